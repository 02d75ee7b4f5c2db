"""A template filled in with valid values passes `weir check`; one planted bad value fails on that cell."""

from __future__ import annotations

from pathlib import Path

import pytest
from filling import BUNDLE_FILLS, FILLS, fill, fill_sheets, plant
from openpyxl import load_workbook

from linter.check import check_paths
from linter.contract.load import load_contract
from linter.findings import Finding, Severity
from linter.report.model import Report


def check(files: list[Path], contracts: list[Path]) -> Report:
    return check_paths([str(f) for f in files], [load_contract(str(c)) for c in contracts])


def filled_all(templates: dict[str, Path], folder: Path) -> dict[str, Path]:
    """The one-table demo templates filled with their valid rows."""
    return {
        name: fill(templates[name], folder / f"{name}-filled.xlsx", name, rows)
        for name, rows in FILLS.items()
    }


@pytest.fixture(scope="module")
def filled(templates: dict[str, Path], tmp_path_factory: pytest.TempPathFactory) -> dict[str, Path]:
    """All three templates filled with valid rows once; planting writes a new file beside them."""
    return filled_all(templates, tmp_path_factory.mktemp("filled"))


def every_finding(report: Report) -> list[Finding]:
    return [*report.findings, *(f for r in report.results for f in r.findings)]


def test_filled_templates_pass_with_no_finding(filled: dict[str, Path], demo_contracts: list[Path]) -> None:
    report = check(list(filled.values()), demo_contracts)
    assert every_finding(report) == []
    # Only the data sheets are tables, with exactly the rows typed in (examples and help sheets dropped).
    assert sorted((r.table, r.rows) for r in report.results) == sorted((n, len(FILLS[n])) for n in FILLS)


def test_the_bare_template_is_only_an_empty_table(
    templates: dict[str, Path], demo_contracts: list[Path]
) -> None:
    report = check([templates["sites"]], demo_contracts)
    assert [(r.sheet, r.rows) for r in report.results] == [("sites", 0)]
    assert {f.rule for f in every_finding(report)} == {"file.header-only"}  # nothing about examples or help


def test_a_changed_example_row_is_data_not_dropped(
    templates: dict[str, Path], demo_contracts: list[Path], tmp_path: Path
) -> None:
    filled = fill(templates["sites"], tmp_path / "sites.xlsx", "sites", FILLS["sites"])
    workbook = load_workbook(filled)
    workbook["sites"]["B2"] = "Otter Pool"  # the provider typed over the first example
    workbook.save(filled)
    report = check([filled], demo_contracts)
    assert report.results[0].rows == len(FILLS["sites"]) + 1  # kept: nothing the provider wrote is lost


def test_examples_are_still_recognised_after_a_column_is_added(
    templates: dict[str, Path], demo_contracts: list[Path], tmp_path: Path
) -> None:
    filled = fill(templates["sites"], tmp_path / "sites.xlsx", "sites", FILLS["sites"])
    workbook = load_workbook(filled)
    workbook["sites"]["I1"] = "remarks"
    workbook["sites"]["I4"] = "new footbridge"
    workbook.save(filled)
    report = check([filled], demo_contracts)
    assert report.results[0].rows == len(FILLS["sites"])  # examples dropped, the remark kept
    assert {f.rule for f in every_finding(report)} == {
        "columns.unexpected"
    }  # sites says extra_columns: error


def test_an_instructions_sheet_the_provider_edited_is_checked(
    templates: dict[str, Path], demo_contracts: list[Path], tmp_path: Path
) -> None:
    filled = fill(templates["sites"], tmp_path / "sites.xlsx", "sites", FILLS["sites"])
    workbook = load_workbook(filled)
    workbook["Instructions"]["A40"] = "VB-099 also visited"
    workbook.save(filled)
    sheets = {r.sheet for r in check([filled], demo_contracts).results}
    assert sheets == {"sites", "Instructions"}


