"""The compiled row scanner: never more lenient than the numpy screen, the same key hashes, and
the engine's findings on hostile cells, with the scanner and without it."""

from __future__ import annotations

import csv
import datetime
import io
import random

import numpy as np
import pyarrow as pa
import pyarrow.csv as pacsv
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scale_lab_data import CONTRACT, HEADER, csv_text, lab_rows

from linter.check import check_paths
from linter.contract.load import contract_from_tree, load_contract
from linter.contract.yaml_tree import parse_yaml
from linter.scale import fast_path, pieces, row_scan
from linter.scale.key_hash import row_hashes
from linter.scale.pieces import text_options
from linter.scale.row_scan import DOUBT, FALLBACK, judge_lines, scan_spec, sorted_high_halves
from linter.scale.screen import screen_batch, worker_pool

pytestmark = pytest.mark.skipif(row_scan._rowscan is None, reason="the row scanner is not built here")

MIXED = """\
contract: gauge-readings
version: 1
title: Vell Basin Water Network gauge readings (invented)
observational_unit: one reading of one gauge on one day
keys: [gauge, read_on, depth_m]
variables:
  gauge: {type: string, pattern: '^G\\d{2}$'}
  read_on: {type: date, min: 2020-01-01}
  depth_m: {type: number, min: 0, max: 40}
  level_cm: {type: integer, min: 0, max: 900, missing: ["-"]}
  turbid: {type: boolean, nullable: true}
  note: {type: string, nullable: true}
missing: ["", "NA"]
"""
MIXED_HEADER = "gauge,read_on,depth_m,level_cm,turbid,note"
# Cells chosen to sit on every edge the scanner decides: spaces and tabs around clean values,
# missing-value codes written loosely, exponents, signs, leading zeros, 16 digits, impossible
# dates, quoted cells, text beyond ASCII, a carriage return before the line end.
HOSTILE = {
    0: ["G01", "G1", " G02", "G03 ", "g04", "G٠٥", '"G06"', "NA", "", "G0\t7", "G08"],
    1: ["2024-02-29", "2026-02-29", "2026-13-01", "2026-1-01", "2019-12-31", "1677-12-31", " 2026-03-02",
        "2026-03-02", "２０２６-03-02", "NA", ""],
    2: ["1.5", "1.50", "+1.5", "-0", "0", "5.", ".5", "1e1", "00012", "1234567890123456", "12345678901234.5",
        "40.000000000001", " 3", "3 ", "inf", "nan", "0x10", "1,5", '"1,5"', "NA", "", "-0.0"],
    3: ["1", "01", "+2", "2.0", "900", "901", "-", " -", "NA", "", "123456789012345", "1234567890123456"],
    4: ["true", "TRUE", "False", "1", "0", "yes", " true", "", "NA", "tru"],
    5: ["ok", "", "NA", " NA", "café", "a;b", '"a,b"', "  "],
}  # fmt: skip


def mixed_rows(count: int, seed: int, hostile: float = 0.3) -> list[list[str]]:
    rng = random.Random(seed)
    rows = []
    for n in range(count):
        row = [f"G{n % 97:02d}", f"2026-{n % 12 + 1:02d}-{n % 28 + 1:02d}", f"{n % 40}.{n % 10}",
               str(rng.randrange(0, 900)), rng.choice(["true", "false"]), rng.choice(["", "ok"])]  # fmt: skip
        if rng.random() < hostile:
            column = rng.randrange(6)
            row[column] = rng.choice(HOSTILE[column])
        rows.append(row)
    return rows


def mixed_text(rows: list[list[str]], line_end: str = "\n") -> str:
    return MIXED_HEADER + line_end + "".join(",".join(r) + line_end for r in rows)


def mixed_contract(tmp_path):
    path = tmp_path / "gauge-readings.yaml"
    path.write_text(MIXED, encoding="utf-8")
    return path


def findings(path, contract):
    report = check_paths([str(path)], [load_contract(str(contract))])
    return [f for r in report.results for f in r.findings if f.rule.startswith(("values.", "keys."))]


def fast(path, contract, monkeypatch, scanner: bool):
    monkeypatch.setattr(fast_path, "FAST_PATH_BYTES", 0)
    monkeypatch.setattr(fast_path, "SAMPLE_ROWS", 4)
    with monkeypatch.context() as patch:
        if not scanner:
            patch.setattr(row_scan, "_rowscan", None)
        return findings(path, contract)


