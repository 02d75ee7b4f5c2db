"""Drafts of open datasets shipped inside index packages, checked against their own documentation."""

from __future__ import annotations

import json
import shutil
from importlib import resources
from pathlib import Path

import pytest
from typer.testing import CliRunner

from linter.cli import app
from linter.contract.load import load_contract
from linter.contract.model import TableContract, VarType


def packaged(package: str, *parts: str) -> Path:
    """A data file shipped inside an installed package (read offline from the package itself)."""
    pytest.importorskip(package)
    path = Path(str(resources.files(package).joinpath(*parts)))
    if not path.is_file():
        pytest.skip(f"{package} does not ship {'/'.join(parts)}")
    return path


def drafted(source: Path, *options: str) -> TableContract:
    """Copy the dataset into the test folder, draft it, and require that it passes its own draft."""
    local = Path(source.name)
    shutil.copyfile(source, local)
    runner = CliRunner()
    made = runner.invoke(app, ["draft", str(local), "--out", "contract.yaml", *options])
    assert made.exit_code == 0, made.output
    checked = runner.invoke(app, ["check", str(local), "-c", "contract.yaml", "--report", "r.json"])
    assert checked.exit_code == 0, checked.output
    assert json.loads(Path("r.json").read_text())["verdict"] == "accepted"
    return load_contract("contract.yaml").tables[0]


def test_palmer_penguins_types_and_code_lists_match_the_package_documentation() -> None:
    # Dataset: penguins.csv shipped in the `palmerpenguins` package (from the package index), 344 rows.
    table = drafted(packaged("palmerpenguins", "data", "penguins.csv"))
    types = {v.name: v.type for v in table.variables}
    # Source: palmerpenguins.load_penguins docstring: "species | A string denoting penguin species
    # (Adélie, Chinstrap and Gentoo)"; the CSV itself spells it without the accent, Adelie.
    species = table.variable("species")
    assert species is not None and species.codes is not None
    assert set(species.codes.values) == {"Adelie", "Chinstrap", "Gentoo"}
    # Source: same docstring: "island | A string denoting island in Palmer Archipelago, Antarctica
    # (Biscoe, Dream or Torgersen)".
    island = table.variable("island")
    assert island is not None and island.codes is not None
    assert set(island.codes.values) == {"Biscoe", "Dream", "Torgersen"}
    # Source: same docstring: "sex | A string denoting penguin sex (female, male)".
    sex = table.variable("sex")
    assert sex is not None and sex.codes is not None and set(sex.codes.values) == {"female", "male"}
    # Source: same docstring: "bill_length_mm | A number denoting bill length (millimeters)",
    # "bill_depth_mm | A number ...", "flipper_length_mm | An integer denoting flipper length
    # (millimeters)", "body_mass_g | An integer denoting body mass (grams)", "year | An integer
    # denoting the study year (2007, 2008, or 2009)".
    assert types["bill_length_mm"] is VarType.NUMBER
    assert types["bill_depth_mm"] is VarType.NUMBER
    assert types["flipper_length_mm"] is VarType.INTEGER
    assert types["body_mass_g"] is VarType.INTEGER
    assert types["year"] is VarType.INTEGER
    year = table.variable("year")
    assert year is not None and year.minimum is not None and year.maximum is not None
    assert float(year.minimum) <= 2007 and float(year.maximum) >= 2009
    # The units the documentation gives in words are the ones the column names carry.
    assert [table.variable(n).unit for n in ("bill_length_mm", "body_mass_g")] == ["mm", "g"]  # type: ignore[union-attr]
    # The documentation names no identifier, and no column set of the data is one: no key.
    assert table.keys == ()
    # The file writes NA for unmeasured penguins (the R package's missing value).
    assert "NA" in table.missing


