"""Imports every rule family so that its rules and inspectors are registered."""

from linter.rules import (  # noqa: F401
    columns,
    comparisons,
    gate,
    header,
    keys,
    layout_cells,
    layout_groups,
    layout_header_rows,
    layout_headers,
    layout_index,
    layout_margins,
    layout_rows,
    reading,
    references,
    submission_units,
    units,
    unreadable,
    value_codes,
    value_patterns,
    values,
)
