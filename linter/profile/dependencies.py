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

Limits: left-hand sides of at most `max_lhs` columns (default 3) among the first
`max_columns` columns (default 40).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import pandas as pd

from linter.profile.partitions import (
    Stripped,
    column_codes,
    combine,
    combined_codes,
    product,
    stripped_of,
    with_nulls_as_value,
)

DEFAULT_MAX_LHS = 3
DEFAULT_MAX_COLUMNS = 40


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
    largest = np.zeros(partition.classes, dtype=np.int64)
    np.maximum.at(largest, pair_class, pair_sizes)
    return int(partition.rows.size - largest.sum())


def functional_dependencies(
    frame: pd.DataFrame,
    max_lhs: int = DEFAULT_MAX_LHS,
    max_error: float = 0.0,
    max_columns: int = DEFAULT_MAX_COLUMNS,
) -> tuple[Dependency, ...]:
    """Every minimal non-trivial dependency X -> A with |X| <= max_lhs and g3 error <= max_error."""
    names = [str(c) for c in frame.columns][:max_columns]
    rows = len(frame)
    if rows == 0 or not names:
        return ()
    raw = column_codes(frame[names])
    codes = [with_nulls_as_value(raw[n]) for n in names]
    budget = int(np.floor(max_error * rows + 1e-9))
    width = len(names)
    everything = (1 << width) - 1
    found: list[tuple[tuple[int, ...], int, int]] = []

    empty = stripped_of(np.zeros(rows, dtype=np.int64))
    previous: dict[tuple[int, ...], Stripped] = {(): empty}
    cplus: dict[tuple[int, ...], int] = {(): everything}
    level: dict[tuple[int, ...], Stripped] = {(a,): stripped_of(codes[a]) for a in range(width)}

    def partition_of(columns: tuple[int, ...]) -> Stripped:
        known = level.get(columns) or previous.get(columns)
        if known is not None:
            return known
        return stripped_of(combined_codes(dict(enumerate(codes)), columns, rows))  # type: ignore[arg-type]

    def breaking(lhs: tuple[int, ...], rhs: int, lhs_partition: Stripped, full: Stripped) -> int:
        if lhs_partition.error == full.error:
            return 0
        if budget == 0:
            return budget + 1
        return _g3_breaking(lhs_partition, codes[rhs])

    def subset_fails(lhs: tuple[int, ...], rhs: int) -> bool:
        # A key's dependency X -> A is minimal only if no X minus one column already gives A
        # (within the error budget in approximate mode: the paper's C+ test in PRUNE, done directly).
        left = partition_of(lhs)
        return breaking(lhs, rhs, left, product(left, codes[rhs])) > budget

    size = 1
    while level and size <= max_lhs + 1:
        for x in level:
            mask = everything
            for i in range(len(x)):
                mask &= cplus.get(x[:i] + x[i + 1 :], 0)
            cplus[x] = mask
        for x, part in level.items():
            for i, a in enumerate(x):
                if not cplus[x] & (1 << a):
                    continue
                lhs = x[:i] + x[i + 1 :]
                broken = breaking(lhs, a, previous[lhs], part)
                if broken <= budget:
                    found.append((lhs, a, broken))
                    cplus[x] &= ~(1 << a)
                    if broken == 0:
                        for b in range(width):
                            if b not in x:
                                cplus[x] &= ~(1 << b)
        survivors: dict[tuple[int, ...], Stripped] = {}
        for x, part in level.items():
            if cplus[x] == 0:
                continue
            if part.error <= budget and size <= max_lhs:
                # X is a (super)key, or within the budget of one: X -> A holds (g3 <= e(X)/n) for
                # every A, and so does it for every superset; keep only the minimal ones (§4.3).
                for a in range(width):
                    if a in x or not cplus[x] & (1 << a):
                        continue
                    if all(subset_fails(x[:i] + x[i + 1 :], a) for i in range(len(x))):
                        found.append((x, a, _g3_breaking(part, codes[a]) if part.error else 0))
                continue
            survivors[x] = part
        if size > max_lhs:
            break
        previous, level = survivors, _next_level(survivors, codes)
        size += 1
    return tuple(
        sorted(
            (Dependency(tuple(names[i] for i in lhs), names[a], n / rows, n) for lhs, a, n in found),
            key=lambda d: (len(d.determinant), names.index(d.dependent), d.determinant),
        )
    )


def _next_level(
    level: dict[tuple[int, ...], Stripped], codes: list[np.ndarray]
) -> dict[tuple[int, ...], Stripped]:
    """GENERATE_NEXT_LEVEL: unions of two sets sharing a prefix whose every subset survived."""
    by_prefix: dict[tuple[int, ...], list[tuple[int, ...]]] = {}
    for x in level:
        by_prefix.setdefault(x[:-1], []).append(x)
    following: dict[tuple[int, ...], Stripped] = {}
    for group in by_prefix.values():
        group.sort()
        for i, first in enumerate(group):
            for second in group[i + 1 :]:
                candidate = (*first, second[-1])
                if all(candidate[:j] + candidate[j + 1 :] in level for j in range(len(candidate))):
                    following[candidate] = product(level[first], codes[second[-1]])
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
