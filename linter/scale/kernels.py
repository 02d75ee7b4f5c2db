"""Byte kernels: plain numbers and ISO 8601 dates judged straight from Arrow's text buffers.

Each kernel reads every cell's bytes with a few numpy passes over the whole chunk (no Python per
cell) and is deliberately stricter than the engine: a cell it passes is one the engine reads to the
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

    When every byte of the chunk is a digit, a sign or (for numbers) a dot, and no cell is longer
    than `SIGNIFICANT_DIGITS`, a cell is plain exactly when Arrow's number parser reads it (at most
    one dot, a sign only in front, a digit somewhere: tests/scale/test_plain_numbers.py holds this
    for every such text up to six bytes), so the parse the values need anyway decides; one cell
    it refuses sends the chunk to `plain_number_shape`.
    """
    offsets, data = cell_bytes(chunk)
    if not len(data) or data.min() < ord("+") or data.max() > ord("9"):
        return None
    # Between '+' and '9' lie also ',' and '/', and for integers the dot is not plain either.
    if (data == ord(",")).any() or (data == ord("/")).any() or (integer and (data == ord(".")).any()):
        return None
    lengths = np.diff(offsets)
    if lengths.max() > SIGNIFICANT_DIGITS:
        return None
    plain = lengths > 0
    if chunk.null_count:
        plain &= present(chunk)
    if refused is not None:
        plain &= ~refused
    try:
        return plain, pc.cast(with_validity(chunk, plain), pa.float64())
    except pa.ArrowInvalid:
        return None


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


def _calendar() -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """Lookup tables by year (0-9999) and by month * 100 + day (0-9999): leap, year held, first day
    of the year since 1970, real month and day (29 February included), day of a common year."""
    years = np.arange(10_000)
    leap = (years % 4 == 0) & ((years % 100 != 0) | (years % 400 == 0))
    held = (years >= FIRST_YEAR) & (years <= LAST_YEAR)
    ones = np.ones_like(years)
    year_start = _days_since_1970(years, ones, ones)
    month, day = np.divmod(np.arange(10_000), 100)
    longest = np.array([0, 31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31])
    real = (month >= 1) & (month <= 12) & (day >= 1) & (day <= longest[np.clip(month, 0, 12)])
    common = np.full(10_000, 2001)
    of_year = _days_since_1970(common, np.clip(month, 1, 12), day) - _days_since_1970(common, ones, ones)
    of_year = np.where(real, of_year, 0)
    of_year[LEAP_DAY] = 59  # 31 January days + 28 February days before it
    return leap, held, year_start, real, of_year


LEAP_DAY = 229
"""29 February as month * 100 + day."""
LEAP_YEAR, HELD_YEAR, YEAR_START, REAL_MONTH_DAY, DAY_OF_COMMON_YEAR = _calendar()


def _lanes(text: bytes) -> int:
    """Bytes as the little-endian integer they form in memory."""
    return int.from_bytes(text, "little")


# A date's first 8 bytes are read as one uint64 and its last 2 as one uint16. After an XOR with the
# expected text ('0000-00-' and '00') a digit lane holds 0-9 and a dash lane 0; a lane holds a value
# below 10 exactly when neither its own top bit nor that of its low 7 bits plus 0x76 is set.
ZEROS_AND_DASHES = np.uint64(_lanes(b"0000-00-"))
DASH_LANES = np.uint64(_lanes(b"\0\0\0\0\xff\0\0\xff"))
LOW_BITS, BELOW_TEN, TOP_BITS = (np.uint64(_lanes(bytes([b]) * 8)) for b in (0x7F, 0x76, 0x80))


def _digit_lanes(lanes: np.ndarray) -> np.ndarray:
    """True where every byte lane of `lanes` (uint64 or uint16) holds a value from 0 to 9."""
    kind = lanes.dtype.type
    low, ten, top = (kind(int(c) & int(np.iinfo(kind).max)) for c in (LOW_BITS, BELOW_TEN, TOP_BITS))
    return ((((lanes & low) + ten) | lanes) & top) == 0


def _lane(lanes: np.ndarray, place: int) -> np.ndarray:
    return ((lanes >> np.uint64(8 * place)) & np.uint64(0xFF)).astype(np.int32)


def _read_dates(text: np.ndarray, count: int) -> tuple[np.ndarray, np.ndarray]:
    """(real date, days since 1970) of `count` 10-byte texts in `text`, exactly YYYY-MM-DD."""
    head = np.ndarray((count,), "<u8", buffer=text, offset=0, strides=(10,)) ^ ZEROS_AND_DASHES
    tail = np.ndarray((count,), "<u2", buffer=text, offset=8, strides=(10,)) ^ np.uint16(_lanes(b"00"))
    ok = _digit_lanes(head & ~DASH_LANES) & ((head & DASH_LANES) == 0) & _digit_lanes(tail)
    year = _lane(head, 0) * 1000 + _lane(head, 1) * 100 + _lane(head, 2) * 10 + _lane(head, 3)
    day = tail.astype(np.int32)
    month_day = _lane(head, 5) * 1000 + _lane(head, 6) * 100 + (day & 0xFF) * 10 + (day >> 8)
    year, month_day = np.where(ok, year, 0), np.where(ok, month_day, 0)
    leap = LEAP_YEAR[year]
    ok &= HELD_YEAR[year] & REAL_MONTH_DAY[month_day] & ((month_day != LEAP_DAY) | leap)
    days = YEAR_START[year] + DAY_OF_COMMON_YEAR[month_day] + (leap & (month_day > LEAP_DAY))
    return ok, days


def iso_dates(chunk: pa.Array) -> tuple[np.ndarray, np.ndarray]:
    """(real date, nanoseconds since 1970) of cells written exactly YYYY-MM-DD with ASCII digits,
    a real day of a real month and a year the nanosecond clock holds; other cells get False, 0."""
    offsets, data = cell_bytes(chunk)
    shaped = present(chunk) & (np.diff(offsets) == 10)
    real = np.zeros(len(chunk), bool)
    stamps = np.zeros(len(chunk), np.int64)
    if not shaped.any():
        return real, stamps
    ok, days = _read_dates(fixed_width_text(offsets, data, shaped, 10).reshape(-1), int(shaped.sum()))
    rows = np.flatnonzero(shaped)
    real[rows] = ok
    stamps[rows] = np.where(ok, days * NS_PER_DAY, 0)
    return real, stamps
