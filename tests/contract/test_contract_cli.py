"""A broken contract through `weir check`: one line `path:line:col: message` on stderr and exit 2."""

from __future__ import annotations

from pathlib import Path

import pytest
from typer.testing import CliRunner

from linter.cli import app

GOOD = """\
contract: field-sheets
version: 1
observational_unit: one visit to one site in one month
keys: [site_id, month]
variables:
  site_id: {type: string, pattern: '^VB-\\d{3}$'}
  month: string
  water_temp_min_c: number
  water_temp_max_c: number
rules: ["water_temp_min_c <= water_temp_max_c"]
"""

CASES = {
    "misspelt key": (
        GOOD.replace("observational_unit", "obervational_unit"),
        "broken.yaml:3:1: ",
        "did you mean 'observational_unit'?",
    ),
    "bad rule": (
        GOOD.replace("<= water_temp_max_c", "<= water_temp_max_c()"),
        "broken.yaml:10:46: ",
        "unexpected character '('",
    ),
    "missing code list": (
        GOOD.replace("month: string", "month: {type: category, codes: months.yaml}"),
        "broken.yaml:7:34: ",
        "code-list file 'months.yaml' not found",
    ),
    "broken YAML": (
        GOOD.replace("keys: [site_id, month]", "keys: [site_id, month"),
        "broken.yaml:5:",
        "broken YAML",
    ),
    "empty contract": ("", "broken.yaml:1:1: ", "empty"),
}


@pytest.mark.parametrize("case", sorted(CASES))
def test_broken_contract_exits_2_with_one_line(tmp_path: Path, case: str) -> None:
    text, where, words = CASES[case]
    (tmp_path / "broken.yaml").write_text(text, encoding="utf-8")
    submitted = tmp_path / "field-sheets-2026-03.csv"
    submitted.write_text("site_id,month\nVB-014,2026-03\n", encoding="utf-8")
    before = submitted.read_bytes()
    result = CliRunner().invoke(app, ["check", submitted.name, "--contract", "broken.yaml"])
    assert result.exit_code == 2, result.output
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith(f"weir: {where}"), result.stderr
    assert words in lines[0]
    assert "Traceback" not in result.output + result.stderr
    assert submitted.read_bytes() == before  # the submission is never touched


def test_cli_positions_match_the_text(tmp_path: Path) -> None:
    # the columns above were counted by hand; this re-derives them from the text so a typo shows up
    bad_rule = CASES["bad rule"][0].splitlines()[9]
    assert bad_rule.index("(") + 1 == 46
    code_line = CASES["missing code list"][0].splitlines()[6]
    assert code_line.index("months.yaml") + 1 == 34
