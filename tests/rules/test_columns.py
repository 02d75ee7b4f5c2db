"""Column rules, as small pass/fail cases: a header against a contract's declared variables."""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import pytest

from linter.contract.model import TableContract, Variable
from linter.findings import Finding, Severity

DECLARED = (
    Variable("site_id"),
    Variable("sampled_on"),
    Variable("result"),
    Variable("qualifier", required=False),
)


@dataclass(frozen=True)
class Case:
    id: str
    header: tuple[str, ...]
    expect: tuple[tuple[str, tuple[str, ...], tuple[str, ...]], ...]
    """(rule, columns, letters) per finding, in report order."""
    extra_columns: str = "warn"
    column_order: bool = False
    fix: str = ""


CASES = (
    Case("all declared columns present", ("site_id", "sampled_on", "result"), ()),
    Case("optional column may be absent or present", ("site_id", "sampled_on", "result", "qualifier"), ()),
    Case(
        "required column absent",
        ("site_id", "result"),
        (("columns.missing", ("sampled_on",), ("C",)),),
        fix="add a column headed sampled_on, for example as column C",
    ),
    Case(
        "misspelt column replaces missing + unexpected",
        ("site_id", "sampeld_on", "result"),
        (("columns.misspelt", ("sampeld_on",), ("B",)),),
        fix="rename the column 'sampeld_on' to sampled_on",
    ),
    Case(
        "other case and spaces count as misspelt",
        ("Site ID", "sampled_on", "result"),
        (("columns.misspelt", ("Site ID",), ("A",)),),
        fix="to site_id",
    ),
    Case(
        "a unit in the header is a misspelling of the bare name",
        ("site_id", "sampled_on", "Result (mg/L)"),
        (("columns.misspelt", ("Result (mg/L)",), ("C",)),),
        fix="rename the column 'Result (mg/L)' to result",
    ),
    Case(
        "unexpected column, warned by default",
        ("site_id", "sampled_on", "result", "lab_notes"),
        (("columns.unexpected", ("lab_notes",), ("D",)),),
    ),
    Case(
        "unexpected column allowed",
        ("site_id", "sampled_on", "result", "lab_notes"),
        (),
        extra_columns="allow",
    ),
    Case(
        "order ignored unless asked",
        ("result", "site_id", "sampled_on"),
        (),
    ),
    Case(
        "order checked when asked",
        ("result", "site_id", "sampled_on"),
        (("columns.order", ("result", "site_id", "sampled_on"), ("A", "B", "C")),),
        column_order=True,
        fix="site_id, sampled_on, result",
    ),
    Case(
        "order kept",
        ("site_id", "sampled_on", "extra", "result"),
        (("columns.unexpected", ("extra",), ("C",)),),
        column_order=True,
    ),
)


@pytest.mark.parametrize("case", CASES, ids=[c.id for c in CASES])
def test_column_rules(case: Case, check_family: Callable[..., list[Finding]]) -> None:
    contract = TableContract(
        "chemistry",
        "one sample",
        (),
        DECLARED,
        extra_columns=case.extra_columns,
        column_order=case.column_order,
    )
    found = check_family([list(case.header), ["x"] * len(case.header)], contract, "columns")
    assert [(f.rule, f.place.columns, f.place.letters) for f in found] == list(case.expect)
    if case.fix:
        assert case.fix in found[0].fix


def test_unexpected_column_severity_follows_the_contract(check_family: Callable[..., list[Finding]]) -> None:
    contract = TableContract("chemistry", "one sample", (), DECLARED, extra_columns="error")
    (finding,) = check_family(
        [["site_id", "sampled_on", "result", "x1"], ["a", "b", "c", "d"]], contract, "columns"
    )
    assert finding.rule == "columns.unexpected" and finding.severity is Severity.ERROR


def test_two_misspellings_pair_with_their_own_targets(check_family: Callable[..., list[Finding]]) -> None:
    contract = TableContract("chemistry", "one sample", (), DECLARED)
    found = check_family([["Site_Id", "sampled on", "result"], ["a", "b", "c"]], contract, "columns")
    assert {(f.evidence["found"], f.evidence["expected"]) for f in found} == {
        ("Site_Id", "site_id"),
        ("sampled on", "sampled_on"),
    }
