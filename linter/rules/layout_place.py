"""Builds the finding of a layout problem: its place in the provider's file and its one recipe step."""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from typing import Any

from linter.findings import Finding, Place, listed_rows
from linter.rules.registry import Rule
from linter.table import Frame, Table, column_letter


def layout_finding(
    rule: Rule,
    table: Table,
    message: str,
    fix: str,
    step: Mapping[str, Any],
    *,
    rows: Sequence[int] = (),
    columns: Sequence[str] = (),
    letters: Sequence[str] = (),
    count: int = 1,
    examples: Sequence[str] = (),
    evidence: Mapping[str, Any] | None = None,
) -> Finding:
    """One layout finding; `step` is a JSON-ready recipe step of the agreed vocabulary."""
    return Finding(
        rule=rule.id,
        severity=rule.severity,
        message=message,
        place=Place(
            file=table.source,
            sheet=table.sheet,
            rows=listed_rows(list(rows)),
            columns=tuple(columns),
            letters=tuple(letters),
        ),
        count=count,
        examples=tuple(str(e) for e in examples[:5]),
        fix=fix,
        step=dict(step),
        evidence=dict(evidence or {}),
    )


def frame_letters(frame: Frame, labels: Sequence[str]) -> tuple[str, ...]:
    return tuple(frame.letter(label) for label in labels)


def grid_letters(indexes: Sequence[int]) -> tuple[str, ...]:
    return tuple(column_letter(i) for i in indexes)


def shown(labels: Sequence[str], limit: int = 4) -> str:
    """A short quoted list for messages: 'a', 'b', ... (and N more)."""
    head = ", ".join(f"'{label}'" for label in labels[:limit])
    more = len(labels) - limit
    return head + (f" and {more} more" if more > 0 else "")
