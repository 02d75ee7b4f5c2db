"""Writes the invented layout corpus: each case's tidy table first, then the messy form made from it.

The expected table is the ground truth and is written before (and independently of) Weir: the
messy input is derived from it here by plain Python, never by Weir's own reshaping code. Run
`python tests/reference/layout_corpus/build_cases.py` from the repo root to regenerate; the
cases are committed so the scorer never depends on this script.
"""

from __future__ import annotations

import csv
import random
import shutil
from collections.abc import Callable
from pathlib import Path

HERE = Path(__file__).resolve().parent
Rows = list[list[str]]
SITES = [f"VB-{n:03d}" for n in range(1, 60)]
ANALYTES = ["nitrate", "phosphate", "ammonium", "chloride", "sulphate", "turbidity"]
MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"]
TAXA = ["mayfly", "stonefly", "caddisfly", "midge", "blackfly", "snail", "leech", "shrimp"]
REACHES = ["Upper Vell", "Middle Vell", "Lower Vell", "Orrin Brook", "Tarn Beck"]
LABS = ["Hollin Lab", "Carrow Analytics", "Mere Field Station"]
CASES: dict[str, tuple[str, Rows, Rows]] = {}


def write(path: Path, rows: Rows) -> None:
    with path.open("w", newline="", encoding="utf-8") as handle:
        csv.writer(handle, lineterminator="\n").writerows(rows)


def case(name: str, family: str, messy: Rows, tidy: Rows) -> None:
    CASES[name] = (family, messy, tidy)


def num(rng: random.Random, low: float, high: float, digits: int = 1) -> str:
    return f"{rng.uniform(low, high):.{digits}f}"


def wide(rng: random.Random, headers: list[str], n: int, first: str = "site_id", blank_share: float = 0.0):
    """A wide table (one column per header value) and its gathered tidy form."""
    sites = rng.sample(SITES, n)
    messy: Rows = [[first, *headers]]
    tidy: Rows = [[first, "key", "value"]]
    for site in sites:
        row = [site]
        for h in headers:
            value = "" if rng.random() < blank_share else str(rng.randint(0, 40))
            row.append(value)
            if value:
                tidy.append([site, h, value])
        messy.append(row)
    return messy, tidy


def values_in_headers(rng: random.Random) -> None:
    for i in range(5):
        years = [str(y) for y in range(2015 + i, 2019 + i + i % 3)]
        case(f"years-{i}", "values-in-headers", *wide(rng, years, 4 + i, blank_share=0.1 * (i % 2)))
    for i in range(3):
        months = MONTHS[i : i + 4 + i]
        case(f"months-{i}", "values-in-headers", *wide(rng, months, 5, first="station"))
    for i in range(3):
        dates = [f"2025-{m:02d}-15" for m in range(1 + i, 5 + i)]
        case(f"dates-{i}", "values-in-headers", *wide(rng, dates, 6))
    for i in range(2):
        # Range headers become a range column, which is itself split into its two ends.
        ranges = ["0-5", "5-10", "10-20", "20-50"][: 3 + i]
        messy, tidy = wide(rng, ranges, 5)
        tidy = [["site_id", "from", "to", "value"]] + [[r[0], *r[1].split("-"), r[2]] for r in tidy[1:]]
        case(f"depth-bands-{i}", "values-in-headers", messy, tidy)
    for i, months in enumerate([["Jan 2026", "Feb 2026", "Mar 2026"], ["2025 Oct", "2025 Nov", "2025 Dec"]]):
        case(f"month-year-headers-{i}", "values-in-headers", *wide(rng, months, 4, blank_share=0.1))
    for i, prefix in enumerate(["wk", "visit_", "d"]):
        headers = [f"{prefix}{k}" for k in range(1, 5 + i)]
        messy, tidy = wide(rng, headers, 5, blank_share=0.15)
        tidy = [tidy[0]] + [[r[0], r[1][len(prefix) :], r[2]] for r in tidy[1:]]
        case(f"numbered-headers-{i}", "values-in-headers", messy, tidy)


def repeated_groups(rng: random.Random) -> None:
    for i, (fmt, members) in enumerate(
        [
            ("Sample {k} {m}", ["Depth", "Result"]),
            ("rep{k}_{m}", ["depth", "nitrate", "ph"]),
            ("{m}_{k}", ["depth", "result"]),
            ("{m} {k}", ["Time", "Flow"]),
        ]
    ):
        groups = 2 + i % 2
        messy: Rows = [["site_id"] + [fmt.format(k=k, m=m) for k in range(1, groups + 1) for m in members]]
        tidy: Rows = [["site_id", "group", *members]]
        for site in rng.sample(SITES, 4):
            row = [site]
            for k in range(1, groups + 1):
                values = [num(rng, 0, 10) for _ in members]
                row += values
                tidy.append([site, str(k), *values])
            messy.append(row)
        case(f"repeated-groups-{i}", "repeated-column-groups", messy, tidy)


