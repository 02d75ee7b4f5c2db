"""`weir check` reports layout findings with their recipe step, with and without a contract."""

from __future__ import annotations

import json
from pathlib import Path

from typer.testing import CliRunner

from linter.check import check_paths
from linter.cli import app
from linter.contract.load import load_contract

WIDE = "site_id,2023,2024,2025\nVB-014,3,,4\nVB-015,1,0,2\n"
TIDY = (
    "site_id,sampled_on,ph,nitrate_mg_l,temp_c\n"
    "VB-014,2025-03-02,7.1,1.2,8.5\nVB-015,2025-03-02,6.8,0.9,8.1\n"
)


def test_check_json_report_carries_the_layout_step() -> None:
    Path("wide.csv").write_text(WIDE, encoding="utf-8")
    result = CliRunner().invoke(app, ["check", "wide.csv", "--report", "r.json"])
    assert result.exit_code == 1, result.output
    report = json.loads(Path("r.json").read_text(encoding="utf-8"))
    text = json.dumps(report)
    assert "layout.values-in-headers" in text and '"gather"' in text
    assert "layout.values-in-headers" in result.output


def test_tidy_file_draws_no_layout_finding_in_check() -> None:
    Path("tidy.csv").write_text(TIDY, encoding="utf-8")
    report = check_paths(["tidy.csv"], [])
    assert [f.rule for f in report.all_findings() if f.rule.startswith("layout.")] == []


def test_contract_code_list_turns_headers_into_a_finding() -> None:
    Path("taxa.yaml").write_text(
        "contract: taxa-counts\nversion: 1\ntitle: Kick-sample counts\n"
        "observational_unit: one taxon counted at one site\nkeys: [site_id, taxon]\n"
        "variables:\n  site_id: {type: string}\n"
        "  taxon: {type: category, values: [mayfly, stonefly, midge]}\n"
        "  individuals: {type: integer}\n",
        encoding="utf-8",
    )
    Path("taxa.csv").write_text("site_id,mayfly,stonefly\nVB-014,3,5\nVB-015,1,0\n", encoding="utf-8")
    with_contract = check_paths(["taxa.csv"], [load_contract("taxa.yaml")])
    steps = [f.step for f in with_contract.all_findings() if f.rule == "layout.values-in-headers"]
    assert steps and steps[0]["names_to"] == "taxon" and steps[0]["values_to"] == "individuals"
    without = check_paths(["taxa.csv"], [])
    assert not [f for f in without.all_findings() if f.rule == "layout.values-in-headers"]


def test_a_title_line_does_not_hide_months_in_the_header() -> None:
    Path("monthly.csv").write_text(
        "Nitrate by month,,,\nsite_id,Jan 2026,Feb 2026,Mar 2026\nVB-003,1.8,2.1,2.4\nVB-007,0.9,,1.2\n",
        encoding="utf-8",
    )
    findings = check_paths(["monthly.csv"], []).all_findings()
    months = [f for f in findings if f.rule == "layout.values-in-headers"]
    assert months and months[0].place.rows == (2,) and months[0].place.letters == ("B", "C", "D")
    assert {f.step["reason"] for f in findings if f.rule == "layout.totals-and-notes"} == {"title"}
    assert not [f for f in findings if f.rule == "layout.transposed"]
