"""`weir draft` on each clean demo file: the file passes its own draft, and returned files fail it."""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

import jsonschema
import pytest
from ruamel.yaml import YAML
from typer.testing import CliRunner

from linter.cli import app
from linter.contract.load import load_contract

REPO = Path(__file__).resolve().parents[2]
CLEAN = REPO / "sample_submissions" / "clean"
RETURNED = REPO / "sample_submissions" / "returned"
CLEAN_FILES = sorted(p.name for p in CLEAN.iterdir() if p.suffix in (".csv", ".xlsx"))

KINDS = {
    "chemistry": "chemistry-2026-03-aurora-lab.csv",
    "sites": "sites-register-2026.csv",
    "field-sheets": "field-sheets-2026-q1-willowbank-volunteers.csv",
}
"""Which clean file each kind of returned file is checked against (its draft)."""
NOT_INFERABLE = {
    "values.wrong-unit": "the clean file's header names no unit for result, so the draft declares none",
    "references.unknown": "a draft of one file knows no other table to refer to",
    "references.table-absent": "a draft of one file knows no other table to refer to",
    "columns.order": "the draft never asks for column order; that is the data manager's choice",
}
"""Planted problems a draft of one clean file cannot know about, and why; every other one must be caught."""


def run(*args: str) -> Any:
    return CliRunner().invoke(app, list(args))


def manifest(folder: Path) -> dict[str, Any]:
    data: dict[str, Any] = YAML(typ="safe", pure=True).load(folder / "expected.yaml")
    return data["files"]


def kind_of(name: str) -> str:
    return next(k for k in KINDS if name.startswith(k))


@pytest.fixture(scope="module")
def drafts(tmp_path_factory: pytest.TempPathFactory) -> dict[str, Path]:
    """One drafted contract per clean demo file, made once for the module."""
    folder = tmp_path_factory.mktemp("drafts")
    made: dict[str, Path] = {}
    for name in CLEAN_FILES:
        out = folder / f"{Path(name).stem}.yaml"
        result = run("draft", str(CLEAN / name), "--out", str(out))
        assert result.exit_code == 0, result.output
        made[name] = out
    return made


@pytest.mark.parametrize("name", CLEAN_FILES)
def test_clean_file_passes_its_own_draft(name: str, drafts: dict[str, Path]) -> None:
    result = run("check", str(CLEAN / name), "-c", str(drafts[name]), "--report", "report.json")
    assert result.exit_code == 0, result.output
    report = json.loads(Path("report.json").read_text())
    assert report["verdict"] == "accepted"
    errors = [f for t in report["tables"] for f in t["findings"] if f["severity"] == "error"]
    assert errors == []


@pytest.mark.parametrize("name", CLEAN_FILES)
def test_draft_validates_against_the_contract_schema_and_loads(name: str, drafts: dict[str, Path]) -> None:
    # Source: JSON Schema draft 2020-12, validated by the jsonschema reference implementation.
    schema = json.loads((REPO / "contracts" / "weir-contract.schema.json").read_text())
    document = YAML(typ="safe", pure=True).load(drafts[name])
    jsonschema.Draft202012Validator(schema).validate(document)
    contract = load_contract(str(drafts[name]))
    assert contract.tables[0].variables


@pytest.mark.parametrize("name", sorted(manifest(RETURNED)))
def test_returned_file_fails_the_draft_for_its_planted_reasons(name: str, drafts: dict[str, Path]) -> None:
    entry = manifest(RETURNED)[name]
    contract = drafts[KINDS[kind_of(name)]]
    result = run("check", str(RETURNED / name), "-c", str(contract), "--report", "report.json")
    assert result.exit_code == 1, result.output
    found = {f["rule"] for t in json.loads(Path("report.json").read_text())["tables"] for f in t["findings"]}
    expected = set(entry["must_report"]) - set(NOT_INFERABLE)
    assert expected, "every returned file has a planted problem a draft can catch"
    assert expected <= found, f"missing {sorted(expected - found)}; found {sorted(found)}"


def test_two_files_of_one_kind_make_one_contract_with_the_key_the_demo_contract_declares() -> None:
    march, april = CLEAN / "chemistry-2026-03-aurora-lab.csv", CLEAN / "chemistry-2026-04-aurora-lab.xlsx"
    assert run("draft", str(march), str(april), "--out", "chem.yaml").exit_code == 0
    drafted = load_contract("chem.yaml").tables[0]
    hand_written = load_contract(str(REPO / "contracts" / "stream-chemistry.yaml")).tables[0]
    # Over two months the sample date is needed to tell rows apart, as the data manager wrote.
    assert drafted.keys == hand_written.keys
    assert drafted.applies_to == ("chemistry-*.csv", "chemistry-*.xlsx")
    result = drafted.variable("result")
    assert result is not None and result.censored_prefix == "<" and result.minimum == 0
    lab = drafted.variable("lab_sample_id")
    assert lab is not None and lab.pattern == hand_written.variable("lab_sample_id").pattern  # type: ignore[union-attr]
    for path in (march, april):
        assert run("check", str(path), "-c", "chem.yaml").exit_code == 0


def test_a_folder_is_drafted_from_every_file_in_it(tmp_path: Path) -> None:
    folder = tmp_path / "in"
    folder.mkdir()
    for name in ("field-sheets-2026-q1-willowbank-volunteers.csv",):
        (folder / name).write_bytes((CLEAN / name).read_bytes())
    (folder / "field-sheets-2026-q2-willowbank-volunteers.csv").write_text(
        "site_id,month,visited_on,water_temp_min_c,water_temp_max_c,ph,dissolved_oxygen,observer,notes\n"
        "VB-004,2026-04,2026-04-12,6.0,8.5,7.3,10.1,RT,\n"
    )
    result = run("draft", str(folder), "--out", "fs.yaml")
    assert result.exit_code == 0, result.output
    text = Path("fs.yaml").read_text()
    assert "from 10 rows of" in text
    assert run("check", str(folder), "-c", "fs.yaml").exit_code == 0
