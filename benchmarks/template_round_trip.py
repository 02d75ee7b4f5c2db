"""Time `weir check` on a filled template against the same rows in a plain workbook, and print the ratio.

Contenders, both holding the same invented Vell Basin chemistry rows, checked with the same contract:
  template  the workbook `weir template` writes (validations, text formats, examples, Instructions),
            filled below its examples: Weir must recognise and drop the template's own parts;
  plain     a bare workbook with only the header and the rows (the baseline: no template parts).
The ratio is the cost of reading a template back. Usage:
  python benchmarks/template_round_trip.py [--rows 5000] [--repeat 3]
"""

from __future__ import annotations

import argparse
import tempfile
import time
from datetime import date, timedelta
from pathlib import Path

from openpyxl import Workbook, load_workbook

from linter.check import check_paths
from linter.contract.load import load_contract
from linter.template.workbook import workbook_bytes

CONTRACT = Path(__file__).resolve().parent.parent / "contracts" / "stream-chemistry.yaml"
ANALYTES = ("NITRATE", "NITRITE", "AMMONIUM", "PHOSPHATE", "CHLORIDE", "SULFATE", "CALCIUM", "IRON")


def rows(count: int) -> list[list[object]]:
    """Distinct keys: site x day x analyte, all values valid (invented)."""
    out: list[list[object]] = []
    for i in range(count):
        site, rest = divmod(i, 8 * 400)
        day, analyte = divmod(rest, 8)
        out.append(
            [
                f"VB-{site:03d}",
                date(2021, 1, 1) + timedelta(days=day),
                ANALYTES[analyte],
                round(0.1 + i % 97, 2),
                None,
                f"KL{i:06d}",
            ]
        )
    return out


def best(run: int, action: object) -> float:
    times = []
    for _ in range(run):
        start = time.perf_counter()
        action()  # type: ignore[operator]
        times.append(time.perf_counter() - start)
    return min(times)


def main() -> None:
    parser = argparse.ArgumentParser()
    parser.add_argument("--rows", type=int, default=5000)
    parser.add_argument("--repeat", type=int, default=3)
    options = parser.parse_args()
    contract = load_contract(str(CONTRACT))
    data = rows(options.rows)
    with tempfile.TemporaryDirectory() as folder:
        template = Path(folder) / "template.xlsx"
        template.write_bytes(workbook_bytes(contract))
        book = load_workbook(template)
        for r, values in enumerate(data, start=4):
            for c, value in enumerate(values, start=1):
                book["stream-chemistry"].cell(row=r, column=c, value=value)
        book.save(template)
        plain = Path(folder) / "plain.xlsx"
        bare = Workbook()
        sheet = bare.worksheets[0]
        sheet.title = "stream-chemistry"
        sheet.append(list(contract.tables[0].names))
        for values in data:
            sheet.append(values)
        bare.save(plain)
        results = {}
        for name, path in (("template", template), ("plain", plain)):
            report = check_paths([str(path)], [contract])
            assert [t.rows for t in report.results] == [options.rows], name  # same rows seen by both
            results[name] = best(options.repeat, lambda p=path: check_paths([str(p)], [contract]))
    for name, seconds in results.items():
        print(f"{name:9} {seconds:7.3f} s  ({options.rows} rows, best of {options.repeat})")
    print(f"ratio template/plain: {results['template'] / results['plain']:.2f}")


if __name__ == "__main__":
    main()
