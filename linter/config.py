"""Project settings (`weir.toml` or `[tool.weir]` in `pyproject.toml`): which contracts govern what."""

from __future__ import annotations

import difflib
import tomllib
from collections.abc import Mapping
from dataclasses import dataclass, field
from fnmatch import fnmatch
from pathlib import Path, PurePath

from linter.errors import WeirError
from linter.findings import Severity
from linter.limits import Limits, parse_limits

SETTINGS_FILES = ("weir.toml", "pyproject.toml")


@dataclass(frozen=True)
class FileMap:
    """`[[map]]`: files matching `files` are governed by `contract`, whatever its own `applies_to` says."""

    files: str
    contract: str


@dataclass(frozen=True)
class Bundle:
    """`[[bundle]]`: files checked together, so references between their tables can be resolved."""

    name: str
    files: tuple[str, ...]


@dataclass(frozen=True)
class InboxLayout:
    """`[inbox]`: where the gate files what it has handled and how it names the provider."""

    accepted: str = "accepted"
    returned: str = "returned"
    ledger: str = ".weir/ledger.sqlite"
    """Relative to the inbox folder."""
    providers: Mapping[str, str] = field(default_factory=dict)
    """Glob of a path inside the inbox -> provider name; otherwise the first subfolder names it."""
    settle_seconds: float = 2.0
    """A file whose last change is younger than this is taken to be still arriving."""


@dataclass(frozen=True)
class Settings:
    """What a project says once so that `weir check` needs no flags."""

    root: Path
    """The folder holding the settings file; relative paths are taken from here."""
    contracts: tuple[str, ...] = ()
    """Contract files or globs, relative to `root`."""
    fail_on: Severity = Severity.ERROR
    report_dir: str | None = None
    maps: tuple[FileMap, ...] = ()
    bundles: tuple[Bundle, ...] = ()
    limits: Mapping[str, int | float | str | bool] = field(default_factory=dict)
    """Resource limits, parsed here and passed on untouched to whoever enforces them."""
    inbox: InboxLayout = field(default_factory=InboxLayout)

    @property
    def bounds(self) -> Limits:
        """`limits` as the bounds every command enforces (already validated when the settings loaded)."""
        return parse_limits(self.limits)


TOP_KEYS = ("contracts", "fail_on", "report_dir", "map", "bundle", "limits", "inbox")
MAP_KEYS = ("files", "contract")
BUNDLE_KEYS = ("name", "files")
INBOX_KEYS = ("accepted", "returned", "ledger", "providers", "settle_seconds")


def reject_unknown(table: Mapping[str, object], known: tuple[str, ...], where: str) -> None:
    for key in sorted(set(table) - set(known)):
        close = difflib.get_close_matches(key, known, n=1)
        hint = f"; did you mean {close[0]!r}?" if close else f" (known: {', '.join(known)})"
        raise WeirError(f"{where}: unknown setting {key!r}{hint}")


def text_list(value: object, what: str) -> tuple[str, ...]:
    if isinstance(value, str):
        return (value,)
    if not isinstance(value, list) or not all(isinstance(v, str) for v in value):
        raise WeirError(f"{what} must be a path or glob, or a list of them")
    return tuple(value)


def text(value: object, what: str) -> str:
    if not isinstance(value, str) or not value.strip():
        raise WeirError(f"{what} must be a non-empty text")
    return value


def tables(value: object, what: str) -> list[dict[str, object]]:
    if isinstance(value, dict):
        value = [value]
    if not isinstance(value, list) or not all(isinstance(v, dict) for v in value):
        raise WeirError(f"{what} must be an array of tables ([[...]])")
    return value


def inside(value: object, what: str) -> str:
    """A folder or file inside the inbox: relative, and never climbing out of it."""
    path = PurePath(text(value, what))
    if path.is_absolute() or ".." in path.parts:
        raise WeirError(f"{what} must be a path inside the inbox (relative, without '..'): {value}")
    return path.as_posix()


