"""The data dictionary as one self-contained, printable HTML page in the provider letter's style."""

from __future__ import annotations

from html import escape

from linter.dictionary.facts import ContractFacts, TableFacts, VariableFacts, shown_code
from linter.report.html import STYLE as LETTER_STYLE

DICTIONARY_STYLE = """
header.spec { border: 3px solid var(--line); border-radius: .5rem; padding: 1rem 1.25rem;
              margin-bottom: 1.25rem; background: var(--note); }
section.table { margin: 1.5rem 0; }
.variable { border: 1px solid var(--line); border-left: 8px solid #4b7aa6; border-radius: .4rem;
            padding: .8rem 1.25rem; margin: 1rem 0; break-inside: avoid; page-break-inside: avoid; }
.variable.key { border-left-color: var(--ok-ink); }
.variable h3 { font-size: 1.05rem; margin: 0 0 .3rem; }
.variable h3 code { font-size: 1.05rem; }
table.codes { border-collapse: collapse; margin: .4rem 0; font-size: .9rem; }
table.codes th, table.codes td { border: 1px solid var(--line); padding: .15rem .55rem; text-align: left; }
table.codes thead th { background: #eef2f5; }
ul.rules li, ul.said li { margin: .2rem 0; }
.changes { border-left: 4px solid #c98a1c; padding-left: .75rem; }
"""


def codes_html(variable: VariableFacts) -> str:
    if not variable.codes:
        return ""
    rows = "".join(
        f'<tr><td><code class="code">{escape(shown_code(code))}</code></td><td>{escape(label)}</td></tr>'
        for code, label in variable.codes
    )
    return (
        f'<table class="codes"><caption class="kicker">Allowed values of {escape(variable.name)}</caption>'
        f'<thead><tr><th scope="col">Code</th><th scope="col">Meaning</th></tr></thead><tbody>{rows}</tbody>'
        "</table>"
    )


def variable_html(variable: VariableFacts) -> str:
    facts = "".join(f"<dt>{escape(label)}</dt><dd>{escape(text)}</dd>" for label, text in variable.facts)
    kind = "variable key" if variable.is_key else "variable"
    return (
        f'<section class="{kind}" data-variable="{escape(variable.name)}">'
        f'<h3><code class="name">{escape(variable.name)}</code> · {escape(variable.kind)}</h3>'
        f'<p class="kicker">column {escape(variable.letter)} in the declared order</p>'
        f'<dl class="place">{facts}</dl>{codes_html(variable)}</section>'
    )


def table_html(table: TableFacts, several: bool) -> str:
    heading = f"<h2>Table {escape(table.name)}</h2>" if several else "<h2>What one row is</h2>"
    rules = (
        '<h3>Rules across columns</h3><ul class="rules">'
        + "".join(f"<li>{escape(r)}</li>" for r in table.rules)
        + "</ul>"
        if table.rules
        else ""
    )
    said = "".join(f"<li>{escape(s)}</li>" for s in table.other_sentences)
    names = ", ".join(escape(v.name) for v in table.variables)
    return (
        f'<section class="table" data-table="{escape(table.name)}">{heading}'
        f'<p class="unit">Each row is <strong>{escape(table.unit)}</strong>.</p>'
        f'<p class="keys">{escape(table.key_sentence)}</p><ul class="said">{said}</ul>{rules}'
        f'<h3>The columns, in order</h3><p class="legend">{names}</p>'
        + "".join(variable_html(v) for v in table.variables)
        + "</section>"
    )


def changes_html(facts: ContractFacts) -> str:
    if facts.changes is None:
        return ""  # no comparison was made: say nothing rather than guess
    items = "".join(f"<li>{escape(c)}</li>" for c in facts.changes) or "<li>Nothing changed.</li>"
    return (
        f'<section class="changes"><h2>What changed since the previous version</h2><ul>{items}</ul></section>'
    )


def render(facts: ContractFacts) -> str:
    """The whole page; every value from the contract is escaped, nothing is loaded from elsewhere."""
    several = len(facts.tables) > 1
    return (
        '<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8">'
        '<meta name="viewport" content="width=device-width, initial-scale=1">'
        f"<title>Data dictionary: {escape(facts.title or facts.id)} (version {escape(facts.version)})</title>"
        f"<style>{LETTER_STYLE}{DICTIONARY_STYLE}</style></head><body>"
        f'<header class="spec"><p class="kicker">Weir · data dictionary</p>'
        f"<h1>{escape(facts.title or facts.id)}</h1>"
        f'<p>Contract <code>{escape(facts.id)}</code>, version <strong class="version">'
        f"{escape(facts.version)}</strong>. Files that follow this page "
        "pass the submission check.</p></header>"
        f"{changes_html(facts)}<main>"
        + "".join(table_html(t, several) for t in facts.tables)
        + f"</main><footer>Written by Weir from contract {escape(facts.id)} version "
        f"{escape(facts.version)}; the same contract checks every submission.</footer></body></html>\n"
    )
