"""Steps that move values between headers and rows: gather and gather_groups (pandas `melt`,
`wide_to_long`) and spread (pandas `pivot`)."""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np
import pandas as pd

from linter.reshape.columns import (
    EMPTY_HEADER,
    compile_pattern,
    header_of,
    is_empty,
    need_columns,
    need_new,
    text_column,
)
from linter.reshape.sheet import NO_ORIGIN, Carried, Sheet, as_header
from linter.reshape.steps import Outcome, RecipeError, StepParams, register_sheet_step


@dataclass(frozen=True)
class Gather(StepParams):
    """Columns whose headers are values of one variable become rows (pandas `melt`)."""

    step = "gather"
    columns: tuple[str, ...]
    names_to: str
    values_to: str
    keep_empty: bool = True


def _gather_code(p: Gather) -> list[str]:
    cols = list(p.columns)
    lines = [
        f"ids = [c for c in df.columns if c not in {cols!r}]",
        f"df = df.melt(id_vars=ids, value_vars={cols!r}, var_name={p.names_to!r}, value_name={p.values_to!r},"
        " ignore_index=False).sort_index(kind='stable')",
    ]
    if not p.keep_empty:
        lines.append(f"df = df[df[{p.values_to!r}].notna()]")
    return lines


@register_sheet_step(Gather, grid_level=False, code=_gather_code)
def gather(p: Gather, sheet: Sheet) -> Outcome:
    need_columns(sheet, p.columns)
    need_new(sheet, [p.names_to, p.values_to])
    ids = [c for c in sheet.cells.columns if c not in p.columns]
    header = header_of(sheet)
    width, n = len(p.columns), len(sheet.cells)
    # Row-major order: all values of one input row stay together, as a reader expects.
    take = np.repeat(np.arange(n), width)
    cells = sheet.cells[ids].iloc[take].reset_index(drop=True)
    origin = sheet.origin[ids].iloc[take].reset_index(drop=True)
    names = np.tile(np.asarray(p.columns, dtype=object), n)
    name_codes = np.tile(np.asarray([(header.get(c) or (NO_ORIGIN,))[-1] for c in p.columns]), n)
    cells[p.names_to] = text_column(names)
    origin[p.names_to] = as_header(name_codes)
    cells[p.values_to] = text_column(sheet.cells[list(p.columns)].to_numpy(dtype=object).ravel())
    origin[p.values_to] = sheet.origin[list(p.columns)].to_numpy().ravel()
    rows = sheet.rows[take]
    keep = ~is_empty(cells[p.values_to]) if not p.keep_empty else np.ones(len(cells), dtype=bool)
    # a gathered column that leaves no row takes its header with it, on purpose
    left = set(p.columns) if len(keep) and keep.all() else set(names[keep].tolist())
    gone = [c for c in p.columns if c not in left]
    dropped = ((tuple(x for c in gone for x in header.get(c, ())), EMPTY_HEADER),)
    cells, origin, rows = cells[keep], origin[keep], rows[keep]
    carried = (Carried.of([(c, name) for name in p.columns for c in (header.get(name) or ())[:-1]]),)
    new_header = {c: header.get(c, ()) for c in ids} | {p.names_to: (), p.values_to: ()}
    made = replace(sheet.with_frames(cells, origin, rows), header=new_header)
    return Outcome(made, dropped=dropped, carried=carried)


@dataclass(frozen=True)
class GatherGroups(StepParams):
    """Repeated column groups (`Sample 1 Depth, Sample 1 Result, Sample 2 Depth, ...`) become one
    row per group with one column per member. The pattern has a group named `member` and one
    other named group, the group id, whose values go to column `names_to`."""

    step = "gather_groups"
    pattern: str
    names_to: str
    keep_empty: bool = True

    def check(self) -> None:
        groups = list(compile_pattern(self.pattern).groupindex)
        if "member" not in groups or len(groups) != 2:
            raise RecipeError(
                "step 'gather_groups': the pattern needs a group named 'member' and one other named group"
                f" (the group id); it has {groups or 'no named groups'}"
            )


