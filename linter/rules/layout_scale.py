"""Tells whether several numeric columns hold one variable on one scale or several variables."""

from __future__ import annotations

from itertools import combinations

import pandas as pd

from linter.rules.layout_signals import sample
from linter.table import Frame

MIN_ROWS = 3
"""Fewer numbers than this in a column say nothing about its scale."""


def _numbers(frame: Frame, label: str) -> pd.Series:
    texts = pd.Series(sample(frame.body[label]), dtype=object)
    return pd.to_numeric(texts.str.replace(",", "", regex=False), errors="coerce").dropna()


def one_scale(frame: Frame, labels: list[str]) -> bool:
    """False when numeric columns are plainly different variables (`x1, x2, x3` regressors).

    Columns that are the values of one variable (weeks of a count, replicates of a reading)
    share a number format (all whole numbers or not) and their ranges overlap pairwise;
    separate variables laid side by side often do neither. Text columns, or columns with too
    few numbers to tell, are given the benefit of the doubt.
    """
    columns = [_numbers(frame, label) for label in labels]
    if any(len(c) < MIN_ROWS for c in columns):
        return True
    whole = {bool((c == c.round()).all()) for c in columns}
    if len(whole) > 1:
        return False
    ranges = [(float(c.min()), float(c.max())) for c in columns]
    return all(a_lo <= b_hi and b_lo <= a_hi for (a_lo, a_hi), (b_lo, b_hi) in combinations(ranges, 2))
