"""The inbox gate: good, bad, unreadable, duplicate and half-written files, crashes and two gates."""

from __future__ import annotations

import hashlib
import itertools
import os
import signal
import subprocess
import sys
import time
from collections import Counter
from collections.abc import Callable
from pathlib import Path

import pytest
from csv_checker import check_csv

import linter.gate.inbox as inbox_module
from linter.config import InboxLayout
from linter.gate.answer import guarded
from linter.gate.inbox import Gate, new_owner, provider_of, run_pass
from linter.gate.ledger import Entry, SqliteLedger

GOOD = "site_id,sampled_on,result\nVB-014,2026-01-12,0.42\nVB-015,2026-01-12,0.38\n"
BAD = "site_id,sampled_on,result\nVB-014,2026-01-12,\nVB-015,2026-01-12,0.38\n"
LAYOUT = InboxLayout(settle_seconds=30)
PAST = time.time() - 3600
DROPPED = itertools.count()


class Crash(BaseException):
    """Stands for the gate process dying: not an Exception, so nothing on the way catches it."""


def drop(inbox: Path, relative: str, data: bytes | str, settled: bool = True) -> Path:
    path = inbox / relative
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_bytes(data.encode() if isinstance(data, str) else data)
    if settled:  # an hour old, one second apart in the order dropped
        stamp = PAST + next(DROPPED)
        os.utime(path, (stamp, stamp))
    return path


def submissions(inbox: Path) -> Counter[str]:
    """Hashes of every submitted file anywhere under the inbox (reports, letters and the ledger aside)."""
    found: Counter[str] = Counter()
    for path in inbox.rglob("*"):
        if (
            path.is_file()
            and ".weir" not in path.parts
            and ".letter." not in path.name
            and not path.name.endswith(".json")
        ):
            found[hashlib.sha256(path.read_bytes()).hexdigest()] += 1
    return found


def gate(inbox: Path, check: object = check_csv) -> Gate:
    ledger = SqliteLedger(inbox / LAYOUT.ledger)
    return Gate(inbox, LAYOUT, ledger, guarded(check), new_owner())  # type: ignore[arg-type]


def test_a_mixed_inbox_is_sorted_answered_and_nothing_is_lost(tmp_path: Path) -> None:
    inbox = tmp_path / "inbox"
    drop(inbox, "north-lab/chem-2026-01.csv", GOOD)
    drop(inbox, "north-lab/chem-2026-02.csv", BAD)
    drop(inbox, "east-county/field-sheet.xlsx", b"PK\x03\x04\xff\xfe not really a workbook")
    drop(inbox, "east-county/chem-again.csv", GOOD)  # the same bytes as north-lab's January file
    drop(inbox, "vb-volunteers/chem-2026-03.csv", GOOD.replace("0.42", "0.44"), settled=False)
    before = submissions(inbox)

    events = {e.file: e for e in run_pass(gate(inbox))}

    assert events["north-lab/chem-2026-01.csv"].action == "accepted"
    assert events["north-lab/chem-2026-02.csv"].action == "returned"
    assert events["east-county/field-sheet.xlsx"].action == "returned"
    assert events["east-county/chem-again.csv"].action == "duplicate"
    assert events["vb-volunteers/chem-2026-03.csv"].reason == "still arriving"
    assert sorted(p.name.split(".letter.")[0] for p in (inbox / "accepted").rglob("*")) == [
        "000001-chem-2026-01.csv",
        "000001-chem-2026-01.csv",  # its letter
        "000001-chem-2026-01.csv.report.json",
        "north-lab",
    ]
    returned = sorted(
        p.relative_to(inbox / "returned").as_posix() for p in (inbox / "returned").rglob("*.csv")
    )
    assert returned == ["east-county/000004-chem-again.csv", "north-lab/000002-chem-2026-02.csv"]
    assert (inbox / "returned/east-county/000003-field-sheet.xlsx.report.json").read_text().count(
        "gate.not-checked"
    ) == 1
    assert "gate.duplicate" in (inbox / "returned/east-county/000004-chem-again.csv.report.json").read_text()
    assert "values.missing" in (inbox / "returned/north-lab/000002-chem-2026-02.csv.report.json").read_text()
    (letter,) = (inbox / "returned/north-lab").glob("000002-chem-2026-02.csv.letter.*")
    assert "chem-2026-02.csv" in letter.read_text()
    assert [p.relative_to(inbox).as_posix() for p in inbox.glob("*/*.csv")] == [
        "vb-volunteers/chem-2026-03.csv"
    ]
    assert submissions(inbox) == before

    ledger = SqliteLedger(inbox / LAYOUT.ledger)
    rows = {e.file_name: e for e in ledger.recent(10)}
    assert {name: e.verdict for name, e in rows.items()} == {
        "north-lab/chem-2026-01.csv": "accepted",
        "north-lab/chem-2026-02.csv": "returned",
        "east-county/field-sheet.xlsx": "returned",
        "east-county/chem-again.csv": "duplicate",
    }
    assert rows["east-county/chem-again.csv"].duplicate_of == rows["north-lab/chem-2026-01.csv"].id
    assert rows["north-lab/chem-2026-02.csv"].errors == 1
    assert all(e.state == "done" and e.size > 0 for e in rows.values())
    assert rows["north-lab/chem-2026-01.csv"].contract == "stream-chemistry"

    # A second run finds nothing new; once the half-written file settles it goes through.
    assert [e.action for e in run_pass(gate(inbox))] == ["skipped"]
    os.utime(inbox / "vb-volunteers/chem-2026-03.csv", (PAST, PAST))
    assert [e.action for e in run_pass(gate(inbox))] == ["accepted"]
    assert len(ledger.recent(10)) == 5
    assert submissions(inbox) == before


