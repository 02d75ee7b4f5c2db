"""Layout rule about cells holding lists of items (`mayfly; stonefly`): one row per item is tidy."""

from __future__ import annotations

import re
from collections import Counter
from collections.abc import Iterable

from linter.contract.model import TableContract
from linter.findings import Finding, Severity
from linter.rules.layout_cells import present_texts
from linter.rules.layout_margins import below_titles
from linter.rules.layout_place import layout_finding
from linter.rules.layout_signals import cell_kind, frame_of
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Table

LIST_CELLS = define_rule(
    "layout.list-cells",
    "Lists inside cells",
    Severity.ERROR,
    """
    Finds a column whose cells hold lists of items separated by `;`, `|` or `,`
    (`mayfly; stonefly`). Counting, filtering or joining by an item is impossible while the
    items share a cell. Fix: one row per item.

    Bad:
        site,taxa
        VB-014,mayfly; stonefly

    Good:
        site,taxa
        VB-014,mayfly
        VB-014,stonefly
    """,
)

LIST_SEPARATORS = (";", "|", ",", " / ")
ONE_WORD = re.compile(r"^[A-Za-z][A-Za-z'-]{0,19}$")


def _items_recur(texts: list[str], sep: str, items: list[str]) -> bool:
    """Items of a real list recur in different company ("mayfly" alone, "mayfly; midge");
    the parts of "Surname, Given" always come together in the same one cell."""
    if len(set(items)) > 0.8 * len(items):
        return False
    cells_of: dict[str, set[str]] = {}
    for text in set(texts):
        for item in text.split(sep):
            cells_of.setdefault(item.strip(), set()).add(text)
    multi = [t for t in set(texts) if sep in t]
    shared = [t for t in multi if any(len(cells_of[i.strip()]) >= 2 for i in t.split(sep))]
    return len(shared) >= 0.5 * len(multi)


def _one_word_items(sizes: Counter[int], items: list[str]) -> bool:
    """On a table too small for items to recur: every item one word (`billing`, `gluten`), and
    some cells hold a single item while others hold several. Free text splits into phrases."""
    return sizes[1] > 0 and all(_one_word_or_list(item) for item in items)


def _one_word_or_list(item: str) -> bool:
    """One word, or a list of one-word items under another separator (`red, green; blue`)."""
    if ONE_WORD.match(item):
        return True
    return any(
        sep in item and all(ONE_WORD.match(part.strip()) for part in item.split(sep))
        for sep in LIST_SEPARATORS
    )


def find_list_cells(table: Table, contract: TableContract | None = None) -> list[Finding]:
    frame = frame_of(table)
    findings: list[Finding] = []
    for label in frame.labels:
        texts = present_texts(frame, label)
        if len(texts) < 2 or any(cell_kind(t) == "number" for t in texts):
            continue
        for sep in LIST_SEPARATORS:
            listed = [t for t in texts if sep in t]
            if len(listed) < max(1, 0.2 * len(texts)):
                continue
            items = [item.strip() for t in texts for item in t.split(sep)]
            if any(not item or len(item) > 40 or len(item.split()) > 4 for item in items):
                continue
            sizes = Counter(len(t.split(sep)) for t in texts)
            if len(sizes) < 2:
                continue
            if not (_items_recur(texts, sep, items) or _one_word_items(sizes, items)):
                continue
            findings.append(
                layout_finding(
                    LIST_CELLS,
                    table,
                    f"The column '{label}' holds lists of items separated by '{sep}' "
                    f"in {len(listed)} of {len(texts)} cells (e.g. '{listed[0]}').",
                    f"Write one row per item of '{label}'.",
                    {"step": "explode", "column": label, "separator": sep},
                    rows=table.row_numbers[:1],
                    columns=[label],
                    letters=(frame.letter(label),),
                    count=len(listed),
                    examples=listed[:5],
                )
            )
            break
    return findings


@inspector()
def list_cells(subject: Subject) -> Iterable[Finding]:
    return find_list_cells(below_titles(subject.table), subject.contract)
