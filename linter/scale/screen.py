"""Tell, with Arrow kernels over whole columns, which rows are certainly clean under a table contract.

The screen is deliberately stricter than the engine: a cell passes only in a plain form that the
pandera engine is known to accept (e.g. a number must look like `12.5`, a date like `2026-03-02`,
a patterned text must be ASCII). Every row with a cell that does not pass goes to the engine of
record (pandera, `linter.contract.engine`), which then judges it exactly as it would in a full
run; a clean row yields no finding from any contract rule, so skipping it changes nothing.
"""

from __future__ import annotations

import os
from collections.abc import Mapping, Sequence
from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.compute as pc

from linter.contract.convert import convert_column
from linter.contract.model import TableContract, Variable, VarType
from linter.scale.key_hash import repeated_values

SCREENED_TYPES = frozenset(
    {VarType.STRING, VarType.CATEGORY, VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN, VarType.DATE}
)
ISO_FORMS = (None, "%Y-%m-%d")
BOOLEAN_WORDS = ("true", "false", "1", "0")
# Longer digit strings may overflow int64 in one engine and not the other: leave them to pandera.
LONGEST_PLAIN_INTEGER = 15
COUNTED_SPAN = 2
"""Folded key codes up to this many times the rows are counted in a table (8 bytes a code) instead
of sorted: at twice the rows the table costs 16 bytes a row, as the sort's copy and mask do."""


def whole_match(pattern: str) -> str:
    """The contract pattern as an RE2 whole-text match (the engine anchors with `\\Z` in Python)."""
    return rf"^(?:{pattern})\z"


def re2_accepts(pattern: str) -> bool:
    try:
        pc.match_substring_regex(pa.array([""]), whole_match(pattern))
    except (pa.ArrowInvalid, pa.ArrowNotImplementedError):
        return False
    return True


def unscreenable(contract: TableContract) -> str | None:
    """Why this contract cannot be pre-screened (then the file takes the ordinary path), or None."""
    if contract.comparisons:
        return "row comparisons"
    if contract.complete_over:
        return "complete_over (needs every row)"
    for variable in contract.variables:
        if variable.type not in SCREENED_TYPES:
            return f"{variable.name} has type {variable.type}"
        if variable.type is VarType.DATE and variable.date_format not in ISO_FORMS:
            return f"{variable.name} has date_format {variable.date_format}"
        if variable.references is not None:
            return f"{variable.name} references another table"
        if variable.pattern is not None and not re2_accepts(variable.pattern):
            return f"{variable.name} has a pattern Arrow's regex engine cannot run"
    return None


@dataclass(frozen=True)
class Screened:
    """One batch judged: which rows need the engine, and the key columns for duplicate search."""

    suspect: pa.ChunkedArray | pa.Array
    """True where a row has a cell the screen could not pass."""
    cells: Mapping[str, np.ndarray]
    """Per present variable, True where its own cell is one the screen could not pass."""
    keys: pa.Table
    """The key columns as the engine compares them (typed where the engine types them)."""


def _falsy(array: pa.Array | pa.ChunkedArray) -> pa.Array | pa.ChunkedArray:
    return pc.fill_null(array, False)


def _flat(mask: pa.Array | pa.ChunkedArray) -> np.ndarray:
    """A boolean Arrow result as a numpy bool array (null counts as False)."""
    return np.asarray(_falsy(mask).to_numpy(zero_copy_only=False), dtype=bool)


def _chunks(text: pa.ChunkedArray | pa.Array) -> list[pa.Array]:
    if isinstance(text, pa.ChunkedArray):
        return list(text.chunks) if text.num_chunks else [pa.array([], text.type)]
    return [text]


def _present(chunk: pa.Array) -> np.ndarray:
    """True where the cell is not null."""
    if chunk.null_count == 0:
        return np.ones(len(chunk), bool)
    return np.asarray(chunk.is_valid().to_numpy(zero_copy_only=False), dtype=bool)


