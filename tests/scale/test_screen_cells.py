"""Cell by cell, the screen never passes what the engine of record would find fault with.

Hypothesis draws awkward cell texts per type (signs, dots, spaces and tabs, exponents, digits of
other scripts, missing codes, impossible dates); every cell the screen calls clean must convert
without a reason, raise no pandera failure, and be typed as the engine types it.
"""

from __future__ import annotations

import pandas as pd
import pyarrow as pa
import pyarrow.compute as pc
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

from linter.contract.engine import CheckedTable, run_contract
from linter.contract.model import CodeList, TableContract, Variable, VarType
from linter.scale.kernels import iso_dates, plain_number_shape
from linter.scale.screen import Screened, screen_batch, trimmed_text
from linter.table import Table, first_row_header

# The suite's examples repeat on every run (a CI failure can be reproduced); the "long" profile of
# tests/conftest.py draws fresh ones.
LONG_RUN = settings.default.max_examples > 100

MISSING = ("", "NA", "-999")
VARIABLES = {
    "result": Variable(
        "result", VarType.NUMBER, minimum=0, maximum=500, censored_prefix="<", missing=("n/a",)
    ),
    "depth_m": Variable("depth_m", VarType.NUMBER),
    "replicate": Variable("replicate", VarType.INTEGER, minimum=1, maximum=3),
    "count": Variable("count", VarType.INTEGER),
    "sampled_on": Variable("sampled_on", VarType.DATE, minimum="2020-01-01", maximum="2026-12-31"),
    "logged_on": Variable("logged_on", VarType.DATE),
    "filtered": Variable("filtered", VarType.BOOLEAN),
    "site_id": Variable("site_id", VarType.STRING, pattern=r"^VB-\d{3}$"),
    "qualifier": Variable("qualifier", VarType.CATEGORY, codes=CodeList(("J", "U", " R"))),
    "lab_code": Variable("lab_code", VarType.CATEGORY, codes=CodeList(("J", "U")), nullable=False),
    "note": Variable("note", VarType.STRING, nullable=False),
}

SPACES = st.sampled_from(["", "", "", " ", "  ", "\t", "\u00a0", "\u2003", "\x1c", "\n"])
SIGNS = st.sampled_from(["", "", "", "+", "-", "--", "+-", "−"])
DIGITS = st.text(st.sampled_from("0123456789"), min_size=0, max_size=18) | st.sampled_from(
    ["١٢", "１２", "٠", "12", "007", "4", "1" * 16, "9" * 31]
)
NUMBER_TAILS = st.sampled_from(
    ["", "", "", ".", ".5", "..5", ".5.", "e5", "E-3", "e", "e+", " mg/L", "%", ","]
)
NUMBER_WORDS = st.sampled_from(
    ["NaN", "nan", "inf", "-inf", "Infinity", "<0.05", "< 2", "<", "n/a", "1,420", "0x1F"]
)
MISSING_CELLS = st.sampled_from(["", "NA", " NA ", "na", "-999", " -999", "n/a", "N/A"])


@st.composite
def number_texts(draw: st.DrawFn) -> str:
    if draw(st.integers(0, 5)) == 0:
        return draw(NUMBER_WORDS | MISSING_CELLS)
    if draw(st.booleans()):
        body = repr(draw(st.floats(allow_nan=True, allow_infinity=True)))
    else:
        body = draw(SIGNS) + draw(DIGITS) + draw(NUMBER_TAILS)
    return draw(SPACES) + body + draw(SPACES)


@st.composite
def date_texts(draw: st.DrawFn) -> str:
    if draw(st.integers(0, 4)) == 0:
        return draw(
            st.sampled_from(
                [
                    "2026-02-29",
                    "2024-02-29",
                    "1900-02-29",
                    "2000-02-29",
                    "2026-13-01",
                    "2026-00-10",
                    "2026-1-05",
                    "2026-03-02 ",
                    " 2026-03-02",
                    "2026-03-02\n",
                    "1677-09-21",
                    "1678-01-01",
                    "2261-12-31",
                    "2262-04-11",
                    "0000-01-01",
                    "9999-12-31",
                    "٢٠٢٦-٠٣-٠٢",
                    "２０２６-03-02",
                    "2026-03-02T00:00",
                    "20260302",
                    "03/02/2026",
                    "2026/03/02",
                    "2026-03",
                    "+026-03-02",
                    "2026-03-3 ",
                    "2026–03–02",
                ]
            )
            | MISSING_CELLS
        )
    year = draw(st.integers(0, 9999))
    month = draw(st.integers(0, 13))
    day = draw(st.integers(0, 32))
    dash = draw(st.sampled_from(["-", "-", "-", "/", ".", ""]))
    return f"{year:04d}{dash}{month:02d}-{day:02d}"


