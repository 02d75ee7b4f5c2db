"""Screen a delimited file batch by batch in bounded memory, keys across batches included.

Column checks run per batch (`screen.screen_batch`). Keys need the whole file: each batch's keys
are hashed to 64 bits (`key_hash`); below `KEYS_IN_MEMORY_BYTES` the hashes are kept in memory
(8 bytes a row), above it they are spilled to partition files by their top bits and each partition
is searched for repeated hashes on its own. Either way a second pass reads back the candidate rows
and compares their keys exactly, so only keys that are really equal are reported (a hash collision
is dropped).
"""

from __future__ import annotations

import hashlib
import itertools
import os
import tempfile
import threading
from collections.abc import Callable, Iterator, Mapping, Sequence
from concurrent.futures import Future
from dataclasses import dataclass, field
from pathlib import Path
from queue import Full, Queue
from typing import Any, TypeVar

import numpy as np
import pyarrow as pa
import pyarrow.csv as pacsv

from linter.contract.model import TableContract
from linter.read.limits import DEFAULT_LIMITS
from linter.scale.key_codes import key_codes, shared_codes
from linter.scale.key_hash import members_of, merged_runs, repeated_values, repeats_of, row_hashes
from linter.scale.screen import screen_batch, worker_pool
from linter.table import unique_labels

BATCH_BYTES = 16 * 1024 * 1024
KEYS_IN_MEMORY_BYTES = 512 * 1024 * 1024
"""Files larger than this find duplicate keys through spilled 64-bit hashes instead of kept keys."""
PARTITION_ROWS = 1_000_000
"""Rows per hash partition, about: one partition (16 bytes a row) is read back at a time, so the
partitions grow in number, not in size, with the file, and memory stays flat."""
FEWEST_PARTITIONS = 64
MOST_PARTITIONS = 512
"""Each partition is an open file while the pass runs; 512 stays well inside the usual limit of
1,024 open files, and keeps a partition near 16 MB up to files of about 500 million rows."""
LONGEST_LINE_BYTES = 4 * DEFAULT_LIMITS.max_line_chars
"""UTF-8 needs at most 4 bytes a character."""

Progress = Callable[[int], None]
"""Told the number of body rows just screened."""


@dataclass(frozen=True)
class StreamResult:
    """What a pass over the file found: the header, the kept rows with their positions, the row count."""

    names: tuple[str, ...]
    kept: pa.Table
    """Header-less rows to show the engine (sample, suspects, duplicate keys), in file order."""
    positions: tuple[int, ...]
    """0-based body position of each kept row."""
    rows: int
    suspect: int
    sample: int
    """Leading body rows kept as the sample (positions 0 to sample - 1), judged or not."""
    judged: int
    """Kept rows the engine must judge (a suspect cell or a shared key)."""
    cells: Mapping[str, np.ndarray] | None = None
    """Per screened variable, the sorted body positions of its cells the screen could not pass;
    None when only whole rows are known (then every variable is judged on every judged row)."""
    shared: np.ndarray = field(default_factory=lambda: np.array([], np.int64))
    """Sorted body positions of the rows whose whole key another row shares."""


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
        self.newlines += data.count(b"\n", start, end)
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
        pacsv.ReadOptions(column_names=names),
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
    with open(path, "rb") as handle:
        while True:
            read = handle.readinto(view[have : have + block])
            if scan is not None:
                scan.add(buffer, have, have + read)
                if scan.nuls:
                    raise pa.ArrowInvalid("NUL bytes: the ordinary reader reports them")
            filled = have + read
            cut = filled if not read else buffer.rfind(b"\n", 0, filled) + 1
            if filled - cut > LONGEST_LINE_BYTES:
                # The ordinary reader refuses such a line with a finding; let it.
                raise pa.ArrowInvalid("a line longer than the reader's limit")
            if cut:
                # Arrow copies the cells into its own arrays, so the buffer may be reused at once.
                table = pacsv.read_csv(pa.BufferReader(pa.py_buffer(view[:cut])), *options)
                yield Piece(table, Span(offset, cut, line, table.num_rows))
                offset += cut
                line += table.num_rows
                buffer[: filled - cut] = bytes(view[cut:filled])  # the unfinished line (may overlap)
            have = filled - cut
            if not read:
                return


def key_hashes(keys: pa.Table) -> np.ndarray:
    """A 64-bit hash per row of the whole key; equal keys hash equal, unequal ones almost never.

    A row's hash depends on that row alone (`key_hash.row_hashes`), so batches hashed apart agree.
    """
    return row_hashes(keys)


