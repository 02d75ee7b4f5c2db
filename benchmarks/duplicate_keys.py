"""Time Weir's duplicate-key search on 5M keys against pandas `DataFrame.duplicated(keep=False)`.

Usage: python benchmarks/duplicate_keys.py [--rows 5000000] [--duplicates 0.001] [--before-source DIR]
The keys are those of benchmarks/scale.py's invented Vell Basin results (sample_id: 8-character
texts, four rows each; analyte: four codes), cut into batches of the size the check streams, with
a share of rows given the key of another row. Each contender runs in its own process, so its peak
memory (VmHWM) is its own; the time covers the search alone, not making the keys:

- pandas: every batch kept, one frame, `duplicated(keep=False)` (the baseline);
- kept keys: every batch's key texts kept, concatenated and searched exactly with
  `screen.duplicated_rows` (how the check searched before hashing; `--before-source` runs it from
  an older source tree, e.g. an export of main, in the same run);
- hashed: each batch hashed to 8 bytes a row as it arrives, repeated hashes searched, and the
  candidate rows' keys (made again in a second pass, as the check reads them again) compared exactly.

All three must name the same rows; the script stops if they do not.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
import textwrap
from pathlib import Path

sys.path.insert(0, str(Path(__file__).parent))
from scale import PEAK_RESIDENT_MB, best_of_processes

BATCH_ROWS = 310_000
"""About the rows of one 16 MB batch of the scale benchmark's file."""

MEASURE = PEAK_RESIDENT_MB + textwrap.dedent(
    """
    import json, sys, time
    import numpy as np
    import pandas as pd
    import pyarrow as pa
    import pyarrow.compute as pc
    rows, share, batch_rows, how = int(sys.argv[1]), float(sys.argv[2]), int(sys.argv[3]), sys.argv[4]
    ANALYTES = np.array(["NITRATE", "PHOSPHATE", "AMMONIUM", "CHLORIDE"])

    def key_batch(start):
        # Row n has sample S{n // 4:07d} and analyte n % 4; a share of rows takes another row's key.
        count = min(batch_rows, rows - start)
        number = np.arange(start, start + count)
        rng = np.random.default_rng(start)
        copied = rng.random(count) < share
        number[copied] = rng.integers(0, rows, int(copied.sum()))
        digits = pc.utf8_lpad(pa.array((number // 4).astype(str)), 7, "0")
        return pa.table({
            "sample_id": pc.binary_join_element_wise("S", digits, ""),
            "analyte": pa.array(ANALYTES[number % 4]),
        })

    starts = range(0, rows, batch_rows)
    spent = 0.0
    if how == "pandas":
        frame = pa.concat_tables([key_batch(s) for s in starts]).to_pandas()
        began = time.perf_counter()
        found = np.flatnonzero(frame.duplicated(keep=False).to_numpy())
        spent = time.perf_counter() - began
    elif how == "kept-keys":
        from linter.scale.key_codes import duplicated_rows
        parts = [key_batch(s) for s in starts]
        began = time.perf_counter()
        found = duplicated_rows(pa.concat_tables(parts)).to_numpy()
        spent = time.perf_counter() - began
    else:
        from linter.scale.key_hash import repeated_values
        from linter.scale.key_codes import key_codes, shared_codes
        from linter.scale.stream import key_hashes
        hashes = []
        for start in starts:
            batch = key_batch(start)
            began = time.perf_counter()
            hashes.append(key_hashes(batch))
            spent += time.perf_counter() - began
        began = time.perf_counter()
        candidates = np.flatnonzero(repeated_values(np.concatenate(hashes)))
        spent += time.perf_counter() - began
        picked = []
        for start in starts:  # the second pass: the candidate rows' keys again
            batch = key_batch(start)
            began = time.perf_counter()
            inside = candidates[(candidates >= start) & (candidates < start + batch.num_rows)] - start
            picked.append(batch.take(pa.array(inside)))
            spent += time.perf_counter() - began
        began = time.perf_counter()
        found = candidates[shared_codes(key_codes(pa.concat_tables(picked)))]
        spent += time.perf_counter() - began
    print(json.dumps({"seconds": spent, "peak_mb": peak_resident_mb(), "found": len(found),
                      "digest": int(np.asarray(found, np.int64).sum())}))
    """
)


def measure(how: str, rows: int, share: float, repeat: int, source: str | None) -> dict[str, float]:
    """Best time of `repeat` fresh processes, with the largest peak memory among them."""
    environment = dict(os.environ)
    if source is not None:
        environment["PYTHONPATH"] = source
    return best_of_processes([MEASURE, str(rows), str(share), str(BATCH_ROWS), how], how, repeat, environment)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, default=5_000_000)
    parser.add_argument("--duplicates", type=float, default=0.001, help="share of rows copying a key")
    parser.add_argument("--repeat", type=int, default=3)
    parser.add_argument("--before-source", help="source tree of an earlier Weir for the kept-keys search")
    options = parser.parse_args()
    results = {
        "pandas": measure("pandas", options.rows, options.duplicates, options.repeat, None),
        "kept-keys": measure(
            "kept-keys", options.rows, options.duplicates, options.repeat, options.before_source
        ),
        "hashed": measure("hashed", options.rows, options.duplicates, options.repeat, None),
    }
    answers = {(r["found"], r["digest"]) for r in results.values()}
    if len(answers) != 1:
        raise SystemExit(f"the contenders disagree: {results}")
    baseline = results["pandas"]
    print(f"{options.rows:,} keys, {results['pandas']['found']:,} rows sharing a key")
    print("| search | seconds | vs pandas | peak memory |")
    print("|---|---|---|---|")
    for how, result in results.items():
        ratio = baseline["seconds"] / result["seconds"]
        print(f"| {how} | {result['seconds']:.3f} s | {ratio:.1f}x | {result['peak_mb']:.0f} MB |")
    print(json.dumps({how: {k: round(v, 3) for k, v in r.items()} for how, r in results.items()}))


if __name__ == "__main__":
    main()
