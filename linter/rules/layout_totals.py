"""Finds totals that the data recomputes: `All ...` rows and total columns that are row sums."""

from __future__ import annotations

import re
from collections.abc import Iterable

import numpy as np
import pandas as pd

from linter.contract.model import TableContract
from linter.findings import Finding
from linter.rules.layout_margins import TOTAL_LABEL, TOTALS_AND_NOTES
from linter.rules.layout_place import grid_letters, layout_finding
from linter.rules.layout_signals import blank
from linter.rules.registry import inspector
from linter.rules.subject import Subject
from linter.table import Table

ALL_LABEL = re.compile(r"^\s*all\b", re.I)
"""`All`, `All districts`: a total only when its numbers are the sums of the rows above."""


def _numbers(cells: pd.DataFrame) -> pd.DataFrame:
    text = (
        cells.astype(object)
        .where(cells.notna(), None)
        .map(lambda v: None if blank(v) else str(v).replace(",", "").strip())
    )
    return text.apply(pd.to_numeric, errors="coerce")


def _close(a: np.ndarray, b: np.ndarray) -> bool:
    return bool(np.allclose(a, b, rtol=1e-6, atol=0.01))


def _all_rows(table: Table) -> list[int]:
    """Rows labelled `All ...` whose numeric cells each equal the column sum of the rows above."""
    grid = table.grid
    labels = grid.iloc[:, 0].astype(object).where(grid.iloc[:, 0].notna(), "").astype(str)
    candidates = [int(i) for i in np.flatnonzero(labels.str.match(ALL_LABEL.pattern, case=False)) if i >= 2]
    if not candidates:
        return []  # the sums are only worked out for labelled rows, so long tables stay cheap
    numbers = _numbers(grid.iloc[: candidates[-1] + 1, 1:])
    found: list[int] = []
    start = 1
    for index in candidates:
        row = numbers.iloc[index]
        filled = row.notna().to_numpy()
        above = numbers.iloc[start:index].to_numpy()[:, filled]
        if filled.sum() and above.shape[0] >= 2 and _close(np.nansum(above, axis=0), row.to_numpy()[filled]):
            found.append(index)
            start = index + 1
    return found


def _total_columns(table: Table) -> list[int]:
    """Columns headed Total (or Grand total) whose every value is the sum of the other numbers."""
    grid = table.grid
    if grid.shape[0] < 3 or grid.shape[1] < 4:
        return []
    heads = [
        j
        for j in range(grid.shape[1])
        if not blank(grid.iat[0, j]) and TOTAL_LABEL.match(str(grid.iat[0, j]))
    ]
    if not heads:
        return []
    numbers = _numbers(grid.iloc[1:])
    found: list[int] = []
    for j in heads:
        head = grid.iat[0, j]
        if blank(head) or not TOTAL_LABEL.match(str(head)) or numbers.iloc[:, j].isna().any():
            continue
        others = numbers.drop(columns=[numbers.columns[j], *(numbers.columns[k] for k in found)])
        parts = others.loc[:, others.notna().any()]
        if parts.shape[1] >= 2 and _close(np.nansum(parts.to_numpy(), axis=1), numbers.iloc[:, j].to_numpy()):
            found.append(j)
    return found


def find_recomputed_totals(table: Table, contract: TableContract | None = None) -> list[Finding]:
    findings: list[Finding] = []
    rows = _all_rows(table) if table.grid.shape[1] >= 2 else []
    if rows:
        numbers = [table.row_numbers[i] for i in rows]
        findings.append(
            layout_finding(
                TOTALS_AND_NOTES,
                table,
                f"{len(rows)} row(s) labelled 'All ...' add up the rows above them (row {numbers[0]}).",
                "Remove total rows; totals are recomputed from the data.",
                {"step": "drop_rows", "rows": numbers, "reason": "total"},
                rows=numbers,
                count=len(rows),
                examples=[str(table.grid.iat[i, 0]) for i in rows],
            )
        )
    columns = _total_columns(table)
    if columns:
        letters = grid_letters(columns)
        findings.append(
            layout_finding(
                TOTALS_AND_NOTES,
                table,
                f"The column(s) {', '.join(letters)} hold the row sums of the other numbers.",
                "Remove total columns; totals are recomputed from the data.",
                {"step": "drop_columns", "columns": list(letters), "reason": "total"},
                letters=letters,
                count=len(columns),
                examples=[str(table.grid.iat[0, j]) for j in columns],
            )
        )
    return findings


@inspector()
def recomputed_totals(subject: Subject) -> Iterable[Finding]:
    return find_recomputed_totals(subject.table, subject.contract)
