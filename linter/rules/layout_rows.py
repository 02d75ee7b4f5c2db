"""Layout rules about rows: variables stored in rows, sideways tables, section titles, "same as above"."""

from __future__ import annotations

import re
from collections.abc import Iterable

import pandas as pd

from linter.contract.model import TableContract
from linter.findings import Finding, Severity
from linter.rules.layout_margins import below_titles
from linter.rules.layout_place import frame_letters, layout_finding, shown
from linter.rules.layout_scale import rows_differ_in_scale, sideways_by_ids
from linter.rules.layout_signals import (
    blank,
    cell_kind,
    dominant_kind,
    frame_of,
    names_across,
    sample,
)
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Table

VARIABLES_IN_ROWS = define_rule(
    "layout.variables-in-rows",
    "Variables stored in rows",
    Severity.ERROR,
    """
    Finds a column whose values are names of variables (`temp_min`, `temp_max`) beside a
    column holding their values, so one observation is spread over several rows and one value
    column mixes quantities of different kinds. Fix: spread the names into columns.

    Bad:
        site,day,measure,value
        VB-014,2025-03-02,temp_min,4.1
        VB-014,2025-03-02,temp_max,9.8

    Good:
        site,day,temp_min,temp_max
        VB-014,2025-03-02,4.1,9.8
    """,
)

TRANSPOSED = define_rule(
    "layout.transposed",
    "Table printed sideways",
    Severity.ERROR,
    """
    Finds a table whose variables run down the first column and whose observations run across:
    every row holds one kind of value while the columns mix kinds. Nothing can type or check
    such columns. Fix: swap rows and columns.

    Bad:
        site,VB-014,VB-015
        sampled_on,2025-03-02,2025-03-03
        ph,7.1,6.8

    Good:
        site,sampled_on,ph
        VB-014,2025-03-02,7.1
        VB-015,2025-03-03,6.8
    """,
)

MAX_VARIABLES = 500
"""More rows than this and a table is not a sideways one."""
SAMPLE_BLOCK = 5000
"""Rows looked at by the variables-in-rows detector (the first ones, so row groups stay whole)."""
PAIRED = re.compile(
    r"(^|[_ .-])(min|max|lo|hi|low|high|mean|start|end|first|last)($|[_ .-])|^t?(min|max)", re.I
)


def _holds_values(
    body: pd.DataFrame,
    names: pd.Series,
    levels: list[str],
    values_col: str,
    labels: list[str],
    declared: set[str],
) -> bool:
    """True when `values_col` holds the values of the variables named in `names`."""
    names_col = str(names.name)
    others = [c for c in labels if c not in (names_col, values_col)]
    if not others or body.duplicated(subset=[*others, names_col]).any():
        return False
    if not body.duplicated(subset=others).any():
        return False
    by_kind = {dominant_kind(body.loc[names == level, values_col])[0] for level in levels} - {"empty"}
    return (
        len(declared & set(levels)) >= 2
        or len(by_kind) >= 2
        or sum(bool(PAIRED.search(level)) for level in levels) >= 2
        or (
            not any(UNIT_NAME.match(c) for c in others)
            and (_scales_differ(body, names, levels, values_col) or bool(GENERIC_NAMES.match(names_col)))
        )
    )


GENERIC_NAMES = re.compile(
    r"^(measure|measurement|variable|var|field|attribute|property|key|element|type|quantity|metric)s?$", re.I
)
"""Headers that say "this column names variables" (an analyte or a taxon column is a key, not this)."""
UNIT_NAME = re.compile(r"^(units?|uom|unit_of_measure)$", re.I)
SCALE_GAP = 1000.0
"""Median magnitudes this far apart mean the names are different quantities (cases vs population)."""


