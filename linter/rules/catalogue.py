"""Imports every rule family so that its rules and inspectors are registered."""

from linter.rules import (  # noqa: F401
    columns,
    comparisons,
    header,
    keys,
    reading,
    references,
    unreadable,
    value_codes,
    values,
)
