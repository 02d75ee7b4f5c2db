"""The contract JSON Schema: valid 2020-12, every property described, and in agreement with the loader."""

from __future__ import annotations

import json
from datetime import date, datetime
from pathlib import Path
from typing import Any

import jsonschema
import pytest
from ruamel.yaml import YAML

from linter.contract.load import load_contract
from linter.errors import WeirError

MINIMAL = """\
contract: c
version: 1
observational_unit: one reading at one site
keys: [site_id]
variables:
  site_id: {type: string, pattern: '^VB-\\d{3}$'}
  ph: {type: number, min: 0, max: 14}
"""


def schema(repo: Path) -> dict[str, Any]:
    loaded: dict[str, Any] = json.loads((repo / "contracts" / "weir-contract.schema.json").read_text("utf-8"))
    return loaded


def as_json(value: object) -> object:
    """YAML data as JSON data: dates become ISO 8601 text, keys become text."""
    if isinstance(value, dict):
        return {str(k): as_json(v) for k, v in value.items()}
    if isinstance(value, list):
        return [as_json(v) for v in value]
    if isinstance(value, date | datetime):
        return value.isoformat()
    return value


def yaml_data(text: str) -> object:
    # the reference reader (ruamel's own safe loader), independent of Weir's node walk
    return as_json(YAML(typ="safe", pure=True).load(text))


def test_schema_is_valid_draft_2020_12(repo: Path) -> None:
    # Source: JSON Schema 2020-12 meta-schema, as shipped in the jsonschema library
    document = schema(repo)
    assert document["$schema"] == "https://json-schema.org/draft/2020-12/schema"
    jsonschema.Draft202012Validator.check_schema(document)


def test_every_property_is_described(repo: Path) -> None:
    missing: list[str] = []

    def walk(node: object, where: str) -> None:
        if isinstance(node, dict):
            for name, sub in node.get("properties", {}).items():
                if "description" not in sub:
                    missing.append(f"{where}.{name}")
            for key, sub in node.items():
                # conditions (if/then) only narrow properties declared, and described, elsewhere
                if key not in ("allOf", "if", "then", "else"):
                    walk(sub, f"{where}.{key}")
        elif isinstance(node, list):
            for index, sub in enumerate(node):
                walk(sub, f"{where}[{index}]")

    walk(schema(repo), "#")
    assert not missing, missing


def contract_files(repo: Path) -> list[Path]:
    return sorted((repo / "contracts").glob("*.yaml"))


def test_there_are_demo_contracts(repo: Path) -> None:
    assert len(contract_files(repo)) >= 3


@pytest.mark.parametrize("name", ["sites.yaml", "stream-chemistry.yaml", "field-sheets.yaml"])
def test_demo_contracts_validate(repo: Path, name: str) -> None:
    # Source: JSON Schema 2020-12, validated with the jsonschema library
    data = yaml_data((repo / "contracts" / name).read_text("utf-8"))
    jsonschema.Draft202012Validator(schema(repo)).validate(data)


def test_all_contracts_in_the_folder_validate(repo: Path) -> None:
    validator = jsonschema.Draft202012Validator(schema(repo))
    for path in contract_files(repo):
        errors = [e.message for e in validator.iter_errors(yaml_data(path.read_text("utf-8")))]
        assert not errors, (path.name, errors)


