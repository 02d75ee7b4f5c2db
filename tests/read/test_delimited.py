"""Delimited text: RFC 4180 quoting and line breaks, dialects, and every cell kept as written."""

from __future__ import annotations

import csv
import io

import pytest
from reader_helpers import cells, kinds, read_one

from linter.read.delimited import choose_delimiter


def test_rfc4180_rule1_crlf_line_breaks() -> None:
    # Source: RFC 4180 §2 rule 1: each record on its own line, delimited by CRLF.
    table = read_one("a.csv", b"aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n")
    assert cells(table) == [["aaa", "bbb", "ccc"], ["zzz", "yyy", "xxx"]]
    assert table.row_numbers == (1, 2)


def test_rfc4180_rule2_final_line_break_optional() -> None:
    # Source: RFC 4180 §2 rule 2: the last record may or may not end with a line break.
    with_break = read_one("a.csv", b"aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n")
    without = read_one("b.csv", b"aaa,bbb,ccc\r\nzzz,yyy,xxx")
    assert cells(with_break) == cells(without)
    assert "line-endings" not in kinds(without)


def test_rfc4180_rule3_header_line_stays_in_grid() -> None:
    # Source: RFC 4180 §2 rule 3: an optional header line in the same format as records.
    table = read_one("a.csv", b"field_name,field_name,field_name\r\naaa,bbb,ccc\r\n")
    assert cells(table)[0] == ["field_name"] * 3


def test_rfc4180_rule4_spaces_are_part_of_a_field() -> None:
    # Source: RFC 4180 §2 rule 4: spaces are considered part of a field and not ignored.
    table = read_one("a.csv", b"a,b\r\n  x , y\r\n")
    assert cells(table)[1] == ["  x ", " y"]


def test_rfc4180_rule5_quoted_fields() -> None:
    # Source: RFC 4180 §2 rule 5: fields may be enclosed in double quotes.
    table = read_one("a.csv", b'"aaa","bbb","ccc"\r\nzzz,yyy,xxx\r\n')
    assert cells(table)[0] == ["aaa", "bbb", "ccc"]


def test_rfc4180_rule6_quoted_line_break_and_delimiter() -> None:
    # Source: RFC 4180 §2 rule 6: fields with line breaks, double quotes and commas are quoted.
    table = read_one("a.csv", b'"aaa","b\r\nbb","ccc"\r\nzzz,"y,yy",xxx\r\n')
    assert cells(table) == [["aaa", "b\r\nbb", "ccc"], ["zzz", "y,yy", "xxx"]]
    # The second record starts on physical line 3 because the quoted break used line 2.
    assert table.row_numbers == (1, 3)


def test_rfc4180_rule7_doubled_quotes() -> None:
    # Source: RFC 4180 §2 rule 7: a double quote inside a quoted field is escaped by doubling it.
    table = read_one("a.csv", b'"aaa","b""bb","ccc"\r\n1,2,3\r\n')
    assert cells(table)[0] == ["aaa", 'b"bb', "ccc"]


RFC_SAMPLES = [
    b"aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n",
    b'"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx',
    b'"aaa","b""bb","ccc"\r\n"x,1","",z\r\n',
    b'site_id,note\n"VB-014","turbid, after ""heavy"" rain\nsecond line"\nVB-015,clear\n',
]


@pytest.mark.parametrize("data", RFC_SAMPLES)
def test_agrees_with_python_csv_module(data: bytes) -> None:
    # Source: Python's standard csv module (a reference RFC 4180 reader), used as the oracle.
    expected = list(csv.reader(io.StringIO(data.decode("utf-8"), newline="")))
    expected_cells = [[c if c != "" else None for c in row] for row in expected]
    assert cells(read_one("a.csv", data)) == expected_cells


def test_cells_stay_exactly_as_written() -> None:
    # Common practice (no source): these are the values type guessing most often destroys.
    data = (
        b"site_id,result,flag\n007,NA,TRUE\nVB-014,n/a,FALSE\nVB-015,-999,\n"
        b'VB-016,"1,234",x\nVB-017,12 mg/L,y\n'
    )
    table = read_one("a.csv", data)
    grid = cells(table)
    assert grid[1] == ["007", "NA", "TRUE"]
    assert grid[2] == ["VB-014", "n/a", "FALSE"]
    assert grid[3] == ["VB-015", "-999", None]
    assert grid[4][1] == "1,234"
    assert grid[5][1] == "12 mg/L"
    assert all(isinstance(v, str) or v is None for row in grid for v in row)


