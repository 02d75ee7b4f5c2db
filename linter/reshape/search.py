"""Searches multi-step recipes built from the layout detectors' steps and ranks the results by tidiness."""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any

import pandas as pd

from linter.contract.model import TableContract
from linter.reshape.apply import Reshaped, apply_recipe
from linter.reshape.audit import audit
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
    from linter.rules import (
        layout_cells,
        layout_groups,
        layout_header_rows,
        layout_headers,
        layout_index,
        layout_lists,
        layout_margins,
        layout_repeated_header,
        layout_rows,
        layout_totals,
    )

    return [
        layout_margins.find_blank_rows_columns,
        layout_margins.find_totals_and_notes,
        layout_index.find_index_column,
        layout_repeated_header.find_repeated_header,
        layout_repeated_header.find_rule_lines,
        layout_totals.find_recomputed_totals,
        layout_header_rows.find_multi_row_header,
        layout_header_rows.find_no_header,
        layout_rows.find_transposed,
        layout_groups.find_section_titles,
        layout_groups.find_same_as_above,
        layout_groups.find_ditto_marks,
        layout_headers.find_repeated_groups,
        layout_headers.find_values_in_headers,
        layout_cells.find_packed_column,
        layout_lists.find_list_cells,
        layout_rows.find_variables_in_rows,
    ]


def as_table(
    frame: pd.DataFrame,
    rows: Sequence[int],
    source: str,
    blank_names: frozenset[str] = frozenset(),
    header_row: int | None = None,
) -> Table:
    """An output frame as a Table again (header row first) so the detectors can look at it.

    `blank_names` are labels the engine made up for blank header cells; they are blank again here.
    """
    names = [None if c in blank_names else str(c) for c in frame.columns]
    header = pd.DataFrame([names], columns=range(frame.shape[1]))
    body = pd.DataFrame(frame.to_numpy(dtype=object), columns=range(frame.shape[1]))
    grid = pd.concat([header, body], ignore_index=True).astype(object)
    grid = grid.where(grid.notna(), None)
    if header_row is None:
        header_row = (min(rows) - 1) if len(rows) else 0
    return Table(source=source, sheet=None, grid=grid, row_numbers=(header_row, *map(int, rows)))


def _grid_only(steps: Sequence[Step]) -> bool:
    return all(STEPS[s["step"]].grid_level and s["step"] != "header" for s in steps)


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


MARGIN_STEPS = frozenset({"drop_rows", "drop_columns", "lift_titles"})
"""Steps about rows and columns that are not observations: they go first, before any reshaping."""
Move = list[Step]


def _proposals(
    table: Table,
    contract: TableContract | None,
    derived: frozenset[str],
    parts: frozenset[str] = frozenset(),
) -> tuple[list[Move], list[str]]:
    """Next moves (one or more steps) the detectors propose for `table`, and the rule ids they report."""
    steps: list[Step] = []
    rules: list[str] = []
    for column in derived:
        split = derived_split(table, column)
        if split is not None:
            steps.append(split)
            rules.append("layout.values-in-headers")  # the header labels still hide a number
    margins: list[Step] = []
    for detect in layout_detectors():
        for finding in detect(table, contract):
            if finding.step and finding.step["step"] == "gather" and set(finding.place.columns) <= parts:
                continue  # the parts of a split are different variables by construction
            rules.append(finding.rule)
            if finding.step is None:
                continue
            if finding.step["step"] in MARGIN_STEPS:
                margins.append(dict(finding.step))
            else:
                steps.append(dict(finding.step))
    if margins:  # rows and columns that are not data go first, all together, before any reshaping
        return [margins], rules
    return [[s] for s in steps], rules


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
) -> tuple[Candidate, list[Move]] | None:
    result = _run(table, steps)
    if result is None or len(result.tables) != 1:
        return None
    name = next(iter(result.tables))
    output = result.tables[name]
    rows = result.rows[name]
    made_up = frozenset(str(c) for c, codes in result.headers[name].items() if not codes)
    header_rows = [
        origin.row
        for codes in result.headers[name].values()
        for origin in map(result.index.decode, codes[-1:])
        if origin is not None
    ]
    view = as_table(
        output,
        rows,
        table.source,
        made_up if not steps or _grid_only(steps) else frozenset(),
        max(header_rows) if header_rows and _grid_only(steps) else None,
    )
    derived = frozenset(d for d in derived if d in output.columns)
    parts = frozenset(str(c) for s in steps if s["step"] == "split_column" for c in s["into"])
    proposals, remaining = _proposals(view, contract, derived, parts)
    lossless = audit(table, result).lossless
    candidate = Candidate(steps, output, tidiness(output, contract), lossless, tuple(remaining), derived)
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


def _fingerprint(frame: pd.DataFrame) -> int:
    return hash((tuple(map(str, frame.columns)), frame.to_csv(index=False)))


def search(table: Table, contract: TableContract | None = None, *, keep_empty: bool = True) -> SearchResult:
    """Beam search over recipes; only lossless recipes are ever chosen (the empty recipe always is)."""
    start = _evaluate(table, (), contract, frozenset())
    if start is None:
        raise RecipeError("the table cannot be read as a table with a header")
    seen: dict[tuple[str, ...], Candidate] = {(): start[0]}
    beam: list[tuple[Candidate, list[Move]]] = [start]
    outputs = {_fingerprint(start[0].output)}
    for _ in range(DEPTH):
        grown: list[tuple[Candidate, list[Move]]] = []
        for candidate, proposals in beam:
            for move in proposals[:BRANCH]:
                steps = candidate.steps
                for proposal in move:
                    for step in _prepared(proposal, list(candidate.output.columns), keep_empty):
                        steps = _ordered(steps, step)
                key = tuple(map(repr, steps))
                if key in seen:
                    continue
                derived = candidate.derived.union(*(_derived_names(p) for p in move))
                evaluated = _evaluate(table, steps, contract, derived)
                if evaluated is None:
                    continue
                seen[key] = evaluated[0]
                fingerprint = _fingerprint(evaluated[0].output)
                if evaluated[0].lossless and fingerprint not in outputs:
                    outputs.add(fingerprint)
                    grown.append(evaluated)
        if not grown:
            break
        grown.sort(key=lambda pair: -pair[0].score)
        beam = grown[:BEAM]
    unique: dict[int, Candidate] = {}
    for c in seen.values():
        if c.lossless:
            fingerprint = _fingerprint(c.output)
            if fingerprint not in unique or c.score > unique[fingerprint].score:
                unique[fingerprint] = c
    ranked = sorted(unique.values(), key=lambda c: -c.score)
    best = ranked[0] if ranked else start[0]
    renames = contract_names(best.output, contract)
    if renames:
        named = _evaluate(
            table, (*best.steps, {"step": "rename", "columns": renames}), contract, best.derived
        )
        if named is not None and named[0].lossless:
            best = named[0]
    return SearchResult(best, tuple(c for c in ranked if c is not best)[:5])


def recipe_json(steps: Sequence[Mapping[str, Any]]) -> dict[str, Any]:
    return {"weir_recipe": 1, "steps": [dict(s) for s in steps]}
