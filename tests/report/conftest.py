"""Fixtures for the report tests: one invented Vell Basin submission with real-shaped findings."""

from __future__ import annotations

import shutil
from collections.abc import Iterator

import pytest
from playwright.sync_api import BrowserContext, sync_playwright
from report_samples import chemistry_report

from linter.report.model import Report


@pytest.fixture()
def report() -> Report:
    return chemistry_report()


CHROMIUM_FLAGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--no-first-run",
]


@pytest.fixture(scope="module")
def browser(tmp_path_factory: pytest.TempPathFactory) -> Iterator[BrowserContext]:
    """A real headless Chromium (Debian's) with a fresh profile, shared within a module (launch is slow)."""
    executable = shutil.which("chromium")
    if executable is None:
        pytest.skip("BROWSER TESTS NOT RUN: Debian's chromium is not installed (apt-get install chromium)")
    with sync_playwright() as driver:
        context = driver.chromium.launch_persistent_context(
            str(tmp_path_factory.mktemp("chromium-profile")),
            executable_path=executable,
            headless=True,
            args=CHROMIUM_FLAGS,
            offline=True,
        )
        try:
            yield context
        finally:
            context.close()
