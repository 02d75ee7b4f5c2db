"""Layout rule about a row-number column a dataframe library wrote out with the data."""

from __future__ import annotations

import re
from collections.abc import Iterable

from linter.contract.model import TableContract
from linter.findings import Finding, Severity
from linter.rules.layout_margins import below_titles
from linter.rules.layout_place import layout_finding
from linter.rules.layout_signals import blank, sample
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Table

INDEX_COLUMN = define_rule(
    "layout.index-column",
    "Row-number column left by a dataframe export",
    Severity.WARNING,
    """
    Finds a first column with no name (blank, or the `Unnamed: 0` a reader gives a blank
    header) holding exactly 0, 1, 2, ... down the rows: the row index a dataframe library
    writes unless told not to. It numbers the file, not the observations, and changes
    whenever rows are filtered or sorted. Fix: drop it (the audit lists every dropped cell).

    Bad:
        ,site,ph
        0,VB-014,7.1
        1,VB-015,6.8

    Good:
        site,ph
        VB-014,7.1
        VB-015,6.8
    """,
)

# From memory of pandas: `DataFrame.to_csv` writes the RangeIndex under an empty header cell,
# and `read_csv` names an empty header cell `Unnamed: <position>`.
UNNAMED = re.compile(r"^(Unnamed: \d+)?$")


def find_index_column(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if grid.shape[0] < 3 or grid.shape[1] < 2:
        return []
    head = grid.iat[0, 0]
    if not UNNAMED.match("" if blank(head) else str(head).strip()):
        return []
    if contract is not None and not blank(head) and contract.variable(str(head).strip()) is not None:
        return []
    cells = grid.iloc[1:, 0].tolist()
    if any(blank(c) or not str(c).strip().isdigit() for c in sample(cells)):
        return []
    if [int(str(c).strip()) for c in cells] != list(range(len(cells))):
        return []
    return [
        layout_finding(
            INDEX_COLUMN,
            table,
            f"Column A has no name and numbers the rows 0 to {len(cells) - 1}: "
            "a row index written out with the data.",
            "Drop column A; write the file without its index.",
            {"step": "drop_columns", "columns": ["A"], "reason": "index"},
            rows=table.row_numbers[:1],
            letters=("A",),
            count=len(cells),
            examples=[str(c) for c in cells[:5]],
        )
    ]


@inspector()
def index_column(subject: Subject) -> Iterable[Finding]:
    return find_index_column(below_titles(subject.table), subject.contract)
