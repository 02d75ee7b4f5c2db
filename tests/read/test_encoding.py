"""Encodings and bytes: every encoding is written as bytes in the test and must read to the same cells."""

from __future__ import annotations

import codecs
import random

import pytest
from reader_helpers import cells, kinds, read_one, write

from linter.read import UnreadableFile, read_path

TEXT = "site_id,note\nVB-014,Trübung nach Regen\nVB-015,café µg/L\n"
EXPECTED = [["site_id", "note"], ["VB-014", "Trübung nach Regen"], ["VB-015", "café µg/L"]]


def test_plain_utf8_has_no_encoding_note() -> None:
    table = read_one("a.csv", TEXT.encode("utf-8"))
    assert cells(table) == EXPECTED
    assert table.encoding == "utf-8"
    assert not kinds(table) & {"encoding", "byte-order-mark", "mixed-encoding"}


def test_utf8_with_bom_drops_the_mark_from_the_first_name() -> None:
    # Source: The Unicode Standard §23.8: the UTF-8 BOM is EF BB BF.
    data = b"\xef\xbb\xbf" + TEXT.encode("utf-8")
    assert data.startswith(codecs.BOM_UTF8)
    table = read_one("a.csv", data)
    assert cells(table) == EXPECTED
    assert cells(table)[0][0] == "site_id"
    assert kinds(table) == {"byte-order-mark"}


@pytest.mark.parametrize(
    ("bom", "codec"),
    [
        (b"\xff\xfe", "utf-16-le"),  # Source: Unicode §23.8: UTF-16LE BOM is FF FE.
        (b"\xfe\xff", "utf-16-be"),  # Source: Unicode §23.8: UTF-16BE BOM is FE FF.
        (b"\xff\xfe\x00\x00", "utf-32-le"),  # Source: Unicode §23.8: UTF-32LE BOM is FF FE 00 00.
        (b"\x00\x00\xfe\xff", "utf-32-be"),  # Source: Unicode §23.8: UTF-32BE BOM is 00 00 FE FF.
    ],
)
def test_utf16_and_utf32_with_bom(bom: bytes, codec: str) -> None:
    table = read_one("a.csv", bom + TEXT.encode(codec))
    assert cells(table) == EXPECTED
    assert "encoding" in kinds(table)


def test_utf16_without_bom_is_recognised() -> None:
    table = read_one("a.csv", TEXT.encode("utf-16-le"))
    assert cells(table) == EXPECTED
    assert table.encoding == "utf-16-le"
    assert "nul-bytes" not in kinds(table)


def test_windows_1252_is_read_and_noted() -> None:
    # Source: Windows-1252 code chart (Python's cp1252 codec): ü = FC, é = E9, µ = B5.
    data = TEXT.encode("cp1252")
    assert b"\xfc" in data and b"\xe9" in data and b"\xb5" in data
    table = read_one("a.csv", data)
    assert cells(table) == EXPECTED
    assert table.encoding == "cp1252"
    note = next(n for n in table.notes if n.kind == "encoding")
    assert "Windows-1252" in note.message
    assert note.rows == (2,)  # ü of "Trübung" is the first non-UTF-8 byte, on line 2


def test_latin1_text_reads_to_the_same_characters() -> None:
    # Latin-1 and Windows-1252 agree on every character of this sample (ISO 8859-1 A0-FF).
    table = read_one("a.csv", TEXT.encode("latin-1"))
    assert cells(table) == EXPECTED
    assert "encoding" in kinds(table)


def test_mixed_utf8_and_windows_1252_is_noted() -> None:
    data = "site_id,note\nVB-014,Müller\n".encode() + "VB-015,Müller\n".encode("cp1252")
    table = read_one("a.csv", data)
    assert {"encoding", "mixed-encoding"} <= kinds(table)
    assert cells(table)[2] == ["VB-015", "Müller"]


