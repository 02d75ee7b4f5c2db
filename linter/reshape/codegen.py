"""The pandas code equivalent to a recipe: a runnable script a provider can read and rerun."""

from __future__ import annotations

import inspect
from pathlib import Path

from linter.reshape.recipe import Recipe
from linter.reshape.steps import STEPS
from linter.table import column_letter, unique_labels

_PREAMBLE = '''\
"""Reshape {input_name} into a tidy table with pandas (written by Weir from a recipe).

Row numbers are the file's line numbers, as Weir reports them; the raw grid's columns are
named by spreadsheet letter until the header is chosen.
"""

import re

import pandas as pd

INPUT = {input_name!r}
OUTPUT = {output_name!r}


def is_letter(label):
    return re.fullmatch(r"[A-Z]{{1,3}}", str(label)) is not None


{helpers}

{read}
df = df.astype(object).where(df != "", None)
df.index = range(1, len(df) + 1)
df.columns = [column_letter(i) for i in range(df.shape[1])]
'''

_FIRST_ROW_HEADER = [
    "names = [(df.iloc[0][c] or '') if is_letter(c) else c for c in df.columns]",
    "df = df.iloc[1:]",
    "df.columns = unique_labels(names)",
]

_EPILOGUE = """
df = df.reset_index(drop=True)

if __name__ == "__main__":
    df.to_csv(OUTPUT, index=False)
"""


def _read_line(input_name: str, sheet: str | None) -> str:
    """Every cell as text, blank as empty, no header: the raw grid as Weir reads it."""
    suffix = Path(input_name).suffix.lower()
    if suffix in (".xlsx", ".xlsm"):
        # Cells are read as pandas formats them; Weir's reader may write dates or
        # numbers differently, which the script then keeps as pandas wrote them.
        where = repr(sheet) if sheet is not None else "0"
        return (
            f"df = pd.read_excel(INPUT, sheet_name={where}, header=None, dtype=str, "
            'engine="openpyxl", keep_default_na=False)'
        )
    separator = ', sep="\\t"' if suffix == ".tsv" else ""
    return f"df = pd.read_csv(INPUT, header=None, dtype=str, keep_default_na=False{separator})"


def pandas_code(
    recipe: Recipe, input_name: str = "input.csv", output_name: str | None = None, sheet: str | None = None
) -> str:
    """A script that reads `input_name` (CSV, TSV or an Excel `sheet`) as a raw grid and applies
    `recipe` step by step."""
    stem = Path(input_name).stem or "table"
    helpers = "\n\n".join(inspect.getsource(f) for f in (column_letter, unique_labels))
    preamble = _PREAMBLE.format(
        input_name=input_name,
        output_name=output_name or f"{stem}_tidy.csv",
        helpers=helpers,
        read=_read_line(input_name, sheet),
    )
    lines = [preamble]
    grid = True
    for number, step in enumerate(recipe.steps, start=1):
        kind = STEPS[type(step).step]
        if grid and not kind.grid_level:
            lines += ["# the first row is the header", *_FIRST_ROW_HEADER]
            grid = False
        lines.append(f"\n# step {number}: {kind.name}")
        lines += kind.code(step)
        if kind.name == "header":
            grid = False
    if grid:
        lines += ["# the first row is the header", *_FIRST_ROW_HEADER]
    return "\n".join(lines) + "\n" + _EPILOGUE
