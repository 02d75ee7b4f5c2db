"""The one module where pandera lives: compile a table contract to a schema, run it, return its failures."""

from __future__ import annotations

import re
from collections.abc import Collection, Mapping
from dataclasses import dataclass
from functools import cached_property

import numpy as np
import pandas as pd
import pandera.pandas as pa
from pandera.errors import SchemaErrors

from linter.contract.convert import Converted, convert_column
from linter.contract.model import TableContract, Variable, VarType
from linter.contract.repeats import Repeats, repeats
from linter.table import Frame

FAILURE_COLUMNS = ("column", "kind", "row", "value")
"""Weir's failure table: variable, which check failed, the provider row, the typed value."""

KINDS_BY_PANDERA_NAME = {"not_nullable": "nullable", "multiple_fields_uniqueness": "unique"}

DTYPES: Mapping[VarType, str] = {
    VarType.NUMBER: "float64",
    VarType.INTEGER: "Int64",
    VarType.BOOLEAN: "boolean",
}


@dataclass(frozen=True)
class CheckedTable:
    """What the engine learnt about one table: each present variable read as typed, and what failed."""

    converted: Mapping[str, Converted]
    """Variable name -> its column read as typed; only variables whose column is present."""
    typed: pd.DataFrame
    """The typed columns side by side, indexed by the provider's row numbers."""
    failures: pd.DataFrame
    """One row per failing cell with FAILURE_COLUMNS; `kind` is range, codes, pattern, nullable or unique."""

    unrun: tuple[tuple[str, str, str], ...] = ()
    """(column, kind, pandera's error) for checks that raised instead of judging the cells."""

    def failing(self, column: str, kind: str) -> pd.DataFrame:
        """The failure table's rows for one check of one column."""
        return self._by_check.get((column, kind), self.failures.iloc[:0])

    @cached_property
    def _by_check(self) -> dict[tuple[str, str], pd.DataFrame]:
        """Every rule family asks for its own checks, column by column: grouped once."""
        groups = self.failures.groupby(["column", "kind"], sort=False)
        return {(str(column), str(kind)): rows for (column, kind), rows in groups}

    def raise_if_unrun(self, kind: str) -> None:
        """Raise when a check of `kind` never ran, so it surfaces as that inspector's failure, not silence."""
        unrun = [(column, error) for column, k, error in self.unrun if k == kind]
        if unrun:
            column, error = unrun[0]
            raise RuntimeError(f"the {kind} check of {column} could not run: {error}")


def present_variables(contract: TableContract, frame: Frame) -> list[Variable]:
    """Declared variables whose column is in the file under exactly their own name."""
    labels = set(frame.labels)
    return [v for v in contract.variables if v.name in labels]


def _bound(variable: Variable, bound: float | str) -> float | pd.Timestamp:
    if variable.type in (VarType.DATE, VarType.DATETIME):
        return pd.Timestamp(str(bound))
    return float(bound)


def _range_check(variable: Variable) -> pa.Check | None:
    low, high = variable.minimum, variable.maximum
    if low is not None and high is not None:
        return pa.Check.in_range(_bound(variable, low), _bound(variable, high))
    if low is not None:
        return pa.Check.ge(_bound(variable, low))
    if high is not None:
        return pa.Check.le(_bound(variable, high))
    return None


def _pattern_check(variable: Variable) -> pa.Check | None:
    if variable.pattern is None or variable.type not in (VarType.STRING, VarType.CATEGORY):
        return None
    try:
        re.compile(variable.pattern)
    except re.error:  # the contract loader reports a broken pattern; the other checks still run
        return None
    # str_matches anchors only the start; the contract promises a whole-text match.
    return pa.Check.str_matches(rf"(?:{variable.pattern})\Z")


def _column_checks(variable: Variable) -> list[tuple[str, pa.Check]]:
    checks: list[tuple[str, pa.Check | None]] = [
        ("range", _range_check(variable)),
        ("pattern", _pattern_check(variable)),
    ]
    if variable.codes is not None and variable.type in (VarType.STRING, VarType.CATEGORY):
        checks.append(("codes", pa.Check.isin(list(variable.codes.values))))
    return [(kind, check) for kind, check in checks if check is not None]


def compile_schema(
    contract: TableContract, present: Collection[str]
) -> tuple[pa.DataFrameSchema, dict[tuple[str, int], str]]:
    """A pandera schema for the present columns, and which Weir check kind each pandera check is."""
    columns: dict[str, pa.Column] = {}
    kinds: dict[tuple[str, int], str] = {}
    for variable in contract.variables:
        if variable.name not in present:
            continue
        checks = _column_checks(variable)
        for number, (kind, _) in enumerate(checks):
            kinds[(variable.name, number)] = kind
        columns[variable.name] = pa.Column(
            DTYPES.get(variable.type),
            checks=[check for _, check in checks],
            nullable=variable.nullable and variable.name not in contract.keys,
            required=True,
        )
    keys = [k for k in contract.keys if k in present]
    whole_key = len(keys) == len(contract.keys) and bool(keys)
    return _table_schema(columns, keys if whole_key else None), kinds


