"""Duplicate-key search: per-batch 64-bit hashes, exact codes (counted or sorted), pandas as reference."""

from __future__ import annotations

from collections import Counter
from concurrent.futures import ThreadPoolExecutor

import numpy as np
import pandas as pd
import pyarrow as pa
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from linter.scale import key_codes as key_code_module
from linter.scale.key_codes import duplicated_rows, key_codes, shared_codes
from linter.scale.key_hash import (
    LEADING_CELLS,
    column_hashes,
    high_halves,
    members_of,
    merged_runs,
    repeated_positions,
    repeated_values,
    repeats_across,
    repeats_of,
    row_hashes,
)


def repeated_by_counting(values: list[object]) -> list[bool]:
    counts = Counter(values)
    return [counts[v] > 1 for v in values]


def test_a_text_hashes_alike_whatever_else_is_in_its_batch():
    # Batches differ in their longest cell, their nulls, their slicing and their chunks.
    alone = column_hashes(pa.array(["S0000001", "NITRATE", "Vell Basin weir, lower reach", "é"]))
    wide = column_hashes(
        pa.array(["x" * 70, "S0000001", None, "NITRATE", "é", "Vell Basin weir, lower reach"])
    )
    sliced = column_hashes(
        pa.array(["", "S0000001", "NITRATE", "Vell Basin weir, lower reach", "é"]).slice(1)
    )
    chunked = column_hashes(
        pa.chunked_array([["S0000001"], ["NITRATE", "Vell Basin weir, lower reach", "é"]])
    )
    assert alone.tolist() == [wide[1], wide[3], wide[5], wide[4]] == sliced.tolist() == chunked.tolist()


def test_texts_that_differ_in_one_byte_or_a_trailing_nul_hash_apart():
    texts = ["ab", "ab\x00", "abc", "", "ab" * 9, "ab" * 9 + "c", "Ab" + "ab" * 8, "e", "é"]
    hashes = column_hashes(pa.array(texts)).tolist()
    assert len(set(hashes)) == len(texts)


def test_nulls_hash_alike_and_minus_zero_is_zero():
    numbers = column_hashes(pa.array([-0.0, 0.0, None, None, 1.5, float("nan"), float("nan")]))
    assert numbers[0] == numbers[1] and numbers[2] == numbers[3] and numbers[5] == numbers[6]
    assert len(set(numbers.tolist())) == 4
    flags = column_hashes(pa.array([True, None, False, True, None]))
    assert flags[0] == flags[3] and flags[1] == flags[4] and len(set(flags.tolist())) == 3
    days = pa.array(pd.to_datetime(["2026-03-02", None, "2026-03-02", "2026-03-03"]))
    stamps = column_hashes(days)
    assert stamps[0] == stamps[2] and len(set(stamps.tolist())) == 3


def test_row_hashes_follow_the_whole_key_in_column_order():
    keys = pa.table({"a": ["x", "y", "x", "y"], "b": ["y", "x", "y", "x"]})
    hashes = row_hashes(keys).tolist()
    assert hashes[0] == hashes[2] and hashes[1] == hashes[3] and hashes[0] != hashes[1]


def test_repeated_values_agree_with_counting():
    values = np.array([7, 3, 7, 1, 3, 9, 2**63 + 5, 2**63 + 5], np.uint64)
    assert repeated_values(values).tolist() == repeated_by_counting(values.tolist())
    assert repeated_values(np.array([4, 5, 6], np.uint64)).tolist() == [False, False, False]
    assert repeated_values(np.array([4], np.uint64)).tolist() == [False]


@pytest.mark.parametrize(
    "codes",
    [
        [0, 1, 0, 2, 3, 3],  # span within the rows: counted
        [0, 10**12, 5, 10**12, 0, 7],  # span far beyond the rows: sorted
    ],
)
def test_shared_codes_counted_or_sorted_agree_with_counting(codes):
    array = np.array(codes, np.int64)
    assert shared_codes(array).tolist() == repeated_by_counting(codes)


def test_wide_and_narrow_code_spans_give_the_same_rows(monkeypatch):
    keys = pa.table({"site": ["VB-001", "VB-002", "VB-001", None, None], "depth": [1.0, 2.0, 1.0, -0.0, 0.0]})
    counted = duplicated_rows(keys).to_pylist()
    monkeypatch.setattr(key_code_module, "COUNTED_SPAN", 0)  # every span is "wide": the sort decides
    assert duplicated_rows(keys).to_pylist() == counted == [0, 2, 3, 4]


def test_key_codes_renumber_before_they_overflow():
    # Three columns of 2**21 distinct values each would fold past 2**62 without renumbering.
    rows = 2**21
    column = pa.array(np.arange(rows, dtype=np.float64))
    keys = pa.table({"a": column, "b": column, "c": column})
    codes = key_codes(keys)
    assert codes.min() >= 0 and len(np.unique(codes)) == rows


key_texts = st.sampled_from(["S0000001", "S0000002", "NITRATE", "", "é", "S00000010", None])
key_numbers = st.sampled_from([0.0, -0.0, 1.5, 2.0, None])


