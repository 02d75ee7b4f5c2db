"""The in-memory form of one submitted sheet: every cell exactly as the provider wrote it."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from functools import cached_property

import pandas as pd


def column_letter(index: int) -> str:
    """Spreadsheet letter of a 0-based column index: 0 -> A, 25 -> Z, 26 -> AA."""
    if index < 0:
        raise ValueError("column index must be >= 0")
    letters = ""
    index += 1
    while index:
        index, rest = divmod(index - 1, 26)
        letters = chr(ord("A") + rest) + letters
    return letters


@dataclass(frozen=True)
class ReadNote:
    """Something the reader noticed while reading a file, turned into a finding by `rules/reading`."""

    kind: str
    """Short stable kind, e.g. `encoding`, `ragged-rows`, `merged-cells`, `hidden-rows`."""
    message: str
    rows: tuple[int, ...] = ()
    """Provider row numbers concerned, if any."""
    examples: tuple[str, ...] = ()
    """A few values or names concerned, exactly as written (added with a default: optional)."""


@dataclass(frozen=True)
class Table:
    """One CSV file, one Excel sheet or one Parquet file, before any interpretation.

    `grid` has positional columns 0..n-1 and holds every cell as text (`str`) or
    `None` for an empty cell, header rows included: nothing is guessed or converted.
    """

    source: str
    """The path as the user named it."""
    sheet: str | None
    """Excel sheet name; None for CSV and Parquet."""
    grid: pd.DataFrame
    """Every cell as text or None; positional integer columns; header row(s) included."""
    row_numbers: tuple[int, ...]
    """The 1-based row (spreadsheet) or line (CSV) number the provider sees for each grid row."""
    format: str = "csv"
    """One of csv, tsv, xlsx, parquet."""
    encoding: str | None = None
    """Text encoding the file was decoded with (text formats only)."""
    delimiter: str | None = None
    """Field delimiter (text formats only)."""
    hidden_rows: frozenset[int] = frozenset()
    """Provider row numbers that the spreadsheet hides."""
    merged_ranges: tuple[str, ...] = ()
    """Merged cell ranges as written in the workbook, e.g. "A2:A5"."""
    header_given: bool = True
    """False when the format carries no header (never for Parquet, whose names are given)."""
    notes: tuple[ReadNote, ...] = field(default=())
    """What the reader noticed (encoding fallback, ragged rows, merged cells...)."""

    @property
    def label(self) -> str:
        """File name with the sheet, as a provider would name the place."""
        return f"{self.source} [{self.sheet}]" if self.sheet else self.source


@dataclass(frozen=True)
class Frame:
    """A table read with its first row as the header: named columns, body rows below."""

    table: Table
    names: tuple[str, ...]
    """Header cells as written ('' for a blank header cell), one per column."""
    body: pd.DataFrame
    """Body cells as text or None, with unique column labels made from `names`."""
    rows: tuple[int, ...]
    """Provider row number of each body row."""

    @property
    def labels(self) -> tuple[str, ...]:
        """The unique column labels used in `body` (blank or repeated names get the letter)."""
        return tuple(str(c) for c in self.body.columns)

    @cached_property
    def row_index(self) -> pd.Index:
        """`rows` as an index: built (and its look-up table hashed) once, however often rules ask."""
        return pd.Index(self.rows, dtype="int64")

    @cached_property
    def positions(self) -> Mapping[str, int]:
        """Column label -> 0-based position; a lookup per letter keeps wide tables linear."""
        return {label: index for index, label in enumerate(self.labels)}

    def letter(self, label: str) -> str:
        """Spreadsheet letter of a body column (ValueError for a label the frame lacks)."""
        if label not in self.positions:
            raise ValueError(f"{label!r} is not a column of the table")
        return column_letter(self.positions[label])


def unique_labels(names: list[str]) -> list[str]:
    """Column labels for `names`: blank and repeated header cells get their letter appended."""
    seen: dict[str, int] = {}
    for name in names:
        seen[name] = seen.get(name, 0) + 1
    labels: list[str] = []
    for index, name in enumerate(names):
        if not name.strip():
            labels.append(f"(column {column_letter(index)})")
        elif seen[name] > 1:
            labels.append(f"{name} (column {column_letter(index)})")
        else:
            labels.append(name)
    return labels


def first_row_header(table: Table) -> Frame:
    """Read `table` with its first row as the header (the layout rules judge whether it is one)."""
    grid = table.grid
    if grid.shape[0] == 0:
        return Frame(table, (), pd.DataFrame(), ())
    names = ["" if v is None else str(v) for v in grid.iloc[0].tolist()]
    body = grid.iloc[1:].reset_index(drop=True)
    body.columns = pd.Index(unique_labels(names))
    return Frame(table, tuple(names), body, tuple(table.row_numbers[1:]))
