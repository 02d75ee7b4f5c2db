"""Example rows for a template: valid values written exactly as Weir reads them back from the file."""

from __future__ import annotations

import re
from datetime import date, timedelta

from linter.contract.model import TableContract, Variable, VarType
from linter.dictionary.facts import date_example
from linter.read.cells import number_text
from linter.template.pattern_example import pattern_example

EXAMPLE_COUNT = 2
NUMERIC = (VarType.NUMBER, VarType.INTEGER)
DESCRIBED = re.compile(r"\be\.g\.,?\s+(\S+)")


def number_example(variable: Variable, variant: int) -> float:
    low = variable.minimum if isinstance(variable.minimum, int | float) else None
    high = variable.maximum if isinstance(variable.maximum, int | float) else None
    if low is not None and high is not None:
        value = low + (high - low) * (0.5 + 0.05 * variant)  # mid-range: typical, far from both ends
    elif low is not None:
        value = low + 1.5 + variant
    elif high is not None:
        value = high - 1.5 - variant
    else:
        value = 1.5 + variant
    return float(round(value)) if variable.type is VarType.INTEGER else round(value, 2)


def date_value(variable: Variable, variant: int) -> str:
    """The dictionary's sample day, `variant` days later while that stays in range."""
    if variable.type is VarType.DATETIME or variable.date_format not in (None, "%Y-%m-%d"):
        return date_example(variable)
    day = date.fromisoformat(date_example(variable)) + timedelta(days=variant)
    if isinstance(variable.maximum, str) and day > date.fromisoformat(variable.maximum[:10]):
        day = date.fromisoformat(variable.maximum[:10])
    return day.isoformat()


def described_example(variable: Variable) -> str | None:
    """The example the description itself gives ("e.g. VB-014"), when it fits the pattern."""
    found = DESCRIBED.search(variable.description)
    if found is None or variable.pattern is None:
        return None
    text = found.group(1).rstrip(".,;:)")
    return text if re.fullmatch(variable.pattern, text) else None


def value_example(variable: Variable, variant: int) -> str | None:
    """One valid cell for `variable` as text, or None when Weir cannot write one with confidence."""
    kind = variable.type
    if variable.codes is not None and variable.codes.values:
        return variable.codes.values[variant % len(variable.codes.values)]
    if kind is VarType.BOOLEAN:
        return "true" if variant % 2 == 0 else "false"
    if kind in NUMERIC:
        return number_text(number_example(variable, variant))
    if kind in (VarType.DATE, VarType.DATETIME):
        return date_value(variable, variant)
    if variable.pattern:
        given = described_example(variable)
        if variant == 0 and given is not None:
            return given
        return pattern_example(variable.pattern, variant)
    return f"example {variant + 1}"


def respect_comparisons(row: dict[str, str | None], table: TableContract) -> None:
    """Order numeric example values so the table's cross-variable rules hold (a <= b keeps a <= b)."""
    for rule in table.comparisons:
        left = row.get(rule.left)
        if not rule.right_is_variable or not isinstance(rule.right, str) or left is None:
            continue
        right = row.get(rule.right)
        left_var, right_var = table.variable(rule.left), table.variable(rule.right)
        if right is None or left_var is None or right_var is None:
            continue
        if left_var.type not in NUMERIC or right_var.type not in NUMERIC:
            continue
        a, b = float(left), float(right)
        if (rule.operator in ("<", "<=") and a > b) or (rule.operator in (">", ">=") and a < b):
            row[rule.left], row[rule.right] = right, left
        elif rule.operator == "==":
            row[rule.right] = left


def example_rows(table: TableContract, count: int = EXAMPLE_COUNT) -> tuple[tuple[str | None, ...], ...]:
    """`count` valid rows in column order, or none at all when any required value cannot be written.

    Strict comparisons (`<`, `>`) between equal examples are left unordered; such a table gets no
    examples rather than wrong ones.
    """
    rows: list[tuple[str | None, ...]] = []
    for variant in range(count):
        row = {v.name: value_example(v, variant) for v in table.variables}
        if any(value is None for value in row.values()):
            return ()
        respect_comparisons(row, table)
        if any(strictly_equal(row, table)):
            return ()
        rows.append(tuple(row[v.name] for v in table.variables))
    keys = [tuple(r[table.names.index(k)] for k in table.keys) for r in rows]
    return tuple(rows) if len(set(keys)) == len(keys) else ()


def strictly_equal(row: dict[str, str | None], table: TableContract) -> list[bool]:
    return [
        rule.operator in ("<", ">", "!=")
        and isinstance(rule.right, str)
        and row.get(rule.left) == row.get(rule.right)
        for rule in table.comparisons
        if rule.right_is_variable
    ]
