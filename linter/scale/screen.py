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
from dataclasses import dataclass, field
from typing import NamedTuple

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.compute as pc

from linter.contract.convert import convert_column
from linter.contract.model import TableContract, Variable, VarType
from linter.scale.cell_bytes import byte_table, cell_bytes, chunks, falsy, flat, present
from linter.scale.kernels import PLAIN_NUMBER_BYTES, iso_dates, plain_numbers
from linter.scale.patterns import fixed_width_matches, position_tables

SCREENED_TYPES = frozenset(
    {VarType.STRING, VarType.CATEGORY, VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN, VarType.DATE}
)
ISO_FORMS = (None, "%Y-%m-%d")
BOOLEAN_WORDS = ("true", "false", "1", "0")


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
    good: Mapping[str, np.ndarray] = field(default_factory=dict)
    """Per present patterned variable, True where its cell passes and is not missing: a value the
    engine finds good, which a pattern finding may quote as an example of the agreed form."""


class Judged(NamedTuple):
    """One column of a batch judged."""

    clean: np.ndarray
    """True where the engine would find nothing in the cell."""
    key: pa.Array | pa.ChunkedArray
    """The cells typed as the engine compares them as a key."""
    good: np.ndarray | None = None
    """For a patterned variable, True where the cell passes and is not missing (else None)."""


# Bytes that are certainly not whitespace to any trimming function: printable ASCII but the space.
UNTRIMMED = byte_table(bytes(range(0x21, 0x7F)))


def _needs_trim(chunk: pa.Array) -> bool:
    """Whether any non-empty cell starts or ends with a byte trimming might remove (null cells
    included: trimming where nothing needs it only costs time)."""
    offsets, data = cell_bytes(chunk)
    if len(data) == 0 or (data.min() >= 0x21 and data.max() <= 0x7E):
        return False  # not one byte of the chunk is one trimming removes
    # Only the few bytes that are not printable ASCII can be trimmed: is one a cell's first or last?
    odd = np.flatnonzero((data < 0x21) | (data > 0x7E))
    cell = np.searchsorted(offsets, odd, side="right") - 1
    return bool(np.any((odd == offsets[cell]) | (odd == offsets[cell + 1] - 1)))


def trimmed_text(text: pa.ChunkedArray) -> pa.ChunkedArray:
    """Every cell trimmed as the engine trims it; a chunk with no cell to trim is kept as it is."""
    return pa.chunked_array(
        [pc.utf8_trim_whitespace(c) if _needs_trim(c) else c for c in chunks(text)], text.type
    )


def missing_cells(
    text: pa.ChunkedArray, codes: Sequence[str], trimmed: pa.ChunkedArray | None = None
) -> np.ndarray:
    """Empty cells and cells whose trimmed text is a missing-value code, as `missing_mask` does."""
    trimmed = trimmed_text(text) if trimmed is None else trimmed
    codes_set = pa.array(sorted({c.strip() for c in codes}), pa.string())
    return flat(pc.or_(pc.is_null(text), falsy(pc.is_in(trimmed, value_set=codes_set))))


def ns_bound(bound: float | str) -> int:
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
        ok &= compare(values, ns_bound(bound) if as_date else float(bound))
    return ok


def _numbers(trimmed: pa.ChunkedArray, variable: Variable) -> tuple[np.ndarray, pa.ChunkedArray, np.ndarray]:
    """(plain, value as the engine reads it, value as float64 with NaN) of number or integer cells."""
    integer = variable.type is VarType.INTEGER
    prefix = variable.censored_prefix
    judged = [
        plain_numbers(
            chunk,
            integer,
            flat(pc.starts_with(chunk, prefix)) if prefix and prefix[0] in PLAIN_NUMBER_BYTES else None,
        )
        for chunk in chunks(trimmed)
    ]
    values = pa.chunked_array([v for _, v in judged], pa.float64())
    plain = np.concatenate([p for p, _ in judged])
    return plain, values, np.asarray(values.to_numpy(zero_copy_only=False), dtype=np.float64)


TRIMMED_TYPES = frozenset({VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN})
"""Types the engine reads from the trimmed text (strings and dates it reads as written)."""


def _trimmed_cells(trimmed: pa.ChunkedArray, variable: Variable) -> tuple[np.ndarray, pa.ChunkedArray]:
    """(passes, typed value) of numbers, integers and booleans, judged on the trimmed text."""
    if variable.type is VarType.BOOLEAN:
        words = pc.utf8_lower(trimmed)
        ok = flat(pc.string_is_ascii(trimmed)) & flat(pc.is_in(words, pa.array(BOOLEAN_WORDS)))
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
    fixed = None if variable.pattern is None else position_tables(variable.pattern)
    if variable.pattern is not None and fixed is None:
        # RE2 and Python's re agree on ASCII text; other text goes to the engine.
        matched = pc.match_substring_regex(text, whole_match(variable.pattern))
        ok = pc.and_(ok, pc.and_(falsy(pc.string_is_ascii(text)), falsy(matched)))
    if variable.codes is not None:
        ok = pc.and_(ok, falsy(pc.is_in(text, pa.array(variable.codes.values, pa.string()))))
    passes = flat(ok)
    if fixed is not None:  # a fixed-width pattern: byte tables instead of a regex run per cell
        passes &= fixed_width_matches(text, fixed)
    return passes, text


def _present_text(text: pa.ChunkedArray) -> np.ndarray:
    return np.concatenate([present(chunk) for chunk in chunks(text)])


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
    given_up = ~missing & ~flat(pc.is_valid(typed))
    if not given_up.any():
        return typed
    rows = np.flatnonzero(given_up)
    spread = np.full(len(missing), -1, np.int64)
    spread[rows] = np.arange(len(rows))
    engine = _engine_keys(text, variable, contract, rows)
    return pc.if_else(pa.array(given_up), engine.take(pa.array(np.maximum(spread, 0))), typed)


