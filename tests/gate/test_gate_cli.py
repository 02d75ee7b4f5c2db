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
