"""One call for the `weir tidy` command: apply a recipe and audit the result."""

from __future__ import annotations

from linter.reshape.apply import Reshaped, apply_recipe
from linter.reshape.audit import Audit, audit
from linter.reshape.recipe import Recipe
from linter.table import Table


def tidy_with_recipe(table: Table, recipe: Recipe) -> tuple[Reshaped, Audit]:
    """Reshape `table` (never modified) by `recipe` and account for every input cell.

    Raises RecipeError (exit 2, one line) when a step does not fit the table. A recipe that
    loses data is not an error here: `Audit.lossless` is false and `Audit.lost` names every
    lost cell, and the caller must not present the result as complete (see `write_tidy`).
    """
    reshaped = apply_recipe(table, recipe)
    return reshaped, audit(table, reshaped, recipe)
