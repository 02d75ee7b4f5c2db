"""Parquet: header from the schema, every value as text, dates in ISO 8601, nothing guessed."""

from __future__ import annotations

from datetime import date, datetime
from decimal import Decimal
from pathlib import Path

import pyarrow as pa
import pyarrow.parquet as pq
import pytest
from reader_helpers import cells, write

from linter.read import UnreadableFile, read_path


def test_values_become_text_without_noise(tmp_path: Path) -> None:
    data = pa.table(
        {
            "site_id": pa.array(["007", "VB-014", None]),
            "sampled_on": pa.array([date(2024, 3, 5), date(2024, 12, 31), None]),
            "taken_at": pa.array([datetime(2024, 3, 5, 14, 30), None, datetime(2024, 1, 1)]),
            "result": pa.array([0.1, 12.0, None], pa.float64()),
            "turbidity": pa.array([0.1, 2.5, None], pa.float32()),
            "count": pa.array([7, None, -3], pa.int64()),
            "checked": pa.array([True, False, None]),
            "dose": pa.array([Decimal("1.50"), Decimal("2"), None], pa.decimal128(5, 2)),
            "qualifier": pa.array(["J", "U", "J"]).dictionary_encode(),
        }
    )
    pq.write_table(data, tmp_path / "r.parquet")
    table = read_path(str(tmp_path / "r.parquet"))[0]
    grid = cells(table)
    assert table.format == "parquet"
    assert grid[0] == list(data.schema.names)
    assert table.row_numbers == (1, 2, 3, 4)
    # Source: ISO 8601-1:2019 §5.2.2 (calendar date) and §5.4.2 (date and time with "T").
    assert grid[1] == ["007", "2024-03-05", "2024-03-05T14:30:00", "0.1", "0.1", "7", "TRUE", "1.50", "J"]
    assert grid[2] == ["VB-014", "2024-12-31", None, "12", "2.5", None, "FALSE", "2.00", "U"]
    assert grid[3][:3] == [None, None, "2024-01-01T00:00:00"]


def test_open_dataset_shipped_with_pyarrow() -> None:
    # Source: pyarrow's own test data (v0.7.1.parquet, written by an early pyarrow) holds the first
    # rows of the "diamonds" dataset. From memory of that dataset's published first row:
    # carat 0.23, cut Ideal, color E, clarity SI2, depth 61.5, table 55, price 326, x 3.95, y 3.98, z 2.43.
    path = Path(pa.__file__).parent / "tests" / "data" / "parquet" / "v0.7.1.parquet"
    if not path.exists():
        pytest.skip("this pyarrow wheel ships without its test data")
    table = read_path(str(path))[0]
    grid = cells(table)
    assert grid[0][:10] == ["carat", "cut", "color", "clarity", "depth", "table", "price", "x", "y", "z"]
    assert grid[1][:10] == ["0.23", "Ideal", "E", "SI2", "61.5", "55", "326", "3.95", "3.98", "2.43"]
    assert len(grid) - 1 == pq.ParquetFile(path).metadata.num_rows


def test_truncated_parquet_is_corrupt(tmp_path: Path) -> None:
    pq.write_table(pa.table({"a": [1, 2, 3]}), tmp_path / "r.parquet")
    data = (tmp_path / "r.parquet").read_bytes()
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("cut.parquet", data[: len(data) - 12]))
    assert caught.value.rule == "file.corrupt"


def test_header_only_parquet_reads_as_a_header_row(tmp_path: Path) -> None:
    pq.write_table(pa.table({"site_id": pa.array([], pa.string())}), tmp_path / "r.parquet")
    assert cells(read_path(str(tmp_path / "r.parquet"))[0]) == [["site_id"]]


def test_nested_values_are_json_text(tmp_path: Path) -> None:
    # Source: RFC 8259 (JSON) text, checked by parsing it back with Python's json module.
    import json

    data = pa.table({"depths": pa.array([[0.5, 1.0], None]), "probe": pa.array([{"id": "P-7"}, None])})
    pq.write_table(data, tmp_path / "n.parquet")
    grid = cells(read_path(str(tmp_path / "n.parquet"))[0])
    assert json.loads(grid[1][0]) == [0.5, 1.0]
    assert json.loads(grid[1][1]) == {"id": "P-7"}
    assert grid[2] == [None, None]


