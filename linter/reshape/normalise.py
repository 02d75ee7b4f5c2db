"""The steps that change how many tables there are: `split_by_unit` (one table -> one per unit) and
`stack_files` (several files of one unit -> one table), with the lossless-join audit of a split."""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, replace
from pathlib import PurePath
from typing import TYPE_CHECKING

import numpy as np
import pandas as pd

from linter.reshape.sheet import NO_ORIGIN, Bench, CellIndex, Dropped, Sheet, StepNote, sheet_of
from linter.reshape.steps import STEPS, RecipeError, StepParams, register_bench_step
from linter.table import Table

if TYPE_CHECKING:
    from linter.reshape.apply import Reshaped
    from linter.reshape.recipe import Recipe


@dataclass(frozen=True)
class UnitTable(StepParams):
    """One output table of a split: its name, its key and its columns (key included)."""

    name: str
    key: tuple[str, ...]
    columns: tuple[str, ...]


@dataclass(frozen=True)
class SplitByUnit(StepParams):
    """One table holding several kinds of observational unit becomes one table per unit: each is
    the distinct rows of its columns, and its key must then identify every row (else the columns
    do not describe that unit only, and splitting would lose or invent values)."""

    step = "split_by_unit"
    tables: tuple[UnitTable, ...]

    def check(self) -> None:
        names = [t.name for t in self.tables]
        if len(self.tables) < 2 or len(set(names)) != len(names):
            raise RecipeError("split_by_unit needs two or more tables with different names")
        for table in self.tables:
            if not table.key or not set(table.key) <= set(table.columns):
                raise RecipeError(f"table {table.name!r}: its key must be one or more of its columns")


def _split_code(p: SplitByUnit) -> list[str]:
    lines = []
    for t in p.tables:
        lines.append(f"{t.name} = df[{list(t.columns)!r}].drop_duplicates().reset_index(drop=True)")
        lines.append(f"assert not {t.name}.duplicated({list(t.key)!r}).any()  # one row per {t.name} key")
    return lines


def _empty(cells: pd.DataFrame) -> np.ndarray:
    return (cells.isna() | (cells == "")).to_numpy(dtype=bool)


def _split_sheet(p: SplitByUnit, sheet: Sheet) -> tuple[dict[str, Sheet], list[Dropped], int]:
    """The split of one sheet and the repeated input cells no output table keeps."""
    cells = sheet.cells
    wanted = {c for t in p.tables for c in t.columns}
    missing = sorted(wanted - {str(c) for c in cells.columns})
    if missing:
        raise RecipeError(f"column(s) {', '.join(map(repr, missing))} are not in the table")
    left_out = [str(c) for c in cells.columns if str(c) not in wanted]
    if left_out:
        raise RecipeError(f"column(s) {', '.join(map(repr, left_out))} go to no table; name them in one")
    kept_anywhere = np.zeros(cells.shape, dtype=bool)
    position = {str(c): i for i, c in enumerate(cells.columns)}
    out: dict[str, Sheet] = {}
    for table in p.tables:
        columns = list(table.columns)
        kept = ~cells[columns].duplicated(keep="first").to_numpy()
        clash = cells.loc[kept, list(table.key)].duplicated(keep=False).to_numpy()
        if clash.any():
            rows = sheet.rows[kept][clash][:6].tolist()
            raise RecipeError(
                f"table {table.name!r}: rows {', '.join(map(str, rows))} share a {'+'.join(table.key)} "
                f"but differ in {', '.join(c for c in columns if c not in table.key)}; correct them first"
            )
        for c in columns:
            kept_anywhere[kept, position[c]] = True
        header = {c: tuple((sheet.header or {}).get(c, ())) for c in columns}
        made = sheet.with_frames(cells.loc[kept, columns], sheet.origin.loc[kept, columns], sheet.rows[kept])
        out[table.name] = replace(made, header=header)
    codes = sheet.origin.to_numpy()
    repeats = ~kept_anywhere & ~_empty(cells) & (codes >= 0)
    dropped = [Dropped(tuple(int(c) for c in codes[repeats]), "repeat", 0)] if repeats.any() else []
    return out, dropped, int(repeats.sum())