def _cell_bytes(chunk: pa.Array) -> tuple[np.ndarray, np.ndarray]:
    """(offsets, bytes) of one text chunk without copying: cell i is bytes[offsets[i]:offsets[i + 1]]."""
    buffers = chunk.buffers()
    if len(chunk) == 0 or buffers[1] is None:
        return np.zeros(len(chunk) + 1, np.int64), np.zeros(0, np.uint8)
    width = np.int64 if pa.types.is_large_string(chunk.type) else np.int32
    offsets = np.frombuffer(buffers[1], width)[chunk.offset : chunk.offset + len(chunk) + 1].astype(np.int64)
    first, last = int(offsets[0]), int(offsets[-1])
    data = (
        np.frombuffer(buffers[2], np.uint8)[first:last] if buffers[2] is not None else np.zeros(0, np.uint8)
    )
    return offsets - first, data


def _byte_table(members: bytes) -> np.ndarray:
    table = np.zeros(256, bool)
    table[list(members)] = True
    return table


# Bytes that are certainly not whitespace to any trimming function: printable ASCII but the space.
UNTRIMMED = _byte_table(bytes(range(0x21, 0x7F)))


def _needs_trim(chunk: pa.Array) -> bool:
    """Whether any non-empty cell starts or ends with a byte trimming might remove (null cells
    included: trimming where nothing needs it only costs time)."""
    offsets, data = _cell_bytes(chunk)
    if len(data) == 0:
        return False
    starts, ends = offsets[:-1], offsets[1:]
    first, last = data.take(starts, mode="clip"), data.take(ends - 1, mode="clip")
    return bool(np.any((~UNTRIMMED[first] | ~UNTRIMMED[last]) & (ends > starts)))


def trimmed_text(text: pa.ChunkedArray) -> pa.ChunkedArray:
    """Every cell trimmed as the engine trims it; a chunk with no cell to trim is kept as it is."""
    return pa.chunked_array(
        [pc.utf8_trim_whitespace(c) if _needs_trim(c) else c for c in _chunks(text)], text.type
    )


def missing_cells(
    text: pa.ChunkedArray, codes: Sequence[str], trimmed: pa.ChunkedArray | None = None
) -> np.ndarray:
    """Empty cells and cells whose trimmed text is a missing-value code, as `missing_mask` does."""
    trimmed = trimmed_text(text) if trimmed is None else trimmed
    codes_set = pa.array(sorted({c.strip() for c in codes}), pa.string())
    return _flat(pc.or_(pc.is_null(text), _falsy(pc.is_in(trimmed, value_set=codes_set))))


def _ns_bound(bound: float | str) -> int:
    """A date bound in nanoseconds since 1970, clamped to the int64 range pandas' ns clock spans."""
    stamp = pd.Timestamp(str(bound))
    try:
        return int(stamp.as_unit("ns").value)
    except (OverflowError, pd.errors.OutOfBoundsDatetime):
        limit = np.iinfo(np.int64)
        return int(limit.max) if stamp > pd.Timestamp("1970-01-01") else int(limit.min)


def _bound_ok(values: np.ndarray, variable: Variable, as_date: bool) -> np.ndarray:
    """Within the contract's minimum and maximum (values: float64 with NaN, or int64 nanoseconds)."""
    ok = np.ones(len(values), bool)
    for bound, compare in ((variable.minimum, np.greater_equal), (variable.maximum, np.less_equal)):
        if bound is None:
            continue
        ok &= compare(values, _ns_bound(bound) if as_date else float(bound))
    return ok


# Each byte of a plain number adds its weight to the cell's sum: dots count in bits 0-4, signs in
# bits 5-9, anything else from bit 10 on; cells are at most 31 bytes, so the fields never carry
# and every sum of a cell that short fits in 16 bits.
LONGEST_PLAIN_NUMBER = 31
SIGNIFICANT_DIGITS = 15
NUMBER_WEIGHTS = np.full(256, 1 << 10, np.uint16)
NUMBER_WEIGHTS[ord("0") : ord("9") + 1] = 0
NUMBER_WEIGHTS[ord(".")] = 1
NUMBER_WEIGHTS[[ord("+"), ord("-")]] = 1 << 5
SIGNS = _byte_table(b"+-")
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
    offsets, data = _cell_bytes(chunk)
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
    return plain & _present(chunk) if chunk.null_count else plain


def _with_validity(chunk: pa.Array, valid: np.ndarray) -> pa.Array:
    """The same text cells (same buffers, no copy) with null wherever `valid` is False."""
    bits = np.packbits(np.concatenate([np.zeros(chunk.offset, bool), valid]), bitorder="little")
    buffers = chunk.buffers()
    return pa.Array.from_buffers(
        chunk.type, len(chunk), [pa.py_buffer(bits.tobytes()), buffers[1], buffers[2]], offset=chunk.offset
    )


