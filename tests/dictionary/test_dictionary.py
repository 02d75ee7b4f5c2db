"""The data dictionary says every rule of the contract in words, escapes everything, and renders."""

from __future__ import annotations

from pathlib import Path

import html5lib
import pytest
from markdown_it import MarkdownIt
from typer.testing import CliRunner

from linter.cli import app
from linter.contract.load import load_contract
from linter.dictionary import html, markdown
from linter.dictionary.facts import contract_facts

REPO = Path(__file__).resolve().parents[2]
DEMO = ("sites", "stream-chemistry", "field-sheets", "volunteer-bundle")
HOSTILE = r"""
contract: hostile
version: "2.10"
title: <script>alert(1)</script> & *not emphasis*
observational_unit: one <b>visit</b>
keys: [site_id]
variables:
  site_id: {type: string, pattern: '^VB-\d{3}$', description: "</dd><img src=x onerror=alert(1)>"}
  code: {type: category, values: {"<A>": "less & more", "B|C": "pipe `tick`"}}
  taken_on: {type: date, date_format: "%d/%m/%Y", min: 2021-02-01}
  level: {type: number, min: 0, max: 5, unit: m, censored_prefix: "<"}
rules: ["level < 4"]
missing: ["", "n/a"]
"""


def page_text(document: str) -> str:
    # Source: WHATWG HTML parsing rules, as implemented by html5lib (strict mode raises on any parse error).
    tree = html5lib.HTMLParser(strict=True, namespaceHTMLElements=False).parse(document)
    body = tree.find("body")
    assert body is not None
    return "".join(body.itertext())


@pytest.fixture()
def hostile(tmp_path: Path) -> Path:
    path = tmp_path / "hostile.yaml"
    path.write_text(HOSTILE, encoding="utf-8")
    return path


@pytest.mark.parametrize("name", DEMO)
def test_every_variable_and_every_code_is_in_the_page(name: str) -> None:
    contract = load_contract(str(REPO / "contracts" / f"{name}.yaml"))
    document = html.render(contract_facts(contract))
    for outside in ("http:", "https:", "src=", "url(", "@import", "<link", "<script"):
        assert outside not in document  # self-contained: nothing is fetched or run when the page opens
    text = page_text(document)
    assert f"version {contract.version}" in text
    for table in contract.tables:
        assert table.observational_unit in text
        assert len(contract.tables) == 1 or f"Table {table.name}" in text
        for variable in table.variables:
            assert variable.name in text
            for code in variable.codes.values if variable.codes else ():
                assert code in text and variable.codes.labels.get(code, "") in text


def test_plain_words_for_keys_rules_dates_and_censoring(hostile: Path) -> None:
    facts = contract_facts(load_contract(str(hostile)))
    table = facts.tables[0]
    assert table.key_sentence.startswith(
        "The key column is site_id. Each row is one <b>visit</b>, so site_id"
    )
    assert table.rules == ("In every row, level must be less than 4 (written: level < 4).",)
    said = {v.name: dict(v.facts) for v in table.variables}
    # The sample day 2026-03-14 written with the agreed strftime form %d/%m/%Y.
    assert said["taken_on"]["Format"].endswith("e.g. 14/03/2026")
    assert said["taken_on"]["Range"] == "on or after 2021-02-01"
    assert said["level"]["Range"] == "from 0 to 5 m, both included"
    assert "<0.05" in said["level"]["Below the limit"]
    assert "n/a" in said["level"]["Empty cells"]
    assert [c for c, _ in next(v for v in table.variables if v.name == "code").codes] == ["<A>", "B|C"]


def test_html_escapes_every_contract_value(hostile: Path) -> None:
    document = html.render(contract_facts(load_contract(str(hostile))))
    assert "<script>" not in document and "<img" not in document and "<b>" not in document
    text = page_text(document)
    for literal in ("<script>alert(1)</script>", "</dd><img src=x onerror=alert(1)>", "<A>", "less & more"):
        assert literal in text  # shown as written, never as markup


def test_markdown_renders_literally_under_commonmark(hostile: Path) -> None:
    source = markdown.render(contract_facts(load_contract(str(hostile))))
    # Source: CommonMark 0.31.2 (markdown-it-py's "commonmark" preset) plus its GFM-style table rule.
    rendered = MarkdownIt("commonmark").enable("table").render(source)
    assert "<script>" not in rendered and "<em>not emphasis</em>" not in rendered
    text = page_text(f"<!DOCTYPE html><html><head><title>t</title></head><body>{rendered}</body></html>")
    assert "*not emphasis*" in text and "^VB-\\d{3}$" in text
    assert "B|C" in text and "pipe `tick`" in text  # the pipe did not split the code table


def test_the_changes_section_appears_only_when_a_comparison_is_given() -> None:
    contract = load_contract(str(REPO / "contracts" / "sites.yaml"))
    assert "What changed" not in html.render(contract_facts(contract))
    shown = html.render(contract_facts(contract, changes=("county became a code list",)))
    assert "What changed since the previous version" in shown and "county became a code list" in shown


def test_cli_writes_html_and_markdown_by_suffix(tmp_path: Path) -> None:
    runner = CliRunner()
    contract = str(REPO / "contracts" / "stream-chemistry.yaml")
    assert runner.invoke(app, ["dictionary", contract, "--out", "spec.html"]).exit_code == 0
    assert runner.invoke(app, ["dictionary", contract, "--out", "spec.md"]).exit_code == 0
    assert (tmp_path / "spec.html").read_text(encoding="utf-8").startswith("<!DOCTYPE html>")
    assert (tmp_path / "spec.md").read_text(encoding="utf-8").startswith("# Monthly stream chemistry")
    shown = runner.invoke(app, ["dictionary", contract])
    assert shown.exit_code == 0 and "NITRATE" in shown.output


@pytest.mark.parametrize(
    ("arguments", "message"),
    [
        (["missing.yaml", "--out", "x.html"], "no such contract file"),
        (["CONTRACT", "--out", "x.pdf"], "name an .html or .md file"),
        (["CONTRACT", "--out", "CONTRACT"], "would overwrite a contract file"),
        (["broken.yaml", "--out", "x.html"], "broken.yaml:"),
    ],
)
def test_cli_bad_input_is_one_line_and_exit_2(tmp_path: Path, arguments: list[str], message: str) -> None:
    (tmp_path / "CONTRACT").write_text((REPO / "contracts" / "field-sheets.yaml").read_text(encoding="utf-8"))
    (tmp_path / "broken.yaml").write_text(
        "contract: x\nversion: 1\nobservational_unit: [\n", encoding="utf-8"
    )
    before = (tmp_path / "CONTRACT").read_bytes()
    result = CliRunner().invoke(app, ["dictionary", *arguments])
    assert result.exit_code == 2
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and message in lines[0] and "Traceback" not in result.output
    assert (tmp_path / "CONTRACT").read_bytes() == before
