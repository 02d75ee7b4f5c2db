"""The pandera engine: what a contract compiles to, and how pandera's failures come back as provider rows."""

from __future__ import annotations

import numpy as np
import pandas as pd
import pandera.pandas as pa
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from linter.contract.engine import (
    FAILURE_COLUMNS,
    KEY_TABLE_SPLIT_ROWS,
    CheckedTable,
    checked,
    combined_codes,
    compile_schema,
    run_contract,
    validated,
)
from linter.contract.model import CodeList, TableContract, Variable, VarType
from linter.table import Table, first_row_header

CONTRACT = TableContract(
    "stream-chemistry",
    "one analyte measured in one water sample",
    ("site_id", "analyte"),
    (
        Variable("site_id", pattern=r"^VB-\d{3}$"),
        Variable("analyte", VarType.CATEGORY, codes=CodeList(("NITRATE", "PHOSPHATE"))),
        Variable("result", VarType.NUMBER, minimum=0, maximum=50, nullable=False, censored_prefix="<"),
        Variable("sampled_on", VarType.DATE, minimum="2026-01-01"),
    ),
    missing=("", "NA"),
)

HEADER = ["site_id", "analyte", "result", "sampled_on"]
BODY = [
    ["VB-001", "NITRATE", "0.5", "2026-03-02"],
    ["VB-01", "NITRATE", "60", "2025-12-31"],
    ["VB-001", "nitrate", "", "2026-03-02"],
    ["VB-001", "NITRATE", "<0.05", "NA"],
]
# Provider lines with gaps, as when a spreadsheet has blank or note lines between records.
LINES = (3, 5, 9, 10, 12)


def frame():
    table = Table("chemistry.csv", None, pd.DataFrame([HEADER, *BODY], dtype=object), LINES)
    return first_row_header(table)


def test_contract_compiles_to_a_pandera_schema() -> None:
    schema, kinds = compile_schema(CONTRACT, {"site_id", "analyte", "result", "sampled_on"})
    assert isinstance(schema, pa.DataFrameSchema)
    assert schema.unique == ["site_id", "analyte"]
    assert not schema.columns["result"].nullable and not schema.columns["site_id"].nullable
    assert schema.columns["sampled_on"].nullable
    assert kinds == {
        ("site_id", 0): "pattern",
        ("analyte", 0): "codes",
        ("result", 0): "range",
        ("sampled_on", 0): "range",
    }


def test_only_present_columns_are_compiled_and_a_partial_key_is_not_unique() -> None:
    schema, _ = compile_schema(CONTRACT, {"site_id", "result"})
    assert set(schema.columns) == {"site_id", "result"}
    assert schema.unique is None


@pytest.mark.parametrize(
    ("column", "kind", "lines"),
    [
        ("site_id", "pattern", [9]),
        ("analyte", "codes", [10]),
        ("result", "range", [9]),
        ("result", "nullable", [10]),
        ("sampled_on", "range", [9]),
        ("site_id", "unique", [5, 12]),
    ],
)
def test_failures_come_back_with_provider_lines(column: str, kind: str, lines: list[int]) -> None:
    result = run_contract(CONTRACT, frame())
    assert tuple(result.failures.columns) == FAILURE_COLUMNS
    assert sorted(result.failing(column, kind)["row"].tolist()) == lines


def test_censored_value_is_typed_as_its_limit() -> None:
    result = run_contract(CONTRACT, frame())
    assert result.typed.loc[12, "result"] == pytest.approx(0.05)
    assert bool(result.converted["result"].censored[12])


def test_pandera_uniqueness_agrees_with_pandas_duplicated() -> None:
    # Source: pandas reference library, DataFrame.duplicated(keep=False) over the key columns.
    result = run_contract(CONTRACT, frame())
    typed = result.typed
    expected = sorted(typed.index[typed.duplicated(list(CONTRACT.keys), keep=False)].tolist())
    assert sorted(set(result.failing("site_id", "unique")["row"])) == expected