class HashSpill:
    """64-bit key hashes and row positions written to partition files by the hash's top bits."""

    def __init__(self, folder: Path, partitions: int) -> None:
        self.bits = max(0, int(np.ceil(np.log2(max(partitions, 1)))))
        # Closed in `candidates`, which every caller reaches (the folder is temporary anyway).
        self.files = [open(folder / f"keys-{i}.bin", "ab") for i in range(1 << self.bits)]  # noqa: SIM115

    def add(self, hashes: np.ndarray, start: int) -> None:
        pairs = np.empty((len(hashes), 2), np.uint64)
        pairs[:, 0] = hashes
        pairs[:, 1] = np.arange(start, start + len(hashes), dtype=np.uint64)
        if not self.bits:
            pairs.tofile(self.files[0])
            return
        part = (hashes >> np.uint64(64 - self.bits)).astype(np.uint16)
        # One stable sort by partition (a radix sort for 16-bit keys), then one write a partition.
        order = np.argsort(part, kind="stable")
        grouped = pairs[order]
        bounds = np.searchsorted(part[order], np.arange(len(self.files) + 1))
        for index, (lower, upper) in enumerate(itertools.pairwise(bounds)):
            if upper > lower:
                grouped[lower:upper].tofile(self.files[index])

    def candidates(self) -> np.ndarray:
        """Positions whose hash occurs more than once (true duplicates and the rare collision)."""
        found: list[np.ndarray] = []
        for handle in self.files:
            handle.close()
            pairs = np.fromfile(handle.name, np.uint64).reshape(-1, 2)
            repeated = repeated_values(pairs[:, 0])
            if repeated.any():
                found.append(pairs[repeated, 1].astype(np.int64))
        return np.sort(np.concatenate(found)) if found else np.array([], np.int64)


