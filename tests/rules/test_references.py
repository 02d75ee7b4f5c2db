"""Reference rules: values checked against another table's key column of the same submission."""

from __future__ import annotations

from collections.abc import Callable

from linter.contract.model import Reference, TableContract, Variable, VarType
from linter.findings import Finding, Severity

CONTRACT = TableContract(
    "chemistry",
    "one analyte in one sample",
    (),
    (Variable("site_id", references=Reference("sites", "site_id")), Variable("result", VarType.NUMBER)),
    missing=("", "NA"),
)
CHEMISTRY = [
    ["site_id", "result"],
    ["VB-001", "1"],
    ["VB-099", "2"],
    ["VB-002 ", "3"],
    ["NA", "4"],
    ["VB-099", "5"],
]
SITES = [["site_id", "name"], ["VB-001", "Upper weir"], ["VB-002", "Mill race"]]


def test_unknown_values_are_listed_with_their_rows(check_family: Callable[..., list[Finding]]) -> None:
    (finding,) = check_family(CHEMISTRY, CONTRACT, "references", others={"sites": SITES})
    assert finding.rule == "references.unknown" and finding.severity is Severity.ERROR
    assert finding.place.rows == (3, 4, 6) and finding.count == 3
    assert finding.examples == ("VB-099", "VB-002 ")
    assert "'VB-002 ' match once the surrounding spaces are removed" in finding.fix


def test_all_known_values_pass(check_family: Callable[..., list[Finding]]) -> None:
    rows = [["site_id", "result"], ["VB-001", "1"], ["VB-002", "2"]]
    assert check_family(rows, CONTRACT, "references", others={"sites": SITES}) == []


def test_absent_table_is_a_note(check_family: Callable[..., list[Finding]]) -> None:
    (finding,) = check_family(CHEMISTRY, CONTRACT, "references")
    assert finding.rule == "references.table-absent" and finding.severity is Severity.NOTE
    assert finding.place.columns == ("site_id",) and finding.place.letters == ("A",)


def test_absent_column_of_the_referenced_table_is_a_note(check_family: Callable[..., list[Finding]]) -> None:
    (finding,) = check_family(CHEMISTRY, CONTRACT, "references", others={"sites": [["code"], ["VB-001"]]})
    assert finding.rule == "references.table-absent" and "column site_id" in finding.message


def test_numeric_keys_are_compared_as_written(check_family: Callable[..., list[Finding]]) -> None:
    contract = TableContract(
        "visits",
        "one visit",
        (),
        (Variable("station", VarType.INTEGER, references=Reference("stations", "code")),),
    )
    stations = [["code"], ["14"], ["15"]]
    (finding,) = check_family(
        [["station"], ["14"], ["014"], ["16"]], contract, "references", others={"stations": stations}
    )
    assert finding.place.rows == (3, 4) and finding.examples == ("014", "16")
