"""Value rules, as small pass/fail cases: one column under a one-variable contract, and what Weir says."""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field

import pytest

from linter.contract.model import CodeList, TableContract, Variable, VarType
from linter.findings import Finding, Severity

NITRATE_CODES = CodeList(("NITRATE", "PHOSPHATE", "AMMONIUM"))
COUNTIES = CodeList(("ALD", "BRK"), labels={"ALD": "Aldermoor", "BRK": "Brookfold"})


@dataclass(frozen=True)
class Expect:
    rule: str
    rows: tuple[int, ...]
    """Provider line numbers: the header is line 1, the first cell line 2."""
    fix: str = ""
    """Text the fix must contain."""
    examples: tuple[str, ...] = ()


@dataclass(frozen=True)
class Case:
    id: str
    variable: Variable
    cells: tuple[str | None, ...]
    expect: tuple[Expect, ...] = ()
    missing: tuple[str, ...] = ("", "NA", "-999")
    keys: tuple[str, ...] = field(default=())


RESULT = Variable("result", VarType.NUMBER, minimum=0, unit="mg/L", censored_prefix="<")

CASES = (
    Case("clean numbers pass", RESULT, ("0.5", "12", "3e-2", "NA")),
    Case(
        "thousands separator",
        RESULT,
        ("0.5", "1,234"),
        (Expect("values.wrong-type", (3,), "write 1234 without the thousands separator", ("1,234",)),),
    ),
    Case(
        "unit written in the cell",
        RESULT,
        ("12 mg/L", "4"),
        (Expect("values.wrong-type", (2,), "write the number alone, 12", ("12 mg/L",)),),
    ),
    Case(
        "another unit",
        RESULT,
        ("12 ug/L", "3 µg/L", "1"),
        (Expect("values.wrong-unit", (2, 3), "convert to mg/L", ("12 ug/L", "3 µg/L")),),
    ),
    Case(
        "censored value is checked by its limit, never an error",
        RESULT,
        ("<0.05", "< 0.1"),
    ),
    Case(
        "censored value below the minimum",
        Variable("result", VarType.NUMBER, minimum=0.1, censored_prefix="<"),
        ("<0.05", "0.2"),
        (Expect("values.out-of-range", (2,), "censored", ("<0.05",)),),
    ),
    Case(
        "below min and above max",
        Variable("ph", VarType.NUMBER, minimum=0, maximum=14),
        ("7.1", "-1", "14", "15.5"),
        (Expect("values.out-of-range", (3, 5), "at least 0 and at most 14", ("-1", "15.5")),),
    ),
    Case(
        "not a number and a decimal comma",
        RESULT,
        ("about 3", "1,5"),
        (Expect("values.wrong-type", (2, 3), "write 1.5 with a decimal point", ("about 3", "1,5")),),
    ),
    Case(
        "integer with a fraction",
        Variable("count", VarType.INTEGER),
        ("3", "3.5"),
        (Expect("values.wrong-type", (3,), "whole number", ("3.5",)),),
    ),
    Case(
        "integer range",
        Variable("count", VarType.INTEGER, minimum=1, maximum=10),
        ("1", "11", "NA", "0"),
        (Expect("values.out-of-range", (3, 5), "at least 1 and at most 10", ("11", "0")),),
    ),
    Case(
        "date-time range",
        Variable("taken_at", VarType.DATETIME, maximum="2026-12-31T23:59:59"),
        ("2026-03-02T10:15:00", "2027-01-01T00:00:00"),
        (Expect("values.out-of-range", (3,), "at most 2026-12-31T23:59:59", ("2027-01-01T00:00:00",)),),
    ),
    Case(
        "boolean words",
        Variable("filtered", VarType.BOOLEAN),
        ("true", "FALSE", "1", "yes"),
        (Expect("values.wrong-type", (5,), "'yes' reads as true", ("yes",)),),
    ),
    Case(
        "date in another format",
        Variable("sampled_on", VarType.DATE),
        ("2026-03-02", "03/02/2026", "13/02/2026"),
        (Expect("values.date-format", (3, 4), "2026-02-03 or 2026-03-02", ("03/02/2026", "13/02/2026")),),
    ),
    Case(
        "impossible day is a type error, not a format one",
        Variable("sampled_on", VarType.DATE),
        ("2026-02-30",),
        (Expect("values.wrong-type", (2,), "no such day", ("2026-02-30",)),),
    ),
    Case(
        "date before the minimum",
        Variable("sampled_on", VarType.DATE, minimum="2026-01-01"),
        ("2025-12-31", "2026-01-01"),
        (Expect("values.out-of-range", (2,), "at least 2026-01-01", ("2025-12-31",)),),
    ),
    Case(
        "code variants name the exact code",
        Variable("analyte", VarType.CATEGORY, codes=NITRATE_CODES),
        ("NITRATE", "Nitrate ", "nitrate", "PHOSPHATE"),
        (
            Expect(
                "values.code-variant",
                (3, 4),
                "use the code NITRATE (found 'Nitrate ', 'nitrate')",
                ("Nitrate ", "nitrate"),
            ),
        ),
    ),
    Case(
        "unknown code with a near miss",
        Variable("analyte", VarType.CATEGORY, codes=NITRATE_CODES),
        ("NITRATE", "AMONIUM", "LEAD", "PHOSPHTE"),
        (
            Expect(
                "values.not-in-code-list",
                (3, 4, 5),
                "'AMONIUM' looks like AMMONIUM: write AMMONIUM if that is meant; 'PHOSPHTE' looks like "
                "PHOSPHATE: write PHOSPHATE if that is meant; otherwise use one of the allowed codes: "
                "NITRATE, PHOSPHATE, AMMONIUM",
                ("AMONIUM", "LEAD", "PHOSPHTE"),
            ),
        ),
    ),
    Case(
        "a label written instead of its code",
        Variable("county", VarType.CATEGORY, codes=COUNTIES),
        ("ALD", "Aldermoor", "brookfold"),
        (
            Expect(
                "values.not-in-code-list",
                (3, 4),
                "write ALD instead of its label 'Aldermoor'; write BRK instead of its label 'brookfold'",
            ),
        ),
    ),
    Case(
        "bounds read as the contract wrote them",
        Variable("result", VarType.NUMBER, minimum=0.0, maximum=2000.0),
        ("2500",),
        (Expect("values.out-of-range", (2,), "at least 0 and at most 2000"),),
    ),
    Case(
        "pattern must match the whole text",
        Variable("site_id", pattern=r"VB-\d{3}"),
        ("VB-014", "VB-0145", "vb-014"),
        (
            Expect(
                "values.pattern-mismatch",
                (3, 4),
                "like 'VB-014' (found 'VB-0145', 'vb-014'); write 'vb-014' in capital letters",
                ("VB-0145", "vb-014"),
            ),
        ),
    ),
    Case(
        "surrounding spaces are named as the only problem",
        Variable("site_id", pattern=r"VB-\d{3}"),
        ("VB-014 ", "VB-14"),
        (Expect("values.pattern-mismatch", (2, 3), "remove the surrounding spaces from 'VB-014 '"),),
    ),
    Case(
        "empty cells and missing codes in a non-nullable variable",
        Variable("result", VarType.NUMBER, nullable=False),
        ("1", None, "NA", "-999", "abc"),
        (
            Expect("values.missing", (3, 4, 5), "fill in result"),
            Expect("values.wrong-type", (6,), "found 'abc'", ("abc",)),
        ),
    ),
    Case(
        "the variable's own missing code",
        Variable("result", VarType.NUMBER, nullable=False, missing=("n/d",)),
        ("n/d", "2"),
        (Expect("values.missing", (2,), "fill in result"),),
    ),
)


