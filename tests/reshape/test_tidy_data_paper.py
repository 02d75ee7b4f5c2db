"""Outside check: worked examples of "Tidy Data" (H. Wickham, Journal of Statistical Software 59(10),
2014), re-typed as small fixtures; each recipe must give the paper's tidy form, losing nothing.

The tables are re-typed from memory of the paper (no copy of it is at hand here): excerpts
only, with the columns named as printed there. Where the paper goes beyond reshaping (it
recodes age "014" to "0-14" and joins year, month and day into a date) the expected form
stops at the reshaping."""

from __future__ import annotations

from collections import Counter
from typing import Any

from reshape_cases import Grid, recipe_json, table_of

from linter.reshape.recipe import Recipe
from linter.reshape.tidy import tidy_with_recipe


def tidy(grid: Grid, *steps: dict[str, Any]) -> Grid:
    reshaped, audit = tidy_with_recipe(table_of(grid, "paper.csv"), Recipe.from_json(recipe_json(*steps)))
    assert audit.lossless, audit.lost[:5]
    frame = reshaped.tables["paper"]
    return [list(map(str, frame.columns)), *[list(r) for r in frame.itertuples(index=False)]]


# From memory of Wickham (2014) Table 4: Pew Forum income by religion, first rows and columns.
PEW: Grid = [
    ["religion", "<$10k", "$10-20k", "$20-30k", "$30-40k", "$40-50k", "$50-75k"],
    ["Agnostic", "27", "34", "60", "81", "76", "137"],
    ["Atheist", "12", "27", "37", "52", "35", "70"],
    ["Buddhist", "27", "21", "30", "34", "33", "58"],
    ["Catholic", "418", "617", "732", "670", "638", "1116"],
]


def test_pew_column_headers_are_values_table_4_to_table_6() -> None:
    # Source: Wickham (2014) §3.1, Table 4 molten into Table 6 (religion, income, freq).
    out = tidy(PEW, {"step": "gather", "columns": PEW[0][1:], "names_to": "income", "values_to": "freq"})
    assert out[0] == ["religion", "income", "freq"]
    assert out[1:8] == [
        ["Agnostic", "<$10k", "27"],
        ["Agnostic", "$10-20k", "34"],
        ["Agnostic", "$20-30k", "60"],
        ["Agnostic", "$30-40k", "81"],
        ["Agnostic", "$40-50k", "76"],
        ["Agnostic", "$50-75k", "137"],
        ["Atheist", "<$10k", "12"],
    ]
    assert len(out) - 1 == 4 * 6


# From memory of Wickham (2014) Table 9: tuberculosis counts, first rows; "—" there is empty here.
TB: Grid = [
    ["country", "year", "m014", "m1524", "m2534", "m3544", "m4554", "m5564", "m65", "mu", "f014"],
    ["AD", "2000", "0", "0", "1", "0", "0", "0", "0", None, None],
    ["AE", "2000", "2", "4", "4", "6", "5", "12", "10", None, "3"],
    ["AF", "2000", "52", "228", "183", "149", "129", "94", "80", None, "93"],
]


def test_tuberculosis_several_variables_in_headers_table_9_to_table_10() -> None:
    # Source: Wickham (2014) §3.2, Table 9 molten (Table 10a, missing values dropped) and the
    # column split into sex and age (Table 10b).
    out = tidy(
        TB,
        {
            "step": "gather",
            "columns": TB[0][2:],
            "names_to": "column",
            "values_to": "cases",
            "keep_empty": False,
        },
        {
            "step": "split_column",
            "column": "column",
            "pattern": r"^(?P<sex>[mf])(?P<age>u|\d+)$",
            "into": ["sex", "age"],
        },
    )
    assert out[0] == ["country", "year", "sex", "age", "cases"]
    assert out[1:4] == [
        ["AD", "2000", "m", "014", "0"],
        ["AD", "2000", "m", "1524", "0"],
        ["AD", "2000", "m", "2534", "1"],
    ]
    assert ["AE", "2000", "f", "014", "3"] in out
    assert len(out) - 1 == 7 + 8 + 8  # Table 10 keeps no row for the empty "mu" and AD "f014" cells


# From memory of Wickham (2014) Table 11: daily weather of station MX17004, only the day
# columns that hold a value in the rows shown (the paper prints d1 ... d8 and says more follow).
WEATHER: Grid = [
    ["id", "year", "month", "element", "d2", "d3", "d5", "d10", "d11", "d16", "d23", "d27", "d30"],
    ["MX17004", "2010", "1", "tmax", None, None, None, None, None, None, None, None, "27.8"],
    ["MX17004", "2010", "1", "tmin", None, None, None, None, None, None, None, None, "14.5"],
    ["MX17004", "2010", "2", "tmax", "27.3", "24.1", None, None, "29.7", None, "29.9", None, None],
    ["MX17004", "2010", "2", "tmin", "14.4", "14.4", None, None, "13.4", None, "10.7", None, None],
    ["MX17004", "2010", "3", "tmax", None, None, "32.1", "34.5", None, "31.1", None, None, None],
    ["MX17004", "2010", "3", "tmin", None, None, "14.2", "16.8", None, "17.6", None, None, None],
    ["MX17004", "2010", "4", "tmax", None, None, None, None, None, None, None, "36.3", None],
    ["MX17004", "2010", "4", "tmin", None, None, None, None, None, None, None, "16.7", None],
    ["MX17004", "2010", "5", "tmax", None, None, None, None, None, None, None, "33.2", None],
    ["MX17004", "2010", "5", "tmin", None, None, None, None, None, None, None, "18.2", None],
]


def test_weather_variables_in_rows_and_columns_table_11_to_table_12() -> None:
    # Source: Wickham (2014) §3.3: Table 11 molten on the day columns (Table 12a), then the
    # element column cast into tmax and tmin (Table 12b, here with month and day, not a date).
    out = tidy(
        WEATHER,
        {
            "step": "gather",
            "columns": WEATHER[0][4:],
            "names_to": "day",
            "values_to": "value",
            "keep_empty": False,
        },
        {"step": "spread", "names_from": "element", "values_from": "value"},
    )
    assert out[0] == ["id", "year", "month", "day", "tmax", "tmin"]
    expected = [
        ["MX17004", "2010", "1", "d30", "27.8", "14.5"],
        ["MX17004", "2010", "2", "d2", "27.3", "14.4"],
        ["MX17004", "2010", "2", "d3", "24.1", "14.4"],
        ["MX17004", "2010", "2", "d11", "29.7", "13.4"],
        ["MX17004", "2010", "2", "d23", "29.9", "10.7"],
        ["MX17004", "2010", "3", "d5", "32.1", "14.2"],
        ["MX17004", "2010", "3", "d10", "34.5", "16.8"],
        ["MX17004", "2010", "3", "d16", "31.1", "17.6"],
        ["MX17004", "2010", "4", "d27", "36.3", "16.7"],
        ["MX17004", "2010", "5", "d27", "33.2", "18.2"],
    ]
    assert out[1:] == expected  # Table 12b's ten rows, in its (date) order
    assert Counter(map(tuple, out[1:])) == Counter(map(tuple, expected))
