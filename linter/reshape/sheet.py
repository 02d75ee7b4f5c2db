"""The working sheet a recipe reshapes: cells as text, plus where every cell came from."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field, replace
from typing import NamedTuple

import numpy as np
import pandas as pd

from linter.table import Table, column_letter

NO_ORIGIN = -1
"""Origin code of a cell made by the recipe itself (e.g. a row-number column)."""


class Origin(NamedTuple):
    """The input cell an output value came from."""

    row: int
    """Provider row number of the input cell."""
    letter: str
    """Spreadsheet column letter of the input cell."""
    role: str
    """`value` (copied from the cell) or `header` (the cell was a header and became a value)."""
    source: str
    """The input file as the user named it."""


# An origin code packs (input cell id, role) into one integer so that provenance moves
# through melt/pivot/explode as a plain int64 frame beside the cells: code = id * 2 + role.
def as_header(codes: np.ndarray) -> np.ndarray:
    """The same cells, now marked as header-derived values."""
    codes = np.asarray(codes, dtype=np.int64)
    return np.where(codes >= 0, (codes // 2) * 2 + 1, NO_ORIGIN)


@dataclass(frozen=True)
class CellIndex:
    """Numbers every cell of the input tables so an origin code can be decoded again."""

    tables: tuple[Table, ...]
    offsets: tuple[int, ...]

    @classmethod
    def of(cls, tables: tuple[Table, ...]) -> CellIndex:
        offsets, start = [], 0
        for table in tables:
            offsets.append(start)
            start += table.grid.shape[0] * table.grid.shape[1]
        return cls(tables, tuple(offsets))

    def base_codes(self, which: int) -> np.ndarray:
        """Value-origin codes of every grid cell of input `which`, shaped like its grid."""
        rows, cols = self.tables[which].grid.shape
        ids = self.offsets[which] + np.arange(rows * cols, dtype=np.int64).reshape(rows, cols)
        return ids * 2

    def decode(self, code: int) -> Origin | None:
        """The input cell behind `code` (None for cells the recipe made)."""
        if code < 0:
            return None
        cell, role = divmod(int(code), 2)
        which = int(np.searchsorted(np.asarray(self.offsets), cell, side="right")) - 1
        table = self.tables[which]
        row, col = divmod(cell - self.offsets[which], table.grid.shape[1])
        return Origin(table.row_numbers[row], column_letter(col), "header" if role else "value", table.source)


@dataclass(frozen=True)
class Sheet:
    """One table being reshaped.

    Before a header is chosen (`header is None`) the columns are the raw spreadsheet
    letters; afterwards they are names. `origin` has the shape of `cells` and holds one
    origin code per cell; `rows` holds the provider row number each row descends from.
    """

    cells: pd.DataFrame
    """Every cell as text or None (object dtype)."""
    origin: pd.DataFrame
    """Origin code of every cell (int64), same labels as `cells`."""
    rows: np.ndarray
    """Provider row number of each row (repeats after gather/explode)."""
    header: Mapping[str, tuple[int, ...]] | None = None
    """Column name -> origin codes of the header cell(s) it was made from; None on a raw grid."""

    @property
    def is_grid(self) -> bool:
        return self.header is None

    def with_frames(self, cells: pd.DataFrame, origin: pd.DataFrame, rows: np.ndarray) -> Sheet:
        """A copy with new cells; both frames are re-indexed 0..n-1 so they stay aligned."""
        cells = cells.reset_index(drop=True)
        origin = origin.reset_index(drop=True)
        return replace(self, cells=cells, origin=origin, rows=np.asarray(rows, dtype=np.int64))


def sheet_of(table: Table, index: CellIndex, which: int = 0) -> Sheet:
    """The raw grid of `table` as a working sheet, columns named by spreadsheet letter."""
    grid = table.grid
    letters = [column_letter(i) for i in range(grid.shape[1])]
    cells = pd.DataFrame(grid.to_numpy(dtype=object), columns=letters, dtype=object)
    cells = cells.where(cells.notna(), None)
    origin = pd.DataFrame(index.base_codes(which), columns=letters)
    return Sheet(cells, origin, np.asarray(table.row_numbers, dtype=np.int64))


@dataclass(frozen=True)
class Dropped:
    """Input cells a step removed on purpose, with the reason the recipe gives."""

    codes: tuple[int, ...]
    reason: str
    step: int


@dataclass(frozen=True)
class StepNote:
    """Something a step noticed that the audit must report (e.g. unmatched cells of a split)."""

    step: int
    kind: str
    """`unmatched` (split_column), `collision` (spread), ..."""
    message: str
    codes: tuple[int, ...] = ()
    """Origin codes of the input cells concerned."""


@dataclass(frozen=True, eq=False)
class Carried:
    """Input cells that live on in output texts beyond the one origin code a cell can hold:
    the upper row of a joined header that was gathered, or the repeated identifying cells
    that a spread merged into one row. Arrays, because a spread can merge millions."""

    codes: np.ndarray
    """Origin codes (int64)."""
    texts: np.ndarray
    """The output text each cell lives on in (object), aligned with `codes`."""

    @classmethod
    def of(cls, pairs: list[tuple[int, str]]) -> Carried:
        return cls(
            np.asarray([c for c, _ in pairs], dtype=np.int64), np.asarray([t for _, t in pairs], dtype=object)
        )


@dataclass(frozen=True)
class Bench:
    """Everything a recipe works on: the sheets (name -> Sheet) and what steps recorded."""

    index: CellIndex
    sheets: Mapping[str, Sheet]
    dropped: tuple[Dropped, ...] = ()
    notes: tuple[StepNote, ...] = ()
    renamed: frozenset[int] = field(default_factory=frozenset)
    """Origin codes of header cells whose text a `rename` step replaced on purpose."""
    carried: tuple[Carried, ...] = ()
    """(origin code, output text): input cells that live on in an output text beyond the one
    code a cell can hold (the upper row of a joined header that was gathered; the repeated
    identifying cells that a spread merged into one row)."""
    step: int = 0
    """1-based number of the step being applied (for messages and records)."""
