"""Layout rules about what sits around the data: title rows, totals, notes, blank rows and columns."""

from __future__ import annotations

import re
from collections.abc import Iterable
from dataclasses import replace

import numpy as np

from linter.contract.model import TableContract
from linter.findings import Finding, Severity
from linter.rules.layout_place import grid_letters, layout_finding
from linter.rules.layout_signals import filled_mask, row_fill
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Table

TOTALS_AND_NOTES = define_rule(
    "layout.totals-and-notes",
    "Totals, titles or notes among the data rows",
    Severity.ERROR,
    """
    Finds rows that are not observations: a title above the header, total and subtotal rows,
    and notes or footnotes under the data. Read as data, a total is counted twice and a note
    becomes a malformed observation. Fix: remove those rows (put notes in a separate file or
    in the contract's description; totals can be recomputed from the data).

    Bad:
        site,count
        VB-014,3
        VB-015,5
        Total,8
        * counts from the spring survey

    Good:
        site,count
        VB-014,3
        VB-015,5
    """,
)

BLANK_ROWS_COLUMNS = define_rule(
    "layout.blank-rows-columns",
    "Blank rows or columns",
    Severity.WARNING,
    """
    Finds rows or columns with no value at all (not even a header). They split the table for
    readers that stop at the first blank row and add empty variables. Fix: delete them.

    Bad:
        site,,count
        VB-014,,3
        ,,
        VB-015,,5

    Good:
        site,count
        VB-014,3
        VB-015,5
    """,
)

TOTAL_LABEL = re.compile(r"^\s*((grand|sub)[\s-]?)?totals?\b|^\s*(sum|all sites|overall)\s*:?\s*$", re.I)
NOTE_LABEL = re.compile(r"^\s*(notes?\b|source\b|\*|†|‡|¹|²|\(\d\)|\[\d\]|n\.?b\.?\b)", re.I)


def _data_span(counts: np.ndarray) -> tuple[int, int] | None:
    """First and last grid row holding at least two values (the header and observations)."""
    wide = np.flatnonzero(counts >= 2)
    return (int(wide[0]), int(wide[-1])) if wide.size else None


def _first_text(table: Table, index: int, first: np.ndarray) -> str:
    return str(table.grid.iat[index, int(first[index])])


def _reads_as_note(text: str) -> bool:
    """A lone cell under the data is a note when it says so or is a sentence, not a short value."""
    return bool(NOTE_LABEL.match(text)) or len(text.split()) >= 3


def _matching_rows(table: Table, rows: np.ndarray, first: np.ndarray, pattern: re.Pattern[str]) -> list[int]:
    """Rows whose first filled cell matches `pattern`; each distinct text is matched once."""
    found: list[int] = []
    for column in np.unique(first[rows]) if rows.size else ():
        these = rows[first[rows] == column]
        texts = table.grid.iloc[these, int(column)].astype(str)
        hits = [t for t in texts.unique() if pattern.match(t)]
        if hits:
            found.extend(int(r) for r in these[texts.isin(hits).to_numpy()])
    return sorted(found)


def find_totals_and_notes(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if grid.shape[1] < 2 or grid.shape[0] < 2:
        return []
    counts, first_cell = row_fill(grid)
    span = _data_span(counts)
    if span is None:
        return []
    first, last = span
    titles = [i for i in range(first) if counts[i] == 1]
    notes = [
        i
        for i in range(last + 1, len(counts))
        if counts[i] and _reads_as_note(_first_text(table, i, first_cell))
    ]
    inside = np.arange(first + 1, last + 1)
    notes += _matching_rows(table, inside[counts[inside] == 1], first_cell, NOTE_LABEL)
    totals = _matching_rows(table, inside[counts[inside] >= 2], first_cell, TOTAL_LABEL)
    findings: list[Finding] = []
    for indexes, reason, what, fix in (
        (
            titles,
            "title",
            "title rows above the header",
            "Remove the title rows; start the file with the header.",
        ),
        (
            totals,
            "total",
            "total or subtotal rows",
            "Remove total rows; totals are recomputed from the data.",
        ),
        (sorted(notes), "notes", "notes or footnotes", "Move the notes out of the data sheet."),
    ):
        if not indexes:
            continue
        rows = [table.row_numbers[i] for i in indexes]
        examples = [_first_text(table, i, first_cell) for i in indexes[:5]]
        findings.append(
            layout_finding(
                TOTALS_AND_NOTES,
                table,
                f"{len(rows)} row(s) hold {what}, not observations (rows {', '.join(map(str, rows[:6]))}).",
                fix,
                {"step": "drop_rows", "rows": rows, "reason": reason},
                rows=rows,
                count=len(rows),
                examples=examples,
                evidence={"reason": reason},
            )
        )
    return findings


def find_blank_rows_columns(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if grid.shape[0] == 0:
        return []
    mask = filled_mask(grid)
    counts = mask.sum(axis=1)
    findings: list[Finding] = []
    blank_rows = [table.row_numbers[int(i)] for i in np.flatnonzero(counts == 0)]
    if blank_rows and _data_span(counts) is not None:
        findings.append(
            layout_finding(
                BLANK_ROWS_COLUMNS,
                table,
                f"{len(blank_rows)} row(s) are completely blank.",
                "Delete the blank rows.",
                {"step": "drop_rows", "rows": blank_rows, "reason": "blank"},
                rows=blank_rows,
                count=len(blank_rows),
            )
        )
    blank_columns = [int(i) for i in np.flatnonzero(~mask.any(axis=0))]
    if blank_columns and len(blank_columns) < grid.shape[1]:
        letters = grid_letters(blank_columns)
        findings.append(
            layout_finding(
                BLANK_ROWS_COLUMNS,
                table,
                f"{len(letters)} column(s) are completely blank, header included ({', '.join(letters)}).",
                "Delete the blank columns.",
                {"step": "drop_columns", "columns": list(letters), "reason": "blank"},
                letters=letters,
                count=len(letters),
            )
        )
    return findings


def below_titles(table: Table) -> Table:
    """The table from its header row down: title and blank rows above the header left out.

    `weir check` judges the header rules on this, so a title line does not hide, say, months
    used as column names; row numbers stay the provider's.
    """
    counts, _ = row_fill(table.grid)
    span = _data_span(counts)
    if span is None or span[0] == 0:
        return table
    grid = table.grid.iloc[span[0] :].reset_index(drop=True)
    return replace(table, grid=grid, row_numbers=table.row_numbers[span[0] :])


@inspector()
def totals_and_notes(subject: Subject) -> Iterable[Finding]:
    return find_totals_and_notes(subject.table, subject.contract)


@inspector()
def blank_rows_columns(subject: Subject) -> Iterable[Finding]:
    return find_blank_rows_columns(subject.table, subject.contract)
