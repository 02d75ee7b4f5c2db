"""The raw worksheet XML of a template, read with the standard library rather than openpyxl.

Source: ECMA-376 Office Open XML, Part 1: §18.3.1.32/33 dataValidation(s), §18.3.1.66 pane
(ySplit, topLeftCell, state="frozen"), §18.2.19 sheet (state="hidden"); Part 2 (Open Packaging
Conventions) for the workbook's parts. Section numbers from memory.
"""

from __future__ import annotations

import zipfile
from pathlib import Path
from xml.etree import ElementTree

from template_files import REPO

from linter.contract.load import load_contract

MAIN = "{http://schemas.openxmlformats.org/spreadsheetml/2006/main}"
RELATIONSHIPS = "{http://schemas.openxmlformats.org/officeDocument/2006/relationships}"


def part(path: Path, name: str) -> ElementTree.Element:
    with zipfile.ZipFile(path) as archive:
        return ElementTree.fromstring(archive.read(name))


def sheet_part(path: Path, title: str) -> ElementTree.Element:
    """Follow workbook.xml -> its relationships to the part that holds the sheet named `title`."""
    workbook = part(path, "xl/workbook.xml")
    sheet = next(s for s in workbook.iter(f"{MAIN}sheet") if s.get("name") == title)
    rel_id = sheet.get(f"{RELATIONSHIPS}id")
    rels = part(path, "xl/_rels/workbook.xml.rels")
    target = next(r.get("Target") for r in rels if r.get("Id") == rel_id)
    assert target is not None
    return part(path, target.lstrip("/") if target.startswith("/xl/") else f"xl/{target}")


def test_the_stored_xml_holds_one_rule_per_column_and_a_frozen_header(templates: dict[str, Path]) -> None:
    table = load_contract(str(REPO / "contracts" / "sites.yaml")).tables[0]
    xml = sheet_part(templates["sites"], "sites")
    pane = xml.find(f"{MAIN}sheetViews/{MAIN}sheetView/{MAIN}pane")
    assert pane is not None and (pane.get("ySplit"), pane.get("topLeftCell"), pane.get("state")) == (
        "1",
        "A2",
        "frozen",
    )
    rules = xml.find(f"{MAIN}dataValidations")
    assert rules is not None and rules.get("count") == str(len(table.variables))
    by_column = {r.get("sqref", "")[0]: r for r in rules.findall(f"{MAIN}dataValidation")}
    assert by_column["D"].get("type") == "list"  # county, a code list
    assert by_column["D"].findtext(f"{MAIN}formula1") == '"ALD,BRK,CRS,DUN,ELV"'
    assert by_column["E"].get("type") == "decimal" and by_column["E"].get("operator") == "between"
    assert [by_column["E"].findtext(f"{MAIN}formula{i}") for i in (1, 2)] == ["51", "53"]
    assert by_column["A"].get("type") == "textLength" and by_column["A"].findtext(f"{MAIN}formula1") == "6"
    # A rule with no type attribute is type "none" by the schema's default: a prompt only.
    assert by_column["B"].get("type") is None and by_column["B"].get("prompt")


def test_the_lists_sheet_is_stored_hidden(tmp_path: Path) -> None:
    from template_files import make_template

    (tmp_path / "m.yaml").write_text(
        "\n".join(f"- METHOD-{i:03d}" for i in range(40)) + "\n", encoding="utf-8"
    )
    (tmp_path / "c.yaml").write_text(
        "contract: lab-methods\nversion: 1\nobservational_unit: one method\nkeys: [method]\n"
        "variables:\n  method: {type: category, codes: m.yaml}\n",
        encoding="utf-8",
    )
    made = make_template(tmp_path / "c.yaml", tmp_path / "t.xlsx")
    states = {s.get("name"): s.get("state") for s in part(made, "xl/workbook.xml").iter(f"{MAIN}sheet")}
    assert states["Lists"] == "hidden" and states["lab-methods"] in (None, "visible")
    rule = sheet_part(made, "lab-methods").find(f"{MAIN}dataValidations/{MAIN}dataValidation")
    assert rule is not None and rule.findtext(f"{MAIN}formula1") == "Lists!$A$2:$A$41"
