"""Steps on named columns: fill down, split a column, explode list cells, row ids, rename."""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np
import pandas as pd

from linter.reshape.columns import (
    compile_pattern,
    header_of,
    is_empty,
    need_columns,
    need_new,
)
from linter.reshape.sheet import NO_ORIGIN, Sheet
from linter.reshape.steps import Outcome, RecipeError, StepParams, register_sheet_step


@dataclass(frozen=True)
class FillDown(StepParams):
    """An empty cell in these columns means "same as the cell above"."""

    step = "fill_down"
    columns: tuple[str, ...]
    marks: tuple[str, ...] = ()
    """Cell texts that also mean "same as above" (ditto marks such as `"`); the audit lists
    each one as dropped with the reason `ditto`, since the value above now stands in its place."""


def _fill_down_code(p: FillDown) -> list[str]:
    lines = (
        [f"df[{list(p.columns)!r}] = df[{list(p.columns)!r}].replace({list(p.marks)!r}, None)"]
        if p.marks
        else []
    )
    return [*lines, f"df[{list(p.columns)!r}] = df[{list(p.columns)!r}].ffill().astype(object)"]


@register_sheet_step(FillDown, grid_level=False, code=_fill_down_code)
def fill_down(p: FillDown, sheet: Sheet) -> Outcome:
    need_columns(sheet, p.columns)
    cells, origin = sheet.cells.copy(), sheet.origin.copy()
    dittos: list[int] = []
    for column in p.columns:
        marked = cells[column].map(lambda v: v is not None and str(v).strip() in p.marks).astype(bool)
        dittos += [int(c) for c in origin[column][marked].tolist() if c >= 0]
        blank = is_empty(cells[column]) | marked
        filled = cells[column].where(~blank).ffill()
        codes = origin[column].where(~blank).ffill()
        cells[column] = filled.where(filled.notna(), None).astype(object)
        origin[column] = codes.where(codes.notna(), origin[column]).astype(np.int64)
    dropped = ((tuple(dittos), "ditto"),) if dittos else ()
    return Outcome(sheet.with_frames(cells, origin, sheet.rows), dropped)


@dataclass(frozen=True)
class SplitColumn(StepParams):
    """One column holding several variables becomes one column per named group of the pattern.
    A cell that does not match keeps its text in the first new column and is counted."""

    step = "split_column"
    column: str
    pattern: str
    into: tuple[str, ...]

    def check(self) -> None:
        groups = list(compile_pattern(self.pattern).groupindex)
        if sorted(groups) != sorted(self.into) or not groups:
            raise RecipeError(
                f"step 'split_column': the pattern's named groups {groups} must be the 'into' columns"
            )


def _split_column_code(p: SplitColumn) -> list[str]:
    c, into = repr(p.column), list(p.into)
    return [
        f"parts = df[{c}].str.extract({p.pattern!r})[{into!r}]",
        f"parts[{into[0]!r}] = parts[{into[0]!r}].where(parts.notna().any(axis=1), df[{c}])  # unmatched",
        "parts = parts.astype(object).where(parts.notna() & (parts != ''), None)",
        f"at = df.columns.get_loc({c})",
        "df = pd.concat([df.iloc[:, :at], parts, df.iloc[:, at + 1:]], axis=1)",
    ]


@register_sheet_step(SplitColumn, grid_level=False, code=_split_column_code)
def split_column(p: SplitColumn, sheet: Sheet) -> Outcome:
    need_columns(sheet, (p.column,))
    need_new(replace(sheet, cells=sheet.cells.drop(columns=[p.column])), list(p.into))
    header = header_of(sheet)
    source = sheet.cells[p.column]
    parts = source.astype(object).str.extract(p.pattern)[list(p.into)]
    unmatched = (~parts.notna().any(axis=1) & ~pd.Series(is_empty(source))).to_numpy()
    parts[p.into[0]] = parts[p.into[0]].where(~unmatched, source)
    parts = parts.astype(object).where(parts.notna() & (parts != ""), None)
    at = list(sheet.cells.columns).index(p.column)
    codes = sheet.origin[p.column].to_numpy()
    cells = pd.concat([sheet.cells.iloc[:, :at], parts, sheet.cells.iloc[:, at + 1 :]], axis=1)
    origin_parts = pd.DataFrame({name: codes for name in p.into})
    origin = pd.concat([sheet.origin.iloc[:, :at], origin_parts, sheet.origin.iloc[:, at + 1 :]], axis=1)
    old = header.get(p.column, ())
    new_header = {c: header.get(c, ()) for c in cells.columns}
    if p.column in p.into:
        new_header[p.column] = old
    notes: tuple[tuple[str, str, tuple[int, ...]], ...] = ()
    if unmatched.any():
        notes = (
            (
                "unmatched",
                f"{int(unmatched.sum())} cell(s) of {p.column!r} do not match the pattern",
                tuple(int(c) for c in codes[unmatched] if c >= 0),
            ),
        )
    dropped = () if p.column in p.into else ((old, "layout label"),)
    made = replace(sheet.with_frames(cells, origin, sheet.rows), header=new_header)
    return Outcome(made, dropped=dropped, notes=notes)


