"""Fixtures for the report tests: one invented Vell Basin submission with real-shaped findings."""

from __future__ import annotations

import pytest
from report_samples import chemistry_report

from linter.report.model import Report


@pytest.fixture()
def report() -> Report:
    return chemistry_report()
