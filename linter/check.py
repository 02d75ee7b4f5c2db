"""The check pipeline: read every file, match its contract, run every inspector, collect a report."""

from __future__ import annotations

import hashlib
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from datetime import UTC, datetime
from fnmatch import fnmatch
from pathlib import Path, PurePath

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


def check_paths(
    paths: Sequence[str], contracts: Sequence[Contract], fail_on: Severity = Severity.ERROR
) -> Report:
    """Check every named file (folders expanded) and return the whole report."""
    import linter.rules.catalogue  # noqa: F401  (registers every rule family)

    governed: list[Governed] = []
    results: list[TableResult] = []
    for path in submitted_files(paths):
        sha = file_sha256(path)
        contract, rules = governing(path, contracts)
        screened = read_screened(path, rules) if rules is not None else None
        if screened is not None:
            governed.append(Governed(screened.table, contract, rules, sha, screened.rows))
            continue
        try:
            tables = read_path(path)
        except UnreadableFile as error:
            results.append(unreadable_result(path, sha, error))
            continue
        governed.extend(Governed(t, contract, rules, sha) for t in tables)

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
        results.append(
            TableResult(
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
        )
    whole = tuple(run_submission_inspectors(subjects))
    return Report(
        __version__, datetime.now(UTC).isoformat(timespec="seconds"), fail_on, tuple(results), whole
    )
