"""The demo agrees with itself: every planted problem is there and every clean file is clean."""

from __future__ import annotations

import csv
import io
import re
import subprocess
import sys
from datetime import date, datetime
from pathlib import Path
from typing import Any

import openpyxl
import pytest
from ruamel.yaml import YAML

from linter.check import governing
from linter.contract.load import load_contract
from linter.contract.model import Contract, TableContract, VarType

CONTRACT_RULES = {
    "columns.missing",
    "columns.misspelt",
    "columns.unexpected",
    "columns.order",
    "values.missing",
    "values.wrong-type",
    "values.wrong-unit",
    "values.date-format",
    "values.out-of-range",
    "values.not-in-code-list",
    "values.code-variant",
    "values.pattern-mismatch",
    "keys.duplicate",
    "keys.missing",
    "keys.incomplete-grid",
    "references.unknown",
    "references.table-absent",
    "rows.comparison",
}
"""The contract rule ids agreed between the loader, the checks and the demo (see the task brief)."""
READER_RULES = {"file.encoding"}
"""Reading rules a demo file must also trigger (defined by the reader's rule family)."""
NOT_DATA = {"expected.yaml"}


def manifest(repo: Path, folder: str) -> dict[str, Any]:
    loaded: dict[str, Any] = YAML(typ="safe", pure=True).load(
        repo / "sample_submissions" / folder / "expected.yaml"
    )
    return loaded


def demo_contracts(repo: Path) -> list[Contract]:
    return [load_contract(str(p)) for p in sorted((repo / "contracts").glob("*.yaml"))]


@pytest.mark.parametrize("folder", ["clean", "returned"])
def test_manifest_lists_exactly_the_files_in_its_folder(repo: Path, folder: str) -> None:
    listed = set(manifest(repo, folder)["files"])
    present = {p.name for p in (repo / "sample_submissions" / folder).iterdir() if p.is_file()} - NOT_DATA
    assert listed == present


@pytest.mark.parametrize("folder", ["clean", "returned"])
def test_each_file_is_governed_by_its_listed_contract(repo: Path, folder: str) -> None:
    contracts = demo_contracts(repo)
    for name, entry in manifest(repo, folder)["files"].items():
        path = f"sample_submissions/{folder}/{name}"
        contract, _ = governing(path, contracts)
        assert contract is not None and Path(contract.path).name == Path(entry["contract"]).name, name
        assert (repo / entry["contract"]).is_file()
        for other in entry["submitted_with"]:
            assert (repo / "sample_submissions" / folder / other).is_file(), (name, other)


def test_clean_files_expect_acceptance(repo: Path) -> None:
    for name, entry in manifest(repo, "clean")["files"].items():
        assert entry["exit"] == 0 and entry["must_report"] == [], name


def test_returned_files_expect_return_and_name_only_agreed_rules(repo: Path) -> None:
    for name, entry in manifest(repo, "returned")["files"].items():
        assert entry["exit"] == 1, name
        assert entry["must_report"], name
        allowed = CONTRACT_RULES | READER_RULES
        assert set(entry["must_report"]) <= allowed, (name, set(entry["must_report"]) - allowed)


def test_every_contract_rule_is_planted_at_least_once(repo: Path) -> None:
    planted = {
        rule for entry in manifest(repo, "returned")["files"].values() for rule in entry["must_report"]
    }
    assert planted - READER_RULES == CONTRACT_RULES, CONTRACT_RULES - planted


def test_generator_reproduces_the_committed_files(repo: Path, tmp_path: Path) -> None:
    script = repo / "sample_submissions" / "make_samples.py"
    subprocess.run([sys.executable, str(script), "--out", str(tmp_path)], check=True, capture_output=True)
    made = sorted(p.relative_to(tmp_path) for p in tmp_path.rglob("*") if p.is_file())
    assert made, "the generator wrote nothing"
    for relative in made:
        committed = repo / "sample_submissions" / relative
        assert committed.read_bytes() == (tmp_path / relative).read_bytes(), (
            f"{relative} is stale: rerun the script"
        )


