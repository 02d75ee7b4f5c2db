"""Start-up cost of Weir as a hook: `weir --help` and a 1,000-row check, against Python baselines.

Every command runs REPEAT times in fresh processes in this one run; the median wall time is
compared with `python -c pass` (the floor) and `python -c "import pandas"` (what a check
cannot avoid, since reading a table needs pandas).

    python benchmarks/startup.py [--repeat N]
"""

from __future__ import annotations

import argparse
import random
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parent.parent
ANALYTES = ("NITRATE", "NITRITE", "AMMONIUM", "PHOSPHATE", "CHLORIDE")


def demo_csv(path: Path, rows: int) -> None:
    """An invented month of Vell Basin results: unique keys, values in range, a few censored."""
    generator = random.Random(7)
    lines = ["site_id,sampled_on,analyte,result,lab_sample_id"]
    for n in range(rows):
        site, analyte = divmod(n, len(ANALYTES))
        value = "<0.05" if generator.random() < 0.05 else f"{generator.uniform(0.01, 40):.3f}"
        lines.append(
            f"VB-{site % 1000:03d},2026-{1 + site // 1000:02d}-12,{ANALYTES[analyte]},{value},VL{n:06d}"
        )
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")


def timed(command: list[str], cwd: Path, repeat: int) -> float:
    times = []
    for _ in range(repeat):
        start = time.perf_counter()
        done = subprocess.run(command, cwd=cwd, capture_output=True)
        times.append(time.perf_counter() - start)
        if done.returncode not in (0, 1):
            raise SystemExit(f"{' '.join(command)} failed: {done.stderr.decode()[-300:]}")
    return statistics.median(times)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=5)
    options = parser.parse_args()
    python = sys.executable
    weir = [python, "-m", "linter"]
    hook = [python, "-c", "from linter.gate.hook import main; main()"]
    with tempfile.TemporaryDirectory() as folder:
        work = Path(folder)
        shutil.copytree(REPO / "contracts", work / "contracts")
        (work / "weir.toml").write_text('contracts = ["contracts/stream-chemistry.yaml"]\n')
        demo_csv(work / "chemistry-1000.csv", 1000)
        cases = {
            "python -c pass": [python, "-c", "pass"],
            "python -c 'import pandas'": [python, "-c", "import pandas"],
            "weir --help": [*weir, "--help"],
            "weir check (1,000 rows)": [*weir, "check", "chemistry-1000.csv"],
            "weir-hook (1,000 rows)": [*hook, "chemistry-1000.csv"],
        }
        medians = {name: timed(command, work, options.repeat) for name, command in cases.items()}
    floor = medians["python -c pass"]
    pandas = medians["python -c 'import pandas'"]
    print(f"median of {options.repeat} runs each, same machine, same run")
    print(f"{'command':28} {'seconds':>8} {'x pass':>8} {'x pandas':>9}")
    for name, seconds in medians.items():
        print(f"{name:28} {seconds:8.3f} {seconds / floor:8.1f} {seconds / pandas:9.2f}")


if __name__ == "__main__":
    main()
