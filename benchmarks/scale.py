"""Time `weir check` with a full contract on large synthetic lab submissions against the readers and
hand-written pandera schemas, all in the same run, and print the ratios the README table shows.

Usage: python benchmarks/scale.py [--rows 1000000 5000000] [--repeat 2] [--keep]
Each measurement runs in its own subprocess so its peak memory (max RSS) is its own; the time is
taken inside that process after the libraries are imported, the best of --repeat runs.
The files are invented Vell Basin Water Network results, generated in a temporary folder.
"""

from __future__ import annotations

import argparse
import json
import os
import subprocess
import sys
import tempfile
import textwrap
from pathlib import Path

import numpy as np
import pyarrow as pa
import pyarrow.compute as pc

CONTRACT = """\
contract: lab-results
version: 1
title: Vell Basin Water Network laboratory results (invented, for the benchmark)
observational_unit: one analyte measured in one water sample
applies_to: ["results*.csv"]
keys: [sample_id, analyte]
variables:
  sample_id: {type: string, pattern: '^S\\d{7}$'}
  site_id: {type: string, pattern: '^VB-\\d{3}$'}
  sampled_on: {type: date, min: 2020-01-01, max: 2026-12-31}
  analyte: {type: category, values: [NITRATE, PHOSPHATE, AMMONIUM, CHLORIDE]}
  result: {type: number, min: 0, max: 500, unit: mg/L}
  replicate: {type: integer, min: 1, max: 3}
  qualifier: {type: category, values: [J, U]}
  lab: {type: category, values: [KESTREL, HERON, OTTER], nullable: false}
missing: ["", "NA"]
"""
ANALYTES = ["NITRATE", "PHOSPHATE", "AMMONIUM", "CHLORIDE"]
LABS = ["KESTREL", "HERON", "OTTER"]
BROKEN = {
    "site_id": ["vb-014", "VB-14"],
    "sampled_on": ["03/02/2026", "2026-02-30"],
    "analyte": ["Nitrate ", "SULPHATE"],
    "result": ["1,420", "-3", "about 3"],
    "replicate": ["2.5", "7"],
    "lab": ["", "PIKE"],
}


VARIED = {
    "site_id": [("vb-{:03d}", 1000), ("VB-{:02d}", 100)],
    "sampled_on": [("{:02d}/03/2026", 29), ("2026-02-3{:d}", 2)],
    "result": [("1,{:03d}", 1000), ("-{:d}.5", 1000), ("about {:d}", 1000)],
    "replicate": [("{:d}.5", 4), ("{:d}7", 10)],
}
"""Mistakes of the same kinds with a number in them (below the given bound) that varies from cell
to cell, as mistyped values do: `--mistakes varied` plants these, so few cells share a wrong value."""


def mistakes(name: str, count: int, rng: np.random.Generator, varied: bool) -> np.ndarray:
    """`count` wrong cells for the column `name`: one of its typical mistakes each, or (varied, where
    the column has such forms) one of its mistake forms with a random number filled in."""
    if not varied or name not in VARIED:
        return np.array(BROKEN[name])[rng.integers(0, len(BROKEN[name]), count)]
    forms = VARIED[name]
    chosen = rng.integers(0, len(forms), count)
    numbers = rng.integers(0, 1 << 30, count)
    cells = [forms[f][0].format(int(n) % forms[f][1]) for f, n in zip(chosen, numbers, strict=True)]
    return np.array(cells, dtype=object)


