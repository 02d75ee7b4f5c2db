"""Physical lines of a decoded text stream, read in chunks so one endless line cannot exhaust memory."""

from __future__ import annotations

from collections.abc import Iterator
from typing import TextIO

from linter.read.errors import UnreadableFile

CHUNK_CHARS = 1 << 16


class LineScanner:
    """Yields each physical line with its ending (LF, CRLF or CR alone), counting the endings seen.

    Python's own line splitting would first build a whole 200 MB line in memory; this stops
    as soon as a line passes `max_line_chars`.
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

    def __iter__(self) -> Iterator[str]:
        pending: list[str] = []
        pending_len = 0
        carry_cr = False
        while True:
            chunk = self.handle.read(CHUNK_CHARS)
            if not chunk:
                break
            if carry_cr:
                chunk = "\r" + chunk
                carry_cr = False
            if chunk.endswith("\r"):
                # The LF of a CRLF may start the next chunk: decide once it is read.
                chunk, carry_cr = chunk[:-1], True
            start = 0
            for end, ending in line_ends(chunk):
                piece = chunk[start:end]
                yield self.finish("".join(pending) + piece if pending else piece, ending, pending_len)
                pending, pending_len = [], 0
                start = end + len(ending)
            rest = chunk[start:]
            if rest:
                pending.append(rest)
                pending_len += len(rest)
                if pending_len > self.max_line_chars:
                    raise self.too_long(self.lines + 1)
        if carry_cr:
            yield self.finish("".join(pending), "\r", pending_len)
        elif pending:
            self.final_newline = False
            yield self.finish("".join(pending), "", pending_len)

    def finish(self, body: str, ending: str, _pending_len: int) -> str:
        """Count one line and hand it on with its own ending."""
        self.lines += 1
        if len(body) > self.max_line_chars:
            raise self.too_long(self.lines)
        if ending:
            self.endings[ending] += 1
            if ending == "\r" and len(self.cr_only_lines) < 1000:
                self.cr_only_lines.append(self.lines)
        if "\x00" in body:
            self.nul_lines.append(self.lines)
        # The ending is handed on untouched so a quoted line break stays exactly as written.
        return body + ending

    def too_long(self, line: int) -> UnreadableFile:
        return UnreadableFile(
            "file.line-too-long",
            f"Line {line} is longer than {self.max_line_chars:,} characters, so the file was not read "
            "further: it is probably not a table, or its line breaks were lost.",
            "Check that the file is the table you meant to send and that each record is on its own line.",
        )


def line_ends(chunk: str) -> Iterator[tuple[int, str]]:
    """Positions and kinds of the line endings in `chunk` (CRLF counts once)."""
    index = 0
    length = len(chunk)
    while index < length:
        lf = chunk.find("\n", index)
        cr = chunk.find("\r", index)
        if lf < 0 and cr < 0:
            return
        if cr >= 0 and (lf < 0 or cr < lf):
            if cr + 1 < length and chunk[cr + 1] == "\n":
                yield cr, "\r\n"
                index = cr + 2
            else:
                yield cr, "\r"
                index = cr + 1
        else:
            yield lf, "\n"
            index = lf + 1
