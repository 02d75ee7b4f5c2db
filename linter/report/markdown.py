"""The fix-it letter as Markdown, for e-mail and issue trackers: the same content as the HTML letter."""

from __future__ import annotations

import re
from collections.abc import Sequence

from linter.findings import Excerpt, Severity
from linter.report import letter
from linter.report.model import Report
from linter.report.sketch import Grid, sketch_for
from linter.report.step_code import step_pandas_code

SIGNIFICANT = re.compile(r"([\\`*_{}\[\]()#+!|~^$-])")
"""Punctuation Markdown (CommonMark and the common table extension) may read as markup."""
TEXT_CELL = {"h": "#", "k": "O", "d": ".", "v": "o", "x": "x", "t": "=", ".": "_"}
"""Characters for the text sketch: headers #, data ., what moves O/o, dropped x, titles =, empty _."""


def md(text: str) -> str:
    """`text` shown literally by a Markdown renderer: HTML characters as entities, markup escaped."""
    text = text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")
    text = SIGNIFICANT.sub(r"\\\1", text)
    text = re.sub(r"^(\d+)([.)])", r"\1\\\2", text)  # "1." at the start would open a numbered list
    return " ".join(text.splitlines())


def code_block(text: str, info: str = "") -> str:
    """A fenced block whose fence is longer than any backtick run inside, so the content cannot end it."""
    longest = max((len(run) for run in re.findall(r"`+", text)), default=0)
    fence = "`" * max(3, longest + 1)
    return f"{fence}{info}\n{text}\n{fence}"


def cell_md(text: str | None, marked: bool) -> str:
    shown = f"*{letter.EMPTY}*" if text in (None, "") else md(text or "")
    return f"**{letter.MARKER} {shown}**" if marked else shown


def excerpt_md(excerpt: Excerpt) -> str:
    head = ["Row", *(f"{md(c)} ({col})" for c, col in zip(excerpt.columns, excerpt.letters, strict=False))]
    lines = ["| " + " | ".join(head) + " |", "|" + "---|" * len(head)]
    for row in excerpt.rows:
        cells = [str(row.row), *(cell_md(c, m) for c, m in zip(row.cells, row.marked, strict=False))]
        lines.append("| " + " | ".join(cells) + " |")
    return "\n".join(lines)


def text_sketch(before: Sequence[Grid], after: Sequence[Grid]) -> str:
    """The before/after shapes as characters, side by side, for readers without pictures."""

    def block(grids: Sequence[Grid]) -> list[str]:
        height = max(len(g) for g in grids)
        rows = []
        for r in range(height):
            parts = [
                " ".join(TEXT_CELL[c] for c in g[r]) if r < len(g) else " " * (2 * len(g[0]) - 1)
                for g in grids
            ]
            rows.append("   ".join(parts))
        return rows

    left, right = block(before), block(after)
    width = max(len(line) for line in left)
    lines = [f"{'before'.ljust(width)}      after"]
    for r in range(max(len(left), len(right))):
        a = left[r] if r < len(left) else ""
        b = right[r] if r < len(right) else ""
        arrow = " ---> " if r == 1 else "      "
        lines.append(f"{a.ljust(width)}{arrow}{b}".rstrip())
    return "\n".join(lines)


def finding_md(item: letter.Item) -> str:
    f = item.finding
    blocks = "blocks acceptance" if item.blocks else "does not block acceptance"
    parts = [
        f"## {item.number}. {letter.LABEL[f.severity]}: {md(item.title)}",
        f"*{f.severity.value}, {blocks}*",
        "\n".join(f"- **{k}:** {md(v)}" for k, v in letter.place_lines(f)),
        f"**What is wrong.** {md(f.message)}",
    ]
    if f.excerpt is not None:
        parts.append(excerpt_md(f.excerpt))
    elif f.examples:
        parts.append("Examples as written: " + ", ".join(md(e) for e in f.examples))
    if f.fix:
        parts.append(f"**How to fix it.** {md(f.fix)}")
    if f.step is not None:
        picture = sketch_for(f.step)
        parts.append(code_block(text_sketch(picture.before, picture.after)))
        parts.append(md(picture.caption))
        parts.append("Weir can make this change for you; this is the step as a recipe:")
        parts.append(code_block(letter.step_json(f), "json"))
        code = step_pandas_code(f.step)
        if code:
            parts.append("The same change in pandas (on a DataFrame `df`):")
            parts.append(code_block(code, "python"))
    parts.append(f"Rule `{f.rule}`; `weir explain {f.rule}` says more.")
    return "\n\n".join(parts)


def render(report: Report) -> str:
    """The whole letter as CommonMark with pipe tables; every submitted value escaped."""
    counts = report.counts()
    lines = [
        f"# {md(letter.verdict_heading(report))}",
        md(letter.counts_sentence(report)),
        "\n".join(f"- {letter.LABEL[s]} ({s.value}s): {counts[s.value]}" for s in Severity),
        "\n".join(
            f"- **{md(r.file + (f' [{r.sheet}]' if r.sheet else ''))}**: {letter.plural(r.rows, 'row')}, "
            f"{letter.plural(len(r.findings), 'finding')}"
            for r in report.results
        ),
        f"Row numbers and column letters are those your spreadsheet shows. Cells to correct are "
        f"**marked {letter.MARKER}**. Problems that block acceptance come first.",
    ]
    listed = letter.items(report)
    lines += [finding_md(i) for i in listed[: letter.SECTIONS]] or ["Weir found nothing to correct."]
    rest = listed[letter.SECTIONS :]
    if rest:
        table = ["| No. | Priority | Where | Problem | What is wrong |", "|---|---|---|---|---|"]
        table += ["| " + " | ".join(md(v) for v in letter.summary_line(i)) + " |" for i in rest]
        lines += [f"## {len(rest)} more findings, in brief", "\n".join(table)]
    lines.append(
        f"*Checked {md(report.created)} by weir {md(report.tool_version)}; submissions are returned "
        f"on {report.fail_on.value}s and above.*"
    )
    return "\n\n".join(lines) + "\n"
