"""The pre-screened fast path gives exactly the engine's findings, on data built to break every check."""

from __future__ import annotations

import csv
from pathlib import Path

import pyarrow as pa
import pytest
from scale_lab_data import bad_sites_first, csv_text, lab_rows

from linter.check import check_paths, narrowed
from linter.contract.load import load_contract
from linter.findings import Finding
from linter.report.model import Report
from linter.scale import fast_path
from linter.scale.fast_path import read_screened
from linter.scale.key_codes import duplicated_rows
from linter.scale.key_hash import LEADING_CELLS
from linter.scale.pieces import text_batches

# Rules that judge cells and keys row by row: the fast path must reproduce them exactly.
ROW_RULES = ("values.", "keys.", "columns.", "header.")


def row_findings(report: Report) -> list[Finding]:
    """Whole findings (message, place, count, examples, fix, evidence, excerpt) of the row rules."""
    return [f for r in report.results for f in r.findings if f.rule.startswith(ROW_RULES)]


def both_paths(path: Path, contract: Path, monkeypatch: pytest.MonkeyPatch, sample: int = 5):
    contracts = [load_contract(str(contract))]
    ordinary = check_paths([str(path)], contracts)
    monkeypatch.setattr(fast_path, "FAST_PATH_BYTES", 0)
    monkeypatch.setattr(fast_path, "SAMPLE_ROWS", sample)
    fast = check_paths([str(path)], contracts)
    return ordinary, fast


def test_fast_path_finds_exactly_what_the_engine_finds(tmp_path, contract_file, monkeypatch):
    path = tmp_path / "results-2026-03.csv"
    path.write_text(csv_text(lab_rows(600, seed=7, broken_every=13)), encoding="utf-8")
    screened = read_screened(str(path), load_contract(str(contract_file)).tables[0], 0, 5)
    assert screened is not None and screened.rows == 600
    # The screen really skipped rows, so identity below is not just the same table twice.
    assert len(screened.judged_rows) < 200
    ordinary, fast = both_paths(path, contract_file, monkeypatch)
    expected = row_findings(ordinary)
    assert len({f.rule for f in expected}) >= 8  # the planted breaks reach many rules
    assert row_findings(fast) == expected
    assert [r.rows for r in fast.results] == [r.rows for r in ordinary.results] == [600]
    assert fast.failed == ordinary.failed


@pytest.mark.parametrize("empty_analytes", [False, True])
def test_batches_longer_than_the_leading_cells_find_what_the_engine_finds(
    tmp_path, contract_file, monkeypatch, empty_analytes
):
    # Past key_hash.LEADING_CELLS rows a coded key (analyte) is hashed through its dictionary;
    # with every analyte left empty that dictionary holds no text at all.
    rows = lab_rows(LEADING_CELLS + 1500, seed=5, broken_every=41)
    for row in rows if empty_analytes else ():
        row[3] = ""
    path = tmp_path / "results-2026-05.csv"
    path.write_text(csv_text(rows), encoding="utf-8")
    ordinary, fast = both_paths(path, contract_file, monkeypatch)
    expected = row_findings(ordinary)
    # Empty key cells are reported as missing, not as keys the rows share.
    assert ("keys.missing" if empty_analytes else "keys.duplicate") in {f.rule for f in expected}
    assert row_findings(fast) == expected


@pytest.mark.parametrize(
    ("doubtful_site", "example_row"),
    [
        # The fix shows the column's first good value; here it lies far past the five-row sample.
        (None, 120),
        # The screen doubts a site written with Arabic-Indic digits (not ASCII), but the engine's
        # pattern VB-\d{3} reads them as digits: that cell, before the first good site, is the
        # column's first value in the agreed form, and so the example on both paths.
        ("VB-\u0661\u0662\u0663", 60),
    ],
)
def test_a_pattern_finding_quotes_the_columns_first_value_in_the_agreed_form(
    tmp_path, contract_file, monkeypatch, doubtful_site, example_row
):
    rows = bad_sites_first(300, 120, seed=9)
    if doubtful_site is not None:
        rows[example_row][1] = doubtful_site
    path = tmp_path / "results-2026-07.csv"
    path.write_text(csv_text(rows), encoding="utf-8")
    ordinary, fast = both_paths(path, contract_file, monkeypatch)
    expected = row_findings(ordinary)
    [pattern] = [f for f in expected if f.rule == "values.pattern-mismatch"]
    assert f"like {rows[example_row][1]!r}" in pattern.fix
    assert row_findings(fast) == expected


def test_each_column_is_judged_only_where_its_own_cell_is_in_doubt(tmp_path, contract_file, monkeypatch):
    rows = lab_rows(400, seed=11)
    rows[50][4], rows[50][7] = "1,420", "PIKE"  # two broken cells in one row
    rows[120][2] = "03/02/2026"
    rows[300] = list(rows[200])  # a shared key ...
    rows[300][1] = "vb-014"  # ... on a row whose site is broken too
    rows[310][0] = ""  # an empty key cell
    path = tmp_path / "results-2026-04.csv"
    path.write_text(csv_text(rows), encoding="utf-8")
    screened = read_screened(str(path), load_contract(str(contract_file)).tables[0], 0, 5)
    assert screened is not None
    first_good = 2  # provider line of the first body row, whose cells are all good
    parts = {p.columns: p.table.row_numbers[1:] for p in screened.parts}
    assert parts == {  # patterned columns (sample_id, site_id) with their first good cell, as example
        ("sample_id", "analyte"): (first_good, 202, 302, 312),
        ("site_id",): (first_good, 302),
        ("sampled_on",): (122,),
        ("result",): (52,),
        ("lab",): (52,),
    }
    ordinary, fast = both_paths(path, contract_file, monkeypatch)
    expected = row_findings(ordinary)
    assert {f.rule for f in expected} >= {"keys.duplicate", "keys.missing", "values.not-in-code-list"}
    assert row_findings(fast) == expected


