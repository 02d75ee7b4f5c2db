"""Runs the recipe search (or a saved recipe) on each table of a file and writes what `weir tidy` promises."""

from __future__ import annotations

import json
import shutil
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import pandas as pd

from linter.contract.model import TableContract
from linter.errors import WeirError
from linter.output import write_text_atomic
from linter.reshape.apply import apply_recipe, output_name
from linter.reshape.audit import Audit, audit
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
        if len(reshaped.tables) != 1:
            raise RecipeError("this recipe makes several tables; weir tidy writes one per input table")
        name, output = next(iter(reshaped.tables.items()))
        return TidyResult(table, name, output, recipe.to_json(), audit(table, reshaped, recipe))
    found = search_large(table, contract, keep_empty=keep_empty)
    recipe = Recipe.of(step_from_json(s, i) for i, s in enumerate(found.best.steps, start=1))
    reshaped = apply_recipe(table, recipe)
    checked = audit(table, reshaped, recipe)
    if not checked.lossless:  # the search only picks lossless recipes; this guards a disagreement
        raise RecipeError(f"the chosen recipe would lose {len(checked.lost)} cell(s); nothing was written")
    name, output = next(iter(reshaped.tables.items()))
    return TidyResult(table, name, output, recipe.to_json(), checked, found.runners_up, found.best)


def tidy_tables(
    tables: list[Table], contract: TableContract | None, *, recipe_path: Path | None, keep_empty: bool
) -> list[TidyResult]:
    return [tidy_one(t, contract, recipe_path, keep_empty) for t in tables]


def _csv(frame: pd.DataFrame) -> str:
    return frame.to_csv(index=False, lineterminator="\n")


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
        write_text_atomic(
            out / f"{prefix}audit.json",
            json.dumps(result.audit.to_json(), indent=2, ensure_ascii=False) + "\n",
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
        steps = len(result.recipe["steps"])
        lines.append(
            f"{target}: {len(result.output)} rows, {result.output.shape[1]} columns "
            f"({'already tidy, written unchanged' if not steps else f'{steps} step(s)'}; "
            f"audit: {'lossless' if result.audit.lossless else f'{len(result.audit.lost)} cell(s) lost'})"
        )
    return lines
