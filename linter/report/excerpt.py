"""Attach to each finding a small excerpt of the rows it names, with the cells it is about marked."""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import replace

import pandas as pd

from linter.findings import Excerpt, ExcerptRow, Finding
from linter.table import Frame, column_letter

EXCERPT_ROWS = 5
"""Rows a letter shows per finding by default: enough to recognise the pattern, short enough to read."""


def _finding_positions(finding: Finding, frame: Frame) -> list[int]:
    """0-based frame columns the finding names: by letter where given (names may repeat), else by name."""
    letters = [column_letter(i) for i in range(len(frame.labels))]
    positions: list[int] = []
    for index, name in enumerate(finding.place.columns):
        letter = finding.place.letters[index] if index < len(finding.place.letters) else ""
        if letter in letters:
            positions.append(letters.index(letter))
        elif name in frame.labels:
            positions.append(frame.labels.index(name))
        elif name in frame.names:
            positions.append(frame.names.index(name))
    return sorted(set(positions))


def _text(value: object) -> str | None:
    """Cell text, or None for an empty cell (pandas may hold an empty cell as NaN)."""
    return value if isinstance(value, str) else None


def excerpt_for(finding: Finding, frame: Frame, max_rows: int, keys: Sequence[str] = ()) -> Excerpt | None:
    """The excerpt of `finding` in `frame`, or None when it names no body row or no column of it."""
    if max_rows <= 0 or not finding.place.rows or finding.place.file != frame.table.source:
        return None
    if (finding.place.sheet or None) != (frame.table.sheet or None):
        return None
    marked = _finding_positions(finding, frame)
    if not marked:
        return None
    key_positions = [frame.labels.index(k) for k in keys if k in frame.labels]
    shown = sorted(set(marked) | set(key_positions))
    # Body positions of the listed rows (a finding lists a few dozen at most), -1 for a row
    # without body cells, such as the header row.
    at = frame.row_index.get_indexer(pd.Index(finding.place.rows, dtype="int64")).tolist()
    rows: list[ExcerptRow] = []
    for row, position in zip(finding.place.rows, at, strict=True):
        if position < 0:
            continue
        values = frame.body.iloc[position].tolist()
        rows.append(
            ExcerptRow(
                row=row,
                cells=tuple(_text(values[p]) for p in shown),
                marked=tuple(p in marked for p in shown),
            )
        )
        if len(rows) == max_rows:
            break
    if not rows:
        return None
    return Excerpt(
        columns=tuple(frame.labels[p] for p in shown),
        letters=tuple(column_letter(p) for p in shown),
        rows=tuple(rows),
    )


def attach_excerpts(
    findings: Iterable[Finding], frame: Frame, max_rows: int = EXCERPT_ROWS, keys: Sequence[str] = ()
) -> tuple[Finding, ...]:
    """`findings` with an excerpt attached where the finding names rows and columns of `frame`.

    Columns shown are the finding's own (marked) plus the contract's `keys` (unmarked, so the
    provider can recognise the rows); at most `max_rows` rows. Findings that already carry an
    excerpt keep it.
    """
    attached: list[Finding] = []
    for finding in findings:
        if finding.excerpt is None:
            excerpt = excerpt_for(finding, frame, max_rows, keys)
            if excerpt is not None:
                finding = replace(finding, excerpt=excerpt)
        attached.append(finding)
    return tuple(attached)
