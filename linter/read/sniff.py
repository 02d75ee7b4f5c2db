"""What kind of file this is, told from its first bytes rather than from its name."""

from __future__ import annotations

from enum import StrEnum


class Kind(StrEnum):
    """File kinds the reader tells apart; only text, workbook and Parquet are tables."""

    TEXT = "text"
    ZIP = "ZIP archive"
    OLE = "OLE compound file"
    PARQUET = "Parquet file"
    PDF = "PDF document"
    PNG = "PNG image"
    JPEG = "JPEG image"
    GIF = "GIF image"
    GZIP = "gzip archive"
    SEVEN_ZIP = "7-Zip archive"
    RAR = "RAR archive"
    BINARY = "binary file"


# Sources: the magic numbers below are the published signatures of each format:
# PDF 1.7 (ISO 32000-1 §7.5.2 "%PDF-"), PNG (ISO/IEC 15948 §5.2), JPEG (ITU T.81 SOI marker),
# GIF89a spec, gzip (RFC 1952 §2.3.1 ID1 ID2), ZIP (PKWARE APPNOTE 4.3.7 local header),
# OLE/CFB ([MS-CFB] §2.2 header signature), Apache Parquet format ("PAR1"), 7z and RAR headers.
SIGNATURES: tuple[tuple[bytes, Kind], ...] = (
    (b"%PDF-", Kind.PDF),
    (b"\x89PNG\r\n\x1a\n", Kind.PNG),
    (b"\xff\xd8\xff", Kind.JPEG),
    (b"GIF87a", Kind.GIF),
    (b"GIF89a", Kind.GIF),
    (b"\x1f\x8b", Kind.GZIP),
    (b"PK\x03\x04", Kind.ZIP),
    (b"PK\x05\x06", Kind.ZIP),
    (b"\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1", Kind.OLE),
    (b"PAR1", Kind.PARQUET),
    (b"7z\xbc\xaf\x27\x1c", Kind.SEVEN_ZIP),
    (b"Rar!\x1a\x07", Kind.RAR),
)

TEXT_BOMS = (b"\xef\xbb\xbf", b"\xff\xfe", b"\xfe\xff", b"\x00\x00\xfe\xff")
"""UTF-8, UTF-16 LE/BE and UTF-32 BE byte order marks (Unicode §23.8); UTF-32 LE starts FF FE."""

CONTROL_BYTES = frozenset(range(0, 32)) - {9, 10, 12, 13}
"""Bytes that plain text hardly ever holds (tab, LF, FF and CR excepted)."""


def sniff(head: bytes) -> Kind:
    """The kind of a file from its first few kilobytes."""
    for magic, kind in SIGNATURES:
        if head.startswith(magic):
            return kind
    if head.startswith(TEXT_BOMS) or looks_like_utf16(head):
        return Kind.TEXT
    if not head:
        return Kind.TEXT
    controls = sum(1 for b in head if b in CONTROL_BYTES)
    # Common practice (no source): text with a stray NUL is still text; a file where more
    # than one byte in ten is a control character is not something a person typed.
    return Kind.BINARY if controls * 10 > len(head) else Kind.TEXT


def looks_like_utf16(head: bytes) -> bool:
    """UTF-16 without a byte order mark: ASCII text with a NUL in every other byte."""
    sample = head[:4096]
    if len(sample) < 4:
        return False
    even_nuls = sample[0::2].count(0)
    odd_nuls = sample[1::2].count(0)
    half = len(sample) // 2
    return max(even_nuls, odd_nuls) > 0.7 * half and min(even_nuls, odd_nuls) < 0.05 * half
