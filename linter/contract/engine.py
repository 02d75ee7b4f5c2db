"""The one module where pandera lives: compile a table contract to a schema, run it, return its failures."""

from __future__ import annotations

import re
from collections.abc import Collection, Mapping
from dataclasses import dataclass
from functools import cached_property
from itertools import pairwise

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
        """Every rule family asks for its own checks, column by column: grouped once, each
        group's rows in table order (as a pandas groupby gives them, at a fraction of its cost
        on the few-row tables of a large file's parts)."""
        columns = self.failures["column"].to_numpy(dtype=object)
        kinds = self.failures["kind"].to_numpy(dtype=object)
        column_code, kind_code = (pd.factorize(values)[0] for values in (columns, kinds))
        named = np.flatnonzero((column_code >= 0) & (kind_code >= 0))  # a groupby drops the others
        checks = combined_codes(column_code[named], kind_code[named])
        ordered = np.argsort(checks, kind="stable")
        order = named[ordered]
        bounds = [*np.flatnonzero(np.diff(checks[ordered], prepend=-1)).tolist(), len(order)]
        return {
            (str(columns[order[a]]), str(kinds[order[a]])): self.failures.iloc[order[a:b]]
            for a, b in pairwise(bounds)
        }

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
    schema = pa.DataFrameSchema(
        columns,
        unique=keys if whole_key else None,
        report_duplicates="all",
        strict=False,
    )
    return schema, kinds


def _kind_of(row: pd.Series, kinds: Mapping[tuple[str, int], str]) -> str:
    number = row["check_number"]
    return _kind(str(row["column"]), row["check"], None if pd.isna(number) else float(number), kinds)


def _unrun(error: SchemaErrors, kinds: Mapping[tuple[str, int], str]) -> tuple[tuple[str, str, str], ...]:
    """Checks pandera reports without a row: the check itself raised (e.g. an impossible comparison)."""
    cases = error.failure_cases
    rowless = np.flatnonzero(pd.isna(cases["index"].to_numpy(dtype=object)))
    if not len(rowless):  # the usual case: skip building an empty table
        return ()
    cases = cases.iloc[rowless]
    return tuple((str(r["column"]), _kind_of(r, kinds), str(r["failure_case"])) for _, r in cases.iterrows())


def _failure_table(error: SchemaErrors, kinds: Mapping[tuple[str, int], str]) -> pd.DataFrame:
    cases = error.failure_cases
    cases = cases[cases["index"].notna()]
    # Vectorised: a file can fail a check on every row, so no per-case Python here. A schema has
    # only a few (column, check, number) triples: each is given its kind once, from its first case.
    columns = cases["column"].to_numpy(dtype=object)
    checks = cases["check"].to_numpy(dtype=object)
    numbers = pd.to_numeric(cases["check_number"], errors="coerce").to_numpy(dtype=float)
    column_code, check_code, number_code = (
        pd.factorize(values, use_na_sentinel=False)[0] for values in (columns, checks, numbers)
    )  # a check without a number (nullable, unique) has NaN: a code of its own, not -1
    triples = combined_codes(column_code, check_code, number_code)
    _, firsts, which = np.unique(triples, return_index=True, return_inverse=True)
    kind_of = [_kind(str(columns[i]), checks[i], float(numbers[i]), kinds) for i in firsts.tolist()]
    kind = np.array(kind_of, dtype=object)[which.reshape(-1)]
    rows = cases["index"].to_numpy(dtype=np.int64)
    # The first case of each (column, kind, row), in pandera's order.
    cells = combined_codes(
        column_code, pd.factorize(kind, use_na_sentinel=False)[0], rows - rows.min(initial=0)
    )
    first = np.sort(np.unique(cells, return_index=True)[1])
    return pd.DataFrame(
        {
            "column": pd.Series(columns[first], dtype=object),
            "kind": pd.Series(kind[first], dtype=object),
            "row": rows[first],
            "value": cases["failure_case"].iloc[first].reset_index(drop=True),
        }
    )


def combined_codes(*codes: np.ndarray) -> np.ndarray:
    """One int64 per position for several arrays of small non-negative codes, ordered as the
    tuples of codes are: a 1-D `np.unique` sorts these much faster than tuples (axis=1)."""
    if any(len(code) and code.min() < 0 for code in codes):
        raise ValueError("codes must not be negative")
    combined = np.zeros(len(codes[0]), np.int64)
    for code in codes:
        combined = combined * (int(code.max(initial=0)) + 1) + code
    return combined


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


KEY_TABLE_SPLIT_ROWS = 1000
"""A table of its key columns alone with at least this many rows is validated in a run per check
group (see `validated`); below it the extra runs cost more than they save."""


