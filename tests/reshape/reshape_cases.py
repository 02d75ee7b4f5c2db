"""Tiny invented Vell Basin Water Network sheets and the recipes that reshape them (shared by tests)."""

from __future__ import annotations

from typing import Any

import pandas as pd

from linter.table import Table

Grid = list[list[str | None]]


def table_of(grid: Grid, source: str = "vb_counts.csv", rows: tuple[int, ...] | None = None) -> Table:
    """A Table as the reader would give it: text or None, positional columns, row numbers 1..n."""
    frame = pd.DataFrame(grid, dtype=object)
    frame = frame.where(frame.notna(), None)
    return Table(source, None, frame, rows or tuple(range(1, len(grid) + 1)))


def recipe_json(*steps: dict[str, Any]) -> dict[str, Any]:
    return {"weir_recipe": 1, "steps": list(steps)}


# Each case: id, input grid, steps, expected output (header row first, then body rows).
STEP_CASES: list[tuple[str, Grid, list[dict[str, Any]], Grid]] = [
    (
        "drop_rows-total-and-notes",
        [["site", "count"], ["VB-014", "3"], ["VB-015", "4"], ["Total", "7"], ["Counts by volunteers", None]],
        [
            {"step": "drop_rows", "rows": [4], "reason": "total"},
            {"step": "drop_rows", "rows": [5], "reason": "notes"},
        ],
        [["site", "count"], ["VB-014", "3"], ["VB-015", "4"]],
    ),
    (
        "drop_columns-blank",
        [["site", None, "count"], ["VB-014", None, "3"]],
        [{"step": "drop_columns", "columns": ["B"], "reason": "blank"}],
        [["site", "count"], ["VB-014", "3"]],
    ),
    (
        "transpose-sideways",
        [["site", "VB-014", "VB-015"], ["river", "Vell", "Orra"]],
        [{"step": "transpose"}],
        [["site", "river"], ["VB-014", "Vell"], ["VB-015", "Orra"]],
    ),
    (
        "header-two-rows-carry-right",
        [["Nitrate", None, "Phosphate", None], ["min", "max", "min", "max"], ["0.1", "0.9", "0.02", "0.05"]],
        [{"step": "header", "rows": [1, 2], "joiner": "_"}],
        [["Nitrate_min", "Nitrate_max", "Phosphate_min", "Phosphate_max"], ["0.1", "0.9", "0.02", "0.05"]],
    ),
    (
        "header-names-for-headerless-file",
        [["VB-014", "3"], ["VB-015", "4"]],
        [{"step": "header", "rows": [], "names": ["site_id", "count"]}],
        [["site_id", "count"], ["VB-014", "3"], ["VB-015", "4"]],
    ),
    (
        "lift_titles-reaches",
        [["site", "ph"], ["Upper Vell", None], ["VB-014", "7.1"], ["Lower Vell", None], ["VB-031", "6.8"]],
        [{"step": "header", "rows": [1]}, {"step": "lift_titles", "rows": [2, 4], "into": "reach"}],
        [["reach", "site", "ph"], ["Upper Vell", "VB-014", "7.1"], ["Lower Vell", "VB-031", "6.8"]],
    ),
    (
        "fill_down-merged-site",
        [["site", "analyte"], ["VB-014", "nitrate"], [None, "phosphate"], ["VB-015", "nitrate"]],
        [{"step": "fill_down", "columns": ["site"]}],
        [["site", "analyte"], ["VB-014", "nitrate"], ["VB-014", "phosphate"], ["VB-015", "nitrate"]],
    ),
    (
        "gather-years-keep-empty",
        [["site", "2019", "2020"], ["VB-014", "3", None]],
        [{"step": "gather", "columns": ["2019", "2020"], "names_to": "year", "values_to": "count"}],
        [["site", "year", "count"], ["VB-014", "2019", "3"], ["VB-014", "2020", None]],
    ),
    (
        "gather-years-drop-empty",
        [["site", "2019", "2020"], ["VB-014", "3", None]],
        [
            {
                "step": "gather",
                "columns": ["2019", "2020"],
                "names_to": "year",
                "values_to": "count",
                "keep_empty": False,
            }
        ],
        [["site", "year", "count"], ["VB-014", "2019", "3"]],
    ),
    (
        "gather_groups-samples",
        [
            ["site", "Sample 1 Depth", "Sample 1 Result", "Sample 2 Depth", "Sample 2 Result"],
            ["VB-014", "0.5", "12", "2.0", "9"],
        ],
        [
            {
                "step": "gather_groups",
                "pattern": r"^Sample (?P<sample>\d+) (?P<member>.+)$",
                "names_to": "sample",
            }
        ],
        [["site", "sample", "Depth", "Result"], ["VB-014", "1", "0.5", "12"], ["VB-014", "2", "2.0", "9"]],
    ),
    (
        "spread-measures",
        [["site", "measure", "value"], ["VB-014", "temp_min", "4"], ["VB-014", "temp_max", "11"]],
        [{"step": "spread", "names_from": "measure", "values_from": "value"}],
        [["site", "temp_min", "temp_max"], ["VB-014", "4", "11"]],
    ),
    (
        "split_column-value-unit",
        [["site", "result"], ["VB-014", "12 mg/L"], ["VB-015", "n.d."]],
        [
            {
                "step": "split_column",
                "column": "result",
                "pattern": r"^(?P<value>-?[0-9.]+)\s*(?P<unit>\S+)$",
                "into": ["value", "unit"],
            }
        ],
        [["site", "value", "unit"], ["VB-014", "12", "mg/L"], ["VB-015", "n.d.", None]],
    ),
    (
        "explode-species",
        [["site", "species"], ["VB-014", "mayfly; stonefly ;caddisfly"], ["VB-015", None]],
        [{"step": "explode", "column": "species", "separator": ";"}],
        [
            ["site", "species"],
            ["VB-014", "mayfly"],
            ["VB-014", "stonefly"],
            ["VB-014", "caddisfly"],
            ["VB-015", None],
        ],
    ),
    (
        "add_row_id-then-gather",
        [["2019", "2020"], ["3", "4"]],
        [
            {"step": "add_row_id", "name": "row"},
            {"step": "gather", "columns": ["2019", "2020"], "names_to": "year", "values_to": "count"},
        ],
        [["row", "year", "count"], ["2", "2019", "3"], ["2", "2020", "4"]],
    ),
    (
        "rename-temperature",
        [["site", "Temp (C)"], ["VB-014", "8.5"]],
        [{"step": "rename", "columns": {"Temp (C)": "water_temp"}}],
        [["site", "water_temp"], ["VB-014", "8.5"]],
    ),
]