def test_clean_table_has_no_failures() -> None:
    table = Table(
        "chemistry.csv",
        None,
        pd.DataFrame([HEADER, ["VB-001", "NITRATE", "1", "2026-02-01"]], dtype=object),
        (1, 2),
    )
    result = run_contract(CONTRACT, first_row_header(table))
    assert result.failures.empty


def test_the_engine_runs_once_per_table() -> None:
    shared = frame()
    assert checked(CONTRACT, shared) is checked(CONTRACT, shared)
    assert checked(CONTRACT, frame()) is not checked(CONTRACT, shared)


ONE_COLUMN = [
    Variable("site_id", pattern=r"^VB-\d{3}$", nullable=False),
    Variable("analyte", VarType.CATEGORY, codes=CodeList(("NITRATE", "PHOSPHATE"))),
    Variable("result", VarType.NUMBER, minimum=0, maximum=50, nullable=False),
    Variable("replicate", VarType.INTEGER, minimum=1, maximum=3),
    Variable("sampled_on", VarType.DATE, minimum="2026-01-01", maximum="2026-12-31", nullable=False),
]
WRITTEN = {
    "site_id": ["VB-001", "VB-01", "vb-001", "VB-001 ", None, "VB-999"],
    "analyte": ["NITRATE", "nitrate", "SULPHATE", None, "PHOSPHATE"],
    "result": ["0.5", "60", "-3", None, "about 3", "50", "1,5"],
    "replicate": ["1", "3", "7", "2.5", None, "0"],
    "sampled_on": ["2026-03-02", "2025-12-31", "2027-01-01", None, "03/02/2026", "2026-02-30"],
}


@settings(max_examples=60, deadline=None)
@given(st.sampled_from(ONE_COLUMN), st.data())
def test_one_column_validated_once_per_value_fails_the_same_cells(variable, data) -> None:
    # A one-column table with repeated values is validated on the first row of each value and its
    # failures spread back; validating every row must give the same failure table, row for row.
    cells = data.draw(st.lists(st.sampled_from(WRITTEN[variable.name]), min_size=16, max_size=200))
    gaps = data.draw(st.lists(st.integers(1, 3), min_size=len(cells), max_size=len(cells)))
    lines = (1, *(1 + sum(gaps[: i + 1]) for i in range(len(cells))))
    table = Table(
        "part.csv", None, pd.DataFrame([[variable.name], *[[c] for c in cells]], dtype=object), lines
    )
    contract = TableContract("part", "one cell", (), (variable,), missing=("",))
    converted = run_contract(contract, first_row_header(table))
    schema, kinds = compile_schema(contract, {variable.name})
    once, unrun_once = validated(schema, converted.typed, kinds)
    every, unrun_every = validated(schema, converted.typed, kinds, per_value=False)
    pd.testing.assert_frame_equal(once, every)
    assert unrun_once == unrun_every
    # A one-column table is validated by its column alone; inside a wider table the same column
    # goes through the whole schema: the failures must be the same.
    wide = TableContract("part", "one cell", (), (variable, Variable("note")), missing=("",))
    wide_schema, wide_kinds = compile_schema(wide, {variable.name, "note"})
    whole, _ = validated(wide_schema, converted.typed.assign(note="written"), wide_kinds, per_value=False)
    pd.testing.assert_frame_equal(whole[whole["column"] == variable.name].reset_index(drop=True), every)


