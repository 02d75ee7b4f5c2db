"""The CLI boundary: Weir's own failures are one line and exit 2, never a traceback."""

from __future__ import annotations

from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app

runner = CliRunner()


def test_help_lists_the_commands() -> None:
    result = runner.invoke(app, ["--help"])
    assert result.exit_code == 0
    assert "check" in result.output and "explain" in result.output


def test_missing_path_is_exit_2_with_one_line() -> None:
    result = runner.invoke(app, ["check", "no-such-file.csv"])
    assert result.exit_code == 2
    assert "no such file or folder: no-such-file.csv" in result.output
    assert "Traceback" not in result.output


def test_unknown_rule_gets_did_you_mean() -> None:
    import linter.rules.catalogue  # noqa: F401
    from linter.rules.registry import RULES

    some = sorted(RULES)[0]
    result = runner.invoke(app, ["explain", some[:-1] + "x"])
    assert result.exit_code == 2
    assert "did you mean" in result.output


def test_explain_lists_every_rule(tmp_path: Path) -> None:
    import linter.rules.catalogue  # noqa: F401
    from linter.rules.registry import RULES

    result = runner.invoke(app, ["explain"])
    assert result.exit_code == 0
    assert all(rule_id in result.output for rule_id in RULES)
