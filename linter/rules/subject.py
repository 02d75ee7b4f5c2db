"""What an inspector looks at: one table, read with a header, maybe under a contract."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

from linter.contract.model import TableContract
from linter.table import Frame, Table


@dataclass(frozen=True)
class Subject:
    """One table of a submission, with everything an inspector may need and nothing it may change."""

    table: Table
    frame: Frame
    """The table read with its first row as header."""
    contract: TableContract | None = None
    """The table contract that governs this file, if any."""
    others: Mapping[str, Frame] = field(default_factory=dict)
    """Other tables of the same submission by table-contract name, for references across files."""
