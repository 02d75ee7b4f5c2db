"""Workbooks built with openpyxl: cached values only, numbers without float noise, ISO dates, and
everything the sheet hides (merged ranges, hidden rows, columns and sheets) recorded."""

from __future__ import annotations

import re
import zipfile
from datetime import date, datetime
from pathlib import Path
from xml.etree import ElementTree

import pytest
from openpyxl import Workbook
from reader_helpers import cells, kinds, write

from linter.read import UnreadableFile, read_path
from linter.read.limits import ReadLimits


def patch_member(path: Path, member: str, old: str, new: str) -> None:
    """Rewrite one archive member (openpyxl cannot write a formula's cached value itself)."""
    with zipfile.ZipFile(path) as archive:
        contents = {i.filename: archive.read(i.filename) for i in archive.infolist()}
    text = contents[member].decode()
    assert old in text
    contents[member] = text.replace(old, new).encode()
    with zipfile.ZipFile(path, "w", zipfile.ZIP_DEFLATED) as archive:
        for name, data in contents.items():
            archive.writestr(name, data)


def build_workbook(path: Path) -> None:
    wb = Workbook()
    ws = wb.active
    assert ws is not None
    ws.title = "results"
    ws.append(["site_id", "sampled_on", "result", "count", "doubled", "checked"])
    ws.append(["007", date(2024, 3, 5), 0.1, 12.0, "=C2*2", True])
    ws.append(["VB-014", datetime(2024, 3, 5, 14, 30), 0.30000000000000004, 7, None, False])
    ws.append([None, None, 1234567.0, 3, None, None])
    ws.append(["VB-016", None, -0.5, 4, None, None])
    ws.merge_cells("A3:A4")
    ws.row_dimensions[5].hidden = True
    ws.column_dimensions["F"].hidden = True
    ws["D3"].number_format = "000"
    hidden = wb.create_sheet("old_results")
    hidden.append(["site_id", "result"])
    hidden.append(["VB-001", "4.2"])
    hidden.sheet_state = "hidden"
    wb.create_sheet("Sheet3")
    wb.save(path)
    patch_member(path, "xl/worksheets/sheet1.xml", "<f>C2*2</f><v />", "<f>C2*2</f><v>0.2</v>")


@pytest.fixture()
def workbook(tmp_path: Path) -> Path:
    path = tmp_path / "results.xlsx"
    build_workbook(path)
    return path


def test_every_sheet_with_content_hidden_ones_included(workbook: Path) -> None:
    tables = read_path(str(workbook))
    assert [t.sheet for t in tables] == ["results", "old_results"]
    assert "hidden-sheet" in kinds(tables[1]) and "hidden-sheet" not in kinds(tables[0])
    empty = next(n for n in tables[0].notes if n.kind == "empty-sheets")
    assert empty.examples == ("Sheet3",)


def test_cells_as_the_provider_sees_them(workbook: Path) -> None:
    grid = cells(read_path(str(workbook))[0])
    assert grid[0] == ["site_id", "sampled_on", "result", "count", "doubled", "checked"]
    # Leading-zero text stays text; a date cell is an ISO 8601 calendar date (ISO 8601-1 §5.2.2);
    # 12.0 is shown as 12; the formula gives its cached value, never a recomputed one.
    assert grid[1] == ["007", "2024-03-05", "0.1", "12", "0.2", "TRUE"]
    # Source: ISO 8601-1:2019 §5.4.2: date and time of day, extended format with "T".
    assert grid[2][1] == "2024-03-05T14:30:00"
    # Binary noise beyond 15 significant digits is dropped; a zero-padded format shows 007.
    assert grid[2][2] == "0.3"
    assert grid[2][3] == "007"
    assert grid[2][5] == "FALSE"
    assert grid[3] == [None, None, "1234567", "3", None, None]


def test_merged_hidden_rows_and_columns_are_recorded(workbook: Path) -> None:
    table = read_path(str(workbook))[0]
    assert table.merged_ranges == ("A3:A4",)
    assert table.hidden_rows == frozenset({5})
    assert table.row_numbers == (1, 2, 3, 4, 5)
    columns = next(n for n in table.notes if n.kind == "hidden-columns")
    assert columns.examples == ("F",)
    merged = next(n for n in table.notes if n.kind == "merged-cells")
    assert merged.rows == (3,)


def test_numbers_agree_with_the_values_stored_in_the_sheet_xml(workbook: Path) -> None:
    # Source: ECMA-376 Part 1 §18.3.1.4 (c, cell) and §18.3.1.96 (v, cell value): a cell of type
    # t="n" (the default) stores its number as text in <v>; read here with the standard library's XML
    # parser, independently of openpyxl.
    ns = {"m": "http://schemas.openxmlformats.org/spreadsheetml/2006/main"}
    with zipfile.ZipFile(workbook) as archive:
        root = ElementTree.fromstring(archive.read("xl/worksheets/sheet1.xml"))
    table = read_path(str(workbook))[0]
    by_ref = {}
    for r_index, row_number in enumerate(table.row_numbers):
        for c_index in range(table.grid.shape[1]):
            by_ref[f"{chr(65 + c_index)}{row_number}"] = table.grid.iat[r_index, c_index]
    checked = 0
    for cell in root.iterfind(".//m:c", ns):
        value = cell.find("m:v", ns)
        ref = cell.get("r", "")
        if cell.get("t", "n") == "n" and value is not None and value.text and ref[0] in "CE":
            assert float(by_ref[ref]) == pytest.approx(float(value.text), rel=1e-14), ref
            checked += 1
    assert checked >= 4