def packed(rng: random.Random) -> None:
    for i, unit in enumerate(["mg/L", "µS/cm", "NTU"]):
        messy: Rows = [["site_id", "sampled_on", "reading"]]
        tidy: Rows = [["site_id", "sampled_on", "value", "unit"]]
        for site in rng.sample(SITES, 5):
            value = num(rng, 0, 50, 2)
            messy.append([site, "2025-04-0" + str(i + 1), f"{value} {unit}" if i != 1 else f"{value}{unit}"])
            tidy.append([site, "2025-04-0" + str(i + 1), value, unit])
        case(f"value-unit-{i}", "packed-column", messy, tidy)
    for i in range(2):
        messy = [["site_id", "depth_m", "temp_c"]]
        tidy = [["site_id", "from", "to", "temp_c"]]
        for site in rng.sample(SITES, 5):
            low = rng.randint(0, 5)
            high = low + rng.randint(1, 5)
            temp = num(rng, 4, 15)
            messy.append([site, f"{low}-{high}" if i == 0 else f"{low} to {high}", temp])
            tidy.append([site, str(low), str(high), temp])
        case(f"range-{i}", "packed-column", messy, tidy)
    for i, sep in enumerate(["/", "|"]):
        messy = [["site_id", "analyte_fraction", "result"]]
        tidy = [["site_id", "analyte", "fraction", "result"]]
        for site in rng.sample(SITES, 3):
            for analyte in ANALYTES[:2]:
                for fraction in ["filtered", "total"]:
                    value = num(rng, 0, 3, 2)
                    messy.append([site, f"{analyte}{sep}{fraction}", value])
                    tidy.append([site, analyte, fraction, value])
        case(f"two-codes-{i}", "packed-column", messy, tidy)


def list_cells(rng: random.Random) -> None:
    for i, sep in enumerate(["; ", "|", ", "]):
        messy: Rows = [["site_id", "surveyed_on", "taxa"]]
        tidy: Rows = [["site_id", "surveyed_on", "taxa"]]
        for site in rng.sample(SITES, 6):
            found = rng.sample(TAXA, rng.randint(1, 4))
            messy.append([site, "2025-05-12", sep.join(found)])
            tidy += [[site, "2025-05-12", t] for t in found]
        case(f"list-cells-{i}", "list-cells", messy, tidy)


def variables_in_rows(rng: random.Random) -> None:
    for i, names in enumerate([["temp_min", "temp_max"], ["tmin", "tmax"], ["flow_low", "flow_high"]]):
        messy: Rows = [["site_id", "day", "measure", "value"]]
        tidy: Rows = [["site_id", "day", *names]]
        for site in rng.sample(SITES, 3):
            for day in ["2025-06-01", "2025-06-02"]:
                values = [num(rng, 1, 9), num(rng, 10, 20)]
                messy += [[site, day, n, v] for n, v in zip(names, values, strict=True)]
                tidy.append([site, day, *values])
        case(f"variables-in-rows-{i}", "variables-in-rows", messy, tidy)
    messy = [["site_id", "visited_on", "measure", "value"]]
    tidy = [["site_id", "visited_on", "water_temp_c", "ph", "dissolved_oxygen"]]
    for site in rng.sample(SITES, 3):
        values = [num(rng, 4, 12), num(rng, 6, 8), num(rng, 8, 11)]
        messy += [[site, "2026-03-04", n, v] for n, v in zip(tidy[0][2:], values, strict=True)]
        tidy.append([site, "2026-03-04", *values])
    case("variables-in-rows-generic-measure", "variables-in-rows", messy, tidy)
    messy = [["site_id", "field", "entry"]]
    tidy = [["site_id", "sampled_on", "ph", "observer"]]
    for site in rng.sample(SITES, 4):
        row = ["2025-07-0" + str(rng.randint(1, 9)), num(rng, 6, 8), rng.choice(["Ana", "Bo", "Cy"])]
        messy += [[site, f, v] for f, v in zip(["sampled_on", "ph", "observer"], row, strict=True)]
        tidy.append([site, *row])
    case("variables-in-rows-mixed", "variables-in-rows", messy, tidy)


