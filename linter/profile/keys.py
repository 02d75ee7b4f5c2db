"""Minimal unique column combinations (candidate keys) of a table, by a pruned bottom-up lattice search.

Method: the level-wise, apriori-style bottom-up search over the column lattice surveyed in
Abedjan, Golab & Naumann, "Profiling relational data: a survey", VLDB Journal 24(4), 2015, §4.1
(unique column combinations): level k+1 is generated only from non-unique combinations of
level k whose every k-subset is non-unique, so no superset of a found key is ever tested.

Uniqueness is decided on factorised integer codes (one `pandas.factorize` per combination, no
Python loop over rows). A random sample refutes first: two equal rows in the sample are two
equal rows in the table, so a combination that repeats in the sample is a non-key for sure;
only combinations unique in the sample are verified on all rows (and one that fails there is
kept as a non-key, so the result is exact, not sampled).

Null semantics (SQL PRIMARY KEY): a column with any empty cell is never part of a key, because
an empty cell identifies nothing. Such columns are listed in `with_nulls`.

Refutation is progressive: the first sample (20,000 rows), then one ten times larger, and
so on; only a combination unique in every sample is checked on all rows.

Limits: combinations of at most `max_size` columns (default 3) among the first `max_columns`
columns (default 40); columns past that are listed in `not_considered`. With
`skip_measurements`, columns whose sampled values are all decimal numbers with a fraction
(12.5, -0.031) are left out, listed in `measurements`: a measured quantity identifies nothing,
and such columns otherwise make many accidental keys in long tables (the rules use this;
the cross-checks against the reference library do not). Constant columns are
never part of a minimal key (adding one cannot make rows distinct) and are skipped. A table
with no body rows has no keys to find.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from itertools import combinations

import numpy as np
import pandas as pd

from linter.profile.partitions import column_codes, combine, combined_codes, distinct_count

DEFAULT_MAX_SIZE = 3
DEFAULT_MAX_COLUMNS = 40
DEFAULT_SAMPLE_ROWS = 20_000
DECIMAL = r"-?\d*\.\d+"


@dataclass(frozen=True)
class KeySearch:
    """The minimal unique column combinations of one table, and what the search left out and why."""

    keys: tuple[tuple[str, ...], ...]
    """Minimal unique combinations, smallest first, columns in table order."""
    rows: int
    considered: tuple[str, ...]
    """Columns that took part in the search."""
    with_nulls: tuple[str, ...] = ()
    """Columns left out because they have empty cells (see the null semantics above)."""
    constant: tuple[str, ...] = ()
    """Columns left out because every row holds the same value."""
    not_considered: tuple[str, ...] = ()
    """Columns past `max_columns`."""
    measurements: tuple[str, ...] = ()
    """Columns left out as measurements (only with `skip_measurements`)."""
    max_size: int = DEFAULT_MAX_SIZE
    verified_on_all_rows: int = 0
    """How many candidate combinations needed a check on every row (no sample could refute them)."""


def sample_positions(rows: int, size: int, seed: int = 0) -> np.ndarray:
    """Sorted row positions of a reproducible random sample (all rows when the table is small)."""
    if rows <= size:
        return np.arange(rows, dtype=np.int64)
    chosen = np.random.default_rng(seed).choice(rows, size=size, replace=False)
    return np.sort(chosen).astype(np.int64)


def unique_combinations(
    frame: pd.DataFrame,
    max_size: int = DEFAULT_MAX_SIZE,
    max_columns: int = DEFAULT_MAX_COLUMNS,
    sample_rows: int = DEFAULT_SAMPLE_ROWS,
    seed: int = 0,
    skip_measurements: bool = False,
) -> KeySearch:
    """Every minimal combination of at most `max_size` columns whose values identify each row."""
    labels = [str(c) for c in frame.columns]
    rows = len(frame)
    inside, outside = labels[:max_columns], tuple(labels[max_columns:])
    codes = column_codes(frame[inside]) if inside else {}
    with_nulls = tuple(c for c in inside if rows and codes[c].min() < 0)
    constant = tuple(c for c in inside if c not in with_nulls and rows and codes[c].max() == 0 and rows > 1)
    considered = tuple(c for c in inside if c not in with_nulls and c not in constant)
    positions = sample_positions(rows, sample_rows, seed)
    measurements: tuple[str, ...] = ()
    if skip_measurements:
        measurements = tuple(
            c for c in considered if frame[c].iloc[positions].astype(str).str.fullmatch(DECIMAL).all()
        )
        considered = tuple(c for c in considered if c not in measurements)
    if rows == 0:
        return KeySearch((), 0, considered, with_nulls, constant, outside, measurements, max_size)

    cardinality = {c: distinct_count(codes[c]) for c in considered}
    larger: list[np.ndarray] = []
    size = sample_rows * 10
    while size < rows:
        larger.append(sample_positions(rows, size, seed + len(larger) + 1))
        size *= 10
    # Sample codes are re-factorised so that they are dense again (distinct_count relies on it).
    sample = {c: pd.factorize(codes[c][positions])[0].astype(np.int64) for c in considered}
    whole = positions.size == rows
    verified = 0

    def unique_on_all_rows(columns: Sequence[str]) -> bool:
        nonlocal verified
        if whole:
            return True
        if float(np.prod([float(cardinality[c]) for c in columns])) < rows:
            return False  # too few value combinations to tell every row apart
        for subset in larger:
            part = {c: codes[c][subset] for c in columns}
            if distinct_count(combined_codes(part, columns, subset.size)) < subset.size:
                return False
        verified += 1
        return distinct_count(combined_codes(codes, columns, rows)) == rows

    keys: list[tuple[str, ...]] = []
    non_keys: dict[tuple[str, ...], np.ndarray] = {}
    for column in considered:
        if distinct_count(sample[column]) == positions.size and unique_on_all_rows([column]):
            keys.append((column,))
        else:
            non_keys[(column,)] = sample[column]

    order = {c: i for i, c in enumerate(considered)}
    for _size in range(2, max_size + 1):
        level: dict[tuple[str, ...], np.ndarray] = {}
        for combination, parent in _next_level(non_keys, order):
            combined = combine(parent, sample[combination[-1]])
            if distinct_count(combined) == positions.size and unique_on_all_rows(combination):
                keys.append(combination)
            else:
                level[combination] = combined
        if not level:
            break
        non_keys = level
    return KeySearch(
        tuple(keys), rows, considered, with_nulls, constant, outside, measurements, max_size, verified
    )


def _next_level(
    non_keys: dict[tuple[str, ...], np.ndarray], order: dict[str, int]
) -> list[tuple[tuple[str, ...], np.ndarray]]:
    """Apriori candidate generation: join non-keys sharing a prefix; keep those with only non-key subsets."""
    by_prefix: dict[tuple[str, ...], list[tuple[str, ...]]] = {}
    for combination in non_keys:
        by_prefix.setdefault(combination[:-1], []).append(combination)
    candidates: list[tuple[tuple[str, ...], np.ndarray]] = []
    for group in by_prefix.values():
        group.sort(key=lambda c: order[c[-1]])
        for first, second in combinations(group, 2):
            candidate = (*first, second[-1])
            subsets = (candidate[:i] + candidate[i + 1 :] for i in range(len(candidate)))
            if all(s in non_keys for s in subsets):
                candidates.append((candidate, non_keys[first]))
    return candidates
