"""Which contracts govern which submitted files, and which files must be checked together."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path

from linter.config import Settings, bundle_members, bundle_of, contract_paths, mapped_contract
from linter.contract.model import Contract
from linter.findings import Severity
from linter.limits import Limits
from linter.report.model import Report


@dataclass(frozen=True)
class CheckGroup:
    """Files checked in one pipeline run, so references between their tables resolve."""

    name: str
    """A bundle name, or the single file's path."""
    files: tuple[str, ...]
    contracts: tuple[Contract, ...]


@dataclass(frozen=True)
class Governance:
    """Loaded contracts, by the resolved path of their file, and the settings that named them."""

    settings: Settings | None
    contracts: dict[Path, Contract]
    limits: Limits = field(default_factory=Limits)
    """The settings' `[limits]` (even when contracts were named on the command line)."""

    def for_file(self, path: str, relative_to: Path | None = None) -> tuple[Contract, ...]:
        """The contract a `[[map]]` assigns to the file, else every contract (their `applies_to` decides)."""
        if self.settings is not None:
            base = relative_to or self.settings.root
            try:
                relative = Path(path).resolve().relative_to(base.resolve()).as_posix()
            except ValueError:
                relative = path
            mapped = mapped_contract(self.settings, relative)
            if mapped is not None and mapped in self.contracts:
                return (self.contracts[mapped],)
        return tuple(self.contracts.values())


def load_governance(settings: Settings | None, named: Sequence[Path] = ()) -> Governance:
    """Load the contracts named on the command line (maps then do not apply), else the settings' ones."""
    files = list(named) or (contract_paths(settings) if settings else [])
    bounds = settings.bounds if settings else Limits()
    if not files:
        return Governance(None if named else settings, {}, bounds)
    from linter.contract.load import load_contract

    loaded = {p.resolve(): load_contract(str(p), bounds) for p in files}
    return Governance(None if named else settings, loaded, bounds)


def check_governed(paths: Sequence[str], governance: Governance, fail_on: Severity) -> Report:
    """`weir check`: all files in one run, except that files a `[[map]]` assigns get their own run."""
    from linter import __version__
    from linter.check import check_paths, not_followed_findings
    from linter.read import SUPPORTED_SUFFIXES
    from linter.read.folders import expand_paths

    if governance.settings is None or not governance.settings.maps:
        return check_paths(paths, list(governance.contracts.values()), fail_on, governance.limits)
    runs: dict[tuple[int, ...], list[str]] = {}
    chosen: dict[tuple[int, ...], tuple[Contract, ...]] = {}
    expansion = expand_paths(paths, SUPPORTED_SUFFIXES, governance.limits.folder_depth)
    for name in expansion.files:
        contracts = governance.for_file(name)
        key = tuple(id(c) for c in contracts)
        runs.setdefault(key, []).append(name)
        chosen[key] = contracts
    reports = [
        check_paths(files, list(chosen[key]), fail_on, governance.limits) for key, files in runs.items()
    ]
    if expansion.skipped:  # the per-map runs see only files, so report what the walk left out here
        skipped = tuple(not_followed_findings(expansion.skipped))
        reports.append(Report(__version__, "", fail_on, (), skipped))
    return merged(reports, fail_on)


def split_safe_groups(files: Sequence[str], governance: Governance) -> list[CheckGroup]:
    """One group per bundle touched (all its members on disk), one per other file.

    The result for a file never depends on which other files came in the same call, so a
    caller that splits its file list (as pre-commit does) gets the same verdicts.
    """
    settings = governance.settings
    groups: dict[str, CheckGroup] = {}
    for name in files:
        bundle = bundle_of(settings, name) if settings else None
        if bundle is None or settings is None:
            groups.setdefault(name, CheckGroup(name, (name,), governance.for_file(name)))
            continue
        if bundle.name in groups:
            continue
        members = [str(p.relative_to(settings.root)) for p in bundle_members(settings, bundle)]
        listed = sorted({*members, *(f for f in files if bundle_of(settings, f) == bundle)})
        groups[bundle.name] = CheckGroup(bundle.name, tuple(listed), tuple(governance.contracts.values()))
    return list(groups.values())


def check_groups(
    groups: Sequence[CheckGroup], fail_on: Severity, limits: Limits | None = None
) -> list[tuple[CheckGroup, Report]]:
    from linter.check import check_paths

    return [(g, check_paths(list(g.files), list(g.contracts), fail_on, limits)) for g in groups]


def merged(reports: Sequence[Report], fail_on: Severity) -> Report:
    """Several runs' results as one report (for a single exit code and one summary)."""
    from linter import __version__

    created = max((r.created for r in reports), default="")
    results = tuple(r for report in reports for r in report.results)
    findings = tuple(f for report in reports for f in report.findings)
    return Report(__version__, created, fail_on, results, findings)