def _table_schema(columns: Mapping[str, pa.Column], unique: list[str] | None) -> pa.DataFrameSchema:
    """Weir's one way of asking pandera to judge a typed table: every failure, extra columns allowed."""
    return pa.DataFrameSchema(dict(columns), unique=unique, report_duplicates="all", strict=False)


def _kind_of(row: pd.Series, kinds: Mapping[tuple[str, int], str]) -> str:
    number = row["check_number"]
    return _kind(str(row["column"]), row["check"], None if pd.isna(number) else float(number), kinds)


def _unrun(error: SchemaErrors, kinds: Mapping[tuple[str, int], str]) -> tuple[tuple[str, str, str], ...]:
    """Checks pandera reports without a row: the check itself raised (e.g. an impossible comparison)."""
    cases = error.failure_cases
    cases = cases[cases["index"].isna()]
    return tuple((str(r["column"]), _kind_of(r, kinds), str(r["failure_case"])) for _, r in cases.iterrows())


def _failure_table(error: SchemaErrors, kinds: Mapping[tuple[str, int], str]) -> pd.DataFrame:
    cases = error.failure_cases
    cases = cases[cases["index"].notna()]
    # Vectorised: a file can fail a check on every row, so no per-case Python here. A schema has
    # only a few (column, check, number) triples: each is given its kind once, from its first case.
    columns = cases["column"].to_numpy(dtype=object)
    checks = cases["check"].to_numpy(dtype=object)
    numbers = pd.to_numeric(cases["check_number"], errors="coerce").to_numpy(dtype=float)
    triples = np.stack([pd.factorize(values)[0] for values in (columns, checks, numbers)])
    _, firsts, which = np.unique(triples, axis=1, return_index=True, return_inverse=True)
    kind_of = [_kind(str(columns[i]), checks[i], float(numbers[i]), kinds) for i in firsts.tolist()]
    kind = np.array(kind_of, dtype=object)[which.reshape(-1)]
    rows = cases["index"].to_numpy(dtype=np.int64)
    # The first case of each (column, kind, row), in pandera's order.
    cells = np.stack([triples[0], pd.factorize(kind)[0], rows])
    first = np.sort(np.unique(cells, axis=1, return_index=True)[1])
    return pd.DataFrame(
        {
            "column": pd.Series(columns[first], dtype=object),
            "kind": pd.Series(kind[first], dtype=object),
            "row": rows[first],
            "value": cases["failure_case"].iloc[first].reset_index(drop=True),
        }
    )


def _kind(column: str, check: object, number: float | None, kinds: Mapping[tuple[str, int], str]) -> str:
    """Weir's check kind of one pandera check of a column (`number` None or NaN when it has none)."""
    if check in KINDS_BY_PANDERA_NAME:
        return KINDS_BY_PANDERA_NAME[str(check)]
    if number is None or np.isnan(number):
        return "other"
    return kinds.get((column, int(number)), "other")


def run_contract(contract: TableContract, frame: Frame) -> CheckedTable:
    """Convert every present variable, validate the typed table with pandera, collect every failure."""
    variables = present_variables(contract, frame)
    index = frame.row_index
    converted: dict[str, Converted] = {}
    for variable in variables:
        text = frame.body[variable.name].set_axis(index)
        converted[variable.name] = convert_column(text, variable, contract.missing)
    typed = pd.DataFrame({name: c.values for name, c in converted.items()}, index=index)
    schema, kinds = compile_schema(contract, converted)
    failures, unrun = validated(schema, typed, kinds)
    return CheckedTable(converted, typed, failures, unrun)


NO_FAILURES = pd.DataFrame({name: pd.Series(dtype=object) for name in FAILURE_COLUMNS})


