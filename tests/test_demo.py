"""`make demo` end to end: every demo file gets its promised verdict and a letter is written."""

from __future__ import annotations

from pathlib import Path

import pytest

from linter import demo


@pytest.mark.slow
def test_demo_runs_and_writes_a_letter_for_every_returned_file(
    repo: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    out = tmp_path / "demo-out"
    assert demo.main(repo / "sample_submissions", out) == 0
    returned = demo.manifest(repo / "sample_submissions" / "returned")
    for name in returned:
        letter = out / "returned" / f"{Path(name).stem}.html"
        assert letter.is_file() and "Returned" in letter.read_text(encoding="utf-8")
    assert (out / "clean.json").is_file()
    assert "UNEXPECTED" not in capsys.readouterr().err
