"""Time Weir's recipe engine (apply + audit) against plain pandas melt/pivot on the same invented table.

Run: python benchmarks/reshape_engine.py [ROWS]   (default 100000; prints seconds and ratios)
"""

from __future__ import annotations

import sys
import time
from collections.abc import Callable

import numpy as np
import pandas as pd

from linter.reshape.apply import apply_recipe
from linter.reshape.audit import audit
from linter.reshape.recipe import Recipe
from linter.table import Table

MONTHS = [f"2026-{m:02d}" for m in range(1, 13)]


def wide_table(rows: int) -> Table:
    """Invented Vell Basin monthly turbidity readings, one column per month, some cells empty."""
    rng = np.random.default_rng(7)
    values = rng.integers(0, 500, size=(rows, len(MONTHS))).astype(str).astype(object)
    values[rng.random(values.shape) < 0.1] = None
    sites = np.asarray([f"VB-{i:06d}" for i in range(rows)], dtype=object)
    body = np.column_stack([sites, values])
    grid = pd.DataFrame(np.vstack([np.asarray(["site", *MONTHS], dtype=object), body]), dtype=object)
    return Table("turbidity_wide.csv", None, grid, tuple(range(1, rows + 2)))


def timed(work: Callable[[], object], repeat: int = 3) -> float:
    """Best of `repeat` runs: the machine is shared, the minimum is the least disturbed."""
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        work()
        best = min(best, time.perf_counter() - start)
    return best


def main(rows: int) -> None:
    table = wide_table(rows)
    frame = table.grid.iloc[1:].set_axis(["site", *MONTHS], axis=1)
    gather = Recipe.from_json(
        {
            "weir_recipe": 1,
            "steps": [{"step": "gather", "columns": MONTHS, "names_to": "month", "values_to": "ntu"}],
        }
    )
    spread = Recipe.from_json(
        {
            "weir_recipe": 1,
            "steps": [
                {"step": "gather", "columns": MONTHS, "names_to": "month", "values_to": "ntu"},
                {"step": "spread", "names_from": "month", "values_from": "ntu"},
            ],
        }
    )

    base_melt = timed(lambda: frame.melt(id_vars=["site"], var_name="month", value_name="ntu"))
    weir_gather = timed(lambda: apply_recipe(table, gather))
    reshaped = apply_recipe(table, gather)
    weir_audit = timed(lambda: audit(table, reshaped, gather))
    long = frame.melt(id_vars=["site"], var_name="month", value_name="ntu")
    base_round = base_melt + timed(lambda: long.pivot(index="site", columns="month", values="ntu"))
    weir_round = timed(lambda: apply_recipe(table, spread))

    cells = rows * (len(MONTHS) + 1)
    print(f"input: {rows} rows x {len(MONTHS) + 1} columns = {cells} cells")
    ratio = weir_gather / base_melt
    print(f"gather        weir {weir_gather:7.3f}s  pandas melt {base_melt:7.3f}s  ratio {ratio:6.1f}")
    print(
        f"audit         weir {weir_audit:7.3f}s  (no pandas counterpart; {cells / weir_audit:,.0f} cells/s)"
    )
    ratio = weir_round / base_round
    print(f"gather+spread weir {weir_round:7.3f}s  melt+pivot  {base_round:7.3f}s  ratio {ratio:6.1f}")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 100_000)
