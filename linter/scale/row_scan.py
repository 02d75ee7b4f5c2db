"""Judge a plain file's lines straight from its bytes with the compiled row scanner.

`linter/scale/_rowscan.c` splits each line at its delimiters and judges every cell of a
contract variable in one pass: the same judgement as the numpy screen (`screen.py`), and like it
stricter than the engine, with no Arrow parse of the clean lines at all. A line it cannot split
for certain (a doubled or stray quote, a byte outside ASCII, a stray carriage return) or whose
key it cannot type comes back as a fallback: `stream._line_screen` parses those lines with Arrow
(`parse_lines`) and judges them with the numpy screen, so every line gets the numpy screen's
answer or a stricter one. Key hashes agree with `key_hash.row_hashes` bit for bit, so duplicates
are found across both kinds of line.

The scanner is built when Weir is installed (a C compiler is needed); where it is missing, or a
contract asks for what it does not judge (a pattern that is not fixed-width, more than 64 codes),
`scan_spec` returns None and the file is screened by Arrow and numpy as before.
"""

from __future__ import annotations

import math
from concurrent.futures import Executor
from dataclasses import dataclass
from typing import Any

import numpy as np
import pyarrow as pa

from linter.contract.model import TableContract, Variable, VarType
from linter.scale.key_hash import high_halves
from linter.scale.patterns import position_tables
from linter.scale.pieces import parse_text
from linter.scale.screen import missing_codes, ns_bound

try:
    from linter.scale import _rowscan  # type: ignore[attr-defined]
except ImportError:  # built without a C compiler: the numpy screen does all the work
    _rowscan = None

KINDS = {
    VarType.STRING: 1,
    VarType.CATEGORY: 1,
    VarType.NUMBER: 2,
    VarType.INTEGER: 3,
    VarType.BOOLEAN: 4,
    VarType.DATE: 5,
}
MOST_CODES = 64
MOST_COLUMNS = 256
MOST_KEYS = 16
INT64 = np.iinfo(np.int64)
FALLBACK, DOUBT = 1, 2
"""A line's flags (see `LineVerdict.flags`)."""
NOT_JUDGED: tuple[Any, ...] = (0, 0, 0, 0.0, 0.0, 0, 0, None, None, None, ())
FALLBACK_SHARE = 8
"""When more than one line in this many is a fallback (a file written with text beyond ASCII on
most lines, say), the whole piece is parsed by Arrow instead: one parse of everything costs less
than cutting lines."""


@dataclass(frozen=True)
class ScanSpec:
    """What the scanner needs to judge a file's columns under a contract."""

    delimiter: int
    columns: tuple[tuple[Any, ...], ...]
    """One spec per file column (see `_rowscan.c`)."""
    keys: tuple[int, ...]
    """File column indices of the key, in the order the numpy screen folds their hashes."""
    variables: tuple[str, ...]
    """The judged variables, in the numpy screen's order: the columns of `LineVerdict.bad`."""
    patterned: tuple[str, ...]


def _bounds(variable: Variable) -> tuple[float, float, int, int] | None:
    low, high = -math.inf, math.inf
    low_ns, high_ns = int(INT64.min), int(INT64.max)
    try:
        if variable.type is VarType.DATE:
            low_ns = low_ns if variable.minimum is None else ns_bound(variable.minimum)
            high_ns = high_ns if variable.maximum is None else ns_bound(variable.maximum)
        elif variable.type in (VarType.NUMBER, VarType.INTEGER):
            low = low if variable.minimum is None else float(variable.minimum)
            high = high if variable.maximum is None else float(variable.maximum)
    except (TypeError, ValueError):
        return None
    return low, high, low_ns, high_ns


def _column_spec(variable: Variable, index: int, contract: TableContract) -> tuple[Any, ...] | None:
    """The scanner's spec of one variable's column, or None when the scanner cannot judge it."""
    table = None
    if variable.pattern is not None:
        fixed = position_tables(variable.pattern)
        if fixed is None:
            return None  # a pattern that is not fixed-width: the regex engine judges it
        table = fixed.astype(np.uint8).tobytes()
    codes = None if variable.codes is None else tuple(c.encode("utf-8") for c in variable.codes.values)
    missing = tuple(c.encode("utf-8") for c in missing_codes(variable, contract))
    bounds = _bounds(variable)
    if bounds is None or len(missing) > MOST_CODES or (codes is not None and len(codes) > MOST_CODES):
        return None
    prefix = variable.censored_prefix.encode("utf-8") if variable.censored_prefix else None
    return (KINDS[variable.type], index, int(variable.nullable), *bounds, table, codes, prefix, missing)


def scan_spec(contract: TableContract, labels: list[str], delimiter: str) -> ScanSpec | None:
    """The scanner's spec for a file with these column labels, or None when it cannot judge them."""
    if _rowscan is None or len(labels) > MOST_COLUMNS or len(delimiter.encode("utf-8")) != 1:
        return None
    if delimiter in '"\r\n' or not delimiter.isascii():
        return None
    present = [v for v in contract.variables if v.name in labels]  # as `screen_batch` judges them
    columns = [NOT_JUDGED] * len(labels)
    for index, variable in enumerate(present):
        if variable.type not in KINDS:
            return None
        spec = _column_spec(variable, index, contract)
        if spec is None:
            return None
        columns[labels.index(variable.name)] = spec
    keys = tuple(labels.index(v.name) for v in present if v.name in contract.keys)
    if len(keys) > MOST_KEYS:
        return None
    return ScanSpec(
        ord(delimiter),
        tuple(columns),
        keys,
        tuple(v.name for v in present),
        tuple(v.name for v in present if v.pattern is not None),
    )


