"""Screen a delimited file batch by batch in bounded memory, keys across batches included.

Column checks run per batch (`screen.screen_batch`) on the pieces `pieces.text_batches` reads.
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
from collections.abc import Callable, Mapping, Sequence
from concurrent.futures import Future
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np
import pyarrow as pa
import pyarrow.csv as pacsv

from linter.contract.model import TableContract
from linter.scale.key_codes import key_codes, shared_codes
from linter.scale.key_hash import high_halves, members_of, repeated_positions, row_hashes
from linter.scale.pieces import LineScan, Span, read_ahead, text_batches, text_options
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
    first_good: Mapping[str, int] = field(default_factory=dict)
    """Per patterned variable, the body position of the first cell the screen passes that is not
    missing (a row kept for it): a pattern finding's example of the agreed form is the column's
    first good value, which lies beyond the sample when the file starts with bad ones."""


def key_hashes(keys: pa.Table) -> np.ndarray:
    """A 64-bit hash per row of the whole key; equal keys hash equal, unequal ones almost never.

    A row's hash depends on that row alone (`key_hash.row_hashes`), so batches hashed apart agree.
    """
    return row_hashes(keys)


def _hashed_and_sorted(keys: pa.Table) -> tuple[np.ndarray, np.ndarray]:
    """The batch's key hashes, and their upper halves sorted (see `key_hash.repeated_positions`)."""
    hashes = key_hashes(keys)
    return hashes, np.sort(high_halves(hashes))


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
    # Per batch, its 64-bit key hashes (8 bytes a row instead of the key texts) and their upper
    # halves sorted, both worked out on a worker while the pass goes on.
    key_runs: list[Future[tuple[np.ndarray, np.ndarray]]] = []
    suspect_parts: list[np.ndarray] = []
    cell_parts: dict[str, list[np.ndarray]] = {}
    first_good: dict[str, int] = {}
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
            firsts = _first_good(screened.good, first_good)
            for name, at in firsts.items():
                first_good[name] = start + at
            chosen = np.union1d(np.union1d(sample, suspect), list(firsts.values())).astype(np.int64)
            if len(chosen):
                kept.append(_take(body, chosen))
                kept_positions.append(chosen + start)
            if screened.keys.num_columns:
                if spill is None:
                    key_runs.append(worker_pool().submit(_hashed_and_sorted, screened.keys))
                else:
                    spill.add(key_hashes(screened.keys), start)
            start += body.num_rows
            if progress is not None:
                progress(body.num_rows)
        if not scan.rows_agree(start):
            raise pa.ArrowInvalid("blank lines, stray carriage returns or NUL bytes")
        hashed = [run.result() for run in key_runs]
        key_parts = [hashes for hashes, _ in hashed]
        high_runs = [ordered for _, ordered in hashed]
        positions = np.concatenate([*kept_positions, np.array([], np.int64)])
        first_pass = pa.concat_tables(kept) if kept else _no_rows(labels)
        found_rows = Rows(path, delimiter, width, labels, spans, first_pass, positions)
        duplicate = _exact_duplicates(key_parts, high_runs, spill, contract, found_rows)
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
        first_good,
    )


def _first_good(good: Mapping[str, np.ndarray], known: Mapping[str, int]) -> dict[str, int]:
    """Per patterned variable without a known first good cell, the batch position of its first
    good cell, when the batch has one."""
    return {name: int(np.argmax(cells)) for name, cells in good.items() if name not in known and cells.any()}


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
                chosen = b"".join(data[starts[i] : ends[i] + 1] for i in wanted)
                if not chosen.endswith(b"\n"):
                    chosen += b"\n"
                found.append(pacsv.read_csv(pa.BufferReader(chosen), *options).rename_columns(self.labels))
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
