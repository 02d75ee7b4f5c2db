"""Layout rules about groups of rows: section-title rows and blank cells that mean "same as above"."""

from __future__ import annotations

from collections.abc import Iterable
from itertools import pairwise

import numpy as np
import pandas as pd

from linter.contract.model import TableContract
from linter.findings import Finding, Severity
from linter.rules.layout_header_rows import index_name_row
from linter.rules.layout_margins import NOTE_LABEL, TOTAL_LABEL, below_titles
from linter.rules.layout_place import frame_letters, layout_finding, shown
from linter.rules.layout_signals import YEAR, blank, dominant_kind, filled_mask, frame_of, row_fill, sample
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Table

SECTION_TITLES = define_rule(
    "layout.section-titles",
    "Section-title rows",
    Severity.ERROR,
    """
    Finds rows with only their first cell filled that label the rows below them (a river, a
    month, a laboratory). The label is a value of every row in its section but is written once,
    so sorting or filtering loses it. Fix: move the label into its own column.

    Bad:
        site,ph
        Upper Vell,
        VB-014,7.1
        Lower Vell,
        VB-031,6.9

    Good:
        section,site,ph
        Upper Vell,VB-014,7.1
        Lower Vell,VB-031,6.9
    """,
)

SAME_AS_ABOVE = define_rule(
    "layout.same-as-above",
    "Blank cells that mean 'same as above'",
    Severity.ERROR,
    """
    Finds identifying columns written once per group (often merged cells) and left blank below,
    where blank means "same as above", not "missing". A row read on its own then has no site or
    date. Fix: repeat the value in every row.

    Bad:
        site,sampled_on,ph
        VB-014,2025-03-02,7.1
        ,2025-03-09,7.0

    Good:
        site,sampled_on,ph
        VB-014,2025-03-02,7.1
        VB-014,2025-03-09,7.0
    """,
)


def find_section_titles(table: Table, contract: TableContract | None = None) -> list[Finding]:
    grid = table.grid
    if grid.shape[0] < 4 or grid.shape[1] < 3:
        return []
    counts, first_cell = row_fill(grid)
    wide = np.flatnonzero(counts >= 2)
    if not wide.size or wide[0] != 0:
        return []
    last = int(wide[-1])
    lone = [int(i) for i in np.flatnonzero((counts == 1) & (first_cell == 0)) if 0 < i < last]
    if index_name_row(grid):
        return []  # the lone row under a blank header cell names column A (a header row)
    titles = [
        i
        for i in lone
        if not TOTAL_LABEL.match(str(grid.iat[i, 0])) and not NOTE_LABEL.match(str(grid.iat[i, 0]))
    ]
    if not titles or titles[0] != 1 or any(b - a < 2 for a, b in pairwise(titles)):
        return []
    texts = [str(grid.iat[i, 0]).strip() for i in titles]
    into = "section"
    for variable in contract.variables if contract else ():
        codes = set(variable.codes.values) if variable.codes else set()
        if variable.name not in map(str, grid.iloc[0]) and codes and set(texts) <= codes:
            into = variable.name
    rows = [table.row_numbers[i] for i in titles]
    return [
        layout_finding(
            SECTION_TITLES,
            table,
            f"{len(rows)} row(s) are section titles ({shown(texts)}) labelling the rows below them.",
            f"Move each title into a '{into}' column on every row of its section.",
            {"step": "lift_titles", "rows": rows, "into": into},
            rows=rows,
            letters=("A",),
            count=len(rows),
            examples=texts,
        )
    ]


def _nested(body: pd.DataFrame, left: list[str], chosen: list[str], empty_rows: list[int]) -> bool:
    """A "same as above" blank sits inside its group: every column to its left repeats the row above."""
    if not left:
        return True
    view = body[left].copy()
    if chosen:
        view[chosen] = view[chosen].ffill()
    rows = [i for i in empty_rows[:500] if i > 0]
    return all(view.iloc[i].tolist() == view.iloc[i - 1].tolist() for i in rows)


