"""Pivot-style exports: levels and years across the top, grand totals on both edges, sideways series."""

from __future__ import annotations

from corpus_case import add, gather, table


def register() -> None:
    likert = table("""
question|Strongly agree|Agree|Neutral|Disagree|Strongly disagree
The water tastes clean|41|88|30|12|4
Bills are fair|10|52|61|40|12
Staff were helpful|66|70|21|5|
""")
    add(
        "likert-answer-levels-headers",
        "values-in-headers",
        "web",
        "answer levels of one scale as headers; gather to question, answer, count (blank kept)",
        likert,
        gather(likert[0], likert[1:], 1, "answer", "count"),
    )
    pivot = table("""
Row Labels|2022|2023|Grand Total
Kessel Ward|410|455|865
Brannoch|220|241|461
Oldfold|502|530|1032
Grand Total|1132|1226|2358
""")
    add(
        "pivot-grand-totals-both-edges",
        "multi-step",
        "spreadsheet",
        "a pivot export: years across, a Grand Total column and row; drop both totals then gather years",
        pivot,
        gather(["district", "2022", "2023"], [r[:3] for r in pivot[1:4]], 1, "year", "complaints"),
    )
    add(
        "transposed-daily-series",
        "transposed",
        "notebook",
        "variables down the side and one column per date; swap so each date is a row of rain and tmax",
        table("""
variable|2024-05-01|2024-05-02|2024-05-03|2024-05-04
rain_mm|0.0|4.2|11.8|0.6
tmax_c|17.2|14.9|12.1|15.5
wind_kmh|12|25|31|18
"""),
        table("""
date|rain_mm|tmax_c|wind_kmh
2024-05-01|0.0|17.2|12
2024-05-02|4.2|14.9|25
2024-05-03|11.8|12.1|31
2024-05-04|0.6|15.5|18
"""),
    )
    add(
        "win-draw-loss-packed",
        "packed-column",
        "forum",
        "a record like 8-0-2 packs won, drawn and lost; split into three columns",
        table("""
team|record|points
Dunmore Rovers|8-0-2|24
Kell Town|6-3-1|21
Ardle United|5-3-2|18
Fenwick Athletic|3-3-4|12
"""),
        table("""
team|won|drawn|lost|points
Dunmore Rovers|8|0|2|24
Kell Town|6|3|1|21
Ardle United|5|3|2|18
Fenwick Athletic|3|3|4|12
"""),
    )
    codes = table("""
sample|NO3|PO4|NH4|Cl
LS-01|4.1|0.12|0.05|22
LS-02|3.8|0.09|0.07|25
LS-03|5.2|0.20|0.11|19
LS-04|4.9|0.18||21
""")
    add(
        "tidy-analyte-code-columns",
        "tidy",
        "spreadsheet",
        "short analyte codes as headers are different measured variables with their own scales; tidy",
        codes,
        codes,
    )
    banded = table("""
Region|<$10k|$10-20k|$20-40k|>$40k
Vell North|410|1320|2805|4514
Vell South|620|1510|2440|3491
Total|1030|2830|5245|8005
Bands are yearly household income.||||
""")
    add(
        "income-bands-total-note",
        "multi-step",
        "web",
        "income bands across, a Total row and a note line; drop the total and note then gather the bands",
        banded,
        gather(banded[0], banded[1:3], 1, "income_band", "households"),
    )
