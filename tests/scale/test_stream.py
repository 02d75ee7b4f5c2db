"""Batch-by-batch screening: same findings with small batches, spilled key hashes and forced collisions."""

from __future__ import annotations

import threading
import time

import numpy as np
import pandas as pd
import pyarrow as pa
import pytest
from scale_lab_data import HEADER, csv_text, lab_rows

from linter.check import check_paths
from linter.contract.load import load_contract
from linter.scale import fast_path, pieces, spill, stream
from linter.scale.pieces import Span
from linter.scale.spill import HashSpill
from linter.scale.stream import key_hashes, screen_stream


@pytest.fixture
def broken_file(tmp_path):
    path = tmp_path / "results-2026-04.csv"
    path.write_text(csv_text(lab_rows(900, seed=11, broken_every=17)), encoding="utf-8")
    return path


def findings_of(path, contract_file):
    report = check_paths([str(path)], [load_contract(str(contract_file))])
    return [f for r in report.results for f in r.findings if f.rule.startswith(("values.", "keys."))]


def collide(monkeypatch):
    """Every key hashes alike, on the rows the row scanner hashes and on those numpy hashes."""
    monkeypatch.setattr(stream, "key_hashes", lambda keys: np.zeros(keys.num_rows, np.uint64))
    judged = stream.judge_lines

    def colliding(*args):
        verdict = judged(*args)
        verdict.hashes[:] = 0
        return verdict

    monkeypatch.setattr(stream, "judge_lines", colliding)


def fast_findings(path, contract_file, monkeypatch, spill: bool):
    monkeypatch.setattr(fast_path, "FAST_PATH_BYTES", 0)
    monkeypatch.setattr(fast_path, "SAMPLE_ROWS", 3)
    monkeypatch.setattr(pieces, "BATCH_BYTES", 4096)  # many batches, keys repeated across them
    if spill:
        monkeypatch.setattr(fast_path, "KEYS_IN_MEMORY_BYTES", 0)
    return findings_of(path, contract_file)


@pytest.mark.parametrize("spill", [False, True])
def test_small_batches_give_the_ordinary_findings(broken_file, contract_file, monkeypatch, spill):
    expected = findings_of(broken_file, contract_file)
    assert any(f.rule == "keys.duplicate" for f in expected)
    assert fast_findings(broken_file, contract_file, monkeypatch, spill) == expected


@pytest.mark.parametrize("spill", [False, True])
def test_hash_collisions_are_verified_away(broken_file, contract_file, monkeypatch, spill):
    expected = findings_of(broken_file, contract_file)
    # Every key hashes alike, so every row is a candidate: only really equal keys may survive.
    collide(monkeypatch)
    assert fast_findings(broken_file, contract_file, monkeypatch, spill=spill) == expected


@pytest.mark.parametrize("spill", [False, True])
def test_keys_repeated_across_batches_are_found_exactly(tmp_path, contract_file, monkeypatch, spill):
    # Body row 0 repeats in the last batch (row 400); rows 150-151 lack a sample id (suspects, kept
    # anyway). The forced collision makes every row a candidate: only the exact comparison decides.
    lines = [f"S{n:07d},VB-001,2026-03-02,NITRATE,1.5,1,,HERON" for n in range(400)]
    lines[150] = lines[151] = ",VB-001,2026-03-02,NITRATE,1.5,1,,HERON"
    lines.append(lines[0])
    path = tmp_path / "results-2026-05.csv"
    path.write_text(
        "sample_id,site_id,sampled_on,analyte,result,replicate,qualifier,lab\n" + "\n".join(lines) + "\n"
    )
    monkeypatch.setattr(pieces, "BATCH_BYTES", 4096)
    collide(monkeypatch)
    contract = load_contract(str(contract_file)).tables[0]
    found = screen_stream(str(path), contract, ",", 8, 0, keys_in_memory=not spill)
    assert found.positions.tolist() == [0, 150, 151, 400]


def test_progress_is_told_every_row_once(broken_file, contract_file, monkeypatch):
    monkeypatch.setattr(pieces, "BATCH_BYTES", 4096)
    told: list[int] = []
    contract = load_contract(str(contract_file)).tables[0]
    found = screen_stream(str(broken_file), contract, ",", 8, 3, told.append)
    assert len(told) > 3 and sum(told) == found.rows == 900


def test_equal_keys_hash_equal_and_spill_finds_them(tmp_path):
    keys = pa.table({"a": ["x", "y", "x", None, None], "b": [1.0, 2.0, 1.0, -0.0, 0.0]})
    hashes = key_hashes(keys)
    assert hashes[0] == hashes[2] and hashes[3] == hashes[4] and len(set(hashes.tolist())) == 3
    spill = HashSpill(tmp_path, 4)
    spill.add(hashes[:2], 0)
    spill.add(hashes[2:], 2)
    assert spill.candidates().tolist() == [0, 2, 3, 4]


