"""Cases with several variables packed into one column, and list cells holding several items."""

from __future__ import annotations

from corpus_case import add, table


def register() -> None:
    add(
        "value-unit-nitrate",
        "packed-column",
        "spreadsheet",
        "result cells hold number and unit; split into value and unit",
        table("""
site|sampled|nitrate
VB-014|2024-04-02|12 mg/L
VB-021|2024-04-02|8.5 mg/L
VB-033|2024-04-03|0.4 mg/L
VB-040|2024-04-03|15.2 mg/L
"""),
        table("""
site|sampled|nitrate|unit
VB-014|2024-04-02|12|mg/L
VB-021|2024-04-02|8.5|mg/L
VB-033|2024-04-03|0.4|mg/L
VB-040|2024-04-03|15.2|mg/L
"""),
    )
    add(
        "value-unit-mixed-units",
        "packed-column",
        "forum",
        "parcel weights with mixed units; split into value and unit (no conversion)",
        table("""
parcel|weight
PX-1001|2.5 kg
PX-1002|800 g
PX-1003|1.2 kg
PX-1004|350 g
PX-1005|12 kg
"""),
        table("""
parcel|weight|unit
PX-1001|2.5|kg
PX-1002|800|g
PX-1003|1.2|kg
PX-1004|350|g
PX-1005|12|kg
"""),
    )
    add(
        "fraction-score-out-of",
        "packed-column",
        "spreadsheet",
        "quiz results as 12/15; split into correct and out_of",
        table("""
pupil|quiz|result
Anwen Hask|Fractions|12/15
Joss Mellor|Fractions|14/15
Rhea Tollan|Fractions|9/15
Anwen Hask|Decimals|18/20
Joss Mellor|Decimals|17/20
"""),
        table("""
pupil|quiz|correct|out_of
Anwen Hask|Fractions|12|15
Joss Mellor|Fractions|14|15
Rhea Tollan|Fractions|9|15
Anwen Hask|Decimals|18|20
Joss Mellor|Decimals|17|20
"""),
    )
    add(
        "match-score-dash",
        "packed-column",
        "forum",
        "match scores as 3-1; split into home_goals and away_goals",
        table("""
date|home|away|score
2024-08-10|Dunmore Rovers|Kell Town|3-1
2024-08-10|Ardle United|Fenwick Athletic|0-0
2024-08-17|Kell Town|Ardle United|2-2
2024-08-17|Fenwick Athletic|Dunmore Rovers|1-4
"""),
        table("""
date|home|away|home_goals|away_goals
2024-08-10|Dunmore Rovers|Kell Town|3|1
2024-08-10|Ardle United|Fenwick Athletic|0|0
2024-08-17|Kell Town|Ardle United|2|2
2024-08-17|Fenwick Athletic|Dunmore Rovers|1|4
"""),
    )
    add(
        "count-with-percent",
        "packed-column",
        "web",
        "cells like 45 (12%) hold count and share; split into count and percent",
        table("""
answer|responses
Very satisfied|45 (12%)
Satisfied|160 (43%)
Neutral|98 (26%)
Dissatisfied|52 (14%)
Very dissatisfied|19 (5%)
"""),
        table("""
answer|count|percent
Very satisfied|45|12
Satisfied|160|43
Neutral|98|26
Dissatisfied|52|14
Very dissatisfied|19|5
"""),
    )
    add(
        "lat-lon-one-cell",
        "packed-column",
        "forum",
        "coordinates as 'lat, lon' in one quoted cell; split into latitude and longitude",
        table("""
station|coordinates|elevation_m
Kell Moor|54.512, -2.871|412
Ardle Gap|54.601, -3.004|288
Sennet Vale|54.388, -2.655|97
"""),
        table("""
station|lat|lon|elevation_m
Kell Moor|54.512|-2.871|412
Ardle Gap|54.601|-3.004|288
Sennet Vale|54.388|-2.655|97
"""),
    )
    add(
        "range-min-max",
        "packed-column",
        "spreadsheet",
        "depth ranges 0-10 in one cell; split into depth_from and depth_to",
        table("""
core|horizon|depth_cm|texture
C1|A|0-10|loam
C1|B|10-35|clay loam
C1|C|35-80|clay
C2|A|0-15|sandy loam
C2|B|15-60|loam
"""),
        table("""
core|horizon|depth_from|depth_to|texture
C1|A|0|10|loam
C1|B|10|35|clay loam
C1|C|35|80|clay
C2|A|0|15|sandy loam
C2|B|15|60|loam
"""),
    )
    add(
        "code-and-year-underscore",
        "packed-column",
        "notebook",
        "sample ids join site and year (VB-014_2023); split at the underscore",
        table("""
sample_key|phosphate
VB-014_2023|0.12
VB-014_2024|0.10
VB-021_2023|0.31
VB-021_2024|0.27
"""),
        table("""
site|year|phosphate
VB-014|2023|0.12
VB-014|2024|0.10
VB-021|2023|0.31
VB-021|2024|0.27
"""),
    )
    add(
        "blood-pressure-slash",
        "packed-column",
        "spreadsheet",
        "blood pressure as 120/80; split into systolic and diastolic",
        table("""
patient|visit|bp
P001|1|120/80
P001|2|118/79
P002|1|141/92
P002|2|135/88
"""),
        table("""
patient|visit|systolic|diastolic
P001|1|120|80
P001|2|118|79
P002|1|141|92
P002|2|135|88
"""),
    )
    add(
        "price-currency-code",
        "packed-column",
        "web",
        "prices with a currency code suffix (12.50 EUR); split into amount and currency",
        table("""
item|price
Tarn kettle|34.00 EUR
Fold chair|21.50 GBP
Reed lamp|18.99 EUR
Wick set|4.25 GBP
"""),
        table("""
item|amount|currency
Tarn kettle|34.00|EUR
Fold chair|21.50|GBP
Reed lamp|18.99|EUR
Wick set|4.25|GBP
"""),
    )
    add(
        "value-unit-percent-sign",
        "packed-column",
        "spreadsheet",
        "moisture as 23.5 % with a space; split into value and unit",
        table("""
plot|moisture
P-01|23.5 %
P-02|19.0 %
P-03|31.2 %
P-04|27.8 %
"""),
        table("""
plot|moisture|unit
P-01|23.5|%
P-02|19.0|%
P-03|31.2|%
P-04|27.8|%
"""),
    )
    add(
        "list-semicolon-taxa",
        "list-cells",
        "spreadsheet",
        "taxa listed with semicolons; one row per taxon",
        table("""
site|date|taxa
VB-014|2024-06-01|mayfly; stonefly
VB-021|2024-06-01|midge
VB-033|2024-06-02|snail; leech; shrimp
"""),
        table("""
site|date|taxon
VB-014|2024-06-01|mayfly
VB-014|2024-06-01|stonefly
VB-021|2024-06-01|midge
VB-033|2024-06-02|snail
VB-033|2024-06-02|leech
VB-033|2024-06-02|shrimp
"""),
    )
    add(
        "list-comma-tags",
        "list-cells",
        "forum",
        "comma-separated tags in a quoted cell; one row per tag",
        table("""
ticket|opened|tags
T-101|2024-02-01|billing, urgent
T-102|2024-02-01|login
T-103|2024-02-02|billing, refund, vip
T-104|2024-02-03|shipping
"""),
        table("""
ticket|opened|tag
T-101|2024-02-01|billing
T-101|2024-02-01|urgent
T-102|2024-02-01|login
T-103|2024-02-02|billing
T-103|2024-02-02|refund
T-103|2024-02-02|vip
T-104|2024-02-03|shipping
"""),
    )
    add(
        "list-pipe-allergens",
        "list-cells",
        "notebook",
        "allergens separated by | ; one row per allergen",
        [
            ["dish", "allergens"],
            ["Oat bake", "gluten|milk"],
            ["Bean stew", "celery"],
            ["Nut loaf", "nuts|gluten|soya"],
            ["Fruit cup", "sulphites"],
        ],
        table("""
dish|allergen
Oat bake|gluten
Oat bake|milk
Bean stew|celery
Nut loaf|nuts
Nut loaf|gluten
Nut loaf|soya
Fruit cup|sulphites
"""),
    )
    add(
        "list-slash-languages",
        "list-cells",
        "web",
        "languages spoken joined by ' / '; one row per language",
        table("""
volunteer|group|languages
Ilse Varnham|Tarn Beck Watch|English / Welsh
Bram Kettleby|Orrin Friends|English
Maud Fenner|Tarn Beck Watch|English / Polish / German
"""),
        table("""
volunteer|group|language
Ilse Varnham|Tarn Beck Watch|English
Ilse Varnham|Tarn Beck Watch|Welsh
Bram Kettleby|Orrin Friends|English
Maud Fenner|Tarn Beck Watch|English
Maud Fenner|Tarn Beck Watch|Polish
Maud Fenner|Tarn Beck Watch|German
"""),
    )
    add(
        "list-mixed-separators",
        "list-cells",
        "spreadsheet",
        "colours listed with both commas and semicolons (red, green; blue); one row per colour",
        table("""
order|colours
A-1|red, green; blue
A-2|black
A-3|white; grey
"""),
        table("""
order|colour
A-1|red
A-1|green
A-1|blue
A-2|black
A-3|white
A-3|grey
"""),
    )
