"""The pre-commit entry point `weir-hook`: check the files git is about to commit, never change them.

Kept on argparse rather than the full CLI so a hook call stays quick: heavy libraries load
only once there is a file to read.
"""

from __future__ import annotations

import argparse
import re
import sys
from collections.abc import Sequence
from pathlib import Path

from linter.errors import WeirError
from linter.findings import Severity

CONTRACT_HEAD = re.compile(r"^contract\s*:", re.MULTILINE)
"""A YAML file is taken for a contract when it has a top-level `contract:` key (code lists do not)."""


def arguments(argv: Sequence[str] | None) -> argparse.Namespace:
    parser = argparse.ArgumentParser(prog="weir-hook", description="Check staged data files with Weir.")
    parser.add_argument("files", nargs="*", help="Files pre-commit passes (data files, or contracts).")
    parser.add_argument("--contracts", action="store_true", help="Validate contract files themselves.")
    parser.add_argument("--contract", "-c", action="append", default=[], help="Contract file (repeatable).")
    parser.add_argument("--fail-on", choices=[s.value for s in Severity], help="Lowest severity that fails.")
    parser.add_argument("--report-dir", help="Also write one JSON report per checked group here.")
    parser.add_argument("--verbose", "-v", action="store_true", help="Show every finding.")
    return parser.parse_args(files_last(list(sys.argv[1:] if argv is None else argv)))


def files_last(argv: list[str]) -> list[str]:
    """Move staged files whose names start with '-' behind `--`, so no file is read as an option.

    pre-commit appends file names after the hook's own arguments without a `--`; a file named
    `-chemistry.csv` would otherwise become `-c hemistry.csv`.
    """
    if "--" in argv:
        return argv
    dashed = [a for a in argv if a.startswith("-") and a != "-" and Path(a).is_file()]
    if not dashed:
        return argv
    return [a for a in argv if a not in dashed] + ["--", *dashed]


def check_contract_files(files: Sequence[str]) -> int:
    from linter.contract.load import load_contract

    bad = 0
    for name in files:
        text = Path(name).read_text(encoding="utf-8", errors="replace")
        if not CONTRACT_HEAD.search(text):
            continue
        try:
            load_contract(name)
        except WeirError as error:
            print(f"{name}: {error}")
            bad += 1
    return 1 if bad else 0


def report_name(group: str) -> str:
    return re.sub(r"[^A-Za-z0-9._-]+", "_", group).strip("_") + ".json"


def check_data_files(options: argparse.Namespace) -> int:
    from rich.console import Console

    from linter.config import find_settings
    from linter.gate.governance import check_groups, load_governance, merged, split_safe_groups
    from linter.output import write_text_atomic
    from linter.report import console as console_report
    from linter.report import json_report

    settings = find_settings(Path.cwd())
    governance = load_governance(settings, [Path(c) for c in options.contract])
    fail_on = (
        Severity(options.fail_on) if options.fail_on else (settings.fail_on if settings else Severity.ERROR)
    )
    checked = check_groups(split_safe_groups(options.files, governance), fail_on, governance.limits)
    if options.report_dir:
        for group, report in checked:
            write_text_atomic(Path(options.report_dir) / report_name(group.name), json_report.render(report))
    whole = merged([report for _, report in checked], fail_on)
    console_report.render(whole, Console(), verbose=options.verbose)
    return 1 if whole.failed else 0


def run(argv: Sequence[str] | None = None) -> int:
    options = arguments(argv)
    try:
        for name in options.files:
            if not Path(name).is_file():
                raise WeirError(f"no such file: {name}")
        if not options.files:
            return 0
        return check_contract_files(options.files) if options.contracts else check_data_files(options)
    except WeirError as error:
        print(f"weir-hook: {error}", file=sys.stderr)
        return 2
    except OSError as error:
        print(f"weir-hook: {error.strerror or error}: {error.filename or ''}".rstrip(": "), file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        return 130
    except Exception as error:  # the last line of defence: a bug must not show a traceback
        print(
            f"weir-hook: internal error ({type(error).__name__}: {error}); please report it", file=sys.stderr
        )
        return 2


def main() -> None:
    """Console entry point."""
    sys.exit(run())
