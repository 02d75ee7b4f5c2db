"""Every contract check runs on its own: one problem never hides another, in one round trip."""

from __future__ import annotations

from collections.abc import Callable

from linter.contract.model import CodeList, TableContract, Variable, VarType
from linter.findings import Finding

CONTRACT = TableContract(
    "stream-chemistry",
    "one analyte measured in one water sample",
    ("site_id", "sampled_on", "analyte"),
    (
        Variable("site_id", pattern=r"^VB-\d{3}$"),
        Variable("sampled_on", VarType.DATE),
        Variable("analyte", VarType.CATEGORY, codes=CodeList(("NITRATE", "PHOSPHATE"))),
        Variable("result", VarType.NUMBER, minimum=0, maximum=50, nullable=False, unit="mg/L"),
        Variable("lab_id", required=True),
    ),
    missing=("", "NA"),
)

# lab_id is missing; result has a null and values out of range; two rows share a key.
ROWS = [
    ["site_id", "sampled_on", "analyte", "result"],
    ["VB-014", "2026-03-02", "NITRATE", "0.8"],
    ["VB-014", "2026-03-02", "PHOSPHATE", ""],
    ["VB-015", "2026-03-02", "NITRATE", "-0.4"],
    ["VB-015", "2026-03-02", "NITRATE", "73"],
    ["VB-016", "2026-03-02", "NITRATE", "1,234"],
]


def test_missing_column_null_range_and_duplicate_key_all_reported(
    check_family: Callable[..., list[Finding]],
) -> None:
    found = check_family(ROWS, CONTRACT, "")  # "" keeps every family
    by_rule = {f.rule: f for f in found}
    assert by_rule["columns.missing"].place.columns == ("lab_id",)
    assert by_rule["values.missing"].place.rows == (3,)
    assert by_rule["values.out-of-range"].place.rows == (4, 5)
    assert by_rule["keys.duplicate"].evidence["rows"] == [4, 5]
    assert by_rule["values.wrong-type"].place.rows == (6,)
    assert "weir.inspector-failed" not in by_rule


def test_a_failing_check_does_not_hide_the_others(check_family: Callable[..., list[Finding]]) -> None:
    # A pattern that does not compile is the loader's to report; the other checks of the column still run.
    broken = TableContract(
        "stream-chemistry",
        "one sample",
        (),
        (Variable("site_id", pattern="VB-(", codes=CodeList(("VB-014",)), type=VarType.CATEGORY),),
    )
    found = check_family([["site_id"], ["VB-014"], ["VB-999"]], broken, "")
    assert [(f.rule, f.place.rows) for f in found] == [("values.not-in-code-list", (3,))]


def test_header_only_and_empty_tables_raise_nothing(check_family: Callable[..., list[Finding]]) -> None:
    header_only = check_family([["site_id", "sampled_on", "analyte", "result"]], CONTRACT, "")
    assert [f.rule for f in header_only if f.rule != "file.header-only"] == ["columns.missing"]
    empty = check_family([], CONTRACT, "")
    assert all(not f.rule.startswith("weir.") for f in empty)


def test_a_check_pandera_cannot_run_is_reported_not_silent(
    check_family: Callable[..., list[Finding]],
) -> None:
    # A date-time minimum compared with times written with offsets: Weir compares them in UTC;
    # should pandera ever fail to run the check, its inspector must say so rather than pass.
    contract = TableContract(
        "field", "one reading", (), (Variable("taken_at", VarType.DATETIME, minimum="2026-01-01"),)
    )
    rows = [
        ["taken_at"],
        ["2026-03-02T10:00:00+01:00"],
        ["2025-12-31T23:30:00-01:00"],
        ["2025-06-01T08:00:00"],
    ]
    found = check_family(rows, contract, "")
    assert [(f.rule, f.place.rows) for f in found] == [("values.out-of-range", (4,))]


def test_a_range_check_that_cannot_run_fails_alone(check_family: Callable[..., list[Finding]]) -> None:
    # A minimum on a text variable (the loader refuses it; the engine must not hide it either).
    contract = TableContract(
        "sites", "one site", (), (Variable("site_id", minimum=5.0, pattern=r"VB-\d{3}"),)
    )
    found = check_family([["site_id"], ["VB-014"], ["VB-14"]], contract, "")
    assert [f.rule for f in found] == ["values.pattern-mismatch", "weir.inspector-failed"]
    assert "range check of site_id could not run" in found[1].message