def test_formula_without_cached_value_is_empty_not_evaluated(tmp_path: Path) -> None:
    wb = Workbook()
    ws = wb.active
    assert ws is not None
    ws.append(["a", "b"])
    ws.append([1, "=A2+1"])
    wb.save(tmp_path / "f.xlsx")
    (table,) = read_path(str(tmp_path / "f.xlsx"))
    assert cells(table)[1] == ["1", None]
    note = next(n for n in table.notes if n.kind == "uncached-formulas")
    assert note.examples == ("B2",) and note.rows == (2,)


def test_formula_with_cached_value_is_not_noted(workbook: Path) -> None:
    assert "uncached-formulas" not in kinds(read_path(str(workbook))[0])


def test_truncated_workbook_is_corrupt(workbook: Path) -> None:
    data = workbook.read_bytes()
    name = write("cut.xlsx", data[: len(data) // 2])
    with pytest.raises(UnreadableFile) as caught:
        read_path(name)
    assert caught.value.rule in {"file.corrupt", "file.not-a-table"}


def test_damaged_sheet_xml_is_corrupt(workbook: Path) -> None:
    patch_member(workbook, "xl/worksheets/sheet1.xml", "<sheetData>", "<sheetData><row")
    with pytest.raises(UnreadableFile) as caught:
        read_path(str(workbook))
    assert caught.value.rule == "file.corrupt"


def test_declared_inflation_beyond_the_limit_is_refused_before_opening(workbook: Path) -> None:
    with pytest.raises(UnreadableFile) as caught:
        read_path(str(workbook), ReadLimits(max_uncompressed_bytes=1000))
    assert caught.value.rule == "file.zip-bomb"


def test_workbook_of_empty_sheets_is_empty(tmp_path: Path) -> None:
    Workbook().save(tmp_path / "e.xlsx")
    with pytest.raises(UnreadableFile) as caught:
        read_path(str(tmp_path / "e.xlsx"))
    assert caught.value.rule == "file.empty"


def test_workbook_named_csv_is_read_and_noted(workbook: Path, tmp_path: Path) -> None:
    renamed = tmp_path / "results.csv"
    renamed.write_bytes(workbook.read_bytes())
    tables = read_path(str(renamed))
    assert tables[0].format == "xlsx"
    assert "misnamed" in kinds(tables[0])


def test_csv_named_xlsx_is_read_as_text_and_noted() -> None:
    tables = read_path(write("results.xlsx", b"site_id,result\nVB-014,4.2\n"))
    assert cells(tables[0])[1] == ["VB-014", "4.2"]
    note = next(n for n in tables[0].notes if n.kind == "misnamed")
    assert re.search(r"\.xlsx", note.message)


def test_large_workbook_is_streamed_with_the_same_cells(workbook: Path) -> None:
    full = read_path(str(workbook))
    streamed = read_path(str(workbook), ReadLimits(full_workbook_bytes=0))
    assert [cells(t) for t in streamed] == [cells(t) for t in full]
    assert [t.row_numbers for t in streamed] == [t.row_numbers for t in full]
    assert "streamed-workbook" in kinds(streamed[0])
    assert "hidden-sheet" in kinds(streamed[1])
    assert streamed[0].merged_ranges == ()  # streaming mode cannot see them; the note says so


def test_hidden_columns_are_listed_in_sheet_order(tmp_path: Path) -> None:
    wb = Workbook()
    ws = wb.active
    assert ws is not None
    ws.append([f"c{i}" for i in range(30)])
    ws.append(list(range(30)))
    for letter in ("AB", "C"):
        ws.column_dimensions[letter].hidden = True
    wb.save(tmp_path / "wide.xlsx")
    note = next(n for n in read_path(str(tmp_path / "wide.xlsx"))[0].notes if n.kind == "hidden-columns")
    assert note.examples == ("C", "AB")


def test_archive_needing_an_unknown_zip_version_is_corrupt(workbook: Path) -> None:
    # Source: PKWARE APPNOTE 4.3.12: a central directory header (50 4B 01 02) holds "version
    # needed to extract" at offset 6. Regression: found by a mutation run, zipfile raised
    # NotImplementedError out of the reader.
    data = bytearray(workbook.read_bytes())
    at = data.index(b"PK\x01\x02")
    data[at + 6 : at + 8] = (240).to_bytes(2, "little")
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("v.xlsx", bytes(data)))
    assert caught.value.rule == "file.corrupt"


def test_highly_compressed_sheet_is_refused_with_default_limits(workbook: Path) -> None:
    # 8 MB of padding deflates about 1000:1, far past the 200:1 a real sheet reaches; the check
    # reads only the archive's declared sizes, so nothing is inflated.
    patch_member(workbook, "xl/worksheets/sheet1.xml", "<sheetData>", "<sheetData>" + " " * 8_000_000)
    assert workbook.stat().st_size < 200_000
    with pytest.raises(UnreadableFile) as caught:
        read_path(str(workbook))
    assert caught.value.rule == "file.zip-bomb"
