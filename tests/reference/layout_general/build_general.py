"""Writes the broad invented layout corpus: each case's messy input beside its hand-made tidy form.

Every case is written out literally in the `cases_*` modules (messy rows and the tidy rows a
careful analyst would produce), never derived by Weir's own reshaping code. Spreadsheet cases
with merged cells or stacked headers are written as `input.xlsx` with openpyxl. Run
`python tests/reference/layout_general/build_general.py` from the repo root to regenerate; the
cases are committed so the scorer never depends on this script.
"""

from __future__ import annotations

import csv
import shutil
import sys
from pathlib import Path

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE))

import cases_combo  # noqa: E402
import cases_edges  # noqa: E402
import cases_extra  # noqa: E402
import cases_large  # noqa: E402
import cases_more  # noqa: E402
import cases_packed  # noqa: E402
import cases_pivot  # noqa: E402
import cases_rows  # noqa: E402
import cases_tidy  # noqa: E402
import cases_wide  # noqa: E402
from corpus_case import CASES, Case  # noqa: E402


def write_csv(path: Path, rows: list[list[str]]) -> None:
    # Spreadsheet exports pad every line to the table's width; so do we.
    width = max(len(row) for row in rows)
    with path.open("w", newline="", encoding="utf-8") as handle:
        csv.writer(handle, lineterminator="\n").writerows(row + [""] * (width - len(row)) for row in rows)


def write_case(case: Case) -> None:
    folder = HERE / case.name
    if folder.exists():
        shutil.rmtree(folder)
    folder.mkdir()
    if case.workbook is not None:
        case.workbook().save(folder / "input.xlsx")
    else:
        write_csv(folder / "input.csv", case.messy)
    write_csv(folder / "expected.csv", case.tidy)
    why = case.why.replace('"', "'")
    (folder / "case.yaml").write_text(
        f'family: {case.family}\nsource_style: {case.style}\nwhy: "{why}"\n', encoding="utf-8"
    )


def main() -> None:
    for module in (
        cases_wide,
        cases_packed,
        cases_rows,
        cases_edges,
        cases_combo,
        cases_more,
        cases_extra,
        cases_large,
        cases_pivot,
        cases_tidy,
    ):
        module.register()
    for case in CASES:
        write_case(case)
    print(f"wrote {len(CASES)} cases")


if __name__ == "__main__":
    main()
