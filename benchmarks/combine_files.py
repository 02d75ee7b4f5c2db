"""Time Weir's combining of a submission's files (join_files, stack_files, each with its audit)
against plain pandas merge / concat in one run, and print the ratios.

Invented Vell Basin data: a field file and a lab file about the same samples (every 50th sample
absent from the lab file), and the field file cut into four monthly files.
Usage: python benchmarks/combine_files.py [--rows 100000] [--repeat 3]
"""

from __future__ import annotations

import argparse
import random
import time
from collections.abc import Callable

import pandas as pd

from linter.reshape.join_files import JoinFiles
from linter.reshape.normalise import StackFiles
from linter.reshape.recipe import Recipe
from linter.reshape.tidy_files import combine
from linter.table import Table


def table_of(frame: pd.DataFrame, source: str) -> Table:
    grid = pd.DataFrame([list(frame.columns), *frame.values.tolist()], dtype=object)
    grid.columns = pd.RangeIndex(grid.shape[1])
    return Table(source, None, grid, tuple(range(1, len(grid) + 1)))


def best_of(repeat: int, run: Callable[[], object]) -> float:
    times = []
    for _ in range(repeat):
        start = time.perf_counter()
        run()
        times.append(time.perf_counter() - start)
    return min(times)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, default=100_000)
    parser.add_argument("--repeat", type=int, default=3)
    args = parser.parse_args()
    rng = random.Random(14)
    ids = [f"VB-S{i:07d}" for i in range(args.rows)]
    field = pd.DataFrame(
        {
            "sample_id": ids,
            "site_id": [f"VB-{rng.randrange(1, 60):03d}" for _ in ids],
            "water_temp_c": [f"{rng.uniform(2, 22):.1f}" for _ in ids],
        }
    )
    lab = pd.DataFrame({"sample_id": ids, "nitrate_mg_l": [f"{rng.uniform(0, 5):.2f}" for _ in ids]}).iloc[
        [i for i in range(args.rows) if i % 50]
    ]
    pair = [table_of(field, "field.csv"), table_of(lab, "lab.csv")]
    months = {f"readings_2026-0{m}.csv": f"2026-0{m}" for m in range(1, 5)}
    parts = [field.iloc[k::4] for k in range(4)]
    monthly = [table_of(p, name) for p, name in zip(parts, months, strict=True)]

    weir_join = best_of(args.repeat, lambda: combine(pair, Recipe.of([JoinFiles(("sample_id",))])))
    pandas_join = best_of(args.repeat, lambda: field.merge(lab, on="sample_id", how="outer"))
    weir_stack = best_of(args.repeat, lambda: combine(monthly, Recipe.of([StackFiles("month", months)])))
    pandas_stack = best_of(
        args.repeat,
        lambda: pd.concat([p.assign(month=v) for p, v in zip(parts, months.values(), strict=True)]),
    )
    print(f"rows per file: {args.rows}; best of {args.repeat}")
    print(f"join : weir {weir_join:.3f} s (with audit)  pandas merge {pandas_join:.3f} s  "
          f"ratio {weir_join / pandas_join:.1f}x")  # fmt: skip
    print(f"stack: weir {weir_stack:.3f} s (with audit)  pandas concat {pandas_stack:.3f} s  "
          f"ratio {weir_stack / pandas_stack:.1f}x")  # fmt: skip


if __name__ == "__main__":
    main()