def test_seattle_weather_is_keyed_by_its_date_with_its_own_date_format() -> None:
    # Dataset: seattle-weather.csv shipped (locally) in the `vega_datasets` package (from the package index).
    table = drafted(packaged("vega_datasets", "_data", "seattle-weather.csv"))
    # Source: vega_datasets/dataset_info.json: "precipitation totals, temperature extremes, wind
    # speed, and weather type recorded daily in Seattle from 2012 to 2015": one row per day.
    assert table.keys == ("date",)
    date = table.variable("date")
    assert date is not None and date.type is VarType.DATE and date.date_format == "%Y/%m/%d"
    weather = table.variable("weather")
    assert weather is not None and weather.type is VarType.CATEGORY
    # From memory of the Vega example gallery (no source shipped with the package): the weather
    # types are drizzle, rain, sun, snow and fog.
    assert weather.codes is not None
    assert set(weather.codes.values) == {"drizzle", "rain", "sun", "snow", "fog"}
    # "temperature extremes": the daily minimum never exceeds the maximum, so the draft says so.
    assert [c.text for c in table.comparisons] == ["temp_min <= temp_max"]


def test_airports_are_keyed_by_their_code() -> None:
    # Dataset: airports.csv shipped (locally) in the `vega_datasets` package (from the package index).
    table = drafted(packaged("vega_datasets", "_data", "airports.csv"))
    # Source: vega_datasets/dataset_info.json: "This dataset lists US airports, including airport
    # code, city, state, latitude, and longitude": the code (column iata) identifies an airport.
    assert table.keys == ("iata",)
    latitude, longitude = table.variable("latitude"), table.variable("longitude")
    assert latitude is not None and longitude is not None
    assert latitude.type is VarType.NUMBER and longitude.type is VarType.NUMBER
    # Source: ISO 6709: latitudes lie within -90..90, longitudes within -180..180 (from memory).
    assert float(latitude.minimum) >= -90 and float(latitude.maximum) <= 90  # type: ignore[arg-type]
    assert float(longitude.minimum) >= -180 and float(longitude.maximum) <= 180  # type: ignore[arg-type]


def test_a_penguin_the_documentation_does_not_allow_fails_the_draft() -> None:
    # Dataset: penguins.csv of `palmerpenguins`; the docstring lists three species and three islands,
    # so a drafted contract must return a row with a fourth species on a fourth island.
    drafted(packaged("palmerpenguins", "data", "penguins.csv"))
    odd = Path("penguins-odd.csv")
    lines = Path("penguins.csv").read_text().splitlines()
    odd.write_text("\n".join([*lines, "Emperor,Ross,45.0,17.0,200,4000,male,2008"]) + "\n")
    runner = CliRunner()
    checked = runner.invoke(app, ["check", str(odd), "-c", "contract.yaml", "--report", "odd.json"])
    assert checked.exit_code == 1
    findings = json.loads(Path("odd.json").read_text())["tables"][0]["findings"]
    flagged = {tuple(f["place"]["columns"]) for f in findings if f["rule"] == "values.not-in-code-list"}
    assert flagged == {("species",), ("island",)}


def test_the_penguins_as_parquet_draft_the_same_types_as_the_csv() -> None:
    # Dataset: penguins.csv of `palmerpenguins`, written to Parquet by pyarrow (the reference writer):
    # pandas reads flipper_length_mm as float64 because of its NA cells, yet the documented
    # "An integer denoting flipper length" must still be drafted as an integer.
    import pandas as pd

    source = packaged("palmerpenguins", "data", "penguins.csv")
    from_csv = {v.name: v.type for v in drafted(source).variables}
    pd.read_csv(source).to_parquet("penguins.parquet")
    runner = CliRunner()
    assert runner.invoke(app, ["draft", "penguins.parquet", "--out", "pq.yaml"]).exit_code == 0
    assert runner.invoke(app, ["check", "penguins.parquet", "-c", "pq.yaml"]).exit_code == 0
    from_parquet = {v.name: v.type for v in load_contract("pq.yaml").tables[0].variables}
    assert from_parquet == from_csv
    assert from_parquet["flipper_length_mm"] is VarType.INTEGER
