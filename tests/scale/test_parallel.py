"""Many files in worker processes: the same report as one process, in the same order."""

from __future__ import annotations

from scale_lab_data import csv_text, lab_rows
from typer.testing import CliRunner

from linter.check import check_paths
from linter.cli import app
from linter.contract.load import load_contract
from linter.scale.progress import BytesMeter


def small_folder(tmp_path, count: int):
    folder = tmp_path / "inbox"
    folder.mkdir()
    for number in range(count):
        broken = 7 if number % 3 == 0 else 0
        (folder / f"results-{number:03d}.csv").write_text(
            csv_text(lab_rows(40, seed=number, broken_every=broken)), encoding="utf-8"
        )
    (folder / "results-bad.csv").write_bytes(b"")  # unreadable: its finding must keep its place
    return folder


def comparable(report):
    return [(r.file, r.rows, r.findings) for r in report.results], report.findings


def test_workers_give_the_single_process_report(tmp_path, contract_file):
    folder = small_folder(tmp_path, 9)
    contracts = [load_contract(str(contract_file))]
    alone = check_paths([str(folder)], contracts)
    seen: list[str] = []

    class Recorder:
        def part(self, path: str, fraction: float) -> None:
            pass

        def done(self, path: str) -> None:
            seen.append(path)

    together = check_paths([str(folder)], contracts, jobs=2, progress=Recorder())
    assert comparable(together) == comparable(alone)
    assert any(r.findings for r in alone.results)  # the planted breaks were found at all
    assert sorted(seen) == sorted(str(p) for p in folder.iterdir())


def test_cli_jobs_option(tmp_path, contract_file):
    folder = small_folder(tmp_path, 3)
    outcome = CliRunner().invoke(app, ["check", str(folder), "-c", str(contract_file), "--jobs", "2"])
    assert outcome.exit_code == 1, outcome.output  # the planted breaks fail the check
    assert "Traceback" not in outcome.output


def test_meter_counts_each_file_once_and_waits_before_drawing():
    meter = BytesMeter({"a.csv": 100, "b.csv": 300}, bar=None, delay=3600)
    meter.part("a.csv", 0.5)
    meter.part("a.csv", 0.25)  # never goes backwards
    assert meter.total == 50
    meter.done("a.csv")
    meter.done("b.csv")
    meter.done("b.csv")
    assert meter.total == 400
