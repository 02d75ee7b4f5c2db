"""Multi-step cases and spreadsheet cases with merged cells or stacked headers (written as .xlsx)."""

from __future__ import annotations

from typing import Any

from corpus_case import Rows, add, gather, table
from openpyxl import Workbook


def _book(rows: Rows, merges: tuple[str, ...] = ()) -> Any:
    def build() -> Any:
        book = Workbook()
        sheet = book.active
        sheet.title = "Data"
        for row in rows:
            sheet.append([_typed(cell) for cell in row])
        for span in merges:
            sheet.merge_cells(span)
        return book

    return build


def _typed(cell: str) -> Any:
    if cell == "":
        return None
    try:
        return int(cell)
    except ValueError:
        try:
            return float(cell)
        except ValueError:
            return cell


def register() -> None:
    body = table("""
Shop|Jan|Feb|Mar
Corran Street|1200|1130|1410
Mill Yard|880|902|
Harbour Row|2310|2205|2480
""")
    messy = [
        ["Monthly sales, first quarter", "", "", ""],
        ["", "", "", ""],
        *body,
        ["Total", "4390", "4237", "3890"],
        ["Figures in pounds; Mill Yard closed in March.", "", "", ""],
    ]
    add(
        "title-wide-total-note",
        "multi-step",
        "spreadsheet",
        "title, blank line, months as headers, a total row and a note; drop title/total/note then gather",
        messy,
        gather(body[0], body[1:], 1, "month", "sales"),
    )
    messy = table("""
District|2021|2022|2023
Urban||
Kessel Ward|4102|4200|4311
Oldfold|5012|5100|5230
Rural||
Brannoch|2210|2250|2301
Wenlow|1877|1880|1902
""")
    tidy = [["area", "district", "year", "voters"]]
    area = ""
    for row in messy[1:]:
        if row[1:] == ["", ""]:
            area = row[0]
            continue
        for j, year in enumerate(messy[0][1:], start=1):
            tidy.append([area, row[0], year, row[j]])
    add(
        "sections-plus-wide-years",
        "multi-step",
        "web",
        "section rows (Urban/Rural) label districts and years sit in headers; lift section then gather",
        messy,
        tidy,
    )
    stacked = [
        ["", "2023", "", "2024", ""],
        ["Site", "Nitrate", "Phosphate", "Nitrate", "Phosphate"],
        ["VB-014", "4.1", "0.12", "3.9", "0.10"],
        ["VB-021", "5.6", "0.31", "5.2", "0.27"],
        ["VB-033", "2.2", "0.05", "2.4", ""],
    ]
    tidy = [["site", "year", "nitrate", "phosphate"]]
    for row in stacked[2:]:
        tidy.append([row[0], "2023", row[1], row[2]])
        tidy.append([row[0], "2024", row[3], row[4]])
    add(
        "merged-year-header-xlsx",
        "multi-row-header",
        "spreadsheet",
        "year merged across two analyte columns above the analyte header; one row per site and year",
        stacked,
        tidy,
        _book(stacked, ("B1:C1", "D1:E1")),
    )
    stacked = [
        ["", "Male", "", "Female", ""],
        ["Ward", "Under 18", "18+", "Under 18", "18+"],
        ["Heron", "120", "340", "131", "362"],
        ["Kestrel", "88", "210", "90", "225"],
    ]
    tidy = [["ward", "sex", "age_group", "people"]]
    for row in stacked[2:]:
        for j, (sex, age) in enumerate(
            [("Male", "Under 18"), ("Male", "18+"), ("Female", "Under 18"), ("Female", "18+")], start=1
        ):
            tidy.append([row[0], sex, age, row[j]])
    add(
        "merged-sex-age-header-xlsx",
        "multi-step",
        "spreadsheet",
        "two header rows (sex merged over age groups) are both values; one row per ward, sex and age group",
        stacked,
        tidy,
        _book(stacked, ("B1:C1", "D1:E1")),
    )
    merged = [
        ["Region", "Shop", "Sales"],
        ["North", "Corran Street", "1200"],
        ["", "Mill Yard", "880"],
        ["", "Fold Lane", "450"],
        ["South", "Harbour Row", "2310"],
        ["", "Depot Lane", "640"],
    ]
    tidy = [
        ["region", "shop", "sales"],
        ["North", "Corran Street", "1200"],
        ["North", "Mill Yard", "880"],
        ["North", "Fold Lane", "450"],
        ["South", "Harbour Row", "2310"],
        ["South", "Depot Lane", "640"],
    ]
    add(
        "merged-region-cells-xlsx",
        "same-as-above",
        "spreadsheet",
        "region cells merged vertically over their shops; each shop row takes its region",
        merged,
        tidy,
        _book(merged, ("A2:A4", "A5:A6")),
    )
    twohead = [
        ["Station", "Temperature", "Temperature", "Rain"],
        ["", "min (C)", "max (C)", "(mm)"],
        ["Kell Moor", "-2.1", "6.4", "3.2"],
        ["Ardle Gap", "-4.0", "4.2", "5.8"],
        ["Sennet Vale", "0.8", "9.1", "0.0"],
    ]
    add(
        "two-row-header-units",
        "multi-row-header",
        "spreadsheet",
        "name on one header row, qualifier or unit on the next; join into one header, data unchanged",
        twohead,
        [["station", "temperature_min", "temperature_max", "rain_mm"], *twohead[2:]],
    )
    title_xlsx = [
        ["Vell Basin stock count", "", ""],
        ["Counted 2024-03-31", "", ""],
        ["", "", ""],
        ["Item", "Bin", "Count"],
        ["Bolts M6", "A-12", "1200"],
        ["Hinges 75mm", "B-03", "210"],
        ["Screws 4x30", "A-14", "5000"],
        ["Total", "", "6410"],
    ]
    add(
        "title-and-total-xlsx",
        "multi-step",
        "spreadsheet",
        "merged title, date line, blank row above the header and a total below; keep the three data rows",
        title_xlsx,
        [title_xlsx[3], *title_xlsx[4:7]],
        _book(title_xlsx, ("A1:C1",)),
    )
    wide_units = table("""
Lab results, spring round|||
site|nitrate_2023|nitrate_2024|
VB-014|4.1|3.9|
VB-021|5.6|5.2|
VB-033|2.2||
n = 3 sites|||
""")
    tidy = [["site", "year", "nitrate"]]
    for row in wide_units[2:5]:
        tidy.append([row[0], "2023", row[1]])
        tidy.append([row[0], "2024", row[2]])
    add(
        "title-blankcol-wide-note",
        "multi-step",
        "forum",
        "title row, empty last column, analyte_year headers, a count note; drop the extras, gather years",
        wide_units,
        tidy,
    )
    tags = table("""
product|Jan|Feb|Mar
Tarn kettle|10|12|9
Fold chair|4|6|
All|14|18|9
""")
    add(
        "all-row-plus-wide",
        "multi-step",
        "notebook",
        "an 'All' total row under a month-wide table; drop it then gather months",
        tags,
        gather(tags[0], tags[1:3], 1, "month", "units"),
    )
    index_wide = table("""
|site|2022|2023|2024
0|VB-014|12|15|11
1|VB-021|8|7|9
2|VB-033|20|22|
""")
    add(
        "index-column-plus-wide-years",
        "multi-step",
        "notebook",
        "pandas index column plus years in headers; drop the index then gather",
        index_wide,
        gather(index_wide[0][1:], [r[1:] for r in index_wide[1:]], 1, "year", "count"),
    )
    html = table("""
Route|Mon|Tue|Wed
R1|45|44|47
R7|12|11|12
Route|Mon|Tue|Wed
R12|30|29|31
""")
    add(
        "repeated-header-plus-wide",
        "multi-step",
        "web",
        "an HTML table repeats its header mid-way and weekdays sit in headers; drop repeat then gather",
        html,
        gather(html[0], [html[1], html[2], html[4]], 1, "day", "trips"),
    )
    blanks = table("""
site|ph|nitrate
VB-014|7.1|4.1 mg/L
|7.0|3.9 mg/L
VB-021|6.8|5.6 mg/L
|6.9|5.2 mg/L
""")
    add(
        "fill-down-plus-unit-split",
        "multi-step",
        "spreadsheet",
        "site left blank under its first row and nitrate carries its unit; fill down and split value/unit",
        blanks,
        table("""
site|ph|nitrate|unit
VB-014|7.1|4.1|mg/L
VB-014|7.0|3.9|mg/L
VB-021|6.8|5.6|mg/L
VB-021|6.9|5.2|mg/L
"""),
    )
