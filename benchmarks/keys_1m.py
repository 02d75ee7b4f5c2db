"""Time key and dependency discovery on 1M rows x 30 columns against pandas baselines, in one run.

Run: python benchmarks/keys_1m.py [ROWS]. The table is invented (Vell Basin scenario): 500 sites x
200 dates x 10 analytes, site, date and analyte attributes repeated on every row, a laboratory per
row and twelve measurement columns. Cells are text, as Weir reads them.

Baselines, timed in the same run:
- key: `DataFrame.duplicated(key).any()` on the key found (pandas checks one given key);
- dependencies: for each dependency found, `groupby(determinant)[dependent].nunique().max() == 1`
  (pandas verifies given dependencies; it cannot discover them).
"""

from __future__ import annotations

import sys
import time

import numpy as np
import pandas as pd

from linter.profile.dependencies import functional_dependencies
from linter.profile.keys import unique_combinations


def pool(prefix: str, size: int) -> np.ndarray:
    return np.array([f"{prefix}{i}" for i in range(size)], dtype=object)


def decimals(size: int) -> np.ndarray:
    """Measurement-like text: 0.001 ... with three decimals."""
    return np.array([f"{i / 1000:.3f}" for i in range(size)], dtype=object)


def invented_table(rows: int, seed: int = 1) -> pd.DataFrame:
    rng = np.random.default_rng(seed)
    sites, dates, analytes = 500, 200, 10
    index = np.arange(rows)
    site = index // (dates * analytes) % sites
    date = index // analytes % dates
    analyte = index % analytes
    lab = rng.integers(0, 5, rows)
    columns: dict[str, np.ndarray] = {
        "site_id": np.array([f"VB-{i:03d}" for i in range(sites)], dtype=object)[site],
        "site_name": pool("Station ", sites)[site],
        "river": pool("River ", 40)[site % 40],
        "latitude": np.array([f"{52 + i / 1000:.4f}" for i in range(sites)], dtype=object)[site],
        "longitude": np.array([f"{-1.5 - i / 997:.4f}" for i in range(sites)], dtype=object)[site],
        "county": pool("County ", 7)[site % 7],
        "sampled_on": np.array([str(np.datetime64("2025-01-01") + i) for i in range(dates)], dtype=object)[
            date
        ],
        "month": np.array([str(np.datetime64("2025-01-01") + i)[:7] for i in range(dates)], dtype=object)[
            date
        ],
        "season": np.array(["winter", "spring", "summer", "autumn"], dtype=object)[date // 60 % 4],
        "analyte": pool("A", analytes)[analyte],
        "analyte_name": pool("Analyte ", analytes)[analyte],
        "unit": np.array(["mg/L", "ug/L"], dtype=object)[analyte % 2],
        "method": pool("M-", 4)[analyte % 4],
        "lab": pool("L", 5)[lab],
        "lab_city": pool("Town ", 5)[lab],
        "result": decimals(20_000)[rng.integers(0, 20_000, rows)],
        "qualifier": np.array([None, "J", "U"], dtype=object)[rng.choice(3, rows, p=[0.9, 0.07, 0.03])],
        "detection_limit": pool("0.0", 8)[(analyte + index // (rows // 2 + 1)) % 8],
    }
    for i in range(12):
        columns[f"reading_{i + 1:02d}"] = decimals(50_000)[rng.integers(0, 50_000, rows)]
    return pd.DataFrame(columns)


def timed(label: str, work):
    start = time.perf_counter()
    result = work()
    seconds = time.perf_counter() - start
    print(f"{label:<58} {seconds:8.2f} s")
    return result, seconds


def main() -> None:
    rows = int(sys.argv[1]) if len(sys.argv) > 1 else 1_000_000
    frame, _ = timed(f"build invented table ({rows:,} rows)", lambda: invented_table(rows))
    print(f"table: {frame.shape[0]:,} rows x {frame.shape[1]} columns")
    search, key_s = timed(
        "weir: minimal unique combinations (<= 3 columns)",
        lambda: unique_combinations(frame, skip_measurements=True),
    )
    print(f"  left out as measurements: {', '.join(search.measurements)}")
    print(
        f"  keys found: {[', '.join(k) for k in search.keys][:6]}"
        f" (verified on all rows: {search.verified_on_all_rows})"
    )
    fds, fd_s = timed(
        "weir: TANE exact dependencies (lhs <= 2)", lambda: functional_dependencies(frame, max_lhs=2)
    )
    print(f"  dependencies found: {len(fds)}; e.g. {[str(d) for d in fds[:4]]}")
    key = list(search.keys[0]) if search.keys else list(frame.columns[:3])
    unique, base_key_s = timed(f"pandas: duplicated({key}).any()", lambda: frame.duplicated(key).any())
    assert not unique, "the found key must have no duplicates"

    def verify_all() -> bool:
        return all(
            frame.groupby(list(d.determinant), sort=False, dropna=False)[d.dependent]
            .nunique(dropna=False)
            .max()
            == 1
            for d in fds
            if d.determinant
        )

    holds, base_fd_s = timed(f"pandas: groupby-nunique verification of the {len(fds)} found", verify_all)
    assert holds, "every found dependency must verify"
    print(f"ratio key discovery / pandas check of one given key:       {key_s / base_key_s:8.1f}x")
    print(f"ratio dependency discovery / pandas check of found ones:   {fd_s / base_fd_s:8.2f}x")


if __name__ == "__main__":
    main()
