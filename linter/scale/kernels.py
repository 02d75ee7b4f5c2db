"""Byte kernels: plain numbers and ISO 8601 dates judged straight from Arrow's text buffers.

Each kernel reads every cell's bytes with a few numpy passes over the whole chunk (no Python per
cell; a chunk of number bytes is judged by Arrow's number parse, see `plain_numbers`) and is
deliberately stricter than the engine: a cell it passes is one the engine reads to the
same value; anything else is left for the engine to judge.
"""

from __future__ import annotations

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

from linter.scale.cell_bytes import byte_table, cell_bytes, fixed_width_text, present, with_validity

# Longer digit strings may overflow int64 in one engine and not the other: leave them to pandera.
LONGEST_PLAIN_INTEGER = 15


# Each byte of a plain number adds its weight to the cell's sum: dots count in bits 0-4, signs in
# bits 5-9, anything else from bit 10 on; cells are at most 31 bytes, so the fields never carry
# and every sum of a cell that short fits in 16 bits.
LONGEST_PLAIN_NUMBER = 31
SIGNIFICANT_DIGITS = 15
NUMBER_WEIGHTS = np.full(256, 1 << 10, np.uint16)
NUMBER_WEIGHTS[ord("0") : ord("9") + 1] = 0
NUMBER_WEIGHTS[ord(".")] = 1
NUMBER_WEIGHTS[[ord("+"), ord("-")]] = 1 << 5
SIGNS = byte_table(b"+-")
PLAIN_NUMBER_BYTES = "+-.0123456789"
"""A censored prefix starting with another character can never start a plain number."""


def _cell_sums(weights: np.ndarray, offsets: np.ndarray) -> np.ndarray:
    """Per cell, the sum of its bytes' weights, modulo 2**16 (exact for the cells that matter)."""
    running = np.zeros(len(weights) + 1, np.uint16)
    np.cumsum(weights, dtype=np.uint16, out=running[1:])
    return running[offsets[1:]] - running[offsets[:-1]]


def plain_number_shape(chunk: pa.Array, integer: bool) -> np.ndarray:
    """True where the (trimmed) cell is ASCII digits with at most one leading sign and, for numbers,
    at most one dot: a subset of `PLAIN_NUMBER` / `PLAIN_INTEGER` (exponents go to the engine)."""
    offsets, data = cell_bytes(chunk)
    if len(data) == 0:
        return np.zeros(len(chunk), bool)
    lengths = np.diff(offsets)
    sums = _cell_sums(NUMBER_WEIGHTS[data], offsets)
    leading_sign = SIGNS[data.take(offsets[:-1], mode="clip")]
    # Less the leading sign's weight, what is left counts the dots alone when nothing else is there.
    dots = sums - np.where(leading_sign, np.uint16(1 << 5), np.uint16(0))
    longest = LONGEST_PLAIN_INTEGER if integer else LONGEST_PLAIN_NUMBER
    digits = lengths - dots - leading_sign
    plain = (dots <= (0 if integer else 1)) & (lengths <= longest) & (digits > 0)
    # Up to 15 significant digits a double is one exact scaling away from the text, so Arrow's and
    # pandas' parsers agree to the bit; pandas misrounds some longer ones (1000000000000000.5).
    plain &= digits <= SIGNIFICANT_DIGITS
    return plain & present(chunk) if chunk.null_count else plain


def plain_numbers(
    chunk: pa.Array, integer: bool, refused: np.ndarray | None = None
) -> tuple[np.ndarray, pa.Array]:
    """(plain, value as float64) of one chunk of trimmed number or integer cells: plain as in
    `plain_number_shape`, never where `refused` (e.g. a censored prefix), and the value null
    wherever the cell is not plain."""
    quick = _plain_numbers_at_once(chunk, integer, refused)
    if quick is not None:
        return quick
    plain = plain_number_shape(chunk, integer)
    if refused is not None:
        plain &= ~refused
    return plain, pc.cast(with_validity(chunk, plain), pa.float64())