def _numbers(trimmed: pa.ChunkedArray, variable: Variable) -> tuple[np.ndarray, pa.ChunkedArray, np.ndarray]:
    """(plain, value as the engine reads it, value as float64 with NaN) of number or integer cells."""
    integer = variable.type is VarType.INTEGER
    plain_parts: list[np.ndarray] = []
    values_parts: list[pa.Array] = []
    for chunk in _chunks(trimmed):
        plain = plain_number_shape(chunk, integer)
        if variable.censored_prefix and variable.censored_prefix[0] in PLAIN_NUMBER_BYTES:
            plain &= ~_flat(pc.starts_with(chunk, variable.censored_prefix))
        plain_parts.append(plain)
        values_parts.append(pc.cast(_with_validity(chunk, plain), pa.float64()))
    values = pa.chunked_array(values_parts, pa.float64())
    plain = np.concatenate(plain_parts)
    return plain, values, np.asarray(values.to_numpy(zero_copy_only=False), dtype=np.float64)


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


def _date_text(chunk: pa.Array, shaped: np.ndarray) -> np.ndarray:
    """The bytes of the cells where `shaped` (cells 10 bytes long) side by side, 10 per cell."""
    offsets, data = _cell_bytes(chunk)
    rows = np.flatnonzero(shaped)
    if len(rows) * 10 == len(data):  # every byte belongs to a 10-byte cell: the data is the text
        return data
    windows = np.lib.stride_tricks.sliding_window_view(data, 10)
    return np.ascontiguousarray(windows[offsets[rows]]).reshape(-1)


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
    offsets, _ = _cell_bytes(chunk)
    shaped = _present(chunk) & (np.diff(offsets) == 10)
    real = np.zeros(len(chunk), bool)
    stamps = np.zeros(len(chunk), np.int64)
    if not shaped.any():
        return real, stamps
    ok, days = _read_dates(_date_text(chunk, shaped), int(shaped.sum()))
    rows = np.flatnonzero(shaped)
    real[rows] = ok
    stamps[rows] = np.where(ok, days * NS_PER_DAY, 0)
    return real, stamps


def _dates(text: pa.ChunkedArray) -> tuple[np.ndarray, np.ndarray]:
    parts = [iso_dates(chunk) for chunk in _chunks(text)]
    return np.concatenate([p[0] for p in parts]), np.concatenate([p[1] for p in parts])


TRIMMED_TYPES = frozenset({VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN})
"""Types the engine reads from the trimmed text (strings and dates it reads as written)."""


def _trimmed_cells(trimmed: pa.ChunkedArray, variable: Variable) -> tuple[np.ndarray, pa.ChunkedArray]:
    """(passes, typed value) of numbers, integers and booleans, judged on the trimmed text."""
    if variable.type is VarType.BOOLEAN:
        words = pc.utf8_lower(trimmed)
        ok = _flat(pc.string_is_ascii(trimmed)) & _flat(pc.is_in(words, pa.array(BOOLEAN_WORDS)))
        # As a key, "1" and "true" are the same value to the engine.
        return ok, pc.is_in(words, pa.array(("true", "1")))
    plain, values, floats = _numbers(trimmed, variable)
    return plain & _bound_ok(floats, variable, as_date=False), values


def _typed_cells(
    text: pa.ChunkedArray, variable: Variable, trimmed: pa.ChunkedArray | None = None
) -> tuple[np.ndarray, pa.Array | pa.ChunkedArray]:
    """(passes, typed value) for a present cell; typed values are null where the screen gives up."""
    kind = variable.type
    if kind in TRIMMED_TYPES:
        return _trimmed_cells(trimmed_text(text) if trimmed is None else trimmed, variable)
    if kind is VarType.DATE:
        # The engine's agreed form is matched on the untrimmed text: '2026-03-02 ' is not a plain date.
        real, stamps = _dates(text)
        typed = pa.array(stamps, pa.timestamp("ns"), mask=~real)
        return real & _bound_ok(stamps, variable, as_date=True), typed
    # Combined as Arrow bitmaps, turned into numpy once.
    ok = pc.is_valid(text)
    if variable.pattern is not None:
        # RE2 and Python's re agree on ASCII text; other text goes to the engine.
        matched = pc.match_substring_regex(text, whole_match(variable.pattern))
        ok = pc.and_(ok, pc.and_(_falsy(pc.string_is_ascii(text)), _falsy(matched)))
    if variable.codes is not None:
        ok = pc.and_(ok, _falsy(pc.is_in(text, pa.array(variable.codes.values, pa.string()))))
    return _flat(ok), text