@pytest.mark.parametrize("case", CASES, ids=[c.id for c in CASES])
def test_value_rules(case: Case, check_family: Callable[..., list[Finding]]) -> None:
    contract = TableContract(
        "chemistry", "one analyte in one sample", case.keys, (case.variable,), missing=case.missing
    )
    rows = [[case.variable.name], *([cell] for cell in case.cells)]
    found = check_family(rows, contract, "values")
    assert [(f.rule, f.place.rows) for f in found] == [(e.rule, e.rows) for e in case.expect]
    for finding, expect in zip(found, case.expect, strict=True):
        assert expect.fix in finding.fix, finding.fix
        assert finding.count == len(expect.rows)
        assert finding.place.columns == (case.variable.name,) and finding.place.letters == ("A",)
        if expect.examples:
            assert finding.examples == expect.examples
        assert finding.severity is Severity.ERROR


def test_every_problem_kind_is_reported_once_per_rule_and_column(
    check_family: Callable[..., list[Finding]],
) -> None:
    contract = TableContract("chemistry", "one analyte", (), (RESULT,))
    rows = [["result"], ["1,234"], ["12 mg/L"], ["x"], ["9,876"]]
    (finding,) = check_family(rows, contract, "values")
    assert finding.count == 4 and finding.place.rows == (2, 3, 4, 5)
    assert finding.evidence["problems"] == {"thousands-separator": 2, "unit-in-cell": 1, "not-a-number": 1}
    assert finding.examples == ("1,234", "12 mg/L", "x", "9,876")
