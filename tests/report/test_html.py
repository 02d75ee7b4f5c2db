"""The HTML letter: well-formed, self-contained, every submitted value escaped, every step sketched."""

from __future__ import annotations

import re
from dataclasses import replace

import html5lib
import pytest
from report_samples import HOSTILE_IMG, HOSTILE_SCRIPT

from linter.findings import Finding, Place, Severity
from linter.report import html
from linter.report.model import Report
from linter.report.sketch import sketch_for, svg

STEPS = [
    {"step": "drop_rows", "rows": [7, 8], "reason": "total"},
    {"step": "drop_columns", "columns": ["F"], "reason": "blank"},
    {"step": "transpose"},
    {"step": "header", "rows": [1, 2], "joiner": " "},
    {"step": "header", "rows": [], "names": ["site_id", "result"]},
    {"step": "lift_titles", "rows": [3, 9], "into": "section"},
    {"step": "fill_down", "columns": ["site"]},
    {
        "step": "gather",
        "columns": ["2019", "2020"],
        "names_to": "year",
        "values_to": "count",
        "keep_empty": True,
    },
    {"step": "gather_groups", "pattern": "^Sample (?P<sample>\\d+) (?P<member>.+)$", "names_to": "sample"},
    {"step": "spread", "names_from": "measure", "values_from": "value"},
    {"step": "split_column", "column": "result", "pattern": "x", "into": ["value", "unit"]},
    {"step": "explode", "column": "species", "separator": ";"},
    {"step": "add_row_id", "name": "row"},
    {"step": "rename", "columns": {"Temp (C)": "water_temp"}},
    {"step": "split_by_unit", "tables": [{"name": "sites"}, {"name": "samples"}]},
    {"step": "stack_files", "column": "month", "values": {"a.csv": "2026-01"}},
]


def parse_strict(text: str) -> object:
    # Source: WHATWG HTML parsing algorithm as implemented by html5lib; strict mode raises on any parse error
    return html5lib.HTMLParser(strict=True, namespaceHTMLElements=False).parse(text)


def test_letter_is_well_formed_and_self_contained(report: Report) -> None:
    text = html.render(report)
    tree = parse_strict(text)
    assert tree.find(".//script") is None  # type: ignore[attr-defined]
    linked = [e.tag for e in tree.iter() if {"src", "href"} & set(e.attrib)]  # type: ignore[attr-defined]
    assert linked == [], "a letter must not load or link anything"
    assert "<style>" in text and text.startswith("<!DOCTYPE html>")


def test_strict_parser_would_catch_broken_markup() -> None:
    with pytest.raises(html5lib.html5parser.ParseError):
        parse_strict("<!DOCTYPE html><html><body><p>a</b></body></html>")


def test_hostile_cells_are_text_not_markup(report: Report) -> None:
    text = html.render(report)
    assert HOSTILE_SCRIPT not in text and HOSTILE_IMG not in text
    assert "&lt;script&gt;window.__pwned = 1&lt;/script&gt;" in text
    tree = parse_strict(text)
    assert tree.find(".//img") is None  # type: ignore[attr-defined]
    cells = ["".join(td.itertext()) for td in tree.iter("td")]  # type: ignore[attr-defined]
    assert "✗ " + HOSTILE_SCRIPT in cells  # the reader sees the value as written, with its marker


def test_hostile_message_fix_file_and_rule_are_escaped(report: Report) -> None:
    evil = Finding(
        "values.x",
        Severity.ERROR,
        "Bad <b>bold</b> & more",
        Place('<i>f</i>".csv', "<sheet>", (2,), ("<col>",), ("A",)),
        fix="</section><script>x()</script>",
        examples=("<u>",),
        step={"step": "<svg onload=x()>", "columns": ["</pre>"]},
    )
    text = html.render(replace(report, findings=(evil,)))
    tree = parse_strict(text)
    for tag in ("b", "i", "u", "script", "col"):
        assert tree.find(f".//main//{tag}") is None, tag  # type: ignore[attr-defined]
    assert "Bad &lt;b&gt;bold&lt;/b&gt; &amp; more" in text


def test_findings_that_block_come_first_and_verdict_leads(report: Report) -> None:
    text = html.render(report)
    assert text.index("Returned:") < text.index("finding-1")
    badges = re.findall(r'<span class="badge">([^<]+)</span>', text)
    assert badges == ["Must fix", "Must fix", "Should fix", "For information"]
    accepted = replace(report, fail_on=Severity.ERROR, results=(replace(report.results[0], findings=()),))
    assert "Accepted:" in html.render(accepted)


@pytest.mark.parametrize("step", STEPS, ids=lambda s: str(s["step"]))
def test_every_step_has_its_own_sketch(step: dict[str, object]) -> None:
    picture = sketch_for(step)
    assert "reshaped by step" not in picture.caption  # not the fallback
    assert picture.before != picture.after or step["step"] == "rename"
    drawing = svg(step)
    parse_strict(f"<!DOCTYPE html><title>t</title>{drawing}")
    assert re.search(r'width="[1-9]\d*" height="[1-9]\d*"', drawing)


def test_unknown_or_malformed_steps_get_the_generic_sketch() -> None:
    assert "reshaped by step pivot_longer" in sketch_for({"step": "pivot_longer"}).caption
    assert sketch_for({"step": "rename", "columns": ["not", "a", "mapping"]}).caption
    assert "<" not in svg({"step": "<script>"}).split("<title>")[1].split("</title>")[0]


def test_layout_finding_shows_the_engines_pandas_code(report: Report) -> None:
    text = html.render(report)
    # the gather step of the sample is a pandas melt, written by the reshape engine's code generator
    assert "df.melt(id_vars=ids, value_vars=[&#x27;2019&#x27;, &#x27;2020&#x27;]" in text
    odd = Finding("layout.x", Severity.NOTE, "m", Place("f.csv"), step={"step": "not_a_step"})
    assert "in pandas" not in html.render(replace(report, results=(), findings=(odd,)))


def test_a_long_letter_spells_out_the_first_findings_and_lists_the_rest(report: Report) -> None:
    many = tuple(
        Finding(
            "values.x", Severity.WARNING, f"Problem <{i}>", Place("f.csv", None, (i + 2,), ("c",), ("A",))
        )
        for i in range(130)
    )
    tree = parse_strict(html.render(replace(report, results=(), findings=many)))
    sections = tree.findall(".//section")  # type: ignore[attr-defined]
    assert len(sections) == 101 and sections[-1].get("class") == "overflow"
    rows = sections[-1].findall(".//tbody/tr")
    assert len(rows) == 30
    assert ["".join(td.itertext()) for td in rows[0]] == [
        "101",
        "Should fix",
        "f.csv, row 102, c (column A)",
        "values.x",
        "Problem <100>",
    ]