def test_windows_1252_file_is_not_utf8(repo: Path) -> None:
    raw = (repo / "sample_submissions/returned/field-sheets-2026-q1-heronsgate-volunteers.csv").read_bytes()
    # Source: Python's codecs (UTF-8 per RFC 3629; cp1252 code page): 0x96 is an en dash in cp1252
    with pytest.raises(UnicodeDecodeError):
        raw.decode("utf-8")
    assert "\u2013" in raw.decode("cp1252")


def rows_of(path: Path) -> list[dict[str, str | None]]:
    """Every cell as text, read by reference libraries (csv per RFC 4180, openpyxl per ECMA-376)."""
    if path.suffix == ".xlsx":
        sheet = openpyxl.load_workbook(path, read_only=True).worksheets[0]
        grid = [
            ["" if v is None else v.date().isoformat() if isinstance(v, datetime) else str(v) for v in row]
            for row in sheet.iter_rows(values_only=True)
        ]
    else:
        text = path.read_bytes().decode("utf-8", errors="replace")
        grid = list(csv.reader(io.StringIO(text)))
    header, *body = grid
    assert all(len(row) == len(header) for row in body), f"{path.name} is ragged"
    return [dict(zip(header, row, strict=True)) for row in body]


def independent_problems(rows: list[dict[str, str | None]], table: TableContract) -> list[str]:
    """A deliberately simple second opinion on the contract, written without any of Weir's checks."""
    problems: list[str] = []
    header = list(rows[0]) if rows else []
    for variable in table.variables:
        if variable.required and variable.name not in header:
            problems.append(f"missing column {variable.name}")
    problems += [f"extra column {name}" for name in header if table.variable(name) is None]
    for number, row in enumerate(rows, start=2):
        for name, cell in row.items():
            variable = table.variable(name)
            if variable is None:
                continue
            value = (cell or "").strip() if cell == (cell or "").strip() else f"<spaces>{cell}"
            if value in table.missing:
                if not variable.nullable:
                    problems.append(f"row {number}: {name} empty")
                continue
            if variable.pattern and not re.fullmatch(variable.pattern, value):
                problems.append(f"row {number}: {name} {value!r} breaks the pattern")
            if variable.codes and value not in variable.codes.values:
                problems.append(f"row {number}: {name} {value!r} not a code")
            if variable.type is VarType.DATE:
                try:
                    day = date.fromisoformat(value)  # Source: ISO 8601-1 calendar date YYYY-MM-DD
                    if variable.minimum is not None and day < date.fromisoformat(str(variable.minimum)):
                        problems.append(f"row {number}: {name} before min")
                except ValueError:
                    problems.append(f"row {number}: {name} {value!r} not an ISO date")
            if variable.type is VarType.NUMBER:
                text = value.removeprefix(variable.censored_prefix or "\0")
                try:
                    amount = float(text)
                except ValueError:
                    problems.append(f"row {number}: {name} {value!r} not a number")
                    continue
                low, high = variable.minimum, variable.maximum
                if (low is not None and amount < float(low)) or (high is not None and amount > float(high)):
                    problems.append(f"row {number}: {name} {amount} out of range")
            if variable.type is VarType.BOOLEAN and value not in ("true", "false"):
                problems.append(f"row {number}: {name} {value!r} not true/false")
    return problems


@pytest.mark.parametrize("folder", ["clean", "returned"])
def test_a_second_opinion_agrees_with_the_verdicts(repo: Path, folder: str) -> None:
    contracts = demo_contracts(repo)
    for name in manifest(repo, folder)["files"]:
        path = repo / "sample_submissions" / folder / name
        _, table = governing(str(path), contracts)
        assert table is not None
        problems = independent_problems(rows_of(path), table)
        if folder == "clean":
            assert problems == [], (name, problems)
        else:
            assert problems, f"{name} is meant to be returned but a simple check finds nothing wrong"