@register_bench_step(SplitByUnit, grid_level=False, code=_split_code)
def split_by_unit(p: SplitByUnit, bench: Bench) -> Bench:
    """Split every sheet that has the named columns (the usual case: the one sheet of a file)."""
    sheets: dict[str, Sheet] = {}
    dropped = list(bench.dropped)
    fitting = [
        n for n, s in bench.sheets.items() if {c for t in p.tables for c in t.columns} <= set(s.cells.columns)
    ]
    if not fitting:
        raise RecipeError("no table has all the columns the split names")
    for name, sheet in bench.sheets.items():
        if name not in fitting:
            sheets[name] = sheet
            continue
        parts, repeats, _ = _split_sheet(p, sheet)
        prefix = "" if len(fitting) == 1 else f"{name}-"
        sheets |= {prefix + part: s for part, s in parts.items()}
        dropped += [replace(d, step=bench.step) for d in repeats]
    return replace(bench, sheets=sheets, dropped=tuple(dropped))


@dataclass(frozen=True)
class StackFiles(StepParams):
    """Several files with the same columns, each holding one value of a variable in its name
    (a month, a site, a lab), become one table with that value as a new column."""

    step = "stack_files"
    column: str
    values: dict[str, str]

    def check(self) -> None:
        if not self.column.strip() or len(self.values) < 2:
            raise RecipeError("stack_files needs a new column name and two or more files with their value")


def _stack_code(p: StackFiles) -> list[str]:
    return [
        f"parts = {{f: pd.read_csv(f, dtype=str, keep_default_na=False) for f in {list(p.values)!r}}}",
        f"df = pd.concat([d.assign(**{{{p.column!r}: v}}) for f, v in {dict(p.values)!r}.items() "
        "for d in [parts[f]]], ignore_index=True)",
    ]


def _value_for(sheet: Sheet, bench: Bench, name: str, values: Mapping[str, str]) -> str | None:
    """The value the recipe gives the file a sheet came from (named by path, file name or stem)."""
    codes = sheet.origin.to_numpy().ravel()
    first = next((int(c) for c in codes if c >= 0), None)
    source = bench.index.decode(first).source if first is not None else name  # type: ignore[union-attr]
    for spelling in (source, PurePath(source).as_posix(), PurePath(source).name, PurePath(source).stem, name):
        if spelling in values:
            return values[spelling]
    return None


@register_bench_step(StackFiles, grid_level=False, code=_stack_code)
def stack_files(p: StackFiles, bench: Bench) -> Bench:
    named = [(n, s, _value_for(s, bench, n, p.values)) for n, s in bench.sheets.items()]
    chosen = [(n, s, v) for n, s, v in named if v is not None]
    if len(chosen) < 2:
        raise RecipeError(f"stack_files names {', '.join(sorted(p.values))}, but fewer than two were given")
    columns = [str(c) for c in chosen[0][1].cells.columns]
    for name, sheet, _ in chosen[1:]:
        if sorted(map(str, sheet.cells.columns)) != sorted(columns):
            raise RecipeError(
                f"{name!r} does not have the same columns as {chosen[0][0]!r}; they cannot be stacked"
            )
    if p.column in columns:
        raise RecipeError(f"new column {p.column!r} would repeat a column")
    cells = pd.concat([s.cells[columns] for _, s, _ in chosen], ignore_index=True)
    origin = pd.concat([s.origin[columns] for _, s, _ in chosen], ignore_index=True)
    cells[p.column] = [v for _, s, v in chosen for _ in range(len(s.cells))]
    origin[p.column] = NO_ORIGIN
    rows = np.concatenate([s.rows for _, s, _ in chosen])
    header: dict[str, tuple[int, ...]] = {c: () for c in [*columns, p.column]}
    for _, sheet, _ in chosen:
        for c in columns:
            header[c] += tuple((sheet.header or {}).get(c, ()))
    stems = [PurePath(n).name for n, _, _ in chosen]
    target = _common_name(stems)
    stacked = replace(chosen[0][1].with_frames(cells.astype(object), origin, rows), header=header)
    sheets = {n: s for n, s in bench.sheets.items() if n not in {c[0] for c in chosen}}
    sheets[target] = stacked
    # The new column's values come from file names, not cells: say so, for the audit's record.
    note = StepNote(
        bench.step,
        "from-file-name",
        f"column {p.column!r} holds the value each file's name gave: "
        + ", ".join(f"{n} -> {v}" for n, _, v in chosen),
    )
    return replace(bench, sheets=sheets, notes=(*bench.notes, note))


