"""Vectorised reading of date and date-time cells: the agreed form, and valid dates in other forms."""

from __future__ import annotations

import numpy as np
import pandas as pd

from linter.contract.problems import Problem

ISO_DATE = r"^\d{4}-\d{2}-\d{2}$"
"""The ISO 8601-1 calendar date, complete representation, extended format (YYYY-MM-DD)."""

# Forms a provider may use for a real date instead of the agreed one, tried in this order.
# The first three are ISO 8601 forms too (basic calendar, ordinal, week date) but not the
# extended calendar form Weir agrees on by default, so they earn a format finding, not a type one.
OTHER_DATE_FORMS: tuple[tuple[str, str], ...] = (
    (r"^\d{8}$", "%Y%m%d"),
    (r"^\d{4}-\d{3}$", "%Y-%j"),
    (r"^\d{4}-W\d{2}-\d$", "%G-W%V-%u"),
    (r"^\d{4}-\d{1,2}-\d{1,2}$", "%Y-%m-%d"),
    (r"^\d{4}/\d{1,2}/\d{1,2}$", "%Y/%m/%d"),
    (r"^\d{1,2}\.\d{1,2}\.\d{4}$", "%d.%m.%Y"),
    (r"^\d{1,2}-\d{1,2}-\d{4}$", "%d-%m-%Y"),
    (r"^\d{1,2} [A-Za-z]{3} \d{4}$", "%d %b %Y"),
    (r"^\d{1,2} [A-Za-z]{4,9} \d{4}$", "%d %B %Y"),
    (r"^[A-Za-z]{3} \d{1,2}, \d{4}$", "%b %d, %Y"),
)
SLASHED = r"^\d{1,2}/\d{1,2}/\d{4}$"
"""Day/month/year or month/day/year: both readings are tried, and an ambiguity is said plainly."""

OTHER_DATETIME_FORMS: tuple[str, ...] = (
    "%d/%m/%Y %H:%M",
    "%d/%m/%Y %H:%M:%S",
    "%m/%d/%Y %H:%M",
    "%d.%m.%Y %H:%M",
    "%Y%m%dT%H%M%S",
    "%Y/%m/%d %H:%M",
)


def _parse(text: pd.Series, form: str) -> pd.Series:
    return pd.to_datetime(text, format=form, errors="coerce")


def _iso_text(stamps: pd.Series, with_time: bool) -> pd.Series:
    return stamps.dt.strftime("%Y-%m-%dT%H:%M:%S" if with_time else "%Y-%m-%d")


def _other_date(text: pd.Series, todo: np.ndarray, extra: tuple[tuple[str, str], ...]) -> pd.Series:
    """Where `todo`, the ISO rewrite of a date written in another recognised form, else None."""
    full = np.full(len(text), None, dtype=object)
    if todo.any():  # only the failing cells are tried against the other forms
        full[todo] = _other_date_forms(text[todo], extra)
    return pd.Series(full, index=text.index, dtype=object)


def matches(text: pd.Series, pattern: str) -> np.ndarray:
    """Where the text cell matches `pattern` from its start, as a numpy mask (None never matches)."""
    return text.str.match(pattern, na=False).to_numpy(dtype=bool)


def _other_date_forms(text: pd.Series, extra: tuple[tuple[str, str], ...]) -> np.ndarray:
    """The ISO rewrite of each cell written as a real date in another form, else None (numpy
    arrays throughout: a pandas assignment through a mask costs a copy of the column)."""
    suggestion = np.full(len(text), None, dtype=object)
    left = np.ones(len(text), dtype=bool)
    forms = extra + OTHER_DATE_FORMS
    if not matches(text, "|".join(f"(?:{pattern})" for pattern, _ in forms)).any():
        forms = ()  # one look at the cells instead of one per form, when no form fits any of them
    for pattern, form in forms:
        shaped = left & matches(text, pattern)
        if not shaped.any():
            continue
        stamps = _parse(text.where(shaped), form)
        hit = shaped & stamps.notna().to_numpy(dtype=bool)
        suggestion[hit] = _iso_text(stamps[hit], False).to_numpy(dtype=object)
        left &= ~hit
    shaped = left & matches(text, SLASHED)
    if shaped.any():
        day_first = _iso_text(_parse(text.where(shaped), "%d/%m/%Y"), False)
        month_first = _iso_text(_parse(text.where(shaped), "%m/%d/%Y"), False)
        day, month = day_first.notna().to_numpy(dtype=bool), month_first.notna().to_numpy(dtype=bool)
        both = shaped & day & month & (day_first != month_first).to_numpy(dtype=bool)
        only_day = shaped & day & ~both
        only_month = shaped & ~day & month
        suggestion[both] = (day_first[both] + " or " + month_first[both]).to_numpy(dtype=object)
        suggestion[only_day] = day_first[only_day].to_numpy(dtype=object)
        suggestion[only_month] = month_first[only_month].to_numpy(dtype=object)
    return suggestion


