"""`weir template CONTRACT --out FILE`: a fill-in workbook (or header-only CSV) for providers."""

from __future__ import annotations

from enum import StrEnum
from pathlib import Path

import typer

from linter.cli.app import app, guarded
from linter.cli.dictionary import refuse_overwriting
from linter.errors import WeirError


class TemplateFormat(StrEnum):
    XLSX = "xlsx"
    CSV = "csv"


@app.command()
@guarded
def template(
    contract: Path = typer.Argument(..., help="The contract the template follows."),
    out: Path = typer.Option(..., "--out", "-o", help="The workbook (.xlsx) or CSV file to write."),
    format: TemplateFormat | None = typer.Option(
        None, "--format", help="xlsx (validated workbook) or csv (header + README); default from --out."
    ),
) -> int:
    """Write a fill-in template: one sheet per table, drop-downs and range rules, example rows."""
    from linter.contract.load import load_contract
    from linter.output import write_bytes_atomic
    from linter.template.csv_template import csv_files
    from linter.template.workbook import workbook_bytes

    if not contract.is_file():
        raise WeirError(f"no such contract file: {contract}")
    refuse_overwriting(out, contract)
    chosen = format or (TemplateFormat.CSV if out.suffix.lower() == ".csv" else TemplateFormat.XLSX)
    if chosen is TemplateFormat.XLSX and out.suffix.lower() != ".xlsx":
        raise WeirError(f"--out {out}: a workbook template needs an .xlsx name")
    if chosen is TemplateFormat.CSV and out.suffix.lower() != ".csv":
        raise WeirError(f"--out {out}: a CSV template needs a .csv name")
    loaded = load_contract(str(contract))
    files = {out: workbook_bytes(loaded)} if chosen is TemplateFormat.XLSX else csv_files(loaded, out)
    for target in files:
        if target.resolve() == contract.resolve():
            raise WeirError(f"{target} would overwrite the contract; choose another --out name")
    for target, data in files.items():
        write_bytes_atomic(target, data)
        print(f"weir: wrote {target}")
    return 0
