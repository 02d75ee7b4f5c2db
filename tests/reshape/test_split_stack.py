"""split_by_unit and stack_files on small invented Vell Basin sheets: outputs, audit, clear errors."""

from __future__ import annotations

from typing import Any

import pandas as pd
import pytest
from reshape_cases import recipe_json, table_of

from linter.reshape.apply import apply_recipe
from linter.reshape.normalise import SplitByUnit, apply_recipe_to_tables, audit_split
from linter.reshape.recipe import Recipe
from linter.reshape.steps import RecipeError
from linter.table import first_row_header

MIXED = [
    ["site_id", "sampled_on", "river", "latitude", "nitrate"],
    ["VB-014", "2026-01-05", "Vell", "52.10", "1.2"],
    ["VB-014", "2026-02-03", "Vell", "52.10", "1.5"],
    ["VB-021", "2026-01-05", "Marrow Beck", "52.31", None],
    ["VB-021", "2026-02-03", "Marrow Beck", "52.31", "0.8"],
    ["VB-030", "2026-01-06", None, "52.40", "2.1"],
]

SPLIT: dict[str, Any] = {
    "step": "split_by_unit",
    "tables": [
        {"name": "sites", "key": ["site_id"], "columns": ["site_id", "river", "latitude"]},
        {
            "name": "samples",
            "key": ["site_id", "sampled_on"],
            "columns": ["site_id", "sampled_on", "nitrate"],
        },
    ],
}


def test_split_gives_one_table_per_unit_and_joins_back_to_the_input() -> None:
    table = table_of(MIXED)
    before = table.grid.copy()
    recipe = Recipe.from_json(recipe_json(SPLIT))
    reshaped = apply_recipe(table, recipe)
    assert set(reshaped.tables) == {"sites", "samples"}
    sites = reshaped.tables["sites"]
    assert sites.values.tolist() == [
        ["VB-014", "Vell", "52.10"],
        ["VB-021", "Marrow Beck", "52.31"],
        ["VB-030", None, "52.40"],
    ]
    assert reshaped.rows["sites"] == (2, 4, 6)  # each site row keeps the provider row it came from
    assert len(reshaped.tables["samples"]) == 5
    audit = audit_split(first_row_header(table).body, reshaped.tables, recipe.steps[0])  # type: ignore[arg-type]
    assert audit.lossless and audit.joined_rows == audit.input_rows == 5
    # The repeated site cells (rows 3 and 5: river and latitude) are on record as repeats, not lost.
    (repeat,) = [d for d in reshaped.dropped if d.reason == "repeat"]
    assert sorted({reshaped.index.decode(c).row for c in repeat.codes}) == [3, 5]  # type: ignore[union-attr]
    assert len(repeat.codes) == 4
    pd.testing.assert_frame_equal(table.grid, before)


def test_audit_notices_a_join_that_does_not_give_back_the_input() -> None:
    step = SplitByUnit.from_json(SPLIT)
    original = first_row_header(table_of(MIXED)).body
    tables = {
        "sites": original[["site_id", "river", "latitude"]].drop_duplicates().iloc[:2],  # VB-030 lost
        "samples": original[["site_id", "sampled_on", "nitrate"]],
    }
    audit = audit_split(original, tables, step)
    assert not audit.lossless
    assert audit.missing == (("VB-030", "2026-01-06", None, "52.40", "2.1"),)


def test_split_refuses_when_a_column_does_not_depend_on_the_key() -> None:
    grid = [row[:] for row in MIXED]
    grid[2][2] = "Vel"  # a typing slip: site VB-014 now has two rivers
    with pytest.raises(RecipeError) as caught:
        apply_recipe(table_of(grid), Recipe.from_json(recipe_json(SPLIT)))
    assert "rows 2, 3 share a site_id" in str(caught.value) and "\n" not in str(caught.value)


@pytest.mark.parametrize(
    ("tables", "fragment"),
    [
        ([{"name": "sites", "key": ["site_id"], "columns": ["site_id", "river", "latitude"]}], "two or more"),
        (
            [
                {"name": "sites", "key": ["site_id"], "columns": ["site_id", "river", "latitude"]},
                {"name": "samples", "key": ["site_id", "sampled_on"], "columns": ["site_id", "sampled_on"]},
            ],
            "'nitrate' go to no table",
        ),
        (
            [
                {"name": "sites", "key": ["depth"], "columns": ["site_id"]},
                {"name": "samples", "key": ["site_id"], "columns": ["site_id"]},
            ],
            "its key must be",
        ),
    ],
)
def test_bad_split_is_a_one_line_error(tables: list[dict[str, Any]], fragment: str) -> None:
    with pytest.raises(RecipeError) as caught:
        apply_recipe(
            table_of(MIXED), Recipe.from_json(recipe_json({"step": "split_by_unit", "tables": tables}))
        )
    assert fragment in str(caught.value) and "\n" not in str(caught.value)


def test_split_shows_as_pandas_code() -> None:
    from linter.reshape.steps import STEPS

    lines = STEPS["split_by_unit"].code(SplitByUnit.from_json(SPLIT))
    frame = first_row_header(table_of(MIXED)).body
    scope: dict[str, Any] = {"df": frame, "pd": pd}
    exec("\n".join(lines), scope)  # the shown code runs and gives the same tables
    assert scope["sites"]["site_id"].tolist() == ["VB-014", "VB-021", "VB-030"]


JANUARY = [["site_id", "nitrate"], ["VB-014", "1.2"], ["VB-021", "0.9"]]
FEBRUARY = [["nitrate", "site_id"], ["1.5", "VB-014"]]


def test_stack_files_adds_the_value_from_each_file_name() -> None:
    files = [table_of(JANUARY, "field/vb_2026-01.csv"), table_of(FEBRUARY, "field/vb_2026-02.csv")]
    step = {
        "step": "stack_files",
        "column": "month",
        "values": {"vb_2026-01.csv": "2026-01", "vb_2026-02.csv": "2026-02"},
    }
    reshaped = apply_recipe_to_tables(files, Recipe.from_json(recipe_json(step)))
    assert list(reshaped.tables) == ["vb_2026"]
    stacked = reshaped.tables["vb_2026"]
    assert stacked.values.tolist() == [
        ["VB-014", "1.2", "2026-01"],
        ["VB-021", "0.9", "2026-01"],
        ["VB-014", "1.5", "2026-02"],
    ]
    assert reshaped.origin("vb_2026", 2, "nitrate").source == "field/vb_2026-02.csv"  # type: ignore[union-attr]
    assert any(n.kind == "from-file-name" for n in reshaped.notes)


def test_stack_files_refuses_files_with_different_columns() -> None:
    files = [table_of(JANUARY, "a.csv"), table_of([["site_id", "ph"], ["VB-014", "7.1"]], "b.csv")]
    step = {"step": "stack_files", "column": "month", "values": {"a.csv": "2026-01", "b.csv": "2026-02"}}
    with pytest.raises(RecipeError) as caught:
        apply_recipe_to_tables(files, Recipe.from_json(recipe_json(step)))
    assert "same columns" in str(caught.value)
