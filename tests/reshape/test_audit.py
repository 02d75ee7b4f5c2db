"""The value-conservation audit: kept, deliberately dropped and lost cells, each counted and named."""

from __future__ import annotations

from typing import Any

import pytest
from reshape_cases import STEP_CASES, Grid, recipe_json, table_of

from linter.reshape.apply import apply_recipe
from linter.reshape.audit import Audit, audit
from linter.reshape.recipe import Recipe


def audit_of(grid: Grid, *steps: dict[str, Any]) -> Audit:
    table = table_of(grid)
    return audit(table, apply_recipe(table, Recipe.from_json(recipe_json(*steps))), None)


def lost_places(result: Audit) -> list[tuple[int, str, str]]:
    return sorted((c.row, c.letter, c.text) for c in result.lost)


# Every worked step case either keeps every cell or drops it for a stated reason.
@pytest.mark.parametrize(("case", "grid", "steps", "expected"), STEP_CASES, ids=[c[0] for c in STEP_CASES])
def test_every_step_case_is_lossless(
    case: str, grid: Grid, steps: list[dict[str, Any]], expected: Grid
) -> None:
    result = audit_of(grid, *steps)
    assert result.lossless, lost_places(result)
    filled = sum(1 for row in grid for v in row if v is not None and v.strip())
    assert result.input_cells == filled
    assert sum(result.kept.values()) + len(result.dropped) == filled


def test_gather_counts_header_derived_values() -> None:
    result = audit_of(
        [["site", "2019", "2020"], ["VB-014", "3", "4"], ["VB-015", "5", "6"]],
        {"step": "gather", "columns": ["2019", "2020"], "names_to": "year", "values_to": "count"},
    )
    assert result.kept["header_value"] == 2 and result.kept["value"] == 6 and result.kept["column_name"] == 1


def test_lossy_recipe_is_caught_with_every_lost_cell() -> None:
    # Deliberately lossy: the values of row 3 are dropped under the false reason "blank".
    result = audit_of(
        [["site", "count"], ["VB-014", "3"], ["VB-015", "4"]],
        {"step": "drop_rows", "rows": [3], "reason": "blank"},
    )
    assert not result.lossless
    assert lost_places(result) == [(3, "A", "VB-015"), (3, "B", "4")]
    assert {c.why for c in result.lost} == {"dropped as blank, but the cell holds text"}


def test_gather_that_drops_a_column_header_then_spread_collision_is_lost() -> None:
    result = audit_of(
        [["site", "measure", "value"], ["VB-014", "ph", "7.1"], ["VB-014", "ph", "7.3"]],
        {"step": "spread", "names_from": "measure", "values_from": "value"},
    )
    assert not result.lossless and result.collisions == 1
    assert lost_places(result) == [(3, "C", "7.3")]
    assert {c.why for c in result.dropped} == {"layout label"}  # the 'measure'/'value' headers


def test_title_row_with_more_than_its_title_loses_the_rest() -> None:
    result = audit_of(
        [["site", "ph"], ["Upper Vell", "see note 2"], ["VB-014", "7.1"]],
        {"step": "header", "rows": [1]},
        {"step": "lift_titles", "rows": [2], "into": "reach"},
    )
    assert lost_places(result) == [(2, "B", "see note 2")]


def test_title_with_no_rows_below_is_lost() -> None:
    result = audit_of(
        [["site", "ph"], ["VB-014", "7.1"], ["Lower Vell", None]],
        {"step": "header", "rows": [1]},
        {"step": "lift_titles", "rows": [3], "into": "reach"},
    )
    assert lost_places(result) == [(3, "A", "Lower Vell")]


def test_total_that_the_data_recomputes_is_a_deliberate_drop() -> None:
    grid: Grid = [
        ["site", "count"],
        ["VB-014", "3"],
        ["VB-015", "4"],
        ["Subtotal", "7"],
        ["VB-016", "1.5"],
        ["Subtotal", "1.5"],
    ]
    result = audit_of(grid, {"step": "drop_rows", "rows": [4, 6], "reason": "total"})
    assert result.lossless
    assert sorted((c.row, c.letter, c.why) for c in result.dropped) == [
        (4, "A", "total"),
        (4, "B", "total"),
        (6, "A", "total"),
        (6, "B", "total"),
    ]


def test_total_that_does_not_add_up_is_lost() -> None:
    grid: Grid = [["site", "count"], ["VB-014", "3"], ["VB-015", "4"], ["Total", "8"]]
    result = audit_of(grid, {"step": "drop_rows", "rows": [4], "reason": "total"})
    assert lost_places(result) == [(4, "B", "8")]
    assert "sum to 7" in result.lost[0].why


# Common practice (no source): a pivot table's grand total column and row, as spreadsheet
# pivot tables print them; each total must be recomputed from the kept numbers.
PIVOT: Grid = [
    ["district", "2022", "2023", "Grand Total"],
    ["Kessel", "410", "455", "865"],
    ["Brannoch", "220", "241", "461"],
    ["Grand Total", "630", "696", "1326"],
]
PIVOT_DROPS = (
    {"step": "drop_rows", "rows": [4], "reason": "total"},
    {"step": "drop_columns", "columns": ["D"], "reason": "total"},
)


def test_total_column_and_grand_total_that_add_up_are_deliberate_drops() -> None:
    result = audit_of(PIVOT, *PIVOT_DROPS)
    assert result.lossless, lost_places(result)
    assert {(c.row, c.letter) for c in result.dropped} >= {(2, "D"), (3, "D"), (4, "D"), (4, "B")}


