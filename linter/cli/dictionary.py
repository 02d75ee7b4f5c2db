"""`weir dictionary CONTRACT`: the contract as a data dictionary (HTML or Markdown by suffix)."""

from __future__ import annotations

import sys
from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError


def refuse_overwriting(target: Path, contract: Path) -> None:
    """Weir's outputs never replace the contract (or a code list beside it)."""
    if target.resolve() == contract.resolve() or target.suffix.lower() in (".yaml", ".yml"):
        raise WeirError(f"--out {target} would overwrite a contract file; choose an .html or .md name")


@app.command()
@guarded
def dictionary(
    contract: Path = typer.Argument(..., help="The contract file to describe."),
    out: Path | None = typer.Option(
        None, "--out", "-o", help="Write here: .html (printable page) or .md; default Markdown on screen."
    ),
) -> int:
    """Write the data dictionary of a contract: what one row is, every column and its rules."""
    from linter.contract.load import load_contract
    from linter.dictionary import html, markdown
    from linter.dictionary.facts import contract_facts
    from linter.output import write_text_atomic

    if not contract.is_file():
        raise WeirError(f"no such contract file: {contract}")
    # The version comparison (`weir diff`) will pass its sentences as `changes` here.
    facts = contract_facts(load_contract(str(contract)))
    if out is None:
        sys.stdout.write(markdown.render(facts))
        return 0
    refuse_overwriting(out, contract)
    suffix = out.suffix.lower()
    if suffix in (".html", ".htm"):
        write_text_atomic(out, html.render(facts))
    elif suffix in (".md", ".markdown", ".txt"):
        write_text_atomic(out, markdown.render(facts))
    else:
        raise WeirError(f"--out {out}: name an .html or .md file")
    print(f"weir: wrote the data dictionary of {facts.id} version {facts.version} to {out}")
    return 0
