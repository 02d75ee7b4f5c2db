"""The check pipeline: read every file, match its contract, run every inspector, collect a report."""

from __future__ import annotations

import hashlib
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from datetime import UTC, datetime
from fnmatch import fnmatch
from pathlib import PurePath

from linter import __version__
from linter.contract.model import Contract, TableContract
from linter.deadline import TimedOut, time_limit
from linter.findings import Finding, Place, Severity, sort_key
from linter.limits import MAX_FOLDER_DEPTH, Limits
from linter.read import SUPPORTED_SUFFIXES, UnreadableFile, read_path
from linter.read.folders import Skipped, expand_paths
from linter.report.excerpt import EXCERPT_ROWS, attach_excerpts
from linter.report.model import Report, TableResult
from linter.rules.registry import CONTRACT_ONLY, INSPECTORS, SUBMISSION_INSPECTORS
from linter.rules.subject import Subject
from linter.table import Frame, Table, first_row_header
from linter.template.returned import sheet_owner, template_parts_removed

INTERNAL_RULE = "weir.inspector-failed"


@dataclass(frozen=True)
class Governed:
    """A table read from a submitted file, with the contract table that governs it (if any)."""

    table: Table
    contract: Contract | None
    rules: TableContract | None
    sha256: str


def submitted_files(paths: Iterable[str], max_depth: int = MAX_FOLDER_DEPTH) -> list[str]:
    """The files named, with folders expanded to the supported files below them, sorted."""
    return list(expand_paths(paths, SUPPORTED_SUFFIXES, max_depth).files)


def governing(path: str, contracts: Sequence[Contract]) -> tuple[Contract | None, TableContract | None]:
    """The contract table whose `applies_to` globs match `path` (a lone one-table contract matches all)."""
    posix = PurePath(path).as_posix()
    for contract in contracts:
        for table in contract.tables:
            if any(
                fnmatch(posix, g) or fnmatch(posix, f"*/{g}") or fnmatch(PurePath(path).name, g)
                for g in table.applies_to
            ):
                return contract, table
    if len(contracts) == 1 and len(contracts[0].tables) == 1:
        return contracts[0], contracts[0].tables[0]
    return None, None


def file_sha256(path: str) -> str:
    digest = hashlib.sha256()
    with open(path, "rb") as handle:
        for block in iter(lambda: handle.read(1 << 20), b""):
            digest.update(block)
    return digest.hexdigest()


def unreadable_result(path: str, sha: str, error: UnreadableFile) -> TableResult:
    finding = Finding(
        rule=error.rule,
        severity=Severity.ERROR,
        message=error.message,
        place=Place(file=path),
        fix=error.fix,
    )
    return TableResult(
        path,
        None,
        sha,
        PurePath(path).suffix.lstrip(".").lower() or "unknown",
        0,
        0,
        None,
        None,
        None,
        (finding,),
    )


def inspector_failed(name: str, error: Exception, place: Place) -> Finding:
    """The finding that stands in for a check that crashed, so the provider still hears of it."""
    return Finding(
        rule=INTERNAL_RULE,
        severity=Severity.ERROR,
        message=f"Weir could not finish the check {name.rsplit('.', 1)[-1]}: "
        f"{type(error).__name__}: {error}. Please report this to the data manager.",
        place=place,
    )


def run_inspectors(subject: Subject) -> list[Finding]:
    """Run every registered inspector on its own: one that fails never hides the others."""
    findings: list[Finding] = []
    for name, inspect in INSPECTORS.items():
        if name in CONTRACT_ONLY and subject.contract is None:
            continue
        try:
            findings.extend(inspect(subject))
        except Exception as error:  # a bug in one check must not cost the provider the others
            findings.append(inspector_failed(name, error, Place(subject.table.source, subject.table.sheet)))
    return sorted(findings, key=sort_key)


