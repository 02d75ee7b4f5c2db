"""Layout rules about the header: values used as column names, repeated column groups, header rows."""

from __future__ import annotations

import re
from collections.abc import Iterable

from linter.contract.model import TableContract, VarType
from linter.findings import Finding, Severity
from linter.rules.layout_margins import below_titles
from linter.rules.layout_place import frame_letters, layout_finding, shown
from linter.rules.layout_scale import name_runs, one_scale, sideways_by_ids
from linter.rules.layout_signals import (
    YEAR,
    GrowingStem,
    blank,
    dominant_kind,
    frame_of,
    header_value_kind,
    sample,
    shared_stem,
    slug,
)
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Frame, Table

VALUES_IN_HEADERS = define_rule(
    "layout.values-in-headers",
    "Values stored as column names",
    Severity.ERROR,
    """
    Finds a run of column headers that are values of one variable (years, dates, months,
    numbers, ranges, levels of a declared code list, or labels that differ only by a number,
    such as `wk1, wk2, wk3`) rather than names of variables. Analysis tools cannot filter,
    group or plot by a variable that lives in the header, and every new year adds a column.
    Fix: gather those columns into two columns, one for the header value and one for the cell.

    Bad:
        site,2024,2025
        VB-014,3,5

    Good:
        site,year,count
        VB-014,2024,3
        VB-014,2025,5
    """,
)

REPEATED_GROUPS = define_rule(
    "layout.repeated-column-groups",
    "Repeated groups of columns",
    Severity.ERROR,
    """
    Finds groups of columns that repeat with a number (`Sample 1 Depth, Sample 1 Result,
    Sample 2 Depth, Sample 2 Result`): each group is one observation laid out sideways, so
    the row holds a variable number of observations and the columns cannot be compared.
    Fix: one row per group, one column per member of the group, plus the group number.

    Bad:
        site,Sample 1 Depth,Sample 1 Result,Sample 2 Depth,Sample 2 Result
        VB-014,0.5,1.2,2.0,1.4

    Good:
        site,sample,Depth,Result
        VB-014,1,0.5,1.2
        VB-014,2,2.0,1.4
    """,
)

ID_RUN = re.compile(r"^[A-Za-z]?\d+([-_.]\d+)?[A-Za-z]?$")


def _levels(contract: TableContract | None) -> dict[str, str]:
    """Code-list level -> the declared variable it belongs to."""
    found: dict[str, str] = {}
    for variable in contract.variables if contract else ():
        for code in variable.codes.values if variable.codes else ():
            found.setdefault(code.strip().lower(), variable.name)
    return found


def _measured(contract: TableContract | None, present: set[str], names_to: str) -> str | None:
    """The declared number-like variable the gathered cells most likely hold."""
    if contract is None:
        return None
    for variable in contract.variables:
        if variable.name in present or variable.name == names_to or variable.name in contract.keys:
            continue
        if variable.type in (VarType.NUMBER, VarType.INTEGER):
            return variable.name
    return None


def _body_kind(frame: Frame, label: str) -> str:
    return dominant_kind(sample(frame.body[label]))[0]


def _value_runs(frame: Frame, contract: TableContract | None) -> list[tuple[list[str], str]]:
    """Runs of consecutive columns whose headers are values, with what kind of value they are."""
    labels = list(frame.labels)
    levels = _levels(contract)
    declared = set(contract.names) if contract else set()
    marks: list[str | None] = []
    for name in frame.names:
        if name in declared:
            marks.append(None)
        elif name.strip().lower() in levels:
            marks.append("level:" + levels[name.strip().lower()])
        else:
            marks.append(header_value_kind(name))
    runs: list[tuple[list[str], str]] = []
    i = 0
    while i < len(labels):
        if marks[i] is None:
            i += 1
            continue
        j = i
        while j + 1 < len(labels) and marks[j + 1] is not None:
            j += 1
        kinds = {str(m).split(":")[0] for m in marks[i : j + 1]}
        needed = 2 if kinds & {"year", "date", "month", "level"} else 3
        run = labels[i : j + 1]
        # A trailing "Don't know" style column of the same kind belongs to the run.
        if (
            j + 1 == len(labels) - 1
            and len(run) >= 3
            and _body_kind(frame, labels[j + 1]) == _body_kind(frame, run[-1])
        ):
            run = [*run, labels[j + 1]]
        if len(run) >= needed and len({_body_kind(frame, c) for c in run} - {"empty"}) <= 1:
            kind = next(iter(kinds)) if len(kinds) == 1 else "value"
            runs.append((run, str(marks[i]) if kind == "level" else kind))
        i = j + 1
    return runs


