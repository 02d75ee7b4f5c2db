"""Key hashes of files too large to keep them in memory, spilled to disk in partitions.

Each batch's 64-bit hashes go, with their row positions, to the partition file their top bits
name; each partition is then read back on its own and searched for repeated hashes, so memory
holds one partition at a time, however large the file.
"""

from __future__ import annotations

import itertools
import os
from pathlib import Path

import numpy as np

from linter.scale.key_hash import repeated_values
from linter.scale.pieces import Span

KEYS_IN_MEMORY_BYTES = 512 * 1024 * 1024
"""Files larger than this find duplicate keys through spilled 64-bit hashes instead of kept keys."""
PARTITION_ROWS = 1_000_000
"""Rows per hash partition, about: one partition (16 bytes a row) is read back at a time, so the
partitions grow in number, not in size, with the file, and memory stays flat."""
FEWEST_PARTITIONS = 64
MOST_PARTITIONS = 512
"""Each partition is an open file while the pass runs; 512 stays well inside the usual limit of
1,024 open files, and keeps a partition near 16 MB up to files of about 500 million rows."""


class HashSpill:
    """64-bit key hashes and row positions written to partition files by the hash's top bits."""

    def __init__(self, folder: Path, partitions: int) -> None:
        self.bits = max(0, int(np.ceil(np.log2(max(partitions, 1)))))
        # Closed in `candidates`, which every caller reaches (the folder is temporary anyway).
        self.files = [open(folder / f"keys-{i}.bin", "ab") for i in range(1 << self.bits)]  # noqa: SIM115

    def add(self, hashes: np.ndarray, start: int) -> None:
        pairs = np.empty((len(hashes), 2), np.uint64)
        pairs[:, 0] = hashes
        pairs[:, 1] = np.arange(start, start + len(hashes), dtype=np.uint64)
        if not self.bits:
            pairs.tofile(self.files[0])
            return
        part = (hashes >> np.uint64(64 - self.bits)).astype(np.uint16)
        # One stable sort by partition (a radix sort for 16-bit keys), then one write a partition.
        order = np.argsort(part, kind="stable")
        grouped = pairs[order]
        bounds = np.searchsorted(part[order], np.arange(len(self.files) + 1))
        for index, (lower, upper) in enumerate(itertools.pairwise(bounds)):
            if upper > lower:
                grouped[lower:upper].tofile(self.files[index])

    def candidates(self) -> np.ndarray:
        """Positions whose hash occurs more than once (true duplicates and the rare collision)."""
        found: list[np.ndarray] = []
        for handle in self.files:
            handle.close()
            pairs = np.fromfile(handle.name, np.uint64).reshape(-1, 2)
            repeated = repeated_values(pairs[:, 0])
            if repeated.any():
                found.append(pairs[repeated, 1].astype(np.int64))
        return np.sort(np.concatenate(found)) if found else np.array([], np.int64)


def spill_partitions(path: str, first: Span) -> int:
    """How many hash partitions keep each near `PARTITION_ROWS` rows, estimated from the file's
    size and the first piece's bytes per row, within `FEWEST_PARTITIONS` and `MOST_PARTITIONS`."""
    per_row = first.size / max(1, first.rows)
    rows = os.path.getsize(path) / max(1.0, per_row)
    return int(min(MOST_PARTITIONS, max(FEWEST_PARTITIONS, rows // PARTITION_ROWS + 1)))