def _scales_differ(body: pd.DataFrame, names: pd.Series, levels: list[str], values_col: str) -> bool:
    medians = []
    for level in levels:
        numbers = pd.to_numeric(body.loc[names == level, values_col], errors="coerce").abs().dropna()
        if numbers.empty:
            return False
        medians.append(float(numbers.median()))
    low, high = min(medians), max(medians)
    return low > 0 and high / low >= SCALE_GAP


def find_variables_in_rows(table: Table, contract: TableContract | None = None) -> list[Finding]:
    frame = frame_of(table)
    labels = list(frame.labels)
    body = frame.body.iloc[:SAMPLE_BLOCK]  # a contiguous block: row groups must stay whole
    if len(labels) < 3 or len(body) < 4:
        return []
    declared = set(contract.names) if contract else set()
    findings: list[Finding] = []
    for position, names_col in enumerate(labels[:-1]):
        names = body[names_col]
        if names.isna().any() or dominant_kind(names)[0] != "text":
            continue
        levels = sorted({str(v) for v in names})
        if not 2 <= len(levels) <= 20 or len(levels) * 2 > len(names):
            continue
        values_col = next(
            (
                v
                for v in dict.fromkeys([labels[position + 1], labels[-1]])
                if v != names_col and _holds_values(body, names, levels, v, labels, declared)
            ),
            None,
        )
        if values_col is None:
            continue
        findings.append(
            layout_finding(
                VARIABLES_IN_ROWS,
                table,
                f"The column '{names_col}' holds names of variables ({shown(levels)}) and "
                f"'{values_col}' their values, so one observation takes {len(levels)} rows.",
                f"Make one column per value of '{names_col}', filled from '{values_col}'.",
                {"step": "spread", "names_from": names_col, "values_from": values_col},
                columns=[names_col, values_col],
                letters=frame_letters(frame, [names_col, values_col]),
                count=len(levels),
                examples=levels,
            )
        )
        break
    return findings


def find_transposed(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if not 3 <= grid.shape[0] <= MAX_VARIABLES or grid.shape[1] < 3:
        return []  # a sideways table has one row per variable: a few, not thousands
    if any(blank(v) for v in grid.iloc[0].tolist()):
        return []  # the top row of a sideways table names every observation
    firsts = grid.iloc[1:, 0].tolist()
    if any(blank(v) for v in firsts) or len(set(firsts)) != len(firsts):
        return []
    if any(cell_kind(v) != "text" for v in firsts):
        return []
    declared = set(contract.names) if contract else set()
    row_kinds: list[str] = []
    for index in range(1, grid.shape[0]):
        kind, share = dominant_kind(sample(grid.iloc[index, 1:].tolist()))
        if share < 0.9:
            return []
        row_kinds.append(kind)
    column_shares = [dominant_kind(grid.iloc[1:, j].tolist())[1] for j in range(1, grid.shape[1])]
    mixed = len(set(row_kinds) - {"empty"}) >= 2 and max(column_shares) < 0.85
    named = len(declared & {str(v) for v in firsts}) >= 2 and len(declared & set(map(str, grid.iloc[0]))) < 2
    by_ids = sideways_by_ids(table)
    by_names = names_across(grid) and rows_differ_in_scale(grid)
    if not (mixed or named or by_ids or by_names):
        return []
    return [
        layout_finding(
            TRANSPOSED,
            table,
            "The table is sideways: the first column names variables "
            f"({shown([str(v) for v in firsts])}) and each column is one observation.",
            "Swap rows and columns so that each variable is a column.",
            {"step": "transpose"},
            rows=table.row_numbers[1:],
            columns=[str(grid.iat[0, 0] or "")],
            letters=("A",),
            count=grid.shape[1] - 1,
            examples=[str(v) for v in firsts],
        )
    ]


@inspector()
def variables_in_rows(subject: Subject) -> Iterable[Finding]:
    return find_variables_in_rows(below_titles(subject.table), subject.contract)


@inspector()
def transposed(subject: Subject) -> Iterable[Finding]:
    return find_transposed(subject.table, subject.contract)
