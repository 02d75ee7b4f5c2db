"""The limits table in docs/reliability.md is the one the code enforces, key for key."""

from __future__ import annotations

import re
from pathlib import Path

from linter.limits import describe_defaults


def test_documented_defaults_are_the_real_ones(repo: Path) -> None:
    text = (repo / "docs" / "reliability.md").read_text(encoding="utf-8")
    documented = dict(re.findall(r"^\| `([a-z_]+)` \| ([\d,]+) \|", text, flags=re.M))
    assert documented == dict(describe_defaults())
