"""Unit vocabulary and the one-scale test that keep units, codes and regressors out of layout findings."""

from __future__ import annotations

from pathlib import Path

import pandas as pd
import pytest

from linter.read import read_path
from linter.rules.layout_scale import one_scale
from linter.rules.layout_units import is_unit
from linter.table import Frame, first_row_header


# Source: SI Brochure 9th ed. (BIPM 2019) tables 2, 4, 7 and 8 (symbols, prefixes, accepted units).
@pytest.mark.parametrize("text", ["mg/L", "µS/cm", "ug/L", "km2", "°C", "kWh", "%", "NTU", "cfu/100mL"])
def test_known_units(text: str) -> None:
    assert is_unit(text)


@pytest.mark.parametrize("text", ["B", "10B", "North", "Oct", "", "VB-014", "Kell Town"])
def test_codes_and_words_are_not_units(text: str) -> None:
    assert not is_unit(text)


def _frame(columns: dict[str, list[str]]) -> Frame:
    Path("input.csv").write_text(pd.DataFrame(columns).to_csv(index=False), encoding="utf-8")
    return first_row_header(read_path("input.csv")[0])


def test_weeks_of_one_count_share_a_scale() -> None:
    frame = _frame({"W01": ["12", "3", "21"], "W02": ["15", "5", "19"], "W03": ["11", "2", "25"]})
    assert one_scale(frame, ["W01", "W02", "W03"])


def test_regressors_on_disjoint_scales_are_separate_variables() -> None:
    frame = _frame({"x1": ["0.5", "0.7", "0.2"], "x2": ["1.2", "1.1", "1.9"], "x3": ["3", "2", "5"]})
    assert not one_scale(frame, ["x1", "x2", "x3"])


def test_too_few_rows_give_the_benefit_of_the_doubt() -> None:
    frame = _frame({"a1": ["0.5", "0.7"], "a2": ["100", "900"]})
    assert one_scale(frame, ["a1", "a2"])


def test_species_matrix_is_not_sideways_but_stats_are() -> None:
    from linter.rules.layout_rows import find_transposed

    # Common practice (no source): counts of species by site share one scale in every row.
    Path("m.csv").write_text("species,VB-014,VB-021,VB-033\nwagtail,3,0,1\nheron,1,1,0\n", encoding="utf-8")
    assert find_transposed(read_path("m.csv")[0]) == []
    # Common practice (no source): a generic `variable` corner cell says the rows are variables.
    Path("s.csv").write_text("variable,VB-014,VB-015\nph,7.1,6.9\ntemp_c,8.5,9.0\n", encoding="utf-8")
    assert [f.rule for f in find_transposed(read_path("s.csv")[0])] == ["layout.transposed"]


@pytest.mark.parametrize(
    ("label", "kind"),
    [
        ("Q1 2023", "quarter"),
        ("2024-W05", "week"),  # Source: ISO 8601-1:2019 §5.2.3 week dates
        ("1 Mar", "date"),
        ("Tue", "day"),
        ("Strongly disagree", "answer"),  # Source: Likert (1932) agreement scale
        ("Sales", None),
        ("Quay", None),
    ],
)
def test_period_and_scale_headers(label: str, kind: str | None) -> None:
    from linter.rules.layout_signals import header_value_kind

    assert header_value_kind(label) == kind


def test_index_column_is_dropped_only_when_it_counts_from_zero() -> None:
    from linter.rules.layout_index import find_index_column

    # Source: pandas.DataFrame.to_csv (pandas reference library) writes the default index.
    frame = pd.DataFrame({"site": ["VB-014", "VB-015", "VB-016"], "ph": ["7.1", "6.8", "7.0"]})
    Path("a.csv").write_text(frame.to_csv(), encoding="utf-8")
    found = find_index_column(read_path("a.csv")[0])
    assert [f.step for f in found] == [{"step": "drop_columns", "columns": ["A"], "reason": "index"}]
    shuffled = frame.iloc[[2, 0, 1]]  # a filtered or sorted index is no longer 0..n-1 in order
    Path("b.csv").write_text(shuffled.to_csv(), encoding="utf-8")
    assert find_index_column(read_path("b.csv")[0]) == []


def test_two_level_fill_down_names_both_levels() -> None:
    from linter.rules.layout_groups import find_same_as_above

    # Common practice (no source): hierarchical row labels, years above terms.
    text = (
        "year,term,subject,avg\n2023,Autumn,Maths,61\n,,English,66\n,Spring,Maths,63\n,,English,64\n"
        "2024,Autumn,Maths,65\n,,English,69\n"
    )
    Path("h.csv").write_text(text, encoding="utf-8")
    found = find_same_as_above(read_path("h.csv")[0])
    assert [f.step for f in found] == [{"step": "fill_down", "columns": ["year", "term"]}]
    # A measured number column is never filled down, even with blanks in it.
    Path("n.csv").write_text("site,depth\nVB-014,2.5\n,\nVB-015,1.5\n,3.0\n", encoding="utf-8")
    assert all("depth" not in f.place.columns for f in find_same_as_above(read_path("n.csv")[0]))


def test_index_name_row_is_a_header_not_a_section() -> None:
    from linter.rules.layout_groups import find_section_titles

    # Common practice (no source): a section title sits under a header that names column A.
    Path("s.csv").write_text("district,2021,2022\nUrban,,\nKessel,4,5\nOldfold,5,6\nRural,,\nWen,2,3\n")
    assert [f.rule for f in find_section_titles(read_path("s.csv")[0])] == ["layout.section-titles"]
    Path("i.csv").write_text(",ph,nitrate\nsite,,\nVB-014,7.1,4.1\nVB-021,6.8,5.6\nVB-033,7.4,2.2\n")
    assert find_section_titles(read_path("i.csv")[0]) == []


def test_constant_columns_do_not_count_against_one_scale() -> None:
    # Common practice (no source): the same reading repeated down a column has no spread to compare.
    frame = _frame({"VB-001": ["0.1", "0.1", "0.1"], "VB-002": ["0.1", "0.1", "0.1"], "VB-003": ["0.2"] * 3})
    assert one_scale(frame, ["VB-001", "VB-002", "VB-003"])
