"""Outside check: gather, spread, gather_groups and explode agree with pandas' own melt, pivot,
wide_to_long and explode on open datasets shipped inside index packages (loaded offline)."""

from __future__ import annotations

from collections import Counter
from typing import Any

import pandas as pd
import pytest
from reshape_cases import recipe_json

from linter.reshape.recipe import Recipe
from linter.reshape.tidy import tidy_with_recipe
from linter.table import Table

palmerpenguins = pytest.importorskip("palmerpenguins")
vega_datasets = pytest.importorskip("vega_datasets")


def as_text(frame: pd.DataFrame) -> pd.DataFrame:
    """Every cell as text or None, the way Weir's reader hands a file over."""
    out = frame.astype(object).map(lambda v: None if pd.isna(v) else str(v))
    return out.astype(object).where(out.notna(), None)


def table_of_frame(frame: pd.DataFrame, source: str) -> Table:
    text = as_text(frame)
    grid = pd.DataFrame([list(map(str, text.columns)), *text.itertuples(index=False)], dtype=object)
    return Table(source, None, grid.where(grid.notna(), None), tuple(range(1, len(grid) + 1)))


def rows_of(frame: pd.DataFrame, columns: list[str]) -> Counter[tuple[Any, ...]]:
    """Rows as a multiset (order ignored), NaN and None both counted as missing."""
    text = as_text(frame[columns])
    return Counter(tuple(r) for r in text.itertuples(index=False))


def run(frame: pd.DataFrame, source: str, *steps: dict[str, Any], lossless: bool = True) -> pd.DataFrame:
    table = table_of_frame(frame, source)
    reshaped, audit = tidy_with_recipe(table, Recipe.from_json(recipe_json(*steps)))
    if lossless:
        assert audit.lossless, audit.lost[:5]
    (out,) = reshaped.tables.values()
    return out


MEASURES = ["bill_length_mm", "bill_depth_mm", "flipper_length_mm", "body_mass_g"]


@pytest.mark.parametrize("keep_empty", [True, False])
def test_gather_equals_pandas_melt_on_palmer_penguins(keep_empty: bool) -> None:
    # Source: the Palmer penguins data (Gorman, Williams & Fraser 2014) shipped in the
    # `palmerpenguins` package, compared with pandas.DataFrame.melt.
    penguins = palmerpenguins.load_penguins()
    step = {
        "step": "gather",
        "columns": MEASURES,
        "names_to": "measurement",
        "values_to": "value",
        "keep_empty": keep_empty,
    }
    ours = run(penguins, "penguins.csv", step, lossless=keep_empty)
    ids = ["species", "island", "sex", "year"]
    theirs = as_text(penguins).melt(
        id_vars=ids, value_vars=MEASURES, var_name="measurement", value_name="value", ignore_index=False
    )
    if not keep_empty:
        theirs = theirs.dropna(subset=["value"])
    expected_rows = len(penguins) * 4 if keep_empty else int(penguins[MEASURES].notna().sum().sum())
    assert list(ours.columns) == [*ids, "measurement", "value"]
    assert len(ours) == len(theirs) == expected_rows
    # same rows in the same order once pandas' column-major result is put in row order
    theirs = theirs.sort_index(kind="stable").reset_index(drop=True)
    pd.testing.assert_frame_equal(as_text(ours), as_text(theirs), check_dtype=False)


def test_gather_dropping_empties_loses_the_ids_of_rows_with_no_measurement() -> None:
    # Source: `palmerpenguins`: two penguins have no measurement at all. Dropping empty
    # values leaves no row for them, so their species/island/sex/year cells are lost, and
    # the audit must name exactly those cells (why keep_empty defaults to true).
    penguins = palmerpenguins.load_penguins()
    table = table_of_frame(penguins, "penguins.csv")
    _, audit = tidy_with_recipe(
        table,
        Recipe.from_json(
            recipe_json(
                {
                    "step": "gather",
                    "columns": MEASURES,
                    "names_to": "m",
                    "values_to": "v",
                    "keep_empty": False,
                }
            )
        ),
    )
    empty_rows = penguins.index[penguins[MEASURES].isna().all(axis=1)]
    expected = sorted(
        (int(i) + 2, letter)
        for i in empty_rows
        for letter, column in zip("ABGH", ["species", "island", "sex", "year"], strict=True)
        if pd.notna(penguins.at[i, column])
    )
    assert len(empty_rows) == 2
    assert sorted((c.row, c.letter) for c in audit.lost) == expected


@pytest.mark.parametrize(
    ("dataset", "ids", "names", "values"),
    [
        # Source: vega_datasets `stocks` (monthly prices of five symbols), shipped locally.
        ("stocks", ["date"], "symbol", "price"),
        # Source: vega_datasets `barley` (Immer et al. 1934 barley yields), shipped locally.
        ("barley", ["variety", "site"], "year", "yield"),
    ],
)
def test_spread_equals_pandas_pivot_on_vega_datasets(
    dataset: str, ids: list[str], names: str, values: str
) -> None:
    frame = getattr(vega_datasets.data, dataset)()[[*ids, names, values]]
    ours = run(frame, f"{dataset}.csv", {"step": "spread", "names_from": names, "values_from": values})
    text = as_text(frame)
    theirs = text.pivot(index=ids, columns=names, values=values).reset_index()
    theirs.columns = [str(c) for c in theirs.columns]
    assert sorted(ours.columns) == sorted(theirs.columns)
    assert rows_of(ours, list(theirs.columns)) == rows_of(theirs, list(theirs.columns))
    assert list(ours.columns[len(ids) :]) == list(dict.fromkeys(text[names]))  # first-seen order