def _gather_groups_code(p: GatherGroups) -> list[str]:
    lines = [
        f"found = {{c: m for c in df.columns if (m := re.search({p.pattern!r}, str(c)))}}",
        f"group_id = [g for g in re.compile({p.pattern!r}).groupindex if g != 'member'][0]",
        "ids = [c for c in df.columns if c not in found]",
        "groups = list(dict.fromkeys(m.group(group_id) for m in found.values()))",
        "members = list(dict.fromkeys(m.group('member') for m in found.values()))",
        "column = {(m.group(group_id), m.group('member')): c for c, m in found.items()}",
        "pieces = [df[ids].assign(**{" + repr(p.names_to) + ": g},"
        " **{m: df[column[(g, m)]] if (g, m) in column else None for m in members}) for g in groups]",
        "df = pd.concat(pieces).sort_index(kind='stable').astype(object)",
        "df = df.where(df.notna(), None)",
    ]
    if not p.keep_empty:
        lines.append("df = df[df[members].notna().any(axis=1)]")
    return lines


@register_sheet_step(GatherGroups, grid_level=False, code=_gather_groups_code)
def gather_groups(p: GatherGroups, sheet: Sheet) -> Outcome:
    regex = compile_pattern(p.pattern)
    id_group = next(g for g in regex.groupindex if g != "member")
    header = header_of(sheet)
    matched = {c: m for c in sheet.cells.columns if (m := regex.search(str(c)))}
    if not matched:
        raise RecipeError(f"no column name matches the pattern {p.pattern!r}")
    ids = [c for c in sheet.cells.columns if c not in matched]
    group_ids = list(dict.fromkeys(m.group(id_group) for m in matched.values()))
    members = list(dict.fromkeys(m.group("member") for m in matched.values()))
    need_new(sheet, [p.names_to, *members])
    column_of = {(m.group(id_group), m.group("member")): c for c, m in matched.items()}
    if len(column_of) != len(matched):
        raise RecipeError(f"two columns give the same group and member under pattern {p.pattern!r}")
    n, k = len(sheet.cells), len(group_ids)
    take = np.repeat(np.arange(n), k)
    cells = sheet.cells[ids].iloc[take].reset_index(drop=True)
    origin = sheet.origin[ids].iloc[take].reset_index(drop=True)
    id_codes = []  # the id value comes from the header of the group's first member column
    for g in group_ids:
        codes = [(header.get(column_of[(g, m)]) or (NO_ORIGIN,))[-1] for m in members if (g, m) in column_of]
        id_codes.append(codes[0] if codes else NO_ORIGIN)
    cells[p.names_to] = text_column(np.tile(np.asarray(group_ids, dtype=object), n))
    origin[p.names_to] = as_header(np.tile(np.asarray(id_codes, dtype=np.int64), n))
    blank = np.full(n, None, dtype=object)
    no_origin = np.full(n, NO_ORIGIN, dtype=np.int64)
    for member in members:
        stacked_cells = [
            sheet.cells[column_of[(g, member)]].to_numpy(dtype=object) if (g, member) in column_of else blank
            for g in group_ids
        ]
        stacked_codes = [
            sheet.origin[column_of[(g, member)]].to_numpy() if (g, member) in column_of else no_origin
            for g in group_ids
        ]
        cells[member] = text_column(np.column_stack(stacked_cells).ravel())
        origin[member] = np.column_stack(stacked_codes).ravel()
    rows = sheet.rows[take]
    keep = np.ones(len(cells), dtype=bool)
    if not p.keep_empty:
        keep = ~np.logical_and.reduce([is_empty(cells[m]) for m in members])
    group_of = cells[p.names_to].to_numpy()
    gone = [c for c, m in matched.items() if not keep[group_of == m.group(id_group)].any()]
    dropped = ((tuple(x for c in gone for x in header.get(c, ())), EMPTY_HEADER),)
    cells, origin, rows = cells[keep], origin[keep], rows[keep]
    carried = (
        Carried.of([(c, m.group(id_group)) for col, m in matched.items() for c in header.get(col, ())]),
    )
    new_header = {c: header.get(c, ()) for c in ids} | {p.names_to: ()}
    for member in members:
        new_header[member] = tuple(
            c for g in group_ids if (g, member) in column_of for c in header.get(column_of[(g, member)], ())
        )
    made = replace(sheet.with_frames(cells, origin, rows), header=new_header)
    return Outcome(made, dropped=dropped, carried=carried)


@dataclass(frozen=True)
class Spread(StepParams):
    """A column of variable names beside a value column becomes one column per name (pandas
    `pivot`); all other columns identify a row. Two values for one cell are a recipe error,
    reported by the audit, never collapsed."""

    step = "spread"
    names_from: str
    values_from: str