@dataclass(frozen=True)
class LineVerdict:
    """The scanner's answer on a run of lines."""

    bad: np.ndarray
    """(lines, variables) bool: True where the variable's cell needs the engine."""
    flags: np.ndarray
    """uint8 per line: `FALLBACK` where the whole line must be parsed and judged by the numpy
    screen instead, `DOUBT` where some cell needs the engine, 0 where every cell passes."""
    hashes: np.ndarray
    """uint64 key hash of each line (0 on fallback lines; unset when the contract has no key)."""
    starts: np.ndarray
    """int64 offset of each line in the data, and one more: where the last one ends."""
    first_good: np.ndarray
    """int64 per variable: the first line whose cell passes and is not missing, or -1."""

    @property
    def rows(self) -> int:
        return len(self.flags)


def _judge(data: Any, start: int, end: int, width: int, spec: ScanSpec) -> LineVerdict:
    most = (end - start) // width + 1
    variables = max(1, len(spec.variables))
    bad = np.empty((most, variables), np.uint8)
    flags = np.empty(most, np.uint8)
    hashes = np.empty(most, np.uint64)
    starts = np.empty(most + 1, np.int64)
    first_good = np.empty(variables, np.int64)
    try:
        rows = _rowscan.judge(
            data, start, end, spec.delimiter, width, spec.columns, spec.keys,
            bad, flags, hashes, starts, first_good,
        )  # fmt: skip
    except ValueError as error:  # an empty or ragged line: the ordinary reader reports it
        raise pa.ArrowInvalid(str(error)) from error
    return LineVerdict(
        bad[:rows, : len(spec.variables)].view(bool),
        flags[:rows],
        hashes[:rows],
        starts[: rows + 1],
        first_good[: len(spec.variables)],
    )


def judge_lines(data: Any, start: int, end: int, width: int, spec: ScanSpec, pool: Executor) -> LineVerdict:
    """The lines of `data[start:end]` judged, in two halves side by side (the scanner lets go of
    the GIL); line offsets count from the start of `data`."""
    middle = data.find(b"\n", start + (end - start) // 2, end) + 1 if end - start > 1 << 16 else 0
    if middle <= start or middle >= end:
        return _judge(data, start, end, width, spec)
    first, second = pool.map(
        lambda r: _judge(data, r[0], r[1], width, spec), [(start, middle), (middle, end)]
    )
    later = np.where(second.first_good >= 0, second.first_good + first.rows, -1)
    return LineVerdict(
        np.concatenate([first.bad, second.bad]),
        np.concatenate([first.flags, second.flags]),
        np.concatenate([first.hashes, second.hashes]),
        np.concatenate([first.starts[:-1], second.starts]),
        np.where(first.first_good >= 0, first.first_good, later),
    )


def parse_lines(
    data: Any, starts: np.ndarray, lines: np.ndarray, options: Any, labels: list[str]
) -> pa.Table:
    """The lines at sorted indices `lines` (offsets in `starts`) parsed by Arrow as text cells."""
    chosen = gathered_lines(data, starts[lines], starts[lines + 1])
    if not len(chosen):
        return pa.table({label: pa.array([], pa.string()) for label in labels})
    table = parse_text(chosen, 0, len(chosen), options)
    if table.num_rows != len(lines):
        raise pa.ArrowInvalid("lines that Arrow reads as more or fewer records")
    return table.rename_columns(labels)


def gathered_lines(data: Any, low: np.ndarray, high: np.ndarray) -> np.ndarray:
    """The byte ranges `data[low[i]:high[i]]` (whole lines) one after another, ending in a line
    end (the file's last line may lack its own), as uint8."""
    low = np.ascontiguousarray(low, np.int64)
    high = np.ascontiguousarray(high, np.int64)
    size = int((high - low).sum())
    out = np.empty(size + 1, np.uint8)
    if _rowscan is not None:
        _rowscan.gather_lines(data, low, high, out)
    else:  # one numpy gather: each line's byte offsets run on from where it starts
        lengths = high - low
        at = np.repeat(low - (np.cumsum(lengths) - lengths), lengths) + np.arange(size)
        out[:size] = np.frombuffer(data, np.uint8)[at]
    if size and out[size - 1] != ord("\n"):
        out[size] = ord("\n")
        return out
    return out[:size]


def sorted_high_halves(hashes: np.ndarray) -> np.ndarray:
    """`np.sort(key_hash.high_halves(hashes))`, by the scanner's radix sort where it is built."""
    if _rowscan is None:
        return np.sort(high_halves(hashes))
    ordered = np.empty(len(hashes), np.uint32)
    _rowscan.sorted_high_halves(np.ascontiguousarray(hashes, np.uint64), ordered)
    return ordered
