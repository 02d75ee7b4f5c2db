"""The HTML letter opened in a real headless Chromium: what a provider sees, and that nothing runs."""

from __future__ import annotations

from pathlib import Path

import pytest
from playwright.sync_api import BrowserContext, Page
from report_samples import HOSTILE_FORMULA, HOSTILE_IMG, HOSTILE_SCRIPT

from linter.report import html
from linter.report.model import Report

pytestmark = pytest.mark.browser


def open_letter(browser: BrowserContext, report: Report, tmp_path: Path) -> tuple[Page, list[str]]:
    path = tmp_path / "letter.html"
    path.write_text(html.render(report), encoding="utf-8")
    page = browser.new_page()
    errors: list[str] = []
    page.on("pageerror", lambda error: errors.append(str(error)))
    page.goto(path.as_uri())
    return page, errors


def test_reader_sees_verdict_marked_cells_and_sketch(
    browser: BrowserContext, report: Report, tmp_path: Path
) -> None:
    page, errors = open_letter(browser, report, tmp_path)
    assert page.locator("h1").inner_text().startswith("Returned:")
    marked = page.locator("td.bad").first
    assert marked.inner_text() == "✗ n/a"  # the value as written, after its text marker
    colour = marked.evaluate("cell => getComputedStyle(cell).backgroundColor")
    assert colour not in ("rgba(0, 0, 0, 0)", "rgb(255, 255, 255)")  # shaded as well as marked
    box = page.locator("svg.sketch").first.bounding_box()
    assert box is not None and box["width"] > 50 and box["height"] > 20
    assert errors == []


def test_hostile_cells_show_as_text_and_never_run(
    browser: BrowserContext, report: Report, tmp_path: Path
) -> None:
    # Source: OWASP XSS Prevention Cheat Sheet, rule 1: HTML-encode data put into element content
    page, errors = open_letter(browser, report, tmp_path)
    assert page.evaluate("typeof window.__pwned") == "undefined"
    assert page.locator("img").count() == 0
    assert page.locator("script").count() == 0
    assert page.locator("a").count() == 0  # =HYPERLINK(...) did not become a link
    texts = page.locator("td.bad").all_inner_texts()
    for hostile in (HOSTILE_SCRIPT, HOSTILE_IMG, HOSTILE_FORMULA):
        assert "✗ " + hostile in texts
    assert errors == []


def test_letter_prints_to_pdf_with_its_colours(
    browser: BrowserContext, report: Report, tmp_path: Path
) -> None:
    page, _ = open_letter(browser, report, tmp_path)
    page.emulate_media(media="print")
    assert page.locator("td.bad").first.evaluate("c => getComputedStyle(c).printColorAdjust") == "exact"
    pdf = page.pdf(format="A4")
    assert pdf.startswith(b"%PDF") and len(pdf) > 10_000
