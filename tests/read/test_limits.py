"""Limits stop a runaway file early and with a clear verdict, without reading it whole."""

from __future__ import annotations

import time
import tracemalloc
from pathlib import Path

import pytest
from reader_helpers import write

from linter.read import UnreadableFile, read_path
from linter.read.limits import DEFAULT_LIMITS, ReadLimits


def rule_of(name: str, limits: ReadLimits) -> str:
    with pytest.raises(UnreadableFile) as caught:
        read_path(name, limits)
    return caught.value.rule


def test_single_long_line_stops_early_in_bounded_memory() -> None:
    # 8 MB of one line with a 10,000-character limit: a reader that splits lines the usual way
    # would hold the whole line (8 MB of text) before it could tell.
    name = write("one-line.csv", b"site_id,result," + b"x" * 8_000_000)
    tracemalloc.start()
    started = time.perf_counter()
    rule = rule_of(name, ReadLimits(max_line_chars=10_000))
    elapsed = time.perf_counter() - started
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    assert rule == "file.line-too-long"
    # Reading works in chunks of about 1 MB, so the peak stays far below the line's size.
    assert peak < 8_000_000 / 2, f"peak traced memory {peak:,} bytes"
    assert elapsed < 5


def test_long_line_message_names_the_line() -> None:
    name = write("a.csv", b"a,b\n1,2\n" + b"z" * 5000 + b"\n")
    with pytest.raises(UnreadableFile) as caught:
        read_path(name, ReadLimits(max_line_chars=1000))
    assert "Line 3" in caught.value.message


def test_file_size_limit_is_checked_before_reading() -> None:
    name = write("a.csv", b"site_id\n" + b"VB-014\n" * 100)
    assert rule_of(name, ReadLimits(max_file_bytes=100)) == "file.too-large"


def test_cell_limit_catches_a_never_closed_quote() -> None:
    name = write("a.csv", b'a,b\n1,"open\n' + b"more text\n" * 200)
    assert rule_of(name, ReadLimits(max_cell_chars=500)) == "file.cell-too-long"


def test_column_limit() -> None:
    name = write("a.csv", b",".join(b"c%d" % i for i in range(50)) + b"\n")
    assert rule_of(name, ReadLimits(max_columns=20)) == "file.too-many-columns"


def test_row_limit() -> None:
    name = write("a.csv", b"site_id\n" + b"VB-014\n" * 30)
    assert rule_of(name, ReadLimits(max_rows=10)) == "file.too-many-rows"


def test_cell_limit_on_every_format(tmp_path: Path) -> None:
    import pyarrow as pa
    import pyarrow.parquet as pq
    from openpyxl import Workbook

    limits = ReadLimits(max_cells=50)
    assert rule_of(write("a.csv", b"a,b,c\n" + b"1,2,3\n" * 20), limits) == "file.too-many-cells"
    wb = Workbook()
    sheet = wb.active
    assert sheet is not None
    for i in range(20):
        sheet.append([i, i, i])
    wb.save(tmp_path / "b.xlsx")
    assert rule_of(str(tmp_path / "b.xlsx"), limits) == "file.too-many-cells"
    pq.write_table(pa.table({"a": list(range(20)), "b": list(range(20)), "c": list(range(20))}), "c.parquet")
    assert rule_of("c.parquet", limits) == "file.too-many-cells"


def test_defaults_are_the_documented_ones() -> None:
    # From memory of Excel's published specifications and limits (32,767 characters per cell,
    # 16,384 columns, 1,048,576 rows); a file within them fits a spreadsheet.
    assert DEFAULT_LIMITS.max_cell_chars == 32_767
    assert DEFAULT_LIMITS.max_columns == 16_384
    assert DEFAULT_LIMITS.max_rows == 1_048_576


def test_limits_do_not_leave_csv_field_limit_changed() -> None:
    import csv

    before = csv.field_size_limit()
    read_path(write("a.csv", b"a,b\n1,2\n"), ReadLimits(max_cell_chars=77))
    assert csv.field_size_limit() == before
