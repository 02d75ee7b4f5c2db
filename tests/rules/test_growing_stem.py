"""The incremental stem used on long header runs agrees with `shared_stem` on every run length."""

from __future__ import annotations

import time

from hypothesis import given, settings
from hypothesis import strategies as st

from linter.rules.layout_signals import GrowingStem, shared_stem

label = st.builds(
    lambda head, number, tail: f"{head}{number}{tail}",
    st.sampled_from(["wk", "wk1", "site_", "", "Q", "x"]),
    st.one_of(st.integers(0, 30).map(str), st.sampled_from(["", "a", "1a", "٣"])),
    st.sampled_from(["", "_mg", "0", "_1", "b"]),
)


@settings(max_examples=300, deadline=None, database=None)
@given(labels=st.lists(label, min_size=2, max_size=12))
def test_growing_stem_matches_the_plain_one(labels: list[str]) -> None:
    growing = GrowingStem(labels[0])
    for end in range(2, len(labels) + 1):
        got = growing.add(labels[end - 1])
        assert got == shared_stem(labels[:end])
        if got is None:
            break  # the caller stops extending a run at its first None


def test_ten_thousand_headers_are_linear() -> None:
    labels = [f"c{i}" for i in range(10_000)]
    start = time.perf_counter()
    growing = GrowingStem(labels[0])
    assert all(growing.add(name) == ("c", "") for name in labels[1:])
    # Common practice (no source): the plain recomputation took minutes here; a linear pass is
    # far below a second even on a shared machine.
    assert time.perf_counter() - start < 2.0
