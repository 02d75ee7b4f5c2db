"""Hash typed key columns to 64 bits a row with NumPy.

Equal keys (as the engine compares them: nulls equal to nulls, -0.0 equal to 0.0) always hash
alike; unequal keys almost never do, so whoever uses these hashes verifies the rows they name.
Texts are hashed straight from Arrow's data buffer, a 64-bit word at a time, which for varied
texts (identifiers) is several times faster than dictionary-encoding them; a text column of few
distinct values (a coded key) is dictionary-encoded and only its distinct texts hashed, to the
same hashes. Numbers are hashed from their bits; any other type is dictionary-encoded and its
distinct values hashed one by one. A cell's hash never depends on the rest of its batch.
"""

from __future__ import annotations

from concurrent.futures import Executor

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.compute as pc

from linter.row_sets import distinct
from linter.scale.cell_bytes import plain_integers

NULL_HASH = np.uint64(0x9E3779B97F4A7C15)
"""What a null cell hashes to (an odd constant; a value that happens to hash alike is verified away)."""
FOLD = np.uint64(0x100000001B3)
NUMBER_TYPES = (pa.types.is_boolean, pa.types.is_floating, pa.types.is_timestamp, pa.types.is_signed_integer)
"""Column types hashed from their bits (the others through a dictionary of their values)."""
BYTE_MASKS = np.array([(1 << (8 * kept)) - 1 for kept in range(9)], np.uint64)
"""Little-endian masks keeping the first 0 to 8 bytes of a 64-bit word."""
FEW_REPEATS = 8
"""Repeated values are "few" (worth a filter before the search) below one in this many rows."""
LOW_BITS = 24
"""At most a 16 MB table of low bits for that filter."""
TEXT_TYPES = (pa.types.is_string, pa.types.is_large_string, pa.types.is_binary, pa.types.is_large_binary)
"""Column types hashed from their bytes."""
FEW_TEXTS = 64
"""A text column with at most this many distinct values in its leading cells (a coded key such as
an analyte) is hashed through its dictionary: each distinct text once, then one gather."""
LEADING_CELLS = 4096
"""How many leading cells decide that."""


def mix(values: np.ndarray) -> np.ndarray:
    """splitmix64's finaliser: spreads every input bit over the 64-bit hash (a bijection)."""
    with np.errstate(over="ignore"):
        values = values ^ (values >> np.uint64(30))
        values *= np.uint64(0xBF58476D1CE4E5B9)
        values ^= values >> np.uint64(27)
        values *= np.uint64(0x94D049BB133111EB)
        values ^= values >> np.uint64(31)
        return values


def _with_nulls(hashes: np.ndarray, column: pa.Array) -> np.ndarray:
    if column.null_count == 0:
        return hashes
    nulls = pc.is_null(column).to_numpy(zero_copy_only=False)
    return np.where(nulls, NULL_HASH, hashes)


def _offsets(column: pa.Array) -> np.ndarray:
    kind = (
        np.int64
        if pa.types.is_large_string(column.type) or pa.types.is_large_binary(column.type)
        else np.int32
    )
    raw = np.frombuffer(column.buffers()[1], dtype=kind)
    return raw[column.offset : column.offset + len(column) + 1].astype(np.int64)


def _words_at(words: np.ndarray, starts: np.ndarray, left: np.ndarray) -> np.ndarray:
    """The 64-bit little-endian word starting at each byte offset, bytes past `left` (0 to 8) zeroed."""
    shift = ((starts & 7) << 3).view(np.uint64)
    index = starts >> 3
    # Two shifts for the high part, so a shift of 64 (an aligned start) gives 0, not the word.
    word = words[index] >> shift
    word |= (words[index + 1] << np.uint64(1)) << (np.uint64(63) - shift)
    if int(left.min(initial=8)) < 8:
        word &= BYTE_MASKS[np.minimum(left, 8)]
    return word