# One planted value per kind of spreadsheet rule in each demo contract: (contract, cell, value, rule).
# Data rows start at row 4, below the two example rows.
PLANTED = [
    ("sites", "D5", "ALDERMOOR", "values.not-in-code-list"),  # list
    ("sites", "E4", 60.2, "values.out-of-range"),  # decimal range
    ("sites", "G5", "02/05/2019", "values.date-format"),  # date rule refuses text
    ("sites", "H4", "maybe", "values.wrong-type"),  # true/false list
    ("stream-chemistry", "C6", "NITRATES", "values.not-in-code-list"),
    ("stream-chemistry", "E4", "X", "values.not-in-code-list"),
    ("stream-chemistry", "F5", "KL2044188", "values.pattern-mismatch"),
    ("stream-chemistry", "B6", "2019-12-31", "values.out-of-range"),  # typed as a date below
    ("field-sheets", "F4", 14.5, "values.out-of-range"),
    ("field-sheets", "G5", "eleven", "values.wrong-type"),
    ("field-sheets", "C4", "2019-06-01", "values.out-of-range"),
]


@pytest.mark.parametrize(("name", "cell", "value", "rule"), PLANTED)
def test_one_planted_bad_value_fails_on_exactly_that_cell(
    filled: dict[str, Path],
    demo_contracts: list[Path],
    tmp_path: Path,
    name: str,
    cell: str,
    value: object,
    rule: str,
) -> None:
    from datetime import date

    typed = date.fromisoformat(value) if isinstance(value, str) and rule == "values.out-of-range" else value
    planted = plant(filled[name], tmp_path / f"{name}.xlsx", name, cell, typed)
    report = check([planted, *(p for n, p in filled.items() if n != name)], demo_contracts)
    found = every_finding(report)
    letter, row = cell[0], int(cell[1:])
    assert [(f.rule, f.place.rows, f.place.letters, f.place.sheet) for f in found] == [
        (rule, (row,), (letter,), name)
    ]
    assert found[0].severity is Severity.ERROR
    assert all(2 not in f.place.rows and 3 not in f.place.rows for f in found)  # examples never reported


@pytest.fixture(scope="module")
def bundle(templates: dict[str, Path], tmp_path_factory: pytest.TempPathFactory) -> Path:
    return fill_sheets(
        templates["volunteer-bundle"], tmp_path_factory.mktemp("bundle") / "group.xlsx", BUNDLE_FILLS
    )


def test_the_filled_demo_bundle_passes_in_one_workbook(bundle: Path, demo_contracts: list[Path]) -> None:
    report = check([bundle], demo_contracts)
    assert every_finding(report) == []
    assert sorted((r.table, r.rows) for r in report.results) == sorted(
        (n, len(r)) for n, r in BUNDLE_FILLS.items()
    )


BUNDLE_PLANTED = [
    ("visited_sites", "C5", 50.9, "values.out-of-range"),  # decimal range
    ("visited_sites", "B4", None, "values.missing"),  # a required cell left empty
    ("samples", "B6", "09/04/2026", "values.date-format"),  # date rule refuses text
    ("samples", "C4", -0.5, "values.out-of-range"),  # decimal with a minimum only
]


@pytest.mark.parametrize(("sheet", "cell", "value", "rule"), BUNDLE_PLANTED)
def test_one_planted_bad_value_in_the_bundle_fails_on_that_cell(
    bundle: Path, demo_contracts: list[Path], tmp_path: Path, sheet: str, cell: str, value: object, rule: str
) -> None:
    planted = plant(bundle, tmp_path / "planted.xlsx", sheet, cell, value)
    found = every_finding(check([planted], demo_contracts))
    assert [(f.rule, f.place.rows, f.place.letters, f.place.sheet) for f in found] == [
        (rule, (int(cell[1:]),), (cell[0],), sheet)
    ]
