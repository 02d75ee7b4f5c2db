"""The submission ledger: one row per file received, behind a narrow interface, stored in SQLite.

The row doubles as the gate's journal (claimed -> checked -> filed -> done), so a gate
killed mid-file can tell exactly which step to resume from.
"""

from __future__ import annotations

import sqlite3
import time
from collections.abc import Sequence
from dataclasses import dataclass, fields
from datetime import UTC, datetime
from pathlib import Path
from typing import Protocol

STATES = ("claimed", "checked", "filed", "done")
"""Journal steps in order; a row only ever moves forward."""


@dataclass(frozen=True)
class Entry:
    """One submission as the ledger remembers it."""

    id: int
    claim_key: str
    """Unique per processing: the hash for a first arrival, hash + suffix for a duplicate."""
    provider: str
    file_name: str
    """Path of the file inside the inbox, as the provider dropped it."""
    sha256: str
    size: int
    state: str
    owner: str
    """Which gate holds the claim (host:pid)."""
    received_at: str
    contract: str | None = None
    contract_version: str | None = None
    verdict: str | None = None
    """accepted, returned or duplicate; None until checked."""
    errors: int = 0
    warnings: int = 0
    notes: int = 0
    report_path: str | None = None
    filed_path: str | None = None
    checked_at: str | None = None
    filed_at: str | None = None
    done_at: str | None = None
    duplicate_of: int | None = None
    mtime_ns: int | None = None
    """Modification time of the file as claimed: tells the same drop from a later identical one."""


@dataclass(frozen=True)
class Outcome:
    """What checking a claimed file produced."""

    verdict: str
    contract: str | None
    contract_version: str | None
    errors: int
    warnings: int
    notes: int
    report_path: str
    duplicate_of: int | None = None


@dataclass(frozen=True)
class ProviderRate:
    provider: str
    submissions: int
    accepted: int
    returned: int
    duplicates: int

    @property
    def acceptance(self) -> float:
        """Share of checked submissions (duplicates excluded) that were accepted."""
        judged = self.accepted + self.returned
        return self.accepted / judged if judged else 0.0


class Ledger(Protocol):
    """What the gate and `weir ledger` need from a ledger; a PostgreSQL one would implement the same."""

    def claim(
        self, key: str, provider: str, file_name: str, sha256: str, size: int, owner: str, mtime_ns: int = 0
    ) -> int | None:
        """Atomically claim `key`; the new row id, or None if someone already holds it."""
        ...

    def take_over(self, entry_id: int, old_owner: str, new_owner: str) -> bool:
        """Atomically move an unfinished claim from a dead gate to this one."""
        ...

    def with_hash(self, sha256: str) -> list[Entry]: ...
    def unfinished(self) -> list[Entry]: ...
    def mark_checked(self, entry_id: int, outcome: Outcome) -> None: ...
    def mark_filed(self, entry_id: int, filed_path: str) -> None: ...
    def mark_done(self, entry_id: int) -> None: ...
    def get(self, entry_id: int) -> Entry: ...
    def recent(self, limit: int = 20) -> list[Entry]: ...
    def entries(self) -> list[Entry]: ...
    def rates(self) -> list[ProviderRate]: ...
    def close(self) -> None: ...


MIGRATIONS: Sequence[str] = (
    # v1: the submissions table as first shipped.
    """
    CREATE TABLE submissions (
        id INTEGER PRIMARY KEY AUTOINCREMENT,
        claim_key TEXT NOT NULL UNIQUE,
        provider TEXT NOT NULL,
        file_name TEXT NOT NULL,
        sha256 TEXT NOT NULL,
        size INTEGER NOT NULL,
        state TEXT NOT NULL,
        owner TEXT NOT NULL,
        received_at TEXT NOT NULL,
        contract TEXT,
        contract_version TEXT,
        verdict TEXT,
        errors INTEGER NOT NULL DEFAULT 0,
        warnings INTEGER NOT NULL DEFAULT 0,
        notes INTEGER NOT NULL DEFAULT 0,
        report_path TEXT,
        filed_path TEXT,
        checked_at TEXT,
        filed_at TEXT,
        done_at TEXT
    );
    CREATE INDEX submissions_sha ON submissions (sha256);
    """,
    # v2: duplicates point at the first arrival of the same bytes; per-provider queries get an index.
    """
    ALTER TABLE submissions ADD COLUMN duplicate_of INTEGER REFERENCES submissions (id);
    CREATE INDEX submissions_provider ON submissions (provider);
    """,
    # v3: remember which drop of a file was claimed, so a gate that hashed a file just before
    # another gate filed it does not take that same file for a second, duplicate submission.
    """
    ALTER TABLE submissions ADD COLUMN mtime_ns INTEGER;
    """,
)
SCHEMA_VERSION = len(MIGRATIONS)


def now() -> str:
    return datetime.now(UTC).isoformat(timespec="seconds")


def schema_version(connection: sqlite3.Connection) -> int:
    connection.execute("CREATE TABLE IF NOT EXISTS schema_version (version INTEGER NOT NULL)")
    row = connection.execute("SELECT MAX(version) FROM schema_version").fetchone()
    return int(row[0] or 0)


