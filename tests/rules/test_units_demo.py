"""The units demo: each manifest run gives its exit code and exactly the units rules it promises."""

from __future__ import annotations

from pathlib import Path
from typing import Any

import pytest
from ruamel.yaml import YAML

from linter.check import check_paths
from linter.contract.load import load_contract

REPO = Path(__file__).resolve().parent.parent.parent
FOLDER = REPO / "sample_submissions" / "units"


def entries() -> list[tuple[str, dict[str, Any]]]:
    manifest = YAML(typ="safe", pure=True).load(FOLDER / "expected.yaml")
    return list(manifest["files"].items())


def test_manifest_lists_every_data_file() -> None:
    present = {p.relative_to(FOLDER).as_posix() for p in FOLDER.rglob("*.csv")}
    assert {name for name, _ in entries()} == present


@pytest.mark.parametrize(("name", "entry"), entries(), ids=[n for n, _ in entries()])
def test_demo_run_gives_the_promised_units_rules(name: str, entry: dict[str, Any]) -> None:
    contracts = [load_contract(str(p)) for p in sorted((REPO / "contracts").glob("*.yaml"))]
    paths = [str(FOLDER / name)] + [str(FOLDER / other) for other in entry["submitted_with"]]
    before = {p: Path(p).read_bytes() for p in paths}
    report = check_paths(paths, contracts)
    mine = [r for r in report.results if Path(r.file) == FOLDER / name]
    assert len(mine) == 1
    assert mine[0].contract == (
        load_contract(str(REPO / entry["contract"])).id if entry["contract"] else None
    )
    reported = {f.rule for f in report.all_findings() if Path(f.place.file) == FOLDER / name}
    assert (1 if report.failed else 0) == entry["exit"], sorted(reported)
    assert set(entry["must_report"]) <= reported
    assert {r for r in reported if r.startswith("units.")} == {
        r for r in entry["must_report"] if r.startswith("units.")
    }  # no contract-free false alarm in this family
    assert {p: Path(p).read_bytes() for p in paths} == before  # inputs untouched
