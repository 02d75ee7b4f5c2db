"""Let a large check reuse the memory it frees instead of asking the system for it again.

glibc hands every freed block above its mmap threshold (128 KB at first) back to the system
at once, so each batch's numpy arrays of a large file page-fault afresh: a third of the time of
hashing 5M keys in a new process. On glibc the thresholds are raised once, before the first
large file; elsewhere nothing changes. Peak memory is what `benchmarks/scale.py` reports.
"""

from __future__ import annotations

import ctypes
import platform
from functools import cache

M_TRIM_THRESHOLD = -1
M_TOP_PAD = -2
M_MMAP_THRESHOLD = -3
KEPT_BYTES = 64 * 1024 * 1024
"""Blocks up to this size come from the reused heap; freed memory up to it is kept."""


@cache
def reuse_freed_memory() -> bool:
    """Raise glibc's thresholds for this process; True when they were raised."""
    if platform.system() != "Linux" or platform.libc_ver()[0] != "glibc":
        return False
    try:
        libc = ctypes.CDLL("libc.so.6")
    except OSError:
        return False
    done = [libc.mallopt(option, KEPT_BYTES) for option in (M_MMAP_THRESHOLD, M_TRIM_THRESHOLD, M_TOP_PAD)]
    return all(done)
