"""Imports every rule family so that its rules and inspectors are registered."""

from linter.rules import header, reading, unreadable  # noqa: F401
from linter.rules import layout_cells as _layout_cells  # noqa: F401
from linter.rules import layout_headers as _layout_headers  # noqa: F401
from linter.rules import layout_margins as _layout_margins  # noqa: F401
from linter.rules import layout_rows as _layout_rows  # noqa: F401
