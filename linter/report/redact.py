"""Reports fit for a third party: values replaced by their shape, examples capped per finding."""

from __future__ import annotations

import re
from collections.abc import Mapping
from dataclasses import replace
from datetime import date, datetime
from typing import Any

from linter.findings import Excerpt, ExcerptRow, Finding
from linter.report.model import Report

CODE_LIKE = re.compile(r"^[A-Za-z0-9]+([-_/.:][A-Za-z0-9]+)*$")
"""Identifiers such as VB-014 or LAB_7: their shape (AA-999) tells a reader the format without the value."""
MASKED_MIN = 2
"""Shorter values are not searched for in messages: a lone digit would mangle the counts in them."""
NUMBER_INSIDE = re.compile(r"\d+(?:[.,]\d+)*")
ISO_DATE = re.compile(r"\b\d{4}-\d{2}-\d{2}\b")
LOCAL_DATE = re.compile(r"\b\d{1,2}[./-]\d{1,2}[./-]\d{2,4}\b")
"""Dates a rule may suggest from a value it re-read (03/04/2026 -> 2026-04-03); hidden with the value."""
NUMBER = re.compile(r"^[<>]?\s*[-+]?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?$")


def _is_date(text: str) -> bool:
    for parse in (date.fromisoformat, datetime.fromisoformat):
        try:
            parse(text)
            return True
        except ValueError:
            continue
    return False


def shape(value: str) -> str:
    """The shape of a value: `<number>`, `<date>`, a letter/digit mask like `AA-999`, or `<text:N>`."""
    text = value.strip()
    if not text:
        return value
    if NUMBER.match(text):
        return "<number>"
    if _is_date(text):
        return "<date>"
    if len(text) <= 16 and CODE_LIKE.match(text) and any(c.isdigit() for c in text):
        return re.sub(r"[0-9]", "9", re.sub(r"[A-Za-z]", lambda m: "A" if m[0].isupper() else "a", text))
    return f"<text:{len(text)}>"


def _masked(text: str, values: Mapping[str, str]) -> str:
    """`text` with every known value replaced by its shape, in one pass, longest value first.

    One pass, so a shape already written (`99/99/9999`) is never masked again.
    """
    if not values:
        return text
    if any(v == "<date>" or LOCAL_DATE.search(k) for k, v in values.items()):
        text = ISO_DATE.sub("<date>", text)  # first, or the numbers inside would be masked one by one
    pattern = re.compile("|".join(re.escape(v) for v in sorted(values, key=len, reverse=True)))
    return pattern.sub(lambda m: values[m[0]], text)


def hidden_values(seen: list[str]) -> dict[str, str]:
    """Every value to hide, with its shape, plus what rules derive from it when they suggest a fix.

    A fix often repeats a value rewritten ("write 1250 without the separator", "write 2.4"), so the
    numbers inside a value, with and without thousands separators, are hidden too.
    """
    values = {v: shape(v) for v in seen if len(v.strip()) >= MASKED_MIN}
    for value in seen:
        for number in NUMBER_INSIDE.findall(value):
            for form in (number, number.replace(",", "")):
                if len(form) >= MASKED_MIN and form not in values:
                    values[form] = "<number>"
    return values


def _evidence(item: Any, values: Mapping[str, str]) -> Any:
    if isinstance(item, str):
        return _masked(item, values)
    if isinstance(item, Mapping):
        return {k: _evidence(v, values) for k, v in item.items()}
    if isinstance(item, list | tuple):
        return [_evidence(v, values) for v in item]
    return item


def _cap_excerpt(excerpt: Excerpt | None, limit: int | None) -> Excerpt | None:
    if excerpt is None or limit is None:
        return excerpt
    return replace(excerpt, rows=excerpt.rows[:limit]) if limit > 0 else None


def redact_finding(finding: Finding, hide_values: bool, examples: int | None) -> Finding:
    """One finding with examples capped at `examples` and, if `hide_values`, every value as its shape."""
    capped = finding.examples if examples is None else finding.examples[: max(examples, 0)]
    excerpt = _cap_excerpt(finding.excerpt, examples)
    if not hide_values:
        return replace(finding, examples=capped, excerpt=excerpt)
    # The values to hide are every example and excerpt cell, wherever the message repeats them.
    seen = list(finding.examples)
    if finding.excerpt is not None:
        seen += [c for r in finding.excerpt.rows for c in r.cells if c]
    values = hidden_values(seen)
    if excerpt is not None:
        excerpt = replace(
            excerpt,
            rows=tuple(
                ExcerptRow(r.row, tuple(None if c is None else shape(c) for c in r.cells), r.marked)
                for r in excerpt.rows
            ),
        )
    return replace(
        finding,
        message=_masked(finding.message, values),
        fix=_masked(finding.fix, values),
        examples=tuple(shape(v) for v in capped),
        evidence=_evidence(dict(finding.evidence), values),
        excerpt=excerpt,
    )


def redact(report: Report, hide_values: bool = True, examples: int | None = None) -> Report:
    """The report with every finding passed through `redact_finding`; file names and rows are kept."""
    results = tuple(
        replace(r, findings=tuple(redact_finding(f, hide_values, examples) for f in r.findings))
        for r in report.results
    )
    return replace(
        report,
        results=results,
        findings=tuple(redact_finding(f, hide_values, examples) for f in report.findings),
    )