def synthetic_results(rows: int, broken: float, seed: int, varied: bool = False) -> pa.Table:
    """A tidy 8-column submission; `broken` is the share of rows with one planted bad cell (a
    typical mistake, or with `varied` one whose wrong value differs from cell to cell)."""
    rng = np.random.default_rng(seed)
    number = np.arange(rows)
    months = rng.integers(1, 13, rows)
    days = rng.integers(1, 29, rows)

    def text(values: np.ndarray) -> pa.Array:
        return pa.array(values.astype(str), pa.string())

    def padded(values: np.ndarray, width: int) -> pa.Array:
        return pc.utf8_lpad(text(values), width, "0")

    columns = {
        "sample_id": pc.binary_join_element_wise("S", padded(number // 4, 7), ""),
        "site_id": pc.binary_join_element_wise("VB-", padded(rng.integers(1, 200, rows), 3), ""),
        "sampled_on": pc.binary_join_element_wise("2026", padded(months, 2), padded(days, 2), "-"),
        "analyte": pa.array(np.array(ANALYTES)[number % 4]),
        "result": text(np.round(rng.uniform(0, 400, rows), 3)),
        "replicate": text(rng.integers(1, 4, rows)),
        "qualifier": pa.array(np.array(["", "", "J", "U"])[rng.integers(0, 4, rows)]),
        "lab": pa.array(np.array(LABS)[rng.integers(0, 3, rows)]),
    }
    table = pa.table(columns)
    if broken:
        hit = rng.choice(rows, int(rows * broken), replace=False)
        names = list(BROKEN)
        which = rng.integers(0, len(names), len(hit))
        for index, name in enumerate(names):
            where = hit[which == index]
            values = mistakes(name, len(where), rng, varied)
            column = table.column(name).to_numpy(zero_copy_only=False).astype(object)
            column[where] = values
            table = table.set_column(table.column_names.index(name), name, pa.array(column, pa.string()))
    return table


def write_csv(table: pa.Table, path: Path) -> None:
    """Plain CSV as a partner's export writes it: quotes only around cells holding a comma."""

    def cells(column: pa.ChunkedArray) -> pa.ChunkedArray:
        comma = pc.match_substring(column, ",")
        return pc.if_else(comma, pc.binary_join_element_wise('"', column, '"', ""), column)

    header = ",".join(table.column_names) + "\n"
    with open(path, "wb") as handle:
        handle.write(header.encode("utf-8"))
        for start in range(0, table.num_rows, 1_000_000):
            part = table.slice(start, 1_000_000)
            joined = pc.binary_join_element_wise(*(cells(c) for c in part.columns), ",")
            lines = pc.binary_join_element_wise(joined, "\n", "").combine_chunks()
            offsets = lines.buffers()[1]
            first, last = (
                int(x) for x in np.frombuffer(offsets, np.int32)[[lines.offset, lines.offset + len(lines)]]
            )
            handle.write(memoryview(lines.buffers()[2])[first:last])


PEAK_RESIDENT_MB = textwrap.dedent(
    """
    import resource

    def peak_resident_mb():
        # Linux carries ru_maxrss over exec, so a child would start at the parent's peak;
        # VmHWM is the high-water mark of this process's own memory.
        try:
            for line in open("/proc/self/status"):
                if line.startswith("VmHWM:"):
                    return int(line.split()[1]) / 1024
        except OSError:
            pass
        return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    """
)
"""Source of the peak-memory probe that every measuring child process starts with."""

MEASURE = PEAK_RESIDENT_MB + textwrap.dedent(
    """
    import json, sys, time
    path, contract, how = sys.argv[1], sys.argv[2], sys.argv[3]
    # Every contender loads the same libraries first, so time and memory compare the work alone.
    import pandas as pd
    import pyarrow as pa
    import pyarrow.csv as pacsv
    import pandera.pandas as pap
    from pandera.errors import SchemaErrors
    import linter.cli
    import linter.check
    import linter.rules.catalogue
    # pandera registers its pandas backend on the first validate (importing its strategies, and
    # hypothesis where installed): library loading too, so it is done here for every contender.
    pap.DataFrameSchema({"a": pap.Column(int)}).validate(pd.DataFrame({"a": [1]}))
    failures = None
    if how == "pandera-polars":
        import polars as pl
        import pandera.polars as papl
    started = time.perf_counter()
    if how == "pyarrow":
        rows = pacsv.read_csv(path).num_rows
    elif how == "pandas":
        rows = len(pd.read_csv(path, engine="c"))
    elif how == "pandera-pandas":
        frame = pd.read_csv(path, dtype=str, keep_default_na=False, na_values=[""])
        day = lambda s: pd.to_datetime(s, format="%Y-%m-%d", errors="coerce").between(
            "2020-01-01", "2026-12-31")
        schema = pap.DataFrameSchema(
            {
                "sample_id": pap.Column(str, pap.Check.str_matches(r"S\\d{7}\\Z")),
                "site_id": pap.Column(str, pap.Check.str_matches(r"VB-\\d{3}\\Z")),
                "sampled_on": pap.Column(str, pap.Check(day)),
                "analyte": pap.Column(str, pap.Check.isin(["NITRATE", "PHOSPHATE", "AMMONIUM", "CHLORIDE"])),
                "result": pap.Column(float, pap.Check.in_range(0, 500), coerce=True, nullable=True),
                "replicate": pap.Column("Int64", pap.Check.in_range(1, 3), coerce=True, nullable=True),
                "qualifier": pap.Column(str, pap.Check.isin(["J", "U"]), nullable=True),
                "lab": pap.Column(str, pap.Check.isin(["KESTREL", "HERON", "OTTER"])),
            },
            unique=["sample_id", "analyte"],
        )
        rows = len(frame)
        try:
            schema.validate(frame, lazy=True)
            failures = 0
        except SchemaErrors as error:
            failures = len(error.failure_cases)
    elif how == "pandera-polars":
        frame = pl.read_csv(path, infer_schema=False)
        day = lambda data: data.lazyframe.select(
            pl.col(data.key).str.strptime(pl.Date, "%Y-%m-%d", strict=False).is_between(
                pl.date(2020, 1, 1), pl.date(2026, 12, 31)).fill_null(False))
        schema = papl.DataFrameSchema(
            {
                "sample_id": papl.Column(pl.Utf8, papl.Check.str_matches(r"^S\\d{7}$")),
                "site_id": papl.Column(pl.Utf8, papl.Check.str_matches(r"^VB-\\d{3}$")),
                "sampled_on": papl.Column(pl.Utf8, papl.Check(day)),
                "analyte": papl.Column(
                    pl.Utf8, papl.Check.isin(["NITRATE", "PHOSPHATE", "AMMONIUM", "CHLORIDE"])),
                "result": papl.Column(pl.Float64, papl.Check.in_range(0, 500), coerce=True, nullable=True),
                "replicate": papl.Column(pl.Int64, papl.Check.in_range(1, 3), coerce=True, nullable=True),
                "qualifier": papl.Column(pl.Utf8, papl.Check.isin(["J", "U"]), nullable=True),
                "lab": papl.Column(pl.Utf8, papl.Check.isin(["KESTREL", "HERON", "OTTER"])),
            },
            unique=["sample_id", "analyte"],
        )
        rows = frame.height
        try:
            schema.validate(frame, lazy=True)
            failures = 0
        except SchemaErrors as error:
            failures = len(error.failure_cases)
    elif how in ("weir", "weir-ordinary"):
        # The real command, as a data manager runs it: contract, report file, exit code.
        import contextlib, io
        from linter.cli import app
        if how == "weir-ordinary":  # before the fast path: every file through the ordinary reader
            import linter.scale.fast_path
            linter.scale.fast_path.FAST_PATH_BYTES = 1 << 62
        out = path + ".report.json"
        with contextlib.redirect_stdout(io.StringIO()):
            try:
                app(["check", path, "--contract", contract, "--report", out], standalone_mode=False)
            except SystemExit:
                pass
        report = json.load(open(out))
        table = report["tables"][0]
        rows = table["rows"]
        failures = sum(f.get("count", 1) for f in table["findings"])
    elapsed = time.perf_counter() - started
    peak_mb = peak_resident_mb()
    print(json.dumps({"seconds": elapsed, "peak_mb": peak_mb, "rows": rows, "failures": failures}))
    """
)


def best_of_processes(
    arguments: list[str], label: str, repeat: int, environment: dict[str, str] | None = None
) -> dict[str, float]:
    """Run `python -c MEASURING_SOURCE ...` `repeat` times in fresh processes; the fastest run's
    result, with the largest peak memory among the runs."""
    best: dict[str, float] | None = None
    for _ in range(repeat):
        done = subprocess.run(
            [sys.executable, "-c", *arguments], capture_output=True, text=True, check=False, env=environment
        )
        if done.returncode != 0:
            raise SystemExit(f"{label} failed: {done.stderr.strip().splitlines()[-1:]}")
        result = json.loads(done.stdout.strip().splitlines()[-1])
        if best is None or result["seconds"] < best["seconds"]:
            peak = max(result["peak_mb"], best["peak_mb"] if best else 0.0)
            best = {**result, "peak_mb": peak}
    assert best is not None
    return best


def measure(path: Path, contract: Path, how: str, repeat: int) -> dict[str, float]:
    """Best time of `repeat` fresh processes, with the largest peak memory among them."""
    return best_of_processes([MEASURE, str(path), str(contract), how], how, repeat)


def measure_alternately(paths: list[Path], contract: Path, how: str, repeat: int) -> list[dict[str, float]]:
    """`measure` of each path, the runs taken in turn (a, b, a, b, ...): this machine's speed drifts
    by a fifth from minute to minute, and a ratio of two timings should not measure the drift."""
    best: list[dict[str, float] | None] = [None] * len(paths)
    for _ in range(repeat):
        for at, path in enumerate(paths):
            run = measure(path, contract, how, 1)
            known = best[at]
            if known is None or run["seconds"] < known["seconds"]:
                best[at] = {**run, "peak_mb": max(run["peak_mb"], known["peak_mb"] if known else 0.0)}
            else:
                best[at] = {**known, "peak_mb": max(run["peak_mb"], known["peak_mb"])}
    return [b for b in best if b is not None]


def polars_available() -> bool:
    try:
        import pandera.polars  # noqa: F401
        import polars  # noqa: F401
    except ImportError:
        return False
    return True


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, nargs="+", default=[1_000_000, 5_000_000])
    parser.add_argument("--repeat", type=int, default=2)
    parser.add_argument("--broken", type=float, default=0.01, help="share of broken rows in the variant")
    parser.add_argument(
        "--mistakes",
        choices=["typical", "varied"],
        default="typical",
        help="broken cells drawn from a few typical wrong values, or varied from cell to cell",
    )
    parser.add_argument("--keep", action="store_true", help="keep the generated files")
    parser.add_argument(
        "--before", action="store_true", help="also time Weir without the fast path (slow: use few rows)"
    )
    options = parser.parse_args()
    contenders = ["pyarrow", "pandas", "pandera-pandas"] + (["pandera-polars"] if polars_available() else [])
    folder = Path(tempfile.mkdtemp(prefix="weir-scale-"))
    contract = folder / "lab-results.yaml"
    contract.write_text(CONTRACT, encoding="utf-8")
    lines = []
    for rows in options.rows:
        clean = folder / f"results-{rows}.csv"
        broken = folder / f"results-{rows}-broken.csv"
        write_csv(synthetic_results(rows, 0.0, seed=rows), clean)
        write_csv(
            synthetic_results(rows, options.broken, seed=rows, varied=options.mistakes == "varied"), broken
        )
        size_mb = os.stat(clean).st_size / 1e6
        times = {how: measure(clean, contract, how, options.repeat) for how in contenders}
        weir, weir_broken = measure_alternately([clean, broken], contract, "weir", options.repeat)
        before = measure(clean, contract, "weir-ordinary", 1) if options.before else None
        pandera_broken = measure(broken, contract, "pandera-pandas", options.repeat)
        floor = min(times["pyarrow"]["seconds"], times["pandas"]["seconds"])
        line = {
            "rows": rows,
            "file_mb": round(size_mb, 1),
            "weir_s": round(weir["seconds"], 3),
            "floor_s": round(floor, 3),
            "pandera_pandas_s": round(times["pandera-pandas"]["seconds"], 3),
            "pandera_polars_s": round(times["pandera-polars"]["seconds"], 3)
            if "pandera-polars" in times
            else None,
            "weir_over_floor": round(weir["seconds"] / floor, 2),
            "weir_over_pandera": round(weir["seconds"] / times["pandera-pandas"]["seconds"], 2),
            "weir_over_polars": round(weir["seconds"] / times["pandera-polars"]["seconds"], 2)
            if "pandera-polars" in times
            else None,
            "weir_peak_mb": round(weir["peak_mb"]),
            "pandera_peak_mb": round(times["pandera-pandas"]["peak_mb"]),
            "peak_over_file": round(weir["peak_mb"] / size_mb, 2),
            "weir_broken_s": round(weir_broken["seconds"], 3),
            "broken_over_clean": round(weir_broken["seconds"] / weir["seconds"], 2),
            "pandera_broken_over_clean": round(
                pandera_broken["seconds"] / times["pandera-pandas"]["seconds"], 2
            ),
            "weir_without_fast_path_s": round(before["seconds"], 3) if before else None,
            "fast_path_speed_up": round(before["seconds"] / weir["seconds"], 1) if before else None,
            "weir_findings_broken": weir_broken["failures"],
            "pandera_failure_cases_broken": pandera_broken["failures"],
        }
        lines.append(line)
        print(json.dumps(line), flush=True)
    print()
    print(
        "| rows | file | Weir | floor | pandera (pandas) | pandera (polars) | Weir/floor | Weir/pandera "
        "| Weir/polars | Weir peak | peak/file | 1 % broken: Weir | broken/clean |"
    )
    print("|---|---|---|---|---|---|---|---|---|---|---|---|---|")
    for line in lines:
        print(
            f"| {line['rows']:,} | {line['file_mb']} MB | {line['weir_s']} s | {line['floor_s']} s "
            f"| {line['pandera_pandas_s']} s | {line['pandera_polars_s']} s | {line['weir_over_floor']}x "
            f"| {line['weir_over_pandera']}x | {line['weir_over_polars']}x | {line['weir_peak_mb']} MB "
            f"| {line['peak_over_file']}x | {line['weir_broken_s']} s | {line['broken_over_clean']}x |"
        )
    if not options.keep:
        for path in folder.iterdir():
            path.unlink()
        folder.rmdir()


if __name__ == "__main__":
    main()
