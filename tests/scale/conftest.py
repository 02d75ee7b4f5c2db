"""Fixtures of the scale tests."""

from __future__ import annotations

from pathlib import Path

import pytest
from scale_lab_data import CONTRACT


@pytest.fixture
def contract_file(tmp_path: Path) -> Path:
    path = tmp_path / "lab-results.yaml"
    path.write_text(CONTRACT, encoding="utf-8")
    return path
