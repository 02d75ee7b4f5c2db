"""Value rules: each cell against its variable's type, unit, date format, range and nullability."""

from __future__ import annotations

from collections.abc import Iterator

import numpy as np
import pandas as pd

from linter.contract.convert import Converted
from linter.contract.model import Variable, VarType
from linter.contract.problems import Problem
from linter.findings import Finding, Severity
from linter.rules.cell_findings import column_finding, counted, engine_result, plural, written
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject

define_rule(
    "values.missing",
    "Empty cell in a variable that must have a value",
    Severity.ERROR,
    """
    Finds empty cells, and cells holding a missing-value code, in a variable the contract
    declares as not nullable (key columns are reported by keys.missing instead).

    Bad:  result is required for every row, but row 7 is empty or says NA.

    Good: every row has a result; a value below the detection limit is written <0.05.
    """,
)
define_rule(
    "values.wrong-type",
    "Value that is not of the declared type",
    Severity.ERROR,
    """
    Finds cells that cannot be read as the variable's declared type (number, integer,
    boolean, date, date-time), with a specific hint for the usual causes: a thousands
    separator, a decimal comma, a unit written in the cell, a day that does not exist.

    Bad:  result (number, mg/L): 1,234 | 12 mg/L | about 3

    Good: result: 1234 | 12 | 3
    """,
)
define_rule(
    "values.wrong-unit",
    "Value written with another unit than the declared one",
    Severity.ERROR,
    """
    Finds numbers written together with a unit that differs from the variable's declared
    unit, which usually means the value was measured or reported on another scale.

    Bad:  result (unit mg/L): 12 ug/L

    Good: result: 0.012   (converted to mg/L, number alone)
    """,
)
define_rule(
    "values.date-format",
    "Valid date not written in the agreed format",
    Severity.ERROR,
    """
    Finds real dates written in another form than the agreed one (ISO 8601 YYYY-MM-DD unless
    the contract gives a date_format). Weir shows the date in the agreed form, and both
    readings when day and month cannot be told apart.

    Bad:  sampled_on: 03/02/2026 | 20260302 | 2 Mar 2026

    Good: sampled_on: 2026-03-02
    """,
)
define_rule(
    "values.out-of-range",
    "Value below the minimum or above the maximum",
    Severity.ERROR,
    """
    Finds numbers or dates outside the variable's declared min/max. A censored value such as
    <0.05 is checked by its detection limit 0.05.

    Bad:  result (min 0): -0.4

    Good: result: 0.4
    """,
)
WRONG_TYPE_NAMES = {
    VarType.NUMBER: "a number",
    VarType.INTEGER: "a whole number",
    VarType.BOOLEAN: "true or false",
    VarType.DATE: "a date",
    VarType.DATETIME: "a date and time",
}


def bound_text(bound: float | str) -> str:
    """A bound as a provider writes it: 0 and 2000 rather than 0.0 and 2000.0; dates as given."""
    return f"{bound:g}" if isinstance(bound, float) else str(bound)


def agreed_date_form(variable: Variable) -> str:
    if variable.date_format:
        return f"the agreed form {variable.date_format}"
    if variable.type is VarType.DATETIME:
        return "ISO 8601 YYYY-MM-DDThh:mm:ss"
    return "ISO 8601 YYYY-MM-DD"


def problem_hint(problem: Problem, found: str, suggestion: object, variable: Variable) -> str:
    """The specific instruction for one kind of conversion failure, using one cell as the example."""
    unit = variable.unit or "the contract's unit"
    hints = {
        Problem.THOUSANDS_SEPARATOR: f"write {suggestion} without the thousands separator (found {found!r})",
        Problem.DECIMAL_COMMA: f"write {suggestion} with a decimal point (found {found!r})",
        Problem.UNIT_IN_CELL: f"write the number alone, {suggestion}; the unit ({unit}) is set by the "
        f"contract, not the cell (found {found!r})",
        Problem.NOT_AN_INTEGER: f"write a whole number (found {found!r})",
        Problem.INTEGER_TOO_LARGE: f"{found!r} is too long to be one whole number; if it is an "
        "identifier, the contract should give this column type string",
        Problem.NOT_A_NUMBER: f"write a number such as 0.25 (found {found!r}); leave the cell empty "
        "or use a missing-value code when there is no value",
        Problem.CENSORED_NOT_A_NUMBER: f"write the detection limit after the marker, e.g. "
        f"{variable.censored_prefix}0.05 (found {found!r})",
        Problem.NOT_A_BOOLEAN: f"write true or false (found {found!r})"
        + (f"; {found!r} reads as {suggestion}" if suggestion else ""),
        Problem.NOT_A_DATE: f"write a date in {agreed_date_form(variable)}, e.g. 2026-03-02 "
        f"(found {found!r})",
        Problem.NO_SUCH_DATE: f"the calendar has no such day: correct {found!r}",
        Problem.MONTH_NOT_DAY: f"give the whole day, e.g. {found}-01 if that is right (found {found!r})",
        Problem.NOT_A_DATETIME: f"write a date and time in {agreed_date_form(variable)} (found {found!r})",
    }
    return hints.get(problem, f"correct {found!r}")


