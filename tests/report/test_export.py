"""Exported offending rows open in a spreadsheet as text: no cell can start a formula."""

from __future__ import annotations

import csv
import io

import openpyxl
import pandas as pd
import pytest
from report_samples import HOSTILE_FORMULA

from linter.errors import WeirError
from linter.report.export import csv_bytes, export_bytes, neutralised, xlsx_bytes
from linter.report.model import Report

# Source: OWASP "CSV Injection" page: cells beginning with = + - @ tab (0x09) or carriage return (0x0D)
# are read as formulas; the guidance is to prefix them with a single quote
TRIGGERS = ("=", "+", "-", "@", "\t", "\r")


@pytest.mark.parametrize("text", ["=1+2", "+1", "-0.4", "@SUM(A1)", "\tx", "\rx", HOSTILE_FORMULA])
def test_formula_starts_are_prefixed(text: str) -> None:
    assert neutralised(text) == "'" + text


@pytest.mark.parametrize("text", ["VB-014", "0.4", "", "a=b", " =x"])
def test_other_text_is_untouched(text: str) -> None:
    assert neutralised(text) == text


def test_csv_export_has_no_formula_cell_and_keeps_the_rows(report: Report) -> None:
    data = csv_bytes(report)
    assert data.startswith(b"\xef\xbb\xbf")
    # Source: RFC 4180 §2 (CRLF records, quoted fields), parsed by Python's csv module
    rows = list(csv.reader(io.StringIO(data.decode("utf-8-sig"), newline="")))
    assert rows[0][:3] == ["file", "sheet", "row"]
    assert all(not cell.startswith(TRIGGERS) for row in rows for cell in row)
    cells = [r[7] for r in rows[1:]]
    assert "'" + HOSTILE_FORMULA in cells and "'-0.4" in cells and "n/a" in cells
    named = sorted(int(r[2]) for r in rows[1:] if r[0] == "vell_chemistry.csv")
    assert named == [3, 4, 5, 6, 7, 7]  # every row each finding names, once per finding
    assert len(pd.read_csv(io.BytesIO(data), encoding="utf-8-sig")) == len(rows) - 1


def test_xlsx_export_holds_text_not_formulas(report: Report) -> None:
    # Source: ECMA-376 Part 1 §18.3.1.4 (a cell's <f> element holds a formula), read back with openpyxl
    book = openpyxl.load_workbook(io.BytesIO(xlsx_bytes(report)))
    sheet = book.active
    assert sheet is not None
    cells = [c for row in sheet.iter_rows() for c in row if c.value is not None]
    assert not [c.coordinate for c in cells if c.data_type == "f"]
    assert not [c.value for c in cells if isinstance(c.value, str) and c.value.startswith(TRIGGERS)]
    assert "'" + HOSTILE_FORMULA in [c.value for c in cells]
    assert 4 in [c.value for c in sheet["C"]]  # row numbers stay numbers


def test_raw_value_would_be_a_formula_in_a_workbook() -> None:
    # Guards the test above: openpyxl does store an unprefixed "=..." as a formula
    book = openpyxl.Workbook()
    assert book.active is not None
    book.active.append([HOSTILE_FORMULA])
    assert book.active["A1"].data_type == "f"


def test_unknown_export_suffix_is_a_one_line_error(report: Report) -> None:
    with pytest.raises(WeirError, match=r"\.csv or \.xlsx"):
        export_bytes(report, "rows.ods")