def parse_inbox(value: object, source: str) -> InboxLayout:
    if not isinstance(value, dict):
        raise WeirError(f"{source}: [inbox] must be a table")
    reject_unknown(value, INBOX_KEYS, f"{source} [inbox]")
    defaults = InboxLayout()
    providers = value.get("providers", {})
    if not isinstance(providers, dict) or not all(isinstance(v, str) for v in providers.values()):
        raise WeirError(f"{source}: [inbox.providers] maps a path glob to a provider name")
    settle = value.get("settle_seconds", defaults.settle_seconds)
    if isinstance(settle, bool) or not isinstance(settle, int | float) or settle < 0:
        raise WeirError(f"{source}: inbox 'settle_seconds' must be a number of seconds >= 0")
    return InboxLayout(
        accepted=inside(value.get("accepted", defaults.accepted), f"{source}: inbox 'accepted'"),
        returned=inside(value.get("returned", defaults.returned), f"{source}: inbox 'returned'"),
        ledger=inside(value.get("ledger", defaults.ledger), f"{source}: inbox 'ledger'"),
        providers=dict(providers),
        settle_seconds=float(settle),
    )


def parse_settings(root: Path, table: dict[str, object], source: str) -> Settings:
    reject_unknown(table, TOP_KEYS, source)
    contracts = text_list(table.get("contracts", []), f"{source}: 'contracts'")
    fail_on = table.get("fail_on", "error")
    if fail_on not in {s.value for s in Severity}:
        raise WeirError(f"{source}: 'fail_on' must be one of error, warning, note")
    report_dir = table.get("report_dir")
    if report_dir is not None and not isinstance(report_dir, str):
        raise WeirError(f"{source}: 'report_dir' must be a path")
    maps = []
    for entry in tables(table.get("map", []), f"{source}: 'map'"):
        reject_unknown(entry, MAP_KEYS, f"{source} [[map]]")
        maps.append(
            FileMap(
                text(entry.get("files"), f"{source}: [[map]] 'files'"),
                text(entry.get("contract"), f"{source}: [[map]] 'contract'"),
            )
        )
    bundles = []
    for entry in tables(table.get("bundle", []), f"{source}: 'bundle'"):
        reject_unknown(entry, BUNDLE_KEYS, f"{source} [[bundle]]")
        name = text(entry.get("name"), f"{source}: [[bundle]] 'name'")
        bundles.append(Bundle(name, text_list(entry.get("files", []), f"{source}: bundle {name} 'files'")))
    limits = table.get("limits", {})
    if not isinstance(limits, dict) or not all(
        isinstance(v, int | float | str | bool) for v in limits.values()
    ):
        raise WeirError(f"{source}: [limits] must be a table of plain values")
    parse_limits(limits, source)  # a misspelt or negative limit fails here, before any file is read
    inbox = parse_inbox(table["inbox"], source) if "inbox" in table else InboxLayout()
    return Settings(
        root, contracts, Severity(str(fail_on)), report_dir, tuple(maps), tuple(bundles), dict(limits), inbox
    )


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


def expand(settings: Settings, pattern: str) -> list[Path]:
    matches = sorted(settings.root.glob(pattern))
    if not matches and not any(ch in pattern for ch in "*?["):
        raise WeirError(f"settings name a contract that does not exist: {pattern}")
    return [m for m in matches if m.is_file()]


def contract_paths(settings: Settings) -> list[Path]:
    """Every contract file the settings name (globs and maps), in a stable order, each once."""
    found: list[Path] = []
    for pattern in [*settings.contracts, *(m.contract for m in settings.maps)]:
        found.extend(p for p in expand(settings, pattern) if p not in found)
    return found


def matches(path: str, pattern: str) -> bool:
    """Whether a file (relative to the settings root, or just its name) matches a settings glob."""
    posix = PurePath(path).as_posix()
    return fnmatch(posix, pattern) or fnmatch(posix, f"*/{pattern}") or fnmatch(PurePath(path).name, pattern)


def mapped_contract(settings: Settings, path: str) -> Path | None:
    """The contract a `[[map]]` assigns to `path`, if any (the first map that matches wins)."""
    for entry in settings.maps:
        if matches(path, entry.files):
            return (settings.root / entry.contract).resolve()
    return None


def bundle_of(settings: Settings, path: str) -> Bundle | None:
    return next((b for b in settings.bundles if any(matches(path, g) for g in b.files)), None)


def bundle_members(settings: Settings, bundle: Bundle) -> list[Path]:
    """The files of a bundle that exist under the settings root, sorted."""
    found: set[Path] = set()
    for pattern in bundle.files:
        found.update(p for p in settings.root.glob(pattern) if p.is_file())
    return sorted(found)
