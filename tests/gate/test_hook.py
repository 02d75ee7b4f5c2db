"""`weir-hook`: checks staged files without touching them, alone or split, bundles together."""

from __future__ import annotations

import hashlib
import json
import shutil
from pathlib import Path

import pytest

from linter.gate.hook import run

HEADER = "site_id,sampled_on,analyte,result,lab_sample_id\n"
GOOD = HEADER + "VB-014,2026-01-12,NITRATE,0.42,VL000123\n"
UNKNOWN_SITE = HEADER + "VB-099,2026-01-12,NITRATE,0.42,VL000123\n"
BAD = HEADER + "VB-014,2026-02-09,NITRATE,-3,VL000125\n"
SITES = (
    "site_id,site_name,river,county,latitude,longitude,established_on,active\n"
    "VB-014,Mill Weir,Vell,{county},52.1,-2.2,2019-04-01,true\n"
)
SETTINGS = """
contracts = ["contracts/stream-chemistry.yaml", "contracts/sites.yaml"]

[[bundle]]
name = "visits"
files = ["visits/*.csv"]
"""


@pytest.fixture()
def project(tmp_path: Path, repo: Path) -> Path:
    shutil.copytree(repo / "contracts", tmp_path / "contracts")
    (tmp_path / "weir.toml").write_text(SETTINGS)
    county = (tmp_path / "contracts/codes/counties.yaml").read_text().split("\n")
    code = next(line.split(":")[0].strip("- ") for line in county if line and not line.startswith("#"))
    (tmp_path / "visits").mkdir()
    (tmp_path / "visits/sites.csv").write_text(SITES.format(county=code))
    (tmp_path / "visits/chemistry-2026-01.csv").write_text(UNKNOWN_SITE)
    (tmp_path / "chemistry-good.csv").write_text(GOOD)
    (tmp_path / "chemistry-bad.csv").write_text(BAD)
    return tmp_path


def digests(folder: Path) -> dict[str, str]:
    return {
        str(p): hashlib.sha256(p.read_bytes()).hexdigest() for p in sorted(folder.rglob("*")) if p.is_file()
    }


def test_a_good_file_passes_and_a_bad_one_fails_with_its_findings(
    project: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    before = digests(project)
    assert run(["chemistry-good.csv"]) == 0
    assert run(["chemistry-bad.csv"]) == 1
    out = capsys.readouterr().out
    assert "values.out-of-range" in out and "chemistry-bad.csv" in out
    assert digests(project) == before  # nothing edited, and no report written unasked


def test_split_calls_give_the_verdicts_of_one_call(project: Path, capsys: pytest.CaptureFixture[str]) -> None:
    files = ["chemistry-good.csv", "chemistry-bad.csv", "visits/chemistry-2026-01.csv"]
    run([*files, "--report-dir", "whole"])
    whole = {p.name: json.loads(p.read_text())["verdict"] for p in Path("whole").iterdir()}
    for name in files:
        run([name, "--report-dir", "split"])
    split = {p.name: json.loads(p.read_text())["verdict"] for p in Path("split").iterdir()}
    assert whole == split
    assert whole == {
        "chemistry-good.csv.json": "accepted",
        "chemistry-bad.csv.json": "returned",
        "visits.json": "returned",
    }


def test_a_bundle_member_is_checked_with_the_rest_of_its_bundle(
    project: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    # Only the chemistry file is staged, but its sites table is in the same bundle on disk.
    assert run(["visits/chemistry-2026-01.csv", "--report-dir", "reports"]) == 1
    report = json.loads(Path("reports/visits.json").read_text())
    assert sorted(t["file"] for t in report["tables"]) == ["visits/chemistry-2026-01.csv", "visits/sites.csv"]
    rules = {f["rule"] for t in report["tables"] for f in t["findings"]}
    assert "references.unknown" in rules and "references.table-absent" not in rules
    # The same file outside a bundle cannot see the sites table.
    shutil.copy("visits/chemistry-2026-01.csv", "chemistry-alone.csv")
    run(["chemistry-alone.csv", "--report-dir", "alone"])
    alone = json.loads(Path("alone/chemistry-alone.csv.json").read_text())
    assert "references.table-absent" in {f["rule"] for f in alone["tables"][0]["findings"]}


def test_contract_files_are_validated_and_code_lists_left_alone(
    project: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    good = ["contracts/stream-chemistry.yaml", "contracts/sites.yaml", "contracts/codes/analytes.yaml"]
    assert run(["--contracts", *good]) == 0
    broken = Path("contracts/broken.yaml")
    broken.write_text("contract: broken\nversion: 1\ntitle: Broken\nkeys: [site_id]\nvariabels: {}\n")
    assert run(["--contracts", str(broken)]) == 1
    assert "contracts/broken.yaml" in capsys.readouterr().out


def test_bad_arguments_are_one_line_and_exit_2(project: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert run(["no-such.csv"]) == 2
    assert run(["chemistry-good.csv", "--contract", "contracts/none.yaml"]) == 2
    Path("weir.toml").write_text('contract = "x"\n')
    assert run(["chemistry-good.csv"]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 3 and all(line.startswith("weir-hook: ") for line in err)
    assert "did you mean 'contracts'?" in err[2]


def test_the_hook_manifest_is_valid_for_pre_commit(repo: Path) -> None:
    import subprocess
    import sys

    # Source: pre-commit's own manifest schema (`pre-commit validate-manifest`, from the package index)
    pre_commit = Path(sys.executable).with_name("pre-commit")
    done = subprocess.run(
        [str(pre_commit), "validate-manifest", str(repo / ".pre-commit-hooks.yaml")],
        capture_output=True,
        text=True,
        timeout=120,
    )
    assert done.returncode == 0, done.stdout + done.stderr
    broken = Path("broken-hooks.yaml")
    broken.write_text("- id: weir-check\n  entry: weir-hook\n")  # no name, no language
    assert (
        subprocess.run([str(pre_commit), "validate-manifest", str(broken)], capture_output=True).returncode
        != 0
    )
