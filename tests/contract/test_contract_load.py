"""Loading contracts: the demo contracts, positions, bundles, and every way a contract can be wrong."""

from __future__ import annotations

import re
from datetime import date
from pathlib import Path

import pytest

from linter.contract.load import load_contract
from linter.contract.model import Position, Reference, VarType
from linter.errors import WeirError

GOOD = """\
contract: stream-chemistry
version: 2.10
title: Monthly stream chemistry
observational_unit: one analyte measured in one water sample
applies_to: ["chemistry*.csv"]
keys: [site_id, sampled_on, analyte]
variables:
  site_id: {type: string, pattern: '^VB-\\d{3}$', references: sites.site_id}
  sampled_on: {type: date, min: 2020-01-01, max: "2030-12-31"}
  analyte: {type: category, values: {NITRATE: Nitrate as N, "01": Code one}}
  result: {type: number, min: 0, unit: mg/L, censored_prefix: "<"}
  qualifier: {type: category, values: [J, U], required: false}
  depth_m: number
missing: ["NA", -999]
rules: ["depth_m >= 0", "0 <= result and result < 500"]
complete_over: [site_id, sampled_on]
extra_columns: error
column_order: true
"""


def write(tmp_path: Path, text: str, name: str = "contract.yaml") -> str:
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return str(path.relative_to(tmp_path))  # tests run inside tmp_path


def test_happy_path_fills_the_model(tmp_path: Path) -> None:
    contract = load_contract(write(tmp_path, GOOD))
    assert (contract.id, contract.title, contract.path) == (
        "stream-chemistry",
        "Monthly stream chemistry",
        "contract.yaml",
    )
    # YAML would read 2.10 as the float 2.1; the version is kept exactly as written
    assert contract.version == "2.10"
    (table,) = contract.tables
    assert table.name == "stream-chemistry"
    assert table.keys == ("site_id", "sampled_on", "analyte")
    assert table.applies_to == ("chemistry*.csv",)
    assert table.missing == ("", "NA", "-999")
    assert table.extra_columns == "error" and table.column_order is True
    assert table.complete_over == ("site_id", "sampled_on")
    site, sampled, analyte, result, qualifier, depth = table.variables
    assert site.references == Reference("sites", "site_id") and site.pattern == r"^VB-\d{3}$"
    assert (sampled.type, sampled.minimum, sampled.maximum) == (VarType.DATE, "2020-01-01", "2030-12-31")
    assert analyte.codes is not None and analyte.codes.values == ("NITRATE", "01")
    assert analyte.codes.labels["NITRATE"] == "Nitrate as N"
    assert (result.minimum, result.unit, result.censored_prefix) == (0.0, "mg/L", "<")
    assert qualifier.required is False and qualifier.nullable is True
    assert depth.type is VarType.NUMBER
    assert [c.text for c in table.comparisons] == ["depth_m >= 0", "0 <= result", "result < 500"]
    # `0 <= result` is kept with the variable on the left
    assert (table.comparisons[1].left, table.comparisons[1].operator, table.comparisons[1].right) == (
        "result",
        ">=",
        0.0,
    )


def test_text_variables_may_be_compared_for_equality(tmp_path: Path) -> None:
    text = GOOD.replace('"depth_m >= 0"', '"site_id != analyte"')
    (rule, *_) = load_contract(write(tmp_path, text)).tables[0].comparisons
    assert (rule.left, rule.operator, rule.right) == ("site_id", "!=", "analyte")


def test_key_variables_are_never_nullable(tmp_path: Path) -> None:
    table = load_contract(write(tmp_path, GOOD)).tables[0]
    assert all(not table.variable(k).nullable for k in table.keys)  # type: ignore[union-attr]
    assert table.variable("result").nullable  # type: ignore[union-attr]


def test_positions_are_one_based_line_and_column(tmp_path: Path) -> None:
    path = write(tmp_path, GOOD)
    table = load_contract(path).tables[0]
    lines = GOOD.splitlines()
    for variable in table.variables:
        # each variable is written on its own line, indented by two spaces
        line = next(i for i, text in enumerate(lines, 1) if text.startswith(f"  {variable.name}:"))
        assert variable.position == Position(path, line, 3)
    rules_line = lines.index('rules: ["depth_m >= 0", "0 <= result and result < 500"]')
    second = table.comparisons[2]
    assert second.position.line == rules_line + 1
    assert lines[rules_line][second.position.column - 1 :].startswith("result < 500")


