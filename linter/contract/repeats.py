"""Columns that repeat their values: work done once per distinct value, then spread back cell by cell."""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

import numpy as np
import pandas as pd

DISTINCT_SHARE = 0.5
"""Worth it when at most this share of the cells are distinct."""


@dataclass(frozen=True)
class Repeats:
    """Which cells of a column hold the same value."""

    codes: np.ndarray
    """Per cell, the number of its value; every missing cell has the last number."""
    values: list[object]
    """The distinct values in order of first appearance, then None when a cell is missing."""

    @cached_property
    def first(self) -> np.ndarray:
        """Position of the first cell of each value, in the order the values first appear."""
        return np.sort(np.unique(self.codes, return_index=True)[1])


def repeats(column: pd.Series, fewest: int) -> Repeats | None:
    """The column's repeats when it has at least `fewest` cells and few enough distinct values,
    else None (then working cell by cell costs no more)."""
    if len(column) < fewest:
        return None
    codes, distinct = pd.factorize(column, use_na_sentinel=True)
    if len(distinct) > DISTINCT_SHARE * len(column):
        return None
    missing = codes < 0
    values = [*distinct, *([None] if missing.any() else [])]
    return Repeats(np.where(missing, len(distinct), codes), values)
