"""Screen a delimited file batch by batch in bounded memory, keys across batches included.

Column checks run per batch: by the compiled row scanner on the blocks `pieces.line_blocks` reads
(`row_scan`, where it is built and the contract is one it judges), else by the numpy screen
(`screen.screen_batch`) on the pieces `pieces.text_batches` parses.
Keys need the whole file: each batch's keys are hashed to 64 bits (`key_hash`); below
`spill.KEYS_IN_MEMORY_BYTES` the hashes are kept in memory (8 bytes a row, and their upper
halves sorted, 4 more; see `key_hash.repeated_positions`), above it they are spilled to
partition files (`spill.HashSpill`). Either way the candidate rows are found again
(`Rows`) and their keys compared exactly, so only keys that are really equal are reported (a
hash collision is dropped).
"""

from __future__ import annotations

import os
import tempfile
from collections.abc import Callable, Iterator, Mapping, Sequence
from concurrent.futures import Future
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np
import pyarrow as pa
import pyarrow.csv as pacsv

from linter.contract.model import TableContract
from linter.row_sets import difference, union
from linter.scale.key_codes import key_codes, shared_codes
from linter.scale.key_hash import members_of, repeated_positions, row_hashes
from linter.scale.pieces import (
    LONGEST_LINE_BYTES,
    PARSE_BLOCK_BYTES,
    Block,
    LineScan,
    Span,
    line_blocks,
    parse_text,
    read_ahead,
    text_batches,
    text_options,
)
from linter.scale.row_scan import (
    DOUBT,
    FALLBACK,
    FALLBACK_SHARE,
    ScanSpec,
    gathered_lines,
    judge_lines,
    parse_lines,
    scan_spec,
    sorted_high_halves,
)
from linter.scale.screen import screen_batch, worker_pool
from linter.scale.spill import HashSpill, spill_partitions
from linter.table import unique_labels

Progress = Callable[[int], None]
"""Told the number of body rows just screened."""


@dataclass(frozen=True)
class StreamResult:
    """What a pass over the file found: the header, the kept rows with their positions, the row count."""

    names: tuple[str, ...]
    kept: pa.Table
    """Header-less rows to show the engine (sample, suspects, duplicate keys), in file order."""
    positions: np.ndarray
    """0-based body position of each kept row (int64, ascending)."""
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
    first_good: Mapping[str, int] = field(default_factory=dict)
    """Per patterned variable, the body position of the first cell the screen passes that is not
    missing (a row kept for it): a pattern finding's example of the agreed form is the column's
    first good value, which lies beyond the sample when the file starts with bad ones."""


def key_hashes(keys: pa.Table) -> np.ndarray:
    """A 64-bit hash per row of the whole key; equal keys hash equal, unequal ones almost never.

    A row's hash depends on that row alone (`key_hash.row_hashes`), so batches hashed apart agree.
    """
    return row_hashes(keys)


def _hashed_and_sorted(hashed: Callable[[], np.ndarray]) -> tuple[np.ndarray, np.ndarray]:
    """The batch's key hashes, and their upper halves sorted (see `key_hash.repeated_positions`)."""
    hashes = hashed()
    return hashes, sorted_high_halves(hashes)


def _no_rows(labels: Sequence[str]) -> pa.Table:
    return pa.table({label: pa.array([], pa.string()) for label in labels})


def _take(table: pa.Table, positions: np.ndarray) -> pa.Table:
    return table.take(pa.array(positions, pa.int64()))


@dataclass(frozen=True)
class BatchScreen:
    """One batch of body rows screened, however it was read."""

    rows: int
    suspect: np.ndarray
    """Batch positions of the rows with a cell the screen could not pass."""
    cells: Mapping[str, np.ndarray]
    """Per present variable, the batch positions of its cells the screen could not pass."""
    good: Mapping[str, int]
    """Per patterned variable with a good cell in the batch, the first one's batch position."""
    hashes: Callable[[], np.ndarray] | None
    """The rows' 64-bit key hashes, worked out when called (None: no key column is present)."""
    take: Callable[[np.ndarray], pa.Table | Lines]
    """The rows at sorted batch positions, as text cells or as their lines; valid only until the
    next batch is read."""


@dataclass(frozen=True)
class Lines:
    """Whole lines copied out of a block, each ending in a line end, to be parsed later."""

    data: np.ndarray
    """uint8."""
    count: int


