"""Combining the files of one submission: the join and the stack against pandas, and their audits."""

from __future__ import annotations

import csv
from pathlib import Path

import pandas as pd
import pytest

from linter.limits import Limits
from linter.read import read_path
from linter.reshape.join_files import JoinFiles
from linter.reshape.normalise import StackFiles
from linter.reshape.recipe import Recipe
from linter.reshape.steps import RecipeError
from linter.reshape.tidy_files import combine, combining_step
from linter.table import Table

UNITS = Path(__file__).resolve().parents[2] / "sample_submissions" / "units"
FIELD = UNITS / "field" / "vb_field_readings.csv"
LAB = UNITS / "lab" / "vb_lab_results.csv"
MONTHS = sorted((UNITS / "monthly").glob("*.csv"))


def tables_of(*paths: Path) -> list[Table]:
    return [t for p in paths for t in read_path(str(p), Limits().read)]


def as_text(path: Path) -> pd.DataFrame:
    return pd.read_csv(path, dtype=str, keep_default_na=False, na_values=[""]).astype(object)


def filled_cells(*paths: Path) -> int:
    # Source: Python's csv module (RFC 4180 reader), counting non-empty fields independently of Weir.
    total = 0
    for path in paths:
        with path.open(newline="", encoding="utf-8") as handle:
            total += sum(1 for row in csv.reader(handle) for cell in row if cell != "")
    return total


def same_rows(ours: pd.DataFrame, theirs: pd.DataFrame, key: list[str]) -> None:
    left = ours.fillna("").astype(str).sort_values(key).reset_index(drop=True)
    right = theirs[list(ours.columns)].fillna("").astype(str).sort_values(key).reset_index(drop=True)
    pd.testing.assert_frame_equal(left, right, check_dtype=False)


def test_demo_pair_is_joined_like_pandas_outer_merge() -> None:
    tables = tables_of(FIELD, LAB)
    step = combining_step(tables)
    assert step == JoinFiles(("sample_id",))
    combined = combine(tables, Recipe.of([step]))
    # Source: pandas DataFrame.merge(how="outer") as the reference join.
    expected = as_text(FIELD).merge(as_text(LAB), on="sample_id", how="outer", validate="one_to_one")
    assert list(combined.output.columns) == list(expected.columns)
    same_rows(combined.output, expected, ["sample_id"])
    assert combined.audit.lossless
    assert combined.audit.input_cells == filled_cells(FIELD, LAB)


def test_demo_unmatched_sample_is_kept_and_listed() -> None:
    tables = tables_of(FIELD, LAB)
    combined = combine(tables, Recipe.of([JoinFiles(("sample_id",))]))
    field_ids = set(as_text(FIELD)["sample_id"])
    lab_ids = set(as_text(LAB)["sample_id"])
    lonely = field_ids ^ lab_ids  # computed from the files, not from Weir
    assert lonely, "the demo pair plants a sample missing from the lab file"
    assert {c["text"] for c in combined.one_file_only} == lonely
    row = combined.output[combined.output["sample_id"].isin(lonely)]
    assert len(row) == len(lonely) and row["nitrate_mg_l"].isna().all()


def test_demo_months_are_stacked_like_pandas_concat() -> None:
    tables = tables_of(*MONTHS)
    step = combining_step(tables)
    assert isinstance(step, StackFiles) and step.column == "month"
    combined = combine(tables, Recipe.of([step]))
    # Source: pandas.concat of the files, each given its month from the file name by hand.
    expected = pd.concat(
        [as_text(p).assign(month=p.stem.rsplit("_", 1)[1]) for p in MONTHS], ignore_index=True
    )
    same_rows(combined.output, expected, ["site_id", "read_on"])
    assert combined.audit.lossless
    assert combined.audit.input_cells == filled_cells(*MONTHS)


def penguins() -> pd.DataFrame:
    # Source: palmerpenguins package (Horst, Hill & Gorman), data/penguins.csv, an open dataset.
    import palmerpenguins

    path = Path(palmerpenguins.__file__).parent / "data" / "penguins.csv"
    return pd.read_csv(path, dtype=str, keep_default_na=False, na_values=[""]).astype(object)


