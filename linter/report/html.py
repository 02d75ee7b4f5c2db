"""The fix-it letter as one self-contained HTML page: inline CSS, inline SVG, no scripts, prints well."""

from __future__ import annotations

from html import escape

from linter.findings import Excerpt, Finding, Severity
from linter.report import letter, sketch
from linter.report.model import Report, TableResult
from linter.report.step_code import step_pandas_code

STYLE = """
:root { --ink:#1f2a33; --muted:#5b6b7d; --line:#c7d0d9; --bad:#fde2e1; --bad-ink:#8f1d14;
        --ok:#e3f4e6; --ok-ink:#1d5e2c; --warn:#fff1d6; --warn-ink:#7a4a00; --note:#e6eef6; }
* { box-sizing: border-box; }
body { font: 15px/1.5 system-ui, "Segoe UI", Roboto, sans-serif; color: var(--ink); margin: 0 auto;
       max-width: 60rem; padding: 1.5rem; }
h1 { font-size: 1.55rem; margin: .2rem 0 .4rem; }
h2 { font-size: 1.15rem; margin: 0 0 .6rem; }
caption.kicker { text-align: left; }
.kicker { text-transform: uppercase; letter-spacing: .08em; font-size: .75rem; color: var(--muted);
          margin: 0; }
.verdict { border: 3px solid; border-radius: .5rem; padding: 1rem 1.25rem; margin-bottom: 1.25rem; }
.verdict.returned { background: var(--bad); border-color: var(--bad-ink); }
.verdict.accepted { background: var(--ok); border-color: var(--ok-ink); }
.counts { border-collapse: collapse; margin: .5rem 0; }
.counts td, .counts th { border: 1px solid var(--line); padding: .2rem .7rem; text-align: left;
                         background: #fff; }
.files { margin: .4rem 0 0; padding-left: 1.2rem; }
.legend { font-size: .9rem; color: var(--muted); border-left: 4px solid var(--line); padding-left: .75rem; }
.finding { border: 1px solid var(--line); border-left: 8px solid var(--muted); border-radius: .4rem;
           padding: 1rem 1.25rem; margin: 1rem 0; break-inside: avoid; page-break-inside: avoid; }
.finding.error { border-left-color: var(--bad-ink); }
.finding.warning { border-left-color: #c98a1c; }
.finding.note { border-left-color: #4b7aa6; }
.badge { display: inline-block; font-size: .8rem; font-weight: 700; padding: .05rem .5rem;
         border-radius: 1rem; border: 1px solid; margin-right: .4rem; vertical-align: middle; }
.error .badge { background: var(--bad); color: var(--bad-ink); }
.warning .badge { background: var(--warn); color: var(--warn-ink); }
.note .badge { background: var(--note); color: #234; }
dl.place { display: grid; grid-template-columns: max-content 1fr; gap: .1rem 1rem; margin: .4rem 0 .8rem; }
dl.place dt { color: var(--muted); }
dl.place dd { margin: 0; font-weight: 600; }
table.excerpt { border-collapse: collapse; margin: .6rem 0; font-size: .9rem; }
table.excerpt th, table.excerpt td { border: 1px solid var(--line); padding: .2rem .55rem; text-align: left;
                                     white-space: pre-wrap; vertical-align: top; }
table.excerpt thead th { background: #eef2f5; }
table.excerpt .letter { display: block; font-weight: 400; color: var(--muted); font-size: .75rem; }
table.excerpt th.row { background: #eef2f5; color: var(--muted); font-weight: 400; }
td.bad { background: var(--bad); color: var(--bad-ink); font-weight: 700; outline: 2px solid var(--bad-ink);
         outline-offset: -2px; }
.marker { font-weight: 700; }
.empty { color: var(--muted); font-style: italic; }
.fix { background: #f3f7f1; border: 1px dashed var(--ok-ink); padding: .5rem .75rem; border-radius: .3rem; }
figure.reshape { margin: .8rem 0; }
figure.reshape figcaption { font-size: .9rem; color: var(--muted); }
pre { background: #f4f6f8; border: 1px solid var(--line); padding: .6rem; overflow-x: auto; font-size: .8rem;
      white-space: pre-wrap; }
.rule { font-size: .8rem; color: var(--muted); margin-bottom: 0; }
footer { font-size: .8rem; color: var(--muted); margin-top: 2rem; }
@media print {
  body { max-width: none; padding: 0; font-size: 11pt; }
  .verdict, .finding, td.bad, .badge { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  pre { white-space: pre-wrap; }
}
"""


def cell_html(text: str | None, marked: bool) -> str:
    shown = f'<span class="empty">{letter.EMPTY}</span>' if text in (None, "") else escape(text or "")
    if marked:
        return f'<td class="bad"><span class="marker" title="to correct">{letter.MARKER}</span> {shown}</td>'
    return f"<td>{shown}</td>"


def excerpt_html(excerpt: Excerpt) -> str:
    head = "".join(
        f'<th scope="col">{escape(name)}<span class="letter">column {escape(col)}</span></th>'
        for name, col in zip(excerpt.columns, excerpt.letters, strict=False)
    )
    body = "".join(
        f'<tr><th scope="row" class="row">row {r.row}</th>'
        + "".join(cell_html(c, m) for c, m in zip(r.cells, r.marked, strict=False))
        + "</tr>"
        for r in excerpt.rows
    )
    return (
        '<table class="excerpt"><caption class="kicker">From your file</caption>'
        f'<thead><tr><th scope="col">Row</th>{head}</tr></thead><tbody>{body}</tbody></table>'
    )


