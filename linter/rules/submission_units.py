"""Observational-unit rules across the files of one submission: one unit split over files or stacked."""

from __future__ import annotations

import re
from collections.abc import Iterator, Sequence
from itertools import combinations
from pathlib import PurePath

import pandas as pd

from linter.findings import Finding, Place, Severity, listed_rows
from linter.profile.keys import unique_combinations
from linter.rules.cell_findings import place_of, plural
from linter.rules.registry import define_rule, submission_inspector
from linter.rules.subject import Subject

MIN_ROWS = 3
"""Each file of a pair needs this many body rows before Weir compares their keys."""
MIN_SHARED_KEYS = 0.5
"""Share of the smaller file's keys that must also be in the other file (same units, not chance)."""

define_rule(
    "units.split-over-files",
    "One observational unit spread over several files",
    Severity.WARNING,
    """
    Finds two files of one submission that share key columns (a key of both files: a declared
    key, or a minimal unique combination found in both) but hold different variables about the
    same units, at least half of the smaller file's keys appearing in the other. One table with
    all variables of the unit is easier to check and use; the fix is a join on the keys. Two
    files that a bundle contract declares as two different tables are left alone.

    Bad:  field.csv (sample_id, temperature) and lab.csv (sample_id, nitrate)
    Good: samples.csv (sample_id, temperature, nitrate)
    """,
)
define_rule(
    "units.stacked-files",
    "Files with the same columns and a value in their name",
    Severity.WARNING,
    """
    Finds files (or sheets) with the same columns whose names differ only by a value such as a
    month, a site or a laboratory, while no column says which file a row came from. The value
    belongs in a column; the fix is the stack_files step. Files that a contract governs are not
    reported: the contract is the agreement, and one file per month or laboratory is then the
    agreed way of delivering.

    Bad:  readings_2026-01.csv and readings_2026-02.csv, no month column
    Good: readings.csv with a month column holding 2026-01 and 2026-02
    """,
)
define_rule(
    "units.unmatched-keys",
    "Key present in one file of a pair and absent from the other",
    Severity.WARNING,
    """
    For two files that hold one unit between them (see units.split-over-files), finds keys in
    one file that the other does not have: a sample with field readings but no lab result.

    Bad:  sample VB-014-0107 in field.csv, absent from lab.csv
    Good: every sample in field.csv also in lab.csv, or a note saying why not
    """,
)

MONTH = re.compile(r"^(\d{4}[-_]?\d{2}|jan|feb|mar|apr|may|jun|jul|aug|sep|oct|nov|dec)[a-z]*$", re.I)
YEAR = re.compile(r"^(19|20)\d{2}$")
DATE = re.compile(r"^\d{4}-?\d{2}-?\d{2}$")


def _name_of(subject: Subject) -> str:
    table = subject.table
    stem = PurePath(table.source).stem
    return f"{stem}-{table.sheet}" if table.sheet else stem


def _varying_part(names: Sequence[str]) -> list[str]:
    """What differs between names once their common start and end are removed, widened to whole
    tokens (a hyphen joins a token: 2026-09 and VB-014 stay whole; _ . and space separate)."""
    start = 0
    while all(len(n) > start and n[start] == names[0][start] for n in names):
        start += 1
    end = 0
    while all(len(n) - end > start and n[-1 - end] == names[0][-1 - end] for n in names):
        end += 1
    while start > 0 and names[0][start - 1] not in TOKEN_BREAK:
        start -= 1
    while end > 0 and names[0][len(names[0]) - end] not in TOKEN_BREAK:
        end -= 1
    return [n[start : len(n) - end].strip(TOKEN_BREAK + "-") for n in names]


TOKEN_BREAK = "_. "
VALUE_LIKE = re.compile(r"^(\d{4}([-_]?\d{2}){0,2}|[A-Za-z]{1,5}-?\d{1,5}|[A-Za-z]{3,9})$")
"""Without a contract, only a date, month, year, a code such as VB-014, or one word is taken
for a value hidden in a file name (river_slip vs with_sites is not)."""


def _column_for(values: Sequence[str]) -> str:
    if all(DATE.match(v) for v in values):
        return "date"
    if all(MONTH.match(v) for v in values):
        return "month"
    if all(YEAR.match(v) for v in values):
        return "year"
    return "source"


def _tells_files_apart(subjects: Sequence[Subject], columns: Sequence[str]) -> bool:
    """True when some column is constant within each file and differs between them (nothing hidden)."""
    for column in columns:
        per_file = [s.frame.body[column].dropna().unique() for s in subjects]
        if all(len(v) == 1 for v in per_file) and len({v[0] for v in per_file}) == len(per_file):
            return True
    return False


def _in_name_order(subjects: Sequence[Subject]) -> list[Subject]:
    """Files in path order, so that a finding about several lands on the same file however they were named."""
    return sorted(subjects, key=lambda s: (PurePath(s.table.source).as_posix(), s.table.sheet or ""))


