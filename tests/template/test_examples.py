"""Example rows are valid data under their own contract, and patterns get texts that `re` accepts."""

from __future__ import annotations

import csv
import re
from pathlib import Path

import pytest
from template_files import DEMO, REPO

from linter.check import check_paths
from linter.contract.load import load_contract
from linter.template.examples import example_rows
from linter.template.pattern_example import pattern_example, text_width


@pytest.mark.parametrize("name", DEMO)
def test_examples_checked_as_data_raise_no_error(tmp_path: Path, name: str) -> None:
    contract = load_contract(str(REPO / "contracts" / f"{name}.yaml"))
    table = contract.tables[0]
    rows = example_rows(table)
    assert len(rows) == 2
    path = tmp_path / "examples.csv"
    with path.open("w", newline="", encoding="utf-8") as handle:
        csv.writer(handle).writerows([table.names, *rows])
    report = check_paths([str(path)], [contract])
    # Alone, the examples cannot show their site register, and two invented visits are no full grid:
    # both are about the submission as a whole, not about a value.
    found = {f.rule for r in report.results for f in r.findings}
    assert found <= {"references.table-absent", "keys.incomplete-grid"}


@pytest.mark.parametrize(
    "pattern",
    [
        r"^VB-\d{3}$",
        r"^\d{4}-(0[1-9]|1[0-2])$",
        r"^[A-Z]{2}\d{6}$",
        r"^[a-z]+(-[a-z]+)*$",
        r"^(?:N|S)\d{2}[^0-9]$",
    ],
)
def test_pattern_examples_match_under_python_re(pattern: str) -> None:
    first, second = pattern_example(pattern, 0), pattern_example(pattern, 1)
    # Source: Python's `re` module (the reference engine) judges each example.
    assert first is not None and re.fullmatch(pattern, first)
    assert second is not None and re.fullmatch(pattern, second)
    shortest, longest = text_width(pattern)
    assert shortest <= len(first) and (longest is None or len(first) <= longest)


def test_a_pattern_the_writer_cannot_follow_gives_no_examples() -> None:
    assert pattern_example(r"^(?=VB)VB-\d+$") is None
    contract_text = (
        "contract: odd\nversion: 1\nobservational_unit: one thing\nkeys: [a]\n"
        "variables:\n  a: {type: string, pattern: '^(\\w)\\1$'}\n"
    )
    assert pattern_example(r"^(\w)\1$") is None
    Path("odd.yaml").write_text(contract_text, encoding="utf-8")
    assert example_rows(load_contract("odd.yaml").tables[0]) == ()  # none rather than a wrong one
