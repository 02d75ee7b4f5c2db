"""Key rules: each row identified once by its key, no empty key cell, the expected key grid complete."""

from __future__ import annotations

import math
from collections.abc import Iterator

import numpy as np
import pandas as pd

from linter.findings import Finding, Severity
from linter.rules.cell_findings import column_finding, counted, engine_result, place_of, written
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject

define_rule(
    "keys.duplicate",
    "Rows that share a key",
    Severity.ERROR,
    """
    Finds groups of rows with the same values in all key columns: the observational unit is
    then recorded more than once. One finding per group, naming every row of the group.

    Bad:  VB-014, 2026-03-02, NITRATE on rows 4 and 9

    Good: each site, date and analyte appears on one row only
    """,
)
define_rule(
    "keys.missing",
    "Empty key cell",
    Severity.ERROR,
    """
    Finds empty cells (or missing-value codes) in a key column; such a row cannot be
    identified.

    Bad:  site_id empty on row 6

    Good: site_id VB-014 on row 6
    """,
)
define_rule(
    "keys.incomplete-grid",
    "Expected key combination is absent",
    Severity.WARNING,
    """
    When the contract names complete_over columns, finds combinations of their values seen in
    the file that have no row (for example a site with no row for one month).

    Bad:  VB-014 has rows for 2026-01 and 2026-03, but not 2026-02

    Good: every site has a row for every month in the file
    """,
)

GRID_EXAMPLES_LIMIT = 200_000
"""Above this many combinations, the absent ones are counted but not listed."""


@inspector(needs_contract=True, row_wise=True)
def duplicate_keys(subject: Subject) -> Iterator[Finding]:
    result = engine_result(subject)
    contract = subject.contract
    if result is None or contract is None or not contract.keys:
        return
    keys = list(contract.keys)
    if any(k not in result.converted for k in keys):
        return  # a key column is missing: the key cannot be judged (columns.missing says why)
    unique = result.failures["kind"].to_numpy(dtype=object) == "unique"
    flagged = sorted(set(result.failures["row"].to_numpy(dtype=np.int64)[unique].tolist()))
    if not flagged:  # the usual case: grouping no rows still costs pandas milliseconds
        result.raise_if_unrun("unique")
        return
    typed = result.typed.loc[flagged, keys]
    # dropna: an empty key cell is keys.missing, never a duplicate of another empty one.
    group_of = typed.groupby(keys, sort=False, dropna=True).ngroup()
    for _, members in group_of[group_of >= 0].groupby(group_of[group_of >= 0], sort=True):
        rows = sorted(int(r) for r in members.index)
        if len(rows) < 2:
            continue
        shown = ", ".join(f"{k}={written(subject, k, rows[:1])[0]}" for k in keys)
        yield Finding(
            rule="keys.duplicate",
            severity=Severity.ERROR,
            message=f"{len(rows)} rows share the key {shown}; each key may appear once.",
            place=place_of(subject, keys, rows),
            count=len(rows),
            examples=(shown,),
            fix=f"keep one row for {shown}, or correct the key of the others "
            f"(rows {', '.join(map(str, rows))})",
            evidence={"key": keys, "rows": rows},
        )
    result.raise_if_unrun("unique")


@inspector(needs_contract=True, row_wise=True)
def missing_keys(subject: Subject) -> Iterator[Finding]:
    result = engine_result(subject)
    contract = subject.contract
    if result is None or contract is None:
        return
    for key in contract.keys:
        converted = result.converted.get(key)
        if converted is None or not converted.missing.any():
            continue
        rows = [int(r) for r in converted.missing.index[converted.missing]]
        yield column_finding(
            subject,
            "keys.missing",
            key,
            rows,
            f"{counted(len(rows), 'row', 'has', 'have')} no {key}, a key column; "
            "such rows cannot be identified.",
            f"fill in {key} on every row",
        )


@inspector(needs_contract=True)
def incomplete_grid(subject: Subject) -> Iterator[Finding]:
    contract = subject.contract
    if contract is None or not contract.complete_over:
        return  # before the engine runs: most contracts ask for no complete grid
    result = engine_result(subject)
    if result is None:
        return
    over = list(contract.complete_over)
    if any(c not in result.converted for c in over):
        return
    index = subject.frame.row_index
    usable = pd.Series(True, index=index)
    for column in over:  # empty or unreadable cells are other findings; they do not define the grid
        usable &= ~result.converted[column].missing & result.converted[column].reason.isna()
    text = pd.DataFrame({c: subject.frame.body[c].set_axis(index).str.strip() for c in over})[usable]
    levels = [sorted(text[c].unique()) for c in over]
    present = set(map(tuple, text.drop_duplicates().itertuples(index=False, name=None)))
    expected = math.prod(len(level) for level in levels)
    absent_count = expected - len(present)
    if absent_count <= 0:
        return
    examples: list[str] = []
    if expected <= GRID_EXAMPLES_LIMIT:
        grid = pd.MultiIndex.from_product(levels, names=over)
        absent = [combo for combo in grid if combo not in present]
        examples = [", ".join(f"{c}={v}" for c, v in zip(over, combo, strict=True)) for combo in absent[:5]]
    yield Finding(
        rule="keys.incomplete-grid",
        severity=Severity.WARNING,
        message=f"Of {', '.join(over)}, {counted(absent_count, 'combination', 'has', 'have')} no row, "
        "although each "
        f"value appears elsewhere in the file ({expected} expected, {len(present)} present).",
        place=place_of(subject, over),
        count=absent_count,
        examples=tuple(examples),
        fix="add the rows that are absent (with missing-value codes if nothing was measured), "
        "or tell the data manager why they are absent",
        evidence={"over": over, "expected": expected, "present": len(present)},
    )
