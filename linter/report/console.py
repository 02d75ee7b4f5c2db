"""The terminal summary of a report: short even for thousands of findings, grouped by rule and column."""

from __future__ import annotations

from collections.abc import Sequence
from itertools import groupby

from rich.console import Console
from rich.text import Text

from linter.findings import Finding, sort_key
from linter.report.letter import plural, rows_text
from linter.report.model import Report, TableResult

STYLE = {"error": "bold red", "warning": "yellow", "note": "cyan"}
SHOWN_GROUPS = 8
"""Kinds of problem (rule and columns) listed per table before "and N more"."""
SHOWN_PER_GROUP = 2
"""Findings spelled out per kind before "and N more like this"."""


def columns_label(finding: Finding) -> str:
    place = finding.place
    return ", ".join(
        f"{c} ({place.letters[i]})" if i < len(place.letters) else c for i, c in enumerate(place.columns)
    )


def group_key(finding: Finding) -> tuple[int, str, tuple[str, ...]]:
    return (-finding.severity.rank, finding.rule, finding.place.columns)


def groups(findings: Sequence[Finding]) -> list[list[Finding]]:
    """Findings of one table grouped by severity, rule and columns, most severe first."""
    ordered = sorted(findings, key=lambda f: (group_key(f), sort_key(f)))
    return [list(g) for _, g in groupby(ordered, key=group_key)]


def render_group(console: Console, group: list[Finding], verbose: bool) -> None:
    first = group[0]
    sev = first.severity.value
    affected = sum(f.count for f in group)
    head = Text("  ")
    head.append(f"{sev:8}", style=STYLE[sev])
    head.append(first.rule, style="bold")
    if first.place.columns:
        head.append(f" · {columns_label(first)}")
    head.append(f" · {plural(len(group), 'finding')}, {affected} affected", style="dim")
    console.print(head)
    shown = group if verbose else group[:SHOWN_PER_GROUP]
    for finding in shown:
        line = Text("           " + finding.message)
        if finding.place.rows:
            line.append(f" (row {rows_text(finding)})", style="dim")
        console.print(line)
    if len(group) > len(shown):
        console.print(Text(f"           … and {len(group) - len(shown)} more like this", style="dim"))
    if first.fix:
        console.print(Text("           fix: " + first.fix, style="green"))


def render_table(console: Console, result: TableResult, verbose: bool) -> None:
    title = Text(f"{result.file} [{result.sheet}]" if result.sheet else result.file, style="bold")
    if result.contract:
        title.append(f" — contract {result.contract} v{result.contract_version}")
    title.append(f"  ({plural(result.rows, 'row')})", style="dim")
    console.print(title)
    if not result.findings:
        console.print(Text("  no findings", style="green"))
        return
    kinds = groups(result.findings)
    shown = kinds if verbose else kinds[:SHOWN_GROUPS]
    for group in shown:
        render_group(console, group, verbose)
    hidden = kinds[len(shown) :]
    if hidden:
        more = sum(len(g) for g in hidden)
        console.print(
            Text(f"  … and {plural(len(hidden), 'more kind')} of problem ({more} findings)", style="dim")
        )
    if not verbose and (hidden or any(len(g) > SHOWN_PER_GROUP for g in kinds)):
        console.print(Text("  (use --verbose to see every finding)", style="dim"))


def render(report: Report, console: Console, verbose: bool = False) -> None:
    """Print the summary of `report` on `console` (plain off a terminal or with NO_COLOR)."""
    for result in report.results:
        render_table(console, result, verbose)
    for group in groups(report.findings):
        render_group(console, group, verbose)
    counts = report.counts()
    verdict = Text("\n")
    verdict.append(report.verdict, style="bold green" if report.verdict == "accepted" else "bold red")
    verdict.append(
        f": {plural(counts['error'], 'error')}, {plural(counts['warning'], 'warning')}, "
        f"{plural(counts['note'], 'note')} in {plural(len(report.results), 'table')}"
    )
    console.print(verdict)
