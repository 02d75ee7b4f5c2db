"""Read a delimited file in pieces cut at line ends, and learn what its bytes tell on the way.

`text_batches` parses one piece at a time with Arrow (all cells as text, empty as null), so
memory does not grow with the file; `LineScan` sees every byte once (SHA-256, line ends, NUL
bytes, carriage returns) to prove Arrow's rows are the file's lines; each `Span` says where a
piece's lines lie, so rows can be read again without another pass; `read_ahead` parses the next
piece while the current one is judged.
"""

from __future__ import annotations

import hashlib
import os
import threading
from collections.abc import Iterator
from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass
from queue import Full, Queue
from typing import Any, TypeVar

import numpy as np
import pyarrow as pa
import pyarrow.csv as pacsv

from linter.read.limits import DEFAULT_LIMITS

BATCH_BYTES = 16 * 1024 * 1024
PARSE_BLOCK_BYTES = max(1024 * 1024, BATCH_BYTES // (os.cpu_count() or 1))
"""Arrow parses a piece in blocks of this size side by side, one per core, and each block becomes
one chunk of every column: the screen works chunk by chunk, so fewer, longer chunks cost it less
(a 16 MB piece in 1 MB blocks, Arrow's default, took it a third longer than in two)."""
NEWLINE = ord("\n")
LONGEST_LINE_BYTES = 4 * DEFAULT_LIMITS.max_line_chars
"""UTF-8 needs at most 4 bytes a character."""


class LineScan:
    """What reading a file's bytes once tells: its SHA-256, and whether Arrow's rows are its lines.

    Fed every block as it is read, so the hash and the line counts cost no pass of their own.
    NUL bytes, carriage returns that do not all end lines (CRLF), or a count of lines that differs
    from the rows parsed mean the file takes the ordinary reader, which reports such things.
    """

    def __init__(self) -> None:
        self.digest = hashlib.sha256()
        self.bytes = 0
        self.newlines = 0
        self.returns = 0
        self.line_returns = 0
        """Carriage returns directly followed by a line feed."""
        self.nuls = False
        self.ends_with_newline = False
        self.ends_with_return = False

    def add(self, data: bytes | bytearray, start: int = 0, end: int | None = None) -> None:
        """Take in `data[start:end]` (a range, so a reused read buffer is never copied)."""
        end = len(data) if end is None else end
        if end <= start:
            return
        self.digest.update(memoryview(data)[start:end])
        self.bytes += end - start
        # NumPy counts several times faster than `bytes.count`, and lets go of the GIL meanwhile.
        self.newlines += int(np.count_nonzero(np.frombuffer(data, np.uint8, end - start, start) == NEWLINE))
        # `find` is a fast byte search; counting is only needed in files that have the byte at all.
        if data.find(b"\r", start, end) >= 0:
            self.returns += data.count(b"\r", start, end)
            self.line_returns += data.count(b"\r\n", start, end)
        if self.ends_with_return and data[start] == ord("\n"):
            self.line_returns += 1  # a CRLF split between two blocks
        self.nuls = self.nuls or data.find(b"\x00", start, end) >= 0
        self.ends_with_newline = data[end - 1] == ord("\n")
        self.ends_with_return = data[end - 1] == ord("\r")

    @property
    def plain(self) -> bool:
        """No NUL bytes, and either no carriage return or CRLF at the end of every line."""
        return not self.nuls and self.returns == self.line_returns and self.returns in (0, self.newlines)

    def rows_agree(self, body_rows: int) -> bool:
        """One parsed row per physical line proves every row number exact (no blank or split lines)."""
        lines = self.newlines + (0 if self.ends_with_newline else 1)
        return self.plain and body_rows >= 1 and lines == body_rows + 1

    @property
    def sha256(self) -> str:
        return self.digest.hexdigest()


def scan_lines(path: str) -> LineScan:
    """A `LineScan` of the whole file, for readers that do not go through `text_batches`."""
    scan = LineScan()
    with open(path, "rb") as handle:
        for block in iter(lambda: handle.read(BATCH_BYTES), b""):
            scan.add(block)
    return scan


@dataclass(frozen=True)
class Span:
    """Where one batch's lines lie in the file, so its rows can be read again without a full pass."""

    offset: int
    """Byte offset of the batch's first line."""
    size: int
    """Bytes of whole lines in the batch."""
    first_line: int
    """0-based physical line of the batch's first row (the header is line 0)."""
    rows: int


@dataclass(frozen=True)
class Piece:
    """One batch of text cells and where its lines lie in the file."""

    table: pa.Table
    span: Span


def text_options(delimiter: str, width: int) -> tuple[Any, Any, Any]:
    """Arrow's read, parse and convert options for text cells (empty -> null), with no header."""
    names = [f"c{i}" for i in range(width)]
    return (
        pacsv.ReadOptions(column_names=names, block_size=PARSE_BLOCK_BYTES),
        pacsv.ParseOptions(delimiter=delimiter, newlines_in_values=False),
        pacsv.ConvertOptions(
            column_types=dict.fromkeys(names, pa.string()), null_values=[""], strings_can_be_null=True
        ),
    )


def text_batches(
    path: str, delimiter: str, width: int, block: int | None = None, scan: LineScan | None = None
) -> Iterator[Piece]:
    """Batches of text cells (empty -> null), the header line included as the first row.

    The file is cut at line ends and each piece parsed on its own: with line breaks inside cells
    refused (`newlines_in_values=False`) that is exactly how Arrow splits records anyway, and only
    one piece is ever in memory (Arrow's own streaming reader reads ahead without bound). Every
    block read is shown to `scan`; a NUL byte stops the pass at once.
    """
    block = BATCH_BYTES if block is None else block
    options = text_options(delimiter, width)
    # One buffer for the whole pass: a fresh 16 MB object per read cost more in page faults than
    # the copy itself. It holds the unfinished last line of one read plus the next read.
    buffer = bytearray(LONGEST_LINE_BYTES + block)
    view = memoryview(buffer)
    have = offset = line = 0
    # The scan (SHA-256 mostly) of each block runs beside Arrow's parse of it; both let go of the
    # GIL, and the buffer is changed only once both are done.
    with open(path, "rb") as handle, ThreadPoolExecutor(1, thread_name_prefix="weir-scan") as scanner:
        while True:
            read = handle.readinto(view[have : have + block])
            scanned = None if scan is None else scanner.submit(scan.add, buffer, have, have + read)
            filled = have + read
            cut = filled if not read else buffer.rfind(b"\n", 0, filled) + 1
            table = None
            if cut and filled - cut <= LONGEST_LINE_BYTES:
                try:
                    # Arrow copies the cells into its own arrays, so the buffer may be reused after.
                    table = pacsv.read_csv(pa.BufferReader(pa.py_buffer(view[:cut])), *options)
                finally:
                    if scanned is not None:
                        scanned.result()
            elif scanned is not None:
                scanned.result()
            if scan is not None and scan.nuls:
                raise pa.ArrowInvalid("NUL bytes: the ordinary reader reports them")
            if filled - cut > LONGEST_LINE_BYTES:
                # The ordinary reader refuses such a line with a finding; let it.
                raise pa.ArrowInvalid("a line longer than the reader's limit")
            if table is not None:
                yield Piece(table, Span(offset, cut, line, table.num_rows))
                offset += cut
                line += table.num_rows
                buffer[: filled - cut] = bytes(view[cut:filled])  # the unfinished line (may overlap)
            have = filled - cut
            if not read:
                return


T = TypeVar("T")


def read_ahead(items: Iterator[T], depth: int = 1) -> Iterator[T]:
    """`items`, produced in a thread up to `depth` ahead of the consumer.

    Reading and parsing the next batch (Arrow releases the GIL) overlaps with judging this one;
    at most `depth + 1` batches are in memory. An error in the producer is raised here, in order.
    """
    queue: Queue[tuple[bool, Any]] = Queue(maxsize=depth)
    stop = threading.Event()

    def produce() -> None:
        try:
            for item in items:
                while not stop.is_set():
                    try:
                        queue.put((True, item), timeout=0.1)
                        break
                    except Full:
                        continue
                if stop.is_set():
                    return
            queue.put((False, None))
        except BaseException as error:  # handed to the consumer, which raises it
            queue.put((False, error))

    worker = threading.Thread(target=produce, name="weir-read-ahead", daemon=True)
    worker.start()
    try:
        while True:
            more, item = queue.get()
            if not more:
                if item is not None:
                    raise item
                return
            yield item
    finally:
        stop.set()
        worker.join()
