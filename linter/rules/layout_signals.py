"""Recognises what a header label or a cell's text looks like (a year, a date, a number, a name...)."""

from __future__ import annotations

import functools
import re
import weakref
from collections import Counter
from collections.abc import Callable, Iterable, Sequence
from typing import Generic, TypeVar

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.compute as pc

from linter.rules.layout_levels import level_kind
from linter.table import Frame, Table, first_row_header

T = TypeVar("T")

SAMPLE_ROWS = 1000
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
MONTH_YEAR = re.compile(r"^([A-Za-z]{3,9}\.?[\s/-]*(\d{2}|\d{4})|\d{4}[\s/-]*[A-Za-z]{3,9})$")
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
    if value is None:
        return "empty"
    if isinstance(value, str):
        return _text_kind(value)
    return _written_kind(str(value).strip())  # a number or date read from a workbook: never blank


@functools.lru_cache(maxsize=1 << 16)
def _text_kind(value: str) -> str:
    """`cell_kind` of a text cell; a column repeats its values, so each is read once."""
    text = value.strip()
    return _written_kind(text) if text else "empty"


def _written_kind(text: str) -> str:
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
    if MONTH_YEAR.match(text) and any(w in MONTH_WORDS for w in re.findall(r"[a-z]+", text.lower())):
        return "date"
    if is_number(text):
        return "number"
    if RANGE.match(text):
        return "range"
    return level_kind(text)


def sample(values: Sequence[object] | pd.Series) -> list[object]:
    """At most SAMPLE_ROWS values spread evenly over the sequence."""
    if len(values) <= SAMPLE_ROWS:
        return values.tolist() if isinstance(values, pd.Series) else list(values)
    picks = (np.arange(SAMPLE_ROWS) * (len(values) / SAMPLE_ROWS)).astype(int)
    if isinstance(values, pd.Series):
        return values.iloc[picks].tolist()
    return [values[int(i)] for i in picks]


class PerGrid(Generic[T]):
    """Remembers one derived value per grid (by identity) while the grid lives.

    Twelve detectors look at the same table; reading its header or its filled cells once
    instead of twelve times keeps layout inference a small fraction of reading a large file.
    """

    def __init__(self) -> None:
        self._values: dict[int, tuple[weakref.ref[pd.DataFrame], T]] = {}

    def get(self, grid: pd.DataFrame, make: Callable[[], T]) -> T:
        key = id(grid)
        held = self._values.get(key)
        if held is not None and held[0]() is grid:
            return held[1]
        value = make()

        def forget(_: object) -> None:
            self._values.pop(key, None)

        self._values[key] = (weakref.ref(grid, forget), value)
        return value


_FRAMES: PerGrid[Frame] = PerGrid()
_MASKS: PerGrid[np.ndarray] = PerGrid()


def frame_of(table: Table) -> Frame:
    """`first_row_header(table)`, computed once per grid however many detectors ask for it."""
    frame = _FRAMES.get(table.grid, lambda: first_row_header(table))
    return frame if frame.table is table else first_row_header(table)


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


def _common_prefix(a: str, b: str) -> str:
    n = 0
    for x, y in zip(a, b, strict=False):
        if x != y:
            break
        n += 1
    return a[:n]


def _common_suffix(a: str, b: str) -> str:
    n = 0
    for x, y in zip(reversed(a), reversed(b), strict=False):
        if x != y:
            break
        n += 1
    return a[len(a) - n :]


def _edge_digits_dropped(prefix: str, suffix: str) -> tuple[str, str]:
    while prefix and prefix[-1].isdigit():
        prefix = prefix[:-1]
    while suffix and suffix[0].isdigit():
        suffix = suffix[1:]
    return prefix, suffix


class GrowingStem:
    """`shared_stem` of a run of labels kept up to date as labels are appended.

    Recomputing `shared_stem` for every longer run is quadratic in the run's length (a header of
    10,000 columns c0..c9999 took minutes); here each label costs its own length, plus a full
    recount only the few times the shared prefix or suffix shrinks.
    """

    def __init__(self, first: str) -> None:
        self.labels = [first]
        self.raw_prefix = first
        self.raw_suffix = ""
        self.stem: tuple[str, str] = ("", "")
        self.rests: set[str] = set()
        self.valid = False

    def _recount(self) -> None:
        prefix, suffix = self.stem
        rests = [label[len(prefix) : len(label) - len(suffix)] for label in self.labels]
        self.rests = set(rests)
        self.valid = (
            bool(prefix or suffix)
            and len(self.rests) == len(rests)
            and all(r and any(c.isdigit() for c in r) for r in rests)
        )

    def add(self, label: str) -> tuple[str, str] | None:
        """The shared stem once `label` joins the run (what `shared_stem` would say of the whole run)."""
        self.labels.append(label)
        prefix = _common_prefix(self.raw_prefix, label)
        if prefix != self.raw_prefix or len(self.labels) == 2:
            self.raw_prefix = prefix
            suffix = self.labels[0][len(prefix) :]
            for other in self.labels[1:]:
                suffix = _common_suffix(suffix, other[len(prefix) :])
            self.raw_suffix = suffix
        else:
            self.raw_suffix = _common_suffix(self.raw_suffix, label[len(prefix) :])
        stem = _edge_digits_dropped(self.raw_prefix, self.raw_suffix)
        if stem != self.stem or len(self.labels) == 2:
            self.stem = stem
            self._recount()
        elif self.valid:
            rest = label[len(stem[0]) : len(label) - len(stem[1])]
            self.valid = rest not in self.rests and bool(rest) and any(c.isdigit() for c in rest)
            self.rests.add(rest)
        return self.stem if self.valid else None


