"""The dictionary's "what changed" section: sentences from change records, and the --since option."""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app
from linter.dictionary.changes import change_sentences

REPO = Path(__file__).resolve().parents[2]


@dataclass(frozen=True)
class Record:
    table: str
    subject: str
    breaking: bool
    message: str


def test_breaking_changes_come_first_and_say_so() -> None:
    said = change_sentences(
        [
            Record("sites", "river", False, "river may now be empty."),
            Record("sites", "county", True, "county lost the code DUN."),
        ]
    )
    assert said == (
        "sites.county: county lost the code DUN. This may make a file that passed fail.",
        "sites.river: river may now be empty.",
    )


def test_since_lists_what_changed(tmp_path: Path) -> None:
    old = (REPO / "contracts" / "field-sheets.yaml").read_text(encoding="utf-8")
    (tmp_path / "old.yaml").write_text(old, encoding="utf-8")
    (tmp_path / "new.yaml").write_text(
        old.replace("max: 14,", "max: 13,").replace('version: "1.3"', 'version: "1.4"'), encoding="utf-8"
    )
    result = CliRunner().invoke(app, ["dictionary", "new.yaml", "--since", "old.yaml", "--out", "spec.md"])
    assert result.exit_code == 0, result.output
    text = (tmp_path / "spec.md").read_text(encoding="utf-8")
    assert "What changed since the previous version" in text
    assert "field-sheets.ph: ph: max is now 13" in text and "may make a file that passed fail" in text


def test_since_a_missing_file_is_one_line_and_exit_2(tmp_path: Path) -> None:
    contract = str(REPO / "contracts" / "sites.yaml")
    result = CliRunner().invoke(app, ["dictionary", contract, "--since", "gone.yaml"])
    assert result.exit_code == 2 and result.stderr.strip() == "weir: no such contract file: gone.yaml"
