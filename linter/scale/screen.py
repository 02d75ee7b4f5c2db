"""Tell, with Arrow kernels over whole columns, which rows are certainly clean under a table contract.

The screen is deliberately stricter than the engine: a cell passes only in a plain form that the
pandera engine is known to accept (e.g. a number must look like `12.5`, a date like `2026-03-02`,
a patterned text must be ASCII). Every row with a cell that does not pass goes to the engine of
record (pandera, `linter.contract.engine`), which then judges it exactly as it would in a full
run; a clean row yields no finding from any contract rule, so skipping it changes nothing.
"""

from __future__ import annotations

import os
from collections.abc import Sequence
from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.compute as pc

from linter.contract.convert import PLAIN_INTEGER, PLAIN_NUMBER
from linter.contract.dates import ISO_DATE
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
    keys: pa.Table
    """The key columns as the engine compares them (typed where the engine types them)."""


def _falsy(array: pa.Array | pa.ChunkedArray) -> pa.Array | pa.ChunkedArray:
    return pc.fill_null(array, False)


def missing_cells(text: pa.ChunkedArray, codes: Sequence[str]) -> pa.ChunkedArray:
    """Empty cells and cells whose trimmed text is a missing-value code, as `missing_mask` does."""
    trimmed = pc.utf8_trim_whitespace(text)
    codes_set = pa.array(sorted({c.strip() for c in codes} | {""}), pa.string())
    return pc.or_(pc.is_null(text), _falsy(pc.is_in(trimmed, value_set=codes_set)))


def _bound_ok(values: pa.ChunkedArray, variable: Variable, as_date: bool) -> pa.ChunkedArray:
    ok = pc.is_valid(values)
    for bound, compare in ((variable.minimum, pc.greater_equal), (variable.maximum, pc.less_equal)):
        if bound is None:
            continue
        scalar = (
            pa.scalar(pd.Timestamp(str(bound)).as_unit("ns"), pa.timestamp("ns"))
            if as_date
            else pa.scalar(float(bound))
        )
        ok = pc.and_(ok, _falsy(compare(values, scalar)))
    return ok


def _typed_cells(text: pa.ChunkedArray, variable: Variable) -> tuple[pa.ChunkedArray, pa.ChunkedArray]:
    """(passes, typed value) for a present cell; typed values are null where the screen gives up."""
    kind = variable.type
    if kind in (VarType.NUMBER, VarType.INTEGER):
        trimmed = pc.utf8_trim_whitespace(text)
        shape = PLAIN_INTEGER if kind is VarType.INTEGER else PLAIN_NUMBER
        plain = _falsy(pc.match_substring_regex(trimmed, shape))
        if kind is VarType.INTEGER:
            plain = pc.and_(plain, pc.less_equal(pc.utf8_length(trimmed), LONGEST_PLAIN_INTEGER))
        if variable.censored_prefix:
            plain = pc.and_(plain, pc.invert(_falsy(pc.starts_with(trimmed, variable.censored_prefix))))
        values = pc.cast(pc.if_else(plain, trimmed, pa.scalar(None, pa.string())), pa.float64())
        return pc.and_(plain, _bound_ok(values, variable, as_date=False)), values
    if kind is VarType.DATE:
        shaped = _falsy(pc.match_substring_regex(text, ISO_DATE))
        stamps = pc.strptime(
            pc.if_else(shaped, text, pa.scalar(None, pa.string())),
            format="%Y-%m-%d",
            unit="ns",
            error_is_null=True,
        )
        # Arrow's strptime rolls 2026-02-30 over into March, where pandas refuses it: compare the day.
        written_day = pc.cast(
            pc.utf8_slice_codeunits(pc.if_else(shaped, text, "2000-01-01"), 8, 10), pa.int64()
        )
        real_day = pc.and_(shaped, _falsy(pc.equal(pc.day(stamps), written_day)))
        return pc.and_(real_day, _bound_ok(stamps, variable, as_date=True)), stamps
    if kind is VarType.BOOLEAN:
        trimmed = pc.utf8_trim_whitespace(text)
        words = pc.utf8_lower(trimmed)
        ok = pc.and_(_falsy(pc.string_is_ascii(trimmed)), _falsy(pc.is_in(words, pa.array(BOOLEAN_WORDS))))
        # As a key, "1" and "true" are the same value to the engine.
        return ok, pc.is_in(words, pa.array(("true", "1")))
    ok = pc.is_valid(text)
    if variable.pattern is not None:
        # RE2 and Python's re agree on ASCII text; other text goes to the engine.
        matched = pc.match_substring_regex(text, whole_match(variable.pattern))
        ok = pc.and_(ok, pc.and_(_falsy(pc.string_is_ascii(text)), _falsy(matched)))
    if variable.codes is not None:
        ok = pc.and_(ok, _falsy(pc.is_in(text, pa.array(variable.codes.values, pa.string()))))
    return ok, text


def _judged(text: pa.ChunkedArray, variable: Variable, contract: TableContract) -> tuple[pa.Array, pa.Array]:
    """(clean, key value) for one column: clean where the engine would find nothing in the cell."""
    missing = missing_cells(text, tuple(contract.missing) + tuple(variable.missing))
    passes, typed = _typed_cells(text, variable)
    nullable = variable.nullable and variable.name not in contract.keys
    clean = pc.if_else(missing, pa.scalar(nullable), _falsy(passes))
    return clean, pc.if_else(missing, pa.scalar(None, typed.type), typed)


def screen_batch(batch: pa.Table, contract: TableContract) -> Screened:
    """Judge every present variable of one batch (columns named as in the header, all text)."""
    present = [v for v in contract.variables if v.name in batch.column_names]
    # Arrow kernels release the GIL, so columns are judged side by side on the available cores.
    with ThreadPoolExecutor(max_workers=min(len(present), os.cpu_count() or 1) or 1) as pool:
        judged = list(pool.map(lambda v: _judged(batch.column(v.name), v, contract), present))
    suspect: pa.ChunkedArray = pa.chunked_array([pa.nulls(batch.num_rows, pa.bool_()).fill_null(False)])
    for clean, _ in judged:
        suspect = pc.or_(suspect, pc.invert(clean))
    keys = {v.name: key for v, (_, key) in zip(present, judged, strict=True) if v.name in contract.keys}
    return Screened(suspect, pa.table(keys) if keys else pa.table({}))


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