def test_a_runaway_line_goes_to_the_ordinary_reader(tmp_path, contract_file, monkeypatch):
    monkeypatch.setattr(pieces, "BATCH_BYTES", 1024)
    monkeypatch.setattr(pieces, "LONGEST_LINE_BYTES", 4096)
    path = tmp_path / "results-runaway.csv"
    path.write_text("sample_id,lab\n" + "S" * 10_000 + ",HERON\n", encoding="utf-8")
    contract = load_contract(str(contract_file)).tables[0]
    assert fast_path.read_screened(str(path), contract, 0, 3) is None


@pytest.mark.parametrize("line_end", ["\n", "\r\n"])
def test_rows_with_shared_keys_are_cut_from_where_the_first_pass_found_them(
    tmp_path, contract_file, monkeypatch, line_end
):
    # The last line repeats an earlier key and has no line end: the read-back must still find it.
    rows = lab_rows(700, seed=5)
    rows.append(list(rows[2]))
    text = csv_text(rows).replace("\n", line_end).rstrip("\r\n")
    path = tmp_path / "results-2026-05.csv"
    path.write_bytes(text.encode("utf-8"))
    expected = findings_of(path, contract_file)
    duplicate = [f for f in expected if f.rule == "keys.duplicate"]
    assert duplicate and duplicate[0].place.rows == (4, 702)  # header is line 1
    assert fast_findings(path, contract_file, monkeypatch, spill=False) == expected


def test_a_nul_byte_stops_the_pass_and_leaves_the_file_to_the_ordinary_reader(
    tmp_path, contract_file, monkeypatch
):
    monkeypatch.setattr(pieces, "BATCH_BYTES", 1024)
    rows = lab_rows(300, seed=2)
    text = csv_text(rows)
    cut = len(text) // 2
    path = tmp_path / "results-nul.csv"
    path.write_bytes(text[:cut].encode() + b"\x00" + text[cut:].encode())
    contract = load_contract(str(contract_file)).tables[0]
    assert fast_path.read_screened(str(path), contract, 0, 3) is None


def test_line_scan_counts_lines_and_hashes_the_bytes_it_is_shown():
    import hashlib

    scan = pieces.LineScan()
    for block in (b"a,b\r\n1,2\r", b"\n3,4\r\n"):
        scan.add(block)
    assert scan.newlines == 3 and scan.returns == 3 and scan.plain and scan.rows_agree(2)
    # Source: Python's hashlib (the same digest as hashing the whole file at once).
    assert scan.sha256 == hashlib.sha256(b"a,b\r\n1,2\r\n3,4\r\n").hexdigest()
    bare = pieces.LineScan()
    bare.add(b"a,b\r1,2\n")
    assert not bare.plain and not bare.rows_agree(1)


def test_read_ahead_keeps_order_raises_in_order_and_stops_with_its_consumer():
    assert list(pieces.read_ahead(iter(range(50)), depth=2)) == list(range(50))

    def failing():
        yield 1
        yield 2
        raise ValueError("broken batch")

    seen: list[int] = []
    with pytest.raises(ValueError, match="broken batch"):
        for item in pieces.read_ahead(failing()):
            seen.append(item)
    assert seen == [1, 2]
    produced: list[int] = []

    def endless():
        n = 0
        while True:
            produced.append(n)
            yield n
            n += 1

    ahead = pieces.read_ahead(endless(), depth=1)
    assert next(ahead) == 0
    ahead.close()  # the consumer stops: the producer thread must end, not block forever
    assert len(produced) <= 4


@pytest.mark.parametrize("last", ["end", "error"])
def test_read_ahead_stops_when_its_consumer_stops_after_the_producer_is_done(last):
    # The producer has queued its items and waits to hand over its end (or its error) when the
    # consumer gives up: closing must not wait for a hand-over that never comes.
    def short():
        yield from (1, 2, 3)
        if last == "error":
            raise ValueError("after the end")

    ahead = pieces.read_ahead(short(), depth=1)
    assert [next(ahead), next(ahead)] == [1, 2]
    time.sleep(0.3)  # the producer queues its last item and blocks on its end (or error)
    closing = threading.Thread(target=ahead.close, daemon=True)
    closing.start()
    closing.join(5)  # it used to wait forever here
    assert not closing.is_alive()


def test_a_ragged_line_the_scanner_refuses_leaves_the_file_to_the_ordinary_reader(tmp_path, contract_file):
    # The scanner raises on the ragged line, near the end of the file, while the reader thread
    # still has blocks (or its end) to hand over: the pass stops and says so.
    lines = [f"S{n:07d},VB-001,2026-03-02,NITRATE,1.5,1,,HERON" for n in range(3000)]
    lines[2998] += ",extra"  # in the last block: the reader has nothing left but its end to hand over
    path = tmp_path / "results-2026-09.csv"
    path.write_text(HEADER + "\n" + "\n".join(lines) + "\n", encoding="utf-8")
    contract = load_contract(str(contract_file)).tables[0]
    with pytest.MonkeyPatch.context() as patch:
        patch.setattr(pieces, "BATCH_BYTES", 4096)
        assert fast_path.read_screened(str(path), contract, 0, 3) is None