def test_the_provider_comes_from_settings_first_then_the_subfolder() -> None:
    layout = InboxLayout(providers={"shared/ridge-*": "ridge-volunteers"})
    assert provider_of("shared/ridge-2026-01.csv", layout) == "ridge-volunteers"
    assert provider_of("north-lab/x.csv", layout) == "north-lab"
    assert provider_of("loose.csv", layout) == "unknown"


@pytest.mark.parametrize("crash_in", ["check_step", "copy_verified", "release_step"])
def test_a_gate_killed_mid_file_is_resumed_by_the_next(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch, crash_in: str
) -> None:
    inbox = tmp_path / "inbox"
    drop(inbox, "north-lab/chem-2026-01.csv", GOOD)
    before = submissions(inbox)

    def die(*args: object) -> None:
        raise Crash

    with monkeypatch.context() as patched:
        patched.setattr(inbox_module, crash_in, die)
        with pytest.raises(Crash):
            run_pass(gate(inbox))
    (stuck,) = SqliteLedger(inbox / LAYOUT.ledger).unfinished()
    expected_state = {"check_step": "claimed", "copy_verified": "checked", "release_step": "filed"}
    assert stuck.state == expected_state[crash_in]
    assert (inbox / "north-lab/chem-2026-01.csv").is_file()  # the original stays until filed and verified

    events = run_pass(gate(inbox))
    assert [(e.action, e.entry) for e in events] == [("accepted", stuck.id)]
    ledger = SqliteLedger(inbox / LAYOUT.ledger)
    assert len(ledger.recent(10)) == 1 and ledger.unfinished() == []
    assert sorted(p.name.split(".letter.")[0] for p in (inbox / "accepted/north-lab").iterdir()) == [
        "000001-chem-2026-01.csv",
        "000001-chem-2026-01.csv",  # its letter
        "000001-chem-2026-01.csv.report.json",
    ]
    assert submissions(inbox) == before


GATE_SCRIPT = """
import sys, time
from pathlib import Path
import csv_checker
from linter.config import InboxLayout
from linter.gate.answer import guarded
from linter.gate.inbox import Gate, new_owner, run_pass
from linter.gate.ledger import Entry, SqliteLedger

inbox, marker, delay = Path(sys.argv[1]), Path(sys.argv[2]), float(sys.argv[3])
csv_checker.DELAY = delay
def check(path):
    marker.write_text("claimed")
    return csv_checker.check_csv(path)
layout = InboxLayout(settle_seconds=30)
events = run_pass(Gate(inbox, layout, SqliteLedger(inbox / layout.ledger), guarded(check), new_owner()))
print(" ".join(f"{e.file}={e.action}" for e in events))
"""


def start_gate(tmp_path: Path, inbox: Path, name: str, delay: float) -> subprocess.Popen[str]:
    script = tmp_path / "run_gate.py"
    script.write_text(GATE_SCRIPT)
    env = {**os.environ, "PYTHONPATH": str(Path(__file__).parent)}
    return subprocess.Popen(
        [sys.executable, str(script), str(inbox), str(tmp_path / name), str(delay)],
        env=env,
        stdout=subprocess.PIPE,
        text=True,
    )


def test_a_gate_killed_by_a_real_signal_is_resumed(tmp_path: Path) -> None:
    inbox = tmp_path / "inbox"
    drop(inbox, "north-lab/chem-2026-01.csv", GOOD)
    process = start_gate(tmp_path, inbox, "marker", delay=60)
    deadline = time.time() + 30
    while not (tmp_path / "marker").exists() and time.time() < deadline:
        time.sleep(0.05)
    process.send_signal(signal.SIGKILL)
    process.wait()
    (stuck,) = SqliteLedger(inbox / LAYOUT.ledger).unfinished()
    assert stuck.state == "claimed"
    assert [e.action for e in run_pass(gate(inbox))] == ["accepted"]
    assert not (inbox / "north-lab/chem-2026-01.csv").exists()
    assert (inbox / "accepted/north-lab/000001-chem-2026-01.csv").read_text() == GOOD


