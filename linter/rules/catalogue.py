"""Imports every rule family so that its rules and inspectors are registered."""

import linter.rules.columns
import linter.rules.comparisons
import linter.rules.keys
import linter.rules.references
import linter.rules.value_codes
import linter.rules.values  # noqa: F401
from linter.rules import gate as _gate  # noqa: F401
from linter.rules import header, reading, unreadable  # noqa: F401