def _present_text(text: pa.ChunkedArray) -> np.ndarray:
    return np.concatenate([_present(chunk) for chunk in _chunks(text)])


def _engine_keys(
    text: pa.ChunkedArray, variable: Variable, contract: TableContract, rows: np.ndarray
) -> pa.Array:
    """Key values of the cells at `rows` exactly as the engine types them (it reads each cell itself)."""
    cells = pd.Series(text.take(pa.array(rows, pa.int64())).to_pylist(), dtype=object)
    try:
        with np.errstate(invalid="ignore"):
            values = convert_column(cells, variable, contract.missing).values
    except (TypeError, ValueError, OverflowError):
        # The engine cannot read these cells either (e.g. an integer beyond int64) and will say so
        # on these rows, which it judges anyway; null keys only keep more rows for it.
        return pa.nulls(len(rows), pa.timestamp("ns") if variable.type is VarType.DATE else pa.float64())
    if variable.type is VarType.DATE:
        stamps = values.to_numpy("datetime64[us]")
        inside = (stamps >= np.datetime64(pd.Timestamp.min.ceil("us"))) & (
            stamps <= np.datetime64(pd.Timestamp.max.floor("us"))
        )
        # Beyond the nanosecond clock no screened date can equal it: a null key is then safe.
        return pa.array(
            np.where(inside, stamps, np.datetime64("NaT")).astype("datetime64[ns]"),
            pa.timestamp("ns"),
            from_pandas=True,
        )
    return pa.array(values.astype("float64").to_numpy(), pa.float64(), from_pandas=True)


def _keyed(
    text: pa.ChunkedArray,
    variable: Variable,
    contract: TableContract,
    typed: pa.Array | pa.ChunkedArray,
    missing: np.ndarray,
) -> pa.Array | pa.ChunkedArray:
    """Typed key values, with every present cell the screen could not type read by the engine instead:
    otherwise a key written `1.5e0` (engine 1.5, screen null) would hide its duplicate `1.5`."""
    given_up = ~missing & ~_flat(pc.is_valid(typed))
    if not given_up.any():
        return typed
    rows = np.flatnonzero(given_up)
    spread = np.full(len(missing), -1, np.int64)
    spread[rows] = np.arange(len(rows))
    engine = _engine_keys(text, variable, contract, rows)
    return pc.if_else(pa.array(given_up), engine.take(pa.array(np.maximum(spread, 0))), typed)


def _passing_never_missing(variable: Variable, codes: Sequence[str]) -> bool:
    """Whether no cell the screen passes can be a missing-value code: then only failing cells need
    the missing-value look-up. Passing numbers, booleans and dates are their own trimmed text, so
    trying the codes themselves decides it; a passing category is one of its codes."""
    stripped = pa.array(sorted({c.strip() for c in codes}), pa.string())
    if variable.type in (VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN, VarType.DATE):
        return not _typed_cells(pa.chunked_array([stripped], pa.string()), variable)[0].any()
    if variable.codes is not None:
        written = pa.array(variable.codes.values, pa.string())
        return not _flat(pc.is_in(pc.utf8_trim_whitespace(written), value_set=stripped)).any()
    return False


def _missing_among(text: pa.ChunkedArray, codes: Sequence[str], rows: np.ndarray) -> np.ndarray:
    """Where a cell is missing, looked up only at `rows` (and at null cells); False elsewhere."""
    missing = ~_present_text(text)
    look = np.flatnonzero(rows & ~missing)
    if len(look):
        cells = pa.chunked_array([text.take(pa.array(look, pa.int64()))], text.type)
        missing[look] = missing_cells(cells, codes)
    return missing


