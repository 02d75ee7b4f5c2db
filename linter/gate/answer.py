"""What the gate sends back for one file: the JSON report and a letter to the provider, beside the copy."""

from __future__ import annotations

from collections.abc import Callable
from datetime import UTC, datetime
from io import StringIO
from pathlib import Path

from linter import __version__
from linter.findings import Finding, Place, Severity
from linter.gate.ledger import Entry
from linter.output import write_text_atomic
from linter.report.model import Report
from linter.rules.gate import DUPLICATE, NO_CONTRACT, NOT_CHECKED


def now() -> str:
    return datetime.now(UTC).isoformat(timespec="seconds")


def submission_report(file: str, finding: Finding, fail_on: Severity = Severity.ERROR) -> Report:
    return Report(__version__, now(), fail_on, (), (finding,))


def duplicate_report(file: str, sha256: str, earlier: Entry) -> Report:
    verdict = earlier.verdict or "still being checked"
    return submission_report(
        file,
        Finding(
            rule=DUPLICATE.id,
            severity=Severity.WARNING,
            message=f"This file holds exactly the same bytes as {earlier.file_name}, received "
            f"{earlier.received_at} (submission {earlier.id}, {verdict}); it was not checked again.",
            place=Place(file=file),
            examples=(sha256[:16],),
            fix="Nothing to do if you sent it twice by mistake; to correct a submission, send the "
            "corrected file (its content will differ).",
            evidence={"sha256": sha256, "first_submission": earlier.id},
        ),
    )


def not_checked_report(file: str, error: Exception) -> Report:
    reason = str(error).splitlines()[0] if str(error) else type(error).__name__
    return submission_report(
        file,
        Finding(
            rule=NOT_CHECKED.id,
            severity=Severity.ERROR,
            message=f"Weir could not read {Path(file).name} as a table ({reason}).",
            place=Place(file=file),
            fix="Send the data as CSV (UTF-8), an Excel workbook (.xlsx) or Parquet.",
        ),
    )


def with_contract_demanded(report: Report, file: str) -> Report:
    """An inbox only accepts what a contract covers: add a finding when nothing governed the file."""
    if not report.results or any(r.contract for r in report.results):
        return report
    finding = Finding(
        rule=NO_CONTRACT.id,
        severity=Severity.ERROR,
        message=f"No contract covers {Path(file).name}, so it cannot be accepted.",
        place=Place(file=file),
        fix="Check the file name agreed with the data manager, or ask which contract applies.",
    )
    return Report(
        report.tool_version, report.created, report.fail_on, report.results, (*report.findings, finding)
    )


def guarded(check: Callable[[Path], Report]) -> Callable[[Path], Report]:
    """A checker that answers any failure to read or check a file with a finding, never an exception."""

    def run(path: Path) -> Report:
        try:
            report = check(path)
        except Exception as error:  # an unreadable submission is returned to its sender, not crashed on
            return not_checked_report(str(path), error)
        return with_contract_demanded(report, str(path))

    return run


def letter(report: Report) -> tuple[str, str]:
    """The provider letter as (suffix, text): the HTML letter where its writer is installed,
    else the Markdown one, else the full console summary as plain text."""
    import importlib

    for module, suffix in (("linter.report.html", ".letter.html"), ("linter.report.markdown", ".letter.md")):
        try:
            writer = importlib.import_module(module)
        except ImportError:
            continue
        return suffix, str(writer.render(report))
    from rich.console import Console

    from linter.report import console as console_report

    buffer = StringIO()
    console_report.render(report, Console(file=buffer, width=100, color_system=None), verbose=True)
    return ".letter.txt", buffer.getvalue()


def write_answer(report: Report, copy_path: Path) -> Path:
    """Write `<copy>.report.json` and `<copy>.letter.*` beside the filed copy; return the report path."""
    from linter.report import json_report

    report_path = copy_path.with_name(copy_path.name + ".report.json")
    write_text_atomic(report_path, json_report.render(report))
    suffix, text = letter(report)
    write_text_atomic(copy_path.with_name(copy_path.name + suffix), text)
    return report_path
