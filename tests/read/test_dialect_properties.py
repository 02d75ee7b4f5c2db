"""Random CSV dialects, encodings and line ends never raise out of the reader: a table or a verdict."""

from __future__ import annotations

import csv
import io
import tempfile
from pathlib import Path

from hypothesis import given, settings
from hypothesis import strategies as st

from linter.read import UnreadableFile, read_path

LONG_RUN = settings.default.max_examples > 100  # the "long" profile of tests/conftest.py
QUICK = settings(max_examples=settings.default.max_examples if LONG_RUN else 60, deadline=None, database=None)

cell = st.text(alphabet=st.characters(blacklist_categories=("Cs",)), max_size=6)


@QUICK
@given(
    rows=st.lists(st.lists(cell, min_size=1, max_size=4), min_size=1, max_size=5),
    delimiter=st.sampled_from([",", ";", "\t", "|", ":", " "]),
    quotechar=st.sampled_from(['"', "'"]),
    doublequote=st.booleans(),
    quoting=st.sampled_from([csv.QUOTE_MINIMAL, csv.QUOTE_ALL, csv.QUOTE_NONNUMERIC]),
    terminator=st.sampled_from(["\r\n", "\n", "\r"]),
    encoding=st.sampled_from(["utf-8", "utf-8-sig", "utf-16", "utf-16-le", "utf-16-be", "cp1252", "latin-1"]),
    final_newline=st.booleans(),
)
def test_any_dialect_reads_or_gets_a_verdict(
    rows: list[list[str]],
    delimiter: str,
    quotechar: str,
    doublequote: bool,
    quoting: int,
    terminator: str,
    encoding: str,
    final_newline: bool,
) -> None:
    # Source: Python's csv module writes each dialect (escapechar set when doublequote is off,
    # as the module requires); control characters included, whatever the writer makes of them.
    buffer = io.StringIO(newline="")
    writer = csv.writer(
        buffer,
        delimiter=delimiter,
        quotechar=quotechar,
        doublequote=doublequote,
        escapechar=None if doublequote else "\\",
        quoting=quoting,
        lineterminator=terminator,
    )
    try:
        writer.writerows(rows)
    except csv.Error:
        return  # the writer itself refuses this dialect for these cells
    text = buffer.getvalue() if final_newline else buffer.getvalue().rstrip("\r\n")
    data = text.encode(encoding, errors="replace")
    with tempfile.TemporaryDirectory() as folder:
        path = Path(folder) / "dialect.csv"
        path.write_bytes(data)
        try:
            tables = read_path(str(path))
        except UnreadableFile as verdict:
            assert verdict.rule.startswith("file.") and verdict.message
            return
    for table in tables:
        assert len(table.row_numbers) == table.grid.shape[0]
        assert all(v is None or isinstance(v, str) for v in table.grid.to_numpy().ravel())
