"""`weir gate INBOX`: check, answer and file every new file in an inbox folder tree."""

from __future__ import annotations

import time
from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError
from linter.findings import Severity


@app.command()
@guarded
def gate(
    inbox: Path = typer.Argument(..., help="The inbox folder; each provider's files in its own subfolder."),
    watch: bool = typer.Option(False, "--watch", help="Keep polling the inbox until interrupted."),
    interval: float = typer.Option(10.0, "--interval", min=0.1, help="Seconds between polls with --watch."),
    contract: list[Path] = typer.Option(
        [], "--contract", "-c", help="Contract file (repeatable); default: from weir.toml."
    ),
    fail_on: Severity | None = typer.Option(None, "--fail-on", help="Lowest severity that returns a file."),
) -> int:
    """File each new submission under accepted/ or returned/ with its report and letter."""
    from linter.check import check_paths
    from linter.config import InboxLayout, find_settings
    from linter.gate.answer import guarded as answering
    from linter.gate.companions import check_in_bundle
    from linter.gate.governance import load_governance
    from linter.gate.inbox import Gate, new_owner, run_pass
    from linter.gate.ledger import SqliteLedger
    from linter.report.model import Report

    if not inbox.is_dir():
        raise WeirError(f"no such inbox folder: {inbox}")
    settings = find_settings(Path.cwd()) or find_settings(inbox)
    governance = load_governance(settings, contract)
    if not governance.contracts:
        raise WeirError("no contract: name one with --contract or list them in weir.toml")
    layout = settings.inbox if settings else InboxLayout()
    threshold = fail_on or (settings.fail_on if settings else Severity.ERROR)

    def check(path: Path) -> Report:
        if settings is not None and settings.bundles:
            return check_in_bundle(path, inbox, layout, settings, governance, threshold)
        return check_paths(
            [str(path)], list(governance.for_file(str(path), inbox)), threshold, governance.limits
        )

    ledger = SqliteLedger(inbox / layout.ledger)
    try:
        keeper = Gate(inbox, layout, ledger, answering(check), new_owner())
        while True:
            for event in run_pass(keeper):
                if event.action != "skipped":
                    print(f"{event.action:9} {event.file}  (submission {event.entry})")
            if not watch:
                return 0
            time.sleep(interval)
    except KeyboardInterrupt:
        return 0
    finally:
        ledger.close()
