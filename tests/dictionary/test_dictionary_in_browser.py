"""The data dictionary opened in a real headless Chromium: what a provider sees, and that it prints."""

from __future__ import annotations

from pathlib import Path

import pytest
from playwright.sync_api import BrowserContext

from linter.contract.load import load_contract
from linter.dictionary import html
from linter.dictionary.facts import contract_facts

pytestmark = pytest.mark.browser
REPO = Path(__file__).resolve().parents[2]


@pytest.mark.parametrize("name", ["sites", "stream-chemistry", "field-sheets", "volunteer-bundle"])
def test_a_reader_sees_every_variable_and_every_code(
    browser: BrowserContext, tmp_path: Path, name: str
) -> None:
    contract = load_contract(str(REPO / "contracts" / f"{name}.yaml"))
    path = tmp_path / "spec.html"
    path.write_text(html.render(contract_facts(contract)), encoding="utf-8")
    page = browser.new_page()
    errors: list[str] = []
    page.on("pageerror", lambda error: errors.append(str(error)))
    page.goto(path.as_uri())
    for table in contract.tables:
        within = page.locator(f'section.table[data-table="{table.name}"]')
        shown = [n.strip() for n in within.locator("section.variable h3 code.name").all_inner_texts()]
        assert shown == list(table.names)  # every variable of every table, in the declared order
        for variable in table.variables:
            section = within.locator(f'section.variable[data-variable="{variable.name}"]')
            assert section.is_visible()
            if variable.codes is not None:
                codes = [c.strip() for c in section.locator("code.code").all_inner_texts()]
                assert codes == list(variable.codes.values)  # the list is complete, nothing hidden
                for label in variable.codes.labels.values():
                    assert label in section.inner_text()
    assert page.locator("strong.version").inner_text() == contract.version
    assert page.evaluate("document.scripts.length") == 0 and errors == []
    pdf = page.pdf(format="A4")  # printable: Chromium's own print pipeline lays it out
    assert pdf.startswith(b"%PDF") and len(pdf) > 5000
    page.close()
