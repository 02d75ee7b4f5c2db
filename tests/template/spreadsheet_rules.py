"""What a spreadsheet program does with a dataValidation: refuse or accept a typed cell value.

Written for the tests from the standard, not from Weir's code, so the two can disagree.
Source: ECMA-376 Office Open XML, Part 1, §18.3.1.32 dataValidation and §18.18.20/§18.18.21
(ST_DataValidationType: none, whole, decimal, list, date, time, textLength, custom;
ST_DataValidationOperator: between, notBetween, equal, notEqual, lessThan, lessThanOrEqual,
greaterThan, greaterThanOrEqual); section numbers from memory.
"""

from __future__ import annotations

import operator
import re
from collections.abc import Callable
from datetime import date, datetime

from openpyxl.workbook.workbook import Workbook
from openpyxl.worksheet.datavalidation import DataValidation

# From memory of the 1900 date system (ECMA-376 Part 1 §18.17.4.1): serial 1 is 1900-01-01 and the
# phantom 1900-02-29 is serial 60, so for days from 1900-03-01 the serial counts from 1899-12-30.
EPOCH = date(1899, 12, 30)

COMPARE: dict[str, Callable[[float, float, float | None], bool]] = {
    "between": lambda v, a, b: b is not None and a <= v <= b,
    "notBetween": lambda v, a, b: b is not None and not a <= v <= b,
    "equal": lambda v, a, _b: v == a,
    "notEqual": lambda v, a, _b: v != a,
    "lessThan": lambda v, a, _b: operator.lt(v, a),
    "lessThanOrEqual": lambda v, a, _b: operator.le(v, a),
    "greaterThan": lambda v, a, _b: operator.gt(v, a),
    "greaterThanOrEqual": lambda v, a, _b: operator.ge(v, a),
}


def list_items(dv: DataValidation, workbook: Workbook) -> list[str]:
    """An inline list `"a,b"` or a range `Sheet!$A$2:$A$9` read from the workbook."""
    formula = dv.formula1 or ""
    if formula.startswith('"'):
        return formula.strip('"').split(",")
    sheet, cells = formula.split("!")
    ws = workbook[sheet.strip("'")]
    return [str(c.value) for row in ws[cells.replace("$", "")] for c in row if c.value is not None]


def as_number(value: object) -> float | None:
    if isinstance(value, bool) or not isinstance(value, int | float | datetime | date):
        return None
    if isinstance(value, datetime):
        return (value - datetime(1899, 12, 30)).total_seconds() / 86400
    if isinstance(value, date):
        return float((value - EPOCH).days)
    return float(value)


def accepts(dv: DataValidation, value: object, workbook: Workbook) -> bool:
    """Whether the program lets `value` (the typed cell value) stand in a cell under `dv`."""
    if value is None or value == "":
        return bool(dv.allow_blank)
    kind = dv.type or "none"
    if kind == "none" or not dv.showErrorMessage:
        return True  # an input message only: nothing is refused
    if kind == "list":
        # From memory of Excel's behaviour: list membership ignores letter case.
        return str(value).casefold() in {item.casefold() for item in list_items(dv, workbook)}
    first = float(dv.formula1)
    second = float(dv.formula2) if dv.formula2 is not None else None
    compare = COMPARE[dv.operator or "between"]
    if kind == "textLength":
        return compare(float(len(str(value))), first, second)
    number = as_number(value)
    if number is None:
        return False  # text in a number or date rule is refused
    if kind == "whole" and not float(number).is_integer():
        return False
    if kind == "date" and not isinstance(value, date):
        return False
    return compare(number, first, second)


def rule_at(workbook: Workbook, sheet: str, cell: str) -> DataValidation | None:
    """The validation covering `cell` (e.g. `D5`) on `sheet`."""
    column = re.sub(r"\d", "", cell)
    row = int(re.sub(r"\D", "", cell))
    for dv in workbook[sheet].data_validations.dataValidation:
        for bounds in dv.sqref.ranges:
            if bounds.min_row <= row <= bounds.max_row and column in letters_between(
                bounds.min_col, bounds.max_col
            ):
                return dv
    return None


def letters_between(low: int, high: int) -> set[str]:
    from openpyxl.utils import get_column_letter

    return {get_column_letter(i) for i in range(low, high + 1)}
