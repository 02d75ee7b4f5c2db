"""Columns whose values a spreadsheet would reinterpret are text cells, and they survive the round trip."""

from __future__ import annotations

from pathlib import Path

from filling import fill
from openpyxl import load_workbook
from spreadsheet_rules import accepts, rule_at
from template_files import make_template

from linter.check import check_paths
from linter.contract.load import load_contract

CONTRACT = r"""
contract: gauge-log
version: 3
title: Vell Basin gauge log (invented test contract)
observational_unit: one gauge reading
keys: [gauge, read_at]
variables:
  gauge: {type: category, values: {"007": Lower mill, "010": Upper weir}}
  read_at: {type: datetime}
  logged_on: {type: date, date_format: "%d/%m/%Y"}
  stage_cm: {type: integer, min: 0}
"""


def test_codes_with_leading_zeros_custom_dates_and_datetimes_round_trip(tmp_path: Path) -> None:
    (tmp_path / "gauge.yaml").write_text(CONTRACT, encoding="utf-8")
    template = make_template(tmp_path / "gauge.yaml", tmp_path / "gauge.xlsx")
    workbook = load_workbook(template)
    ws = workbook["gauge-log"]
    # Source: ECMA-376 Part 1 §18.8.30 numFmt, built-in id 49 "@" = text (from memory): a text cell keeps
    # "007" as typed, a dd/mm/yyyy date as typed, and a date-time in ISO 8601 as typed.
    assert [ws.column_dimensions[c].number_format for c in "ABCD"] == ["@", "@", "@", "0"]
    gauge, logged = rule_at(workbook, "gauge-log", "A4"), rule_at(workbook, "gauge-log", "C4")
    assert gauge is not None and gauge.formula1 == '"007,010"' and accepts(gauge, "007", workbook)
    assert not accepts(gauge, "7", workbook)  # the number 7 is not the code 007
    assert logged is not None and logged.type is None and "%d/%m/%Y" in logged.prompt  # guidance only
    stage = rule_at(workbook, "gauge-log", "D4")
    assert stage is not None and (stage.type, stage.operator, stage.formula1) == (
        "whole",
        "greaterThanOrEqual",
        "0",
    )
    filled = fill(
        template,
        tmp_path / "filled.xlsx",
        "gauge-log",
        [["007", "2026-03-14T09:30:00", "14/03/2026", 42], ["010", "2026-03-14T10:00:00", "15/03/2026", 0]],
    )
    report = check_paths([str(filled)], [load_contract(str(tmp_path / "gauge.yaml"))])
    assert [f for r in report.results for f in r.findings] == [] and report.results[0].rows == 2


def test_examples_for_custom_formats_come_back_as_examples(tmp_path: Path) -> None:
    (tmp_path / "gauge.yaml").write_text(CONTRACT, encoding="utf-8")
    template = make_template(tmp_path / "gauge.yaml", tmp_path / "gauge.xlsx")
    ws = load_workbook(template)["gauge-log"]
    assert ws["C2"].value == "14/03/2026" and ws["A2"].value == "007"  # written in the agreed form, as text
    report = check_paths([str(template)], [load_contract(str(tmp_path / "gauge.yaml"))])
    assert [(r.sheet, r.rows) for r in report.results] == [("gauge-log", 0)]  # both examples recognised


def test_long_prompts_are_cut_to_what_a_spreadsheet_accepts() -> None:
    from linter.contract.model import Variable
    from linter.template.validation import cell_rule

    rule = cell_rule(Variable("remarks", description="The site was visited in fog. " * 20), False, None)
    # From memory of Excel's limits: an input message holds at most 255 characters.
    assert rule.kind == "none" and len(rule.prompt) == 255 and rule.prompt.endswith("…")


def test_a_huge_code_list_fits_the_instructions_and_comes_back_recognised(tmp_path: Path) -> None:
    codes = [f"TAXON-{i:05d}" for i in range(3000)]  # about 36 000 characters with separators
    (tmp_path / "taxa.csv").write_text(
        "code,label\n" + "".join(f"{c},Taxon {c}\n" for c in codes), encoding="utf-8"
    )
    (tmp_path / "c.yaml").write_text(
        "contract: taxa\nversion: 1\nobservational_unit: one taxon\nkeys: [taxon]\n"
        "variables:\n  taxon: {type: category, codes: taxa.csv}\n",
        encoding="utf-8",
    )
    template = make_template(tmp_path / "c.yaml", tmp_path / "t.xlsx")
    workbook = load_workbook(template)
    longest = max(len(str(c.value)) for row in workbook["Instructions"].iter_rows() for c in row if c.value)
    assert longest <= 32_767  # from memory of Excel's per-cell limit
    rule = rule_at(workbook, "taxa", "A4")
    assert (
        rule is not None
        and accepts(rule, "TAXON-02999", workbook)
        and not accepts(rule, "TAXON-03000", workbook)
    )
    report = check_paths([str(template)], [load_contract(str(tmp_path / "c.yaml"))])
    assert [(r.sheet, r.rows) for r in report.results] == [("taxa", 0)]  # help sheets and examples recognised
