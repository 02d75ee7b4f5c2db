"""`weir explain RULE`: print a rule's documentation."""

from __future__ import annotations

import difflib

import typer

from linter.cli.app import app, guarded
from linter.errors import WeirError


@app.command()
@guarded
def explain(
    rule: str = typer.Argument(None, help="Rule id, e.g. layout.values-in-headers; omit to list all."),
) -> int:
    """Explain what a rule finds, why it matters and how to fix it."""
    from rich.console import Console
    from rich.markdown import Markdown

    import linter.rules.catalogue  # noqa: F401
    from linter.rules.registry import RULES

    console = Console()
    if rule is None:
        for rule_id in sorted(RULES):
            console.print(f"{rule_id:40} {RULES[rule_id].title}", highlight=False)
        return 0
    if rule not in RULES:
        close = difflib.get_close_matches(rule, list(RULES), n=1)
        hint = f"; did you mean {close[0]}?" if close else "; `weir explain` lists all rules"
        raise WeirError(f"no rule called {rule}{hint}")
    found = RULES[rule]
    console.print(f"[bold]{found.id}[/bold] — {found.title} (default severity: {found.severity})")
    console.print(Markdown(found.doc))
    return 0