def _in_agreed_form(iso: pd.Series, date_format: str) -> pd.Series:
    """Rewrite ISO suggestions ("A" or "A or B") into a custom agreed strftime form."""
    readings = iso.str.split(" or ", expand=True)
    rewritten = [pd.to_datetime(readings[c], format="%Y-%m-%d").dt.strftime(date_format) for c in readings]
    joined = rewritten[0]
    for more in rewritten[1:]:
        joined = joined.where(more.isna(), joined + " or " + more)
    return joined


def convert_dates(
    text: pd.Series, present: pd.Series, date_format: str | None
) -> tuple[pd.Series, pd.Series, pd.Series]:
    """Typed dates, a Problem per failing cell, and the agreed-form rewrite where one is known."""
    reason = np.full(len(text), None, dtype=object)
    if date_format is None:
        agreed = present & text.str.match(ISO_DATE, na=False)
        values = _parse(text.where(agreed), "%Y-%m-%d")
        no_such_day = (agreed & values.isna()).to_numpy(dtype=bool)
        reason[no_such_day] = Problem.NO_SUCH_DATE
        extra: tuple[tuple[str, str], ...] = ()
    else:
        values = _parse(text.where(present), date_format)
        no_such_day = np.zeros(len(text), dtype=bool)
        extra = ((ISO_DATE, "%Y-%m-%d"),)
    todo = (present & values.isna()).to_numpy(dtype=bool) & ~no_such_day
    suggestion = _other_date(text, todo, extra)
    other = todo & suggestion.notna().to_numpy(dtype=bool)
    if date_format is not None and other.any():
        suggestion[other] = _in_agreed_form(suggestion[other], date_format)
    reason[other] = Problem.OTHER_DATE_FORMAT
    reason[todo & ~other & matches(text, r"^\d{4}-\d{2}$")] = Problem.MONTH_NOT_DAY
    reason[todo & pd.isna(reason)] = Problem.NOT_A_DATE
    return values, pd.Series(reason, index=text.index, dtype=object), suggestion.where(other)


def convert_datetimes(
    text: pd.Series, present: pd.Series, date_format: str | None
) -> tuple[pd.Series, pd.Series, pd.Series]:
    """Typed date-times (ISO 8601 unless a format is agreed), a Problem per failing cell, a rewrite."""
    reason = pd.Series(None, index=text.index, dtype=object)
    suggestion = pd.Series(None, index=text.index, dtype=object)
    candidates = text.where(present)
    if date_format is None:
        shaped = present & text.str.match(r"^\d{4}-\d{2}-\d{2}([T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?)?", na=False)
        try:
            values = pd.to_datetime(candidates.where(shaped), format="ISO8601", errors="coerce")
        except (ValueError, TypeError):  # offsets mixed with local times: compare them in UTC
            values = pd.to_datetime(candidates.where(shaped), format="ISO8601", errors="coerce", utc=True)
    else:
        values = _parse(candidates, date_format)
    if getattr(values.dt, "tz", None) is not None:  # written with offsets: compared as UTC times
        values = values.dt.tz_convert(None)
    todo = present & values.isna()
    for form in OTHER_DATETIME_FORMS:
        left = todo & suggestion.isna()
        if not left.any():
            break
        stamps = _parse(text.where(left), form)
        hit = left & stamps.notna()
        suggestion[hit] = stamps[hit].dt.strftime(date_format or "%Y-%m-%dT%H:%M:%S")
    reason[todo & suggestion.notna()] = Problem.OTHER_DATE_FORMAT
    reason[todo & suggestion.isna()] = Problem.NOT_A_DATETIME
    return values, reason, suggestion
