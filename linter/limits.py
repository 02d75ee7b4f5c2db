"""Every resource bound Weir enforces, with defaults, and how settings' `[limits]` overrides them."""

from __future__ import annotations

import difflib
from collections.abc import Mapping
from dataclasses import dataclass, field, fields, replace

from linter.contract import yaml_tree
from linter.errors import WeirError
from linter.read.limits import ReadLimits

MAX_FOLDER_DEPTH = 32
"""Folders nested deeper than this below a named folder are not searched (`file.too-deep`)."""
SECONDS_PER_FILE = 300.0
"""Reading and checking one file may take this long before it gets `file.timed-out` (0 = no limit)."""


@dataclass(frozen=True)
class Limits:
    """All bounds of one run: the reader's, the contract loader's and the folder walk's."""

    read: ReadLimits = field(default_factory=ReadLimits)
    contract_bytes: int = yaml_tree.MAX_FILE_BYTES
    """Largest contract file (exit 2 with a one-line reason)."""
    contract_nodes: int = yaml_tree.MAX_NODES
    """YAML nodes of a contract after alias expansion (a "billion laughs" contract stops here)."""
    folder_depth: int = MAX_FOLDER_DEPTH
    seconds_per_file: float = SECONDS_PER_FILE


DEFAULT = Limits()

READ_KEYS = tuple(f.name for f in fields(ReadLimits))
"""Settings keys that are ReadLimits fields, named as there (`max_rows`, `max_cell_chars`...)."""
OTHER_KEYS = {
    "max_contract_bytes": "contract_bytes",
    "max_contract_nodes": "contract_nodes",
    "max_folder_depth": "folder_depth",
    "max_seconds_per_file": "seconds_per_file",
}
KNOWN = (*READ_KEYS, *OTHER_KEYS)


def positive_number(value: object, key: str, source: str, whole: bool) -> int | float:
    if isinstance(value, bool) or not isinstance(value, int | float) or value < 0:
        raise WeirError(f"{source}: limits '{key}' must be a number >= 0, not {value!r}")
    if whole and not isinstance(value, int):
        raise WeirError(f"{source}: limits '{key}' must be a whole number, not {value!r}")
    return value


def parse_limits(table: Mapping[str, object], source: str = "settings") -> Limits:
    """The limits a settings `[limits]` table asks for; a misspelt key or bad value is a WeirError."""
    for key in sorted(set(table) - set(KNOWN)):
        close = difflib.get_close_matches(key, KNOWN, n=1)
        hint = f"; did you mean {close[0]!r}?" if close else f" (known: {', '.join(KNOWN)})"
        raise WeirError(f"{source} [limits]: unknown limit {key!r}{hint}")
    read_changes = {k: positive_number(v, k, source, whole=True) for k, v in table.items() if k in READ_KEYS}
    other = {
        name: positive_number(table[k], k, source, whole=k != "max_seconds_per_file")
        for k, name in OTHER_KEYS.items()
        if k in table
    }
    return replace(DEFAULT, read=replace(ReadLimits(), **read_changes), **other)  # type: ignore[arg-type]


def describe_defaults() -> list[tuple[str, str]]:
    """(settings key, default) for every limit, in the order the README lists them."""
    rows = [(key, getattr(DEFAULT.read, key)) for key in READ_KEYS]
    rows += [(key, getattr(DEFAULT, name)) for key, name in OTHER_KEYS.items()]
    return [(key, f"{value:,}" if isinstance(value, int) else f"{value:g}") for key, value in rows]