def _stem_runs(frame: Frame, taken: set[str]) -> list[tuple[list[str], str]]:
    """Runs of 3+ headers differing only by a number-like part (wk1, wk2, wk3)."""
    labels = [label for label in frame.labels]
    runs: list[tuple[list[str], str]] = []
    i = 0
    while i < len(labels):
        j = i + 1
        best = i
        growing = GrowingStem(labels[i])
        while j < len(labels) and labels[j] not in taken:
            if growing.add(labels[j]) is None:
                break
            best = j
            j += 1
        run = labels[i : best + 1]
        if len(run) >= _needed(run) and run[0] not in taken:
            stem = shared_stem(run)
            assert stem is not None
            rests = [label[len(stem[0]) : len(label) - len(stem[1])] for label in run]
            kinds = {_body_kind(frame, c) for c in run} - {"empty"}
            if all(ID_RUN.match(r) for r in rests) and len(kinds) <= 1 and one_scale(frame, run):
                runs.append((run, slug(stem[0] + stem[1]) if (stem[0] + stem[1]).strip("_ ") else "item"))
            i = best + 1
        else:
            i += 1
    return runs


def _needed(run: list[str]) -> int:
    """Three numbered headers make a run; two suffice when the numbers are years, as bare years do."""
    stem = shared_stem(run) if len(run) >= 2 else None
    if stem is None:
        return 3
    rests = [label[len(stem[0]) : len(label) - len(stem[1])] for label in run]
    return 2 if all(YEAR.match(r.strip("_ -")) for r in rests) else 3


CODE_LABEL = re.compile(r"^([a-z]{1,2})(\d+)$")


def _code_runs(frame: Frame, taken: set[str]) -> list[tuple[list[str], str]]:
    """Runs of 3+ headers crossing a short code with a number (m014, m1524, f014): two variables."""
    runs: list[tuple[list[str], str]] = []
    current: list[str] = []
    for label in [*frame.labels, ""]:
        if label not in taken and CODE_LABEL.match(label):
            current.append(label)
            continue
        if len(current) >= 3:
            parts = [CODE_LABEL.match(c) for c in current]
            by_code: dict[str, set[str]] = {}
            for part in parts:
                if part:
                    by_code.setdefault(part[1], set()).add(part[2])
            numbers = list(by_code.values())
            crossed = len(by_code) >= 2 and bool(set.intersection(*numbers))
            if crossed and len({_body_kind(frame, c) for c in current} - {"empty"}) <= 1:
                runs.append((current, "code"))
        current = []
    return runs


def find_values_in_headers(table: Table, contract: TableContract | None = None) -> list[Finding]:
    frame = frame_of(table)
    if not frame.labels:
        return []
    grouped = {c for found in find_repeated_groups(table) for c in found.place.columns}
    runs = [(r, k) for r, k in _value_runs(frame, contract) if not set(r) & grouped]
    taken = grouped | {c for r, _ in runs for c in r}
    if not sideways_by_ids(table):  # ids across the top of a sideways table are observations
        runs += _code_runs(frame, taken)
        runs += _stem_runs(frame, taken | {c for r, _ in runs for c in r})
        runs += name_runs(frame, taken | {c for r, _ in runs for c in r})
    findings: list[Finding] = []
    present = set(frame.labels)
    for run, kind in runs:
        if len(run) == len(frame.labels) and table.grid.shape[0] <= 1:
            continue
        names_to = kind.split(":", 1)[1] if kind.startswith("level:") else kind
        values_to = _measured(contract, present, names_to) or (
            "count" if _all_counts(frame, run) else "value"
        )
        step: dict[str, object] = {
            "step": "gather",
            "columns": run,
            "names_to": names_to,
            "values_to": values_to,
            "keep_empty": True,
        }
        findings.append(
            layout_finding(
                VALUES_IN_HEADERS,
                table,
                f"The headers {shown(run)} are values of one variable ({names_to}), not names of variables.",
                f"Gather these {len(run)} columns into a '{names_to}' column and a '{values_to}' column.",
                step,
                rows=table.row_numbers[:1],
                columns=run,
                letters=frame_letters(frame, run),
                count=len(run),
                examples=run,
                evidence={"header_kind": kind},
            )
        )
    return findings


