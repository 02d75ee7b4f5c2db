"""Time `weir check` on a folder of many small files: one process, N worker processes, and (as the
baseline) one `weir` process per file, all in the same run; prints the ratios.

Usage: python benchmarks/many_files.py [--files 500] [--rows 40] [--jobs 2] [--per-file-sample 10]
The per-file baseline starts `--per-file-sample` separate processes and scales their mean time to
all files (starting 500 processes would take minutes on a shared machine); the table says so.
Files are invented Vell Basin results written to a temporary folder and removed afterwards.
"""

from __future__ import annotations

import argparse
import os
import random
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).parent))
from scale import CONTRACT

ANALYTES = ("NITRATE", "PHOSPHATE", "AMMONIUM", "CHLORIDE")


def small_file(path: Path, rows: int, seed: int) -> None:
    rng = random.Random(seed)
    lines = ["sample_id,site_id,sampled_on,analyte,result,replicate,qualifier,lab"]
    for number in range(rows):
        result = f"{rng.uniform(0, 400):.3f}" if rng.random() > 0.02 else "1,420"
        sampled = f"2026-{rng.randrange(1, 13):02d}-{rng.randrange(1, 29):02d}"
        lines.append(
            f"S{seed * 1000 + number // 4:07d},VB-{rng.randrange(1, 200):03d},{sampled},"
            f'{ANALYTES[number % 4]},"{result}",{rng.randrange(1, 4)},,HERON'
        )
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")


def timed(command: list[str]) -> float:
    started = time.perf_counter()
    done = subprocess.run(command, capture_output=True, text=True, check=False)
    if done.returncode not in (0, 1):
        raise SystemExit(f"{' '.join(command[:3])} failed: {done.stderr.strip().splitlines()[-1:]}")
    return time.perf_counter() - started


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--files", type=int, default=500)
    parser.add_argument("--rows", type=int, default=40)
    parser.add_argument("--jobs", type=int, default=os.cpu_count() or 2)
    parser.add_argument("--per-file-sample", type=int, default=10)
    options = parser.parse_args()
    folder = Path(tempfile.mkdtemp(prefix="weir-many-"))
    try:
        inbox = folder / "inbox"
        inbox.mkdir()
        for number in range(options.files):
            small_file(inbox / f"results-{number:04d}.csv", options.rows, number)
        contract = folder / "lab-results.yaml"
        contract.write_text(CONTRACT, encoding="utf-8")
        weir = [sys.executable, "-m", "linter"]
        one = timed([*weir, "check", str(inbox), "-c", str(contract), "--jobs", "1"])
        many = timed([*weir, "check", str(inbox), "-c", str(contract), "--jobs", str(options.jobs)])
        sample = sorted(inbox.iterdir())[: options.per_file_sample]
        each = sum(timed([*weir, "check", str(p), "-c", str(contract)]) for p in sample) / len(sample)
        per_file = each * options.files
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    print(
        f"| files | one process | --jobs {options.jobs} | one process per file (from {len(sample)}) "
        "| jobs/one | jobs/per-file |"
    )
    print("|---|---|---|---|---|---|")
    print(
        f"| {options.files} x {options.rows} rows | {one:.1f} s | {many:.1f} s | {per_file:.0f} s "
        f"| {many / one:.2f}x | {many / per_file:.3f}x |"
    )


if __name__ == "__main__":
    main()
