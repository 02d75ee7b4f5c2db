"""A wall-clock bound on one piece of work, so that no single submitted file can hang a run."""

from __future__ import annotations

import signal
import threading
from collections.abc import Iterator
from contextlib import contextmanager
from types import FrameType


class TimedOut(BaseException):
    """The time limit passed. A BaseException so that no `except Exception` on the way swallows it."""


@contextmanager
def time_limit(seconds: float) -> Iterator[None]:
    """Raise TimedOut in the block after `seconds` (0 = no limit).

    Uses SIGALRM, so it bounds only the main thread on POSIX systems; elsewhere it does nothing.
    Work inside one long C call (a huge regular expression, say) is interrupted when it returns.
    """
    usable = (
        seconds > 0 and hasattr(signal, "setitimer") and threading.current_thread() is threading.main_thread()
    )
    if not usable:
        yield
        return

    def on_alarm(signum: int, frame: FrameType | None) -> None:
        raise TimedOut()

    previous = signal.signal(signal.SIGALRM, on_alarm)
    signal.setitimer(signal.ITIMER_REAL, seconds)
    try:
        yield
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, previous)
