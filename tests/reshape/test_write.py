"""Writing the tidy result: RFC 4180 CSV, recipe and audit JSON; inputs are never overwritten."""

from __future__ import annotations

import csv
import json
from pathlib import Path

import pytest
from reshape_cases import recipe_json, table_of

from linter.errors import WeirError
from linter.reshape.recipe import Recipe, load_recipe
from linter.reshape.tidy import tidy_with_recipe
from linter.reshape.write import csv_text, write_tidy

GATHER = recipe_json({"step": "gather", "columns": ["2024", "2025"], "names_to": "year", "values_to": "note"})


def test_tidy_table_recipe_audit_and_code_are_written(tmp_path: Path) -> None:
    source = tmp_path / "in" / "vb_notes.csv"
    source.parent.mkdir()
    source.write_text("kept as is\n", encoding="utf-8")
    table = table_of([["site", "2024", "2025"], ["VB-014", 'ice, "thin"', "dry\nbed"]], source=str(source))
    recipe = Recipe.from_json(GATHER)
    reshaped, audit = tidy_with_recipe(table, recipe)
    written = write_tidy(tmp_path / "out", table, reshaped, audit, recipe)
    assert source.read_text(encoding="utf-8") == "kept as is\n"
    raw = written.tables[0].read_bytes()
    # Source: RFC 4180 §2 rules 1, 6 and 7: CRLF records; a field holding a comma, a double
    # quote or a line break is enclosed in double quotes, and inner quotes are doubled.
    assert raw.startswith(b"site,year,note\r\n")
    assert b'"ice, ""thin"""' in raw and b'"dry\nbed"' in raw
    with written.tables[0].open(newline="", encoding="utf-8") as handle:
        rows = list(csv.reader(handle))  # Python's csv module as the independent reader
    assert rows == [
        ["site", "year", "note"],
        ["VB-014", "2024", 'ice, "thin"'],
        ["VB-014", "2025", "dry\nbed"],
    ]
    assert load_recipe(written.recipe) == recipe
    audit_data = json.loads(written.audit.read_text(encoding="utf-8"))
    assert audit_data["lossless"] is True and audit_data["outputs"]["vb_notes"]["rows"] == 2
    assert written.code is not None and "df.melt(" in written.code.read_text(encoding="utf-8")


def test_lossy_recipe_writes_the_audit_but_no_tidy_table(tmp_path: Path) -> None:
    table = table_of([["site", "n"], ["VB-014", "3"]])
    recipe = Recipe.from_json(recipe_json({"step": "drop_rows", "rows": [2], "reason": "blank"}))
    reshaped, audit = tidy_with_recipe(table, recipe)
    written = write_tidy(tmp_path / "out", table, reshaped, audit, recipe)
    assert written.tables == () and not list((tmp_path / "out").glob("*.csv"))
    lost = json.loads(written.audit.read_text(encoding="utf-8"))["lost"]
    assert [(c["row"], c["column"], c["text"]) for c in lost] == [(2, "A", "VB-014"), (2, "B", "3")]
    forced = write_tidy(tmp_path / "forced", table, reshaped, audit, recipe, allow_loss=True)
    assert len(forced.tables) == 1


def test_output_that_would_overwrite_the_input_is_refused(tmp_path: Path) -> None:
    source = tmp_path / "vb_counts.csv"
    source.write_bytes(b"site,n\r\nVB-014,3\r\n")
    table = table_of([["site", "n"], ["VB-014", "3"]], source=str(source))
    reshaped, audit = tidy_with_recipe(table, Recipe())
    with pytest.raises(WeirError, match="refusing to overwrite the input"):
        write_tidy(tmp_path, table, reshaped, audit, Recipe())
    assert source.read_bytes() == b"site,n\r\nVB-014,3\r\n"


def test_output_folder_that_is_a_file_is_a_clear_error(tmp_path: Path) -> None:
    (tmp_path / "out").write_text("x", encoding="utf-8")
    table = table_of([["a"], ["1"]])
    reshaped, audit = tidy_with_recipe(table, Recipe())
    with pytest.raises(WeirError, match="is a file, not a folder"):
        write_tidy(tmp_path / "out", table, reshaped, audit, Recipe())


def test_already_tidy_table_is_written_unchanged() -> None:
    table = table_of([["site", "n"], ["VB-014", "3"], ["VB-015", None]])
    reshaped, audit = tidy_with_recipe(table, Recipe())
    assert audit.lossless
    assert csv_text(reshaped.tables["vb_counts"]) == "site,n\r\nVB-014,3\r\nVB-015,\r\n"


def test_origins_file_names_the_input_cell_of_every_output_cell(tmp_path: Path) -> None:
    table = table_of([["site", "2024", "2025"], ["VB-014", "3", "4"]], rows=(3, 4))
    recipe = Recipe.from_json(
        recipe_json(
            {"step": "add_row_id", "name": "line"},
            {"step": "gather", "columns": ["2024", "2025"], "names_to": "year", "values_to": "n"},
        )
    )
    reshaped, audit = tidy_with_recipe(table, recipe)
    written = write_tidy(tmp_path / "out", table, reshaped, audit, recipe, with_origins=True)
    with written.origins[0].open(newline="", encoding="utf-8") as handle:
        rows = list(csv.reader(handle))
    assert rows == [
        ["line", "site", "year", "n"],
        ["", "A4", "B3 (header)", "B4"],
        ["", "A4", "C3 (header)", "C4"],
    ]
