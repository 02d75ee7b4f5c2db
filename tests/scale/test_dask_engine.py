"""`--engine dask` on a LocalCluster with two workers gives the single-machine engine's findings."""

from __future__ import annotations

import pytest
from scale_lab_data import bad_sites_first, csv_text, lab_rows

pytest.importorskip("distributed")

from distributed import Client, LocalCluster
from typer.testing import CliRunner

from linter.check import check_paths
from linter.cli import app
from linter.contract.load import load_contract
from linter.scale import dask_engine
from linter.scale.dask_engine import screen_with_dask


@pytest.fixture(scope="module")
def two_workers():
    # Threads, not processes: the same scheduler, shuffle and task graph, without process start-up.
    with (
        LocalCluster(n_workers=2, threads_per_worker=1, processes=False, dashboard_address=None) as local,
        Client(local) as client,
    ):
        yield client


def test_dask_engine_finds_what_the_single_machine_engine_finds(
    tmp_path, contract_file, monkeypatch, two_workers
):
    path = tmp_path / "results-2026-05.csv"
    path.write_text(csv_text(lab_rows(900, seed=5, broken_every=11)), encoding="utf-8")
    contract = load_contract(str(contract_file)).tables[0]
    monkeypatch.setattr(dask_engine, "BLOCK_BYTES", 6000)  # about eight partitions
    screened = screen_with_dask(str(path), contract, sample_rows=3)
    assert screened is not None and screened.rows == 900
    assert len(screened.judged_rows) < 200  # the cluster really sent back only a subset
    contracts = [load_contract(str(contract_file))]
    single = check_paths([str(path)], contracts)
    monkeypatch.setattr("linter.scale.fast_path.SAMPLE_ROWS", 3)
    distributed = check_paths([str(path)], contracts, engine="dask")
    expected = [f for r in single.results for f in r.findings if f.rule.startswith(("values.", "keys."))]
    assert any(f.rule == "keys.duplicate" for f in expected)  # keys shared across partitions
    found = [f for r in distributed.results for f in r.findings if f.rule.startswith(("values.", "keys."))]
    assert found == expected
    assert [r.rows for r in distributed.results] == [900]


def test_dask_engine_quotes_the_first_good_value_of_a_pattern_from_a_later_partition(
    tmp_path, contract_file, monkeypatch, two_workers
):
    rows = bad_sites_first(400, 200, seed=4)
    path = tmp_path / "results-2026-07.csv"
    path.write_text(csv_text(rows), encoding="utf-8")
    contracts = [load_contract(str(contract_file))]
    single = check_paths([str(path)], contracts)
    monkeypatch.setattr(dask_engine, "BLOCK_BYTES", 6000)  # the first good site id is partitions away
    monkeypatch.setattr("linter.scale.fast_path.SAMPLE_ROWS", 3)
    distributed = check_paths([str(path)], contracts, engine="dask")
    [expected] = [f for r in single.results for f in r.findings if f.rule == "values.pattern-mismatch"]
    assert f"like {rows[200][1]!r}" in expected.fix
    assert [f for r in distributed.results for f in r.findings if f.rule == expected.rule] == [expected]


def test_cli_engine_dask_refuses_an_unreachable_scheduler_in_one_line(tmp_path, contract_file):
    path = tmp_path / "results-2026-06.csv"
    path.write_text(csv_text(lab_rows(20, seed=1)), encoding="utf-8")
    outcome = CliRunner().invoke(
        app,
        [
            "check",
            str(path),
            "-c",
            str(contract_file),
            "--engine",
            "dask",
            "--scheduler",
            "tcp://127.0.0.1:9",
        ],
    )
    assert outcome.exit_code == 2
    assert "Traceback" not in outcome.output and "Dask scheduler" in outcome.output
