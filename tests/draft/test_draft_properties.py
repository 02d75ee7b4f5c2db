"""Property: any small tidy table, drafted as sent, passes its own draft (no error from any rule).

Text cells are written without spaces around them: a padded code is a finding by design (see
`test_padded_codes_are_named_at_the_top`)."""

from __future__ import annotations

import csv
import io
from pathlib import Path

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from linter.check import check_paths
from linter.contract.load import load_contract
from linter.draft.infer import draft_table
from linter.draft.samples import read_samples
from linter.draft.write import render_draft

CONTRACT_FAMILIES = {"columns", "values", "keys", "rows", "references", "header"}
NAMES = ("station", "reading", "analyte", "remark", "flow")
MISSING = st.sampled_from(["", "NA", "-999", "n/a", "."])
KINDS = {
    "integer": st.integers(-500, 500).map(str),
    "decimal": st.decimals(-100, 100, places=2, allow_nan=False).map(str),
    "censored": st.one_of(st.floats(0.01, 50).map(lambda x: f"{x:.3f}"), st.just("<0.05")),
    "date": st.dates().map(lambda d: d.isoformat()),
    "code": st.sampled_from(["NITRATE", "AMMONIUM", "J", "dry", "wet"]),
    "site": st.integers(0, 999).map(lambda n: f"VB-{n:03d}"),
    "text": st.text(alphabet="abc xyz,'é", min_size=1, max_size=12).filter(lambda t: t.strip() == t != ""),
    "flag": st.sampled_from(["true", "false"]),
}


@st.composite
def tables(draw: st.DrawFn) -> list[list[str]]:
    kinds = draw(st.lists(st.sampled_from(sorted(KINDS)), min_size=2, max_size=5))
    rows = draw(st.integers(2, 25))
    columns: list[list[str]] = []
    for kind in kinds:
        cells = st.one_of(KINDS[kind], MISSING) if draw(st.booleans()) else KINDS[kind]
        columns.append(draw(st.lists(cells, min_size=rows, max_size=rows)))
    # Distinct plain words: names with a shared stem and a counter are values in headers, by design.
    header = list(NAMES[: len(kinds)])
    return [header, *map(list, zip(*columns, strict=True))]


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(grid=tables())
def test_a_tidy_table_passes_its_own_draft(tmp_path: Path, grid: list[list[str]]) -> None:
    text = io.StringIO()
    csv.writer(text, lineterminator="\n").writerows(grid)
    sample = tmp_path / "sample.csv"
    sample.write_text(text.getvalue(), encoding="utf-8")
    if all(all(c.strip() == "" for c in row) for row in grid[1:]):
        return  # blank rows only: the reader drops them, nothing to draft
    files = render_draft(draft_table(read_samples([str(sample)], tidy=False)))
    contract_path = tmp_path / "contract.yaml"
    contract_path.write_text(files.contract)
    for relative, body in files.code_lists.items():
        (tmp_path / relative).parent.mkdir(parents=True, exist_ok=True)
        (tmp_path / relative).write_text(body)
    report = check_paths([str(sample)], [load_contract(str(contract_path))])
    # The contract rules are the draft's business; layout and unit rules judge the shape on their
    # own (a random table may well look like variables in rows), so they are left out here.
    errors = [
        (f.rule, f.message)
        for f in report.all_findings()
        if f.severity.value == "error" and f.rule.split(".")[0] in CONTRACT_FAMILIES
    ]
    assert errors == [], files.contract


def test_padded_codes_are_named_at_the_top(tmp_path: Path) -> None:
    sample = tmp_path / "sample.csv"
    sample.write_text("site_id,analyte\nVB-001,NITRATE\nVB-002,NITRATE \nVB-003,AMMONIUM\nVB-004,AMMONIUM\n")
    draft = draft_table(read_samples([str(sample)], tidy=False))
    analyte = draft.variable("analyte")
    assert analyte is not None and analyte.values == ("AMMONIUM", "NITRATE") and analyte.padded == 1
    assert any("analyte (1 cell)" in note for note in draft.notes)
    assert "analyte (1 cell)" in render_draft(draft).contract.split("contract:", 1)[0]
