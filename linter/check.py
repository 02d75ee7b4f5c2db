"""The check pipeline: read every file, match its contract, run every inspector, collect a report."""

from __future__ import annotations

import hashlib
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from datetime import UTC, datetime
from fnmatch import fnmatch
from pathlib import Path, PurePath
from typing import Protocol

from linter import __version__
from linter.contract.model import Contract, TableContract
from linter.findings import Finding, Place, Severity, sort_key
from linter.read import SUPPORTED_SUFFIXES, UnreadableFile, read_path
from linter.report.excerpt import EXCERPT_ROWS, attach_excerpts
from linter.report.model import Report, TableResult
from linter.rules.registry import CONTRACT_ONLY, INSPECTORS, SUBMISSION_INSPECTORS
from linter.rules.subject import Subject
from linter.scale.fast_path import read_screened
from linter.table import Frame, Table, first_row_header

INTERNAL_RULE = "weir.inspector-failed"


class FileProgress(Protocol):
    """Told how far the check has got through each submitted file (see `linter.scale.progress`)."""

    def part(self, path: str, fraction: float) -> None: ...

    def done(self, path: str) -> None: ...


@dataclass(frozen=True)
class Governed:
    """A table read from a submitted file, with the contract table that governs it (if any)."""

    table: Table
    contract: Contract | None
    rules: TableContract | None
    sha256: str
    rows: int | None = None
    """Body rows in the file when `table` holds only the rows a pre-screen kept (large files)."""


def submitted_files(paths: Iterable[str]) -> list[str]:
    """The files named, with folders expanded to the supported files below them, sorted."""
    found: list[str] = []
    for name in paths:
        path = Path(name)
        if path.is_dir():
            found.extend(
                str(p)
                for p in sorted(path.rglob("*"))
                if p.is_file()
                and p.suffix.lower() in SUPPORTED_SUFFIXES
                and not any(part.startswith(".") for part in p.relative_to(path).parts)
            )
        else:
            found.append(name)
    return found


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


def run_inspectors(subject: Subject) -> list[Finding]:
    """Run every registered inspector on its own: one that fails never hides the others."""
    findings: list[Finding] = []
    for name, inspect in INSPECTORS.items():
        if name in CONTRACT_ONLY and subject.contract is None:
            continue
        try:
            findings.extend(inspect(subject))
        except Exception as error:  # a bug in one check must not cost the provider the others
            findings.append(
                Finding(
                    rule=INTERNAL_RULE,
                    severity=Severity.ERROR,
                    message=f"Weir could not finish the check {name.rsplit('.', 1)[-1]}: "
                    f"{type(error).__name__}: {error}. Please report this to the data manager.",
                    place=Place(file=subject.table.source, sheet=subject.table.sheet),
                )
            )
    return sorted(findings, key=sort_key)


def run_submission_inspectors(subjects: Sequence[Subject]) -> list[Finding]:
    """Run every submission-level inspector once over all tables; a failing one hides no other."""
    findings: list[Finding] = []
    for name, inspect in SUBMISSION_INSPECTORS.items():
        try:
            findings.extend(inspect(subjects))
        except Exception as error:  # same isolation as per-table inspectors
            findings.append(
                Finding(
                    rule=INTERNAL_RULE,
                    severity=Severity.ERROR,
                    message=f"Weir could not finish the check {name.rsplit('.', 1)[-1]}: "
                    f"{type(error).__name__}: {error}. Please report this to the data manager.",
                    place=Place(file=subjects[0].table.source if subjects else ""),
                )
            )
    return sorted(findings, key=sort_key)


@dataclass(frozen=True)
class FileOutcome:
    """One submitted file read (and, when it needs no other table, already inspected)."""

    governed: tuple[Governed, ...]
    unreadable: TableResult | None = None
    results: tuple[TableResult | None, ...] = ()
    """Per governed table, its result when inspected where it was read; None to inspect later."""


def read_governed(
    path: str, contracts: Sequence[Contract], progress: FileProgress | None = None, engine: str = "local"
) -> FileOutcome:
    """Read one file under its contract: large plain CSV files through the pre-screen.

    With engine "dask" every plain delimited file is pre-screened on the current Dask cluster.
    """
    sha = file_sha256(path)
    contract, rules = governing(path, contracts)
    share = None if progress is None else (lambda fraction: progress.part(path, fraction))
    if rules is None:
        screened = None
    elif engine == "dask":
        from linter.scale.dask_engine import screen_with_dask

        screened = screen_with_dask(path, rules)
    else:
        screened = read_screened(path, rules, progress=share)
    if screened is not None:
        return FileOutcome((Governed(screened.table, contract, rules, sha, screened.rows),))
    try:
        tables = read_path(path)
    except UnreadableFile as error:
        return FileOutcome((), unreadable_result(path, sha, error))
    return FileOutcome(tuple(Governed(t, contract, rules, sha) for t in tables))


def needs_other_tables(rules: TableContract | None) -> bool:
    return rules is not None and any(v.references is not None for v in rules.variables)


def table_result(g: Governed, subject: Subject) -> TableResult:
    frame = subject.frame
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
        findings=attach_excerpts(
            run_inspectors(subject), frame, EXCERPT_ROWS, g.rules.keys if g.rules else ()
        ),
        encoding=g.table.encoding,
    )


def check_paths(
    paths: Sequence[str],
    contracts: Sequence[Contract],
    fail_on: Severity = Severity.ERROR,
    jobs: int = 1,
    progress: FileProgress | None = None,
    engine: str = "local",
) -> Report:
    """Check every named file (folders expanded) and return the whole report.

    With `jobs` above 1, files are read and inspected in that many worker processes (started
    once for the whole run); tables that reference another table are inspected here afterwards.
    """
    import linter.rules.catalogue  # noqa: F401  (registers every rule family)

    files = submitted_files(paths)
    if jobs > 1 and len(files) > 1 and engine == "local":
        from linter.scale.parallel import outcomes_in_parallel

        outcomes = outcomes_in_parallel(files, contracts, jobs, progress)
    else:
        outcomes = []
        for path in files:
            outcomes.append(read_governed(path, contracts, progress, engine))
            if progress is not None:
                progress.done(path)
    results: list[TableResult] = [o.unreadable for o in outcomes if o.unreadable is not None]
    governed = [
        (g, r)
        for o in outcomes
        for g, r in zip(o.governed, o.results or (None,) * len(o.governed), strict=True)
    ]
    frames = {id(g): first_row_header(g.table) for g, _ in governed}
    by_name: dict[str, Frame] = {}
    for g, _ in governed:
        if g.rules is not None:
            by_name.setdefault(g.rules.name, frames[id(g)])
    subjects: list[Subject] = []
    for g, done in governed:
        subject = Subject(g.table, frames[id(g)], g.rules, by_name)
        subjects.append(subject)
        results.append(done if done is not None else table_result(g, subject))
    whole = tuple(run_submission_inspectors(subjects))
    return Report(
        __version__, datetime.now(UTC).isoformat(timespec="seconds"), fail_on, tuple(results), whole
    )
