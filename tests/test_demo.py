"""`make demo` end to end: every demo file gets its verdict, letters are written, inputs untouched."""

from __future__ import annotations

import hashlib
from pathlib import Path

import html5lib
import pytest

from linter import demo


def digests(folder: Path) -> dict[str, str]:
    return {
        str(p): hashlib.sha256(p.read_bytes()).hexdigest() for p in sorted(folder.rglob("*")) if p.is_file()
    }


@pytest.mark.slow  # checks every demo file and tidies the layout samples (tens of seconds on a shared CPU)
def test_demo_runs_and_writes_a_letter_for_every_returned_file(
    repo: Path, tmp_path: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]
) -> None:
    monkeypatch.chdir(repo)  # the demo runs from the repository root; it writes only to tmp_path
    before = digests(repo / "sample_submissions")
    out = tmp_path / "demo-out"
    assert demo.main(Path("sample_submissions"), out) == 0
    assert "UNEXPECTED" not in capsys.readouterr().err
    assert digests(repo / "sample_submissions") == before
    for name in demo.manifest(repo / "sample_submissions" / "returned"):
        letter = out / "returned" / f"{Path(name).stem}.html"
        text = letter.read_text(encoding="utf-8")
        # Source: WHATWG HTML parsing rules via html5lib (strict mode raises on any parse error)
        html5lib.HTMLParser(strict=True).parse(text)
        assert "Returned:" in text and str(repo) not in text  # files named as submitted, no machine path
    assert (out / "clean.json").is_file()
    assert sorted(p.name for p in (out / "tidy").iterdir()) == sorted(
        [p.stem for p in (repo / "sample_submissions" / "layout").glob("*.csv")]
        + ["units-joined", "units-stacked"]
    )


def test_demo_outside_the_repository_is_a_one_line_error(capsys: pytest.CaptureFixture[str]) -> None:
    assert demo.main(Path("sample_submissions"), Path("out")) == 2  # the autouse fixture: empty tmp_path
    assert "sample_submissions/ not found" in capsys.readouterr().err
