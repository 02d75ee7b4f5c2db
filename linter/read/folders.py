"""Expanding named folders into the files to check, without leaving them or descending forever."""

from __future__ import annotations

import os
from collections.abc import Iterable
from dataclasses import dataclass
from pathlib import Path

from linter.read.errors import UnreadableFile


@dataclass(frozen=True)
class Skipped:
    """A path inside a named folder that was deliberately not read, and why."""

    path: str
    reason: UnreadableFile


@dataclass(frozen=True)
class Expansion:
    files: tuple[str, ...]
    skipped: tuple[Skipped, ...]


def escapes(entry: Path, root: Path) -> bool:
    """Whether a link inside `root` resolves to somewhere outside it (or nowhere)."""
    try:
        target = entry.resolve(strict=True)
    except (OSError, RuntimeError):  # dangling link or a loop of links
        return True
    return not target.is_relative_to(root)


def outside(entry: Path) -> Skipped:
    return Skipped(
        str(entry),
        UnreadableFile(
            "file.outside-folder",
            "This is a link to a file or folder outside the checked folder, so Weir did not follow it.",
            "Copy the file itself into the folder instead of linking to it.",
        ),
    )


def too_deep(entry: Path, depth: int) -> Skipped:
    return Skipped(
        str(entry),
        UnreadableFile(
            "file.too-deep",
            f"The folder is nested more than {depth} levels below the checked folder; "
            "files inside it were not searched.",
            "Move the files closer to the top of the folder, or ask the data manager to raise the limit.",
        ),
    )


def walk(folder: Path, suffixes: frozenset[str], max_depth: int) -> Expansion:
    """Supported files below `folder` (hidden names skipped), links kept inside it, depth bounded."""
    root = folder.resolve()
    files: list[str] = []
    skipped: list[Skipped] = []
    pending: list[tuple[Path, int]] = [(folder, 0)]
    while pending:
        here, depth = pending.pop()
        try:
            entries = sorted(os.scandir(here), key=lambda e: e.name)
        except OSError:
            continue  # unreadable folder: nothing in it can be submitted through Weir
        for entry in entries:
            if entry.name.startswith("."):
                continue
            path = Path(here, entry.name)
            if entry.is_symlink() and escapes(path, root):
                skipped.append(outside(path))
                continue
            if entry.is_dir():
                if entry.is_symlink():
                    continue  # leads inside the folder, whose files the walk reaches anyway
                if depth + 1 > max_depth:
                    skipped.append(too_deep(path, max_depth))
                else:
                    pending.append((path, depth + 1))
            elif entry.is_file() and path.suffix.lower() in suffixes:
                files.append(str(path))
    return Expansion(tuple(sorted(files)), tuple(sorted(skipped, key=lambda s: s.path)))


def expand_paths(names: Iterable[str], suffixes: frozenset[str], max_depth: int) -> Expansion:
    """The files named, with each folder replaced by what `walk` finds in it."""
    files: list[str] = []
    skipped: list[Skipped] = []
    for name in names:
        if Path(name).is_dir():
            found = walk(Path(name), suffixes, max_depth)
            files.extend(found.files)
            skipped.extend(found.skipped)
        else:
            files.append(name)
    return Expansion(tuple(files), tuple(skipped))
