"""Exact key comparison for the screen: one integer code per row, equal exactly where keys are equal."""

from __future__ import annotations

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

from linter.scale.cell_bytes import plain_integers
from linter.scale.key_hash import repeated_values

COUNTED_SPAN = 2
"""Folded key codes up to this many times the rows are counted in a table (8 bytes a code) instead
of sorted: at twice the rows the table costs 16 bytes a row, as the sort's copy and mask do."""


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
