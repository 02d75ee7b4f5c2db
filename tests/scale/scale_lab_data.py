"""Shared invented Vell Basin lab submissions for the scale tests (small: the tests must stay fast)."""

from __future__ import annotations

import random

CONTRACT = """\
contract: lab-results
version: 1
title: Vell Basin Water Network laboratory results (invented demo scenario)
observational_unit: one analyte measured in one water sample
applies_to: ["results*.csv"]
keys: [sample_id, analyte]
variables:
  sample_id: {type: string, pattern: '^S\\d{7}$'}
  site_id: {type: string, pattern: '^VB-\\d{3}$'}
  sampled_on: {type: date, min: 2020-01-01, max: 2026-12-31}
  analyte: {type: category, values: [NITRATE, PHOSPHATE, AMMONIUM, CHLORIDE]}
  result: {type: number, min: 0, max: 500, unit: mg/L, censored_prefix: "<"}
  replicate: {type: integer, min: 1, max: 3}
  qualifier: {type: category, values: [J, U]}
  lab: {type: category, values: [KESTREL, HERON, OTTER], nullable: false}
missing: ["", "NA"]
"""
HEADER = "sample_id,site_id,sampled_on,analyte,result,replicate,qualifier,lab"
ANALYTES = ("NITRATE", "PHOSPHATE", "AMMONIUM", "CHLORIDE")
LABS = ("KESTREL", "HERON", "OTTER")
# One planted break per kind the contract rules know; each replaces one cell of a clean row.
BREAKS: tuple[tuple[int, str], ...] = (
    (0, "S12"),  # pattern mismatch
    (1, "vb-014"),  # pattern mismatch (case)
    (2, "03/02/2026"),  # date in another form
    (2, "2026-02-30"),  # no such day
    (2, "2019-12-31"),  # below the minimum date
    (3, "Nitrate "),  # code variant
    (3, "SULPHATE"),  # not in the code list
    (4, "1,420"),  # thousands separator
    (4, "0.2 mg/L"),  # unit in the cell
    (4, "12 ug/L"),  # another unit
    (4, "-3"),  # below the minimum
    (4, "<0.05"),  # censored: valid, but the screen hands it to the engine
    (4, "about 3"),  # not a number
    (5, "2.5"),  # not an integer
    (5, "7"),  # above the maximum
    (6, "X"),  # not in the code list
    (7, ""),  # missing where not nullable
    (7, "NA"),  # missing code where not nullable
    (0, ""),  # missing key
    (1, "VB-٠١٤"),  # Arabic-Indic digits: Python's \\d matches them, Arrow's RE2 does not
)


def clean_row(number: int, rng: random.Random) -> list[str]:
    return [
        f"S{number // 4:07d}",
        f"VB-{rng.randrange(1, 60):03d}",
        f"2026-{rng.randrange(1, 13):02d}-{rng.randrange(1, 29):02d}",
        ANALYTES[number % 4],
        f"{rng.uniform(0, 400):.3f}",
        str(rng.randrange(1, 4)),
        rng.choice(("", "", "J", "U")),
        rng.choice(LABS),
    ]


def lab_rows(count: int, seed: int, broken_every: int = 0) -> list[list[str]]:
    """Clean invented rows; with `broken_every`, every n-th row gets the next planted break."""
    rng = random.Random(seed)
    rows = [clean_row(n, rng) for n in range(count)]
    if broken_every:
        for number, row_index in enumerate(range(3, count, broken_every)):
            column, value = BREAKS[number % len(BREAKS)]
            rows[row_index][column] = value
        # Two exact duplicates and one duplicate written differently but equal as typed keys.
        rows[count - 1] = list(rows[5])
        rows[count - 2] = list(rows[9])
    return rows


def csv_text(rows: list[list[str]]) -> str:
    def cell(value: str) -> str:
        return f'"{value}"' if "," in value else value

    return HEADER + "\n" + "".join(",".join(cell(v) for v in r) + "\n" for r in rows)


def bad_sites_first(count: int, bad: int, seed: int) -> list[list[str]]:
    """Clean rows whose first `bad` site ids break the pattern, so the first good one lies beyond them."""
    rows = lab_rows(count, seed)
    for row in rows[:bad]:
        row[1] = "vb-" + row[1][3:]
    return rows
