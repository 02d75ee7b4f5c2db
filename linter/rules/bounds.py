"""Rules for files Weir stopped handling because a configured bound was reached."""

from __future__ import annotations

from linter.findings import Severity
from linter.rules.registry import define_rule

TOO_MANY_SHEETS = define_rule(
    "file.too-many-sheets",
    "The workbook has more sheets than the limit",
    Severity.ERROR,
    """
    Finds workbooks whose archive lists more worksheets than `[limits] max_sheets` allows; they are
    refused from the archive's table of contents, before any sheet is inflated.

    Bad: a workbook generated with one sheet per sample, 5,000 sheets in all.
    Good: one sheet holding one row per sample.
    """,
)
TIMED_OUT = define_rule(
    "file.timed-out",
    "Reading and checking the file took longer than the time limit",
    Severity.ERROR,
    """
    Finds files that Weir gave up on after `[limits] max_seconds_per_file`; the other files of the
    run are still checked. The file itself is left exactly as it was.

    Bad: one 400 MB sheet with a million formulas' cached values and stray cells far away.
    Good: the same data as a CSV, or split into one file per month.
    """,
)
TOO_DEEP = define_rule(
    "file.too-deep",
    "Folders are nested deeper than the limit",
    Severity.ERROR,
    """
    Finds folders below a checked folder that are nested deeper than `[limits] max_folder_depth`;
    files inside them are not searched, so nothing there is silently taken as checked.

    Bad: `inbox/a/a/a/.../a/results.csv`, forty folders down.
    Good: `inbox/lab-north/2026-03/results.csv`.
    """,
)
OUTSIDE_FOLDER = define_rule(
    "file.outside-folder",
    "A link in the folder points outside it",
    Severity.ERROR,
    """
    Finds symbolic links inside a checked folder that lead to a file or folder outside it; Weir
    does not follow them, so a submission cannot make Weir read (or report) files elsewhere.

    Bad: `inbox/lab-north/results.csv` linking to a file in another user's home folder.
    Good: the file itself copied into `inbox/lab-north/`.
    """,
)
