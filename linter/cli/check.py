"""`weir check PATH...`: check submitted files against their contracts and report."""

from __future__ import annotations

from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError
from linter.findings import Severity
from linter.output import write_text_atomic


@app.command()
@guarded
def check(
    paths: list[Path] = typer.Argument(..., help="Files or folders to check."),
    contract: list[Path] = typer.Option(
        [], "--contract", "-c", help="Contract file (repeatable); default: from weir.toml."
    ),
    report: Path | None = typer.Option(None, "--report", help="Write the JSON report here."),
    fail_on: Severity | None = typer.Option(None, "--fail-on", help="Lowest severity that fails."),
    verbose: bool = typer.Option(False, "--verbose", "-v", help="Show every finding."),
) -> int:
    """Check files against their contract; exit 0 if accepted, 1 if returned, 2 if Weir could not."""
    from rich.console import Console

    from linter.check import check_paths
    from linter.config import contract_paths, find_settings
    from linter.contract.load import load_contract
    from linter.report import console as console_report
    from linter.report import json_report

    for path in paths:
        if not path.exists():
            raise WeirError(f"no such file or folder: {path}")
    settings = find_settings(Path.cwd())
    contract_files = list(contract) or (contract_paths(settings) if settings else [])
    contracts = [load_contract(str(p)) for p in contract_files]
    threshold = fail_on or (settings.fail_on if settings else Severity.ERROR)
    result = check_paths([str(p) for p in paths], contracts, threshold)
    console_report.render(result, Console(), verbose=verbose)
    if report is not None:
        write_text_atomic(report, json_report.render(result))
    return 1 if result.failed else 0
