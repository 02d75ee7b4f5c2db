"""Cases with values or several variables stored in column headers, and repeated column groups."""

from __future__ import annotations

import re
from collections.abc import Callable

from corpus_case import add, as_written, gather, table


def trailing_number(header: str) -> str:
    """`rep2`, `T0`, `W01` -> the number: the prefix names the variable, as with the billboard
    data's `wk1`.. columns becoming week 1.. in Wickham, Tidy Data (J. Stat. Softw. 59(10), 2014)."""
    match = re.search(r"(\d+)$", header)
    assert match, header
    return match.group(1)


def _wide(
    name: str,
    style: str,
    why: str,
    text: str,
    ids: int,
    key: str,
    value: str,
    label: Callable[[str], str] = as_written,
) -> None:
    rows = table(text)
    add(name, "values-in-headers", style, why, rows, gather(rows[0], rows[1:], ids, key, value, label))


def register() -> None:
    _wide(
        "shop-sales-by-month",
        "spreadsheet",
        "one column per month abbreviation; gather to shop, month, sales",
        """
shop|Jan|Feb|Mar|Apr|May|Jun
Corran Street|1200|1130|1410|1388|1502|1611
Mill Yard|880|902|||1010|990
Harbour Row|2310|2205|2480|2511|2390|2602
""",
        1,
        "month",
        "sales",
    )
    _wide(
        "enrolment-by-year",
        "web",
        "school intake, one column per year; gather to school, year, pupils",
        """
School|2019|2020|2021|2022|2023
Lowmoor Primary|212|220|218|231|240
Fenwick Academy|640|655|661|670|702
St Aldren Infants|88|91|95|90|
Brackwater High|1102|1099|1120|1131|1150
""",
        1,
        "year",
        "pupils",
    )
    _wide(
        "budget-fiscal-years",
        "spreadsheet",
        "one column per fiscal year; gather, label FY2020 kept as written (not calendar 2020)",
        """
Budget line|FY2020|FY2021|FY2022|FY2023
Road maintenance|412000|398500|430250|455000
Library services|120400|118000|121900|125000
Parks and green spaces|88000|91200|90500|97800
Street lighting|56300|57100|59800|61250
""",
        1,
        "fiscal_year",
        "amount",
    )
    _wide(
        "rainfall-by-month-name",
        "notebook",
        "full month names as headers; gather to station, month, rain_mm",
        """
station|January|February|March|April
Kell Moor|112.4|98.1|87.0|64.2
Ardle Gap|140.9|131.5|101.2|70.8
Sennet Vale|76.3|70.0|66.8|51.1
""",
        1,
        "month",
        "rain_mm",
    )
    _wide(
        "visits-month-year-headers",
        "spreadsheet",
        "headers like Jan-24; gather keeping the header text as the month",
        """
Clinic|Jan-24|Feb-24|Mar-24|Apr-24|May-24
North Hollin|340|312|355|298|330
Drayburn|122|130|118||141
""",
        1,
        "month",
        "visits",
    )
    _wide(
        "iso-month-headers",
        "notebook",
        "ISO year-month headers 2024-01..; gather to route, month, riders",
        """
route|2024-01|2024-02|2024-03|2024-04
R1 Orbital|45210|43980|47002|46110
R7 Quayside|12030|11874|12566|12980
R12 Airport Link|30411|29870|31205|32011
""",
        1,
        "month",
        "riders",
    )
    _wide(
        "quarterly-revenue",
        "spreadsheet",
        "quarter labels Q1 2023.. as headers; gather to product, quarter, revenue",
        """
Product|Q1 2023|Q2 2023|Q3 2023|Q4 2023|Q1 2024
Tarn kettle|10400|11250|9800|15600|10900
Fold chair|6200|7400|8100|5300|6600
Reed lamp|3100|2950|3300|4800|
""",
        1,
        "quarter",
        "revenue",
    )
    _wide(
        "census-age-bands",
        "web",
        "age bands as headers incl. 65+; gather to district, age_band, people",
        """
District|0-14|15-24|25-44|45-64|65+
Kessel Ward|1820|1210|3305|2870|1940
Brannoch|960|702|1811|1604|1322
Oldfold|2210|1540|4012|3390|2011
""",
        1,
        "age_band",
        "people",
    )
    _wide(
        "income-bands-households",
        "web",
        "income bands as headers; gather to region, income_band, households",
        """
Region|<$10k|$10-20k|$20-40k|$40-80k|>$80k
Vell North|410|1320|2805|3310|1204
Vell South|620|1510|2440|2601|890
Coastal Strip|305|870|1920|2755|1660
""",
        1,
        "income_band",
        "households",
    )
    _wide(
        "dose-levels-response",
        "notebook",
        "numeric dose levels as headers; gather to strain, dose_mg, response",
        """
strain|0|5|10|20|40
K-12a|0.02|0.15|0.33|0.61|0.88
K-14b|0.01|0.09|0.21|0.47|0.79
W-3|0.03|0.18|0.40|0.70|0.93
""",
        1,
        "dose_mg",
        "response",
    )
    _wide(
        "replicates-rep-columns",
        "notebook",
        "rep1..rep3 headers; gather, replicate is the number (prefix names the variable)",
        """
sample|treatment|rep1|rep2|rep3
S01|control|0.412|0.398|0.405
S02|control|0.420|0.433|
S03|salt|0.281|0.277|0.290
S04|salt|0.266|0.259|0.270
""",
        2,
        "replicate",
        "od",
        trailing_number,
    )
    _wide(
        "timepoints-t0-t3",
        "forum",
        "T0..T3 headers; gather, timepoint is the number (prefix names the variable)",
        """
id|arm|T0|T1|T2|T3
P001|A|22|18|15|12
P002|A|25|24|20|19
P003|B|21|21|22|
P004|B|27|25|23|22
""",
        2,
        "timepoint",
        "score",
        trailing_number,
    )
    _wide(
        "weekly-timesheet",
        "spreadsheet",
        "weekday names as headers; gather to employee, day, hours",
        """
Employee|Mon|Tue|Wed|Thu|Fri
Tamsin Orrow|7.5|7.5|8|7.5|6
Bram Kettleby|8|8|8|8|4
Ilse Varnham||7|7|7|7
""",
        1,
        "day",
        "hours",
    )
    _wide(
        "week-number-headers",
        "notebook",
        "W01.. headers; gather, week is the number (prefix names the variable)",
        """
ward|W01|W02|W03|W04|W05|W06
Heron|12|15|11|9|14|18
Kestrel|3|5|2|4|6|3
Plover|21|19|25|22|20|17
""",
        1,
        "week",
        "cases",
        trailing_number,
    )
    _wide(
        "daily-date-headers",
        "spreadsheet",
        "one column per calendar date; gather to item, date, count",
        """
Item|2024-03-04|2024-03-05|2024-03-06|2024-03-07
Bolts M6|1200|1185|1160|1402
Washers 6mm|3300|3250||3410
Hinges 75mm|210|204|199|188
""",
        1,
        "date",
        "count",
    )
    _wide(
        "votes-per-candidate",
        "web",
        "one column per invented candidate name; gather to district, candidate, votes",
        """
District|Alder Quinn|Maren Tosh|Per Hollis
Kessel Ward|4102|3877|902
Brannoch|2210|2655|400
Oldfold|5012|4420|1330
Wenlow|1877|1903|
""",
        1,
        "candidate",
        "votes",
    )
    _wide(
        "stock-per-store-columns",
        "spreadsheet",
        "one column per invented store; gather to sku, store, on_hand",
        """
SKU|Corran St|Mill Yard|Harbour Row|Depot
TK-100|14|3|22|140
TK-110|0|0|5|60
FC-210|8|11|9|75
RL-300|2||4|31
""",
        1,
        "store",
        "on_hand",
    )
    _wide(
        "species-by-site-matrix",
        "notebook",
        "site ids as headers in a species matrix; gather to species, site, count",
        """
species|VB-014|VB-021|VB-033|VB-040
pied wagtail|3|0|1|2
grey heron|1|1|0|0
dipper|0|2|4|1
kingfisher|0|0|1|
""",
        1,
        "site",
        "count",
    )
    _wide(
        "exam-subject-wide-two-ids",
        "spreadsheet",
        "two id columns then one column per exam paper; gather to student, class, paper, mark",
        """
Student|Class|Paper 1|Paper 2|Paper 3
Anwen Hask|10B|64|71|58
Joss Mellor|10B|80|77|
Rhea Tollan|10C|55|62|60
""",
        2,
        "paper",
        "mark",
    )
    _wide(
        "temperature-hours",
        "notebook",
        "hour-of-day headers 00:00..; gather to station, hour, temp_c",
        """
station|00:00|06:00|12:00|18:00
VB-002|4.1|3.2|11.8|8.0
VB-009|3.7|2.9|12.4|8.6
""",
        1,
        "hour",
        "temp_c",
    )
    several = table("""
district|m014|m1524|f014|f1524
Kessel Ward|12|30|9|27
Brannoch|4|11|6|
Oldfold|20|41|17|38
""")
    tidy = [["district", "sex", "age", "cases"]]
    for row in several[1:]:
        for j, head in enumerate(several[0][1:], start=1):
            tidy.append([row[0], head[0], head[1:], row[j]])
    add(
        "sex-age-codes-in-headers",
        "values-in-headers",
        "notebook",
        "headers pack sex and age digits (m014); gather, split into sex and age (014 compares as 14)",
        several,
        tidy,
    )
    varyear = table("""
county|pop_2019|pop_2020|births_2019|births_2020
Aldmere|11013|11130|98|102
Wythen|6422|6495|51|47
""")
    tidy = [["county", "year", "pop", "births"]]
    for row in varyear[1:]:
        tidy.append([row[0], "2019", row[1], row[3]])
        tidy.append([row[0], "2020", row[2], row[4]])
    add(
        "variable-year-underscore-headers",
        "repeated-column-groups",
        "notebook",
        "headers join variable and year (pop_2019); one row per county and year, a column per variable",
        varyear,
        tidy,
    )
    minmax = table("""
station|min_temp_jan|max_temp_jan|min_temp_feb|max_temp_feb
Kell Moor|-2.1|6.4|-1.5|7.9
Ardle Gap|-4.0|4.2|-3.1|5.5
Sennet Vale|0.8|9.1|1.2|10.4
""")
    tidy = [["station", "month", "min_temp", "max_temp"]]
    for row in minmax[1:]:
        tidy.append([row[0], "jan", row[1], row[2]])
        tidy.append([row[0], "feb", row[3], row[4]])
    add(
        "min-max-month-headers",
        "repeated-column-groups",
        "notebook",
        "min/max temperature per month in headers; one row per station and month with min and max columns",
        minmax,
        tidy,
    )
    groups = table("""
Region|Q1 Sales|Q1 Units|Q2 Sales|Q2 Units|Q3 Sales|Q3 Units
North|12500|410|13200|433|11900|398
South|9800|322|10400|350|10900|361
West|7100|240|||7600|255
""")
    tidy = [["region", "quarter", "sales", "units"]]
    for row in groups[1:]:
        for q, j in (("Q1", 1), ("Q2", 3), ("Q3", 5)):
            tidy.append([row[0], q, row[j], row[j + 1]])
    add(
        "quarter-sales-units-groups",
        "repeated-column-groups",
        "spreadsheet",
        "Sales/Units pairs per quarter; a row per region and quarter (Q1 kept as written), empty kept",
        groups,
        tidy,
    )
    samples = table("""
Site|Date|Sample 1 Depth|Sample 1 Result|Sample 2 Depth|Sample 2 Result
VB-014|2024-05-02|0.5|7.1|2.0|6.8
VB-021|2024-05-02|0.5|6.9|1.5|6.6
VB-033|2024-05-03|0.5|7.4|3.0|7.0
""")
    tidy = [["site", "date", "sample", "depth", "result"]]
    for row in samples[1:]:
        tidy.append([row[0], row[1], "1", row[2], row[3]])
        tidy.append([row[0], row[1], "2", row[4], row[5]])
    add(
        "sample-depth-result-groups",
        "repeated-column-groups",
        "spreadsheet",
        "numbered sample groups of depth and result; one row per site, date and sample number",
        samples,
        tidy,
    )
