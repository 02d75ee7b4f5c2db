"""Write the demo's binary and non-UTF-8 files (Excel workbooks, a Windows-1252 CSV) reproducibly.

The plain CSV files next to this script are written by hand; the files below cannot be, so this
script makes them byte for byte the same on every run (fixed zip entry times and document dates).

    python sample_submissions/make_samples.py            # rewrite them here
    python sample_submissions/make_samples.py --out DIR  # write them under DIR instead
"""

from __future__ import annotations

import argparse
import io
import re
import sys
import zipfile
from datetime import date, datetime
from pathlib import Path

from openpyxl import Workbook

FIXED_TIME = (2026, 1, 1, 0, 0, 0)
"""Zip entry time and document date of every workbook, so the bytes never depend on today."""
CHEMISTRY_HEADER = ("site_id", "sampled_on", "analyte", "result", "qualifier", "lab_sample_id")
Row = tuple[object, ...]

CLEAN_APRIL: list[Row] = [
    ("VB-001", date(2026, 4, 7), "NITRATE", 1.38, None, "AU260401"),
    ("VB-001", date(2026, 4, 7), "AMMONIUM", "<0.05", None, "AU260402"),
    ("VB-001", date(2026, 4, 7), "PHOSPHATE", 0.058, None, "AU260403"),
    ("VB-003", date(2026, 4, 7), "NITRATE", 1.97, None, "AU260404"),
    ("VB-003", date(2026, 4, 7), "AMMONIUM", 0.15, "J", "AU260405"),
    ("VB-003", date(2026, 4, 7), "PHOSPHATE", "<0.02", None, "AU260406"),
    ("VB-014", date(2026, 4, 8), "NITRATE", 2.88, None, "AU260407"),
    ("VB-014", date(2026, 4, 8), "SULFATE", 41.5, None, "AU260408"),
]
"""A clean laboratory workbook: numbers and dates as real Excel cells, censored results as text."""

RETURNED_APRIL: list[Row] = [
    ("VB-001", date(2026, 4, 9), "NITRATE", 1.21, None, "FC260401"),
    ("VB-002", date(2026, 4, 9), "Nitrate ", 1.44, None, "FC260402"),  # code variant: case and space
    ("VB-003", date(2026, 4, 9), "nitrate", 0.93, None, "FC260403"),  # code variant: case
    ("VB-003", date(2026, 4, 9), "ZINC", 0.02, None, "FC260404"),  # not in the code list
    ("VB-004", date(2026, 4, 9), "CHLORIDE", 18.0, "X", "FC260405"),  # qualifier not in the code list
    ("VB-004", date(2026, 4, 9), "SULFATE", None, None, "FC260406"),  # result missing
    (None, date(2026, 4, 9), "NITRATE", 1.1, None, "FC260407"),  # key cell empty
    ("VB-005", date(2026, 4, 9), "NITRATE", 1.62, None, "FC260408"),  # duplicate key group ...
    ("VB-005", date(2026, 4, 9), "NITRATE", 1.71, None, "FC260409"),  # ... with this row
    ("VB-099", date(2026, 4, 9), "NITRATE", 2.05, None, "FC260410"),  # no such site in the register
]
"""A returned laboratory workbook: every planted problem is named on its row."""

HERONSGATE_CP1252 = (
    "site_id,month,visited_on,water_temp_min_c,water_temp_max_c,ph,dissolved_oxygen,observer,notes\r\n"
    "VB-007,2026-01,2026-01-24,2.0,3.0,7.5,12.1,HB,Caf\u00e9 bridge \u2013 frost on the rail\r\n"
    "VB-008,2026-01,2026-01-24,2.5,3.5,7.4,11.7,HB,\r\n"
    "VB-007,2026-02,2026-02-21,3.0,4.5,7.6,24.0,HB,Reading doubtful \u2013 probe re-calibrated\r\n"
    "VB-008,2026-02,2026-02-21,3.5,5.0,7.3,11.2,,Observer left the sheet unsigned\r\n"
    "VB-007,2026-03,2026-03-21,5.0,7.0,7.5,10.7,HB,\r\n"
    "VB-008,2026-03,2026-03-21,5.5,7.5,7.4,10.3,HB,Water 5\u00b0 warmer below the outfall\r\n"
)
"""A volunteer sheet saved by an old spreadsheet in Windows-1252 (é, en dash and ° are not UTF-8)."""


def workbook_bytes(rows: list[Row], sheet: str) -> bytes:
    book = Workbook()
    page = book.active
    assert page is not None
    page.title = sheet
    page.append(CHEMISTRY_HEADER)
    for row in rows:
        page.append(row)
    for cell in page["B"][1:]:
        cell.number_format = "yyyy-mm-dd"
    book.properties.creator = "Vell Basin Water Network demo"
    book.properties.created = datetime(*FIXED_TIME)
    buffer = io.BytesIO()
    book.save(buffer)
    return fixed_zip(buffer.getvalue())


def fixed_zip(data: bytes) -> bytes:
    """The same workbook with every entry time and the saved-on date fixed (openpyxl stamps 'now')."""
    stamp = datetime(*FIXED_TIME).strftime("%Y-%m-%dT%H:%M:%SZ")
    source = zipfile.ZipFile(io.BytesIO(data))
    out = io.BytesIO()
    with zipfile.ZipFile(out, "w", zipfile.ZIP_DEFLATED) as target:
        for entry in source.infolist():
            content = source.read(entry.filename)
            if entry.filename == "docProps/core.xml":
                content = re.sub(rb"(<dcterms:modified[^>]*>)[^<]*", rb"\g<1>" + stamp.encode(), content)
            info = zipfile.ZipInfo(entry.filename, date_time=FIXED_TIME)
            info.compress_type = zipfile.ZIP_DEFLATED
            info.external_attr = 0o644 << 16
            target.writestr(info, content)
    return out.getvalue()


def samples() -> dict[str, bytes]:
    """Relative path -> exact bytes of every generated demo file."""
    return {
        "clean/chemistry-2026-04-aurora-lab.xlsx": workbook_bytes(CLEAN_APRIL, "April 2026"),
        "returned/chemistry-2026-04-ferncliff-lab.xlsx": workbook_bytes(RETURNED_APRIL, "Results"),
        "returned/field-sheets-2026-q1-heronsgate-volunteers.csv": HERONSGATE_CP1252.encode("cp1252"),
    }


def main(argv: list[str]) -> int:
    parser = argparse.ArgumentParser(description="Write the demo's generated files.")
    parser.add_argument("--out", type=Path, default=Path(__file__).resolve().parent)
    out = parser.parse_args(argv).out
    for name, content in samples().items():
        target = out / name
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(content)
        print(f"wrote {name} ({len(content):,} bytes)")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
