"""A value the spreadsheet's own validation refuses is also refused by `weir check`, for each kind of rule.

The spreadsheet side is judged by `spreadsheet_rules.accepts`, which reads the dataValidation objects
back from the saved workbook with openpyxl and applies ECMA-376 semantics (Part 1 §18.3.1.32).
"""

from __future__ import annotations

from datetime import date
from pathlib import Path

import pytest
from filling import FILLS, fill, plant
from openpyxl import load_workbook
from spreadsheet_rules import accepts, rule_at
from template_files import make_template

from linter.check import check_paths
from linter.contract.load import load_contract
from linter.findings import Severity

CONTRACT = r"""
contract: depth-profiles
version: 1
title: Vell Basin depth profiles (invented test contract)
observational_unit: one reading at one depth on one visit
keys: [station, measured_on, depth_m]
variables:
  station: {type: string, pattern: '^VB-\d{3}$'}
  measured_on: {type: date, min: 2020-01-01, max: 2030-12-31}
  depth_m: {type: number, min: 0, max: 30, unit: m}
  visits: {type: integer, min: 0, max: 31}
  method: {type: category, codes: methods.yaml}
  flag: {type: category, values: [J, B]}
  checked: {type: boolean}
missing: [""]
"""
METHODS = [f"METHOD-{i:03d}" for i in range(40)]  # too long for an inline list: kept on the Lists sheet
VALID = ["VB-100", date(2026, 5, 5), 12.5, 3, "METHOD-001", "J", "true"]
KIND_OF_COLUMN = {
    "A": "textLength",
    "B": "date",
    "C": "decimal",
    "D": "whole",
    "E": "list",
    "F": "list",
    "G": "list",
}
PLANTED: dict[str, list[object]] = {
    "A": ["VB-0141", "VB-01", "VB-014 ", "AB-123", "VB-099", ""],
    "B": [
        date(2019, 12, 31),
        date(2031, 1, 1),
        "2026-13-01",
        "14/03/2026",
        "soon",
        date(2020, 1, 1),
        date(2030, 12, 31),
    ],
    "C": [30.5, -0.1, "deep", "12 m", "1,5", 12.25, 0, 30],
    "D": [32, -1, 2.5, "ten", 0, 31],
    "E": ["METHOD-040", "method-001", "METHOD-039", "NA"],
    "F": ["X", "j", "B"],
    "G": ["maybe", "yes", "TRUE", "false"],
}
# Known one-way differences, where Weir is stricter than any spreadsheet rule can be:
# a pattern is more than a length, and (from memory of Excel's behaviour) list rules ignore letter case.
STRICTER_IN_WEIR = {("A", "AB-123"), ("E", "method-001"), ("F", "j")}


@pytest.fixture(scope="module")
def verdicts(tmp_path_factory: pytest.TempPathFactory) -> list[tuple[str, object, bool, bool]]:
    """(column, planted value, spreadsheet accepts, Weir accepts) for every planted value, one row each."""
    folder = tmp_path_factory.mktemp("agreement")
    (folder / "methods.yaml").write_text("\n".join(f"- {m}" for m in METHODS) + "\n", encoding="utf-8")
    (folder / "depth.yaml").write_text(CONTRACT, encoding="utf-8")
    template = make_template(folder / "depth.yaml", folder / "depth-template.xlsx")
    workbook = load_workbook(template)
    ws = workbook["depth-profiles"]
    planted: list[tuple[str, object, int]] = []
    row = 4  # below the header and the two example rows
    for letter, values in PLANTED.items():
        for value in values:
            for c, base in enumerate(VALID, start=1):
                ws.cell(row=row, column=c, value=base)
            ws.cell(row=row, column=1, value=f"VB-{100 + row}")  # distinct keys: no duplicate findings
            ws[f"{letter}{row}"] = value if value != "" else None
            planted.append((letter, value, row))
            row += 1
    filled = folder / "depth-filled.xlsx"
    workbook.save(filled)
    report = check_paths([str(filled)], [load_contract(str(folder / "depth.yaml"))])
    refused = {
        (r, letter)
        for result in report.results
        for f in result.findings
        if f.severity is Severity.ERROR
        for r in f.place.rows
        for letter in f.place.letters
    }
    back = load_workbook(filled)  # the rules as saved, not as Weir meant them
    out = []
    for letter, value, r in planted:
        rule = rule_at(back, "depth-profiles", f"{letter}{r}")
        assert rule is not None and rule.type == KIND_OF_COLUMN[letter]
        out.append(
            (letter, value, accepts(rule, None if value == "" else value, back), (r, letter) not in refused)
        )
    return out


def test_whatever_the_spreadsheet_refuses_weir_refuses(
    verdicts: list[tuple[str, object, bool, bool]],
) -> None:
    disagreements = [(c, v) for c, v, sheet_ok, weir_ok in verdicts if not sheet_ok and weir_ok]
    assert disagreements == []


def test_every_kind_of_rule_is_exercised_both_ways(verdicts: list[tuple[str, object, bool, bool]]) -> None:
    for letter in PLANTED:
        outcomes = {sheet_ok for c, _v, sheet_ok, _w in verdicts if c == letter}
        assert outcomes == {True, False}, letter  # each rule both refuses and accepts something


def test_weir_is_stricter_only_where_a_spreadsheet_rule_cannot_say_more(
    verdicts: list[tuple[str, object, bool, bool]],
) -> None:
    stricter = {(c, v) for c, v, sheet_ok, weir_ok in verdicts if sheet_ok and not weir_ok}
    assert stricter == STRICTER_IN_WEIR


def test_ranges_and_dates_agree_exactly(verdicts: list[tuple[str, object, bool, bool]]) -> None:
    for column, value, sheet_ok, weir_ok in verdicts:
        if KIND_OF_COLUMN[column] in ("date", "decimal", "whole"):
            assert sheet_ok == weir_ok, (column, value)


def test_a_missing_value_code_is_the_one_deliberate_difference(
    templates: dict[str, Path], demo_contracts: list[Path], tmp_path: Path
) -> None:
    """`NA`, a missing-value code of the field sheets: Weir accepts it, the template wants an empty cell."""
    workbook = load_workbook(templates["field-sheets"])
    rule = rule_at(workbook, "field-sheets", "F4")  # ph, nullable, 0-14
    assert rule is not None and rule.type == "decimal"
    assert not accepts(rule, "NA", workbook) and accepts(rule, None, workbook)
    assert "Leave the cell empty when the value is missing" in rule.error
    instructions = " ".join(
        str(c.value) for row in workbook["Instructions"].iter_rows() for c in row if c.value
    )
    assert "Leave a cell empty when a value is missing" in instructions
    sites = fill(templates["sites"], tmp_path / "sites.xlsx", "sites", FILLS["sites"])
    visits = fill(templates["field-sheets"], tmp_path / "visits.xlsx", "field-sheets", FILLS["field-sheets"])
    planted = plant(visits, tmp_path / "visits-na.xlsx", "field-sheets", "F4", "NA")
    report = check_paths([str(sites), str(planted)], [load_contract(str(c)) for c in demo_contracts])
    assert [f for r in report.results for f in r.findings] == []  # Weir reads NA as missing
