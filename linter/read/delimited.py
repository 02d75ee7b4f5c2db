"""Delimited text (CSV, TSV, semicolon, pipe) read record by record, every cell kept as written."""

from __future__ import annotations

import csv
import io
import re
from collections import Counter
from collections.abc import Iterator
from contextlib import contextmanager

import pandas as pd

from linter.read.encoding import Decoding
from linter.read.errors import UnreadableFile, too_many_cells
from linter.read.limits import ReadLimits
from linter.read.lines import LineScanner
from linter.table import ReadNote, Table

CANDIDATE_DELIMITERS = (",", "\t", ";", "|")
SEPARATOR_HINT = re.compile(r"sep=(.)(?:\r\n|\n|\r|$)")
# From memory of spreadsheet programs' CSV handling: a first line `sep=;` names the delimiter
# (written by some European exports so the file opens in columns); it is not data.
SAMPLE_CHARS = 64 * 1024
SAMPLE_RECORDS = 50


def records_of(text: str, delimiter: str) -> list[list[str]]:
    try:
        # StringIO with newline="" splits at CR and LF only, as csv does; str.splitlines would
        # also split at characters like U+001E or U+0085 that are ordinary text in a cell.
        return list(csv.reader(io.StringIO(text, newline=""), delimiter=delimiter, strict=False))
    except csv.Error:
        return []


def choose_delimiter(sample: str, complete: bool, prefer_tab: bool) -> str:
    """The delimiter that splits the sample into the most consistent, widest records."""
    if not complete and "\n" in sample:
        sample = sample[: sample.rfind("\n") + 1]  # the last line may be cut short
    best: tuple[tuple[bool, float, int, bool], str] | None = None
    for delimiter in CANDIDATE_DELIMITERS:
        widths = [len(r) for r in records_of(sample, delimiter)[:SAMPLE_RECORDS] if r]
        if not widths:
            continue
        width, times = Counter(widths).most_common(1)[0]
        score = (width > 1, times / len(widths), width, delimiter == "\t" and prefer_tab)
        if best is None or score > best[0]:
            best = (score, delimiter)
    if best is None or not best[0][0]:
        return "\t" if prefer_tab else ","
    return best[1]


@contextmanager
def cell_limit(chars: int) -> Iterator[None]:
    """csv's field limit is process-wide: set ours for one read and restore it after."""
    previous = csv.field_size_limit(chars)
    try:
        yield
    finally:
        csv.field_size_limit(previous)


def trimmed(record: list[str], width: int) -> list[str]:
    """Drop empty cells past the header's width: a trailing delimiter is not an extra column."""
    end = len(record)
    while end > width and record[end - 1] == "":
        end -= 1
    return record[:end]


def read_delimited(path: str, decoding: Decoding, limits: ReadLimits, prefer_tab: bool) -> Table:
    """Read a delimited text file; header rows stay in the grid, row numbers are physical lines."""
    try:
        return decoded_table(path, decoding, limits, prefer_tab)
    except UnicodeDecodeError as error:
        # choose_decoding checked the whole file; this is the safety net for a codec that
        # accepts bytes one way and refuses them another.
        raise UnreadableFile(
            "file.encoding-unknown",
            f"The file cannot be decoded as {decoding.encoding} ({error.reason} at byte {error.start}).",
            "Open the file in the program that made it and save it as CSV UTF-8.",
        ) from None


