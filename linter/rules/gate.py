"""Rules the gatekeepers report about a submission as a whole (no inspector: the gate emits them)."""

from linter.findings import Severity
from linter.rules.registry import define_rule

DUPLICATE = define_rule(
    "gate.duplicate",
    "The same file was already received",
    Severity.WARNING,
    """
    The inbox received a file whose bytes (SHA-256) are identical to an earlier submission,
    so Weir files it without checking it again and points at the first one.

    Bad: sending `chem-2026-01.csv` on Monday and the unchanged file again as `chem-jan.csv`.

    Good: sending a file again only after correcting it, so its content differs.
    """,
)

NO_CONTRACT = define_rule(
    "gate.no-contract",
    "No contract covers the file",
    Severity.ERROR,
    """
    The inbox only accepts files that an agreed contract governs; this file matched none
    of the contracts in the settings (neither their `applies_to` nor a `[[map]]`).

    Bad: `vell-notes.csv` dropped into the inbox when only `chemistry/*.csv` is agreed.

    Good: `chemistry/chem-2026-01.csv`, named as the contract for stream chemistry expects.
    """,
)

NOT_CHECKED = define_rule(
    "gate.not-checked",
    "The file could not be read or checked",
    Severity.ERROR,
    """
    Weir could not read the file as a table at all (an unsupported format, a damaged
    workbook, a file that vanished), so nothing in it could be checked.

    Bad: `results.pdf`, or an `.xlsx` file that is really a renamed zip of photos.

    Good: the same results as `results.csv` (UTF-8) or a workbook saved by a spreadsheet program.
    """,
)
