"""Fill a generated template the way a provider would: typed values below the example rows."""

from __future__ import annotations

from datetime import date
from pathlib import Path

from openpyxl import load_workbook

# Invented Vell Basin rows, typed as a person types them: numbers as numbers, dates as dates.
SITES = [
    ["VB-014", "Mill Ford", "Vell", "ALD", 52.11, -2.4, date(2019, 5, 2), "true"],
    ["VB-027", "Heron Weir", "Cress Brook", "CRS", 51.87, -1.95, date(2021, 8, 30), "false"],
]
CHEMISTRY = [
    ["VB-014", date(2026, 2, 3), "NITRATE", 2.4, None, "KL204417"],
    ["VB-014", date(2026, 2, 3), "PHOSPHATE", "<0.05", "J", "KL204418"],
    ["VB-027", date(2026, 2, 4), "NITRATE", 1.15, None, "KL204419"],
]
FIELD_SHEETS = [
    ["VB-014", "2026-01", date(2026, 1, 17), 3.5, 4.1, 7.2, 10.4, "RT", None],
    ["VB-027", "2026-01", date(2026, 1, 18), 2.9, 3.6, 6.8, 11.0, "MJ", "ice at the bank"],
]
FILLS = {"sites": SITES, "stream-chemistry": CHEMISTRY, "field-sheets": FIELD_SHEETS}
BUNDLE_FILLS = {
    "visited_sites": [["VB-014", "Vell", 52.11], ["VB-031", "Tarn Beck", 51.62]],
    "samples": [
        ["VB-014", date(2026, 4, 2), 2.45],
        ["VB-031", date(2026, 4, 2), 0.8],
        ["VB-031", date(2026, 4, 9), 1],
    ],
}
"""The demo bundle, one list of rows per sheet of the same workbook."""
FIRST_DATA_ROW = 4
"""Row 1 is the header, rows 2-3 the examples; data follows them."""


def fill(
    template: Path, out: Path, sheet: str, rows: list[list[object]], start: int = FIRST_DATA_ROW
) -> Path:
    workbook = load_workbook(template)
    ws = workbook[sheet]
    for r, values in enumerate(rows, start=start):
        for c, value in enumerate(values, start=1):
            ws.cell(row=r, column=c, value=value)
    workbook.save(out)
    return out


def fill_sheets(template: Path, out: Path, sheets: dict[str, list[list[object]]]) -> Path:
    """Fill several sheets of one workbook (a bundle) below their examples."""
    workbook = load_workbook(template)
    for sheet, rows in sheets.items():
        for r, values in enumerate(rows, start=FIRST_DATA_ROW):
            for c, value in enumerate(values, start=1):
                workbook[sheet].cell(row=r, column=c, value=value)
    workbook.save(out)
    return out


def plant(filled: Path, out: Path, sheet: str, cell: str, value: object) -> Path:
    """A copy of `filled` with one cell changed (the original stays as it was)."""
    workbook = load_workbook(filled)
    workbook[sheet][cell] = value
    workbook.save(out)
    return out
