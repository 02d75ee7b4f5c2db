"""How a column's cells are quoted back: as written, per row and as distinct texts."""

from __future__ import annotations

import numpy as np
import pandas as pd

from linter.rules.cell_findings import written, written_distinct
from linter.rules.subject import Subject
from linter.table import Table, first_row_header


def subject_of(cells: list[str | None]) -> Subject:
    """One column, header on line 1 and the cells on the lines below."""
    grid = pd.DataFrame({0: ["analyte", *cells]}, dtype=object)
    table = Table("chemistry.csv", None, grid, tuple(range(1, len(cells) + 2)))
    return Subject(table, first_row_header(table), None, {})


def test_distinct_texts_rebuild_every_row_as_written():
    subject = subject_of(["Nitrate ", None, "SULPHATE", "Nitrate ", "", None, "SULPHATE"])
    rows = np.array([8, 2, 3, 4, 5, 6, 7])  # provider lines; the header is line 1
    which, texts = written_distinct(subject, "analyte", rows)
    # The per-row answer is the reference: every row rebuilt from its distinct text.
    assert [texts[i] for i in which] == written(subject, "analyte", rows.tolist())
    assert texts[:2] == ["SULPHATE", "Nitrate "]  # in order of first appearance among the rows
    assert "" in texts and len(which) == len(rows)


def test_no_rows_give_no_texts():
    which, texts = written_distinct(subject_of(["A"]), "analyte", np.array([], np.int64))
    assert len(which) == 0 and texts == []
