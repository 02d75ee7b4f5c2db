"""The CSV template (header line and README), bundle workbooks, and the command's one-line refusals."""

from __future__ import annotations

import csv
from pathlib import Path

import pytest
from filling import FILLS, fill
from openpyxl import load_workbook
from template_files import REPO, make_template
from typer.testing import CliRunner

from linter.check import check_paths
from linter.cli import app
from linter.contract.load import load_contract

BUNDLE = r"""
contract: vell-annual
version: "2026.1"
title: The annual return of a Vell Basin volunteer group (invented)
tables:
  sites:
    observational_unit: one site
    keys: [site_id]
    variables:
      site_id: {type: string, pattern: '^VB-\d{3}$'}
      county: {type: category, values: {ALD: Aldermoor, BRK: Brackenfold}}
  samples:
    observational_unit: one sample
    keys: [sample_id]
    variables:
      sample_id: {type: string, pattern: '^S\d{4}$'}
      site_id: {type: string, references: sites.site_id}
      depth_m: {type: number, min: 0, max: 30}
"""


def test_csv_template_is_one_header_line_and_a_readme(tmp_path: Path) -> None:
    contract = REPO / "contracts" / "field-sheets.yaml"
    make_template(contract, tmp_path / "visits.csv")
    raw = (tmp_path / "visits.csv").read_bytes()
    # Source: RFC 4180 §2 rule 1 (records end with CRLF) and rule 3 (an optional header line).
    assert raw.endswith(b"\r\n") and raw.count(b"\r\n") == 1 and not raw.startswith(b"\xef\xbb\xbf")
    with (tmp_path / "visits.csv").open(newline="", encoding="utf-8") as handle:
        assert list(csv.reader(handle)) == [list(load_contract(str(contract)).tables[0].names)]
    readme = (tmp_path / "visits.README.txt").read_text(encoding="utf-8")
    assert "keep the header line" in readme and "water\\_temp\\_min\\_c" in readme


def test_a_filled_csv_template_passes(tmp_path: Path) -> None:
    contract = REPO / "contracts" / "sites.yaml"
    make_template(contract, tmp_path / "sites.csv", "--format", "csv")
    rows = [[str(v) for v in row] for row in FILLS["sites"]]
    with (tmp_path / "sites.csv").open("a", newline="", encoding="utf-8") as handle:
        csv.writer(handle, lineterminator="\r\n").writerows(rows)
    report = check_paths([str(tmp_path / "sites.csv")], [load_contract(str(contract))])
    assert [f for r in report.results for f in r.findings] == [] and report.results[0].rows == 2


def test_a_bundle_gets_one_sheet_per_table_and_a_filled_one_passes(tmp_path: Path) -> None:
    (tmp_path / "annual.yaml").write_text(BUNDLE, encoding="utf-8")
    template = make_template(tmp_path / "annual.yaml", tmp_path / "annual.xlsx")
    assert load_workbook(template).sheetnames == ["sites", "samples", "Instructions"]
    fill(template, tmp_path / "step.xlsx", "sites", [["VB-014", "ALD"], ["VB-027", "BRK"]])
    filled = fill(tmp_path / "step.xlsx", tmp_path / "returned.xlsx", "samples", [["S0001", "VB-014", 2.5]])
    report = check_paths([str(filled)], [load_contract(str(tmp_path / "annual.yaml"))])
    assert {(r.table, r.rows) for r in report.results} == {("sites", 2), ("samples", 1)}
    assert [f for r in report.results for f in r.findings] == []


def test_a_bundle_reference_is_checked_across_the_sheets(tmp_path: Path) -> None:
    (tmp_path / "annual.yaml").write_text(BUNDLE, encoding="utf-8")
    template = make_template(tmp_path / "annual.yaml", tmp_path / "annual.xlsx")
    fill(template, tmp_path / "step.xlsx", "sites", [["VB-014", "ALD"]])
    filled = fill(tmp_path / "step.xlsx", tmp_path / "returned.xlsx", "samples", [["S0001", "VB-099", 2.5]])
    report = check_paths([str(filled)], [load_contract(str(tmp_path / "annual.yaml"))])
    found = [(f.rule, f.place.sheet, f.place.rows) for r in report.results for f in r.findings]
    assert found == [("references.unknown", "samples", (4,))]


@pytest.mark.parametrize(
    ("arguments", "message"),
    [
        (["missing.yaml", "--out", "t.xlsx"], "no such contract file"),
        (["c.yaml", "--out", "t.ods"], "needs an .xlsx name"),
        (["c.yaml", "--out", "t.xlsx", "--format", "csv"], "needs a .csv name"),
        (["c.yaml", "--out", "c.yaml"], "would overwrite a contract file"),
        (["bad-name.yaml", "--out", "t.xlsx"], "cannot be a worksheet name"),
        (["same-name.yaml", "--out", "t.xlsx"], "differ only in letter case"),
    ],
)
def test_bad_template_requests_are_one_line_and_exit_2(
    tmp_path: Path, arguments: list[str], message: str
) -> None:
    (tmp_path / "c.yaml").write_text((REPO / "contracts" / "field-sheets.yaml").read_text(encoding="utf-8"))
    (tmp_path / "bad-name.yaml").write_text(
        "contract: x\nversion: 1\ntables:\n"
        "  'Instructions': {observational_unit: one thing, variables: {a: string}}\n",
        encoding="utf-8",
    )
    (tmp_path / "same-name.yaml").write_text(
        "contract: x\nversion: 1\ntables:\n  Sites: {observational_unit: one site, variables: {a: string}}\n"
        "  sites: {observational_unit: one site, variables: {a: string}}\n",
        encoding="utf-8",
    )
    result = CliRunner().invoke(app, ["template", *arguments])
    assert result.exit_code == 2, result.output
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and message in lines[0]
    assert not (tmp_path / "t.xlsx").exists()