class KeptRows:
    """The rows a pass keeps, in file order, as one Arrow table.

    Lines cut from the blocks are parsed together once enough of them are waiting: an Arrow read
    costs about a millisecond however few lines it holds, once per block when each block's few
    rows in doubt were parsed on their own."""

    def __init__(self, delimiter: str, width: int, labels: list[str]) -> None:
        self.options = text_options(delimiter, width)
        self.labels = labels
        self.tables: list[pa.Table] = []
        self.waiting: list[Lines] = []
        self.waiting_bytes = 0

    def add(self, rows: pa.Table | Lines) -> None:
        if isinstance(rows, pa.Table):
            self._parse_waiting()
            self.tables.append(rows)
            return
        self.waiting.append(rows)
        self.waiting_bytes += len(rows.data)
        if self.waiting_bytes >= PARSE_BLOCK_BYTES:
            self._parse_waiting()

    def table(self) -> pa.Table:
        """Every kept row in one chunk: each part of the file's judging takes rows from it (a take
        over a chunk per batch costs more than this one copy of the few rows kept)."""
        self._parse_waiting()
        return pa.concat_tables(self.tables).combine_chunks() if self.tables else _no_rows(self.labels)

    def _parse_waiting(self) -> None:
        if not self.waiting:
            return
        data = np.concatenate([lines.data for lines in self.waiting])
        table = parse_text(data, 0, len(data), self.options)
        if table.num_rows != sum(lines.count for lines in self.waiting):
            raise pa.ArrowInvalid("lines that Arrow reads as more or fewer records")
        self.tables.append(table.rename_columns(self.labels))
        self.waiting, self.waiting_bytes = [], 0


def _table_screen(body: pa.Table, contract: TableContract) -> BatchScreen:
    """A batch parsed by Arrow, judged by the numpy screen."""
    screened = screen_batch(body, contract)
    keys = screened.keys
    return BatchScreen(
        body.num_rows,
        np.flatnonzero(screened.suspect.to_numpy(zero_copy_only=False)),
        {name: np.flatnonzero(cells) for name, cells in screened.cells.items()},
        {name: int(np.argmax(cells)) for name, cells in screened.good.items() if cells.any()},
        (lambda: key_hashes(keys)) if keys.num_columns else None,
        lambda rows: _take(body, rows),
    )


def _table_screens(
    path: str, delimiter: str, width: int, contract: TableContract, labels: list[str], scan: LineScan
) -> Iterator[tuple[BatchScreen, Span]]:
    """The file parsed by Arrow piece by piece (the next piece while this one is judged)."""
    for piece in read_ahead(text_batches(path, delimiter, width, scan=scan)):
        batch = piece.table.slice(1) if piece.span.first_line == 0 else piece.table  # the header
        yield _table_screen(batch.rename_columns(labels), contract), piece.span


def _line_screen(
    block: Block, begin: int, spec: ScanSpec, contract: TableContract, labels: list[str], width: int
) -> BatchScreen:
    """The lines of `block.data[begin:block.size]` judged by the row scanner, its fallback lines by
    the numpy screen (or the whole block, when it is mostly such lines)."""
    options = text_options(chr(spec.delimiter), width)
    verdict = judge_lines(block.data, begin, block.size, width, spec, worker_pool())
    # One pass over the block's flags; the few flagged lines are then told apart among themselves.
    flagged = np.flatnonzero(verdict.flags)
    kinds = verdict.flags[flagged]
    back = flagged[kinds == FALLBACK]
    if len(back) * FALLBACK_SHARE > verdict.rows:
        body = parse_text(block.data, begin, block.size, options)
        if body.num_rows != verdict.rows:
            raise pa.ArrowInvalid("lines that Arrow reads as more or fewer records")
        return _table_screen(body.rename_columns(labels), contract)
    bad, hashes = verdict.bad, verdict.hashes
    good = {
        name: int(at) for name, at in zip(spec.variables, verdict.first_good, strict=True)
        if name in spec.patterned and at >= 0
    }  # fmt: skip
    suspect = flagged[kinds == DOUBT]
    if len(back):
        screened = screen_batch(parse_lines(block.data, verdict.starts, back, options, labels), contract)
        suspect = union([suspect, back[screened.suspect.to_numpy(zero_copy_only=False)]])
        for column, name in enumerate(spec.variables):
            bad[back, column] = screened.cells[name]
        if screened.keys.num_columns:
            hashes[back] = key_hashes(screened.keys)
        for name, cells in screened.good.items():
            if cells.any():
                good[name] = min(good.get(name, verdict.rows), int(back[np.argmax(cells)]))
    # Only a doubtful or handed-back line has a cell in doubt: look for them among those lines
    # alone (a column of `bad` is strided, and scanning each whole cost 1 ms a block).
    lines, columns = np.nonzero(bad[flagged])
    return BatchScreen(
        verdict.rows,
        suspect,
        {name: flagged[lines[columns == column]] for column, name in enumerate(spec.variables)},
        good,
        (lambda: hashes) if spec.keys else None,
        lambda rows: Lines(
            gathered_lines(block.data, verdict.starts[rows], verdict.starts[rows + 1]), len(rows)
        ),
    )


def _line_screens(
    path: str, spec: ScanSpec, contract: TableContract, labels: list[str], width: int, scan: LineScan
) -> Iterator[tuple[BatchScreen, Span]]:
    """The file judged by the row scanner block by block (the next block read meanwhile)."""
    line = 0
    for block in read_ahead(line_blocks(path, scan=scan, ring=3)):
        begin = 0
        if block.offset == 0:  # the header line
            begin = block.data.find(b"\n", 0, block.size) + 1 or block.size
        screened = _line_screen(block, begin, spec, contract, labels, width)
        rows = screened.rows + (1 if block.offset == 0 else 0)
        yield screened, Span(block.offset, block.size, line, rows)
        line += rows