def test_penguins_split_by_island_stack_back_like_concat(tmp_path: Path) -> None:
    data = penguins()
    paths = []
    for island, part in data.groupby("island", sort=True):
        path = tmp_path / f"penguins_{island}.csv"
        part.drop(columns="island").to_csv(path, index=False)
        paths.append(path)
    tables = tables_of(*paths)
    step = combining_step(tables)
    assert isinstance(step, StackFiles), step
    combined = combine(tables, Recipe.of([step]))
    # Source: pandas.concat, the island written back from each file's name.
    expected = pd.concat(
        [
            pd.read_csv(p, dtype=str, keep_default_na=False).assign(**{step.column: p.stem.split("_")[1]})
            for p in paths
        ],
        ignore_index=True,
    )
    pd.testing.assert_frame_equal(
        combined.output.fillna("").astype(str), expected.astype(str), check_dtype=False
    )
    assert sorted(combined.output[step.column].unique()) == sorted(data["island"].unique())
    assert combined.audit.lossless and combined.audit.input_cells == filled_cells(*paths)


def test_penguins_split_by_columns_join_back_like_outer_merge(tmp_path: Path) -> None:
    data = penguins()
    data.insert(0, "penguin_id", [f"P{i:04d}" for i in range(len(data))])  # synthetic key
    body = ["penguin_id", "bill_length_mm", "bill_depth_mm", "flipper_length_mm", "body_mass_g"]
    rest = ["penguin_id", "species", "island", "sex", "year"]
    first, second = tmp_path / "penguins_body.csv", tmp_path / "penguins_about.csv"
    data[body].to_csv(first, index=False)
    data[rest].iloc[5:].to_csv(second, index=False)  # five penguins only in the first file
    tables = tables_of(first, second)
    step = combining_step(tables)
    assert step == JoinFiles(("penguin_id",))
    combined = combine(tables, Recipe.of([step]))
    # Source: pandas DataFrame.merge(how="outer") of the same two files.
    expected = as_text(first).merge(as_text(second), on="penguin_id", how="outer")
    same_rows(combined.output, expected, ["penguin_id"])
    assert len(combined.output) == len(data)
    assert {c["text"] for c in combined.one_file_only} == set(data["penguin_id"].iloc[:5])
    assert combined.audit.lossless and combined.audit.input_cells == filled_cells(first, second)


def write(path: Path, text: str) -> Path:
    path.write_text(text, encoding="utf-8")
    return path


def test_key_only_in_second_file_becomes_a_row(tmp_path: Path) -> None:
    a = write(tmp_path / "field.csv", "sample_id,temp\nS1,7.1\nS2,8.0\n")
    b = write(tmp_path / "lab.csv", "sample_id,nitrate\nS1,1.2\nS3,0.4\n")
    combined = combine(tables_of(a, b), Recipe.of([JoinFiles(("sample_id",))]))
    rows = {r["sample_id"]: (r["temp"], r["nitrate"]) for r in combined.output.to_dict("records")}
    assert rows == {"S1": ("7.1", "1.2"), "S2": ("8.0", None), "S3": (None, "0.4")}
    assert sorted((c["file"].endswith("lab.csv"), c["text"]) for c in combined.one_file_only) == [
        (False, "S2"),
        (True, "S3"),
    ]
    assert combined.audit.lossless and combined.audit.input_cells == filled_cells(a, b)


def test_join_refuses_repeated_keys_and_unkeyed_shared_columns(tmp_path: Path) -> None:
    a = write(tmp_path / "a.csv", "id,x\n1,p\n1,q\n")
    b = write(tmp_path / "b.csv", "id,y\n1,r\n")
    with pytest.raises(RecipeError, match="one row per key"):
        combine(tables_of(a, b), Recipe.of([JoinFiles(("id",))]))
    c = write(tmp_path / "c.csv", "id,x\n1,p\n")
    d = write(tmp_path / "d.csv", "id,x,z\n1,p,s\n")
    with pytest.raises(RecipeError, match="not in the key"):
        combine(tables_of(c, d), Recipe.of([JoinFiles(("id",))]))


def test_unrelated_files_get_no_combining_step(tmp_path: Path) -> None:
    a = write(tmp_path / "sites.csv", "site_id,river\nVB-014,Vell\nVB-021,Marrow Beck\nVB-030,Tilly Brook\n")
    b = write(tmp_path / "gauges.csv", "gauge,model\nG1,float\nG2,radar\nG3,float\n")
    assert combining_step(tables_of(a, b)) is None


def test_columns_shared_beyond_the_key_merge_where_they_agree(tmp_path: Path) -> None:
    a = write(tmp_path / "field.csv", "sample_id,site_id,temp\nS1,VB-014,7.1\nS2,VB-021,8.0\nS3,VB-030,6.2\n")
    b = write(
        tmp_path / "lab.csv", "sample_id,site_id,nitrate\nS1,VB-014,1.2\nS2,VB-022,0.9\nS3,VB-030,0.4\n"
    )
    tables = tables_of(a, b)
    step = combining_step(tables)
    assert step == JoinFiles(("sample_id", "site_id"))
    combined = combine(tables, Recipe.of([step]))
    # Source: pandas DataFrame.merge(how="outer") on the same columns.
    expected = as_text(a).merge(as_text(b), on=["sample_id", "site_id"], how="outer")
    same_rows(combined.output, expected, ["sample_id", "site_id"])
    # S2's two site ids disagree: both rows stay, and both are listed as in one file only.
    assert sorted(c["text"] for c in combined.one_file_only) == ["S2", "S2", "VB-021", "VB-022"]
    assert combined.audit.lossless and combined.audit.input_cells == filled_cells(a, b)


