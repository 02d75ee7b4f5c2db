"""Turn a column of text cells into the typed values its variable declares, saying why cells fail."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, fields, replace
from functools import cached_property

import numpy as np
import pandas as pd

from linter.contract.dates import convert_dates, convert_datetimes, matches
from linter.contract.model import Variable, VarType
from linter.contract.problems import Problem
from linter.contract.repeats import repeats

PLAIN_NUMBER = r"^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$"
PLAIN_INTEGER = r"^[+-]?\d+$"
THOUSANDS = r"^[+-]?\d{1,3}(?:,\d{3})+(?:\.\d+)?$"
DECIMAL_COMMA = r"^[+-]?\d+,\d+$"
NUMBER_WITH_UNIT = r"^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([A-Za-zµμ%°‰][^\d]*)$"

# Source: W3C XML Schema 1.1 Part 2 §3.3.2 (boolean lexical space: true, false, 1, 0);
# the upper- and title-case forms are what spreadsheet programs write (common practice, no source).
TRUE_WORDS = frozenset({"true", "1"})
FALSE_WORDS = frozenset({"false", "0"})


RULE_OF_PROBLEM = {str(problem): problem.rule for problem in Problem}
"""Looked up once per distinct problem of a column: a Python call per failing cell was most of
the cost on large files."""


@dataclass(frozen=True)
class Converted:
    """One column read as its variable's type; all series share the body's index."""

    values: pd.Series
    """Typed values; null where the cell is missing or failed conversion."""
    missing: pd.Series
    """True where the cell is empty or holds a missing-value code."""
    censored: pd.Series
    """True where the value was reported below a detection limit (e.g. `<0.05`)."""
    reason: pd.Series
    """A `Problem` where the cell is present but could not be converted, else None."""
    suggestion: pd.Series
    """What to write instead, where Weir can tell (e.g. `1234`, `2026-03-02`), else None."""

    @property
    def failed(self) -> pd.Series:
        return self.reason.notna()

    def spread(self, positions: np.ndarray, index: pd.Index) -> Converted:
        """Each field taken at `positions` (one per cell of a column of `index`): the cells of a
        column read once per distinct text, then laid out again cell by cell."""
        return replace(
            self, **{f.name: getattr(self, f.name).take(positions).set_axis(index) for f in fields(self)}
        )

    @cached_property
    def failing_by_rule(self) -> Mapping[str, pd.Series]:
        """The reason of each failing cell, by the conversion rule it breaks (failing cells only:
        most cells are fine). Every conversion rule asks, so it is worked out once."""
        failed = np.flatnonzero(self.reason.notna().to_numpy(dtype=bool))
        which, problems = pd.factorize(self.reason.to_numpy(dtype=object)[failed])  # a handful
        rule_of = np.array([RULE_OF_PROBLEM[str(p)] for p in problems], dtype=object)
        return {
            rule: self.reason.iloc[failed[np.isin(which, np.flatnonzero(rule_of == rule))]]
            for rule in dict.fromkeys(rule_of.tolist())
        }


def _or_none(series: pd.Series) -> pd.Series:
    """Object series with None (not NaN) where there is nothing, as the Converted fields promise."""
    return series.astype(object).where(series.notna(), None)


def unit_key(unit: str) -> str:
    """Units compared without case, spaces or the micro-sign spelling: `mg/l` is `mg/L`, `µg/L` is `ug/L`."""
    return unit.replace(" ", "").replace("µ", "u").replace("μ", "u").casefold()


def missing_mask(text: pd.Series, codes: tuple[str, ...]) -> pd.Series:
    """Empty cells and cells whose trimmed text is a missing-value code."""
    trimmed = {c.strip() for c in codes}
    return text.isna() | text.str.strip().isin(trimmed)


def _number_problems(trimmed: pd.Series, unit: str | None, integer: bool) -> tuple[np.ndarray, np.ndarray]:
    """Why each of these (failing, trimmed) cells is not a plain number, and what to write instead.

    Filled in as numpy arrays: a pandas assignment through a mask costs a copy of the column."""
    reason = np.full(len(trimmed), None, dtype=object)
    suggestion = np.full(len(trimmed), None, dtype=object)
    if integer:
        reason[matches(trimmed, PLAIN_NUMBER)] = Problem.NOT_AN_INTEGER
    thousands = pd.isna(reason) & matches(trimmed, THOUSANDS)
    reason[thousands] = Problem.THOUSANDS_SEPARATOR
    suggestion[thousands] = trimmed[thousands].str.replace(",", "", regex=False).to_numpy(dtype=object)
    comma = pd.isna(reason) & matches(trimmed, DECIMAL_COMMA)
    reason[comma] = Problem.DECIMAL_COMMA
    suggestion[comma] = trimmed[comma].str.replace(",", ".", regex=False).to_numpy(dtype=object)
    parts = trimmed.where(pd.isna(reason)).str.extract(NUMBER_WITH_UNIT)
    with_unit = pd.isna(reason) & parts[0].notna().to_numpy(dtype=bool)
    written_unit = parts[1].str.strip()
    if unit is None:
        same_unit = with_unit
    else:
        keyed = written_unit.map(unit_key, na_action="ignore")
        same_unit = with_unit & (keyed == unit_key(unit)).to_numpy(dtype=bool)
    reason[same_unit] = Problem.UNIT_IN_CELL
    suggestion[same_unit] = parts[0][same_unit].to_numpy(dtype=object)
    other_unit = with_unit & ~same_unit
    reason[other_unit] = Problem.WRONG_UNIT
    suggestion[other_unit] = written_unit[other_unit].to_numpy(dtype=object)
    reason[pd.isna(reason)] = Problem.NOT_A_NUMBER
    return reason, suggestion


INT64_DIGITS = 18
"""Every integer of at most this many digits fits in 64 bits; longer ones are checked exactly."""


def _fits_int64(cell: str) -> bool:
    digits = cell.lstrip("+-").lstrip("0")
    if len(digits) <= INT64_DIGITS:
        return True
    return len(digits) == INT64_DIGITS + 1 and -(2**63) <= int(cell) <= 2**63 - 1


def _numbers(
    text: pd.Series, present: pd.Series, unit: str | None, integer: bool
) -> tuple[pd.Series, pd.Series, pd.Series]:
    trimmed = text.str.strip()
    good = present.to_numpy(dtype=bool) & matches(trimmed, PLAIN_INTEGER if integer else PLAIN_NUMBER)
    reason = np.full(len(text), None, dtype=object)
    if integer:
        # A 64-bit integer column holds whole numbers up to 2**63 - 1; longer ones are named, not cast.
        fits = trimmed.where(good, "0").map(_fits_int64, na_action="ignore").to_numpy(dtype=bool)
        huge = good & ~fits
        reason[huge] = Problem.INTEGER_TOO_LARGE
        good &= ~huge
    values = pd.to_numeric(trimmed.where(good), errors="coerce")
    suggestion = np.full(len(text), None, dtype=object)
    bad = present.to_numpy(dtype=bool) & ~good & pd.isna(reason)
    if bad.any():  # the usual file is mostly clean: explain only the cells that failed
        reason[bad], suggestion[bad] = _number_problems(trimmed[bad], unit, integer)
    typed = values.astype("Int64") if integer else values.astype("float64")
    index = text.index
    return (
        typed,
        pd.Series(reason, index=index, dtype=object),
        pd.Series(suggestion, index=index, dtype=object),
    )


def _booleans(text: pd.Series, present: pd.Series) -> tuple[pd.Series, pd.Series, pd.Series]:
    words = text.str.strip().str.casefold()
    truthy = present & words.isin(TRUE_WORDS)
    falsy = present & words.isin(FALSE_WORDS)
    values = pd.Series(pd.NA, index=text.index, dtype="boolean")
    values[truthy] = True
    values[falsy] = False
    reason = pd.Series(None, index=text.index, dtype=object)
    reason[present & ~truthy & ~falsy] = Problem.NOT_A_BOOLEAN
    suggestion = pd.Series(None, index=text.index, dtype=object)
    suggestion[present & words.isin({"yes", "y", "oui", "ja", "t"})] = "true"
    suggestion[present & words.isin({"no", "n", "non", "nein", "f"})] = "false"
    return values, reason, suggestion.where(reason.notna())


READ_PER_DISTINCT_TYPES = frozenset(
    {VarType.NUMBER, VarType.INTEGER, VarType.BOOLEAN, VarType.DATE, VarType.DATETIME}
)
"""Types whose reading explains a failing cell by trying forms one after another: worth reading
each distinct text once (a column repeats its values, its mistakes most of all)."""
FEWEST_CELLS_PER_DISTINCT = 64
"""Shorter columns are read as they are: counting their distinct texts would cost more than it saves."""


def convert_column(text: pd.Series, variable: Variable, file_missing: tuple[str, ...]) -> Converted:
    """Read `text` (cells as written, None when empty) as `variable` declares; never raises on a cell.

    Reading a cell depends on its text alone, and every decision taken for a column as a whole
    (e.g. date-times with UTC offsets compared in UTC) on the set of its texts, so a column with
    few distinct texts is read once per text and spread back: the result is the same."""
    raw = text.astype(object).where(text.notna(), None)
    same = repeats(raw, FEWEST_CELLS_PER_DISTINCT) if variable.type in READ_PER_DISTINCT_TYPES else None
    if same is None:
        return read_cells(raw, variable, file_missing)
    once = read_cells(pd.Series(same.values, dtype=object), variable, file_missing)
    return once.spread(same.codes, text.index)


def read_cells(raw: pd.Series, variable: Variable, file_missing: tuple[str, ...]) -> Converted:
    """`convert_column` on cells already as object texts or None."""
    # pandas' pyarrow-backed "str" dtype runs the regular expressions below in C, not per cell in Python.
    text = raw.astype("str")
    missing = missing_mask(text, tuple(file_missing) + tuple(variable.missing))
    present = ~missing
    censored = pd.Series(False, index=text.index)
    kind = variable.type
    if kind in (VarType.NUMBER, VarType.INTEGER):
        body = text
        if variable.censored_prefix:
            trimmed = text.str.strip()
            censored = present & trimmed.str.startswith(variable.censored_prefix, na=False)
            stripped = trimmed.str.slice(len(variable.censored_prefix)).str.strip()
            body = text.where(~censored, stripped)
        values, reason, suggestion = _numbers(body, present, variable.unit, kind is VarType.INTEGER)
        # A bare "<" (or "< mg/L") names no detection limit: it is not a number at all.
        censored_bad = censored & reason.notna() & (reason != Problem.WRONG_UNIT)
        reason[censored_bad & (body.str.strip() == "")] = Problem.CENSORED_NOT_A_NUMBER
        censored &= reason.isna()
        return Converted(values, missing, censored, _or_none(reason), _or_none(suggestion))
    if kind is VarType.BOOLEAN:
        values, reason, suggestion = _booleans(text, present)
    elif kind is VarType.DATE:
        values, reason, suggestion = convert_dates(text, present, variable.date_format)
    elif kind is VarType.DATETIME:
        values, reason, suggestion = convert_datetimes(text, present, variable.date_format)
    else:
        values = text.where(present)  # pandas' Arrow-backed str: pandera's pattern and code checks run in C
        reason = pd.Series(None, index=text.index, dtype=object)
        suggestion = reason.copy()
    return Converted(values, missing, censored, _or_none(reason), _or_none(suggestion))
