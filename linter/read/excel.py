"""Excel workbooks (.xlsx/.xlsm) read sheet by sheet from cached values, with what the sheet hides."""

from __future__ import annotations

import re
import zipfile
from collections.abc import Iterator
from dataclasses import replace
from datetime import datetime

import pandas as pd
from openpyxl import load_workbook
from openpyxl.cell.cell import Cell
from openpyxl.cell.read_only import ReadOnlyCell
from openpyxl.worksheet._read_only import ReadOnlyWorksheet
from openpyxl.worksheet.worksheet import Worksheet

from linter.read.cells import cell_text
from linter.read.errors import UnreadableFile, too_many_cells
from linter.read.formulas import uncached_formulas
from linter.read.limits import ReadLimits
from linter.table import ReadNote, Table, column_letter

ZERO_PADDED = re.compile(r"0+")
"""A number format of zeros only (`000`) shows 7 as 007: the provider sees the zeros."""


SHEET_PART = re.compile(r"xl/(worksheets|chartsheets)/[^/]+\.xml")
"""Where a workbook archive keeps each sheet's part (ECMA-376 Part 1 §12.3.24, §12.3.2)."""

ARCHIVE_ERRORS = (zipfile.BadZipFile, NotImplementedError, EOFError, OSError, ValueError, KeyError)
"""What zipfile raises for a damaged archive (bad offsets even surface as OSError from seek)."""


def is_workbook(path: str) -> bool:
    """A ZIP archive is an Office Open XML workbook when it holds `xl/workbook.xml` (ECMA-376 Part 2)."""
    try:
        with zipfile.ZipFile(path) as archive:
            return "xl/workbook.xml" in archive.namelist()
    except ARCHIVE_ERRORS as error:
        raise corrupt(f"its ZIP archive is damaged ({type(error).__name__}: {error})") from None


def check_archive(path: str, limits: ReadLimits) -> int:
    """Refuse a zip bomb from the sizes the archive declares, before anything is inflated.

    Returns the declared inflated size, which decides whether the workbook is streamed.
    """
    try:
        with zipfile.ZipFile(path) as archive:
            members = archive.infolist()
    except ARCHIVE_ERRORS as error:
        raise corrupt(f"its ZIP archive is damaged ({type(error).__name__}: {error})") from None
    sheets = sum(1 for m in members if SHEET_PART.fullmatch(m.filename))
    if sheets > limits.max_sheets:
        raise UnreadableFile(
            "file.too-many-sheets",
            f"The workbook holds {sheets:,} worksheets, more than the limit of {limits.max_sheets:,}.",
            "Send one workbook per table, or only the sheets that hold the data.",
        )
    total = sum(m.file_size for m in members)
    ratios = [m.file_size / max(m.compress_size, 1) for m in members if m.file_size > 1 << 20]
    if total > limits.max_uncompressed_bytes or any(r > limits.max_compression_ratio for r in ratios):
        raise UnreadableFile(
            "file.zip-bomb",
            f"The workbook would inflate to {total:,} bytes (limit {limits.max_uncompressed_bytes:,}, "
            f"ratio limit {limits.max_compression_ratio}:1), so it was not opened.",
            "Send the data as a plain CSV file, or a workbook saved normally by a spreadsheet program.",
        )
    return total


def corrupt(reason: str) -> UnreadableFile:
    return UnreadableFile(
        "file.corrupt",
        f"The workbook cannot be opened: {reason}.",
        "Open the file in a spreadsheet program, save it again as .xlsx (or CSV UTF-8) and resend it.",
    )


def shown_text(cell: Cell | ReadOnlyCell) -> str | None:
    """A cell's cached value as the provider reads it: ISO dates, no float noise, padded zeros kept."""
    value = cell.value
    fmt = str(cell.number_format or "General")
    if isinstance(value, datetime):
        bare = re.sub(r'"[^"]*"|\[[^\]]*\]', "", fmt).lower()
        return cell_text(value, date_only="h" not in bare and "s" not in bare)
    padded = isinstance(value, int | float) and not isinstance(value, bool) and ZERO_PADDED.fullmatch(fmt)
    if padded and float(value).is_integer() and value >= 0:
        return str(int(value)).zfill(len(fmt))
    return cell_text(value)


def written_cells(ws: Worksheet | ReadOnlyWorksheet) -> Iterator[tuple[int, int, Cell | ReadOnlyCell]]:
    """Every cell the file writes, with its 1-based row and column."""
    if isinstance(ws, ReadOnlyWorksheet):
        ws.reset_dimensions()  # the stated dimensions may be wrong; read to the real end
        for row in ws.iter_rows():
            for cell in row:
                if isinstance(cell, ReadOnlyCell):
                    yield cell.row, cell.column, cell
        return
    # openpyxl keeps only the cells written in the file; walking them avoids visiting the
    # million empty rows a stray format can add to `max_row`.
    for (row, col), cell in ws._cells.items():
        yield row, col, cell


def hidden_sheet(ws: Worksheet | ReadOnlyWorksheet) -> list[ReadNote]:
    if ws.sheet_state == "visible":
        return []
    return [ReadNote("hidden-sheet", f"The sheet {ws.title!r} is {ws.sheet_state}.")]


