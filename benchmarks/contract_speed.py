"""Time Weir's contract checks against two baselines in one run and print the ratios.

Contenders on the same invented Vell Basin chemistry table:
  weir          every registered inspector, as `weir check` runs them on one table;
  weir-contract only the contract families (conversion, pandera engine, findings);
  pandera-only  pandas coercion (to_numeric / to_datetime, errors="coerce") plus the same pandera
                schema: the floor any pandera-based check pays, without reasons, hints or findings;
  per-cell      the same conversion and checks written as a Python loop over cells, which is what
                Weir's vectorised conversion avoids.
Usage: python benchmarks/contract_speed.py [--rows 100000] [--repeat 3]
"""

from __future__ import annotations

import argparse
import random
import re
import time
from collections.abc import Callable
from datetime import datetime

import pandas as pd
import pandera.pandas as pa
from pandera.errors import SchemaErrors

import linter.rules.catalogue  # noqa: F401  (registers every rule family)
from linter.check import run_inspectors
from linter.contract.model import CodeList, TableContract, Variable, VarType
from linter.rules.registry import INSPECTORS
from linter.rules.subject import Subject
from linter.table import Table, first_row_header

ANALYTES = ("NITRATE", "NITRITE", "AMMONIUM", "PHOSPHATE", "CHLORIDE")
CONTRACT = TableContract(
    "stream-chemistry",
    "one analyte measured in one water sample",
    ("site_id", "sampled_on", "analyte"),
    (
        Variable("site_id", pattern=r"^VB-\d{3}$"),
        Variable("sampled_on", VarType.DATE, minimum="2020-01-01"),
        Variable("analyte", VarType.CATEGORY, codes=CodeList(ANALYTES)),
        Variable("result", VarType.NUMBER, minimum=0, maximum=500, unit="mg/L", censored_prefix="<"),
    ),
    missing=("", "NA", "-999"),
)


def invented_rows(count: int, seed: int = 7) -> list[list[str]]:
    """Invented results with about 2% planted problems of several kinds."""
    rng = random.Random(seed)
    odd = ("1,234", "12 mg/L", "3 ug/L", "<0.05", "NA", "-4", "about 3")
    rows = [["site_id", "sampled_on", "analyte", "result"]]
    for i in range(count):
        site = f"VB-{i // 600 % 1000:03d}"
        day = f"2026-{1 + i // 50 % 12:02d}-{1 + i % 28:02d}"
        analyte = ANALYTES[i % len(ANALYTES)]
        result = f"{rng.uniform(0, 40):.3f}" if rng.random() > 0.02 else rng.choice(odd)
        rows.append([site, day, analyte, result])
    return rows


CONTRACT_FAMILIES = tuple(
    f"linter.rules.{m}."
    for m in ("columns", "values", "value_codes", "value_patterns", "keys", "references", "comparisons")
)


def subject_of(rows: list[list[str]]) -> Subject:
    table = Table("chemistry.csv", None, pd.DataFrame(rows, dtype=object), tuple(range(1, len(rows) + 1)))
    return Subject(table, first_row_header(table), CONTRACT, {})


def weir(rows: list[list[str]]) -> int:
    """Every inspector Weir registers (layout, units and reading rules too), as `weir check` runs them."""
    return len(run_inspectors(subject_of(rows)))


def weir_contract(rows: list[list[str]]) -> int:
    """Only the contract families: conversion, the pandera engine and the findings built from it."""
    subject = subject_of(rows)
    return sum(
        len(list(inspect(subject)))
        for name, inspect in INSPECTORS.items()
        if name.startswith(CONTRACT_FAMILIES)
    )


def pandera_only(rows: list[list[str]]) -> int:
    body = pd.DataFrame(rows[1:], columns=rows[0], dtype=object)
    typed = pd.DataFrame(
        {
            "site_id": body["site_id"],
            "sampled_on": pd.to_datetime(body["sampled_on"], format="%Y-%m-%d", errors="coerce"),
            "analyte": body["analyte"],
            "result": pd.to_numeric(body["result"], errors="coerce"),
        }
    )
    schema = pa.DataFrameSchema(
        {
            "site_id": pa.Column(checks=pa.Check.str_matches(r"^VB-\d{3}$"), nullable=False),
            "sampled_on": pa.Column(checks=pa.Check.ge(pd.Timestamp("2020-01-01")), nullable=False),
            "analyte": pa.Column(checks=pa.Check.isin(list(ANALYTES)), nullable=False),
            "result": pa.Column(checks=pa.Check.in_range(0, 500), nullable=True),
        },
        unique=["site_id", "sampled_on", "analyte"],
        report_duplicates="all",
    )
    try:
        schema.validate(typed, lazy=True)
    except SchemaErrors as error:
        return len(error.failure_cases)
    return 0


def per_cell(rows: list[list[str]]) -> int:
    problems = 0
    seen: set[tuple[str, str, str]] = set()
    site = re.compile(r"^VB-\d{3}$")
    for site_id, sampled_on, analyte, result in rows[1:]:
        problems += not site.match(site_id)
        try:
            problems += datetime.strptime(sampled_on, "%Y-%m-%d") < datetime(2020, 1, 1)
        except ValueError:
            problems += 1
        problems += analyte not in ANALYTES
        text = result.strip()
        if text not in ("", "NA", "-999"):
            try:
                value = float(text.removeprefix("<"))
                problems += not 0 <= value <= 500
            except ValueError:
                problems += 1
        key = (site_id, sampled_on, analyte)
        problems += key in seen
        seen.add(key)
    return problems


def best_of(repeat: int, job: Callable[[list[list[str]]], int], rows: list[list[str]]) -> tuple[float, int]:
    times: list[float] = []
    outcome = 0
    for _ in range(repeat):
        started = time.perf_counter()
        outcome = job(rows)
        times.append(time.perf_counter() - started)
    return min(times), outcome


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, default=100_000)
    parser.add_argument("--repeat", type=int, default=3)
    options = parser.parse_args()
    rows = invented_rows(options.rows)
    weir(rows[:50])  # warm imports and pandera's first-use costs outside the timing
    results = {
        name: best_of(options.repeat, job, rows)
        for name, job in (
            ("weir", weir),
            ("weir-contract", weir_contract),
            ("pandera-only", pandera_only),
            ("per-cell", per_cell),
        )
    }
    base = results["weir-contract"][0]
    print(f"{options.rows} rows, best of {options.repeat}")
    print(f"{'contender':<14}{'seconds':>10}{'rows/s':>12}{'vs contract':>13}  outcome")
    for name, (seconds, outcome) in results.items():
        unit = "findings" if name.startswith("weir") else "failing cells"
        speed = options.rows / seconds
        print(f"{name:<14}{seconds:>10.3f}{speed:>12,.0f}{seconds / base:>12.2f}x  {outcome} {unit}")


if __name__ == "__main__":
    main()