def test_bundle_contract_holds_several_tables(tmp_path: Path) -> None:
    text = """\
contract: vell-annual
version: "2026.1"
tables:
  sites:
    observational_unit: one site
    keys: site_id
    variables: {site_id: string, river: string}
  samples:
    observational_unit: one sample
    keys: [sample_id]
    variables:
      sample_id: string
      site_id: {type: string, references: sites.site_id}
"""
    contract = load_contract(write(tmp_path, text))
    assert [t.name for t in contract.tables] == ["sites", "samples"]
    assert contract.table("sites").keys == ("site_id",)  # type: ignore[union-attr]
    assert contract.version == "2026.1"


@pytest.mark.parametrize("name", ["sites", "stream-chemistry", "field-sheets"])
def test_demo_contracts_load(repo: Path, name: str) -> None:
    contract = load_contract(str(repo / "contracts" / f"{name}.yaml"))
    assert contract.id == name
    table = contract.tables[0]
    assert table.applies_to and table.keys and table.observational_unit
    for variable in table.variables:
        if variable.type is VarType.CATEGORY:
            assert variable.codes is not None and variable.codes.values


def test_demo_code_lists_come_from_files(repo: Path) -> None:
    table = load_contract(str(repo / "contracts" / "stream-chemistry.yaml")).tables[0]
    analyte, qualifier = table.variable("analyte"), table.variable("qualifier")
    assert analyte is not None and analyte.codes is not None and "NITRATE" in analyte.codes.values
    assert analyte.codes.source == "codes/analytes.yaml"
    assert (
        qualifier is not None
        and qualifier.codes is not None
        and qualifier.codes.source == "codes/qualifiers.csv"
    )


# Each case: a contract with one mistake, the line the error must point at, the text that starts at
# the column it must point at (so the column is found in the case itself), and words it must say.
BROKEN = {
    "misspelt top key": (
        GOOD.replace("observational_unit:", "obervational_unit:"),
        4,
        "obervational_unit",
        "unknown key 'obervational_unit' in the contract; did you mean 'observational_unit'?",
    ),
    "misspelt variable key": (GOOD.replace("unit: mg/L", "unti: mg/L"), 11, "unti", "did you mean 'unit'?"),
    "unknown type": (
        GOOD.replace("type: number, min: 0", "type: numbr, min: 0"),
        11,
        "numbr",
        "did you mean 'number'?",
    ),
    "key names no variable": (
        GOOD.replace("keys: [site_id, sampled_on,", "keys: [site_id, sampledon,"),
        6,
        "sampledon",
        "key 'sampledon' names no variable; did you mean 'sampled_on'?",
    ),
    "reference not table.column": (
        GOOD.replace("references: sites.site_id", "references: sites"),
        8,
        "sites}",
        "must be 'table.column'",
    ),
    "bad regex": (
        GOOD.replace("'^VB-\\d{3}$'", "'^VB-(\\d{3}$'"),
        8,
        "'^VB-(",
        "not a valid regular expression",
    ),
    "min above max": (GOOD.replace('max: "2030-12-31"', 'max: "2019-12-31"'), 9, '"2019', "below its min"),
    "wrong value type": (
        GOOD.replace("column_order: true", "column_order: sometimes"),
        18,
        "sometimes",
        "column_order must be true or false",
    ),
    "missing required entry": (GOOD.replace("version: 2.10\n", ""), 1, "contract", "needs a 'version' entry"),
    "category without codes": (
        GOOD.replace("values: [J, U], ", ""),
        12,
        "qualifier",
        "needs 'values: [...]'",
    ),
    "min on a string": (
        GOOD.replace("pattern: '^VB", "min: 3, pattern: '^VB"),
        8,
        "min: 3",
        "'min' applies only to integer, number, date or datetime",
    ),
    "bad date bound": (GOOD.replace("min: 2020-01-01", "min: 2020-13-01"), 9, "2020-13", "2020-13-01"),
    "bad quoted date bound": (
        GOOD.replace('"2030-12-31"', '"2030-02-30"'),
        9,
        '"2030-02-30"',
        "not an ISO 8601 date",
    ),
    "rule with an unknown name": (
        GOOD.replace('"depth_m >= 0"', '"dept_m >= 0"'),
        15,
        "dept_m",
        "did you mean 'depth_m'?",
    ),
    "rule with a call": (
        GOOD.replace('"depth_m >= 0"', '"len(depth_m) >= 0"'),
        15,
        "(depth",
        "unexpected character '('",
    ),
    "rule on a date and a number": (
        GOOD.replace('"depth_m >= 0"', '"sampled_on >= 0"'),
        15,
        "sampled_on",
        "compares 'sampled_on' (date) with a number",
    ),
    "rule ordering text": (
        GOOD.replace('"depth_m >= 0"', '"site_id < analyte"'),
        15,
        "site_id",
        "only numbers and dates have an order",
    ),
    "nullable key": (
        GOOD.replace("{type: date, min", "{type: date, nullable: true, min"),
        9,
        "nullable",
        "is a key, so it is never nullable: true",
    ),
    "duplicate key in mapping": (
        GOOD.replace("  depth_m: number\n", "  depth_m: number\n  result: string\n"),
        14,
        "result",
        "written twice",
    ),
    "broken YAML": (GOOD.replace("keys: [site_id,", "keys: [site_id,,"), 6, ", sampled_on", "broken YAML"),
    "table key in a bundle header": (
        "contract: b\nversion: 1\nkeys: [a]\ntables:\n  t: {observational_unit: x, variables: {a: string}}\n",
        3,
        "keys",
        "belongs inside one of the tables",
    ),
}


