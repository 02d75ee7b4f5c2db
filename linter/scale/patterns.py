"""Fixed-width contract patterns (`^VB-\\d{3}$`, `^S\\d{7}$`) judged as byte tables, not regexes.

Most id patterns in contracts are a run of one-character pieces (a literal, `\\d`, `[A-Z]`, `.`)
each repeated a fixed number of times. Such a pattern matches a text exactly when the text has
one character per piece and each character is one its piece matches. So the pattern becomes one
256-entry table per position, built by asking Python's own `re` which ASCII characters each piece
matches, and a column is judged with a few numpy look-ups instead of a regex run per cell.
Only ASCII bytes are ever in a table, so a text with any other character never passes here and
goes to the engine, which judges it with the pattern itself. Any other pattern (alternatives,
groups, variable repeats, flags) returns None and is left to Arrow's regex engine.
"""

from __future__ import annotations

import functools
import re
import warnings

import numpy as np
import pyarrow as pa

from linter.scale.cell_bytes import cell_bytes, chunks, fixed_width_text, present

LONGEST_FIXED_WIDTH = 64
"""Longer fixed-width patterns are rare and left to the regex engine."""
ESCAPED_CLASSES = frozenset("dDwWsS")
SPECIAL = frozenset(".^$*+?{}[]\\|()")


def _class_end(pattern: str, start: int) -> int | None:
    """Index just past the `]` closing the character class that opens at `start`, or None."""
    at = start + 1
    if pattern.startswith("^", at):
        at += 1
    if pattern.startswith("]", at):  # a leading ] is a literal
        at += 1
    while at < len(pattern):
        char = pattern[at]
        if char == "\\":
            at += 2
            continue
        if char == "[":  # nested sets and set operations: leave to the regex engine
            return None
        if char == "]":
            return at + 1
        at += 1
    return None


def pieces(pattern: str) -> list[tuple[str, int]] | None:
    """The pattern as (one-character regex, repeat) pieces, anchors dropped, or None when it is
    not a fixed-width run of one-character pieces."""
    if not pattern.isascii():
        return None
    body = pattern[1:] if pattern.startswith("^") else pattern
    found: list[tuple[str, int]] = []
    at = 0
    while at < len(body):
        char = body[at]
        if char == "$" and at == len(body) - 1:
            break  # a final $ before the engine's own end anchor asks for nothing more
        if char == "\\":
            escaped = body[at + 1 : at + 2]
            if not escaped or (escaped.isalnum() and escaped not in ESCAPED_CLASSES):
                return None  # \b, \A, back references, \x41...: not one plain character
            piece, at = body[at : at + 2], at + 2
        elif char == "[":
            end = _class_end(body, at)
            if end is None:
                return None
            piece, at = body[at:end], end
        elif char == "." or char not in SPECIAL:
            piece, at = char, at + 1
        else:
            return None
        repeat = 1
        if body.startswith("{", at):
            close = body.find("}", at)
            count = body[at + 1 : close] if close > 0 else ""
            if not count.isdigit():
                return None  # {m,n} and friends: not a fixed width
            repeat, at = int(count), close + 1
        if body[at : at + 1] in ("*", "+", "?", "{"):
            return None
        found.append((piece, repeat))
    return found


@functools.lru_cache(maxsize=256)
def position_tables(pattern: str) -> np.ndarray | None:
    """A (width, 256) bool table: True where the byte may stand at that position; None when the
    pattern is not fixed-width (see `pieces`)."""
    parts = pieces(pattern)
    if parts is None or not parts or sum(r for _, r in parts) > LONGEST_FIXED_WIDTH:
        return None
    rows: list[np.ndarray] = []
    for piece, repeat in parts:
        try:
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")  # e.g. FutureWarning for a set that may change meaning
                compiled = re.compile(piece)
        except re.error:
            return None
        table = np.zeros(256, bool)
        table[:128] = [compiled.fullmatch(chr(b)) is not None for b in range(128)]
        rows.extend([table] * repeat)
    return np.stack(rows)


def _byte_range(table: np.ndarray) -> tuple[int, int] | None:
    """(lowest, highest) byte when the table holds exactly one run of bytes, else None."""
    held = np.flatnonzero(table)
    if len(held) and held[-1] - held[0] + 1 == len(held):
        return int(held[0]), int(held[-1])
    return None


def _chunk_matches(chunk: pa.Array, tables: np.ndarray, runs: list[tuple[int, int] | None]) -> np.ndarray:
    width = len(tables)
    offsets, data = cell_bytes(chunk)
    shaped = (np.diff(offsets) == width) & present(chunk)
    matched = np.zeros(len(chunk), bool)
    if not shaped.any():
        return matched
    text = fixed_width_text(offsets, data, shaped, width)
    # One contiguous row of bytes per position: each test below is then one plain pass.
    places = np.ascontiguousarray(text.T)
    ok = np.ones(len(text), bool)
    for place, (table, run) in enumerate(zip(tables, runs, strict=True)):
        if run is None:
            ok &= table[places[place]]
        else:  # a literal or a range such as 0-9: one wrapping subtraction and compare
            lowest, highest = run
            ok &= np.subtract(places[place], np.uint8(lowest), dtype=np.uint8) <= np.uint8(highest - lowest)
    matched[np.flatnonzero(shaped)] = ok
    return matched


def fixed_width_matches(text: pa.ChunkedArray | pa.Array, tables: np.ndarray) -> np.ndarray:
    """True where the cell is present, ASCII and matched whole by the pattern of `tables`."""
    runs = [_byte_range(table) for table in tables]  # once per column, not once per chunk
    parts = [_chunk_matches(chunk, tables, runs) for chunk in chunks(text)]
    return np.concatenate(parts) if parts else np.zeros(0, bool)
