"""The contract as data: frozen dataclasses, each node remembering where it was written."""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from enum import StrEnum


@dataclass(frozen=True)
class Position:
    """A place in a contract file (1-based line and column), for `path:line:col` messages."""

    file: str
    line: int = 0
    column: int = 0

    def __str__(self) -> str:
        return f"{self.file}:{self.line}:{self.column}"


class VarType(StrEnum):
    """The kinds of value a variable can hold."""

    STRING = "string"
    INTEGER = "integer"
    NUMBER = "number"
    BOOLEAN = "boolean"
    DATE = "date"
    DATETIME = "datetime"
    CATEGORY = "category"


@dataclass(frozen=True)
class CodeList:
    """Allowed values of a category, inline or from a code-list file, with optional labels."""

    values: tuple[str, ...]
    labels: Mapping[str, str] = field(default_factory=dict)
    """Code -> human label, where the code list gives one."""
    source: str | None = None
    """Code-list file the values came from, if not inline."""


@dataclass(frozen=True)
class Reference:
    """A foreign key: this variable's values must appear in `table`.`column`."""

    table: str
    column: str

    def __str__(self) -> str:
        return f"{self.table}.{self.column}"


@dataclass(frozen=True)
class Variable:
    """One column the contract expects, and what its values may be."""

    name: str
    type: VarType = VarType.STRING
    required: bool = True
    """The column must be present in the file."""
    nullable: bool = True
    """Cells may be empty (or a missing-value code). Key columns are never nullable."""
    codes: CodeList | None = None
    minimum: float | str | None = None
    """Smallest allowed value (a number, or an ISO 8601 date for dates)."""
    maximum: float | str | None = None
    pattern: str | None = None
    """Regular expression the whole text must match."""
    unit: str | None = None
    """Unit of measure, e.g. mg/L; a value written with another unit is a finding."""
    missing: tuple[str, ...] = ()
    """Extra missing-value codes for this variable only (added to the contract's)."""
    censored_prefix: str | None = None
    """Marker for values below a detection limit, e.g. "<" in "<0.05"."""
    date_format: str | None = None
    """strftime-style format; None means ISO 8601 (YYYY-MM-DD, or date-time for datetime)."""
    references: Reference | None = None
    description: str = ""
    position: Position = field(default_factory=lambda: Position(""))


@dataclass(frozen=True)
class Comparison:
    """A cross-variable rule such as `min_temp <= max_temp`, parsed by Weir (never eval'd)."""

    text: str
    """The rule as written in the contract."""
    left: str
    operator: str
    """One of <, <=, >, >=, ==, !="""
    right: str | float
    """A variable name, or a number literal."""
    right_is_variable: bool = True
    position: Position = field(default_factory=lambda: Position(""))


@dataclass(frozen=True)
class TableContract:
    """What one table of a submission must look like: its observational unit, keys and variables."""

    name: str
    """Table name; for a one-table contract the contract id."""
    observational_unit: str
    keys: tuple[str, ...]
    variables: tuple[Variable, ...]
    applies_to: tuple[str, ...] = ()
    """Glob patterns of file names this table governs."""
    missing: tuple[str, ...] = ("",)
    """File-wide missing-value codes."""
    comparisons: tuple[Comparison, ...] = ()
    complete_over: tuple[str, ...] = ()
    """Key columns whose every combination of seen values must be present (an expected grid)."""
    extra_columns: str = "warn"
    """What an unexpected column earns: "error", "warn" or "allow"."""
    column_order: bool = False
    """Whether columns must appear in the declared order."""
    position: Position = field(default_factory=lambda: Position(""))

    def variable(self, name: str) -> Variable | None:
        return next((v for v in self.variables if v.name == name), None)

    @property
    def names(self) -> tuple[str, ...]:
        return tuple(v.name for v in self.variables)


@dataclass(frozen=True)
class Contract:
    """One contract file: an id, a version and one or more tables (a bundle)."""

    id: str
    version: str
    title: str
    tables: tuple[TableContract, ...]
    path: str = ""

    def table(self, name: str) -> TableContract | None:
        return next((t for t in self.tables if t.name == name), None)
