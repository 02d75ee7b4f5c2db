"""Propose one variable from one column of text cells: type, nullability, codes, range, pattern, unit."""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np
import pandas as pd

from linter.contract.convert import PLAIN_INTEGER, PLAIN_NUMBER
from linter.contract.dates import ISO_DATE
from linter.contract.model import VarType
from linter.draft.ranges import margin_range, physical_range, shown
from linter.draft.shapes import id_pattern
from linter.draft.units import header_unit

MISSING_CODES = ("NA", "N/A", "n/a", "na", "-999", "-9999", ".", "NULL", "null", "NaN", "nan", "-")
"""Missing-value codes Weir recognises when it drafts. Common practice (no source): these are the
placeholders statistical packages and spreadsheets write for "no value"."""
MAX_CODES = 50
"""A text column with more distinct values than this is never proposed as a category."""
LONG_CODE_LIST = 12
"""A code list longer than this is written to its own code-list file."""
SAMPLE = 5_000
"""Values looked at by the heuristics that cost more than one vectorised pass (shapes, date forms)."""
ISO_DATETIME = r"^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?$"
DATE_FORMS: tuple[tuple[str, str], ...] = (
    (r"^\d{4}/\d{2}/\d{2}$", "%Y/%m/%d"),
    (r"^\d{2}/\d{2}/\d{4}$", "%d/%m/%Y"),
    (r"^\d{2}/\d{2}/\d{4}$", "%m/%d/%Y"),
    (r"^\d{2}\.\d{2}\.\d{4}$", "%d.%m.%Y"),
    (r"^\d{2}-\d{2}-\d{4}$", "%d-%m-%Y"),
)
"""Other date forms a draft recognises (with zero-padded fields, so the strftime form writes them back)."""
SHORT_CODE = r"[A-Za-z]{1,3}"
"""One to three letters (a laboratory qualifier such as J): a code even when it occurs only once."""
TRUE_FALSE = frozenset({"true", "false"})
CENSORED = "<"


@dataclass(frozen=True)
class VariableDraft:
    """What the draft proposes for one column, and the evidence for each choice."""

    name: str
    type: VarType
    nullable: bool
    required: bool = True
    values: tuple[str, ...] = ()
    """Proposed codes of a category, sorted."""
    minimum: float | str | None = None
    """A number, or for a date the ISO 8601 first day of the earliest year seen."""
    maximum: float | None = None
    pattern: str | None = None
    unit: str | None = None
    date_format: str | None = None
    censored_prefix: str | None = None
    seen_min: float | None = None
    """Smallest value seen (numbers only), before the margin."""
    seen_max: float | None = None
    seen_values: tuple[str, ...] = ()
    """The distinct text values, sorted, when there are at most MAX_CODES of them (else empty)."""
    missing_seen: tuple[str, ...] = ()
    """Missing-value codes found in this column (other than empty cells)."""
    padded: int = 0
    """Cells with spaces before or after the value (the draft proposes the trimmed value)."""
    evidence: dict[str, str] = field(default_factory=dict)
    """Property name (or "" for the variable itself) -> the comment that justifies it."""

    @property
    def is_measurement(self) -> bool:
        """Decimal measurements never identify a row, so they are kept out of the key search."""
        return self.type is VarType.NUMBER


def plural(count: int, word: str) -> str:
    return f"{count:,} {word}" if count == 1 else f"{count:,} {word}s"


def sample_of(values: pd.Series, size: int = SAMPLE) -> pd.Series:
    """An evenly spread, reproducible sample: cost stays flat however long the column."""
    if len(values) <= size:
        return values
    positions = np.linspace(0, len(values) - 1, size).astype(np.int64)
    return values.iloc[positions]


