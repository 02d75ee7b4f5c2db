"""The plain-text template: a header-only CSV per table and a README with the dictionary in words."""

from __future__ import annotations

import csv
import io
from pathlib import Path

from linter.contract.model import Contract
from linter.dictionary import markdown
from linter.dictionary.facts import contract_facts


def header_csv(names: tuple[str, ...]) -> bytes:
    """One header line, quoted where RFC 4180 requires, CRLF-terminated, UTF-8 without a BOM."""
    buffer = io.StringIO()
    # Source: RFC 4180 §2 rules 1, 6 and 7 (CRLF line ends; quote fields holding commas, quotes, breaks).
    csv.writer(buffer, lineterminator="\r\n").writerow(names)
    return buffer.getvalue().encode("utf-8")


def csv_files(contract: Contract, out: Path) -> dict[Path, bytes]:
    """File -> bytes: `out` itself for a one-table contract, `STEM-TABLE.csv` per table of a bundle."""
    files: dict[Path, bytes] = {}
    if len(contract.tables) == 1:
        files[out] = header_csv(contract.tables[0].names)
    else:
        for table in contract.tables:
            files[out.with_name(f"{out.stem}-{table.name}.csv")] = header_csv(table.names)
    readme = markdown.render(contract_facts(contract))
    note = (
        "How to fill in the CSV template: keep the header line, add one line per row, save as CSV UTF-8, "
        "write dates as YYYY-MM-DD and leave a field empty when a value is missing.\n\n"
    )
    files[out.with_name(f"{out.stem}.README.txt")] = (note + readme).encode("utf-8")
    return files
