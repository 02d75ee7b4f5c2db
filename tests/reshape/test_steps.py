"""Each recipe step on tiny invented sheets: the expected tidy table, or a clear one-line error."""

from __future__ import annotations

from typing import Any

import pandas as pd
import pytest
from reshape_cases import BAD_STEP_CASES, STEP_CASES, Grid, recipe_json, table_of

from linter.reshape.apply import apply_recipe
from linter.reshape.recipe import Recipe
from linter.reshape.steps import STEPS, RecipeError


def as_grid(frame: pd.DataFrame) -> Grid:
    body = [[None if v is None else str(v) for v in row] for row in frame.itertuples(index=False)]
    return [[str(c) for c in frame.columns], *body]


@pytest.mark.parametrize(("case", "grid", "steps", "expected"), STEP_CASES, ids=[c[0] for c in STEP_CASES])
def test_step_gives_expected_table(
    case: str, grid: Grid, steps: list[dict[str, Any]], expected: Grid
) -> None:
    table = table_of(grid)
    before = table.grid.copy()
    reshaped = apply_recipe(table, Recipe.from_json(recipe_json(*steps)))
    assert list(reshaped.tables) == ["vb_counts"]
    assert as_grid(reshaped.tables["vb_counts"]) == expected
    pd.testing.assert_frame_equal(table.grid, before)  # the input is never touched


@pytest.mark.parametrize(
    ("case", "grid", "steps", "fragment"), BAD_STEP_CASES, ids=[c[0] for c in BAD_STEP_CASES]
)
def test_step_that_does_not_fit_is_a_one_line_error(
    case: str, grid: Grid, steps: list[dict[str, Any]], fragment: str
) -> None:
    with pytest.raises(RecipeError) as caught:
        apply_recipe(table_of(grid), Recipe.from_json(recipe_json(*steps)))
    message = str(caught.value)
    assert fragment in message and "\n" not in message
    assert message.startswith("recipe step ")


def test_every_step_of_the_vocabulary_is_registered() -> None:
    basic = {
        "drop_rows",
        "drop_columns",
        "transpose",
        "header",
        "lift_titles",
        "fill_down",
        "gather",
        "gather_groups",
        "spread",
        "split_column",
        "explode",
        "add_row_id",
        "rename",
    }
    assert basic <= set(STEPS)


def test_provenance_names_the_input_cell_and_header_derived_values() -> None:
    table = table_of([["site", "2019", "2020"], ["VB-014", "3", "4"]], rows=(5, 6))
    reshaped = apply_recipe(
        table,
        Recipe.from_json(
            recipe_json(
                {"step": "gather", "columns": ["2019", "2020"], "names_to": "year", "values_to": "count"}
            )
        ),
    )
    second = reshaped.origin("vb_counts", 1, "count")
    year = reshaped.origin("vb_counts", 1, "year")
    assert second is not None and (second.row, second.letter, second.role) == (6, "C", "value")
    assert year is not None and (year.row, year.letter, year.role) == (5, "C", "header")
    assert reshaped.rows["vb_counts"] == (6, 6)


def test_spread_collision_is_reported_not_collapsed() -> None:
    table = table_of([["site", "measure", "value"], ["VB-014", "ph", "7.1"], ["VB-014", "ph", "7.3"]])
    reshaped = apply_recipe(
        table,
        Recipe.from_json(recipe_json({"step": "spread", "names_from": "measure", "values_from": "value"})),
    )
    assert [n.kind for n in reshaped.notes] == ["collision"]
    lost = reshaped.index.decode(reshaped.notes[0].codes[0])
    assert lost is not None and (lost.row, lost.letter) == (3, "C")
