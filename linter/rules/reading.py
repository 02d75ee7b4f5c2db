"""Contract-free reading rules: what the reader noticed about the bytes and the sheet, as findings."""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass

from linter.findings import Finding, Place, listed_rows
from linter.rules.reading_rules import (
    BLANK_ROWS,
    BYTE_ORDER_MARK,
    EMPTY_SHEETS,
    ENCODING,
    HIDDEN_COLUMNS,
    HIDDEN_ROWS,
    HIDDEN_SHEET,
    LINE_ENDINGS,
    MERGED_CELLS,
    MISNAMED,
    MIXED_ENCODING,
    NUL_BYTES,
    RAGGED_ROWS,
    STREAMED,
    UNCACHED_FORMULAS,
    UNCLOSED_QUOTE,
)
from linter.rules.registry import Rule, inspector
from linter.rules.subject import Subject
from linter.table import ReadNote, column_letter


@dataclass(frozen=True)
class NoteRule:
    """How one kind of reader note becomes a finding."""

    rule: Rule
    fix: str


NOTE_RULES: dict[str, NoteRule] = {
    "encoding": NoteRule(ENCODING, "Save the file as CSV UTF-8 (in the Save As dialog) and send it again."),
    "mixed-encoding": NoteRule(
        MIXED_ENCODING, "Re-create the file from its sources in one program and save it as CSV UTF-8."
    ),
    "byte-order-mark": NoteRule(BYTE_ORDER_MARK, "Nothing to do; 'CSV UTF-8' without a BOM is also fine."),
    "nul-bytes": NoteRule(
        NUL_BYTES, "Remove the NUL characters (often left by a failed export) or export the file again."
    ),
    "line-endings": NoteRule(LINE_ENDINGS, "Save the file again with Windows (CRLF) or Unix (LF) line ends."),
    "ragged-rows": NoteRule(
        RAGGED_ROWS,
        "Give every row exactly one cell per header column; quote cells that contain the delimiter.",
    ),
    "blank-rows": NoteRule(BLANK_ROWS, "Delete the blank rows, or split the sections into separate tables."),
    "unclosed-quote": NoteRule(UNCLOSED_QUOTE, 'Close the quote (") in that record, or remove it.'),
    "misnamed": NoteRule(MISNAMED, "Rename the file to match what it holds, or export it again."),
    "hidden-rows": NoteRule(HIDDEN_ROWS, "Unhide the rows; delete any that are not part of the submission."),
    "hidden-columns": NoteRule(
        HIDDEN_COLUMNS, "Unhide the columns; delete them if they are not part of the submission."
    ),
    "merged-cells": NoteRule(
        MERGED_CELLS, "Unmerge the cells and write the value into every row or column it applies to."
    ),
    "hidden-sheet": NoteRule(HIDDEN_SHEET, "Unhide the sheet, or delete it if it is not part of the data."),
    "empty-sheets": NoteRule(EMPTY_SHEETS, "Delete empty sheets before sending the workbook."),
    "uncached-formulas": NoteRule(
        UNCACHED_FORMULAS, "Open the workbook in a spreadsheet program, let it calculate, and save it."
    ),
    "streamed-workbook": NoteRule(STREAMED, "Send the data as CSV UTF-8, or in smaller workbooks."),
}
"""Every note kind the reader writes; a test checks none is missing."""


def finding_of(note: NoteRule, read: ReadNote, subject: Subject) -> Finding:
    table = subject.table
    letters: tuple[str, ...] = ()
    columns: tuple[str, ...] = ()
    if read.kind == "hidden-columns":
        letters = read.examples
        names = subject.frame.names
        by_letter = {column_letter(i): n for i, n in enumerate(names)}
        columns = tuple(by_letter.get(letter, "") for letter in letters)
    examples = read.examples if read.kind != "hidden-columns" else ()
    return Finding(
        rule=note.rule.id,
        severity=note.rule.severity,
        message=read.message,
        place=Place(
            file=table.source,
            sheet=table.sheet,
            rows=listed_rows(read.rows),
            columns=columns,
            letters=letters,
        ),
        count=len(read.rows) or len(read.examples) or 1,
        examples=examples,
        fix=note.fix,
        evidence={"rows": len(read.rows)} if read.rows else {},
    )


@inspector()
def reading_notes(subject: Subject) -> Iterable[Finding]:
    """One finding per note the reader left on the table."""
    for read in subject.table.notes:
        note = NOTE_RULES.get(read.kind)
        if note is not None:
            yield finding_of(note, read, subject)
