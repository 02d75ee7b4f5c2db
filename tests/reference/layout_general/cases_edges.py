"""Cases with extra rows and columns around the data: totals, notes, blanks, titles, indexes, no header."""

from __future__ import annotations

from corpus_case import add, table


def register() -> None:
    add(
        "grand-total-row",
        "totals-and-notes",
        "spreadsheet",
        "a Grand total row under the data is derived; drop it",
        table("""
department|headcount|cost
Finance|12|540000
Planning|8|352000
Parks|21|690000
Grand total|41|1582000
"""),
        table("""
department|headcount|cost
Finance|12|540000
Planning|8|352000
Parks|21|690000
"""),
    )
    add(
        "subtotals-per-group",
        "totals-and-notes",
        "spreadsheet",
        "subtotal rows after each region and a total at the end; drop them",
        table("""
region|shop|sales
North|Corran Street|1200
North|Mill Yard|880
North Subtotal||2080
South|Harbour Row|2310
South|Depot Lane|640
South Subtotal||2950
Total||5030
"""),
        table("""
region|shop|sales
North|Corran Street|1200
North|Mill Yard|880
South|Harbour Row|2310
South|Depot Lane|640
"""),
    )
    add(
        "footnotes-and-source",
        "totals-and-notes",
        "web",
        "footnote and source lines under the table are not data; drop them",
        table("""
district|turnout_pct
Kessel Ward|61.2
Brannoch|58.9
Oldfold|64.0
* Provisional figures.|
Source: Vell Basin count office, invented demo data.|
"""),
        table("""
district|turnout_pct
Kessel Ward|61.2
Brannoch|58.9
Oldfold|64.0
"""),
    )
    add(
        "sum-row-first-column",
        "totals-and-notes",
        "notebook",
        "a 'Sum' row at the bottom; drop it",
        table("""
crop|plots|yield_t
barley|4|12.2
oats|3|7.9
rye|2|4.1
Sum|9|24.2
"""),
        table("""
crop|plots|yield_t
barley|4|12.2
oats|3|7.9
rye|2|4.1
"""),
    )
    add(
        "blank-rows-between",
        "blank-rows-columns",
        "spreadsheet",
        "blank rows separate groups of data; drop them",
        table("""
item|count
Bolts M6|1200
Washers 6mm|3300
|
Hinges 75mm|210
Brackets|95
|
Screws 4x30|5000
"""),
        table("""
item|count
Bolts M6|1200
Washers 6mm|3300
Hinges 75mm|210
Brackets|95
Screws 4x30|5000
"""),
    )
    add(
        "blank-leading-column-row",
        "blank-rows-columns",
        "spreadsheet",
        "table starts at B2: an empty first row and column; drop them",
        [
            ["", "", "", ""],
            ["", "runner", "club", "time_s"],
            ["", "Dace", "Kell Harriers", "1012"],
            ["", "Pell", "Ardle AC", "998"],
            ["", "Orrin", "Kell Harriers", "1045"],
        ],
        table("""
runner|club|time_s
Dace|Kell Harriers|1012
Pell|Ardle AC|998
Orrin|Kell Harriers|1045
"""),
    )
    add(
        "title-rows-above",
        "title-rows",
        "spreadsheet",
        "a title and a date line above the real header; drop them",
        table("""
Vell Basin volunteer hours||
Prepared 2024-07-01||
volunteer|group|hours
Ilse Varnham|Tarn Beck Watch|14
Bram Kettleby|Orrin Friends|9
Maud Fenner|Tarn Beck Watch|21
"""),
        table("""
volunteer|group|hours
Ilse Varnham|Tarn Beck Watch|14
Bram Kettleby|Orrin Friends|9
Maud Fenner|Tarn Beck Watch|21
"""),
    )
    add(
        "unnamed-index-column",
        "index-column",
        "notebook",
        "a pandas index written as an unnamed first column; drop it",
        table("""
|species|wing_mm|mass_g
0|dipper|92|64
1|dipper|95|66
2|wagtail|88|21
3|wagtail|86|20
"""),
        table("""
species|wing_mm|mass_g
dipper|92|64
dipper|95|66
wagtail|88|21
wagtail|86|20
"""),
    )
    add(
        "unnamed-0-header",
        "index-column",
        "notebook",
        "'Unnamed: 0' column from a re-read pandas export; drop it",
        table("""
Unnamed: 0|order_id|amount
0|A-1001|12.50
1|A-1002|8.00
2|A-1003|30.25
"""),
        table("""
order_id|amount
A-1001|12.50
A-1002|8.00
A-1003|30.25
"""),
    )
    add(
        "repeated-header-rows",
        "repeated-header-rows",
        "web",
        "an HTML table repeats its header every few rows; drop the repeats",
        table("""
Pos|Team|Played|Points
1|Dunmore Rovers|10|24
2|Kell Town|10|21
3|Ardle United|10|18
Pos|Team|Played|Points
4|Fenwick Athletic|10|12
5|Wenlow Wanderers|10|9
Pos|Team|Played|Points
6|Oldfold City|10|4
"""),
        table("""
Pos|Team|Played|Points
1|Dunmore Rovers|10|24
2|Kell Town|10|21
3|Ardle United|10|18
4|Fenwick Athletic|10|12
5|Wenlow Wanderers|10|9
6|Oldfold City|10|4
"""),
    )
    add(
        "no-header-numbers",
        "no-header",
        "forum",
        "pasted data with no header row; the first line is data and must be kept",
        table("""
VB-014|2024-05-01|7.1|12.3
VB-021|2024-05-01|6.8|11.9
VB-033|2024-05-02|7.4|13.0
VB-040|2024-05-02|7.0|12.6
"""),
        table("""
column_1|column_2|column_3|column_4
VB-014|2024-05-01|7.1|12.3
VB-021|2024-05-01|6.8|11.9
VB-033|2024-05-02|7.4|13.0
VB-040|2024-05-02|7.0|12.6
"""),
    )
    add(
        "no-header-names",
        "no-header",
        "forum",
        "a name/score list pasted without a header; keep every line as data",
        table("""
Anwen Hask|64
Joss Mellor|80
Rhea Tollan|55
Tomos Wray|71
"""),
        table("""
column_1|column_2
Anwen Hask|64
Joss Mellor|80
Rhea Tollan|55
Tomos Wray|71
"""),
    )