def transposed(rng: random.Random) -> None:
    for i in range(3):
        sites = rng.sample(SITES, 3 + i)
        tidy: Rows = [["site_id", "sampled_on", "ph", "lab"]]
        for site in sites:
            tidy.append([site, f"2025-08-{rng.randint(10, 28)}", num(rng, 6, 8), rng.choice(LABS)])
        messy = [list(col) for col in zip(*tidy, strict=True)]
        case(f"transposed-{i}", "transposed", messy, tidy)


def sections(rng: random.Random) -> None:
    for i in range(3):
        messy: Rows = [["site_id", "ph", "nitrate"]]
        tidy: Rows = [["reach", "site_id", "ph", "nitrate"]]
        for reach in REACHES[: 2 + i]:
            messy.append([reach, "", ""])
            for site in rng.sample(SITES, 2 + i % 2):
                row = [site, num(rng, 6, 8), num(rng, 0, 3, 2)]
                messy.append(row)
                tidy.append([reach, *row])
        case(f"section-titles-{i}", "section-titles", messy, tidy)


def same_as_above(rng: random.Random) -> None:
    for i in range(3):
        messy: Rows = [["site_id", "sampled_on", "ph"]]
        tidy: Rows = [["site_id", "sampled_on", "ph"]]
        for site in rng.sample(SITES, 3 + i):
            for k in range(3):
                day = f"2025-09-{k * 7 + 1:02d}"
                ph = num(rng, 6, 8)
                messy.append([site if k == 0 else "", day, ph])
                tidy.append([site, day, ph])
        case(f"same-as-above-{i}", "same-as-above", messy, tidy)


def multi_row_header(rng: random.Random) -> None:
    for i, (groups, subs) in enumerate(
        [
            (["nitrate", "phosphate"], ["min", "max"]),
            (["Spring", "Autumn"], ["count", "taxa"]),
            (["temp", "flow", "ph"], ["am", "pm"]),
        ]
    ):
        top = ["site_id"] + [g if k == 0 else "" for g in groups for k in range(len(subs))]
        second = [""] + [s for _ in groups for s in subs]
        tidy: Rows = [["site_id"] + [f"{g} {s}" for g in groups for s in subs]]
        messy: Rows = [top, second]
        for site in rng.sample(SITES, 4):
            row = [site] + [num(rng, 0, 9) for _ in groups for _ in subs]
            messy.append(row)
            tidy.append(row)
        case(f"multi-row-header-{i}", "multi-row-header", messy, tidy)


def no_header(rng: random.Random) -> None:
    for i in range(3):
        rows = [
            [site, f"2025-10-{rng.randint(10, 28)}", num(rng, 6, 8), num(rng, 0, 3, 2)]
            for site in rng.sample(SITES, 5 + i)
        ]
        case(f"no-header-{i}", "no-header", rows, [["a", "b", "c", "d"], *rows])


def margins(rng: random.Random) -> None:
    for i in range(4):
        body = [[site, num(rng, 6, 8), str(rng.randint(0, 30))] for site in rng.sample(SITES, 5)]
        tidy: Rows = [["site_id", "ph", "count"], *body]
        messy: Rows = []
        if i in (0, 3):
            messy += [["Vell Basin Water Network: spring survey", "", ""], ["", "", ""]]
        messy += tidy
        if i in (1, 3):
            messy.append(["Total", "", str(sum(int(r[2]) for r in body))])
        if i in (2, 3):
            messy += [["* pH measured in the field", "", ""], ["Source: volunteer survey sheets", "", ""]]
        case(f"totals-notes-{i}", "totals-and-notes", messy, tidy)
    for i in range(3):
        body = [[site, num(rng, 6, 8)] for site in rng.sample(SITES, 5)]
        messy = [["site_id", "", "ph"]] + [[r[0], "", r[1]] for r in body]
        if i:
            messy.insert(3, ["", "", ""])
        case(f"blank-{i}", "blank-rows-columns", messy, [["site_id", "ph"], *body])


def multi_step(rng: random.Random) -> None:
    for i in range(3):
        messy, tidy = wide(rng, [str(y) for y in range(2020, 2024)], 4)
        messy = [["Nitrate exceedance counts by year", "", "", "", ""], *messy]
        messy.append(["Note: counts are provisional", "", "", "", ""])
        if i == 1:
            messy.insert(len(messy) - 1, ["Total", "", "", "", ""])
        case(f"multi-title-years-notes-{i}", "multi-step", messy, tidy)
    for i in range(2):
        messy = [["site_id", "sampled_on", "ph"]]
        tidy = [["reach", "site_id", "sampled_on", "ph"]]
        for reach in REACHES[:2]:
            messy.append([reach, "", ""])
            for site in rng.sample(SITES, 2):
                for k in range(2):
                    day, ph = f"2025-03-{k + 10}", num(rng, 6, 8)
                    messy.append([site if k == 0 else "", day, ph])
                    tidy.append([reach, site, day, ph])
        case(f"multi-sections-fill-{i}", "multi-step", messy, tidy)
    messy = [["site_id", "2023", "2024", "2025"]]
    tidy = [["site_id", "year", "value", "unit"]]
    for site in rng.sample(SITES, 4):
        values = [num(rng, 0, 5, 2) for _ in range(3)]
        messy.append([site, *[f"{v} mg/L" for v in values]])
        tidy += [[site, str(2023 + k), v, "mg/L"] for k, v in enumerate(values)]
    case("multi-years-units", "multi-step", messy, tidy)


