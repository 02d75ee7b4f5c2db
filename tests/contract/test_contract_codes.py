"""Code lists: inline, YAML list or mapping, CSV `code,label`, and never from outside the contract folder."""

from __future__ import annotations

import csv
import io
import os
from pathlib import Path

import pytest

from linter.contract.load import load_contract
from linter.errors import WeirError

CONTRACT = """\
contract: c
version: 1
observational_unit: one reading
variables:
  county: {{type: category, codes: {codes}}}
"""
CODES_AT = f"5:{CONTRACT.format(codes='@').splitlines()[4].index('@') + 1}"
"""Where the `codes:` value starts in the contract above."""


def contract_with(tmp_path: Path, codes: str, files: dict[str, str]) -> str:
    for name, text in files.items():
        target = tmp_path / name
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_text(text, encoding="utf-8")
    (tmp_path / "contracts").mkdir(exist_ok=True)
    (tmp_path / "contracts" / "c.yaml").write_text(CONTRACT.format(codes=codes), encoding="utf-8")
    return "contracts/c.yaml"


def codes_of(path: str) -> tuple[tuple[str, ...], dict[str, str]]:
    variable = load_contract(path).tables[0].variable("county")
    assert variable is not None and variable.codes is not None
    return variable.codes.values, dict(variable.codes.labels)


def test_yaml_list(tmp_path: Path) -> None:
    path = contract_with(tmp_path, "codes/c.yaml", {"contracts/codes/c.yaml": "- ALD\n- BRK\n- 07\n"})
    # `07` is a code as written, not the number 7
    assert codes_of(path) == (("ALD", "BRK", "07"), {})


def test_yaml_mapping_with_labels(tmp_path: Path) -> None:
    path = contract_with(
        tmp_path, "codes/c.yaml", {"contracts/codes/c.yaml": "ALD: Aldermoor\nBRK: Brackenfold\n"}
    )
    assert codes_of(path) == (("ALD", "BRK"), {"ALD": "Aldermoor", "BRK": "Brackenfold"})


def test_csv_code_list_follows_rfc_4180_quoting(tmp_path: Path) -> None:
    # Source: RFC 4180 §2 rules 6 and 7 (fields with commas are quoted; a quote inside is doubled)
    text = 'code,label\r\nJ,"Estimated, see note"\r\nB,"Found in the ""blank"""\r\n'
    path = contract_with(tmp_path, "codes/q.csv", {"contracts/codes/q.csv": text})
    values, labels = codes_of(path)
    # the reference reader (Python's csv module) must read the same file the same way
    expected = {row["code"]: row["label"] for row in csv.DictReader(io.StringIO(text))}
    assert values == ("J", "B") and labels == expected == {
        "J": "Estimated, see note",
        "B": 'Found in the "blank"',
    }


def test_csv_without_code_header(tmp_path: Path) -> None:
    path = contract_with(tmp_path, "q.csv", {"contracts/q.csv": "J,Estimated\n"})
    with pytest.raises(WeirError, match=r"q\.csv:1:1: a CSV code list needs a header row"):
        load_contract(path)


@pytest.mark.parametrize(
    ("text", "words"),
    [
        ("- A\n- A\n", "code 'A' is listed twice"),
        ("[]\n", "the code list is empty"),
        ("- ' A'\n", "spaces around it"),
    ],
)
def test_bad_code_list_contents(tmp_path: Path, text: str, words: str) -> None:
    path = contract_with(tmp_path, "codes.yaml", {"contracts/codes.yaml": text})
    with pytest.raises(WeirError, match=r"contracts/codes\.yaml:\d+:\d+: ") as caught:
        load_contract(path)
    assert words in str(caught.value)


def test_missing_code_list_file(tmp_path: Path) -> None:
    path = contract_with(tmp_path, "codes/none.yaml", {})
    with pytest.raises(
        WeirError, match=rf"^contracts/c\.yaml:{CODES_AT}: code-list file 'codes/none\.yaml' not found"
    ):
        load_contract(path)


@pytest.mark.parametrize(
    "reference", ["../outside.yaml", "codes/../../outside.yaml", "/codes/analytes.yaml", "C:\\codes.yaml"]
)
def test_code_list_may_not_escape_the_contract_folder(tmp_path: Path, reference: str) -> None:
    path = contract_with(tmp_path, f"'{reference}'", {"outside.yaml": "- A\n"})
    with pytest.raises(WeirError, match=rf"^contracts/c\.yaml:{CODES_AT}: code-list path") as caught:
        load_contract(path)
    assert "relative to the contract" in str(caught.value) or "leave the contract" in str(caught.value)


@pytest.mark.skipif(not hasattr(os, "symlink"), reason="needs symbolic links")
def test_symbolic_link_out_of_the_folder_is_refused(tmp_path: Path) -> None:
    path = contract_with(tmp_path, "codes.yaml", {"outside.yaml": "- A\n"})
    (tmp_path / "contracts" / "codes.yaml").symlink_to(tmp_path / "outside.yaml")
    with pytest.raises(WeirError, match="leads outside the contract's folder"):
        load_contract(path)


def test_inline_values_and_codes_together_are_refused(tmp_path: Path) -> None:
    path = contract_with(tmp_path, "c.yaml, values: [A]", {"contracts/c.yaml": "- A\n"})
    with pytest.raises(WeirError, match="either 'values' or 'codes'"):
        load_contract(path)


def test_unreadable_csv_code_list(tmp_path: Path) -> None:
    # Python's csv module refuses a field longer than its field_size_limit (131072 by default)
    huge = "code,label\nA," + "x" * (csv.field_size_limit() + 10) + "\n"
    path = contract_with(tmp_path, "q.csv", {"contracts/q.csv": huge})
    with pytest.raises(WeirError, match=r"^contracts/q\.csv:1:1: not a readable CSV code list"):
        load_contract(path)


def test_windows_separators_in_a_code_list_path(tmp_path: Path) -> None:
    path = contract_with(tmp_path, "'codes\\counties.yaml'", {"contracts/codes/counties.yaml": "- ALD\n"})
    assert codes_of(path) == (("ALD",), {})
