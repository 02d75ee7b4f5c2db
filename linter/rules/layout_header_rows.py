"""Layout rules about the header rows themselves: a header over several rows, or no header at all."""

from __future__ import annotations

import re
from collections.abc import Iterable

import pandas as pd

from linter.contract.model import TableContract
from linter.findings import Finding, Severity
from linter.rules.layout_place import grid_letters, layout_finding
from linter.rules.layout_signals import (
    blank,
    cell_kind,
    dominant_kind,
    frame_of,
    header_value_kind,
    is_number,
    sample,
    shape,
)
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Frame, Table

MULTI_ROW_HEADER = define_rule(
    "layout.multi-row-header",
    "Header spread over several rows",
    Severity.ERROR,
    """
    Finds a header written over two rows (a group label over several columns, often a merged
    cell, and the column labels below it). Readers take the first row as the header and the
    second as data, so every column gets a wrong name and a text value in its first row.
    Fix: one header row whose names join both labels.

    Bad:
        site,nitrate,,phosphate,
        ,min,max,min,max
        VB-014,0.4,1.1,0.02,0.05

    Good:
        site,nitrate min,nitrate max,phosphate min,phosphate max
        VB-014,0.4,1.1,0.02,0.05
    """,
)

NO_HEADER = define_rule(
    "layout.no-header",
    "No header row",
    Severity.ERROR,
    """
    Finds a file whose first row is already data: its cells have the same kind and shape as
    the values below them. Taken as a header, that first observation is lost and the
    columns get meaningless names. Fix: add a header row naming every column.

    Bad:
        VB-014,2025-03-02,7.1
        VB-015,2025-03-02,6.8

    Good:
        site_id,sampled_on,ph
        VB-014,2025-03-02,7.1
        VB-015,2025-03-02,6.8
    """,
)


def index_name_row(grid: pd.DataFrame) -> bool:
    """Header blank over column A only, and the next row filled in column A only: the name of
    column A printed below the header, as a dataframe with a named index prints itself."""
    top, second = grid.iloc[0].tolist(), grid.iloc[1].tolist()
    if not blank(top[0]) or any(blank(v) for v in top[1:]) or blank(second[0]):
        return False
    if any(not blank(v) for v in second[1:]) or cell_kind(second[0]) != "text":
        return False
    return all(not blank(v) for v in grid.iloc[2:, 0].tolist())


def find_multi_row_header(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if grid.shape[0] < 3 or grid.shape[1] < 3:
        return []
    top, second = grid.iloc[0].tolist(), grid.iloc[1].tolist()
    filled_top = [i for i, v in enumerate(top) if not blank(v)]
    if len(filled_top) < 2:
        return []
    if index_name_row(grid):
        rows = list(table.row_numbers[:2])
        return [
            layout_finding(
                MULTI_ROW_HEADER,
                table,
                f"Row {rows[1]} holds only '{str(second[0]).strip()}', the name of column A, whose "
                f"header cell in row {rows[0]} is blank (a dataframe index name printed on its own row).",
                "Write one header row: put the column A name into the header.",
                {"step": "header", "rows": rows, "joiner": " "},
                rows=rows,
                letters=("A",),
                examples=[str(second[0]).strip()],
            )
        ]
    carried = [i for i in range(filled_top[0] + 1, len(top)) if blank(top[i]) and not blank(second[i])]
    second_labels = [str(v).strip() for v in second if not blank(v)]
    if len(second_labels) < 0.6 * grid.shape[1] or any(cell_kind(v) != "text" for v in second_labels):
        return []
    repeats = len(set(second_labels)) < len(second_labels)
    top_row = str(table.row_numbers[0])
    merged = any(re.fullmatch(rf"[A-Z]+{top_row}:[A-Z]+{top_row}", r) for r in table.merged_ranges)
    if not (carried and (repeats or merged)):
        return []
    below = [cell_kind(v) for v in sample(grid.iloc[2:].to_numpy().ravel().tolist())]
    if "number" not in below and "date" not in below:
        return []
    rows = list(table.row_numbers[:2])
    return [
        layout_finding(
            MULTI_ROW_HEADER,
            table,
            f"The header is written over rows {rows[0]} and {rows[1]}: row {rows[0]} labels groups of "
            "columns and the column names are in the row below.",
            "Write one header row whose names join the group label and the column label.",
            {"step": "header", "rows": rows, "joiner": " "},
            rows=rows,
            letters=grid_letters(carried),
            count=len(carried),
            examples=[str(top[i]) for i in filled_top] + second_labels[:3],
        )
    ]


def _looks_like_data(first: Iterable[object], body: Frame) -> bool:
    cells = list(first)
    seen_value = False
    for index, value in enumerate(cells):
        column = sample(body.body.iloc[:, index])
        kind, share = dominant_kind(column)
        mine = cell_kind(value)
        if mine == "empty":
            return False
        if kind in ("number", "date"):
            if mine != kind or share < 0.9:
                return False
            seen_value = True
        elif kind == "text":
            shapes = [shape(str(v)) for v in column if not blank(v)]
            common = max(set(shapes), key=shapes.count)
            if shapes.count(common) < 0.9 * len(shapes) or shape(str(value)) != common or common == "a":
                return False
            seen_value = True
    return seen_value


def find_no_header(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if grid.shape[0] < 3 or not table.header_given:
        return []
    frame = frame_of(table)
    first = grid.iloc[0].tolist()
    if all(header_value_kind(str(v)) == "year" for v in first) or not _looks_like_data(first, frame):
        return []
    numbers = [str(v).strip() for v in first if not blank(v) and is_number(str(v))]
    if len(numbers) >= 3 and numbers == [
        str(n) for n in range(int(numbers[0]), int(numbers[0]) + len(numbers))
    ]:
        return []  # 1,2,3,... across the top is a row of labels
    width = grid.shape[1]
    if contract is not None and len(contract.variables) == width:
        names = list(contract.names)
    else:
        names = [f"column_{letter}" for letter in grid_letters(range(width))]
    return [
        layout_finding(
            NO_HEADER,
            table,
            f"Row {table.row_numbers[0]} is data, not a header: every cell has the kind and shape of the "
            "values below it.",
            "Add a header row that names every column.",
            {"step": "header", "rows": [], "names": names},
            rows=table.row_numbers[:1],
            count=1,
            examples=[str(v) for v in first[:5]],
        )
    ]


@inspector()
def multi_row_header(subject: Subject) -> Iterable[Finding]:
    return find_multi_row_header(subject.table, subject.contract)


@inspector()
def no_header(subject: Subject) -> Iterable[Finding]:
    return find_no_header(subject.table, subject.contract)