def test_spilled_hashes_land_in_the_partition_of_their_top_bits_and_are_all_found(tmp_path):
    rng = np.random.default_rng(5)
    hashes = rng.integers(0, 2**63, 5000, dtype=np.int64).view(np.uint64) * np.uint64(2)
    hashes[4000:] = hashes[:1000]  # 1,000 keys written twice, in a later batch
    spill = HashSpill(tmp_path, 16)
    for start in range(0, 5000, 1000):
        spill.add(hashes[start : start + 1000], start)
    found = spill.candidates()
    # Reference: pandas' duplicated, counting every member of a repeated group.
    expected = np.flatnonzero(pd.Series(hashes).duplicated(keep=False).to_numpy())
    assert found.tolist() == expected.tolist() and len(found) == 2000
    for index, handle in enumerate(spill.files):
        pairs = np.fromfile(handle.name, np.uint64).reshape(-1, 2)
        assert ((pairs[:, 0] >> np.uint64(60)) == index).all()


def test_partitions_grow_in_number_with_the_file(tmp_path):
    path = tmp_path / "big.csv"
    with open(path, "wb") as handle:
        handle.truncate(400 * 100_000_000)  # 40 GB of (sparse) bytes, 400 bytes a row
    first = Span(0, 400 * 1000, 1, 1000)
    assert spill.spill_partitions(str(path), first) == 101  # 100M rows, 1M rows a partition
    assert spill.spill_partitions(str(path), Span(0, 4 * 1000, 1, 1000)) == spill.MOST_PARTITIONS


def test_rows_found_again_come_from_the_kept_rows_or_the_file_in_order(tmp_path, monkeypatch):
    # Body rows 0-299 in pieces of about 1 KB; rows 5, 150 and 299 were kept by the first pass
    # (their copies are marked so it shows which were taken), the others must be cut from the file.
    lines = [f"S{n:07d},VB-001,2026-03-02,NITRATE,1.5,1,,HERON" for n in range(300)]
    path = tmp_path / "results-2026-06.csv"
    path.write_text(HEADER + "\n" + "\n".join(lines) + "\n", encoding="utf-8")
    monkeypatch.setattr(pieces, "BATCH_BYTES", 1024)
    spans = [piece.span for piece in pieces.text_batches(str(path), ",", 8)]
    labels = HEADER.split(",")
    kept_at = np.array([5, 150, 299])
    kept = pa.table(
        {
            label: [f"kept-{p}" if label == "lab" else lines[p].split(",")[i] for p in kept_at]
            for i, label in enumerate(labels)
        }
    )
    rows = stream.Rows(str(path), ",", 8, labels, spans, kept, kept_at)
    wanted = np.array([0, 5, 64, 150, 151, 298, 299])
    found = rows.at(wanted)
    assert found.column("sample_id").to_pylist() == [f"S{p:07d}" for p in wanted]
    assert found.column("lab").to_pylist() == [f"kept-{p}" if p in kept_at else "HERON" for p in wanted]


@pytest.mark.parametrize("waiting_bytes", [1, 1 << 30])  # parsed as each comes, or all at the end
def test_kept_rows_keep_file_order_across_lines_and_tables(monkeypatch, waiting_bytes):
    monkeypatch.setattr(stream, "PARSE_BLOCK_BYTES", waiting_bytes)
    labels = ["sample_id", "lab"]
    kept = stream.KeptRows(",", 2, labels)
    kept.add(stream.Lines(np.frombuffer(b"S0000001,HERON\nS0000002,\n", np.uint8), 2))
    kept.add(pa.table({"sample_id": ["S0000003"], "lab": ["OTTER"]}))  # a block the numpy screen read
    kept.add(stream.Lines(np.frombuffer(b"S0000004,KESTREL\n", np.uint8), 1))
    kept.add(stream.Lines(np.frombuffer(b'"S0000005","PIKE"\n', np.uint8), 1))
    table = kept.table()
    assert table.column_names == labels
    assert table.column("sample_id").num_chunks == 1
    assert table.to_pydict() == {
        "sample_id": ["S0000001", "S0000002", "S0000003", "S0000004", "S0000005"],
        "lab": ["HERON", None, "OTTER", "KESTREL", "PIKE"],
    }


def test_kept_lines_that_arrow_reads_as_other_records_leave_the_file_to_the_ordinary_reader():
    kept = stream.KeptRows(",", 2, ["sample_id", "lab"])
    kept.add(stream.Lines(np.frombuffer(b"S0000001,HERON\nS0000002,OTTER\n", np.uint8), 1))
    with pytest.raises(pa.ArrowInvalid):
        kept.table()
    assert stream.KeptRows(",", 2, ["sample_id", "lab"]).table().num_rows == 0
