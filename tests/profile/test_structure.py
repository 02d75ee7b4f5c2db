"""discovered_structure: what a bundle-contract draft gets for each table of the units demo."""

from __future__ import annotations

from pathlib import Path

from linter.profile.structure import discovered_structure
from linter.read import read_path
from linter.table import first_row_header


def test_structure_of_the_demo_tables(repo: Path) -> None:
    folder = repo / "sample_submissions" / "units"
    bodies = {
        p.stem: first_row_header(read_path(str(p))[0]).body
        for p in (folder / "vb_samples_with_sites.csv", folder / "lab" / "vb_lab_results.csv")
    }
    found = discovered_structure(bodies)
    mixed = found["vb_samples_with_sites"]
    assert ("site_id", "sampled_on") in mixed.keys.keys
    assert "latitude" in mixed.keys.measurements  # decimals identify nothing
    assert any(d.determinant == ("site_id",) and d.dependent == "river" for d in mixed.dependencies)
    assert mixed.split is not None
    assert [t.key for t in mixed.split.tables] == [("site_id", "sampled_on"), ("site_id",)]
    lab = found["vb_lab_results"]
    assert lab.keys.keys[0] == ("sample_id",) and lab.split is None  # 9 rows: too few to claim a mix