def _plain_numbers_at_once(
    chunk: pa.Array, integer: bool, refused: np.ndarray | None
) -> tuple[np.ndarray, pa.Array] | None:
    """The same answer as `plain_numbers` without a pass per cell byte, or None when it cannot tell.

    A cell holding a byte that is not a digit, a sign or (for numbers) a dot is not plain. Among
    the others, when none is longer than `SIGNIFICANT_DIGITS`, a cell is plain exactly when Arrow's
    number parser reads it (at most one dot, a sign only in front, a digit somewhere:
    tests/scale/test_kernels.py holds this for every such text up to six bytes), so the parse the
    values need anyway decides; one such cell it refuses sends the chunk to `plain_number_shape`.
    """
    offsets, data = cell_bytes(chunk)
    if not len(data):
        return None
    lengths = np.diff(offsets)
    plain = lengths > 0
    if chunk.null_count:
        plain &= present(chunk)
    others = _other_bytes(data, integer)
    if len(others):
        plain[np.searchsorted(offsets, others, side="right") - 1] = False
    if (plain & (lengths > SIGNIFICANT_DIGITS)).any():
        return None
    if refused is not None:
        plain &= ~refused
    try:
        return plain, pc.cast(with_validity(chunk, plain), pa.float64())
    except pa.ArrowInvalid:
        return None


def _other_bytes(data: np.ndarray, integer: bool) -> np.ndarray:
    """Positions of the bytes that are not a digit, a sign or (for numbers) a dot, found with a
    few byte-wide passes (no table look-up), the usual answer (none) with the fewest."""
    # Between '+' and '9' lie also ',' and '/', and for integers the dot is not plain either.
    inside = (ord(","), ord("/"), ord(".")) if integer else (ord(","), ord("/"))
    if data.min() >= ord("+") and data.max() <= ord("9") and not any((data == b).any() for b in inside):
        return np.zeros(0, np.int64)
    other = (data < ord("+")) | (data > ord("9"))
    for byte in inside:
        other |= data == byte
    return np.flatnonzero(other)


# Pandas' nanosecond clock spans 1677-09-21 to 2262-04-11; the screen passes whole years inside it.
FIRST_YEAR, LAST_YEAR = 1678, 2261
NS_PER_DAY = 86_400 * 10**9


def _days_since_1970(year: np.ndarray, month: np.ndarray, day: np.ndarray) -> np.ndarray:
    """Days from 1970-01-01 of proleptic Gregorian dates (years from 1 on), in integers only."""
    year = year - (month <= 2)
    era = year // 400
    of_era = year - era * 400
    of_year = (153 * ((month + 9) % 12) + 2) // 5 + day - 1
    return era * 146_097 + of_era * 365 + of_era // 4 - of_era // 100 + of_year - 719_468


NOT_HELD = -1


def _calendar() -> tuple[np.ndarray, np.ndarray]:
    """Two lookup tables. By year (0-9999): twice the days from 1970 to its 1 January, plus 1 in
    a leap year, or NOT_HELD when the nanosecond clock does not hold the year whole. By leap (0 or
    1) * 10,000 + month * 100 + day: the days from 1 January to that day, or NOT_HELD when no
    such day exists in such a year (30 February, 29 February of a common year, month 13)."""
    years = np.arange(10_000)
    leap = (years % 4 == 0) & ((years % 100 != 0) | (years % 400 == 0))
    ones = np.ones_like(years)
    year_start = _days_since_1970(years, ones, ones)
    held = (years >= FIRST_YEAR) & (years <= LAST_YEAR)
    by_year = np.where(held, year_start * 2 + leap, NOT_HELD)
    month, day = np.divmod(np.arange(10_000), 100)
    by_day = np.full(20_000, NOT_HELD, np.int64)
    for is_leap, of_a_year in ((0, 2001), (1, 2004)):
        length = np.array([0, 31, 28 + is_leap, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31])
        real = (month >= 1) & (month <= 12) & (day >= 1) & (day <= length[np.clip(month, 0, 12)])
        year = np.full(10_000, of_a_year)
        of_year = _days_since_1970(year, np.clip(month, 1, 12), day) - _days_since_1970(year, ones, ones)
        by_day[is_leap * 10_000 : (is_leap + 1) * 10_000] = np.where(real, of_year, NOT_HELD)
    return by_year, by_day