@settings(max_examples=80, deadline=None)
@given(st.lists(st.tuples(key_texts, key_numbers, st.booleans()), min_size=0, max_size=60))
def test_duplicates_agree_with_pandas_duplicated(rows):
    # Reference: pandas.DataFrame.duplicated(keep=False) (pandas API documentation), the comparison
    # the engine's unique check makes: nulls equal to nulls, -0.0 equal to 0.0.
    texts = [r[0] for r in rows]
    numbers = [r[1] for r in rows]
    flags = [r[2] for r in rows]
    frame = pd.DataFrame(
        {"t": pd.Series(texts, dtype=object), "n": pd.Series(numbers, dtype=float), "f": flags}
    )
    expected = [i for i, shared in enumerate(frame.duplicated(keep=False)) if shared]
    keys = pa.table(
        {"t": pa.array(texts, pa.string()), "n": pa.array(numbers, pa.float64()), "f": pa.array(flags)}
    )
    assert duplicated_rows(keys).to_pylist() == expected
    # Hashes of the same rows, cut into two batches, name every real duplicate (and here no more).
    cut = len(rows) // 3
    hashes = np.concatenate([row_hashes(keys.slice(0, cut)), row_hashes(keys.slice(cut))])
    assert np.flatnonzero(repeated_values(hashes)).tolist() == expected


def test_few_repeats_among_many_values_are_filtered_then_searched_exactly():
    # Every value shares its low 24 bits with the others, so the low-bits filter passes them all:
    # the exact search behind it must still keep only the real repeats.
    values = np.arange(1, 1001, dtype=np.uint64) << np.uint64(24)
    values[[10, 500]] = values[3]
    values[999] = values[998]
    assert repeated_values(values).tolist() == repeated_by_counting(values.tolist())
    assert repeated_values(values).sum() == 5


@given(st.lists(st.lists(st.integers(0, 40), max_size=30), max_size=6))
def test_batches_sorted_apart_and_merged_find_the_same_repeats(batches):
    parts = [np.array(b, np.uint64) for b in batches]
    values = np.concatenate([*parts, np.zeros(0, np.uint64)])
    merged = merged_runs([np.sort(p) for p in parts])
    assert merged.tolist() == sorted(values.tolist())  # Reference: Python's sorted
    assert members_of(values, repeats_of(merged)).tolist() == repeated_by_counting(values.tolist())


EDGES = st.sampled_from([0, 1, (1 << 63) - 1, 1 << 63, (1 << 64) // 3, (1 << 64) - 1])
"""Values at and beside the cuts between ranges, and the ends of the 64-bit space."""


@given(
    st.lists(st.lists(EDGES | st.integers(0, (1 << 64) - 1) | st.integers(0, 40), max_size=30), max_size=6),
    st.integers(1, 5),
)
def test_repeats_found_range_by_range_are_the_repeats_of_all_the_values(batches, ranges):
    parts = [np.array(b, np.uint64) for b in batches]
    values = [v for b in batches for v in b]
    with ThreadPoolExecutor(2) as pool:
        found = repeats_across([np.sort(p) for p in parts], ranges, pool)
    counts = Counter(values)
    # Reference: counting with Python's Counter, sorted with Python's sorted.
    assert found.tolist() == sorted(v for v, n in counts.items() if n > 1)


def test_a_coded_text_column_hashes_as_its_cells_do_one_by_one():
    # Few distinct texts take the dictionary path; each cell must still hash as it does alone,
    # or a batch of few codes and a batch of varied ones would disagree on the same key.
    codes = ["NITRATE", "PHOSPHATE", None, "AMMONIUM", "é", ""]
    column = pa.array([codes[i % len(codes)] for i in range(LEADING_CELLS + 500)])
    alone = [int(column_hashes(pa.array([cell]))[0]) for cell in codes]
    assert column_hashes(column).tolist() == [alone[i % len(codes)] for i in range(len(column))]
    # Varied texts further down than the leading cells still hash as they do alone.
    varied = pa.array([*column.to_pylist(), *(f"S{n:07d}" for n in range(300))])
    hashes = column_hashes(varied)
    assert hashes[-1] == column_hashes(pa.array(["S0000299"]))[0]
    assert hashes[: len(column)].tolist() == column_hashes(column).tolist()


def test_a_key_column_of_empty_cells_only_hashes_every_cell_as_null():
    # A batch whose key cells are all empty has no distinct text at all.
    empty = column_hashes(pa.array([None] * (LEADING_CELLS + 10), pa.string()))
    assert set(empty.tolist()) == {int(column_hashes(pa.array([None, "x"], pa.string()))[0])}


@given(
    st.lists(st.lists(st.integers(0, (1 << 32) - 1) | st.integers(0, 40), max_size=30), max_size=6),
    st.integers(1, 5),
)
def test_upper_halves_are_merged_range_by_range_as_whole_hashes_are(batches, ranges):
    parts = [np.array(b, np.uint32) for b in batches]
    with ThreadPoolExecutor(2) as pool:
        found = repeats_across([np.sort(p) for p in parts], ranges, pool)
    counts = Counter(v for b in batches for v in b)
    # Reference: counting with Python's Counter, sorted with Python's sorted.
    assert found.dtype == (np.uint32 if parts else np.uint64)  # no runs: nothing says their type
    assert found.tolist() == sorted(v for v, n in counts.items() if n > 1)


UPPER = st.sampled_from([0, 1, 0xFFFFFFFF])
LOWER = st.sampled_from([0, 7, 0xFFFFFFFF])


@given(st.lists(st.lists(st.tuples(UPPER, LOWER), max_size=12), max_size=5), st.integers(1, 3))
def test_hashes_sharing_only_their_upper_half_are_not_repeats(batches, ranges):
    # Few distinct halves, so upper halves repeat often while the whole hashes differ.
    parts = [np.array([(high << 32) | low for high, low in b], np.uint64) for b in batches]
    whole = [int(v) for p in parts for v in p]
    positions = repeated_positions(parts, [np.sort(high_halves(p)) for p in parts], ranges)
    # Reference: counting the whole 64-bit values with Python's Counter.
    assert positions.tolist() == [i for i, shared in enumerate(repeated_by_counting(whole)) if shared]
