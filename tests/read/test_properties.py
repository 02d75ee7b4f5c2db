"""Property checks: random bytes never escape the reader, and any grid Python's csv writes reads back."""

from __future__ import annotations

import csv
import io
from pathlib import Path

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from linter.read import UnreadableFile, read_path

FAST = settings(
    max_examples=100,
    deadline=None,
    database=None,  # no example database: tests write only under tmp_path
    suppress_health_check=[HealthCheck.function_scoped_fixture],
)


@FAST
@given(data=st.binary(max_size=600))
def test_random_bytes_give_tables_or_a_verdict(tmp_path: Path, data: bytes) -> None:
    path = tmp_path / "random.csv"
    path.write_bytes(data)
    try:
        tables = read_path(str(path))
    except UnreadableFile as verdict:
        assert verdict.rule.startswith("file.") and verdict.message
    else:
        for table in tables:
            assert len(table.row_numbers) == table.grid.shape[0]
            assert all(v is None or isinstance(v, str) for v in table.grid.to_numpy().ravel())


# No CR in cells: Python 3.11's csv writer leaves a lone CR unquoted when the line terminator
# is LF (seen in this suite), which writes an ambiguous file rather than the cell it was given.
# Control characters other than LF and tab are left out: a file full of them is binary, by design.
cell = st.text(
    alphabet=st.one_of(st.characters(blacklist_categories=("Cs", "Cc")), st.sampled_from(list('\n\t",;| '))),
    max_size=8,
)


@FAST
@given(
    rows=st.lists(st.lists(cell, min_size=3, max_size=3), min_size=1, max_size=6),
    delimiter=st.sampled_from([",", "\t", ";", "|"]),
    quoting=st.sampled_from([csv.QUOTE_MINIMAL, csv.QUOTE_ALL]),
    terminator=st.sampled_from(["\r\n", "\n"]),
)
def test_whatever_python_csv_writes_reads_back(
    tmp_path: Path, rows: list[list[str]], delimiter: str, quoting: int, terminator: str
) -> None:
    # Source: Python's csv writer (a reference RFC 4180 writer) produces the files; the reader
    # must give back every cell exactly, with row numbers that are the physical start lines.
    header = ["site_id", "sampled_on", "result"]
    buffer = io.StringIO(newline="")
    csv.writer(buffer, delimiter=delimiter, quoting=quoting, lineterminator=terminator).writerows(
        [header, *rows]
    )
    text = buffer.getvalue()
    path = tmp_path / "dialect.csv"
    path.write_bytes(text.encode("utf-8"))
    (table,) = read_path(str(path))
    expected = [[c if c != "" else None for c in r] for r in [header, *rows] if any(r)]
    got = [[table.grid.iat[i, j] for j in range(3)] for i in range(table.grid.shape[0])]
    assert table.delimiter == delimiter
    assert got == expected


def test_damaged_workbooks_and_parquet_files_give_a_verdict(tmp_path: Path) -> None:
    # Deterministic mutations (flipped bytes, truncation, spliced junk) of files written by
    # openpyxl and pyarrow; a longer run of the same loop found the regressions in test_excel
    # and test_parquet.
    import random

    import pyarrow as pa
    import pyarrow.parquet as pq
    from openpyxl import Workbook

    book = Workbook()
    sheet = book.active
    assert sheet is not None
    for i in range(10):
        sheet.append([f"VB-{i:03d}", i * 0.1])
    sheet.merge_cells("A2:A3")
    book.save(tmp_path / "seed.xlsx")
    pq.write_table(pa.table({"a": [1, 2, 3], "b": ["x", "y", "z"]}), tmp_path / "seed.parquet")
    seeds = [(tmp_path / "seed.xlsx").read_bytes(), (tmp_path / "seed.parquet").read_bytes()]
    rnd = random.Random(20260302)
    verdicts = 0
    for _ in range(120):
        data = bytearray(rnd.choice(seeds))
        how = rnd.random()
        if how < 0.4:
            for _ in range(rnd.randint(1, 20)):
                data[rnd.randrange(len(data))] = rnd.randrange(256)
        elif how < 0.7:
            data = data[: rnd.randrange(len(data))]
        else:
            at = rnd.randrange(len(data))
            data = data[:at] + bytearray(rnd.randbytes(rnd.randint(1, 50))) + data[at:]
        path = tmp_path / "mutant.bin"
        path.write_bytes(bytes(data))
        try:
            read_path(str(path))
        except UnreadableFile as verdict:
            assert verdict.rule.startswith("file.") and verdict.message
            verdicts += 1
    assert verdicts > 60  # most mutants are damaged; the loop really exercised the refusals
