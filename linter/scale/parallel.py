"""Read and inspect many submitted files in worker processes started once for the whole run."""

from __future__ import annotations

import multiprocessing
from collections.abc import Sequence
from concurrent.futures import ProcessPoolExecutor

from linter.check import (
    FileOutcome,
    FileProgress,
    needs_other_tables,
    read_governed,
    table_result,
)
from linter.contract.model import Contract
from linter.limits import Limits

_contracts: Sequence[Contract] = ()
_bounds = Limits()


def _remember(contracts: Sequence[Contract], bounds: Limits) -> None:
    """Worker start-up: the contracts and limits travel once per worker, not once per file."""
    global _contracts, _bounds
    import linter.rules.catalogue  # noqa: F401  (registers every rule family in the worker)

    _contracts, _bounds = contracts, bounds


def _outcome(path: str) -> FileOutcome:
    read = read_governed(path, _contracts, _bounds)
    results = tuple(
        None if needs_other_tables(g.rules) else table_result(g, g.subjects(), _bounds) for g in read.governed
    )
    return FileOutcome(read.governed, read.unreadable, results)


def outcomes_in_parallel(
    files: Sequence[str],
    contracts: Sequence[Contract],
    bounds: Limits,
    jobs: int,
    progress: FileProgress | None = None,
) -> list[FileOutcome]:
    """Each file's outcome, in the order of `files`, computed by `jobs` worker processes."""
    # spawn, not fork: Arrow's and pandas' thread pools in this process must not be copied mid-work.
    context = multiprocessing.get_context("spawn")
    chunk = max(1, min(16, len(files) // (jobs * 4)))
    with ProcessPoolExecutor(
        jobs, mp_context=context, initializer=_remember, initargs=(contracts, bounds)
    ) as pool:
        outcomes: list[FileOutcome] = []
        for path, outcome in zip(files, pool.map(_outcome, files, chunksize=chunk), strict=True):
            outcomes.append(outcome)
            if progress is not None:
                progress.done(path)
    return outcomes