def _spread_code(p: Spread) -> list[str]:
    n, v = repr(p.names_from), repr(p.values_from)
    return [
        f"ids = [c for c in df.columns if c not in ({n}, {v})]",
        "df = df.assign(_row=df.groupby(ids, dropna=False, sort=False).ngroup() if ids else 0)",
        "first = df.drop_duplicates('_row')  # a group's first row keeps its row number",
        f"named = df.dropna(subset=[{n}]).drop_duplicates(['_row', {n}])  # a second value is lost",
        f"wide = named.pivot(index='_row', columns={n}, values={v})",
        f"wide = wide.reindex(columns=list(named[{n}].unique()))",
        "out = first.set_index('_row')[ids].join(wide)",
        "out.index = first.index",
        "df = out.astype(object).where(out.notna(), None)",
        "df.columns.name = None",
    ]


@register_sheet_step(Spread, grid_level=False, code=_spread_code)
def spread(p: Spread, sheet: Sheet) -> Outcome:
    need_columns(sheet, (p.names_from, p.values_from))
    header = header_of(sheet)
    ids = [c for c in sheet.cells.columns if c not in (p.names_from, p.values_from)]
    n = len(sheet.cells)
    group = (
        sheet.cells[ids].groupby(ids, dropna=False, sort=False).ngroup().to_numpy()
        if ids
        else np.zeros(n, dtype=np.int64)
    )
    names_cells = sheet.cells[p.names_from]
    named = ~is_empty(names_cells)
    name_index, uniques = pd.factorize(names_cells.where(named, None), use_na_sentinel=True)
    names = [str(x) for x in uniques]
    need_new(replace(sheet, cells=sheet.cells[ids]), names)
    pairs = pd.DataFrame({"g": group, "n": name_index})
    clash = (pairs.duplicated(keep="first") & named).to_numpy()
    place = named & ~clash
    groups = int(group.max()) + 1 if n else 0
    value_codes = sheet.origin[p.values_from].to_numpy()
    wide = np.full((groups, len(names)), None, dtype=object)
    wide_codes = np.full((groups, len(names)), NO_ORIGIN, dtype=np.int64)
    wide[group[place], name_index[place]] = sheet.cells[p.values_from].to_numpy(dtype=object)[place]
    wide_codes[group[place], name_index[place]] = value_codes[place]
    first = pd.Series(np.arange(n)).groupby(group).first().to_numpy() if n else np.zeros(0, dtype=np.int64)
    cells = sheet.cells[ids].iloc[first].reset_index(drop=True)
    origin = sheet.origin[ids].iloc[first].reset_index(drop=True)
    for j, name in enumerate(names):
        cells[name] = text_column(wide[:, j])
        origin[name] = wide_codes[:, j]
    name_codes = sheet.origin[p.names_from].to_numpy()
    new_header = {c: header.get(c, ()) for c in ids}
    for j, name in enumerate(names):
        new_header[name] = tuple(name_codes[named & (name_index == j) & (name_codes >= 0)].tolist())
    labels = tuple(header.get(p.names_from, ()) + header.get(p.values_from, ()))
    notes: list[tuple[str, str, tuple[int, ...]]] = []
    if clash.any():
        lost = tuple(int(c) for c in value_codes[clash] if c >= 0)
        notes.append(
            (
                "collision",
                f"{int(clash.sum())} value(s) share their row and {p.names_from!r} with another",
                lost,
            )
        )
    if (~named & ~is_empty(sheet.cells[p.values_from])).any():
        lost = tuple(int(c) for c in value_codes[~named & ~is_empty(sheet.cells[p.values_from])] if c >= 0)
        notes.append(("unnamed", f"value(s) whose {p.names_from!r} is empty have no column to go to", lost))
    # The identifying cells of a group's later rows equal its first row's: they live on there.
    later = np.ones(n, dtype=bool)
    later[first] = False
    id_texts = sheet.cells[ids].to_numpy(dtype=object)[later]
    id_codes = sheet.origin[ids].to_numpy()[later]
    carried = (Carried(id_codes.ravel().astype(np.int64), id_texts.ravel()),)
    made = replace(sheet.with_frames(cells, origin, sheet.rows[first]), header=new_header)
    return Outcome(made, dropped=((labels, "layout label"),), notes=tuple(notes), carried=carried)
