"""The JSON report validates against its published schema and is deterministic."""

from __future__ import annotations

import json
from importlib import resources

import jsonschema
import pytest

from linter.findings import Finding, Place, Severity
from linter.report import json_report
from linter.report.model import Report, TableResult


def schema() -> dict:  # type: ignore[type-arg]
    text = resources.files("linter.report").joinpath("schema/report-v1.json").read_text("utf-8")
    return json.loads(text)  # type: ignore[no-any-return]


def sample_report() -> Report:
    finding = Finding(
        rule="values.out-of-range",
        severity=Severity.ERROR,
        message="pH above 14 in 2 rows.",
        place=Place("field.csv", None, (4, 9), ("ph",), ("D",)),
        count=2,
        examples=("15.2", "19"),
        fix="pH is between 0 and 14; check the meter calibration record.",
        evidence={"maximum": 14},
    )
    layout = Finding(
        rule="layout.values-in-headers",
        severity=Severity.WARNING,
        message="Headers 2024, 2025 are values of one variable.",
        place=Place("wide.csv", None, (1,), ("2024", "2025"), ("B", "C")),
        step={
            "step": "gather",
            "columns": ["2024", "2025"],
            "names_to": "year",
            "values_to": "value",
            "keep_empty": True,
        },
    )
    results = (
        TableResult(
            "field.csv",
            None,
            "0" * 64,
            "csv",
            10,
            5,
            "field-sheets",
            "1",
            "field-sheets",
            (finding,),
            "utf-8",
        ),
        TableResult("wide.csv", None, "f" * 64, "csv", 3, 3, None, None, None, (layout,), "utf-8"),
    )
    return Report("0.1.0", "2026-12-02T03:00:00+00:00", Severity.ERROR, results)


def test_schema_is_a_valid_2020_12_schema() -> None:
    # Source: JSON Schema 2020-12 meta-schema, as shipped by the jsonschema library.
    jsonschema.Draft202012Validator.check_schema(schema())


def test_report_validates_against_schema() -> None:
    document = json.loads(json_report.render(sample_report()))
    jsonschema.Draft202012Validator(schema(), format_checker=jsonschema.FormatChecker()).validate(document)
    assert document["verdict"] == "returned"
    assert document["counts"] == {"error": 1, "warning": 1, "note": 0}
    assert document["tables"][1]["verdict"] == "accepted"  # a warning alone does not return a file


def test_schema_rejects_a_finding_without_a_rule() -> None:
    document = json.loads(json_report.render(sample_report()))
    del document["tables"][0]["findings"][0]["rule"]
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate(document, schema())


def test_same_report_renders_byte_identical() -> None:
    assert json_report.render(sample_report()) == json_report.render(sample_report())