def reshape_html(finding: Finding) -> str:
    if finding.step is None:
        return ""
    picture = sketch.sketch_for(finding.step)
    code = step_pandas_code(finding.step)
    pandas = (
        f'<p>The same change in pandas (on a DataFrame <code>df</code>):</p><pre class="code">'
        f"<code>{escape(code)}</code></pre>"
        if code
        else ""
    )
    return (
        f'<figure class="reshape">{sketch.svg(finding.step)}'
        f"<figcaption>{escape(picture.caption)}</figcaption></figure>"
        "<p>Weir can make this change for you; this is the step as a recipe:</p>"
        f'<pre class="recipe"><code>{escape(letter.step_json(finding))}</code></pre>{pandas}'
    )


def finding_html(item: letter.Item) -> str:
    f = item.finding
    blocks = "blocks acceptance" if item.blocks else "does not block acceptance"
    place = "".join(f"<dt>{escape(k)}</dt><dd>{escape(v)}</dd>" for k, v in letter.place_lines(f))
    examples = ""
    if f.examples and f.excerpt is None:
        shown = ", ".join(f"<code>{escape(e)}</code>" for e in f.examples)
        examples = f"<p>Examples as written: {shown}</p>"
    return (
        f'<section class="finding {f.severity.value}" id="finding-{item.number}">'
        f'<h2><span class="badge">{escape(letter.LABEL[f.severity])}</span>'
        f"{item.number}. {escape(item.title)}</h2>"
        f'<p class="kicker">{escape(f.severity.value)} · {blocks}</p>'
        f'<dl class="place">{place}</dl>'
        f'<p class="reason"><strong>What is wrong.</strong> {escape(f.message)}</p>'
        + (excerpt_html(f.excerpt) if f.excerpt is not None else "")
        + examples
        + (f'<p class="fix"><strong>How to fix it.</strong> {escape(f.fix)}</p>' if f.fix else "")
        + reshape_html(f)
        + f'<p class="rule">Rule <code>{escape(f.rule)}</code>; <code>weir explain {escape(f.rule)}</code> '
        "says more.</p></section>"
    )


def overflow_html(rest: list[letter.Item]) -> str:
    """The findings beyond the first SECTIONS, one table row each."""
    if not rest:
        return ""
    rows = "".join(
        "<tr>" + "".join(f"<td>{escape(v)}</td>" for v in letter.summary_line(i)) + "</tr>" for i in rest
    )
    return (
        f'<section class="overflow"><h2>{len(rest)} more findings, in brief</h2>'
        '<table class="excerpt"><thead><tr>'
        + "".join(
            f'<th scope="col">{h}</th>' for h in ("No.", "Priority", "Where", "Problem", "What is wrong")
        )
        + "</tr></thead>"
        f"<tbody>{rows}</tbody></table></section>"
    )


def table_line(result: TableResult, fail_on_rank: int) -> str:
    name = f"{result.file} [{result.sheet}]" if result.sheet else result.file
    returned = any(f.severity.rank >= fail_on_rank for f in result.findings)
    state = "returned" if returned else "accepted"
    contract = f", contract {result.contract} v{result.contract_version}" if result.contract else ""
    return (
        f"<li><strong>{escape(name)}</strong>: {result.rows} row{'s' if result.rows != 1 else ''}"
        f"{escape(contract)} — {state}, "
        f"{len(result.findings)} finding{'s' if len(result.findings) != 1 else ''}</li>"
    )


def render(report: Report) -> str:
    """The whole letter; every value that came from a submission or a message is escaped."""
    listed = letter.items(report)
    counts = report.counts()
    count_rows = "".join(
        f"<tr><th scope='row'>{escape(letter.LABEL[s])} ({s.value}s)</th><td>{counts[s.value]}</td></tr>"
        for s in Severity
    )
    files = "".join(table_line(r, report.fail_on.rank) for r in report.results)
    sections = (
        "".join(finding_html(i) for i in listed[: letter.SECTIONS]) or "<p>Weir found nothing to correct.</p>"
    )
    sections += overflow_html(listed[letter.SECTIONS :])
    legend = (
        f'<p class="legend">Row numbers and column letters are those your spreadsheet shows. '
        f"Cells to correct are shaded and marked <strong>{letter.MARKER}</strong>. Problems that block "
        "acceptance come first.</p>"
    )
    return (
        '<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8">'
        '<meta name="viewport" content="width=device-width, initial-scale=1">'
        f"<title>Weir: submission {escape(report.verdict)}</title><style>{STYLE}</style></head><body>"
        f'<header class="verdict {escape(report.verdict)}"><p class="kicker">Weir · submission check</p>'
        f'<h1 id="verdict">{escape(letter.verdict_heading(report))}</h1>'
        f"<p>{escape(letter.counts_sentence(report))}</p>"
        f'<table class="counts">{count_rows}</table><ul class="files">{files}</ul></header>'
        f"{legend}<main>{sections}</main>"
        f"<footer>Checked {escape(report.created)} by weir {escape(report.tool_version)}; submissions are "
        f"returned on {escape(report.fail_on.value)}s and above.</footer></body></html>\n"
    )
