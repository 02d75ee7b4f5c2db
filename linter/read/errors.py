"""The one exception of the reader: content that is not a table at all."""

from __future__ import annotations


class UnreadableFile(Exception):
    """The file's content cannot be read as a table at all (a finding, not a Weir failure)."""

    def __init__(self, rule: str, message: str, fix: str = "") -> None:
        super().__init__(message)
        self.rule = rule
        """Rule id of the finding this becomes, e.g. `file.not-a-table`."""
        self.message = message
        self.fix = fix