@pytest.mark.parametrize("line_end", ["\n", "\r\n"])
@pytest.mark.parametrize("seed", [1, 2, 3])
def test_hostile_cells_get_the_engines_findings_with_and_without_the_scanner(
    tmp_path, monkeypatch, seed, line_end
):
    contract = mixed_contract(tmp_path)
    path = tmp_path / "gauges.csv"
    # Over 64 KB, so each piece is judged in two halves side by side.
    rows = mixed_rows(3000, seed)
    rows[2900] = list(rows[10])  # a shared key, far from its twin
    path.write_bytes(mixed_text(rows, line_end).encode("utf-8"))
    assert path.stat().st_size > 1 << 16
    expected = findings(path, contract)
    assert {"keys.duplicate", "values.wrong-type", "values.pattern-mismatch"} <= {f.rule for f in expected}
    assert fast(path, contract, monkeypatch, scanner=True) == expected
    assert fast(path, contract, monkeypatch, scanner=False) == expected


def test_lab_results_get_the_engines_findings_on_the_scanner(tmp_path, contract_file, monkeypatch):
    path = tmp_path / "results-2026-06.csv"
    path.write_text(csv_text(lab_rows(2500, seed=21, broken_every=7)), encoding="utf-8")
    expected = findings(path, contract_file)
    assert len({f.rule for f in expected}) >= 8
    assert fast(path, contract_file, monkeypatch, scanner=True) == expected


def judged(text: str, contract_text: str = MIXED):
    """The scanner's verdict on a file's body, and the numpy screen's on the same lines."""
    contract = contract_from_tree(parse_yaml(contract_text, "contract.yaml"), "contract.yaml").tables[0]
    data = bytearray(text.encode("utf-8"))
    labels = text.split("\n", 1)[0].split(",")
    spec = scan_spec(contract, labels, ",")
    assert spec is not None
    begin = data.find(b"\n") + 1
    verdict = judge_lines(data, begin, len(data), len(labels), spec, worker_pool())
    body = pacsv.read_csv(pa.BufferReader(bytes(data[begin:])), *text_options(",", len(labels)))
    return spec, verdict, screen_batch(body.rename_columns(labels), contract)


CELL = st.text(alphabet=st.sampled_from(list('0123456789.-+eE GNAtrufalsT\t,é"')), max_size=12)


@settings(max_examples=300, deadline=None)
@given(
    st.lists(st.tuples(*[CELL] * 6), min_size=1, max_size=30),
    st.sampled_from([csv.QUOTE_MINIMAL, csv.QUOTE_ALL]),
)
def test_the_scanner_passes_no_cell_the_numpy_screen_doubts(rows, quoting):
    # Source: Python's csv module writes the lines, quoting as RFC 4180 §2 describes (cells with
    # a delimiter or a quote quoted whole, inner quotes doubled; or every cell quoted).
    out = io.StringIO()
    csv.writer(out, quoting=quoting, lineterminator="\n").writerows(rows)
    spec, verdict, screened = judged(MIXED_HEADER + "\n" + out.getvalue())
    scanned = verdict.flags != FALLBACK
    for column, name in enumerate(spec.variables):
        numpy_doubts = screened.cells[name]
        assert not (scanned & ~verdict.bad[:, column] & numpy_doubts).any(), name
    # Where every cell passes the scanner, the numpy screen has no doubt about the line either.
    numpy_suspect = screened.suspect.to_numpy(zero_copy_only=False)
    assert not (scanned & (verdict.flags != DOUBT) & numpy_suspect).any()
    # Scanned lines hash their keys exactly as the numpy screen's typed keys hash.
    hashes = row_hashes(screened.keys)
    assert np.array_equal(verdict.hashes[scanned], hashes[scanned])


def test_plain_cells_are_scanned_and_hash_as_the_engines_typed_keys():
    rows = mixed_rows(500, seed=8, hostile=0)
    rows[7][2] = rows[9][2] = "NA"  # missing key cells hash as null
    _, verdict, screened = judged(mixed_text(rows))
    scanned = verdict.flags != FALLBACK
    assert scanned.all() and (verdict.flags == DOUBT).sum() == 2
    assert np.array_equal(verdict.hashes[scanned], row_hashes(screened.keys)[scanned])


