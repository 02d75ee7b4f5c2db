"""Searches multi-step recipes built from the layout detectors' steps and ranks the results by tidiness."""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np
import pandas as pd

from linter.contract.model import TableContract
from linter.reshape.apply import Reshaped, apply_recipe
from linter.reshape.recipe import Recipe
from linter.reshape.steps import STEPS, RecipeError, step_from_json
from linter.reshape.tidiness import Tidiness, derived_split, tidiness
from linter.rules.layout_signals import slug
from linter.table import Table

Step = dict[str, Any]
Detector = Callable[[Table, TableContract | None], Sequence[Any]]

BEAM = 4
"""Partial recipes kept after each round."""
BRANCH = 4
"""Proposed next steps tried from each partial recipe."""
DEPTH = 8
"""At most this many steps in a recipe."""


@dataclass(frozen=True)
class Candidate:
    """One recipe tried by the search, with its result and why it scored as it did."""

    steps: tuple[Step, ...]
    output: pd.DataFrame
    tidiness: Tidiness
    lossless: bool
    remaining: tuple[str, ...] = ()
    """Rule ids the layout detectors still report on the output."""
    derived: frozenset[str] = field(default_factory=frozenset)
    """Output columns made from header labels (gathered names), which may still hide a number."""

    @property
    def score(self) -> float:
        return self.tidiness.score - 2.0 * len(self.remaining) - 0.05 * len(self.steps)

    def summary(self) -> dict[str, Any]:
        """JSON-ready description, as kept in the tidy report."""
        return {
            "steps": [dict(s) for s in self.steps],
            "score": round(self.score, 4),
            "lossless": self.lossless,
            "remaining_findings": list(self.remaining),
            "tidiness": self.tidiness.as_json(),
        }


@dataclass(frozen=True)
class SearchResult:
    """The chosen recipe and the runners-up, best first."""

    best: Candidate
    runners_up: tuple[Candidate, ...]


def layout_detectors() -> list[Detector]:
    """The layout detectors in the order their steps should apply (margins and header first)."""
    from linter.rules import layout_cells, layout_headers, layout_margins, layout_rows

    return [
        layout_margins.find_blank_rows_columns,
        layout_margins.find_totals_and_notes,
        layout_headers.find_multi_row_header,
        layout_headers.find_no_header,
        layout_rows.find_transposed,
        layout_rows.find_section_titles,
        layout_rows.find_same_as_above,
        layout_headers.find_repeated_groups,
        layout_headers.find_values_in_headers,
        layout_cells.find_packed_column,
        layout_cells.find_list_cells,
        layout_rows.find_variables_in_rows,
    ]


def as_table(frame: pd.DataFrame, rows: Sequence[int], source: str) -> Table:
    """An output frame as a Table again (header row first) so the detectors can look at it."""
    header = pd.DataFrame([[str(c) for c in frame.columns]], columns=range(frame.shape[1]))
    body = pd.DataFrame(frame.to_numpy(dtype=object), columns=range(frame.shape[1]))
    grid = pd.concat([header, body], ignore_index=True).astype(object)
    grid = grid.where(grid.notna(), None)
    first = (min(rows) - 1) if len(rows) else 0
    return Table(source=source, sheet=None, grid=grid, row_numbers=(first, *map(int, rows)))


