"""Templates generated through the real `weir template` command, once per test module."""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

sys.path.insert(0, str(Path(__file__).parent))  # the helper modules beside these tests

from template_files import BUNDLE, DEMO, REPO, make_template


@pytest.fixture(scope="module")
def templates(tmp_path_factory: pytest.TempPathFactory) -> dict[str, Path]:
    """Contract id -> a template workbook of that demo contract, made once per module (tests copy it)."""
    folder = tmp_path_factory.mktemp("templates")
    return {
        name: make_template(REPO / "contracts" / f"{name}.yaml", folder / f"{name}-template.xlsx")
        for name in (*DEMO, BUNDLE)
    }


@pytest.fixture()
def demo_contracts() -> list[Path]:
    return [REPO / "contracts" / f"{name}.yaml" for name in (*DEMO, BUNDLE)]
