"""Steps on the raw grid: drop rows or columns, swap rows and columns, choose the header, lift titles."""

from __future__ import annotations

import re
from dataclasses import dataclass, replace
from typing import Literal

import numpy as np
import pandas as pd

from linter.reshape.sheet import NO_ORIGIN, Sheet
from linter.reshape.steps import Outcome, RecipeError, StepParams, register_sheet_step
from linter.table import column_letter, unique_labels

LETTER = re.compile(r"^[A-Z]{1,3}$")
"""Raw-grid columns are labelled by spreadsheet letter; any other label was named by a step."""

DropReason = Literal["blank", "notes", "total", "title", "header", "rule"]


def _codes(frame: pd.DataFrame) -> tuple[int, ...]:
    return tuple(int(c) for c in frame.to_numpy().ravel() if c >= 0)


def _missing_rows(sheet: Sheet, rows: tuple[int, ...]) -> list[int]:
    return sorted(set(rows) - set(sheet.rows.tolist()))


@dataclass(frozen=True)
class DropRows(StepParams):
    """Remove rows (provider row numbers); their cells are listed in the audit with the reason."""

    step = "drop_rows"
    rows: tuple[int, ...]
    reason: DropReason


def _drop_rows_code(p: DropRows) -> list[str]:
    return [f"df = df.drop(index={list(p.rows)!r})  # {p.reason} rows"]


@register_sheet_step(DropRows, grid_level=True, code=_drop_rows_code)
def drop_rows(p: DropRows, sheet: Sheet) -> Outcome:
    missing = _missing_rows(sheet, p.rows)
    if missing:
        raise RecipeError(f"row(s) {', '.join(map(str, missing))} are not in the table")
    gone = np.isin(sheet.rows, np.asarray(p.rows, dtype=np.int64))
    dropped = _codes(sheet.origin[gone])
    kept = ~gone
    return Outcome(
        sheet.with_frames(sheet.cells[kept], sheet.origin[kept], sheet.rows[kept]), ((dropped, p.reason),)
    )


@dataclass(frozen=True)
class DropColumns(StepParams):
    """Remove raw-grid columns by spreadsheet letter; their cells are listed in the audit."""

    step = "drop_columns"
    columns: tuple[str, ...]
    reason: Literal["blank", "notes", "total", "index"]


def _drop_columns_code(p: DropColumns) -> list[str]:
    return [f"df = df.drop(columns={list(p.columns)!r})  # {p.reason} columns"]


@register_sheet_step(DropColumns, grid_level=True, code=_drop_columns_code)
def drop_columns(p: DropColumns, sheet: Sheet) -> Outcome:
    if not sheet.is_grid:
        raise RecipeError(
            "drop_columns names spreadsheet letters of the raw grid; put it before the header step"
        )
    missing = [c for c in p.columns if c not in sheet.cells.columns]
    if missing:
        raise RecipeError(f"column(s) {', '.join(missing)} are not in the table")
    dropped = _codes(sheet.origin[list(p.columns)])
    cells = sheet.cells.drop(columns=list(p.columns))
    origin = sheet.origin.drop(columns=list(p.columns))
    return Outcome(sheet.with_frames(cells, origin, sheet.rows), ((dropped, p.reason),))


@dataclass(frozen=True)
class Transpose(StepParams):
    """Swap rows and columns (a table printed sideways). Afterwards rows are numbered 1..n and
    columns lettered A.. in their new order; provenance still names the input cells."""

    step = "transpose"


def _transpose_code(p: Transpose) -> list[str]:
    return [
        "df = df.T",
        "df.index = range(1, len(df) + 1)",
        "df.columns = [column_letter(i) for i in range(df.shape[1])]",
    ]


@register_sheet_step(Transpose, grid_level=True, code=_transpose_code)
def transpose(p: Transpose, sheet: Sheet) -> Outcome:
    if not sheet.is_grid:
        raise RecipeError("transpose works on the raw grid; put it before the header step")
    cells, origin = sheet.cells.T, sheet.origin.T
    letters = [column_letter(i) for i in range(cells.shape[1])]
    cells.columns = origin.columns = pd.Index(letters)
    rows = np.arange(1, cells.shape[0] + 1, dtype=np.int64)
    return Outcome(sheet.with_frames(cells.astype(object), origin.astype(np.int64), rows))


@dataclass(frozen=True)
class Header(StepParams):
    """These rows become one header; several rows are joined (upper labels carry right over
    blank cells). With no rows, `names` gives the header of a file that has none."""

    step = "header"
    rows: tuple[int, ...]
    joiner: str = " "
    names: tuple[str, ...] = ()

    def check(self) -> None:
        if not self.rows and not self.names:
            raise RecipeError(
                "step 'header': give the header rows, or the column names for a file without one"
            )


def _header_code(p: Header) -> list[str]:
    if not p.rows:
        return [f"df.columns = {list(p.names)!r}"]
    lines = [
        f"head = df.loc[{list(p.rows)!r}]",
        "head = pd.concat([head.iloc[:-1].ffill(axis=1), head.iloc[-1:]])  # upper labels carry right",
        f"names = [{p.joiner!r}.join(v for v in head[c] if v) if is_letter(c) else c for c in df.columns]",
        f"df = df.drop(index={list(p.rows)!r})",
        "df.columns = unique_labels(names)",
    ]
    if p.names:
        lines.append(f"df.columns = {list(p.names)!r}")
    return lines


