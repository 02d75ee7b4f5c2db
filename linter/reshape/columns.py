"""Checks and builders for named columns, shared by the table-level reshaping steps."""

from __future__ import annotations

import re

import numpy as np
import pandas as pd

from linter.reshape.sheet import Sheet
from linter.reshape.steps import RecipeError

EMPTY_HEADER = "header with no values"
"""Drop reason for the header of a gathered column that leaves no row: its cells were all
empty and empty values were dropped, or the table has no body rows at all."""


def need_columns(sheet: Sheet, columns: tuple[str, ...] | list[str]) -> None:
    """A step naming a column the table lacks is a recipe error that lists the columns there are."""
    missing = [c for c in columns if c not in sheet.cells.columns]
    if missing:
        known = ", ".join(map(str, sheet.cells.columns))
        raise RecipeError(
            f"column(s) {', '.join(map(repr, missing))} are not in the table (columns: {known})"
        )


def need_new(sheet: Sheet, names: list[str]) -> None:
    """New columns must not repeat an existing column or each other."""
    clash = [n for n in names if n in sheet.cells.columns]
    if clash or len(set(names)) != len(names):
        raise RecipeError(f"new column name(s) {', '.join(map(repr, clash or names))} would repeat a column")


def compile_pattern(pattern: str) -> re.Pattern[str]:
    try:
        return re.compile(pattern)
    except re.error as err:
        raise RecipeError(f"pattern {pattern!r} is not a valid regular expression: {err}") from None


def header_of(sheet: Sheet) -> dict[str, tuple[int, ...]]:
    return dict(sheet.header or {})


def text_column(values: np.ndarray) -> pd.Series:
    """A column of text/None kept as object dtype (pandas would infer its string dtype, slowly,
    and turn None into NaN)."""
    return pd.Series(values, dtype=object)


def is_empty(values: pd.Series) -> np.ndarray:
    return (values.isna() | (values == "")).to_numpy(dtype=bool)