def _judged(
    text: pa.ChunkedArray, variable: Variable, contract: TableContract
) -> tuple[np.ndarray, pa.Array | pa.ChunkedArray]:
    """(clean, key value) for one column: clean where the engine would find nothing in the cell."""
    codes = tuple(contract.missing) + tuple(variable.missing)
    trimmed = (
        trimmed_text(text) if variable.type in (VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN) else text
    )
    passes, typed = _typed_cells(text, variable, trimmed)
    if _passing_never_missing(variable, codes):
        missing = _missing_among(text, codes, ~passes)
    else:
        missing = missing_cells(text, codes, trimmed_text(text) if trimmed is text else trimmed)
    nullable = variable.nullable and variable.name not in contract.keys
    clean = np.where(missing, nullable, passes)
    if variable.name not in contract.keys:
        return clean, typed
    keyed = pc.if_else(pa.array(missing), pa.scalar(None, typed.type), typed) if missing.any() else typed
    if variable.type in (VarType.NUMBER, VarType.INTEGER, VarType.DATE):
        keyed = _keyed(text, variable, contract, keyed, missing)
    return clean, keyed


_pools: dict[int, ThreadPoolExecutor] = {}


def _pool() -> ThreadPoolExecutor:
    """One thread pool per process (a forked child must not use its parent's threads)."""
    pid = os.getpid()
    if pid not in _pools:
        _pools[pid] = ThreadPoolExecutor(max_workers=os.cpu_count() or 1, thread_name_prefix="weir-screen")
    return _pools[pid]


def screen_batch(batch: pa.Table, contract: TableContract) -> Screened:
    """Judge every present variable of one batch (columns named as in the header, all text)."""
    present = [v for v in contract.variables if v.name in batch.column_names]
    # Arrow kernels and numpy release the GIL, so columns are judged side by side on the available cores.
    judged = list(_pool().map(lambda v: _judged(batch.column(v.name), v, contract), present))
    clean = np.ones(batch.num_rows, bool)
    for column_clean, _ in judged:
        clean &= column_clean
    cells = {v.name: ~column_clean for v, (column_clean, _) in zip(present, judged, strict=True)}
    keys = {v.name: key for v, (_, key) in zip(present, judged, strict=True) if v.name in contract.keys}
    return Screened(pa.array(~clean), cells, pa.table(keys) if keys else pa.table({}))


def plain_integers(indices: pa.Array) -> np.ndarray:
    """Dictionary indices (no nulls) as a NumPy view in their own width, without Arrow's slow
    nullable conversion and without a copy."""
    raw = np.frombuffer(indices.buffers()[1], dtype=indices.type.to_pandas_dtype())
    return raw[indices.offset : indices.offset + len(indices)]


def key_codes(keys: pa.Table) -> np.ndarray:
    """A non-negative integer per row, equal exactly where the whole keys are equal (nulls equal to
    nulls, as in pandas' `duplicated`).

    Each column is dictionary-encoded and the codes are folded in column by column; when the
    product of the dictionary sizes could overflow, the folded codes are renumbered first.
    """
    combined = np.zeros(keys.num_rows, np.int64)
    span = 1
    for name in keys.column_names:
        column = keys.column(name)
        if pa.types.is_floating(column.type):
            column = pc.add(column, 0.0)  # -0.0 + 0.0 is 0.0: equal numbers, one code
        # One chunk first: chunked input would get one dictionary per chunk.
        encoded = pc.dictionary_encode(column.combine_chunks(), null_encoding="encode")
        size = max(1, len(encoded.dictionary))
        if span * size >= 1 << 62:
            _, combined = np.unique(combined, return_inverse=True)
            span = int(combined.max()) + 1 if len(combined) else 1
        if size > 1:  # one value (or none) adds nothing to tell rows apart
            combined *= size
            combined += plain_integers(encoded.indices)
        span *= size
    return combined


def shared_codes(codes: np.ndarray) -> np.ndarray:
    """True where a (non-negative) code occurs more than once.

    Codes spanning at most `COUNTED_SPAN` times the rows are counted in one table (one pass, no
    sort); wider ones are sorted and only the repeated codes searched for.
    """
    if len(codes) < 2:
        return np.zeros(len(codes), bool)
    span = int(codes.max()) + 1
    if span <= COUNTED_SPAN * len(codes):
        return np.bincount(codes, minlength=span)[codes] > 1
    return repeated_values(codes)


def duplicated_rows(keys: pa.Table) -> pa.Array:
    """Sorted row positions whose whole key is shared with another row."""
    if keys.num_columns == 0 or keys.num_rows == 0:
        return pa.array([], pa.int64())
    codes = key_codes(keys)
    shared = shared_codes(codes)
    return pa.array(np.flatnonzero(shared), pa.int64())
