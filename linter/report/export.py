"""The offending rows as CSV or XLSX for the provider, every cell neutralised against formula injection."""

from __future__ import annotations

import csv
import io
from pathlib import PurePath

from linter.errors import WeirError
from linter.findings import Finding
from linter.report.model import Report

FORMULA_TRIGGERS = ("=", "+", "-", "@", "\t", "\r")
"""Leading characters a spreadsheet may read as a formula (OWASP, "CSV Injection")."""
HEADER = ("file", "sheet", "row", "severity", "rule", "columns", "letters", "cells", "problem", "fix")


def neutralised(text: str) -> str:
    """`text`, prefixed with `'` when it starts like a formula, so a spreadsheet shows it as text.

    Follows OWASP's CSV Injection guidance: prefix cells beginning with = + - @ tab or carriage
    return with a single quote. Negative numbers get the quote too: the guidance makes no exception.
    """
    return "'" + text if text.startswith(FORMULA_TRIGGERS) else text


def _marked_cells(finding: Finding, row: int) -> str:
    if finding.excerpt is None:
        return ""
    for shown in finding.excerpt.rows:
        if shown.row == row:
            return " | ".join(c or "" for c, m in zip(shown.cells, shown.marked, strict=False) if m)
    return ""


def offending_rows(report: Report) -> list[list[str | int]]:
    """One line per finding and named row (a finding without rows gets one line), header first."""
    lines: list[list[str | int]] = [list(HEADER)]
    for finding in sorted(
        report.all_findings(), key=lambda f: (f.place.file, f.place.sheet or "", f.place.rows)
    ):
        place = finding.place
        for row in place.rows or (0,):
            lines.append(
                [
                    place.file,
                    place.sheet or "",
                    row if row else "",
                    finding.severity.value,
                    finding.rule,
                    ", ".join(place.columns),
                    ", ".join(place.letters),
                    _marked_cells(finding, row),
                    finding.message,
                    finding.fix,
                ]
            )
    return [[neutralised(v) if isinstance(v, str) else v for v in line] for line in lines]


def csv_bytes(report: Report) -> bytes:
    """RFC 4180 CSV (CRLF line ends, quoted fields), UTF-8 with a BOM so spreadsheets detect it."""
    buffer = io.StringIO(newline="")
    csv.writer(buffer, lineterminator="\r\n").writerows(offending_rows(report))
    return buffer.getvalue().encode("utf-8-sig")


def xlsx_bytes(report: Report) -> bytes:
    """A one-sheet workbook; cells are written as text (neutralised), row numbers as numbers."""
    # Imported here: every `weir check` loads this module, few write a workbook.
    from openpyxl import Workbook
    from openpyxl.styles import Font

    book = Workbook()
    sheet = book.active
    assert sheet is not None  # a new workbook always has its first sheet
    sheet.title = "Rows to correct"
    for line in offending_rows(report):
        sheet.append(line)
    for cell in sheet[1]:
        cell.font = Font(bold=True)
    sheet.freeze_panes = "A2"
    buffer = io.BytesIO()
    book.save(buffer)
    return buffer.getvalue()


def export_bytes(report: Report, target: str) -> bytes:
    """The export in the format named by `target`'s suffix (.csv or .xlsx)."""
    suffix = PurePath(target).suffix.lower()
    if suffix == ".csv":
        return csv_bytes(report)
    if suffix == ".xlsx":
        return xlsx_bytes(report)
    raise WeirError(f"cannot export rows to {target}: name a .csv or .xlsx file")