def migrate(connection: sqlite3.Connection, upto: int = SCHEMA_VERSION) -> int:
    """Apply the migrations the database lacks, each in its own transaction; the version reached.

    The version is read again inside each write transaction, so two gates opening a new
    ledger at the same moment apply every migration exactly once.
    """
    while True:
        connection.execute("BEGIN IMMEDIATE")
        try:
            current = schema_version(connection)
            if current > SCHEMA_VERSION:
                from linter.errors import WeirError

                raise WeirError(f"the ledger was written by a newer Weir (schema v{current}); upgrade Weir")
            if current >= upto:
                connection.execute("COMMIT")
                return current
            for statement in MIGRATIONS[current].split(";"):
                if statement.strip():
                    connection.execute(statement)
            connection.execute("INSERT INTO schema_version (version) VALUES (?)", (current + 1,))
            connection.execute("COMMIT")
        except BaseException:
            connection.execute("ROLLBACK")
            raise


ENTRY_COLUMNS = tuple(f.name for f in fields(Entry))


def switch_to_wal(connection: sqlite3.Connection, seconds: float = 30.0) -> None:
    """Put the database in WAL mode, waiting while another gate does the same.

    Changing the journal mode needs the database to itself, and SQLite answers "database is
    locked" at once (without its busy handler) when another connection holds it, as when
    several gates open a new ledger together; so the switch is retried for a while.
    """
    deadline = time.monotonic() + seconds
    pause = 0.01
    while True:
        try:
            connection.execute("PRAGMA journal_mode=WAL")
            return
        except sqlite3.OperationalError as error:
            if "locked" not in str(error) or time.monotonic() > deadline:
                raise
            time.sleep(pause)
            pause = min(pause * 2, 0.5)


class SqliteLedger:
    """The ledger in one SQLite file (WAL mode, so `weir ledger` can read while a gate writes)."""

    def __init__(self, path: Path) -> None:
        path.parent.mkdir(parents=True, exist_ok=True)
        try:
            self.connection = sqlite3.connect(path, timeout=30, isolation_level=None)
            self.connection.execute("PRAGMA busy_timeout=30000")
            switch_to_wal(self.connection)
            migrate(self.connection)
        except sqlite3.DatabaseError as error:
            from linter.errors import WeirError

            raise WeirError(f"{path.name}: not a usable ledger ({error})") from None

    def claim(
        self, key: str, provider: str, file_name: str, sha256: str, size: int, owner: str, mtime_ns: int = 0
    ) -> int | None:
        try:
            cursor = self.connection.execute(
                "INSERT INTO submissions (claim_key, provider, file_name, sha256, size, state, owner,"
                " received_at, mtime_ns) VALUES (?, ?, ?, ?, ?, 'claimed', ?, ?, ?)",
                (key, provider, file_name, sha256, size, owner, now(), mtime_ns),
            )
        except sqlite3.IntegrityError:  # the UNIQUE claim_key is the lock between two gates
            return None
        return int(cursor.lastrowid or 0)

    def take_over(self, entry_id: int, old_owner: str, new_owner: str) -> bool:
        cursor = self.connection.execute(
            "UPDATE submissions SET owner = ? WHERE id = ? AND owner = ? AND state != 'done'",
            (new_owner, entry_id, old_owner),
        )
        return cursor.rowcount == 1

    def with_hash(self, sha256: str) -> list[Entry]:
        return self._select("WHERE sha256 = ? ORDER BY id", (sha256,))

    def unfinished(self) -> list[Entry]:
        return self._select("WHERE state != 'done' ORDER BY id", ())

    def mark_checked(self, entry_id: int, outcome: Outcome) -> None:
        self.connection.execute(
            "UPDATE submissions SET state = 'checked', verdict = ?, contract = ?, contract_version = ?,"
            " errors = ?, warnings = ?, notes = ?, report_path = ?, duplicate_of = ?, checked_at = ?"
            " WHERE id = ?",
            (
                outcome.verdict,
                outcome.contract,
                outcome.contract_version,
                outcome.errors,
                outcome.warnings,
                outcome.notes,
                outcome.report_path,
                outcome.duplicate_of,
                now(),
                entry_id,
            ),
        )

    def mark_filed(self, entry_id: int, filed_path: str) -> None:
        self.connection.execute(
            "UPDATE submissions SET state = 'filed', filed_path = ?, filed_at = ? WHERE id = ?",
            (filed_path, now(), entry_id),
        )

    def mark_done(self, entry_id: int) -> None:
        self.connection.execute(
            "UPDATE submissions SET state = 'done', done_at = ? WHERE id = ?", (now(), entry_id)
        )

    def get(self, entry_id: int) -> Entry:
        return self._select("WHERE id = ?", (entry_id,))[0]

    def recent(self, limit: int = 20) -> list[Entry]:
        return self._select("ORDER BY id DESC LIMIT ?", (limit,))

    def entries(self) -> list[Entry]:
        """Every submission, oldest first (for export)."""
        return self._select("ORDER BY id", ())

    def rates(self) -> list[ProviderRate]:
        rows = self.connection.execute(
            "SELECT provider, COUNT(*),"
            " SUM(verdict = 'accepted'), SUM(verdict = 'returned'), SUM(verdict = 'duplicate')"
            " FROM submissions GROUP BY provider ORDER BY provider"
        ).fetchall()
        return [ProviderRate(p, int(n), int(a or 0), int(r or 0), int(d or 0)) for p, n, a, r, d in rows]

    def close(self) -> None:
        self.connection.close()

    def _select(self, clause: str, args: tuple[object, ...]) -> list[Entry]:
        rows = self.connection.execute(
            f"SELECT {', '.join(ENTRY_COLUMNS)} FROM submissions {clause}", args
        ).fetchall()
        return [Entry(*row) for row in rows]
