"""Contract-free reading rules: small files in, the expected findings out, through the check pipeline."""

from __future__ import annotations

import re
from pathlib import Path

import pytest
from openpyxl import Workbook

import linter.rules.catalogue
from linter.check import check_paths
from linter.findings import Finding
from linter.rules.reading import NOTE_RULES
from linter.rules.registry import RULES

READ_PACKAGE = Path(linter.rules.catalogue.__file__).parent.parent / "read"
OURS = {r for r in RULES if r.split(".")[0] in {"file", "header", "sheet"}}


def findings_for(name: str, data: bytes) -> list[Finding]:
    Path(name).write_bytes(data)
    report = check_paths([name], [])
    return [f for f in report.all_findings() if f.rule in OURS]


CASES = [
    ("clean.csv", b"site_id,result\nVB-014,4.2\nVB-015,3.1\n", set()),
    ("empty.csv", b"", {"file.empty"}),
    ("header-only.csv", b"site_id,sampled_on,result\n", {"file.header-only"}),
    ("png.csv", b"\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR", {"file.not-a-table"}),
    ("pdf.csv", b"%PDF-1.7\n1 0 obj\n", {"file.not-a-table"}),
    ("ragged.csv", b"site_id,result\nVB-014,1,234\nVB-015,3\n", {"file.ragged-rows", "header.blank"}),
    ("blank.csv", b"site_id,,result\nVB-014,x,4.2\n", {"header.blank"}),
    ("dup.csv", b"site_id,result,Result \nVB-014,1,2\n", {"header.duplicate", "header.whitespace"}),
    ("pad.csv", b"site_id, result\nVB-014,1\n", {"header.whitespace"}),
    ("cp1252.csv", "site_id,note\nVB-014,Trübung\n".encode("cp1252"), {"file.encoding"}),
    ("bom.csv", b"\xef\xbb\xbfsite_id,result\nVB-014,1\n", {"file.byte-order-mark"}),
    ("nul.csv", b"site_id,result\nVB-014,1\x00\n", {"file.nul-bytes"}),
    ("cr.csv", b"site_id,result\rVB-014,1\r", {"file.line-endings"}),
    ("gaps.csv", b"site_id,result\nVB-014,1\n\nVB-015,2\n", {"file.blank-rows"}),
    ("quote.csv", b'site_id,result\nVB-014,"1\nVB-015,2\n', {"file.unclosed-quote"}),
    ("text.xlsx", b"site_id,result\nVB-014,1\n", {"file.misnamed"}),
    # A title row above the header is a layout question; the header rules stay quiet on it.
    ("title.csv", b"Vell Basin results ,,\nsite_id,result,unit\nVB-014,1,mg/L\n", set()),
]


@pytest.mark.parametrize(("name", "data", "expected"), CASES, ids=[c[0] for c in CASES])
def test_reading_rules(name: str, data: bytes, expected: set[str]) -> None:
    assert {f.rule for f in findings_for(name, data)} == expected


def test_ragged_rows_finding_names_rows_and_fix() -> None:
    (finding,) = [
        f for f in findings_for("r.csv", b"a,b\n1,2\n3\n4,5\n6,7,8\n") if f.rule == "file.ragged-rows"
    ]
    assert finding.place.rows == (3, 5)
    assert finding.count == 2
    assert finding.fix and finding.examples


def test_duplicate_and_blank_findings_carry_letters() -> None:
    found = findings_for("h.csv", b"site_id,result,,result\nVB-014,1,2,3\n")
    dup = next(f for f in found if f.rule == "header.duplicate")
    blank = next(f for f in found if f.rule == "header.blank")
    assert dup.place.letters == ("B", "D") and dup.place.columns == ("result", "result")
    assert blank.place.letters == ("C",)
    assert "C" in blank.message


def test_workbook_rules(tmp_path: Path) -> None:
    wb = Workbook()
    ws = wb.active
    assert ws is not None
    ws.title = "results"
    for row in (["site_id", "result", "lab_note"], ["VB-014", 1, "x"], [None, 2, "y"], ["VB-015", 3, "z"]):
        ws.append(row)
    ws.merge_cells("A2:A3")
    ws.row_dimensions[4].hidden = True
    ws.column_dimensions["C"].hidden = True
    old = wb.create_sheet("old")
    old.append(["site_id"])
    old.append(["VB-001"])
    old.sheet_state = "hidden"
    wb.create_sheet("Sheet3")
    wb.save("book.xlsx")
    found = [f for f in check_paths(["book.xlsx"], []).all_findings() if f.rule in OURS]
    by_rule = {(f.rule, f.place.sheet): f for f in found}
    assert set(by_rule) == {
        ("sheet.merged-cells", "results"),
        ("sheet.hidden-rows", "results"),
        ("sheet.hidden-columns", "results"),
        ("sheet.empty", "results"),
        ("sheet.hidden", "old"),
    }
    assert by_rule[("sheet.hidden-rows", "results")].place.rows == (4,)
    assert by_rule[("sheet.hidden-columns", "results")].place.letters == ("C",)
    assert by_rule[("sheet.hidden-columns", "results")].place.columns == ("lab_note",)
    assert by_rule[("sheet.merged-cells", "results")].examples == ("A2:A3",)


def test_every_note_kind_the_reader_writes_has_a_rule() -> None:
    source = "\n".join(p.read_text() for p in READ_PACKAGE.glob("*.py"))
    written = set(re.findall(r'ReadNote\(\s*"([a-z-]+)"', source))
    assert written, "no ReadNote kinds found in linter/read"
    assert written <= set(NOTE_RULES), written - set(NOTE_RULES)


def test_every_rule_the_reader_raises_is_declared() -> None:
    source = "\n".join(p.read_text() for p in READ_PACKAGE.glob("*.py"))
    raised = set(re.findall(r'"(file\.[a-z-]+)"', source))
    assert {"file.empty", "file.not-a-table", "file.line-too-long"} <= raised
    assert raised <= set(RULES), raised - set(RULES)
