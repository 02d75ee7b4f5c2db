"""End to end: the demo contracts, invented Vell Basin files on disk, `weir check`, and its JSON report."""

from __future__ import annotations

import hashlib
import json
from importlib import resources
from pathlib import Path

import jsonschema
from typer.testing import CliRunner

from linter.check import check_paths
from linter.cli import app
from linter.contract.load import load_contract

SITES = """site_id,site_name,river,county,latitude,longitude,established_on,active
VB-014,Upper Vell weir,Vell,ALD,52.101,-2.301,2019-04-01,true
VB-015,Mill race footbridge,Vell,ALD,52.093,-2.288,2019-04-01,true
VB-021,Cold Brook confluence,Cold Brook,BRK,52.040,-2.250,2021-06-15,false
"""
CLEAN = """site_id,sampled_on,analyte,result,qualifier,lab_sample_id
VB-014,2026-03-02,NITRATE,1.42,,KL004811
VB-014,2026-03-02,PHOSPHATE,<0.05,,KL004812
VB-015,2026-03-02,NITRATE,0.98,J,KL004813
VB-021,2026-03-03,AMMONIUM,<0.02,,KL004814
"""
# Every line below the header breaks the contract in one planted way (line numbers as a text editor shows).
MESSY = """site_id,sampled_on,analyte,result,qualifier,lab_sample_id
VB-014,2026-03-02,NITRATE,"1,420",,KL004811
VB-014,03/02/2026,PHOSPHATE,0.2 mg/L,,KL004812
VB-015,2026-03-02,Nitrate ,12 ug/L,,KL004813
VB-099,2026-03-02,NITRATE,0.5,,KL004814
VB-014,2026-03-02,NITRATE,-3,,KL004815
VB-021,2026-03-03,AMMONIUM,,,KL004816
"""
CONTRACTS = ("stream-chemistry", "sites")


def write(folder: Path, name: str, text: str) -> Path:
    path = folder / name
    path.write_text(text, encoding="utf-8")
    return path


def contracts(repo: Path) -> list:  # type: ignore[type-arg]
    return [load_contract(str(repo / "contracts" / f"{name}.yaml")) for name in CONTRACTS]


def test_clean_files_are_accepted(tmp_path: Path, repo: Path) -> None:
    write(tmp_path, "sites.csv", SITES)
    write(tmp_path, "chemistry-2026-03.csv", CLEAN)
    report = check_paths(["."], contracts(repo))
    assert [f.rule for f in report.all_findings()] == []
    assert report.verdict == "accepted"


def test_every_planted_problem_is_found_once(tmp_path: Path, repo: Path) -> None:
    write(tmp_path, "sites.csv", SITES)
    write(tmp_path, "chemistry-2026-03.csv", MESSY)
    report = check_paths(["."], contracts(repo))
    found = {(f.rule, f.place.columns, f.place.rows) for f in report.all_findings()}
    assert found == {
        ("values.wrong-type", ("result",), (2, 3)),
        ("values.date-format", ("sampled_on",), (3,)),
        ("values.code-variant", ("analyte",), (4,)),
        ("values.wrong-unit", ("result",), (4,)),
        ("references.unknown", ("site_id",), (5,)),
        ("values.out-of-range", ("result",), (6,)),
        ("keys.duplicate", ("site_id", "sampled_on", "analyte"), (2, 6)),
        ("values.missing", ("result",), (7,)),
    }
    assert report.verdict == "returned"


def test_check_command_writes_a_valid_report_and_leaves_inputs_alone(tmp_path: Path, repo: Path) -> None:
    sites = write(tmp_path, "sites.csv", SITES)
    messy = write(tmp_path, "chemistry-2026-03.csv", MESSY)
    before = {p: hashlib.sha256(p.read_bytes()).hexdigest() for p in (sites, messy)}
    arguments = ["check", "sites.csv", "chemistry-2026-03.csv", "--report", "report.json"]
    for name in CONTRACTS:
        arguments += ["--contract", str(repo / "contracts" / f"{name}.yaml")]
    result = CliRunner().invoke(app, arguments)
    assert result.exit_code == 1, result.output
    assert "Traceback" not in result.output
    document = json.loads(Path("report.json").read_text("utf-8"))
    # Source: JSON Schema 2020-12, validated by the jsonschema library against the repo's report schema.
    schema = json.loads(resources.files("linter.report").joinpath("schema/report-v1.json").read_text("utf-8"))
    jsonschema.Draft202012Validator(schema, format_checker=jsonschema.FormatChecker()).validate(document)
    assert {p: hashlib.sha256(p.read_bytes()).hexdigest() for p in (sites, messy)} == before


def test_chemistry_alone_notes_that_sites_could_not_be_checked(tmp_path: Path, repo: Path) -> None:
    write(tmp_path, "chemistry-2026-03.csv", CLEAN)
    report = check_paths(["chemistry-2026-03.csv"], contracts(repo))
    assert [(f.rule, f.severity.value) for f in report.all_findings()] == [
        ("references.table-absent", "note")
    ]
    assert report.verdict == "accepted"


FIELD_SHEETS = """site_id,month,visited_on,water_temp_min_c,water_temp_max_c,ph,dissolved_oxygen,observer
VB-014,2026-01,2026-01-11,3.1,5.0,7.2,11.0,AH
VB-014,2026-02,2026-02-08,6.4,4.2,7.4,10.6,AH
VB-015,2026-01,2026-01-11,2.9,4.8,15.1,11.3,RT
VB-014,2026-03,2026-03-08,5.5,8.0,7.1,9.9,AH
VB-015,2026-03,2026-03-08,5.2,7.9,7.0,9.8,
"""


def test_field_sheet_comparison_grid_and_range(tmp_path: Path, repo: Path) -> None:
    write(tmp_path, "sites.csv", SITES)
    write(tmp_path, "field-sheets-2026-q1.csv", FIELD_SHEETS)
    loaded = [load_contract(str(repo / "contracts" / f"{n}.yaml")) for n in ("field-sheets", "sites")]
    report = check_paths(["."], loaded)
    found = {(f.rule, f.place.columns, f.place.rows, f.examples) for f in report.all_findings()}
    assert found == {
        (
            "rows.comparison",
            ("water_temp_min_c", "water_temp_max_c"),
            (3,),
            ("water_temp_min_c=6.4, water_temp_max_c=4.2",),
        ),
        ("values.out-of-range", ("ph",), (4,), ("15.1",)),
        ("values.missing", ("observer",), (6,), ("",)),
        ("keys.incomplete-grid", ("site_id", "month"), (), ("site_id=VB-015, month=2026-02",)),
    }