def slug(text: str) -> str:
    """A column name made from free text: lowercase words joined by underscores."""
    words = re.findall(r"[0-9A-Za-z]+", text.lower())
    return "_".join(words) or "value"


def filled_mask(grid: pd.DataFrame) -> np.ndarray:
    """True for every non-empty cell of the grid (vectorised: margins are checked on every row)."""
    return _MASKS.get(grid, lambda: _filled_mask(grid))


def _filled_mask(grid: pd.DataFrame) -> np.ndarray:
    if grid.size == 0:
        return np.zeros(grid.shape, dtype=bool)
    columns = []
    for index in range(grid.shape[1]):
        cells = pa.array(grid.iloc[:, index].to_numpy(dtype=object), type=pa.string(), from_pandas=True)
        length = pc.utf8_length(pc.utf8_trim_whitespace(cells))
        columns.append(pc.fill_null(pc.greater(length, 0), False).to_numpy(zero_copy_only=False))
    return np.column_stack(columns)


def row_fill(grid: pd.DataFrame) -> tuple[np.ndarray, np.ndarray]:
    """For each row: how many cells are filled, and the index of its first filled cell (0 if none)."""
    mask = filled_mask(grid)
    if mask.size == 0:
        return np.zeros(grid.shape[0], dtype=int), np.zeros(grid.shape[0], dtype=int)
    return mask.sum(axis=1), mask.argmax(axis=1)


def shape(text: str) -> str:
    """Letters become a, digits 9, runs collapsed: 'VB-014' -> 'a-9'."""
    return re.sub(r"\d+", "9", re.sub(r"[A-Za-z]+", "a", text.strip()))


NAME_LIKE = re.compile(r"^[A-Za-z][A-Za-z0-9_ ()/.%-]*$")


def sideways_by_names(table: Table) -> bool:
    """A table whose first column names variables and whose header names observations (ids).

    The header cells after the first share one shape made of letters and digits (`VB-014`,
    `VB-015`), which is how identifiers look, not years, dates or numbers; the first column's
    cells are distinct names; every row holds one kind of value.
    """
    grid = table.grid
    if not 3 <= grid.shape[0] <= 500 or grid.shape[1] < 3:
        return False
    heads = [str(v).strip() for v in grid.iloc[0, 1:].tolist() if not blank(v)]
    shapes = {shape(h) for h in heads}
    if len(heads) < grid.shape[1] - 1 or len(shapes) != 1:
        return False
    common = next(iter(shapes))
    if "a" not in common or "9" not in common or any(header_value_kind(h) for h in heads):
        return False
    names = [str(v).strip() for v in grid.iloc[1:, 0].tolist()]
    if any(not NAME_LIKE.match(n) for n in names) or len(set(names)) != len(names):
        return False
    digit_shapes = Counter(shape(n) for n in names if any(c.isdigit() for c in n))
    if digit_shapes and digit_shapes.most_common(1)[0][1] * 2 >= len(names):
        return False  # the first column holds identifiers (VB-014, VB-015), not variable names
    return all(dominant_kind(grid.iloc[i, 1:].tolist())[1] >= 0.9 for i in range(1, grid.shape[0]))


def names_across(grid: pd.DataFrame) -> bool:
    """The header after its first cell holds distinct plain words (player or store names), and the
    first column distinct names without digits: the two sides of a possibly sideways table."""
    heads = [str(v).strip() for v in grid.iloc[0, 1:].tolist() if not blank(v)]
    names = [str(v).strip() for v in grid.iloc[1:, 0].tolist() if not blank(v)]
    plain = all(NAME_LIKE.match(h) and not any(c.isdigit() for c in h) and not header_value_kind(h)
                for h in [*heads, *names])  # fmt: skip
    return plain and len(heads) == grid.shape[1] - 1 and len(set(heads)) == len(heads)
