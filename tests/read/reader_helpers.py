"""Small helpers for reader tests: write bytes into the test's tmp folder and read them back."""

from __future__ import annotations

from pathlib import Path

from linter.read import read_path
from linter.read.limits import DEFAULT_LIMITS, ReadLimits
from linter.table import Table


def write(name: str, data: bytes) -> str:
    """Write `data` under the current folder (each test's own tmp_path) and return the name."""
    Path(name).write_bytes(data)
    return name


def read_one(name: str, data: bytes, limits: ReadLimits = DEFAULT_LIMITS) -> Table:
    tables = read_path(write(name, data), limits)
    assert len(tables) == 1
    return tables[0]


def cells(table: Table) -> list[list[str | None]]:
    """The grid as plain lists, header row included."""
    return [list(row) for row in table.grid.itertuples(index=False, name=None)]


def kinds(table: Table) -> set[str]:
    return {note.kind for note in table.notes}
