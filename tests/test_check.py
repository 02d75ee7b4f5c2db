"""The check pipeline's own logic: which files are submitted and which contract governs each."""

from __future__ import annotations

from pathlib import Path

import pandas as pd

from linter.check import governing, run_inspectors, submitted_files
from linter.contract.model import Contract, TableContract
from linter.findings import Severity
from linter.rules import registry
from linter.rules.subject import Subject
from linter.table import Table, first_row_header


def table_contract(name: str, globs: tuple[str, ...]) -> TableContract:
    return TableContract(name=name, observational_unit="one thing", keys=(), variables=(), applies_to=globs)


def test_folders_expand_to_supported_files_in_order(tmp_path: Path) -> None:
    (tmp_path / "b").mkdir()
    for name in ["b/z.csv", "a.xlsx", "notes.pdf", "b/y.parquet", ".hidden/x.csv"]:
        (tmp_path / name).parent.mkdir(parents=True, exist_ok=True)
        (tmp_path / name).write_text("x")
    found = [Path(p).relative_to(tmp_path).as_posix() for p in submitted_files([str(tmp_path)])]
    assert found == ["a.xlsx", "b/y.parquet", "b/z.csv"]


def test_a_named_file_is_kept_even_with_an_odd_suffix(tmp_path: Path) -> None:
    # A provider who names a file explicitly gets an answer about it, whatever its suffix.
    assert submitted_files(["results.pdf"]) == ["results.pdf"]


def test_contract_table_chosen_by_glob() -> None:
    contract = Contract(
        "bundle",
        "1",
        "t",
        (table_contract("sites", ("sites*.csv",)), table_contract("results", ("chem/*.csv",))),
    )
    assert governing("inbox/sites-2026.csv", [contract])[1].name == "sites"  # type: ignore[union-attr]
    assert governing("inbox/chem/jan.csv", [contract])[1].name == "results"  # type: ignore[union-attr]
    assert governing("inbox/other.csv", [contract]) == (None, None)


def test_a_lone_one_table_contract_governs_every_named_file() -> None:
    contract = Contract("c", "1", "t", (table_contract("c", ("never-matches-*.csv",)),))
    assert governing("anything.csv", [contract])[1] is contract.tables[0]


def test_a_crashing_inspector_becomes_a_finding_and_others_still_run(monkeypatch) -> None:
    def broken(subject: Subject):  # type: ignore[no-untyped-def]
        raise ValueError("boom")

    def working(subject: Subject):  # type: ignore[no-untyped-def]
        from linter.findings import Finding, Place

        yield Finding("test.works", Severity.NOTE, "still ran", Place(subject.table.source))

    monkeypatch.setattr(registry, "INSPECTORS", {"t.broken": broken, "t.working": working})
    monkeypatch.setattr("linter.check.INSPECTORS", registry.INSPECTORS)
    grid = pd.DataFrame([["a"], ["1"]], dtype=object)
    table = Table("f.csv", None, grid, (1, 2))
    findings = run_inspectors(Subject(table, first_row_header(table)))
    assert {f.rule for f in findings} == {"weir.inspector-failed", "test.works"}
    failed = next(f for f in findings if f.rule == "weir.inspector-failed")
    assert "boom" in failed.message and failed.severity is Severity.ERROR