def validated(
    schema: pa.DataFrameSchema,
    typed: pd.DataFrame,
    kinds: Mapping[tuple[str, int], str],
    per_value: bool = True,
) -> tuple[pd.DataFrame, tuple[tuple[str, str, str], ...]]:
    """Pandera's verdict on the typed table: Weir's failure table, and the checks that never ran.

    Every check of a column without a key (range, pattern, codes, nullable, type) judges each value
    on its own, so a one-column table with few distinct values (the doubtful cells of one column
    in a large file) is validated on the first row of each value, and each failure then stands for
    every row holding that value: pandera's work, and its failure cases, grow with the values.
    A large table of the key columns alone (a large file's key part: rows whose key is shared or
    has a doubtful cell) is validated in one run for the key, which needs every row, then one run
    per column, each on the first row of each of its values, in the order pandera checks them.
    With `per_value` False every row is validated in one run (the result is the same; tests
    compare them).

    Not wider tables: splitting one into a run per repeating column was measured slower on
    ordinary files (each run costs pandera a few milliseconds, and most cells pass)."""
    if not per_value:
        return _run(_validator(schema, typed), typed, kinds, None)
    if _key_columns_alone(schema, typed):
        key = pa.DataFrameSchema(unique=schema.unique, report_duplicates=schema.report_duplicates)
        runs = [_run(key, typed, kinds, None)]
        for name, column in schema.columns.items():
            runs.append(_run(_series_schema(column), typed[[name]], kinds, repeats(typed[name], 2)))
        failures = [f for f, _ in runs if len(f)]
        merged = pd.concat(failures, ignore_index=True) if failures else NO_FAILURES.copy()
        return merged, tuple(u for _, unrun in runs for u in unrun)
    return _run(_validator(schema, typed), typed, kinds, _one_column_repeats(schema, typed))


def _key_columns_alone(schema: pa.DataFrameSchema, typed: pd.DataFrame) -> bool:
    keys = [schema.unique] if isinstance(schema.unique, str) else list(schema.unique or ())
    return (
        len(typed) >= KEY_TABLE_SPLIT_ROWS
        and bool(keys)
        and not schema.checks
        and set(typed.columns) == set(keys) == set(schema.columns)
    )


def _run(
    validator: pa.DataFrameSchema | pa.SeriesSchema,
    typed: pd.DataFrame,
    kinds: Mapping[tuple[str, int], str],
    same: Repeats | None,
) -> tuple[pd.DataFrame, tuple[tuple[str, str, str], ...]]:
    """One pandera run on `typed` (a series schema on its one column), or with `same` on the
    first row of each value, spread back."""
    judged = typed if same is None else typed.iloc[same.first]
    try:
        if isinstance(validator, pa.SeriesSchema):
            validator.validate(judged[validator.name], lazy=True)
        else:
            validator.validate(judged, lazy=True)
    except SchemaErrors as error:
        failures = _failure_table(error, kinds)
        return (failures if same is None else _spread(failures, same, typed.index)), _unrun(error, kinds)
    return NO_FAILURES.copy(), ()


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
    # Pandera lists each check's failing rows in row order, one check after another. Every case
    # is spread to at least its own row, so the checks come in the same order before and after.
    check = pd.factorize(  # each case's check, numbered in the order the checks come
        combined_codes(*(pd.factorize(failures[c].to_numpy(dtype=object))[0] for c in ("column", "kind")))
    )[0]
    final = np.lexsort((rows, check[case]))
    return failures.iloc[case[final]].assign(row=rows[final]).reset_index(drop=True)


def _validator(schema: pa.DataFrameSchema, typed: pd.DataFrame) -> pa.DataFrameSchema | pa.SeriesSchema:
    """What validates `typed`: the schema, or for a one-column table its column's series schema.

    A schema without a key or checks of its own judges a one-column table exactly as its column
    does, and as a series schema on that column alone: pandera then gathers the failure cases
    once, where a column gathers them twice and a table schema three times (a part of a large
    file, each doubtful column judged on its own, took 7.2 ms a failing run as a column and 4.5 ms
    as a series)."""
    if typed.shape[1] != 1 or schema.unique or schema.checks or typed.columns[0] not in schema.columns:
        return schema
    return _series_schema(schema.columns[typed.columns[0]])


def _series_schema(column: pa.Column) -> pa.SeriesSchema:
    """The column's own checks as a series schema of the same name: the same verdicts."""
    return pa.SeriesSchema(
        column.dtype,
        checks=column.checks,
        nullable=column.nullable,
        unique=column.unique,
        report_duplicates=column.report_duplicates,
        coerce=column.coerce,
        name=column.name,
    )


def _one_column_repeats(schema: pa.DataFrameSchema, typed: pd.DataFrame) -> Repeats | None:
    """The repeats of a one-column table without a key, whose first rows stand for the others in
    `validated`; None to validate every row."""
    if typed.shape[1] != 1 or schema.unique:
        return None
    return repeats(typed.iloc[:, 0], 2)


_last: tuple[TableContract, Frame, CheckedTable] | None = None


def checked(contract: TableContract, frame: Frame) -> CheckedTable:
    """`run_contract`, computed once per table even though every rule family asks for it."""
    global _last
    if _last is not None and _last[0] is contract and _last[1] is frame:
        return _last[2]
    result = run_contract(contract, frame)
    _last = (contract, frame, result)
    return result
