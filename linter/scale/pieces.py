"""Read a delimited file in pieces cut at line ends, and learn what its bytes tell on the way.

`text_batches` parses one piece at a time with Arrow (all cells as text, empty as null), so
memory does not grow with the file (`line_blocks` hands the same pieces over unparsed, for the
row scanner); `LineScan` sees every byte once (SHA-256, line ends, NUL
bytes, carriage returns) to prove Arrow's rows are the file's lines; each `Span` says where a
piece's lines lie, so rows can be read again without another pass; `read_ahead` parses the next
piece while the current one is judged.
"""

from __future__ import annotations

import contextlib
import functools
import hashlib
import mmap
import os
import threading
from collections.abc import Callable, Iterator
from concurrent.futures import Future, ThreadPoolExecutor
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
RETURN = ord("\r")
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

    def add(self, data: bytes | bytearray | mmap.mmap, start: int = 0, end: int | None = None) -> None:
        """Take in `data[start:end]` (a range, so a reused read buffer is never copied)."""
        end = len(data) if end is None else end
        if end <= start:
            return
        self.digest.update(memoryview(data)[start:end])
        self.bytes += end - start
        # NumPy counts several times faster than `bytes.count`, and lets go of the GIL meanwhile.
        block = np.frombuffer(data, np.uint8, end - start, start)
        self.newlines += int(np.count_nonzero(block == NEWLINE))
        # `find` is a fast byte search; counting is only needed in files that have the byte at all.
        if data.find(b"\r", start, end) >= 0:
            returns = block == RETURN
            self.returns += int(np.count_nonzero(returns))
            self.line_returns += int(np.count_nonzero(returns[:-1] & (block[1:] == NEWLINE)))
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


@dataclass(frozen=True)
class Block:
    """Whole lines of the file, as read: `data[:size]`, starting at byte `offset` of the file."""

    data: Any
    """A writable buffer (reused for later blocks once this one is done with)."""
    size: int
    offset: int
    checked: Callable[[], None]
    """Waits for the block's scan (which runs meanwhile); raises `pa.ArrowInvalid` on NUL bytes."""


def _scanned(scanned: Future[None] | None, scan: LineScan | None) -> None:
    if scanned is not None:
        scanned.result()
    if scan is not None and scan.nuls:
        raise pa.ArrowInvalid("NUL bytes: the ordinary reader reports them")


def _anonymous(size: int) -> mmap.mmap:
    """Anonymous memory for a read buffer, in huge pages where the system gives them when asked:
    a 16 MB block then costs eight page faults instead of four thousand (which, in a new
    process, cost more than the SHA-256 of the block)."""
    private = getattr(mmap, "MAP_PRIVATE", 0) | getattr(mmap, "MAP_ANONYMOUS", 0)
    # Private, not Python's default shared mapping: shared memory gets no huge pages on Linux.
    buffer = mmap.mmap(-1, size, flags=private) if private else mmap.mmap(-1, size)
    if hasattr(mmap, "MADV_HUGEPAGE"):
        with contextlib.suppress(OSError):
            buffer.madvise(mmap.MADV_HUGEPAGE)
    return buffer


