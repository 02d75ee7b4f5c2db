"""Imports every rule family so that its rules and inspectors are registered."""

from linter.rules import gate as _gate  # noqa: F401
from linter.rules import header, reading, unreadable  # noqa: F401
