"""Tiny layout cases: the CSV a provider might send, and the one finding (and step) it must draw.

Each failing case names the rule and the recipe step; each passing case is a tidy table that
must draw no layout finding at all. Sources for the structural problems: Wickham, "Tidy Data",
Journal of Statistical Software 59(10), 2014, section 3 (five common problems); the rest are
common practice in survey and monitoring spreadsheets (no source).
"""

from __future__ import annotations

FAILING: dict[str, tuple[str, str, str]] = {
    # Source: SI Brochure 9th ed. table 4 (mg/L as a quotient unit): one value with its unit on
    # every row is still a value and a unit, even when the value never changes.
    "constant-value-unit": (
        "site,year,result\nVB-001,1990,0.1 mg/L\nVB-001,1991,0.1 mg/L\nVB-002,1990,0.1 mg/L\n",
        "layout.packed-column",
        "split_column",
    ),
    # Common practice (no source): ditto marks in a hand-kept timetable mean "same as above".
    "ditto-marks": (
        'bus,stop,departs\n12,Quay End,07:10\n"""",Mill Yard,07:18\n"""",Corran St,07:25\n'
        '14,Depot Lane,07:40\n"""",Harbour Row,07:52\n',
        "layout.same-as-above",
        "fill_down",
    ),
    # Source: GitHub Flavored Markdown spec 0.29, §4.10 tables: the delimiter row `---` under
    # the header row is layout, not data.
    "markdown-rule-line": (
        "site,ph,temp_c\n---,---,---\nVB-014,7.1,11.2\nVB-021,6.8,11.9\n",
        "layout.rule-lines",
        "drop_rows",
    ),
    # Common practice (no source): min/max pairs repeated per month, the month written as a word.
    "groups-by-month-word": (
        "station,min_temp_jan,max_temp_jan,min_temp_feb,max_temp_feb\nKell,-2.1,6.4,-1.5,7.9\n"
        "Ardle,-4.0,4.2,-3.1,5.5\n",
        "layout.repeated-column-groups",
        "gather_groups",
    ),
    # From memory of pandas: a frame with a named index prints the index name on its own row.
    "index-name-row": (
        ",ph,nitrate\nsite,,\nVB-014,7.1,4.1\nVB-021,6.8,5.6\nVB-033,7.4,2.2\n",
        "layout.multi-row-header",
        "header",
    ),
    # Source: Wickham 2014 §3.1: a variable_year header pair is one variable over two years.
    "variable-year-pair": (
        "site,nitrate_2023,nitrate_2024\nVB-014,4.1,3.9\nVB-021,5.6,5.2\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Common practice (no source): a year written once per group above a term written once per group.
    "two-level-fill-down": (
        "year,term,subject,average\n2023,Autumn,Maths,61\n,,English,66\n,Spring,Maths,63\n"
        ",,English,64\n2024,Autumn,Maths,65\n,,English,69\n",
        "layout.same-as-above",
        "fill_down",
    ),
    # Common practice (no source): stock counts with one column per store (two-word place names).
    "stores-as-headers": (
        "SKU,Corran St,Mill Yard,Harbour Row,Depot\nTK-100,14,3,22,140\nTK-110,0,0,5,60\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Source: Wickham 2014 §3.2, tuberculosis table: m014, f014 cross sex with an age band, so
    # the headers are values of two variables (gathered, then split), not repeated groups.
    "sex-age-codes": (
        "district,m014,m1524,f014,f1524\nKessel,12,30,9,27\nBrannoch,4,11,6,8\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Common practice (no source): a paged web table repeats its header at each page break.
    "repeated-header": (
        "pos,team,points\n1,Dunmore,24\n2,Kell,21\npos,team,points\n3,Ardle,18\n",
        "layout.repeated-header-rows",
        "drop_rows",
    ),
    # Common practice (no source): a count with its share in brackets, as survey tables print it.
    "count-and-share": (
        "answer,responses\nSatisfied,160 (43%)\nNeutral,98 (26%)\nDissatisfied,52 (14%)\n",
        "layout.packed-column",
        "split_column",
    ),
    # Common practice (no source): latitude and longitude pasted into one cell.
    "lat-lon-cell": (
        'station,coordinates\nKell,"54.512, -2.871"\nArdle,"54.601, -3.004"\nSennet,"54.388, -2.655"\n',
        "layout.packed-column",
        "split_column",
    ),
    # Common practice (no source): an `All ...` footer row that adds up the rows above.
    "all-row-sums": (
        "district,registered,voted\nKessel,6710,4102\nBrannoch,3755,2210\nAll districts,10465,6312\n",
        "layout.totals-and-notes",
        "drop_rows",
    ),
    # Common practice (no source): a Total column that is the row sum of the age bands.
    "total-column-sums": (
        "district,0-14,15-64,65+,Total\nKessel,1820,7385,1940,11145\nBrannoch,960,4117,1322,6399\n"
        "Oldfold,2210,8942,2011,13163\n",
        "layout.totals-and-notes",
        "drop_columns",
    ),
    # Common practice (no source): a short tag list, too few rows for tags to recur.
    "short-tag-list": (
        'ticket,tags\nT-1,"billing, urgent"\nT-2,login\nT-3,"billing, refund, vip"\n',
        "layout.list-cells",
        "explode",
    ),
    # Common practice (no source): spaced slashes between one-word items.
    "slash-list": (
        "volunteer,languages\nIlse,English / Welsh\nBram,English\nMaud,English / Polish / German\n",
        "layout.list-cells",
        "explode",
    ),
    # From memory of pandas: to_csv writes the RangeIndex 0..n-1 under a blank header cell.
    "index-column": (
        ",site,ph\n0,VB-014,7.1\n1,VB-015,6.8\n2,VB-016,7.0\n",
        "layout.index-column",
        "drop_columns",
    ),
    # Source: Wickham 2014 §3.1 (column headers are values); quarters are periods, not variables.
    "quarters-as-headers": (
        "product,Q1 2023,Q2 2023,Q3 2023\nkettle,10400,11250,9800\nchair,6200,7400,8100\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Common practice (no source): weekday columns in a timesheet are values of one `day`.
    "weekdays-as-headers": (
        "employee,Mon,Tue,Wed\nTamsin,7.5,7.5,8\nBram,8,8,8\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Source: Likert (1932), five-point agreement scale: the levels are values of one answer.
    "scale-levels-as-headers": (
        "question,Strongly agree,Agree,Neutral,Disagree,Strongly disagree\n"
        "Q-1,41,88,30,12,4\nQ-2,10,52,61,40,12\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Common practice (no source): players across, stats down: rows on different scales.
    "sideways-player-stats": (
        "Player,Dace,Orrin,Pell\nGames,12,14,9\nGoals,7,3,5\nAssists,2,6,1\nMinutes,980,1204,702\n",
        "layout.transposed",
        "transpose",
    ),
    # Common practice (no source): a match score `3-1` is two counts even though 3 > 1.
    "score-pair": (
        "home,away,score\nKell Town,Ardle United,3-1\nArdle United,Kell Town,0-0\nFenwick,Dunmore,1-4\n",
        "layout.packed-column",
        "split_column",
    ),
    # Common practice (no source): replicate counts on one scale are values of one variable.
    "replicates-one-scale": (
        "site_id,rep1,rep2,rep3\nVB-014,12,15,11\nVB-015,3,5,2\nVB-016,21,19,25\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Source: Wickham 2014 §3.1 "column headers are values, not variable names" (years as headers).
    "years-as-headers": (
        "site_id,2023,2024,2025\nVB-014,3,5,4\nVB-015,1,0,2\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Common practice (no source): month columns in a volunteer count sheet.
    "months-as-headers": (
        "station,Jan,Feb,Mar\nVB-001,4,6,2\nVB-002,1,3,3\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Source: Wickham 2014 Table 7 (billboard): wk1, wk2, wk3 differ only by a number.
    "numbered-headers": (
        "site_id,wk1,wk2,wk3\nVB-014,87,82,72\nVB-015,91,87,92\n",
        "layout.values-in-headers",
        "gather",
    ),
    # Common practice (no source): replicate groups laid out side by side.
    "repeated-groups": (
        "site_id,Sample 1 Depth,Sample 1 Result,Sample 2 Depth,Sample 2 Result\n"
        "VB-014,0.5,1.2,2.0,1.4\nVB-015,0.4,1.0,1.8,1.1\n",
        "layout.repeated-column-groups",
        "gather_groups",
    ),
    # Source: Wickham 2014 §3.2 "multiple variables stored in one column" (value with its unit).
    "value-and-unit": (
        "site_id,nitrate\nVB-014,1.2 mg/L\nVB-015,0.8 mg/L\nVB-016,2.1 mg/L\n",
        "layout.packed-column",
        "split_column",
    ),
    # Common practice (no source): a depth band written as a range.
    "range": (
        "site_id,depth_m,temp_c\nVB-014,0-5,8.1\nVB-015,5-10,7.2\nVB-016,0-5,8.4\n",
        "layout.packed-column",
        "split_column",
    ),
    # Common practice (no source): a taxa list in one cell.
    "list-cells": (
        "site_id,taxa\nVB-014,mayfly; stonefly\nVB-015,mayfly\n"
        "VB-016,caddisfly; mayfly; midge\nVB-017,midge\n",
        "layout.list-cells",
        "explode",
    ),
    # Source: Wickham 2014 §3.3 "variables stored in both rows and columns" (tmin/tmax in rows).
    "variables-in-rows": (
        "site_id,day,measure,value\nVB-014,2025-06-01,temp_min,4.1\nVB-014,2025-06-01,temp_max,9.8\n"
        "VB-015,2025-06-01,temp_min,3.9\nVB-015,2025-06-01,temp_max,10.2\n",
        "layout.variables-in-rows",
        "spread",
    ),
    # Common practice (no source): a field sheet typed in sideways.
    "transposed": (
        "site_id,VB-014,VB-015,VB-016\nsampled_on,2025-03-02,2025-03-03,2025-03-04\n"
        "ph,7.1,6.8,7.3\nobserver,Ana,Bo,Cy\n",
        "layout.transposed",
        "transpose",
    ),
    # Common practice (no source): reach names as section titles.
    "section-titles": (
        "site_id,ph,nitrate\nUpper Vell,,\nVB-014,7.1,1.2\nVB-015,7.0,1.1\nLower Vell,,\nVB-031,6.9,0.8\n",
        "layout.section-titles",
        "lift_titles",
    ),
    # Common practice (no source): a merged site cell exported as blanks below it.
    "same-as-above": (
        "site_id,sampled_on,ph\nVB-014,2025-03-02,7.1\n,2025-03-09,7.0\n,2025-03-16,7.2\n"
        "VB-015,2025-03-02,6.8\n,2025-03-09,6.9\n",
        "layout.same-as-above",
        "fill_down",
    ),
    # Common practice (no source): a group label over two sub-columns.
    "multi-row-header": (
        "site_id,nitrate,,phosphate,\n,min,max,min,max\nVB-014,0.4,1.1,0.02,0.05\nVB-015,0.3,0.9,0.01,0.04\n",
        "layout.multi-row-header",
        "header",
    ),
    # Common practice (no source): an export without its header line.
    "no-header": (
        "VB-014,2025-03-02,7.1\nVB-015,2025-03-02,6.8\nVB-016,2025-03-03,7.4\n",
        "layout.no-header",
        "header",
    ),
    # Common practice (no source): a total under the data.
    "total-row": (
        "site_id,count\nVB-014,3\nVB-015,5\nTotal,8\n",
        "layout.totals-and-notes",
        "drop_rows",
    ),
    # Common practice (no source): a footnote under the data.
    "footnote": (
        "site_id,count\nVB-014,3\nVB-015,5\n* counts from the spring survey,\n",
        "layout.totals-and-notes",
        "drop_rows",
    ),
    # Common practice (no source): a spacer column left empty.
    "blank-column": (
        "site_id,,ph\nVB-014,,7.1\nVB-015,,6.8\n",
        "layout.blank-rows-columns",
        "drop_columns",
    ),
}

PASSING: dict[str, str] = {
    # Common practice (no source): the tidy-but-wide lab table the brief names.
    "wide-lab-table": "site_id,sampled_on,ph,nitrate_mg_l,temp_c\nVB-014,2025-03-02,7.1,1.2,8.5\n"
    "VB-015,2025-03-02,6.8,0.9,8.1\nVB-016,2025-03-03,7.4,1.5,7.9\n",
    # Source: Wickham 2014 §2.3: a long table of one analyte per row is tidy (unit beside result).
    "long-chemistry": "site_id,sampled_on,analyte,result,unit\nVB-014,2025-03-02,nitrate,1.2,mg/L\n"
    "VB-014,2025-03-02,chloride,31,mg/L\nVB-015,2025-03-02,nitrate,0.9,mg/L\nVB-015,2025-03-02,chloride,28,mg/L\n",
    # Common practice (no source): chemical formulas carry digits but are variable names.
    "formula-headers": "site_id,po4,no3,nh4\nVB-014,0.02,1.2,0.1\nVB-015,0.03,0.9,0.2\nVB-016,0.01,1.4,0.1\n",
    # Common practice (no source): a year is a value in a column, not a header.
    "year-column": "site_id,year,count\nVB-014,2024,3\nVB-014,2025,5\nVB-015,2024,1\n",
    # Common practice (no source): an optional qualifier column is mostly blank, not "same as above".
    "optional-qualifier": "site_id,analyte,result,qualifier\nVB-014,nitrate,1.2,\nVB-015,nitrate,0.05,U\n"
    "VB-016,nitrate,0.9,\nVB-017,nitrate,0.04,U\n",
    # Common practice (no source): free-text notes with commas are not lists.
    "notes-with-commas": 'site_id,notes\nVB-014,"bank eroded, sampled upstream"\nVB-015,clear\n'
    'VB-016,"cattle in stream, turbid"\nVB-017,\n',
    # Common practice (no source): short identifiers with a number are identifiers.
    "short-ids": "site,depth_m\nS1,0.5\nS2,1.5\nS3,2.5\n",
    # Common practice (no source): min and max as two columns is already tidy.
    "min-max-columns": "site_id,day,temp_min,temp_max\n"
    "VB-014,2025-06-01,4.1,9.8\nVB-015,2025-06-01,3.9,10.2\n",
    # Common practice (no source): school class codes (`10B`) are codes, not a number with a unit.
    "class-codes": "pupil,class,mark\nP-01,10B,64\nP-02,10B,71\nP-03,10C,58\nP-04,10C,60\n",
    # Source: SI Brochure 9th ed. (BIPM 2019) table 4: `mg/L` is one unit (a quotient), not two codes.
    "unit-column-quotients": "sample,analyte,result,unit\nLS-01,nitrate,4.1,mg/L\n"
    "LS-01,chloride,22,mg/L\nLS-02,nitrate,3.8,mg/L\nLS-02,ecoli,120,cfu/100mL\n",
    # Common practice (no source): regressors x1..x3 on different scales are separate variables.
    "regressor-columns": "obs,x1,x2,x3,y\n1,0.5,1.2,3,10.1\n"
    "2,0.7,1.1,2,9.8\n3,0.2,1.9,5,12.4\n4,0.9,0.8,1,8.7\n",
    # Common practice (no source): a season `2019-2020` spans consecutive years: one value.
    "seasons": "season,club,titles\n2019-2020,Kell Town,1\n"
    "2020-2021,Dunmore Rovers,1\n2021-2022,Kell Town,2\n",
    # Common practice (no source): a named running number starting at 1 is the provider's own id.
    "numbered-rows-named": "row,site,ph\n1,VB-014,7.1\n2,VB-015,6.8\n3,VB-016,7.0\n",
    # Common practice (no source): free-text remarks split into phrases, not one-word items.
    "free-text-remarks": 'visit,comment\nV-1,"Water clear; banks eroded, fence down"\n'
    'V-2,"Algae present, light bloom; sample taken"\nV-3,"No access, gate locked"\nV-4,Fine\n',
    # Common practice (no source): "Surname, Given" always has two parts: a name, not a list.
    "surname-given": 'id,name\nP-1,"Varnham, Ilse"\nP-2,"Fenner, Maud"\nP-3,"Orrow, Tamsin"\n',
    # Common practice (no source): a row that starts with `All` but does not add up is data.
    "all-saints-is-a-name": "parish,households,visits\nKell,120,14\nAll Saints,95,11\nOrrin,60,7\n",
    # Common practice (no source): clock times and decimals are single values, not number tuples.
    # Common practice (no source): dates written with slashes or dots are single values.
    "slash-dates": "day,rain_mm\n2012/01/01,0.0\n2012/01/02,10.9\n2012/01/03,0.8\n",
    "dotted-dates": "day,rain_mm\n01.02.2024,0.0\n02.02.2024,10.9\n03.02.2024,0.8\n",
    "clock-times": "bus,departs,fare\nR1,09:30,1.20\nR7,10:15,1.50\nR9,11:45,2.25\n",
    # Common practice (no source): a row sharing some header words is data, not a header copy.
    "row-like-header-in-part": "name,role,team\nPat,role,team A\nJo,coach,team B\nAl,captain,team C\n",
    # Common practice (no source): single-word capitalised stats are variables (a tidy table).
    "capitalised-stats": "Player,Games,Goals,Assists\nDace,12,7,2\nOrrin,14,3,6\nPell,9,5,1\n",
    # Common practice (no source): two-word variable names over decimals are measurements.
    "capitalised-measures": "Site,Water Temp,Dissolved Oxygen,Total Phosphorus\n"
    "VB-014,8.5,10.2,0.04\nVB-015,9.1,9.8,0.06\nVB-016,7.9,11.0,0.03\n",
    # Common practice (no source): two numbered names that are not years stay two variables.
    "two-numbered-columns": "site,ph_1,ph_2\nVB-014,7.1,7.0\nVB-015,6.8,6.9\n",
    # Common practice (no source): words after an underscore that are not periods are plain names.
    "word-suffixed-names": "site,depth_top,depth_bottom,temp_top,temp_bottom\nVB-014,0.5,2.0,8.1,7.2\n"
    "VB-015,0.4,1.8,8.3,7.5\n",
    # Common practice (no source): a dash as a missing-value mark in a few cells is not a rule line.
    "dash-missing-marks": "site,ph,temp_c\nVB-014,-,11.2\nVB-021,6.8,-\nVB-033,7.0,10.1\n",
    # Common practice (no source): a status that says "same" is a value, not a ditto mark.
    "status-same": "site,visit,change\nVB-014,1,new\nVB-014,2,same\nVB-015,1,new\nVB-015,2,same\n",
    # Common practice (no source): one class `10C` throughout: C is a class letter, not coulomb.
    "one-class-letter": "pupil,class,mark\nP-01,10C,64\nP-02,10C,71\nP-03,10C,58\n",
}
