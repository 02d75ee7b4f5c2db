"""Show that `weir check` streams: peak memory stays flat while the file grows (1 GB vs 4 GB by default).

Usage: python benchmarks/stream.py [--gb 1 4] [--keep]
The files are invented Vell Basin results, generated in a temporary folder by repeating one
block of rows with a different sample-id prefix per copy (so every key stays unique), and
removed afterwards. Each check runs in its own process; the table shows time and peak RSS.
"""

from __future__ import annotations

import argparse
import json
import os
import shutil
import subprocess
import sys
import tempfile
import textwrap
from pathlib import Path

sys.path.insert(0, str(Path(__file__).parent))
from scale import CONTRACT, PEAK_RESIDENT_MB, synthetic_results, write_csv

STREAM_CONTRACT = CONTRACT.replace("pattern: '^S\\d{7}$'", "pattern: '^S\\d{11}$'")
BLOCK_ROWS = 1_000_000

MEASURE = PEAK_RESIDENT_MB + textwrap.dedent(
    """
    import contextlib, io, json, sys, time
    path, contract = sys.argv[1], sys.argv[2]
    from linter.cli import app
    import linter.rules.catalogue
    started = time.perf_counter()
    with contextlib.redirect_stdout(io.StringIO()):
        try:
            app(["check", path, "--contract", contract, "--report", path + ".json"], standalone_mode=False)
        except SystemExit:
            pass
    elapsed = time.perf_counter() - started
    table = json.load(open(path + ".json"))["tables"][0]
    peak_mb = peak_resident_mb()
    print(json.dumps({"seconds": elapsed, "peak_mb": peak_mb, "rows": table["rows"],
                      "findings": len(table["findings"])}))
    """
)


def block_template(folder: Path) -> bytes:
    """One block of rows whose sample ids start with the placeholder `SXXXX` (replaced per copy)."""
    sample = folder / "block.csv"
    write_csv(synthetic_results(BLOCK_ROWS, 0.0, seed=1), sample)
    text = sample.read_bytes()
    sample.unlink()
    header, body = text.split(b"\n", 1)
    # Every body line starts with its sample id (S + 7 digits); the copy number goes in front.
    return header + b"\n" + b"SXXXX" + body[1:].replace(b"\nS", b"\nSXXXX")


def write_big(path: Path, gigabytes: float, template: bytes) -> int:
    header, body = template.split(b"\n", 1)
    copies = max(1, round(gigabytes * 1e9 / len(body)))
    with open(path, "wb") as handle:
        handle.write(header + b"\n")
        for copy in range(copies):
            handle.write(body.replace(b"SXXXX", b"S%04d" % copy))
    return copies * BLOCK_ROWS


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--gb", type=float, nargs="+", default=[1.0, 4.0])
    parser.add_argument("--keep", action="store_true")
    options = parser.parse_args()
    folder = Path(tempfile.mkdtemp(prefix="weir-stream-"))
    free = shutil.disk_usage(folder).free / 1e9
    if free < max(options.gb) * 1.2:
        raise SystemExit(f"only {free:.0f} GB free in the temporary folder; choose smaller --gb")
    contract = folder / "lab-results.yaml"
    contract.write_text(STREAM_CONTRACT, encoding="utf-8")
    # Files this large are over the default size limit (512 MB): raise it, as a data manager would.
    (folder / "weir.toml").write_text(
        f"[limits]\nmax_file_bytes = {int(max(options.gb) * 2e9)}\n", encoding="utf-8"
    )
    template = block_template(folder)
    lines = []
    try:
        for size in options.gb:
            path = folder / f"results-{size:g}gb.csv"
            rows = write_big(path, size, template)
            done = subprocess.run(
                [sys.executable, "-c", MEASURE, str(path), str(contract)],
                capture_output=True,
                text=True,
                cwd=folder,  # so that weir finds the weir.toml above
            )
            if done.returncode != 0:
                raise SystemExit(f"weir check failed: {done.stderr.strip().splitlines()[-1:]}")
            result = json.loads(done.stdout.strip().splitlines()[-1])
            line = {
                "file_gb": round(os.stat(path).st_size / 1e9, 2),
                "rows": rows,
                "reported_rows": result["rows"],
                "findings": result["findings"],
                "seconds": round(result["seconds"], 1),
                "mb_per_s": round(os.stat(path).st_size / 1e6 / result["seconds"]),
                "peak_mb": round(result["peak_mb"]),
            }
            lines.append(line)
            print(json.dumps(line), flush=True)
            if not options.keep:
                path.unlink()
                Path(str(path) + ".json").unlink()
    finally:
        if not options.keep:
            shutil.rmtree(folder, ignore_errors=True)
    print()
    print("| file | rows | Weir time | rate | peak memory |")
    print("|---|---|---|---|---|")
    for line in lines:
        print(
            f"| {line['file_gb']} GB | {line['rows']:,} | {line['seconds']} s | {line['mb_per_s']} MB/s "
            f"| {line['peak_mb']} MB |"
        )


if __name__ == "__main__":
    main()
