"""Minimal non-trivial functional dependencies of a table with TANE, exact and approximate (g3).

Method: TANE, Huhtala, Kärkkäinen, Porkka & Toivonen, "TANE: An efficient algorithm for
discovering functional and approximate dependencies", The Computer Journal 42(2), 1999:
a level-wise search over the attribute lattice on stripped partitions, with the candidate
right-hand sides C+(X) (§4.2), the pruning of empty C+ and of (super)keys (§4.3, PRUNE) and
the validity test e(X \\ {A}) = e(X) (Lemma 2). Partitions are numpy arrays of class ids and
each product is one `pandas.factorize` over the kept rows, never a loop over rows.

Approximate mode (§2.2 and §5 of the same paper): X -> A is accepted when its g3 error, the
fraction of rows to delete for it to hold exactly, is at most `max_error`. Those that hold
only approximately are the "probable data-entry errors"; `exception_rows` names the rows
whose value disagrees with the majority of their group.

Null semantics: an empty cell equals every other empty cell of its column (as SQL GROUP BY
treats NULL); so `site_id -> river` fails when one sample row of a site has an empty river
and the others a name, which is exactly the data-entry error worth reporting.

Sample first (exact mode, tables longer than `sample_rows`): the lattice is searched on a
random sample, where a dependency or key that fails is known to fail on all rows; every one
that holds on the sample is confirmed on all rows before TANE relies on it, so the result is
exact (the same pruning decisions as on all rows), only cheaper. The approximate mode works
on all rows (a g3 error on a sample bounds nothing).

Limits: left-hand sides of at most `max_lhs` columns (default 3) among the first
`max_columns` columns (default 40).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import pandas as pd

from linter.profile.keys import sample_positions
from linter.profile.partitions import (
    Stripped,
    column_codes,
    combine,
    combined_codes,
    distinct_count,
    product,
    refines,
    refines_each,
    stripped_of,
    with_nulls_as_value,
)

DEFAULT_MAX_LHS = 3
DEFAULT_MAX_COLUMNS = 40
DEFAULT_SAMPLE_ROWS = 20_000
CONFIRM_CACHE_ROWS = 40_000_000
MIDDLE_CACHE = 512
"""Kept rows, summed over the all-row partitions held for confirmations (about 16 bytes each)."""


@dataclass(frozen=True)
class Dependency:
    """X -> A: rows that agree on the determining columns agree on the dependent column."""

    determinant: tuple[str, ...]
    """The left-hand side X, in table order (empty: the column is constant)."""
    dependent: str
    error: float = 0.0
    """g3: the fraction of rows that break it (0 for an exact dependency)."""
    breaking_rows: int = 0
    """How many rows break it (g3 times the row count)."""

    @property
    def exact(self) -> bool:
        return self.breaking_rows == 0

    def __str__(self) -> str:
        return f"{', '.join(self.determinant) or '{}'} -> {self.dependent}"


def _g3_breaking(partition: Stripped, codes: np.ndarray) -> int:
    """Rows to delete so that the classes of `partition` agree on `codes` (the numerator of g3)."""
    if partition.rows.size == 0:
        return 0
    pairs, _ = pd.factorize(partition.labels * (int(codes.max()) + 1) + codes[partition.rows])
    pair_sizes = np.bincount(pairs)
    pair_class = np.zeros(pair_sizes.size, dtype=np.int64)
    pair_class[pairs] = partition.labels
    largest = np.zeros(int(partition.labels.max()) + 1, dtype=np.int64)
    np.maximum.at(largest, pair_class, pair_sizes)
    return int(partition.rows.size - largest.sum())


def functional_dependencies(
    frame: pd.DataFrame,
    max_lhs: int = DEFAULT_MAX_LHS,
    max_error: float = 0.0,
    max_columns: int = DEFAULT_MAX_COLUMNS,
    sample_rows: int = DEFAULT_SAMPLE_ROWS,
    seed: int = 0,
) -> tuple[Dependency, ...]:
    """Every minimal non-trivial dependency X -> A with |X| <= max_lhs and g3 error <= max_error."""
    names = [str(c) for c in frame.columns][:max_columns]
    rows = len(frame)
    if rows == 0 or not names:
        return ()
    raw = column_codes(frame[names])
    codes = [with_nulls_as_value(raw[n]) for n in names]
    budget = int(np.floor(max_error * rows + 1e-9))
    # Exact mode searches the lattice on a sample and confirms on all rows every decision the
    # sample cannot make alone (a dependency or key that fails on the sample fails everywhere).
    sampled = budget == 0 and rows > sample_rows
    if sampled:
        at = sample_positions(rows, sample_rows, seed)
        search = [pd.factorize(c[at])[0].astype(np.int64) for c in codes]
    else:
        search = codes
    n_search = len(search[0])
    matrix = np.stack(search, axis=1)
    width = len(names)
    everything = (1 << width) - 1
    found: list[tuple[tuple[int, ...], int, int]] = []

    kept: dict[tuple[int, ...], Stripped] = {}
    room = [CONFIRM_CACHE_ROWS]

    def on_all_rows(columns: tuple[int, ...]) -> Stripped:
        # Partitions on all rows are built only to confirm, and kept while they fit the budget
        # (one left side is confirmed against many right sides).
        if columns in kept:
            return kept[columns]
        if not columns:
            made = stripped_of(np.zeros(rows, dtype=np.int64))
        elif len(columns) == 1:
            made = stripped_of(codes[columns[0]])
        else:
            made = product(on_all_rows(columns[:-1]), codes[columns[-1]])
        if made.rows.size <= room[0]:
            kept[columns] = made
            room[0] -= made.rows.size
        return made

    # In a table at least fifty times the sample, a ten times larger sample refutes most of what
    # the first one let through, before any partition on all rows (the expensive ones) is built.
    middle = (
        sample_positions(rows, sample_rows * 10, seed + 1) if sampled and rows >= sample_rows * 50 else None
    )
    middle_codes = {i: c[middle] for i, c in enumerate(codes)} if middle is not None else {}
    seen_middle: dict[tuple[int, ...], Stripped] = {}

    def on_middle(columns: tuple[int, ...]) -> Stripped:
        if columns not in seen_middle:
            if len(seen_middle) > MIDDLE_CACHE:
                seen_middle.clear()
            seen_middle[columns] = stripped_of(combined_codes(middle_codes, columns, len(middle)))  # type: ignore[arg-type]
        return seen_middle[columns]

    def confirmed(lhs: tuple[int, ...], rhs: int) -> bool:
        if not sampled:
            return True
        if middle is not None and not refines(on_middle(lhs), middle_codes[rhs]):
            return False
        return refines(on_all_rows(lhs), codes[rhs])

    def confirmed_key(columns: tuple[int, ...]) -> bool:
        if not sampled:
            return True
        if middle is not None and on_middle(columns).error:
            return False
        return on_all_rows(columns).error == 0

    empty = stripped_of(np.zeros(n_search, dtype=np.int64))
    previous: dict[tuple[int, ...], Stripped] = {(): empty}
    cplus: dict[tuple[int, ...], int] = {(): everything}
    level: dict[tuple[int, ...], Stripped | None] = {(a,): stripped_of(search[a]) for a in range(width)}

    # Approximate mode: a sample cannot estimate g3, but it bounds it from below (every extra
    # value of A inside one group of X in the sample is at least one row to delete on all
    # rows), so a sample bound above the budget refutes without touching all rows.
    bound_at = sample_positions(rows, sample_rows, seed + 2) if budget and rows > sample_rows else None

    def approximate(lhs: tuple[int, ...], rhs: int, lhs_partition: Stripped) -> int:
        if budget == 0:
            return 1
        if bound_at is not None:
            part = {i: codes[i][bound_at] for i in (*lhs, rhs)}
            groups = distinct_count(combined_codes(part, lhs, bound_at.size))  # type: ignore[arg-type]
            if distinct_count(combined_codes(part, (*lhs, rhs), bound_at.size)) - groups > budget:  # type: ignore[arg-type]
                return budget + 1
        return _g3_breaking(lhs_partition, codes[rhs])

    def partition_of(columns: tuple[int, ...]) -> Stripped:
        known = level.get(columns) or previous.get(columns)
        if known is not None:
            return known
        return stripped_of(combined_codes(dict(enumerate(search)), columns, n_search))  # type: ignore[arg-type]

    def breaking(lhs: tuple[int, ...], rhs: int, lhs_partition: Stripped, full: Stripped | None) -> int:
        # Lemma 2 when the partition of X is known; else the direct refinement test (the last
        # level never builds partitions: nothing above it needs them).
        holds = lhs_partition.error == full.error if full is not None else refines(lhs_partition, search[rhs])
        if holds and confirmed(lhs, rhs):
            return 0
        return approximate(lhs, rhs, lhs_partition)

    def subset_fails(lhs: tuple[int, ...], rhs: int) -> bool:
        # A key's dependency X -> A is minimal only if no X minus one column already gives A
        # (within the error budget in approximate mode: the paper's C+ test in PRUNE, done directly).
        return breaking(lhs, rhs, partition_of(lhs), None) > budget

    size = 1
    while level and size <= max_lhs + 1:
        for x in level:
            mask = everything
            for i in range(len(x)):
                mask &= cplus.get(x[:i] + x[i + 1 :], 0)
            cplus[x] = mask
        # Tests within one X do not change each other's outcome, so those of the last level
        # (no partitions there) are batched per left-hand side: one pass for all its columns.
        batched: dict[tuple[int, ...], list[int]] = {}
        for x, part in level.items():
            if part is None:
                for i, a in enumerate(x):
                    if cplus[x] & (1 << a):
                        batched.setdefault(x[:i] + x[i + 1 :], []).append(a)
        on_sample: dict[tuple[tuple[int, ...], int], bool] = {}
        for lhs, rhs in batched.items():
            flags = refines_each(previous[lhs], matrix, rhs)
            on_sample.update(((lhs, a), bool(f)) for a, f in zip(rhs, flags, strict=True))
        for x, part in level.items():
            for i, a in enumerate(x):
                if not cplus[x] & (1 << a):
                    continue
                lhs = x[:i] + x[i + 1 :]
                if part is not None:
                    broken = breaking(lhs, a, previous[lhs], part)
                elif on_sample[lhs, a] and confirmed(lhs, a):
                    broken = 0
                else:
                    broken = approximate(lhs, a, previous[lhs])
                if broken <= budget:
                    found.append((lhs, a, broken))
                    cplus[x] &= ~(1 << a)
                    if broken == 0:
                        cplus[x] &= sum(1 << b for b in x)  # drop every B outside X
        if size > max_lhs:
            break
        survivors: dict[tuple[int, ...], Stripped] = {}
        for x, part in level.items():
            if cplus[x] == 0 or part is None:
                continue
            if part.error <= budget and confirmed_key(x):
                # X is a (super)key, or within the budget of one: X -> A holds (g3 <= e(X)/n) for
                # every A, and so does it for every superset; keep only the minimal ones (§4.3).
                for a in range(width):
                    if a in x or not cplus[x] & (1 << a):
                        continue
                    if all(subset_fails(x[:i] + x[i + 1 :], a) for i in range(len(x))):
                        found.append((x, a, _g3_breaking(part, codes[a]) if part.error else 0))
                continue
            survivors[x] = part
        size += 1
        previous, level = survivors, _next_level(survivors, search, build=size <= max_lhs)
    return tuple(
        sorted(
            (Dependency(tuple(names[i] for i in lhs), names[a], n / rows, n) for lhs, a, n in found),
            key=lambda d: (len(d.determinant), names.index(d.dependent), d.determinant),
        )
    )


def _next_level(
    level: dict[tuple[int, ...], Stripped], codes: list[np.ndarray], build: bool = True
) -> dict[tuple[int, ...], Stripped | None]:
    """GENERATE_NEXT_LEVEL: unions of two sets sharing a prefix whose every subset survived
    (their partitions only when `build`: the last level is tested without them)."""
    by_prefix: dict[tuple[int, ...], list[tuple[int, ...]]] = {}
    for x in level:
        by_prefix.setdefault(x[:-1], []).append(x)
    following: dict[tuple[int, ...], Stripped | None] = {}
    for group in by_prefix.values():
        group.sort()
        for i, first in enumerate(group):
            for second in group[i + 1 :]:
                candidate = (*first, second[-1])
                if all(candidate[:j] + candidate[j + 1 :] in level for j in range(len(candidate))):
                    following[candidate] = product(level[first], codes[second[-1]]) if build else None
    return following


def exception_rows(frame: pd.DataFrame, dependency: Dependency) -> np.ndarray:
    """Row positions whose dependent value differs from the most common one in their determinant group."""
    raw = column_codes(frame[[*dependency.determinant, dependency.dependent]])
    rows = len(frame)
    lhs = combined_codes({k: with_nulls_as_value(v) for k, v in raw.items()}, dependency.determinant, rows)
    rhs = with_nulls_as_value(raw[dependency.dependent])
    pairs = combine(lhs, rhs)
    counts = np.bincount(pairs)
    # The majority pair of each group: the largest count, ties broken by first appearance.
    table = pd.DataFrame({"group": lhs, "pair": pairs, "count": counts[pairs]})
    best = table.sort_values(["group", "count"], ascending=[True, False], kind="stable").drop_duplicates(
        "group"
    )
    majority = np.full(int(lhs.max()) + 1 if rows else 0, -1, dtype=np.int64)
    majority[best["group"].to_numpy()] = best["pair"].to_numpy()
    return np.flatnonzero(pairs != majority[lhs])


def breaking_count(frame: pd.DataFrame, determinant: Sequence[str], dependent: str) -> int:
    """g3 numerator of one given dependency on all rows (for checking a declared dependency)."""
    return int(exception_rows(frame, Dependency(tuple(determinant), dependent)).size)