def _all_counts(frame: Frame, run: list[str]) -> bool:
    cells = [v for c in run for v in sample(frame.body[c]) if not blank(v)]
    return bool(cells) and all(str(v).strip().isdigit() for v in cells)


GROUP_ID_FIRST = re.compile(r"^(?P<stem>.*?\D)?(?P<id>\d+)(?P<sep>[ _.:-]+)(?P<member>[^\d\s].*)$")
GROUP_ID_LAST = re.compile(r"^(?P<member>.*?[^\d\s_.-])(?P<sep>[ _.-]*)(?P<id>\d+)$")


GROUP_WORD_LAST = re.compile(r"^(?P<member>.*?[^\s_.-])(?P<sep>[ _.-]+)(?P<id>[A-Za-z]+)$")
WORD_IDS = ("month", "day", "quarter")
"""Group ids written as words: `min_temp_jan, max_temp_jan, min_temp_feb, ...`."""


def find_repeated_groups(table: Table, contract: TableContract | None = None) -> list[Finding]:
    frame = frame_of(table)
    shapes: dict[tuple[str, str, str], list[tuple[str, str, str]]] = {}
    for label in frame.labels:
        first, last = GROUP_ID_FIRST.match(label), GROUP_ID_LAST.match(label)
        if first:
            key = ("first", first["stem"] or "", first["sep"])
            shapes.setdefault(key, []).append((label, first["id"], first["member"]))
        elif last:
            shapes.setdefault(("last", "", last["sep"]), []).append((label, last["id"], last["member"]))
        elif (word := GROUP_WORD_LAST.match(label)) and header_value_kind(word["id"]) in WORD_IDS:
            key = ("word", "", word["sep"])
            shapes.setdefault(key, []).append((label, word["id"], word["member"]))
    findings: list[Finding] = []
    for (order, stem, sep), members in shapes.items():
        by_id: dict[str, set[str]] = {}
        for _, group_id, member in members:
            by_id.setdefault(group_id, set()).add(member)
        sets = list(by_id.values())
        if len(by_id) < 2 or len(sets[0]) < 2 or any(s != sets[0] for s in sets):
            continue
        if all(CODE_LABEL.match(label) for label, _, _ in members):
            continue  # m014, f014: a short code crossed with a number is two values, not a group
        names_to = slug(stem) if stem.strip(" _.-") else "group"
        if order == "word":
            names_to = str(header_value_kind(members[0][1]))
            words = "|".join(re.escape(w) for w in sorted(by_id, key=len, reverse=True))
            pattern = f"^(?P<member>.+?){re.escape(sep)}(?P<{names_to}>{words})$"
        elif order == "first":
            pattern = f"^{re.escape(stem)}(?P<{names_to}>\\d+){re.escape(sep)}(?P<member>.+)$"
        else:
            pattern = f"^(?P<member>.+?){re.escape(sep)}(?P<{names_to}>\\d+)$"
        columns = [label for label, _, _ in members]
        findings.append(
            layout_finding(
                REPEATED_GROUPS,
                table,
                f"{len(by_id)} groups of the columns {shown(sorted(sets[0]))} repeat side by side "
                f"({shown(columns)}): each group is one observation.",
                f"Write one row per {names_to} with one column per member: {', '.join(sorted(sets[0]))}.",
                {"step": "gather_groups", "pattern": pattern, "names_to": names_to, "keep_empty": True},
                rows=table.row_numbers[:1],
                columns=columns,
                letters=frame_letters(frame, columns),
                count=len(by_id),
                examples=columns,
                evidence={"groups": sorted(by_id), "members": sorted(sets[0])},
            )
        )
    return findings


@inspector()
def values_in_headers(subject: Subject) -> Iterable[Finding]:
    return find_values_in_headers(below_titles(subject.table), subject.contract)


@inspector()
def repeated_groups(subject: Subject) -> Iterable[Finding]:
    return find_repeated_groups(below_titles(subject.table), subject.contract)
