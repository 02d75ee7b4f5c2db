"""Layout rule about a column whose every cell joins several values: a packed column.

Lists of items inside cells are the other way a cell holds more than one value (`layout_lists.py`).
"""

from __future__ import annotations

import re
from collections.abc import Iterable

from linter.contract.model import TableContract
from linter.findings import Finding, Severity
from linter.rules.layout_margins import below_titles
from linter.rules.layout_place import layout_finding
from linter.rules.layout_signals import (
    YEAR,
    blank,
    cell_kind,
    frame_of,
    header_value_kind,
    is_date,
    sample,
    slug,
)
from linter.rules.layout_units import is_unit
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import Frame, Table

PACKED_COLUMN = define_rule(
    "layout.packed-column",
    "Several variables in one column",
    Severity.ERROR,
    """
    Finds a column whose every value joins several values: a number and its unit (`12 mg/L`),
    a range (`0-5`), or two codes joined by a separator (`nitrate/filtered`). Such a column is
    text to every tool, so it cannot be summed, compared or checked. Fix: split it into one
    column per part.

    Bad:
        site,nitrate
        VB-014,1.2 mg/L

    Good:
        site,nitrate,nitrate_unit
        VB-014,1.2,mg/L
    """,
)

NUM = r"[<>]?-?\d+(?:\.\d+)?"
VALUE_UNIT = re.compile(rf"^\s*({NUM})\s*([A-Za-zµμ°%][A-Za-z0-9µμ°%/.²³]*)\s*$")
RANGE_CELL = re.compile(r"^\s*(-?\d+(?:\.\d+)?)\s*(?:-|–|to)\s*(-?\d+(?:\.\d+)?)\s*$")
YEAR_MONTH = re.compile(r"^\d{4}-\d{2}$")
SEPARATORS = ("/", "|", "_", ":", " - ")
MATCH_SHARE = 0.9
UNIT_VARIETY = 0.3
"""Share of distinct numbers that marks a column of measurements (class codes repeat a few)."""


def present_texts(frame: Frame, label: str) -> list[str]:
    """The sampled non-blank cells of a column, as text."""
    return [str(v) for v in sample(frame.body[label]) if not blank(v)]


def _letter(token: str) -> bool:
    return len(token) == 1 and token.isalpha()


def _value_unit(label: str, texts: list[str]) -> dict[str, object] | None:
    if any(header_value_kind(t) == "date" for t in texts[:50]):
        return None  # "2025 Oct" is a month, not 2025 of a unit called Oct
    matches = [VALUE_UNIT.match(t) for t in texts]
    hits = [m for m in matches if m]
    if len(hits) < MATCH_SHARE * len(texts) or len(hits) < 2:
        return None
    # A number glued to a letter is also how class codes (`10B`) and grid squares are written.
    # Accept it as value and unit only when the tokens are known units, or when the numbers
    # vary like measurements and every token is longer than one letter.
    tokens = {m.group(2) for m in hits}
    numbers = {m.group(1) for m in hits}
    # A one-letter unit (C, A, S) is also a class or grade letter: it needs numbers that vary.
    known = all(is_unit(t) for t in tokens) and (len(numbers) >= 2 or all(not _letter(t) for t in tokens))
    measured = len(numbers) >= max(2, UNIT_VARIETY * len(hits)) and all(len(t) > 1 for t in tokens)
    if not (known or measured):
        return None
    name = slug(label)
    pattern = rf"^\s*(?P<{name}>{NUM})\s*(?P<{name}_unit>\S.*?)\s*$"
    return {"pattern": pattern, "into": [name, f"{name}_unit"], "kind": "value and unit"}


def _range(label: str, texts: list[str]) -> dict[str, object] | None:
    if any(YEAR_MONTH.match(t.strip()) for t in texts):
        return None
    hits = [RANGE_CELL.match(t) for t in texts]
    if sum(bool(h) for h in hits) < MATCH_SHARE * len(texts) or len(texts) < 2:
        return None
    matched = [h for h in hits if h]
    ends = [(float(h.group(1)), float(h.group(2))) for h in matched]
    if all(
        YEAR.match(h[1]) and YEAR.match(h[2]) and high - low == 1
        for h, (low, high) in zip(matched, ends, strict=True)
    ):
        return None  # `2019-2020` is one season or school year, a single value
    name = slug(label)
    # Only `from < to` on every row makes a range; otherwise two counts joined by a dash (`3-1`).
    ordered = all(low < high for low, high in ends)
    into = [f"{name}_from", f"{name}_to"] if ordered else [f"{name}_1", f"{name}_2"]
    pattern = rf"^\s*(?P<{into[0]}>-?\d+(?:\.\d+)?)\s*(?:-|–|to)\s*(?P<{into[1]}>-?\d+(?:\.\d+)?)\s*$"
    return {"pattern": pattern, "into": into, "kind": "range" if ordered else "two numbers"}


NUMBER_PAIR = re.compile(r"^\s*\d+(?:\.\d+)?\s*/\s*\d+(?:\.\d+)?\s*$")


def _number_pair(label: str, texts: list[str]) -> dict[str, object] | None:
    """Two numbers joined by a slash (`3/7`, `745/19987071`): a count and its total, say."""
    if sum(bool(NUMBER_PAIR.match(t)) for t in texts) < MATCH_SHARE * len(texts) or len(texts) < 2:
        return None
    name = slug(label)
    pattern = rf"^\s*(?P<{name}_1>\d+(?:\.\d+)?)\s*/\s*(?P<{name}_2>\d+(?:\.\d+)?)\s*$"
    return {"pattern": pattern, "into": [f"{name}_1", f"{name}_2"], "kind": "two numbers"}


