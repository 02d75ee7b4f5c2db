"""The installed CLI never opens a network connection, proven in a child process with its own guard.

The suite's autouse guard only covers this process; here each command runs as
`python -m linter ...` with a `sitecustomize` that logs and refuses every socket connection
and name lookup. A control run shows the guard does catch a real attempt.
"""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pytest

GUARD = """
import os, socket
LOG = os.environ["WEIR_NETWORK_LOG"]

def refuse(*args, **kwargs):
    with open(LOG, "a", encoding="utf-8") as handle:
        handle.write(repr(args[1:3] if len(args) > 1 else args) + "\\n")
    raise OSError("network refused by the test guard")

socket.socket.connect = refuse
socket.socket.connect_ex = refuse
socket.socket.sendto = refuse
socket.create_connection = refuse
socket.getaddrinfo = refuse
"""
CONTRACT = (
    "contract: stream-chemistry\nversion: 1\nobservational_unit: one sample at one site\n"
    "keys: [site_id]\nvariables:\n  site_id: {type: string}\n  result: {type: number}\n"
)


def guarded_run(tmp_path: Path, *args: str) -> tuple[subprocess.CompletedProcess[str], str]:
    guard = tmp_path / "guard"
    guard.mkdir(exist_ok=True)
    (guard / "sitecustomize.py").write_text(GUARD, encoding="utf-8")
    log = tmp_path / "network.log"
    log.touch()
    env = dict(os.environ, PYTHONPATH=str(guard), WEIR_NETWORK_LOG=str(log))
    done = subprocess.run(
        [sys.executable, *args], cwd=tmp_path, env=env, capture_output=True, text=True, timeout=120
    )
    return done, log.read_text(encoding="utf-8")


def test_the_guard_catches_a_real_attempt(tmp_path: Path) -> None:
    # 192.0.2.1 is TEST-NET-1 (Source: RFC 5737 §3), never routed; the guard refuses before trying.
    code = (
        "import urllib.request\n"
        "try:\n urllib.request.urlopen('http://192.0.2.1/', timeout=1)\n"
        "except OSError:\n pass"
    )
    _, log = guarded_run(tmp_path, "-c", code)
    assert log.strip()


@pytest.mark.parametrize(
    "command",
    [
        [
            "check",
            "data.csv",
            "-c",
            "c.yaml",
            "--report",
            "r.json",
            "--letter",
            "l.html",
            "--sarif",
            "r.sarif",
        ],
        ["check", "book.xlsx", "-c", "c.yaml"],
        ["tidy", "--out", "tidy", "wide.csv"],
        ["explain", "file.zip-bomb"],
        ["gate", "inbox", "-c", "c.yaml"],
    ],
    ids=lambda c: c[0] + ":" + c[1],
)
def test_no_command_touches_the_network(tmp_path: Path, command: list[str]) -> None:
    from openpyxl import Workbook

    (tmp_path / "c.yaml").write_text(CONTRACT, encoding="utf-8")
    # A link to an outside address in a cell must stay text: nothing follows it.
    (tmp_path / "data.csv").write_text("site_id,result\nVB-014,4.2\nhttp://192.0.2.1/x,1\n", encoding="utf-8")
    (tmp_path / "wide.csv").write_text(
        "site_id,2026-01,2026-02\nVB-014,4.2,4.0\nVB-015,1,2\n", encoding="utf-8"
    )
    book = Workbook()
    sheet = book.active
    assert sheet is not None
    sheet.append(["site_id", "result"])
    sheet.append(['=HYPERLINK("http://192.0.2.1/","VB-014")', 4.2])
    book.save(tmp_path / "book.xlsx")
    (tmp_path / "inbox" / "lab-north").mkdir(parents=True)
    (tmp_path / "inbox" / "lab-north" / "data.csv").write_text(
        "site_id,result\nVB-014,4.2\n", encoding="utf-8"
    )
    (tmp_path / "weir.toml").write_text("[inbox]\nsettle_seconds = 0\n", encoding="utf-8")
    done, log = guarded_run(tmp_path, "-m", "linter", *command)
    assert "Traceback" not in done.stderr, done.stderr
    assert done.returncode in (0, 1), done.stderr
    assert log == ""
