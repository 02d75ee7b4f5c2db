"""Folder expansion stays inside the named folder: links out are reported, never followed."""

from __future__ import annotations

import os
from pathlib import Path

from linter.read import SUPPORTED_SUFFIXES
from linter.read.folders import expand_paths


def names(paths: tuple[str, ...], root: Path) -> list[str]:
    return [Path(p).relative_to(root).as_posix() for p in paths]


def test_links_out_of_the_folder_are_not_followed(tmp_path: Path) -> None:
    secret = tmp_path / "elsewhere"
    secret.mkdir()
    (secret / "passwords.csv").write_text("user,password\nx,y\n", encoding="utf-8")
    inbox = tmp_path / "inbox"
    (inbox / "lab-north").mkdir(parents=True)
    (inbox / "lab-north" / "results.csv").write_text("site_id\nVB-014\n", encoding="utf-8")
    os.symlink(secret / "passwords.csv", inbox / "lab-north" / "linked.csv")
    os.symlink(secret, inbox / "linked-folder")
    os.symlink(tmp_path / "missing.csv", inbox / "dangling.csv")
    os.symlink(inbox / "lab-north" / "results.csv", inbox / "inside.csv")  # stays inside: read
    found = expand_paths([str(inbox)], SUPPORTED_SUFFIXES, 10)
    assert names(found.files, inbox) == ["inside.csv", "lab-north/results.csv"]
    assert sorted(names(tuple(s.path for s in found.skipped), inbox)) == [
        "dangling.csv",
        "lab-north/linked.csv",
        "linked-folder",
    ]
    assert {s.reason.rule for s in found.skipped} == {"file.outside-folder"}


def test_a_link_loop_ends(tmp_path: Path) -> None:
    inbox = tmp_path / "inbox"
    inbox.mkdir()
    os.symlink(inbox, inbox / "again")  # points inside: its files are reached once, by their own path
    (inbox / "a.csv").write_text("x\n1\n", encoding="utf-8")
    found = expand_paths([str(inbox)], SUPPORTED_SUFFIXES, 3)
    assert names(found.files, inbox) == ["a.csv"] and not found.skipped


def test_odd_names_and_hidden_files(tmp_path: Path) -> None:
    # Common practice (no source): names with spaces, non-ASCII letters and a leading dash.
    for name in ("-results.csv", "März 2026.csv", ".~lock.a.csv", "notes.pdf"):
        (tmp_path / name).write_text("x\n1\n", encoding="utf-8")
    found = expand_paths([str(tmp_path)], SUPPORTED_SUFFIXES, 3)
    assert names(found.files, tmp_path) == ["-results.csv", "März 2026.csv"]