_never_missing: dict[tuple[str, tuple[str, ...]], bool] = {}
NEVER_MISSING_KEPT = 1024


def passing_never_missing(variable: Variable, codes: tuple[str, ...]) -> bool:
    """`_passing_never_missing`, worked out once per variable rather than once per batch (the
    variable's repr holds every field it depends on; variables hold dicts, so are not hashable)."""
    key = (repr(variable), codes)
    if key not in _never_missing:
        if len(_never_missing) >= NEVER_MISSING_KEPT:  # a long-running gate meets many contracts
            _never_missing.clear()
        _never_missing[key] = _passing_never_missing(variable, codes)
    return _never_missing[key]


def _passing_never_missing(variable: Variable, codes: Sequence[str]) -> bool:
    """Whether no cell the screen passes can be a missing-value code: then only failing cells need
    the missing-value look-up. Passing numbers, booleans and dates are their own trimmed text, so
    trying the codes themselves decides it; a passing category is one of its codes. So is a text
    matched by a fixed-width pattern that takes no byte trimming removes at either end."""
    stripped = pa.array(sorted({c.strip() for c in codes}), pa.string())
    if variable.type in (VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN, VarType.DATE):
        return not _typed_cells(pa.chunked_array([stripped], pa.string()), variable)[0].any()
    if variable.codes is not None:
        written = pa.array(variable.codes.values, pa.string())
        return not flat(pc.is_in(pc.utf8_trim_whitespace(written), value_set=stripped)).any()
    fixed = None if variable.pattern is None else position_tables(variable.pattern)
    if fixed is not None and not (fixed[[0, -1]] & ~UNTRIMMED).any():
        return not fixed_width_matches(stripped, fixed).any()
    return False


def _missing_among(text: pa.ChunkedArray, codes: Sequence[str], rows: np.ndarray) -> np.ndarray:
    """Where a cell is missing, looked up only at `rows` (and at null cells); False elsewhere."""
    missing = ~_present_text(text)
    look = np.flatnonzero(rows & ~missing)
    if len(look):
        cells = pa.chunked_array([text.take(pa.array(look, pa.int64()))], text.type)
        missing[look] = missing_cells(cells, codes)
    return missing


def missing_codes(variable: Variable, contract: TableContract) -> tuple[str, ...]:
    """The variable's missing-value codes (the contract's and its own), stripped as a cell is
    stripped before it is compared with them."""
    return tuple(sorted({c.strip() for c in (*contract.missing, *variable.missing)}))


def _judged(text: pa.ChunkedArray, variable: Variable, contract: TableContract) -> Judged:
    """One column judged: clean where the engine would find nothing in the cell."""
    codes = missing_codes(variable, contract)
    trimmed = (
        trimmed_text(text) if variable.type in (VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN) else text
    )
    passes, typed = _typed_cells(text, variable, trimmed)
    is_key = variable.name in contract.keys
    nullable = variable.nullable and not is_key
    never_missing = passing_never_missing(variable, codes)
    patterned = variable.pattern is not None
    if never_missing and not nullable and not is_key:
        # A failing cell fails, missing or not; a passing one is never missing.
        return Judged(passes, typed, passes if patterned else None)
    if never_missing:
        missing = _missing_among(text, codes, ~passes)
    else:
        missing = missing_cells(text, codes, trimmed_text(text) if trimmed is text else trimmed)
    clean = np.where(missing, nullable, passes)
    good = (passes if never_missing else passes & ~missing) if patterned else None
    if not is_key:
        return Judged(clean, typed, good)
    keyed = pc.if_else(pa.array(missing), pa.scalar(None, typed.type), typed) if missing.any() else typed
    if variable.type in (VarType.NUMBER, VarType.INTEGER, VarType.DATE):
        keyed = _keyed(text, variable, contract, keyed, missing)
    return Judged(clean, keyed, good)


_pools: dict[int, ThreadPoolExecutor] = {}


def worker_pool() -> ThreadPoolExecutor:
    """One thread pool per process (a forked child must not use its parent's threads)."""
    pid = os.getpid()
    if pid not in _pools:
        _pools[pid] = ThreadPoolExecutor(max_workers=os.cpu_count() or 1, thread_name_prefix="weir-screen")
    return _pools[pid]


def screen_batch(batch: pa.Table, contract: TableContract) -> Screened:
    """Judge every present variable of one batch (columns named as in the header, all text)."""
    present = [v for v in contract.variables if v.name in batch.column_names]
    # Arrow kernels and numpy release the GIL, so columns are judged side by side on the available cores.
    judged = list(worker_pool().map(lambda v: _judged(batch.column(v.name), v, contract), present))
    clean = np.ones(batch.num_rows, bool)
    for column in judged:
        clean &= column.clean
    named = list(zip(present, judged, strict=True))
    cells = {v.name: ~column.clean for v, column in named}
    keys = {v.name: column.key for v, column in named if v.name in contract.keys}
    good = {v.name: column.good for v, column in named if column.good is not None}
    return Screened(pa.array(~clean), cells, pa.table(keys) if keys else pa.table({}), good)


def _dates(text: pa.ChunkedArray) -> tuple[np.ndarray, np.ndarray]:
    parts = [iso_dates(chunk) for chunk in chunks(text)]
    return np.concatenate([p[0] for p in parts]), np.concatenate([p[1] for p in parts])
