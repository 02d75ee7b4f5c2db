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
    """Dense class id of each kept row."""

    @property
    def classes(self) -> int:
        return distinct_count(self.labels)

    @property
    def error(self) -> int:
        """e(X) = ||pi|| - |pi|: rows to delete so that X becomes a key; equal e means equal partitions."""
        return int(self.rows.size) - self.classes


def strip(rows: np.ndarray, labels: np.ndarray) -> Stripped:
    """Drop the rows alone in their class and re-number the remaining classes densely."""
    if labels.size == 0:
        return Stripped(rows, labels)
    dense, _ = pd.factorize(labels)
    sizes = np.bincount(dense)
    keep = sizes[dense] > 1
    kept, _ = pd.factorize(dense[keep])
    return Stripped(rows[keep], kept.astype(np.int64, copy=False))


def stripped_of(codes: np.ndarray) -> Stripped:
    """The stripped partition of one column's codes (all rows considered)."""
    return strip(np.arange(codes.size, dtype=np.int64), codes)


def product(partition: Stripped, codes: np.ndarray) -> Stripped:
    """The stripped partition of X u {A} from that of X and the codes of A (only kept rows are touched)."""
    if partition.rows.size == 0:
        return partition
    width = int(codes.max()) + 1
    return strip(partition.rows, partition.labels * width + codes[partition.rows])
