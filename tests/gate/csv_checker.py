"""A small stand-in checker for the gate's own tests: the gate's job is filing, not checking.

It reads CSV with the standard library and reports every empty `result` cell, so the gate
can be tested on good, bad and unreadable files without the full pipeline.
"""

from __future__ import annotations

import csv
import time
from datetime import UTC, datetime
from pathlib import Path

from linter.check import file_sha256
from linter.findings import Finding, Place, Severity
from linter.report.model import Report, TableResult

DELAY = 0.0
"""Seconds to spend per file, so two gates running at once really overlap."""


def check_csv(path: Path) -> Report:
    time.sleep(DELAY)
    with open(path, encoding="utf-8", newline="") as handle:  # binary junk raises UnicodeDecodeError
        rows = list(csv.DictReader(handle))
    if not rows or "result" not in rows[0]:
        raise ValueError("no result column")
    empty = [n for n, row in enumerate(rows, start=2) if not (row["result"] or "").strip()]
    findings = tuple(
        Finding("values.missing", Severity.ERROR, "result is empty", Place(str(path), rows=(n,)))
        for n in empty
    )
    result = TableResult(
        str(path), None, file_sha256(str(path)), "csv", len(rows), 3, "stream-chemistry", "2", None, findings
    )
    return Report("test", datetime.now(UTC).isoformat(), Severity.ERROR, (result,))