def read_sheet(ws: Worksheet | ReadOnlyWorksheet, path: str, limits: ReadLimits) -> Table | None:
    """One worksheet as a Table, or None when the sheet holds nothing."""
    texts: dict[tuple[int, int], str] = {}
    for row, col, cell in written_cells(ws):
        text = shown_text(cell)
        if text is not None:
            texts[(row, col)] = text
            if len(texts) > limits.max_cells:
                raise too_many_cells(limits)
    if not texts:
        return None
    last_row = max(r for r, _ in texts)
    last_col = max(c for _, c in texts)
    if last_col > limits.max_columns or last_row > limits.max_rows:
        raise UnreadableFile(
            "file.too-many-columns" if last_col > limits.max_columns else "file.too-many-rows",
            f"Sheet {ws.title!r} reaches {column_letter(last_col - 1)}{last_row}, beyond the limits of "
            f"{limits.max_columns:,} columns and {limits.max_rows:,} rows.",
            "Remove stray content far from the table, or split the submission.",
        )
    used = sorted({r for r, _ in texts})
    grid = pd.DataFrame([[texts.get((r, c)) for c in range(1, last_col + 1)] for r in used], dtype=object)
    notes: list[ReadNote] = []
    blank = sorted(set(range(used[0], used[-1] + 1)) - set(used))
    if blank:
        notes.append(ReadNote("blank-rows", "Blank rows inside the table.", rows=tuple(blank)))
    if isinstance(ws, ReadOnlyWorksheet):
        notes.append(
            ReadNote(
                "streamed-workbook",
                "The workbook is large, so it was read in streaming mode: merged cells and hidden "
                "rows and columns were not checked.",
            )
        )
        return Table(path, ws.title, grid, tuple(used), format="xlsx", notes=tuple(notes + hidden_sheet(ws)))
    hidden = sorted(r for r, dim in ws.row_dimensions.items() if dim.hidden and r <= last_row)
    if hidden:
        notes.append(ReadNote("hidden-rows", f"{len(hidden)} row(s) are hidden.", rows=tuple(hidden)))
    hidden_cols = [
        column_letter(c - 1)
        for c in sorted(
            {
                c
                for dim in ws.column_dimensions.values()
                if dim.hidden and dim.min is not None
                for c in range(dim.min, min(dim.max or dim.min, last_col) + 1)
            }
        )
    ]
    if hidden_cols:
        notes.append(
            ReadNote(
                "hidden-columns", f"{len(hidden_cols)} column(s) are hidden.", examples=tuple(hidden_cols)
            )
        )
    merged = tuple(str(r) for r in ws.merged_cells.ranges)
    if merged:
        notes.append(
            ReadNote(
                "merged-cells",
                f"{len(merged)} merged cell range(s): only the first cell of each holds the value.",
                rows=tuple(sorted({r.min_row for r in ws.merged_cells.ranges})),
                examples=merged[:5],
            )
        )
    notes.extend(hidden_sheet(ws))
    return Table(
        source=path,
        sheet=ws.title,
        grid=grid,
        row_numbers=tuple(used),
        format="xlsx",
        hidden_rows=frozenset(hidden),
        merged_ranges=merged,
        notes=tuple(notes),
    )


def with_uncached(table: Table, missing: tuple[int, list[str]] | None) -> Table:
    """Tag a sheet whose formulas were saved without values (Weir reads them as empty)."""
    if missing is None:
        return table
    count, refs = missing
    note = ReadNote(
        "uncached-formulas",
        f"{count} formula cell(s) were saved without their calculated value, so they read as empty.",
        rows=tuple(sorted({int(re.sub(r"^[A-Z]+", "", r)) for r in refs if re.fullmatch(r"[A-Z]+\d+", r)})),
        examples=tuple(refs),
    )
    return replace(table, notes=(*table.notes, note))


def read_workbook(path: str, limits: ReadLimits) -> list[Table]:
    """Every worksheet with content, hidden ones included; formulas are never evaluated."""
    streamed = check_archive(path, limits) > limits.full_workbook_bytes
    tables: list[Table] = []
    empty: list[str] = []
    # A handle, not the name: openpyxl refuses names without a workbook extension, but the
    # bytes have already shown this is a workbook. Full mode unless the workbook is large:
    # streaming mode exposes neither merged ranges nor hidden rows. data_only gives the values
    # cached by the program that saved the file; nothing is ever calculated.
    with open(path, "rb") as handle:
        try:
            workbook = load_workbook(handle, read_only=streamed, data_only=True, keep_links=False)
            for ws in workbook.worksheets:
                table = read_sheet(ws, path, limits)
                if table is None:
                    empty.append(ws.title)
                else:
                    tables.append(table)
            missing = uncached_formulas(path)
        except UnreadableFile:
            raise
        except Exception as error:  # openpyxl and zipfile raise many kinds (even OSError from a
            # seek to a damaged offset) on a damaged file that read_path has already opened;
            # all of them mean "corrupt"
            raise corrupt(f"{type(error).__name__}: {error}") from None
    tables = [with_uncached(t, missing.get(t.sheet or "")) for t in tables]
    if not tables:
        raise UnreadableFile(
            "file.empty",
            "The workbook holds no data: every sheet is empty.",
            "Send the workbook again with its header and data rows.",
        )
    if empty:
        first = tables[0]
        note = ReadNote("empty-sheets", "Empty sheets were skipped.", examples=tuple(empty))
        tables[0] = replace(first, notes=(*first.notes, note))
    return tables
