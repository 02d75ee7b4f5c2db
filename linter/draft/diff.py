"""What changed between two versions of a contract, each change judged breaking for providers or not."""

from __future__ import annotations

from collections.abc import Callable, Iterator
from dataclasses import dataclass

from linter.contract.model import Contract, TableContract, Variable, VarType

LOOSER_TYPES: dict[VarType, frozenset[VarType]] = {
    VarType.INTEGER: frozenset({VarType.NUMBER, VarType.STRING}),
    VarType.NUMBER: frozenset({VarType.STRING}),
    VarType.CATEGORY: frozenset({VarType.STRING}),
    VarType.DATE: frozenset({VarType.DATETIME, VarType.STRING}),
    VarType.DATETIME: frozenset({VarType.STRING}),
    VarType.BOOLEAN: frozenset({VarType.STRING}),
    VarType.STRING: frozenset(),
}
"""old type -> new types that accept every value the old one accepted (text accepts anything)."""
Make = Callable[[str, bool, str], "Change"]


@dataclass(frozen=True)
class Change:
    """One difference between the old and the new contract."""

    table: str
    subject: str
    """The variable or table-level entry that changed, e.g. `result` or `keys`."""
    what: str
    """Short stable kind, e.g. `variable-added`, `max-lowered`, `codes-removed`."""
    breaking: bool
    """True when a file that passed the old contract may fail the new one."""
    message: str
    """One sentence a provider can act on."""


def contract_changes(old: Contract, new: Contract) -> tuple[Change, ...]:
    """Every change from `old` to `new`, in table then variable order (pure; nothing is read)."""
    changes: list[Change] = []
    old_tables = {t.name: t for t in old.tables}
    new_tables = {t.name: t for t in new.tables}
    if len(old.tables) == 1 and len(new.tables) == 1:
        old_tables = {new.tables[0].name: old.tables[0]}  # a renamed one-table contract is the same table
    for name, table in new_tables.items():
        before = old_tables.get(name)
        if before is None:
            changes.append(Change(name, name, "table-added", False, f"New table {name}: send it when asked."))
        else:
            changes.extend(table_changes(before, table))
    for name in old_tables:
        if name not in new_tables:
            changes.append(Change(name, name, "table-removed", False, f"Table {name} is no longer expected."))
    return tuple(changes)


def table_changes(old: TableContract, new: TableContract) -> Iterator[Change]:
    t = new.name

    def change(subject: str, what: str, breaking: bool, message: str) -> Change:
        return Change(t, subject, what, breaking, message)

    for variable in new.variables:
        before = old.variable(variable.name)
        if before is None:
            if variable.required:
                yield change(variable.name, "variable-added", True, f"Add the new column {variable.name}.")
            else:
                yield change(
                    variable.name, "variable-added", False, f"You may add the new column {variable.name}."
                )
        else:
            yield from variable_changes(t, before, variable)
    for variable in old.variables:
        if new.variable(variable.name) is None:
            breaking = new.extra_columns == "error"
            yield change(
                variable.name,
                "variable-removed",
                breaking,
                f"Column {variable.name} is no longer declared"
                + ("; remove it from your files." if breaking else "; you may leave it out."),
            )
    if old.keys != new.keys:
        added = [k for k in new.keys if k not in old.keys]
        removed = [k for k in old.keys if k not in new.keys]
        detail = (
            "; ".join(
                part
                for part in (
                    f"new key column {', '.join(added)}" if added else "",
                    f"{', '.join(removed)} no longer in the key" if removed else "",
                )
                if part
            )
            or "key columns reordered"
        )
        # fewer key columns make rows that were distinct collide; more forbid empty cells in them
        yield change(
            "keys",
            "keys-changed",
            bool(added or removed),
            f"Rows are now identified by {', '.join(new.keys) or 'nothing'} ({detail}).",
        )
    yield from set_changes(t, "missing", set(old.missing), set(new.missing), removed_breaks=True)
    old_rules, new_rules = {c.text for c in old.comparisons}, {c.text for c in new.comparisons}
    for text in sorted(new_rules - old_rules):
        yield change("rules", "rule-added", True, f"Every row must now keep {text}.")
    for text in sorted(old_rules - new_rules):
        yield change("rules", "rule-removed", False, f"Rows no longer need to keep {text}.")
    if set(old.complete_over) != set(new.complete_over):
        yield change(
            "complete_over",
            "grid-changed",
            False,
            "The expected grid of rows is now over "
            + (", ".join(new.complete_over) or "nothing")
            + " (a gap is a warning only).",
        )
    strict = {"allow": 0, "warn": 1, "error": 2}
    if old.extra_columns != new.extra_columns:
        tighter = strict[new.extra_columns] > strict[old.extra_columns]
        yield change(
            "extra_columns",
            "extra-columns-" + ("tightened" if tighter else "loosened"),
            new.extra_columns == "error",
            f"Undeclared columns now earn: {new.extra_columns} (was {old.extra_columns}).",
        )
    if set(old.applies_to) != set(new.applies_to):
        yield change(
            "applies_to",
            "file-names-changed",
            False,
            "The contract now governs files named "
            + (", ".join(new.applies_to) or "as the settings say")
            + ".",
        )
    if old.column_order != new.column_order:
        yield change(
            "column_order",
            "order-changed",
            False,
            "Columns must now come in the declared order (a warning)."
            if new.column_order
            else "Columns may come in any order.",
        )


