"""Contract-free header rules: blank, repeated and padded column names, and a header with no rows."""

from __future__ import annotations

from collections.abc import Iterable

from linter.findings import Finding, Place, Severity
from linter.rules.cell_findings import header_place
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import column_letter

HEADER_ONLY = define_rule(
    "file.header-only",
    "A header but no data rows",
    Severity.ERROR,
    """
    Finds tables whose first row (the header) is followed by no data row at all.

    Bad: a file holding only `site_id,sampled_on,result`.
    Good: the header followed by one row per sample.
    """,
)
BLANK = define_rule(
    "header.blank",
    "A column with data has no name",
    Severity.ERROR,
    """
    Finds header cells left empty above a column that holds data, so nobody can say which
    variable the column is.

    Bad: header `site_id,,result` with values in column B.
    Good: header `site_id,sampled_on,result`.
    """,
)
DUPLICATE = define_rule(
    "header.duplicate",
    "Two columns have the same name",
    Severity.ERROR,
    """
    Finds column names that appear more than once in the header (ignoring case and surrounding
    spaces), so values cannot be told apart by name.

    Bad: `site_id,result,result` (a first and a repeated measurement).
    Good: `site_id,result_first,result_repeat`, or one row per measurement with a `replicate` column.
    """,
)
WHITESPACE = define_rule(
    "header.whitespace",
    "A column name has spaces around it",
    Severity.WARNING,
    """
    Finds column names with leading or trailing spaces (including non-breaking spaces); they
    look right on screen but do not match the agreed name.

    Bad: `site_id, result ,unit` (`result` padded with spaces).
    Good: `site_id,result,unit`.
    """,
)


def looks_like_title(names: tuple[str, ...]) -> bool:
    """One filled cell over a wide table is a title row, which the layout rules judge, not these."""
    return len(names) >= 3 and sum(1 for n in names if n.strip()) == 1


@inspector()
def header_only(subject: Subject) -> Iterable[Finding]:
    frame = subject.frame
    if frame.names and not frame.rows:
        yield Finding(
            rule=HEADER_ONLY.id,
            severity=HEADER_ONLY.severity,
            message=f"The table has a header ({len(frame.names)} columns) but no data rows.",
            place=Place(subject.table.source, subject.table.sheet, subject.table.row_numbers[:1]),
            examples=tuple(n for n in frame.names if n)[:5],
            fix="Add the data rows below the header, or do not send an empty table.",
        )


@inspector()
def blank_names(subject: Subject) -> Iterable[Finding]:
    frame = subject.frame
    if looks_like_title(frame.names):
        return
    body = frame.body
    blank = [
        i for i, name in enumerate(frame.names) if not name.strip() and bool(body.iloc[:, i].notna().any())
    ]
    if blank:
        letters = ", ".join(column_letter(i) for i in blank)
        yield Finding(
            rule=BLANK.id,
            severity=BLANK.severity,
            message=f"{len(blank)} column(s) with data have no name in the header: column(s) {letters}.",
            place=header_place(subject, blank),
            count=len(blank),
            fix="Write the variable's agreed name in the header cell of each of these columns.",
        )


@inspector()
def repeated_names(subject: Subject) -> Iterable[Finding]:
    if looks_like_title(subject.frame.names):
        return
    groups: dict[str, list[int]] = {}
    for index, name in enumerate(subject.frame.names):
        if name.strip():
            groups.setdefault(name.strip().casefold(), []).append(index)
    for indexes in groups.values():
        if len(indexes) > 1:
            names = subject.frame.names
            letters = ", ".join(column_letter(i) for i in indexes)
            yield Finding(
                rule=DUPLICATE.id,
                severity=DUPLICATE.severity,
                message=f"The column name {names[indexes[0]].strip()!r} appears {len(indexes)} times "
                f"(columns {letters}).",
                place=header_place(subject, indexes),
                count=len(indexes),
                examples=tuple(names[i] for i in indexes),
                fix="Give each column its own agreed name, or put repeated measurements in rows.",
            )


@inspector()
def padded_names(subject: Subject) -> Iterable[Finding]:
    names = subject.frame.names
    if looks_like_title(names):
        return
    padded = [i for i, name in enumerate(names) if name.strip() and name != name.strip()]
    if padded:
        yield Finding(
            rule=WHITESPACE.id,
            severity=WHITESPACE.severity,
            message=f"{len(padded)} column name(s) have spaces before or after them: "
            + ", ".join(repr(names[i]) for i in padded[:5]),
            place=header_place(subject, padded),
            count=len(padded),
            examples=tuple(names[i] for i in padded[:5]),
            fix="Remove the spaces around the column names.",
        )