def conserved(table: Table, result: Reshaped) -> bool:
    """True when every non-empty input cell lives on in the output or was dropped on purpose."""
    grid = table.grid.to_numpy(dtype=object)
    filled = np.vectorize(lambda v: v is not None and str(v).strip() != "", otypes=[bool])(grid)
    needed = set((result.index.base_codes(0)[filled] // 2).tolist()) if grid.size else set()
    seen: set[int] = set()
    for frame in result.provenance.values():
        codes = frame.to_numpy(dtype=np.int64).ravel()
        seen.update((codes[codes >= 0] // 2).tolist())
    for header in result.headers.values():
        seen.update(c // 2 for codes in header.values() for c in codes if c >= 0)
    for dropped in result.dropped:
        seen.update(c // 2 for c in dropped.codes if c >= 0)
    seen.update(c // 2 for c, _ in result.carried if c >= 0)
    seen.update(c // 2 for c in result.renamed if c >= 0)
    return needed <= seen


def _ordered(steps: Sequence[Step], new: Step) -> tuple[Step, ...]:
    """Grid steps go before the header step and the table steps; table steps apply in order found."""
    if not STEPS[new["step"]].grid_level:
        return (*steps, new)
    grid = [s for s in steps if STEPS[s["step"]].grid_level and s["step"] != "header"]
    header = [s for s in steps if s["step"] == "header"]
    rest = [s for s in steps if not STEPS[s["step"]].grid_level]
    if new["step"] == "header":
        return (*grid, new, *rest) if not header else tuple(steps)
    return (*grid, new, *header, *rest)


def _proposals(
    table: Table, contract: TableContract | None, derived: frozenset[str], columns: Sequence[str]
) -> tuple[list[Step], list[str]]:
    """Next steps the detectors propose for `table`, and the rule ids they report."""
    steps: list[Step] = []
    rules: list[str] = []
    for column in derived:
        split = derived_split(table, column)
        if split is not None:
            steps.append(split)
    for detect in layout_detectors():
        for finding in detect(table, contract):
            rules.append(finding.rule)
            if finding.step is not None:
                steps.append(dict(finding.step))
    return steps, rules


def _prepared(step: Step, columns: Sequence[str], keep_empty: bool) -> list[Step]:
    """The step as the search applies it: empty-cell policy, and a row id when nothing identifies rows."""
    step = dict(step)
    if step["step"] in ("gather", "gather_groups"):
        step["keep_empty"] = keep_empty
    if step["step"] == "gather" and set(step["columns"]) >= set(columns):
        return [{"step": "add_row_id", "name": "row"}, step]
    return [step]


def _derived_names(step: Step) -> set[str]:
    if step["step"] == "gather":
        return {str(step["names_to"])}
    if step["step"] == "gather_groups":
        return {str(step["names_to"])}
    return set()


def _run(table: Table, steps: tuple[Step, ...]) -> Reshaped | None:
    try:
        recipe = Recipe.of(step_from_json(s, i) for i, s in enumerate(steps, start=1))
        return apply_recipe(table, recipe)
    except (RecipeError, ValueError, KeyError, IndexError, TypeError):
        return None  # a step that does not fit this table is simply not a candidate


def _evaluate(
    table: Table,
    steps: tuple[Step, ...],
    contract: TableContract | None,
    derived: frozenset[str],
) -> tuple[Candidate, list[Step]] | None:
    result = _run(table, steps)
    if result is None or len(result.tables) != 1:
        return None
    name = next(iter(result.tables))
    output = result.tables[name]
    rows = result.rows[name]
    view = as_table(output, rows, table.source)
    derived = frozenset(d for d in derived if d in output.columns)
    proposals, remaining = _proposals(view, contract, derived, list(output.columns))
    candidate = Candidate(
        steps, output, tidiness(output, contract), conserved(table, result), tuple(remaining), derived
    )
    return candidate, proposals


def contract_names(output: pd.DataFrame, contract: TableContract | None) -> dict[str, str]:
    """Output column -> declared variable, where the names match apart from case and punctuation."""
    if contract is None:
        return {}
    declared = {slug(v.name): v.name for v in contract.variables}
    mapping: dict[str, str] = {}
    for column in output.columns:
        target = declared.get(slug(str(column)))
        if target is not None and target != column and target not in output.columns:
            mapping[str(column)] = target
    return mapping


def search(
    table: Table, contract: TableContract | None = None, *, keep_empty: bool = True
) -> SearchResult:
    """Beam search over recipes; only lossless recipes are ever chosen (the empty recipe always is)."""
    start = _evaluate(table, (), contract, frozenset())
    if start is None:
        raise RecipeError("the table cannot be read as a table with a header")
    seen: dict[tuple[str, ...], Candidate] = {(): start[0]}
    beam: list[tuple[Candidate, list[Step]]] = [start]
    for _ in range(DEPTH):
        grown: list[tuple[Candidate, list[Step]]] = []
        for candidate, proposals in beam:
            for proposal in proposals[:BRANCH]:
                steps = candidate.steps
                for step in _prepared(proposal, list(candidate.output.columns), keep_empty):
                    steps = _ordered(steps, step)
                key = tuple(map(repr, steps))
                if key in seen:
                    continue
                derived = candidate.derived | _derived_names(proposal)
                evaluated = _evaluate(table, steps, contract, derived)
                if evaluated is None:
                    continue
                seen[key] = evaluated[0]
                if evaluated[0].lossless:
                    grown.append(evaluated)
        if not grown:
            break
        grown.sort(key=lambda pair: -pair[0].score)
        beam = grown[:BEAM]
    ranked = sorted((c for c in seen.values() if c.lossless), key=lambda c: -c.score)
    best = ranked[0] if ranked else start[0]
    renames = contract_names(best.output, contract)
    if renames:
        named = _evaluate(table, (*best.steps, {"step": "rename", "columns": renames}), contract, best.derived)
        if named is not None and named[0].lossless:
            best = named[0]
    return SearchResult(best, tuple(c for c in ranked if c is not best)[:5])


def recipe_json(steps: Sequence[Mapping[str, Any]]) -> dict[str, Any]:
    return {"weir_recipe": 1, "steps": [dict(s) for s in steps]}
