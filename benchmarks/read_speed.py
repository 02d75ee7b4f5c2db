"""Time Weir's reader against pandas and Python's csv module in one run, and show that a huge single
line is refused in bounded memory while a plain line reader swallows it whole.

Usage: python benchmarks/read_speed.py [--rows 200000] [--line-mb 200]
Each measurement runs in its own subprocess so peak memory (max RSS) belongs to it alone.
"""

from __future__ import annotations

import argparse
import json
import subprocess
import sys
import tempfile
import textwrap
from pathlib import Path

MEASURE = textwrap.dedent(
    """
    import json, resource, sys, time
    path, how = sys.argv[1], sys.argv[2]
    # Every contender loads the same libraries first, so peak memory compares the reading alone.
    import csv
    import pandas as pd
    from linter.read import UnreadableFile, read_path
    started = time.perf_counter()
    outcome = "read"
    if how == "weir":
        try:
            tables = read_path(path)
            outcome = f"{tables[0].grid.shape[0]} rows"
        except UnreadableFile as verdict:
            outcome = verdict.rule
    elif how == "pandas":
        frame = pd.read_csv(path, dtype=str, keep_default_na=False, header=None)
        outcome = f"{frame.shape[0]} rows"
    elif how == "csv":
        csv.field_size_limit(sys.maxsize)
        with open(path, newline="", encoding="utf-8") as handle:
            rows = list(csv.reader(handle))
        outcome = f"{len(rows)} rows"
    elif how == "readline":
        with open(path, encoding="utf-8") as handle:
            lines = handle.readlines()
        outcome = f"{len(lines)} lines"
    elif how == "imports-only":
        outcome = "libraries loaded, nothing read"
    elapsed = time.perf_counter() - started
    peak_kb = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    print(json.dumps({"seconds": elapsed, "peak_mb": peak_kb / 1024, "outcome": outcome}))
    """
)


def measure(path: Path, how: str) -> dict[str, object]:
    done = subprocess.run(
        [sys.executable, "-c", MEASURE, str(path), how], capture_output=True, text=True, check=False
    )
    if done.returncode != 0:
        return {"seconds": float("nan"), "peak_mb": float("nan"), "outcome": done.stderr.strip()[-120:]}
    result: dict[str, object] = json.loads(done.stdout)
    return result


def write_table(path: Path, rows: int) -> None:
    with path.open("w", encoding="utf-8", newline="") as handle:
        handle.write("site_id,sampled_on,analyte,result,unit,note\r\n")
        for i in range(rows):
            site, month = f"VB-{i % 997:03d}", f"{i % 12 + 1:02d}"
            handle.write(f'{site},2024-{month}-15,nitrate,{i % 50}.{i % 7},mg/L,"ok, {i}"\r\n')


def report(title: str, results: dict[str, dict[str, object]], baseline: str) -> None:
    print(f"\n{title}")
    base = results[baseline]
    for how, r in results.items():
        seconds, peak = float(r["seconds"]), float(r["peak_mb"])  # type: ignore[arg-type]
        ratio_t = seconds / float(base["seconds"])  # type: ignore[arg-type]
        ratio_m = peak / float(base["peak_mb"])  # type: ignore[arg-type]
        print(
            f"  {how:9} {seconds:8.2f} s  {peak:8.1f} MB peak   x{ratio_t:5.2f} time  x{ratio_m:5.2f} memory"
            f"  vs {baseline}   ({r['outcome']})"
        )


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, default=200_000)
    parser.add_argument("--line-mb", type=int, default=200)
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        table = Path(folder) / "table.csv"
        write_table(table, args.rows)
        size = table.stat().st_size / 1e6
        results = {how: measure(table, how) for how in ("weir", "pandas", "csv", "imports-only")}
        report(f"{args.rows:,}-row CSV ({size:.1f} MB), every cell as text", results, "csv")
        table.unlink()

        line = Path(folder) / "one-line.csv"
        with line.open("wb") as handle:
            handle.write(b"site_id,result,")
            block = b"x" * (1 << 20)
            for _ in range(args.line_mb):
                handle.write(block)
        results = {how: measure(line, how) for how in ("weir", "readline", "imports-only")}
        report(f"single line of {args.line_mb} MB", results, "readline")


if __name__ == "__main__":
    main()
