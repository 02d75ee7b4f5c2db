"""The gate never follows a link out of its inbox: the linked file is neither read, moved nor changed."""

from __future__ import annotations

import hashlib
import os
from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app

CONTRACT = (
    "contract: c\nversion: 1\nobservational_unit: one site\nkeys: [site_id]\n"
    "variables:\n  site_id: {type: string}\n"
)


def test_links_out_of_the_inbox_are_left_alone(tmp_path: Path) -> None:
    outside = tmp_path / "elsewhere"
    (outside / "folder").mkdir(parents=True)
    (outside / "private.csv").write_text("site_id\nVB-999\n", encoding="utf-8")
    (outside / "folder" / "more.csv").write_text("site_id\nVB-998\n", encoding="utf-8")
    before = {p: hashlib.sha256(p.read_bytes()).hexdigest() for p in outside.rglob("*.csv")}
    provider = tmp_path / "inbox" / "lab-north"
    provider.mkdir(parents=True)
    (provider / "results.csv").write_text("site_id\nVB-014\n", encoding="utf-8")
    os.symlink(outside / "private.csv", provider / "linked.csv")
    os.symlink(outside / "folder", provider / "linked-folder")
    (tmp_path / "c.yaml").write_text(CONTRACT, encoding="utf-8")
    (tmp_path / "weir.toml").write_text("[inbox]\nsettle_seconds = 0\n", encoding="utf-8")
    result = CliRunner().invoke(app, ["gate", "inbox", "-c", "c.yaml"])
    assert result.exit_code == 0, result.output
    assert "results.csv" in result.output and "linked" not in result.output
    assert {p: hashlib.sha256(p.read_bytes()).hexdigest() for p in outside.rglob("*.csv")} == before
    assert (provider / "linked.csv").is_symlink() and (provider / "linked-folder").is_symlink()
    filed = [p.name for p in (tmp_path / "inbox").rglob("*.csv") if not p.is_symlink()]
    assert all("VB-99" not in p.read_text(encoding="utf-8") for p in (tmp_path / "inbox").rglob("*.json"))
    assert any(name.endswith("results.csv") for name in filed)