def decoded_table(path: str, decoding: Decoding, limits: ReadLimits, prefer_tab: bool) -> Table:
    with open(path, encoding=decoding.encoding, newline="") as handle:
        sample = handle.read(SAMPLE_CHARS + 1)
    hint = SEPARATOR_HINT.match(sample)
    if hint:
        delimiter = hint.group(1)
    else:
        delimiter = choose_delimiter(sample[:SAMPLE_CHARS], len(sample) <= SAMPLE_CHARS, prefer_tab)

    rows: list[list[str]] = []
    starts: list[int] = []
    blank_lines: list[int] = []
    last_raw: list[str] = []
    with open(path, encoding=decoding.encoding, newline="") as handle, cell_limit(limits.max_cell_chars):
        scanner = LineScanner(handle, limits.max_line_chars)
        reader = csv.reader(iter(scanner), delimiter=delimiter, quotechar='"', doublequote=True, strict=False)
        consumed = 0
        cell_count = 0
        while True:
            start = consumed + 1
            try:
                record = next(reader)
            except StopIteration:
                break
            except csv.Error as error:
                raise UnreadableFile(
                    "file.cell-too-long",
                    f"A cell starting on line {start} is longer than {limits.max_cell_chars:,} characters "
                    f'({error}); often a quote (") that is never closed.',
                    "Close the quote or shorten the cell, then send the file again.",
                ) from None
            consumed = reader.line_num
            last_raw = scanner.raw
            scanner.raw = []
            if hint and start == 1:
                continue  # the `sep=` line is an instruction to the program, not a row of data
            if not any(record):
                blank_lines.append(start)
                continue
            if len(record) > limits.max_columns:
                raise UnreadableFile(
                    "file.too-many-columns",
                    f"Line {start} has {len(record):,} cells, more than the limit of {limits.max_columns:,}.",
                    "Check the delimiter and send the table with one column per variable.",
                )
            cell_count += len(record)
            if cell_count > limits.max_cells:
                raise too_many_cells(limits)
            if len(rows) >= limits.max_rows:
                raise UnreadableFile(
                    "file.too-many-rows",
                    f"The file has more than {limits.max_rows:,} rows.",
                    "Split the submission into smaller files.",
                )
            rows.append(record)
            starts.append(start)

    if not rows:
        raise UnreadableFile(
            "file.empty",
            "The file holds no data: it is empty or has only blank lines.",
            "Send the file again with its header and data rows.",
        )
    notes = list(decoding.notes)
    width = len(rows[0])
    rows = [trimmed(r, width) if len(r) > width else r for r in rows]
    ragged = [(line, len(r)) for line, r in zip(starts, rows, strict=True) if len(r) != width]
    if ragged:
        notes.append(
            ReadNote(
                "ragged-rows",
                f"{len(ragged)} row(s) do not have the {width} cells of the header row.",
                rows=tuple(line for line, _ in ragged),
                examples=tuple(f"line {line}: {n} cells" for line, n in ragged[:5]),
            )
        )
    inner_blanks = [line for line in blank_lines if starts[0] < line < starts[-1]]
    if inner_blanks:
        notes.append(ReadNote("blank-rows", "Blank lines inside the table.", rows=tuple(inner_blanks)))
    cr_only = scanner.endings["\r"]
    if cr_only:
        notes.append(
            ReadNote(
                "line-endings",
                f"{cr_only} line(s) end with a carriage return alone (old Mac style).",
                rows=tuple(scanner.cr_only_lines),
            )
        )
    if scanner.nul_lines:
        notes.append(
            ReadNote("nul-bytes", "The file contains NUL characters.", rows=tuple(scanner.nul_lines))
        )
    # A record that runs over several lines to the end of the file with an odd number of quotes
    # opened a quoted cell that never closed (csv's lenient mode silently swallows the rest).
    if len(last_raw) > 1 and "".join(last_raw).count('"') % 2 == 1:
        notes.append(
            ReadNote(
                "unclosed-quote",
                f"A quote opened in the record on line {starts[-1]} is never closed, so everything "
                "after it to the end of the file was read as one cell.",
                rows=(starts[-1],),
            )
        )
    grid_width = max(len(r) for r in rows)
    grid = pd.DataFrame(
        [[c if c != "" else None for c in r] + [None] * (grid_width - len(r)) for r in rows],
        dtype=object,
    )
    return Table(
        source=path,
        sheet=None,
        grid=grid,
        row_numbers=tuple(starts),
        format="tsv" if delimiter == "\t" else "csv",
        encoding=decoding.encoding,
        delimiter=delimiter,
        notes=tuple(notes),
    )
