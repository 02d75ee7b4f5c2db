"""Observational-unit rules on one table: columns that describe another unit, and probable entry errors."""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import PurePath

import pandas as pd

from linter.findings import Finding, Severity
from linter.profile.evidence import EntryError, MixedUnits, entry_errors, mixed_units
from linter.reshape.normalise import SplitByUnit, UnitTable
from linter.rules.cell_findings import place_of, plural, quoted
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject

PROFILE_ROW_LIMIT = 500_000
"""Tables longer than this are not profiled for units (the search would hold up the check)."""

define_rule(
    "units.mixed",
    "Table holds more than one kind of observational unit",
    Severity.WARNING,
    """
    Finds columns that depend on only part of the key, or on a column that is not a key: they
    describe another unit (a site, a laboratory) and repeat its values on every row of it.
    The finding names the determining columns, the columns that depend on them, example rows
    and counts, and carries a split_by_unit step into tables in Boyce-Codd normal form (third
    normal form where BCNF would lose a dependency), each with its key and the reference
    linking them. Without a contract it reports only strong evidence: 20 rows or more, and a
    determinant whose values repeat (at most a third as many values as rows, two or more
    repeated); tables over 500,000 rows are not profiled.

    Bad:  site_id, sampled_on, river, latitude, nitrate: every sample row repeats its site's
          river and latitude
    Good: sites (site_id, river, latitude) and samples (site_id, sampled_on, nitrate), joined on
          site_id
    """,
)
define_rule(
    "units.probable-entry-error",
    "Value breaks a dependency that all other rows keep",
    Severity.WARNING,
    """
    Finds a column that depends on another on all but a few rows (at most 5% of the rows and
    10 rows; the g3 measure of approximate functional dependencies): the few rows that break it
    are probably typing slips. It lists those rows, their value and the value the other rows
    of the same group hold.

    Bad:  site VB-014 has river "Vell" on eleven rows and "Vel" on row 9
    Good: site VB-014 has river "Vell" on every row
    """,
)


def _unit_name(subject: Subject) -> str:
    if subject.contract is not None:
        return subject.contract.name
    return PurePath(subject.table.source).stem or "rows"


def _letters(subject: Subject, columns: list[str]) -> str:
    return ", ".join(f"{c} ({subject.frame.letter(c)})" for c in columns)


def _profiled(subject: Subject) -> pd.DataFrame | None:
    body = subject.frame.body
    if len(body) > PROFILE_ROW_LIMIT or body.shape[1] == 0:
        return None
    return body


@inspector()
def mixed_unit_tables(subject: Subject) -> Iterator[Finding]:
    body = _profiled(subject)
    if body is None:
        return
    declared = tuple(subject.contract.keys) if subject.contract is not None else ()
    found = mixed_units(body, declared, _unit_name(subject))
    if found is not None:
        yield _mixed_finding(subject, body, found)


def _mixed_finding(subject: Subject, body: pd.DataFrame, found: MixedUnits) -> Finding:
    main, *others = found.split.tables
    rows = subject.frame.rows
    parts, units, columns, repeats = [], [], [], []
    first_rows: list[int] = []
    examples: list[str] = []
    for table in others:
        described = [c for c in table.columns if c not in table.key]
        groups = body.groupby(list(table.key), dropna=False, sort=False).indices
        repeated = len(body) - len(groups)
        repeats.append(repeated)
        parts.append(
            f"{', '.join(described)} {'depends' if len(described) == 1 else 'depend'} only on "
            f"{', '.join(table.key)}: {'it describes' if len(described) == 1 else 'they describe'} "
            f"{table.name}, not {main.name} ({plural(repeated, 'row')} repeat them)"
        )
        biggest = max(groups.values(), key=len)
        if not first_rows:
            first_rows = [rows[int(p)] for p in biggest]
        values = body.iloc[int(biggest[0])]
        examples.append(
            ", ".join(f"{c}={'' if pd.isna(values[c]) else values[c]}" for c in table.columns)
            + f" (on {len(biggest)} rows)"
        )
        columns += [c for c in table.columns if c not in columns]
        units.append(
            {"table": table.name, "key": list(table.key), "columns": described, "repeated_rows": repeated}
        )
    step = SplitByUnit(tuple(UnitTable(t.name, t.key, t.columns) for t in found.split.tables))
    references = [
        f"{main.name}.{'+'.join(cols)} refers to {name}"
        for t in found.split.tables
        for cols, name in t.references
    ]
    return Finding(
        rule="units.mixed",
        severity=Severity.WARNING,
        message="; ".join(parts) + ".",
        place=place_of(subject, columns, first_rows),
        count=sum(repeats),
        examples=tuple(examples[:5]),
        fix="send one table per unit: "
        + ", ".join(f"{t.name} (key {', '.join(t.key)})" for t in found.split.tables)
        + (f"; {'; '.join(references)}" if references else ""),
        step=step.to_json(),
        evidence={
            "key": list(found.key),
            "normal_form": found.split.normal_form,
            "units": units,
            "dependencies": [str(d) for d in found.strong],
            "columns_with_letters": _letters(subject, columns),
        },
    )


@inspector()
def probable_entry_errors(subject: Subject) -> Iterator[Finding]:
    body = _profiled(subject)
    if body is None:
        return
    declared = tuple(subject.contract.keys) if subject.contract is not None else ()
    for error in entry_errors(body, declared):
        yield _entry_finding(subject, body, error)


def _entry_finding(subject: Subject, body: pd.DataFrame, error: EntryError) -> Finding:
    dependency = error.dependency
    (determinant,) = dependency.determinant
    dependent = dependency.dependent
    rows = [subject.frame.rows[p] for p in error.positions]
    slips = []
    for position in error.positions[:5]:
        group = body[determinant].iloc[position]
        same = body[body[determinant].isna()] if pd.isna(group) else body[body[determinant] == group]
        usual = same[dependent].mode(dropna=False)
        usual_text = "" if usual.empty or pd.isna(usual.iloc[0]) else str(usual.iloc[0])
        cell = body[dependent].iloc[position]
        written = "" if pd.isna(cell) else str(cell)
        slips.append(
            f"row {subject.frame.rows[position]}: {dependent} {quoted([written])}"
            f" where the other rows of {determinant} {group} have {quoted([usual_text])}"
        )
    return Finding(
        rule="units.probable-entry-error",
        severity=Severity.WARNING,
        message=f"{dependent} depends on {determinant}"
        + (f" (and on {', '.join(error.also)})" if error.also else "")
        + f" on all but {plural(len(rows), 'row')} of {len(body)}: "
        + "; ".join(slips)
        + ".",
        place=place_of(subject, [determinant, dependent], rows),
        count=len(rows),
        examples=tuple(s.split(": ", 1)[1] for s in slips),
        fix=f"correct {dependent} on {'row' if len(rows) == 1 else 'rows'} {', '.join(map(str, rows[:10]))}, "
        f"or confirm that one {determinant} really has several {dependent} values",
        evidence={
            "determinant": [determinant],
            "also_determined_by": list(error.also),
            "dependent": dependent,
            "g3": round(dependency.error, 6),
        },
    )
