"""Searches a large table's recipe on a sample of its rows, then applies and audits it on every row."""

from __future__ import annotations

from dataclasses import replace
from typing import Any

import numpy as np

from linter.contract.model import TableContract
from linter.reshape.apply import apply_recipe
from linter.reshape.audit import audit
from linter.reshape.recipe import Recipe
from linter.reshape.search import SearchResult, search
from linter.reshape.steps import RecipeError, step_from_json
from linter.reshape.tidiness import tidiness
from linter.rules.layout_groups import find_section_titles
from linter.rules.layout_margins import find_blank_rows_columns, find_totals_and_notes
from linter.table import Table

SAMPLE_HEAD = 2000
"""Grid rows kept from the top of a large table (header zone and the first observations)."""
SAMPLE_TAIL = 300
"""Grid rows kept from the bottom (totals and notes live there)."""

Step = dict[str, Any]


def _row_steps(table: Table, contract: TableContract | None) -> list[Step]:
    """Steps naming rows, found on the whole table (cheap, vectorised detectors)."""
    found = [
        *find_blank_rows_columns(table, contract),
        *find_totals_and_notes(table, contract),
        *find_section_titles(table, contract),
    ]
    return [dict(f.step) for f in found if f.step is not None]


def sampled(table: Table, contract: TableContract | None) -> Table:
    """The head, the tail and every row a row-naming step touches (with the row after it)."""
    n = table.grid.shape[0]
    keep = set(range(min(n, SAMPLE_HEAD))) | set(range(max(0, n - SAMPLE_TAIL), n))
    position = {number: i for i, number in enumerate(table.row_numbers)}
    for step in _row_steps(table, contract):
        for number in step.get("rows", []):
            i = position.get(number)
            if i is not None:
                keep.update(j for j in (i, i + 1, i + 2) if j < n)
    rows = np.asarray(sorted(keep))
    grid = table.grid.iloc[rows].reset_index(drop=True)
    return replace(table, grid=grid, row_numbers=tuple(table.row_numbers[i] for i in rows))


def _on_every_row(steps: tuple[Step, ...], full: list[Step]) -> tuple[Step, ...]:
    """The sample's steps with their row lists taken from the whole table."""
    by_kind = {(s["step"], s.get("reason")): s for s in full if s["step"] in ("drop_rows", "lift_titles")}
    refreshed = []
    for step in steps:
        whole = by_kind.get((step["step"], step.get("reason")))
        refreshed.append({**step, "rows": whole["rows"]} if whole is not None else dict(step))
    return tuple(refreshed)


def search_large(
    table: Table, contract: TableContract | None = None, *, keep_empty: bool = True
) -> SearchResult:
    """`search` for any size: small tables directly; large ones on a sample, checked on every row.

    When the sample's recipe does not fit the whole table or its audit there is not lossless,
    the search runs on the whole table after all: a recipe that loses data is never chosen.
    """
    if table.grid.shape[0] <= SAMPLE_HEAD + SAMPLE_TAIL:
        return search(table, contract, keep_empty=keep_empty)
    found = search(sampled(table, contract), contract, keep_empty=keep_empty)
    steps = _on_every_row(found.best.steps, _row_steps(table, contract))
    try:
        recipe = Recipe.of(step_from_json(s, i) for i, s in enumerate(steps, start=1))
        result = apply_recipe(table, recipe)
    except RecipeError:
        return search(table, contract, keep_empty=keep_empty)
    if len(result.tables) != 1 or not audit(table, result, recipe).lossless:
        return search(table, contract, keep_empty=keep_empty)
    output = next(iter(result.tables.values()))
    best = replace(found.best, steps=steps, output=output, tidiness=tidiness(output, contract))
    return SearchResult(best, found.runners_up)
