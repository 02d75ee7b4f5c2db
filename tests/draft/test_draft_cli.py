"""`weir draft` at the edges: bad input is one line and exit 2, inputs are never touched, untidy files."""

from __future__ import annotations

import hashlib
from pathlib import Path

import pytest
from typer.testing import CliRunner

from linter.cli import app
from linter.contract.load import load_contract

REPO = Path(__file__).resolve().parents[2]


def run(*args: str) -> tuple[int, str]:
    result = CliRunner().invoke(app, list(args))
    return result.exit_code, result.output


def one_line_error(code: int, output: str) -> bool:
    return code == 2 and "Traceback" not in output and len(output.strip().splitlines()) == 1


@pytest.mark.parametrize(
    ("content", "name"),
    [
        (b"", "empty.csv"),
        (b"%PDF-1.7\n%\xe2\xe3\xcf\xd3\n1 0 obj\n", "report.csv"),
        (b"site_id,ph\n", "header-only.csv"),
    ],
)
def test_a_file_with_nothing_to_draft_from_is_one_line(tmp_path: Path, content: bytes, name: str) -> None:
    (tmp_path / name).write_bytes(content)
    assert one_line_error(*run("draft", str(tmp_path / name)))


def test_bad_arguments_are_one_line(tmp_path: Path) -> None:
    sample = tmp_path / "sites.csv"
    sample.write_text("site_id,ph\nVB-001,7.1\nVB-002,7.2\n")
    assert one_line_error(*run("draft", str(tmp_path / "absent.csv")))
    assert one_line_error(*run("draft", str(sample), "--write"))
    assert one_line_error(*run("draft", str(sample), "--out", "a.yaml", "--update", "b.yaml"))
    assert one_line_error(*run("draft", str(sample), "--update", "no-such-contract.yaml"))
    assert one_line_error(*run("draft", str(sample), "--name", "stream chemistry"))
    code, output = run("draft", str(sample), "--name", "vell-sites")
    assert code == 0 and "contract: vell-sites" in output


def test_an_existing_contract_or_a_sample_file_is_never_overwritten(tmp_path: Path) -> None:
    sample = tmp_path / "sites.csv"
    sample.write_text("site_id,ph\nVB-001,7.1\nVB-002,7.2\n")
    existing = tmp_path / "contract.yaml"
    existing.write_text("# the data manager's work\n")
    assert one_line_error(*run("draft", str(sample), "--out", str(existing)))
    assert existing.read_text() == "# the data manager's work\n"
    assert one_line_error(*run("draft", str(sample), "--out", str(sample)))
    assert sample.read_text() == "site_id,ph\nVB-001,7.1\nVB-002,7.2\n"


def test_drafting_leaves_every_sample_file_byte_for_byte(tmp_path: Path) -> None:
    clean = REPO / "sample_submissions" / "clean"
    files = sorted(p for p in clean.iterdir() if p.suffix in (".csv", ".xlsx"))
    before = {p: hashlib.sha256(p.read_bytes()).hexdigest() for p in files}
    assert run("draft", str(files[0]), "--out", "one.yaml")[0] == 0
    assert run("draft", str(clean / "sites-register-2026.csv"), "--update", "one.yaml")[0] == 0
    assert {p: hashlib.sha256(p.read_bytes()).hexdigest() for p in files} == before


def test_the_same_files_give_the_same_contract_text() -> None:
    sample = REPO / "sample_submissions" / "clean" / "field-sheets-2026-q1-willowbank-volunteers.csv"
    first, second = run("draft", str(sample)), run("draft", str(sample))
    assert first == second and first[0] == 0
    assert "# unique over 9 rows; no smaller unique set" in first[1]


def test_an_untidy_file_is_drafted_in_its_tidy_layout_and_names_the_recipe(tmp_path: Path) -> None:
    wide = tmp_path / "nitrate-2026.csv"
    wide.write_text(
        "site_id,Jan,Feb,Mar,Apr\nVB-001,1.2,1.4,1.1,1.3\nVB-002,0.8,0.9,1.0,1.1\nVB-003,2.1,2.0,1.9,2.2\n"
    )
    code, output = run("draft", str(wide), "--out", "nitrate.yaml")
    assert code == 0, output
    text = Path("nitrate.yaml").read_text()
    assert "is not tidy as sent" in text and '"step": "gather"' in text
    table = load_contract("nitrate.yaml").tables[0]
    assert table.names == ("site_id", "month", "value")
    assert table.keys == ("site_id", "month")
    assert table.complete_over == ("site_id", "month")  # 3 sites x 4 months, all present
    # Drafted as sent, the month columns stay columns and the file passes its own draft.
    assert run("draft", str(wide), "--as-sent", "--out", "as-sent.yaml")[0] == 0
    assert load_contract("as-sent.yaml").tables[0].names == ("site_id", "Jan", "Feb", "Mar", "Apr")
    assert run("check", str(wide), "-c", "as-sent.yaml")[0] == 0


