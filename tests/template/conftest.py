"""Templates generated through the real `weir template` command, once per test module."""

from __future__ import annotations

import sys
from pathlib import Path

import pytest
from typer.testing import CliRunner

from linter.cli import app

sys.path.insert(0, str(Path(__file__).parent))  # the helper modules beside these tests

REPO = Path(__file__).resolve().parents[2]
DEMO = ("sites", "stream-chemistry", "field-sheets")


def make_template(contract: Path, out: Path, *options: str) -> Path:
    result = CliRunner().invoke(app, ["template", str(contract), "--out", str(out), *options])
    assert result.exit_code == 0, result.output
    return out


@pytest.fixture(scope="module")
def templates(tmp_path_factory: pytest.TempPathFactory) -> dict[str, Path]:
    """Contract id -> a template workbook of that demo contract, made once per module (tests copy it)."""
    folder = tmp_path_factory.mktemp("templates")
    return {
        name: make_template(REPO / "contracts" / f"{name}.yaml", folder / f"{name}-template.xlsx")
        for name in DEMO
    }


@pytest.fixture()
def demo_contracts() -> list[Path]:
    return [REPO / "contracts" / f"{name}.yaml" for name in DEMO]
