"""Recognises header labels that are values of a period or of a known answer scale.

Quarters (`Q1 2023`), ISO 8601 weeks (`2024-W05`), day and month (`1 Mar`), weekdays (`Mon`)
and the levels of an agreement scale (`Strongly agree` ... `Strongly disagree`) name values,
never variables; a run of them across a header is one variable spread over columns.
"""

from __future__ import annotations

import re

MONTH_WORD = (
    r"(jan(uary)?|feb(ruary)?|mar(ch)?|apr(il)?|may|june?|july?|aug(ust)?|sept?(ember)?"
    r"|oct(ober)?|nov(ember)?|dec(ember)?)\.?"
)
# Common practice (no source): quarters written Q1, Q1 2023, 2023 Q1, 2023-Q1.
QUARTER = re.compile(r"^(q[1-4]([\s/_-]*\d{2}(\d{2})?)?|\d{4}[\s/_-]*q[1-4])$", re.I)
# Source: ISO 8601-1:2019 §5.2.3 (week dates: 2024-W05, 2024W05).
ISO_WEEK = re.compile(r"^\d{4}-?W\d{2}$")
ORDINAL = r"\d{1,2}(st|nd|rd|th)?"
DAY_MONTH = re.compile(rf"^({ORDINAL}[\s-]*{MONTH_WORD}|{MONTH_WORD}[\s-]*{ORDINAL})$", re.I)
# Common practice (no source): English weekday names and their usual abbreviations.
_WEEKDAY_WORDS = "monday tuesday wednesday thursday friday saturday sunday"
_WEEKDAY_SHORT = "mon tue tues wed thu thur thurs fri sat sun"
WEEKDAYS = frozenset(f"{_WEEKDAY_WORDS} {_WEEKDAY_SHORT}".split())
# Source: Likert, "A technique for the measurement of attitudes", Archives of Psychology 140 (1932):
# the five-point agreement scale; the frequency and satisfaction wordings are common practice.
SCALE_LEVELS = frozenset(
    [
        "strongly agree", "agree", "neutral", "neither agree nor disagree", "disagree",
        "strongly disagree", "somewhat agree", "somewhat disagree", "don't know", "dont know",
        "very satisfied", "satisfied", "dissatisfied", "very dissatisfied", "always", "often",
        "sometimes", "rarely", "never", "very good", "good", "fair", "poor", "very poor",
    ]
)  # fmt: skip


def level_kind(text: str) -> str | None:
    """`quarter`, `week`, `date`, `day` or `answer` when a header label is such a value."""
    text = text.strip()
    low = text.lower().rstrip(".")
    if QUARTER.match(text):
        return "quarter"
    if ISO_WEEK.match(text):
        return "week"
    if DAY_MONTH.match(text):
        return "date"
    if low in WEEKDAYS:
        return "day"
    if low in SCALE_LEVELS:
        return "answer"
    return None
