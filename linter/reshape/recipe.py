"""A recipe: an ordered list of steps, saved and loaded as JSON (`{"weir_recipe": 1, "steps": [...]}`)."""

from __future__ import annotations

import json
from collections.abc import Iterable
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import linter.reshape.grid_steps
import linter.reshape.join_files
import linter.reshape.melt_steps
import linter.reshape.normalise
import linter.reshape.table_steps  # noqa: F401  (these modules register their steps on import)
from linter.reshape.steps import RecipeError, StepParams, step_from_json

FORMAT_VERSION = 1


@dataclass(frozen=True)
class Recipe:
    """The steps that turn one submitted table into tidy table(s), in the order they apply."""

    steps: tuple[StepParams, ...] = ()

    @classmethod
    def of(cls, steps: Iterable[StepParams]) -> Recipe:
        return cls(tuple(steps))

    def to_json(self) -> dict[str, Any]:
        return {"weir_recipe": FORMAT_VERSION, "steps": [s.to_json() for s in self.steps]}

    @classmethod
    def from_json(cls, data: Any) -> Recipe:
        if not isinstance(data, dict) or "weir_recipe" not in data:
            raise RecipeError('not a Weir recipe: expected an object with "weir_recipe": 1 and "steps"')
        if data["weir_recipe"] != FORMAT_VERSION:
            raise RecipeError(f"recipe format {data['weir_recipe']!r} is not supported (this Weir reads 1)")
        extra = sorted(set(data) - {"weir_recipe", "steps"})
        if extra:
            raise RecipeError(f"recipe has unknown key(s) {', '.join(extra)}")
        steps = data.get("steps")
        if not isinstance(steps, list):
            raise RecipeError('recipe "steps" must be a list')
        return cls(tuple(step_from_json(s, i) for i, s in enumerate(steps, start=1)))


def dumps_recipe(recipe: Recipe) -> str:
    return json.dumps(recipe.to_json(), indent=2, ensure_ascii=False) + "\n"


def load_recipe(path: str | Path) -> Recipe:
    """Read a saved recipe; any problem is a RecipeError naming the file."""
    try:
        text = Path(path).read_text(encoding="utf-8")
    except (OSError, UnicodeDecodeError) as err:
        raise RecipeError(f"cannot read recipe {path}: {err}") from None
    try:
        data = json.loads(text)
    except json.JSONDecodeError as err:
        raise RecipeError(f"recipe {path} is not valid JSON: {err}") from None
    try:
        return Recipe.from_json(data)
    except RecipeError as err:
        raise RecipeError(f"recipe {path}: {err}") from None


def dump_recipe(recipe: Recipe, path: str | Path) -> None:
    from linter.output import write_text_atomic

    write_text_atomic(Path(path), dumps_recipe(recipe))