def variable_changes(table: str, old: Variable, new: Variable) -> Iterator[Change]:
    name = new.name

    def change(what: str, breaking: bool, message: str) -> Change:
        return Change(table, name, what, breaking, f"{name}: {message}")

    if old.type != new.type:
        looser = new.type in LOOSER_TYPES[old.type]
        yield change("type-changed", not looser, f"now {new.type} (was {old.type}).")
    if old.required != new.required:
        yield change(
            "required-changed",
            new.required,
            "the column is now required." if new.required else "the column may now be left out.",
        )
    if old.nullable != new.nullable:
        yield change(
            "nullable-changed",
            not new.nullable,
            "every cell must now hold a value." if not new.nullable else "cells may now be empty.",
        )
    yield from bound_changes(change, old.minimum, new.minimum, "min", lower_is_looser=True)
    yield from bound_changes(change, old.maximum, new.maximum, "max", lower_is_looser=False)
    old_codes = set(old.codes.values) if old.codes else None
    new_codes = set(new.codes.values) if new.codes else None
    if old_codes is not None and new_codes is not None:
        if old_codes - new_codes:
            removed = ", ".join(sorted(old_codes - new_codes))
            yield change("codes-removed", True, f"codes {removed} are no longer allowed.")
        if new_codes - old_codes:
            yield change(
                "codes-added", False, f"codes {', '.join(sorted(new_codes - old_codes))} are now allowed."
            )
    elif new_codes is not None and old.type is new.type:
        yield change("codes-added", True, f"values must now be one of {len(new_codes)} codes.")
    if old.pattern != new.pattern:
        if new.pattern is None:
            yield change("pattern-removed", False, "values no longer need to match a pattern.")
        else:
            # Whether one regular expression accepts all another accepts is not decided here: any
            # new or changed pattern may reject values that passed, so it counts as breaking.
            yield change("pattern-changed", True, f"values must now match {new.pattern}.")
    if old.unit != new.unit:
        yield change("unit-changed", new.unit is not None, f"the unit is now {new.unit or 'not declared'}.")
    if old.date_format != new.date_format:
        yield change(
            "date-format-changed", True, f"dates must now be written as {new.date_format or 'ISO 8601'}."
        )
    if old.censored_prefix != new.censored_prefix:
        yield change(
            "censoring-changed",
            old.censored_prefix is not None,
            f"a value below the detection limit is now written {new.censored_prefix}LIMIT."
            if new.censored_prefix is not None
            else f"a value below the detection limit may no longer be written {old.censored_prefix}LIMIT; "
            "ask the data manager how to report it.",
        )
    if old.references != new.references:
        yield change(
            "reference-changed",
            new.references is not None,
            f"values must now appear in {new.references}."
            if new.references
            else "no longer checked against another table.",
        )
    yield from set_changes(table, name, set(old.missing), set(new.missing), removed_breaks=True)


def bound_changes(
    change: Make, old: float | str | None, new: float | str | None, key: str, lower_is_looser: bool
) -> Iterator[Change]:
    if old == new:
        return
    old_text, new_text = bound_text(old), bound_text(new)
    if new is None:
        yield change(f"{key}-removed", False, f"no {key} any more (was {old_text}).")
        return
    if old is None:
        side = "at least" if key == "min" else "at most"
        yield change(f"{key}-added", True, f"values must now be {side} {new_text}.")
        return
    if isinstance(old, str) != isinstance(new, str):
        yield change(f"{key}-changed", True, f"{key} is now {new_text} (was {old_text}).")
        return
    lowered = new < old  # type: ignore[operator]  # both numbers, or both ISO 8601 texts (ordered as text)
    looser = lowered if lower_is_looser else not lowered
    word = "lowered" if lowered else "raised"
    yield change(f"{key}-{word}", not looser, f"{key} is now {new_text} (was {old_text}).")


def bound_text(value: float | str | None) -> str:
    """A bound as people write it: 500, not 500.0."""
    if isinstance(value, float) and value.is_integer():
        return str(int(value))
    return str(value)


def set_changes(
    table: str, subject: str, old: set[str], new: set[str], removed_breaks: bool
) -> Iterator[Change]:
    for code in sorted(new - old):
        yield Change(
            table, subject, "missing-added", False, f"{subject}: {code!r} now counts as a missing value."
        )
    for code in sorted(old - new):
        yield Change(
            table,
            subject,
            "missing-removed",
            removed_breaks,
            f"{subject}: {code!r} no longer counts as a missing value; leave the cell empty instead.",
        )


def provider_summary(old: Contract, new: Contract, changes: tuple[Change, ...]) -> str:
    """Plain text a data manager can send to partners: what they must change, and what they may."""
    breaking = [c for c in changes if c.breaking]
    compatible = [c for c in changes if not c.breaking]
    lines = [f"Contract {new.id}: version {old.version} -> {new.version}", ""]
    if not changes:
        lines.append("Nothing changed that affects your files.")
    if breaking:
        lines.append(f"What you must change in your files ({len(breaking)}):")
        lines.extend(f"  - [{c.table}] {c.message}" for c in breaking)
    if compatible:
        if breaking:
            lines.append("")
        lines.append(f"What you may do, but need not ({len(compatible)}):")
        lines.extend(f"  - [{c.table}] {c.message}" for c in compatible)
    if breaking and old.version == new.version:
        lines.extend(
            ["", f"Note for the data manager: breaking changes but the version is still {new.version}."]
        )
    return "\n".join(lines) + "\n"


def changes_json(old: Contract, new: Contract, changes: tuple[Change, ...]) -> dict[str, object]:
    """The comparison as JSON-ready data, for CI jobs that gate a contract change."""
    return {
        "weir_contract_diff": 1,
        "contract": new.id,
        "old_version": old.version,
        "new_version": new.version,
        "breaking": sum(c.breaking for c in changes),
        "compatible": sum(not c.breaking for c in changes),
        "changes": [
            {
                "table": c.table,
                "subject": c.subject,
                "kind": c.what,
                "breaking": c.breaking,
                "message": c.message,
            }
            for c in changes
        ],
    }
