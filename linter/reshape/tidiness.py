"""Measures how tidy a table is (typed columns, names not values, a key) to rank candidate recipes."""

from __future__ import annotations

import re
from dataclasses import dataclass
from itertools import combinations
from typing import Any

import pandas as pd

from linter.contract.model import TableContract
from linter.rules.layout_signals import blank, dominant_kind, header_value_kind, sample, slug
from linter.table import Table, first_row_header

KEY_WIDTH = 3
"""Candidate keys are searched among combinations of at most this many columns."""


@dataclass(frozen=True)
class Tidiness:
    """The parts of the tidiness score, each between 0 and 1 (1 is best), and their weighted sum."""

    typed_columns: float
    """Mean share of each column's dominant kind of value (number, date, text)."""
    names_not_values: float
    """Share of column names that do not look like values (years, dates, numbers, ranges)."""
    has_key: float
    """1 when some combination of at most KEY_WIDTH columns identifies every row."""
    distinct_rows: float
    """Share of rows that are not exact repeats of another row."""
    contract_fit: float
    """Share of the contract's variables found among the columns (0 without a contract)."""

    @property
    def score(self) -> float:
        return (
            3.0 * self.typed_columns
            + 3.0 * self.names_not_values
            + 1.0 * self.has_key
            + 1.0 * self.distinct_rows
            + 3.0 * self.contract_fit
        )

    def as_json(self) -> dict[str, Any]:
        return {
            "typed_columns": round(self.typed_columns, 4),
            "names_not_values": round(self.names_not_values, 4),
            "has_key": self.has_key,
            "distinct_rows": round(self.distinct_rows, 4),
            "contract_fit": round(self.contract_fit, 4),
        }


def _has_key(frame: pd.DataFrame) -> bool:
    body = frame.iloc[: min(len(frame), 5000)].astype(object).where(frame.notna(), "")
    if len(body) <= 1:
        return True
    columns = list(body.columns)[:12]
    for width in range(1, min(KEY_WIDTH, len(columns)) + 1):
        for combo in combinations(columns, width):
            if not body.duplicated(subset=list(combo)).any():
                return True
    return False


def tidiness(frame: pd.DataFrame, contract: TableContract | None = None) -> Tidiness:
    """Score `frame` (cells as text or None) on the tidy-data principles; pure, O(rows) by sampling."""
    columns = list(frame.columns)
    if not columns:
        return Tidiness(0.0, 0.0, 0.0, 0.0, 0.0)
    typed = sum(dominant_kind(sample(frame[c]))[1] for c in columns) / len(columns)
    valued = sum(header_value_kind(str(c)) is not None for c in columns) / len(columns)
    rows = frame.iloc[: min(len(frame), 5000)]
    distinct = 1.0 - (rows.astype(object).where(rows.notna(), "").duplicated().mean() if len(rows) else 0.0)
    fit = 0.0
    if contract is not None and contract.variables:
        present = {slug(str(c)) for c in columns}
        fit = sum(slug(v.name) in present for v in contract.variables) / len(contract.variables)
    return Tidiness(typed, 1.0 - valued, 1.0 if _has_key(frame) else 0.0, float(distinct), fit)


LETTERS_DIGITS = re.compile(r"^([A-Za-z]+)_?(\d+)$")


def derived_split(table: Table, column: str) -> dict[str, Any] | None:
    """For a column made from header labels: the split that frees the number they hide.

    `wk1, wk2` -> the week number; `m014, f1524` -> a code and a number. Only columns the search
    itself made from headers are offered this split: in submitted data `S1` is just an identifier.
    """
    frame = first_row_header(table)
    if column not in frame.labels:
        return None
    values = sorted({str(v) for v in frame.body[column].tolist() if not blank(v)})
    if len(values) < 2:
        return None
    parts = [LETTERS_DIGITS.match(v) for v in values]
    if not all(parts):
        return None
    letters = {p[1] for p in parts if p}
    name = slug(column)
    if len(letters) == 1:
        prefix = re.escape(next(iter(letters)))
        return {
            "step": "split_column",
            "column": column,
            "pattern": f"^{prefix}_?(?P<{name}>\\d+)$",
            "into": [name],
        }
    if all(len(x) <= 2 for x in letters):
        return {
            "step": "split_column",
            "column": column,
            "pattern": f"^(?P<{name}_code>[A-Za-z]+)_?(?P<{name}_number>\\d+)$",
            "into": [f"{name}_code", f"{name}_number"],
        }
    return None
