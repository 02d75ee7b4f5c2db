"""Declarations of the rules for what the reader notices in bytes, lines and sheets."""

from __future__ import annotations

from linter.findings import Severity
from linter.rules.registry import define_rule

ENCODING = define_rule(
    "file.encoding",
    "The file is not UTF-8",
    Severity.WARNING,
    """
    Finds text files decoded as something other than UTF-8 (Windows-1252, Latin-1, UTF-16...).
    Weir reads them, but other programs may turn `µg/L` or `Ørsted` into garbage.

    Bad: `site,note` / `VB-014,Trübung` saved as Windows-1252 (byte `0xFC` for `ü`).
    Good: the same file saved as CSV UTF-8 (bytes `0xC3 0xBC` for `ü`).
    """,
)
MIXED_ENCODING = define_rule(
    "file.mixed-encoding",
    "Part of the file is UTF-8 and part is not",
    Severity.WARNING,
    """
    Finds text files where valid UTF-8 characters come before bytes that are not UTF-8: two
    files saved differently were pasted together, and one of the parts will read wrongly.

    Bad: lines 1-40 in UTF-8 (`Müller`), lines 41-60 appended from a Windows-1252 file (`Müller`
    as byte `0xFC`).
    Good: the whole file saved once, as CSV UTF-8.
    """,
)
BYTE_ORDER_MARK = define_rule(
    "file.byte-order-mark",
    "The file starts with a UTF-8 byte order mark",
    Severity.NOTE,
    """
    Finds UTF-8 files that begin with the byte order mark EF BB BF. Weir removes it before
    reading the header, but some tools glue it to the first column name.

    Bad: bytes `EF BB BF` then `site_id,...` (some tools read the first name as `\\ufeffsite_id`).
    Good: `site_id,...` from the first byte.
    """,
)
NUL_BYTES = define_rule(
    "file.nul-bytes",
    "The file contains NUL characters",
    Severity.WARNING,
    """
    Finds NUL (0x00) characters in a text file, usually left by a failed export or a file
    padded by a disk tool; they are kept in the cells but no person typed them.

    Bad: `VB-014,4.2\\x00\\x00\\x00`.
    Good: `VB-014,4.2`.
    """,
)
LINE_ENDINGS = define_rule(
    "file.line-endings",
    "Lines end with a carriage return alone",
    Severity.WARNING,
    """
    Finds lines ended by a lone carriage return (CR, the classic Mac style), which many
    programs read as one long line. RFC 4180 §2 rule 1 ends records with CRLF; LF alone is
    common practice and fine.

    Bad: `site_id,result\\rVB-014,4.2\\r`.
    Good: `site_id,result\\r\\nVB-014,4.2\\r\\n` (or with `\\n`).
    """,
)
RAGGED_ROWS = define_rule(
    "file.ragged-rows",
    "Rows with more or fewer cells than the header",
    Severity.ERROR,
    """
    Finds rows whose number of cells differs from the header row's (RFC 4180 §2 rule 4 asks for
    the same number of fields in every record), usually an unquoted delimiter inside a value
    or a missing cell. Empty cells after the last header column do not count.

    Bad: header `site_id,result,unit`, row `VB-014,1,234,mg/L` (four cells).
    Good: `VB-014,"1,234",mg/L` or `VB-014,1234,mg/L`.
    """,
)
BLANK_ROWS = define_rule(
    "file.blank-rows",
    "Blank rows inside the table",
    Severity.NOTE,
    """
    Finds empty rows between the first and the last row of a table; Weir skips them but keeps
    the original row numbers. They often separate sections that belong in a column.

    Bad: rows for VB-014, a blank row, then rows for VB-015.
    Good: all rows one after another, with `site_id` saying which site each row belongs to.
    """,
)
UNCLOSED_QUOTE = define_rule(
    "file.unclosed-quote",
    "A quote is opened and never closed",
    Severity.ERROR,
    """
    Finds a quoted cell that runs to the end of the file because its closing quote is
    missing (RFC 4180 §2 rules 5-7), so every later line was read into that one cell.

    Bad: `VB-014,"turbid after rain,4.2` followed by more lines.
    Good: `VB-014,"turbid after rain",4.2`.
    """,
)
MISNAMED = define_rule(
    "file.misnamed",
    "The file's extension does not match its content",
    Severity.WARNING,
    """
    Finds files whose name promises one format while the bytes hold another (told from the
    first bytes). Weir reads what the bytes hold.

    Bad: `results.xlsx` that is really comma-separated text.
    Good: `results.csv` for comma-separated text, `results.xlsx` for a workbook.
    """,
)
HIDDEN_ROWS = define_rule(
    "sheet.hidden-rows",
    "The sheet hides rows",
    Severity.WARNING,
    """
    Finds rows hidden in a worksheet. Weir reads them like any other row, but the person who
    sent the file may not know they are there.

    Bad: rows 12-14 hidden because they hold "old values, do not use".
    Good: rows that are not part of the submission deleted; every row visible.
    """,
)
HIDDEN_COLUMNS = define_rule(
    "sheet.hidden-columns",
    "The sheet hides columns",
    Severity.WARNING,
    """
    Finds columns hidden in a worksheet; Weir reads them, the sender may not see them.

    Bad: column D (`lab_internal_id`) hidden.
    Good: column D deleted, or visible and agreed in the contract.
    """,
)
MERGED_CELLS = define_rule(
    "sheet.merged-cells",
    "The sheet has merged cells",
    Severity.WARNING,
    """
    Finds merged cell ranges. Only the first cell of a range holds the value, so the other
    rows of the range read as empty.

    Bad: `A2:A5` merged, showing `VB-014` once for four samples.
    Good: `VB-014` written in each of A2, A3, A4 and A5.
    """,
)
HIDDEN_SHEET = define_rule(
    "sheet.hidden",
    "The sheet is hidden",
    Severity.WARNING,
    """
    Finds worksheets marked hidden or very hidden. Weir checks them like the others, which may
    surprise the sender.

    Bad: a hidden sheet `old_results` left in the workbook.
    Good: only the sheets that are part of the submission, all visible.
    """,
)
EMPTY_SHEETS = define_rule(
    "sheet.empty",
    "The workbook has empty sheets",
    Severity.NOTE,
    """
    Finds worksheets without a single value; Weir skips them.

    Bad: a workbook with sheets `results`, `Sheet2` and `Sheet3`, the last two empty.
    Good: a workbook with only `results`.
    """,
)
STREAMED = define_rule(
    "sheet.streamed",
    "A large workbook was read without its sheet layout",
    Severity.NOTE,
    """
    Finds workbooks so large that Weir read them in streaming mode, which keeps memory bounded
    but cannot see merged cells or hidden rows and columns; those checks did not run.

    Bad: a 300 MB `.xlsx` whose merged and hidden cells Weir cannot vouch for.
    Good: the same data as CSV UTF-8 (no layout to hide), or split into smaller workbooks.
    """,
)
UNCACHED_FORMULAS = define_rule(
    "sheet.formula-without-value",
    "Formulas were saved without their values",
    Severity.WARNING,
    """
    Finds formula cells stored without a calculated value (files written by scripts, or saved
    with calculation switched off). Weir never calculates formulas, so these cells read as
    empty although a spreadsheet program shows a number once it recalculates.

    Bad: `E2` holds `=C2*2` and no saved value.
    Good: the workbook opened and saved once by a spreadsheet program, or the value typed in.
    """,
)
