"""Read the files a draft is made from into Samples, reshaping untidy ones with the best recipe."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import replace

from linter.check import submitted_files
from linter.draft.infer import Sample
from linter.errors import WeirError
from linter.read import UnreadableFile, read_path
from linter.table import Table, first_row_header

SEARCH_ROWS = 5_000
"""Rows the layout search looks at: a table up to this long is searched whole; a longer one by its top
rows, where its shape shows (a header, titles, wide columns), so the cost stays flat however long."""


def read_samples(paths: Sequence[str], tidy: bool = True) -> list[Sample]:
    """One Sample per table of every file named (folders expanded); an unreadable file is a WeirError."""
    files = submitted_files(paths)
    if not files:
        raise WeirError("no CSV, Excel or Parquet file to draft from in " + ", ".join(paths))
    samples: list[Sample] = []
    for path in files:
        try:
            tables = read_path(path)
        except UnreadableFile as error:
            raise WeirError(f"{path}: {error.message}") from None
        samples.extend(sample_of_table(t, tidy) for t in tables if t.grid.shape[0] > 1)
    if not samples:
        raise WeirError("the files hold no rows below a header, so there is nothing to draft from")
    return samples


def sample_of_table(table: Table, tidy: bool) -> Sample:
    """The table's body as sent, or as the best lossless recipe reshapes it when it is untidy."""
    frame = first_row_header(table)
    label = table.source
    if not tidy:
        return Sample(frame.body, label)
    steps = best_steps(table)
    if not steps:
        return Sample(frame.body, label)
    from linter.reshape.apply import apply_recipe
    from linter.reshape.audit import audit
    from linter.reshape.recipe import Recipe
    from linter.reshape.steps import RecipeError, step_from_json

    try:
        recipe = Recipe.of(step_from_json(s, i) for i, s in enumerate(steps, start=1))
        reshaped = apply_recipe(table, recipe)
    except (RecipeError, ValueError, KeyError, IndexError, TypeError):
        return Sample(frame.body, label)  # the recipe fits the top rows only: draft the file as sent
    if len(reshaped.tables) != 1 or not audit(table, reshaped, recipe).lossless:
        return Sample(frame.body, label)
    output = next(iter(reshaped.tables.values()))
    return Sample(output, label, tuple(dict(s) for s in steps))


def best_steps(table: Table) -> tuple[dict[str, object], ...]:
    """The steps of the best recipe the layout search finds on the table's top rows."""
    from linter.reshape.search import search
    from linter.reshape.steps import RecipeError

    top = table
    if table.grid.shape[0] > SEARCH_ROWS:
        top = replace(
            table,
            grid=table.grid.iloc[:SEARCH_ROWS].reset_index(drop=True),
            row_numbers=table.row_numbers[:SEARCH_ROWS],
        )
    try:
        found = search(top)
    except RecipeError:
        return ()
    return tuple(dict(s) for s in found.best.steps)
