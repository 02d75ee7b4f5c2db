"""The terminal summary of a report: short, grouped by file, most severe first."""

from __future__ import annotations

from rich.console import Console
from rich.markup import escape

from linter.findings import Finding
from linter.report.model import Report, TableResult

STYLE = {"error": "bold red", "warning": "yellow", "note": "cyan"}
SHOWN_PER_TABLE = 12


def where(finding: Finding) -> str:
    place = finding.place
    parts = []
    if place.columns:
        cols = ", ".join(f"{c} ({letter})" for c, letter in zip(place.columns, place.letters, strict=False))
        parts.append(f"column {cols}" if len(place.columns) == 1 else f"columns {cols}")
    if place.rows:
        more = "…" if finding.count > len(place.rows) and len(place.rows) >= 5 else ""
        parts.append("row " + ", ".join(str(r) for r in place.rows[:5]) + more)
    return "; ".join(parts)


def render_table(console: Console, result: TableResult, verbose: bool) -> None:
    name = f"{result.file} [{result.sheet}]" if result.sheet else result.file
    governed = f" — contract {result.contract} v{result.contract_version}" if result.contract else ""
    console.print(f"[bold]{escape(name)}[/bold]{escape(governed)}  ({result.rows} rows)")
    if not result.findings:
        console.print("  [green]no findings[/green]")
        return
    shown = result.findings if verbose else result.findings[:SHOWN_PER_TABLE]
    for f in shown:
        sev = f.severity.value
        location = where(f)
        console.print(
            f"  [{STYLE[sev]}]{sev:7}[/{STYLE[sev]}] [dim]{f.rule}[/dim] "
            f"{escape(f.message)}" + (f" [dim]({escape(location)})[/dim]" if location else "")
        )
        if f.fix:
            console.print(f"           fix: {escape(f.fix)}")
    hidden = len(result.findings) - len(shown)
    if hidden:
        console.print(f"  … and {hidden} more (use --verbose to see all)")


def render(report: Report, console: Console, verbose: bool = False) -> None:
    """Print the summary of `report` on `console`."""
    for result in report.results:
        render_table(console, result, verbose)
    for f in report.findings:
        console.print(f"[{STYLE[f.severity.value]}]{f.severity.value}[/] {escape(f.message)}")
    counts = report.counts()
    verdict = "[green]accepted[/green]" if report.verdict == "accepted" else "[red]returned[/red]"
    console.print(
        f"\n{verdict}: {counts['error']} errors, {counts['warning']} warnings, "
        f"{counts['note']} notes in {len(report.results)} tables"
    )
