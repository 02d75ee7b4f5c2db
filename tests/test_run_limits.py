"""Settings' [limits] reach every bound: reader, contract loader, folder walk and the per-file clock."""

from __future__ import annotations

import json
import os
import time
import zipfile
from pathlib import Path

import pytest
from openpyxl import Workbook
from typer.testing import CliRunner

from linter.cli import app
from linter.config import find_settings
from linter.deadline import TimedOut, time_limit
from linter.errors import WeirError
from linter.limits import DEFAULT, describe_defaults, parse_limits
from linter.read import read_path
from linter.read.limits import MAX_COLUMNS, ReadLimits

RUNNER = CliRunner()


def run(*args: str) -> tuple[int, str]:
    result = RUNNER.invoke(app, list(args))
    return result.exit_code, result.output


def rules_in(report: Path) -> set[str]:
    data = json.loads(report.read_text(encoding="utf-8"))
    found = {f["rule"] for r in data["tables"] for f in r["findings"]}
    return found | {f["rule"] for f in data["submission_findings"]}


def test_every_settings_key_changes_its_bound() -> None:
    keys = dict(describe_defaults())
    changed = parse_limits({key: 7 for key in keys})
    assert changed.read == ReadLimits(*(7 for _ in range(len(ReadLimits.__dataclass_fields__))))
    assert (changed.contract_bytes, changed.contract_nodes, changed.folder_depth) == (7, 7, 7)
    assert changed.seconds_per_file == 7
    assert parse_limits({}) == DEFAULT


def test_defaults_listed_for_the_readme() -> None:
    listed = dict(describe_defaults())
    # From memory of Excel's published specifications and limits: 16,384 columns per sheet.
    assert listed["max_columns"] == f"{MAX_COLUMNS:,}" == "16,384"
    assert listed["max_seconds_per_file"] == "300"


@pytest.mark.parametrize(
    ("table", "said"),
    [
        ({"max_colums": 5}, "did you mean 'max_columns'"),
        ({"max_rows": -1}, "'max_rows' must be a number >= 0"),
        ({"max_rows": 2.5}, "whole number"),
        ({"max_rows": True}, "must be a number"),
    ],
)
def test_bad_limits_are_one_line_errors(table: dict[str, object], said: str) -> None:
    with pytest.raises(WeirError, match=said):
        parse_limits(table)


def test_misspelt_limit_in_weir_toml_fails_the_command(tmp_path: Path) -> None:
    (tmp_path / "weir.toml").write_text("[limits]\nmax_row = 5\n", encoding="utf-8")
    (tmp_path / "a.csv").write_text("site_id\nVB-014\n", encoding="utf-8")
    code, out = run("check", "a.csv")
    assert code == 2 and "did you mean 'max_rows'" in out and "Traceback" not in out


def test_row_limit_from_settings_reaches_check(tmp_path: Path) -> None:
    (tmp_path / "weir.toml").write_text("[limits]\nmax_rows = 3\n", encoding="utf-8")
    rows = "".join(f"VB-{i:03d},{i}\n" for i in range(10))
    (tmp_path / "a.csv").write_text("site_id,result\n" + rows, encoding="utf-8")
    code, _ = run("check", "a.csv", "--report", "r.json")
    assert code == 1 and "file.too-many-rows" in rules_in(tmp_path / "r.json")
    (tmp_path / "weir.toml").write_text("[limits]\nmax_rows = 30\n", encoding="utf-8")
    run("check", "a.csv", "--report", "r.json")
    assert "file.too-many-rows" not in rules_in(tmp_path / "r.json")


def test_sheet_limit_is_read_from_the_archive(tmp_path: Path) -> None:
    book = Workbook()
    for i in range(4):
        book.create_sheet(f"site {i}")["A1"] = "VB-014"
    book.save(tmp_path / "many.xlsx")
    with zipfile.ZipFile(tmp_path / "many.xlsx") as archive:
        parts = [n for n in archive.namelist() if n.startswith("xl/worksheets/")]
    assert len(parts) == 5  # Source: ECMA-376 Part 1 §12.3.24, one worksheet part per sheet (openpyxl)
    from linter.read import UnreadableFile

    with pytest.raises(UnreadableFile) as caught:
        read_path(str(tmp_path / "many.xlsx"), ReadLimits(max_sheets=4))
    assert caught.value.rule == "file.too-many-sheets"
    assert len(read_path(str(tmp_path / "many.xlsx"), ReadLimits(max_sheets=5))) == 4  # one is empty


