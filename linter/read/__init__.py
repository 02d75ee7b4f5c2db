"""Reading submitted files into Tables: every cell as text, with the provider's row numbers."""

from __future__ import annotations

from linter.table import Table

SUPPORTED_SUFFIXES = frozenset({".csv", ".tsv", ".txt", ".xlsx", ".xlsm", ".parquet"})


class UnreadableFile(Exception):
    """The file's content cannot be read as a table at all (a finding, not a Weir failure)."""

    def __init__(self, rule: str, message: str, fix: str = "") -> None:
        super().__init__(message)
        self.rule = rule
        """Rule id of the finding this becomes, e.g. `file.not-a-table`."""
        self.message = message
        self.fix = fix


def read_path(path: str) -> list[Table]:
    """Read one file into its tables (one per Excel sheet). Raises UnreadableFile or OSError."""
    raise NotImplementedError("the reader lands with the read/ package")
