"""Bundles in the inbox: the other files of a provider's bundle, so references between them resolve.

A provider often sends the site register and the results that refer to it together. The
gate files them one by one, so when the second arrives the first may already be filed;
its filed copy is then lent back under its original name for the check.
"""

from __future__ import annotations

import re
import shutil
import tempfile
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path, PurePosixPath

from linter.config import InboxLayout, Settings, bundle_of
from linter.findings import Severity
from linter.gate.governance import Governance
from linter.report.model import Report

FILED_NAME = re.compile(r"^\d{6}-(?P<name>.+)$")
"""`000012-sites.csv`: the gate's filed name, the ledger number then the name as sent."""


def waiting_companions(settings: Settings, inbox: Path, relative: str) -> dict[str, Path]:
    """Bundle members waiting beside the file in the inbox, by name."""
    bundle = bundle_of(settings, relative)
    source = inbox / relative
    if bundle is None:
        return {}
    return {
        p.name: p
        for p in sorted(source.parent.iterdir())
        if p.is_file()
        and p != source
        and not p.name.startswith(".")
        and bundle_of(settings, p.name) == bundle
    }


def filed_companions(
    settings: Settings, inbox: Path, layout: InboxLayout, relative: str, provider: str
) -> dict[str, Path]:
    """The latest accepted copy of each other bundle member from the same provider, by original name."""
    bundle = bundle_of(settings, relative)
    folder = inbox / layout.accepted / provider
    if bundle is None or not folder.is_dir():
        return {}
    found: dict[str, Path] = {}
    for copy in sorted(folder.iterdir()):  # ledger numbers sort in arrival order: the latest wins
        match = FILED_NAME.match(copy.name)
        if not match or ".letter." in copy.name or copy.name.endswith(".report.json"):
            continue
        name = match["name"]
        if name != PurePosixPath(relative).name and bundle_of(settings, name) == bundle:
            found[name] = copy
    return found


@contextmanager
def lent(inbox: Path, copies: dict[str, Path]) -> Iterator[list[str]]:
    """Copies of filed files under their original names in a scratch folder, removed afterwards."""
    if not copies:
        yield []
        return
    scratch_root = inbox / ".weir" / "scratch"
    scratch_root.mkdir(parents=True, exist_ok=True)
    with tempfile.TemporaryDirectory(dir=scratch_root) as scratch:
        paths = []
        for name, copy in copies.items():
            target = Path(scratch) / name
            shutil.copyfile(copy, target)
            paths.append(str(target))
        yield paths


def own_results(report: Report, file: str) -> Report:
    """Only the checked file's own tables: a companion's findings belong to its own submission."""
    results = tuple(r for r in report.results if r.file == file)
    return Report(report.tool_version, report.created, report.fail_on, results, report.findings)


def check_in_bundle(
    path: Path,
    inbox: Path,
    layout: InboxLayout,
    settings: Settings,
    governance: Governance,
    fail_on: Severity,
) -> Report:
    """Check an inbox file with its bundle companions (waiting ones first, else accepted copies)."""
    from linter.check import check_paths
    from linter.gate.inbox import provider_of

    relative = path.relative_to(inbox).as_posix()
    if bundle_of(settings, relative) is None:
        return check_paths(
            [str(path)], list(governance.for_file(str(path), inbox)), fail_on, governance.limits
        )
    waiting = waiting_companions(settings, inbox, relative)
    filed = filed_companions(settings, inbox, layout, relative, provider_of(relative, layout))
    borrowed = {name: copy for name, copy in filed.items() if name not in waiting}
    with lent(inbox, borrowed) as extra:
        files = [str(path), *(str(p) for p in waiting.values()), *extra]
        report = check_paths(files, list(governance.contracts.values()), fail_on, governance.limits)
    return own_results(report, str(path))
