"""How contract rule families word a finding about cells of one column: place, examples, counts."""

from __future__ import annotations

from collections.abc import Iterable, Mapping, Sequence
from typing import Any

import numpy as np
import pandas as pd

from linter.contract.engine import CheckedTable, checked
from linter.findings import MAX_ROWS_LISTED, Finding, Place, Severity, listed_rows
from linter.row_sets import as_rows, union
from linter.rules.registry import RULES
from linter.rules.subject import Subject
from linter.table import column_letter

MAX_EXAMPLES = 5


def engine_result(subject: Subject) -> CheckedTable | None:
    """The engine's view of the subject's table, or None when no contract governs it."""
    if subject.contract is None:
        return None
    return checked(subject.contract, subject.frame)


def place_of(subject: Subject, columns: Sequence[str], rows: Iterable[int] | np.ndarray = ()) -> Place:
    """The file, sheet, listed provider rows, and the named columns with their letters."""
    labels = subject.frame.labels
    present = [c for c in columns if c in labels]
    return Place(
        file=subject.table.source,
        sheet=subject.table.sheet,
        # Sorted and distinct in numpy first: a column finding may name thousands of rows.
        rows=listed_rows(union([rows])[:MAX_ROWS_LISTED].tolist()),
        columns=tuple(present),
        letters=tuple(subject.frame.letter(c) for c in present),
    )


def header_place(subject: Subject, indexes: Sequence[int]) -> Place:
    """The header row, with the columns at these 0-based positions (names as written) and letters."""
    names = subject.frame.names
    return Place(
        file=subject.table.source,
        sheet=subject.table.sheet,
        rows=subject.table.row_numbers[:1],
        columns=tuple(names[i] for i in indexes),
        letters=tuple(column_letter(i) for i in indexes),
    )


def _cells_at(subject: Subject, column: str, rows: Iterable[int] | np.ndarray) -> pd.Series:
    positions = subject.frame.row_index.get_indexer(pd.Index(as_rows(rows)))
    return subject.frame.body[column].iloc[positions]


def _as_written(cells: pd.Series) -> list[str]:
    # Body cells are text or None; `cell != cell` also catches a NaN that slipped in.
    return ["" if cell is None or cell != cell else str(cell) for cell in cells.tolist()]


def written(subject: Subject, column: str, rows: Iterable[int] | np.ndarray) -> list[str]:
    """The cells of `column` at provider `rows` exactly as written ('' for an empty cell)."""
    return _as_written(_cells_at(subject, column, rows))


def written_distinct(
    subject: Subject, column: str, rows: Iterable[int] | np.ndarray
) -> tuple[np.ndarray, list[str]]:
    """The cells of `column` at provider `rows` as written, without a Python step per row: the
    distinct texts in order of first appearance, and per row the index of its text among them.

    An empty cell and a NaN read as one text, '', which an empty string cell may share."""
    cells = _cells_at(subject, column, rows)
    codes, distinct = pd.factorize(cells.to_numpy(dtype=object), use_na_sentinel=False)
    return codes, _as_written(pd.Series(distinct, dtype=object))


def written_examples(subject: Subject, column: str, rows: Sequence[int] | np.ndarray) -> tuple[str, ...]:
    """`examples_from` the cells of `column` at `rows` (in that order), read only as far as needed:
    a failing column often holds thousands of cells and a handful of distinct values."""
    # First appearances in order; None and NaN drop as one, and '' is the only text an empty cell
    # shares, so one more than the examples wanted is always enough.
    firsts = _cells_at(subject, column, rows).drop_duplicates().head(MAX_EXAMPLES + 1)
    return examples_from(_as_written(firsts))


def examples_from(values: Iterable[str]) -> tuple[str, ...]:
    """Up to MAX_EXAMPLES distinct values in order of first appearance."""
    seen: list[str] = []
    for value in values:
        if value not in seen:
            seen.append(value)
            if len(seen) == MAX_EXAMPLES:
                break
    return tuple(seen)


def quoted(values: Iterable[str]) -> str:
    return ", ".join(repr(v) for v in values)


def column_finding(
    subject: Subject,
    rule: str,
    column: str,
    rows: Sequence[int] | np.ndarray,
    message: str,
    fix: str,
    *,
    severity: Severity | None = None,
    evidence: Mapping[str, Any] | None = None,
) -> Finding:
    """One finding for (rule, column): count, examples as written, listed rows and the column letter."""
    ordered = np.sort(as_rows(rows), kind="stable")
    return Finding(
        rule=rule,
        severity=severity or RULES[rule].severity,
        message=message,
        place=place_of(subject, [column], ordered),
        count=len(ordered),
        examples=written_examples(subject, column, ordered),
        fix=fix,
        evidence=dict(evidence or {}),
    )


def plural(count: int, word: str) -> str:
    """`1 row`, `3 rows`."""
    return f"{count} {word}" if count == 1 else f"{count} {word}s"


def counted(count: int, word: str, singular_verb: str, plural_verb: str) -> str:
    """`1 row has`, `3 rows have`: a count that agrees with its verb."""
    return f"{plural(count, word)} {singular_verb if count == 1 else plural_verb}"