@pytest.mark.parametrize("case", sorted(BROKEN))
def test_each_mistake_names_file_line_and_column(tmp_path: Path, case: str) -> None:
    text, line, anchor, words = BROKEN[case]
    assert text != GOOD, "the case did not change the contract"
    column = text.splitlines()[line - 1].index(anchor) + 1
    path = write(tmp_path, text)
    with pytest.raises(WeirError) as caught:
        load_contract(path)
    message = str(caught.value)
    assert message.startswith(f"{path}:{line}:{column}: "), message
    assert words in message
    assert "\n" not in message


def test_empty_and_blank_files_are_refused(tmp_path: Path) -> None:
    for text in ("", "  \n# only a comment\n"):
        path = write(tmp_path, text)
        with pytest.raises(WeirError, match=re.escape(f"{path}:1:1:")):
            load_contract(path)


def test_missing_contract_file(tmp_path: Path) -> None:
    with pytest.raises(WeirError, match="no such contract file"):
        load_contract("nowhere.yaml")


def test_yaml_12_booleans_only(tmp_path: Path) -> None:
    # From memory of YAML 1.2.2 §10.3.2 (core schema): true/True/TRUE are booleans; `yes` is text,
    # unlike YAML 1.1, so `required: yes` must be refused rather than read as true.
    loaded = load_contract(write(tmp_path, GOOD.replace("required: false", "required: False")))
    assert loaded.tables[0].variable("qualifier").required is False  # type: ignore[union-attr]
    with pytest.raises(WeirError, match="required must be true or false"):
        load_contract(write(tmp_path, GOOD.replace("required: false", "required: yes")))


def test_unquoted_yaml_date_and_quoted_iso_text_agree(tmp_path: Path) -> None:
    table = load_contract(write(tmp_path, GOOD)).tables[0]
    sampled = table.variable("sampled_on")
    assert sampled is not None
    # Source: ISO 8601-1 calendar date, complete representation YYYY-MM-DD, as read by Python's date
    assert date.fromisoformat(str(sampled.minimum)) == date(2020, 1, 1)


@pytest.mark.parametrize("item", ["depth_m >= 0 and result <= 5", "'depth_m >= 0 and result <= 5'"])
def test_rule_positions_in_a_block_list(tmp_path: Path, item: str) -> None:
    text = GOOD.replace('rules: ["depth_m >= 0", "0 <= result and result < 500"]\n', f"rules:\n  - {item}\n")
    assert text != GOOD
    path = write(tmp_path, text)
    first, second = load_contract(path).tables[0].comparisons
    line = text.splitlines().index(f"  - {item}") + 1
    assert (first.position.line, first.position.column) == (
        line,
        text.splitlines()[line - 1].index("depth_m") + 1,
    )
    assert second.position.column == text.splitlines()[line - 1].index("result") + 1
    with pytest.raises(
        WeirError, match=rf"^{path}:{line}:{text.splitlines()[line - 1].index('resul') + 1}: "
    ):
        load_contract(write(tmp_path, text.replace("result <= 5", "resul <= 5")))
