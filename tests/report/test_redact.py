"""Redaction keeps a value's shape and drops the value; `--examples N` caps what a finding shows."""

from __future__ import annotations

import json
from dataclasses import replace

import pytest

from linter.findings import Finding, Place, Severity
from linter.report import json_report
from linter.report.model import Report
from linter.report.redact import redact, shape


@pytest.mark.parametrize(
    ("value", "expected"),
    [
        ("VB-014", "AA-999"),  # Common practice (no source): letter/digit masks describe id formats
        ("lab7", "aaa9"),
        ("0.42", "<number>"),
        ("-3", "<number>"),
        ("<0.05", "<number>"),  # a censored value is still a number to a reader
        ("1.5e-3", "<number>"),
        ("2026-03-02", "<date>"),  # Source: ISO 8601-1:2019 §5.2.2 calendar date, complete representation
        ("2026-03-02T10:15:00", "<date>"),  # Source: ISO 8601-1:2019 §5.4.2 date and time of day
        ("Mill Creek below the weir", "<text:25>"),
        ("<script>", "<text:8>"),
        ("", ""),
    ],
)
def test_shape(value: str, expected: str) -> None:
    assert shape(value) == expected


def test_redacted_report_holds_no_submitted_value(report: Report) -> None:
    hidden = redact(report)
    text = json_report.render(hidden)
    for original in ("VB-014", "VB-021", "2026-03-03", "n/a", "-0.4", "window.__pwned", "HYPERLINK"):
        assert original in json_report.render(report)  # the unredacted report does carry it
        assert original not in text, original
    first = hidden.results[0].findings[0]
    assert first.excerpt is not None
    assert first.excerpt.rows[0].cells == ("AA-999", "<date>", "<text:7>", "<text:3>")
    assert first.excerpt.rows[0].marked == report.results[0].findings[0].excerpt.rows[0].marked  # type: ignore[union-attr]
    assert first.place == report.results[0].findings[0].place  # rows and columns still say where


def test_message_and_evidence_are_masked_too() -> None:
    finding = Finding(
        "keys.duplicate",
        Severity.ERROR,
        "Site VB-014 appears twice on 2026-03-02.",
        Place("f.csv", None, (2, 3), ("site_id",), ("A",)),
        examples=("VB-014", "2026-03-02"),
        evidence={"key": ["VB-014", "2026-03-02"], "count": 2},
    )
    hidden = redact(Report("0", "2026-03-10T09:00:00+00:00", Severity.ERROR, (), (finding,))).findings[0]
    assert hidden.message == "Site AA-999 appears twice on <date>."
    assert json.dumps(dict(hidden.evidence)) == '{"key": ["AA-999", "<date>"], "count": 2}'


def test_examples_cap_without_redaction(report: Report) -> None:
    capped = redact(report, hide_values=False, examples=2)
    first = capped.results[0].findings[0]
    assert first.examples == report.results[0].findings[0].examples[:2]
    assert first.excerpt is not None and len(first.excerpt.rows) == 2
    assert first.examples[0] == "n/a"  # values untouched
    none = redact(report, hide_values=False, examples=0).results[0].findings[0]
    assert none.examples == () and none.excerpt is None
    assert replace(report).results == redact(report, hide_values=False).results  # no-op without options


def test_values_a_fix_derives_from_the_cell_are_hidden_too() -> None:
    # Invented messages of the kind the value rules write when they propose a corrected value
    finding = Finding(
        "values.wrong-type",
        Severity.ERROR,
        "2 cells in result cannot be read as a number; at least 0.5 is allowed.",
        Place("f.csv", None, (2, 4), ("result",), ("D",)),
        examples=("1,250", "2.4 mg/L", "03/04/2026"),
        fix="write 1250 without the separator (found '1,250'); write 2.4 alone; "
        "write 2026-04-03 or 2026-03-04",
    )
    hidden = redact(Report("0", "2026-03-10T09:00:00+00:00", Severity.ERROR, (), (finding,))).findings[0]
    for leaked in ("1250", "1,250", "2.4", "2026-04-03", "2026-03-04", "03/04"):
        assert leaked not in hidden.fix, (leaked, hidden.fix)
    assert hidden.fix.startswith("write <number> without the separator (found '<number>')")
    assert (
        "at least 0.5 is allowed" in hidden.message
    )  # the contract's own limits are not the provider's data