def test_unknown_encoding_is_an_unreadable_file_not_a_crash() -> None:
    rnd = random.Random(7)
    body = bytes(rnd.choice([*range(0x80, 0x100), *[0x2C] * 10]) for _ in range(2000))
    name = write("a.csv", b"site_id,note\n" + body + b"\n")
    with pytest.raises(UnreadableFile) as caught:
        read_path(name)
    assert caught.value.rule == "file.encoding-unknown"
    assert "UTF-8" in caught.value.fix


def test_nul_bytes_are_kept_and_noted_with_lines() -> None:
    table = read_one("a.csv", b"site_id,result\nVB-014,4.2\x00\x00\nVB-015,3.1\n")
    assert cells(table)[1] == ["VB-014", "4.2\x00\x00"]
    note = next(n for n in table.notes if n.kind == "nul-bytes")
    assert note.rows == (2,)


def test_non_utf8_byte_after_the_first_megabyte_is_still_found() -> None:
    # The UTF-8 check streams the whole file, not a head sample.
    filler = b"VB-014,4.2\n" * 100_000  # 1.1 MB: past the first 1 MiB read
    table = read_one("a.csv", b"site_id,result\n" + filler + "VB-099,Trübung\n".encode("cp1252"))
    assert table.encoding == "cp1252"
    assert table.grid.iloc[-1, 1] == "Trübung"


def test_central_european_text_is_not_forced_into_windows_1252() -> None:
    # Source: Windows-1250 code chart (Python's cp1250 codec): Ł = A3, ź = 9F, ó = F3.
    text = "site_id,note\nVB-014,Łódź źródło\nVB-015,Zażółć gęślą jaźń\n"
    table = read_one("a.csv", text.encode("cp1250"))
    assert table.encoding == "cp1250"
    assert cells(table)[1] == ["VB-014", "Łódź źródło"]


def test_windows_1252_only_characters_pick_windows_1252() -> None:
    # Source: Windows-1252 code chart: € = 80, ñ = F1 (in Windows-1250 F1 is ń).
    text = "site_id,note,price\nVB-014,Señora Niño,5€\nVB-015,naïve façade,\n"
    table = read_one("a.csv", text.encode("cp1252"))
    assert table.encoding == "cp1252"
    assert cells(table)[1] == ["VB-014", "Señora Niño", "5€"]


@pytest.mark.parametrize("data", [b"\xfe\xffx;x", b"\xff\xfe\x1ex\xa9;\xa9\n\x00"])
def test_utf16_bom_followed_by_bytes_that_are_not_utf16(data: bytes) -> None:
    # Regression: found by a random-bytes run; these raised UnicodeDecodeError out of the reader.
    try:
        tables = read_path(write("a.csv", data))
    except UnreadableFile as verdict:
        assert verdict.rule.startswith("file.")
    else:
        assert tables[0].encoding != "utf-16"


@pytest.mark.parametrize("newline", [b"\n", b"\r\n", b"\r"])
def test_line_of_the_first_non_utf8_byte(newline: bytes) -> None:
    lines = [b"site_id,note", b"VB-014,ok", b'VB-015,"two', b'lines"', "VB-016,Trübung".encode("cp1252")]
    data = newline.join(lines)
    note = next(n for n in read_one("a.csv", data).notes if n.kind == "encoding")
    assert note.rows == (5,)


@pytest.mark.parametrize("chunk", [1, 2, 3, 4, 5, 64])
def test_line_counting_is_the_same_for_every_read_size(chunk: int, monkeypatch: pytest.MonkeyPatch) -> None:
    from linter.read import encoding

    data = b"ab\r\ncd\rde\nfg\r\n\r\nhi"
    write("lines.bin", data)
    monkeypatch.setattr(encoding, "CHUNK_BYTES", chunk)
    # Expected from Python's own universal-newline splitting (str.splitlines on CR, LF, CRLF).
    for offset in range(len(data)):
        if data[offset : offset + 1] in b"\r\n":
            continue
        expected = len(data[: offset + 1].decode().splitlines())
        assert encoding.line_of("lines.bin", offset) == expected, offset