@register_sheet_step(Header, grid_level=True, code=_header_code)
def header(p: Header, sheet: Sheet) -> Outcome:
    if not sheet.is_grid:
        raise RecipeError("the table already has a header; use one header step, before the table steps")
    width = sheet.cells.shape[1]
    if p.names and len(p.names) != width:
        raise RecipeError(f"header names {len(p.names)} columns but the table has {width}")
    missing = _missing_rows(sheet, p.rows)
    if missing:
        raise RecipeError(f"header row(s) {', '.join(map(str, missing))} are not in the table")
    in_head = np.isin(sheet.rows, np.asarray(p.rows, dtype=np.int64))
    head = sheet.cells[in_head]
    head_origin = sheet.origin[in_head].to_numpy()
    if len(head) > 1:  # a label over a merged or blank span belongs to every column under it
        carried = head.iloc[:-1].ffill(axis=1)
        filled = head.iloc[:-1].notna().to_numpy()
        origin_upper = pd.DataFrame(np.where(filled, head_origin[:-1], np.nan)).ffill(axis=1)
        head = pd.concat([carried, head.iloc[-1:]])
        head_origin = np.vstack([origin_upper.fillna(NO_ORIGIN).to_numpy(np.int64), head_origin[-1:]])
    names: list[str] = []
    codes: list[tuple[int, ...]] = []
    for j, label in enumerate(sheet.cells.columns):
        if not LETTER.match(str(label)):
            names.append(str(label))
            codes.append(())
            continue
        parts = [(v, int(head_origin[i, j])) for i, v in enumerate(head.iloc[:, j].tolist()) if v]
        names.append(p.joiner.join(v for v, _ in parts))
        codes.append(tuple(c for _, c in parts if c >= 0))
    renamed: tuple[int, ...] = ()
    if p.names:
        labels = list(p.names)
        if len(set(labels)) != len(labels):
            raise RecipeError("header names must be unique")
        renamed = tuple(c for group in codes for c in group)
    else:
        labels = unique_labels(names)
    body = ~in_head
    cells = sheet.cells[body].set_axis(labels, axis=1)
    origin = sheet.origin[body].set_axis(labels, axis=1)
    made = replace(
        sheet.with_frames(cells, origin, sheet.rows[body]), header=dict(zip(labels, codes, strict=True))
    )
    return Outcome(made, renamed=renamed)


@dataclass(frozen=True)
class LiftTitles(StepParams):
    """Section-title rows (only the first cell filled) become the values of a new first column
    `into` for the rows below each title; the title rows themselves disappear."""

    step = "lift_titles"
    rows: tuple[int, ...]
    into: str

    def check(self) -> None:
        if LETTER.match(self.into):
            raise RecipeError(
                f"step 'lift_titles': the new column needs a name that is not a column letter ({self.into!r})"
            )


def _lift_titles_code(p: LiftTitles) -> list[str]:
    rows = list(p.rows)
    return [
        f"titles = df.loc[{rows!r}].bfill(axis=1).iloc[:, 0]",
        f"df.insert(0, {p.into!r}, titles.reindex(df.index).ffill().where(lambda s: s.notna(), None))",
        "df = df.astype(object).where(df.notna(), None)",
        f"df = df.drop(index={rows!r})",
    ]


@register_sheet_step(LiftTitles, grid_level=True, code=_lift_titles_code)
def lift_titles(p: LiftTitles, sheet: Sheet) -> Outcome:
    missing = _missing_rows(sheet, p.rows)
    if missing:
        raise RecipeError(f"title row(s) {', '.join(map(str, missing))} are not in the table")
    if p.into in sheet.cells.columns:
        raise RecipeError(f"lift_titles would add column {p.into!r}, which the table already has")
    is_title = np.isin(sheet.rows, np.asarray(p.rows, dtype=np.int64))
    filled = sheet.cells.notna().to_numpy()
    first = np.where(filled.any(axis=1), filled.argmax(axis=1), 0)
    positions = np.arange(len(sheet.cells))
    text = pd.Series(sheet.cells.to_numpy()[positions, first], dtype=object)
    code = pd.Series(sheet.origin.to_numpy()[positions, first], dtype="float64")
    titles = text.where(is_title).ffill()
    title_codes = code.where(is_title).ffill().fillna(NO_ORIGIN).astype(np.int64)
    cells = sheet.cells.copy()
    origin = sheet.origin.copy()
    cells.insert(0, p.into, pd.Series(titles.where(titles.notna(), None).to_numpy(), dtype=object))
    origin.insert(0, p.into, np.where(titles.notna(), title_codes.to_numpy(), NO_ORIGIN))
    keep = ~is_title
    made = sheet.with_frames(cells[keep], origin[keep], sheet.rows[keep])
    if made.header is not None:
        made = replace(made, header={p.into: (), **made.header})
    return Outcome(made)
