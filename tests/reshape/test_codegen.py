"""The generated pandas code gives the same table as apply_recipe (our own generated code is executed)."""

from __future__ import annotations

import csv
import subprocess
import sys
from pathlib import Path
from typing import Any

import pandas as pd
import pytest
from reshape_cases import STEP_CASES, Grid, recipe_json, table_of

from linter.reshape.apply import apply_recipe
from linter.reshape.codegen import pandas_code
from linter.reshape.recipe import Recipe


def write_csv(path: Path, grid: Grid) -> None:
    with path.open("w", newline="", encoding="utf-8") as handle:
        csv.writer(handle).writerows([["" if v is None else v for v in row] for row in grid])


def cells(frame: pd.DataFrame) -> list[list[str | None]]:
    rows = [
        [None if v is None or (isinstance(v, float) and pd.isna(v)) else str(v) for v in r]
        for r in frame.itertuples(index=False)
    ]
    return [[str(c) for c in frame.columns], *rows]


def run_generated(code: str) -> pd.DataFrame:
    namespace: dict[str, Any] = {"__name__": "weir_generated"}
    exec(compile(code, "generated_recipe.py", "exec"), namespace)  # our own generated code, tests only
    frame = namespace["df"]
    assert isinstance(frame, pd.DataFrame)
    return frame


@pytest.mark.parametrize(("case", "grid", "steps", "expected"), STEP_CASES, ids=[c[0] for c in STEP_CASES])
def test_generated_code_matches_apply(
    case: str, grid: Grid, steps: list[dict[str, Any]], expected: Grid, tmp_path: Path
) -> None:
    # A CSV cannot hold a ragged or wholly empty trailing column differently from the grid,
    # so each case is written out and read back by the script exactly as Weir's grid holds it.
    write_csv(tmp_path / "vb_counts.csv", grid)
    recipe = Recipe.from_json(recipe_json(*steps))
    ours = apply_recipe(table_of(grid), recipe).tables["vb_counts"]
    theirs = run_generated(pandas_code(recipe, "vb_counts.csv"))
    assert cells(theirs) == cells(ours) == expected


def test_generated_multi_step_script_runs_as_a_program(tmp_path: Path) -> None:
    grid: Grid = [
        ["Vell Basin volunteer counts", None, None],
        ["site", "2024", "2025"],
        ["VB-014", "3", None],
        [None, "5", "2"],
        ["Total", "8", "2"],
    ]
    write_csv(tmp_path / "counts.csv", grid)
    recipe = Recipe.from_json(
        recipe_json(
            {"step": "drop_rows", "rows": [1], "reason": "title"},
            {"step": "drop_rows", "rows": [5], "reason": "total"},
            {"step": "header", "rows": [2]},
            {"step": "fill_down", "columns": ["site"]},
            {"step": "add_row_id", "name": "line"},
            {"step": "gather", "columns": ["2024", "2025"], "names_to": "year", "values_to": "count"},
        )
    )
    (tmp_path / "tidy.py").write_text(pandas_code(recipe, "counts.csv", "counts_tidy.csv"), encoding="utf-8")
    done = subprocess.run(
        [sys.executable, "tidy.py"], cwd=tmp_path, capture_output=True, text=True, timeout=60
    )
    assert done.returncode == 0, done.stderr
    theirs = pd.read_csv(tmp_path / "counts_tidy.csv", dtype=str, keep_default_na=False)
    ours = apply_recipe(table_of(grid, "counts.csv"), recipe).tables["counts"].fillna("")
    assert cells(theirs) == cells(ours)
    assert cells(ours)[1:3] == [["3", "VB-014", "2024", "3"], ["3", "VB-014", "2025", ""]]


@pytest.mark.parametrize("suffix", [".tsv", ".xlsx"])
def test_generated_code_reads_tsv_and_excel_sheets(suffix: str, tmp_path: Path) -> None:
    grid: Grid = [[None, None, None], ["site", "2024", "2025"], ["VB-014", "3", None], ["VB-015", "5", "2"]]
    if suffix == ".tsv":
        with (tmp_path / "counts.tsv").open("w", newline="", encoding="utf-8") as handle:
            csv.writer(handle, delimiter="\t").writerows([["" if v is None else v for v in r] for r in grid])
    else:
        openpyxl = pytest.importorskip("openpyxl")
        book = openpyxl.Workbook()
        sheet = book.active
        sheet.title = "Counts 2025"
        for r, row in enumerate(grid, start=1):
            for c, value in enumerate(row, start=1):
                if value is not None:
                    sheet.cell(row=r, column=c, value=value)
        book.save(tmp_path / "counts.xlsx")
    recipe = Recipe.from_json(
        recipe_json(
            {"step": "drop_rows", "rows": [1], "reason": "blank"},
            {"step": "gather", "columns": ["2024", "2025"], "names_to": "year", "values_to": "count"},
        )
    )
    ours = apply_recipe(table_of(grid, f"counts{suffix}"), recipe).tables["counts"]
    theirs = run_generated(
        pandas_code(recipe, f"counts{suffix}", sheet="Counts 2025" if suffix == ".xlsx" else None)
    )
    assert cells(theirs) == cells(ours)
    assert len(ours) == 4