def draft_variable(name: str, cells: pd.Series) -> VariableDraft:
    """Everything the draft proposes for one column (cells as text, None where empty)."""
    # Every heuristic runs on the distinct values (with their counts), not on every cell: a
    # column of a million cells with a thousand distinct values costs one hashing pass.
    codes, uniques = pd.factorize(cells.to_numpy(dtype=object), use_na_sentinel=True)
    counts = np.bincount(codes[codes >= 0], minlength=len(uniques))
    stripped = pd.Series(uniques, dtype=object).str.strip().to_numpy(dtype=object)
    tally = pd.Series(counts, index=pd.Index(stripped, dtype=object), dtype=np.int64)
    if not tally.index.is_unique:  # " A" and "A" are one value once trimmed
        tally = tally.groupby(level=0).sum()
    labels = tally.index.astype(str)
    is_coded = labels.isin(MISSING_CODES)
    is_empty = labels == ""
    seen = tuple(sorted(str(v) for v in tally.index[is_coded]))
    kept = tally[~is_coded & ~is_empty]
    present = pd.Series(kept.index.astype(str), dtype=object)
    weights = pd.Series(kept.to_numpy(), index=present.index)
    rows = len(cells)
    absent = rows - int(weights.sum())
    evidence: dict[str, str] = {}
    nullable = absent > 0
    if nullable:
        evidence["nullable"] = f"{plural(absent, 'empty cell')} in {rows:,} rows"
    else:
        evidence["nullable"] = f"no empty cell in {rows:,} rows"
    raw = pd.Series(uniques, dtype=object).astype(str).to_numpy(dtype=object)
    padded_cells = int(counts[(raw != stripped) & (stripped != "")].sum())
    base = VariableDraft(
        name, VarType.STRING, nullable, missing_seen=seen, padded=padded_cells, evidence=evidence
    )
    if present.empty:
        evidence[""] = f"every one of {rows:,} cells is empty"
        return base
    return (
        _numeric(base, present, weights)
        or _boolean(base, present, weights)
        or _temporal(base, present)
        or _textual(base, present, weights, rows)
    )


def _numeric(base: VariableDraft, present: pd.Series, weights: pd.Series) -> VariableDraft | None:
    if not _could_be_numbers(sample_of(present)):
        return None  # refuted on the sample: no need to look at every value
    censored = present.str.startswith(CENSORED)
    body = present.where(~censored, present.str.slice(len(CENSORED)).str.strip())
    if not body.str.match(PLAIN_NUMBER).all():
        return None
    integer = bool(body.str.match(PLAIN_INTEGER).all()) and not censored.any()
    if integer and bool(body.str.match(r"^[+-]?0\d").any()):
        return None  # leading zeros are part of a code (07 is not 7): keep the text
    numbers = pd.to_numeric(body)
    low, high = float(numbers.min()), float(numbers.max())
    minimum, maximum = physical_range(base.name, *margin_range(low, high, integer))
    evidence = dict(base.evidence)
    kind = "whole numbers" if integer else "numbers"
    evidence[""] = f"{plural(int(weights.sum()), 'value')}, all {kind}"
    evidence["min"] = f"smallest seen {shown(low)}" + ("; no negative value" if minimum == 0 else "")
    evidence["max"] = f"largest seen {shown(high)}, with a margin"
    prefix = None
    if censored.any():
        prefix = CENSORED
        evidence["censored_prefix"] = (
            f"{plural(int(weights[censored].sum()), 'value')} below a limit, e.g. "
            + str(present[censored].iloc[0])
        )
    unit = header_unit(base.name)
    if unit is not None:
        evidence["unit"] = f"from the column name {base.name!r}"
    return VariableDraft(
        base.name,
        VarType.INTEGER if integer else VarType.NUMBER,
        base.nullable,
        minimum=minimum,
        maximum=maximum,
        seen_min=low,
        seen_max=high,
        unit=unit,
        censored_prefix=prefix,
        missing_seen=base.missing_seen,
        padded=base.padded,
        evidence=evidence,
    )


def _could_be_numbers(values: pd.Series) -> bool:
    body = values.str.removeprefix(CENSORED).str.strip()
    return bool(body.str.match(PLAIN_NUMBER).all())


def _boolean(base: VariableDraft, present: pd.Series, weights: pd.Series) -> VariableDraft | None:
    if not present.str.casefold().isin(TRUE_FALSE).all():
        return None
    evidence = {**base.evidence, "": f"{plural(int(weights.sum()), 'value')}, all true or false"}
    return VariableDraft(
        base.name,
        VarType.BOOLEAN,
        base.nullable,
        missing_seen=base.missing_seen,
        padded=base.padded,
        evidence=evidence,
    )


