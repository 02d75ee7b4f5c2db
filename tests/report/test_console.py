"""The console summary stays short for many findings and is plain text off a terminal or with NO_COLOR."""

from __future__ import annotations

import io
import re
from dataclasses import replace

import pytest
from report_samples import HOSTILE_SCRIPT, make_frame, result_for
from rich.console import Console

from linter.findings import Finding, Place, Severity
from linter.report import console
from linter.report.model import Report

SGR = re.compile(r"\x1b\[([0-9;]*)m")


def many_findings_report(n: int = 400) -> Report:
    frame = make_frame([["site_id", "result", "depth"], *[[f"VB-{i:03}", "x", "-1"] for i in range(n)]])
    found = [
        Finding(
            "values.not-a-number",
            Severity.ERROR,
            f"Row {i + 2}: result x is not a number.",
            Place(frame.table.source, None, (i + 2,), ("result",), ("B",)),
            fix="Write a number.",
        )
        for i in range(n)
    ] + [
        Finding(
            f"values.rule-{k}",
            Severity.WARNING,
            f"Kind {k}.",
            Place(frame.table.source, None, (2,), ("depth",), ("C",)),
        )
        for k in range(12)
    ]
    return Report("0.1.0", "2026-03-10T09:00:00+00:00", Severity.ERROR, (result_for(frame, found),))


def rendered(report: Report, verbose: bool = False) -> str:
    # Common practice (no source): rich's recording console renders exactly what a 100-column terminal shows
    out = Console(width=100, record=True, file=io.StringIO())
    console.render(report, out, verbose=verbose)
    return out.export_text()


def test_many_findings_stay_short_grouped_and_counted() -> None:
    text = rendered(many_findings_report())
    lines = text.splitlines()
    assert len(lines) < 40, text
    assert "values.not-a-number · result (B) · 400 findings, 400 affected" in text
    assert "… and 398 more like this" in text
    assert "… and 5 more kinds of problem (5 findings)" in text  # 1 + 12 kinds, 8 shown
    assert "use --verbose" in text
    assert lines[-1] == "returned: 400 errors, 12 warnings, 0 notes in 1 table"


def test_verbose_shows_every_finding() -> None:
    text = rendered(many_findings_report(), verbose=True)
    assert all(f"Row {i + 2}: result x" in text for i in range(400))
    assert "more like this" not in text and "values.rule-11" in text


def test_values_are_not_read_as_markup_or_emoji(report: Report) -> None:
    odd = Finding("values.x", Severity.NOTE, f"[bold]{HOSTILE_SCRIPT}[/bold] :smile:", Place("f.csv"))
    text = rendered(replace(report, findings=(odd,)))
    assert f"[bold]{HOSTILE_SCRIPT}[/bold] :smile:" in text


def test_not_a_terminal_means_no_escape_codes(report: Report) -> None:
    stream = io.StringIO()
    console.render(report, Console(file=stream, width=100))  # a StringIO is not a terminal
    assert "\x1b[" not in stream.getvalue()
    assert "returned: 2 errors" in stream.getvalue()


def test_no_color_keeps_styles_but_drops_colours(report: Report, monkeypatch: pytest.MonkeyPatch) -> None:
    # Source: the NO_COLOR convention (no-color.org): when NO_COLOR is set and not empty, no ANSI colour
    def colour_codes(text: str) -> list[str]:
        params = [p for m in SGR.finditer(text) for p in m.group(1).split(";")]
        return [p for p in params if p and (30 <= int(p) <= 38 or 90 <= int(p) <= 97)]

    coloured = io.StringIO()
    console.render(report, Console(file=coloured, width=100, force_terminal=True))
    assert colour_codes(coloured.getvalue())  # guard: a terminal does get colours
    monkeypatch.setenv("NO_COLOR", "1")
    plain = io.StringIO()
    console.render(report, Console(file=plain, width=100, force_terminal=True))
    assert colour_codes(plain.getvalue()) == []
