"""Tells whether several numeric columns hold one variable on one scale or several variables."""

from __future__ import annotations

import math
import re

import pandas as pd

from linter.rules.layout_signals import sample, sideways_by_names
from linter.table import Frame, Table

MIN_ROWS = 3
"""Fewer numbers than this in a column say nothing about its scale."""


CHANCE = 0.01
"""A gap between columns this unlikely when they all hold one variable says they do not."""
DECIMALS = re.compile(r"\.(\d+)$")


def _numbers(frame: Frame, label: str) -> pd.Series:
    texts = pd.Series(sample(frame.body[label]), dtype=object)
    return pd.to_numeric(texts.str.replace(",", "", regex=False), errors="coerce").dropna()


def _step(frame: Frame, labels: list[str]) -> float:
    """The smallest difference the numbers are written to (0.1 for `4.2`, 1 for `12`).

    Readings written to one decimal have nothing between 0.2 and 0.3: ranges that far apart
    touch on the scale the provider wrote, they are not separated by a gap.
    """
    places = [
        len(found[1])
        for label in labels
        for v in sample(frame.body[label])
        if v is not None and (found := DECIMALS.search(str(v).strip()))
    ]
    return 10.0 ** -max(places, default=0)


def _blocks(columns: list[pd.Series], step: float) -> list[list[pd.Series]]:
    """The columns in groups whose ranges overlap or touch (a chain), lowest group first."""
    ordered = sorted(columns, key=lambda c: float(c.min()))
    blocks: list[list[pd.Series]] = [[ordered[0]]]
    top = float(ordered[0].max())
    for column in ordered[1:]:
        if float(column.min()) - top > step * 1.000001:  # tolerance for binary fractions
            blocks.append([])
        blocks[-1].append(column)
        top = max(top, float(column.max()))
    return blocks


def _chance_of(blocks: list[list[pd.Series]]) -> float:
    """How likely gaps like these are when every column holds the same variable.

    If the columns are one variable, every way of dealing its numbers out to the columns is
    equally likely; the share of deals that put each group's numbers in that group's place
    (any columns of the same counts in the groups) is k!/prod(c!) * prod(n!)/N!.
    """
    counts = [len(block) for block in blocks]
    sizes = [sum(len(c) for c in block) for block in blocks]
    log_chance = (
        math.lgamma(sum(counts) + 1)
        - sum(math.lgamma(c + 1) for c in counts)
        + sum(math.lgamma(n + 1) for n in sizes)
        - math.lgamma(sum(sizes) + 1)
    )
    return math.exp(log_chance)


def one_scale(frame: Frame, labels: list[str]) -> bool:
    """False when numeric columns are plainly different variables (`x1, x2, x3` regressors).

    Columns that are the values of one variable (weeks of a count, replicates of a reading)
    share a number format (all whole numbers or not), and their ranges chain together with
    no gap that chance would rarely leave: with three readings a column, one column lying
    wholly above another is common (one pair in ten), so a gap must be unlikely (below
    CHANCE) before it splits the run. Text columns, or columns with too few numbers to
    tell, are given the benefit of the doubt.
    """
    columns = [_numbers(frame, label) for label in labels]
    if any(len(c) < MIN_ROWS for c in columns):
        return True
    whole = {bool((c == c.round()).all()) for c in columns}
    if len(whole) > 1:
        return False
    blocks = _blocks(columns, _step(frame, labels))
    return len(blocks) == 1 or _chance_of(blocks) >= CHANCE


SCALE_GAP = 10.0
"""Row medians this many times apart, with each row tighter than that, mean different quantities."""


def _row_numbers(grid: pd.DataFrame) -> list[pd.Series] | None:
    rows = []
    for index in range(1, grid.shape[0]):
        texts = pd.Series(grid.iloc[index, 1:].tolist(), dtype=object)
        texts = texts[texts.notna() & (texts.astype(str).str.strip() != "")]
        numbers = pd.to_numeric(texts.astype(str).str.replace(",", "", regex=False), errors="coerce")
        if numbers.isna().any() or numbers.empty:
            return None
        rows.append(numbers)
    return rows if len(rows) >= 2 else None


def rows_differ_in_format(grid: pd.DataFrame) -> bool:
    """True when some numeric rows hold only whole numbers and others decimals: different variables."""
    rows = _row_numbers(grid)
    return rows is not None and len({bool((r == r.round()).all()) for r in rows}) > 1


def rows_differ_in_scale(grid: pd.DataFrame) -> bool:
    """True when the rows are different quantities: their medians lie SCALE_GAP or more apart
    while every row, read across, stays within a narrower spread (games 9-14, minutes 702-1204).

    The rows of a one-variable matrix (votes by district and candidate) vary across as much
    as they differ from each other, so they do not pass.
    """
    rows = _row_numbers(grid)
    if rows is None:
        return False
    medians = [float(r.abs().median()) for r in rows]
    if min(medians) <= 0:
        return False
    between = max(medians) / min(medians)
    within = max(float(r.abs().max()) / max(float(r.abs().min()), 1e-9) for r in rows)
    return between >= SCALE_GAP and within < between


GENERIC_CORNER = re.compile(r"^(measure|measurement|variable|var|field|attribute|property|metric)s?$", re.I)
"""A top-left cell that says "the first column names variables"."""


def sideways_by_ids(table: Table) -> bool:
    """Ids across the top and variable names down the side, read as a sideways table.

    The shape alone is not enough: a one-variable matrix (counts of species by site) looks the
    same and is better gathered. The rows must also read as different variables: a generic
    corner cell, another number format or another scale per row.
    """
    grid = table.grid
    if not sideways_by_names(table):
        return False
    generic = bool(GENERIC_CORNER.match(str(grid.iat[0, 0] or "").strip()))
    return generic or rows_differ_in_format(grid) or rows_differ_in_scale(grid)


PROPER_NAME = re.compile(r"^[A-Z][a-z]+( [A-Z][a-z]+)*$")
"""`Corran St`, `Alder Quinn`, `Depot`: capitalised words only, as names of people and places."""
MIN_NAMES = 3


def name_runs(frame: Frame, taken: set[str]) -> list[tuple[list[str], str]]:
    """Runs of 3+ headers that are proper names (stores, candidates) over numbers on one scale.

    Variable names carry units, underscores or lower case (`temp_c`, `Flow (m3/s)`); a run of
    capitalised, mostly two-word names over columns of whole numbers, right of a text column
    that names each row, is one count (stock, votes) spread over its levels.
    """
    labels = list(frame.labels)
    if len(labels) < MIN_NAMES + 1 or labels[0] in taken:
        return []
    first = [v for v in sample(frame.body[labels[0]]) if v is not None and str(v).strip()]
    if not first or any(str(v).replace(",", "").replace(".", "").strip().isdigit() for v in first):
        return []
    run = [label for label in labels[1:] if label not in taken and PROPER_NAME.match(label)]
    if len(run) < MIN_NAMES or len(run) != len(labels) - 1:
        return []
    if 2 * sum(" " in label for label in run) < len(run):
        return []  # `Games, Goals, Assists` are single-word variable names; names of places and
        # people mostly take two words (`Corran St`, `Alder Quinn`)
    columns = [_numbers(frame, label) for label in run]
    filled = sum(
        sum(1 for v in sample(frame.body[label]) if v is not None and str(v).strip()) for label in run
    )
    if sum(len(c) for c in columns) < filled or not all((c == c.round()).all() for c in columns):
        return []
    return [(run, "name")]  # every filled cell a whole number: counts of one thing per name