@pytest.mark.parametrize(
    ("data", "delimiter"),
    [
        (b"site_id\tresult\nVB-014\t1,5\nVB-015\t2,5\n", "\t"),
        (b"site_id;result;unit\nVB-014;1,5;mg/L\nVB-015;2;mg/L\n", ";"),
        (b"site_id|result\nVB-014|4.2\nVB-015|3.1\n", "|"),
        (b"site_id,result\nVB-014,4.2\nVB-015,3.1\n", ","),
    ],
)
def test_delimiter_detection(data: bytes, delimiter: str) -> None:
    table = read_one("a.txt", data)
    assert table.delimiter == delimiter
    assert cells(table)[1][0] == "VB-014"


def test_single_column_file_keeps_default_delimiter() -> None:
    assert choose_delimiter("site_id\nVB-014\nVB-015\n", True, prefer_tab=False) == ","
    assert choose_delimiter("site_id\nVB-014\n", True, prefer_tab=True) == "\t"


def test_lf_and_cr_only_line_endings() -> None:
    lf = read_one("lf.csv", b"a,b\n1,2\n3,4\n")
    cr = read_one("cr.csv", b"a,b\r1,2\r3,4\r")
    assert cells(lf) == cells(cr)
    assert cr.row_numbers == (1, 2, 3)
    assert "line-endings" in kinds(cr) and "line-endings" not in kinds(lf)
    note = next(n for n in cr.notes if n.kind == "line-endings")
    assert note.rows == (1, 2, 3)


def test_ragged_rows_are_noted_with_their_lines_and_nothing_dropped() -> None:
    table = read_one("a.csv", b"a,b,c\n1,2,3\n4,5\n6,7,8,9\n10,11,12,\n")
    note = next(n for n in table.notes if n.kind == "ragged-rows")
    assert note.rows == (3, 4)  # a trailing empty cell (line 5) is not an extra column
    assert cells(table)[3] == ["6", "7", "8", "9"]
    assert cells(table)[2] == ["4", "5", None, None]


def test_blank_lines_are_skipped_but_row_numbers_kept() -> None:
    table = read_one("a.csv", b"a,b\n1,2\n\n3,4\n\n")
    assert table.row_numbers == (1, 2, 4)
    note = next(n for n in table.notes if n.kind == "blank-rows")
    assert note.rows == (3,)


def test_unclosed_quote_is_noted() -> None:
    table = read_one("a.csv", b'a,b\n1,"open\n2,3\n4,5\n')
    assert "unclosed-quote" in kinds(table)
    assert "unclosed-quote" not in kinds(read_one("b.csv", b'a,b\n1,"closed\nhere"\n2,3\n'))


def test_tsv_suffix_prefers_tab_and_sets_format() -> None:
    table = read_one("a.tsv", b"site_id\tnote\nVB-014\tnone, really\n")
    assert table.format == "tsv"
    assert cells(table)[1] == ["VB-014", "none, really"]


@pytest.mark.parametrize("pad", range(8185, 8195))
def test_crlf_split_across_read_buffers_counts_once(pad: int) -> None:
    # The CR and LF of one CRLF may arrive in different buffer reads (8 KiB apart here).
    data = b"a,b\r\n" + b"x," + b"y" * pad + b"\r\n" + b"1,2\r\n"
    table = read_one("a.csv", data)
    assert table.row_numbers == (1, 2, 3)
    assert "line-endings" not in kinds(table)


def test_separator_hint_line_names_the_delimiter_and_is_not_data() -> None:
    table = read_one("a.csv", b"sep=;\r\nsite_id;result\r\nVB-014;4,2\r\n")
    assert table.delimiter == ";"
    assert cells(table) == [["site_id", "result"], ["VB-014", "4,2"]]
    assert table.row_numbers == (2, 3)