def test_spread_reports_every_duplicate_that_pandas_pivot_refuses() -> None:
    # Source: vega_datasets `iowa-electricity`; without its year column, source names repeat.
    frame = vega_datasets.data.iowa_electricity()[["source", "net_generation"]].assign(state="Iowa")
    text = as_text(frame)
    with pytest.raises(ValueError, match="duplicate"):
        text.pivot(index="state", columns="source", values="net_generation")
    _, audit = tidy_with_recipe(
        table_of_frame(frame, "iowa.csv"),
        Recipe.from_json(
            recipe_json({"step": "spread", "names_from": "source", "values_from": "net_generation"})
        ),
    )
    expected = int(text.duplicated(["state", "source"]).sum())
    assert expected > 0 and audit.collisions == expected and len(audit.lost) == expected
    assert not audit.lossless


def test_gather_groups_equals_pandas_wide_to_long_on_anscombe() -> None:
    # Source: Anscombe's quartet (Anscombe 1973) as shipped in vega_datasets `anscombe`,
    # spread to the classic wide layout X_I, Y_I, ..., then compared with pandas.wide_to_long.
    long = vega_datasets.data.anscombe()
    long = long.assign(obs=long.groupby("Series").cumcount() + 1)
    wide = long.pivot(index="obs", columns="Series", values=["X", "Y"])
    wide.columns = [f"{member}_{series}" for member, series in wide.columns]
    wide = wide.reset_index()
    ours = run(
        wide,
        "anscombe_wide.csv",
        {"step": "gather_groups", "pattern": r"^(?P<member>[XY])_(?P<series>\w+)$", "names_to": "Series"},
    )
    theirs = pd.wide_to_long(as_text(wide), stubnames=["X", "Y"], i="obs", j="Series", sep="_", suffix=r"\w+")
    theirs = theirs.reset_index()
    columns = ["obs", "Series", "X", "Y"]
    assert list(ours.columns) == columns
    assert rows_of(ours, columns) == rows_of(theirs, columns)
    # and it is the shipped long form again (the wide pivot made X a float column)
    assert rows_of(ours, columns) == rows_of(long.astype({"X": float}), columns)


def test_explode_equals_pandas_explode_on_barley_varieties() -> None:
    # Source: vega_datasets `barley`; the varieties grown at each site are packed into one
    # "a; b; c" cell, then split by Weir and by pandas.Series.explode.
    barley = vega_datasets.data.barley()
    packed = (
        barley.groupby("site", sort=False)["variety"].agg(lambda v: "; ".join(dict.fromkeys(v))).reset_index()
    )
    ours = run(packed, "barley_sites.csv", {"step": "explode", "column": "variety", "separator": ";"})
    theirs = packed.assign(variety=packed["variety"].str.split(";")).explode("variety")
    theirs["variety"] = theirs["variety"].str.strip()
    pd.testing.assert_frame_equal(as_text(ours), as_text(theirs.reset_index(drop=True)), check_dtype=False)
    assert rows_of(ours, ["site", "variety"]) == rows_of(
        barley.drop_duplicates(["site", "variety"]), ["site", "variety"]
    )


def test_transpose_equals_pandas_transpose_on_iowa_electricity() -> None:
    # Source: vega_datasets `iowa-electricity`, spread to one row per source and one column
    # per year, then printed sideways; Weir's transpose must equal pandas.DataFrame.T.
    frame = vega_datasets.data.iowa_electricity()
    wide = frame.assign(year=frame["year"].dt.year.astype(str)).pivot(
        index="source", columns="year", values="net_generation"
    )
    sideways = wide.T.reset_index()  # the provider's layout: years down, sources across
    sideways.columns = [str(c) for c in sideways.columns]
    ours = run(sideways, "iowa_sideways.csv", {"step": "transpose"})
    theirs = as_text(sideways).set_index("year").T.reset_index().rename(columns={"index": "year"})
    theirs.columns.name = None
    assert list(ours.columns) == list(theirs.columns)
    pd.testing.assert_frame_equal(as_text(ours), as_text(theirs).reset_index(drop=True), check_dtype=False)


def test_split_column_agrees_with_pandas_date_parts_on_seattle_weather() -> None:
    # Source: vega_datasets `seattle-weather` dates (ISO 8601 calendar dates, YYYY-MM-DD);
    # the split parts must equal the year, month and day pandas.to_datetime finds.
    weather = vega_datasets.data.seattle_weather()[["date", "temp_max"]]
    text = weather.assign(date=weather["date"].dt.strftime("%Y-%m-%d"))
    ours = run(
        text,
        "seattle.csv",
        {
            "step": "split_column",
            "column": "date",
            "pattern": r"^(?P<year>\d{4})-(?P<month>\d{2})-(?P<day>\d{2})$",
            "into": ["year", "month", "day"],
        },
    )
    parsed = pd.to_datetime(text["date"], format="ISO8601")
    assert ours["year"].astype(int).tolist() == parsed.dt.year.tolist()
    assert ours["month"].astype(int).tolist() == parsed.dt.month.tolist()
    assert ours["day"].astype(int).tolist() == parsed.dt.day.tolist()
    assert list(ours.columns) == ["year", "month", "day", "temp_max"]
