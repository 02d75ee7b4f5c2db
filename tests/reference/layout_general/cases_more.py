"""More mixed cases: notebook print-outs, headers over headers, totals beside wide blocks, tidy negatives."""

from __future__ import annotations

from corpus_case import add, gather, table


def register() -> None:
    add(
        "notebook-index-name-row",
        "multi-row-header",
        "notebook",
        "a pasted pandas frame with a named index: the index name sits alone on a second header line",
        table("""
|ph|nitrate
site||
VB-014|7.1|4.1
VB-021|6.8|5.6
VB-033|7.4|2.2
"""),
        table("""
site|ph|nitrate
VB-014|7.1|4.1
VB-021|6.8|5.6
VB-033|7.4|2.2
"""),
    )
    add(
        "notebook-sparse-multiindex",
        "same-as-above",
        "notebook",
        "a grouped pandas result prints its outer index once per group; fill the site down",
        table("""
site|year|ph
VB-014|2023|7.1
|2024|7.0
VB-021|2023|6.8
|2024|6.9
VB-033|2023|7.4
|2024|7.3
"""),
        table("""
site|year|ph
VB-014|2023|7.1
VB-014|2024|7.0
VB-021|2023|6.8
VB-021|2024|6.9
VB-033|2023|7.4
VB-033|2024|7.3
"""),
    )
    stacked = table("""
|Sales||
Shop|2023|2024
Corran Street|14200|15100
Mill Yard|9800|
Harbour Row|25100|26300
""")
    add(
        "variable-over-years-header",
        "multi-step",
        "spreadsheet",
        "a 'Sales' banner over year headers: drop the banner, gather years into shop, year, sales",
        stacked,
        gather(stacked[1], stacked[2:], 1, "year", "sales"),
    )
    bands = table("""
District|0-14|15-64|65+|Total
Kessel Ward|1820|7385|1940|11145
Brannoch|960|4117|1322|6399
Oldfold|2210|8942|2011|13163
""")
    add(
        "age-bands-with-total-column",
        "multi-step",
        "web",
        "age bands in headers plus a derived Total column; drop the total then gather the bands",
        bands,
        gather(bands[0][:4], [r[:4] for r in bands[1:]], 1, "age_band", "people"),
    )
    add(
        "note-line-above-header",
        "title-rows",
        "web",
        "a 'Note:' line and a blank line above the header; drop them",
        table("""
Note: counts are provisional||
||
trap|species|count
T-01|field vole|4
T-02|wood mouse|7
T-03|common shrew|2
"""),
        table("""
trap|species|count
T-01|field vole|4
T-02|wood mouse|7
T-03|common shrew|2
"""),
    )
    sections = table("""
site|visit|ph
Spring round||
VB-014|1|7.1
VB-021|1|6.8
Subtotal: 2 visits||
Autumn round||
VB-014|2|7.0
VB-033|2|7.4
Subtotal: 2 visits||
""")
    add(
        "sections-with-subtotals",
        "multi-step",
        "spreadsheet",
        "section rows name the round, a subtotal line ends each; lift the round, drop subtotals",
        sections,
        table("""
round|site|visit|ph
Spring round|VB-014|1|7.1
Spring round|VB-021|1|6.8
Autumn round|VB-014|2|7.0
Autumn round|VB-033|2|7.4
"""),
    )
    add(
        "transposed-budget-summary",
        "transposed",
        "spreadsheet",
        "fields down the first column and one column per project; swap so each project is a row",
        table("""
Field|PRJ-01|PRJ-02|PRJ-03
Lead|Tamsin Orrow|Bram Kettleby|Ilse Varnham
Start|2024-01-08|2024-02-12|2024-03-04
Budget|12000|8500|20400
Status|open|closed|open
"""),
        table("""
project|lead|start|budget|status
PRJ-01|Tamsin Orrow|2024-01-08|12000|open
PRJ-02|Bram Kettleby|2024-02-12|8500|closed
PRJ-03|Ilse Varnham|2024-03-04|20400|open
"""),
    )
    add(
        "no-header-timetable",
        "no-header",
        "web",
        "a copied timetable without a header row; the first line is a departure and must be kept",
        table("""
R7|Quay End|07:10
R7|Mill Yard|07:18
R7|Corran St|07:25
R12|Depot Lane|07:40
R12|Harbour Row|07:52
"""),
        table("""
column_1|column_2|column_3
R7|Quay End|07:10
R7|Mill Yard|07:18
R7|Corran St|07:25
R12|Depot Lane|07:40
R12|Harbour Row|07:52
"""),
    )
    add(
        "value-unit-in-wide-months",
        "multi-step",
        "forum",
        "months in headers and every cell carries its unit; gather months then split value and unit",
        table("""
gauge|Jan|Feb|Mar
Kell Moor|112 mm|98 mm|87 mm
Ardle Gap|141 mm|132 mm|101 mm
"""),
        table("""
gauge|month|rain|unit
Kell Moor|Jan|112|mm
Kell Moor|Feb|98|mm
Kell Moor|Mar|87|mm
Ardle Gap|Jan|141|mm
Ardle Gap|Feb|132|mm
Ardle Gap|Mar|101|mm
"""),
    )
    add(
        "blank-columns-between",
        "blank-rows-columns",
        "spreadsheet",
        "empty spacer columns between blocks of real columns; drop them",
        table("""
bin||item||count
A-12||Bolts M6||1200
A-13||Washers 6mm||3300
B-03||Hinges 75mm||210
"""),
        table("""
bin|item|count
A-12|Bolts M6|1200
A-13|Washers 6mm|3300
B-03|Hinges 75mm|210
"""),
    )
    add(
        "html-footer-row",
        "totals-and-notes",
        "web",
        "a web table ends with an 'All districts' total and a 'Last updated' line; drop both",
        table("""
district|registered|voted
Kessel Ward|6710|4102
Brannoch|3755|2210
Oldfold|7830|5012
All districts|18295|11324
Last updated 2024-05-03||
"""),
        table("""
district|registered|voted
Kessel Ward|6710|4102
Brannoch|3755|2210
Oldfold|7830|5012
"""),
    )
