"""The Markdown letter renders, under a CommonMark parser, to what the provider wrote and nothing more."""

from __future__ import annotations

from dataclasses import replace

import html5lib
import pytest
from markdown_it import MarkdownIt
from report_samples import HOSTILE_FORMULA, HOSTILE_IMG, HOSTILE_SCRIPT

from linter.findings import Finding, Place, Severity
from linter.report import markdown
from linter.report.model import Report


def rendered(text: str) -> object:
    # Source: CommonMark spec 0.31.2 (§2.4 backslash escapes, §6.6 raw HTML) as implemented by markdown-it-py,
    # with its GitHub-style table extension
    page = MarkdownIt("commonmark").enable("table").render(text)
    return html5lib.parse(page, namespaceHTMLElements=False)


@pytest.mark.parametrize(
    "value",
    [
        HOSTILE_SCRIPT,
        HOSTILE_IMG,
        HOSTILE_FORMULA,
        "*bold* _it_ `code` [x](y) a|b",
        "1. not a list",
        "# no heading",
        "&amp; stays",
        "back\\slash",
        "~~gone~~ <b>",
        "- item",
    ],
)
def test_any_value_comes_back_as_the_same_text(value: str) -> None:
    tree = rendered(f"Value: {markdown.md(value)}")
    paragraph = tree.find(".//p")  # type: ignore[attr-defined]
    assert paragraph is not None and len(list(paragraph)) == 0, "the value became markup"
    assert "".join(paragraph.itertext()) == f"Value: {value}"


def test_unescaped_value_would_become_markup() -> None:
    # Guards the test above: the same parser does turn raw values into markup
    assert rendered(f"Value: {HOSTILE_IMG}").find(".//img") is not None  # type: ignore[attr-defined]
    assert rendered("Value: *bold*").find(".//em") is not None  # type: ignore[attr-defined]


def test_letter_content_survives_rendering(report: Report) -> None:
    text = markdown.render(report)
    tree = rendered(text)
    assert "".join(tree.find(".//h1").itertext()).startswith("Returned:")  # type: ignore[attr-defined]
    for tag in ("script", "img", "a"):
        assert tree.find(f".//{tag}") is None, tag  # type: ignore[attr-defined]
    first_table = tree.find(".//table")  # type: ignore[attr-defined]
    cells = ["".join(td.itertext()) for td in first_table.iter("td")]
    assert "✗ n/a" in cells and "✗ " + HOSTILE_SCRIPT in cells and "VB-021" in cells
    headers = ["".join(th.itertext()) for th in first_table.iter("th")]
    assert headers == ["Row", "site_id (A)", "sampled_on (B)", "analyte (C)", "result (D)"]
    assert [h.text for h in tree.iter("h2")][:1] == ["1. Must fix: values.not-a-number"]  # type: ignore[attr-defined]


def test_layout_finding_has_text_sketch_and_recipe(report: Report) -> None:
    text = markdown.render(report)
    assert '"step": "gather"' in text
    assert "before" in text and "--->" in text
    tree = rendered(text)
    codes = ["".join(c.itertext()) for c in tree.iter("code")]  # type: ignore[attr-defined]
    assert any(c.startswith('{"weir_recipe": 1') for c in codes)


def test_backticks_in_a_step_cannot_close_the_fence(report: Report) -> None:
    sneaky = Finding(
        "layout.x", Severity.NOTE, "m", Place("f.csv"), step={"step": "rename", "columns": {"```": "<b>"}}
    )
    tree = rendered(markdown.render(replace(report, findings=(sneaky,))))
    assert tree.find(".//b") is None  # type: ignore[attr-defined]


def test_pandas_code_of_the_step_is_included(report: Report) -> None:
    tree = rendered(markdown.render(report))
    codes = ["".join(c.itertext()) for c in tree.iter("code")]  # type: ignore[attr-defined]
    assert any("df.melt(" in c for c in codes)


def test_a_long_markdown_letter_lists_the_rest_in_a_table(report: Report) -> None:
    many = tuple(
        Finding("values.x", Severity.NOTE, f"P|{i}", Place("f.csv", None, (i + 2,))) for i in range(103)
    )
    tree = rendered(markdown.render(replace(report, results=(), findings=many)))
    assert len(tree.findall(".//h2")) == 101  # type: ignore[attr-defined]
    last = tree.findall(".//table")[-1]  # type: ignore[attr-defined]
    assert ["".join(td.itertext()) for td in last.findall(".//tbody/tr")[-1]][-1] == "P|102"
