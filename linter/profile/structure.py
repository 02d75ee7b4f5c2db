"""What profiling found in each table of a submission (keys, dependencies, split), for drafting contracts."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

import pandas as pd

from linter.profile.dependencies import Dependency, functional_dependencies
from linter.profile.evidence import MAX_LHS, mixed_units
from linter.profile.keys import KeySearch, unique_combinations
from linter.profile.normalise import Split


@dataclass(frozen=True)
class TableStructure:
    """What profiling found in one table; a drafted contract takes its keys and units from here."""

    keys: KeySearch
    """Minimal unique column combinations (measurements left out, as the rules do)."""
    dependencies: tuple[Dependency, ...]
    """Minimal exact functional dependencies with at most MAX_LHS determining columns."""
    split: Split | None
    """The split into one table per observational unit, when the evidence is strong enough."""


def discovered_structure(tables: Mapping[str, pd.DataFrame]) -> dict[str, TableStructure]:
    """Keys, dependencies and the proposed split of every table (name -> body of text cells)."""
    found: dict[str, TableStructure] = {}
    for name, body in tables.items():
        keys = unique_combinations(body, skip_measurements=True)
        mixed = mixed_units(body, (), name)
        found[name] = TableStructure(
            keys, functional_dependencies(body, max_lhs=MAX_LHS), mixed.split if mixed else None
        )
    return found
