"""The workbook's own dataValidation objects, read back by openpyxl, match the contract they came from.

Source: ECMA-376 Office Open XML, Part 1, §18.3.1.32 dataValidation and §18.3.1.33 dataValidations
(type, operator, formula1/formula2, allowBlank, sqref); §18.3.1.94 pane for the frozen header row
(xSplit/ySplit, state="frozen"); section numbers from memory.
"""

from __future__ import annotations

from datetime import date
from pathlib import Path

import pytest
from openpyxl import load_workbook
from openpyxl.utils import get_column_letter
from spreadsheet_rules import EPOCH, list_items, rule_at
from template_files import REPO

from linter.contract.load import load_contract
from linter.contract.model import VarType

SHEETS = [
    ("sites", "sites"),
    ("stream-chemistry", "stream-chemistry"),
    ("field-sheets", "field-sheets"),
    ("volunteer-bundle", "visited_sites"),
    ("volunteer-bundle", "samples"),
]
"""(demo contract, table): every table of every demo contract, the bundle's two included."""


@pytest.mark.parametrize(("contract", "name"), SHEETS)
def test_every_column_has_the_rule_its_variable_declares(
    templates: dict[str, Path], contract: str, name: str
) -> None:
    table = load_contract(str(REPO / "contracts" / f"{contract}.yaml")).table(name)
    assert table is not None
    workbook = load_workbook(templates[contract])
    ws = workbook[name]
    assert [c.value for c in ws[1]] == list(table.names)  # one header row, declared order
    assert ws.freeze_panes == "A2"
    for index, variable in enumerate(table.variables, start=1):
        letter = get_column_letter(index)
        dv = rule_at(workbook, name, f"{letter}2")
        assert dv is not None and rule_at(workbook, name, f"{letter}1048576") is dv  # the whole column
        assert rule_at(workbook, name, f"{letter}1") is None  # never the header
        blank_ok = variable.nullable and variable.name not in table.keys
        assert bool(dv.allow_blank) is blank_ok
        if variable.codes is not None:
            assert dv.type == "list"
            assert list_items(dv, workbook) == list(variable.codes.values)  # complete, in order
        elif variable.type is VarType.BOOLEAN:
            assert dv.type == "list" and list_items(dv, workbook) == ["true", "false"]
        elif variable.type is VarType.NUMBER and not variable.censored_prefix:
            assert dv.type == "decimal"
            assert_bounds(dv, variable.minimum, variable.maximum)
        elif variable.type is VarType.DATE:
            assert dv.type == "date"
            # Serial numbers of the 1900 date system, computed here independently of Weir.
            low = (
                None if variable.minimum is None else (date.fromisoformat(str(variable.minimum)) - EPOCH).days
            )
            high = (
                None if variable.maximum is None else (date.fromisoformat(str(variable.maximum)) - EPOCH).days
            )
            assert_bounds(dv, low, high, date_rule=True)
        elif variable.pattern:
            assert dv.type == "textLength"
            # Every demo pattern has a fixed width: the length of any text it matches.
            assert dv.operator == "equal" and int(dv.formula1) == len(example_of(variable.pattern))
        else:
            assert dv.type is None and dv.prompt  # guidance only: nothing to enforce
        # Source: ECMA-376 Part 1 §18.3.1.32: errorStyle "stop" refuses the entry (from memory).
        assert dv.errorStyle == "stop"
        # From memory of ECMA-376 and Excel: showDropDown="1" *hides* the in-cell arrow of a list.
        assert not dv.showDropDown
        # From memory of Excel's limits: titles up to 32 characters, prompt and error texts up to 255.
        assert len(dv.promptTitle or "") <= 32 and len(dv.errorTitle or "") <= 32
        assert len(dv.prompt or "") <= 255 and len(dv.error or "") <= 255
        if dv.type is not None:
            assert dv.showErrorMessage and dv.error


def example_of(pattern: str) -> str:
    """An independent example: the documented id shapes of the Vell Basin demo."""
    # Common practice (no source): the demo's own documented examples of each id shape.
    known = {r"^VB-\d{3}$": "VB-014", r"^[A-Z]{2}\d{6}$": "KL204417", r"^\d{4}-(0[1-9]|1[0-2])$": "2026-01"}
    return known[pattern]


