"""Cases with variables in rows, periodic rows, transposed tables, section titles and same-as-above cells."""

from __future__ import annotations

from corpus_case import add, table


def register() -> None:
    add(
        "measure-value-long",
        "variables-in-rows",
        "notebook",
        "a measure column naming temp_min/temp_max beside value; spread to one column per measure",
        table("""
station|date|measure|value
Kell Moor|2024-01-01|temp_min|-2.1
Kell Moor|2024-01-01|temp_max|6.4
Kell Moor|2024-01-02|temp_min|-1.0
Kell Moor|2024-01-02|temp_max|7.2
Ardle Gap|2024-01-01|temp_min|-4.0
Ardle Gap|2024-01-01|temp_max|4.2
Ardle Gap|2024-01-02|temp_min|-3.3
Ardle Gap|2024-01-02|temp_max|5.0
"""),
        table("""
station|date|temp_min|temp_max
Kell Moor|2024-01-01|-2.1|6.4
Kell Moor|2024-01-02|-1.0|7.2
Ardle Gap|2024-01-01|-4.0|4.2
Ardle Gap|2024-01-02|-3.3|5.0
"""),
    )
    add(
        "key-value-patient-attrs",
        "variables-in-rows",
        "spreadsheet",
        "entity-attribute-value rows (patient, attribute, value); spread attributes to columns",
        table("""
patient|attribute|value
P001|age|34
P001|height_cm|171
P001|weight_kg|68
P002|age|51
P002|height_cm|165
P002|weight_kg|80
P003|age|27
P003|height_cm|182
P003|weight_kg|77
"""),
        table("""
patient|age|height_cm|weight_kg
P001|34|171|68
P002|51|165|80
P003|27|182|77
"""),
    )
    add(
        "lab-field-sheet-long",
        "variables-in-rows",
        "spreadsheet",
        "field sheet as field/entry rows per visit with mixed kinds (names, times, numbers); spread fields",
        table("""
visit|field|entry
V-1|sampler|Ilse Varnham
V-1|arrived|09:40
V-1|water_temp_c|11.2
V-1|weather|overcast
V-2|sampler|Bram Kettleby
V-2|arrived|10:15
V-2|water_temp_c|12.0
V-2|weather|rain
V-3|sampler|Maud Fenner
V-3|arrived|08:55
V-3|water_temp_c|10.7
V-3|weather|dry
"""),
        table("""
visit|sampler|arrived|water_temp_c|weather
V-1|Ilse Varnham|09:40|11.2|overcast
V-2|Bram Kettleby|10:15|12.0|rain
V-3|Maud Fenner|08:55|10.7|dry
"""),
    )
    add(
        "periodic-three-row-records",
        "periodic-rows",
        "web",
        "a pasted address list: every 3 rows (name, phone, town) form one record; spread to columns",
        [
            ["Ilse Varnham"],
            ["0700 100201"],
            ["Lowmoor"],
            ["Bram Kettleby"],
            ["0700 100377"],
            ["Drayburn"],
            ["Maud Fenner"],
            ["0700 100412"],
            ["Kessel"],
            ["Orla Pettifer"],
            ["0700 100598"],
            ["Brannoch"],
        ],
        table("""
name|phone|town
Ilse Varnham|0700 100201|Lowmoor
Bram Kettleby|0700 100377|Drayburn
Maud Fenner|0700 100412|Kessel
Orla Pettifer|0700 100598|Brannoch
"""),
    )
    add(
        "periodic-label-value-pairs",
        "periodic-rows",
        "forum",
        "label/value rows repeating every 3 rows per device; spread to one row per device",
        table("""
Device|Pump A
Flow|12.5
Status|running
Device|Pump B
Flow|0
Status|stopped
Device|Pump C
Flow|11.9
Status|running
"""),
        table("""
device|flow|status
Pump A|12.5|running
Pump B|0|stopped
Pump C|11.9|running
"""),
    )
    add(
        "transposed-site-profile",
        "transposed",
        "spreadsheet",
        "variables down the first column, one column per site; swap rows and columns",
        table("""
site|VB-014|VB-021|VB-033|VB-040
river|Vell|Vell|Orrin Brook|Tarn Beck
altitude_m|120|85|210|340
catchment_km2|44.1|61.0|12.3|8.7
opened|2011|2009|2015|2018
"""),
        table("""
site|river|altitude_m|catchment_km2|opened
VB-014|Vell|120|44.1|2011
VB-021|Vell|85|61.0|2009
VB-033|Orrin Brook|210|12.3|2015
VB-040|Tarn Beck|340|8.7|2018
"""),
    )
    add(
        "transposed-player-stats",
        "transposed",
        "web",
        "stat names down the side, one column per player; swap so each player is a row",
        table("""
Player|Dace|Orrin|Pell
Games|12|14|9
Goals|7|3|5
Assists|2|6|1
Minutes|980|1204|702
"""),
        table("""
player|games|goals|assists|minutes
Dace|12|7|2|980
Orrin|14|3|6|1204
Pell|9|5|1|702
"""),
    )
    add(
        "section-title-regions",
        "section-titles",
        "spreadsheet",
        "rows with only a region name label the shops below; lift into a region column",
        table("""
shop|manager|staff
North||
Corran Street|Tamsin Orrow|6
Mill Yard|Bram Kettleby|4
South||
Harbour Row|Ilse Varnham|9
Depot Lane|Maud Fenner|3
Quay End|Orla Pettifer|5
"""),
        table("""
region|shop|manager|staff
North|Corran Street|Tamsin Orrow|6
North|Mill Yard|Bram Kettleby|4
South|Harbour Row|Ilse Varnham|9
South|Depot Lane|Maud Fenner|3
South|Quay End|Orla Pettifer|5
"""),
    )
    add(
        "section-title-lab-batches",
        "section-titles",
        "forum",
        "'Batch 12' style rows label the samples below; lift into a batch column",
        table("""
sample|nitrate|phosphate
Batch 12||
LS-01|4.1|0.12
LS-02|3.8|0.09
Batch 13||
LS-03|5.2|0.20
LS-04|4.9|0.18
"""),
        table("""
batch|sample|nitrate|phosphate
Batch 12|LS-01|4.1|0.12
Batch 12|LS-02|3.8|0.09
Batch 13|LS-03|5.2|0.20
Batch 13|LS-04|4.9|0.18
"""),
    )
    add(
        "same-as-above-blank-group",
        "same-as-above",
        "spreadsheet",
        "the site is written once per block and left blank below; fill down",
        table("""
site|date|ph
VB-014|2024-05-01|7.1
|2024-05-08|7.0
|2024-05-15|7.3
VB-021|2024-05-01|6.8
|2024-05-08|6.9
"""),
        table("""
site|date|ph
VB-014|2024-05-01|7.1
VB-014|2024-05-08|7.0
VB-014|2024-05-15|7.3
VB-021|2024-05-01|6.8
VB-021|2024-05-08|6.9
"""),
    )
    add(
        "same-as-above-two-levels",
        "same-as-above",
        "spreadsheet",
        "hierarchical labels year then term written once per block; fill both down",
        table("""
year|term|subject|average
2023|Autumn|Maths|61
||English|66
|Spring|Maths|63
||English|64
2024|Autumn|Maths|65
||English|69
"""),
        table("""
year|term|subject|average
2023|Autumn|Maths|61
2023|Autumn|English|66
2023|Spring|Maths|63
2023|Spring|English|64
2024|Autumn|Maths|65
2024|Autumn|English|69
"""),
    )
    add(
        "ditto-marks",
        "same-as-above",
        "forum",
        'ditto marks (") stand for the value above; fill down',
        [
            ["bus", "stop", "departs"],
            ["12", "Quay End", "07:10"],
            ['"', "Mill Yard", "07:18"],
            ['"', "Corran St", "07:25"],
            ["14", "Depot Lane", "07:40"],
            ['"', "Harbour Row", "07:52"],
        ],
        table("""
bus|stop|departs
12|Quay End|07:10
12|Mill Yard|07:18
12|Corran St|07:25
14|Depot Lane|07:40
14|Harbour Row|07:52
"""),
    )
