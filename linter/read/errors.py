"""The one exception of the reader (content that is not a table at all) and its common causes."""

from __future__ import annotations

from linter.read.limits import ReadLimits


class UnreadableFile(Exception):
    """The file's content cannot be read as a table at all (a finding, not a Weir failure)."""

    def __init__(self, rule: str, message: str, fix: str = "") -> None:
        super().__init__(message)
        self.rule = rule
        """Rule id of the finding this becomes, e.g. `file.not-a-table`."""
        self.message = message
        self.fix = fix


def too_many_cells(limits: ReadLimits) -> UnreadableFile:
    return UnreadableFile(
        "file.too-many-cells",
        f"The table has more than {limits.max_cells:,} cells, so it was not read further.",
        "Split the submission into smaller files.",
    )
