"""Cost of layout inference on a generated 1M-row file, against just reading it (ratio printed).

Baseline: Weir's reader alone (read_path) and, for scale, pandas.read_csv of the same file.
Measured: reading plus every layout detector (what `weir check` adds for layout), and the recipe
search on a wide messy file of the same number of cells (what `weir tidy` adds).

Run: python benchmarks/layout_cost.py [ROWS]   (default 1,000,000)
"""

from __future__ import annotations

import random
import sys
import tempfile
import time
from pathlib import Path

import pandas as pd


def write_tidy(path: Path, rows: int) -> None:
    rng = random.Random(7)
    with path.open("w", encoding="utf-8") as handle:
        handle.write("site_id,sampled_on,ph,nitrate_mg_l,temp_c\n")
        for i in range(rows):
            handle.write(
                f"VB-{i % 900:03d},2025-{1 + i % 12:02d}-{1 + i % 28:02d},"
                f"{rng.uniform(6, 8.5):.2f},{rng.uniform(0, 4):.2f},{rng.uniform(2, 18):.1f}\n"
            )


def write_wide(path: Path, rows: int) -> None:
    """A messy form of about the same number of cells: a title, one column per year, a note."""
    rng = random.Random(11)
    years = list(range(2016, 2026))
    with path.open("w", encoding="utf-8") as handle:
        handle.write("Vell Basin exceedances per year" + "," * len(years) + "\n")
        handle.write("site_id," + ",".join(map(str, years)) + "\n")
        for i in range(rows):
            handle.write(f"VB-{i:07d}," + ",".join(str(rng.randint(0, 9)) for _ in years) + "\n")
        handle.write("Note: provisional counts" + "," * len(years) + "\n")


def timed(label: str, action):
    start = time.perf_counter()
    result = action()
    seconds = time.perf_counter() - start
    print(f"{label:55} {seconds:8.2f} s")
    return seconds, result


def main() -> None:
    rows = int(sys.argv[1]) if len(sys.argv) > 1 else 1_000_000
    import linter.rules.catalogue  # noqa: F401
    from linter.read import read_path
    from linter.reshape.search import layout_detectors

    with tempfile.TemporaryDirectory() as folder:
        path = Path(folder) / "big.csv"
        write_tidy(path, rows)
        print(f"file: {rows:,} rows, {path.stat().st_size / 1e6:.1f} MB")
        pandas_s, _ = timed("baseline: pandas.read_csv (dtype=str)", lambda: pd.read_csv(path, dtype=str))
        read_s, tables = timed("baseline: Weir reader (read_path)", lambda: read_path(str(path)))
        table = tables[0]
        detect_s, found = timed(
            f"layout inference: all {len(layout_detectors())} detectors",
            lambda: [f for d in layout_detectors() for f in d(table, None)],
        )
        print(f"layout findings on the tidy file: {len(found)}")
        print(f"ratio (reading + inference) / reading: {(read_s + detect_s) / read_s:.2f}")
        print(f"inference adds {detect_s:.2f} s over reading ({detect_s / pandas_s:.2f} x pandas.read_csv)")

        from linter.reshape.search_sample import search_large

        wide = Path(folder) / "wide.csv"
        write_wide(wide, rows // 2)
        print(f"messy file: {rows // 2:,} rows x 11 columns, {wide.stat().st_size / 1e6:.1f} MB")
        wide_read_s, wide_tables = timed("baseline: Weir reader (read_path)", lambda: read_path(str(wide)))
        search_s, found = timed(
            "recipe search (apply + audit + re-detect)", lambda: search_large(wide_tables[0])
        )
        print(f"chosen: {[s['step'] for s in found.best.steps]}, {len(found.best.output):,} rows out")
        print(f"ratio (reading + search) / reading: {(wide_read_s + search_s) / wide_read_s:.2f}")


if __name__ == "__main__":
    main()
