"""The vectorised lookup of check kinds gives what the per-row lookup gave, on pandera's own failure table."""

from __future__ import annotations

import pandas as pd
import pandera.pandas as pa
from pandera.errors import SchemaErrors

from linter.contract.engine import _kind_of, _kinds_of


def test_vectorised_kinds_equal_row_by_row_kinds():
    schema = pa.DataFrameSchema(
        {
            "result": pa.Column(float, [pa.Check.ge(0), pa.Check.le(10)], nullable=False),
            "site_id": pa.Column(object, [pa.Check.str_matches(r"VB-\d{3}\Z"), pa.Check.isin(["VB-001"])]),
        },
        unique=["site_id"],
        report_duplicates="all",
    )
    frame = pd.DataFrame(
        {"result": [-1.0, 11.0, None, 3.0], "site_id": ["VB-001", "vb-2", "VB-003", "VB-001"]},
        index=pd.Index([2, 3, 4, 5]),
    )
    kinds = {
        ("result", 0): "range",
        ("result", 1): "range",
        ("site_id", 0): "pattern",
        ("site_id", 1): "codes",
    }
    try:
        schema.validate(frame, lazy=True)
    except SchemaErrors as error:
        cases = error.failure_cases[error.failure_cases["index"].notna()]
    else:
        raise AssertionError("pandera found nothing in a frame built to fail")
    # Reference: pandera's failure_cases table (its check and check_number columns) read row by row.
    expected = [_kind_of(row, kinds) for _, row in cases.iterrows()]
    assert set(expected) >= {"range", "pattern", "codes", "nullable", "unique"}
    assert _kinds_of(cases, kinds).tolist() == expected
