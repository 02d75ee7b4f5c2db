"""The report as a SARIF 2.1.0 log, so a code-hosting platform can show findings on the submitted file."""

from __future__ import annotations

import json
from pathlib import PurePath
from typing import Any
from urllib.parse import quote

from linter.findings import Finding, Severity
from linter.report.model import Report
from linter.rules.registry import RULES, Rule

SARIF_VERSION = "2.1.0"
RELATED_ROWS = 20
"""Rows beyond the first become related locations; a pull-request view gains nothing from fifty."""
TEXT_FORMATS = frozenset({"csv", "tsv", "txt"})
"""Formats whose provider row number is a line number of the file (SARIF `region.startLine`)."""
LEVEL = {Severity.ERROR: "error", Severity.WARNING: "warning", Severity.NOTE: "note"}


def artifact_uri(file: str) -> str:
    """A relative URI reference for a submitted path (SARIF §3.10 wants URIs, so spaces are encoded)."""
    return quote(PurePath(file).as_posix(), safe="/")


def sheet_reference(sheet: str, cell: str) -> str:
    """`Results!C7`, quoting sheet names that need it as spreadsheet formulas do (`'Lab 2'!C7`)."""
    if sheet.replace("_", "").isalnum():
        return f"{sheet}!{cell}"
    return "'" + sheet.replace("'", "''") + f"'!{cell}"


def utc(stamp: str) -> str:
    """SARIF §3.9 asks for UTC times written with a `Z`."""
    return stamp.replace("+00:00", "Z")


def rule_descriptor(rule: Rule) -> dict[str, Any]:
    summary = rule.doc.split("\n\n", 1)[0].replace("\n", " ").strip()
    return {
        "id": rule.id,
        "name": rule.title,
        "shortDescription": {"text": rule.title},
        "fullDescription": {"text": summary or rule.title},
        "help": {"text": rule.doc, "markdown": rule.doc},
        "defaultConfiguration": {"level": LEVEL[rule.severity]},
    }


def unregistered_descriptor(rule_id: str, severity: Severity) -> dict[str, Any]:
    """Rules raised outside the registry (reading failures, internal errors) still get a descriptor."""
    text = f"Weir rule {rule_id}"
    return {
        "id": rule_id,
        "shortDescription": {"text": text},
        "fullDescription": {"text": text},
        "defaultConfiguration": {"level": LEVEL[severity]},
    }


def _location(finding: Finding, row: int | None, text_file: bool) -> dict[str, Any]:
    place = finding.place
    physical: dict[str, Any] = {"artifactLocation": {"uri": artifact_uri(place.file)}}
    location: dict[str, Any] = {"physicalLocation": physical}
    if row is not None and text_file:
        physical["region"] = {"startLine": row}
    if not text_file and (place.sheet or row is not None):
        # A workbook is binary to SARIF (lines mean nothing), so the cell goes in a logical location.
        letter = place.letters[0] if place.letters else ""
        cell = f"{letter}{row}" if row is not None and letter else (letter or (str(row) if row else ""))
        name = cell or (place.sheet or "")
        qualified = sheet_reference(place.sheet, cell) if place.sheet and cell else name
        location["logicalLocations"] = [{"name": name, "fullyQualifiedName": qualified, "kind": "element"}]
    return location


def result_record(finding: Finding, rule_index: int, text_file: bool) -> dict[str, Any]:
    rows: list[int | None] = list(finding.place.rows) or [None]
    message = finding.message + (f" Fix: {finding.fix}" if finding.fix else "")
    result: dict[str, Any] = {
        "ruleId": finding.rule,
        "ruleIndex": rule_index,
        "level": LEVEL[finding.severity],
        "message": {"text": message},
        "locations": [_location(finding, rows[0], text_file)] if finding.place.file else [],
        "properties": {
            "count": finding.count,
            "columns": list(finding.place.columns),
            "letters": list(finding.place.letters),
            "examples": list(finding.examples),
        },
    }
    related = [_location(finding, r, text_file) for r in rows[1 : 1 + RELATED_ROWS]]
    if related:
        result["relatedLocations"] = [
            {"id": i + 1, **loc, "message": {"text": f"also row {r}"}}
            for i, (loc, r) in enumerate(zip(related, rows[1:], strict=False))
        ]
    if finding.step is not None:
        result["properties"]["step"] = dict(finding.step)
    return result


def sarif_document(report: Report) -> dict[str, Any]:
    """The SARIF log: one run, driver `weir` with every registered rule, one result per finding."""
    import linter.rules.catalogue  # noqa: F401  (the driver lists every rule, not only those found)

    descriptors = [rule_descriptor(RULES[r]) for r in sorted(RULES)]
    index = {d["id"]: i for i, d in enumerate(descriptors)}
    findings: list[tuple[Finding, bool]] = [
        (f, r.format in TEXT_FORMATS) for r in report.results for f in r.findings
    ]
    findings += [
        (f, PurePath(f.place.file).suffix.lower().lstrip(".") in TEXT_FORMATS) for f in report.findings
    ]
    for finding, _ in findings:
        if finding.rule not in index:
            index[finding.rule] = len(descriptors)
            descriptors.append(unregistered_descriptor(finding.rule, finding.severity))
    files = sorted({f.place.file for f, _ in findings if f.place.file} | {r.file for r in report.results})
    return {
        "version": SARIF_VERSION,
        "runs": [
            {
                "tool": {
                    "driver": {
                        "name": "weir",
                        "version": report.tool_version,
                        "rules": descriptors,
                    }
                },
                "artifacts": [{"location": {"uri": artifact_uri(f)}} for f in files],
                "invocations": [
                    {"executionSuccessful": True, "endTimeUtc": report.created.replace("+00:00", "Z")}
                ],
                "results": [result_record(f, index[f.rule], text) for f, text in findings],
            }
        ],
    }


def render(report: Report) -> str:
    return json.dumps(sarif_document(report), indent=2, ensure_ascii=False) + "\n"
