"""Reference rules: values that must appear in another table's key column of the same submission."""

from __future__ import annotations

from collections.abc import Iterator

from linter.findings import Finding, Place, Severity
from linter.rules.cell_findings import column_finding, counted, engine_result, quoted, written
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject

define_rule(
    "references.unknown",
    "Value absent from the referenced table",
    Severity.ERROR,
    """
    Finds values of a variable declared with `references: TABLE.COLUMN` that do not appear in
    that column of the referenced table submitted alongside (a foreign key without its row).

    Bad:  chemistry.csv names site VB-099, which sites.csv does not list

    Good: every site_id in chemistry.csv is listed in sites.csv
    """,
)
define_rule(
    "references.table-absent",
    "Referenced table not in the submission",
    Severity.NOTE,
    """
    Notes that a variable references another table (or a column of it) that is not part of
    this submission, so its values could not be checked against it.

    Bad:  chemistry.csv submitted alone, while site_id references sites.site_id

    Good: chemistry.csv and sites.csv submitted together
    """,
)


@inspector(needs_contract=True, row_wise=True)
def reference_values(subject: Subject) -> Iterator[Finding]:
    result = engine_result(subject)
    contract = subject.contract
    if result is None or contract is None:
        return
    for name, converted in result.converted.items():
        variable = contract.variable(name)
        if variable is None or variable.references is None:
            continue
        reference = variable.references
        other = subject.others.get(reference.table)
        if other is None or reference.column not in other.labels:
            what = "table" if other is None else f"column {reference.column} of the table"
            yield Finding(
                rule="references.table-absent",
                severity=Severity.NOTE,
                message=f"{name} refers to {reference}, but the {what} {reference.table} is not in this "
                "submission, so its values were not checked against it.",
                place=Place(
                    file=subject.table.source,
                    sheet=subject.table.sheet,
                    columns=(name,),
                    letters=(subject.frame.letter(name),),
                ),
                fix=f"submit the {reference.table} table together with this file",
                evidence={"references": str(reference)},
            )
            continue
        # Compared as written on both sides: a key is text to the provider ("014" is not "14").
        known = set(other.body[reference.column].dropna().astype(str))
        cells = subject.frame.body[name].set_axis(converted.missing.index)
        judged = ~converted.missing & converted.reason.isna()
        unknown = judged & ~cells.astype(str).isin(known)
        if not unknown.any():
            continue
        rows = [int(r) for r in unknown.index[unknown]]
        found = sorted(set(written(subject, name, rows)))
        trimmed = [f for f in found if f.strip() in known]
        fix = f"use a {reference.column} listed in {other.table.label}, or add the missing rows there"
        if trimmed:
            fix += f"; {quoted(trimmed[:3])} match once the surrounding spaces are removed"
        yield column_finding(
            subject,
            "references.unknown",
            name,
            rows,
            f"In {name}, {counted(len(rows), 'value', 'is', 'are')} not listed in {reference} "
            f"({other.table.label}): {quoted(found[:5])}.",
            fix,
            evidence={"references": str(reference), "unknown": found[:50]},
        )
