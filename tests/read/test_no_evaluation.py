"""Weir never evaluates what a file or contract holds: formulas, macros and YAML object tags stay inert."""

from __future__ import annotations

import io
import zipfile
from pathlib import Path

import pytest
from openpyxl import Workbook

from linter.contract.load import load_contract
from linter.errors import WeirError
from linter.read import read_path


def workbook_with_stale_cache(path: Path) -> None:
    """A formula =1+1 whose saved (cached) value is 7: reading 2 would mean Weir calculated it."""
    book = Workbook()
    sheet = book.active
    assert sheet is not None
    sheet.append(["site_id", "result"])
    sheet.append(["VB-014", "=1+1"])
    raw = io.BytesIO()
    book.save(raw)
    with zipfile.ZipFile(raw) as source:
        members = {n: source.read(n) for n in source.namelist()}
    xml = members["xl/worksheets/sheet1.xml"].decode("utf-8")
    # Source: ECMA-376 Part 1 §18.3.1.40 (f, the formula) and §18.3.1.96 (v, the cell's value).
    assert "<f>1+1</f><v></v>" in xml or "<f>1+1</f><v />" in xml
    xml = xml.replace("<f>1+1</f><v></v>", "<f>1+1</f><v>7</v>").replace(
        "<f>1+1</f><v />", "<f>1+1</f><v>7</v>"
    )
    members["xl/worksheets/sheet1.xml"] = xml.encode("utf-8")
    with zipfile.ZipFile(path, "w") as target:
        for name, data in members.items():
            target.writestr(name, data)


def test_formulas_are_read_from_the_saved_value_never_calculated(tmp_path: Path) -> None:
    workbook_with_stale_cache(tmp_path / "book.xlsx")
    (table,) = read_path(str(tmp_path / "book.xlsx"))
    assert table.grid.iat[1, 1] == "7"


def test_formula_text_in_a_csv_stays_text(tmp_path: Path) -> None:
    # Common practice (no source): cells starting with = + - @ are run as formulas by spreadsheets.
    cells = ["=1+1", "+cmd|' /C calc'!A0", "@SUM(1)", "-2+3"]
    (tmp_path / "a.csv").write_text("note\n" + "\n".join(cells) + "\n", encoding="utf-8")
    (table,) = read_path(str(tmp_path / "a.csv"))
    assert list(table.grid.iloc[1:, 0]) == cells


def test_macros_are_never_even_read(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    book = Workbook()
    sheet = book.active
    assert sheet is not None
    sheet.append(["site_id"])
    sheet.append(["VB-014"])
    raw = io.BytesIO()
    book.save(raw)
    path = tmp_path / "macro.xlsm"
    with zipfile.ZipFile(raw) as source, zipfile.ZipFile(path, "w") as target:
        for name in source.namelist():
            target.writestr(name, source.read(name))
        # Source: [MS-OFFMACRO2] §2.2.1.4: the VBA project lives in xl/vbaProject.bin.
        target.writestr("xl/vbaProject.bin", b'Attribute VB_Name = "Auto_Open"')
    opened: list[str] = []
    real_open = zipfile.ZipFile.open

    def spy(self: zipfile.ZipFile, name: object, *args: object, **kwargs: object) -> object:
        opened.append(name if isinstance(name, str) else getattr(name, "filename", ""))
        return real_open(self, name, *args, **kwargs)  # type: ignore[arg-type]

    monkeypatch.setattr(zipfile.ZipFile, "open", spy)
    (table,) = read_path(str(path))
    assert table.grid.iat[1, 0] == "VB-014"
    assert "xl/worksheets/sheet1.xml" in opened  # the spy sees what is read...
    assert "xl/vbaProject.bin" not in opened  # ...and the macro project is never among it


@pytest.mark.parametrize(
    "tag",
    [
        "!!python/object/apply:os.system ['touch canary']",
        "!!python/object/new:pathlib.Path ['canary']",
        "!!python/name:os.system",
    ],
)
def test_yaml_tags_build_nothing(tmp_path: Path, tag: str) -> None:
    path = tmp_path / "c.yaml"
    path.write_text(f"contract: {tag}\nversion: 1\n", encoding="utf-8")
    with pytest.raises(WeirError, match="not allowed"):
        load_contract(str(path))
    assert not (tmp_path / "canary").exists()