XLSX: dict[str, list[str]] = {}
"""Cases written as workbooks: case name -> merged ranges of its sheet."""


def workbooks(rng: random.Random) -> None:
    """Spreadsheet forms: merged group labels over a two-row header, merged site cells, a title."""
    top = ["site_id", "nitrate", "", "phosphate", ""]
    second = ["", "min", "max", "min", "max"]
    body = [
        [s, num(rng, 0, 1), num(rng, 1, 2), num(rng, 0, 0.05, 3), num(rng, 0.05, 0.1, 3)]
        for s in rng.sample(SITES, 4)
    ]
    case(
        "xlsx-merged-two-row-header",
        "multi-row-header",
        [top, second, *body],
        [["site_id", "a", "b", "c", "d"], *body],
    )
    XLSX["xlsx-merged-two-row-header"] = ["B1:C1", "D1:E1"]
    messy: Rows = [["site_id", "sampled_on", "ph"]]
    tidy: Rows = [["site_id", "sampled_on", "ph"]]
    merged = []
    for site in rng.sample(SITES, 3):
        start = len(messy) + 1
        for k in range(3):
            day, ph = f"2025-07-{k * 7 + 1:02d}", num(rng, 6, 8)
            messy.append([site if k == 0 else "", day, ph])
            tidy.append([site, day, ph])
        merged.append(f"A{start}:A{start + 2}")
    case("xlsx-merged-site-cells", "same-as-above", messy, tidy)
    XLSX["xlsx-merged-site-cells"] = merged
    messy, tidy = wide(rng, ["2022", "2023", "2024"], 4)
    case("xlsx-title-and-years", "multi-step", [["Exceedances per year", "", "", ""], *messy], tidy)
    XLSX["xlsx-title-and-years"] = ["A1:D1"]


def write_workbook(path: Path, rows: Rows, merged: list[str]) -> None:
    from openpyxl import Workbook

    book = Workbook()
    sheet = book.active
    assert sheet is not None
    sheet.title = "Results"
    for row in rows:
        sheet.append([None if v == "" else (float(v) if _is_number(v) else v) for v in row])
    for cells in merged:
        sheet.merge_cells(cells)
    book.save(path)


def _is_number(text: str) -> bool:
    try:
        float(text)
    except ValueError:
        return False
    return True


BUILDERS: list[Callable[[random.Random], None]] = [
    values_in_headers,
    repeated_groups,
    packed,
    list_cells,
    variables_in_rows,
    transposed,
    sections,
    same_as_above,
    multi_row_header,
    no_header,
    margins,
    multi_step,
    workbooks,
]


def main() -> None:
    from fresh_cases import fresh_tables
    from tidy_cases import tidy_tables
    from wickham_cases import wickham_tables

    # One generator per builder, so that adding cases to one family leaves the others as they were.
    for build in BUILDERS:
        build(random.Random(f"weir-layout-{build.__name__}"))
    for name, rows in tidy_tables(random.Random("weir-layout-tidy")).items():
        case(name, "tidy", rows, rows)
    for name, (messy, tidy) in wickham_tables().items():
        case(name, "tidy-data-paper", messy, tidy)
    for name, (family, messy, tidy) in fresh_tables().items():
        case(name, family, messy, tidy)
    for folder in HERE.iterdir():
        if folder.is_dir() and (folder / "case.yaml").exists():
            shutil.rmtree(folder)
    for name, (family, messy, tidy) in CASES.items():
        folder = HERE / name
        folder.mkdir()
        if name in XLSX:
            write_workbook(folder / "input.xlsx", messy, XLSX[name])
        else:
            write(folder / "input.csv", messy)
        write(folder / "expected.csv", tidy)
        (folder / "case.yaml").write_text(f"family: {family}\n", encoding="utf-8")
    print(f"{len(CASES)} cases written")


if __name__ == "__main__":
    main()
