"""`weir draft FILE...`: propose a contract from accepted files, or additions to an existing one."""

from __future__ import annotations

import re
import sys
from pathlib import Path
from typing import TYPE_CHECKING

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError

if TYPE_CHECKING:  # drafting needs pandas; `weir --help` must not load it
    from linter.draft.infer import TableDraft

DRAFT_HELP = (
    "Propose a contract from files a partner already sent (several files of one kind, or a folder).\n\n"
    "Every proposal carries its evidence as a YAML comment. With --out the contract (and any long "
    "code list, under codes/ beside it) is written, never over an existing file; without it the "
    "contract is printed. With --update CONTRACT, Weir keeps every edit and comment of that contract "
    "and only proposes additions (new columns as not required, new codes, missing-value codes seen), "
    "shown as a unified diff; --write then saves them into CONTRACT. Exit 0 when done, 2 when Weir "
    "could not."
)


@app.command(help=DRAFT_HELP)
@guarded
def draft(
    paths: list[Path] = typer.Argument(..., help="Sample files or folders of one kind of submission."),
    out: Path | None = typer.Option(None, "--out", "-o", help="Write the drafted contract here."),
    name: str | None = typer.Option(None, "--name", help="Contract id (default: from the file names)."),
    update: Path | None = typer.Option(
        None, "--update", help="Propose additions to this contract instead of drafting a new one."
    ),
    write: bool = typer.Option(False, "--write", help="With --update: save the proposed additions."),
    tidy: bool = typer.Option(
        True,
        "--tidy/--as-sent",
        help="Draft the tidy layout of an untidy file (default) or the file as sent.",
    ),
) -> int:
    from linter.config import find_settings
    from linter.draft.infer import draft_table
    from linter.draft.samples import read_samples

    for path in paths:
        if not path.exists():
            raise WeirError(f"no such file or folder: {path}")
    if name is not None and not re.fullmatch(r"[^.\s]+", name):
        raise WeirError(f"--name {name!r} may not contain dots or spaces (it is used in table.column)")
    if write and update is None:
        raise WeirError("--write saves the additions of --update; give --update CONTRACT")
    if update is not None and out is not None:
        raise WeirError("give either --out (a new contract) or --update (an existing one), not both")
    inputs = {p.resolve() for p in paths}
    settings = find_settings(Path.cwd())
    bounds = settings.bounds if settings else None
    drafted = draft_table(read_samples([str(p) for p in paths], tidy=tidy, limits=bounds), name)
    if update is not None:
        return run_update(update, drafted, write)
    from linter.draft.write import render_draft

    files = render_draft(drafted, name)
    if out is None:
        if files.code_lists:
            raise WeirError("a code list is long enough for its own file; give --out CONTRACT to write both")
        sys.stdout.write(files.contract)
        return 0
    targets = {out: files.contract, **{out.parent / rel: text for rel, text in files.code_lists.items()}}
    for target in targets:
        if target.resolve() in inputs:
            raise WeirError(f"{target} is one of the sample files; choose another --out")
        if target.exists():
            raise WeirError(f"{target} exists; use --update {target} to add to it, or choose another --out")
    from linter.output import write_text_atomic

    for target, text in targets.items():
        write_text_atomic(target, text)
        print(f"wrote {target}")
    return 0


def run_update(contract_path: Path, drafted: TableDraft, write: bool) -> int:
    from linter.contract.load import load_contract
    from linter.contract.yaml_tree import read_text
    from linter.draft.update import propose_update
    from linter.output import write_text_atomic

    contract = load_contract(str(contract_path))
    text = read_text(str(contract_path))
    update = propose_update(text, str(contract_path), contract, drafted)
    for note in update.notes:
        print(f"note: {note}")
    if not update.added:
        print(f"{contract_path}: nothing to add; the files fit what it declares")
        return 0
    sys.stdout.write(update.unified_diff(str(contract_path)))
    if write:
        write_text_atomic(contract_path, update.new)
        print(f"wrote {len(update.added)} addition(s) into {contract_path}")
    else:
        print(f"{len(update.added)} addition(s) proposed; run again with --write to save them")
    return 0
