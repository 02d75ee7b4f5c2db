"""`weir diff`: a planted set of contract changes, each classified, and each breaking one shown to break."""

from __future__ import annotations

import json
from pathlib import Path

import pytest
from typer.testing import CliRunner

from linter.cli import app
from linter.contract.load import load_contract
from linter.draft.diff import contract_changes, provider_summary

REPO = Path(__file__).resolve().parents[2]

OLD = """\
contract: stream-chemistry
version: 2
title: Monthly stream chemistry results from partner laboratories
observational_unit: one analyte measured in one water sample
applies_to: ["chemistry*.csv"]
keys: [site_id, sampled_on, analyte]
variables:
  site_id: {type: string, pattern: '^VB-\\d{3}$'}
  sampled_on: {type: date}
  analyte: {type: category, values: [NITRATE, AMMONIUM, PHOSPHATE]}
  result: {type: number, min: 0, max: 100, unit: mg/L, censored_prefix: "<"}
  qualifier: {type: category, values: [J, U], required: false}
missing: ["", "NA"]
extra_columns: warn
"""
HEADER = "site_id,sampled_on,analyte,result,qualifier\n"
BASE = HEADER + "VB-001,2026-03-03,NITRATE,50,\n"

# (edit of the old text: old -> new, expected kind, breaking?, a file that passes OLD and fails NEW)
PLANTED: list[tuple[str, str, str, bool, str | None]] = [
    ("  qualifier:", "  lab_id: {type: string}\n  qualifier:", "variable-added", True, BASE),
    ("  qualifier:", "  note: {type: string, required: false}\n  qualifier:", "variable-added", False, None),
    ("max: 100", "max: 40", "max-lowered", True, BASE),
    ("max: 100", "max: 500", "max-raised", False, None),
    ("min: 0,", "min: 1,", "min-raised", True, HEADER + "VB-001,2026-03-03,NITRATE,0.5,\n"),
    ("min: 0, ", "", "min-removed", False, None),
    (
        "NITRATE, AMMONIUM, PHOSPHATE",
        "NITRATE, AMMONIUM",
        "codes-removed",
        True,
        HEADER + "VB-001,2026-03-03,PHOSPHATE,0.1,\n",
    ),
    ("NITRATE, AMMONIUM, PHOSPHATE", "NITRATE, AMMONIUM, PHOSPHATE, CHLORIDE", "codes-added", False, None),
    (
        "keys: [site_id, sampled_on, analyte]",
        "keys: [site_id, sampled_on, analyte, result]",
        "keys-changed",
        True,
        HEADER + "VB-001,2026-03-03,NITRATE,,\n",
    ),
    (
        "keys: [site_id, sampled_on, analyte]",
        "keys: [site_id, analyte]",
        "keys-changed",
        True,
        HEADER + "VB-001,2026-03-03,NITRATE,1,\nVB-001,2026-03-10,NITRATE,2,\n",
    ),
    ("'^VB-\\d{3}$'", "'^VB-0\\d{2}$'", "pattern-changed", True, HEADER + "VB-123,2026-03-03,NITRATE,5,\n"),
    (", pattern: '^VB-\\d{3}$'", "", "pattern-removed", False, None),
    (
        "unit: mg/L,",
        "unit: mg/L, nullable: false,",
        "nullable-changed",
        True,
        HEADER + "VB-001,2026-03-03,NITRATE,,\n",
    ),
    (
        "values: [J, U], required: false",
        "values: [J, U]",
        "required-changed",
        True,
        "site_id,sampled_on,analyte,result\nVB-001,2026-03-03,NITRATE,5\n",
    ),
    (
        "result: {type: number",
        "result: {type: integer",
        "type-changed",
        True,
        HEADER + "VB-001,2026-03-03,NITRATE,50.5,\n",
    ),
    ("qualifier: {type: category, values: [J, U],", "qualifier: {type: string,", "type-changed", False, None),
    (
        'missing: ["", "NA"]',
        'missing: [""]',
        "missing-removed",
        True,
        HEADER + "VB-001,2026-03-03,NITRATE,NA,\n",
    ),
    ('missing: ["", "NA"]', 'missing: ["", "NA", "-999"]', "missing-added", False, None),
    (
        "extra_columns: warn",
        'extra_columns: warn\nrules: ["result <= 90"]',
        "rule-added",
        True,
        HEADER + "VB-001,2026-03-03,NITRATE,95,\n",
    ),
    (
        "extra_columns: warn",
        "extra_columns: error",
        "extra-columns-tightened",
        True,
        HEADER.rstrip("\n") + ",received_by\nVB-001,2026-03-03,NITRATE,5,,AB\n",
    ),
    ("extra_columns: warn", "extra_columns: allow", "extra-columns-loosened", False, None),
    ("extra_columns: warn", "extra_columns: warn\ncolumn_order: true", "order-changed", False, None),
    (
        'applies_to: ["chemistry*.csv"]',
        'applies_to: ["chemistry*.csv", "chemistry*.xlsx"]',
        "file-names-changed",
        False,
        None,
    ),
    # A plain 5 passes both: a new unit changes what every number means, which no check can see.
    ("unit: mg/L", "unit: ug/L", "unit-changed", True, None),
    (', censored_prefix: "<"', "", "censoring-changed", True, HEADER + "VB-001,2026-03-03,NITRATE,<0.05,\n"),
    (
        "sampled_on: {type: date}",
        "sampled_on: {type: date, date_format: '%d/%m/%Y'}",
        "date-format-changed",
        True,
        BASE,
    ),
]
ALSO = {
    "keys: [site_id, sampled_on, analyte, result]": [("nullable-changed", True)],
    "keys: [site_id, analyte]": [("nullable-changed", False)],
}
"""Changes that come with a planted one: a key column may never be empty, a former one may."""
IDS = [
    f"{kind}-{'breaking' if breaking else 'compatible'}-{n}"
    for n, (_, _, kind, breaking, _) in enumerate(PLANTED)
]


