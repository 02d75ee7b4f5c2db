"""Random tidy tables made messy in the ways partners do come back tidy through `weir tidy`.

The messy forms are written here with plain Python (not with Weir's recipe steps), so the
search in `linter/reshape/search.py` must find its own way back. Where the mess is
recoverable the tidy CSV holds the same rows; in every case the audit accounts for every
non-empty input cell (kept or deliberately dropped, never lost).
Long runs: `pytest tests/reshape/test_tidy_recovers.py --hypothesis-profile=long`.
"""

from __future__ import annotations

import csv
import io
import json
from collections.abc import Callable
from pathlib import Path

from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st
from typer.testing import CliRunner

from linter.cli import app

Grid = list[list[str]]
RUNNER = CliRunner()
LONG_RUN = settings.default.max_examples > 100  # the "long" profile of tests/conftest.py
# The suite's 12 examples are the same on every run, so a CI result can be repeated; the long
# profile draws fresh ones. Known rare miss (about 0.4 % of 3x3 sideways tables): when each
# site's readings happen to lie in a band of their own, the numbers alone say "three variables".
QUICK = settings(
    max_examples=settings.default.max_examples if LONG_RUN else 12,
    deadline=None,
    database=None,
    derandomize=not LONG_RUN,
    suppress_health_check=[HealthCheck.too_slow],
)


@st.composite
def tidy_tables(draw: st.DrawFn) -> Grid:
    """One result per site and year; ids, years and results never look alike.

    At least three of each: with two header cells, "2021, 2022" across the top is as likely a
    pair of variables as values of one, so such a table is not recoverable by anyone.
    """
    sites = sorted(draw(st.sets(st.integers(1, 999), min_size=3, max_size=5)))
    years = sorted(draw(st.sets(st.integers(1990, 2030), min_size=3, max_size=4)))
    rows = [
        [f"VB-{s:03d}", str(y), f"{draw(st.integers(1, 999)) / 10:.1f}", "mg/L"] for s in sites for y in years
    ]
    return [["site_id", "year", "result", "unit"], *rows]


def spread(tidy: Grid) -> Grid:
    """Years across the top (values in headers); the constant unit goes into the title."""
    years = sorted({r[1] for r in tidy[1:]})
    sites = sorted({r[0] for r in tidy[1:]})
    value = {(r[0], r[1]): r[2] for r in tidy[1:]}
    return [["site_id", *years], *[[s, *[value[(s, y)] for y in years]] for s in sites]]


def titled(grid: Grid) -> Grid:
    width = len(grid[0])
    return [["Vell Basin Water Network: results (mg/L)", *[""] * (width - 1)], [""] * width, *grid]


def transposed(grid: Grid) -> Grid:
    return [list(column) for column in zip(*grid, strict=True)]


def gaps(tidy: Grid) -> Grid:
    """The site written once per block, blank below (as a person types a grouped list)."""
    out = [tidy[0][:3]]
    for i, row in enumerate(tidy[1:]):
        repeated = i > 0 and tidy[i][0] == row[0]
        out.append(["" if repeated else row[0], row[1], row[2]])
    return out


def packed(tidy: Grid) -> Grid:
    """Result and unit in one cell ("4.2 mg/L")."""
    return [["site_id", "year", "result"], *[[r[0], r[1], f"{r[2]} {r[3]}"] for r in tidy[1:]]]


MESSES: dict[str, tuple[Callable[[Grid], Grid], int]] = {
    # name -> (transformation, how many tidy columns survive it: the unit is left out of some)
    "spread": (spread, 3),
    "title+spread": (lambda t: titled(spread(t)), 3),
    "transpose": (lambda t: transposed(spread(t)), 3),
    "fill-gaps": (gaps, 3),
    "title+fill-gaps": (lambda t: titled(gaps(t)), 3),
    "pack": (packed, 4),
}


