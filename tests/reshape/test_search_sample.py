"""Large tables: the recipe is searched on a sample, then its row lists come from every row."""

from __future__ import annotations

from pathlib import Path

import pytest

from linter.read import read_path
from linter.reshape import search_sample
from linter.reshape.search import search


@pytest.fixture()
def small_sample(monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setattr(search_sample, "SAMPLE_HEAD", 40)
    monkeypatch.setattr(search_sample, "SAMPLE_TAIL", 10)


def sectioned(reaches: int, per_reach: int) -> str:
    lines = ["site_id,ph,nitrate"]
    for r in range(reaches):
        lines.append(f"Reach {chr(65 + r)},,")
        lines += [f"VB-{r:02d}{k:03d},7.{k % 10},1.{k % 7}" for k in range(per_reach)]
    lines.append("Note: provisional values from the spring round")
    return "\n".join(lines) + "\n"


def test_titles_beyond_the_sample_are_lifted_from_every_row(small_sample: None) -> None:
    Path("big.csv").write_text(sectioned(4, 60), encoding="utf-8")
    table = read_path("big.csv")[0]
    found = search_sample.search_large(table)
    steps = {s["step"]: s for s in found.best.steps}
    assert len(steps["lift_titles"]["rows"]) == 4  # the sample alone holds only the first title
    out = found.best.output
    assert len(out) == 240
    assert out.loc[out["site_id"] == "VB-03059", "section"].tolist() == ["Reach D"]
    assert found.best.output.equals(search(table).best.output)  # same answer as the full search


def test_small_tables_are_searched_whole() -> None:
    Path("small.csv").write_text(sectioned(2, 3), encoding="utf-8")
    table = read_path("small.csv")[0]
    assert search_sample.search_large(table).best.steps == search(table).best.steps
