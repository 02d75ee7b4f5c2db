"""`weir gate` and `weir ledger` end to end, with the real pipeline and the demo contracts."""

from __future__ import annotations

import csv
import io
import json
import os
import shutil
import time
from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app

HEADER = "site_id,sampled_on,analyte,result,lab_sample_id\n"
GOOD = HEADER + "VB-014,2026-01-12,NITRATE,0.42,VL000123\nVB-015,2026-01-12,NITRATE,<0.05,VL000124\n"
BAD = HEADER + "VB-014,2026-02-09,nitrate,12 mg/L,VL000125\nVB-14,2026-02-09,NITRATE,,VL000126\n"
OLD = time.time() - 3600


def drop(inbox: Path, relative: str, data: bytes | str, age: int) -> None:
    path = inbox / relative
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_bytes(data.encode() if isinstance(data, str) else data)
    os.utime(path, (OLD + age, OLD + age))


def test_gate_then_ledger_with_the_demo_contract(tmp_path: Path, repo: Path) -> None:
    shutil.copytree(repo / "contracts", tmp_path / "contracts")
    (tmp_path / "weir.toml").write_text('contracts = ["contracts/stream-chemistry.yaml"]\n')
    inbox = tmp_path / "inbox"
    drop(inbox, "north-lab/chemistry-2026-01.csv", GOOD, 1)
    drop(inbox, "north-lab/chemistry-2026-02.csv", BAD, 2)
    drop(inbox, "east-county/chemistry-2026-01.xlsx", b"PK\x03\x04 damaged", 3)
    drop(inbox, "east-county/chemistry-jan.csv", GOOD, 4)
    drop(inbox, "east-county/site-photos.pdf", b"%PDF-1.7 not a table", 5)
    runner = CliRunner()

    result = runner.invoke(app, ["gate", "inbox"])
    assert result.exit_code == 0, result.output
    assert "accepted  north-lab/chemistry-2026-01.csv" in result.output
    accepted = json.loads(
        (inbox / "accepted/north-lab/000001-chemistry-2026-01.csv.report.json").read_text(encoding="utf-8")
    )
    assert accepted["verdict"] == "accepted"
    assert accepted["tables"][0]["contract"] == {
        "id": "stream-chemistry",
        "version": "2",
        "table": "stream-chemistry",
    }
    returned = json.loads(
        (inbox / "returned/north-lab/000002-chemistry-2026-02.csv.report.json").read_text(encoding="utf-8")
    )
    rules = {f["rule"] for f in returned["tables"][0]["findings"]}
    assert {"values.wrong-type", "values.code-variant", "values.missing"} <= rules
    damaged = (inbox / "returned/east-county/000003-chemistry-2026-01.xlsx.report.json").read_text()
    assert '"verdict": "returned"' in damaged
    assert (
        "gate.duplicate" in (inbox / "returned/east-county/000004-chemistry-jan.csv.report.json").read_text()
    )
    assert (
        "gate.no-contract" in (inbox / "returned/east-county/000005-site-photos.pdf.report.json").read_text()
    )
    # every original left the inbox, each into exactly one filed copy
    assert [p.name for p in inbox.glob("*/*") if p.parent.name not in {".weir", "accepted", "returned"}] == []
    assert len([p for p in inbox.rglob("0000*") if p.suffix in {".csv", ".xlsx", ".pdf"}]) == 5

    shown = runner.invoke(app, ["ledger", "inbox"], env={"COLUMNS": "200"})
    assert shown.exit_code == 0, shown.output
    assert "north-lab" in shown.output and "50%" in shown.output  # one accepted, one returned
    assert "stream-chemistry v2" in shown.output

    exported = runner.invoke(app, ["ledger", "inbox", "--csv"])
    # Source: Python's csv module (reference CSV reader) reads the export back, one record per submission
    rows = list(csv.DictReader(io.StringIO(exported.stdout)))
    assert [r["verdict"] for r in rows] == ["accepted", "returned", "returned", "duplicate", "returned"]
    assert rows[1]["errors"] != "0" and rows[0]["contract_version"] == "2"

    again = runner.invoke(app, ["gate", "inbox"])
    assert again.exit_code == 0 and again.output == ""


def test_gate_and_ledger_answer_bad_arguments_in_one_line(tmp_path: Path) -> None:
    runner = CliRunner()
    (tmp_path / "inbox").mkdir()
    for args, message in [
        (["gate", "nowhere"], "no such inbox folder"),
        (["gate", "inbox"], "no contract"),
        (["ledger", "inbox"], "no ledger in inbox"),
        (["gate", "inbox", "--contract", "missing.yaml"], "missing.yaml"),
    ]:
        result = runner.invoke(app, args)
        assert result.exit_code == 2, (args, result.output)
        assert message in result.stderr and "Traceback" not in result.output
        assert len(result.stderr.strip().splitlines()) == 1
    assert not (tmp_path / "inbox/.weir").exists()  # a failed start creates no ledger


