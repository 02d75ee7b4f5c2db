"""Inference of one variable and of a table: types, codes, ranges, patterns, units, keys, rules."""

from __future__ import annotations

import pandas as pd
import pytest

from linter.contract.model import VarType
from linter.draft.columns import draft_variable
from linter.draft.infer import Sample, draft_table, file_globs
from linter.draft.ranges import margin_range
from linter.draft.shapes import id_pattern
from linter.draft.units import header_unit


def cells(*values: str | None) -> pd.Series:
    return pd.Series(list(values), dtype=object)


@pytest.mark.parametrize(
    ("values", "pattern"),
    [
        (("VB-014", "VB-002", "VB-131"), r"^VB-\d{3}$"),  # the brief's own example
        (("AU260301", "MR260302"), r"^[A-Z]{2}\d{6}$"),  # letters glued to digits vary
        (("2026-01", "2026-12"), r"^\d{4}-\d{2}$"),
        (("S-1", "S-22", "S-333"), r"^S-\d{1,3}$"),
        (("x.1", "x.2"), r"^x\.\d{1}$"),  # a dot is escaped, a dash is not
    ],
)
def test_identifiers_generalise_to_their_shared_pattern(values: tuple[str, ...], pattern: str) -> None:
    found = id_pattern(pd.Series(values))
    assert found == pattern
    assert all(pd.Series(values).str.fullmatch(found))


@pytest.mark.parametrize("values", [("VB-014", "VB 015"), ("ALD", "BRK"), ("VB-014", "14-VB"), ("VB-014",)])
def test_values_of_no_single_id_shape_get_no_pattern(values: tuple[str, ...]) -> None:
    assert id_pattern(pd.Series(values)) is None


@pytest.mark.parametrize(
    ("name", "unit"),
    [
        ("Nitrate (mg/L)", "mg/L"),
        ("temp_C", "degC"),
        ("flipper_length_mm", "mm"),
        ("conductivity [uS/cm]", "uS/cm"),
        ("nitrate_mg_l", "mg/L"),
        ("site_id", None),
        ("observer", None),
    ],
)
def test_units_are_read_from_column_names(name: str, unit: str | None) -> None:
    assert header_unit(name) == unit


def test_censored_values_make_a_number_with_the_prefix_not_text() -> None:
    drafted = draft_variable("result", cells("1.42", "<0.05", "0.061", "<0.02"))
    assert drafted.type is VarType.NUMBER
    assert drafted.censored_prefix == "<"
    assert drafted.minimum == 0  # never negative, so the floor is 0
    assert drafted.seen_max == pytest.approx(1.42)


def test_missing_value_codes_are_collected_and_make_the_column_nullable() -> None:
    drafted = draft_variable("ph", cells("7.1", "-999", "NA", "7.4", None, "n/a", "."))
    assert drafted.type is VarType.NUMBER
    assert drafted.nullable
    assert drafted.missing_seen == ("-999", ".", "NA", "n/a")  # sorted by code point


def test_whole_numbers_with_leading_zeros_stay_text() -> None:
    # Common practice (no source): a code written 007 is not the number 7.
    drafted = draft_variable("station", cells("007", "012", "131"))
    assert drafted.type is VarType.STRING
    assert drafted.pattern == r"^\d{3}$"


@pytest.mark.parametrize(
    ("values", "kind", "form"),
    [
        (("2026-03-03", "2026-03-24"), VarType.DATE, None),  # Source: ISO 8601-1 §5.2.2.1 extended format
        (("2026/03/03", "2026/12/24"), VarType.DATE, "%Y/%m/%d"),
        (("24/03/2026", "03/12/2026"), VarType.DATE, "%d/%m/%Y"),
        (("12/24/2026", "03/03/2026"), VarType.DATE, "%m/%d/%Y"),  # 24 cannot be a month
        (("2026-03-03T10:15:00", "2026-03-04 08:00"), VarType.DATETIME, None),
    ],
)
def test_dates_and_their_format(values: tuple[str, ...], kind: VarType, form: str | None) -> None:
    drafted = draft_variable("day", cells(*values))
    assert drafted.type is kind
    assert drafted.date_format == form


def test_an_invalid_calendar_day_is_not_a_date() -> None:
    assert draft_variable("day", cells("2026-02-30", "2026-03-01")).type is VarType.STRING


