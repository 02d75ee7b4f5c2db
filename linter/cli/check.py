"""`weir check PATH...`: check submitted files against their contracts and report."""

from __future__ import annotations

import os
from collections.abc import Callable
from contextlib import ExitStack
from enum import StrEnum
from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError
from linter.findings import Severity
from linter.output import write_bytes_atomic
from linter.report.model import Report


class Engine(StrEnum):
    LOCAL = "local"
    DASK = "dask"


OUTPUTS_HELP = """Check files against their contract; exit 0 if accepted, 1 if returned, 2 if Weir could not.

The summary always goes to the terminal. Each output file has its own option, and any
number of them can be written in one run: --report (JSON, for machines), --sarif
(SARIF 2.1.0, for code-hosting platforms), --letter (HTML fix-it letter for the
provider), --markdown (the same letter for e-mail or an issue tracker) and --export
(the offending rows as .csv or .xlsx). --redact and --examples apply to all of them.
"""


def writers() -> dict[str, Callable[[Report], bytes]]:
    """Output option -> function turning the report into the file's bytes (one module per format)."""
    from linter.report import html, json_report, markdown, sarif

    return {
        "report": lambda r: json_report.render(r).encode("utf-8"),
        "sarif": lambda r: sarif.render(r).encode("utf-8"),
        "letter": lambda r: html.render(r).encode("utf-8"),
        "markdown": lambda r: markdown.render(r).encode("utf-8"),
    }


def refuse_clashes(outputs: dict[str, Path], inputs: list[Path]) -> None:
    """Weir never overwrites a submitted file, and never writes two outputs to one file."""
    submitted = {p.resolve() for p in inputs if p.is_file()}
    folders = [p.resolve() for p in inputs if p.is_dir()]
    seen: dict[Path, str] = {}
    for option, target in outputs.items():
        where = target.resolve()
        if where in submitted or (where.exists() and any(where.is_relative_to(f) for f in folders)):
            raise WeirError(f"--{option} {target} would overwrite a submitted file; choose another name")
        if where in seen:
            raise WeirError(f"--{option} and --{seen[where]} both name {target}; give each its own file")
        seen[where] = option


@app.command(help=OUTPUTS_HELP)
@guarded
def check(
    paths: list[Path] = typer.Argument(..., help="Files or folders to check."),
    contract: list[Path] = typer.Option(
        [], "--contract", "-c", help="Contract file (repeatable); default: from weir.toml."
    ),
    report: Path | None = typer.Option(None, "--report", help="Write the JSON report here."),
    sarif: Path | None = typer.Option(None, "--sarif", help="Write a SARIF 2.1.0 log here."),
    letter: Path | None = typer.Option(None, "--letter", help="Write the HTML fix-it letter here."),
    markdown: Path | None = typer.Option(None, "--markdown", help="Write the Markdown fix-it letter here."),
    export: Path | None = typer.Option(
        None, "--export", help="Write the offending rows here (.csv or .xlsx), safe to open in a spreadsheet."
    ),
    redact: bool = typer.Option(
        False, "--redact", help="Show values only by their shape (AA-999, <number>), for third parties."
    ),
    examples: int | None = typer.Option(
        None, "--examples", min=0, help="Show at most N example values and excerpt rows per finding."
    ),
    fail_on: Severity | None = typer.Option(None, "--fail-on", help="Lowest severity that fails."),
    verbose: bool = typer.Option(False, "--verbose", "-v", help="Show every finding in the summary."),
    jobs: int = typer.Option(
        1, "--jobs", "-j", min=0, help="Check files in N worker processes (0: one per CPU core)."
    ),
    engine: Engine = typer.Option(
        Engine.LOCAL, "--engine", help="local: this process (and --jobs); dask: pre-screen on a Dask cluster."
    ),
    scheduler: str | None = typer.Option(
        None,
        "--scheduler",
        help="Address of the Dask scheduler for --engine dask (default: a local cluster).",
    ),
) -> int:
    from rich.console import Console

    from linter.config import find_settings
    from linter.gate.governance import check_governed, load_governance
    from linter.report import console as console_report
    from linter.report.export import export_bytes
    from linter.report.redact import redact as redacted

    for path in paths:
        if not path.exists():
            raise WeirError(f"no such file or folder: {path}")
    outputs = {
        name: target
        for name, target in {
            "report": report,
            "sarif": sarif,
            "letter": letter,
            "markdown": markdown,
            "export": export,
        }.items()
        if target is not None
    }
    refuse_clashes(outputs, paths)
    if export is not None and export.suffix.lower() not in (".csv", ".xlsx"):
        raise WeirError(f"--export {export}: name a .csv or .xlsx file")
    settings = find_settings(Path.cwd())
    threshold = fail_on or (settings.fail_on if settings else Severity.ERROR)
    governance = load_governance(settings, contract)
    from linter.check import submitted_files
    from linter.scale.progress import bytes_meter

    workers = jobs or os.cpu_count() or 1
    with ExitStack() as stack:
        if engine is Engine.DASK:
            from linter.scale.dask_engine import cluster

            stack.enter_context(cluster(scheduler))
        meter = stack.enter_context(
            bytes_meter(submitted_files([str(p) for p in paths]), Console(stderr=True))
        )
        result = check_governed([str(p) for p in paths], governance, threshold, workers, meter, engine.value)
    if redact or examples is not None:
        result = redacted(result, hide_values=redact, examples=examples)
    console_report.render(result, Console(), verbose=verbose)
    render = writers()
    for name, target in outputs.items():
        data = export_bytes(result, str(target)) if name == "export" else render[name](result)
        write_bytes_atomic(target, data)
    return 1 if result.failed else 0
