"""The machine-readable report: a JSON document that validates against `schema/report-v1.json`."""

from __future__ import annotations

import json
from dataclasses import asdict
from typing import Any

from linter.findings import Finding
from linter.report.model import Report, TableResult

REPORT_FORMAT = 1
"""Bumped whenever the report's shape changes incompatibly; the schema file carries the same number."""


def excerpt_record(finding: Finding) -> dict[str, Any] | None:
    excerpt = finding.excerpt
    if excerpt is None:
        return None
    return {
        "columns": list(excerpt.columns),
        "letters": list(excerpt.letters),
        "rows": [{"row": r.row, "cells": list(r.cells), "marked": list(r.marked)} for r in excerpt.rows],
    }


def finding_record(finding: Finding) -> dict[str, Any]:
    record = asdict(finding)
    record["severity"] = finding.severity.value
    record["place"]["rows"] = list(finding.place.rows)
    record["examples"] = list(finding.examples)
    record["step"] = dict(finding.step) if finding.step is not None else None
    record["evidence"] = dict(finding.evidence)
    record["excerpt"] = excerpt_record(finding)
    return record


def table_record(result: TableResult, fail_on_rank: int) -> dict[str, Any]:
    counts = {s: 0 for s in ("error", "warning", "note")}
    for f in result.findings:
        counts[f.severity.value] += 1
    failed = any(f.severity.rank >= fail_on_rank for f in result.findings)
    return {
        "file": result.file,
        "sheet": result.sheet,
        "sha256": result.sha256,
        "format": result.format,
        "encoding": result.encoding,
        "rows": result.rows,
        "columns": result.columns,
        "contract": (
            {"id": result.contract, "version": result.contract_version, "table": result.table}
            if result.contract
            else None
        ),
        "verdict": "returned" if failed else "accepted",
        "counts": counts,
        "findings": [finding_record(f) for f in result.findings],
    }


def report_document(report: Report) -> dict[str, Any]:
    """The report as JSON-ready data, keys in a fixed order so identical runs give identical files."""
    return {
        "weir_report": REPORT_FORMAT,
        "tool": {"name": "weir", "version": report.tool_version},
        "created": report.created,
        "fail_on": report.fail_on.value,
        "verdict": report.verdict,
        "counts": report.counts(),
        "tables": [table_record(r, report.fail_on.rank) for r in report.results],
        "submission_findings": [finding_record(f) for f in report.findings],
    }


def render(report: Report) -> str:
    return json.dumps(report_document(report), indent=2, ensure_ascii=False, default=str) + "\n"