def _common_name(names: Sequence[str]) -> str:
    """What the stacked files' names share (vb_2026-01, vb_2026-02 -> vb), else `stacked`."""
    prefix = names[0]
    for name in names[1:]:
        while not name.startswith(prefix):
            prefix = prefix[:-1]
    if prefix and prefix[-1] not in SEPARATORS:
        # Cut a half-shared token (vb_2026-0 of vb_2026-01/-02) back to the last separator.
        cut = max(prefix.rfind(c) for c in SEPARATORS)
        prefix = prefix[:cut] if cut > 0 else ""
    return prefix.strip(SEPARATORS) or "stacked"


SEPARATORS = " _-."


def apply_recipe_to_tables(tables: Sequence[Table], recipe: Recipe) -> Reshaped:
    """Apply `recipe` to several tables at once (one sheet each), for steps such as `stack_files`."""
    from linter.reshape.apply import Reshaped, _apply_step, _implicit_header, output_name

    index = CellIndex.of(tuple(tables))
    sheets = {output_name(t): sheet_of(t, index, i) for i, t in enumerate(tables)}
    if len(sheets) != len(tables):
        raise RecipeError("two of the files have the same name; give them different names")
    bench = Bench(index, sheets)
    for number, step in enumerate(recipe.steps, start=1):
        if not STEPS[type(step).step].grid_level:
            bench = _implicit_header(bench, number)
        bench = _apply_step(bench, step, number)
    bench = _implicit_header(bench, len(recipe.steps) + 1)
    out, provenance, headers, rows = {}, {}, {}, {}
    for name, sheet in bench.sheets.items():
        out[name] = sheet.cells.astype(object).where(sheet.cells.notna(), None).reset_index(drop=True)
        provenance[name] = sheet.origin.reset_index(drop=True)
        headers[name] = dict(sheet.header or {})
        rows[name] = tuple(int(r) for r in sheet.rows)
    return Reshaped(
        out, provenance, headers, rows, index, bench.dropped, bench.notes, bench.renamed, bench.carried
    )


@dataclass(frozen=True)
class JoinAudit:
    """Whether joining a split's tables on their shared columns gives back the input rows exactly."""

    lossless: bool
    input_rows: int
    joined_rows: int
    missing: tuple[tuple[str | None, ...], ...] = ()
    """Input rows (as value tuples) the join does not give back (at most 10)."""
    invented: tuple[tuple[str | None, ...], ...] = ()
    """Rows the join makes that the input did not have (at most 10)."""


MISSING_MARK = "\u2400(empty)"
"""Stands for an empty cell while comparing rows (pandas joins and counts None unevenly)."""


def join_back(tables: Mapping[str, pd.DataFrame], step: SplitByUnit) -> pd.DataFrame:
    """The natural join of a split's tables, largest first, each joined on the columns it shares."""
    order = sorted(step.tables, key=lambda t: -len(tables[t.name]))
    joined = tables[order[0].name].fillna(MISSING_MARK)
    for table in order[1:]:
        part = tables[table.name].fillna(MISSING_MARK)
        shared = [c for c in part.columns if c in joined.columns]
        joined = joined.merge(part, on=shared, how="inner") if shared else joined.merge(part, how="cross")
    return joined


def audit_split(original: pd.DataFrame, tables: Mapping[str, pd.DataFrame], step: SplitByUnit) -> JoinAudit:
    """Compare the join of the split with the input as multisets of rows (order aside)."""
    joined = join_back(tables, step)
    columns = list(original.columns)
    left = original.fillna(MISSING_MARK).astype(str).value_counts(subset=columns, dropna=False)
    right = joined[columns].astype(str).value_counts(subset=columns, dropna=False)
    both = pd.concat([left.rename("input"), right.rename("joined")], axis=1).fillna(0)
    short = both[both["input"] > both["joined"]].index.tolist()
    extra = both[both["joined"] > both["input"]].index.tolist()

    def rows_of(index: list[object]) -> tuple[tuple[str | None, ...], ...]:
        return tuple(
            tuple(None if v == MISSING_MARK else str(v) for v in (i if isinstance(i, tuple) else (i,)))
            for i in index[:10]
        )

    return JoinAudit(not short and not extra, len(original), len(joined), rows_of(short), rows_of(extra))
