"""The plain registry of rules (documentation) and inspectors (functions that return findings)."""

from __future__ import annotations

import inspect as _inspect
from collections.abc import Callable, Iterable, Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING

from linter.findings import Finding, Severity

if TYPE_CHECKING:
    from linter.rules.subject import Subject


@dataclass(frozen=True)
class Rule:
    """One kind of problem Weir reports; its docstring-like `doc` is what `weir explain` prints."""

    id: str
    """Stable id, `family.name`, e.g. `layout.values-in-headers`."""
    title: str
    severity: Severity
    """Default severity of its findings."""
    doc: str
    """What it finds, then `Bad:` and `Good:` examples (a test enforces both)."""

    @property
    def family(self) -> str:
        return self.id.split(".", 1)[0]


Inspector = Callable[["Subject"], Iterable[Finding]]

RULES: dict[str, Rule] = {}
INSPECTORS: dict[str, Inspector] = {}
"""Inspector name (module.function) -> function; each one runs independently of the others."""
CONTRACT_ONLY: set[str] = set()
"""Inspectors that need a contract and are skipped without one."""
ROW_WISE: set[str] = set()
"""Inspectors that judge each row on its own, so any subset of rows gives the same findings for
the rows it holds. On a pre-screened large file they see only the rows the screen could not pass;
every other inspector looks at the table as a whole and sees the file's leading sample."""


def define_rule(rule_id: str, title: str, severity: Severity, doc: str) -> Rule:
    """Declare a rule; ids are unique across Weir."""
    if rule_id in RULES:
        raise ValueError(f"rule {rule_id} declared twice")
    rule = Rule(rule_id, title, severity, _inspect.cleandoc(doc))
    RULES[rule_id] = rule
    return rule


def inspector(*, needs_contract: bool = False, row_wise: bool = False) -> Callable[[Inspector], Inspector]:
    """Register a function `Subject -> Iterable[Finding]` to run on every table (see `ROW_WISE`)."""

    def register(function: Inspector) -> Inspector:
        name = f"{function.__module__}.{function.__name__}"
        INSPECTORS[name] = function
        if needs_contract:
            CONTRACT_ONLY.add(name)
        if row_wise:
            ROW_WISE.add(name)
        return function

    return register


SubmissionInspector = Callable[[Sequence["Subject"]], Iterable[Finding]]

SUBMISSION_INSPECTORS: dict[str, SubmissionInspector] = {}
"""Inspectors that look at all tables of one submission at once (files split or stacked)."""


def submission_inspector(function: SubmissionInspector) -> SubmissionInspector:
    """Register a function `[Subject, ...] -> Iterable[Finding]` to run once per submission."""
    SUBMISSION_INSPECTORS[f"{function.__module__}.{function.__name__}"] = function
    return function
