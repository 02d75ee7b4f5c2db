"""Further pasted shapes: markdown pipes, run columns, day-month headers, short wide tidy tables."""

from __future__ import annotations

from corpus_case import add, gather, table


def register() -> None:
    markdown = [
        ["", " site ", " ph ", " temp_c ", ""],
        ["", "---", "---", "---", ""],
        ["", " VB-014 ", " 7.1 ", " 11.2 ", ""],
        ["", " VB-021 ", " 6.8 ", " 11.9 ", ""],
        ["", " VB-033 ", " 7.4 ", " 10.4 ", ""],
    ]
    add(
        "markdown-pipe-table",
        "multi-step",
        "forum",
        "a markdown table split on pipes: empty first/last columns and a --- rule row; drop them, trim cells",
        markdown,
        table("""
site|ph|temp_c
VB-014|7.1|11.2
VB-021|6.8|11.9
VB-033|7.4|10.4
"""),
    )
    runs = table("""
Stop|Run 1|Run 2|Run 3
Quay End|07:10|08:10|09:10
Mill Yard|07:18|08:18|09:18
Corran St|07:25|08:27|09:25
""")
    add(
        "timetable-run-columns",
        "values-in-headers",
        "web",
        "one column per bus run; gather to stop, run, departs (run label kept as written)",
        runs,
        gather(runs[0], runs[1:], 1, "run", "departs"),
    )
    days = table("""
Volunteer|1 Mar|8 Mar|15 Mar|22 Mar
Ilse Varnham|3|2||4
Bram Kettleby|1|1|2|2
Maud Fenner||3|3|
""")
    add(
        "day-month-headers",
        "values-in-headers",
        "spreadsheet",
        "one column per survey day written as '1 Mar'; gather to volunteer, day, bags",
        days,
        gather(days[0], days[1:], 1, "day", "bags"),
    )
    months = table("""
Account|Jan 2024|Feb 2024|Mar 2024
Fuel|1210.40|1188.00|1302.75
Stationery|88.10|42.00|61.35
Postage|40.00|40.00|55.20
""")
    add(
        "month-year-words-headers",
        "values-in-headers",
        "spreadsheet",
        "headers like 'Jan 2024'; gather to account, month, spend",
        months,
        gather(months[0], months[1:], 1, "month", "spend"),
    )
    add(
        "key-value-colon-cells",
        "multi-step",
        "web",
        "a pasted profile list: every cell is 'Label: value', three lines per record; spread by label",
        [
            ["Name: Ilse Varnham"],
            ["Group: Tarn Beck Watch"],
            ["Hours: 14"],
            ["Name: Bram Kettleby"],
            ["Group: Orrin Friends"],
            ["Hours: 9"],
            ["Name: Maud Fenner"],
            ["Group: Tarn Beck Watch"],
            ["Hours: 21"],
        ],
        table("""
name|group|hours
Ilse Varnham|Tarn Beck Watch|14
Bram Kettleby|Orrin Friends|9
Maud Fenner|Tarn Beck Watch|21
"""),
    )
    tidy_short = table("""
site|river|altitude_m|catchment_km2|opened|gauge|logger|fenced
VB-014|Vell|120|44.1|2011|yes|no|yes
VB-021|Vell|85|61.0|2009|yes|yes|no
""")
    add(
        "tidy-short-and-wide",
        "tidy",
        "spreadsheet",
        "two sites, eight different variables: few rows and many columns is not a sideways table",
        tidy_short,
        tidy_short,
    )
    weeks = table("""
site|iso_week|visits
VB-014|2024-W05|2
VB-014|2024-W06|1
VB-021|2024-W05|3
VB-021|2024-W06|0
""")
    add(
        "tidy-iso-week-values",
        "tidy",
        "notebook",
        "ISO 8601 week values (2024-W05) are single values",
        weeks,
        weeks,
    )
    pairs = table("""
site_from|site_to|distance_km
VB-014|VB-021|4.2
VB-021|VB-033|6.8
VB-033|VB-040|3.1
""")
    add(
        "tidy-from-to-columns",
        "tidy",
        "forum",
        "from/to pairs are two different roles of a site, not a repeated group to gather",
        pairs,
        pairs,
    )
