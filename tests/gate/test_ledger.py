"""The SQLite ledger: atomic claims between two gates, the journal, rates and schema migration."""

from __future__ import annotations

import sqlite3
from pathlib import Path

import pytest

from linter.errors import WeirError
from linter.gate.ledger import MIGRATIONS, SCHEMA_VERSION, Outcome, SqliteLedger, migrate, schema_version


def outcome(verdict: str, errors: int = 0) -> Outcome:
    return Outcome(verdict, "stream-chemistry", "2", errors, 0, 0, "accepted/x.report.json")


def test_one_claim_per_key_even_across_two_connections(tmp_path: Path) -> None:
    first = SqliteLedger(tmp_path / "ledger.sqlite")
    second = SqliteLedger(tmp_path / "ledger.sqlite")
    a = first.claim("abc", "north-lab", "north-lab/chem.csv", "abc", 10, "gate-a")
    b = second.claim("abc", "north-lab", "north-lab/chem.csv", "abc", 10, "gate-b")
    assert a is not None and b is None
    assert second.get(a).owner == "gate-a"
    first.close()
    second.close()


def test_journal_moves_forward_and_take_over_is_conditional(tmp_path: Path) -> None:
    ledger = SqliteLedger(tmp_path / "ledger.sqlite")
    entry_id = ledger.claim("k1", "vb-volunteers", "vb-volunteers/a.csv", "h1", 5, "dead")
    assert entry_id is not None
    assert [e.id for e in ledger.unfinished()] == [entry_id]
    assert not ledger.take_over(entry_id, "someone-else", "me")  # wrong previous owner: refused
    assert ledger.take_over(entry_id, "dead", "me")
    ledger.mark_checked(entry_id, outcome("returned", errors=3))
    ledger.mark_filed(entry_id, "returned/vb-volunteers/000001-a.csv")
    ledger.mark_done(entry_id)
    entry = ledger.get(entry_id)
    assert (entry.state, entry.owner, entry.verdict, entry.errors) == ("done", "me", "returned", 3)
    assert entry.checked_at and entry.filed_at and entry.done_at
    assert ledger.unfinished() == []
    assert not ledger.take_over(entry_id, "me", "other")  # a finished row cannot be taken


def test_rates_count_verdicts_per_provider(tmp_path: Path) -> None:
    ledger = SqliteLedger(tmp_path / "ledger.sqlite")
    verdicts = [("north-lab", "accepted"), ("north-lab", "returned"), ("north-lab", "accepted")]
    verdicts += [("east-county", "returned"), ("east-county", "duplicate")]
    for n, (provider, verdict) in enumerate(verdicts):
        entry_id = ledger.claim(f"k{n}", provider, f"{provider}/f{n}.csv", f"h{n}", 1, "me")
        assert entry_id is not None
        ledger.mark_checked(entry_id, outcome(verdict))
    rates = {r.provider: r for r in ledger.rates()}
    assert (rates["north-lab"].accepted, rates["north-lab"].returned) == (2, 1)
    assert rates["north-lab"].acceptance == pytest.approx(2 / 3)
    assert (rates["east-county"].duplicates, rates["east-county"].acceptance) == (1, 0.0)
    assert [e.file_name for e in ledger.recent(2)] == ["east-county/f4.csv", "east-county/f3.csv"]


def test_ledger_runs_in_wal_mode(tmp_path: Path) -> None:
    # Source: SQLite documentation "Write-Ahead Logging" (PRAGMA journal_mode returns "wal")
    ledger = SqliteLedger(tmp_path / "ledger.sqlite")
    assert ledger.connection.execute("PRAGMA journal_mode").fetchone()[0] == "wal"


def test_migration_from_v1_keeps_rows_and_adds_the_new_column(tmp_path: Path) -> None:
    path = tmp_path / "ledger.sqlite"
    old = sqlite3.connect(path, isolation_level=None)
    assert migrate(old, upto=1) == 1
    old.execute(
        "INSERT INTO submissions (claim_key, provider, file_name, sha256, size, state, owner, received_at)"
        " VALUES ('k', 'north-lab', 'north-lab/a.csv', 'h', 3, 'done', 'x', '2026-01-05T10:00:00+00:00')"
    )
    old.close()
    ledger = SqliteLedger(path)
    assert schema_version(ledger.connection) == SCHEMA_VERSION == len(MIGRATIONS) >= 2
    columns = {row[1] for row in ledger.connection.execute("PRAGMA table_info(submissions)")}
    assert {"duplicate_of", "mtime_ns"} <= columns
    (entry,) = ledger.with_hash("h")
    assert (entry.file_name, entry.duplicate_of) == ("north-lab/a.csv", None)


def test_a_ledger_from_a_newer_weir_is_refused(tmp_path: Path) -> None:
    path = tmp_path / "ledger.sqlite"
    SqliteLedger(path).close()
    raw = sqlite3.connect(path, isolation_level=None)
    raw.execute("INSERT INTO schema_version (version) VALUES (?)", (SCHEMA_VERSION + 1,))
    raw.close()
    with pytest.raises(WeirError, match="newer Weir"):
        SqliteLedger(path)


def test_a_file_that_is_not_a_database_is_a_one_line_error(tmp_path: Path) -> None:
    path = tmp_path / "ledger.sqlite"
    path.write_text("site_id,result\nVB-001,0.4\n")
    with pytest.raises(WeirError, match="not a usable ledger"):
        SqliteLedger(path)
    assert path.read_text() == "site_id,result\nVB-001,0.4\n"


OPEN_LEDGER = """
import sys, time
from pathlib import Path
from linter.gate.ledger import SqliteLedger
start = float(sys.argv[2])
time.sleep(max(0.0, start - time.time()))
SqliteLedger(Path(sys.argv[1])).close()
"""


def test_gates_opening_a_new_ledger_at_once_migrate_it_once(tmp_path: Path) -> None:
    import subprocess
    import sys
    import time

    script = tmp_path / "open_ledger.py"
    script.write_text(OPEN_LEDGER)
    start = str(time.time() + 1.5)  # every process is imported and waiting before the first opens
    processes = [
        subprocess.Popen(
            [sys.executable, str(script), str(tmp_path / "ledger.sqlite"), start], stderr=subprocess.PIPE
        )
        for _ in range(4)
    ]
    errors = [p.communicate(timeout=60)[1].decode() for p in processes]
    assert [p.returncode for p in processes] == [0, 0, 0, 0], errors
    check = sqlite3.connect(tmp_path / "ledger.sqlite")
    versions = [v for (v,) in check.execute("SELECT version FROM schema_version ORDER BY version")]
    assert versions == list(range(1, SCHEMA_VERSION + 1))
