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
