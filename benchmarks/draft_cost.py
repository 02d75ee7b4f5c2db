"""Time `weir draft` on 10k, 100k and 1M rows against pandas (read + describe) in the same run.

Usage: python benchmarks/draft_cost.py [--sizes 10000 100000 1000000] [--repeat 1]

The files are invented Vell Basin chemistry results (site, date, analyte, result with censored
values, a sparse qualifier, a unique laboratory id), written to a temporary folder. For each size
it prints the seconds Weir spends reading (the reader), finding the layout (the reshape package's
search_large) and drafting (inference and YAML), the pandas baseline, the ratio of Weir's total to
it, and the drafting time per row; growth of the drafting time near the row factor (10x) between
sizes shows that drafting cost is linear in rows.
"""

from __future__ import annotations

import argparse
import tempfile
import time
from pathlib import Path

import numpy as np
import pandas as pd

from linter.draft.infer import draft_table
from linter.draft.samples import sample_of_table
from linter.draft.write import render_draft
from linter.read import read_path

ANALYTES = np.array(["NITRATE", "NITRITE", "AMMONIUM", "PHOSPHATE", "CHLORIDE", "SULFATE"])


def invented_chemistry(rows: int, seed: int = 7) -> pd.DataFrame:
    """Rows of invented results: one analyte in one sample, keyed by site, day and analyte."""
    rng = np.random.default_rng(seed)
    position = np.arange(rows)
    analyte = ANALYTES[position % len(ANALYTES)]
    sample = position // len(ANALYTES)
    site = np.char.add("VB-", np.char.zfill((sample % 900 + 1).astype(str), 3))
    day = pd.Timestamp("2020-01-01") + pd.to_timedelta(sample // 900, unit="D")
    result = np.round(rng.gamma(2.0, 1.5, rows), 3).astype(str)
    censored = rng.random(rows) < 0.05
    result = np.where(censored, "<0.05", result)
    qualifier = np.where(rng.random(rows) < 0.03, "J", "")
    lab = np.char.add("AU", np.char.zfill(position.astype(str), 7))
    return pd.DataFrame(
        {
            "site_id": site,
            "sampled_on": pd.Series(day).dt.strftime("%Y-%m-%d"),
            "analyte": analyte,
            "result": result,
            "qualifier": qualifier,
            "lab_sample_id": lab,
        }
    )


def timed(task):
    started = time.perf_counter()
    value = task()
    return time.perf_counter() - started, value


def weir(path: Path) -> tuple[float, float, float, str]:
    """Seconds to read, to find the layout (search_large), to draft and render; and the drafted key."""
    read_seconds, tables = timed(lambda: read_path(str(path)))
    layout_seconds, samples = timed(lambda: [sample_of_table(t, tidy=True) for t in tables])
    draft_seconds, files = timed(lambda: render_draft(draft_table(samples)))
    keys = next((line for line in files.contract.splitlines() if line.startswith("keys:")), "keys: none")
    return read_seconds, layout_seconds, draft_seconds, keys.split("#")[0].strip()


def baseline(path: Path) -> float:
    def task() -> None:
        frame = pd.read_csv(path, dtype=str, keep_default_na=False)
        frame.describe(include="all")

    return timed(task)[0]


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", type=int, nargs="+", default=[10_000, 100_000, 1_000_000])
    parser.add_argument("--repeat", type=int, default=1, help="Best of N runs per size.")
    args = parser.parse_args()
    print(
        f"{'rows':>9} {'read':>7} {'layout':>7} {'draft':>7} {'total':>7} {'pandas':>7} "
        f"{'ratio':>6} {'draft us/row':>12}  drafted key"
    )
    previous: tuple[int, float] | None = None
    with tempfile.TemporaryDirectory() as folder:
        for rows in args.sizes:
            path = Path(folder) / f"chemistry-{rows}.csv"
            invented_chemistry(rows).to_csv(path, index=False)
            best = min((weir(path) for _ in range(args.repeat)), key=lambda r: r[0] + r[1] + r[2])
            pandas_seconds = min(baseline(path) for _ in range(args.repeat))
            total = best[0] + best[1] + best[2]
            print(
                f"{rows:>9,} {best[0]:>6.2f}s {best[1]:>6.2f}s {best[2]:>6.2f}s {total:>6.2f}s "
                f"{pandas_seconds:>6.2f}s {total / pandas_seconds:>6.1f} "
                f"{best[2] / rows * 1e6:>12.2f}  {best[3]}"
            )
            if previous is not None:
                factor = rows / previous[0]
                print(f"{'':>9} {factor:.0f}x rows -> {best[2] / previous[1]:.1f}x drafting time")
            previous = (rows, best[2])


if __name__ == "__main__":
    main()