BY_YEAR, BY_DAY = _calendar()


def _texts(text: np.ndarray, count: int, offset: int, kind: str) -> np.ndarray:
    """From each of `count` 10-byte texts side by side in `text`, the bytes at `offset` read as one
    little-endian unsigned integer of `kind` ('u1', 'u2', 'u4'): a strided view, no copy."""
    return np.ndarray((count,), "<" + kind, buffer=text, offset=offset, strides=(10,))


def _digits(lanes: np.ndarray, zeros: int, low: int, ten: int, top: int) -> tuple[np.ndarray, np.ndarray]:
    """(every byte an ASCII digit, the digit values in their byte lanes) of a u2 or u4 array.

    After an XOR with '0' in every byte a digit lane holds 0-9; a lane holds a value below 10
    exactly when neither its own top bit nor that of its low 7 bits plus 0x76 is set."""
    kind = lanes.dtype.type
    values = lanes ^ kind(zeros)
    return ((((values & kind(low)) + kind(ten)) | values) & kind(top)) == 0, values


def _read_dates(text: np.ndarray, count: int) -> tuple[np.ndarray, np.ndarray]:
    """(real date, days since 1970) of `count` 10-byte texts in `text`, exactly YYYY-MM-DD."""
    year_ok, year_digits = _digits(
        _texts(text, count, 0, "u4"), 0x30303030, 0x7F7F7F7F, 0x76767676, 0x80808080
    )
    month_ok, month_digits = _digits(_texts(text, count, 5, "u2"), 0x3030, 0x7F7F, 0x7676, 0x8080)
    day_ok, day_digits = _digits(_texts(text, count, 8, "u2"), 0x3030, 0x7F7F, 0x7676, 0x8080)
    dashes = (_texts(text, count, 4, "u1") == ord("-")) & (_texts(text, count, 7, "u1") == ord("-"))
    ok = year_ok & month_ok & day_ok & dashes
    # Digits first in the lowest byte: pairs of lanes become two-digit numbers, then one of four.
    pairs = year_digits * np.uint32(10) + (year_digits >> np.uint32(8))
    year = (pairs & np.uint32(0xFF)) * np.uint32(100) + ((pairs >> np.uint32(16)) & np.uint32(0xFF))
    month = (month_digits & np.uint16(0xFF)) * np.uint16(10) + (month_digits >> np.uint16(8))
    day = (day_digits & np.uint16(0xFF)) * np.uint16(10) + (day_digits >> np.uint16(8))
    # Cells that are not all digits may hold anything in their lanes: look them up as year 0.
    by_year = BY_YEAR[np.where(ok, year, 0)]
    of_year = BY_DAY[np.where(ok, (by_year & 1) * 10_000 + month * 100 + day, 0)]
    ok &= (by_year != NOT_HELD) & (of_year != NOT_HELD)
    return ok, (by_year >> 1) + of_year


def iso_dates(chunk: pa.Array) -> tuple[np.ndarray, np.ndarray]:
    """(real date, nanoseconds since 1970) of cells written exactly YYYY-MM-DD with ASCII digits,
    a real day of a real month and a year the nanosecond clock holds; other cells get False, 0."""
    offsets, data = cell_bytes(chunk)
    shaped = present(chunk) & (np.diff(offsets) == 10)
    count = int(shaped.sum())
    if count == 0:
        return np.zeros(len(chunk), bool), np.zeros(len(chunk), np.int64)
    ok, days = _read_dates(fixed_width_text(offsets, data, shaped, 10).reshape(-1), count)
    stamps = np.where(ok, days * NS_PER_DAY, 0)
    if count == len(chunk):  # the usual column of dates: no cell to leave out
        return ok, stamps
    real = np.zeros(len(chunk), bool)
    spread = np.zeros(len(chunk), np.int64)
    rows = np.flatnonzero(shaped)
    real[rows] = ok
    spread[rows] = stamps
    return real, spread