def write(path: Path, text: str) -> str:
    path.write_text(text)
    return str(path)


def verdict(file: str, contract: str) -> int:
    return CliRunner().invoke(app, ["check", file, "-c", contract]).exit_code


@pytest.mark.parametrize(("old", "new", "kind", "breaking", "witness"), PLANTED, ids=IDS)
def test_each_planted_change_is_classified_and_breaking_ones_really_break(
    tmp_path: Path, old: str, new: str, kind: str, breaking: bool, witness: str | None
) -> None:
    assert OLD.count(old) >= 1
    old_path = write(tmp_path / "old.yaml", OLD)
    new_path = write(tmp_path / "new.yaml", OLD.replace(old, new, 1).replace("version: 2", "version: 3"))
    changes = contract_changes(load_contract(old_path), load_contract(new_path))
    expected = sorted([(kind, breaking), *ALSO.get(new, [])])
    assert sorted((c.what, c.breaking) for c in changes) == expected
    result = CliRunner().invoke(app, ["diff", old_path, new_path])
    assert result.exit_code == (1 if breaking else 0), result.output
    sample = write(tmp_path / "chemistry-sample.csv", witness or BASE)
    assert verdict(sample, old_path) == 0  # the file was acceptable before
    if witness is not None:
        assert verdict(sample, new_path) == 1  # ...and the change really returns it
    elif not breaking:
        assert verdict(sample, new_path) == 0


def test_no_change_is_exit_0_and_says_so(tmp_path: Path) -> None:
    old_path = write(tmp_path / "old.yaml", OLD)
    new_path = write(tmp_path / "new.yaml", OLD)
    result = CliRunner().invoke(app, ["diff", old_path, new_path])
    assert result.exit_code == 0
    assert "Nothing changed that affects your files." in result.output


def test_provider_summary_lists_what_to_change_first_and_flags_an_unbumped_version(tmp_path: Path) -> None:
    old = load_contract(write(tmp_path / "old.yaml", OLD))
    changed = OLD.replace("max: 100", "max: 40").replace("PHOSPHATE]", "PHOSPHATE, CHLORIDE]")
    new = load_contract(write(tmp_path / "new.yaml", changed))
    text = provider_summary(old, new, contract_changes(old, new))
    must, may = text.index("What you must change"), text.index("What you may do")
    assert must < may
    assert "max is now 40 (was 100)" in text[must:may]
    assert "CHLORIDE" in text[may:]
    assert "the version is still 2" in text


