"""`weir diff OLD NEW`: what changed between two contract versions, and whose files it breaks."""

from __future__ import annotations

import json
import sys
from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.contract.model import Contract
from linter.errors import WeirError
from linter.report.model import Report, TableResult

DIFF_HELP = (
    "List what changed between two versions of a contract, each change marked breaking for providers "
    "(a file that passed may now fail) or compatible, then a summary to send to partners. With "
    "--against FILES, the files (earlier accepted submissions) are checked under both versions and "
    "those that pass the old but fail the new are counted. Exit 0 when no change is breaking, 1 when "
    "one is, 2 when Weir could not compare."
)


@app.command(help=DIFF_HELP)
@guarded
def diff(
    old: Path = typer.Argument(..., help="The contract as it was."),
    new: Path = typer.Argument(..., help="The contract as it will be."),
    against: list[Path] = typer.Option(
        [], "--against", help="Earlier accepted files or folders to check under the new version (repeatable)."
    ),
    summary: Path | None = typer.Option(None, "--summary", help="Also write the provider summary here."),
    json_out: Path | None = typer.Option(None, "--json", help="Also write the changes as JSON here."),
) -> int:
    from linter.contract.load import load_contract
    from linter.draft.diff import changes_json, contract_changes, provider_summary
    from linter.output import write_text_atomic

    before, after = load_contract(str(old)), load_contract(str(new))
    changes = contract_changes(before, after)
    for change in changes:
        mark = "BREAKING  " if change.breaking else "compatible"
        print(f"{mark} {change.table}.{change.subject}: {change.what}: {change.message}")
    text = provider_summary(before, after, changes)
    print()
    sys.stdout.write(text)
    if against:
        print()
        print(recheck([str(p) for p in against], before, after))
    for option, target in (("--summary", summary), ("--json", json_out)):
        if target is not None and target.resolve() in {old.resolve(), new.resolve()}:
            raise WeirError(f"{option} {target} would overwrite a contract; choose another name")
    if summary is not None:
        write_text_atomic(summary, text)
    if json_out is not None:
        data = changes_json(before, after, changes)
        write_text_atomic(json_out, json.dumps(data, indent=2, ensure_ascii=False) + "\n")
    return 1 if any(c.breaking for c in changes) else 0


def recheck(paths: list[str], before: Contract, after: Contract) -> str:
    """Check the files under both versions; say how many passed the old one and fail the new one."""
    from linter.check import check_paths

    for path in paths:
        if not Path(path).exists():
            raise WeirError(f"no such file or folder: {path}")
    old_report, new_report = check_paths(paths, [before]), check_paths(paths, [after])
    old_failed = {(r.file, r.sheet) for r in old_report.results if failing(r, old_report)}
    new_failed = [(r.file, r.sheet) for r in new_report.results if failing(r, new_report)]
    now_failing = [f for f in new_failed if f not in old_failed]
    lines = [
        f"Checked {len(new_report.results)} table(s) under version {after.version}: "
        f"{len(now_failing)} passed version {before.version} and would now fail"
        f"{'' if len(now_failing) == len(new_failed) else f' ({len(new_failed)} fail in all)'}."
    ]
    lines.extend(f"  now failing: {file}" + (f" [{sheet}]" if sheet else "") for file, sheet in now_failing)
    return "\n".join(lines)


def failing(result: TableResult, report: Report) -> bool:
    return any(f.severity.rank >= report.fail_on.rank for f in result.findings)
