"""Recognise a filled-in Weir template when it comes back: drop its help sheets and untouched examples."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import replace

from linter.contract.model import Contract, TableContract
from linter.table import Table
from linter.template.examples import example_rows
from linter.template.sheets import INSTRUCTIONS, LISTS, Rows, instructions_rows, list_places, lists_rows


def trimmed(rows: Rows | list[tuple[str | None, ...]]) -> list[tuple[str | None, ...]]:
    """Rows without trailing empty cells, blank rows left out (the reader keeps only written rows)."""
    out: list[tuple[str | None, ...]] = []
    for row in rows:
        cells = list(row)
        while cells and cells[-1] is None:
            cells.pop()
        if cells:
            out.append(tuple(cells))
    return out


def grid_rows(table: Table) -> list[tuple[str | None, ...]]:
    return trimmed([tuple(r) for r in table.grid.itertuples(index=False, name=None)])


def is_help_sheet(table: Table, contract: Contract) -> bool:
    """The sheet is the template's own Instructions or Lists sheet, exactly as Weir wrote it."""
    if table.sheet == INSTRUCTIONS:
        return grid_rows(table) == trimmed(instructions_rows(contract))
    if table.sheet == LISTS:
        return grid_rows(table) == trimmed(lists_rows(list_places(contract)))
    return False


def without_examples(table: Table, rules: TableContract) -> Table:
    """Drop the example rows that still sit right below the header holding exactly Weir's values.

    A changed, moved or partly overwritten example is the provider's data and stays.
    """
    examples = example_rows(rules)
    grid = table.grid
    width = len(rules.names)
    # The provider may have added columns after the declared ones; the examples leave them empty.
    if not examples or grid.shape[0] < 2 or tuple(grid.iloc[0])[:width] != rules.names:
        return table
    drop: list[int] = []
    for offset, example in enumerate(examples, start=1):
        if offset >= grid.shape[0] or table.row_numbers[offset] != offset + 1:
            break
        cells = tuple(grid.iloc[offset])
        if cells[:width] == example and all(c is None for c in cells[width:]):
            drop.append(offset)
    if not drop:
        return table
    keep = [i for i in range(grid.shape[0]) if i not in drop]
    return replace(
        table,
        grid=grid.iloc[keep].reset_index(drop=True),
        row_numbers=tuple(table.row_numbers[i] for i in keep),
    )


def governing_sheet(
    table: Table, contract: Contract | None, rules: TableContract | None
) -> TableContract | None:
    """A workbook sheet named after one of its contract's tables is governed by that table."""
    if contract is not None and table.sheet is not None:
        named = contract.table(table.sheet)
        if named is not None:
            return named
    return rules


def sheet_owner(tables: list[Table], contracts: Sequence[Contract]) -> Contract | None:
    """The one contract given that names a table after a sheet of this workbook (a returned template)."""
    sheets = {t.sheet for t in tables if t.format == "xlsx" and t.sheet is not None}
    owners = [c for c in contracts if any(t.name in sheets for t in c.tables)]
    return owners[0] if len(owners) == 1 else None


def template_parts_removed(
    tables: list[Table], contract: Contract | None, rules: TableContract | None
) -> list[tuple[Table, TableContract | None]]:
    """Each table with the contract table governing it, minus what the template itself wrote."""
    if contract is None:
        return [(t, rules) for t in tables]
    kept: list[tuple[Table, TableContract | None]] = []
    for table in tables:
        if table.format == "xlsx" and is_help_sheet(table, contract):
            continue
        governed = governing_sheet(table, contract, rules) if table.format == "xlsx" else rules
        if table.format == "xlsx" and governed is not None:
            table = without_examples(table, governed)
        kept.append((table, governed))
    return kept
