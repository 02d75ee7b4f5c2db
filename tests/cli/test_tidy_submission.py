"""`weir tidy` over several files: combined table, recipe re-run, inputs untouched, bad arguments."""

from __future__ import annotations

import hashlib
import json
import shutil
from pathlib import Path

from typer.testing import CliRunner

from linter.cli import app

UNITS = Path(__file__).resolve().parents[2] / "sample_submissions" / "units"


def run(*args: str) -> tuple[int, str]:
    result = CliRunner().invoke(app, ["tidy", *args])
    return result.exit_code, result.output


def digests(folder: Path) -> dict[str, str]:
    return {
        str(p): hashlib.sha256(p.read_bytes()).hexdigest() for p in sorted(folder.rglob("*")) if p.is_file()
    }


def demo_copy() -> Path:
    shutil.copytree(UNITS, "units")
    return Path("units")


def test_field_and_lab_files_are_joined_and_inputs_untouched() -> None:
    units = demo_copy()
    before = digests(units)
    code, output = run(
        str(units / "field/vb_field_readings.csv"), str(units / "lab/vb_lab_results.csv"), "-o", "out"
    )
    assert code == 0, output
    assert digests(units) == before
    lines = Path("out/vb_field_readings.csv").read_text(encoding="utf-8").splitlines()
    assert lines[0] == "sample_id,site_id,sampled_on,water_temp_c,ph,nitrate_mg_l,phosphate_mg_l,lab"
    assert "VB-S0007,VB-021,2026-08-04,9.8,7.16,,," in lines
    audit = json.loads(Path("out/audit.json").read_text(encoding="utf-8"))
    assert audit["lossless"] is True and audit["counts"]["lost"] == 0
    assert [c["text"] for c in audit["one_file_only"]] == ["VB-S0007"]
    assert Path("out/files/vb_field_readings/vb_field_readings.csv").is_file()
    assert Path("out/files/vb_lab_results/audit.json").is_file()
    assert "one file only" in output


def test_monthly_folder_is_stacked_and_recipe_reruns() -> None:
    units = demo_copy()
    code, output = run(str(units / "monthly"), "-o", "out")
    assert code == 0, output
    (combined,) = Path("out").glob("*.csv")
    header, *rows = combined.read_text(encoding="utf-8").splitlines()
    assert header.split(",")[-1] == "month" and len(rows) == 10
    assert {r.rsplit(",", 1)[1] for r in rows} == {"2026-09", "2026-10"}
    recipe = json.loads(Path("out/recipe.json").read_text(encoding="utf-8"))
    assert [s["step"] for s in recipe["steps"]] == ["stack_files"]
    code, output = run(str(units / "monthly"), "-o", "again", "--recipe", "out/recipe.json")
    assert code == 0, output
    assert (Path("again") / combined.name).read_bytes() == combined.read_bytes()


def test_single_file_still_writes_beside_out_as_before() -> None:
    units = demo_copy()
    code, output = run(str(units / "field/vb_field_readings.csv"), "-o", "out")
    assert code == 0, output
    assert (
        Path("out/vb_field_readings.csv").read_bytes() == (units / "field/vb_field_readings.csv").read_bytes()
    )
    assert not Path("out/files").exists()


def test_bad_arguments_exit_2_with_one_line() -> None:
    units = demo_copy()
    Path("lonely").mkdir()
    shutil.copy(units / "lab/vb_lab_results.csv", "lonely/")
    Path("bad.json").write_text('{"weir_recipe": 1, "steps": [{"step": "glue"}]}', encoding="utf-8")
    field, lab = str(units / "field/vb_field_readings.csv"), str(units / "lab/vb_lab_results.csv")
    cases = [
        (field, "missing.csv", "-o", "out"),
        ("lonely", "-o", "out"),
        (field, field, "-o", "out"),
        (field, lab, "-o", "out", "--recipe", "bad.json"),
    ]
    for args in cases:
        code, output = run(*args)
        assert code == 2, (args, output)
        assert len(output.strip().splitlines()) == 1 and "Traceback" not in output, output
    assert not Path("out").exists()  # nothing half-written for a refused run


WIDE = "site_id,2023,2024\nVB-014,3,\nVB-015,1,0\n"


def test_files_reshaped_on_their_own_are_then_stacked() -> None:
    Path("in").mkdir()
    Path("in/counts_north.csv").write_text(WIDE, encoding="utf-8")
    Path("in/counts_south.csv").write_text(WIDE.replace("VB-01", "VB-02"), encoding="utf-8")
    code, output = run("in", "-o", "out")
    assert code == 0, output
    own = json.loads(Path("out/files/counts_north/recipe.json").read_text(encoding="utf-8"))
    assert [s["step"] for s in own["steps"]] == ["gather"]
    header, *rows = Path("out/counts.csv").read_text(encoding="utf-8").splitlines()
    assert header == "site_id,year,count,source"
    # Two sites x two years per file, the empty 2024 cell kept as an explicit missing value.
    assert len(rows) == 8 and "VB-014,2024,,north" in rows and "VB-025,2023,1,south" in rows
    assert json.loads(Path("out/audit.json").read_text(encoding="utf-8"))["lossless"] is True


def test_a_saved_recipe_that_does_not_fit_writes_nothing() -> None:
    units = demo_copy()
    Path("join.json").write_text(
        '{"weir_recipe": 1, "steps": [{"step": "join_files", "on": ["no_such_column"]}]}', encoding="utf-8"
    )
    field, lab = str(units / "field/vb_field_readings.csv"), str(units / "lab/vb_lab_results.csv")
    code, output = run(field, lab, "-o", "out", "--recipe", "join.json")
    assert code == 2 and "no_such_column" in output and len(output.strip().splitlines()) == 1, output
    assert not Path("out").exists()


def test_files_with_the_same_name_in_two_folders_exit_2() -> None:
    for folder in ("north", "south"):
        Path(folder).mkdir()
        Path(folder, "readings.csv").write_text("site_id,temp\nVB-014,7.1\nVB-021,8.0\n", encoding="utf-8")
    code, output = run("north/readings.csv", "south/readings.csv", "-o", "out")
    assert code == 2 and "readings" in output and len(output.strip().splitlines()) == 1, output
    assert not Path("out").exists()


def test_a_folder_of_unrelated_files_is_tidied_file_by_file() -> None:
    Path("in").mkdir()
    Path("in/sites.csv").write_text("site_id,river\nVB-014,Vell\nVB-021,Marrow Beck\n", encoding="utf-8")
    Path("in/gauges.csv").write_text("gauge,model\nG1,float\nG2,radar\n", encoding="utf-8")
    code, output = run("in", "-o", "out")
    assert code == 0, output
    assert "each was tidied on its own" in output
    assert sorted(p.name for p in Path("out/files").iterdir()) == ["gauges", "sites"]
    assert not Path("out/recipe.json").exists()
