"""The recipe search: several problems need several steps, lossless only, ranked, contract-guided."""

from __future__ import annotations

from pathlib import Path

import pandas as pd

from linter.contract.model import TableContract, Variable, VarType
from linter.read import read_path
from linter.reshape.search import search
from linter.reshape.tidiness import tidiness
from linter.table import Table


def table_of(text: str) -> Table:
    Path("input.csv").write_text(text, encoding="utf-8")
    return read_path("input.csv")[0]


TITLED_YEARS = (
    "Nitrate exceedances by year,,,\n"
    "site_id,2023,2024,2025\n"
    "VB-014,3,,4\n"
    "VB-015,1,0,2\n"
    "Note: provisional counts,,,\n"
)


def test_title_years_and_notes_need_three_steps_in_order() -> None:
    found = search(table_of(TITLED_YEARS))
    assert [s["step"] for s in found.best.steps] == ["drop_rows", "drop_rows", "gather"]
    assert {s.get("reason") for s in found.best.steps[:2]} == {"title", "notes"}
    out = found.best.output
    assert list(out.columns) == ["site_id", "year", "count"]
    assert len(out) == 6  # the empty 2024 cell of VB-014 is kept as an explicit missing value
    assert found.best.lossless and found.best.remaining == ()


def test_runners_up_are_kept_and_ranked_below_the_best() -> None:
    found = search(table_of(TITLED_YEARS))
    assert found.runners_up
    assert all(c.score <= found.best.score for c in found.runners_up)
    assert all(c.lossless for c in found.runners_up)


def test_keep_empty_false_drops_rows_of_empty_cells() -> None:
    found = search(table_of(TITLED_YEARS), keep_empty=False)
    assert len(found.best.output) == 5


def test_tidy_table_gets_the_empty_recipe() -> None:
    found = search(table_of("site_id,sampled_on,ph\nVB-014,2025-03-02,7.1\nVB-015,2025-03-02,6.8\n"))
    assert found.best.steps == ()


def test_no_identifying_column_gets_a_row_id_before_gathering() -> None:
    found = search(table_of("2023,2024,2025\n3,4,5\n1,0,2\n"))
    steps = [s["step"] for s in found.best.steps]
    assert steps[:2] == ["add_row_id", "gather"]
    assert sorted(found.best.output["row"].astype(int).unique().tolist()) == [2, 3]  # provider rows


def test_contract_names_the_output_columns() -> None:
    contract = TableContract(
        name="exceedances",
        observational_unit="one site in one year",
        keys=("site_id", "year"),
        variables=(
            Variable("site_id"),
            Variable("year", VarType.INTEGER),
            Variable("exceedances", VarType.INTEGER),
        ),
    )
    found = search(table_of("Site ID,2023,2024\nVB-014,3,4\nVB-015,1,0\n"), contract)
    assert list(found.best.output.columns) == ["site_id", "year", "exceedances"]
    assert found.best.tidiness.contract_fit == 1.0


def test_tidiness_prefers_typed_columns_and_names_over_values() -> None:
    # Common practice (no source): Wickham 2014's principles as a score, checked on two forms of one table.
    wide = pd.DataFrame({"site": ["VB-014", "VB-015"], "2023": ["3", "1"], "2024": ["4", "0"]})
    long = wide.melt(id_vars=["site"], var_name="year", value_name="count")
    assert tidiness(long).score > tidiness(wide).score
    mixed = pd.DataFrame({"site": ["VB-014", "ph", "7.1"], "x": ["2025-03-02", "date", "6.8"]})
    assert tidiness(mixed).typed_columns < 1.0


def test_parts_of_a_split_are_not_gathered_back() -> None:
    # Common practice (no source): a won-drawn-lost record `8-0-2` splits into three counts,
    # which are different variables even though their names differ only by a number.
    from pathlib import Path

    from linter.read import read_path
    from linter.reshape.search import search

    Path("league.csv").write_text(
        "team,record,points\nDunmore,8-0-2,24\nKell,6-3-1,21\nArdle,5-3-2,18\n", encoding="utf-8"
    )
    best = search(read_path("league.csv")[0]).best
    assert [s["step"] for s in best.steps] == ["split_column"]
    assert best.output.shape == (3, 5)


def test_section_titles_are_lifted_before_a_gather() -> None:
    # Common practice (no source): section rows (`Urban`) inside a wide table of years label the
    # rows below them; gathering first would turn each title into rows of empty values.
    from pathlib import Path

    from linter.read import read_path
    from linter.reshape.search import search

    Path("wide.csv").write_text(
        "District,2021,2022\nUrban,,\nKessel,41,42\nOldfold,50,51\nRural,,\nBrannoch,22,23\nWenlow,9,8\n",
        encoding="utf-8",
    )
    best = search(read_path("wide.csv")[0]).best
    assert [s["step"] for s in best.steps] == ["lift_titles", "gather"]
    assert len(best.output) == 8 and "section" in best.output.columns
