"""The result of checking a submission, as plain records every writer works from."""

from __future__ import annotations

from collections import Counter
from dataclasses import dataclass

from linter.findings import Finding, Severity


@dataclass(frozen=True)
class TableResult:
    """Everything Weir found in one table (a CSV file, an Excel sheet, a Parquet file)."""

    file: str
    sheet: str | None
    sha256: str
    """Hash of the file's bytes as submitted."""
    format: str
    rows: int
    """Body rows read (header excluded)."""
    columns: int
    contract: str | None
    """Contract id that governed the table, if any."""
    contract_version: str | None
    table: str | None
    """Table name within the contract."""
    findings: tuple[Finding, ...]
    encoding: str | None = None

    def worst(self) -> Severity | None:
        return max((f.severity for f in self.findings), key=lambda s: s.rank, default=None)


@dataclass(frozen=True)
class Report:
    """One run of `weir check`: every table's result and the verdict."""

    tool_version: str
    created: str
    """ISO 8601 timestamp (UTC); the only field that changes between identical runs."""
    fail_on: Severity
    results: tuple[TableResult, ...]
    findings: tuple[Finding, ...] = ()
    """Findings that belong to the submission as a whole (e.g. a key missing in another file)."""

    def all_findings(self) -> list[Finding]:
        return [f for r in self.results for f in r.findings] + list(self.findings)

    def counts(self) -> dict[str, int]:
        counted = Counter(f.severity.value for f in self.all_findings())
        return {s.value: counted.get(s.value, 0) for s in Severity}

    @property
    def failed(self) -> bool:
        return any(f.severity.rank >= self.fail_on.rank for f in self.all_findings())

    @property
    def verdict(self) -> str:
        """`accepted` when nothing is at or above the failing severity, else `returned`."""
        return "returned" if self.failed else "accepted"
