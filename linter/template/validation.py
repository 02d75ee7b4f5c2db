"""What the spreadsheet itself can enforce for one variable, as data (turned into dataValidation later)."""

from __future__ import annotations

from dataclasses import dataclass, replace
from datetime import date

from linter.contract.model import Variable, VarType
from linter.dictionary.facts import date_sentence
from linter.read.cells import number_text
from linter.template.pattern_example import text_width

# From memory of Excel's limits: an inline list (formula1 in quotes) holds at most 255 characters,
# a prompt or error text 255 characters, and their titles 32.
INLINE_LIST_LIMIT = 255
TEXT_LIMIT = 255
TITLE_LIMIT = 32
EXCEL_EPOCH = date(1899, 12, 30)
"""Day zero of the 1900 date system as serial numbers count it (serial 60 is the phantom 1900-02-29)."""
FIRST_DAY, LAST_DAY = date(1900, 3, 1), date(9999, 12, 31)
LARGEST = 9.99e307
"""Bounds for a number with no range, so the rule still refuses text."""


@dataclass(frozen=True)
class CellRule:
    """One spreadsheet data validation: ECMA-376 dataValidation attributes, in plain values."""

    kind: str
    """`list`, `whole`, `decimal`, `date`, `textLength`, or `none` (an input message only)."""
    operator: str | None = None
    """`between`, `greaterThanOrEqual`, `lessThanOrEqual` (None for list and none)."""
    formula1: str | None = None
    formula2: str | None = None
    prompt: str = ""
    error: str = ""
    allow_blank: bool = True


def serial(day: date) -> int:
    """The spreadsheet serial number of a day in the 1900 date system (days since 1899-12-30)."""
    return (day - EXCEL_EPOCH).days


def inline_list(codes: tuple[str, ...]) -> str | None:
    """`"A,B,C"` when the codes fit an inline list; None when they must live on a sheet."""
    text = ",".join(codes)
    if (
        any("," in c or '"' in c or c != c.strip() or c == "" for c in codes)
        or len(text) + 2 > INLINE_LIST_LIMIT
    ):
        return None
    return f'"{text}"'


def bounded(kind: str, low: str | None, high: str | None) -> tuple[str, str, str | None]:
    """(operator, formula1, formula2) for a range with one or two ends."""
    if low is not None and high is not None:
        return "between", low, high
    if low is not None:
        return "greaterThanOrEqual", low, None
    if high is not None:
        return "lessThanOrEqual", high, None
    if kind == "date":
        return "between", str(serial(FIRST_DAY)), str(serial(LAST_DAY))
    return "between", number_text(-LARGEST), number_text(LARGEST)


def short(text: str) -> str:
    return text if len(text) <= TEXT_LIMIT else text[: TEXT_LIMIT - 1] + "…"


def number_bound(value: float | str | None) -> str | None:
    return None if value is None or isinstance(value, str) else number_text(float(value))


def date_bound(value: float | str | None) -> str | None:
    return None if not isinstance(value, str) else str(serial(date.fromisoformat(value[:10])))


def is_iso_date(variable: Variable) -> bool:
    return variable.type is VarType.DATE and variable.date_format in (None, "%Y-%m-%d")


def cell_rule(variable: Variable, is_key: bool, list_source: str | None) -> CellRule:
    """The rule for one column, its refusal saying how to write a missing value in this template."""
    rule = strongest_rule(variable, is_key, list_source)
    if rule.kind == "none" or not rule.allow_blank:
        return rule
    return replace(rule, error=short(f"{rule.error} Leave the cell empty when the value is missing."))


def strongest_rule(variable: Variable, is_key: bool, list_source: str | None) -> CellRule:
    """The strongest rule the spreadsheet can apply without refusing a value Weir accepts as data.

    `list_source` is the inline list or the sheet range holding the codes. Missing-value codes
    other than an empty cell are refused by numeric, date and list rules: the template asks for
    an empty cell instead, and says so in its instructions.
    """
    blank = variable.nullable and not is_key
    unit = f" in {variable.unit}" if variable.unit else ""
    if variable.codes is not None and list_source is not None:
        return CellRule(
            "list",
            None,
            list_source,
            None,
            short("Choose a code from the list."),
            short(f"{variable.name} must be one of the listed codes, written exactly."),
            blank,
        )
    if variable.type is VarType.BOOLEAN:
        return CellRule(
            "list",
            None,
            '"true,false"',
            None,
            "Choose true or false.",
            f"{variable.name} must be true or false.",
            blank,
        )
    if variable.type in (VarType.NUMBER, VarType.INTEGER) and not variable.censored_prefix:
        kind = "whole" if variable.type is VarType.INTEGER else "decimal"
        low, high = number_bound(variable.minimum), number_bound(variable.maximum)
        operator, first, second = bounded(kind, low, high)
        what = "a whole number" if kind == "whole" else "a number"
        limits = " ".join(p for p in (f"from {low}" if low else "", f"to {high}" if high else "") if p)
        return CellRule(
            kind,
            operator,
            first,
            second,
            short(f"Write {what}{unit} {limits}".strip() + "."),
            short(f"{variable.name} must be {what} {limits}".strip() + "."),
            blank,
        )
    if is_iso_date(variable):
        low, high = date_bound(variable.minimum), date_bound(variable.maximum)
        operator, first, second = bounded("date", low, high)
        words = " ".join(
            p
            for p in (
                f"on or after {variable.minimum}" if low else "",
                f"on or before {variable.maximum}" if high else "",
            )
            if p
        )
        return CellRule(
            "date",
            operator,
            first,
            second,
            short(f"Write a date as YYYY-MM-DD {words}".strip() + "."),
            short(f"{variable.name} must be a date {words}".strip() + "."),
            blank,
        )
    if variable.pattern:
        shortest, longest = text_width(variable.pattern)
        guide = short(f"Text matching {variable.pattern}.")
        if longest is not None and longest > 0:
            operator = "between" if shortest != longest else "equal"
            second = str(longest) if operator == "between" else None
            return CellRule(
                "textLength",
                operator,
                str(shortest),
                second,
                guide,
                short(
                    f"{variable.name} must be {shortest}"
                    + (f" to {longest}" if second else "")
                    + f" characters long, matching {variable.pattern}."
                ),
                blank,
            )
        return CellRule("none", prompt=guide, allow_blank=blank)
    if variable.censored_prefix:
        return CellRule(
            "none",
            prompt=short(f"A number{unit}, or {variable.censored_prefix}LIMIT below the detection limit."),
            allow_blank=blank,
        )
    if variable.type in (VarType.DATE, VarType.DATETIME):
        # A date in an agreed non-ISO form (or a date-time) stays text, so the program cannot rewrite it.
        return CellRule("none", prompt=short(f"Dates are {date_sentence(variable)}."), allow_blank=blank)
    words = {VarType.STRING: "Any text", VarType.CATEGORY: "A code"}.get(variable.type, variable.type.value)
    return CellRule("none", prompt=short(variable.description or f"{words}{unit}."), allow_blank=blank)
