"""Layout rules about rows that only repeat or underline the header (paged web and text-table exports)."""

from __future__ import annotations

import re
from collections.abc import Iterable

import numpy as np
import pandas as pd

from linter.contract.model import TableContract
from linter.findings import Finding, Severity
from linter.rules.layout_margins import below_titles
from linter.rules.layout_place import layout_finding
from linter.rules.layout_signals import blank
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Table

REPEATED_HEADER = define_rule(
    "layout.repeated-header-rows",
    "Header row repeated inside the data",
    Severity.WARNING,
    """
    Finds body rows that repeat the header cell for cell, as paged web tables and printed
    reports do at every page break. Read as data, each copy is a bogus observation and turns
    every numeric column into text. Fix: keep the first header and delete the copies (their
    text is the header's, so nothing is lost).

    Bad:
        pos,team,points
        1,Dunmore,24
        pos,team,points
        2,Kell Town,21

    Good:
        pos,team,points
        1,Dunmore,24
        2,Kell Town,21
    """,
)


RULE_LINES = define_rule(
    "layout.rule-lines",
    "Ruled lines drawn with dashes",
    Severity.ERROR,
    """
    Finds rows whose every filled cell is a line drawn with dashes, equals signs or colons
    (`---`, `===`, `:--:`), as Markdown and plain-text tables underline their header. Read as
    data, the line is an observation of dashes and turns every column into text. Fix: delete
    the ruled lines (the audit lists each one).

    Bad:
        site,ph
        ---,---
        VB-014,7.1

    Good:
        site,ph
        VB-014,7.1
    """,
)
RULE_STARTS = ("-", "=", ":", "+")
RULE_CELL = re.compile(r"^\s*:?[-=]{3,}:?\s*$|^\s*\+?([-=]{3,}\+)+\s*$")


def _column_text(grid: pd.DataFrame, index: int) -> pd.Series:
    column = grid.iloc[:, index]
    return column.astype(object).where(column.notna(), "").astype(str).str.strip()


def find_rule_lines(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if grid.shape[0] == 0 or grid.shape[1] < 2:
        return []
    # A ruled line is ruled (or blank) in its first two columns, so only those are scanned on
    # every row; the few rows that pass are read in full.
    heads = [_column_text(grid, j) for j in (0, 1)]
    ruled = [h.str.startswith(RULE_STARTS) | (h == "") for h in heads]
    candidates = np.flatnonzero((ruled[0] & ruled[1] & ((heads[0] != "") | (heads[1] != ""))).to_numpy())
    lines = []
    for i in candidates.tolist():
        cells = [str(v) for v in grid.iloc[i].tolist() if not blank(v)]
        if len(cells) >= 2 and all(RULE_CELL.match(c) for c in cells):
            lines.append(int(i))
    if not lines:
        return []
    rows = [table.row_numbers[i] for i in lines]
    return [
        layout_finding(
            RULE_LINES,
            table,
            f"{len(rows)} row(s) are ruled lines drawn with dashes (row {rows[0]}), not data.",
            "Delete the ruled lines.",
            {"step": "drop_rows", "rows": rows, "reason": "rule"},
            rows=rows,
            count=len(rows),
            examples=[str(v) for v in grid.iloc[lines[0]].tolist() if not blank(v)][:3],
        )
    ]


@inspector()
def rule_lines(subject: Subject) -> Iterable[Finding]:
    return find_rule_lines(subject.table, subject.contract)


def _cells(values: list[object]) -> tuple[str, ...]:
    return tuple("" if blank(v) else str(v).strip() for v in values)


def find_repeated_header(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if grid.shape[0] < 3 or grid.shape[1] < 2:
        return []
    header = _cells(grid.iloc[0].tolist())
    if sum(bool(c) for c in header) < 2:
        return []
    candidates = np.flatnonzero((_column_text(grid, 0) == header[0]).to_numpy())
    copies = [int(i) for i in candidates.tolist() if i > 0 and _cells(grid.iloc[i].tolist()) == header]
    if not copies:
        return []
    rows = [table.row_numbers[i] for i in copies]
    return [
        layout_finding(
            REPEATED_HEADER,
            table,
            f"The header row is repeated {len(rows)} time(s) inside the data (row {rows[0]}).",
            "Delete the repeated header rows; keep only the first.",
            {"step": "drop_rows", "rows": rows, "reason": "header"},
            rows=rows,
            count=len(rows),
            examples=[", ".join(header[:4])],
        )
    ]


@inspector()
def repeated_header(subject: Subject) -> Iterable[Finding]:
    return find_repeated_header(below_titles(subject.table), subject.contract)
