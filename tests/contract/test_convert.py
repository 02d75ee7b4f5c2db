"""Conversion of text cells to typed values: each failing cell gets its reason and, where known, a rewrite."""

from __future__ import annotations

import math
from datetime import date, datetime

import pandas as pd
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from linter.contract.convert import convert_column, read_cells, unit_key
from linter.contract.model import Variable, VarType
from linter.contract.problems import Problem

MISSING = ("", "NA", "-999")
RESULT = Variable("result", VarType.NUMBER, unit="mg/L", censored_prefix="<")
SAMPLED_ON = Variable("sampled_on", VarType.DATE)


def convert_one(variable: Variable, cell: str | None) -> tuple[object, object, object, bool, bool]:
    converted = convert_column(pd.Series([cell], index=[7], dtype=object), variable, MISSING)
    value = converted.values[7]
    return (
        None if pd.isna(value) else value,
        converted.reason[7],
        converted.suggestion[7],
        bool(converted.censored[7]),
        bool(converted.missing[7]),
    )


NUMBER_CASES = [
    # (cell, value, reason, suggestion, censored, missing)
    ("0.25", 0.25, None, None, False, False),
    (" 7 ", 7.0, None, None, False, False),
    ("3e-2", 0.03, None, None, False, False),
    ("1,234", None, Problem.THOUSANDS_SEPARATOR, "1234", False, False),
    ("12,345,678.5", None, Problem.THOUSANDS_SEPARATOR, "12345678.5", False, False),
    ("1,5", None, Problem.DECIMAL_COMMA, "1.5", False, False),
    ("12 mg/L", None, Problem.UNIT_IN_CELL, "12", False, False),
    ("12mg/l", None, Problem.UNIT_IN_CELL, "12", False, False),
    ("12 ug/L", None, Problem.WRONG_UNIT, "ug/L", False, False),
    ("<0.05", 0.05, None, None, True, False),
    ("< 0.05", 0.05, None, None, True, False),
    ("<", None, Problem.CENSORED_NOT_A_NUMBER, None, False, False),
    ("<0.05 ug/L", None, Problem.WRONG_UNIT, "ug/L", False, False),
    ("NA", None, None, None, False, True),
    ("-999", None, None, None, False, True),
    (None, None, None, None, False, True),
    # pandas would read these as floats; a data file means no such number.
    ("nan", None, Problem.NOT_A_NUMBER, None, False, False),
    ("inf", None, Problem.NOT_A_NUMBER, None, False, False),
    ("about 3", None, Problem.NOT_A_NUMBER, None, False, False),
]


@pytest.mark.parametrize(("cell", "value", "reason", "suggestion", "censored", "missing"), NUMBER_CASES)
def test_number_cells(
    cell: str | None,
    value: float | None,
    reason: Problem | None,
    suggestion: str | None,
    censored: bool,
    missing: bool,
) -> None:
    got = convert_one(RESULT, cell)
    assert got[1:] == (reason, suggestion, censored, missing)
    assert got[0] == (None if value is None else pytest.approx(value))


def test_integer_keeps_an_integer_dtype_and_rejects_fractions() -> None:
    converted = convert_column(pd.Series(["3", "-2", "3.5", None]), Variable("n", VarType.INTEGER), MISSING)
    assert str(converted.values.dtype) == "Int64"
    assert converted.values.tolist()[:2] == [3, -2]
    assert converted.reason.tolist() == [None, None, Problem.NOT_AN_INTEGER, None]


def test_boolean_lexical_forms() -> None:
    # Source: W3C XML Schema 1.1 Part 2 §3.3.2, boolean lexical space {true, false, 1, 0}.
    cells = pd.Series(["true", "false", "1", "0", "TRUE", "yes", "maybe"])
    converted = convert_column(cells, Variable("filtered", VarType.BOOLEAN), MISSING)
    assert converted.values.tolist()[:5] == [True, False, True, False, True]
    assert converted.reason.tolist()[5:] == [Problem.NOT_A_BOOLEAN, Problem.NOT_A_BOOLEAN]
    assert converted.suggestion.tolist()[5:] == ["true", None]


def test_units_compare_without_case_or_micro_sign_spelling() -> None:
    # Common practice (no source): "mg/l" and "mg/L" name the same unit;
    # µ (U+00B5) and μ (U+03BC) both mean micro.
    assert unit_key("mg/l") == unit_key("mg/L")
    assert unit_key("µg/L") == unit_key("μg/L") == unit_key("ug/L")
    assert unit_key("mg/L") != unit_key("ug/L")


# ISO 8601 forms of one day, 2 March 2026. Section numbers from memory of ISO 8601-1:2019.
MARCH_2 = date(2026, 3, 2)


