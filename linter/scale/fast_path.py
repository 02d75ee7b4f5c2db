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
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import PurePath

import pandas as pd
import pyarrow as pa

from linter.contract.model import TableContract
from linter.read.delimited import SAMPLE_CHARS, SEPARATOR_HINT, choose_delimiter
from linter.scale.memory import reuse_freed_memory
from linter.scale.screen import unscreenable
from linter.scale.stream import KEYS_IN_MEMORY_BYTES, LineScan, StreamResult, screen_stream
from linter.table import Table

FAST_PATH_BYTES = 8 * 1024 * 1024
"""Files at least this large are pre-screened; smaller ones are quick on the ordinary path."""
SAMPLE_ROWS = 2000
"""Leading body rows always kept, so layout and unit heuristics see the file as it starts."""


@dataclass(frozen=True)
class ScreenedFile:
    """A large file reduced to what needs judging, and what it was reduced from."""

    table: Table
    """Header row and the rows the engine must judge, with the provider's line numbers."""
    sample: Table
    """Header row and the file's leading rows, for the inspectors that look at the whole table."""
    rows: int
    """Body rows in the whole file."""
    suspect: int
    """Body rows the screen sent to the engine (the sample not counted)."""
    sha256: str
    """Of the whole file, computed in the same pass."""


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


def grid_of(columns: pa.Table) -> pd.DataFrame:
    """Arrow text columns as the reader's grid: object cells, None where empty, positional labels."""
    return pd.DataFrame(
        {i: pd.Series(columns.column(i).to_pylist(), dtype=object) for i in range(columns.num_columns)}
    )


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


def screened_table(plain: PlainFile, found: StreamResult, sha256: str) -> ScreenedFile:
    """The rows to judge, and the leading sample, each under the header as an ordinary `Table`.

    With nothing to judge the row-wise inspectors see the header alone; otherwise they see the
    sample too, because some findings quote a good value of the same column as an example, and
    the file's first good values are in the sample, as they are for the ordinary reader.
    """
    sample = [i for i, p in enumerate(found.positions) if p < found.sample]
    judged = list(range(len(found.positions))) if found.judged else []
    return ScreenedFile(
        _table_of(plain, found, judged), _table_of(plain, found, sample), found.rows, found.suspect, sha256
    )


def _table_of(plain: PlainFile, found: StreamResult, chosen: list[int]) -> Table:
    """The header and the kept rows at `chosen` (indices into `found.kept`) as a `Table`."""
    header_grid = pd.DataFrame({i: pd.Series([n or None], dtype=object) for i, n in enumerate(found.names)})
    rows = found.kept.take(pa.array(chosen, pa.int64()))
    grid = pd.concat([header_grid, grid_of(rows)], ignore_index=True)
    grid.columns = pd.RangeIndex(grid.shape[1])
    return Table(
        source=plain.path,
        sheet=None,
        grid=grid,
        row_numbers=(1, *(found.positions[i] + 2 for i in chosen)),
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
    return screened_table(plain, found, scan.sha256)
