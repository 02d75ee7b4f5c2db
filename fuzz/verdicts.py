"""What the fuzz targets share: one reusable scratch file, and which outcomes count as clean."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

SCRATCH = Path(tempfile.mkdtemp(prefix="weir-fuzz-"))


def scratch_file(name: str, data: bytes) -> str:
    """Write `data` to a reused file in a private temporary folder (never in the repository)."""
    path = SCRATCH / name
    with open(path, "wb") as handle:
        handle.write(data)
    return os.fspath(path)