@pytest.mark.parametrize(
    ("cell", "reason", "reference"),
    [
        # Source: ISO 8601-1:2019 §5.2.2.1, calendar date, complete, extended format: the agreed form.
        ("2026-03-02", None, None),
        # Source: ISO 8601-1:2019 §5.2.2.1, calendar date, complete, basic format: ISO, not the agreed form;
        # the day computed by Python 3.11 date.fromisoformat, which reads the basic form.
        ("20260302", Problem.OTHER_DATE_FORMAT, date.fromisoformat("20260302")),
        # Source: ISO 8601-1:2019 §5.2.3, ordinal date YYYY-DDD; the day computed by Python's strptime %j.
        ("2026-061", Problem.OTHER_DATE_FORMAT, datetime.strptime("2026-061", "%Y-%j").date()),
        # Source: ISO 8601-1:2019 §5.2.4, week date YYYY-Www-D; the day computed by date.fromisocalendar.
        ("2026-W10-1", Problem.OTHER_DATE_FORMAT, date.fromisocalendar(2026, 10, 1)),
        # Source: ISO 8601-1:2019 §5.2.2.2, reduced precision (a month): not a calendar day at all.
        ("2026-03", Problem.MONTH_NOT_DAY, None),
        # Source: ISO 8601-1:2019 §5.2.2.1 needs two-digit month and day.
        ("2026-3-2", Problem.OTHER_DATE_FORMAT, MARCH_2),
        # Common practice (no source): the Gregorian calendar has no 30 February.
        ("2026-02-30", Problem.NO_SUCH_DATE, None),
        ("2.3.2026", Problem.OTHER_DATE_FORMAT, MARCH_2),
        ("2 Mar 2026", Problem.OTHER_DATE_FORMAT, MARCH_2),
        ("soon", Problem.NOT_A_DATE, None),
    ],
)
def test_iso_8601_calendar_dates(cell: str, reason: Problem | None, reference: date | None) -> None:
    value, got_reason, suggestion, _, _ = convert_one(SAMPLED_ON, cell)
    assert got_reason == reason
    if reason is None:
        assert value == pd.Timestamp(MARCH_2)
    else:
        assert value is None
        assert suggestion == (reference.isoformat() if reference else None)


def test_slashed_dates_show_both_readings_when_ambiguous() -> None:
    converted = convert_column(pd.Series(["03/02/2026", "13/02/2026", "02/13/2026"]), SAMPLED_ON, MISSING)
    assert converted.suggestion.tolist() == ["2026-02-03 or 2026-03-02", "2026-02-13", "2026-02-13"]


def test_agreed_custom_format_and_iso_as_the_other_form() -> None:
    day_first = Variable("sampled_on", VarType.DATE, date_format="%d/%m/%Y")
    converted = convert_column(pd.Series(["02/03/2026", "2026-03-02"]), day_first, MISSING)
    assert converted.values[0] == pd.Timestamp(MARCH_2)
    assert converted.reason.tolist() == [None, Problem.OTHER_DATE_FORMAT]
    assert converted.suggestion[1] == "02/03/2026"


def test_datetimes() -> None:
    # Source: ISO 8601-1:2019 §5.4.2, date and time of day with the T separator.
    cells = pd.Series(["2026-03-02T10:15:00", "02/03/2026 10:15", "noon"])
    converted = convert_column(cells, Variable("taken_at", VarType.DATETIME), MISSING)
    assert converted.values[0] == pd.Timestamp("2026-03-02 10:15")
    assert converted.reason.tolist() == [None, Problem.OTHER_DATE_FORMAT, Problem.NOT_A_DATETIME]
    assert converted.suggestion[1] == "2026-03-02T10:15:00"


@settings(max_examples=40, deadline=None)
@given(st.lists(st.dates(min_value=date(1900, 1, 1), max_value=date(2099, 12, 31)), min_size=1, max_size=20))
def test_any_day_written_day_first_with_dots_gets_its_iso_rewrite(days: list[date]) -> None:
    # Source: Python's datetime.date.isoformat as the reference for the ISO 8601 extended form.
    cells = pd.Series([f"{d.day}.{d.month}.{d.year}" for d in days])
    converted = convert_column(cells, SAMPLED_ON, MISSING)
    assert converted.suggestion.tolist() == [d.isoformat() for d in days]


def test_conversion_leaves_its_input_alone() -> None:
    cells = pd.Series(["1,234", None, "<0.05"], dtype=object)
    before = cells.copy()
    convert_column(cells, RESULT, MISSING)
    pd.testing.assert_series_equal(cells, before)