def _one_width_hashes(hashes: np.ndarray, cells: np.ndarray) -> np.ndarray:
    """`_text_hashes` when every cell has the same byte width: the bytes are one matrix already."""
    words = -(-cells.shape[1] // 8)
    whole = np.zeros((len(cells), words * 8), np.uint8)
    whole[:, : cells.shape[1]] = cells
    packed = whole.view(np.uint64)
    with np.errstate(over="ignore"):
        for word in range(words):
            hashes = mix(hashes * FOLD ^ packed[:, word])
    return hashes


def _text_hashes(column: pa.Array) -> np.ndarray:
    """Hashes of text (or bytes) cells from their UTF-8 bytes, read straight from Arrow's buffers.

    The byte length goes in first, then every 64-bit word of the cell (the last one zero-padded):
    the hash depends on the cell alone, never on the other cells of its batch, so batches agree.
    """
    offsets = _offsets(column)
    starts, lengths = offsets[:-1], np.diff(offsets)
    end = int(offsets[-1]) if len(offsets) else 0
    buffer = column.buffers()[2]
    data = np.frombuffer(buffer, np.uint8, count=end)[int(offsets[0]) :] if end else np.zeros(0, np.uint8)
    # Whole words with one spare, so the last word of the last cell can always be read.
    padded = np.zeros(end // 8 + 2, np.uint64)
    padded.view(np.uint8)[int(offsets[0]) : end] = data
    longest = int(lengths.max(initial=0))
    with np.errstate(over="ignore"):
        hashes = lengths.view(np.uint64) * FOLD
        if longest and int(lengths.min()) == longest:
            return _with_nulls(_one_width_hashes(hashes, data.reshape(-1, longest)), column)
        for word in range(-(-longest // 8)):
            if word == 0 or int(lengths.min()) > 8 * word:
                packed = _words_at(padded, starts + 8 * word, lengths - 8 * word)
                hashes = mix(hashes * FOLD ^ packed)
                continue
            rows = np.flatnonzero(lengths > 8 * word)
            packed = _words_at(padded, starts[rows] + 8 * word, lengths[rows] - 8 * word)
            hashes[rows] = mix(hashes[rows] * FOLD ^ packed)
    return _with_nulls(hashes, column)


def _few_text_hashes(column: pa.Array) -> np.ndarray | None:
    """`_text_hashes` of a column with few distinct texts, each distinct text hashed once (the
    same hash, since a cell's hash depends on its bytes alone); None when its leading cells are
    too varied for the dictionary to pay (an identifier: hashing its bytes is then faster)."""
    if len(column) <= LEADING_CELLS or pc.count_distinct(column.slice(0, LEADING_CELLS)).as_py() > FEW_TEXTS:
        return None
    # Should the cells further down be varied after all, hashing the dictionary's texts and one
    # gather cost about what hashing every cell would.
    encoded = pc.dictionary_encode(column)
    # One more entry after the distinct texts' hashes stands for the null cells (there may be no text).
    hashes = np.append(_text_hashes(encoded.dictionary), NULL_HASH)
    return hashes[plain_integers(pc.fill_null(encoded.indices, len(encoded.dictionary)))]


def _dictionary_hashes(column: pa.Array) -> np.ndarray:
    """Hashes of any column through its dictionary: each distinct value hashed once."""
    encoded = pc.dictionary_encode(column, null_encoding="encode")
    words = encoded.dictionary.to_numpy(zero_copy_only=False)
    values = pd.util.hash_array(np.asarray(words, dtype=object), categorize=False)
    values = np.where(pd.isna(words), NULL_HASH, values).astype(np.uint64)
    return values[plain_integers(encoded.indices)]


def _number_hashes(column: pa.Array) -> np.ndarray:
    """Hashes of numbers, times or booleans from their bits (-0.0 and 0.0 alike, every NaN alike)."""
    if pa.types.is_boolean(column.type):
        bits = pc.fill_null(column, False).to_numpy(zero_copy_only=False).astype(np.uint64)
    elif pa.types.is_floating(column.type):
        values = pc.fill_null(pc.cast(column, pa.float64()), 0.0).to_numpy(zero_copy_only=False)
        values = np.where(np.isnan(values), np.nan, values + 0.0)  # -0.0 + 0.0 is 0.0
        bits = values.view(np.uint64)
    else:
        values = pc.fill_null(pc.cast(column, pa.int64()), 0).to_numpy(zero_copy_only=False)
        bits = values.view(np.uint64)
    return _with_nulls(mix(bits), column)


def column_hashes(column: pa.Array | pa.ChunkedArray) -> np.ndarray:
    """A 64-bit hash per cell of one typed key column."""
    whole = column.combine_chunks() if isinstance(column, pa.ChunkedArray) else column
    kind = whole.type
    if any(test(kind) for test in NUMBER_TYPES):
        return _number_hashes(whole)
    if any(test(kind) for test in TEXT_TYPES):
        few = _few_text_hashes(whole)
        return _text_hashes(whole) if few is None else few
    return _dictionary_hashes(whole)


def row_hashes(keys: pa.Table) -> np.ndarray:
    """A 64-bit hash per row of the whole key, column hashes folded in order."""
    combined = np.zeros(keys.num_rows, np.uint64)
    with np.errstate(over="ignore"):
        for name in keys.column_names:
            # Column hashes are mixed already: folding them in and mixing once at the end suffices.
            combined *= FOLD
            combined ^= column_hashes(keys.column(name))
    return mix(combined)


def _members(values: np.ndarray, sorted_set: np.ndarray) -> np.ndarray:
    """True where a value is in `sorted_set` (non-empty, sorted, distinct)."""
    found = np.minimum(np.searchsorted(sorted_set, values), len(sorted_set) - 1)
    return sorted_set[found] == values


def repeats_of(ordered: np.ndarray) -> np.ndarray:
    """The distinct values that occur more than once in sorted `ordered`, sorted."""
    twice = ordered[1:] == ordered[:-1]
    return distinct(ordered[1:][twice]) if twice.any() else ordered[:0]


def members_of(values: np.ndarray, repeats: np.ndarray) -> np.ndarray:
    """True where a value is one of `repeats` (sorted, distinct).

    Searching every row among them is slow (a binary search a row), so when they are few a small
    table of their low bits first picks the rows that may be one of them, and only those are searched.
    """
    if not len(repeats):
        return np.zeros(len(values), bool)
    if len(repeats) * FEW_REPEATS > len(values):
        return _members(values, repeats)
    bits = min(LOW_BITS, max(8, int(len(repeats) * 16).bit_length()))
    low = values.dtype.type((1 << bits) - 1)
    table = np.zeros(1 << bits, bool)
    table[repeats & low] = True
    maybe = np.flatnonzero(table[values & low])
    found = np.zeros(len(values), bool)
    found[maybe] = _members(values[maybe], repeats)
    return found


def repeated_values(values: np.ndarray) -> np.ndarray:
    """True where a (non-negative) value occurs more than once: one sort finds the repeated values."""
    if len(values) < 2:
        return np.zeros(len(values), bool)
    return members_of(values, repeats_of(np.sort(values)))


def repeats_across(runs: list[np.ndarray], ranges: int = 1, executor: Executor | None = None) -> np.ndarray:
    """The distinct values that occur more than once in any of the sorted unsigned `runs` (all of
    one type), sorted.

    The runs are cut at the same values into `ranges` equal ranges of the type's space (equal
    values fall in the same range) and each range is merged and searched on its own, side by side
    on `executor` when given: a hash is spread evenly, so each merge sorts a share of the values.
    """
    kind = runs[0].dtype if runs else np.dtype(np.uint64)
    space = 1 << (8 * kind.itemsize)
    bounds = np.array([space // ranges * i for i in range(1, ranges)], kind)
    cuts = [np.concatenate([[0], np.searchsorted(run, bounds), [len(run)]]) for run in runs]

    def repeats_in(place: int) -> np.ndarray:
        return repeats_of(
            merged_runs([run[c[place] : c[place + 1]] for run, c in zip(runs, cuts, strict=True)])
        )

    found = list(executor.map(repeats_in, range(ranges)) if executor else map(repeats_in, range(ranges)))
    return np.concatenate([*found, np.zeros(0, kind)])


def high_halves(hashes: np.ndarray) -> np.ndarray:
    """The upper 32 bits of each 64-bit hash: sorted and merged in half the time and memory."""
    return (hashes >> np.uint64(32)).astype(np.uint32)


def repeated_positions(
    parts: list[np.ndarray], high_runs: list[np.ndarray], ranges: int = 1, executor: Executor | None = None
) -> np.ndarray:
    """Positions, counted across the batches' 64-bit hash `parts` in turn, of every hash that occurs
    more than once; `high_runs` are the parts' `high_halves`, each sorted.

    Equal hashes have equal upper halves, so the repeated halves name every candidate; among
    millions of hashes some halves repeat by chance, so only candidates whose whole hash repeats
    among the candidates are kept (the hashes then collide as rarely as 64 bits do)."""
    if not parts:
        return np.zeros(0, np.int64)
    repeats = repeats_across(high_runs, ranges, executor)
    # Looked up batch by batch: joining the hashes again would only cost another copy.
    found = [np.flatnonzero(members_of(high_halves(part), repeats)) for part in parts]
    starts = np.cumsum([0, *(len(part) for part in parts[:-1])])
    candidates = np.concatenate([at + start for at, start in zip(found, starts, strict=True)])
    whole = np.concatenate([part[at] for part, at in zip(parts, found, strict=True)])
    return candidates[repeated_values(whole)]


def merged_runs(runs: list[np.ndarray]) -> np.ndarray:
    """Sorted runs (one per batch) as one sorted array: a stable sort merges runs it finds in the
    input (timsort for 32- and 64-bit values), far faster than sorting the whole again; in place,
    so the only new memory is the one joined array."""
    if not runs:
        return np.zeros(0, np.uint64)
    merged = np.concatenate(runs)
    merged.sort(kind="stable")
    return merged
