"""Value rules for code lists: codes not allowed, and near-misses that differ only in spacing or case."""

from __future__ import annotations

import difflib
from collections.abc import Iterator

import numpy as np

from linter.contract.model import Variable
from linter.findings import Finding, Severity
from linter.rules.cell_findings import column_finding, counted, engine_result, quoted, written_distinct
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject

define_rule(
    "values.not-in-code-list",
    "Value that is not one of the allowed codes",
    Severity.ERROR,
    """
    Finds cells of a category variable whose value is not in its code list (inline values or
    a code-list file), and is not merely a spacing or case variant of an allowed code.

    Bad:  analyte (codes NITRATE, PHOSPHATE): NITRITE-N

    Good: analyte: NITRATE
    """,
)
define_rule(
    "values.code-variant",
    "Allowed code written with other spacing or letter case",
    Severity.ERROR,
    """
    Finds values that match an allowed code once surrounding spaces are trimmed and letter
    case is ignored, and names the exact code to use.

    Bad:  analyte: 'Nitrate ' | nitrate

    Good: analyte: NITRATE
    """,
)

LISTED_CODES = 12


def variant_key(text: str) -> str:
    """What a code variant and its code share: the text trimmed, inner spaces single, case folded."""
    return " ".join(text.split()).casefold()


def _code_cells(subject: Subject) -> Iterator[tuple[Variable, dict[str, str], np.ndarray, np.ndarray]]:
    """Per coded variable: variant -> code, rows holding variants, rows holding unknown values."""
    result = engine_result(subject)
    if result is None or subject.contract is None:
        return
    for name in result.converted:
        variable = subject.contract.variable(name)
        failing = result.failing(name, "codes")
        if variable is None or variable.codes is None or failing.empty:
            continue
        by_key = {variant_key(code): code for code in variable.codes.values}
        rows = failing["row"].to_numpy(dtype=np.int64)
        which, found = written_distinct(subject, name, rows)  # a wrong code repeats: each once
        keys = {f: variant_key(f) for f in found}
        variants = {f: by_key[key] for f, key in keys.items() if key in by_key}
        is_variant = np.array([f in variants for f in found], dtype=bool)[which]
        yield variable, variants, rows[is_variant], rows[~is_variant]
    result.raise_if_unrun("codes")


def _labels_used(variable: Variable, found: list[str]) -> list[tuple[str, str]]:
    """(value as written, code) where a provider wrote a code's label instead of the code."""
    if variable.codes is None:
        return []
    by_label = {variant_key(label): code for code, label in variable.codes.labels.items()}
    pairs: list[tuple[str, str]] = []
    for value in dict.fromkeys(found):
        code = by_label.get(variant_key(value))
        if code is not None:
            pairs.append((value, code))
    return pairs


def _nearest_codes(found: list[str], codes: list[str]) -> list[tuple[str, str]]:
    """(value, code) for distinct values that are close to one allowed code (a likely typo)."""
    upper = {c.upper(): c for c in codes}
    pairs: list[tuple[str, str]] = []
    for value in dict.fromkeys(found):
        near = difflib.get_close_matches(value.strip().upper(), list(upper), n=1, cutoff=0.6)
        if near:
            pairs.append((value, upper[near[0]]))
    return pairs


@inspector(needs_contract=True, row_wise=True)
def code_variant(subject: Subject) -> Iterator[Finding]:
    for variable, variants, rows, _ in _code_cells(subject):
        if not len(rows):
            continue
        by_code: dict[str, list[str]] = {}
        for found, code in variants.items():
            by_code.setdefault(code, []).append(found)
        fixes = "; ".join(
            f"use the code {code} (found {quoted(found[:3])})" for code, found in list(by_code.items())[:5]
        )
        yield column_finding(
            subject,
            "values.code-variant",
            variable.name,
            rows,
            f"In {variable.name}, {counted(len(rows), 'value', 'is an allowed code', 'are allowed codes')} "
            "written with other spacing or letter case.",
            fixes,
            evidence={"variants": dict(variants)},
        )


@inspector(needs_contract=True, row_wise=True)
def not_in_code_list(subject: Subject) -> Iterator[Finding]:
    for variable, _, _, rows in _code_cells(subject):
        if not len(rows) or variable.codes is None:
            continue
        codes = list(variable.codes.values)
        found = written_distinct(subject, variable.name, rows)[1]
        shown = ", ".join(codes[:LISTED_CODES]) + (", ..." if len(codes) > LISTED_CODES else "")
        source = f" (code list {variable.codes.source})" if variable.codes.source else ""
        labelled = dict(_labels_used(variable, found))
        hints = [f"write {code} instead of its label {label!r}" for label, code in labelled.items()]
        hints += [
            f"{value!r} looks like {code}: write {code} if that is meant"
            for value, code in _nearest_codes([f for f in found if f not in labelled], codes)
        ]
        fix = "; ".join([*hints[:5], f"otherwise use one of the allowed codes{source}: {shown}"])
        yield column_finding(
            subject,
            "values.not-in-code-list",
            variable.name,
            rows,
            f"In {variable.name}, "
            f"{counted(len(rows), 'value', 'is not an allowed code', 'are not allowed codes')}.",
            fix,
        )
