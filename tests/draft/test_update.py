"""`weir draft --update`: the data manager's edits and comments survive; only additions are proposed."""

from __future__ import annotations

from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app
from linter.contract.load import load_contract

REPO = Path(__file__).resolve().parents[2]

HAND_EDITED = """\
# Field sheets of the Vell Basin Water Network (edited by hand by the data manager).
contract: field-sheets   # agreed with the volunteer groups in January
version: "1.3"
title: Volunteer field readings, one visit per site per month
observational_unit: one volunteer visit to one site in one month
applies_to: ["field-sheets*.csv"]
keys: [site_id, month]
variables:
  # the site register lives elsewhere
  site_id: {type: string, pattern: '^VB-\\d{3}$'}
  month: {type: string, pattern: '^\\d{4}-(0[1-9]|1[0-2])$'}   # YYYY-MM
  ph:
    type: number
    min: 0    # the pH scale
    max: 14
  observer:
    type: category
    values: [RT, JM]   # initials, one per volunteer
missing: ["", "NA"]   # NA is what the paper form says
extra_columns: warn
"""

NEW_FILE = """\
site_id,month,ph,observer,turbidity_ntu
VB-004,2026-04,7.3,RT,12
VB-005,2026-04,n/a,KP,15
VB-006,2026-04,7.6,JM,9
"""


def run(*args: str) -> tuple[int, str]:
    result = CliRunner().invoke(app, list(args))
    return result.exit_code, result.output


def comment_lines(text: str) -> list[str]:
    return [line[line.index("#") :] for line in text.splitlines() if "#" in line]


def setup(tmp_path: Path) -> tuple[Path, Path]:
    contract = tmp_path / "field-sheets.yaml"
    contract.write_text(HAND_EDITED)
    sample = tmp_path / "field-sheets-2026-q2.csv"
    sample.write_text(NEW_FILE)
    return contract, sample


def test_update_shows_only_additions_and_changes_nothing_without_write(tmp_path: Path) -> None:
    contract, sample = setup(tmp_path)
    code, output = run("draft", str(sample), "--update", str(contract))
    assert code == 0, output
    assert contract.read_text() == HAND_EDITED  # shown, not written
    added = [line for line in output.splitlines() if line.startswith("+") and not line.startswith("+++")]
    removed = [line for line in output.splitlines() if line.startswith("-") and not line.startswith("---")]
    assert any("turbidity_ntu:" in line for line in added)
    assert any("KP" in line for line in added)
    assert any("n/a" in line for line in added)
    # Only the two lines that gain an item are rewritten; each comes back with its comment.
    assert len(removed) == 2
    assert all(comment_lines(r[1:])[0] in "".join(added) for r in removed)


def test_update_with_write_keeps_every_comment_and_every_edit(tmp_path: Path) -> None:
    contract, sample = setup(tmp_path)
    before = load_contract(str(contract)).tables[0]
    code, output = run("draft", str(sample), "--update", str(contract), "--write")
    assert code == 0, output
    text = contract.read_text()
    for comment in comment_lines(HAND_EDITED):
        assert comment in text, f"lost comment {comment!r}"
    after = load_contract(str(contract)).tables[0]
    for variable in before.variables:
        kept = after.variable(variable.name)
        assert kept is not None
        if variable.name != "observer":
            assert kept == variable.__class__(**{**kept.__dict__, "position": variable.position})
    observer = after.variable("observer")
    assert observer is not None and observer.codes is not None
    assert observer.codes.values == ("RT", "JM", "KP")  # the manager's order, then the new code
    turbidity = after.variable("turbidity_ntu")
    assert turbidity is not None and not turbidity.required and turbidity.unit == "NTU"
    assert after.missing == ("", "NA", "n/a")
    assert (after.keys, after.extra_columns) == (before.keys, before.extra_columns)
    # The file the additions came from now passes; a file without the new column still does too.
    assert run("check", str(sample), "-c", str(contract))[0] == 0
    old_style = tmp_path / "field-sheets-2026-q1.csv"
    old_style.write_text("site_id,month,ph,observer\nVB-004,2026-01,7.1,RT\n")
    assert run("check", str(old_style), "-c", str(contract))[0] == 0