def test_low_cardinality_text_is_a_category_and_free_text_is_not() -> None:
    analyte = draft_variable("analyte", cells(*(["NITRATE", "AMMONIUM", "CHLORIDE"] * 4)))
    assert analyte.type is VarType.CATEGORY
    assert analyte.values == ("AMMONIUM", "CHLORIDE", "NITRATE")
    notes = draft_variable("notes", cells("Ice at the margins", "High flow after rain", None))
    assert notes.type is VarType.STRING and notes.nullable


def test_true_false_words_are_booleans() -> None:
    assert draft_variable("active", cells("true", "false", "TRUE")).type is VarType.BOOLEAN


@pytest.mark.parametrize(
    ("low", "high", "integer", "expected"),
    [
        (7.1, 7.6, False, (6.72, 7.98)),  # pad 5% of 7.6 = 0.38, rounded to hundredths
        (2.5, 8.0, False, (0.0, 10.8)),  # the padded floor would go below 0: it stops at 0
        (-2.94, -2.47, False, (-3.18, -2.23)),  # pad half the span, 0.235
        (2007, 2009, True, (1906, 2110)),
    ],
)
def test_ranges_get_a_margin_and_round_outward(
    low: float, high: float, integer: bool, expected: tuple[float, float]
) -> None:
    minimum, maximum = margin_range(low, high, integer)
    assert (minimum, maximum) == pytest.approx(expected)
    assert minimum <= low and maximum >= high


def test_coordinates_keep_within_what_a_coordinate_can_be() -> None:
    # Source: ISO 6709: latitude -90..+90, longitude -180..+180 degrees (from memory of the standard).
    drafted = draft_variable("latitude", cells("7.4", "71.3"))
    assert drafted.maximum == 90 and drafted.minimum == 0
    assert draft_variable("longitude", cells("-176.6", "145.6")).minimum == -180


def frame(text: str) -> pd.DataFrame:
    lines = [line.split(",") for line in text.strip().splitlines()]
    body = pd.DataFrame(lines[1:], columns=lines[0], dtype=object)
    return body.where(body != "", None)


def test_the_leftmost_minimal_key_is_chosen_and_measurements_never_key() -> None:
    body = frame(
        """
site_id,month,result,lab_id
VB-001,2026-01,1.1,L1
VB-001,2026-02,1.2,L2
VB-002,2026-01,1.3,L3
VB-002,2026-02,1.4,L4
"""
    )
    drafted = draft_table([Sample(body, "chemistry-2026.csv")])
    assert drafted.keys == ("site_id", "month")
    assert "[lab_id]" in drafted.key_evidence  # the other candidate is named, not lost
    assert drafted.complete_over == ("site_id", "month")  # 2 x 2 combinations, 4 rows


def test_min_max_pairs_kept_by_every_row_become_rules() -> None:
    body = frame(
        """
site_id,temp_min_c,temp_max_c
VB-001,2.0,4.0
VB-002,3.0,3.0
"""
    )
    assert draft_table([Sample(body, "x.csv")]).rules == ("temp_min_c <= temp_max_c",)
    broken = body.copy()
    broken.loc[1, "temp_min_c"] = "5.0"
    assert draft_table([Sample(broken, "x.csv")]).rules == ()


def test_a_column_absent_from_one_sample_file_is_not_required() -> None:
    one = frame("site_id,ph\nVB-001,7.1\nVB-002,7.2")
    two = frame("site_id,ph,notes\nVB-003,7.3,dry")
    drafted = draft_table([Sample(one, "a.csv"), Sample(two, "b.csv")])
    notes = drafted.variable("notes")
    assert notes is not None and not notes.required
    assert drafted.rows == 3


def test_file_globs_keep_the_common_start_before_any_digit() -> None:
    names = ["in/field-sheets-2026-q1-a.csv", "in/field-sheets-2026-q2-b.xlsx"]
    assert file_globs(names) == ("field-sheets-*.csv", "field-sheets-*.xlsx")


def test_a_date_gets_a_floor_at_the_start_of_its_earliest_year_and_no_ceiling() -> None:
    drafted = draft_variable("sampled_on", cells("2026-03-03", "2025-11-30", "2026-04-01"))
    assert drafted.minimum == "2025-01-01" and drafted.maximum is None
    other_form = draft_variable("day", cells("2012/01/01", "2015/12/31"))
    assert other_form.minimum == "2012-01-01"  # bounds are ISO 8601 whatever the agreed form