# Multi-step and corner cases: they run through apply, the audit and the generated code alike.
STEP_CASES += [
    (
        "lift_titles-on-raw-grid-then-header",
        [["site", "ph"], ["Upper Vell", None], ["VB-014", "7.1"], ["VB-015", "7.0"]],
        [{"step": "lift_titles", "rows": [2], "into": "reach"}, {"step": "header", "rows": [1]}],
        [["reach", "site", "ph"], ["Upper Vell", "VB-014", "7.1"], ["Upper Vell", "VB-015", "7.0"]],
    ),
    (
        "gather_groups-missing-member-drop-empty",
        [
            ["site", "Kick 1 taxa", "Kick 1 count", "Kick 2 taxa", "Kick 3 count"],
            ["VB-014", "mayfly", "12", None, None],
            ["VB-015", None, None, "caddisfly", "4"],
        ],
        [
            {
                "step": "gather_groups",
                "pattern": r"^Kick (?P<kick>\d+) (?P<member>\w+)$",
                "names_to": "kick",
                "keep_empty": False,
            }
        ],
        [
            ["site", "kick", "taxa", "count"],
            ["VB-014", "1", "mayfly", "12"],
            ["VB-015", "2", "caddisfly", None],
            ["VB-015", "3", None, "4"],
        ],
    ),
    (
        "spread-two-identifiers-missing-cell",
        [
            ["site", "sampled_on", "analyte", "result"],
            ["VB-014", "2026-01-05", "nitrate", "1.2"],
            ["VB-014", "2026-01-05", "phosphate", "0.04"],
            ["VB-014", "2026-02-03", "nitrate", "1.4"],
        ],
        [{"step": "spread", "names_from": "analyte", "values_from": "result"}],
        [
            ["site", "sampled_on", "nitrate", "phosphate"],
            ["VB-014", "2026-01-05", "1.2", "0.04"],
            ["VB-014", "2026-02-03", "1.4", None],
        ],
    ),
    (
        "two-row-header-then-gather-joined-names",
        [["site", "2025", None], [None, "spring", "autumn"], ["VB-014", "3", "5"]],
        [
            {"step": "header", "rows": [1, 2], "joiner": " "},
            {
                "step": "gather",
                "columns": ["2025 spring", "2025 autumn"],
                "names_to": "season",
                "values_to": "n",
            },
            {
                "step": "split_column",
                "column": "season",
                "pattern": r"^(?P<year>\d{4}) (?P<season>\w+)$",
                "into": ["year", "season"],
            },
        ],
        [
            ["site", "year", "season", "n"],
            ["VB-014", "2025", "spring", "3"],
            ["VB-014", "2025", "autumn", "5"],
        ],
    ),
    (
        "transpose-then-gather",
        [["site", "VB-014", "VB-015"], ["2024", "3", "4"], ["2025", "5", None]],
        [
            {"step": "transpose"},
            {"step": "gather", "columns": ["2024", "2025"], "names_to": "year", "values_to": "count"},
        ],
        [
            ["site", "year", "count"],
            ["VB-014", "2024", "3"],
            ["VB-014", "2025", "5"],
            ["VB-015", "2024", "4"],
            ["VB-015", "2025", None],
        ],
    ),
]

