"""Files that are not tables are told apart by their first bytes and refused with the kind named."""

from __future__ import annotations

import gzip
import io
import zipfile

import pytest
from reader_helpers import write

from linter.read import UnreadableFile, read_path
from linter.read.sniff import Kind, sniff

MAGIC = [
    # Source: ISO 32000-1 §7.5.2: a PDF file starts with "%PDF-".
    (b"%PDF-1.7\n%\xe2\xe3\xcf\xd3\n1 0 obj\n", Kind.PDF),
    # Source: ISO/IEC 15948 (PNG) §5.2 signature: 89 50 4E 47 0D 0A 1A 0A.
    (b"\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR", Kind.PNG),
    # Source: ITU-T T.81 (JPEG) Annex B: SOI marker FF D8 followed by a marker FF xx.
    (b"\xff\xd8\xff\xe0\x00\x10JFIF\x00", Kind.JPEG),
    # Source: [MS-CFB] §2.2: compound file header signature D0 CF 11 E0 A1 B1 1A E1.
    (b"\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1" + b"\x00" * 64, Kind.OLE),
    # Source: Apache Parquet file format: files begin and end with the magic "PAR1".
    (b"PAR1\x15\x04", Kind.PARQUET),
]


@pytest.mark.parametrize(("head", "kind"), MAGIC)
def test_magic_numbers(head: bytes, kind: Kind) -> None:
    assert sniff(head) is kind


def test_gzip_and_zip_made_by_the_standard_library_are_recognised() -> None:
    # Source: Python's gzip and zipfile modules (reference writers of RFC 1952 and PKWARE APPNOTE).
    assert sniff(gzip.compress(b"site_id\n")) is Kind.GZIP
    buffer = io.BytesIO()
    with zipfile.ZipFile(buffer, "w") as archive:
        archive.writestr("notes.txt", "hello")
    assert sniff(buffer.getvalue()) is Kind.ZIP


def test_text_is_text() -> None:
    assert sniff(b"site_id,result\nVB-014,4.2\n") is Kind.TEXT
    assert sniff("site_id\n".encode("utf-16")) is Kind.TEXT


@pytest.mark.parametrize(
    ("data", "named"),
    [
        (MAGIC[0][0], "PDF document"),
        (MAGIC[1][0], "PNG image"),
        (gzip.compress(b"a,b\n", mtime=0), "gzip archive"),
    ],
)
def test_binary_renamed_to_csv_is_not_a_table(data: bytes, named: str) -> None:
    name = write("results.csv", data)
    with pytest.raises(UnreadableFile) as caught:
        read_path(name)
    assert caught.value.rule == "file.not-a-table"
    assert named in caught.value.message


def test_zip_that_is_not_a_workbook() -> None:
    buffer = io.BytesIO()
    with zipfile.ZipFile(buffer, "w") as archive:
        archive.writestr("results.csv", "site_id\nVB-014\n")
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("results.xlsx", buffer.getvalue()))
    assert caught.value.rule == "file.not-a-table"
    assert "ZIP archive" in caught.value.message


def test_random_control_bytes_are_a_binary_file() -> None:
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("a.csv", bytes(range(32)) * 50))
    assert caught.value.rule == "file.not-a-table"
    assert "binary file" in caught.value.message


def test_empty_file() -> None:
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("a.csv", b""))
    assert caught.value.rule == "file.empty"


def test_blank_lines_only_is_empty() -> None:
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("a.csv", b"\r\n\n\n"))
    assert caught.value.rule == "file.empty"


def test_password_protected_workbook() -> None:
    # Source: [MS-OFFCRYPTO] §2.3.4.4: the encrypted package is the "EncryptedPackage" stream of a
    # compound file. This is a minimal stand-in: the CFB signature and that directory name.
    data = MAGIC[3][0] + b"\x00" * 400 + "EncryptedPackage".encode("utf-16-le") + b"\x00" * 100
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("results.xlsx", data))
    assert caught.value.rule == "file.encrypted"


def test_old_binary_excel() -> None:
    data = MAGIC[3][0] + b"\x00" * 400 + "Workbook".encode("utf-16-le") + b"\x00" * 100
    with pytest.raises(UnreadableFile) as caught:
        read_path(write("results.xls", data))
    assert caught.value.rule == "file.unsupported-format"


def test_missing_path_is_an_os_error() -> None:
    with pytest.raises(OSError):
        read_path("no-such-file.csv")
