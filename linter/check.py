"""The check pipeline: read every file, match its contract, run every inspector, collect a report."""

from __future__ import annotations

import hashlib
import os
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass, replace
from datetime import UTC, datetime
from fnmatch import fnmatch
from pathlib import PurePath
from typing import Protocol

from linter import __version__
from linter.contract.model import Contract, TableContract
from linter.deadline import TimedOut, time_limit
from linter.findings import Finding, Place, Severity, sort_key
from linter.limits import MAX_FOLDER_DEPTH, Limits
from linter.read import SUPPORTED_SUFFIXES, UnreadableFile, read_path
from linter.read.folders import Skipped, expand_paths
from linter.report.excerpt import EXCERPT_ROWS, attach_excerpts
from linter.report.model import Report, TableResult
from linter.rules.registry import CONTRACT_ONLY, INSPECTORS, ROW_WISE, SUBMISSION_INSPECTORS
from linter.rules.subject import Subject
from linter.scale.fast_path import Part, read_screened
from linter.table import Frame, Table, first_row_header
from linter.template.returned import sheet_owner, template_parts_removed

INTERNAL_RULE = "weir.inspector-failed"


class FileProgress(Protocol):
    """Told how far the check has got through each submitted file (see `linter.scale.progress`)."""

    def part(self, path: str, fraction: float) -> None: ...

    def done(self, path: str) -> None: ...


@dataclass(frozen=True)
class Governed:
    """A table read from a submitted file, with the contract table that governs it (if any)."""

    table: Table
    """The whole table; for a pre-screened file its header and leading rows (the sample)."""
    contract: Contract | None
    rules: TableContract | None
    sha256: str
    rows: int | None = None
    """Body rows in the file when `table` holds only the leading rows a pre-screen kept."""
    parts: tuple[Part, ...] | None = None
    """For a pre-screened file, what the row-wise inspectors judge instead of `table`."""

    def subjects(self, others: Mapping[str, Frame] | None = None) -> Subjects:
        """What row-wise and whole-table inspectors see (one subject unless pre-screened)."""
        whole = Subject(self.table, first_row_header(self.table), self.rules, others or {})
        if self.parts is None or self.rules is None:
            return Subjects(whole)
        rules = self.rules
        return Subjects(
            whole,
            tuple(
                Subject(p.table, first_row_header(p.table), narrowed(rules, p.columns), others or {})
                for p in self.parts
            ),
        )


def narrowed(rules: TableContract, columns: tuple[str, ...]) -> TableContract:
    """The table contract with only `columns` to judge; the key stays only on the key part."""
    variables = tuple(v for v in rules.variables if v.name in columns)
    keyed = any(v.name in rules.keys for v in variables)
    return replace(rules, variables=variables, keys=rules.keys if keyed else ())


@dataclass(frozen=True)
class Subjects:
    """One table as its inspectors see it."""

    whole: Subject
    """For the inspectors that judge the table as a whole: every row, or the leading sample."""
    parts: tuple[Subject, ...] | None = None
    """For the row-wise inspectors of a pre-screened file: each part's rows under the contract
    narrowed to the part's columns; None when `whole` holds every row (then they judge it)."""

    def with_others(self, others: Mapping[str, Frame]) -> Subjects:
        parts = None if self.parts is None else tuple(replace(p, others=others) for p in self.parts)
        return Subjects(replace(self.whole, others=others), parts)


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


def run_inspectors(subject: Subject, row_wise: bool | None = None) -> list[Finding]:
    """Run every registered inspector on its own: one that fails never hides the others.

    `row_wise` True or False runs only the inspectors that are (or are not) row-wise."""
    findings: list[Finding] = []
    for name, inspect in INSPECTORS.items():
        if name in CONTRACT_ONLY and subject.contract is None:
            continue
        if row_wise is not None and (name in ROW_WISE) is not row_wise:
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


@dataclass(frozen=True)
class FileOutcome:
    """One submitted file read (and, when it needs no other table, already inspected)."""

    governed: tuple[Governed, ...]
    unreadable: TableResult | None = None
    results: tuple[TableResult | None, ...] = ()
    """Per governed table, its result when inspected where it was read; None to inspect later."""


def read_governed(
    path: str,
    contracts: Sequence[Contract],
    bounds: Limits,
    progress: FileProgress | None = None,
    engine: str = "local",
) -> FileOutcome:
    """Read one file under its contract: large plain CSV files through the pre-screen.

    With engine "dask" every plain delimited file is pre-screened on the current Dask cluster.
    The pre-screen reads in bounded memory and linear time, so it is not under the time limit.
    """
    contract, rules = governing(path, contracts)
    # The size limit holds on every path: a larger file goes to the reader, which refuses it
    # with file.too-large (a data manager raises max_file_bytes to check bigger files).
    within_size = os.path.getsize(path) <= bounds.read.max_file_bytes
    if rules is not None and within_size and not is_referenced(rules, contract):
        if engine == "dask":
            from linter.scale.dask_engine import screen_with_dask

            screened = screen_with_dask(path, rules)
        else:
            share = None if progress is None else (lambda fraction: progress.part(path, fraction))
            screened = read_screened(path, rules, progress=share)
        if screened is not None:
            governed = Governed(
                screened.sample, contract, rules, screened.sha256, screened.rows, screened.parts
            )
            return FileOutcome((governed,))
    sha = file_sha256(path)
    try:
        with time_limit(bounds.seconds_per_file):
            tables = read_path(path, bounds.read)
    except UnreadableFile as error:
        return FileOutcome((), unreadable_result(path, sha, error))
    except TimedOut:
        return FileOutcome((), unreadable_result(path, sha, timed_out(bounds.seconds_per_file)))
    # A returned Weir template: its help sheets and untouched example rows are not data, and
    # each sheet named after a table of the contract is governed by that table.
    owner = contract or sheet_owner(tables, contracts)
    return FileOutcome(
        tuple(
            Governed(table, owner if table_rules else contract, table_rules, sha)
            for table, table_rules in template_parts_removed(tables, owner, rules)
        )
    )


