"""units.mixed and units.probable-entry-error on small invented Vell Basin tables."""

from __future__ import annotations

from pathlib import Path

import pandas as pd

from linter.contract.model import TableContract, Variable
from linter.findings import Finding
from linter.read import read_path
from linter.reshape.apply import apply_recipe
from linter.reshape.normalise import audit_split
from linter.reshape.recipe import Recipe
from linter.rules.subject import Subject
from linter.rules.units import mixed_unit_tables, probable_entry_errors
from linter.table import Table, first_row_header

SITES = {"VB-014": ("Vell", "52.10"), "VB-021": ("Marrow Beck", "52.31"), "VB-030": ("Vell", "52.40")}
DAYS = [f"2026-{m:02d}-05" for m in range(1, 9)]


def subject_of(grid: list[list[str | None]], contract: TableContract | None = None) -> Subject:
    frame = pd.DataFrame(grid, dtype=object)
    table = Table("vb_samples.csv", None, frame.where(frame.notna(), None), tuple(range(1, len(grid) + 1)))
    return Subject(table, first_row_header(table), contract)


def mixed_grid(days: list[str]) -> list[list[str | None]]:
    header: list[str | None] = ["site_id", "sampled_on", "river", "latitude", "nitrate"]
    rows: list[list[str | None]] = [header]
    for i, day in enumerate(days):
        for site, (river, lat) in SITES.items():
            rows.append([site, day, river, lat, f"{0.5 + 0.37 * i + len(rows) * 0.11:.2f}"])
    return rows


def only(findings: list[Finding]) -> Finding:
    assert len(findings) == 1, [f.message for f in findings]
    return findings[0]


def test_columns_that_describe_sites_are_reported_with_the_split() -> None:
    finding = only(list(mixed_unit_tables(subject_of(mixed_grid(DAYS)))))  # 24 rows: enough without contract
    assert finding.message.startswith("river, latitude depend only on site_id: they describe sites")
    assert finding.place.columns == ("site_id", "river", "latitude")
    assert finding.place.letters == ("A", "C", "D")
    assert finding.place.rows == (2, 5, 8, 11, 14, 17, 20, 23)  # every row of VB-014
    assert finding.count == 21  # 24 rows, 3 sites
    assert finding.step is not None and finding.step["step"] == "split_by_unit"
    assert finding.evidence["normal_form"] == "BCNF"


def test_the_suggested_split_applies_and_joins_back(repo: Path) -> None:
    (table,) = read_path(str(repo / "sample_submissions" / "units" / "vb_samples_with_sites.csv"))
    subject = Subject(table, first_row_header(table))
    finding = only(list(mixed_unit_tables(subject)))
    recipe = Recipe.from_json({"weir_recipe": 1, "steps": [finding.step]})
    reshaped = apply_recipe(table, recipe)
    assert {k: len(v) for k, v in reshaped.tables.items()} == {"vb_samples_with_sites": 30, "sites": 5}
    audit = audit_split(subject.frame.body, reshaped.tables, recipe.steps[0])  # type: ignore[arg-type]
    assert audit.lossless


def test_tidy_table_and_small_table_are_left_alone() -> None:
    tidy = [["site_id", "sampled_on", "nitrate"]] + [[*r[:2], r[4]] for r in mixed_grid(DAYS)[1:]]
    assert list(mixed_unit_tables(subject_of(tidy))) == []
    small = mixed_grid(DAYS[:2])  # 6 rows: too few for a contract-free claim
    assert list(mixed_unit_tables(subject_of(small))) == []
    contract = TableContract(
        "samples", "one water sample", ("site_id", "sampled_on"), tuple(Variable(n) for n in small[0] if n)
    )
    # A contract does not make six rows better evidence: chance dependencies are just as likely.
    assert list(mixed_unit_tables(subject_of(small, contract))) == []
    larger = mixed_grid(DAYS)
    assert only(list(mixed_unit_tables(subject_of(larger, contract)))).rule == "units.mixed"


def test_a_typing_slip_is_a_probable_entry_error() -> None:
    grid = mixed_grid(DAYS)
    grid[10][2] = "Vel"  # provider row 11: VB-014's river mistyped once
    finding = only(list(probable_entry_errors(subject_of(grid))))
    assert finding.place.rows == (11,)
    assert "river 'Vel' where the other rows of site_id VB-014 have 'Vell'" in finding.message
    assert finding.place.columns == ("site_id", "river")
    assert finding.evidence["g3"] == round(1 / 24, 6)


def test_random_measurements_raise_no_alarm() -> None:
    # Common practice (no source): independent measurements share no dependency; nothing to report.
    import numpy as np

    rng = np.random.default_rng(3)
    values = rng.integers(0, 4, size=(40, 4)).astype(str)
    grid: list[list[str | None]] = [["a", "b", "c", "d"], *[list(map(str, r)) for r in values]]
    assert list(mixed_unit_tables(subject_of(grid))) == []
    assert list(probable_entry_errors(subject_of(grid))) == []