STEP_CASES += [
    (
        "spread-then-add_row_id-keeps-first-row-numbers",
        [
            ["site", "measure", "value"],
            ["VB-014", "tmin", "4"],
            ["VB-015", "tmin", "5"],
            ["VB-014", "tmax", "9"],
        ],
        [
            {"step": "spread", "names_from": "measure", "values_from": "value"},
            {"step": "add_row_id", "name": "row"},
        ],
        [["row", "site", "tmin", "tmax"], ["2", "VB-014", "4", "9"], ["3", "VB-015", "5", None]],
    ),
]

STEP_CASES += [
    (
        "header-row-renamed-to-contract-names",
        [["Vell Basin pH survey", None], ["Site", "pH (field)"], ["VB-014", "7.1"]],
        [
            {"step": "drop_rows", "rows": [1], "reason": "title"},
            {"step": "header", "rows": [2], "names": ["site_id", "ph"]},
        ],
        [["site_id", "ph"], ["VB-014", "7.1"]],
    ),
]

# Each case: id, input grid, steps, a fragment of the one-line error the recipe must give.
BAD_STEP_CASES: list[tuple[str, Grid, list[dict[str, Any]], str]] = [
    ("drop-missing-row", [["a"], ["1"]], [{"step": "drop_rows", "rows": [9], "reason": "blank"}], "row(s) 9"),
    (
        "gather-missing-column",
        [["a"], ["1"]],
        [{"step": "gather", "columns": ["2019"], "names_to": "y", "values_to": "v"}],
        "'2019' are not in the table",
    ),
    (
        "gather-name-clash",
        [["year", "2019"], ["x", "1"]],
        [{"step": "gather", "columns": ["2019"], "names_to": "year", "values_to": "v"}],
        "repeat",
    ),
    (
        "transpose-after-header",
        [["a"], ["1"]],
        [{"step": "header", "rows": [1]}, {"step": "transpose"}],
        "raw grid",
    ),
    (
        "two-headers",
        [["a"], ["1"]],
        [{"step": "header", "rows": [1]}, {"step": "header", "rows": [2]}],
        "already",
    ),
    ("header-names-width", [["a", "b"]], [{"step": "header", "rows": [], "names": ["x"]}], "1 columns"),
    (
        "groups-no-match",
        [["a"], ["1"]],
        [{"step": "gather_groups", "pattern": "^S(?P<s>\\d) (?P<member>.+)$", "names_to": "s"}],
        "no column name matches",
    ),
    ("rename-clash", [["a", "b"], ["1", "2"]], [{"step": "rename", "columns": {"a": "b"}}], "same name"),
]
