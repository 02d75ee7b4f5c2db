"""Four example tables of "Tidy Data" (H. Wickham, Journal of Statistical Software 59(10), 2014), re-typed.

Source: Wickham 2014, section 3 ("Tidying messy datasets"): Table 4 (religion by income), Table 7
(billboard), Table 9 (tuberculosis) and Table 11 (weather), with their tidy forms in Tables 6, 8, 10
and 12. The paper's three principles (each variable a column, each observation a row, each type of
observational unit a table) and its five common problems (column headers are values; several
variables in one column; variables in rows and columns; several units in one table; one unit in
several tables) are the named source for the structural findings these cases exercise.
From memory of the printed tables: counts are re-typed by hand, only the excerpts the paper prints,
and three simplifications are made (named beside each table) so that the tidy form is exactly what
a reshaping of the printed excerpt gives.
"""

from __future__ import annotations

Rows = list[list[str]]


def religion_income() -> tuple[Rows, Rows]:
    # From memory of Wickham 2014, Table 4 (first ten rows, first six income columns as printed).
    incomes = ["<$10k", "$10-20k", "$20-30k", "$30-40k", "$40-50k", "$50-75k"]
    printed = {
        "Agnostic": [27, 34, 60, 81, 76, 137],
        "Atheist": [12, 27, 37, 52, 35, 70],
        "Buddhist": [27, 21, 30, 34, 33, 58],
        "Catholic": [418, 617, 732, 670, 638, 1116],
        "Don't know/refused": [15, 14, 15, 11, 10, 35],
        "Evangelical Prot": [575, 869, 1064, 982, 881, 1486],
        "Hindu": [1, 9, 7, 9, 11, 34],
        "Historically Black Prot": [228, 244, 236, 238, 197, 223],
        "Jehovah's Witness": [20, 27, 24, 24, 21, 30],
        "Jewish": [19, 19, 25, 25, 30, 95],
    }
    messy = [["religion", *incomes]] + [[r, *map(str, v)] for r, v in printed.items()]
    # Table 6: religion, income, freq.
    tidy = [["religion", "income", "freq"]] + [
        [r, inc, str(n)] for r, v in printed.items() for inc, n in zip(incomes, v, strict=True)
    ]
    return messy, tidy


def billboard() -> tuple[Rows, Rows]:
    # From memory of Wickham 2014, Table 7 (weeks 1-3 as printed). Simplification: the tidy form
    # keeps date.entered and the week number instead of computing each week's date (Table 8).
    printed = [
        ["2000", "2 Pac", "Baby Don't Cry", "4:22", "2000-02-26", "87", "82", "72"],
        ["2000", "2Ge+her", "The Hardest Part Of ...", "3:15", "2000-09-02", "91", "87", "92"],
        ["2000", "3 Doors Down", "Kryptonite", "3:53", "2000-04-08", "81", "70", "68"],
        ["2000", "98^0", "Give Me Just One Nig...", "3:24", "2000-08-19", "51", "39", "34"],
        ["2000", "A*Teens", "Dancing Queen", "3:44", "2000-07-08", "97", "97", "96"],
        ["2000", "Aaliyah", "I Don't Wanna", "4:15", "2000-01-29", "84", "62", "51"],
        ["2000", "Aaliyah", "Try Again", "4:03", "2000-03-18", "59", "53", "38"],
        ["2000", "Adams, Yolanda", "Open My Heart", "5:30", "2000-08-26", "76", "76", "74"],
    ]
    messy = [["year", "artist", "track", "time", "date.entered", "wk1", "wk2", "wk3"], *printed]
    tidy = [["year", "artist", "track", "time", "date.entered", "week", "rank"]] + [
        [*row[:5], str(week), row[4 + week]] for row in printed for week in (1, 2, 3)
    ]
    return messy, tidy


def tuberculosis() -> tuple[Rows, Rows]:
    # From memory of Wickham 2014, Table 9. Simplification: the `mu` (age unknown) column is left
    # out and the age codes stay as written (014, 1524, ...) rather than 0-14, 15-24 (Table 10).
    ages = ["014", "1524", "2534", "3544", "4554", "5564", "65"]
    printed = {
        "AD": ["0", "0", "1", "0", "0", "0", "0", ""],
        "AE": ["2", "4", "4", "6", "5", "12", "10", "3"],
        "AF": ["52", "228", "183", "149", "129", "94", "80", "93"],
        "AG": ["0", "0", "0", "0", "0", "0", "1", "1"],
        "AL": ["2", "19", "21", "14", "24", "19", "16", "3"],
        "AM": ["2", "152", "130", "131", "63", "26", "21", "1"],
        "AN": ["0", "0", "1", "2", "0", "0", "0", "0"],
        "AO": ["186", "999", "1003", "912", "482", "312", "194", "247"],
        "AR": ["97", "278", "594", "402", "419", "368", "330", "121"],
        "AS": ["", "", "", "", "1", "1", "", ""],
    }
    headers = [f"m{a}" for a in ages] + ["f014"]
    messy = [["country", "year", *headers]] + [[c, "2000", *v] for c, v in printed.items()]
    tidy = [["country", "year", "sex", "age", "cases"]]
    for country, values in printed.items():
        for header, value in zip(headers, values, strict=True):
            if value:
                tidy.append([country, "2000", header[0], header[1:], value])
    return messy, tidy


def weather() -> tuple[Rows, Rows]:
    # From memory of Wickham 2014, Tables 11 and 12 (station MX17004, the ten dated readings of
    # Table 12). Simplification: the tidy form keeps year, month and day instead of one date.
    readings = {
        (1, 30): ("27.8", "14.5"),
        (2, 2): ("27.3", "14.4"),
        (2, 3): ("24.1", "14.4"),
        (2, 11): ("29.7", "13.4"),
        (2, 23): ("29.9", "10.7"),
        (3, 5): ("32.1", "14.2"),
        (3, 10): ("34.5", "16.8"),
        (3, 16): ("31.1", "17.6"),
        (4, 27): ("36.3", "16.7"),
        (5, 27): ("33.2", "18.2"),
    }
    messy = [["id", "year", "month", "element"] + [f"d{d}" for d in range(1, 32)]]
    for month in range(1, 6):
        for k, element in enumerate(("tmax", "tmin")):
            row = ["MX17004", "2010", str(month), element]
            row += [readings.get((month, d), ("", ""))[k] for d in range(1, 32)]
            messy.append(row)
    tidy = [["id", "year", "month", "day", "tmax", "tmin"]] + [
        ["MX17004", "2010", str(m), str(d), hi, lo] for (m, d), (hi, lo) in readings.items()
    ]
    return messy, tidy


def wickham_tables() -> dict[str, tuple[Rows, Rows]]:
    return {
        "paper-religion-income": religion_income(),
        "paper-billboard": billboard(),
        "paper-tuberculosis": tuberculosis(),
        "paper-weather": weather(),
    }
