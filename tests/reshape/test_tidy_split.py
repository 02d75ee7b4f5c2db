"""`weir tidy` on the units demo: a table mixing two units is written as two tables that join back."""

from __future__ import annotations

import json
import shutil
from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app


def test_tidy_writes_one_table_per_unit_and_audits_the_join(repo: Path, tmp_path: Path) -> None:
    source = tmp_path / "vb_samples_with_sites.csv"
    shutil.copy(repo / "sample_submissions" / "units" / "vb_samples_with_sites.csv", source)
    before = source.read_bytes()
    result = CliRunner().invoke(app, ["tidy", str(source), "--out", "tidy"])
    assert result.exit_code == 0, result.output
    # The one-table answer stays where it always is: the file is already one tidy table.
    assert (tmp_path / "tidy" / "vb_samples_with_sites.csv").read_bytes() == before
    # Beside it, the same table in normal form: one table per observational unit.
    by_unit = tmp_path / "tidy" / "vb_samples_with_sites.by-unit"
    sites = (by_unit / "sites.csv").read_text(encoding="utf-8").splitlines()
    samples = (by_unit / "vb_samples_with_sites.csv").read_text(encoding="utf-8").splitlines()
    assert sites[0] == "site_id,site_name,river,latitude,longitude" and len(sites) == 6
    assert samples[0] == "site_id,sampled_on,water_temp_c,nitrate_mg_l" and len(samples) == 31
    audit = json.loads((by_unit / "audit.json").read_text(encoding="utf-8"))
    assert audit["lossless"] and audit["join"]["lossless"]
    assert audit["join"]["joined_rows"] == audit["join"]["input_rows"] == 30
    assert audit["counts"]["dropped_repeat"] == 100  # 25 repeated site rows x 4 site columns
    recipe = json.loads((by_unit / "recipe.json").read_text(encoding="utf-8"))
    assert recipe["steps"][-1]["step"] == "split_by_unit"
    assert source.read_bytes() == before

    again = CliRunner().invoke(
        app, ["tidy", str(source), "--out", "again", "--recipe", str(by_unit / "recipe.json")]
    )
    assert again.exit_code == 0, again.output  # the saved recipe re-runs to the same tables
    assert (tmp_path / "again" / "sites.csv").read_text(encoding="utf-8").splitlines() == sites


def test_tidy_refuses_a_split_that_would_lose_values(repo: Path, tmp_path: Path) -> None:
    source = tmp_path / "slip.csv"
    shutil.copy(repo / "sample_submissions" / "units" / "vb_samples_river_slip.csv", source)
    recipe = {
        "weir_recipe": 1,
        "steps": [
            {
                "step": "split_by_unit",
                "tables": [
                    {"name": "sites", "key": ["site_id"], "columns": ["site_id", "site_name", "river"]},
                    {
                        "name": "samples",
                        "key": ["site_id", "sampled_on"],
                        "columns": [
                            "site_id",
                            "sampled_on",
                            "latitude",
                            "longitude",
                            "water_temp_c",
                            "nitrate_mg_l",
                        ],
                    },
                ],
            }
        ],
    }
    (tmp_path / "split.json").write_text(json.dumps(recipe), encoding="utf-8")
    result = CliRunner().invoke(app, ["tidy", str(source), "--out", "out", "--recipe", "split.json"])
    assert result.exit_code == 2
    assert "share a site_id but differ in site_name, river" in result.output
    assert "Traceback" not in result.output and not (tmp_path / "out" / "sites.csv").exists()
