"""Time the column screen (`screen_batch`) against the regex screen it replaced, on the same batches.

Usage: python benchmarks/screen_kernels.py [--rows 5000000] [--broken 0.01] [--repeat 5]
The rows are `benchmarks/scale.py`'s invented Vell Basin results, written to a temporary CSV file
and read back in the fast path's own batches, so every cell arrives as `weir check` hands it over.
Both screens judge the same batches in the same process, taking turns, best of --repeat each:
first whole batches as `weir check` does (columns side by side on the available cores), then
every column alone on one thread. Before timing, the new screen must send the engine every row
the old one sent (being stricter, it may send more) and give the same key columns on this data.
"""

from __future__ import annotations

import argparse
import os
import sys
import tempfile
import time
from collections.abc import Callable, Sequence
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.compute as pc

sys.path.insert(0, str(Path(__file__).parent))
from scale import CONTRACT, synthetic_results, write_csv

from linter.contract.convert import PLAIN_INTEGER, PLAIN_NUMBER
from linter.contract.dates import ISO_DATE
from linter.contract.load import load_contract
from linter.contract.model import TableContract, Variable, VarType
from linter.scale import kernels, screen
from linter.scale.pieces import text_batches

# The regex screen as it was before the byte kernels, kept here as the baseline.


def _falsy(array: pa.Array | pa.ChunkedArray) -> pa.Array | pa.ChunkedArray:
    return pc.fill_null(array, False)


def regex_missing(text: pa.ChunkedArray, codes: Sequence[str]) -> pa.ChunkedArray:
    trimmed = pc.utf8_trim_whitespace(text)
    codes_set = pa.array(sorted({c.strip() for c in codes} | {""}), pa.string())
    return pc.or_(pc.is_null(text), _falsy(pc.is_in(trimmed, value_set=codes_set)))


def regex_bound_ok(values: pa.ChunkedArray, variable: Variable, as_date: bool) -> pa.ChunkedArray:
    ok = pc.is_valid(values)
    for bound, compare in ((variable.minimum, pc.greater_equal), (variable.maximum, pc.less_equal)):
        if bound is None:
            continue
        scalar = (
            pa.scalar(pd.Timestamp(str(bound)).as_unit("ns"), pa.timestamp("ns"))
            if as_date
            else pa.scalar(float(bound))
        )
        ok = pc.and_(ok, _falsy(compare(values, scalar)))
    return ok


def regex_typed(text: pa.ChunkedArray, variable: Variable) -> tuple[pa.ChunkedArray, pa.ChunkedArray]:
    kind = variable.type
    if kind in (VarType.NUMBER, VarType.INTEGER):
        trimmed = pc.utf8_trim_whitespace(text)
        shape = PLAIN_INTEGER if kind is VarType.INTEGER else PLAIN_NUMBER
        plain = _falsy(pc.match_substring_regex(trimmed, shape))
        if kind is VarType.INTEGER:
            plain = pc.and_(plain, pc.less_equal(pc.utf8_length(trimmed), kernels.LONGEST_PLAIN_INTEGER))
        if variable.censored_prefix:
            plain = pc.and_(plain, pc.invert(_falsy(pc.starts_with(trimmed, variable.censored_prefix))))
        values = pc.cast(pc.if_else(plain, trimmed, pa.scalar(None, pa.string())), pa.float64())
        return pc.and_(plain, regex_bound_ok(values, variable, as_date=False)), values
    if kind is VarType.DATE:
        shaped = _falsy(pc.match_substring_regex(text, ISO_DATE))
        stamps = pc.strptime(
            pc.if_else(shaped, text, pa.scalar(None, pa.string())),
            format="%Y-%m-%d",
            unit="ns",
            error_is_null=True,
        )
        written_day = pc.cast(
            pc.utf8_slice_codeunits(pc.if_else(shaped, text, "2000-01-01"), 8, 10), pa.int64()
        )
        real_day = pc.and_(shaped, _falsy(pc.equal(pc.day(stamps), written_day)))
        return pc.and_(real_day, regex_bound_ok(stamps, variable, as_date=True)), stamps
    if kind is VarType.BOOLEAN:
        trimmed = pc.utf8_trim_whitespace(text)
        words = pc.utf8_lower(trimmed)
        ok = pc.and_(
            _falsy(pc.string_is_ascii(trimmed)), _falsy(pc.is_in(words, pa.array(screen.BOOLEAN_WORDS)))
        )
        return ok, pc.is_in(words, pa.array(("true", "1")))
    ok = pc.is_valid(text)
    if variable.pattern is not None:
        matched = pc.match_substring_regex(text, screen.whole_match(variable.pattern))
        ok = pc.and_(ok, pc.and_(_falsy(pc.string_is_ascii(text)), _falsy(matched)))
    if variable.codes is not None:
        ok = pc.and_(ok, _falsy(pc.is_in(text, pa.array(variable.codes.values, pa.string()))))
    return ok, text


