"""`weir tidy`: writes the tidy CSV, recipe and audit, never touches the input, exits 2 on bad arguments."""

from __future__ import annotations

import json
from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app

MESSY = "site_id,2023,2024,2025\nVB-014,3,,4\nVB-015,1,0,2\nTotal,4,0,6\n"


def run(*args: str) -> tuple[int, str]:
    result = CliRunner().invoke(app, ["tidy", *args])
    return result.exit_code, result.output


def test_tidy_writes_csv_recipe_audit_and_report() -> None:
    Path("counts.csv").write_text(MESSY, encoding="utf-8")
    code, output = run("counts.csv", "--out", "tidy")
    assert code == 0, output
    assert Path("counts.csv").read_text(encoding="utf-8") == MESSY
    lines = Path("tidy/counts.csv").read_text(encoding="utf-8").splitlines()
    assert lines[0] == "site_id,year,count"
    assert "VB-014,2024," in lines and len(lines) == 7
    recipe = json.loads(Path("tidy/recipe.json").read_text(encoding="utf-8"))
    assert recipe["weir_recipe"] == 1
    assert [s["step"] for s in recipe["steps"]] == ["drop_rows", "gather"]
    audit = json.loads(Path("tidy/audit.json").read_text(encoding="utf-8"))
    assert audit["lossless"] is True
    assert audit["counts"]["dropped_total"] == 4
    report = json.loads(Path("tidy/tidy-report.json").read_text(encoding="utf-8"))
    assert report["chosen"]["steps"] == recipe["steps"] and "runners_up" in report


def test_saved_recipe_reruns_and_drop_empty_drops_empty_cells() -> None:
    Path("counts.csv").write_text(MESSY, encoding="utf-8")
    assert run("counts.csv", "--out", "first")[0] == 0
    next_month = MESSY.replace("VB-015,1", "VB-015,9").replace("Total,4", "Total,12")
    Path("next.csv").write_text(next_month, encoding="utf-8")
    code, output = run("next.csv", "--out", "second", "--recipe", "first/recipe.json", "--drop-empty")
    assert code == 0, output
    lines = Path("second/next.csv").read_text(encoding="utf-8").splitlines()
    assert "VB-015,2023,9" in lines and len(lines) == 6


def test_saved_recipe_that_would_lose_a_value_writes_nothing() -> None:
    # The total row no longer adds up, so dropping it as a total would lose the only record of 4.
    Path("counts.csv").write_text(MESSY, encoding="utf-8")
    assert run("counts.csv", "--out", "first")[0] == 0
    Path("next.csv").write_text(MESSY.replace("VB-015,1", "VB-015,9"), encoding="utf-8")
    code, output = run("next.csv", "--out", "second", "--recipe", "first/recipe.json")
    assert code == 2 and "would lose 1 cell(s)" in output and "A4" not in output
    assert not Path("second/next.csv").exists()


def test_tidy_table_is_written_unchanged() -> None:
    text = "site_id,sampled_on,ph\r\nVB-014,2025-03-02,7.1\r\nVB-015,2025-03-02,6.8\r\n"
    Path("clean.csv").write_bytes(text.encode("utf-8"))
    assert run("clean.csv", "--out", "out")[0] == 0
    assert Path("out/clean.csv").read_bytes() == text.encode("utf-8")
    assert json.loads(Path("out/recipe.json").read_text(encoding="utf-8"))["steps"] == []


def test_bad_arguments_exit_2_with_one_line() -> None:
    Path("counts.csv").write_text(MESSY, encoding="utf-8")
    Path("a-file").write_text("x", encoding="utf-8")
    Path("broken.json").write_text("{not json", encoding="utf-8")
    for args in (
        ("missing.csv", "--out", "o"),
        ("counts.csv", "--out", "a-file"),
        ("counts.csv", "--out", "o", "--recipe", "missing.json"),
        ("counts.csv", "--out", "o", "--recipe", "broken.json"),
        ("counts.csv", "--out", "o", "--contract", "missing.yaml"),
    ):
        code, output = run(*args)
        assert code == 2, args
        assert output.strip().count("\n") == 0 and output.startswith("weir: "), output
        assert "Traceback" not in output


def test_output_never_overwrites_the_input() -> None:
    Path("counts.csv").write_text(MESSY, encoding="utf-8")
    code, output = run("counts.csv", "--out", ".")
    assert code == 2 and "overwrite" in output
    assert Path("counts.csv").read_text(encoding="utf-8") == MESSY


def test_contract_guides_the_names(repo: Path) -> None:
    Path("c.yaml").write_text(
        "contract: exceedances\nversion: 1\ntitle: Exceedances per site and year\n"
        "observational_unit: one site in one year\nkeys: [site_id, year]\n"
        "variables:\n  site_id: {type: string}\n  year: {type: integer}\n  exceedances: {type: integer}\n",
        encoding="utf-8",
    )
    Path("counts.csv").write_text("Site ID,2023,2024\nVB-014,3,4\nVB-015,1,0\n", encoding="utf-8")
    code, output = run("counts.csv", "--out", "o", "--contract", "c.yaml")
    assert code == 0, output
    assert Path("o/counts.csv").read_text(encoding="utf-8").splitlines()[0] == "site_id,year,exceedances"
