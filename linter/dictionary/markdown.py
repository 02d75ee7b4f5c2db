"""The data dictionary as Markdown, for e-mail, wikis and the README beside a CSV template."""

from __future__ import annotations

import re

from linter.dictionary.facts import ContractFacts, TableFacts, VariableFacts, shown_code

MARKDOWN_PUNCTUATION = re.compile(r"([\\`*_\[\]<>|#!~&])")
"""Characters that could start Markdown or HTML markup in contract text."""


def plain(text: str) -> str:
    """Contract text shown literally: Markdown punctuation backslash-escaped, lines flattened."""
    # Source: CommonMark 0.31.2 §2.4: any ASCII punctuation character may be backslash-escaped.
    return MARKDOWN_PUNCTUATION.sub(r"\\\1", text.replace("\n", " "))


def inline(text: str) -> str:
    """Text as a code span that survives backticks inside it."""
    fence = "``" if "`" in text else "`"
    return f"{fence} {text} {fence}" if fence == "``" else f"`{text}`"


def variable_markdown(variable: VariableFacts) -> list[str]:
    lines = [f"### {inline(variable.name)} ({variable.kind})", ""]
    lines += [f"- **{label}:** {plain(text)}" for label, text in variable.facts]
    if variable.codes:
        lines += ["", "| Code | Meaning |", "|---|---|"]
        lines += [f"| {plain(shown_code(code))} | {plain(label)} |" for code, label in variable.codes]
    return [*lines, ""]


def table_markdown(table: TableFacts, several: bool) -> list[str]:
    lines = [f"## Table {plain(table.name)}" if several else "## What one row is", ""]
    lines += [f"Each row is **{plain(table.unit)}**.", "", plain(table.key_sentence), ""]
    lines += [f"- {plain(s)}" for s in table.other_sentences]
    if table.rules:
        lines += ["", "Rules across columns:", ""] + [f"- {plain(r)}" for r in table.rules]
    lines += ["", "Columns, in order: " + ", ".join(inline(v.name) for v in table.variables), ""]
    for variable in table.variables:
        lines += variable_markdown(variable)
    return lines


def render(facts: ContractFacts) -> str:
    lines = [
        f"# {plain(facts.title or facts.id)}",
        "",
        f"Contract {inline(facts.id)}, version **{plain(facts.version)}**.",
        "",
    ]
    if facts.changes is not None:
        lines += ["## What changed since the previous version", ""]
        lines += [f"- {plain(c)}" for c in facts.changes] or ["- Nothing changed."]
        lines.append("")
    for table in facts.tables:
        lines += table_markdown(table, len(facts.tables) > 1)
    lines.append(f"_Written by Weir from contract {plain(facts.id)} version {plain(facts.version)}._")
    return "\n".join(lines) + "\n"