def spill_partitions(path: str, first: Span) -> int:
    """How many hash partitions keep each near `PARTITION_ROWS` rows, estimated from the file's
    size and the first piece's bytes per row, within `FEWEST_PARTITIONS` and `MOST_PARTITIONS`."""
    per_row = first.size / max(1, first.rows)
    rows = os.path.getsize(path) / max(1.0, per_row)
    return int(min(MOST_PARTITIONS, max(FEWEST_PARTITIONS, rows // PARTITION_ROWS + 1)))


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


def _no_rows(labels: Sequence[str]) -> pa.Table:
    return pa.table({label: pa.array([], pa.string()) for label in labels})


def _take(table: pa.Table, positions: np.ndarray) -> pa.Table:
    return table.take(pa.array(positions, pa.int64()))


def screen_stream(
    path: str,
    contract: TableContract,
    delimiter: str,
    width: int,
    sample_rows: int,
    progress: Progress | None = None,
    keys_in_memory: bool = True,
    scan: LineScan | None = None,
) -> StreamResult:
    """One pass screening every batch; rows with shared keys are read back from where they lie.

    Raises `pa.ArrowInvalid` when the file is not one record per line (see `LineScan`)."""
    scan = LineScan() if scan is None else scan
    spans: list[Span] = []
    names: tuple[str, ...] = ()
    labels: list[str] = []
    kept: list[pa.Table] = []
    kept_positions: list[np.ndarray] = []
    key_parts: list[np.ndarray] = []  # 64-bit key hashes, 8 bytes a row instead of the key texts
    key_runs: list[Future[np.ndarray]] = []  # each part sorted on a worker while the pass goes on
    suspect_parts: list[np.ndarray] = []
    cell_parts: dict[str, list[np.ndarray]] = {}
    start = 0
    with tempfile.TemporaryDirectory(prefix="weir-keys-") as spill_folder:
        spill: HashSpill | None = None
        for piece in read_ahead(text_batches(path, delimiter, width, scan=scan)):
            batch = piece.table
            spans.append(piece.span)
            if not names:
                names = tuple("" if v is None else str(v) for v in batch.slice(0, 1).to_pylist()[0].values())
                labels = unique_labels(list(names))
                batch = batch.slice(1)
                if not keys_in_memory:
                    spill = HashSpill(Path(spill_folder), spill_partitions(path, piece.span))
            body = batch.rename_columns(labels)
            screened = screen_batch(body, contract)
            suspect = np.flatnonzero(screened.suspect.to_numpy(zero_copy_only=False))
            suspect_parts.append(suspect + start)
            for name, cells in screened.cells.items():
                cell_parts.setdefault(name, []).append(np.flatnonzero(cells) + start)
            sample = np.arange(max(0, min(sample_rows - start, body.num_rows)))
            chosen = np.union1d(sample, suspect).astype(np.int64)
            if len(chosen):
                kept.append(_take(body, chosen))
                kept_positions.append(chosen + start)
            if screened.keys.num_columns:
                if spill is None:
                    key_parts.append(key_hashes(screened.keys))
                    key_runs.append(worker_pool().submit(np.sort, key_parts[-1]))
                else:
                    spill.add(key_hashes(screened.keys), start)
            start += body.num_rows
            if progress is not None:
                progress(body.num_rows)
        if not scan.rows_agree(start):
            raise pa.ArrowInvalid("blank lines, stray carriage returns or NUL bytes")
        runs = [run.result() for run in key_runs]
        positions = np.concatenate([*kept_positions, np.array([], np.int64)])
        first_pass = pa.concat_tables(kept) if kept else _no_rows(labels)
        found_rows = Rows(path, delimiter, width, labels, spans, first_pass, positions)
        duplicate = _exact_duplicates(key_parts, runs, spill, contract, found_rows)
    extra = np.setdiff1d(duplicate.positions, positions)
    extra_rows = duplicate.rows.take(pa.array(np.searchsorted(duplicate.positions, extra), pa.int64()))
    merged = pa.concat_tables([first_pass, extra_rows])
    every = np.concatenate([positions, extra]).astype(np.int64)
    order = np.argsort(every, kind="stable")
    ordered = every[order]
    suspects = np.concatenate([*suspect_parts, np.array([], np.int64)])
    judged = len(np.union1d(suspects, duplicate.positions))
    return StreamResult(
        names,
        _take(merged, order),
        tuple(int(p) for p in ordered),
        start,
        len(suspects),
        min(sample_rows, start),
        judged,
        {name: np.concatenate(parts) for name, parts in cell_parts.items()},
        duplicate.positions,
    )


@dataclass(frozen=True)
class Duplicates:
    positions: np.ndarray
    """Sorted body positions of rows whose whole key another row shares."""
    rows: pa.Table
    """Those rows (all columns; empty when the first pass already kept every column needed)."""


@dataclass(frozen=True)
class Rows:
    """Where whole body rows can be found again after the first pass: among the rows it kept, or
    in the file at the lines its spans locate."""

    path: str
    delimiter: str
    width: int
    labels: list[str]
    spans: Sequence[Span]
    kept: pa.Table
    kept_at: np.ndarray
    """Sorted body position of each row of `kept`."""

    def at(self, positions: np.ndarray) -> pa.Table:
        """The rows at sorted `positions`: taken from the kept rows where the first pass kept them
        (shared keys are often on rows already in doubt), the others cut from the file."""
        inside = np.isin(positions, self.kept_at)
        tables = [self.kept.take(pa.array(np.searchsorted(self.kept_at, positions[inside]), pa.int64()))]
        if not inside.all():
            tables.append(self._read(positions[~inside]))
        # Kept rows first, then read ones: put back in the order of `positions`.
        order = np.argsort(np.concatenate([positions[inside], positions[~inside]]), kind="stable")
        return _take(pa.concat_tables(tables), order)

    def _read(self, positions: np.ndarray) -> pa.Table:
        """The rows at sorted `positions`, only their lines cut from the file and parsed."""
        lines = positions + 1  # body row p is physical line p + 1, the header being line 0
        options = text_options(self.delimiter, self.width)
        found: list[pa.Table] = []
        with open(self.path, "rb") as handle:
            for span in self.spans:
                lower, upper = np.searchsorted(lines, [span.first_line, span.first_line + span.rows])
                if upper == lower:
                    continue
                handle.seek(span.offset)
                data = handle.read(span.size)
                ends = np.flatnonzero(np.frombuffer(data, np.uint8) == ord("\n"))
                if not data.endswith(b"\n"):
                    ends = np.append(ends, len(data) - 1)  # the file's last line has no line end
                starts = np.concatenate([[0], ends[:-1] + 1])
                wanted = lines[lower:upper] - span.first_line
                chosen = b"".join(data[starts[i] : ends[i] + 1] for i in wanted)
                if not chosen.endswith(b"\n"):
                    chosen += b"\n"
                found.append(pacsv.read_csv(pa.BufferReader(chosen), *options).rename_columns(self.labels))
        return pa.concat_tables(found)


def _exact_duplicates(
    key_parts: list[np.ndarray],
    key_runs: list[np.ndarray],
    spill: HashSpill | None,
    contract: TableContract,
    rows_of: Rows,
) -> Duplicates:
    """Rows sharing a key: rows whose kept or spilled hash repeats, verified on the rows themselves."""
    empty = Duplicates(np.array([], np.int64), _no_rows(rows_of.labels))
    if spill is None:
        if not key_parts:
            return empty
        repeats = repeats_of(merged_runs(key_runs))
        starts = np.cumsum([0, *(len(part) for part in key_parts[:-1])])
        # Looked up batch by batch: joining the hashes again would only cost another copy.
        found = [np.flatnonzero(members_of(p, repeats)) + at for p, at in zip(key_parts, starts, strict=True)]
        candidates = np.concatenate(found)
    else:
        candidates = spill.candidates()
    if not len(candidates):
        return empty
    rows = rows_of.at(candidates)
    # Verify: only candidates whose keys are really equal (as the engine compares them) stay,
    # so a hash collision is dropped. Only the key columns need judging again.
    keys = screen_batch(rows.select([n for n in rows.column_names if n in contract.keys]), contract).keys
    real = shared_codes(key_codes(keys))
    return Duplicates(candidates[real], rows.filter(pa.array(real)))
