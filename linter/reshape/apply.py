"""Applying a recipe to a Table: the reshaped table(s) plus, for every output cell, its input cell."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, replace
from pathlib import Path

import numpy as np
import pandas as pd

from linter.reshape.grid_steps import Header, header
from linter.reshape.recipe import Recipe
from linter.reshape.sheet import Bench, Carried, CellIndex, Dropped, Origin, StepNote, sheet_of
from linter.reshape.steps import STEPS, RecipeError, StepParams
from linter.table import Table, column_letter


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
    carried: tuple[Carried, ...]

    def origin(self, table: str, row: int, column: str) -> Origin | None:
        """The input cell behind output cell (`row` is 0-based), None if the recipe made it."""
        return self.index.decode(int(self.provenance[table][column].iloc[row]))

    def origin_labels(self, table: str) -> pd.DataFrame:
        """Shaped like output `table`: each cell's input cell as `C7`, or `C1 (header)` for a
        header-derived value, or None for a cell the recipe made (a row number)."""
        codes = self.provenance[table].to_numpy(dtype=np.int64)
        flat = codes.ravel()
        made = flat < 0
        cell = np.where(made, 0, flat // 2)
        offsets = np.asarray(self.index.offsets, dtype=np.int64)
        which = np.searchsorted(offsets, cell, side="right") - 1
        labels = np.full(flat.shape, None, dtype=object)
        for k, source in enumerate(self.index.tables):
            mine = (which == k) & ~made
            if not mine.any() or source.grid.shape[1] == 0:
                continue
            row, col = np.divmod(cell[mine] - offsets[k], source.grid.shape[1])
            numbers = np.asarray(source.row_numbers, dtype=np.int64)[row]
            letters = np.asarray([column_letter(i) for i in range(source.grid.shape[1])], dtype=object)[col]
            header = (flat[mine] % 2) == 1
            prefix = "" if len(self.index.tables) == 1 else f"{source.label}!"
            labels[mine] = [
                f"{prefix}{letter}{number}{' (header)' if h else ''}"
                for letter, number, h in zip(letters, numbers, header, strict=True)
            ]
        return pd.DataFrame(labels.reshape(codes.shape), columns=self.provenance[table].columns)


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
        rows[name] = tuple(sheet.rows.tolist())
    return Reshaped(
        tables, provenance, headers, rows, index, bench.dropped, bench.notes, bench.renamed, bench.carried
    )
