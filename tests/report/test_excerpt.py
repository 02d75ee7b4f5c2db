"""Excerpts show the rows a finding names, its cells marked, the key columns alongside."""

from __future__ import annotations

import json
from importlib import resources
from pathlib import Path

import jsonschema
import pytest
from report_samples import CHEMISTRY, chemistry_findings, make_frame

import linter.check
from linter.contract.model import Contract, TableContract
from linter.findings import Finding, Place, Severity
from linter.report import json_report
from linter.report.excerpt import attach_excerpts
from linter.report.model import Report
from linter.rules.subject import Subject


def test_excerpt_shows_named_rows_with_keys_and_marks_only_the_finding_cells() -> None:
    frame = make_frame(CHEMISTRY)
    found = attach_excerpts(chemistry_findings()[:1], frame, 2, ("site_id", "sampled_on", "analyte"))
    excerpt = found[0].excerpt
    assert excerpt is not None
    assert excerpt.columns == ("site_id", "sampled_on", "analyte", "result")
    assert excerpt.letters == ("A", "B", "C", "D")
    assert [r.row for r in excerpt.rows] == [4, 5]  # capped at two of the four named rows
    assert excerpt.rows[0].cells == ("VB-021", "2026-03-03", "nitrate", "n/a")
    assert excerpt.rows[0].marked == (False, False, False, True)


def test_columns_are_found_by_letter_when_header_names_repeat() -> None:
    frame = make_frame([["site_id", "result", "result"], ["VB-014", "1", "oops"]])
    finding = Finding(
        "values.not-a-number", Severity.ERROR, "x", Place(frame.table.source, None, (2,), ("result",), ("C",))
    )
    excerpt = attach_excerpts([finding], frame, 5, ("site_id",))[0].excerpt
    assert excerpt is not None
    assert excerpt.letters == ("A", "C")
    assert excerpt.rows[0].cells == ("VB-014", "oops")


def test_no_excerpt_without_rows_or_for_another_file_or_header_only() -> None:
    frame = make_frame(CHEMISTRY)
    no_rows = Finding(
        "values.x", Severity.NOTE, "x", Place(frame.table.source, None, (), ("result",), ("D",))
    )
    other = Finding("values.x", Severity.NOTE, "x", Place("other.csv", None, (2,), ("result",), ("D",)))
    header = Finding(
        "layout.x", Severity.NOTE, "x", Place(frame.table.source, None, (1,), ("result",), ("D",))
    )
    missing_column = Finding(
        "values.x", Severity.NOTE, "x", Place(frame.table.source, None, (2,), ("depth",), ())
    )
    assert all(f.excerpt is None for f in attach_excerpts([no_rows, other, header, missing_column], frame))


def test_empty_cells_stay_empty_not_nan() -> None:
    frame = make_frame(CHEMISTRY)
    found = attach_excerpts(chemistry_findings()[2:3], frame, 5)
    assert found[0].excerpt is not None
    assert found[0].excerpt.rows[0].cells == (None,)


def test_json_report_with_excerpts_validates_against_its_schema(report: Report) -> None:
    # Source: the project's own report schema, checked by jsonschema's Draft 2020-12 validator
    schema = json.loads(resources.files("linter.report").joinpath("schema/report-v1.json").read_text())
    document = json.loads(json_report.render(report))
    jsonschema.Draft202012Validator(schema).validate(document)
    excerpt = document["tables"][0]["findings"][0]["excerpt"]
    assert excerpt["rows"][0]["marked"] == [False, False, False, True]
    document["tables"][0]["findings"][0]["excerpt"]["rows"][0]["colour"] = "red"
    assert not jsonschema.Draft202012Validator(schema).is_valid(document)  # additionalProperties holds


def test_pipeline_attaches_excerpts_with_the_contract_keys(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    frame = make_frame(CHEMISTRY)
    (tmp_path / frame.table.source).write_text("stand-in bytes for the hash")
    monkeypatch.setattr(linter.check, "read_path", lambda path, limits=None: [frame.table])

    def negative_results(subject: Subject) -> list[Finding]:
        return [
            Finding(
                "values.out-of-range",
                Severity.WARNING,
                "negative",
                Place(subject.table.source, None, (3,), ("result",), ("D",)),
            )
        ]

    monkeypatch.setattr(linter.check, "INSPECTORS", {"tests.negative_results": negative_results})
    contract = Contract(
        "stream-chemistry",
        "2",
        "t",
        (
            TableContract(
                "stream-chemistry", "one analyte in one sample", ("site_id", "sampled_on", "analyte"), ()
            ),
        ),
    )
    report = linter.check.check_paths([frame.table.source], [contract])
    excerpt = report.results[0].findings[0].excerpt
    assert excerpt is not None
    assert excerpt.columns == ("site_id", "sampled_on", "analyte", "result")
    assert excerpt.rows[0].cells == ("VB-014", "2026-03-02", "phosphate", "-0.4")
