"""What changed since the previous contract version, in sentences, from the contract comparison."""

from __future__ import annotations

from collections.abc import Iterable
from typing import Protocol

from linter.contract.model import Contract


class ContractChange(Protocol):
    """The part of a change record (from `weir diff`) the dictionary shows, read-only like a frozen record."""

    @property
    def table(self) -> str: ...
    @property
    def subject(self) -> str: ...
    @property
    def breaking(self) -> bool: ...
    @property
    def message(self) -> str: ...


def change_sentences(changes: Iterable[ContractChange]) -> tuple[str, ...]:
    """One sentence per change, breaking ones first (a provider must act on those)."""
    ordered = sorted(changes, key=lambda c: not c.breaking)
    return tuple(
        f"{c.table}.{c.subject}: {c.message}"
        + (" This may make a file that passed fail." if c.breaking else "")
        for c in ordered
    )


def changes_since(previous: Contract, current: Contract) -> tuple[str, ...]:
    """What changed from `previous` to `current`, as the comparison behind `weir diff` judges it."""
    from linter.draft.diff import contract_changes

    return change_sentences(contract_changes(previous, current))