# Structural cases: the schema and the loader must give the same verdict (True = accepted).
AGREE: dict[str, tuple[str, bool]] = {
    "minimal": (MINIMAL, True),
    "shorthand type": (MINIMAL + "  note: string\n", True),
    "bundle": (
        "contract: b\nversion: '1'\ntables:\n  sites:\n    observational_unit: one site\n"
        "    variables: {site_id: string}\n",
        True,
    ),
    "date bounds": (MINIMAL + "  on: {type: date, min: 2020-01-01, max: '2030-12-31'}\n", True),
    "inline labels": (MINIMAL + "  q: {type: category, values: {J: Estimated, U: null}}\n", True),
    "rules and grid": (
        MINIMAL + "rules: ['ph >= 0']\ncomplete_over: [site_id]\nextra_columns: allow\n",
        True,
    ),
    "misspelt top key": (MINIMAL.replace("observational_unit", "obervational_unit"), False),
    "misspelt variable key": (MINIMAL.replace("pattern:", "patern:"), False),
    "missing version": (MINIMAL.replace("version: 1\n", ""), False),
    "missing variables": (MINIMAL.split("variables:")[0], False),
    "empty variables": (MINIMAL.split("variables:")[0] + "variables: {}\n", False),
    "unknown type": (MINIMAL.replace("type: number", "type: float"), False),
    "unknown shorthand type": (MINIMAL + "  note: text\n", False),
    "category without codes": (MINIMAL + "  q: {type: category}\n", False),
    "values and codes": (MINIMAL + "  q: {type: category, values: [A], codes: c.yaml}\n", False),
    "values on a number": (MINIMAL + "  q: {type: number, values: [1]}\n", False),
    "min on a string": (MINIMAL + "  q: {type: string, min: 1}\n", False),
    "unit on a date": (MINIMAL + "  q: {type: date, unit: mg/L}\n", False),
    "text bound on a number": (MINIMAL.replace("min: 0", "min: 'zero'"), False),
    "date_format on a number": (MINIMAL.replace("max: 14}", "max: 14, date_format: '%Y'}"), False),
    "date_format without directive": (MINIMAL + "  on: {type: date, date_format: YYYY-MM-DD}\n", False),
    "reference without column": (MINIMAL + "  s: {type: string, references: sites}\n", False),
    "extra_columns word": (MINIMAL + "extra_columns: maybe\n", False),
    "column_order text": (MINIMAL + "column_order: sometimes\n", False),
    "yes is not a boolean": (MINIMAL + "  q: {type: string, required: yes}\n", False),
    "duplicate keys list": (MINIMAL.replace("keys: [site_id]", "keys: [site_id, site_id]"), False),
    "bundle with table key on top": (
        "contract: b\nversion: 1\nkeys: [a]\ntables:\n  t: {observational_unit: x, variables: {a: string}}\n",
        False,
    ),
    "bundle without tables": ("contract: b\nversion: 1\ntables: {}\n", False),
    "both forms": (MINIMAL + "tables:\n  t: {observational_unit: x, variables: {a: string}}\n", False),
    "version true": (MINIMAL.replace("version: 1", "version: true"), False),
    "blank title": (MINIMAL + "title: ' '\n", False),
    "null variable": (MINIMAL + "  q:\n", False),
    "dotted contract id": (MINIMAL.replace("contract: c", "contract: c.v2"), False),
    "table name with a space": (
        "contract: b\nversion: 1\ntables:\n  site list: {observational_unit: x, variables: {a: string}}\n",
        False,
    ),
}

# Semantic cases no JSON Schema can express: the schema accepts them, the loader must refuse them.
LOADER_ONLY: dict[str, str] = {
    "key names no variable": MINIMAL.replace("keys: [site_id]", "keys: [siteid]"),
    "bad regular expression": MINIMAL.replace("'^VB-\\d{3}$'", "'^VB-(\\d{3}$'"),
    "min above max": MINIMAL.replace("min: 0, max: 14", "min: 14, max: 0"),
    "invalid ISO date": MINIMAL + "  on: {type: date, min: '2026-02-30'}\n",
    "missing code-list file": MINIMAL + "  q: {type: category, codes: nowhere.yaml}\n",
    "code list escaping the folder": MINIMAL + "  q: {type: category, codes: ../up.yaml}\n",
    "rule with a call": MINIMAL + "rules: ['len(ph) > 0']\n",
    "rule naming no variable": MINIMAL + "rules: ['pH > 0']\n",
    "rule ordering text": MINIMAL + "rules: ['site_id > 0']\n",
    "nullable key": MINIMAL.replace("{type: string, pattern", "{type: string, nullable: true, pattern"),
}


def loader_accepts(tmp_path: Path, text: str) -> bool:
    (tmp_path / "c.yaml").write_text(text, encoding="utf-8")
    try:
        load_contract("c.yaml")
    except WeirError:
        return False
    return True


def schema_accepts(repo: Path, text: str) -> bool:
    return jsonschema.Draft202012Validator(schema(repo)).is_valid(yaml_data(text))


@pytest.mark.parametrize("case", sorted(AGREE))
def test_schema_and_loader_agree(repo: Path, tmp_path: Path, case: str) -> None:
    text, accepted = AGREE[case]
    assert schema_accepts(repo, text) is accepted, f"schema verdict on {case}"
    assert loader_accepts(tmp_path, text) is accepted, f"loader verdict on {case}"


@pytest.mark.parametrize("case", sorted(LOADER_ONLY))
def test_loader_refuses_what_no_schema_can_see(repo: Path, tmp_path: Path, case: str) -> None:
    text = LOADER_ONLY[case]
    assert schema_accepts(repo, text), f"{case} was meant to be schema-valid"
    assert not loader_accepts(tmp_path, text)


def test_examples_in_the_contracts_guide_load_and_validate(repo: Path, tmp_path: Path) -> None:
    guide = (repo / "contracts" / "README.md").read_text("utf-8")
    blocks = [b.split("\n", 1)[1] for b in guide.split("```yaml")[1:]]
    examples = [b.split("```", 1)[0] for b in blocks]
    assert len(examples) >= 2
    (tmp_path / "codes").mkdir()
    for source in (repo / "contracts" / "codes").iterdir():
        (tmp_path / "codes" / source.name).write_bytes(source.read_bytes())
    validator = jsonschema.Draft202012Validator(schema(repo))
    for index, example in enumerate(examples):
        assert validator.is_valid(yaml_data(example)), index
        (tmp_path / f"example{index}.yaml").write_text(example, encoding="utf-8")
        assert load_contract(f"example{index}.yaml").tables
