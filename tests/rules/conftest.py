"""Builds tiny tables and contracts for the rule-family tests, without the reader or the contract loader."""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence

import pandas as pd
import pytest

import linter.rules.catalogue  # noqa: F401  (registers every rule family)
from linter.check import run_inspectors
from linter.contract.model import TableContract
from linter.findings import Finding
from linter.rules.subject import Subject
from linter.table import Frame, Table, first_row_header

Rows = Sequence[Sequence[str | None]]


def table_of(rows: Rows, source: str = "chemistry.csv") -> Table:
    """A CSV-like table whose first line is the header; provider line numbers start at 1."""
    return Table(
        source, None, pd.DataFrame([list(r) for r in rows], dtype=object), tuple(range(1, len(rows) + 1))
    )


def frame_of(rows: Rows, source: str = "sites.csv") -> Frame:
    return first_row_header(table_of(rows, source))


@pytest.fixture()
def check_family() -> Callable[..., list[Finding]]:
    """Run every inspector on a tiny table under `contract`; keep one rule family's findings."""

    def run(
        rows: Rows, contract: TableContract, family: str, others: Mapping[str, Rows] | None = None
    ) -> list[Finding]:
        table = table_of(rows)
        frames = {name: frame_of(other, f"{name}.csv") for name, other in (others or {}).items()}
        subject = Subject(table, first_row_header(table), contract, frames)
        return [f for f in run_inspectors(subject) if not family or f.rule.startswith(family + ".")]

    return run
