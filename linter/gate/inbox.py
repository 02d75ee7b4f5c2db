"""The inbox gate: each new file is hashed, claimed, checked, answered and filed, and never lost.

Every step is journalled in the ledger row before the next one starts (claimed -> checked
-> filed -> done), so a gate killed at any point resumes from where it stopped, and the
original leaves the inbox only once its filed copy has been read back with the same hash.
"""

from __future__ import annotations

import os
import shutil
import socket
import time
import uuid
from collections.abc import Callable, Iterator
from dataclasses import dataclass
from fnmatch import fnmatch
from pathlib import Path, PurePosixPath

from linter.config import InboxLayout
from linter.gate.answer import duplicate_report, write_answer
from linter.gate.ledger import Entry, Ledger, Outcome
from linter.report.model import Report

Checker = Callable[[Path], Report]
"""Checks one file and returns its report; never raises for a bad submission."""

PARTIAL_SUFFIXES = (".part", ".tmp", ".crdownload", ".partial")


@dataclass(frozen=True)
class GateEvent:
    """What the gate did with one file in one pass."""

    file: str
    """Path inside the inbox."""
    action: str
    """accepted, returned, duplicate, or skipped."""
    reason: str = ""
    entry: int | None = None


@dataclass(frozen=True)
class Gate:
    """One gate run: the inbox, where things go, the ledger and how to check a file."""

    inbox: Path
    layout: InboxLayout
    ledger: Ledger
    check: Checker
    owner: str = ""

    def path(self, relative: str) -> Path:
        return self.inbox / relative


def new_owner() -> str:
    """host:pid:token; the token tells a dead earlier gate in this same process from the live one."""
    return f"{socket.gethostname()}:{os.getpid()}:{uuid.uuid4().hex[:8]}"


def owner_alive(owner: str, me: str) -> bool:
    """Whether the gate named `owner` may still be working (claims from other hosts are respected)."""
    if owner == me:
        return True
    host, _, rest = owner.partition(":")
    pid_text, _, _token = rest.partition(":")
    if host != socket.gethostname() or not pid_text.isdigit():
        return True
    pid = int(pid_text)
    if pid == os.getpid():
        return False  # same process, another token: that gate has ended
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:
        return True
    return True


def provider_of(relative: str, layout: InboxLayout) -> str:
    """The provider named by settings for this path, else the top subfolder, else `unknown`."""
    for pattern, provider in layout.providers.items():
        if fnmatch(relative, pattern):
            return provider
    parts = PurePosixPath(relative).parts
    return parts[0] if len(parts) > 1 else "unknown"


def candidates(inbox: Path, layout: InboxLayout) -> Iterator[str]:
    """Files waiting in the inbox (relative posix paths), skipping Weir's own folders and temp files."""
    own = {PurePosixPath(layout.accepted).parts[0], PurePosixPath(layout.returned).parts[0]}
    ledger = PurePosixPath(layout.ledger).as_posix()
    ledger_files = {ledger, f"{ledger}-wal", f"{ledger}-shm", f"{ledger}-journal"}
    waiting: list[tuple[int, str]] = []
    for path in inbox.rglob("*"):
        relative = path.relative_to(inbox)
        parts = relative.parts
        if parts[0] in own or any(p.startswith(".") for p in parts):
            continue
        if path.is_symlink() or not path.is_file() or relative.as_posix() in ledger_files:
            continue
        name = parts[-1]
        if name.startswith("~$") or name.lower().endswith(PARTIAL_SUFFIXES):
            continue
        waiting.append((path.stat().st_mtime_ns, relative.as_posix()))
    # First come, first served: of two identical files, the earlier one is the original.
    yield from (relative for _, relative in sorted(waiting))


def file_sha256(path: Path) -> str:
    from linter.check import file_sha256 as digest

    return digest(str(path))


def copy_verified(source: Path, target: Path, sha256: str) -> None:
    """Copy to a temporary name beside `target`, check the hash, then rename into place."""
    target.parent.mkdir(parents=True, exist_ok=True)
    temporary = target.with_name(f".{target.name}.{uuid.uuid4().hex[:8]}.tmp")
    try:
        shutil.copyfile(source, temporary)
        with open(temporary, "rb") as handle:
            os.fsync(handle.fileno())
        if file_sha256(temporary) != sha256:
            raise OSError(f"the copy of {source.name} does not match the original; left in the inbox")
        os.replace(temporary, target)
    finally:
        temporary.unlink(missing_ok=True)


def filed_target(gate: Gate, entry: Entry, verdict: str) -> Path:
    folder = gate.layout.accepted if verdict == "accepted" else gate.layout.returned
    name = PurePosixPath(entry.file_name).name
    return gate.inbox / folder / entry.provider / f"{entry.id:06d}-{name}"


def stable(path: Path, settle: float) -> tuple[int, int] | None:
    """(size, mtime_ns) if the file has not changed for `settle` seconds, else None."""
    status = path.stat()
    if time.time() - status.st_mtime < settle:
        return None
    return status.st_size, status.st_mtime_ns


