"""Reading submitted files into Tables: every cell as text, with the provider's row numbers."""

from __future__ import annotations

import os
from dataclasses import replace
from pathlib import PurePath

from linter.read.errors import UnreadableFile
from linter.read.limits import DEFAULT_LIMITS, ReadLimits
from linter.read.sniff import Kind, sniff
from linter.table import ReadNote, Table

__all__ = ["DEFAULT_LIMITS", "SUPPORTED_SUFFIXES", "ReadLimits", "UnreadableFile", "read_path"]

SUPPORTED_SUFFIXES = frozenset({".csv", ".tsv", ".txt", ".xlsx", ".xlsm", ".parquet"})
HEAD_BYTES = 8192
WORKBOOK_SUFFIXES = frozenset({".xlsx", ".xlsm"})
TEXT_SUFFIXES = frozenset({".csv", ".tsv", ".txt"})
# Source: [MS-OFFCRYPTO] §2.3.4: an encrypted OOXML file is a compound file with a stream
# named "EncryptedPackage" (directory names are stored as UTF-16LE).
ENCRYPTED_MARK = "EncryptedPackage".encode("utf-16-le")


def not_a_table(kind: Kind) -> UnreadableFile:
    return UnreadableFile(
        "file.not-a-table",
        f"The file is a {kind}, not a table.",
        "Send the data itself as CSV UTF-8 or .xlsx; attach documents separately.",
    )


def read_ole(path: str) -> UnreadableFile:
    """An OLE compound file is either a password-protected workbook or a pre-2007 .xls."""
    with open(path, "rb") as handle:
        content = handle.read(4 << 20)
    if ENCRYPTED_MARK in content:
        return UnreadableFile(
            "file.encrypted",
            "The workbook is password-protected, so its cells cannot be read.",
            "Remove the password (File > Info > Protect Workbook) and send the file again.",
        )
    return UnreadableFile(
        "file.unsupported-format",
        "The file is an old binary Excel 97-2003 workbook (.xls) or another OLE document.",
        "Open it and save it as .xlsx (Excel Workbook) or CSV UTF-8, then send it again.",
    )


def misnamed(tables: list[Table], suffix: str, actual: str) -> list[Table]:
    """Tag tables whose file name promises another format than the content holds."""
    note = ReadNote("misnamed", f"The file is named {suffix} but holds {actual}.", examples=(suffix, actual))
    return [replace(t, notes=(*t.notes, note)) for t in tables]


def read_path(path: str, limits: ReadLimits = DEFAULT_LIMITS) -> list[Table]:
    """Read one file into its tables (one per Excel sheet). Raises UnreadableFile or OSError.

    The file is only ever opened for reading; its kind is told from its bytes, not its name.
    """
    size = os.stat(path).st_size
    if size > limits.max_file_bytes:
        raise UnreadableFile(
            "file.too-large",
            f"The file is {size:,} bytes, larger than the limit of {limits.max_file_bytes:,}.",
            "Split the submission into smaller files, or ask the data manager to raise the limit.",
        )
    with open(path, "rb") as handle:
        head = handle.read(HEAD_BYTES)
    if not head:
        raise UnreadableFile(
            "file.empty", "The file is empty (0 bytes).", "Send the file again with its header and data."
        )
    suffix = PurePath(path).suffix.lower()
    kind = sniff(head)
    if kind is Kind.ZIP:
        from linter.read.excel import is_workbook, read_workbook

        if not is_workbook(path):
            raise not_a_table(kind)
        tables = read_workbook(path, limits)
        return tables if suffix in WORKBOOK_SUFFIXES else misnamed(tables, suffix or "(none)", "a workbook")
    if kind is Kind.PARQUET:
        from linter.read.parquet import read_parquet

        tables = [read_parquet(path, limits)]
        return tables if suffix == ".parquet" else misnamed(tables, suffix or "(none)", "Parquet data")
    if kind is Kind.OLE:
        raise read_ole(path)
    if kind is not Kind.TEXT:
        raise not_a_table(kind)
    from linter.read.delimited import read_delimited
    from linter.read.encoding import choose_decoding

    tables = [read_delimited(path, choose_decoding(path, head), limits, prefer_tab=suffix == ".tsv")]
    if suffix in WORKBOOK_SUFFIXES or suffix == ".parquet":
        return misnamed(tables, suffix, "delimited text")
    return tables
