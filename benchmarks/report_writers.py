"""Time each report writer on a large invented report, against the JSON writer as the baseline, in one run.

Run: python benchmarks/report_writers.py [FINDINGS]   (prints seconds, output size and ratio to JSON)
"""

from __future__ import annotations

import sys
import time
from collections.abc import Callable

import pandas as pd

from linter.findings import Finding, Place, Severity
from linter.report import html, json_report, markdown, sarif
from linter.report.excerpt import attach_excerpts
from linter.report.export import csv_bytes, xlsx_bytes
from linter.report.model import Report, TableResult
from linter.report.redact import redact
from linter.table import Table, first_row_header


def invented_report(findings: int) -> Report:
    """A Vell Basin chemistry table with one bad result per row, and a finding for each."""
    rows = [["site_id", "sampled_on", "analyte", "result"]]
    rows += [[f"VB-{i % 999:03}", "2026-03-02", f"analyte-{i}", "n/a"] for i in range(findings)]
    table = Table("vell_big.csv", None, pd.DataFrame(rows, dtype=object), tuple(range(1, len(rows) + 1)))
    frame = first_row_header(table)
    found = [
        Finding(
            "values.not-a-number",
            Severity.ERROR if i % 3 else Severity.WARNING,
            f"Result in row {i + 2} is not a number.",
            Place("vell_big.csv", None, (i + 2,), ("result",), ("D",)),
            examples=("n/a",),
            fix="Write a number.",
        )
        for i in range(findings)
    ]
    result = TableResult(
        "vell_big.csv",
        None,
        "0" * 64,
        "csv",
        findings,
        4,
        None,
        None,
        None,
        attach_excerpts(found, frame, 5, ("site_id", "sampled_on", "analyte")),
    )
    return Report("bench", "2026-03-10T09:00:00+00:00", Severity.ERROR, (result,))


def timed(render: Callable[[Report], str | bytes], report: Report) -> tuple[float, int]:
    start = time.perf_counter()
    out = render(report)
    return time.perf_counter() - start, len(out.encode() if isinstance(out, str) else out)


def main() -> None:
    findings = int(sys.argv[1]) if len(sys.argv) > 1 else 5000
    report = invented_report(findings)
    base, base_size = timed(json_report.render, report)
    print(f"{findings} findings; baseline json_report: {base:.3f} s, {base_size / 1e6:.2f} MB")
    writers: dict[str, Callable[[Report], str | bytes]] = {
        "html letter": html.render,
        "markdown letter": markdown.render,
        "sarif": sarif.render,
        "export csv": csv_bytes,
        "export xlsx": xlsx_bytes,
        "redact (all values)": lambda r: json_report.render(redact(r)),
    }
    for name, render in writers.items():
        seconds, size = timed(render, report)
        print(f"{name:20} {seconds:7.3f} s  {size / 1e6:6.2f} MB  x{seconds / base:5.2f} of json")


if __name__ == "__main__":
    main()
