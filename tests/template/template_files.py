"""Make templates through the real `weir template` command (shared by the template tests)."""

from __future__ import annotations

from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app

REPO = Path(__file__).resolve().parents[2]
DEMO = ("sites", "stream-chemistry", "field-sheets")
"""The one-table demo contracts (each sheet is named after its contract)."""
BUNDLE = "volunteer-bundle"
"""The demo bundle: one sheet per table."""


def make_template(contract: Path, out: Path, *options: str) -> Path:
    result = CliRunner().invoke(app, ["template", str(contract), "--out", str(out), *options])
    assert result.exit_code == 0, result.output
    return out
