"""`weir ledger [INBOX]`: recent submissions and per-provider acceptance rates, or a CSV export."""

from __future__ import annotations

import csv
import sys
from dataclasses import astuple
from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError


@app.command()
@guarded
def ledger(
    inbox: Path = typer.Argument(Path("."), help="The inbox folder whose ledger to show."),
    as_csv: bool = typer.Option(False, "--csv", help="Write every submission as CSV to standard output."),
    limit: int = typer.Option(20, "--limit", min=1, help="How many recent submissions to show."),
) -> int:
    """Show what the inbox gate received, when, under which contract, and what it answered."""
    from rich.console import Console
    from rich.table import Table

    from linter.config import InboxLayout, find_settings
    from linter.gate.ledger import ENTRY_COLUMNS, SqliteLedger

    settings = find_settings(Path.cwd()) or find_settings(inbox)
    layout = settings.inbox if settings else InboxLayout()
    path = inbox / layout.ledger
    if not path.is_file():
        raise WeirError(f"no ledger in {inbox} (run `weir gate {inbox}` first)")
    book = SqliteLedger(path)
    try:
        if as_csv:
            writer = csv.writer(sys.stdout, lineterminator="\n")
            writer.writerow(ENTRY_COLUMNS)
            writer.writerows(astuple(e) for e in book.entries())
            return 0
        console = Console()
        recent = Table(title="Recent submissions")
        for heading in ("#", "received", "provider", "file", "contract", "verdict", "E/W/N"):
            recent.add_column(heading)
        for e in book.recent(limit):
            version = f" v{e.contract_version}" if e.contract_version else ""
            recent.add_row(
                str(e.id),
                e.received_at,
                e.provider,
                e.file_name,
                f"{e.contract or '-'}{version}",
                e.verdict or e.state,
                f"{e.errors}/{e.warnings}/{e.notes}",
            )
        console.print(recent)
        rates = Table(title="Acceptance by provider")
        for heading in ("provider", "submissions", "accepted", "returned", "duplicates", "acceptance"):
            rates.add_column(heading)
        for r in book.rates():
            rates.add_row(
                r.provider,
                str(r.submissions),
                str(r.accepted),
                str(r.returned),
                str(r.duplicates),
                f"{r.acceptance:.0%}",
            )
        console.print(rates)
        return 0
    finally:
        book.close()
