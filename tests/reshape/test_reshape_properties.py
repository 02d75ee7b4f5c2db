"""Properties over generated tables: gather then spread gives the table back; the audit's books balance."""

from __future__ import annotations

from dataclasses import dataclass, replace

import pandas as pd
from hypothesis import given, settings
from hypothesis import strategies as st
from reshape_cases import Grid, recipe_json, table_of

from linter.reshape.apply import apply_recipe
from linter.reshape.audit import audit
from linter.reshape.recipe import Recipe
from linter.reshape.sheet import Bench
from linter.reshape.steps import STEPS, StepParams, register_bench_step

cell = st.one_of(st.none(), st.text(alphabet="abc 0123,.;", min_size=1, max_size=5))


@st.composite
def wide_grids(draw: st.DrawFn) -> Grid:
    n_rows = draw(st.integers(min_value=1, max_value=6))
    n_cols = draw(st.integers(min_value=1, max_value=4))
    header = ["site", *[f"20{20 + j}" for j in range(n_cols)]]
    body = [[f"VB-{i:03d}", *[draw(cell) for _ in range(n_cols)]] for i in range(n_rows)]
    return [header, *body]


@settings(max_examples=25, deadline=None)
@given(wide_grids())
def test_gather_then_spread_gives_the_table_back(grid: Grid) -> None:
    # Common practice (no source): melt and pivot are inverse when the ids identify a row.
    table = table_of(grid)
    recipe = Recipe.from_json(
        recipe_json(
            {"step": "gather", "columns": grid[0][1:], "names_to": "year", "values_to": "v"},
            {"step": "spread", "names_from": "year", "values_from": "v"},
        )
    )
    out = apply_recipe(table, recipe).tables["vb_counts"]
    rows = [[None if v is None else str(v) for v in r] for r in out.itertuples(index=False)]
    assert [list(map(str, out.columns)), *rows] == grid
    assert audit(table, apply_recipe(table, recipe), recipe).lossless


@settings(max_examples=25, deadline=None)
@given(wide_grids(), st.data())
def test_audit_accounts_for_every_non_empty_cell(grid: Grid, data: st.DataObject) -> None:
    table = table_of(grid)
    rows = data.draw(st.lists(st.integers(min_value=2, max_value=len(grid)), unique=True, max_size=3))
    reason = data.draw(st.sampled_from(["blank", "notes"]))
    keep_empty = data.draw(st.booleans())
    steps = [{"step": "drop_rows", "rows": rows, "reason": reason}] if rows else []
    steps.append(
        {
            "step": "gather",
            "columns": grid[0][1:],
            "names_to": "year",
            "values_to": "v",
            "keep_empty": keep_empty,
        }
    )
    recipe = Recipe.from_json(recipe_json(*steps))
    result = audit(table, apply_recipe(table, recipe), recipe)
    filled = sum(1 for row in grid for v in row if v is not None and v.strip())
    assert sum(result.kept.values()) + len(result.dropped) + len(result.lost) == result.input_cells == filled
    dropped_text = [v for r in rows for v in grid[r - 1] if v is not None and v.strip()]
    if reason == "blank":  # a row dropped as blank that holds text is always loss
        assert len(result.lost) >= len(dropped_text)
    elif keep_empty:
        assert result.lossless


@dataclass(frozen=True)
class KeepFirstRows(StepParams):
    """Test-only step: split off the first `rows` body rows into a table of their own."""

    step = "test_split_head"
    rows: int


def test_a_step_registered_from_another_module_takes_part_in_apply_and_audit() -> None:
    def split_head(p: KeepFirstRows, bench: Bench) -> Bench:
        ((name, sheet),) = bench.sheets.items()
        head = sheet.with_frames(
            sheet.cells.iloc[: p.rows], sheet.origin.iloc[: p.rows], sheet.rows[: p.rows]
        )
        rest = sheet.with_frames(
            sheet.cells.iloc[p.rows :], sheet.origin.iloc[p.rows :], sheet.rows[p.rows :]
        )
        return replace(bench, sheets={f"{name}_head": head, f"{name}_rest": rest})

    register_bench_step(KeepFirstRows, grid_level=False, code=lambda p: [f"df = df.iloc[:{p.rows}]"])(
        split_head
    )
    try:
        table = table_of([["site", "n"], ["VB-014", "3"], ["VB-015", "4"], ["VB-016", "5"]])
        recipe = Recipe.from_json(recipe_json({"step": "test_split_head", "rows": 1}))
        reshaped = apply_recipe(table, recipe)
        assert {k: len(v) for k, v in reshaped.tables.items()} == {"vb_counts_head": 1, "vb_counts_rest": 2}
        assert reshaped.rows["vb_counts_rest"] == (3, 4)
        origins = [reshaped.origin("vb_counts_rest", i, "n") for i in range(2)]
        assert [(o.row, o.letter) for o in origins if o] == [(3, "B"), (4, "B")]
        assert audit(table, reshaped, recipe).lossless
        pd.testing.assert_frame_equal(
            table.grid, table_of([["site", "n"], ["VB-014", "3"], ["VB-015", "4"], ["VB-016", "5"]]).grid
        )
    finally:
        del STEPS["test_split_head"]
