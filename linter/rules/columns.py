"""Column rules: the header against the contract's variables (missing, misspelt, unexpected, out of order)."""

from __future__ import annotations

import difflib
import re
from collections.abc import Iterator
from dataclasses import dataclass

from linter.contract.model import TableContract
from linter.findings import Finding, Place, Severity
from linter.rules.cell_findings import header_place
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject
from linter.table import column_letter

define_rule(
    "columns.missing",
    "Required column is absent",
    Severity.ERROR,
    """
    Finds variables the contract requires whose column is not in the file's header (and for
    which no similarly named column suggests a misspelling). Checks on that column are skipped;
    every other check still runs.

    Bad:  header site_id, sampled_on, result      (analyte is required)

    Good: header site_id, sampled_on, analyte, result
    """,
)
define_rule(
    "columns.misspelt",
    "Column name close to a missing one",
    Severity.ERROR,
    """
    Finds a header cell that the contract does not declare but that is close to a declared
    column that is missing (other case, spaces or a typo), and says which name to use.

    Bad:  header Site ID, sampeld_on

    Good: header site_id, sampled_on
    """,
)
define_rule(
    "columns.unexpected",
    "Column the contract does not declare",
    Severity.WARNING,
    """
    Finds header cells that match no declared variable. The contract's extra_columns setting
    decides whether this is an error, a warning (default) or allowed.

    Bad:  header site_id, result, my_notes      (my_notes is not agreed)

    Good: header site_id, result
    """,
)
define_rule(
    "columns.order",
    "Columns not in the agreed order",
    Severity.WARNING,
    """
    When the contract asks for column order, finds declared columns that appear in another
    order than the contract lists them.

    Bad:  header result, site_id

    Good: header site_id, result
    """,
)

SEVERITY_OF_EXTRA = {"error": Severity.ERROR, "warn": Severity.WARNING}


def name_key(name: str) -> str:
    """A header reduced for comparison: a trailing unit like `(mg/L)` dropped, case folded,
    runs of spaces, dashes and dots as one underscore."""
    bare = re.sub(r"\s*[(\[][^)\]]*[)\]]\s*$", "", name.strip()) or name.strip()
    return re.sub(r"[\s\-.]+", "_", bare).casefold()


@dataclass(frozen=True)
class HeaderMatch:
    """The header compared with the contract."""

    missing: tuple[str, ...]
    """Required variables with no column and no misspelt stand-in."""
    misspelt: tuple[tuple[int, str, str], ...]
    """(column index, header as written, declared name) pairs."""
    unexpected: tuple[tuple[int, str], ...]
    """(column index, header as written) of undeclared columns that are not misspellings."""


def match_header(names: tuple[str, ...], contract: TableContract) -> HeaderMatch:
    """Pair the header with the declared variables; a misspelt pair is not also missing and unexpected."""
    declared = set(contract.names)
    absent = [v.name for v in contract.variables if v.name not in names]
    extra = [(i, n) for i, n in enumerate(names) if n not in declared and n.strip()]
    misspelt: list[tuple[int, str, str]] = []
    for index, header in extra:
        keys = {name_key(a): a for a in absent if a not in {m[2] for m in misspelt}}
        exact = keys.get(name_key(header))
        close = difflib.get_close_matches(name_key(header), list(keys), n=1, cutoff=0.75)
        target = exact or (keys[close[0]] if close else None)
        if target is not None:
            misspelt.append((index, header, target))
    paired = {m[2] for m in misspelt}
    required = {v.name for v in contract.variables if v.required}
    return HeaderMatch(
        missing=tuple(a for a in absent if a in required and a not in paired),
        misspelt=tuple(misspelt),
        unexpected=tuple((i, n) for i, n in extra if i not in {m[0] for m in misspelt}),
    )


@inspector(needs_contract=True)
def missing_columns(subject: Subject) -> Iterator[Finding]:
    if subject.contract is None or not subject.frame.names:
        return
    free = column_letter(len(subject.frame.names))
    for name in match_header(subject.frame.names, subject.contract).missing:
        # An absent column has no letter of its own: give the first free one, where it can go.
        yield Finding(
            rule="columns.missing",
            severity=Severity.ERROR,
            message=f"The required column {name} is not in the header; its checks were skipped.",
            place=Place(
                file=subject.table.source,
                sheet=subject.table.sheet,
                rows=subject.table.row_numbers[:1],
                columns=(name,),
                letters=(free,),
            ),
            fix=f"add a column headed {name}, for example as column {free}",
            evidence={"expected": list(subject.contract.names), "absent": True},
        )


@inspector(needs_contract=True)
def misspelt_columns(subject: Subject) -> Iterator[Finding]:
    if subject.contract is None:
        return
    for index, header, target in match_header(subject.frame.names, subject.contract).misspelt:
        yield Finding(
            rule="columns.misspelt",
            severity=Severity.ERROR,
            message=f"The column {header!r} is not declared; did you mean {target}?",
            place=header_place(subject, [index]),
            examples=(header,),
            fix=f"rename the column {header!r} to {target}",
            evidence={"found": header, "expected": target},
        )


@inspector(needs_contract=True)
def unexpected_columns(subject: Subject) -> Iterator[Finding]:
    contract = subject.contract
    if contract is None or contract.extra_columns not in SEVERITY_OF_EXTRA:
        return
    extra = match_header(subject.frame.names, contract).unexpected
    if extra:
        indexes = [i for i, _ in extra]
        yield Finding(
            rule="columns.unexpected",
            severity=SEVERITY_OF_EXTRA[contract.extra_columns],
            message=f"{len(extra)} column(s) are not in the contract: {', '.join(n for _, n in extra)}.",
            place=header_place(subject, indexes),
            count=len(extra),
            examples=tuple(n for _, n in extra[:5]),
            fix="remove these columns, or ask the data manager to add them to the contract",
        )


@inspector(needs_contract=True)
def column_order(subject: Subject) -> Iterator[Finding]:
    contract = subject.contract
    if contract is None or not contract.column_order:
        return
    names = subject.frame.names
    declared = [n for n in contract.names if n in names]
    seen = [n for n in names if n in set(declared)]
    if seen != declared:
        moved = [i for i, n in enumerate(names) if n in declared and seen.index(n) != declared.index(n)]
        yield Finding(
            rule="columns.order",
            severity=Severity.WARNING,
            message=f"Columns are in the order {', '.join(seen)}; the contract lists {', '.join(declared)}.",
            place=header_place(subject, moved),
            count=len(moved),
            fix=f"put the columns in this order: {', '.join(declared)}",
            evidence={"found": seen, "expected": declared},
        )