@dataclass(frozen=True)
class Explode(StepParams):
    """A cell listing several items (`a; b; c`) becomes one row per item (pandas `explode`)."""

    step = "explode"
    column: str
    separator: str

    def check(self) -> None:
        if not self.separator:
            raise RecipeError("step 'explode': the separator must not be empty")


def _explode_code(p: Explode) -> list[str]:
    c = repr(p.column)
    return [
        f"df[{c}] = df[{c}].str.split({p.separator!r}, regex=False).map(",
        "    lambda items: ([i.strip() for i in items if i.strip()] or [None])",
        "    if isinstance(items, list) else None",
        ")",
        f"df = df.explode({c})",
    ]


@register_sheet_step(Explode, grid_level=False, code=_explode_code)
def explode(p: Explode, sheet: Sheet) -> Outcome:
    need_columns(sheet, (p.column,))
    items = (
        sheet.cells[p.column]
        .str.split(p.separator, regex=False)
        .map(
            lambda parts: (
                ([i.strip() for i in parts if i.strip()] or [None]) if isinstance(parts, list) else [None]
            )
        )
    )
    counts = items.map(len).to_numpy()
    take = np.repeat(np.arange(len(sheet.cells)), counts)
    cells = sheet.cells.iloc[take].reset_index(drop=True)
    origin = sheet.origin.iloc[take].reset_index(drop=True)
    flat = [item for parts in items for item in parts]
    cells[p.column] = pd.Series(flat, dtype=object)
    return Outcome(sheet.with_frames(cells, origin, sheet.rows[take]))


@dataclass(frozen=True)
class AddRowId(StepParams):
    """A first column holding each row's provider row number, so reshaped rows stay traceable."""

    step = "add_row_id"
    name: str = "row"


def _add_row_id_code(p: AddRowId) -> list[str]:
    return [f"df.insert(0, {p.name!r}, df.index.astype(str))"]


@register_sheet_step(AddRowId, grid_level=False, code=_add_row_id_code)
def add_row_id(p: AddRowId, sheet: Sheet) -> Outcome:
    need_new(sheet, [p.name])
    cells, origin = sheet.cells.copy(), sheet.origin.copy()
    cells.insert(0, p.name, pd.Series(sheet.rows.astype(str), dtype=object))
    origin.insert(0, p.name, np.full(len(cells), NO_ORIGIN, dtype=np.int64))
    made = replace(sheet.with_frames(cells, origin, sheet.rows), header={p.name: (), **header_of(sheet)})
    return Outcome(made)


@dataclass(frozen=True)
class Rename(StepParams):
    """Give columns new names (old name -> new name)."""

    step = "rename"
    columns: dict[str, str]


def _rename_code(p: Rename) -> list[str]:
    return [f"df = df.rename(columns={dict(p.columns)!r})"]


@register_sheet_step(Rename, grid_level=False, code=_rename_code)
def rename(p: Rename, sheet: Sheet) -> Outcome:
    need_columns(sheet, tuple(p.columns))
    names = [p.columns.get(c, c) for c in sheet.cells.columns]
    if len(set(names)) != len(names):
        raise RecipeError("rename would give two columns the same name")
    header = header_of(sheet)
    made = replace(
        sheet,
        cells=sheet.cells.set_axis(names, axis=1),
        origin=sheet.origin.set_axis(names, axis=1),
        header={p.columns.get(c, c): codes for c, codes in header.items()},
    )
    renamed = tuple(c for old in p.columns for c in header.get(old, ()))
    return Outcome(made, renamed=renamed)
