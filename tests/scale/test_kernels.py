"""The byte kernels against references the project did not write.

Dates: every day the kernel reads is the day Python's own calendar (the `datetime` module, the
proleptic Gregorian calendar of ISO 8601 §4.3.2.1) gives, and every text it refuses is no such day.

Numbers: the quick way of `kernels.plain_numbers` gives the byte kernel's answer, never a looser
one. It lets Arrow's number parser decide which cells are plain when a chunk is written only in
digits, signs and dots. That rests on one fact about the parser, checked here on every text of
those bytes up to six long: it reads such a text exactly when `plain_number_shape` calls it plain.
"""

from __future__ import annotations

import calendar
import datetime as dt
import itertools

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from linter.scale.kernels import (
    FIRST_YEAR,
    LAST_YEAR,
    NS_PER_DAY,
    _plain_numbers_at_once,
    iso_dates,
    plain_number_shape,
    plain_numbers,
)

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
    # The property above holds whichever way is taken: pin down when the quick way is taken.
    def quick(cells: list[str | None], integer: bool = False) -> list[bool] | None:
        found = _plain_numbers_at_once(pa.array(cells, pa.string()), integer, None)
        return None if found is None else found[0].tolist()

    clean = pa.array(["12.5", "-3", None, "400", "0.125"])
    plain, values = _plain_numbers_at_once(clean, False, None) or ([], None)
    assert list(plain) == [True, True, False, True, True]
    assert values is not None and values.to_pylist() == [12.5, -3.0, None, 400.0, 0.125]
    # A cell with another byte is simply not plain, however long: the others are still judged.
    assert quick(["12.5", "1 ", "1,420", "about three hundred and ten"]) == [True, False, False, False]
    assert quick(["12", "1.5"], integer=True) == [True, False]  # a dot in an integer
    assert quick(["12.5", "1.2.3"]) is None  # Arrow refuses a text of number bytes
    assert quick(["12", "1" * 16], integer=True) is None  # too long to tell


def calendar_day(text: str) -> dt.date | None:
    """The day a YYYY-MM-DD text names in Python's calendar, or None when there is no such day."""
    year, month, day = (int(part) for part in text.split("-"))
    try:
        return dt.date(year, month, day)
    except ValueError:
        return None


# Years around every rule of the calendar (every 4th, not every 100th, every 400th) and the edges
# of the nanosecond clock (the kernel takes 1678-2261 whole and leaves the rest to the engine).
YEARS = (0, 1, 1600, 1677, 1678, 1700, 1800, 1900, 1970, 2000, 2023, 2024, 2026, 2100, 2261, 2262, 9999)


def test_every_day_read_is_the_day_of_the_calendar() -> None:
    # Source: Python's datetime module (proleptic Gregorian calendar), not the kernel's own tables.
    texts = [f"{y:04d}-{m:02d}-{d:02d}" for y in YEARS for m in range(14) for d in range(33)]
    real, stamps = iso_dates(pa.array(texts))
    wrong = []
    for text, is_real, stamp in zip(texts, real.tolist(), stamps.tolist(), strict=True):
        day = calendar_day(text)
        expected = day is not None and FIRST_YEAR <= day.year <= LAST_YEAR
        if is_real != expected or (
            expected and day and stamp != (day - dt.date(1970, 1, 1)).days * NS_PER_DAY
        ):
            wrong.append((text, is_real, stamp))
    assert wrong == []
    held = [y for y in YEARS if FIRST_YEAR <= y <= LAST_YEAR]
    assert int(real.sum()) == sum(366 if calendar.isleap(y) else 365 for y in held)  # every day of them


NEAR_DIGITS = "/:0123456789-+. T"
"""Digits, the bytes beside them ('/' and ':'), and the other bytes a date is written with."""


def one_and_two_bytes_changed(text: str) -> list[str]:
    """Every text made from `text` by putting a byte of NEAR_DIGITS at one or two of its places."""
    changed = []
    for places in [
        *itertools.combinations(range(len(text)), 1),
        *itertools.combinations(range(len(text)), 2),
    ]:
        for chars in itertools.product(NEAR_DIGITS, repeat=len(places)):
            cells = list(text)
            for place, char in zip(places, chars, strict=True):
                cells[place] = char
            changed.append("".join(cells))
    return changed


@pytest.mark.parametrize("day", ["2024-02-29", "1999-12-31", "2026-03-02"])
def test_a_date_with_one_or_two_bytes_changed_is_read_only_when_it_is_a_day(day: str) -> None:
    # Source: Python's datetime module decides which of the changed texts name a day.
    texts = one_and_two_bytes_changed(day)
    real, stamps = iso_dates(pa.array(texts))
    wrong = []
    for text, is_real, stamp in zip(texts, real.tolist(), stamps.tolist(), strict=True):
        shaped = text[4] == text[7] == "-" and (text[:4] + text[5:7] + text[8:]).isdigit()
        found = calendar_day(text) if shaped else None
        expected = found is not None and FIRST_YEAR <= found.year <= LAST_YEAR
        if is_real != expected or (
            found and expected and stamp != (found - dt.date(1970, 1, 1)).days * NS_PER_DAY
        ):
            wrong.append(text)
    assert wrong == []
    assert real.any() and not real.all()