def test_two_gates_on_one_inbox_never_handle_a_file_twice(tmp_path: Path) -> None:
    inbox = tmp_path / "inbox"
    for n in range(8):
        drop(inbox, f"north-lab/chem-{n:02d}.csv", GOOD.replace("0.42", f"0.{n}1"))
    before = submissions(inbox)
    gates = [start_gate(tmp_path, inbox, f"marker-{g}", delay=0.05) for g in "ab"]
    outputs = [p.communicate(timeout=60)[0] for p in gates]
    assert all(p.returncode == 0 for p in gates)
    handled = Counter(
        word.split("=")[0] for out in outputs for word in out.split() if not word.endswith("=skipped")
    )
    assert sorted(handled) == [f"north-lab/chem-{n:02d}.csv" for n in range(8)]
    assert set(handled.values()) == {1}
    ledger = SqliteLedger(inbox / LAYOUT.ledger)
    assert len(ledger.recent(20)) == 8 and ledger.unfinished() == []
    assert submissions(inbox) == before


class LateLedger(SqliteLedger):
    """A ledger that lets another gate run just before this gate's first look-up of a hash."""

    def __init__(self, path: Path, meanwhile: Callable[[], object]) -> None:
        super().__init__(path)
        self.meanwhile: Callable[[], object] | None = meanwhile

    def with_hash(self, sha256: str) -> list[Entry]:
        if self.meanwhile is not None:
            run, self.meanwhile = self.meanwhile, None
            run()
        return super().with_hash(sha256)


def test_a_file_filed_by_another_gate_while_this_one_hashed_it_is_not_taken_for_a_duplicate(
    tmp_path: Path,
) -> None:
    inbox = tmp_path / "inbox"
    drop(inbox, "north-lab/chem-2026-01.csv", GOOD)
    other = gate(inbox)
    ledger = LateLedger(inbox / LAYOUT.ledger, lambda: run_pass(other))
    this = Gate(inbox, LAYOUT, ledger, guarded(check_csv), new_owner())
    assert [(e.action, e.reason) for e in run_pass(this)] == [("skipped", "another gate has just filed it")]
    assert len(ledger.recent(10)) == 1 and ledger.unfinished() == []
    assert not (inbox / "returned").exists()


def test_the_same_file_dropped_again_later_is_a_duplicate(tmp_path: Path) -> None:
    inbox = tmp_path / "inbox"
    drop(inbox, "north-lab/chem-2026-01.csv", GOOD)
    run_pass(gate(inbox))
    drop(inbox, "north-lab/chem-2026-01.csv", GOOD)
    assert [e.action for e in run_pass(gate(inbox))] == ["duplicate"]


def test_the_ledger_records_the_published_sha256_of_a_submission(tmp_path: Path) -> None:
    inbox = tmp_path / "inbox"
    drop(inbox, "north-lab/abc.csv", "abc")  # three bytes; the stand-in checker returns it as unreadable
    (event,) = run_pass(gate(inbox))
    entry = SqliteLedger(inbox / LAYOUT.ledger).get(event.entry or 0)
    # Source: NIST FIPS 180-4 examples (CSRC "SHA256.pdf"), one-block message "abc"
    assert entry.sha256 == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
    assert entry.size == 3
    # Source: ISO 8601 extended format with a UTC offset, as read by Python's datetime.fromisoformat
    from datetime import datetime, timedelta

    for stamp in (entry.received_at, entry.checked_at, entry.filed_at, entry.done_at):
        assert stamp is not None and datetime.fromisoformat(stamp).utcoffset() == timedelta(0)
    # Source: SQLite documentation, PRAGMA integrity_check answers the single row "ok" for a sound file
    assert SqliteLedger(inbox / LAYOUT.ledger).connection.execute("PRAGMA integrity_check").fetchall() == [
        ("ok",)
    ]


def test_a_ledger_kept_in_plain_sight_inside_the_inbox_is_not_taken_for_a_submission(tmp_path: Path) -> None:
    inbox = tmp_path / "inbox"
    layout = InboxLayout(settle_seconds=0, ledger="gate-ledger.sqlite")
    drop(inbox, "north-lab/chem-2026-01.csv", GOOD)
    keeper = Gate(inbox, layout, SqliteLedger(inbox / layout.ledger), guarded(check_csv), new_owner())
    assert [e.file for e in run_pass(keeper)] == ["north-lab/chem-2026-01.csv"]
    assert [e.file for e in run_pass(keeper)] == []
    assert (inbox / "gate-ledger.sqlite").is_file()
