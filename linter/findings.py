"""What every check returns: findings as plain, frozen records (never exceptions)."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from enum import StrEnum
from typing import Any

MAX_ROWS_LISTED = 50
"""A finding names at most this many row numbers; `count` always holds the full number."""


class Severity(StrEnum):
    """How much a finding blocks acceptance."""

    ERROR = "error"
    WARNING = "warning"
    NOTE = "note"

    @property
    def rank(self) -> int:
        """Larger is more severe: note 0, warning 1, error 2."""
        return {"note": 0, "warning": 1, "error": 2}[self.value]


@dataclass(frozen=True)
class Place:
    """Where a finding is, in the words of the provider's own file."""

    file: str
    """The file as the user named it."""
    sheet: str | None = None
    """Excel sheet name, if any."""
    rows: tuple[int, ...] = ()
    """Provider row numbers (as the spreadsheet or text editor shows them), at most MAX_ROWS_LISTED."""
    columns: tuple[str, ...] = ()
    """Column names as written in the header."""
    letters: tuple[str, ...] = ()
    """Spreadsheet column letters, one per entry of `columns`."""


@dataclass(frozen=True)
class ExcerptRow:
    """One row of an excerpt: the provider's row number and the cells shown."""

    row: int
    """Provider row number (as the spreadsheet or text editor shows it)."""
    cells: tuple[str | None, ...]
    """Cell texts exactly as written (None for an empty cell), one per excerpt column."""
    marked: tuple[bool, ...]
    """True for the cells the finding is about, one per excerpt column."""


@dataclass(frozen=True)
class Excerpt:
    """A few offending rows of the provider's table, for a letter to show with the bad cells marked."""

    columns: tuple[str, ...]
    """Column names shown (the finding's columns and the key columns, in file order)."""
    letters: tuple[str, ...]
    """Spreadsheet letter of each shown column."""
    rows: tuple[ExcerptRow, ...]


@dataclass(frozen=True)
class Finding:
    """One problem (or observation) in a submission, with what the provider should do."""

    rule: str
    """Rule id, e.g. `values.out-of-range`; `weir explain RULE` documents it."""
    severity: Severity
    message: str
    """One or two sentences a data provider can act on."""
    place: Place
    count: int = 1
    """How many cells, rows or groups are affected in total."""
    examples: tuple[str, ...] = ()
    """A few offending values exactly as written."""
    fix: str = ""
    """Plain-words instruction for the provider."""
    step: Mapping[str, Any] | None = None
    """For layout problems: one recipe step (JSON-ready) that reshapes the table."""
    evidence: Mapping[str, Any] = field(default_factory=dict)
    """Extra facts behind the finding (JSON-ready), e.g. the key columns or a group's rows."""
    excerpt: Excerpt | None = None
    """A few of the offending rows, attached by the pipeline after inspection (never by a rule)."""


def listed_rows(rows: list[int] | tuple[int, ...]) -> tuple[int, ...]:
    """The sorted, de-duplicated row numbers a finding shows (capped at MAX_ROWS_LISTED)."""
    return tuple(sorted(set(rows))[:MAX_ROWS_LISTED])


def sort_key(finding: Finding) -> tuple[Any, ...]:
    """Stable order for reports: file, most severe first, then rule and first row."""
    return (
        finding.place.file,
        finding.place.sheet or "",
        -finding.severity.rank,
        finding.rule,
        finding.place.rows[:1] or (0,),
        finding.place.columns,
        finding.message,
    )
