"""`--engine dask`: screen a large delimited file partition by partition on a Dask cluster.

Each partition is judged by the same Arrow screen as the single-machine path; keys shared across
partitions are found with Dask's own shuffle (a group-by on the key columns, then a merge back);
only the rows that need judging travel back, and the pandera engine of record judges them here,
so the findings are those of the single-machine engine.
"""

from __future__ import annotations

from collections.abc import Iterator
from contextlib import contextmanager
from typing import Any

import numpy as np
import pandas as pd
import pyarrow as pa

from linter.contract.model import TableContract
from linter.errors import WeirError
from linter.row_sets import union
from linter.scale import fast_path
from linter.scale.fast_path import ScreenedFile, plain_file, screened_table
from linter.scale.pieces import scan_lines
from linter.scale.screen import screen_batch, unscreenable
from linter.scale.stream import StreamResult
from linter.table import unique_labels

BLOCK_BYTES = 64 * 1024 * 1024
POSITION = "\x00position"
GOOD = "\x00good "
"""Prefix of the column saying where a patterned variable's cell is good (see `Screened.good`)."""


def _text_table(part: pd.DataFrame, labels: list[str]) -> pa.Table:
    """A partition of text cells as the Arrow screen expects them: empty cells are null."""
    columns: dict[str, pa.Array] = {}
    for label, name in zip(labels, part.columns, strict=True):
        cells = part[name].astype(object)
        empty = cells.isna() | (cells == "")
        columns[label] = pa.array(cells.where(~empty, None).tolist(), pa.string())
    return pa.table(columns)


def _judge(
    part: pd.DataFrame,
    contract: TableContract,
    labels: list[str],
    starts: list[int],
    partition_info: Any = None,
) -> pd.DataFrame:
    """Suspect rows of one partition (text cells + body position), and every row's typed key."""
    number = 0 if partition_info is None else int(partition_info["number"])
    start = starts[number]
    if number == 0:
        part = part.iloc[1:]  # the header line
        start = 0
    screened = screen_batch(_text_table(part, labels), contract)
    suspect = np.asarray(screened.suspect.to_numpy(zero_copy_only=False), dtype=bool)
    out = pd.DataFrame({POSITION: np.arange(start, start + len(part), dtype=np.int64)})
    out["\x00suspect"] = suspect
    for name in screened.keys.column_names:
        out[f"\x00key {name}"] = screened.keys.column(name).to_pandas().to_numpy()
    for name, good in screened.good.items():
        out[f"{GOOD}{name}"] = good
    return out


def screen_with_dask(
    path: str, contract: TableContract, blocksize: int | None = None, sample_rows: int | None = None
) -> ScreenedFile | None:
    """The file reduced to what the engine must judge, worked out on the current Dask cluster."""
    import dask.dataframe as dd

    blocksize = BLOCK_BYTES if blocksize is None else blocksize
    sample_rows = fast_path.SAMPLE_ROWS if sample_rows is None else sample_rows
    if unscreenable(contract) is not None:
        return None
    plain = plain_file(path)
    if plain is None:
        return None
    names = [f"c{i}" for i in range(plain.width)]
    frame = dd.read_csv(
        path,
        header=None,
        names=names,
        dtype=str,
        keep_default_na=False,
        na_filter=False,
        sep=plain.delimiter,
        blocksize=blocksize,
    )
    lengths = frame.map_partitions(len).compute().tolist()
    scan = scan_lines(path)
    if sum(lengths) < 2 or not scan.rows_agree(sum(lengths) - 1):
        return None
    header = frame.partitions[0].head(1, compute=True)
    names_written = tuple(str(v) for v in header.iloc[0].tolist())
    labels = unique_labels(list(names_written))
    starts = [int(s) - 1 for s in np.concatenate([[0], np.cumsum(lengths)[:-1]])]
    judged = frame.map_partitions(_judge, contract, labels, starts, meta=_meta(contract, names, labels))
    sample = min(sample_rows, sum(lengths) - 1)
    to_judge = _positions_to_judge(judged, contract, labels)
    first_good = _first_good(judged)
    keep = union([np.arange(sample), to_judge, list(first_good.values())])
    kept = _rows_at(frame, keep, starts, labels)
    suspect = int(judged["\x00suspect"].sum().compute())
    found = StreamResult(
        names_written,
        kept,
        keep,
        sum(lengths) - 1,
        suspect,
        sample,
        len(to_judge),
        first_good=first_good,
    )
    return screened_table(plain, found, scan.sha256, contract)


def _first_good(judged: Any) -> dict[str, int]:
    """Per patterned variable, the body position of its first good cell (see `StreamResult`)."""
    import dask

    names = [c[len(GOOD) :] for c in judged.columns if c.startswith(GOOD)]
    firsts = dask.compute(*(judged[POSITION].where(judged[f"{GOOD}{n}"]).min() for n in names))
    return {name: int(at) for name, at in zip(names, firsts, strict=True) if not pd.isna(at)}


def _meta(contract: TableContract, names: list[str], labels: list[str]) -> pd.DataFrame:
    """The columns `_judge` returns, from a header and one empty row."""
    sample = pd.DataFrame({name: pd.Series(["", ""], dtype=object) for name in names})
    return _judge(sample, contract, labels, [-1], {"number": 0}).iloc[:0]


def _positions_to_judge(judged: Any, contract: TableContract, labels: list[str]) -> np.ndarray:
    """Suspects, and every row whose whole key another row shares (via Dask's shuffle)."""
    suspects = judged[judged["\x00suspect"]][POSITION].compute().to_numpy()
    keys = [f"\x00key {k}" for k in contract.keys if k in labels]
    shared = np.array([], np.int64)
    if keys and len(keys) == len(contract.keys):
        counts = judged.groupby(keys, dropna=False)[POSITION].count()
        repeated = counts[counts > 1].reset_index()[keys]
        # The merge back to rows is Dask's hash shuffle; empty keys match like pandas' duplicated.
        marked = (
            judged[[*keys, POSITION]]
            .fillna("\x00empty")
            .merge(repeated.fillna("\x00empty"), on=keys, how="inner", shuffle_method="tasks")
        )
        shared = marked[POSITION].compute().to_numpy()
    return union([suspects, shared])


def _rows_at(frame: Any, positions: np.ndarray, starts: list[int], labels: list[str]) -> pa.Table:
    def pick(part: pd.DataFrame, partition_info: Any = None) -> pd.DataFrame:
        start = starts[int(partition_info["number"]) if partition_info else 0]
        local = positions[(positions >= start) & (positions < start + len(part))] - start
        return part.iloc[local]

    rows = frame.map_partitions(pick, meta=frame._meta).compute()
    return _text_table(rows, labels)


@contextmanager
def cluster(address: str | None) -> Iterator[None]:
    """A Dask client for the run: the scheduler at `address`, else a local cluster on this machine."""
    try:
        from distributed import Client, LocalCluster
    except ImportError:
        raise WeirError("--engine dask needs Dask: pip install 'tidyweir[dask]'") from None
    if address:
        try:
            client = Client(address, timeout=10)
        except (OSError, TimeoutError) as error:
            raise WeirError(f"cannot reach the Dask scheduler at {address}: {error}") from None
        with client:
            yield
        return
    with LocalCluster(processes=False, dashboard_address=None) as local, Client(local):
        yield
