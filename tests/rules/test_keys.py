"""Key rules: duplicate key groups (cross-checked with pandas), empty key cells and the expected key grid."""

from __future__ import annotations

from collections.abc import Callable

import pandas as pd
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from linter.contract.model import TableContract, Variable, VarType
from linter.findings import Finding

VARIABLES = (Variable("site_id"), Variable("month"), Variable("result", VarType.NUMBER))
KEYED = TableContract("chemistry", "one site in one month", ("site_id", "month"), VARIABLES)

ROWS = [
    ["site_id", "month", "result"],
    ["VB-001", "2026-01", "1"],  # line 2
    ["VB-001", "2026-02", "1"],  # line 3
    ["VB-001", "2026-01", "2"],  # line 4, same key as line 2
    ["VB-002", "2026-01", "1"],  # line 5
    ["VB-002", "2026-01", "3"],  # line 6, same key as line 5
    ["VB-001", "2026-01", "4"],  # line 7, same key as lines 2 and 4
    ["VB-003", "2026-02", "1"],  # line 8
]


def test_one_finding_per_duplicate_group_with_every_row(check_family: Callable[..., list[Finding]]) -> None:
    found = [f for f in check_family(ROWS, KEYED, "keys") if f.rule == "keys.duplicate"]
    assert [f.evidence["rows"] for f in found] == [[2, 4, 7], [5, 6]]
    assert [f.count for f in found] == [3, 2]
    assert found[0].place.columns == ("site_id", "month") and found[0].place.letters == ("A", "B")
    assert "site_id=VB-001, month=2026-01" in found[0].message


def test_duplicate_groups_agree_with_pandas_duplicated(check_family: Callable[..., list[Finding]]) -> None:
    # Source: pandas reference library, DataFrame.duplicated(keep=False) marks every row of a repeated key.
    body = pd.DataFrame(ROWS[1:], columns=ROWS[0])
    body["line"] = range(2, len(ROWS) + 1)
    marked = body[body.duplicated(["site_id", "month"], keep=False)]
    expected = sorted(sorted(g["line"].tolist()) for _, g in marked.groupby(["site_id", "month"]))
    found = [f for f in check_family(ROWS, KEYED, "keys") if f.rule == "keys.duplicate"]
    assert sorted(f.evidence["rows"] for f in found) == expected


def test_empty_key_cells_are_not_duplicates(check_family: Callable[..., list[Finding]]) -> None:
    rows = [
        ["site_id", "month", "result"],
        ["", "2026-01", "1"],
        [None, "2026-01", "2"],
        ["VB-001", "NA", "3"],
    ]
    contract = TableContract(
        "chemistry", "one site in one month", ("site_id", "month"), VARIABLES, missing=("", "NA")
    )
    found = check_family(rows, contract, "keys")  # reports are ordered by first row
    assert [(f.rule, f.place.columns, f.place.rows) for f in found] == [
        ("keys.missing", ("site_id",), (2, 3)),
        ("keys.missing", ("month",), (4,)),
    ]


def test_duplicates_need_the_whole_key(check_family: Callable[..., list[Finding]]) -> None:
    rows = [["site_id", "result"], ["VB-001", "1"], ["VB-001", "2"]]
    assert check_family(rows, KEYED, "keys") == []  # month is missing: columns.missing says so


@pytest.mark.parametrize(
    ("rows", "absent"),
    [
        (ROWS, ("site_id=VB-002, month=2026-02", "site_id=VB-003, month=2026-01")),
        ([["site_id", "month", "result"], ["VB-001", "2026-01", "1"], ["VB-001", "2026-02", "1"]], ()),
    ],
    ids=["two sites lack a month", "complete grid"],
)
def test_incomplete_grid(
    rows: list[list[str]], absent: tuple[str, ...], check_family: Callable[..., list[Finding]]
) -> None:
    contract = TableContract(
        "chemistry", "one site in one month", (), VARIABLES, complete_over=("site_id", "month")
    )
    found = check_family(rows, contract, "keys")
    assert tuple(e for f in found for e in f.examples) == absent
    assert all(f.rule == "keys.incomplete-grid" and f.count == len(absent) for f in found)


# check_family holds no state between examples, so reusing the function-scoped fixture is safe.
@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(
    pairs=st.lists(
        st.tuples(st.sampled_from(["VB-001", "VB-002", ""]), st.sampled_from(["2026-01", "2026-02"])),
        max_size=12,
    )
)
def test_duplicate_groups_agree_with_pandas_on_random_tables(
    pairs: list[tuple[str, str]], check_family: Callable[..., list[Finding]]
) -> None:
    # Source: pandas reference library, duplicated(keep=False); rows with an empty key cell excluded,
    # as an empty key is keys.missing, never a duplicate.
    rows = [["site_id", "month", "result"], *([site, month, "1"] for site, month in pairs)]
    body = pd.DataFrame(rows[1:], columns=rows[0])
    body["line"] = range(2, len(rows) + 1)
    body = body[body["site_id"] != ""]
    marked = body[body.duplicated(["site_id", "month"], keep=False)]
    expected = sorted(sorted(g["line"].tolist()) for _, g in marked.groupby(["site_id", "month"]))
    found = [f for f in check_family(rows, KEYED, "keys") if f.rule == "keys.duplicate"]
    assert sorted(f.evidence["rows"] for f in found) == expected