def run_submission_inspectors(subjects: Sequence[Subject]) -> list[Finding]:
    """Run every submission-level inspector once over all tables; a failing one hides no other."""
    findings: list[Finding] = []
    for name, inspect in SUBMISSION_INSPECTORS.items():
        try:
            findings.extend(inspect(subjects))
        except Exception as error:  # same isolation as per-table inspectors
            findings.append(
                inspector_failed(name, error, Place(subjects[0].table.source if subjects else ""))
            )
    return sorted(findings, key=sort_key)


def not_followed_findings(skipped: Iterable[Skipped]) -> list[Finding]:
    """Links out of a folder and folders too deep are not files Weir read: they have no table
    result (and no hash), so they are reported with the whole submission."""
    return [
        Finding(s.reason.rule, Severity.ERROR, s.reason.message, Place(file=s.path), fix=s.reason.fix)
        for s in skipped
    ]


def timed_out(seconds: float) -> UnreadableFile:
    return UnreadableFile(
        "file.timed-out",
        f"Weir stopped after {seconds:g} seconds on this file, so it was not fully checked.",
        "Send the data as CSV, or split it into smaller files; the data manager can raise the time limit.",
    )


def check_paths(
    paths: Sequence[str],
    contracts: Sequence[Contract],
    fail_on: Severity = Severity.ERROR,
    limits: Limits | None = None,
) -> Report:
    """Check every named file (folders expanded) and return the whole report."""
    import linter.rules.catalogue  # noqa: F401  (registers every rule family)

    bounds = limits or Limits()
    governed: list[Governed] = []
    results: list[TableResult] = []
    expansion = expand_paths(paths, SUPPORTED_SUFFIXES, bounds.folder_depth)
    not_followed = not_followed_findings(expansion.skipped)
    for path in expansion.files:
        sha = file_sha256(path)
        contract, rules = governing(path, contracts)
        try:
            with time_limit(bounds.seconds_per_file):
                tables = read_path(path, bounds.read)
        except UnreadableFile as error:
            results.append(unreadable_result(path, sha, error))
            continue
        except TimedOut:
            results.append(unreadable_result(path, sha, timed_out(bounds.seconds_per_file)))
            continue
        # A returned Weir template: its help sheets and untouched example rows are not data, and
        # each sheet named after a table of the contract is governed by that table.
        owner = contract or sheet_owner(tables, contracts)
        for table, table_rules in template_parts_removed(tables, owner, rules):
            governed.append(Governed(table, owner if table_rules else contract, table_rules, sha))

    frames = {id(g): first_row_header(g.table) for g in governed}
    by_name: dict[str, Frame] = {}
    for g in governed:
        if g.rules is not None:
            by_name.setdefault(g.rules.name, frames[id(g)])
    subjects: list[Subject] = []
    for g in governed:
        frame = frames[id(g)]
        subject = Subject(g.table, frame, g.rules, by_name)
        subjects.append(subject)
        try:
            with time_limit(bounds.seconds_per_file):
                findings = attach_excerpts(
                    run_inspectors(subject), frame, EXCERPT_ROWS, g.rules.keys if g.rules else ()
                )
        except TimedOut:
            stopped = timed_out(bounds.seconds_per_file)
            place = Place(file=g.table.source, sheet=g.table.sheet)
            findings = (Finding(stopped.rule, Severity.ERROR, stopped.message, place, fix=stopped.fix),)
        results.append(
            TableResult(
                file=g.table.source,
                sheet=g.table.sheet,
                sha256=g.sha256,
                format=g.table.format,
                rows=len(frame.rows),
                columns=len(frame.names),
                contract=g.contract.id if g.contract else None,
                contract_version=g.contract.version if g.contract else None,
                table=g.rules.name if g.rules else None,
                findings=tuple(findings),
                encoding=g.table.encoding,
            )
        )
    whole = tuple(sorted([*not_followed, *run_submission_inspectors(subjects)], key=sort_key))
    return Report(
        __version__, datetime.now(UTC).isoformat(timespec="seconds"), fail_on, tuple(results), whole
    )