def check_step(gate: Gate, entry: Entry, earlier: Entry | None) -> Entry:
    """Check the claimed file (or answer it as a duplicate) and write its report and letter."""
    source = gate.path(entry.file_name)
    if earlier is not None:
        report = duplicate_report(entry.file_name, entry.sha256, earlier)
        verdict = "duplicate"
    else:
        report = gate.check(source)
        verdict = report.verdict
    target = filed_target(gate, entry, verdict)
    report_path = write_answer(report, target)
    counts = report.counts()
    result = report.results[0] if report.results else None
    gate.ledger.mark_checked(
        entry.id,
        Outcome(
            verdict=verdict,
            contract=result.contract if result else None,
            contract_version=result.contract_version if result else None,
            errors=counts["error"],
            warnings=counts["warning"],
            notes=counts["note"],
            report_path=report_path.relative_to(gate.inbox).as_posix(),
            duplicate_of=earlier.id if earlier else None,
        ),
    )
    return gate.ledger.get(entry.id)


def file_step(gate: Gate, entry: Entry) -> Entry:
    target = filed_target(gate, entry, entry.verdict or "returned")
    if not (target.is_file() and file_sha256(target) == entry.sha256):
        copy_verified(gate.path(entry.file_name), target, entry.sha256)
    gate.ledger.mark_filed(entry.id, target.relative_to(gate.inbox).as_posix())
    return gate.ledger.get(entry.id)


def release_step(gate: Gate, entry: Entry) -> Entry:
    """Remove the original, but only if the filed copy holds the same bytes as the original still does."""
    target = gate.inbox / (entry.filed_path or "")
    source = gate.path(entry.file_name)
    if not (target.is_file() and file_sha256(target) == entry.sha256):
        raise OSError(f"the filed copy of {entry.file_name} is missing or changed; original kept")
    if source.is_file() and file_sha256(source) == entry.sha256:
        source.unlink()
    gate.ledger.mark_done(entry.id)
    return gate.ledger.get(entry.id)


def advance(gate: Gate, entry: Entry, earlier: Entry | None) -> Entry:
    """Carry an entry forward from whatever step its journal says it reached."""
    if entry.state == "claimed":
        entry = check_step(gate, entry, earlier)
    if entry.state == "checked":
        entry = file_step(gate, entry)
    if entry.state == "filed":
        entry = release_step(gate, entry)
    return entry


def handle(gate: Gate, relative: str) -> GateEvent:
    source = gate.path(relative)
    before = stable(source, gate.layout.settle_seconds)
    if before is None:
        return GateEvent(relative, "skipped", "still arriving")
    sha256 = file_sha256(source)
    status = source.stat()
    if (status.st_size, status.st_mtime_ns) != before:
        return GateEvent(relative, "skipped", "changed while being read")
    provider = provider_of(relative, gate.layout)
    known = gate.ledger.with_hash(sha256)
    same_drop = [
        e for e in known if e.file_name == relative and e.provider == provider and e.mtime_ns == before[1]
    ]
    if any(e.state == "done" for e in same_drop):
        return GateEvent(relative, "skipped", "another gate has just filed it")
    mine = [e for e in same_drop if e.state != "done"]
    if mine:
        entry = mine[0]
        if entry.owner != gate.owner:
            if owner_alive(entry.owner, gate.owner):
                return GateEvent(relative, "skipped", "another gate is handling it", entry.id)
            if not gate.ledger.take_over(entry.id, entry.owner, gate.owner):
                return GateEvent(relative, "skipped", "another gate resumed it first", entry.id)
    else:
        key = sha256 if not known else f"{sha256}#{len(known)}"
        claimed = gate.ledger.claim(key, provider, relative, sha256, before[0], gate.owner, before[1])
        if claimed is None:
            return GateEvent(relative, "skipped", "another gate claimed it", None)
        entry = gate.ledger.get(claimed)
    firsts = [e for e in known if e.claim_key == sha256 and e.id != entry.id]
    earlier = firsts[0] if firsts and entry.claim_key != sha256 else None
    entry = advance(gate, entry, earlier)
    return GateEvent(relative, entry.verdict or "returned", "", entry.id)


def finish_orphans(gate: Gate) -> list[GateEvent]:
    """Entries a dead gate had filed but not closed, whose original is already gone: close them."""
    events = []
    for entry in gate.ledger.unfinished():
        if entry.state != "filed" or gate.path(entry.file_name).exists():
            continue
        if owner_alive(entry.owner, gate.owner) and entry.owner != gate.owner:
            continue
        if gate.ledger.take_over(entry.id, entry.owner, gate.owner):
            done = release_step(gate, gate.ledger.get(entry.id))
            events.append(GateEvent(entry.file_name, done.verdict or "returned", "resumed", entry.id))
    return events


def run_pass(gate: Gate) -> list[GateEvent]:
    """One sweep over the inbox; files that cannot be handled now are left for the next sweep."""
    events = finish_orphans(gate)
    for relative in candidates(gate.inbox, gate.layout):
        try:
            events.append(handle(gate, relative))
        except OSError as error:  # a file vanished or a copy failed: keep it for the next sweep
            events.append(GateEvent(relative, "skipped", f"{error.strerror or error}"))
    return events
