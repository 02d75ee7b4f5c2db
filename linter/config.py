"""Project settings (`weir.toml` or `[tool.weir]` in `pyproject.toml`): which contracts govern what."""

from __future__ import annotations

import tomllib
from dataclasses import dataclass
from pathlib import Path

from linter.errors import WeirError
from linter.findings import Severity

SETTINGS_FILES = ("weir.toml", "pyproject.toml")


@dataclass(frozen=True)
class Settings:
    """What a project says once so that `weir check` needs no flags."""

    root: Path
    """The folder holding the settings file; relative paths are taken from here."""
    contracts: tuple[str, ...] = ()
    """Contract files or globs, relative to `root`."""
    fail_on: Severity = Severity.ERROR
    report_dir: str | None = None


def parse_settings(root: Path, table: dict[str, object], source: str) -> Settings:
    known = {"contracts", "fail_on", "report_dir"}
    unknown = sorted(set(table) - known)
    if unknown:
        raise WeirError(f"{source}: unknown setting {unknown[0]!r} (known: {', '.join(sorted(known))})")
    contracts = table.get("contracts", [])
    if isinstance(contracts, str):
        contracts = [contracts]
    if not isinstance(contracts, list) or not all(isinstance(c, str) for c in contracts):
        raise WeirError(f"{source}: 'contracts' must be a list of paths or globs")
    fail_on = table.get("fail_on", "error")
    if fail_on not in {s.value for s in Severity}:
        raise WeirError(f"{source}: 'fail_on' must be one of error, warning, note")
    report_dir = table.get("report_dir")
    if report_dir is not None and not isinstance(report_dir, str):
        raise WeirError(f"{source}: 'report_dir' must be a path")
    return Settings(root, tuple(contracts), Severity(str(fail_on)), report_dir)


def find_settings(start: Path) -> Settings | None:
    """Walk up from `start` to the first folder with Weir settings."""
    for folder in [start.resolve(), *start.resolve().parents]:
        for name in SETTINGS_FILES:
            path = folder / name
            if not path.is_file():
                continue
            try:
                data = tomllib.loads(path.read_text(encoding="utf-8"))
            except (tomllib.TOMLDecodeError, UnicodeDecodeError) as error:
                raise WeirError(f"{path.name}: not valid TOML: {error}") from None
            table = data.get("tool", {}).get("weir") if name == "pyproject.toml" else data
            if table is not None:
                return parse_settings(folder, table, path.name)
    return None


def contract_paths(settings: Settings) -> list[Path]:
    """The contract files the settings name, globs expanded, in a stable order."""
    found: list[Path] = []
    for pattern in settings.contracts:
        matches = sorted(settings.root.glob(pattern))
        if not matches and not any(ch in pattern for ch in "*?["):
            raise WeirError(f"settings name a contract that does not exist: {pattern}")
        found.extend(m for m in matches if m.is_file())
    return found