def test_join_code_gives_the_same_table_as_the_step(tmp_path: Path) -> None:
    from linter.reshape.steps import STEPS

    a = write(tmp_path / "field.csv", "sample_id,temp\nS1,7.1\nS2,8.0\n")
    b = write(tmp_path / "lab.csv", "sample_id,nitrate\nS1,1.2\nS3,0.4\n")
    step = JoinFiles(("sample_id",))
    combined = combine(tables_of(a, b), Recipe.of([step]))
    scope: dict[str, object] = {"pd": pd, "parts": [as_text(a), as_text(b)]}
    exec("\n".join(STEPS["join_files"].code(step)), scope)  # the pandas code Weir shows the provider
    same_rows(combined.output, scope["df"], ["sample_id"])  # type: ignore[arg-type]


def test_files_a_contract_governs_are_not_stacked() -> None:
    from linter.contract.model import TableContract, Variable

    tables = tables_of(*MONTHS)
    columns = ("site_id", "read_on", "water_temp_c", "clarity")
    readings = TableContract(
        "readings", "one reading", ("site_id", "read_on"), tuple(Variable(c) for c in columns)
    )
    assert isinstance(combining_step(tables), StackFiles)
    # As in `weir check`: one file per month is then the agreed delivery, not a layout problem.
    assert combining_step(tables, [readings, readings]) is None


def test_three_files_about_the_same_samples_join_into_one(tmp_path: Path) -> None:
    a = write(tmp_path / "field.csv", "sample_id,temp\nS1,7.1\nS2,8.0\nS3,6.2\nS4,5.5\n")
    b = write(tmp_path / "lab.csv", "sample_id,nitrate\nS1,1.2\nS2,0.9\nS3,0.4\nS4,0.3\n")
    c = write(tmp_path / "bugs.csv", "sample_id,mayflies\nS1,12\nS2,3\nS3,0\n")
    tables = tables_of(a, b, c)
    step = combining_step(tables)
    assert step == JoinFiles(("sample_id",))
    combined = combine(tables, Recipe.of([step]))
    # Source: pandas DataFrame.merge(how="outer"), applied pairwise as the reference.
    expected = (
        as_text(a)
        .merge(as_text(b), on="sample_id", how="outer")
        .merge(as_text(c), on="sample_id", how="outer")
    )
    same_rows(combined.output, expected, ["sample_id"])
    assert [c["text"] for c in combined.one_file_only] == ["S4"]
    assert combined.audit.lossless and combined.audit.input_cells == filled_cells(a, b, c)


def test_check_finding_carries_the_join_tidy_applies() -> None:
    from linter.rules.subject import Subject
    from linter.rules.submission_units import split_over_files
    from linter.table import first_row_header

    tables = tables_of(FIELD, LAB)
    (finding,) = [
        f
        for f in split_over_files([Subject(t, first_row_header(t)) for t in tables])
        if f.rule == "units.split-over-files"
    ]
    assert finding.step == {"step": "join_files", "on": ["sample_id"]}
    assert JoinFiles.from_json(finding.step) == combining_step(tables)


def test_the_audit_catches_a_join_that_loses_a_row(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    import linter.reshape.join_files as join_module

    honest = join_module.join_two

    def inner_only(left, right, on):  # type: ignore[no-untyped-def]
        sheet, lone, merged = honest(left, right, on)
        keep = sheet.origin[on[0]].to_numpy() >= 0
        keep &= sheet.cells.notna().all(axis=1).to_numpy()  # as an inner join would: drop the lone units
        return sheet.with_frames(sheet.cells[keep], sheet.origin[keep], sheet.rows[keep]), lone, merged

    monkeypatch.setattr(join_module, "join_two", inner_only)
    a = write(tmp_path / "field.csv", "sample_id,temp\nS1,7.1\nS2,8.0\n")
    b = write(tmp_path / "lab.csv", "sample_id,nitrate\nS1,1.2\nS3,0.4\n")
    with pytest.raises(RecipeError, match=r"would lose 4 cell"):  # S2, 8.0, S3, 0.4
        combine(tables_of(a, b), Recipe.of([JoinFiles(("sample_id",))]))
