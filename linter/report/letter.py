"""What a fix-it letter says, independent of its format: the verdict, the order, the words for places."""

from __future__ import annotations

import json
from dataclasses import dataclass

from linter.findings import MAX_ROWS_LISTED, Finding, Severity, sort_key
from linter.report.model import Report

LABEL = {
    Severity.ERROR: "Must fix",
    Severity.WARNING: "Should fix",
    Severity.NOTE: "For information",
}
MARKER = "✗"
"""Printed before every marked cell, so the mark survives black-and-white printing and colour blindness."""
EMPTY = "(empty)"
SECTIONS = 100
"""Findings a letter spells out in full; the rest are listed one line each, so a letter stays readable."""
ROWS_SPELLED = 12
"""Row numbers a letter spells out before it says "and N more"."""


@dataclass(frozen=True)
class Item:
    """One numbered section of a letter."""

    number: int
    finding: Finding
    blocks: bool
    """True when this finding alone would return the submission."""
    title: str


def plural(count: int, word: str) -> str:
    return f"{count} {word}{'' if count == 1 else 's'}"


def rule_title(rule_id: str) -> str:
    """The registered rule's title, or its id for rules raised outside the registry."""
    import linter.rules.catalogue  # noqa: F401
    from linter.rules.registry import RULES

    rule = RULES.get(rule_id)
    return rule.title if rule else rule_id


def items(report: Report) -> list[Item]:
    """Every finding of the report, what blocks acceptance first, then by file and row."""
    findings = sorted(report.all_findings(), key=lambda f: (-f.severity.rank, *sort_key(f)))
    return [
        Item(n, f, f.severity.rank >= report.fail_on.rank, rule_title(f.rule))
        for n, f in enumerate(findings, start=1)
    ]


def summary_line(item: Item) -> tuple[str, str, str, str, str]:
    """(number, label, where, rule title, message) for the one-line list of findings beyond SECTIONS."""
    place = item.finding.place
    where = place.file + (f" [{place.sheet}]" if place.sheet else "")
    if place.rows:
        where += f", row {rows_text(item.finding)}"
    if place.columns:
        where += f", {columns_text(item.finding)}"
    return (str(item.number), LABEL[item.finding.severity], where, item.title, item.finding.message)


def verdict_heading(report: Report) -> str:
    if report.verdict == "accepted":
        return "Accepted: this submission meets its contract"
    return "Returned: please correct the problems below and send the files again"


def counts_sentence(report: Report) -> str:
    counts = report.counts()
    parts = [f"{counts[s.value]} {LABEL[s].lower()}" for s in Severity]
    tables = len(report.results)
    return f"{', '.join(parts)} in {tables} table{'s' if tables != 1 else ''}."


def rows_text(finding: Finding) -> str:
    rows = finding.place.rows
    if not rows:
        return ""
    text = ", ".join(str(r) for r in rows[:ROWS_SPELLED])
    if len(rows) > ROWS_SPELLED:
        text += f" and {len(rows) - ROWS_SPELLED} more"
    if len(rows) >= MAX_ROWS_LISTED and finding.count > len(rows):
        text += f" (the first {len(rows)} listed)"
    return text


def columns_text(finding: Finding) -> str:
    place = finding.place
    named = [
        f"{name} (column {place.letters[i]})" if i < len(place.letters) else name
        for i, name in enumerate(place.columns)
    ]
    return ", ".join(named)


def place_lines(finding: Finding) -> list[tuple[str, str]]:
    """(label, text) pairs naming the place as the provider's own spreadsheet shows it."""
    place = finding.place
    lines = [("File", place.file)]
    if place.sheet:
        lines.append(("Sheet", place.sheet))
    if place.rows:
        lines.append(("Row" if len(place.rows) == 1 else "Rows", rows_text(finding)))
    if place.columns:
        lines.append(("Column" if len(place.columns) == 1 else "Columns", columns_text(finding)))
    lines.append(("Affected", str(finding.count)))
    return lines


def step_json(finding: Finding) -> str:
    """The finding's recipe step as a provider can save it and let Weir rerun it."""
    step = json.dumps(dict(finding.step or {}), ensure_ascii=False)
    return '{"weir_recipe": 1, "steps": [\n  ' + step + "\n]}"
