"""The quick way of `kernels.plain_numbers` gives the byte kernel's answer, never a looser one.

The quick way lets Arrow's number parser decide which cells are plain when a chunk is written only
in digits, signs and dots. That rests on one fact about the parser, checked here on every text of
those bytes up to six long: it reads such a text exactly when `plain_number_shape` calls it plain.
"""

from __future__ import annotations

import itertools

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from linter.scale.kernels import _plain_numbers_at_once, plain_number_shape, plain_numbers

ALPHABET = "0+-.5"
"""Two digits, both signs and the dot: every shape a text of plain-number bytes can take."""


def arrow_reads(text: str) -> bool:
    try:
        pc.cast(pa.array([text]), pa.float64())
    except pa.ArrowInvalid:
        return False
    return True


def every_text(longest: int) -> list[str]:
    return ["".join(t) for n in range(1, longest + 1) for t in itertools.product(ALPHABET, repeat=n)]


@pytest.mark.parametrize("integer", [False, True])
def test_arrow_reads_a_text_of_number_bytes_exactly_when_the_kernel_calls_it_plain(integer: bool) -> None:
    texts = [t for t in every_text(6) if not (integer and "." in t)]
    plain = plain_number_shape(pa.array(texts), integer).tolist()
    disagree = [(t, p) for t, p in zip(texts, plain, strict=True) if arrow_reads(t) != p]
    assert disagree == []
    assert len(texts) == sum((4 if integer else 5) ** n for n in range(1, 7))  # every text was tried


def slow_way(chunk: pa.Array, integer: bool, refused: np.ndarray | None) -> tuple[list[bool], list[object]]:
    plain = plain_number_shape(chunk, integer)
    if refused is not None:
        plain &= ~refused
    values = pc.cast(pc.if_else(pa.array(plain), chunk, pa.scalar(None, pa.string())), pa.float64())
    return plain.tolist(), values.to_pylist()


PLAIN_BYTES = st.text(st.sampled_from("0123456789+-."), min_size=0, max_size=17)
DIGITS = st.text(st.sampled_from("0123456789"), max_size=17)
NUMBERS = st.builds(
    lambda sign, whole, dot, part: sign + whole + dot + part,
    st.sampled_from(["", "", "-", "+"]),
    DIGITS,
    st.sampled_from(["", "."]),
    DIGITS,
)
"""Number-shaped texts, some longer than the quick way judges (more than 15 digits)."""
OTHERS = st.sampled_from(["1,5", "1/2", " 3", "7e1"])
CELLS = st.lists(NUMBERS | NUMBERS | PLAIN_BYTES | st.none() | OTHERS, min_size=1, max_size=30)


@given(CELLS, st.booleans(), st.data())
@settings(max_examples=300, deadline=None, derandomize=True)
def test_plain_numbers_answers_as_the_byte_kernel_does(
    cells: list[str | None], integer: bool, data: st.DataObject
) -> None:
    chunk = pa.array(cells, pa.string())
    refused = np.array(data.draw(st.lists(st.booleans(), min_size=len(cells), max_size=len(cells))))
    for no in (None, refused):
        plain, values = plain_numbers(chunk, integer, no)
        assert (plain.tolist(), values.to_pylist()) == slow_way(chunk, integer, no)


def test_the_quick_way_is_taken_on_a_chunk_of_plain_numbers_and_not_on_others() -> None:
    # The property above holds whichever way is taken: pin down that the quick way is taken.
    clean = pa.array(["12.5", "-3", None, "400", "0.125"])
    plain, values = _plain_numbers_at_once(clean, False, None) or ([], None)
    assert list(plain) == [True, True, False, True, True]
    assert values is not None and values.to_pylist() == [12.5, -3.0, None, 400.0, 0.125]
    assert _plain_numbers_at_once(pa.array(["12.5", "1.2.3"]), False, None) is None  # Arrow refuses one
    assert _plain_numbers_at_once(pa.array(["12.5", "1 "]), False, None) is None  # a byte of another kind
    assert _plain_numbers_at_once(pa.array(["12", "1" * 16]), True, None) is None  # too long to tell
    assert _plain_numbers_at_once(pa.array(["12", "1.5"]), True, None) is None  # a dot in an integer
