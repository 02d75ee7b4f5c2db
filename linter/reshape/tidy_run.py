"""Runs the recipe search (or a saved recipe) on each table of a file and writes what `weir tidy` promises."""

from __future__ import annotations

import json
import shutil
from collections.abc import Mapping
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any

import pandas as pd

from linter.contract.model import TableContract
from linter.errors import WeirError
from linter.output import write_text_atomic
from linter.reshape.apply import Reshaped, apply_recipe, output_name
from linter.reshape.audit import Audit, audit
from linter.reshape.normalise import JoinAudit, SplitByUnit, UnitTable, audit_split
from linter.reshape.recipe import Recipe, load_recipe
from linter.reshape.search import Candidate
from linter.reshape.search_sample import search_large
from linter.reshape.steps import RecipeError, StepParams, step_from_json
from linter.table import Table


@dataclass(frozen=True)
class TidyResult:
    """One input table made tidy: the output, the recipe that made it and its audit."""

    table: Table
    name: str
    output: pd.DataFrame
    recipe: dict[str, Any]
    audit: Audit
    runners_up: tuple[Candidate, ...] = ()
    chosen: Candidate | None = None
    others: Mapping[str, pd.DataFrame] = field(default_factory=dict)
    """Further tables the recipe made (a split by observational unit), written beside `output`."""
    join: JoinAudit | None = None
    """For a split: whether joining the tables gives back the table that was split."""
    by_unit: TidyResult | None = None
    """When the tidy table still mixes observational units: the same table split by unit.

    It is written beside the tidy table, not instead of it: the tidy table stays the answer to
    "what is this file in one table", the split is the answer to "and in normal form".
    """


def _without_empty_rows(recipe: Recipe, keep_empty: bool) -> Recipe:
    if keep_empty:
        return recipe
    steps: list[StepParams] = []
    for step in recipe.steps:
        data = step.to_json()
        if "keep_empty" in data:
            data["keep_empty"] = False
        steps.append(step_from_json(data, len(steps) + 1))
    return Recipe.of(steps)


def tidy_one(
    table: Table, contract: TableContract | None, recipe_path: Path | None, keep_empty: bool
) -> TidyResult:
    if recipe_path is not None:
        recipe = _without_empty_rows(load_recipe(recipe_path), keep_empty)
        reshaped = apply_recipe(table, recipe)
        if len(reshaped.tables) != 1 and not isinstance(recipe.steps[-1], SplitByUnit):
            raise RecipeError("this recipe makes several tables; weir tidy writes one per input table")
        name, output = next(iter(reshaped.tables.items()))
        checked = audit(table, reshaped, recipe)
        if not checked.lossless:  # a saved recipe that no longer fits this file must not lose values
            first = checked.lost[0]
            raise RecipeError(
                f"the saved recipe would lose {len(checked.lost)} cell(s) of this file "
                f"(first: {first.letter}{first.row} {first.text!r}); nothing was written"
            )
        return _with_split(
            TidyResult(table, name, output, recipe.to_json(), checked),
            recipe,
            reshaped,
        )
    found = search_large(table, contract, keep_empty=keep_empty)
    recipe = Recipe.of(step_from_json(s, i) for i, s in enumerate(found.best.steps, start=1))
    reshaped = apply_recipe(table, recipe)
    checked = audit(table, reshaped, recipe)
    if not checked.lossless:  # the search only picks lossless recipes; this guards a disagreement
        raise RecipeError(f"the chosen recipe would lose {len(checked.lost)} cell(s); nothing was written")
    name, output = next(iter(reshaped.tables.items()))
    result = TidyResult(table, name, output, recipe.to_json(), checked, found.runners_up, found.best)
    split = _unit_split(reshaped, table, contract)
    if split is None:
        return result
    # The tidy table still holds several units: also split it, and keep both answers.
    by_recipe = Recipe.of([*recipe.steps, split])
    by_reshaped = apply_recipe(table, by_recipe)
    by_name, by_output = next(iter(by_reshaped.tables.items()))
    by_unit = TidyResult(table, by_name, by_output, by_recipe.to_json(), audit(table, by_reshaped, by_recipe))
    return replace(result, by_unit=_with_split(by_unit, by_recipe, by_reshaped))


