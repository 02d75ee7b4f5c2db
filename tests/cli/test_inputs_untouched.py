"""No command modifies a submitted file, a contract or a recipe; the gate moves files but never loses one.

Every input is hashed before and after each command. Inputs carry odd names (spaces,
non-ASCII letters, a leading dash), which every command must accept.
"""

from __future__ import annotations

import hashlib
import shutil
from collections import Counter
from pathlib import Path

import pytest
from typer.testing import CliRunner

from linter.cli import app
from linter.gate.hook import run as hook_run

ADVERSARIAL = Path(__file__).resolve().parent.parent / "reference" / "adversarial" / "files"
RUNNER = CliRunner()
CONTRACT = (
    "contract: stream-chemistry\nversion: 1\nobservational_unit: one sample at one site\n"
    "keys: [site_id, sampled_on]\nvariables:\n  site_id: {type: string, pattern: '^VB-\\d{3}$'}\n"
    "  sampled_on: {type: date}\n  result: {type: number, min: 0}\n"
)
# Common practice (no source): names with spaces, non-ASCII letters and a leading dash.
ODD_NAMES = ("-chemistry März.csv", "Trübung Ødegård.xlsx", "wide results.csv", "zip bomb.xlsx")


def hashes(folder: Path) -> dict[str, str]:
    return {
        p.relative_to(folder).as_posix(): hashlib.sha256(p.read_bytes()).hexdigest()
        for p in sorted(folder.rglob("*"))
        if p.is_file()
    }


@pytest.fixture()
def submitted(tmp_path: Path) -> Path:
    """A folder of inputs: good, bad and hostile files under odd names, a contract and a recipe."""
    inputs = tmp_path / "inputs"
    inputs.mkdir()
    (inputs / ODD_NAMES[0]).write_text(
        "site_id,sampled_on,result\nVB-014,2026-03-02,4.2\nVB-15,2026-03-02,-1\n", encoding="utf-8"
    )
    shutil.copy(ADVERSARIAL / "hidden-and-merged.xlsx", inputs / ODD_NAMES[1])
    (inputs / ODD_NAMES[2]).write_text(
        "site_id,2026-01,2026-02,2026-03\nVB-014,4.2,4.0,3.9\nVB-015,1.1,1.2,1.0\n", encoding="utf-8"
    )
    shutil.copy(ADVERSARIAL / "zip-bomb.xlsx", inputs / ODD_NAMES[3])
    (inputs / "contract ü.yaml").write_text(CONTRACT, encoding="utf-8")
    return inputs


def invoke(*args: str) -> int:
    result = RUNNER.invoke(app, list(args))
    assert result.exception is None or isinstance(result.exception, SystemExit), repr(result.exception)
    assert "Traceback" not in result.output and "internal error" not in result.output, result.output
    return result.exit_code


def test_check_with_every_output_leaves_inputs_alone(submitted: Path, tmp_path: Path) -> None:
    before = hashes(submitted)
    out = tmp_path / "out"
    code = invoke(
        "check",
        "--contract",
        str(submitted / "contract ü.yaml"),
        "--report",
        str(out / "r.json"),
        "--sarif",
        str(out / "r.sarif"),
        "--letter",
        str(out / "letter.html"),
        "--markdown",
        str(out / "letter.md"),
        "--export",
        str(out / "rows.xlsx"),
        "--",
        *(str(submitted / n) for n in ODD_NAMES),
    )
    assert code == 1
    assert hashes(submitted) == before
    assert sorted(p.name for p in out.iterdir()) == [
        "letter.html",
        "letter.md",
        "r.json",
        "r.sarif",
        "rows.xlsx",
    ]


def test_check_refuses_to_write_a_report_over_an_input(submitted: Path) -> None:
    before = hashes(submitted)
    target = submitted / ODD_NAMES[0]
    assert invoke("check", "--report", str(target), "--", str(target)) == 2
    assert hashes(submitted) == before


def test_tidy_leaves_inputs_alone_and_writes_only_its_folder(submitted: Path, tmp_path: Path) -> None:
    before = hashes(submitted)
    out = tmp_path / "tidy out"
    assert invoke("tidy", "--out", str(out), "--", str(submitted / ODD_NAMES[2])) == 0
    recipe = next(out.rglob("*recipe.json"))
    copy = tmp_path / "saved recipe.json"
    shutil.copy(recipe, copy)
    recipe_hash = hashlib.sha256(copy.read_bytes()).hexdigest()
    assert (
        invoke(
            "tidy",
            "--out",
            str(tmp_path / "again"),
            "--recipe",
            str(copy),
            "--",
            str(submitted / ODD_NAMES[2]),
        )
        == 0
    )
    assert invoke("tidy", "--out", str(tmp_path / "bomb"), "--", str(submitted / ODD_NAMES[3])) == 2
    assert hashes(submitted) == before
    assert hashlib.sha256(copy.read_bytes()).hexdigest() == recipe_hash


def test_explain_and_ledger_write_nothing(submitted: Path, tmp_path: Path) -> None:
    before = hashes(tmp_path)
    assert invoke("explain") == 0
    assert invoke("explain", "file.zip-bomb") == 0
    assert invoke("ledger", str(submitted)) in (0, 2)
    assert hashes(tmp_path) == before


def test_gate_moves_every_file_and_loses_none(submitted: Path, tmp_path: Path) -> None:
    inbox = tmp_path / "inbox"
    provider = inbox / "lab north"
    provider.mkdir(parents=True)
    for name in ODD_NAMES:
        shutil.copy(submitted / name, provider / name)
    sent = Counter(hashes(inbox).values())
    (tmp_path / "weir.toml").write_text("[inbox]\nsettle_seconds = 0\n", encoding="utf-8")
    contract_before = hashes(submitted)
    assert invoke("gate", str(inbox), "--contract", str(submitted / "contract ü.yaml")) == 0
    filed = Counter(
        hashlib.sha256(p.read_bytes()).hexdigest()
        for p in inbox.rglob("*")
        if p.is_file() and p.name.endswith(ODD_NAMES)
    )
    assert filed == sent  # every submitted file is still there, byte for byte (moved, not changed)
    assert hashes(submitted) == contract_before


def test_hook_leaves_staged_files_alone(submitted: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.chdir(submitted)
    (submitted / "weir.toml").write_text('contracts = ["contract ü.yaml"]\n', encoding="utf-8")
    before = hashes(submitted)
    code = hook_run([*ODD_NAMES])  # a name starting with "-c" once read as the --contract option
    assert code == 1  # checked (the bomb and the bad chemistry rows fail), not a usage error
    assert hashes(submitted) == before


def test_draft_diff_template_and_dictionary_leave_inputs_alone(submitted: Path, tmp_path: Path) -> None:
    before = hashes(submitted)
    contract = str(submitted / "contract ü.yaml")
    out = tmp_path / "made"
    out.mkdir()
    assert invoke("draft", "--out", str(out / "drafted.yaml"), "--", str(submitted / ODD_NAMES[0])) == 0
    assert invoke("draft", "--out", str(out / "bomb.yaml"), "--", str(submitted / ODD_NAMES[3])) == 2
    assert invoke("diff", contract, str(out / "drafted.yaml")) in (0, 1)
    assert invoke("template", "--out", str(out / "template.xlsx"), contract) == 0
    assert invoke("dictionary", "--out", str(out / "dictionary.md"), contract) == 0
    assert hashes(submitted) == before
