"""Which discovered dependencies are strong enough to tell a provider that a table mixes units.

A contract-free false alarm is costly, so the thresholds are stated and conservative:

- a table needs at least MIN_ROWS body rows, with or without a contract: in a small file many
  dependencies hold by chance (in a 12-row site register, `active` "depends" on `county`);
- a determining column set X must repeat: at most rows / MIN_GROUP distinct values and at
  least MIN_REPEATED_GROUPS values that occur on two or more rows;
- X is never empty (a constant column is no unit), never holds the key, and the dependent
  column is never a key column and takes at least two values;
- a probable entry error is an approximate dependency (g3 at most MAX_ERROR_SHARE of the rows,
  and at most MAX_ERROR_ROWS rows) with a single-column X meeting the same repetition test,
  which fails exactly.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import pandas as pd

from linter.profile.dependencies import Dependency, exception_rows, functional_dependencies
from linter.profile.keys import unique_combinations
from linter.profile.normalise import Split, propose_split

MIN_ROWS = 20
MIN_GROUP = 3
MIN_REPEATED_GROUPS = 2
MAX_ERROR_SHARE = 0.05
MAX_ERROR_ROWS = 10
MAX_LHS = 2


@dataclass(frozen=True)
class MixedUnits:
    """A table whose columns describe more than one kind of unit, and the proposed split."""

    key: tuple[str, ...]
    split: Split
    strong: tuple[Dependency, ...]
    """The dependencies that passed the thresholds (the evidence)."""


@dataclass(frozen=True)
class EntryError:
    """An approximate dependency and the rows that break it."""

    dependency: Dependency
    positions: tuple[int, ...]
    """0-based body positions of the breaking rows."""
    also: tuple[str, ...] = ()
    """Other single columns the same rows break the dependency on (aliases of the same unit)."""


def table_key(frame: pd.DataFrame, declared: Sequence[str] = ()) -> tuple[str, ...] | None:
    """The declared key if every column is there, else the smallest, leftmost discovered key."""
    if declared and all(k in frame.columns for k in declared):
        return tuple(declared)
    if declared:
        return None
    keys = unique_combinations(frame, skip_measurements=True).keys
    return keys[0] if keys else None


def _repeats(frame: pd.DataFrame, columns: Sequence[str], min_group: int) -> bool:
    sizes = frame.groupby(list(columns), dropna=False, sort=False).size()
    return len(sizes) * min_group <= len(frame) and int((sizes >= 2).sum()) >= MIN_REPEATED_GROUPS


def mixed_units(
    frame: pd.DataFrame, declared_key: Sequence[str] = (), name: str = "rows"
) -> MixedUnits | None:
    """The split of `frame` by its strong dependencies, or None when it holds one unit (or is too small)."""
    if len(frame) < MIN_ROWS or frame.shape[1] < 3:
        return None
    key = table_key(frame, declared_key)
    if key is None:
        return None
    min_group = MIN_GROUP
    found = [d for d in functional_dependencies(frame, max_lhs=MAX_LHS) if d.determinant]
    repeating: dict[tuple[str, ...], bool] = {}
    varied: dict[str, bool] = {}

    def repeats(columns: tuple[str, ...]) -> bool:
        if columns not in repeating:
            repeating[columns] = _repeats(frame, columns, min_group)
        return repeating[columns]

    def varies(column: str) -> bool:
        if column not in varied:
            varied[column] = frame[column].nunique(dropna=False) >= 2
        return varied[column]

    strong = tuple(
        d
        for d in found
        if not set(key) <= set(d.determinant)
        and d.dependent not in key
        and varies(d.dependent)
        and repeats(d.determinant)
    )
    if not strong:
        return None
    # The split also needs the dependencies back onto key columns (site_name -> site_id), so that
    # two columns naming one unit stay together; they are not evidence on their own.
    backing = [
        d
        for d in found
        if d.dependent in key and not set(key) <= set(d.determinant) and repeats(d.determinant)
    ]
    split = propose_split(
        [str(c) for c in frame.columns],
        key,
        [(frozenset(d.determinant), d.dependent) for d in (*strong, *backing)],
        name,
    )
    return MixedUnits(key, split, strong) if len(split.tables) > 1 else None


def entry_errors(frame: pd.DataFrame, declared_key: Sequence[str] = ()) -> list[EntryError]:
    """Single-column dependencies that hold on all but a few rows, with those rows."""
    if len(frame) < MIN_ROWS or frame.shape[1] < 2:
        return []
    key = set(declared_key)
    min_group = MIN_GROUP
    column = [str(c) for c in frame.columns]
    found: dict[tuple[str, tuple[int, ...]], EntryError] = {}
    # The budget is the smaller of the share and the row cap, so that long tables stay cheap.
    share = min(MAX_ERROR_SHARE, MAX_ERROR_ROWS / len(frame))
    for d in functional_dependencies(frame, max_lhs=1, max_error=share):
        if d.exact or not d.determinant or d.dependent in key or d.breaking_rows > MAX_ERROR_ROWS:
            continue
        if frame[d.dependent].nunique(dropna=False) < 2 or not _repeats(frame, d.determinant, min_group):
            continue
        positions = tuple(int(p) for p in exception_rows(frame, d))
        # The same slip breaks the dependency on every alias of the unit (site_id, site_name,
        # latitude): report it once, under the leftmost determinant, naming the others.
        earlier = found.get((d.dependent, positions))
        if earlier is None:
            found[(d.dependent, positions)] = EntryError(d, positions)
            continue
        first, second = sorted((earlier.dependency, d), key=lambda x: column.index(x.determinant[0]))
        others = sorted({*earlier.also, *second.determinant} - {first.determinant[0]}, key=column.index)
        found[(d.dependent, positions)] = EntryError(first, positions, tuple(others))
    return list(found.values())
