"""Row-position sets against numpy's own set routines (a general-purpose reference library)."""

from __future__ import annotations

import numpy as np
from hypothesis import given
from hypothesis import strategies as st

from linter.row_sets import difference, distinct, union

positions = st.lists(st.integers(min_value=-5, max_value=60), max_size=40)


@given(st.lists(positions, max_size=4))
def test_union_is_numpys_union_of_every_part(parts):
    # Source: numpy's np.union1d (sorted unique values in either array), folded over the parts.
    expected = np.array([], np.int64)
    for part in parts:
        expected = np.union1d(expected, np.array(part, np.int64))
    found = union(np.array(part, np.int64) for part in parts)
    assert found.dtype == np.int64
    assert found.tolist() == expected.tolist()


@given(positions, positions)
def test_difference_is_numpys_setdiff(values, removed):
    # Source: numpy's np.setdiff1d (sorted unique values of the first array not in the second).
    expected = np.setdiff1d(np.array(values, np.int64), np.array(removed, np.int64))
    assert difference(np.array(values, np.int64), np.array(removed, np.int64)).tolist() == expected.tolist()


@given(positions)
def test_distinct_of_sorted_values_is_numpys_unique(values):
    ordered = np.sort(np.array(values, np.int64))
    assert distinct(ordered).tolist() == np.unique(ordered).tolist()


def test_union_takes_plain_lists_and_no_parts():
    assert union([[3, 1], np.array([2, 3])]).tolist() == [1, 2, 3]
    assert union([]).tolist() == []