def test_weir_check_follows_a_map_in_the_settings(tmp_path: Path, repo: Path) -> None:
    shutil.copytree(repo / "contracts", tmp_path / "contracts")
    settings = 'contracts = ["contracts/sites.yaml", "contracts/field-sheets.yaml"]\n'
    mapped = '\n[[map]]\nfiles = "volunteers/*.csv"\ncontract = "contracts/stream-chemistry.yaml"\n'
    drop(tmp_path, "volunteers/ridge-2026-01.csv", BAD, 0)  # a name no contract's applies_to matches
    drop(tmp_path, "sites-2026.csv", "site_id\n", 0)
    runner = CliRunner()
    for text, expected in [(settings, None), (settings + mapped, "stream-chemistry")]:
        (tmp_path / "weir.toml").write_text(text)
        result = runner.invoke(app, ["check", "volunteers", "sites-2026.csv", "--report", "out.json"])
        assert result.exit_code == 1, result.output
        tables = {t["file"]: t for t in json.loads((tmp_path / "out.json").read_text())["tables"]}
        chemistry = tables["volunteers/ridge-2026-01.csv"]
        assert (chemistry["contract"] or {}).get("id") == expected
        assert tables["sites-2026.csv"]["contract"]["id"] == "sites"


def test_gate_watch_files_what_arrives_later_and_stops_cleanly_on_interrupt(
    tmp_path: Path, repo: Path
) -> None:
    import signal
    import subprocess
    import sys

    shutil.copytree(repo / "contracts", tmp_path / "contracts")
    (tmp_path / "weir.toml").write_text(
        'contracts = ["contracts/stream-chemistry.yaml"]\n\n[inbox]\nsettle_seconds = 0\n'
    )
    (tmp_path / "inbox").mkdir()
    watcher = subprocess.Popen(
        [sys.executable, "-m", "linter", "gate", "inbox", "--watch", "--interval", "0.2"],
        cwd=tmp_path,
        stdout=subprocess.PIPE,
        stderr=subprocess.PIPE,
        text=True,
    )
    try:
        time.sleep(0.5)
        drop(tmp_path / "inbox", "north-lab/chemistry-2026-01.csv", GOOD, 0)
        filed = tmp_path / "inbox/accepted/north-lab/000001-chemistry-2026-01.csv"
        deadline = time.time() + 60
        while not filed.exists() and time.time() < deadline:
            time.sleep(0.2)
        assert filed.read_text() == GOOD
    finally:
        watcher.send_signal(signal.SIGINT)
        out, err = watcher.communicate(timeout=60)
    assert watcher.returncode == 0, err
    assert "accepted  north-lab/chemistry-2026-01.csv" in out and "Traceback" not in err


def test_a_bundle_is_checked_together_even_when_its_register_was_filed_first(
    tmp_path: Path, repo: Path
) -> None:
    shutil.copytree(repo / "contracts", tmp_path / "contracts")
    (tmp_path / "weir.toml").write_text(
        'contracts = ["contracts/stream-chemistry.yaml", "contracts/sites.yaml"]\n\n'
        '[[bundle]]\nname = "register-and-results"\nfiles = ["sites*.csv", "chemistry*.csv"]\n'
    )
    counties = (tmp_path / "contracts/codes/counties.yaml").read_text().splitlines()
    county = next(line.split(":")[0].strip("- ") for line in counties if line and not line.startswith("#"))
    sites = (
        "site_id,site_name,river,county,latitude,longitude,established_on,active\n"
        f"VB-014,Mill Weir,Vell,{county},52.1,-2.2,2019-04-01,true\n"
    )
    unknown_site = GOOD.replace("VB-015", "VB-099")
    inbox = tmp_path / "inbox"
    drop(inbox, "north-lab/sites.csv", sites, 1)
    drop(inbox, "north-lab/chemistry-2026-01.csv", unknown_site, 2)
    # east-county sends no register of its own: north-lab's is not lent to it
    drop(inbox, "east-county/chemistry-2026-01.csv", unknown_site.replace("VL000123", "VL000223"), 3)

    result = CliRunner().invoke(app, ["gate", "inbox"])
    assert result.exit_code == 0, result.output
    assert "accepted  north-lab/sites.csv" in result.output, result.output
    north = json.loads((inbox / "returned/north-lab/000002-chemistry-2026-01.csv.report.json").read_text())
    assert [t["file"] for t in north["tables"]] == ["inbox/north-lab/chemistry-2026-01.csv"]
    unknown = [f for f in north["tables"][0]["findings"] if f["rule"] == "references.unknown"]
    assert len(unknown) == 1 and "VB-099" in unknown[0]["examples"]
    east = json.loads((inbox / "accepted/east-county/000003-chemistry-2026-01.csv.report.json").read_text())
    assert "references.table-absent" in {f["rule"] for f in east["tables"][0]["findings"]}
    assert list((inbox / ".weir/scratch").iterdir()) == []  # the lent copy is gone again