def assert_bounds(dv: object, low: object, high: object, date_rule: bool = False) -> None:
    first, second = float(dv.formula1), None if dv.formula2 is None else float(dv.formula2)  # type: ignore[attr-defined]
    operator = dv.operator  # type: ignore[attr-defined]
    if low is not None and high is not None:
        assert (operator, first, second) == ("between", float(low), float(high))  # type: ignore[arg-type]
    elif low is not None:
        assert (operator, first) == ("greaterThanOrEqual", float(low))  # type: ignore[arg-type]
    elif high is not None:
        assert (operator, first) == ("lessThanOrEqual", float(high))  # type: ignore[arg-type]
    else:
        # No range declared: the rule still refuses text, over every value the type can take.
        assert operator == "between" and second is not None
        if date_rule:  # from the start of the unambiguous 1900 serials (61) to 9999-12-31 (2958465)
            assert first <= 61 and second == 2958465  # serial of 9999-12-31: from memory of Excel's limit
        else:
            assert first <= -1e300 and second >= 1e300


@pytest.mark.parametrize(("contract", "name"), SHEETS)
def test_cell_formats_keep_ids_as_text_and_dates_as_iso(
    templates: dict[str, Path], contract: str, name: str
) -> None:
    table = load_contract(str(REPO / "contracts" / f"{contract}.yaml")).table(name)
    assert table is not None
    ws = load_workbook(templates[contract])[name]
    for index, variable in enumerate(table.variables, start=1):
        fmt = ws.column_dimensions[get_column_letter(index)].number_format
        if variable.type is VarType.DATE:
            assert fmt == "yyyy-mm-dd"
        elif variable.type in (VarType.STRING, VarType.CATEGORY, VarType.BOOLEAN) or variable.censored_prefix:
            # Source: ECMA-376 Part 1 §18.8.30 numFmt: built-in format 49 is "@" (text); from memory.
            assert fmt == "@"


def test_the_workbook_has_instructions_and_marked_examples(templates: dict[str, Path]) -> None:
    workbook = load_workbook(templates["stream-chemistry"])
    assert workbook.sheetnames == [
        "stream-chemistry",
        "Instructions",
    ]  # short lists stay inline: no Lists sheet
    text = "\n".join(str(c.value) for row in workbook["Instructions"].iter_rows() for c in row if c.value)
    contract = load_contract(str(REPO / "contracts" / "stream-chemistry.yaml"))
    for variable in contract.tables[0].variables:
        assert variable.name in text
    for code, label in (("NITRATE", "Nitrate as N"), ("H", "Analysed after the holding time")):
        assert f"{code} = {label}" in text
    ws = workbook["stream-chemistry"]
    assert ws["A2"].comment is not None and "Example" in ws["A2"].comment.text
    assert ws["A3"].comment is not None and ws["A4"].value is None  # two examples, then nothing


def test_long_code_lists_live_on_a_hidden_sheet(tmp_path: Path) -> None:
    from template_files import make_template

    codes = [f"METHOD-{i:03d}" for i in range(40)]  # 40 x 10 characters: beyond an inline list
    (tmp_path / "methods.yaml").write_text("\n".join(f"- {c}" for c in codes) + "\n", encoding="utf-8")
    (tmp_path / "c.yaml").write_text(
        "contract: lab-methods\nversion: 1\nobservational_unit: one method used on one day\n"
        "keys: [method]\nvariables:\n  method: {type: category, codes: methods.yaml}\n",
        encoding="utf-8",
    )
    workbook = load_workbook(make_template(tmp_path / "c.yaml", tmp_path / "t.xlsx"))
    assert workbook["Lists"].sheet_state == "hidden"
    dv = rule_at(workbook, "lab-methods", "A2")
    assert dv is not None and dv.type == "list" and dv.formula1.startswith("Lists!$A$2")
    assert list_items(dv, workbook) == codes