def test_damaged_footer_is_corrupt_not_an_os_error(tmp_path: Path) -> None:
    # Source: Apache Parquet format: the file ends with the footer metadata, its 4-byte length
    # and "PAR1". Regression: found by a mutation run, pyarrow raised OSError ("Couldn't
    # deserialize thrift"), which the CLI would have reported as an unreadable path.
    pq.write_table(pa.table({"a": [1, 2, 3], "b": ["x", "y", "z"]}), tmp_path / "r.parquet")
    data = bytearray((tmp_path / "r.parquet").read_bytes())
    data[-40:-8] = b"\xff" * 32
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("d.parquet", bytes(data)))
    assert caught.value.rule == "file.corrupt"


# Found by fuzz/fuzz_text.py in CI: a Parquet file whose string column holds bytes that are not
# UTF-8 (0xb1). pyarrow reads the file and only fails when the value is taken out.
NOT_UTF8_PARQUET = (
    "UEFSMRUEFSgVLEwVBBUAEgAAFEwGAAAAsb3SzzE0BgAAAFZCLTAxNRUAFRIVFiwVBBUQFQYVBhw2ACgGVkItMDE1GAZWQi0w"
    "MTQREQAAAAkgAgAAAAQBAQMCFQQVIBUkTBUEFQASAAAQPM3MzMzMzBBAMzMzMzMzD0AVABUSFRYsFQQVEBUGFQYcGAjNzMzM"
    "zMwQQBgIMzMzMzMzD0AWACgIzczMzMzMEEAYCDMzMzMzMw9AEREAAAAJIAIAAAAEAQEDAhUEGTw1ABgGc2NoZW1hFQQAFQwl"
    "AhgHc2l0ZV9pZCUATBwAAAAVCiUCGAZyZXN1bHQAFgQZHBksJgAcFQwZNQAGEBkYB3NpdGVfaWQVAhYEFqQBFqwBJlAmCBw2"
    "ACgGVkItMDE1GAZWQi0wMTQREQAZLBUEFQAVAgAVABUQFQIAPBYYGQYZJgAEAAAAJgAcFQoZNQAGEBkYBnJlc3VsdBUCFgQW"
    "zAEW1AEm9AEmtAEcGAjNzMzMzMwQQBgIMzMzMzMzD0AWACgIzczMzMzMEEAYCDMzMzMzMw9AEREAGSwVBBUAFQIAFQAVEBUC"
    "ADwpBhkmAAQAAAAW8AIWBCYIFoADABkcGAxBUlJPVzpzY2hlbWEY7AEvLy8vLzZnQUFBQVFBQUFBQUFBS0FBd0FCZ0FGQUFn"
    "QUNnQUFBQUFCQkFBTUFBQUFDQUFJQUFBQUJBQUlBQUFBQkFBQUFBSUFBQUJNQUFBQUJBQUFBTXovLy84QUFBRURFQUFBQUNB"
    "QUFBQUVBQUFBQUFBQUFBWUFBQUJ5WlhOMWJIUUFBQUFBQmdBSUFBWUFCZ0FBQUFBQUFnQVFBQlFBQ0FBR0FBY0FEQUFBQUJB"
    "QUVBQUFBQUFBQVFVUUFBQUFIQUFBQUFRQUFBQUFBQUFBQndBQUFITnBkR1ZmYVdRQUJBQUVBQVFBQUFBPQAYIHBhcnF1ZXQt"
    "Y3BwLWFycm93IHZlcnNpb24gMjYuMC4xGSwcAAAcAAAALQIAAFBBUjE="
)


def test_text_column_that_is_not_utf8_is_corrupt_not_a_crash(tmp_path: Path) -> None:
    import base64

    path = tmp_path / "results.parquet"
    path.write_bytes(base64.b64decode(NOT_UTF8_PARQUET))
    with pytest.raises(UnreadableFile) as caught:
        read_path(str(path))
    assert caught.value.rule == "file.corrupt" and "not UTF-8" in caught.value.message