def as_csv(grid: Grid) -> str:
    buffer = io.StringIO()
    csv.writer(buffer, lineterminator="\n").writerows(grid)
    return buffer.getvalue()


def rows_as_value_sets(grid: Grid, width: int) -> list[tuple[str, ...]]:
    """Each row as its sorted non-empty values: column names and order do not matter."""
    return sorted(tuple(sorted(v for v in row[:width] if v)) for row in grid)


def tidy_through_cli(tmp_path: Path, grid: Grid) -> tuple[Grid, dict[str, object]]:
    source = tmp_path / "messy.csv"
    source.write_text(as_csv(grid), encoding="utf-8")
    out = tmp_path / "out"
    result = RUNNER.invoke(app, ["tidy", "--out", str(out), str(source)])
    assert result.exit_code == 0, result.output
    assert source.read_text(encoding="utf-8") == as_csv(grid)  # the input is untouched
    with open(out / "messy.csv", encoding="utf-8", newline="") as handle:
        tidy = list(csv.reader(handle))
    return tidy, json.loads((out / "audit.json").read_text(encoding="utf-8"))


def assert_every_cell_accounted(grid: Grid, audit: dict[str, object]) -> None:
    non_empty = sum(1 for row in grid for v in row if v.strip())
    counts = audit["counts"]
    assert isinstance(counts, dict)
    assert audit["lossless"] is True and audit["lost"] == [] and counts["lost"] == 0
    assert counts["input_cells"] == non_empty
    kept = sum(v for k, v in counts.items() if k.startswith("kept_"))
    dropped = sum(v for k, v in counts.items() if k.startswith("dropped_"))
    assert kept + dropped == non_empty  # every cell once: kept in some way, or dropped with a reason


def _results(values: list[str]) -> Grid:
    """A tidy table of three sites by four years (1990-1993) with these results in row order."""
    sites_years = [(f"VB-00{s}", str(y)) for s in (1, 2, 3) for y in range(1990, 1994)]
    return [
        ["site_id", "year", "result", "unit"],
        *[[s, y, v, "mg/L"] for (s, y), v in zip(sites_years, values, strict=True)],
    ]


@QUICK
@given(tidy=tidy_tables(), mess=st.sampled_from(sorted(MESSES)))
# Found by this test: sideways, VB-002 reads 0.1-0.2 and VB-003 0.3-0.4. Adjacent at the written
# precision, those ranges were taken for two variables, so the site ids stayed in the header.
@example(tidy=_results(["0.1"] * 7 + ["0.2", "0.3", "0.3", "0.3", "0.4"]), mess="transpose")
def test_recoverable_mess_comes_back_tidy(tidy: Grid, mess: str) -> None:
    import tempfile

    make, width = MESSES[mess]
    messy = make(tidy)
    with tempfile.TemporaryDirectory() as folder:
        output, audit = tidy_through_cli(Path(folder), messy)
    assert_every_cell_accounted(messy, audit)
    assert rows_as_value_sets(output[1:], len(output[0])) == rows_as_value_sets(tidy[1:], width)


@QUICK
@given(
    tidy=tidy_tables(),
    blanks=st.sets(st.tuples(st.integers(0, 30), st.integers(0, 5)), max_size=6),
    notes=st.lists(st.sampled_from(["Total", "n/a", "see note 3", "2026-03"]), max_size=2),
)
def test_any_mess_keeps_every_cell(tidy: Grid, blanks: set[tuple[int, int]], notes: list[str]) -> None:
    """Holes and stray notes make some tables unrecoverable; even then nothing is lost."""
    import tempfile

    messy = [list(row) for row in spread(tidy)]
    for r, c in blanks:
        if 0 < r < len(messy) and c < len(messy[r]):
            messy[r][c] = ""
    messy += [[note, *[""] * (len(messy[0]) - 1)] for note in notes]
    with tempfile.TemporaryDirectory() as folder:
        _, audit = tidy_through_cli(Path(folder), messy)
    assert_every_cell_accounted(messy, audit)
