"""`python -m linter` runs the `weir` command."""

from linter.cli import main

main()