def regex_judged(
    text: pa.ChunkedArray, variable: Variable, contract: TableContract
) -> tuple[pa.Array, pa.Array]:
    missing = regex_missing(text, tuple(contract.missing) + tuple(variable.missing))
    passes, typed = regex_typed(text, variable)
    nullable = variable.nullable and variable.name not in contract.keys
    clean = pc.if_else(missing, pa.scalar(nullable), _falsy(passes))
    return clean, pc.if_else(missing, pa.scalar(None, typed.type), typed)


def regex_screen_batch(batch: pa.Table, contract: TableContract) -> screen.Screened:
    present = [v for v in contract.variables if v.name in batch.column_names]
    with ThreadPoolExecutor(max_workers=min(len(present), os.cpu_count() or 1) or 1) as pool:
        judged = list(pool.map(lambda v: regex_judged(batch.column(v.name), v, contract), present))
    suspect: pa.ChunkedArray = pa.chunked_array([pa.nulls(batch.num_rows, pa.bool_()).fill_null(False)])
    for clean, _ in judged:
        suspect = pc.or_(suspect, pc.invert(clean))
    keys = {v.name: key for v, (_, key) in zip(present, judged, strict=True) if v.name in contract.keys}
    return screen.Screened(suspect, {}, pa.table(keys) if keys else pa.table({}))


# Measuring.


def batches_of(rows: int, broken: float, folder: Path) -> list[pa.Table]:
    """The invented results as the fast path reads them: header-less text batches, empty cells null."""
    path = folder / "results.csv"
    write_csv(synthetic_results(rows, broken, seed=rows), path)
    found = [piece.table for piece in text_batches(str(path), ",", 8)]
    path.unlink()
    labels = [str(v) for v in found[0].slice(0, 1).to_pylist()[0].values()]
    found[0] = found[0].slice(1)
    return [b.rename_columns(labels) for b in found]


def paired(repeat: int, before: Callable[[], object], after: Callable[[], object]) -> tuple[float, float]:
    """Best seconds of each, run alternately so that load from other work hits both alike."""
    best = [float("inf"), float("inf")]
    for _ in range(repeat):
        for index, work in enumerate((before, after)):
            started = time.perf_counter()
            work()
            best[index] = min(best[index], time.perf_counter() - started)
    return best[0], best[1]


def suspect_rows(screened: screen.Screened) -> np.ndarray:
    return np.asarray(screened.suspect.to_numpy(zero_copy_only=False), dtype=bool)


def same_findings(batches: list[pa.Table], contract: TableContract) -> tuple[int, int]:
    """(suspect rows old, new); raises when the new screen passes a row the old one sent to the engine."""
    old = np.concatenate([suspect_rows(regex_screen_batch(b, contract)) for b in batches])
    new = np.concatenate([suspect_rows(screen.screen_batch(b, contract)) for b in batches])
    if np.any(old & ~new):
        raise SystemExit(f"the new screen passes {int(np.sum(old & ~new))} rows the old one did not")
    for b in batches:
        old_keys, new_keys = regex_screen_batch(b, contract).keys, screen.screen_batch(b, contract).keys
        if not old_keys.equals(new_keys):
            raise SystemExit("the key columns differ")
    return int(old.sum()), int(new.sum())


def column_times(
    columns: list[pa.ChunkedArray], variable: Variable, contract: TableContract, repeat: int
) -> tuple[float, float]:
    """(regex screen, byte kernels) seconds for one column of every batch, on this thread alone."""
    return paired(
        repeat,
        lambda: [regex_judged(c, variable, contract) for c in columns],
        lambda: [screen._judged(c, variable, contract) for c in columns],
    )


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, default=5_000_000)
    parser.add_argument("--broken", type=float, default=0.01, help="share of rows with one planted bad cell")
    parser.add_argument("--repeat", type=int, default=5)
    options = parser.parse_args()
    with tempfile.TemporaryDirectory(prefix="weir-screen-bench-") as folder:
        contract_path = Path(folder) / "lab-results.yaml"
        contract_path.write_text(CONTRACT, encoding="utf-8")
        contract = load_contract(str(contract_path)).tables[0]
        batches = batches_of(options.rows, options.broken, Path(folder))
    old_suspect, new_suspect = same_findings(batches, contract)
    print(
        f"{options.rows:,} rows in {len(batches)} batches, {os.cpu_count()} cores, best of {options.repeat}"
    )
    print(f"suspect rows: regex screen {old_suspect:,}, byte kernels {new_suspect:,}")
    old, new = paired(
        options.repeat,
        lambda: [regex_screen_batch(b, contract) for b in batches],
        lambda: [screen.screen_batch(b, contract) for b in batches],
    )
    print("| column | type | regex screen | byte kernels | speed-up |\n|---|---|---|---|---|")
    print(f"| whole batch | all | {old:.3f} s | {new:.3f} s | {old / new:.2f}x |")
    for variable in contract.variables:
        before, after = column_times(
            [b.column(variable.name) for b in batches], variable, contract, options.repeat
        )
        kind = variable.type.value
        print(f"| {variable.name} | {kind} | {before:.3f} s | {after:.3f} s | {before / after:.2f}x |")


if __name__ == "__main__":
    main()