def header_names(path: str, delimiter: str, width: int) -> tuple[str, ...]:
    """The file's first line as column names, read as Arrow reads it ("" where empty)."""
    with open(path, "rb") as handle:
        first = handle.readline(LONGEST_LINE_BYTES)
    if not first.endswith(b"\n"):
        first += b"\n"
    header = pacsv.read_csv(pa.BufferReader(first), *text_options(delimiter, width))
    return tuple("" if v is None else str(v) for v in header.to_pylist()[0].values())


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
    names = header_names(path, delimiter, width)
    labels = unique_labels(list(names))
    spec = scan_spec(contract, labels, delimiter)
    batches = (
        _table_screens(path, delimiter, width, contract, labels, scan)
        if spec is None
        else _line_screens(path, spec, contract, labels, width, scan)
    )
    spans: list[Span] = []
    kept = KeptRows(delimiter, width, labels)
    kept_positions: list[np.ndarray] = []
    # Per batch, its 64-bit key hashes (8 bytes a row instead of the key texts) and their upper
    # halves sorted, the sort done on a worker while the pass goes on.
    key_runs: list[Future[tuple[np.ndarray, np.ndarray]]] = []
    suspect_parts: list[np.ndarray] = []
    cell_parts: dict[str, list[np.ndarray]] = {}
    first_good: dict[str, int] = {}
    start = 0
    with tempfile.TemporaryDirectory(prefix="weir-keys-") as spill_folder:
        spill: HashSpill | None = None
        for screened, span in batches:
            if not spans and not keys_in_memory:
                spill = HashSpill(Path(spill_folder), spill_partitions(path, span))
            spans.append(span)
            suspect_parts.append(screened.suspect + start)
            for name, cells in screened.cells.items():
                cell_parts.setdefault(name, []).append(cells + start)
            sample = np.arange(max(0, min(sample_rows - start, screened.rows)))
            firsts = {name: at for name, at in screened.good.items() if name not in first_good}
            for name, at in firsts.items():
                first_good[name] = start + at
            chosen = union([sample, screened.suspect, list(firsts.values())])
            if len(chosen):
                kept.add(screened.take(chosen))
                kept_positions.append(chosen + start)
            if screened.hashes is not None:
                if spill is None:
                    key_runs.append(worker_pool().submit(_hashed_and_sorted, screened.hashes))
                else:
                    spill.add(screened.hashes(), start)
            start += screened.rows
            if progress is not None:
                progress(screened.rows)
        if not scan.rows_agree(start):
            raise pa.ArrowInvalid("blank lines, stray carriage returns or NUL bytes")
        hashed = [run.result() for run in key_runs]
        key_parts = [hashes for hashes, _ in hashed]
        high_runs = [ordered for _, ordered in hashed]
        positions = np.concatenate([*kept_positions, np.array([], np.int64)])
        first_pass = kept.table()
        found_rows = Rows(path, delimiter, width, labels, spans, first_pass, positions)
        duplicate = _exact_duplicates(key_parts, high_runs, spill, contract, found_rows)
    extra = difference(duplicate.positions, positions)
    if len(extra):  # rows read back for a shared key: put them among the others in file order
        extra_rows = duplicate.rows.take(pa.array(np.searchsorted(duplicate.positions, extra), pa.int64()))
        every = np.concatenate([positions, extra]).astype(np.int64)
        order = np.argsort(every, kind="stable")
        kept_rows, ordered = _take(pa.concat_tables([first_pass, extra_rows]), order), every[order]
    else:  # each batch's rows are in file order, and the batches too
        kept_rows, ordered = first_pass, positions
    suspects = np.concatenate([*suspect_parts, np.array([], np.int64)])
    judged = len(union([suspects, duplicate.positions]))
    return StreamResult(
        names,
        kept_rows,
        ordered,
        start,
        len(suspects),
        min(sample_rows, start),
        judged,
        {name: np.concatenate(parts) for name, parts in cell_parts.items()},
        duplicate.positions,
        first_good,
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
        # Not np.isin: it tabulates the whole range of positions, milliseconds for a dozen rows.
        inside = members_of(positions, self.kept_at)
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
                chosen = gathered_lines(data, starts[wanted], ends[wanted] + 1)
                found.append(parse_text(chosen, 0, len(chosen), options).rename_columns(self.labels))
        return pa.concat_tables(found)


def _exact_duplicates(
    key_parts: list[np.ndarray],
    high_runs: list[np.ndarray],
    spill: HashSpill | None,
    contract: TableContract,
    rows_of: Rows,
) -> Duplicates:
    """Rows sharing a key: rows whose kept or spilled hash repeats, verified on the rows themselves."""
    empty = Duplicates(np.array([], np.int64), _no_rows(rows_of.labels))
    if spill is None:
        candidates = repeated_positions(key_parts, high_runs, os.cpu_count() or 1, worker_pool())
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
