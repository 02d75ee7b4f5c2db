"""Comparison rules: cross-variable rules of a contract (`min_temp <= max_temp`) checked row by row."""

from __future__ import annotations

import operator
from collections.abc import Callable, Iterator
from typing import Any

import pandas as pd

from linter.contract.model import Comparison
from linter.findings import Finding, Severity
from linter.rules.cell_findings import counted, engine_result, place_of, written
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject

define_rule(
    "rows.comparison",
    "Row breaks a cross-variable rule",
    Severity.ERROR,
    """
    Finds rows whose values break a comparison the contract states between two variables, or
    between a variable and a number. One finding per rule, showing only the columns involved.
    Rows where either side is empty or unreadable are left to the other checks.

    Bad:  min_temp 14.2, max_temp 9.8   (rule min_temp <= max_temp)

    Good: min_temp 9.8, max_temp 14.2
    """,
)

OPERATORS: dict[str, Callable[[Any, Any], Any]] = {
    "<": operator.lt,
    "<=": operator.le,
    ">": operator.gt,
    ">=": operator.ge,
    "==": operator.eq,
    "!=": operator.ne,
}


def broken_rows(typed: pd.DataFrame, rule: Comparison) -> pd.Series | None:
    """True where both sides have a value and the comparison is false; None when it cannot be judged."""
    compare = OPERATORS.get(rule.operator)
    if compare is None or rule.left not in typed:
        return None
    left = typed[rule.left]
    if rule.right_is_variable:
        if str(rule.right) not in typed:
            return None
        right: pd.Series | float = typed[str(rule.right)]
    else:
        right = float(rule.right)
    try:
        holds = compare(left, right)
    except TypeError:  # e.g. a date compared with a number: the contract loader reports the rule
        return None
    judged = left.notna() & (right.notna() if isinstance(right, pd.Series) else True)
    return judged & ~holds.fillna(True).astype(bool)


@inspector(needs_contract=True, row_wise=True)
def comparisons(subject: Subject) -> Iterator[Finding]:
    result = engine_result(subject)
    contract = subject.contract
    if result is None or contract is None:
        return
    for rule in contract.comparisons:
        broken = broken_rows(result.typed, rule)
        if broken is None or not broken.any():
            continue
        rows = [int(r) for r in broken.index[broken]]
        columns = [rule.left] + ([str(rule.right)] if rule.right_is_variable else [])
        examples = tuple(", ".join(f"{c}={written(subject, c, [r])[0]}" for c in columns) for r in rows[:5])
        yield Finding(
            rule="rows.comparison",
            severity=Severity.ERROR,
            message=f"{counted(len(rows), 'row', 'breaks', 'break')} the rule {rule.text}.",
            place=place_of(subject, columns, rows),
            count=len(rows),
            examples=examples,
            fix=f"correct {' or '.join(columns)} on these rows so that {rule.text} holds",
            evidence={"rule": rule.text},
        )
