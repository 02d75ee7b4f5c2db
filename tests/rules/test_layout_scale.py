"""The chance that gaps between column ranges arise when every column holds the same variable."""

from __future__ import annotations

import itertools
import math

import pandas as pd
import pytest

from linter.rules.layout_scale import _chance_of


def blocks_of(counts: tuple[int, ...], size: int) -> list[list[pd.Series]]:
    """Groups of `counts` columns of `size` numbers each (only the counts matter to the chance)."""
    return [[pd.Series(range(size), dtype=float) for _ in range(count)] for count in counts]


def share_of_deals(counts: tuple[int, ...], size: int) -> float:
    """By counting every deal of the numbers 0..N-1 to sum(counts) columns of `size` each: the share
    of deals in which, columns taken from the lowest up, the first counts[0] columns hold exactly
    the smallest numbers, the next counts[1] the next ones, and so on."""
    columns = sum(counts)
    hits = deals = 0
    for order in itertools.permutations(range(columns * size)):
        cells = sorted((order[i * size : (i + 1) * size] for i in range(columns)), key=min)
        deals += 1
        at, low = 0, 0
        for count in counts:
            held = {n for column in cells[at : at + count] for n in column}
            if held != set(range(low, low + count * size)):
                break
            at, low = at + count, low + count * size
        else:
            hits += 1
    return hits / deals


@pytest.mark.parametrize(
    ("counts", "size"), [((1, 2), 2), ((2, 1), 2), ((1, 1), 3), ((1, 1, 1), 2), ((2, 2), 1), ((1, 3), 2)]
)
def test_the_chance_is_the_share_of_deals_counted_one_by_one(counts, size):
    # Source: worked by exhaustive counting of every deal (itertools), not by Weir's formula.
    assert _chance_of(blocks_of(counts, size)) == pytest.approx(share_of_deals(counts, size))


def test_two_groups_of_equal_columns_follow_the_binomial_count():
    # Source: common practice (textbook combinatorics, no source): with k columns of m numbers,
    # the chance that some c of them hold exactly the c*m smallest numbers is C(k, c) / C(k*m, c*m);
    # math.comb is Python's own binomial coefficient.
    for k, m, c in [(3, 3, 1), (4, 3, 2), (6, 5, 1), (5, 10, 2)]:
        expected = math.comb(k, c) / math.comb(k * m, c * m)
        assert _chance_of(blocks_of((c, k - c), m)) == pytest.approx(expected)


def test_one_group_is_certain_and_more_readings_make_a_gap_rarer():
    assert _chance_of(blocks_of((3,), 3)) == pytest.approx(1.0)
    assert _chance_of(blocks_of((1, 2), 3)) > _chance_of(blocks_of((1, 2), 10))