def test_number_and_date_keys_are_read_as_python_reads_them():
    # Source: CPython's float() rounds decimal text correctly (IEEE 754 round to nearest), and its
    # datetime.date counts days on the proleptic Gregorian calendar ISO 8601 uses; both are the
    # outside reference for the scanner's own number and date reading.
    rng = random.Random(4)
    numbers = [f"{rng.randrange(0, 40)}.{rng.randrange(0, 10 ** rng.randrange(1, 13))}" for _ in range(400)]
    numbers += ["0.1", "0.2", "0.3", "39.99999999999", "7.", ".5", "-0", "+3.25", "12345678901.2345"]
    days = [datetime.date(1678, 1, 1) + datetime.timedelta(days=rng.randrange(0, 213_000)) for _ in numbers]
    text = "gauge,read_on,depth_m\n" + "".join(
        f"G01,{day.isoformat()},{number}\n" for day, number in zip(days, numbers, strict=True)
    )
    contract = MIXED.replace("  level_cm", "  level_cm_unused").replace("min: 2020-01-01", "min: 1678-01-01")
    _, verdict, _ = judged(text, contract)
    assert not (verdict.flags == FALLBACK).any()
    epoch = datetime.date(1970, 1, 1)
    keys = pa.table(
        {
            "gauge": pa.array(["G01"] * len(numbers)),
            "read_on": pa.array([(d - epoch).days * 86_400 * 10**9 for d in days], pa.timestamp("ns")),
            "depth_m": pa.array([float(n) for n in numbers], pa.float64()),
        }
    )
    assert np.array_equal(verdict.hashes, row_hashes(keys))


@pytest.mark.parametrize(
    "body",
    [
        "G01,2026-03-02,1.5,1,true,ok\n\nG02,2026-03-02,1.5,1,true,ok\n",  # an empty line
        "G01,2026-03-02,1.5,1,true\n",  # a cell short
        "G01,2026-03-02,1.5,1,true,ok,more\n",  # a cell too many
    ],
)
def test_lines_arrow_would_not_read_one_for_one_are_refused(body):
    with pytest.raises(pa.ArrowInvalid):
        judged(MIXED_HEADER + "\n" + body)


def test_cells_quoted_whole_are_read_between_their_quotes():
    body = (
        '"G01","2026-03-02","1.5","1","true","a,b"\n'  # every cell quoted, a delimiter inside one
        '"G02",2026-03-02,"",1,,""\n'  # empty quoted cells are null, as empty ones are
        'G03,2026-03-02,1.5,1,true,"say ""hi"""\n'  # a doubled quote: left to Arrow
        'G04,2026-03-02,1.5,1,true,a"b\n'  # a quote inside a cell: left to Arrow
        '"G05"x,2026-03-02,1.5,1,true,ok\n'  # text after the closing quote: left to Arrow
    )
    _, verdict, screened = judged(MIXED_HEADER + "\n" + body)
    assert list(verdict.flags) == [0, DOUBT, FALLBACK, FALLBACK, FALLBACK]
    assert list(verdict.bad[1]) == [False, False, True, False, False, False]  # depth_m missing, as a key
    keys = row_hashes(screened.keys)
    assert verdict.hashes[0] == keys[0] and verdict.hashes[1] == keys[1]


def test_spaces_and_tabs_around_a_cell_are_trimmed_as_the_engine_trims_them():
    body = (
        "G01,2026-03-02, 1.5\t,1,true,ok\n"  # a number key read as 1.5: passes, as in numpy
        "G02 ,2026-03-02,1.5,1, TRUE,ok\n"  # a text key is its text as written: 'G02 ' fails
        "G03,2026-03-02,1.5, NA ,true,ok\n"  # a missing-value code with spaces: missing, allowed
        "G04,2026-03-02,1.5,1,true,\x0bok\n"  # a vertical tab: the engine decides
    )
    _, verdict, screened = judged(MIXED_HEADER + "\n" + body)
    assert list(verdict.flags) == [0, DOUBT, 0, DOUBT]
    assert list(verdict.bad[1]) == [True, False, False, False, False, False]
    assert np.array_equal(verdict.hashes, row_hashes(screened.keys))


def test_the_last_line_may_lack_its_line_end():
    _, verdict, _ = judged(MIXED_HEADER + "\nG01,2026-03-02,1.5,1,true,ok\nG02,2026-03-02,1.5,1,true,")
    assert verdict.rows == 2 and list(verdict.flags) == [0, 0]
    assert verdict.starts[-1] == len(
        MIXED_HEADER + "\nG01,2026-03-02,1.5,1,true,ok\nG02,2026-03-02,1.5,1,true,"
    )


