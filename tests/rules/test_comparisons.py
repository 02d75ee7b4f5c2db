"""Cross-variable comparisons: one finding per rule, only the columns involved, the offending rows."""

from __future__ import annotations

from collections.abc import Callable

import pytest

from linter.contract.model import Comparison, TableContract, Variable, VarType
from linter.findings import Finding

VARIABLES = (
    Variable("site_id"),
    Variable("min_temp", VarType.NUMBER),
    Variable("max_temp", VarType.NUMBER),
    Variable("depth_m", VarType.NUMBER),
)
ROWS = [
    ["site_id", "min_temp", "max_temp", "depth_m"],
    ["VB-001", "4.0", "9.5", "1"],
    ["VB-002", "12", "9.5", "0"],  # breaks min <= max
    ["VB-003", "", "3", "-2"],  # min empty: not judged; depth breaks > 0
    ["VB-004", "7", "x", "3"],  # max unreadable: not judged
    ["VB-005", "8", "8", "0.5"],
]


@pytest.mark.parametrize(
    ("rule", "columns", "letters", "rows"),
    [
        (
            Comparison("min_temp <= max_temp", "min_temp", "<=", "max_temp"),
            ("min_temp", "max_temp"),
            ("B", "C"),
            (3,),
        ),
        (
            Comparison("min_temp < max_temp", "min_temp", "<", "max_temp"),
            ("min_temp", "max_temp"),
            ("B", "C"),
            (3, 6),
        ),
        (
            Comparison("depth_m > 0", "depth_m", ">", 0.0, right_is_variable=False),
            ("depth_m",),
            ("D",),
            (3, 4),
        ),
        (
            Comparison("depth_m != 0", "depth_m", "!=", 0.0, right_is_variable=False),
            ("depth_m",),
            ("D",),
            (3,),
        ),
    ],
    ids=["<=", "<", "> number", "!= number"],
)
def test_comparison(
    rule: Comparison,
    columns: tuple[str, ...],
    letters: tuple[str, ...],
    rows: tuple[int, ...],
    check_family: Callable[..., list[Finding]],
) -> None:
    contract = TableContract("temps", "one site", (), VARIABLES, comparisons=(rule,))
    (finding,) = check_family(ROWS, contract, "rows")
    assert finding.place.columns == columns and finding.place.letters == letters
    assert finding.place.rows == rows and finding.count == len(rows)
    assert all(e.count("=") == len(columns) for e in finding.examples)


def test_rule_on_a_missing_column_is_skipped_alone(check_family: Callable[..., list[Finding]]) -> None:
    rules = (
        Comparison("min_temp <= air_temp", "min_temp", "<=", "air_temp"),
        Comparison("min_temp <= max_temp", "min_temp", "<=", "max_temp"),
    )
    contract = TableContract("temps", "one site", (), VARIABLES, comparisons=rules)
    found = check_family(ROWS, contract, "rows")
    assert [f.evidence["rule"] for f in found] == ["min_temp <= max_temp"]
