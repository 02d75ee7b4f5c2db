"""Fuzz target: any bytes named .csv either read as tables or give an UnreadableFile verdict."""

from __future__ import annotations

import sys

import atheris

# Only Weir's own modules are instrumented: pandas and friends are imported by them
# uninstrumented, or start-up would take minutes. Lazy imports are made here, inside.
with atheris.instrument_imports(include=["linter"]):
    import linter.read.delimited
    import linter.read.encoding
    import linter.read.lines  # noqa: F401  (instrumented for coverage)
    from linter.read import UnreadableFile, read_path
    from linter.read.limits import ReadLimits

from verdicts import scratch_file

# Small limits keep each run fast; the limit paths are part of what is fuzzed.
LIMITS = ReadLimits(max_line_chars=20_000, max_cell_chars=5_000, max_columns=2_000, max_rows=5_000)


def test_one_input(data: bytes) -> None:
    path = scratch_file("input.csv", data)
    try:
        tables = read_path(path, LIMITS)
    except UnreadableFile as verdict:
        assert verdict.rule.startswith("file.") and verdict.message
        return
    for table in tables:
        assert len(table.row_numbers) == table.grid.shape[0]


if __name__ == "__main__":
    atheris.Setup(sys.argv, test_one_input)
    atheris.Fuzz()
