"""Each layout rule finds its problem with the right recipe step, and tidy tables draw nothing."""

from __future__ import annotations

from pathlib import Path

import pytest
from layout_cases import FAILING, PASSING

import linter.rules.catalogue  # noqa: F401
from linter.read import read_path
from linter.rules.registry import INSPECTORS, RULES
from linter.rules.subject import Subject
from linter.table import Table, first_row_header


def table_of(text: str, name: str = "input.csv") -> Table:
    Path(name).write_text(text, encoding="utf-8")
    return read_path(name)[0]


def layout_findings(table: Table) -> list:
    subject = Subject(table, first_row_header(table))
    found = []
    for name, inspect in INSPECTORS.items():
        if ".layout_" in name:
            found.extend(inspect(subject))
    return found


@pytest.mark.parametrize("case", sorted(FAILING))
def test_rule_finds_its_problem_with_one_step(case: str) -> None:
    text, rule, step = FAILING[case]
    found = [f for f in layout_findings(table_of(text)) if f.rule == rule]
    assert found, f"{rule} missed {case}"
    assert found[0].step is not None and found[0].step["step"] == step
    assert found[0].message and found[0].fix
    assert found[0].place.file == "input.csv"


@pytest.mark.parametrize("case", sorted(PASSING))
def test_tidy_table_draws_no_layout_finding(case: str) -> None:
    found = layout_findings(table_of(PASSING[case]))
    assert [f.rule for f in found] == []


def test_every_layout_rule_has_a_failing_case() -> None:
    layout_rules = {r for r in RULES if r.startswith("layout.")}
    assert layout_rules == {rule for _, rule, _ in FAILING.values()}


def test_values_in_headers_names_columns_and_letters() -> None:
    found = [f for f in layout_findings(table_of(FAILING["years-as-headers"][0])) if f.step]
    assert found[0].place.columns == ("2023", "2024", "2025")
    assert found[0].place.letters == ("B", "C", "D")
    assert found[0].step == {
        "step": "gather",
        "columns": ["2023", "2024", "2025"],
        "names_to": "year",
        "values_to": "count",
        "keep_empty": True,
    }


def test_split_pattern_is_inferred_from_the_data() -> None:
    import re

    found = [f for f in layout_findings(table_of(FAILING["value-and-unit"][0])) if f.step]
    pattern = re.compile(found[0].step["pattern"])
    match = pattern.match("12.5 µS/cm")
    assert match is not None and list(match.groupdict().values()) == ["12.5", "µS/cm"]
    assert pattern.match("VB-014") is None


def test_total_and_note_rows_are_named_by_provider_row_number() -> None:
    table = table_of("site_id,count\nVB-014,3\nVB-015,5\nTotal,8\n* spring survey,\n")
    steps = [f.step for f in layout_findings(table) if f.rule == "layout.totals-and-notes"]
    assert {"step": "drop_rows", "rows": [4], "reason": "total"} in steps
    assert {"step": "drop_rows", "rows": [5], "reason": "notes"} in steps


def test_contract_code_list_levels_as_headers(tmp_path: Path) -> None:
    from linter.contract.model import CodeList, TableContract, Variable, VarType

    contract = TableContract(
        name="counts",
        observational_unit="one taxon counted at one site",
        keys=("site_id", "taxon"),
        variables=(
            Variable("site_id"),
            Variable("taxon", VarType.CATEGORY, codes=CodeList(("mayfly", "stonefly", "midge"))),
            Variable("individuals", VarType.INTEGER),
        ),
    )
    table = table_of("site_id,mayfly,stonefly\nVB-014,3,5\nVB-015,1,0\n")
    subject = Subject(table, first_row_header(table), contract)
    from linter.rules.layout_headers import values_in_headers

    found = list(values_in_headers(subject))
    assert found and found[0].step["names_to"] == "taxon" and found[0].step["values_to"] == "individuals"
    # Without the contract two taxon names are just two column names.
    assert list(values_in_headers(Subject(table, first_row_header(table)))) == []
