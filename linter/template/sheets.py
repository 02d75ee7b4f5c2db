"""The text of a template's help sheets (instructions and code lists), shared by writer and reader."""

from __future__ import annotations

from dataclasses import dataclass

from linter.contract.model import Contract, TableContract, Variable
from linter.dictionary.facts import ContractFacts, contract_facts
from linter.template.examples import example_rows
from linter.template.validation import inline_list

INSTRUCTIONS = "Instructions"
LISTS = "Lists"
RESERVED = (INSTRUCTIONS, LISTS)
CELL_LIMIT = 32_767
"""Most characters one cell holds (from memory of Excel's specifications and limits)."""

Rows = tuple[tuple[str | None, ...], ...]


@dataclass(frozen=True)
class ListPlace:
    """Where a code list lives on the hidden Lists sheet (1-based column, codes from row 2)."""

    table: str
    variable: str
    column: int
    codes: tuple[str, ...]


def sheet_title(table: TableContract) -> str:
    return table.name


def list_places(contract: Contract) -> tuple[ListPlace, ...]:
    """Code lists too long (or too odd) for an inline drop-down, one Lists column each."""
    places: list[ListPlace] = []
    for table in contract.tables:
        for variable in table.variables:
            codes = variable.codes
            if codes is not None and codes.values and inline_list(codes.values) is None:
                places.append(ListPlace(table.name, variable.name, len(places) + 1, codes.values))
    return tuple(places)


def lists_rows(places: tuple[ListPlace, ...]) -> Rows:
    """Row 1 names each list (`table.variable`); the codes follow down the column."""
    if not places:
        return ()
    depth = max(len(p.codes) for p in places)
    header = tuple(f"{p.table}.{p.variable}" for p in places)
    body = tuple(tuple(p.codes[i] if i < len(p.codes) else None for p in places) for i in range(depth))
    return (header, *body)


def variable_line(variable: Variable, facts: ContractFacts, table: TableContract) -> tuple[str | None, ...]:
    described = next(
        v for t in facts.tables if t.name == table.name for v in t.variables if v.name == variable.name
    )
    said = "; ".join(f"{label}: {text}" for label, text in described.facts)
    codes = "; ".join(f"{c} = {label}" if label else c for c, label in described.codes)
    if len(codes) > CELL_LIMIT:
        codes = (
            f"{len(described.codes)} codes, too many for one cell: see the drop-down or the data dictionary"
        )
    return (variable.name, described.kind, said, codes or None)


def instructions_rows(contract: Contract) -> Rows:
    """What the Instructions sheet says, generated from the same facts as the data dictionary."""
    facts = contract_facts(contract)
    rows: list[tuple[str | None, ...]] = [
        (facts.title or facts.id,),
        (f"Contract {facts.id}, version {facts.version}. Weir wrote this workbook from that contract.",),
        ("How to fill it in",),
        ("1. Type one row per record below the header row of each data sheet; keep the header row.",),
        (
            "2. The first rows in grey italics are examples. Weir ignores them while they are unchanged; "
            "delete them or type over them (a changed example row is checked as data).",
        ),
        (
            "3. Leave a cell empty when a value is missing: the rules of this workbook refuse "
            "missing-value codes such as NA in number, date and list columns.",
        ),
        (
            "4. Type dates as YYYY-MM-DD unless the column's note gives another agreed form. "
            "Ids and codes are text cells, so leading zeros are kept.",
        ),
        ("5. Send the workbook back as .xlsx, or each data sheet as CSV UTF-8.",),
    ]
    for table, described in zip(contract.tables, facts.tables, strict=True):
        examples = len(example_rows(table))
        rows.append((f"Sheet {sheet_title(table)}",))
        rows.append((f"Each row is {described.unit}.",))
        rows.append((described.key_sentence,))
        rows.extend((s,) for s in (*described.other_sentences, *described.rules))
        rows.append((f"Example rows: {examples}." if examples else "This sheet has no example rows.",))
        rows.append(("Column", "Type", "What to write", "Allowed values"))
        rows.extend(variable_line(v, facts, table) for v in table.variables)
    return tuple(rows)
