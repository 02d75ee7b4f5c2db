"""Turn a contract into plain-word facts (one list per variable) shared by every dictionary format."""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date

from linter.contract.model import Comparison, Contract, TableContract, Variable, VarType
from linter.read.cells import number_text
from linter.table import column_letter

TYPE_WORDS: dict[VarType, str] = {
    VarType.STRING: "text",
    VarType.INTEGER: "whole number",
    VarType.NUMBER: "number",
    VarType.BOOLEAN: "true or false",
    VarType.DATE: "date",
    VarType.DATETIME: "date and time",
    VarType.CATEGORY: "code from a list",
}
OPERATOR_WORDS: dict[str, str] = {
    "<": "less than",
    "<=": "less than or equal to",
    ">": "greater than",
    ">=": "greater than or equal to",
    "==": "equal to",
    "!=": "different from",
}
SAMPLE_DAY = date(2026, 3, 14)
"""The day every date example shows (written in the agreed format), unless the range excludes it."""
EMPTY_WORDS = "(an empty cell)"


@dataclass(frozen=True)
class VariableFacts:
    """What a provider must know about one column, as labelled sentences."""

    name: str
    letter: str
    """Spreadsheet letter of the column when the columns come in the declared order."""
    kind: str
    """The type in plain words."""
    is_key: bool
    facts: tuple[tuple[str, str], ...]
    """(label, sentence) pairs, e.g. ("Range", "from 0 to 2000 mg/L")."""
    codes: tuple[tuple[str, str], ...]
    """Every allowed code with its label ("" where the code list gives none)."""


@dataclass(frozen=True)
class TableFacts:
    """One table of the contract in plain words."""

    name: str
    unit: str
    """The observational unit: what one row is."""
    key_sentence: str
    other_sentences: tuple[str, ...]
    """Expected grid, extra columns, column order, missing-value codes."""
    rules: tuple[str, ...]
    """Cross-variable rules in words."""
    variables: tuple[VariableFacts, ...]


@dataclass(frozen=True)
class ContractFacts:
    """The whole dictionary; `changes` is filled by a contract comparison when one is available."""

    id: str
    version: str
    title: str
    tables: tuple[TableFacts, ...]
    changes: tuple[str, ...] | None = None
    """What changed since the previous version, one sentence each; None when not compared."""


def bound_text(value: float | str) -> str:
    return value if isinstance(value, str) else number_text(float(value))


def shown_code(code: str) -> str:
    return EMPTY_WORDS if code == "" else code


def listing(names: tuple[str, ...] | list[str]) -> str:
    """`a`, `a and b`, `a, b and c`."""
    if len(names) <= 1:
        return "".join(names)
    return f"{', '.join(names[:-1])} and {names[-1]}"


def date_example(variable: Variable) -> str:
    """The sample day in the agreed form, moved into the allowed range if it falls outside."""
    day = SAMPLE_DAY
    if isinstance(variable.minimum, str) and day < date.fromisoformat(variable.minimum[:10]):
        day = date.fromisoformat(variable.minimum[:10])
    if isinstance(variable.maximum, str) and day > date.fromisoformat(variable.maximum[:10]):
        day = date.fromisoformat(variable.maximum[:10])
    if variable.type is VarType.DATETIME:
        return day.strftime(variable.date_format) if variable.date_format else f"{day.isoformat()}T09:30:00"
    return day.strftime(variable.date_format) if variable.date_format else day.isoformat()


def date_sentence(variable: Variable) -> str:
    example = date_example(variable)
    if variable.date_format is None or variable.date_format == "%Y-%m-%d":
        form = "YYYY-MM-DD (ISO 8601)" if variable.type is VarType.DATE else "YYYY-MM-DDThh:mm:ss (ISO 8601)"
        return f"written as {form}, e.g. {example}"
    return f"written in the agreed form {variable.date_format} (strftime notation), e.g. {example}"


def range_sentence(variable: Variable) -> str | None:
    low, high = variable.minimum, variable.maximum
    unit = f" {variable.unit}" if variable.unit else ""
    if low is not None and high is not None:
        return f"from {bound_text(low)} to {bound_text(high)}{unit}, both included"
    if low is not None:
        return f"at least {bound_text(low)}{unit}" if not isinstance(low, str) else f"on or after {low}"
    if high is not None:
        return f"at most {bound_text(high)}{unit}" if not isinstance(high, str) else f"on or before {high}"
    return None


def censoring_sentence(variable: Variable) -> str | None:
    prefix = variable.censored_prefix
    if not prefix:
        return None
    limit = bound_text(variable.minimum) if isinstance(variable.minimum, float | int) else "0"
    shown = "0.05" if limit == "0" else limit
    return (
        f"A result below the detection limit is written as {prefix} followed by the limit, e.g. "
        f"{prefix}{shown}; it is read as the number {shown} marked as censored, and that number must "
        "still be in range."
    )


