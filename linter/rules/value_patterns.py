"""Value rule for text shape: cells whose whole text does not match the variable's declared pattern."""

from __future__ import annotations

import re
from collections.abc import Iterator

from linter.contract.convert import Converted
from linter.findings import Finding, Severity
from linter.rules.cell_findings import column_finding, counted, engine_result, quoted, written
from linter.rules.registry import define_rule, inspector
from linter.rules.subject import Subject

define_rule(
    "values.pattern-mismatch",
    "Text that does not match the declared pattern",
    Severity.ERROR,
    """
    Finds text cells whose whole text does not match the variable's declared pattern
    (a regular expression). The fix shows a value of the same column that does match, and
    names cells that only need their letter case or surrounding spaces corrected.

    Bad:  site_id (pattern ^VB-\\d{3}$): VB-14 | vb-014 | 'VB-014 '

    Good: site_id: VB-014
    """,
)


def _matching_example(converted: Converted, failing_rows: set[int], whole: re.Pattern[str]) -> str | None:
    """A value of the same column that has the agreed form, to show the provider what is meant."""
    good = converted.values[~converted.missing & ~converted.values.index.isin(list(failing_rows))]
    return next((str(v) for v in good.head(50).tolist() if whole.fullmatch(str(v))), None)


def pattern_fix(name: str, pattern: str, found: list[str], example: str | None) -> str:
    """What to write: the agreed form, a matching example, and the cells a simple edit mends."""
    whole = re.compile(pattern)
    fix = f"write each {name} in the agreed form {pattern}"
    if example is not None:
        fix += f", like {example!r}"
    fix += f" (found {quoted(found[:3])})"
    # A wrong value repeats: each distinct one is tried once.
    distinct = dict.fromkeys(found)
    is_spaced = {f: f != f.strip() and whole.fullmatch(f.strip()) is not None for f in distinct}
    is_cased = {f: not is_spaced[f] and whole.fullmatch(f.strip().upper()) is not None for f in distinct}
    spaced = [f for f in found if is_spaced[f]]
    cased = [f for f in found if is_cased[f]]
    if spaced:
        fix += f"; remove the surrounding spaces from {quoted(spaced[:3])}"
    if cased:
        fix += f"; write {quoted(cased[:3])} in capital letters"
    return fix


@inspector(needs_contract=True, row_wise=True)
def pattern_mismatch(subject: Subject) -> Iterator[Finding]:
    result = engine_result(subject)
    if result is None or subject.contract is None:
        return
    for name, converted in result.converted.items():
        variable = subject.contract.variable(name)
        failing = result.failing(name, "pattern")
        if variable is None or variable.pattern is None or failing.empty:
            continue
        rows = failing["row"].astype("int64").tolist()
        found = written(subject, name, rows)
        example = _matching_example(converted, set(rows), re.compile(variable.pattern))
        yield column_finding(
            subject,
            "values.pattern-mismatch",
            name,
            rows,
            f"In {name}, {counted(len(rows), 'value', 'does', 'do')} not have the agreed form "
            f"{variable.pattern}.",
            pattern_fix(name, variable.pattern, found, example),
            evidence={"pattern": variable.pattern},
        )
    result.raise_if_unrun("pattern")