def test_against_counts_earlier_accepted_files_that_would_now_fail(tmp_path: Path) -> None:
    folder = tmp_path / "accepted"
    folder.mkdir()
    write(
        folder / "chemistry-a.csv", HEADER + "VB-001,2026-03-03,NITRATE,50,\nVB-002,2026-03-03,NITRATE,5,\n"
    )
    write(folder / "chemistry-b.csv", HEADER + "VB-003,2026-03-03,AMMONIUM,3,J\n")
    write(folder / "chemistry-c.csv", HEADER + "VB-004,2026-03-03,PHOSPHATE,45,\n")
    old_path = write(tmp_path / "old.yaml", OLD)
    new_path = write(tmp_path / "new.yaml", OLD.replace("max: 100", "max: 40"))
    result = CliRunner().invoke(
        app, ["diff", old_path, new_path, "--against", str(folder), "--summary", "summary.txt"]
    )
    assert result.exit_code == 1
    # a (50) and c (45) are above the new max of 40; b (3) is not.
    assert "2 passed version 2 and would now fail" in result.output
    assert "chemistry-a.csv" in result.output and "chemistry-c.csv" in result.output
    assert "chemistry-b.csv" not in result.output.split("would now fail", 1)[1]
    assert "What you must change" in Path("summary.txt").read_text()


def test_against_the_demo_contract_and_clean_files_counts_none_for_a_compatible_change(
    tmp_path: Path,
) -> None:
    for name in ("stream-chemistry.yaml", "codes/analytes.yaml", "codes/qualifiers.csv"):
        target = tmp_path / name
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes((REPO / "contracts" / name).read_bytes())
    old_path = str(tmp_path / "stream-chemistry.yaml")
    new_text = (tmp_path / "stream-chemistry.yaml").read_text().replace("max: 2000", "max: 5000")
    new_path = write(tmp_path / "stream-chemistry-v3.yaml", new_text.replace("version: 2", "version: 3"))
    clean = REPO / "sample_submissions" / "clean"
    files = [
        str(clean / "chemistry-2026-03-aurora-lab.csv"),
        str(clean / "chemistry-2026-04-aurora-lab.xlsx"),
    ]
    args = ["diff", old_path, new_path, *(x for f in files for x in ("--against", f))]
    result = CliRunner().invoke(app, args)
    assert result.exit_code == 0, result.output
    assert "Checked 2 table(s) under version 3: 0 passed version 2 and would now fail" in result.output


@pytest.mark.parametrize("bad", ["missing.yaml", "broken"])
def test_a_bad_contract_is_one_line_and_exit_2(tmp_path: Path, bad: str) -> None:
    old_path = write(tmp_path / "old.yaml", OLD)
    other = str(tmp_path / bad) if bad == "missing.yaml" else write(tmp_path / "b.yaml", "contract: [x\n")
    result = CliRunner().invoke(app, ["diff", old_path, other])
    assert result.exit_code == 2
    assert "Traceback" not in result.output and len(result.output.strip().splitlines()) == 1


def test_json_lists_each_change_and_the_output_is_stable_between_runs(tmp_path: Path) -> None:
    old_path = write(tmp_path / "old.yaml", OLD)
    new_path = write(
        tmp_path / "new.yaml", OLD.replace("max: 100", "max: 40").replace("version: 2", "version: 3")
    )
    first = CliRunner().invoke(app, ["diff", old_path, new_path, "--json", "changes.json"])
    assert first.exit_code == 1
    assert first.output == CliRunner().invoke(app, ["diff", old_path, new_path]).output
    data = json.loads(Path("changes.json").read_text())
    assert (data["old_version"], data["new_version"], data["breaking"], data["compatible"]) == (
        "2",
        "3",
        1,
        0,
    )
    assert data["changes"][0]["kind"] == "max-lowered" and data["changes"][0]["subject"] == "result"
    refused = CliRunner().invoke(app, ["diff", old_path, new_path, "--json", new_path])
    assert refused.exit_code == 2 and Path(new_path).read_text().count("max: 40") == 1
