"""The `weir` command: one module per command, each a thin typer function returning an exit code."""

from linter.cli import check as _check  # noqa: F401  (registers the command)
from linter.cli import dictionary as _dictionary  # noqa: F401
from linter.cli import diff as _diff  # noqa: F401
from linter.cli import draft as _draft  # noqa: F401
from linter.cli import explain as _explain  # noqa: F401
from linter.cli import gate as _gate  # noqa: F401
from linter.cli import ledger as _ledger  # noqa: F401
from linter.cli import template as _template  # noqa: F401
from linter.cli import tidy as _tidy  # noqa: F401
from linter.cli.app import app


def main() -> None:
    """Console entry point."""
    app()