BOOLEAN_TEXTS = st.sampled_from(
    [
        "true",
        "false",
        "TRUE",
        " False ",
        "1",
        "0",
        " 1",
        "yes",
        "t",
        "falſe",
        "TRUE\t",
        "tru",
        "İ",
        "01",
        "NA",
    ]
)
PATTERN_TEXTS = st.sampled_from(
    [
        "VB-014",
        "VB-٠١٤",
        "vb-014",
        "VB-014\n",
        " VB-014",
        "VB-0145",
        "VB-01",
        "ＶB-014",
        "VB-014 ",
        "NA",
        "VB‑014",
    ]
)
CODE_TEXTS = st.sampled_from(["J", "U", " J", "j", "J ", "R", " R", "NA", "Ｊ", "U\u00a0", "-999"])
TEXTS = st.sampled_from(["plain note", " ", "  ", "\t", "NA", " NA", "n/a", "-999", "é", "\u00a0"])

CELLS = {
    VarType.NUMBER: number_texts(),
    # The engine itself cannot yet read an integer beyond int64 (reported): keep them below it.
    VarType.INTEGER: number_texts().filter(lambda c: sum(ch in "0123456789" for ch in c) <= 18),
    VarType.DATE: date_texts(),
    VarType.BOOLEAN: BOOLEAN_TEXTS | MISSING_CELLS,
    VarType.STRING: PATTERN_TEXTS | TEXTS | MISSING_CELLS,
    VarType.CATEGORY: CODE_TEXTS | MISSING_CELLS,
}


def contract_of(variable: Variable, keyed: bool) -> TableContract:
    return TableContract(
        "readings", "one reading", (variable.name,) if keyed else (), (variable,), missing=MISSING
    )


def engine_view(cells: list[str | None], contract: TableContract) -> CheckedTable:
    """The engine's judgement of one column, read as the ordinary readers read it (empty -> None)."""
    name = contract.variables[0].name
    grid = pd.DataFrame([[name], *([c or None] for c in cells)], dtype=object)
    return run_contract(
        contract, first_row_header(Table("readings.csv", None, grid, tuple(range(1, len(cells) + 2))))
    )


def screened(cells: list[str | None], contract: TableContract) -> Screened:
    # Half the time as one chunk, else in two, as Arrow's reader hands columns over.
    middle = len(cells) // 2
    column = pa.chunked_array([pa.array(cells[:middle], pa.string()), pa.array(cells[middle:], pa.string())])
    return screen_batch(pa.table({contract.variables[0].name: column}), contract)


def same_value(screen_value: object, engine_value: object) -> bool:
    if pd.isna(screen_value) or pd.isna(engine_value):
        return bool(pd.isna(screen_value) and pd.isna(engine_value))
    return bool(screen_value == engine_value)


def clean_rows(result: Screened) -> list[int]:
    return [i for i, s in enumerate(result.suspect.to_pylist()) if not s]


def judged_alike(cells: list[str | None], variable: Variable) -> None:
    """Clean cells raise nothing in the engine; as keys they are typed as the engine types them."""
    for keyed in (False, True):
        contract = contract_of(variable, keyed)
        result, engine = screened(cells, contract), engine_view(cells, contract)
        converted = engine.converted[variable.name]
        rows = list(engine.typed.index)
        flagged = set(engine.failures.loc[engine.failures["kind"] != "unique", "row"])
        for i in clean_rows(result):
            assert converted.reason[rows[i]] is None, (cells[i], converted.reason[rows[i]])
            assert not converted.censored[rows[i]], cells[i]
            assert rows[i] not in flagged, (cells[i], engine.failures)
        if not keyed:
            continue
        keys = result.keys.column(variable.name).to_pandas()
        typed = engine.typed[variable.name]
        for i, cell in enumerate(cells):
            engine_value = typed[rows[i]]
            must_agree = i in clean_rows(result) or variable.type is not VarType.BOOLEAN
            if variable.type is VarType.DATE and not pd.isna(engine_value):
                # Beyond pandas' nanosecond clock the screen keeps no date (a null key is coarser).
                must_agree &= pd.Timestamp("1677-09-22") <= engine_value <= pd.Timestamp("2262-04-10")
            if must_agree:
                assert same_value(keys[i], engine_value), (cell, keys[i], engine_value)


