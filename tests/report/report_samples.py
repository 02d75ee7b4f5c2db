"""Invented Vell Basin submissions and findings that the report tests render."""

from __future__ import annotations

from collections.abc import Sequence

import pandas as pd

from linter.findings import Finding, Place, Severity
from linter.report.excerpt import attach_excerpts
from linter.report.model import Report, TableResult
from linter.table import Frame, Table, first_row_header

HOSTILE_SCRIPT = "<script>window.__pwned = 1</script>"
HOSTILE_IMG = '"><img src=x onerror="window.__pwned = 2">'
HOSTILE_FORMULA = '=HYPERLINK("http://evil.invalid/","click me")'

CHEMISTRY: list[list[str | None]] = [
    ["site_id", "sampled_on", "analyte", "result", "unit"],
    ["VB-014", "2026-03-02", "nitrate", "1.8", "mg/L"],
    ["VB-014", "2026-03-02", "phosphate", "-0.4", "mg/L"],
    ["VB-021", "2026-03-03", "nitrate", "n/a", "mg/L"],
    ["VB-021", "2026-03-03", "phosphate", HOSTILE_SCRIPT, "mg/L"],
    ["VB-030", "2026-03-04", "nitrate", HOSTILE_IMG, "mg/L"],
    ["VB-030", "2026-03-04", "phosphate", HOSTILE_FORMULA, None],
]


def make_frame(
    rows: Sequence[Sequence[str | None]], source: str = "vell_chemistry.csv", sheet: str | None = None
) -> Frame:
    grid = pd.DataFrame([list(r) for r in rows], dtype=object)
    table = Table(source, sheet, grid, tuple(range(1, len(rows) + 1)), format="xlsx" if sheet else "csv")
    return first_row_header(table)


def result_for(frame: Frame, findings: list[Finding]) -> TableResult:
    keys = ("site_id", "sampled_on", "analyte")
    return TableResult(
        file=frame.table.source,
        sheet=frame.table.sheet,
        sha256="0" * 64,
        format=frame.table.format,
        rows=len(frame.rows),
        columns=len(frame.names),
        contract="stream-chemistry",
        contract_version="2",
        table="stream-chemistry",
        findings=attach_excerpts(findings, frame, 5, keys),
    )


def chemistry_findings(source: str = "vell_chemistry.csv", sheet: str | None = None) -> list[Finding]:
    return [
        Finding(
            rule="values.not-a-number",
            severity=Severity.ERROR,
            message="4 cells of result are not numbers.",
            place=Place(source, sheet, (4, 5, 6, 7), ("result",), ("D",)),
            count=4,
            examples=("n/a", HOSTILE_SCRIPT, HOSTILE_IMG, HOSTILE_FORMULA),
            fix="Write each result as a number such as 0.42; leave the cell empty if there is none.",
        ),
        Finding(
            rule="values.out-of-range",
            severity=Severity.WARNING,
            message="1 result is below the smallest allowed value 0.",
            place=Place(source, sheet, (3,), ("result",), ("D",)),
            examples=("-0.4",),
            fix="Check the value; concentrations cannot be negative.",
        ),
        Finding(
            rule="values.missing-required",
            severity=Severity.NOTE,
            message="1 cell of unit is empty.",
            place=Place(source, sheet, (7,), ("unit",), ("E",)),
            fix="Write the unit, mg/L.",
        ),
    ]


def wide_findings(source: str = "vell_counts.csv") -> list[Finding]:
    return [
        Finding(
            rule="layout.values-in-headers",
            severity=Severity.ERROR,
            message="Columns 2019 and 2020 are values of the variable year, not variables.",
            place=Place(source, None, (1,), ("2019", "2020"), ("B", "C")),
            count=2,
            examples=("2019", "2020"),
            fix="Put the year in its own column and the counts in one column, one row per site and year.",
            step={
                "step": "gather",
                "columns": ["2019", "2020"],
                "names_to": "year",
                "values_to": "count",
                "keep_empty": True,
            },
        )
    ]


def chemistry_report() -> Report:
    frame = make_frame(CHEMISTRY)
    counts = make_frame([["site_id", "2019", "2020"], ["VB-014", "12", "9"]], "vell_counts.csv")
    return Report(
        "0.1.0",
        "2026-03-10T09:00:00+00:00",
        Severity.ERROR,
        (result_for(frame, chemistry_findings()), result_for(counts, wide_findings())),
    )
