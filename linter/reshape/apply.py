"""Applying a recipe to a Table: the reshaped table(s) plus, for every output cell, its input cell."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, replace
from pathlib import Path

import pandas as pd

from linter.reshape.grid_steps import Header, header
from linter.reshape.recipe import Recipe
from linter.reshape.sheet import Bench, CellIndex, Dropped, Origin, StepNote, sheet_of
from linter.reshape.steps import STEPS, RecipeError, StepParams
from linter.table import Table


@dataclass(frozen=True)
class Reshaped:
    """The result of a recipe: output tables and where each of their cells came from."""

    tables: Mapping[str, pd.DataFrame]
    """Output table name -> cells as text or None (object dtype), columns named."""
    provenance: Mapping[str, pd.DataFrame]
    """Same shapes as `tables`: the origin code of every cell (decode with `origin`)."""
    headers: Mapping[str, Mapping[str, tuple[int, ...]]]
    """Output table -> column name -> origin codes of the input header cells it was made from."""
    rows: Mapping[str, tuple[int, ...]]
    """Output table -> the provider row number each output row descends from."""
    index: CellIndex
    dropped: tuple[Dropped, ...]
    notes: tuple[StepNote, ...]
    renamed: frozenset[int]
    carried: tuple[tuple[int, str], ...]

    def origin(self, table: str, row: int, column: str) -> Origin | None:
        """The input cell behind output cell (`row` is 0-based), None if the recipe made it."""
        return self.index.decode(int(self.provenance[table][column].iloc[row]))


def output_name(table: Table) -> str:
    """The output table is named after its input file (and sheet)."""
    stem = Path(table.source).stem or "table"
    return f"{stem}-{table.sheet}" if table.sheet else stem


def _step_name(step: StepParams) -> str:
    return type(step).step


def _apply_step(bench: Bench, step: StepParams, number: int) -> Bench:
    kind = STEPS[_step_name(step)]
    try:
        return kind.apply(step, replace(bench, step=number))
    except RecipeError as err:
        raise RecipeError(f"recipe step {number} ({kind.name}): {err}") from None


def _implicit_header(bench: Bench, number: int) -> Bench:
    """A table step on a raw grid, or a recipe without a header step: the first row is the header."""
    grids = [name for name, sheet in bench.sheets.items() if sheet.is_grid and len(sheet.rows)]
    if not grids:
        return bench
    sheets = dict(bench.sheets)
    for name in grids:
        first_row = int(sheets[name].rows[0])
        try:
            sheets[name] = header(Header(rows=(first_row,)), sheets[name]).sheet
        except RecipeError as err:
            raise RecipeError(f"recipe step {number}: the first row as header: {err}") from None
    return replace(bench, sheets=sheets)


def apply_recipe(table: Table, recipe: Recipe) -> Reshaped:
    """Apply `recipe` to `table` (never modified). Raises RecipeError when a step does not fit."""
    index = CellIndex.of((table,))
    bench = Bench(index, {output_name(table): sheet_of(table, index)})
    for number, step in enumerate(recipe.steps, start=1):
        kind = STEPS[_step_name(step)]
        if not kind.grid_level:
            bench = _implicit_header(bench, number)
        bench = _apply_step(bench, step, number)
    bench = _implicit_header(bench, len(recipe.steps) + 1)
    tables, provenance, headers, rows = {}, {}, {}, {}
    for name, sheet in bench.sheets.items():
        tables[name] = sheet.cells.astype(object).where(sheet.cells.notna(), None).reset_index(drop=True)
        provenance[name] = sheet.origin.reset_index(drop=True)
        headers[name] = dict(sheet.header or {})
        rows[name] = tuple(int(r) for r in sheet.rows)
    return Reshaped(
        tables, provenance, headers, rows, index, bench.dropped, bench.notes, bench.renamed, bench.carried
    )
