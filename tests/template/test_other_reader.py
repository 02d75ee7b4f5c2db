"""A second, independent workbook reader sees the same template Weir wrote and the same cells Weir reads."""

from __future__ import annotations

from datetime import date, datetime
from pathlib import Path

import pytest
from filling import FILLS, fill
from python_calamine import CalamineWorkbook, SheetVisibleEnum
from template_files import make_template

from linter.read import read_path
from linter.read.cells import number_text

# Source: calamine, a Rust reader of Office Open XML workbooks (ECMA-376 Part 1), via python-calamine;
# it shares no code with openpyxl, which wrote the workbook.


def calamine_text(value: object) -> str | None:
    """A calamine cell value as the text a provider sees (empty cells are "")."""
    if value == "":
        return None
    if isinstance(value, datetime):
        return value.date().isoformat() if value.time() == datetime.min.time() else value.isoformat()
    if isinstance(value, date):
        return value.isoformat()
    if isinstance(value, bool):
        return "TRUE" if value else "FALSE"
    if isinstance(value, int | float):
        return number_text(float(value))
    return str(value)


@pytest.mark.parametrize("name", ["sites", "stream-chemistry", "field-sheets"])
def test_calamine_reads_what_weir_reads(templates: dict[str, Path], tmp_path: Path, name: str) -> None:
    filled = fill(templates[name], tmp_path / f"{name}.xlsx", name, FILLS[name])
    workbook = CalamineWorkbook.from_path(str(filled))
    assert workbook.sheet_names[0] == name and "Instructions" in workbook.sheet_names
    theirs = [[calamine_text(v) for v in row] for row in workbook.get_sheet_by_name(name).to_python()]
    ours = next(t for t in read_path(str(filled)) if t.sheet == name)
    mine = [list(row) for row in ours.grid.itertuples(index=False, name=None)]
    assert theirs == mine
    # The dates typed into the template are real date cells, not text, for the other reader too.
    first_date = next((c for c, v in enumerate(FILLS[name][0]) if isinstance(v, date)), None)
    if first_date is not None:
        raw = workbook.get_sheet_by_name(name).to_python()[3][first_date]
        assert isinstance(raw, date)


def test_calamine_sees_the_long_list_sheet_hidden(tmp_path: Path) -> None:
    codes = [f"METHOD-{i:03d}" for i in range(40)]
    (tmp_path / "methods.yaml").write_text("\n".join(f"- {c}" for c in codes) + "\n", encoding="utf-8")
    (tmp_path / "c.yaml").write_text(
        "contract: lab-methods\nversion: 1\nobservational_unit: one method\nkeys: [method]\n"
        "variables:\n  method: {type: category, codes: methods.yaml}\n",
        encoding="utf-8",
    )
    workbook = CalamineWorkbook.from_path(str(make_template(tmp_path / "c.yaml", tmp_path / "t.xlsx")))
    meta = {m.name: m.visible for m in workbook.sheets_metadata}
    assert meta["Lists"] == SheetVisibleEnum.Hidden and meta["lab-methods"] == SheetVisibleEnum.Visible
    assert [row[0] for row in workbook.get_sheet_by_name("Lists").to_python()] == [
        "lab-methods.method",
        *codes,
    ]