def test_total_column_that_does_not_add_up_is_lost() -> None:
    grid = [row[:] for row in PIVOT]
    grid[2][3] = "462"  # 220 + 241 = 461; the grand total 1326 no longer matches the column either
    result = audit_of(grid, *PIVOT_DROPS)
    assert (3, "D", "462") in lost_places(result)


def test_ditto_marks_filled_down_are_listed_as_dropped() -> None:
    # Common practice (no source): `"` under a value means the value above; once filled in, the
    # mark itself is listed with the reason `ditto`, and nothing else goes.
    grid: Grid = [["bus", "stop"], ["12", "Quay End"], ['"', "Mill Yard"], ["14", "Depot"]]
    result = audit_of(grid, {"step": "fill_down", "columns": ["bus"], "marks": ['"']})
    assert result.lossless, lost_places(result)
    assert [(c.row, c.letter, c.why) for c in result.dropped] == [(3, "A", "ditto")]


def test_split_counts_unmatched_cells_and_keeps_their_text() -> None:
    result = audit_of(
        [["result"], ["12 mg/L"], ["n.d."], ["<0.5 mg/L"]],
        {
            "step": "split_column",
            "column": "result",
            "pattern": r"^(?P<value>[0-9.]+)\s*(?P<unit>\S+)$",
            "into": ["value", "unit"],
        },
    )
    assert result.unmatched == 2 and result.lossless
    assert result.kept["part"] == 1 and result.kept["value"] == 2


def test_split_pattern_that_spells_out_a_unit_lists_the_left_out_text() -> None:
    # "mg/L" is consumed by the pattern's literal part: the number lives on, the unit is
    # listed as left out (trimmed) so the provider sees it, but no digit went missing.
    result = audit_of(
        [["result"], ["12 mg/L"]],
        {
            "step": "split_column",
            "column": "result",
            "pattern": r"^(?P<value>[0-9.]+) mg/L$",
            "into": ["value"],
        },
    )
    assert result.lossless and result.kept["part"] == 1
    assert [(c.row, c.letter, c.why) for c in result.trimmed] == [(2, "A", "kept as '12'; left out 'mg/L'")]


def test_split_pattern_that_cuts_a_number_short_is_loss() -> None:
    # Deliberately lossy: the unanchored group takes one digit of "12", the rest is dropped.
    result = audit_of(
        [["result"], ["12 mg/L"], ["7 mg/L"]],
        {"step": "split_column", "column": "result", "pattern": r"(?P<value>\d)", "into": ["value"]},
    )
    assert lost_places(result) == [(2, "A", "12 mg/L")]
    assert result.lost[0].why == "kept as '1'; left out '2 mg/L'"
    assert [c.text for c in result.trimmed] == ["7 mg/L"]


def test_separators_left_out_by_explode_and_ranges_are_not_listed() -> None:
    result = audit_of(
        [["taxa", "depth"], ["mayfly; stonefly", "3 to 5"]],
        {"step": "explode", "column": "taxa", "separator": ";"},
        {
            "step": "split_column",
            "column": "depth",
            "pattern": r"^(?P<lo>\d+)\s*(?:-|to)\s*(?P<hi>\d+)$",
            "into": ["lo", "hi"],
        },
    )
    # " to " holds letters: a range word is listed as trimmed, the ";" of the list is not
    assert result.lossless and [c.text for c in result.trimmed] == ["3 to 5"]


def test_rename_is_kept_on_purpose_and_audit_json_is_ready() -> None:
    result = audit_of([["Temp (C)"], ["8.5"]], {"step": "rename", "columns": {"Temp (C)": "water_temp"}})
    assert result.kept["renamed"] == 1 and result.lossless
    data = result.to_json()
    assert data["lossless"] is True and data["counts"]["input_cells"] == 2


def test_audit_refuses_a_result_of_another_table() -> None:
    table = table_of([["a"], ["1"]])
    other = table_of([["a"], ["1"]])
    with pytest.raises(ValueError, match="not made from this table"):
        audit(other, apply_recipe(table, Recipe()), None)


def test_gather_dropping_empty_cells_lists_an_all_empty_column_header_as_dropped() -> None:
    result = audit_of(
        [["site", "2019", "2020"], ["VB-014", "3", None]],
        {
            "step": "gather",
            "columns": ["2019", "2020"],
            "names_to": "year",
            "values_to": "n",
            "keep_empty": False,
        },
    )
    assert result.lossless
    assert [(c.row, c.letter, c.text, c.why) for c in result.dropped] == [
        (1, "C", "2020", "header with no values")
    ]


def test_spread_merges_equal_identifying_cells_without_loss() -> None:
    result = audit_of(
        [["site", "measure", "value"], ["VB-014", "tmin", "4"], ["VB-014", "tmax", "11"]],
        {"step": "spread", "names_from": "measure", "values_from": "value"},
    )
    assert result.lossless and result.kept["value"] == 4  # both 'VB-014' cells and both values


def test_gather_on_a_header_only_table_drops_the_gathered_headers_on_purpose() -> None:
    # Found by the property test (twice: once again after a speed-up): no body row is left.
    result = audit_of(
        [["site", "2020"]], {"step": "gather", "columns": ["2020"], "names_to": "y", "values_to": "n"}
    )
    assert result.lossless
    assert [(c.row, c.letter, c.why) for c in result.dropped] == [(1, "B", "header with no values")]
