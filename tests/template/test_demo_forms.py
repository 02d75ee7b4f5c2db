"""`make demo` step 5: a dictionary and a workbook for every demo contract, both opening cleanly."""

from __future__ import annotations

from pathlib import Path

import html5lib
from openpyxl import load_workbook
from template_files import REPO

from linter import demo
from linter.contract.load import load_contract


def test_every_demo_contract_gets_its_forms(tmp_path: Path) -> None:
    rows = demo.provider_forms(REPO / "sample_submissions", tmp_path)
    assert sorted(name for name, _, _ in rows) == sorted(p.stem for p in (REPO / "contracts").glob("*.yaml"))
    for name, spec, form in rows:
        assert (spec, form) == (0, 0)
        # Source: WHATWG HTML parsing rules via html5lib (strict mode raises on any parse error).
        html5lib.HTMLParser(strict=True).parse(
            (tmp_path / "forms" / f"{name}.html").read_text(encoding="utf-8")
        )
        tables = [t.name for t in load_contract(str(REPO / "contracts" / f"{name}.yaml")).tables]
        assert load_workbook(tmp_path / "forms" / f"{name}.xlsx").sheetnames[: len(tables)] == tables