NUMBER_RUN = re.compile(r"(?<![\d.])-?\d+(?:\.\d+)?")
TUPLE_SEPARATOR = re.compile(r"^(\s*[,;/|]\s*|\s*-\s*|\s+\(|%?\)|\s+)$")


def _dates(texts: list[str]) -> bool:
    """Every cell reads as year-month-day, day-month-year or month-day-year."""

    def fits(a: str, b: str, c: str) -> bool:
        x, y, z = int(a), int(b), int(c)
        return (
            (len(a) == 4 and 1 <= y <= 12 and 1 <= z <= 31)
            or (len(c) in (2, 4) and 1 <= x <= 31 and 1 <= y <= 12)
            or (len(c) in (2, 4) and 1 <= x <= 12 and 1 <= y <= 31)
        )

    parts = [NUMBER_RUN.findall(t) for t in texts]
    return all(len(p) == 3 and all(q.isdigit() for q in p) and fits(*p) for p in parts)


def _number_tuple(label: str, texts: list[str]) -> dict[str, object] | None:
    """Several numbers in one fixed frame on every row (`8-0-2`, `45 (12%)`, `54.5, -2.8`).

    Dates, times and decimals are left alone: the frame must be the same on every row, hold
    only list-like separators or a bracketed share, and the cells must not read as dates.
    """
    frames = {NUMBER_RUN.sub("#", t.strip()) for t in texts}
    if len(frames) != 1 or len(texts) < 2:
        return None
    frame = next(iter(frames))
    pieces = frame.split("#")
    if frame.count("#") < 2 or pieces[0] or any(is_date(t) for t in texts):
        return None
    if frame.count("#") == 3 and pieces[1] == pieces[2] and pieces[1] in ("/", "-", ".") and _dates(texts):
        return None  # 2012/01/01, 01.02.2024: a date however it is written
    if frame.count("#") == 2 and pieces[1].strip() in ("-", "–", "/"):
        return None  # two numbers by a dash or slash: the range and pair rules judge those
    if not all(TUPLE_SEPARATOR.match(p) for p in pieces[1:-1]) or pieces[-1] not in ("", "%", "%)", ")"):
        return None
    name = slug(label)
    into = [f"{name}_{i}" for i in range(1, frame.count("#") + 1)]
    pattern = (
        "^"
        + "".join(
            re.escape(p) + (f"(?P<{into[i]}>-?\\d+(?:\\.\\d+)?)" if i < len(into) else "")
            for i, p in enumerate(pieces)
        )
        + "$"
    )
    return {"pattern": pattern.replace("\\\\", "\\"), "into": into, "kind": "several numbers"}


def _crossed_codes(label: str, texts: list[str]) -> dict[str, object] | None:
    """Two codes joined by one separator whose parts cross like two variables (m/014, f/014, ...)."""
    if all(is_unit(t) for t in set(texts)):
        return None  # `mg/L` is one unit, not the codes `mg` and `L`
    for sep in SEPARATORS:
        if not all(t.count(sep) == 1 for t in texts):
            continue  # stops at the first text without exactly one separator, before any split
        parts = [t.split(sep) for t in texts]
        if not all(len(p) == 2 and p[0].strip() and p[1].strip() for p in parts):
            continue
        left = {p[0].strip() for p in parts}
        right = {p[1].strip() for p in parts}
        combos = {(p[0].strip(), p[1].strip()) for p in parts}
        if len(left) < 2 or len(right) < 2 or len(combos) < 0.5 * len(left) * len(right):
            continue
        if len(combos) == len(texts):
            continue  # every value unique: an identifier (a bottle, a sample), not two variables
        if any(cell_kind(t) != "text" for t in texts):
            return None
        name = slug(label)
        pattern = rf"^(?P<{name}_1>.+?){re.escape(sep)}(?P<{name}_2>.+)$"
        return {"pattern": pattern, "into": [f"{name}_1", f"{name}_2"], "kind": "two codes"}
    return None


def find_packed_column(table: Table, contract: TableContract | None = None) -> list[Finding]:
    frame = frame_of(table)
    findings: list[Finding] = []
    for label in frame.labels:
        texts = present_texts(frame, label)
        if len(texts) < 2:
            continue
        found = (
            _value_unit(label, texts)
            or _range(label, texts)
            or _number_pair(label, texts)
            or _number_tuple(label, texts)
            or _crossed_codes(label, texts)
        )
        if found is None:
            continue
        variable = contract.variable(label) if contract else None
        if variable is not None and variable.unit and found["kind"] == "value and unit":
            found["into"] = [label, f"{label}_unit"]
        into = list(found["into"])  # type: ignore[call-overload]
        pattern = str(found["pattern"])
        if variable is not None:
            pattern = pattern.replace(f"(?P<{slug(label)}>", f"(?P<{into[0]}>").replace(
                f"(?P<{slug(label)}_unit>", f"(?P<{into[1]}>"
            )
        findings.append(
            layout_finding(
                PACKED_COLUMN,
                table,
                f"The column '{label}' packs {found['kind']} into one cell (e.g. '{texts[0]}').",
                f"Split '{label}' into the columns {', '.join(into)}.",
                {"step": "split_column", "column": label, "pattern": pattern, "into": into},
                rows=table.row_numbers[:1],
                columns=[label],
                letters=(frame.letter(label),),
                count=len(frame.body),
                examples=texts[:5],
                evidence={"kind": found["kind"]},
            )
        )
    return findings


@inspector()
def packed_column(subject: Subject) -> Iterable[Finding]:
    return find_packed_column(below_titles(subject.table), subject.contract)