def _temporal(base: VariableDraft, present: pd.Series) -> VariableDraft | None:
    if not sample_of(present).str.match(r"^\d").all():
        return None  # every date form Weir drafts starts with a digit
    evidence = dict(base.evidence)
    if present.str.match(ISO_DATE).all() and _parses(present, "%Y-%m-%d"):
        kind, form = VarType.DATE, None
        evidence[""] = "every value an ISO 8601 date (YYYY-MM-DD)"
    elif present.str.match(ISO_DATETIME).all() and _parses(present, "ISO8601"):
        kind, form = VarType.DATETIME, None
        evidence[""] = "every value an ISO 8601 date and time"
    else:
        form = date_form(present)
        if form is None:
            return None
        kind = VarType.DATE
        evidence["date_format"] = f"every value reads as {form}"
        if form in ("%d/%m/%Y", "%m/%d/%Y") and _parses(present, _swapped(form)):
            evidence["date_format"] += f" (but also as {_swapped(form)}: check which one partners use)"
    dates = pd.to_datetime(present, format=form or "ISO8601", utc=kind is VarType.DATETIME)
    evidence[""] = evidence.get("", "dates") + f"; seen {dates.min():%Y-%m-%d} to {dates.max():%Y-%m-%d}"
    # A floor at the start of the earliest year catches a mistyped year (1926 for 2026); no
    # ceiling, so next month's files pass. Common practice (no source).
    earliest = f"{dates.min().year:04d}-01-01" if kind is VarType.DATE else None
    if earliest is not None:
        evidence["min"] = f"earliest seen {dates.min():%Y-%m-%d}"
    return VariableDraft(
        base.name,
        kind,
        base.nullable,
        minimum=earliest,
        date_format=form,
        missing_seen=base.missing_seen,
        padded=base.padded,
        evidence=evidence,
    )


def _swapped(form: str) -> str:
    return "%m/%d/%Y" if form == "%d/%m/%Y" else "%d/%m/%Y"


def _parses(values: pd.Series, form: str) -> bool:
    return bool(pd.to_datetime(values, format=form, errors="coerce").notna().all())


def date_form(present: pd.Series) -> str | None:
    """The first recognised date form that shapes the sample and then reads every value."""
    sample = sample_of(present)
    for shape, form in DATE_FORMS:
        shaped = sample.str.match(shape).all() and present.str.match(shape).all()
        if shaped and _parses(sample, form) and _parses(present, form):
            return form
    return None


def _textual(base: VariableDraft, present: pd.Series, weights: pd.Series, rows: int) -> VariableDraft:
    evidence = dict(base.evidence)
    distinct = present.to_numpy()  # already distinct
    count = len(distinct)
    cells = int(weights.sum())
    pattern = id_pattern(sample_of(present))
    if pattern is not None and not present.str.fullmatch(pattern).all():
        pattern = None  # the sample's shape does not hold on every row
    short_codes = count <= LONG_CODE_LIST and bool(present.str.fullmatch(SHORT_CODE).all())
    if pattern is None and count <= MAX_CODES and (cells >= 2 * count or short_codes):
        values = tuple(sorted(str(v) for v in distinct))
        evidence["values"] = f"{plural(count, 'distinct value')} in {rows:,} rows"
        return VariableDraft(
            base.name,
            VarType.CATEGORY,
            base.nullable,
            values=values,
            seen_values=values,
            missing_seen=base.missing_seen,
            padded=base.padded,
            evidence=evidence,
        )
    evidence[""] = f"{plural(count, 'distinct value')} in {rows:,} rows"
    seen_values = tuple(sorted(str(v) for v in distinct)) if count <= MAX_CODES else ()
    if pattern is not None:
        evidence["pattern"] = f"every one of {plural(cells, 'value')} matches"
    return VariableDraft(
        base.name,
        VarType.STRING,
        base.nullable,
        pattern=pattern,
        seen_values=seen_values,
        missing_seen=base.missing_seen,
        padded=base.padded,
        evidence=evidence,
    )
