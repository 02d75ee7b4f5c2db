"""Contract YAML is data only: no object tags, no alias bombs, no giant files, no broken text."""

from __future__ import annotations

import time
from pathlib import Path

import pytest

from linter.contract.load import load_contract
from linter.contract.yaml_tree import MAX_FILE_BYTES, parse_yaml
from linter.errors import WeirError

BILLION_LAUGHS = """\
contract: laughs
version: 1
observational_unit: one laugh
a: &a ["lol", "lol", "lol", "lol", "lol", "lol", "lol", "lol", "lol"]
b: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a]
c: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b]
d: &d [*c, *c, *c, *c, *c, *c, *c, *c, *c]
e: &e [*d, *d, *d, *d, *d, *d, *d, *d, *d]
f: &f [*e, *e, *e, *e, *e, *e, *e, *e, *e]
g: &g [*f, *f, *f, *f, *f, *f, *f, *f, *f]
h: &h [*g, *g, *g, *g, *g, *g, *g, *g, *g]
i: &i [*h, *h, *h, *h, *h, *h, *h, *h, *h]
variables: {x: {type: string, values: *i}}
"""


def test_billion_laughs_fails_fast(tmp_path: Path) -> None:
    # From memory of CWE-776 (entity expansion, "billion laughs"): nine levels of nine aliases expand
    # to 9**9 (387 million) strings; the loader must stop on its node budget, not build them.
    path = tmp_path / "laughs.yaml"
    path.write_text(BILLION_LAUGHS, encoding="utf-8")
    started = time.perf_counter()
    with pytest.raises(WeirError, match=r"^laughs\.yaml:\d+:\d+: contract expands to more than"):
        load_contract("laughs.yaml")
    assert time.perf_counter() - started < 5.0


def test_a_few_aliases_are_fine() -> None:
    tree = parse_yaml("a: &x [1, 2]\nb: *x\n", "c.yaml")
    assert isinstance(tree.value, dict)
    assert [n.value for n in tree.value["b"].value] == [1, 2]  # type: ignore[union-attr]


def test_alias_to_itself_is_refused() -> None:
    with pytest.raises(WeirError, match="refers to itself"):
        parse_yaml("a: &x [1, *x]\n", "c.yaml")


@pytest.mark.parametrize(
    "text",
    [
        "a: !!python/object/apply:os.system ['touch pwned']\n",
        "a: !!python/name:os.system\n",
        "a: !custom 3\n",
        "a: !!binary aGVsbG8=\n",
        "!!set {a, b}\n",
    ],
)
def test_tags_that_build_objects_are_refused(tmp_path: Path, text: str) -> None:
    with pytest.raises(WeirError, match=r"^c\.yaml:\d+:\d+: YAML tag .* is not allowed"):
        parse_yaml(text, "c.yaml")
    assert not (tmp_path / "pwned").exists()


def test_file_size_is_capped(tmp_path: Path) -> None:
    (tmp_path / "big.yaml").write_text("# " + "x" * MAX_FILE_BYTES + "\n", encoding="utf-8")
    with pytest.raises(WeirError, match=r"^big\.yaml:1:1: contract file is .* bytes; the limit is"):
        load_contract("big.yaml")


def test_non_utf8_contract(tmp_path: Path) -> None:
    (tmp_path / "w.yaml").write_bytes("contract: c\ntitle: caf\u00e9\n".encode("cp1252"))
    with pytest.raises(WeirError, match=r"^w\.yaml:2:1: contract file is not UTF-8"):
        load_contract("w.yaml")


def test_byte_order_mark_is_accepted(tmp_path: Path) -> None:
    text = "contract: c\nversion: 1\nobservational_unit: one row\nvariables: {a: string}\n"
    (tmp_path / "bom.yaml").write_bytes(b"\xef\xbb\xbf" + text.encode())
    assert load_contract("bom.yaml").id == "c"


def test_two_documents_are_refused() -> None:
    with pytest.raises(WeirError, match=r"^c\.yaml:\d+:\d+: broken YAML"):
        parse_yaml("a: 1\n---\nb: 2\n", "c.yaml")


def test_tab_indentation_reports_its_position() -> None:
    # From memory of YAML 1.2.2 §6.1: tabs are not allowed for indentation
    with pytest.raises(WeirError, match=r"^c\.yaml:2:1: broken YAML"):
        parse_yaml("a:\n\tb: 1\n", "c.yaml")


@pytest.mark.parametrize("depth", [50, 5000])
def test_deep_nesting_is_refused(tmp_path: Path, depth: int) -> None:
    (tmp_path / "deep.yaml").write_text("a: " + "[" * depth + "]" * depth + "\n", encoding="utf-8")
    with pytest.raises(WeirError, match=r"^deep\.yaml:\d+:\d+: contract nests deeper than"):
        load_contract("deep.yaml")
