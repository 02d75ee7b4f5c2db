"""Write the fill-in workbook: one frozen-header sheet per table, validations, formats and examples."""

from __future__ import annotations

import io
from datetime import date

from openpyxl import Workbook
from openpyxl.comments import Comment
from openpyxl.styles import Font, PatternFill
from openpyxl.worksheet.datavalidation import DataValidation
from openpyxl.worksheet.worksheet import Worksheet

from linter.contract.model import Contract, TableContract, Variable, VarType
from linter.errors import WeirError
from linter.table import column_letter
from linter.template.examples import example_rows
from linter.template.sheets import (
    INSTRUCTIONS,
    LISTS,
    RESERVED,
    ListPlace,
    Rows,
    instructions_rows,
    list_places,
    lists_rows,
    sheet_title,
)
from linter.template.validation import TITLE_LIMIT, CellRule, cell_rule, inline_list, is_iso_date

LAST_ROW = 1_048_576
"""The last row of a worksheet (ECMA-376 Part 1 §18.3.1.73: row index at most 1048576)."""
EXAMPLE_NOTE = "Example row: Weir ignores it while it is unchanged. Delete it or type over it."
TEXT_FORMAT = "@"
DATE_FORMAT = "yyyy-mm-dd"
EXAMPLE_FILL = PatternFill("solid", fgColor="EEF2F5")
EXAMPLE_FONT = Font(italic=True, color="5B6B7D")
BAD_SHEET_CHARS = set("[]:*?/\\")


def number_format(variable: Variable) -> str:
    """Text for ids, codes and anything not a plain number or ISO date, so nothing is reinterpreted."""
    if variable.type is VarType.NUMBER and not variable.censored_prefix:
        return "General"
    if variable.type is VarType.INTEGER and not variable.censored_prefix:
        return "0"
    return DATE_FORMAT if is_iso_date(variable) else TEXT_FORMAT


def typed(variable: Variable, text: str | None) -> object:
    """An example value as the cell type a provider would type: numbers and dates as such."""
    if text is None:
        return None
    fmt = number_format(variable)
    if fmt == DATE_FORMAT:
        return date.fromisoformat(text)
    if fmt in ("General", "0"):
        number = float(text)
        return int(number) if number.is_integer() else number
    return text


def put(ws: Worksheet, row: int, column: int, value: object) -> None:
    """Write a value; text that starts with `=` stays text (openpyxl would store it as a formula)."""
    cell = ws.cell(row=row, column=column, value=value)
    if isinstance(value, str) and value.startswith("="):
        cell.data_type = "s"


def write_rows(ws: Worksheet, rows: Rows) -> None:
    for r, values in enumerate(rows, start=1):
        for c, value in enumerate(values, start=1):
            if value is not None:
                put(ws, r, c, value)


def list_source(
    variable: Variable, table: TableContract, places: dict[tuple[str, str], ListPlace]
) -> str | None:
    if variable.codes is None:
        return None
    place = places.get((table.name, variable.name))
    if place is None:
        return inline_list(variable.codes.values)
    letter = column_letter(place.column - 1)
    return f"{LISTS}!${letter}$2:${letter}${len(place.codes) + 1}"


def validation(rule: CellRule, variable: Variable, letter: str) -> DataValidation:
    # Source: ECMA-376 Part 1 §18.3.1.32 dataValidation (type, operator, allowBlank, showErrorMessage,
    # formula1/formula2, sqref); section number from memory.
    return DataValidation(
        type=None if rule.kind == "none" else rule.kind,
        operator=rule.operator,
        formula1=rule.formula1,
        formula2=rule.formula2,
        allow_blank=rule.allow_blank,
        showErrorMessage=rule.kind != "none",
        showInputMessage=bool(rule.prompt),
        promptTitle=variable.name[:TITLE_LIMIT],
        prompt=rule.prompt or None,
        errorTitle=f"Not a valid {variable.name}"[:TITLE_LIMIT],
        error=rule.error or None,
        errorStyle="stop",
        sqref=f"{letter}2:{letter}{LAST_ROW}",
    )


def data_sheet(ws: Worksheet, table: TableContract, places: dict[tuple[str, str], ListPlace]) -> None:
    ws.title = sheet_title(table)
    for index, variable in enumerate(table.variables, start=1):
        letter = column_letter(index - 1)
        put(ws, 1, index, variable.name)
        header = ws.cell(row=1, column=index)
        header.font = Font(bold=True)
        header.number_format = TEXT_FORMAT
        ws.column_dimensions[letter].number_format = number_format(variable)
        ws.column_dimensions[letter].width = max(12, min(40, len(variable.name) + 4))
        rule = cell_rule(variable, variable.name in table.keys, list_source(variable, table, places))
        ws.add_data_validation(validation(rule, variable, letter))
    for r, example in enumerate(example_rows(table), start=2):
        for c, (variable, text) in enumerate(zip(table.variables, example, strict=True), start=1):
            put(ws, r, c, typed(variable, text))
            cell = ws.cell(row=r, column=c)
            cell.number_format = number_format(variable)
            cell.fill, cell.font = EXAMPLE_FILL, EXAMPLE_FONT
        ws.cell(row=r, column=1).comment = Comment(EXAMPLE_NOTE, "Weir")
    ws.freeze_panes = "A2"  # one frozen header row


def refuse_bad_titles(contract: Contract) -> None:
    titles = [sheet_title(t) for t in contract.tables]
    reserved = {r.casefold() for r in RESERVED}
    for title in titles:
        # Sheet names are unique regardless of letter case (from memory of Excel's behaviour).
        if [t.casefold() for t in titles].count(title.casefold()) > 1:
            raise WeirError(f"tables named {title!r} differ only in letter case; a workbook cannot hold both")
        if title.casefold() in reserved or len(title) > 31 or BAD_SHEET_CHARS & set(title):
            # Source: ECMA-376 Part 1 §18.2.19 sheet (name rules from memory: <= 31 characters, no []:*?/\)
            raise WeirError(
                f"table name {title!r} cannot be a worksheet name (at most 31 characters, none of "
                f"[ ] : * ? / \\, and not {' or '.join(RESERVED)})"
            )


def build_workbook(contract: Contract) -> Workbook:
    refuse_bad_titles(contract)
    workbook = Workbook()
    places = list_places(contract)
    by_variable = {(p.table, p.variable): p for p in places}
    for index, table in enumerate(contract.tables):
        data_sheet(workbook.worksheets[0] if index == 0 else workbook.create_sheet(), table, by_variable)
    help_sheet = workbook.create_sheet(INSTRUCTIONS)
    write_rows(help_sheet, instructions_rows(contract))
    help_sheet.column_dimensions["A"].width = 24
    help_sheet.column_dimensions["C"].width = 90
    if places:
        lists = workbook.create_sheet(LISTS)
        for c in range(1, len(places) + 1):
            lists.column_dimensions[column_letter(c - 1)].number_format = TEXT_FORMAT
        write_rows(lists, lists_rows(places))
        lists.sheet_state = "hidden"
    return workbook


def workbook_bytes(contract: Contract) -> bytes:
    """The template as .xlsx bytes (written atomically by the caller)."""
    buffer = io.BytesIO()
    build_workbook(contract).save(buffer)
    return buffer.getvalue()
