"""Why a cell could not be read as its variable's type: stable reason codes for conversion failures."""

from __future__ import annotations

from enum import StrEnum


class Problem(StrEnum):
    """One reason a cell failed conversion; `rule` names the finding it becomes."""

    NOT_A_NUMBER = "not-a-number"
    THOUSANDS_SEPARATOR = "thousands-separator"
    DECIMAL_COMMA = "decimal-comma"
    UNIT_IN_CELL = "unit-in-cell"
    WRONG_UNIT = "wrong-unit"
    NOT_AN_INTEGER = "not-an-integer"
    INTEGER_TOO_LARGE = "integer-too-large"
    NOT_A_BOOLEAN = "not-a-boolean"
    NOT_A_DATE = "not-a-date"
    NO_SUCH_DATE = "no-such-date"
    MONTH_NOT_DAY = "month-not-day"
    OTHER_DATE_FORMAT = "other-date-format"
    NOT_A_DATETIME = "not-a-datetime"
    CENSORED_NOT_A_NUMBER = "censored-not-a-number"

    @property
    def rule(self) -> str:
        """The rule id a cell with this problem is reported under."""
        if self is Problem.WRONG_UNIT:
            return "values.wrong-unit"
        if self is Problem.OTHER_DATE_FORMAT:
            return "values.date-format"
        return "values.wrong-type"
