"""`weir dictionary CONTRACT`: the contract as a data dictionary (HTML or Markdown by suffix)."""

from __future__ import annotations

import sys
from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError

HTML_SUFFIXES = (".html", ".htm")
MARKDOWN_SUFFIXES = (".md", ".markdown", ".txt")


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
    since: Path | None = typer.Option(
        None, "--since", help="The previous version of the contract: list what changed since then."
    ),
) -> int:
    """Write the data dictionary of a contract: what one row is, every column and its rules."""
    from linter.contract.load import load_contract
    from linter.dictionary import html, markdown
    from linter.dictionary.changes import changes_since
    from linter.dictionary.facts import contract_facts
    from linter.output import write_text_atomic

    if not contract.is_file():
        raise WeirError(f"no such contract file: {contract}")
    if out is not None:
        refuse_overwriting(out, contract)
        if out.suffix.lower() not in (*HTML_SUFFIXES, *MARKDOWN_SUFFIXES):
            raise WeirError(f"--out {out}: name an .html or .md file")
    if since is not None and not since.is_file():
        raise WeirError(f"no such contract file: {since}")
    current = load_contract(str(contract))
    changes = changes_since(load_contract(str(since)), current) if since is not None else None
    facts = contract_facts(current, changes)
    if out is None:
        sys.stdout.write(markdown.render(facts))
        return 0
    is_html = out.suffix.lower() in HTML_SUFFIXES
    write_text_atomic(out, html.render(facts) if is_html else markdown.render(facts))
    print(f"weir: wrote the data dictionary of {facts.id} version {facts.version} to {out}")
    return 0