def test_radix_sorted_high_halves_equal_numpys_sort():
    hashes = np.random.default_rng(3).integers(0, 2**63, 100_000, dtype=np.uint64) * np.uint64(2)
    assert np.array_equal(sorted_high_halves(hashes), np.sort((hashes >> np.uint64(32)).astype(np.uint32)))
    assert len(sorted_high_halves(hashes[:0])) == 0


def test_the_lab_contract_is_judged_by_the_scanner_and_a_regex_pattern_is_not():
    lab = contract_from_tree(parse_yaml(CONTRACT, "lab.yaml"), "lab.yaml").tables[0]
    spec = scan_spec(lab, HEADER.split(","), ",")
    assert spec is not None and spec.keys == (0, 3)  # sample_id, analyte
    varied = CONTRACT.replace("pattern: '^VB-\\d{3}$'", "pattern: '^VB-\\d{2,3}$'")
    assert varied != CONTRACT
    lab = contract_from_tree(parse_yaml(varied, "lab.yaml"), "lab.yaml").tables[0]
    assert scan_spec(lab, HEADER.split(","), ",") is None  # left to Arrow's regex engine


def test_many_short_quoted_lines_are_refused_without_overrunning_the_answer():
    # Quoted lines skip the width check (Arrow decides them), so there may be more lines than
    # lines of the full width could make: the scanner must stop, not write past its arrays.
    with pytest.raises(pa.ArrowInvalid):
        judged(MIXED_HEADER + "\n" + ',"\n' * 5000)


@pytest.mark.parametrize("scanner", [True, False])
def test_a_line_starting_with_a_byte_order_mark_keeps_it_as_text(
    tmp_path, contract_file, monkeypatch, scanner
):
    # Found by fuzz/fuzz_scan.py: Arrow drops a byte order mark at the start of what it reads, so
    # a line cut out to be parsed on its own (a handed-back line, a kept line, a piece) lost it,
    # and its key became empty, shared with every other empty key.
    rows = lab_rows(400, seed=13)
    for at in (3, 150, 151):
        rows[at][0] = "\ufeff" + rows[at][0]  # invisible, but part of the sample id
    rows[200] = list(rows[150])  # the same key, mark and all
    path = tmp_path / "results-2026-10.csv"
    path.write_text(csv_text(rows), encoding="utf-8")
    expected = findings(path, contract_file)
    assert {"keys.duplicate", "values.pattern-mismatch"} <= {f.rule for f in expected}
    monkeypatch.setattr(pieces, "BATCH_BYTES", 4096)  # so that such lines also start pieces
    assert fast(path, contract_file, monkeypatch, scanner) == expected


@given(
    st.lists(st.binary(max_size=12).map(lambda b: b.replace(b"\n", b"") + b"\n"), min_size=1, max_size=30),
    st.data(),
)
def test_gathered_lines_are_the_chosen_slices_with_and_without_the_scanner(lines, data):
    text = b"".join(lines)
    if data.draw(st.booleans()):
        text = text[:-1]  # the file's last line without its line end
    starts = np.concatenate([[0], np.cumsum([len(line) for line in lines])]).clip(max=len(text))
    chosen = np.array(sorted(data.draw(st.sets(st.integers(0, len(lines) - 1)))), np.int64)
    # Reference: Python's own slicing, and a line end after the last chosen line.
    expected = b"".join(text[starts[i] : starts[i + 1]] for i in chosen)
    if expected and not expected.endswith(b"\n"):
        expected += b"\n"
    low, high = starts[chosen], starts[chosen + 1]
    assert row_scan.gathered_lines(text, low, high).tobytes() == expected
    with pytest.MonkeyPatch.context() as patch:
        patch.setattr(row_scan, "_rowscan", None)
        assert row_scan.gathered_lines(text, low, high).tobytes() == expected


def test_gathering_refuses_ranges_outside_the_data():
    out = np.empty(8, np.uint8)
    with pytest.raises(ValueError, match="outside"):
        row_scan._rowscan.gather_lines(b"abc\n", np.array([2], np.int64), np.array([9], np.int64), out)
    with pytest.raises(ValueError, match="too small"):
        row_scan._rowscan.gather_lines(b"abcdefghij\n", np.zeros(1, np.int64), np.array([11], np.int64), out)
