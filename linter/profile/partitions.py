"""Columns as factorised integer codes, and the stripped partitions TANE and the key search refine."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import pandas as pd

NULL_CODE = -1
"""Code pandas gives an empty cell; the profilers decide per method what a null means."""


def column_codes(frame: pd.DataFrame) -> dict[str, np.ndarray]:
    """Every column as int64 codes 0..k-1 in order of first appearance; empty cells get NULL_CODE."""
    codes: dict[str, np.ndarray] = {}
    for label in frame.columns:
        values, _ = pd.factorize(frame[label], use_na_sentinel=True)
        codes[str(label)] = values.astype(np.int64, copy=False)
    return codes


def with_nulls_as_value(codes: np.ndarray) -> np.ndarray:
    """Codes where an empty cell is one more value (equal to every other empty cell of the column)."""
    if codes.size == 0 or codes.min() >= 0:
        return codes
    return np.where(codes < 0, codes.max() + 1, codes)


def combine(left: np.ndarray, right: np.ndarray) -> np.ndarray:
    """Codes of the pair (left, right): equal when both parts are; refactorised to stay dense."""
    if left.size == 0:
        return left
    width = int(right.max()) + 1
    # Mixed radix on dense codes fits int64 as long as both sides are below ~3e9 distinct values.
    paired = left * width + right
    dense, _ = pd.factorize(paired)
    return dense.astype(np.int64, copy=False)


def combined_codes(codes: dict[str, np.ndarray], columns: Sequence[str], rows: int) -> np.ndarray:
    """Codes of a combination of columns (the empty combination puts every row in one class)."""
    result = np.zeros(rows, dtype=np.int64)
    for column in columns:
        result = combine(result, codes[column])
    return result


def distinct_count(codes: np.ndarray) -> int:
    """Number of classes of a dense code array."""
    return int(codes.max()) + 1 if codes.size else 0


@dataclass(frozen=True)
class Stripped:
    """A stripped partition (Huhtala et al. 1999, §3): only rows in classes of two or more rows are kept.

    A row alone in its class stays alone in every refinement, so dropping it loses nothing.
    """

    rows: np.ndarray
    """Row positions in non-singleton classes."""
    labels: np.ndarray
    """Dense class id (0..classes-1) of each kept row."""
    classes: int
    """Number of classes kept."""

    @property
    def error(self) -> int:
        """e(X) = ||pi|| - |pi|: rows to delete so that X becomes a key; equal e means equal partitions."""
        return int(self.rows.size) - self.classes


DIRECT_COUNT_FACTOR = 8
"""Labels spanning at most this many times the kept rows are counted directly (np.bincount, the
vectorised form of TANE's table T, §4.4) instead of hashed: linear time, no hash table."""


def strip(rows: np.ndarray, labels: np.ndarray) -> Stripped:
    """Drop the rows alone in their class; class ids come back dense (0..classes-1)."""
    if labels.size == 0:
        return Stripped(rows, labels, 0)
    span = int(labels.max()) + 1
    if span > DIRECT_COUNT_FACTOR * labels.size + 1024:
        labels, _ = pd.factorize(labels)
    sizes = np.bincount(labels)
    shared = sizes > 1
    keep = shared[labels]
    renumber = np.cumsum(shared) - 1
    return Stripped(rows[keep], renumber[labels[keep]].astype(np.int64, copy=False), int(shared.sum()))


def stripped_of(codes: np.ndarray) -> Stripped:
    """The stripped partition of one column's codes (all rows considered)."""
    return strip(np.arange(codes.size, dtype=np.int64), codes)


def product(partition: Stripped, codes: np.ndarray) -> Stripped:
    """The stripped partition of X u {A} from that of X and the codes of A (only kept rows are touched)."""
    if partition.rows.size == 0:
        return partition
    width = int(codes.max()) + 1
    return strip(partition.rows, partition.labels * width + codes[partition.rows])


def refines(partition: Stripped, codes: np.ndarray) -> bool:
    """Whether every class of `partition` holds one value of `codes` (X -> A holds exactly).

    Each kept row is compared with the first row of its class: a linear pass, no hashing.
    """
    if partition.rows.size == 0:
        return True
    values = codes[partition.rows]
    first = np.empty(partition.classes, dtype=values.dtype)
    first[partition.labels[::-1]] = values[::-1]  # with repeated indices the last write wins
    return bool((values == first[partition.labels]).all())


def refines_each(partition: Stripped, matrix: np.ndarray, columns: list[int]) -> np.ndarray:
    """`refines` for several columns of `matrix` (rows x all columns of codes), one flag each."""
    if partition.rows.size == 0:
        return np.ones(len(columns), dtype=bool)
    values = matrix[np.ix_(partition.rows, np.asarray(columns, dtype=np.int64))]  # kept rows only
    first = np.empty((partition.classes, len(columns)), dtype=values.dtype)
    first[partition.labels[::-1]] = values[::-1]
    return np.asarray((values == first[partition.labels]).all(axis=0))
