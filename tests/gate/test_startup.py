"""Start-up stays light: `weir --help` and loading the hook import none of the heavy libraries."""

from __future__ import annotations

import subprocess
import sys

HEAVY = ("pandas", "pandera", "pyarrow", "openpyxl", "numpy", "ruamel.yaml")

PROBE = """
import sys
from typer.testing import CliRunner
from linter.cli import app
import linter.gate.hook
result = CliRunner().invoke(app, ["--help"])
assert result.exit_code == 0, result.output
assert "gate" in result.output and "ledger" in result.output
print(" ".join(m for m in {heavy!r} if m in sys.modules))
"""


def test_help_and_the_hook_load_without_heavy_libraries() -> None:
    done = subprocess.run(
        [sys.executable, "-c", PROBE.format(heavy=HEAVY)], capture_output=True, text=True, timeout=60
    )
    assert done.returncode == 0, done.stderr
    assert done.stdout.split() == []
