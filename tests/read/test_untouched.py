"""Reading never changes a submitted file: the bytes hash the same before and after."""

from __future__ import annotations

import contextlib
import hashlib
import os
from pathlib import Path

import pyarrow as pa
import pyarrow.parquet as pq
from openpyxl import Workbook

from linter.read import UnreadableFile, read_path


def digest(path: Path) -> tuple[str, float]:
    return hashlib.sha256(path.read_bytes()).hexdigest(), os.stat(path).st_mtime


def test_no_input_is_modified(tmp_path: Path) -> None:
    files = {
        "plain.csv": b"site_id,result\nVB-014,4.2\n",
        "bom.csv": b"\xef\xbb\xbfsite_id\nVB-014\n",
        "cp1252.csv": "site_id,note\nVB-014,Trübung\n".encode("cp1252"),
        "utf16.tsv": "site_id\tnote\nVB-014\tok\n".encode("utf-16"),
        "ragged.csv": b'a,b\n1,"2\n3\n',
        "cr.csv": b"a,b\r1,2\r",
        "pdf.csv": b"%PDF-1.4\n",
        "empty.csv": b"",
    }
    for name, data in files.items():
        (tmp_path / name).write_bytes(data)
    wb = Workbook()
    sheet = wb.active
    assert sheet is not None
    sheet.append(["site_id"])
    sheet.append(["VB-014"])
    wb.save(tmp_path / "book.xlsx")
    pq.write_table(pa.table({"site_id": ["VB-014"]}), tmp_path / "data.parquet")

    paths = sorted(tmp_path.iterdir())
    before = {p: digest(p) for p in paths}
    for path in paths:
        with contextlib.suppress(UnreadableFile):
            read_path(str(path))
    assert {p: digest(p) for p in paths} == before
    assert sorted(tmp_path.iterdir()) == paths  # nothing written beside the inputs either


def test_odd_file_names_read_like_any_other(tmp_path: Path) -> None:
    # Common practice (no source): names with spaces, non-ASCII letters and a leading dash.
    for name in ("chemistry March 2026.csv", "Trübung-Ødegård.csv", "-results.csv", "résultats .tsv"):
        path = tmp_path / name
        path.write_bytes(b"site_id,result\nVB-014,4.2\n")
        (table,) = read_path(str(path))
        assert table.source == str(path)
        assert table.grid.iat[1, 0] == "VB-014"