def test_a_table_of_two_units_says_so_at_the_top() -> None:
    sample = REPO / "sample_submissions" / "units" / "vb_samples_with_sites.csv"
    code, output = run("draft", str(sample))
    assert code == 0
    header = output.split("contract:", 1)[0]
    assert "2 observational units" in header
    assert "sites (site_id, site_name, river, latitude, longitude; key site_id)" in header


def test_long_code_lists_go_to_their_own_file_beside_the_contract(tmp_path: Path) -> None:
    codes = [f"SP{chr(65 + i)}" for i in range(15)]
    rows = "\n".join(f"VB-{i:03d},{codes[i % 15]}" for i in range(60))
    sample = tmp_path / "species-2026.csv"
    sample.write_text("site_id,species\n" + rows + "\n")
    assert one_line_error(*run("draft", str(sample)))  # two files to write: --out is needed
    code, output = run("draft", str(sample), "--out", str(tmp_path / "out" / "species.yaml"))
    assert code == 0, output
    listed = tmp_path / "out" / "codes" / "species-species.yaml"
    assert listed.is_file()
    species = load_contract(str(tmp_path / "out" / "species.yaml")).tables[0].variable("species")
    assert species is not None and species.codes is not None
    assert species.codes.values == tuple(sorted(codes))
    assert run("check", str(sample), "-c", str(tmp_path / "out" / "species.yaml"))[0] == 0


def test_files_that_share_no_column_are_refused_in_one_line(tmp_path: Path) -> None:
    (tmp_path / "a.csv").write_text("site_id,ph\nVB-001,7.1\nVB-002,7.2\n")
    (tmp_path / "b.csv").write_text("lab,analyst\nAU,RT\nMR,JM\n")
    assert one_line_error(*run("draft", str(tmp_path / "a.csv"), str(tmp_path / "b.csv")))


def test_update_finds_the_table_of_a_bundle_by_its_file_globs(tmp_path: Path) -> None:
    bundle = tmp_path / "annual.yaml"
    bundle.write_text(
        "contract: vell-annual\n"
        'version: "2026.1"\n'
        "tables:\n"
        "  sites:  # the register\n"
        "    observational_unit: one site\n"
        '    applies_to: ["sites*.csv"]\n'
        "    keys: [site_id]\n"
        "    variables: {site_id: string, river: string}\n"
        "  visits:  # one row per visit\n"
        "    observational_unit: one visit\n"
        '    applies_to: ["visits*.csv"]\n'
        "    keys: [site_id, visited_on]\n"
        "    variables: {site_id: string, visited_on: date}\n"
    )
    visits = tmp_path / "visits-2026.csv"
    visits.write_text("site_id,visited_on,observer\nVB-001,2026-01-11,RT\nVB-002,2026-01-11,JM\n")
    code, output = run("draft", str(visits), "--update", str(bundle), "--write")
    assert code == 0, output
    table = load_contract(str(bundle)).table("visits")
    assert table is not None and "observer" in table.names
    assert load_contract(str(bundle)).table("sites").names == ("site_id", "river")  # type: ignore[union-attr]
    assert "# the register" in bundle.read_text() and "# one row per visit" in bundle.read_text()
    other = tmp_path / "counties-2026.csv"
    other.write_text("county\nALD\nBRK\n")
    assert one_line_error(*run("draft", str(other), "--update", str(bundle)))


def test_a_column_with_no_header_and_no_value_is_left_out_and_said(tmp_path: Path) -> None:
    sample = tmp_path / "ph-2026.csv"
    sample.write_text("site_id,,ph\nVB-001,,7.1\nVB-002,,7.3\nVB-003,,6.9\n")
    code, output = run("draft", str(sample), "--as-sent", "--out", "ph.yaml")
    assert code == 0, output
    text = Path("ph.yaml").read_text()
    assert "# Left out (column B): no header and no value in any row." in text
    assert load_contract("ph.yaml").tables[0].names == ("site_id", "ph")
    assert run("check", str(sample), "-c", "ph.yaml")[0] == 0  # the blank column is a warning only
