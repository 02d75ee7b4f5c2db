"""Physical lines of a decoded text stream, each read with a size cap so one endless line cannot
exhaust memory."""

from __future__ import annotations

from collections.abc import Iterator
from typing import TextIO

from linter.read.errors import UnreadableFile

ENDINGS = ("\r\n", "\n", "\r")


class LineScanner:
    """Yields each physical line with its own ending (LF, CRLF or CR alone), counting the endings.

    The handle must be opened with `newline=""`, so lines split at CR, LF and CRLF and reach csv
    untranslated (a quoted line break stays as written). `readline` is capped, so a 200 MB line
    is refused after reading `max_line_chars` characters of it, never held whole.
    """

    def __init__(self, handle: TextIO, max_line_chars: int) -> None:
        self.handle = handle
        self.max_line_chars = max_line_chars
        self.endings: dict[str, int] = {"\r\n": 0, "\n": 0, "\r": 0}
        self.cr_only_lines: list[int] = []
        """Line numbers ended by a lone CR (old Mac style), as a note's evidence."""
        self.lines = 0
        self.final_newline = True
        """False when the last line has no line break (allowed by RFC 4180 §2 rule 2)."""
        self.nul_lines: list[int] = []
        self.raw: list[str] = []
        """Lines handed out since the caller last cleared this (the raw text of one record)."""

    def __iter__(self) -> Iterator[str]:
        readline = self.handle.readline
        cap = self.max_line_chars
        endings = self.endings
        number = 0
        # The loop runs once per line of every submission: only cheap tests on the common path.
        while line := readline(cap + 2):
            number += 1
            last = line[-1]
            if last == "\n":
                endings["\r\n" if line[-2:] == "\r\n" else "\n"] += 1
            elif last == "\r":
                endings["\r"] += 1
                if len(self.cr_only_lines) < 1000:
                    self.cr_only_lines.append(number)
            else:
                self.final_newline = False
            if len(line) > cap and len(line.rstrip("\r\n")) > cap:
                self.lines = number
                raise self.too_long(number)
            if "\x00" in line:
                self.nul_lines.append(number)
            self.raw.append(line)
            self.lines = number
            yield line

    def too_long(self, line: int) -> UnreadableFile:
        return UnreadableFile(
            "file.line-too-long",
            f"Line {line} is longer than {self.max_line_chars:,} characters, so the file was not read "
            "further: it is probably not a table, or its line breaks were lost.",
            "Check that the file is the table you meant to send and that each record is on its own line.",
        )
