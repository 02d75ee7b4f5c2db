"""Recognises what a header label or a cell's text looks like (a year, a date, a number, a name...)."""

from __future__ import annotations

import re
from collections import Counter
from collections.abc import Iterable, Sequence

import pandas as pd

from linter.table import Table

SAMPLE_ROWS = 2000
"""Heuristics look at most at this many rows (spread over the table) so inference stays O(rows)."""

NUMBER = re.compile(r"^[<>]?\s*[+-]?(\d{1,3}(,\d{3})+|\d+)?(\.\d+)?([eE][+-]?\d+)?$")
ISO_DATE = re.compile(r"^\d{4}-\d{2}(-\d{2})?([T ]\d{2}:\d{2}(:\d{2})?)?$")
DMY_DATE = re.compile(r"^\d{1,2}[/.]\d{1,2}[/.]\d{2,4}$")
YEAR = re.compile(r"^(1[89]|20)\d{2}$")
MONTHS = [
    "january",
    "february",
    "march",
    "april",
    "may",
    "june",
    "july",
    "august",
    "september",
    "october",
    "november",
    "december",
]
MONTH_WORDS = frozenset(MONTHS) | frozenset(m[:3] for m in MONTHS) | {"sept"}
RANGE = re.compile(
    r"^[<>≤≥]?\s*\$?\d+(\.\d+)?k?\s*([-–]|to)\s*\$?\d+(\.\d+)?k?$|^[<>≤≥]\s*\$?\d+(\.\d+)?k?$|^\$?\d+(\.\d+)?k?\+$"
)


def blank(value: object) -> bool:
    """True for an empty cell: None or only whitespace."""
    return value is None or (isinstance(value, str) and not value.strip())


def is_number(text: str) -> bool:
    text = text.strip()
    return bool(text) and any(ch.isdigit() for ch in text) and bool(NUMBER.match(text))


def is_date(text: str) -> bool:
    text = text.strip()
    return bool(ISO_DATE.match(text) or DMY_DATE.match(text))


def cell_kind(value: object) -> str:
    """One of empty, number, date, text: the coarse type a column should keep throughout."""
    if blank(value):
        return "empty"
    text = str(value).strip()
    if is_date(text):
        return "date"
    if is_number(text):
        return "number"
    return "text"


def header_value_kind(label: str) -> str | None:
    """The kind of value a header label *is*, when it is a value rather than a variable name."""
    text = label.strip()
    if not text:
        return None
    if YEAR.match(text):
        return "year"
    if is_date(text):
        return "date"
    if text.lower().rstrip(".") in MONTH_WORDS:
        return "month"
    if is_number(text):
        return "number"
    if RANGE.match(text):
        return "range"
    return None


def sample(values: Sequence[object] | pd.Series) -> list[object]:
    """At most SAMPLE_ROWS values spread evenly over the sequence."""
    items = list(values) if not isinstance(values, pd.Series) else values.tolist()
    if len(items) <= SAMPLE_ROWS:
        return items
    stride = len(items) / SAMPLE_ROWS
    return [items[int(i * stride)] for i in range(SAMPLE_ROWS)]


def kinds(values: Iterable[object]) -> Counter[str]:
    """How many non-empty values of each kind."""
    return Counter(k for k in (cell_kind(v) for v in values) if k != "empty")


def dominant_kind(values: Iterable[object]) -> tuple[str, float]:
    """The most common non-empty kind and its share (1.0 = homogeneous); ("empty", 1.0) if none."""
    counts = kinds(values)
    total = sum(counts.values())
    if not total:
        return "empty", 1.0
    kind, n = counts.most_common(1)[0]
    return kind, n / total


def row_cells(table: Table, index: int) -> list[object]:
    return list(table.grid.iloc[index].tolist())


def filled_positions(cells: Sequence[object]) -> list[int]:
    return [i for i, v in enumerate(cells) if not blank(v)]


def shared_stem(labels: Sequence[str]) -> tuple[str, str] | None:
    """Literal prefix and suffix shared by all labels, when what varies holds a digit in every label."""
    if len(labels) < 2:
        return None
    prefix = labels[0]
    for label in labels[1:]:
        while not label.startswith(prefix):
            prefix = prefix[:-1]
    suffix = labels[0][len(prefix) :]
    for label in labels[1:]:
        while not label[len(prefix) :].endswith(suffix):
            suffix = suffix[1:]
    # A shared digit at the edge belongs to what varies (wk1, wk10, wk11 share "wk1").
    while prefix and prefix[-1].isdigit():
        prefix = prefix[:-1]
    while suffix and suffix[0].isdigit():
        suffix = suffix[1:]
    if not prefix and not suffix:
        return None
    rests = [label[len(prefix) : len(label) - len(suffix)] for label in labels]
    if len(set(rests)) != len(rests) or not all(r and any(c.isdigit() for c in r) for r in rests):
        return None
    return prefix, suffix


def slug(text: str) -> str:
    """A column name made from free text: lowercase words joined by underscores."""
    words = re.findall(r"[0-9A-Za-z]+", text.lower())
    return "_".join(words) or "value"
