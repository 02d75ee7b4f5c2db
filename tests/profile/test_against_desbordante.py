"""Keys and exact dependencies agree exactly with the desbordante profiler on open datasets."""

from __future__ import annotations

import pandas as pd
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from reference_data import DATASETS

from linter.profile.dependencies import functional_dependencies
from linter.profile.keys import unique_combinations

desbordante = pytest.importorskip("desbordante")

MAX_LHS = 3


def reference_fds(frame: pd.DataFrame, max_lhs: int) -> set[tuple[frozenset[str], str]]:
    # Source: desbordante (package index), its default exact FD miner; empty cells are passed as ""
    # so that they equal each other, the same null semantics Weir documents (null = null).
    algorithm = desbordante.fd.algorithms.Default()
    algorithm.load_data(table=frame.fillna(""))
    algorithm.execute(max_lhs=max_lhs)
    names = list(frame.columns)
    return {(frozenset(names[i] for i in fd.lhs_indices), names[fd.rhs_index]) for fd in algorithm.get_fds()}


def reference_uccs(frame: pd.DataFrame, max_size: int) -> set[frozenset[str]]:
    # Source: desbordante (package index), its default unique-column-combination miner, run on the
    # columns without empty cells: Weir's stated null semantics keeps those out of every key.
    algorithm = desbordante.ucc.algorithms.Default()
    algorithm.load_data(table=frame)
    algorithm.execute()
    names = list(frame.columns)
    found = {frozenset(names[i] for i in ucc.indices) for ucc in algorithm.get_uccs()}
    return {u for u in found if len(u) <= max_size}


@pytest.mark.parametrize("sample_rows", [20_000, 60, 6])  # all rows; sample then confirm; two samples
@pytest.mark.parametrize("dataset", sorted(DATASETS))
def test_exact_dependencies_agree(dataset: str, sample_rows: int) -> None:
    frame = DATASETS[dataset]()
    found = functional_dependencies(frame, max_lhs=MAX_LHS, sample_rows=sample_rows)
    mine = {(frozenset(d.determinant), d.dependent) for d in found}
    assert mine == reference_fds(frame, MAX_LHS)
    assert mine, "every dataset here has at least one dependency; an empty result would hide a bug"


@pytest.mark.parametrize("dataset", sorted(DATASETS))
def test_minimal_unique_combinations_agree(dataset: str) -> None:
    frame = DATASETS[dataset]()
    search = unique_combinations(frame, max_size=3, sample_rows=100)  # small sample: verification path runs
    without_nulls = frame[[c for c in frame.columns if frame[c].notna().all()]]
    # Constant columns (penguins-raw has two) stay in for the reference: no minimal key can hold one.
    assert {frozenset(k) for k in search.keys} == reference_uccs(without_nulls, 3)


cells = st.sampled_from(["a", "b", "c", None])


@settings(max_examples=60, deadline=None)
@given(
    st.integers(1, 5).flatmap(
        lambda w: st.lists(st.lists(cells, min_size=w, max_size=w), min_size=1, max_size=12)
    )
)
def test_random_small_tables_agree(grid: list[list[str | None]]) -> None:
    # Source: desbordante as the oracle on random tables, including empty cells and duplicate rows.
    frame = pd.DataFrame(grid, columns=[f"c{i}" for i in range(len(grid[0]))], dtype=object)
    reference = reference_fds(frame, 4)
    for sample_rows in (20_000, 3):
        found = functional_dependencies(frame, max_lhs=4, sample_rows=sample_rows)
        assert {(frozenset(d.determinant), d.dependent) for d in found} == reference


@pytest.mark.parametrize("sample_rows", [20_000, 100])  # all rows; a sample's lower bound refutes first
@pytest.mark.parametrize("max_error", [0.01, 0.05])
@pytest.mark.parametrize("dataset", sorted(DATASETS))
def test_approximate_dependencies_agree(dataset: str, max_error: float, sample_rows: int) -> None:
    # Source: desbordante's TANE for approximate dependencies with the g3 measure (Huhtala et al. 1999).
    frame = DATASETS[dataset]()
    algorithm = desbordante.afd.algorithms.Tane()
    algorithm.load_data(table=frame.fillna(""))
    algorithm.execute(error=max_error, max_lhs=2, afd_error_measure="g3")
    names = list(frame.columns)
    reference = {
        (frozenset(names[i] for i in fd.lhs_indices), names[fd.rhs_index]) for fd in algorithm.get_fds()
    }
    found = functional_dependencies(frame, max_lhs=2, max_error=max_error, sample_rows=sample_rows)
    assert {(frozenset(d.determinant), d.dependent) for d in found} == reference
    assert all(d.breaking_rows <= max_error * len(frame) for d in found)


@settings(max_examples=60, deadline=None)
@given(
    st.integers(1, 5).flatmap(
        lambda w: st.lists(st.lists(cells, min_size=w, max_size=w), min_size=2, max_size=12)
    )
)
def test_random_small_tables_keys_agree(grid: list[list[str | None]]) -> None:
    # Source: desbordante as the oracle for minimal unique column combinations on random tables.
    frame = pd.DataFrame(grid, columns=[f"c{i}" for i in range(len(grid[0]))], dtype=object)
    without_nulls = frame[[c for c in frame.columns if frame[c].notna().all()]]
    search = unique_combinations(frame, max_size=5, sample_rows=3)
    expected = reference_uccs(without_nulls, 5) if len(without_nulls.columns) else set()
    assert {frozenset(k) for k in search.keys} == expected