def _unit_split(reshaped: Reshaped, table: Table, contract: TableContract | None) -> SplitByUnit | None:
    """The split_by_unit step for a single tidy output that mixes units (same evidence as units.mixed)."""
    from linter.profile.evidence import mixed_units

    if len(reshaped.tables) != 1:
        return None
    ((name, frame),) = reshaped.tables.items()
    found = mixed_units(frame, tuple(contract.keys) if contract else (), contract.name if contract else name)
    if found is None:
        return None
    return SplitByUnit(tuple(UnitTable(t.name, t.key, t.columns) for t in found.split.tables))


def _with_split(result: TidyResult, recipe: Recipe, reshaped: Reshaped) -> TidyResult:
    """Add the other tables of a split and the audit that joining them gives back the split table."""
    step = recipe.steps[-1] if recipe.steps else None
    if not isinstance(step, SplitByUnit):
        return result
    before = apply_recipe(result.table, Recipe(recipe.steps[:-1]))
    ((_, whole),) = before.tables.items()
    join = audit_split(whole, reshaped.tables, step)
    if not join.lossless:
        raise RecipeError("joining the split tables would not give back the table; nothing was written")
    others = {n: t for n, t in reshaped.tables.items() if n != result.name}
    return replace(result, others=others, join=join)


def tidy_tables(
    tables: list[Table], contract: TableContract | None, *, recipe_path: Path | None, keep_empty: bool
) -> list[TidyResult]:
    return [tidy_one(t, contract, recipe_path, keep_empty) for t in tables]


def _csv(frame: pd.DataFrame) -> str:
    # Source: RFC 4180 §2 rule 1 (records end with CRLF).
    return frame.to_csv(index=False, lineterminator="\r\n")


def write_outputs(results: list[TidyResult], source: Path, out: Path) -> list[str]:
    """Write each tidy CSV with its recipe, audit and search report; return one line per file written."""
    lines: list[str] = []
    single = len(results) == 1
    for result in results:
        stem = result.name if not single else (source.stem or output_name(result.table))
        target = out / f"{stem}.csv"
        if target.resolve() == source.resolve():
            raise WeirError(f"the tidy CSV would overwrite the input {source}; choose another --out folder")
        prefix = "" if single else f"{stem}."
        unchanged = not result.recipe["steps"] and source.suffix.lower() == ".csv"
        if unchanged:
            out.mkdir(parents=True, exist_ok=True)
            tmp = out / f".{target.name}.copy"
            shutil.copyfile(source, tmp)  # an already tidy CSV is written byte for byte
            tmp.replace(target)
        else:
            write_text_atomic(target, _csv(result.output))
        write_text_atomic(
            out / f"{prefix}recipe.json", json.dumps(result.recipe, indent=2, ensure_ascii=False) + "\n"
        )
        for other, frame in result.others.items():
            extra = out / f"{other}.csv"
            if extra.resolve() == source.resolve() or extra == target:
                raise WeirError(
                    f"the split table {other} would overwrite {extra}; choose another --out folder"
                )
            write_text_atomic(extra, _csv(frame))
            lines.append(
                f"{extra}: {len(frame)} rows, {frame.shape[1]} columns (split by observational unit)"
            )
        audited = result.audit.to_json()
        if result.join is not None:
            audited["join"] = {
                "lossless": result.join.lossless,
                "input_rows": result.join.input_rows,
                "joined_rows": result.join.joined_rows,
                "tables": [result.name, *result.others],
            }
        write_text_atomic(
            out / f"{prefix}audit.json", json.dumps(audited, indent=2, ensure_ascii=False) + "\n"
        )
        report = {
            "input": str(source),
            "sheet": result.table.sheet,
            "chosen": result.chosen.summary() if result.chosen else {"steps": result.recipe["steps"]},
            "runners_up": [c.summary() for c in result.runners_up],
        }
        write_text_atomic(
            out / f"{prefix}tidy-report.json", json.dumps(report, indent=2, ensure_ascii=False) + "\n"
        )
        if result.by_unit is not None:
            lines += write_outputs([result.by_unit], source, out / f"{stem}.by-unit")
        steps = len(result.recipe["steps"])
        lines.append(
            f"{target}: {len(result.output)} rows, {result.output.shape[1]} columns "
            f"({'already tidy, written unchanged' if not steps else f'{steps} step(s)'}; "
            f"audit: {'lossless' if result.audit.lossless else f'{len(result.audit.lost)} cell(s) lost'})"
        )
    return lines