def test_clean_file_keeps_only_the_sample(tmp_path, contract_file, monkeypatch):
    path = tmp_path / "results-clean.csv"
    path.write_text(csv_text(lab_rows(300, seed=3)), encoding="utf-8")
    screened = read_screened(str(path), load_contract(str(contract_file)).tables[0], 0, 5)
    assert screened is not None
    assert screened.suspect == 0 and screened.parts == ()  # nothing to judge
    assert screened.sample.row_numbers == (1, 2, 3, 4, 5, 6)
    ordinary, fast = both_paths(path, contract_file, monkeypatch)
    assert row_findings(fast) == row_findings(ordinary) == []


@pytest.mark.parametrize(
    "text",
    [
        "\ufeff" + "sample_id,lab\nS0000001,HERON\n",  # byte order mark: the reader must report it
        "sample_id,lab\nS0000001,HERON\n\nS0000002,HERON\n",  # blank line: Arrow would skip it
        'sample_id,lab\n"S0000001\nS0000002",HERON\n',  # a line break inside a quoted cell
        "sample_id,lab\rS0000001,HERON\r",  # old Mac line endings
        "sample_id,lab\nS0000001,HERON,extra\n",  # ragged row
        "sep=;\nsample_id;lab\nS0000001;HERON\n",  # delimiter instruction line
    ],
)
def test_doubtful_files_take_the_ordinary_path(tmp_path, contract_file, text):
    path = tmp_path / "results-odd.csv"
    path.write_bytes(text.encode("utf-8"))
    assert read_screened(str(path), load_contract(str(contract_file)).tables[0], 0, 5) is None


def test_arrow_cells_equal_python_csv_on_rfc4180_examples(tmp_path):
    # Source: RFC 4180 §2 rules 5-7 (quoted fields, commas and doubled quotes inside quotes);
    # Python's csv module is the reference reader the ordinary path is built on.
    text = 'aaa,"b,bb",ccc\nzzz,"y""yy",xxx\n"",plain,"q"\n'
    path = tmp_path / "rfc.csv"
    path.write_text(text, encoding="utf-8")
    arrow = pa.concat_tables(piece.table for piece in text_batches(str(path), ",", 3))
    expected = [[c if c != "" else None for c in row] for row in csv.reader(text.splitlines())]
    assert [list(r.values()) for r in arrow.to_pylist()] == expected


def test_duplicates_count_empty_keys_as_equal_like_pandas():
    keys = pa.table({"a": ["x", None, "x", None, "y"], "b": [1.0, 2.0, 1.0, 2.0, 1.0]})
    # Reference: pandas.DataFrame.duplicated(keep=False), which the engine's unique check uses.
    import pandas as pd

    frame = pd.DataFrame({"a": ["x", None, "x", None, "y"], "b": [1.0, 2.0, 1.0, 2.0, 1.0]})
    expected = [i for i, d in enumerate(frame.duplicated(keep=False)) if d]
    assert duplicated_rows(keys).to_pylist() == expected == [0, 1, 2, 3]


def test_duplicates_found_across_arrow_chunks():
    # Arrow's CSV reader hands columns over in chunks; a key repeated in another chunk must count.
    keys = pa.table(
        {
            "sample_id": pa.chunked_array([["S1", "S2"], ["S3", "S1"], ["S2", "S4"]]),
            "analyte": pa.chunked_array(
                [["NITRATE", "NITRATE"], ["NITRATE", "NITRATE"], ["CHLORIDE", "NITRATE"]]
            ),
        }
    )
    assert duplicated_rows(keys).to_pylist() == [0, 3]


def test_typed_keys_compare_as_the_engine_compares_them(tmp_path, monkeypatch):
    # 1 and true are one boolean, 1.50 and 1.5 one number: the engine sees duplicate keys there.
    contract = tmp_path / "readings.yaml"
    contract.write_text(
        "contract: readings\nversion: 1\ntitle: Vell Basin sonde readings (invented)\n"
        "observational_unit: one reading\nkeys: [site_id, depth_m, surface]\n"
        "variables:\n  site_id: {type: string}\n  depth_m: {type: number}\n  surface: {type: boolean}\n",
        encoding="utf-8",
    )
    path = tmp_path / "readings.csv"
    rows = ["VB-001,1.50,true", "VB-001,1.5,1", "VB-002,2,false", "VB-003,2,0", "VB-003,2.0,false"]
    path.write_text("site_id,depth_m,surface\n" + "\n".join(rows) + "\n", encoding="utf-8")
    ordinary, fast = both_paths(path, contract, monkeypatch, sample=1)  # only line 2 kept as sample
    expected = row_findings(ordinary)
    assert [f.place.rows for f in expected if f.rule == "keys.duplicate"] == [(2, 3), (5, 6)]
    assert row_findings(fast) == expected


def test_a_part_is_judged_under_the_contract_narrowed_to_its_columns(contract_file):
    rules = load_contract(str(contract_file)).tables[0]
    keyed, result = narrowed(rules, ("sample_id", "analyte")), narrowed(rules, ("result",))
    assert [v.name for v in keyed.variables] == ["sample_id", "analyte"] and keyed.keys == rules.keys
    # Without the key a lone column cannot be a duplicate, and its own rules are unchanged.
    assert [v.name for v in result.variables] == ["result"] and result.keys == ()
    assert result.variables[0] == rules.variable("result")
