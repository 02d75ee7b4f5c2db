"""Every hostile or broken file in the adversarial corpus gets its promised verdict through the CLI.

No traceback, no unexpected exit code, and the file hashes the same afterwards. The corpus and
its verdicts live in `tests/reference/adversarial/` (files built by `make_corpus.py`).
"""

from __future__ import annotations

import hashlib
import json
from pathlib import Path
from typing import Any

import pytest
from typer.testing import CliRunner

from linter.cli import app

CORPUS = Path(__file__).resolve().parent / "adversarial"
FILES = CORPUS / "files"
MANIFEST = json.loads((CORPUS / "manifest.json").read_text(encoding="utf-8"))["cases"]
RUNNER = CliRunner()


def case_id(case: dict[str, Any]) -> str:
    extra = "+" + ",".join(case["limits"]) if "limits" in case else ""
    return f"{case['command']}:{case['file']}{extra}"


def digest(path: Path) -> str:
    return hashlib.sha256(path.read_bytes()).hexdigest()


def reported_rules(report: Path) -> dict[str, str]:
    data = json.loads(report.read_text(encoding="utf-8"))
    found = [f for t in data["tables"] for f in t["findings"]] + data["submission_findings"]
    return {f["rule"]: f["severity"] for f in found}


def test_corpus_is_big_and_every_file_has_a_verdict() -> None:
    named = {c["file"] for c in MANIFEST}
    on_disk = {p.name for p in FILES.iterdir()}
    assert on_disk == named  # no file without a verdict, no verdict without its file
    assert len(on_disk) >= 40


def test_the_generator_rebuilds_the_committed_bytes(tmp_path: Path) -> None:
    import importlib.util

    spec = importlib.util.spec_from_file_location("make_corpus", CORPUS / "make_corpus.py")
    assert spec is not None and spec.loader is not None
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    built = module.corpus()
    assert {name: hashlib.sha256(data).hexdigest() for name, data in built.items()} == {
        p.name: digest(p) for p in FILES.iterdir()
    }


@pytest.mark.parametrize("case", MANIFEST, ids=case_id)
def test_each_file_gets_its_verdict(case: dict[str, Any], tmp_path: Path) -> None:
    target = FILES / case["file"]
    if "limits" in case:
        lines = [f"{key} = {json.dumps(value)}" for key, value in case["limits"].items()]
        (tmp_path / "weir.toml").write_text("[limits]\n" + "\n".join(lines) + "\n", encoding="utf-8")
    before = {p.name: digest(p) for p in FILES.iterdir()}
    if case["command"] == "check":
        args = ["check", str(target), "--report", "report.json"]
        if "contract" in case:
            args += ["-c", str(FILES / case["contract"])]
    elif case["command"] == "contract":
        args = ["check", str(FILES / "ok.csv"), "-c", str(target)]
    else:
        args = ["tidy", "--out", "tidy-out", str(target)]
    result = RUNNER.invoke(app, args)
    output = result.output
    assert result.exception is None or isinstance(result.exception, SystemExit), repr(result.exception)
    assert "Traceback" not in output and "internal error" not in output
    assert result.exit_code == case["exit"], output[-800:]
    if case["exit"] == 2:
        (line,) = [ln for ln in output.splitlines() if ln.startswith("weir: ")]
        assert case["says"] in line
    if case["command"] == "check":
        rules = reported_rules(tmp_path / "report.json")
        assert "weir.inspector-failed" not in rules
        if case["rule"] is None:
            assert "error" not in rules.values(), rules
        else:
            assert case["rule"] in rules, rules
    assert {p.name: digest(p) for p in FILES.iterdir()} == before  # no input changed, none added
