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