def test_update_twice_proposes_nothing_the_second_time(tmp_path: Path) -> None:
    contract, sample = setup(tmp_path)
    assert run("draft", str(sample), "--update", str(contract), "--write")[0] == 0
    written = contract.read_text()
    code, output = run("draft", str(sample), "--update", str(contract))
    assert code == 0
    assert "nothing to add" in output
    assert contract.read_text() == written


def test_update_notes_values_outside_a_declared_range_without_changing_it(tmp_path: Path) -> None:
    contract, _ = setup(tmp_path)
    acid = tmp_path / "field-sheets-acid.csv"
    acid.write_text("site_id,month,ph,observer\nVB-004,2026-04,15.2,RT\nVB-005,2026-04,7.0,JM\n")
    code, output = run("draft", str(acid), "--update", str(contract), "--write")
    assert code == 0
    assert "15.2 seen, above the declared max 14" in output
    assert contract.read_text() == HAND_EDITED


def test_update_of_a_demo_contract_with_code_list_files_only_notes_new_codes(tmp_path: Path) -> None:
    for name in ("stream-chemistry.yaml", "codes/analytes.yaml", "codes/qualifiers.csv"):
        target = tmp_path / "contracts" / name
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes((REPO / "contracts" / name).read_bytes())
    contract = tmp_path / "contracts" / "stream-chemistry.yaml"
    original = contract.read_bytes()
    returned = REPO / "sample_submissions" / "returned" / "chemistry-2026-04-ferncliff-lab.xlsx"
    code, output = run("draft", str(returned), "--update", str(contract), "--write")
    assert code == 0, output
    assert "ZINC" in output and "codes/analytes.yaml" in output
    assert "only in spaces or letter case" in output  # "nitrate" is a variant, never a new code
    assert contract.read_bytes() == original
    assert (tmp_path / "contracts" / "codes" / "analytes.yaml").read_bytes() == (
        REPO / "contracts" / "codes" / "analytes.yaml"
    ).read_bytes()


def test_update_of_a_broken_contract_is_one_line_and_exit_2(tmp_path: Path) -> None:
    contract, sample = setup(tmp_path)
    contract.write_text("contract: x\nversion: 1\nvariables: [oops\n")
    result = CliRunner().invoke(app, ["draft", str(sample), "--update", str(contract)])
    assert result.exit_code == 2
    assert "Traceback" not in result.output
    assert len(result.output.strip().splitlines()) == 1


def test_update_of_a_one_line_variables_mapping_stays_one_line(tmp_path: Path) -> None:
    contract = tmp_path / "t.yaml"
    contract.write_text(
        "contract: t\nversion: 1\nobservational_unit: one site  # what a row is\n"
        "keys: [site_id]\nvariables: {site_id: string, ph: number}\n"
    )
    sample = tmp_path / "t-1.csv"
    sample.write_text("site_id,ph,river\nVB-001,7.1,Vell\nVB-002,7.2,Ash\n")
    code, output = run("draft", str(sample), "--update", str(contract), "--write")
    assert code == 0, output
    lines = contract.read_text().splitlines()
    assert lines[-1].startswith("variables: {site_id: string, ph: number, river: {")
    assert "# what a row is" in lines[2]
    assert run("check", str(sample), "-c", str(contract))[0] == 0


def test_a_single_missing_code_written_without_brackets_is_kept(tmp_path: Path) -> None:
    contract = tmp_path / "t.yaml"
    contract.write_text(
        "contract: t\nversion: 1\nobservational_unit: one site\nkeys: [site_id]\n"
        "variables:\n  site_id: string\n  ph: number\nmissing: NA\n"
    )
    sample = tmp_path / "t-1.csv"
    sample.write_text("site_id,ph\nVB-001,-999\nVB-002,NA\nVB-003,7.2\n")
    assert run("draft", str(sample), "--update", str(contract), "--write")[0] == 0
    assert load_contract(str(contract)).tables[0].missing == ("", "NA", "-999")