def find_same_as_above(table: Table, contract: TableContract | None = None) -> list[Finding]:
    frame = frame_of(table)
    body = frame.body
    if len(body) < 3 or len(frame.labels) < 2:
        return []
    chosen: list[str] = []
    filled = filled_mask(table.grid)[1:]
    for position, label in enumerate(frame.labels[:3]):
        present = filled[:, position]
        empties = int((~present).sum())
        if not present[0] or empties < len(present) / 4 or present.sum() < 2:
            continue
        values = body[label][present]
        if dominant_kind(sample(values))[0] == "number" and not all(
            YEAR.match(str(v).strip()) for v in values
        ):
            break  # measurements start here; a year written once per group is still a label
        if body[[*frame.labels[:position], label]][present].duplicated().any():
            continue  # a label written once per group appears once within its enclosing group
        empty_rows = [int(i) for i in np.flatnonzero(~present)]
        others = np.delete(filled, position, axis=1)
        if not others[empty_rows[:500]].any(axis=1).all():
            continue  # a blank row is not a "same as above" row
        if not _nested(body, list(frame.labels[:position]), chosen, empty_rows):
            continue
        chosen.append(label)
    if not chosen:
        return []
    examples = [str(v) for v in body[chosen[0]].tolist() if not blank(v)]
    blanks = sum(int(body[c].isna().sum()) for c in chosen)
    return [
        layout_finding(
            SAME_AS_ABOVE,
            table,
            f"The column(s) {shown(chosen)} name each group once and leave {blanks} cell(s) blank below, "
            "meaning 'same as above'.",
            "Repeat the value in every row of its group.",
            {"step": "fill_down", "columns": chosen},
            columns=chosen,
            letters=frame_letters(frame, chosen),
            count=blanks,
            examples=examples,
        )
    ]


DITTO_MARKS = ('"', "''", "〃", "ditto", "do.")
"""Common practice (no source): the marks hand-kept ledgers write for "same as above"."""


def find_ditto_marks(table: Table, contract: TableContract | None = None) -> list[Finding]:
    frame = frame_of(table)
    body = frame.body
    if len(body) < 3:
        return []
    chosen: list[str] = []
    count = 0
    for label in frame.labels:
        texts = [None if blank(v) else str(v).strip() for v in sample(body[label])]
        marked = [t is not None and t.lower() in DITTO_MARKS for t in texts]
        if not any(marked) or marked[0] or sum(marked) < len(texts) / 4:
            continue
        if any(
            t is not None and not m and t.lower() in DITTO_MARKS for t, m in zip(texts, marked, strict=True)
        ):
            continue
        chosen.append(label)
        count += sum(marked)
    if not chosen:
        return []
    marks = sorted(
        {
            str(v).strip()
            for c in chosen
            for v in body[c]
            if not blank(v) and str(v).strip().lower() in DITTO_MARKS
        }
    )
    return [
        layout_finding(
            SAME_AS_ABOVE,
            table,
            f"The column(s) {shown(chosen)} write {shown(marks)} in {count} cell(s) for 'same as above'.",
            "Repeat the value in every row instead of the ditto mark.",
            {"step": "fill_down", "columns": chosen, "marks": marks},
            columns=chosen,
            letters=frame_letters(frame, chosen),
            count=count,
            examples=marks,
        )
    ]


@inspector()
def ditto_marks(subject: Subject) -> Iterable[Finding]:
    return find_ditto_marks(below_titles(subject.table), subject.contract)


@inspector()
def section_titles(subject: Subject) -> Iterable[Finding]:
    return find_section_titles(subject.table, subject.contract)


@inspector()
def same_as_above(subject: Subject) -> Iterable[Finding]:
    return find_same_as_above(below_titles(subject.table), subject.contract)