def empty_sentence(variable: Variable, table: TableContract, is_key: bool) -> str:
    codes = [shown_code(c) for c in dict.fromkeys((*table.missing, *variable.missing, ""))]
    if is_key or not variable.nullable:
        return "A value is required in every row; an empty cell or a missing-value code is an error."
    return f"May be left empty; a missing value may also be written as {listing(codes)}."


def variable_facts(variable: Variable, table: TableContract, index: int) -> VariableFacts:
    is_key = variable.name in table.keys
    facts: list[tuple[str, str]] = []
    if variable.description:
        facts.append(("Meaning", variable.description))
    facts.append(("Column", "must be in the file" if variable.required else "optional: may be left out"))
    if is_key:
        facts.append(("Key", "part of the key that identifies a row"))
    if variable.unit:
        facts.append(("Unit", f"{variable.unit}; write the number only, without the unit"))
    if variable.type in (VarType.NUMBER, VarType.INTEGER):
        facts.append(
            (
                "Numbers",
                "a point as decimal separator, no thousands separator, e.g. 1234.5"
                if variable.type is VarType.NUMBER
                else "digits only, no decimals, e.g. 42",
            )
        )
    if variable.type in (VarType.DATE, VarType.DATETIME):
        facts.append(("Format", date_sentence(variable)))
    if variable.type is VarType.BOOLEAN:
        facts.append(("Values", "true or false (1 and 0 are also accepted)"))
    bounds = range_sentence(variable)
    if bounds:
        facts.append(("Range", bounds))
    if variable.pattern:
        facts.append(("Pattern", f"the whole text must match the regular expression {variable.pattern}"))
    censoring = censoring_sentence(variable)
    if censoring:
        facts.append(("Below the limit", censoring))
    if variable.codes is not None:
        source = f" (from {variable.codes.source})" if variable.codes.source else ""
        facts.append(
            (
                "Allowed values",
                f"one of the {len(variable.codes.values)} codes listed{source}, "
                "written exactly, in the same letter case",
            )
        )
    if variable.references is not None:
        ref = variable.references
        facts.append(
            (
                "Refers to",
                f"every value must appear in the {ref.column} column of the "
                f"{ref.table} table sent with the same submission",
            )
        )
    facts.append(("Empty cells", empty_sentence(variable, table, is_key)))
    codes = variable.codes
    listed = tuple((c, codes.labels.get(c, "")) for c in codes.values) if codes is not None else ()
    return VariableFacts(
        variable.name, column_letter(index), TYPE_WORDS[variable.type], is_key, tuple(facts), listed
    )


def key_sentence(table: TableContract) -> str:
    """Why the keys identify a row: they name which observational unit the row is about."""
    keys = list(table.keys)
    unit = table.observational_unit
    if not keys:
        return "This table has no key columns, so rows are not checked for duplicates."
    if len(keys) == 1:
        return (
            f"The key column is {keys[0]}. Each row is {unit}, so {keys[0]} says which one it is: "
            "each value may appear in one row only, and it may never be empty."
        )
    return (
        f"The key columns are {listing(keys)}. Each row is {unit}, so these columns together say which "
        "one it is: no two rows may have the same combination of them, and none of them may be empty."
    )


def rule_sentence(rule: Comparison) -> str:
    right = rule.right if isinstance(rule.right, str) else bound_text(rule.right)
    return (
        f"In every row, {rule.left} must be {OPERATOR_WORDS[rule.operator]} {right} (written: {rule.text})."
    )


def other_sentences(table: TableContract) -> tuple[str, ...]:
    said: list[str] = []
    if table.complete_over:
        said.append(
            f"Every combination of the {listing(list(table.complete_over))} values that occur in "
            "the file is expected to have a row; a missing combination is reported."
        )
    extra = {"error": "is an error", "warn": "earns a warning", "allow": "is accepted"}[table.extra_columns]
    said.append(f"A column not listed here {extra}.")
    if table.column_order:
        said.append("The columns must come in the order listed here.")
    codes = [shown_code(c) for c in dict.fromkeys(("", *table.missing))]
    said.append(f"Missing-value codes for the whole table: {listing(codes)}.")
    if table.applies_to:
        said.append(f"Applies to files named {listing(list(table.applies_to))}.")
    return tuple(said)


def table_facts(table: TableContract) -> TableFacts:
    return TableFacts(
        name=table.name,
        unit=table.observational_unit,
        key_sentence=key_sentence(table),
        other_sentences=other_sentences(table),
        rules=tuple(rule_sentence(r) for r in table.comparisons),
        variables=tuple(variable_facts(v, table, i) for i, v in enumerate(table.variables)),
    )


def contract_facts(contract: Contract, changes: tuple[str, ...] | None = None) -> ContractFacts:
    """The dictionary's content; `changes` is the hook for a version comparison (`weir diff`)."""
    return ContractFacts(
        contract.id, contract.version, contract.title, tuple(table_facts(t) for t in contract.tables), changes
    )
