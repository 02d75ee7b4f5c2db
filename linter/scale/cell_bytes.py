"""Arrow text columns (and dictionary indices) seen as numpy arrays, without copying: what the
byte kernels of the screen and the key hashes read."""

from __future__ import annotations

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc


def falsy(array: pa.Array | pa.ChunkedArray) -> pa.Array | pa.ChunkedArray:
    """A boolean Arrow result with null read as False."""
    return pc.fill_null(array, False)


def flat(mask: pa.Array | pa.ChunkedArray) -> np.ndarray:
    """A boolean Arrow result as a numpy bool array (null counts as False)."""
    return np.asarray(falsy(mask).to_numpy(zero_copy_only=False), dtype=bool)


def chunks(text: pa.ChunkedArray | pa.Array) -> list[pa.Array]:
    if isinstance(text, pa.ChunkedArray):
        return list(text.chunks) if text.num_chunks else [pa.array([], text.type)]
    return [text]


def present(chunk: pa.Array) -> np.ndarray:
    """True where the cell is not null."""
    if chunk.null_count == 0:
        return np.ones(len(chunk), bool)
    return np.asarray(chunk.is_valid().to_numpy(zero_copy_only=False), dtype=bool)


def cell_bytes(chunk: pa.Array) -> tuple[np.ndarray, np.ndarray]:
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


def plain_integers(indices: pa.Array) -> np.ndarray:
    """Dictionary indices (no nulls) as a NumPy view in their own width, without Arrow's slow
    nullable conversion and without a copy."""
    raw = np.frombuffer(indices.buffers()[1], dtype=indices.type.to_pandas_dtype())
    return raw[indices.offset : indices.offset + len(indices)]


def with_validity(chunk: pa.Array, valid: np.ndarray) -> pa.Array:
    """The same text cells (same buffers, no copy) with null wherever `valid` is False."""
    bits = np.packbits(np.concatenate([np.zeros(chunk.offset, bool), valid]), bitorder="little")
    buffers = chunk.buffers()
    return pa.Array.from_buffers(
        chunk.type, len(chunk), [pa.py_buffer(bits.tobytes()), buffers[1], buffers[2]], offset=chunk.offset
    )


def byte_table(members: bytes) -> np.ndarray:
    """A 256-entry lookup table, True at the given bytes."""
    table = np.zeros(256, bool)
    table[list(members)] = True
    return table


FEW_OTHER_WIDTHS = 8
"""Cells of another width are "few" (cut out of the bytes) below one in this many cells."""


def fixed_width_text(offsets: np.ndarray, data: np.ndarray, shaped: np.ndarray, width: int) -> np.ndarray:
    """The bytes of the cells where `shaped` (cells exactly `width` bytes long; `offsets` and `data`
    from `cell_bytes`), side by side: a (cells, width) uint8 matrix, a view of the chunk's own
    bytes when every cell is such a cell."""
    rows = np.flatnonzero(shaped)
    if width == 0:
        return np.zeros((len(rows), 0), np.uint8)
    if len(rows) * width == len(data):  # every byte belongs to a cell of that width: the data is the text
        return data.reshape(-1, width)
    others = np.flatnonzero(~shaped)
    if len(others) * FEW_OTHER_WIDTHS < len(shaped):
        # Between two cells of another width the bytes are already cells of this width side by
        # side: join those runs (one copy) instead of gathering every cell on its own.
        starts = np.concatenate([[0], offsets[others + 1]])
        ends = np.concatenate([offsets[others], [offsets[-1]]])
        runs = [
            data[start:end] for start, end in zip(starts.tolist(), ends.tolist(), strict=True) if end > start
        ]
        return np.concatenate(runs).reshape(-1, width)
    windows = np.lib.stride_tricks.sliding_window_view(data, width)
    return np.ascontiguousarray(windows[offsets[rows]])