@pytest.mark.parametrize("name", list(VARIABLES))
@settings(max_examples=25, deadline=None, derandomize=not LONG_RUN)
@given(data=st.data())
def test_a_cell_the_screen_passes_is_one_the_engine_accepts(name: str, data: st.DataObject) -> None:
    variable = VARIABLES[name]
    cells = data.draw(st.lists(CELLS[variable.type] | st.none(), min_size=1, max_size=20))
    judged_alike(cells, variable)


@given(st.lists(number_texts(), min_size=1, max_size=20))
@example(["1.5", "15e-1", "<1.5", " 1.50 ", "+1.5"])  # one key value written five ways
@example(["+1000000000000000.5"])  # 17 significant digits: pandas reads ...0.4, Arrow ...0.5
@settings(max_examples=40, deadline=None, derandomize=not LONG_RUN)
def test_number_keys_are_typed_as_the_engine_types_them(cells: list[str]) -> None:
    judged_alike(cells, VARIABLES["result"])


def test_the_screen_passes_plain_forms_and_leaves_the_rest() -> None:
    # The property above would also hold for a screen that passes nothing: pin down what passes.
    numbers = pa.array(
        ["12.5", "-3", "+.5", "7.", "1e5", "1.2.3", "--1", "١٢", "", ".", "5-", "1" * 15, "1" * 16]
    )
    # At most 15 significant digits pass (see SIGNIFICANT_DIGITS): longer ones go to the engine.
    assert plain_number_shape(numbers, integer=False).tolist() == [True] * 4 + [False] * 7 + [True, False]
    integers = pa.array(["-12", "12.0", "1" * 15, "1" * 16, "+", "0"])
    assert plain_number_shape(integers, integer=True).tolist() == [True, False, True, False, False, True]
    dates = pa.array(
        ["2024-02-29", "2026-02-29", "2026-12-31", "1678-01-01", "1677-12-31", "2026-1-05", None]
    )
    real, stamps = iso_dates(dates)
    assert real.tolist() == [True, False, True, True, False, False, False]
    assert pd.to_datetime(stamps[real]).strftime("%Y-%m-%d").tolist() == [
        "2024-02-29",
        "2026-12-31",
        "1678-01-01",
    ]


def test_a_key_the_engine_cannot_read_sends_its_row_to_the_engine():
    contract = contract_of(VARIABLES["count"], keyed=True)
    result = screened(["12", "9" * 31, "1.5e0"], contract)
    assert result.suspect.to_pylist() == [False, True, True]
    assert result.keys.column("count").to_pylist() == [12.0, None, None]


@pytest.mark.parametrize(
    ("pattern", "cells", "suspect"),
    [
        (r"^VB-\d{3}$", ["VB-014", "NA", None], [False, True, True]),
        # The pattern matches a missing-value code itself: passing cells are looked up too.
        (r"^[A-Z]{2}$", ["AB", "NA"], [False, True]),
        # A pattern taking a space at its ends passes ' NA', whose trimmed text is a missing code.
        (r"^[A-Z ]{3}$", ["ABC", " NA", "NA "], [False, True, True]),
    ],
)
def test_a_missing_code_in_a_required_patterned_column_is_never_passed(
    pattern: str, cells: list[str | None], suspect: list[bool]
) -> None:
    variable = Variable("site_id", VarType.STRING, pattern=pattern, nullable=False)
    contract = contract_of(variable, keyed=False)
    assert screened(cells, contract).suspect.to_pylist() == suspect
    engine = engine_view(cells, contract)
    flagged = set(engine.failures["row"])
    assert [row in flagged for row in engine.typed.index] == suspect  # the engine agrees


CELL_BYTES = st.sampled_from([" ", "\t", "\u00a0", "\u2003", "\x1c", "\n", "a", "7", "é", "-"])


@given(st.lists(st.lists(st.text(CELL_BYTES, max_size=4) | st.none(), max_size=8), max_size=4))
@settings(max_examples=300, deadline=None, derandomize=True)
def test_a_chunk_left_untrimmed_has_no_cell_trimming_would_change(pieces: list[list[str | None]]) -> None:
    column = pa.chunked_array([pa.array(piece, pa.string()) for piece in pieces], pa.string())
    # Reference: Arrow's own whitespace trim applied to every cell of every chunk.
    assert trimmed_text(column).to_pylist() == pc.utf8_trim_whitespace(column).to_pylist()
