"""Cells seen as bytes: what the kernels read is each cell's own UTF-8 text (Python's encoding)."""

from __future__ import annotations

import numpy as np
import pyarrow as pa
from hypothesis import given, settings
from hypothesis import strategies as st

from linter.scale.cell_bytes import FEW_OTHER_WIDTHS, cell_bytes, fixed_width_text, present

WIDTH = 3


@given(
    st.lists(st.text("ab", min_size=WIDTH, max_size=WIDTH), min_size=1, max_size=80),
    st.lists(st.text("abé", max_size=WIDTH + 2) | st.none(), max_size=30),
    st.randoms(use_true_random=False),
    st.integers(0, 2),
)
@settings(max_examples=200, deadline=None, derandomize=True)
def test_fixed_width_text_is_the_bytes_of_the_cells_of_that_width(shaped, others, random, cut) -> None:
    cells: list[str | None] = [*shaped, *others]
    random.shuffle(cells)
    chunk = pa.array(cells, pa.string()).slice(cut)  # a slice starts inside Arrow's buffers
    offsets, data = cell_bytes(chunk)
    chosen = present(chunk) & (np.diff(offsets) == WIDTH)
    text = fixed_width_text(offsets, data, chosen, WIDTH)
    # Reference: Python's own UTF-8 encoding of the cells WIDTH bytes long, in order.
    expected = [c.encode() for c in chunk.to_pylist() if c is not None and len(c.encode()) == WIDTH]
    assert [bytes(row) for row in text] == expected


def test_both_ways_of_joining_fixed_width_cells_are_taken() -> None:
    # Few cells of another width are cut out of the bytes; many make every cell gathered alone.
    for others in (1, len(range(0, 40, 2))):
        cells = ["abc"] * 40
        for place in range(0, 2 * others, 2):
            cells[place] = "a"
        chunk = pa.array(cells)
        offsets, data = cell_bytes(chunk)
        chosen = np.diff(offsets) == 3
        assert (others * FEW_OTHER_WIDTHS < len(cells)) is (others == 1)
        assert [bytes(r) for r in fixed_width_text(offsets, data, chosen, 3)] == [b"abc"] * (40 - others)
