"""A progress bar over the bytes of a submission (rate and time left), shown only on a terminal.

It appears once a check has run for `DELAY_SECONDS`, so quick checks (the pre-commit hook) never
flash a bar; piped or redirected output gets none at all.
"""

from __future__ import annotations

import os
import time
from collections.abc import Iterator, Sequence
from contextlib import contextmanager

from rich.console import Console
from rich.progress import (
    BarColumn,
    DownloadColumn,
    Progress,
    TaskID,
    TextColumn,
    TimeRemainingColumn,
    TransferSpeedColumn,
)

DELAY_SECONDS = 2.0


class BytesMeter:
    """Counts how much of each file has been checked; drives a rich bar once the wait is long."""

    def __init__(self, sizes: dict[str, int], bar: Progress | None, delay: float = DELAY_SECONDS) -> None:
        self.sizes = sizes
        self.counted: dict[str, int] = dict.fromkeys(sizes, 0)
        self.bar = bar
        self.task: TaskID | None = None
        self.started = time.monotonic()
        self.delay = delay

    @property
    def total(self) -> int:
        return sum(self.counted.values())

    def part(self, path: str, fraction: float) -> None:
        """`fraction` (0..1) of the file at `path` has now been checked."""
        size = self.sizes.get(path, 0)
        self.counted[path] = max(self.counted.get(path, 0), min(size, int(size * fraction)))
        self._show()

    def done(self, path: str) -> None:
        self.part(path, 1.0)

    def _show(self) -> None:
        if self.bar is None:
            return
        if self.task is None:
            if time.monotonic() - self.started < self.delay:
                return
            self.bar.start()
            self.task = self.bar.add_task("checking", total=sum(self.sizes.values()))
        self.bar.update(self.task, completed=self.total)


def size_of(path: str) -> int:
    """The file's size, or 0 when it cannot be seen (the reader then reports why)."""
    try:
        return os.stat(path).st_size
    except OSError:
        return 0


@contextmanager
def bytes_meter(files: Sequence[str], console: Console) -> Iterator[BytesMeter]:
    """A meter for `files`; its bar is drawn only when `console` is a terminal."""
    sizes = {path: size_of(path) for path in files}
    if not console.is_terminal:
        yield BytesMeter(sizes, None)
        return
    bar = Progress(
        TextColumn("[progress.description]{task.description}"),
        BarColumn(),
        DownloadColumn(),
        TransferSpeedColumn(),
        TimeRemainingColumn(),
        console=console,
        transient=True,
        auto_refresh=True,
    )
    meter = BytesMeter(sizes, bar)
    try:
        yield meter
    finally:
        if meter.task is not None:
            bar.stop()
