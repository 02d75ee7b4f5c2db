"""`weir check FOLDER` on the units demo: findings across files land in the JSON report's submission part."""

from __future__ import annotations

import json
import shutil
from pathlib import Path

import jsonschema
from typer.testing import CliRunner

from linter.cli import app


def test_check_folder_reports_units_across_files(repo: Path, tmp_path: Path) -> None:
    shutil.copytree(repo / "sample_submissions" / "units", tmp_path / "units")
    shutil.rmtree(tmp_path / "units" / "bundle")  # checked with its contract below
    result = CliRunner().invoke(app, ["check", "units", "--report", "report.json"])
    assert result.exit_code == 0, result.output  # units findings are warnings
    report = json.loads((tmp_path / "report.json").read_text(encoding="utf-8"))
    schema = json.loads(
        (repo / "linter" / "report" / "schema" / "report-v1.json").read_text(encoding="utf-8")
    )
    jsonschema.validate(report, schema)
    across = {f["rule"] for f in report["submission_findings"]}
    assert across == {"units.split-over-files", "units.unmatched-keys", "units.stacked-files"}
    assert "units.split-over-files" in result.output


def test_check_bundle_folder_with_its_contract(repo: Path, tmp_path: Path) -> None:
    shutil.copytree(repo / "sample_submissions" / "units" / "bundle", tmp_path / "bundle")
    contract = repo / "contracts" / "volunteer-bundle.yaml"
    result = CliRunner().invoke(app, ["check", "bundle", "--contract", str(contract), "--report", "r.json"])
    assert result.exit_code == 1, result.output
    report = json.loads((tmp_path / "r.json").read_text(encoding="utf-8"))
    tables = {Path(t["file"]).name: t for t in report["tables"]}
    assert tables["vb-bundle-samples.csv"]["contract"] == {
        "id": "volunteer-bundle",
        "version": "1",
        "table": "samples",
    }
    rules = [f["rule"] for f in tables["vb-bundle-samples.csv"]["findings"]]
    assert rules == ["references.unknown"]
    assert not report["submission_findings"]  # a declared bundle is not a unit split over files