@settings(max_examples=25, deadline=None)
@given(st.data())
def test_a_large_key_table_validated_in_runs_fails_the_same_cells(data) -> None:
    # A large file's key part holds the key columns alone: validated as one run for the key and
    # one per column (each once per value), it must fail the same cells, in the same order, as
    # one run over every row.
    key = (ONE_COLUMN[0], ONE_COLUMN[1])  # site_id (pattern, not nullable) and analyte (codes)
    pairs = data.draw(
        st.lists(st.tuples(*(st.sampled_from(WRITTEN[v.name]) for v in key)), min_size=2, max_size=40)
    )
    picks = data.draw(st.lists(st.integers(0, len(pairs) - 1), min_size=40, max_size=40))
    body = [list(pairs[picks[i % len(picks)]]) for i in range(KEY_TABLE_SPLIT_ROWS + len(pairs))]
    table = Table(
        "part.csv",
        None,
        pd.DataFrame([[v.name for v in key], *body], dtype=object),
        tuple(range(1, len(body) + 2)),
    )
    contract = TableContract("part", "one analyte in one sample", ("site_id", "analyte"), key, missing=("",))
    converted = run_contract(contract, first_row_header(table))
    schema, kinds = compile_schema(contract, {"site_id", "analyte"})
    runs, unrun_runs = validated(schema, converted.typed, kinds)
    every, unrun_every = validated(schema, converted.typed, kinds, per_value=False)
    pd.testing.assert_frame_equal(runs, every)
    assert unrun_runs == unrun_every


@pytest.mark.parametrize("per_value", [True, False])
def test_a_check_that_raises_is_reported_as_unrun_beside_the_cells_that_failed(per_value) -> None:
    def raises(values: pd.Series) -> pd.Series:
        raise TypeError("cannot compare text with a number")

    schema = pa.DataFrameSchema(
        {"result": pa.Column("float64", checks=[pa.Check.ge(0), pa.Check(raises)], nullable=True)}
    )
    typed = pd.DataFrame({"result": [1.0, -2.0, None, -2.0]}, index=[2, 3, 4, 5])
    failures, unrun = validated(schema, typed, {("result", 0): "range", ("result", 1): "range"}, per_value)
    assert failures[["column", "kind", "row"]].values.tolist() == [
        ["result", "range", 3],
        ["result", "range", 5],
    ]
    assert unrun == (("result", "range", 'TypeError("cannot compare text with a number")'),)


@given(
    st.lists(
        st.tuples(
            st.sampled_from(["site_id", "analyte", "result", None]),
            st.sampled_from(["codes", "pattern", "unique", None]),
            st.integers(2, 90),
        ),
        max_size=60,
    )
)
def test_failures_are_grouped_by_check_as_a_pandas_groupby_groups_them(cases) -> None:
    # Reference: pandas' own groupby over (column, kind), which the grouping replaced.
    failures = pd.DataFrame(
        {
            "column": pd.Series([c for c, _, _ in cases], dtype=object),
            "kind": pd.Series([k for _, k, _ in cases], dtype=object),
            "row": pd.Series([r for _, _, r in cases], dtype=np.int64),
            "value": pd.Series([str(r) for _, _, r in cases], dtype=object),
        }
    )
    table = CheckedTable({}, pd.DataFrame(), failures)
    expected = {key: rows for key, rows in failures.groupby(["column", "kind"], sort=False)}
    for column in ("site_id", "analyte", "result"):
        for kind in ("codes", "pattern", "unique"):
            reference = expected.get((column, kind), failures.iloc[:0])
            pd.testing.assert_frame_equal(table.failing(column, kind), reference)


@given(
    st.lists(st.tuples(st.integers(0, 4), st.integers(0, 2), st.integers(0, 900)), min_size=1, max_size=60)
)
def test_combined_codes_sort_and_repeat_as_their_tuples(tuples) -> None:
    # Reference: numpy's unique over the tuples themselves (axis=1), which _failure_table used.
    codes = np.array(tuples, dtype=np.int64).T
    _, first, which = np.unique(codes, axis=1, return_index=True, return_inverse=True)
    _, first_combined, which_combined = np.unique(
        combined_codes(*codes), return_index=True, return_inverse=True
    )
    assert first.tolist() == first_combined.tolist()
    assert which.reshape(-1).tolist() == which_combined.reshape(-1).tolist()