def validated(
    schema: pa.DataFrameSchema,
    typed: pd.DataFrame,
    kinds: Mapping[tuple[str, int], str],
    per_value: bool = True,
) -> tuple[pd.DataFrame, tuple[tuple[str, str, str], ...]]:
    """Pandera's verdict on the typed table: Weir's failure table, and the checks that never ran.

    Every check of a column (range, pattern, codes, nullable, type) judges each value on its own,
    so a column with few distinct values (the doubtful cells of a large file, most of all) is
    validated on its own, on the first row of each value, and each failure then stands for every
    row holding that value: pandera's work, and its failure cases, grow with the values. The key's
    uniqueness, and the columns without repeats, are judged on every row in one more run. With
    `per_value` False the whole table is validated at once (the result is the same, row for row,
    in the same order; tests compare them)."""
    alone = _repeating_columns(schema, typed) if per_value else {}
    if not alone:
        return _run(schema, typed, kinds)
    rest = _table_schema({n: c for n, c in schema.columns.items() if n not in alone}, schema.unique)
    runs = [_run(rest, typed, kinds)] if rest.columns or rest.unique else []
    for name, same in alone.items():
        one = _table_schema({name: schema.columns[name]}, None)
        failures, unrun = _run(one, typed[[name]].iloc[same.first], kinds)
        runs.append((_spread(failures, same, typed.index) if len(failures) else failures, unrun))
    return _in_pandera_order(runs, list(schema.columns))


def _run(
    schema: pa.DataFrameSchema, typed: pd.DataFrame, kinds: Mapping[tuple[str, int], str]
) -> tuple[pd.DataFrame, tuple[tuple[str, str, str], ...]]:
    try:
        schema.validate(typed, lazy=True)
    except SchemaErrors as error:
        return _failure_table(error, kinds), _unrun(error, kinds)
    return NO_FAILURES.copy(), ()


def _in_pandera_order(
    runs: list[tuple[pd.DataFrame, tuple[tuple[str, str, str], ...]]], columns: list[str]
) -> tuple[pd.DataFrame, tuple[tuple[str, str, str], ...]]:
    """Several runs' failures as one run of the whole schema lists them: the key's uniqueness (a
    check of the whole table) first, then column by column in schema order."""
    if len(runs) == 1:
        return runs[0]
    block = {column: number + 1 for number, column in enumerate(columns)}
    tables = [failures for failures, _ in runs if len(failures)]
    failures = pd.concat(tables, ignore_index=True) if tables else NO_FAILURES.copy()
    if len(tables) > 1:
        of_column = failures["column"].map(block).fillna(len(block) + 1).to_numpy(dtype=np.int64)
        blocks = np.where((failures["kind"] == "unique").to_numpy(), 0, of_column)
        failures = failures.iloc[np.argsort(blocks, kind="stable")].reset_index(drop=True)
    unrun = [u for _, found in runs for u in found]
    unrun.sort(key=lambda u: 0 if u[1] == "unique" else block.get(u[0], len(block) + 1))
    return failures, tuple(unrun)


def _spread(failures: pd.DataFrame, same: Repeats, index: pd.Index) -> pd.DataFrame:
    """The failures of the first rows, each repeated for every row holding the same value."""
    order = np.argsort(same.codes, kind="stable")  # rows of each value together, in file order
    bounds = np.searchsorted(same.codes[order], np.arange(len(same.values) + 1))
    value = same.codes[index.get_indexer(pd.Index(failures["row"], dtype="int64"))]
    counts = bounds[value + 1] - bounds[value]
    case = np.repeat(np.arange(len(failures)), counts)
    # For case i, positions bounds[value[i]] ... bounds[value[i] + 1] - 1 of `order`.
    starts = np.repeat(bounds[value] - np.cumsum(counts) + counts, counts)
    rows = index.to_numpy()[order[starts + np.arange(len(case))]]
    spread = failures.iloc[case].assign(row=rows)
    # Pandera lists each check's failing rows in row order, one check after another.
    block = spread.groupby(["column", "kind"], sort=False).ngroup().to_numpy()
    return spread.iloc[np.lexsort((rows, block))].reset_index(drop=True)


SPLIT_FROM_ROWS = 4096
"""A table of several columns is split into runs from this many rows on: each run costs pandera
about a millisecond more, each failing cell judged once per value saves it a few microseconds."""


def _repeating_columns(schema: pa.DataFrameSchema, typed: pd.DataFrame) -> dict[str, Repeats]:
    """The columns validated on their own, once per value, in `validated`, with their repeats."""
    if typed.shape[1] > 1 and len(typed) < SPLIT_FROM_ROWS:
        return {}
    found = {name: repeats(typed[name], 2) for name in schema.columns if name in typed}
    return {name: same for name, same in found.items() if same is not None}


_last: tuple[TableContract, Frame, CheckedTable] | None = None


def checked(contract: TableContract, frame: Frame) -> CheckedTable:
    """`run_contract`, computed once per table even though every rule family asks for it."""
    global _last
    if _last is not None and _last[0] is contract and _last[1] is frame:
        return _last[2]
    result = run_contract(contract, frame)
    _last = (contract, frame, result)
    return result
