"""The units demo submission: each file earns exactly the units rules its manifest lists."""

from __future__ import annotations

import shutil
from pathlib import Path

from ruamel.yaml import YAML

from linter.check import check_paths


def test_demo_submission_earns_the_listed_rules(repo: Path, tmp_path: Path) -> None:
    demo = tmp_path / "units"
    shutil.copytree(repo / "sample_submissions" / "units", demo)
    expected = YAML(typ="safe").load((demo / "expected.yaml").read_text(encoding="utf-8"))
    before = {p: p.read_bytes() for p in demo.rglob("*.csv")}
    report = check_paths(["units"], [])
    found: dict[str, set[str]] = {}
    for finding in report.all_findings():
        name = Path(finding.place.file).relative_to("units").as_posix()
        found.setdefault(name, set()).add(finding.rule)
    assert {r.file for r in report.results} == {f"units/{name}" for name in expected}
    for name, rules in expected.items():
        reported = found.get(name, set())
        assert set(rules) <= reported, name
        assert {r for r in reported if r.startswith("units.")} == set(rules), name  # no false alarm
    assert {p: p.read_bytes() for p in demo.rglob("*.csv")} == before  # inputs untouched