def test_large_column_converts_without_per_row_python() -> None:
    # Not a timing test: a whole column of bad numbers must come back with one reason per cell.
    cells = pd.Series(["1,234", "12 mg/L", "x", "<0.5"] * 2_500)
    converted = convert_column(cells, RESULT, MISSING)
    assert converted.reason.value_counts().to_dict() == {
        Problem.THOUSANDS_SEPARATOR: 2_500,
        Problem.UNIT_IN_CELL: 2_500,
        Problem.NOT_A_NUMBER: 2_500,
    }
    assert math.isclose(converted.values.sum(), 0.5 * 2_500)


@settings(max_examples=40, deadline=None)
@given(st.lists(st.floats(min_value=1000, max_value=1e9, allow_nan=False), min_size=1, max_size=20))
def test_thousands_separators_written_by_python_are_undone(numbers: list[float]) -> None:
    # Source: PEP 378 (format specifier for thousands separator): f"{x:,.2f}" groups digits by three with ",".
    cells = pd.Series([f"{x:,.2f}" for x in numbers])
    converted = convert_column(cells, RESULT, MISSING)
    assert set(converted.reason) == {Problem.THOUSANDS_SEPARATOR}
    assert converted.suggestion.tolist() == [f"{x:.2f}" for x in numbers]


@pytest.mark.parametrize(
    ("cell", "fits"),
    [
        # Source: the two's-complement range of a 64-bit integer, -2**63 to 2**63 - 1 (common practice).
        ("9223372036854775807", True),
        ("-9223372036854775808", True),
        ("9223372036854775808", False),
        ("00000000000000000000000042", True),  # leading zeros add no value
        ("9" * 31, False),
        ("9" * 5000, False),  # longer than Python's int() accepts from text: never parsed
    ],
)
def test_integers_beyond_64_bits_are_named_not_a_crash(cell, fits):
    variable = Variable("replicate", VarType.INTEGER)
    converted = convert_column(pd.Series([cell, "2"], dtype=object), variable, ("",))
    assert converted.reason.tolist()[1] is None and converted.values.tolist()[1] == 2
    if fits:
        assert converted.reason.tolist()[0] is None and converted.values.tolist()[0] == int(cell)
    else:
        assert converted.reason.tolist()[0] == Problem.INTEGER_TOO_LARGE
        assert pd.isna(converted.values.tolist()[0])


# Cells a provider writes in a typed column, good and bad, including whole-column cases
# (UTC offsets beside local times) and integers beyond float64's exact range.
WRITTEN_CELLS = [
    "0.25",
    " 7 ",
    "3e-2",
    "1,234",
    "1,5",
    "12 mg/L",
    "3 ug/L",
    "<0.05",
    "<",
    "about 3",
    "NA",
    "-999",
    "",
    "   ",
    "9007199254740993",
    "99999999999999999999",
    "2.5",
    "-3",
    "true",
    "FALSE",
    "yes",
    "0",
    "2026-03-02",
    "2026-02-30",
    "03/02/2026",
    "13/02/2026",
    "20260302",
    "2026-061",
    "2026-W10-1",
    "2026-03",
    "2 Mar 2026",
    "2026-03-02T10:15:00",
    "2026-03-02T10:15:00+02:00",
    "02/03/2026 10:15",
    "2026-03-02 10:15",
    None,
]
READ_TYPES = [
    Variable("result", VarType.NUMBER, unit="mg/L", censored_prefix="<"),
    Variable("replicate", VarType.INTEGER),
    Variable("filtered", VarType.BOOLEAN),
    SAMPLED_ON,
    Variable("sampled_on_day_first", VarType.DATE, date_format="%d/%m/%Y"),
    Variable("taken_at", VarType.DATETIME),
]


@settings(max_examples=60, deadline=None)
@given(
    st.sampled_from(READ_TYPES),
    st.lists(st.sampled_from(WRITTEN_CELLS), min_size=2 * len(WRITTEN_CELLS), max_size=400),
)
def test_reading_each_distinct_text_once_gives_the_cell_by_cell_result(variable, cells):
    # At most half the cells are distinct, so convert_column reads each text once and spreads it
    # back; read_cells reads them cell by cell. Every field must agree, index and dtype included.
    index = pd.Index(range(100, 100 + len(cells)))
    column = pd.Series(cells, index=index, dtype=object)
    once = convert_column(column, variable, MISSING)
    each = read_cells(column, variable, MISSING)
    for name in ("values", "missing", "censored", "reason", "suggestion"):
        pd.testing.assert_series_equal(getattr(once, name), getattr(each, name), check_names=False)