def is_referenced(rules: TableContract, contract: Contract | None) -> bool:
    """Whether another table of the contract refers to this one (then every row is its values)."""
    tables = contract.tables if contract else ()
    return any(
        v.references is not None and v.references.table == rules.name for t in tables for v in t.variables
    )


def needs_other_tables(rules: TableContract | None) -> bool:
    return rules is not None and any(v.references is not None for v in rules.variables)


def inspected(seen: Subjects) -> list[Finding]:
    """Every inspector's findings on one table, excerpts attached from the rows each one saw."""
    rules = seen.whole.contract
    keys = rules.keys if rules else ()
    if seen.parts is None:
        return list(attach_excerpts(run_inspectors(seen.whole), seen.whole.frame, EXCERPT_ROWS, keys))
    # A row-wise inspector finds nothing in no rows: a clean large file needs no engine run.
    found = [
        f
        for part in seen.parts
        for f in attach_excerpts(run_inspectors(part, row_wise=True), part.frame, EXCERPT_ROWS, keys)
    ]
    found += attach_excerpts(run_inspectors(seen.whole, row_wise=False), seen.whole.frame, EXCERPT_ROWS, keys)
    return sorted(found, key=sort_key)


def table_result(g: Governed, seen: Subjects, bounds: Limits) -> TableResult:
    frame = seen.whole.frame
    try:
        with time_limit(bounds.seconds_per_file):
            findings = tuple(inspected(seen))
    except TimedOut:
        stopped = timed_out(bounds.seconds_per_file)
        place = Place(file=g.table.source, sheet=g.table.sheet)
        findings = (Finding(stopped.rule, Severity.ERROR, stopped.message, place, fix=stopped.fix),)
    return TableResult(
        file=g.table.source,
        sheet=g.table.sheet,
        sha256=g.sha256,
        format=g.table.format,
        rows=len(frame.rows) if g.rows is None else g.rows,
        columns=len(frame.names),
        contract=g.contract.id if g.contract else None,
        contract_version=g.contract.version if g.contract else None,
        table=g.rules.name if g.rules else None,
        findings=findings,
        encoding=g.table.encoding,
    )


def check_paths(
    paths: Sequence[str],
    contracts: Sequence[Contract],
    fail_on: Severity = Severity.ERROR,
    limits: Limits | None = None,
    jobs: int = 1,
    progress: FileProgress | None = None,
    engine: str = "local",
) -> Report:
    """Check every named file (folders expanded) and return the whole report.

    With `jobs` above 1, files are read and inspected in that many worker processes (started
    once for the whole run); tables that reference another table are inspected here afterwards.
    """
    import linter.rules.catalogue  # noqa: F401  (registers every rule family)

    bounds = limits or Limits()
    expansion = expand_paths(paths, SUPPORTED_SUFFIXES, bounds.folder_depth)
    not_followed = not_followed_findings(expansion.skipped)
    files = list(expansion.files)
    if jobs > 1 and len(files) > 1 and engine == "local":
        from linter.scale.parallel import outcomes_in_parallel

        outcomes = outcomes_in_parallel(files, contracts, bounds, jobs, progress)
    else:
        outcomes = []
        for path in files:
            outcomes.append(read_governed(path, contracts, bounds, progress, engine))
            if progress is not None:
                progress.done(path)
    results: list[TableResult] = [o.unreadable for o in outcomes if o.unreadable is not None]
    governed = [
        (g, r)
        for o in outcomes
        for g, r in zip(o.governed, o.results or (None,) * len(o.governed), strict=True)
    ]
    seen = {id(g): g.subjects() for g, _ in governed}
    by_name: dict[str, Frame] = {}
    for g, _ in governed:
        if g.rules is not None:
            by_name.setdefault(g.rules.name, seen[id(g)].whole.frame)
    for g, done in governed:
        results.append(
            done if done is not None else table_result(g, seen[id(g)].with_others(by_name), bounds)
        )
    wholes = [seen[id(g)].whole for g, _ in governed]
    whole = tuple(sorted([*not_followed, *run_submission_inspectors(wholes)], key=sort_key))
    return Report(
        __version__, datetime.now(UTC).isoformat(timespec="seconds"), fail_on, tuple(results), whole
    )
