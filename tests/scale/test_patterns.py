"""Fixed-width patterns as byte tables agree with Python's `re` (the engine's own regex engine)."""

from __future__ import annotations

import re

import numpy as np
import pyarrow as pa
import pytest
from hypothesis import given
from hypothesis import strategies as st

from linter.scale.patterns import fixed_width_matches, pieces, position_tables

FIXED = [
    r"^S\d{7}$",
    r"^VB-\d{3}$",
    r"[A-Z]{2}\d{4}",
    r"^[A-Z][a-z]\.\d$",
    r"^\w{3}-\w$",
    r"^[^,;]{2}$",
    r"^..\$$",
    r"^[]a]{2}$",
    r"^\s\S\D\W$",
    r"^[A-F0-9]{8}$",
    r"^x{0}y$",
]
NOT_FIXED = [
    r"^S\d+$",
    r"^VB-\d{1,3}$",
    r"^(A|B)\d$",
    r"(?i)^ab$",
    r"^a?b$",
    r"^\bab$",
    r"^\x41$",
    r"^é$",
    "^$",
]


def engine_matches(pattern: str, cells: list[str | None]) -> list[bool]:
    """How the engine judges a cell: `re.match` of the pattern anchored with `\\Z`."""
    compiled = re.compile(rf"(?:{pattern})\Z")
    return [cell is not None and compiled.match(cell) is not None for cell in cells]


@pytest.mark.parametrize("pattern", NOT_FIXED)
def test_patterns_that_are_not_a_fixed_run_are_left_to_the_regex_engine(pattern):
    assert position_tables(pattern) is None


def test_a_fixed_pattern_is_its_pieces():
    assert pieces(r"^VB-\d{3}$") == [("V", 1), ("B", 1), ("-", 1), (r"\d", 3)]
    tables = position_tables(r"^VB-\d{3}$")
    assert tables is not None and tables.shape == (6, 256)


CELLS = st.lists(
    st.one_of(
        st.none(),
        st.text(alphabet=st.sampled_from("SVB-0123456789AZaz_., ;$]\n\t٣é"), max_size=10),
    ),
    max_size=40,
)


@pytest.mark.parametrize("pattern", FIXED)
@given(cells=CELLS)
def test_a_cell_matches_the_tables_only_if_python_re_matches_it(pattern, cells):
    # Reference: Python's re module, which the pandera engine uses for str_matches.
    tables = position_tables(pattern)
    assert tables is not None
    found = fixed_width_matches(pa.array(cells, pa.string()), tables).tolist()
    expected = engine_matches(pattern, cells)
    # Never more than the engine; on ASCII text exactly the engine (others go to the engine).
    assert all(e for f, e in zip(found, expected, strict=True) if f)
    assert [f for f, c in zip(found, cells, strict=True) if c is None or c.isascii()] == [
        e for e, c in zip(expected, cells, strict=True) if c is None or c.isascii()
    ]


def test_tables_judge_sliced_chunked_columns_like_whole_ones():
    cells = ["S0000001", "S12", None, "S1234567", "s1234567", "S123456٧", "S9999999"]
    column = pa.chunked_array([pa.array(cells[:3]), pa.array(cells[3:]).slice(1)])
    tables = position_tables(r"^S\d{7}$")
    assert tables is not None
    found = fixed_width_matches(column, tables)
    assert found.tolist() == [True, False, False, False, False, True]
    assert found.dtype == np.bool_
