"""The `join_files` step: files that hold different variables about the same units become one
table, outer-joined on their shared key so that a unit present in one file only is kept."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, replace

import numpy as np
import pandas as pd

from linter.reshape.sheet import NO_ORIGIN, Bench, Carried, CellIndex, Sheet, StepNote
from linter.reshape.steps import RecipeError, StepParams, register_bench_step

ONE_FILE_ONLY = "one-file-only"
"""StepNote kind for key cells of a unit that only one of the joined files has."""

_EMPTY_KEY = "\u2400(empty)"
"""Stands for an empty key cell while matching (pandas matches None unevenly)."""


@dataclass(frozen=True)
class JoinFiles(StepParams):
    """All tables on the bench (one per file, in the order given) are joined on the `on` columns;
    every file must have them and no two rows of one file may share a key (one row per unit)."""

    step = "join_files"
    on: tuple[str, ...]

    def check(self) -> None:
        if not self.on or any(not c.strip() for c in self.on) or len(set(self.on)) != len(self.on):
            raise RecipeError("join_files needs one or more different key columns in 'on'")


def _join_code(p: JoinFiles) -> list[str]:
    return [
        "# parts: one DataFrame per file, in the order of the recipe's files (read with dtype=str)",
        "df = parts[0]",
        "for part in parts[1:]:",
        f"    df = df.merge(part, on={list(p.on)!r}, how='outer', validate='one_to_one')",
    ]


def _take(frame: pd.DataFrame, positions: np.ndarray, fill: int | None) -> pd.DataFrame:
    """Rows of `frame` at `positions`; a position of -1 gives a row of `fill`."""
    taken = frame.iloc[np.where(positions >= 0, positions, 0)].reset_index(drop=True)
    present = np.broadcast_to((positions >= 0)[:, None], taken.shape)
    if fill is None:
        return taken.astype(object).where(present, None)
    return taken.where(present, fill)


def _check_unique(name: str, sheet: Sheet, on: list[str]) -> None:
    repeated = sheet.cells[on].fillna(_EMPTY_KEY).duplicated(keep=False).to_numpy()
    if repeated.any():
        rows = ", ".join(str(r) for r in sheet.rows[repeated][:6].tolist())
        raise RecipeError(f"{name!r}: rows {rows} share a {'+'.join(on)}; a join needs one row per key")


def join_two(left: Sheet, right: Sheet, on: list[str]) -> tuple[Sheet, tuple[int, ...], Carried]:
    """The outer join of two sheets, the origin codes of key cells of units only one has, and the
    right sheet's matched key cells with the output key text each lives on in."""
    others = [c for c in right.cells.columns if c not in on]
    clash = [c for c in others if c in left.cells.columns]
    if clash:
        raise RecipeError(
            f"column(s) {', '.join(map(repr, clash))} are in both files but not in the key; "
            "add them to 'on' or rename them first"
        )
    keys_l = left.cells[on].fillna(_EMPTY_KEY).assign(_l=np.arange(len(left.cells)))
    keys_r = right.cells[on].fillna(_EMPTY_KEY).assign(_r=np.arange(len(right.cells)))
    matched = keys_l.merge(keys_r, on=on, how="outer", sort=False)
    li = matched["_l"].fillna(-1).astype(np.int64).to_numpy()
    ri = matched["_r"].fillna(-1).astype(np.int64).to_numpy()
    cells = _take(left.cells, li, None)
    origin = _take(left.origin, li, NO_ORIGIN).astype(np.int64)
    right_only = li < 0
    right_keys = _take(right.cells[on], ri, None)
    right_codes = _take(right.origin[on], ri, NO_ORIGIN).astype(np.int64)
    for column in on:  # a unit only the right file has takes its key from the right file
        cells.loc[right_only, column] = right_keys.loc[right_only, column]
        origin.loc[right_only, column] = right_codes.loc[right_only, column]
    for column in others:
        cells[column] = _take(right.cells[[column]], ri, None)[column]
        origin[column] = _take(right.origin[[column]], ri, NO_ORIGIN)[column].astype(np.int64)
    rows = np.where(li >= 0, left.rows[np.maximum(li, 0)], right.rows[np.maximum(ri, 0)])
    header = {c: tuple((left.header or {}).get(c, ())) for c in left.cells.columns}
    for column in on:  # the right file's key header and key cells live on in the left's
        header[column] += tuple((right.header or {}).get(column, ()))
    for column in others:
        header[column] = tuple((right.header or {}).get(column, ()))
    lone = np.concatenate(
        [
            left.origin[on].to_numpy()[np.setdiff1d(np.arange(len(left.cells)), li[ri >= 0])].ravel(),
            right.origin[on].to_numpy()[np.setdiff1d(np.arange(len(right.cells)), ri[li >= 0])].ravel(),
        ]
    )
    both = (li >= 0) & (ri >= 0)
    codes = right_codes.loc[both, on].to_numpy().ravel()
    texts = cells.loc[both, on].to_numpy(dtype=object).ravel()
    merged = Carried(codes[codes >= 0].astype(np.int64), texts[codes >= 0])
    joined = replace(left.with_frames(cells, origin, rows), header=header)
    return joined, tuple(int(c) for c in lone if c >= 0), merged


@register_bench_step(JoinFiles, grid_level=False, code=_join_code)
def join_files(p: JoinFiles, bench: Bench) -> Bench:
    """Join every sheet of the bench, in order, into one table named after the first file."""
    if len(bench.sheets) < 2:
        raise RecipeError("join_files needs two or more files")
    on = list(p.on)
    for name, sheet in bench.sheets.items():
        missing = [c for c in on if c not in sheet.cells.columns]
        if missing:
            raise RecipeError(f"{name!r} has no column(s) {', '.join(map(repr, missing))}")
        _check_unique(name, sheet, on)
    (first, joined), *rest = bench.sheets.items()
    lone: list[int] = []
    # A matched key cell of a later file lives on in the key cell of the output row it joined.
    carried: list[Carried] = []
    for _, sheet in rest:
        joined, alone, merged = join_two(joined, sheet, on)
        lone += alone
        carried.append(merged)
    note = StepNote(
        bench.step,
        ONE_FILE_ONLY,
        f"{len(lone) // len(on)} unit(s) are in one file only; kept with empty cells for the other "
        "file's variables",
        tuple(lone),
    )
    return replace(
        bench,
        sheets={first: joined},
        notes=(*bench.notes, note) if lone else bench.notes,
        carried=(*bench.carried, *(c for c in carried if len(c.codes))),
    )


def texts_of(index: CellIndex, codes: Sequence[int]) -> list[str]:
    """The input text behind each origin code (for Carried records and the audit's listing)."""
    out: list[str] = []
    for code in codes:
        cell = code // 2
        which = int(np.searchsorted(np.asarray(index.offsets), cell, side="right")) - 1
        table = index.tables[which]
        row, col = divmod(cell - index.offsets[which], table.grid.shape[1])
        value = table.grid.iat[row, col]
        out.append("" if value is None else str(value))
    return out
