"""Saved recipes: JSON round trip, clear one-line errors for bad files, and the shipped JSON Schema."""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

import jsonschema
import pytest
from reshape_cases import STEP_CASES, recipe_json

from linter.errors import WeirError
from linter.reshape.recipe import Recipe, dump_recipe, load_recipe
from linter.reshape.schema import SCHEMA_PATH, recipe_schema
from linter.reshape.steps import RecipeError

ALL_STEPS = [step for _, _, steps, _ in STEP_CASES for step in steps]


def test_every_case_recipe_survives_a_round_trip(tmp_path: Path) -> None:
    recipe = Recipe.from_json(recipe_json(*ALL_STEPS))
    dump_recipe(recipe, tmp_path / "saved.json")
    again = load_recipe(tmp_path / "saved.json")
    assert again == recipe
    # defaults are written out, so a saved recipe says everything it does
    assert all("step" in s for s in json.loads((tmp_path / "saved.json").read_text())["steps"])


BAD_RECIPES: list[tuple[str, Any, str]] = [
    ("not-an-object", [1, 2], "not a Weir recipe"),
    ("wrong-version", {"weir_recipe": 2, "steps": []}, "format 2 is not supported"),
    ("steps-not-list", {"weir_recipe": 1, "steps": {}}, "must be a list"),
    ("unknown-step", recipe_json({"step": "pivot_longer"}), "unknown step 'pivot_longer'"),
    (
        "missing-parameter",
        recipe_json({"step": "gather", "columns": ["2019"]}),
        "missing parameter 'names_to'",
    ),
    ("unknown-parameter", recipe_json({"step": "transpose", "axis": 1}), "unknown parameter(s) axis"),
    ("bad-reason", recipe_json({"step": "drop_rows", "rows": [3], "reason": "ugly"}), "'ugly' is not one of"),
    (
        "row-as-text",
        recipe_json({"step": "drop_rows", "rows": ["3"], "reason": "blank"}),
        "expected a whole number",
    ),
    (
        "bool-as-row",
        recipe_json({"step": "drop_rows", "rows": [True], "reason": "blank"}),
        "expected a whole number",
    ),
    (
        "bad-regex",
        recipe_json({"step": "split_column", "column": "r", "pattern": "(?P<v>", "into": ["v"]}),
        "not a valid regular expression",
    ),
    (
        "groups-not-into",
        recipe_json({"step": "split_column", "column": "r", "pattern": "(?P<v>.)", "into": ["w"]}),
        "must be the 'into' columns",
    ),
    (
        "group-without-member",
        recipe_json({"step": "gather_groups", "pattern": "(?P<s>\\d)", "names_to": "s"}),
        "group named 'member'",
    ),
    (
        "empty-separator",
        recipe_json({"step": "explode", "column": "c", "separator": ""}),
        "must not be empty",
    ),
    ("header-nothing", recipe_json({"step": "header", "rows": []}), "give the header rows"),
    ("step-name-missing", recipe_json({"rows": [1]}), 'expected an object with a "step" name'),
]


@pytest.mark.parametrize(("case", "data", "fragment"), BAD_RECIPES, ids=[c[0] for c in BAD_RECIPES])
def test_bad_saved_recipe_is_one_clear_line(case: str, data: Any, fragment: str, tmp_path: Path) -> None:
    path = tmp_path / "bad.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    with pytest.raises(RecipeError) as caught:
        load_recipe(path)
    assert isinstance(caught.value, WeirError)  # the CLI boundary turns it into exit code 2
    assert fragment in str(caught.value) and "\n" not in str(caught.value)


def test_unreadable_recipe_files_are_one_line_errors(tmp_path: Path) -> None:
    (tmp_path / "broken.json").write_text("{not json", encoding="utf-8")
    with pytest.raises(RecipeError, match="not valid JSON"):
        load_recipe(tmp_path / "broken.json")
    with pytest.raises(RecipeError, match="cannot read recipe"):
        load_recipe(tmp_path / "absent.json")


def test_shipped_schema_is_the_one_the_steps_describe() -> None:
    assert json.loads(SCHEMA_PATH.read_text(encoding="utf-8")) == recipe_schema(), (
        "regenerate with: python -m linter.reshape.schema"
    )


# Source: JSON Schema 2020-12, checked by the jsonschema reference implementation (not ours).
def test_schema_accepts_every_case_recipe() -> None:
    validator = jsonschema.Draft202012Validator(recipe_schema())
    validator.check_schema(recipe_schema())
    validator.validate(Recipe.from_json(recipe_json(*ALL_STEPS)).to_json())


@pytest.mark.parametrize(("case", "data", "fragment"), BAD_RECIPES[:9], ids=[c[0] for c in BAD_RECIPES[:9]])
def test_schema_rejects_what_the_loader_rejects(case: str, data: Any, fragment: str) -> None:
    # Regex checks (bad pattern, group names) are beyond JSON Schema; the first nine are structural.
    assert not jsonschema.Draft202012Validator(recipe_schema()).is_valid(data)
