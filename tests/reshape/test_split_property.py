"""Property: a BCNF (or 3NF) split proposed from a table's own dependencies always joins back to it."""

from __future__ import annotations

import pandas as pd
from hypothesis import given, settings
from hypothesis import strategies as st

from linter.profile.dependencies import functional_dependencies
from linter.profile.normalise import propose_split
from linter.reshape.apply import apply_recipe
from linter.reshape.normalise import SplitByUnit, UnitTable, audit_split
from linter.reshape.recipe import Recipe
from linter.table import Table, first_row_header

cells = st.sampled_from(["a", "b", "c", None])


@settings(max_examples=40, deadline=None)
@given(
    st.integers(2, 4).flatmap(
        lambda w: st.lists(st.lists(cells, min_size=w, max_size=w), min_size=2, max_size=10)
    )
)
def test_proposed_split_is_lossless(body: list[list[str | None]]) -> None:
    # Source: the lossless-join property of BCNF decomposition (any textbook; from memory of
    # Silberschatz et al.): splitting on X -> Y with X+ as one table loses no row and invents none.
    names = ["row_id"] + [f"c{i}" for i in range(len(body[0]))]
    grid = [names] + [[f"r{i}", *row] for i, row in enumerate(body)]
    frame = pd.DataFrame(grid, dtype=object)
    table = Table("random.csv", None, frame.where(frame.notna(), None), tuple(range(1, len(grid) + 1)))
    data = first_row_header(table).body
    dependencies = [
        (frozenset(d.determinant), d.dependent) for d in functional_dependencies(data) if d.determinant
    ]
    split = propose_split(names, ["row_id"], dependencies, name="rows")
    if len(split.tables) < 2:
        return
    step = SplitByUnit(tuple(UnitTable(t.name, t.key, t.columns) for t in split.tables))
    reshaped = apply_recipe(table, Recipe.of([step]))
    assert audit_split(data, reshaped.tables, step).lossless
