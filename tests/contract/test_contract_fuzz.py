"""Whatever the bytes, loading a contract either works or gives one WeirError line, never a traceback."""

from __future__ import annotations

from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from linter.contract.load import load_contract
from linter.errors import WeirError

SEED = """\
contract: c
version: 1
observational_unit: one reading
keys: [site_id]
variables:
  site_id: {type: string, pattern: '^VB-\\d{3}$'}
  on: {type: date, min: 2020-01-01}
  q: {type: category, values: {J: Estimated}}
  ph: {type: number, min: 0, max: 14, unit: pH}
rules: ["ph >= 0 and ph <= 14"]
complete_over: [site_id]
"""
YAML_BITS = st.sampled_from(
    [
        ":",
        " ",
        "\n",
        "-",
        "[",
        "]",
        "{",
        "}",
        ",",
        "'",
        '"',
        "&a",
        "*a",
        "!!",
        "#",
        "%",
        "|",
        ">",
        "?",
        "<",
        "0",
        "1.5",
        "true",
        "null",
        "~",
        "\t",
        "\\",
        "@",
        "`",
        "keys",
        "type",
        "min",
        "rules",
        "..",
        "/",
        "2020-13-01",
    ]
)


def attempt(path: Path, data: bytes) -> None:
    path.write_bytes(data)
    try:
        load_contract(path.name)
    except WeirError as error:
        message = str(error)
        assert message.startswith(path.name) and "\n" not in message, message


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(position=st.integers(0, len(SEED)), cut=st.integers(0, 6), insert=st.lists(YAML_BITS, max_size=4))
def test_mutated_contracts_fail_cleanly(tmp_path: Path, position: int, cut: int, insert: list[str]) -> None:
    text = SEED[:position] + "".join(insert) + SEED[position + cut :]
    attempt(tmp_path / "m.yaml", text.encode("utf-8"))


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(data=st.binary(max_size=200))
def test_random_bytes_fail_cleanly(tmp_path: Path, data: bytes) -> None:
    attempt(tmp_path / "b.yaml", data)


# Found by a longer run of random edits: explicit tags on text that is not such a value crashed
# the YAML constructor (KeyError, IndexError) or gave a multi-line message.
@pytest.mark.parametrize(
    ("edit", "words"),
    [
        ("{type: !!bool number, min: 0", "'number' is not a valid YAML bool"),
        ("{type: !!float , min: 0", "'' is not a valid YAML float"),
        ("{type: !!timestamp soon, min: 0", "'soon' is not a valid YAML timestamp"),
    ],
)
def test_explicit_tags_on_wrong_text(tmp_path: Path, edit: str, words: str) -> None:
    text = SEED.replace("{type: number, min: 0", edit)
    assert text != SEED
    (tmp_path / "t.yaml").write_text(text, encoding="utf-8")
    with pytest.raises(WeirError, match=r"^t\.yaml:9:\d+: ") as caught:
        load_contract("t.yaml")
    assert words in str(caught.value) and "\n" not in str(caught.value)
