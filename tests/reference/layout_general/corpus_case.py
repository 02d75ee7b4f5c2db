"""The record for one corpus case and small helpers to state tidy forms without slips."""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass, field
from typing import Any

Rows = list[list[str]]
FAMILIES = frozenset(
    {
        "values-in-headers",
        "repeated-column-groups",
        "packed-column",
        "list-cells",
        "variables-in-rows",
        "periodic-rows",
        "transposed",
        "section-titles",
        "same-as-above",
        "multi-row-header",
        "no-header",
        "totals-and-notes",
        "blank-rows-columns",
        "title-rows",
        "index-column",
        "repeated-header-rows",
        "multi-step",
        "tidy",
    }
)
STYLES = frozenset({"spreadsheet", "forum", "notebook", "web"})


@dataclass(frozen=True)
class Case:
    name: str
    family: str
    style: str
    why: str
    messy: Rows
    tidy: Rows
    workbook: Callable[[], Any] | None = field(default=None)


CASES: list[Case] = []


def add(
    name: str,
    family: str,
    style: str,
    why: str,
    messy: Rows,
    tidy: Rows,
    workbook: Callable[[], Any] | None = None,
) -> None:
    assert family in FAMILIES and style in STYLES, name
    assert all(c.name != name for c in CASES), name
    CASES.append(Case(name, family, style, why, messy, tidy, workbook))


def table(text: str) -> Rows:
    """Rows from a `|`-separated block, so cases read like the table they stand for."""
    return [[cell.strip() for cell in line.split("|")] for line in text.strip().splitlines()]


def as_written(header: str) -> str:
    return header


def gather(
    header: Sequence[str],
    rows: Rows,
    ids: int,
    key: str,
    value: str,
    label: Callable[[str], str] = as_written,
) -> Rows:
    """The tidy form of a wide block: one row per cell, an empty cell kept as an empty value."""
    out: Rows = [[*header[:ids], key, value]]
    for row in rows:
        for j in range(ids, len(header)):
            out.append([*row[:ids], label(header[j]), row[j] if j < len(row) else ""])
    return out
