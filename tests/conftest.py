"""Suite-wide guards: every test runs in its own temporary folder and may not reach the network."""

from __future__ import annotations

import socket
from pathlib import Path

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
