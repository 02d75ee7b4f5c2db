"""`make demo` checks every demo file and writes a letter for each returned one, inputs untouched."""

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


@pytest.mark.slow  # checks all eleven demo files (about ten seconds on a shared machine)
def test_demo_writes_a_letter_for_each_returned_file(
    repo: Path, tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    monkeypatch.chdir(repo)  # the demo runs from the repository root; it writes only to tmp_path
    before = digests(repo / "sample_submissions")
    runs = demo.run_demo(tmp_path / "demo-out")
    assert digests(repo / "sample_submissions") == before
    returned = [r for r in runs if r.exit]
    assert returned and all(r.folder == "returned" for r in returned)
    assert all(r.exit == r.expected_exit for r in runs)
    for run in runs:
        letters = [p for p in run.written if p.name.endswith(".letter.html")]
        assert len(letters) == run.exit
        for letter in letters:
            text = letter.read_text(encoding="utf-8")
            # Source: WHATWG HTML parsing rules via html5lib (strict mode raises on any parse error)
            html5lib.HTMLParser(strict=True).parse(text)
            assert "Returned:" in text and str(repo) not in text  # files named as submitted, no machine path


def test_demo_outside_the_repository_is_a_one_line_error(capsys: pytest.CaptureFixture[str]) -> None:
    assert demo.main(["out"]) == 2  # the autouse fixture runs this test in an empty tmp_path
    assert "no demo manifest" in capsys.readouterr().err
