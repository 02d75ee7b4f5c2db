"""Already-tidy tables, many of them hard negatives that look suspicious but must come out unchanged."""

from __future__ import annotations

from corpus_case import Rows, add, table

TIDY: list[tuple[str, str, str, str]] = [
    (
        "wide-measurements",
        "spreadsheet",
        "one row per sample with several measured variables (ph, temp_c, do_mg_l)",
        """
sample|site|date|ph|temp_c|do_mg_l|conductivity_us
S-101|VB-014|2024-05-01|7.1|11.2|9.8|410
S-102|VB-021|2024-05-01|6.8|11.9|9.1|388
S-103|VB-033|2024-05-02|7.4|10.4|10.2|402
S-104|VB-040|2024-05-02|7.0|12.6|8.7|395
""",
    ),
    (
        "year-column-values",
        "notebook",
        "year is a real column with values, not headers",
        """
country_code|year|population
KX|2019|51200
KX|2020|51850
KY|2019|30110
KY|2020|30402
""",
    ),
    (
        "numeric-looking-names",
        "notebook",
        "x1, x2, x3 are distinct regressors, not a series of levels",
        """
obs|x1|x2|x3|y
1|0.5|1.2|3|10.1
2|0.7|1.1|2|9.8
3|0.2|1.9|5|12.4
4|0.9|0.8|1|8.7
""",
    ),
    (
        "free-text-comments",
        "forum",
        "comments hold commas and semicolons but are free text, not lists",
        """
visit_id|site|comment
V-1|VB-014|Water clear; banks eroded, fence down
V-2|VB-021|Algae present, light bloom; sample taken
V-3|VB-033|No access, gate locked
V-4|VB-040|Normal
""",
    ),
    (
        "dash-codes",
        "spreadsheet",
        "bin codes like A-12 are single codes, not ranges",
        """
item|bin|count
Bolts M6|A-12|1200
Washers 6mm|A-13|3300
Hinges 75mm|B-03|210
Brackets|C-21|95
""",
    ),
    (
        "iso-datetimes",
        "notebook",
        "ISO 8601 date-times are single values",
        """
reading_id|logged_at|level_m
R1|2024-05-01T06:00:00|1.21
R2|2024-05-01T12:00:00|1.25
R3|2024-05-01T18:00:00|1.30
R4|2024-05-02T00:00:00|1.28
""",
    ),
    (
        "surname-given-names",
        "spreadsheet",
        "'Surname, Given' names in one quoted column are one value each",
        """
member|joined|role
Orrow, Tamsin|2019-03-02|chair
Kettleby, Bram|2020-06-11|treasurer
Varnham, Ilse|2021-01-20|secretary
Fenner, Maud|2022-09-05|member
""",
    ),
    (
        "config-key-value",
        "notebook",
        "a settings table is one record per key; spreading would make a one-row table",
        """
setting|value
max_upload_mb|25
retention_days|365
default_unit|mg/L
notify_email|gate@vell-basin.example
""",
    ),
    (
        "sparse-missing-values",
        "spreadsheet",
        "many blank cells are real missing values, not same-as-above",
        """
site|date|ph|nitrate|phosphate|notes
VB-014|2024-05-01|7.1|||
VB-021|2024-05-01||5.6|0.31|
VB-033|2024-05-02|7.4|||meter fault
VB-040|2024-05-02||||dry bed
VB-051|2024-05-03|6.9|4.4||
""",
    ),
    (
        "long-already",
        "web",
        "already long: one row per station, month and value",
        """
station|month|rain_mm
Kell Moor|Jan|112.4
Kell Moor|Feb|98.1
Ardle Gap|Jan|140.9
Ardle Gap|Feb|131.5
""",
    ),
    (
        "league-table",
        "web",
        "a league table: one row per team, columns are distinct statistics",
        """
pos|team|played|won|drawn|lost|points
1|Dunmore Rovers|10|8|0|2|24
2|Kell Town|10|6|3|1|21
3|Ardle United|10|5|3|2|18
4|Fenwick Athletic|10|3|3|4|12
""",
    ),
    (
        "seasons-with-dash",
        "web",
        "2019-2020 is one season label, not a range to split",
        """
season|club|titles
2019-2020|Kell Town|1
2020-2021|Dunmore Rovers|1
2021-2022|Kell Town|2
2022-2023|Ardle United|1
""",
    ),
    (
        "height-feet-inches",
        "forum",
        "5'11\" is one height value; splitting is a unit conversion, not a layout fix",
        """
athlete|height|event
Dace|5'11"|high jump
Pell|6'2"|long jump
Orrin|5'8"|sprint
""",
    ),
    (
        "clinic-appointments",
        "spreadsheet",
        "one row per appointment with date and time columns",
        """
appointment|patient|date|time|clinician|status
A-5001|P001|2024-04-02|09:30|Dr Hask|attended
A-5002|P014|2024-04-02|10:00|Dr Hask|no-show
A-5003|P007|2024-04-02|10:30|Dr Mellor|attended
A-5004|P003|2024-04-03|09:00|Dr Mellor|cancelled
""",
    ),
    (
        "timetable-long",
        "web",
        "a timetable already one row per stop and departure",
        """
route|stop_seq|stop|departs
R7|1|Quay End|07:10
R7|2|Mill Yard|07:18
R7|3|Corran St|07:25
R7|4|Depot Lane|07:40
""",
    ),
    (
        "invoice-lines",
        "spreadsheet",
        "order lines with quantity, unit price and a computed line total column",
        """
order_id|line|item|qty|unit_price|line_total
A-1001|1|Tarn kettle|2|34.00|68.00
A-1001|2|Wick set|5|4.25|21.25
A-1002|1|Fold chair|4|21.50|86.00
A-1003|1|Reed lamp|1|18.99|18.99
""",
    ),
    (
        "survey-likert-items",
        "notebook",
        "one row per respondent; q1_access..q4_recommend are different questions, not levels",
        """
respondent|q1_access|q2_price|q3_staff|q4_recommend
R001|4|5|3|2
R002|2|2|4|5
R003|5|4|4|4
R004|3|3|2|1
""",
    ),
    (
        "species-observations",
        "spreadsheet",
        "one row per sighting",
        """
obs_id|date|site|species|count|observer
O-1|2024-04-12|VB-014|dipper|2|Ilse Varnham
O-2|2024-04-12|VB-014|grey heron|1|Ilse Varnham
O-3|2024-04-13|VB-033|kingfisher|1|Bram Kettleby
O-4|2024-04-14|VB-040|dipper|3|Maud Fenner
""",
    ),
    (
        "lab-results-with-unit-column",
        "spreadsheet",
        "value and unit already in separate columns",
        """
sample|analyte|result|unit
LS-01|nitrate|4.1|mg/L
LS-01|chloride|22|mg/L
LS-02|nitrate|3.8|mg/L
LS-02|ecoli|120|cfu/100mL
""",
    ),
    (
        "budget-quarter-column",
        "spreadsheet",
        "quarter is a column of values; amounts in one column",
        """
line|quarter|amount
Road maintenance|Q1 2024|101000
Road maintenance|Q2 2024|99500
Library services|Q1 2024|30100
Library services|Q2 2024|29800
""",
    ),
    (
        "grades-long",
        "spreadsheet",
        "one row per student and subject",
        """
student|class|subject|grade
Anwen Hask|10B|Maths|B
Anwen Hask|10B|English|A
Joss Mellor|10B|Maths|A
Joss Mellor|10B|English|C
""",
    ),
    (
        "inventory-snapshot",
        "spreadsheet",
        "one row per SKU with min/max reorder levels as distinct variables",
        """
sku|description|on_hand|reorder_min|reorder_max
TK-100|Tarn kettle|14|5|40
TK-110|Tarn kettle XL|0|2|10
FC-210|Fold chair|8|10|60
RL-300|Reed lamp|2|3|12
""",
    ),
    (
        "election-results-long",
        "web",
        "one row per district and candidate",
        """
district|candidate|party|votes
Kessel Ward|Alder Quinn|Riverside|4102
Kessel Ward|Maren Tosh|Meadow|3877
Brannoch|Alder Quinn|Riverside|2210
Brannoch|Maren Tosh|Meadow|2655
""",
    ),
    (
        "weather-daily",
        "notebook",
        "one row per station and day; min and max are different variables",
        """
station|date|tmin_c|tmax_c|rain_mm|wind_kmh
Kell Moor|2024-01-01|-2.1|6.4|3.2|22
Kell Moor|2024-01-02|-1.0|7.2|0.0|15
Ardle Gap|2024-01-01|-4.0|4.2|5.8|31
Ardle Gap|2024-01-02|-3.3|5.0|1.1|27
""",
    ),
    (
        "experiment-long-replicates",
        "notebook",
        "replicate already a column",
        """
sample|treatment|replicate|od600
S01|control|1|0.412
S01|control|2|0.398
S02|salt|1|0.281
S02|salt|2|0.277
""",
    ),
    (
        "timesheet-long",
        "spreadsheet",
        "one row per employee and day",
        """
employee|date|project|hours
Tamsin Orrow|2024-03-04|Survey|7.5
Tamsin Orrow|2024-03-05|Survey|7.5
Bram Kettleby|2024-03-04|Lab|8
Bram Kettleby|2024-03-05|Admin|4
""",
    ),
    (
        "addresses-with-commas",
        "forum",
        "quoted addresses contain commas but are single values",
        """
partner|address|postcode
Hollin Field Lab|Unit 4, Mill Yard, Lowmoor|LM1 4XX
Carrow Analytics|12 Quay End, Drayburn|DR2 9XX
Orrin Friends|The Old School, Brannoch|BR7 1XX
""",
    ),
    (
        "coded-categories",
        "spreadsheet",
        "codes like A12, B07 are single identifiers",
        """
plot|soil_code|crop|area_ha
P-01|A12|barley|2.4
P-02|B07|oats|1.8
P-03|A12|rye|3.1
P-04|C03|barley|0.9
""",
    ),
    (
        "percent-columns",
        "web",
        "count and percent already separate columns",
        """
answer|count|percent
Agree|160|43
Neutral|98|26
Disagree|71|19
Unsure|45|12
""",
    ),
    (
        "month-column-names-as-values",
        "notebook",
        "month is a column of values; the header row holds variable names",
        """
shop|month|sales|returns
Corran Street|Jan|1200|14
Corran Street|Feb|1130|9
Mill Yard|Jan|880|3
Mill Yard|Feb|902|5
""",
    ),
    (
        "two-key-columns-repeat",
        "spreadsheet",
        "repeated values in key columns are normal for a long table, not same-as-above",
        """
site|date|depth_m|temp_c
VB-014|2024-05-01|0.5|11.2
VB-014|2024-05-01|2.0|9.8
VB-014|2024-05-08|0.5|11.9
VB-021|2024-05-01|0.5|10.4
""",
    ),
    (
        "boolean-flags",
        "notebook",
        "several yes/no flag columns are distinct variables",
        """
site|has_gauge|has_logger|fenced|public_access
VB-014|yes|no|yes|no
VB-021|yes|yes|no|yes
VB-033|no|no|no|yes
""",
    ),
    (
        "totals-as-column-values",
        "spreadsheet",
        "a 'total' in a category column is a real category (total hardness), not a total row",
        """
sample|hardness_type|mg_l
LS-01|calcium|82
LS-01|magnesium|21
LS-01|total|103
LS-02|calcium|77
LS-02|magnesium|19
LS-02|total|96
""",
    ),
    (
        "single-column-list",
        "forum",
        "a one-column list of ids",
        """
site_id
VB-014
VB-021
VB-033
VB-040
VB-051
""",
    ),
    (
        "numeric-ids-and-zip",
        "spreadsheet",
        "zero-padded codes stay text-like identifiers",
        """
customer|postcode_area|orders
C0001|0412|3
C0002|0413|1
C0003|0977|7
""",
    ),
    (
        "version-strings",
        "notebook",
        "version numbers like 1.2.3 are single values",
        """
package|version|released
vellkit|1.2.3|2024-01-10
gatekeep|0.9.0|2023-11-02
basinplot|2.0.1|2024-03-15
""",
    ),
    (
        "scores-as-fraction-cols",
        "spreadsheet",
        "score and max already separate",
        """
pupil|quiz|correct|out_of
Anwen Hask|Fractions|12|15
Joss Mellor|Fractions|14|15
Rhea Tollan|Fractions|9|15
""",
    ),
    (
        "dates-day-first",
        "forum",
        "day-first dates are single values",
        """
ticket|opened|closed
T-101|01/02/2024|03/02/2024
T-102|01/02/2024|
T-103|02/02/2024|09/02/2024
""",
    ),
    (
        "household-roster",
        "spreadsheet",
        "one row per household member; blanks are real gaps",
        """
household|member|age|relation|employed
H-01|1|44|head|yes
H-01|2|41|spouse|
H-01|3|12|child|
H-02|1|70|head|no
""",
    ),
    (
        "units-in-headers",
        "spreadsheet",
        "units in headers (depth (m), temp (C)) name variables; tidy",
        """
profile|depth (m)|temp (C)|do (mg/L)
PR-1|0.5|11.2|9.8
PR-1|2.0|9.8|9.1
PR-2|0.5|12.1|9.4
PR-2|3.0|9.2|8.2
""",
    ),
    (
        "initials-names",
        "web",
        "'Hask, A.'-style author names are one value each and must not be split",
        """
report|author|year
VB-R-01|Hask, A.|2021
VB-R-02|Mellor, J.|2022
VB-R-03|Tollan, R.|2022
VB-R-04|Wray, T.|2023
""",
    ),
    (
        "summary-stats-columns",
        "notebook",
        "mean, sd and n per group are distinct statistics of one row",
        """
group|n|mean|sd|min|max
control|12|0.41|0.02|0.38|0.44
salt|12|0.28|0.03|0.24|0.33
heat|11|0.35|0.04|0.29|0.41
""",
    ),
    (
        "letter-grades-with-signs",
        "spreadsheet",
        "grades like A- and B+ are single values",
        """
student|module|grade
Anwen Hask|Ecology|A-
Joss Mellor|Ecology|B+
Rhea Tollan|Ecology|B
Tomos Wray|Ecology|C+
""",
    ),
]


def register() -> None:
    for name, style, why, text in TIDY:
        rows: Rows = table(text)
        add(f"tidy-{name}", "tidy", style, why, rows, rows)