def _conversion_findings(subject: Subject, rule: str) -> Iterator[Finding]:
    result = engine_result(subject)
    if result is None or subject.contract is None:
        return
    for name, converted in result.converted.items():
        variable = subject.contract.variable(name)
        mine = converted.failing_by_rule.get(rule)
        if variable is None or mine is None or mine.empty:
            continue
        rows = mine.index.to_numpy(dtype=np.int64)
        hints: list[str] = []
        kinds: dict[str, int] = {}
        # Per problem (in the order of their names), its first cell as the example, and its count.
        which, problems = pd.factorize(mine.to_numpy(dtype=object))
        firsts = np.unique(which, return_index=True)[1]
        counts = np.bincount(which)
        for at in sorted(range(len(problems)), key=lambda i: str(problems[i])):
            first = int(rows[firsts[at]])
            found = written(subject, name, [first])[0]
            hints.append(problem_hint(Problem(problems[at]), found, converted.suggestion[first], variable))
            kinds[str(problems[at])] = int(counts[at])
        fix = (
            "; ".join(hints)
            if rule == "values.wrong-type"
            else _format_fix(subject, variable, converted, rows)
        )
        yield column_finding(
            subject,
            rule,
            name,
            rows,
            _conversion_message(rule, variable, len(rows)),
            fix,
            evidence={"problems": kinds},
        )


def _conversion_message(rule: str, variable: Variable, count: int) -> str:
    cells = plural(count, "cell")
    if rule == "values.wrong-unit":
        verb = "carries" if count == 1 else "carry"
        return f"{cells} in {variable.name} {verb} a unit other than {variable.unit}."
    if rule == "values.date-format":
        verb = "holds" if count == 1 else "hold"
        return f"{cells} in {variable.name} {verb} a real date not written in {agreed_date_form(variable)}."
    kind = WRONG_TYPE_NAMES.get(variable.type, str(variable.type))
    return f"{cells} in {variable.name} cannot be read as {kind}."


def _format_fix(subject: Subject, variable: Variable, converted: Converted, rows: np.ndarray) -> str:
    first = int(rows[0])
    found = written(subject, variable.name, [first])[0]
    suggestion = str(converted.suggestion[first])
    if variable.unit and converted.reason[first] == Problem.WRONG_UNIT:
        return f"convert to {variable.unit} and write the number alone (found {found!r}, in {suggestion})"
    if " or " in suggestion:
        return f"write {suggestion} (found {found!r}; day and month cannot be told apart, so check which)"
    return f"write {suggestion} (found {found!r}); use {agreed_date_form(variable)} throughout"


@inspector(needs_contract=True, row_wise=True)
def wrong_type(subject: Subject) -> Iterator[Finding]:
    return _conversion_findings(subject, "values.wrong-type")


@inspector(needs_contract=True, row_wise=True)
def wrong_unit(subject: Subject) -> Iterator[Finding]:
    return _conversion_findings(subject, "values.wrong-unit")


@inspector(needs_contract=True, row_wise=True)
def date_format(subject: Subject) -> Iterator[Finding]:
    return _conversion_findings(subject, "values.date-format")


@inspector(needs_contract=True, row_wise=True)
def missing_values(subject: Subject) -> Iterator[Finding]:
    result = engine_result(subject)
    if result is None or subject.contract is None:
        return
    for name, converted in result.converted.items():
        variable = subject.contract.variable(name)
        if variable is None or name in subject.contract.keys:
            continue
        flagged = set(result.failing(name, "nullable")["row"].astype(int))
        # pandera sees a failed conversion as null too; that cell is a wrong-type finding, not a missing one.
        hit = converted.missing & converted.missing.index.isin(list(flagged))
        rows = [int(r) for r in converted.missing.index[hit]]
        if rows:
            yield column_finding(
                subject,
                "values.missing",
                name,
                rows,
                f"{counted(len(rows), 'row', 'has', 'have')} no value in {name}, "
                "which must always be filled in.",
                f"fill in {name} for every row"
                + (
                    f"; write a value below the detection limit as {variable.censored_prefix}LIMIT"
                    if variable.censored_prefix
                    else ""
                ),
            )
    result.raise_if_unrun("nullable")


@inspector(needs_contract=True, row_wise=True)
def out_of_range(subject: Subject) -> Iterator[Finding]:
    result = engine_result(subject)
    if result is None or subject.contract is None:
        return
    for name in result.converted:
        variable = subject.contract.variable(name)
        failing = result.failing(name, "range")
        if variable is None or failing.empty:
            continue
        rows = failing["row"].astype("int64").tolist()
        bounds = " and ".join(
            text
            for text in (
                f"at least {bound_text(variable.minimum)}" if variable.minimum is not None else "",
                f"at most {bound_text(variable.maximum)}" if variable.maximum is not None else "",
            )
            if text
        )
        censored = int(result.converted[name].censored[rows].sum())
        yield column_finding(
            subject,
            "values.out-of-range",
            name,
            rows,
            f"In {name}, {counted(len(rows), 'value', 'is', 'are')} outside the agreed range: "
            f"values must be {bounds}.",
            f"check these values and correct them to be {bounds}"
            + (f" ({censored} are censored; their detection limit is what is compared)" if censored else ""),
            evidence={"minimum": variable.minimum, "maximum": variable.maximum},
        )
    result.raise_if_unrun("range")
