"""Read the files a draft is made from into Samples, reshaping untidy ones with the best recipe."""

from __future__ import annotations

from collections.abc import Sequence

from linter.check import submitted_files
from linter.deadline import TimedOut, time_limit
from linter.draft.infer import Sample
from linter.errors import WeirError
from linter.limits import Limits
from linter.read import UnreadableFile, read_path
from linter.table import Table, first_row_header


def read_samples(paths: Sequence[str], tidy: bool = True, limits: Limits | None = None) -> list[Sample]:
    """One Sample per table of every file named (folders expanded); an unreadable file is a WeirError."""
    bounds = limits or Limits()
    files = submitted_files(paths, bounds.folder_depth)
    if not files:
        raise WeirError("no CSV, Excel or Parquet file to draft from in " + ", ".join(paths))
    samples: list[Sample] = []
    for path in files:
        try:
            with time_limit(bounds.seconds_per_file):
                tables = read_path(path, bounds.read)
        except UnreadableFile as error:
            raise WeirError(f"{path}: {error.message}") from None
        except TimedOut:
            raise WeirError(f"{path}: not read within {bounds.seconds_per_file:g} seconds") from None
        samples.extend(sample_of_table(t, tidy) for t in tables if t.grid.shape[0] > 1)
    if not samples:
        raise WeirError("the files hold no rows below a header, so there is nothing to draft from")
    return samples


def sample_of_table(table: Table, tidy: bool) -> Sample:
    """The table's body as sent, or as the best lossless recipe reshapes it when it is untidy.

    The layout search is the reshape package's own: a long table is searched on its head, its
    tail and the rows the margin detectors name, and the recipe is then applied and audited on
    every row (`reshape/search_sample.py`), so the cost stays near one pass over the table.
    """
    frame = first_row_header(table)
    if not tidy:
        return Sample(frame.body, table.source)
    from linter.reshape.search_sample import search_large
    from linter.reshape.steps import RecipeError

    try:
        best = search_large(table).best
    except RecipeError:
        return Sample(frame.body, table.source)  # no header to search from: draft the file as sent
    if not best.steps or not best.lossless:
        return Sample(frame.body, table.source)
    return Sample(best.output, table.source, tuple(dict(s) for s in best.steps))