@submission_inspector
def stacked_files(subjects: Sequence[Subject]) -> Iterator[Finding]:
    groups: dict[frozenset[str], list[Subject]] = {}
    for subject in _in_name_order(subjects):
        labels = subject.frame.labels
        if len(labels) >= 2 and len(subject.frame.rows) >= 1:
            groups.setdefault(frozenset(labels), []).append(subject)
    for columns, members in groups.items():
        if len(members) < 2 or _tells_files_apart(members, sorted(columns)):
            continue
        names = [_name_of(s) for s in members]
        values = _varying_part(names)
        if any(not v for v in values) or len(set(values)) != len(values):
            continue
        if any(s.contract is not None for s in members):
            continue  # a contract governs these files: one file per month or lab is the agreed delivery
        if not all(VALUE_LIKE.match(v) for v in values):
            continue
        column = _column_for(values)
        keyed = {
            (PurePath(s.table.source).name if not s.table.sheet else name): value
            for s, name, value in zip(members, names, values, strict=True)
        }
        files = ", ".join(sorted({s.table.label for s in members}))
        yield Finding(
            rule="units.stacked-files",
            severity=Severity.WARNING,
            message=f"{plural(len(members), 'file')} ({files}) have the same columns; what tells them apart "
            f"is only a value in their names ({', '.join(values)}), which belongs in a {column} column.",
            place=Place(file=members[0].table.source, sheet=members[0].table.sheet),
            count=len(members),
            examples=tuple(values[:5]),
            fix=f"send one table with a {column} column holding {', '.join(values[:3])}"
            + ("…" if len(values) > 3 else ""),
            step={"step": "stack_files", "column": column, "values": keyed},
            evidence={"files": [s.table.label for s in members], "columns": sorted(columns)},
        )


def _shared_key(left: Subject, right: Subject) -> tuple[str, ...] | None:
    """A key of both files made of columns they share (declared keys first)."""
    shared = [c for c in left.frame.labels if c in set(right.frame.labels)]
    for contract in (left.contract, right.contract):
        if contract is not None and contract.keys and set(contract.keys) <= set(shared):
            keys = list(contract.keys)
            if not left.frame.body[keys].duplicated().any() and not right.frame.body[keys].duplicated().any():
                return tuple(keys)
    if not shared:
        return None
    for key in unique_combinations(left.frame.body[shared], skip_measurements=True).keys:
        if (
            not right.frame.body[list(key)].duplicated().any()
            and right.frame.body[list(key)].notna().all().all()
        ):
            return key
    return None


def join_columns(left: Subject, right: Subject, key: Sequence[str]) -> list[str]:
    """The key, then every other column both files have: where such a column agrees it merges,
    where it disagrees the two rows stay apart (an outer join keeps both, nothing is lost)."""
    shared = [c for c in left.frame.labels if c in set(right.frame.labels)]
    return list(dict.fromkeys([*key, *shared]))


def _keys_of(subject: Subject, key: Sequence[str]) -> pd.Series:
    body = subject.frame.body[list(key)].fillna("")
    return body.astype(str).agg(" | ".join, axis=1).set_axis(list(subject.frame.rows))


@submission_inspector
def split_over_files(subjects: Sequence[Subject]) -> Iterator[Finding]:
    for left, right in combinations(_in_name_order(subjects), 2):
        if left.table.source == right.table.source and left.table.sheet == right.table.sheet:
            continue
        if min(len(left.frame.rows), len(right.frame.rows)) < MIN_ROWS:
            continue
        if set(left.frame.labels) == set(right.frame.labels):
            continue  # same columns: a stack, not a split
        if left.contract is not None and right.contract is not None and left.contract != right.contract:
            continue  # the contract declares them as two tables: a deliberate bundle (references check it)
        key = _shared_key(left, right)
        if key is None:
            continue
        only_left = [c for c in left.frame.labels if c not in right.frame.labels]
        only_right = [c for c in right.frame.labels if c not in left.frame.labels]
        if not only_left or not only_right:
            continue
        left_keys, right_keys = _keys_of(left, key), _keys_of(right, key)
        common = set(left_keys) & set(right_keys)
        if len(common) < MIN_SHARED_KEYS * min(len(left_keys), len(right_keys)):
            continue
        yield from _split_findings(left, right, key, only_left, only_right, left_keys, right_keys, common)


def _split_findings(
    left: Subject,
    right: Subject,
    key: tuple[str, ...],
    only_left: list[str],
    only_right: list[str],
    left_keys: pd.Series,
    right_keys: pd.Series,
    common: set[str],
) -> Iterator[Finding]:
    joined = ", ".join(key)
    yield Finding(
        rule="units.split-over-files",
        severity=Severity.WARNING,
        message=f"{left.table.label} ({', '.join(only_left[:5])}) and {right.table.label} "
        f"({', '.join(only_right[:5])}) hold different variables about the same units, identified by "
        f"{joined}; {plural(len(common), 'key')} appear in both.",
        place=place_of(left, list(key)),
        count=len(common),
        examples=tuple(sorted(common)[:5]),
        fix=f"join the two files on {joined} and send one table",
        step={"step": "join_files", "on": join_columns(left, right, key)},
        evidence={
            "files": [left.table.label, right.table.label],
            "key": list(key),
            "pandas": f"left.merge(right, on={list(key)!r}, how='outer', validate='one_to_one')",
        },
    )
    for this, that, mine, theirs in (
        (left, right, left_keys, right_keys),
        (right, left, right_keys, left_keys),
    ):
        absent = mine[~mine.isin(set(theirs))]
        if absent.empty:
            continue
        rows = [int(r) for r in absent.index]
        yield Finding(
            rule="units.unmatched-keys",
            severity=Severity.WARNING,
            message=f"{plural(len(rows), 'key')} of {this.table.label} ({joined}) "
            f"{'is' if len(rows) == 1 else 'are'} absent from "
            f"{that.table.label}: {', '.join(absent.iloc[:3])}" + ("…" if len(rows) > 3 else "") + ".",
            place=Place(
                file=this.table.source,
                sheet=this.table.sheet,
                rows=listed_rows(rows),
                columns=key,
                letters=tuple(this.frame.letter(c) for c in key),
            ),
            count=len(rows),
            examples=tuple(absent.iloc[:5]),
            fix=f"add the missing rows to {that.table.label}, or say why these units have none there",
            evidence={"key": list(key), "other_file": that.table.label},
        )