def test_contract_limits_from_settings(tmp_path: Path) -> None:
    contract = "contract: c\nversion: 1\nobservational_unit: one site\nkeys: [site_id]\n"
    contract += "variables:\n  site_id: {type: string}\n"
    (tmp_path / "c.yaml").write_text(contract, encoding="utf-8")
    (tmp_path / "a.csv").write_text("site_id\nVB-014\n", encoding="utf-8")
    assert run("check", "a.csv", "-c", "c.yaml")[0] == 0
    (tmp_path / "weir.toml").write_text("[limits]\nmax_contract_nodes = 5\n", encoding="utf-8")
    code, out = run("check", "a.csv", "-c", "c.yaml")
    assert code == 2 and "more than 5 YAML nodes" in out
    (tmp_path / "weir.toml").write_text("[limits]\nmax_contract_bytes = 20\n", encoding="utf-8")
    code, out = run("check", "a.csv", "-c", "c.yaml")
    assert code == 2 and "the limit is 20" in out


def test_folder_depth_is_reported_not_silently_skipped(tmp_path: Path) -> None:
    deep = tmp_path / "inbox" / "a" / "b" / "c"
    deep.mkdir(parents=True)
    (deep / "results.csv").write_text("site_id\nVB-014\n", encoding="utf-8")
    (tmp_path / "inbox" / "top.csv").write_text("site_id\nVB-015\n", encoding="utf-8")
    (tmp_path / "weir.toml").write_text("[limits]\nmax_folder_depth = 2\n", encoding="utf-8")
    code, _ = run("check", "inbox", "--report", "r.json")
    data = json.loads((tmp_path / "r.json").read_text(encoding="utf-8"))
    assert [Path(r["file"]).name for r in data["tables"]] == ["top.csv"]
    (deep_finding,) = data["submission_findings"]
    assert deep_finding["rule"] == "file.too-deep" and code == 1


def test_clock_stops_a_slow_block() -> None:
    start = time.monotonic()
    with pytest.raises(TimedOut), time_limit(0.2):
        while True:
            pass
    assert time.monotonic() - start < 2
    with time_limit(0):  # 0 means no limit
        time.sleep(0.01)


def test_timed_out_file_gets_a_finding_and_the_rest_are_checked(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    import linter.check as check

    real = check.read_path

    def slow_for_one(path: str, limits: ReadLimits) -> object:
        if path.endswith("slow.csv"):
            while True:
                time.sleep(0.01)
        return real(path, limits)

    monkeypatch.setattr(check, "read_path", slow_for_one)
    (tmp_path / "weir.toml").write_text("[limits]\nmax_seconds_per_file = 0.3\n", encoding="utf-8")
    for name in ("slow.csv", "fast.csv"):
        (tmp_path / name).write_text("site_id\nVB-014\n", encoding="utf-8")
    code, out = run("check", "slow.csv", "fast.csv", "--report", "r.json")
    data = json.loads((tmp_path / "r.json").read_text(encoding="utf-8"))
    verdicts = {Path(r["file"]).name: [f["rule"] for f in r["findings"]] for r in data["tables"]}
    assert verdicts["slow.csv"] == ["file.timed-out"] and "file.timed-out" not in verdicts["fast.csv"]
    assert code == 1 and "Traceback" not in out


def test_settings_are_found_with_their_limits(tmp_path: Path) -> None:
    (tmp_path / "weir.toml").write_text("[limits]\nmax_cell_chars = 10\n", encoding="utf-8")
    settings = find_settings(Path(os.getcwd()))
    assert settings is not None and settings.bounds.read.max_cell_chars == 10


def test_links_out_are_reported_when_maps_split_the_run(tmp_path: Path) -> None:
    contract = "contract: c\nversion: 1\nobservational_unit: one site\nkeys: [site_id]\n"
    contract += "variables:\n  site_id: {type: string}\n"
    (tmp_path / "c.yaml").write_text(contract, encoding="utf-8")
    (tmp_path / "weir.toml").write_text(
        'contracts = ["c.yaml"]\n[[map]]\nfiles = "inbox/*.csv"\ncontract = "c.yaml"\n', encoding="utf-8"
    )
    (tmp_path / "inbox").mkdir()
    (tmp_path / "inbox" / "a.csv").write_text("site_id\nVB-014\n", encoding="utf-8")
    (tmp_path / "secret.csv").write_text("site_id\nVB-999\n", encoding="utf-8")
    os.symlink(tmp_path / "secret.csv", tmp_path / "inbox" / "b.csv")
    code, _ = run("check", "inbox", "--report", "r.json")
    data = json.loads((tmp_path / "r.json").read_text(encoding="utf-8"))
    assert [Path(t["file"]).name for t in data["tables"]] == ["a.csv"]
    assert [f["rule"] for f in data["submission_findings"]] == ["file.outside-folder"] and code == 1
