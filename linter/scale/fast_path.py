"""Read a large, plain CSV file with Arrow, pre-screen it, and keep only the rows the engine must judge.

The result is an ordinary `Table` (header, a sample of the first rows for the layout heuristics,
and every row the screen could not pass) with the provider's exact line numbers, so the whole
inspector catalogue — pandera included — runs on it unchanged. Any doubt about the file (a byte
order mark, blank lines, quoted line breaks, ragged rows, NUL bytes, bare carriage returns,
bytes that are not UTF-8) returns None and the file takes the ordinary reader instead.
"""

from __future__ import annotations

import csv
import io
import os
from collections.abc import Callable, Collection, Mapping
from dataclasses import dataclass
from pathlib import PurePath

import numpy as np
import pandas as pd
import pyarrow as pa

from linter.contract.model import TableContract
from linter.read.delimited import SAMPLE_CHARS, SEPARATOR_HINT, choose_delimiter
from linter.row_sets import union
from linter.scale.memory import reuse_freed_memory
from linter.scale.pieces import LineScan
from linter.scale.screen import unscreenable
from linter.scale.spill import KEYS_IN_MEMORY_BYTES
from linter.scale.stream import StreamResult, screen_stream
from linter.table import Table

FAST_PATH_BYTES = 8 * 1024 * 1024
"""Files at least this large are pre-screened; smaller ones are quick on the ordinary path."""
SAMPLE_ROWS = 2000
"""Leading body rows always kept, so layout and unit heuristics see the file as it starts."""


@dataclass(frozen=True)
class Part:
    """Rows of a pre-screened file on which only some columns need judging."""

    columns: tuple[str, ...]
    """The contract variables to judge (the key columns together, any other column on its own)."""
    table: Table
    """Header row and the rows where one of `columns` holds a cell the screen could not pass (for
    the key columns also every row whose key another row shares), with the leading sample and
    the row of the first good cell of each of `columns` that has a pattern (see `screened_table`).
    Only `columns` and the key columns are filled in: the other
    cells are left empty, as no row-wise rule of the part reads them."""


@dataclass(frozen=True)
class ScreenedFile:
    """A large file reduced to what needs judging, and what it was reduced from."""

    parts: tuple[Part, ...]
    """What the row-wise inspectors must judge; none when the screen passed every cell."""
    sample: Table
    """Header row and the file's leading rows, for the inspectors that look at the whole table."""
    rows: int
    """Body rows in the whole file."""
    suspect: int
    """Body rows the screen sent to the engine (the sample not counted)."""
    sha256: str
    """Of the whole file, computed in the same pass."""

    @property
    def judged_rows(self) -> tuple[int, ...]:
        """Provider row numbers that some part judges, in file order."""
        return tuple(sorted({n for p in self.parts for n in p.table.row_numbers[1:]}))


def plain_head(path: str) -> tuple[str, str] | None:
    """(delimiter, header line) when the file starts as plain UTF-8 delimited text, else None."""
    with open(path, "rb") as handle:
        head = handle.read(SAMPLE_CHARS)
    if head[:3] == b"\xef\xbb\xbf" or head[:2] in (b"\xff\xfe", b"\xfe\xff") or b"\x00" in head:
        return None
    cut = head.rfind(b"\n")
    if cut < 0:
        return None
    try:
        sample = head[: cut + 1].decode("utf-8")
    except UnicodeDecodeError:
        return None
    if SEPARATOR_HINT.match(sample):
        return None
    delimiter = choose_delimiter(sample, complete=False, prefer_tab=PurePath(path).suffix.lower() == ".tsv")
    return delimiter, sample.split("\n", 1)[0]


def grid_of(header: tuple[str, ...], columns: Mapping[int, pa.ChunkedArray], rows: int) -> pd.DataFrame:
    """The header over Arrow text columns (by position; `rows` cells each), as the reader's grid:
    object cells, None where empty, positional labels.

    A position missing from `columns` is left empty below the header: nothing that judges the
    grid reads it."""

    def cells(i: int) -> np.ndarray:
        column = np.empty(rows + 1, dtype=object)
        column[0] = header[i] or None
        if i in columns:
            column[1:] = columns[i].to_numpy(zero_copy_only=False)
        return column

    return pd.DataFrame({i: pd.Series(cells(i), dtype=object, copy=False) for i in range(len(header))})


@dataclass(frozen=True)
class PlainFile:
    """A delimited file that starts as plain UTF-8 text: a candidate for the pre-screen."""

    path: str
    delimiter: str
    width: int


def plain_file(path: str) -> PlainFile | None:
    head = plain_head(path)
    if head is None:
        return None
    delimiter, header_line = head
    header = next(csv.reader(io.StringIO(header_line.rstrip("\r")), delimiter=delimiter), [])
    if not header:
        return None
    return PlainFile(path, delimiter, len(header))