def line_blocks(
    path: str, block: int | None = None, scan: LineScan | None = None, ring: int = 1
) -> Iterator[Block]:
    """The file read in blocks of whole lines (the header line included), each shown to `scan`.

    The blocks take turns in `ring` buffers: a block's buffer is reused `ring` blocks later, so a
    consumer `read_ahead` of this needs a ring of 3 (the block it judges, one queued, one being
    read). Each buffer is anonymous memory, so only the pages a block fills count. A NUL byte
    stops the pass at once; a line longer than the reader's limit raises too.
    """
    block = BATCH_BYTES if block is None else block
    buffers: list[mmap.mmap] = []
    have = offset = turn = 0
    carried: tuple[mmap.mmap, int] | None = None
    """The buffer holding the unfinished last line of the block just yielded, and where it starts."""
    # The scan (SHA-256 mostly) of each block runs beside whatever the consumer does with the
    # block until it calls `checked`; both let go of the GIL.
    with open(path, "rb") as handle, ThreadPoolExecutor(1, thread_name_prefix="weir-scan") as scanner:
        while True:
            if turn % ring == len(buffers):
                buffers.append(_anonymous(LONGEST_LINE_BYTES + block))
            buffer = buffers[turn % ring]
            view = memoryview(buffer)
            if carried is not None and have:  # the unfinished line of the last block starts this one
                previous, at = carried
                view[:have] = memoryview(previous)[at : at + have]
            read = handle.readinto(view[have : have + block])
            scanned = None if scan is None else scanner.submit(scan.add, buffer, have, have + read)
            checked = functools.partial(_scanned, scanned, scan)
            filled = have + read
            cut = filled if not read else buffer.rfind(b"\n", 0, filled) + 1
            if filled - cut > LONGEST_LINE_BYTES:
                checked()
                # The ordinary reader refuses such a line with a finding; let it.
                raise pa.ArrowInvalid("a line longer than the reader's limit")
            if cut:
                yield Block(buffer, cut, offset, checked)
            checked()  # before the buffer is written again
            carried = None
            if cut:
                offset += cut
                turn += 1
                if ring == 1:
                    buffer[: filled - cut] = buffer[cut:filled]  # the unfinished line (may overlap)
                else:
                    carried = (buffer, cut)
            have = filled - cut
            if not read:
                return


UTF8_BOM = b"\xef\xbb\xbf"


def parse_text(data: Any, start: int, end: int, options: tuple[Any, Any, Any]) -> pa.Table:
    """`data[start:end]` (whole lines of the file) parsed by Arrow with `text_options`, without
    copying it first; Arrow copies the cells into its own arrays, so the buffer may be reused.

    Arrow drops a byte order mark at the start of what it reads. Past the file's first line such
    bytes are part of a cell (the fast path never takes a file that starts with one), so a range
    that starts with them is read after an empty line, which Arrow skips."""
    view = memoryview(data)[start:end]
    if bytes(view[:3]) == UTF8_BOM:
        return pacsv.read_csv(pa.BufferReader(b"\n" + bytes(view)), *options)
    return pacsv.read_csv(pa.BufferReader(pa.py_buffer(view)), *options)


def text_batches(
    path: str, delimiter: str, width: int, block: int | None = None, scan: LineScan | None = None
) -> Iterator[Piece]:
    """Batches of text cells (empty -> null), the header line included as the first row.

    The file is cut at line ends and each piece parsed on its own: with line breaks inside cells
    refused (`newlines_in_values=False`) that is exactly how Arrow splits records anyway, and only
    one piece is ever in memory (Arrow's own streaming reader reads ahead without bound).
    """
    options = text_options(delimiter, width)
    line = 0
    for lines in line_blocks(path, block, scan):
        table = parse_text(lines.data, 0, lines.size, options)
        lines.checked()
        yield Piece(table, Span(lines.offset, lines.size, line, table.num_rows))
        line += table.num_rows


T = TypeVar("T")


def read_ahead(items: Iterator[T], depth: int = 1) -> Iterator[T]:
    """`items`, produced in a thread up to `depth` ahead of the consumer.

    Reading and parsing the next batch (Arrow releases the GIL) overlaps with judging this one;
    at most `depth + 1` batches are in memory. An error in the producer is raised here, in order.
    """
    queue: Queue[tuple[bool, Any]] = Queue(maxsize=depth)
    stop = threading.Event()

    def offer(entry: tuple[bool, Any]) -> bool:
        """Queue the entry unless the consumer has stopped (then it never takes another one)."""
        while not stop.is_set():
            try:
                queue.put(entry, timeout=0.1)
                return True
            except Full:
                continue
        return False

    def produce() -> None:
        try:
            for item in items:
                if not offer((True, item)):
                    return
            offer((False, None))
        except BaseException as error:  # handed to the consumer, which raises it
            offer((False, error))

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
