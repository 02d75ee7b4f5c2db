"""Suite-wide guards: every test runs in its own temporary folder and may not reach the network."""

from __future__ import annotations

import shutil
import socket
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest
from hypothesis import settings

# `pytest --hypothesis-profile=long` for long property runs by hand; tests that pick their own
# small example count for the suite read `settings.default.max_examples` to honour it.
settings.register_profile("long", max_examples=400, deadline=None)

REPO = Path(__file__).resolve().parent.parent


@pytest.fixture(autouse=True)
def _in_tmp_folder(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    """Relative paths a test writes land in its own tmp_path, never in the checkout."""
    monkeypatch.chdir(tmp_path)


@pytest.fixture(autouse=True)
def _no_network(monkeypatch: pytest.MonkeyPatch) -> None:
    """Weir never opens a network connection; only loopback (a local browser) is allowed in tests."""
    real_connect = socket.socket.connect

    def guarded_connect(self: socket.socket, address: object) -> object:
        host = address[0] if isinstance(address, tuple) else str(address)
        if self.family == socket.AF_UNIX or host in {"127.0.0.1", "::1", "localhost"}:
            return real_connect(self, address)  # type: ignore[arg-type]
        raise AssertionError(f"a test tried to connect to {address!r}")

    monkeypatch.setattr(socket.socket, "connect", guarded_connect)


@pytest.fixture()
def repo() -> Path:
    """The project checkout (read-only for tests)."""
    return REPO


CHROMIUM_FLAGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--no-first-run",
]
"""Flags that let Debian's chromium start here without reaching for the network."""


@pytest.fixture(scope="module")
def browser(tmp_path_factory: pytest.TempPathFactory) -> Iterator[Any]:
    """A real headless Chromium (Debian's) with a fresh profile, shared within a module (launch is slow)."""
    executable = shutil.which("chromium")
    if executable is None:
        pytest.skip("BROWSER TESTS NOT RUN: Debian's chromium is not installed (apt-get install chromium)")
    from playwright.sync_api import sync_playwright

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