def screened_table(plain: PlainFile, found: StreamResult, sha256: str, rules: TableContract) -> ScreenedFile:
    """The parts to judge, and the leading sample, each under the header as an ordinary `Table`.

    A clean cell yields no finding from any row-wise rule, so each column is judged only where its
    own cell is in doubt: the key columns together (with every row whose key is shared), each other
    column on its own. A part with a patterned column also holds the row of that column's first
    good cell, because a pattern finding quotes the column's first value that keeps the pattern
    as an example, as it does on the ordinary reader: that is the first good cell, or a cell
    before it in doubt for another reason, which the part holds anyway.
    """
    positions = found.positions
    sample = np.flatnonzero(positions < found.sample)
    patterned = {v.name for v in rules.variables if v.pattern is not None}

    def rows_of(columns: tuple[str, ...], judged: np.ndarray) -> np.ndarray:
        rows = np.searchsorted(positions, judged)
        if not patterned.intersection(columns):
            return rows
        firsts = [found.first_good[c] for c in columns if c in found.first_good]
        return union([rows, np.searchsorted(positions, firsts)])

    def read_by(columns: tuple[str, ...]) -> set[int]:
        """Positions of the columns the row-wise rules of a part read: its own, and the key
        columns that every excerpt shows."""
        wanted = set(columns) | set(rules.keys)
        return {i for i, label in enumerate(found.kept.column_names) if label in wanted}

    return ScreenedFile(
        tuple(
            Part(columns, _table_of(plain, found, positions, rows_of(columns, judged), read_by(columns)))
            for columns, judged in parts_to_judge(found, rules)
        ),
        _table_of(plain, found, positions, sample),
        found.rows,
        found.suspect,
        sha256,
    )


def parts_to_judge(found: StreamResult, rules: TableContract) -> list[tuple[tuple[str, ...], np.ndarray]]:
    """(columns, sorted body positions) of every part with anything to judge."""
    if found.cells is None:  # only whole rows are known: every column on every kept row
        every = tuple(v.name for v in rules.variables)
        return [(every, found.positions)] if found.judged else []
    keys = tuple(k for k in rules.keys if k in found.cells)
    found_parts = [(keys, union([found.shared, *(found.cells[k] for k in keys)]))] if keys else []
    found_parts += [
        ((v.name,), found.cells[v.name])
        for v in rules.variables
        if v.name in found.cells and v.name not in rules.keys
    ]
    return [(columns, judged) for columns, judged in found_parts if len(judged)]


def _table_of(
    plain: PlainFile,
    found: StreamResult,
    positions: np.ndarray,
    chosen: np.ndarray,
    shown: Collection[int] | None = None,
) -> Table:
    """The header and the kept rows at `chosen` (sorted indices into `found.kept`, whose body
    `positions` are given) as a `Table`, with only the `shown` columns filled in (all when None)."""
    filled = range(found.kept.num_columns) if shown is None else sorted(shown)
    rows = found.kept.select(list(filled)).take(pa.array(chosen, pa.int64()))  # only what is shown
    lines = positions[chosen] + 2  # body position 0 is line 2, after the header
    return Table(
        source=plain.path,
        sheet=None,
        grid=grid_of(found.names, dict(zip(filled, rows.columns, strict=True)), rows.num_rows),
        row_numbers=(1, *lines.tolist()),
        format="tsv" if plain.delimiter == "\t" else "csv",
        encoding="utf-8",
        delimiter=plain.delimiter,
    )


def read_screened(
    path: str,
    contract: TableContract,
    min_bytes: int | None = None,
    sample_rows: int | None = None,
    progress: Callable[[float], None] | None = None,
) -> ScreenedFile | None:
    """The file reduced to the rows the engine must see, or None when it takes the ordinary path."""
    min_bytes = FAST_PATH_BYTES if min_bytes is None else min_bytes
    sample_rows = SAMPLE_ROWS if sample_rows is None else sample_rows
    size = os.stat(path).st_size
    if size < min_bytes or unscreenable(contract) is not None:
        return None
    plain = plain_file(path)
    if plain is None:
        return None
    reuse_freed_memory()
    scan = LineScan()

    def rows_read(rows: int) -> None:
        if progress is not None:
            progress(scan.bytes / max(1, size))

    try:
        found = screen_stream(
            path,
            contract,
            plain.delimiter,
            plain.width,
            sample_rows,
            rows_read,
            size <= KEYS_IN_MEMORY_BYTES,
            scan,
        )
    except (pa.ArrowInvalid, pa.ArrowNotImplementedError):
        return None  # ragged rows, quoted line breaks, bytes that are not UTF-8: the ordinary reader says
    return screened_table(plain, found, scan.sha256, contract)
