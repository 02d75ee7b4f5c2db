"""Hand-written cases added after the detectors were tuned, to see how they do on forms not seen.

Each pair is (messy input, expected tidy table), typed by hand in the house scenario. Their first
result (before any change to the detectors) is recorded in the layout report to the lead.
"""

from __future__ import annotations

Rows = list[list[str]]


def fresh_tables() -> dict[str, tuple[str, Rows, Rows]]:
    t: dict[str, tuple[str, Rows, Rows]] = {}
    t["fresh-fiscal-years"] = (
        "values-in-headers",
        [["site_id", "FY2023", "FY2024", "FY2025"], ["VB-014", "3", "4", "2"], ["VB-015", "0", "1", "5"]],
        [
            ["site_id", "year", "n"],
            ["VB-014", "2023", "3"],
            ["VB-014", "2024", "4"],
            ["VB-014", "2025", "2"],
            ["VB-015", "2023", "0"],
            ["VB-015", "2024", "1"],
            ["VB-015", "2025", "5"],
        ],
    )
    t["fresh-quarters"] = (
        "values-in-headers",
        [
            ["site_id", "Q1", "Q2", "Q3", "Q4"],
            ["VB-020", "12", "15", "9", "11"],
            ["VB-021", "7", "8", "6", "10"],
        ],
        [["site_id", "quarter", "n"]]
        + [["VB-020", str(q), v] for q, v in zip(range(1, 5), ["12", "15", "9", "11"], strict=True)]
        + [["VB-021", str(q), v] for q, v in zip(range(1, 5), ["7", "8", "6", "10"], strict=True)],
    )
    t["fresh-year-months"] = (
        "values-in-headers",
        [
            ["station", "2025-01", "2025-02", "2025-03"],
            ["VB-002", "1.2", "1.4", "1.1"],
            ["VB-003", "0.8", "0.9", ""],
        ],
        [
            ["station", "month", "nitrate"],
            ["VB-002", "2025-01", "1.2"],
            ["VB-002", "2025-02", "1.4"],
            ["VB-002", "2025-03", "1.1"],
            ["VB-003", "2025-01", "0.8"],
            ["VB-003", "2025-02", "0.9"],
        ],
    )
    t["fresh-sites-as-headers"] = (
        "values-in-headers",
        [
            ["sampled_on", "VB-014", "VB-015", "VB-016"],
            ["2025-04-01", "7.1", "6.9", "7.3"],
            ["2025-04-08", "7.0", "6.8", "7.4"],
        ],
        [
            ["sampled_on", "site_id", "ph"],
            ["2025-04-01", "VB-014", "7.1"],
            ["2025-04-01", "VB-015", "6.9"],
            ["2025-04-01", "VB-016", "7.3"],
            ["2025-04-08", "VB-014", "7.0"],
            ["2025-04-08", "VB-015", "6.8"],
            ["2025-04-08", "VB-016", "7.4"],
        ],
    )
    t["fresh-degrees"] = (
        "packed-column",
        [["site_id", "water_temp"], ["VB-031", "8.5 °C"], ["VB-032", "9.1 °C"], ["VB-033", "7.8 °C"]],
        [
            ["site_id", "temp", "unit"],
            ["VB-031", "8.5", "°C"],
            ["VB-032", "9.1", "°C"],
            ["VB-033", "7.8", "°C"],
        ],
    )
    t["fresh-tight-lists"] = (
        "list-cells",
        [
            ["site_id", "gear"],
            ["VB-040", "kick;sweep"],
            ["VB-041", "kick"],
            ["VB-042", "sweep;stone;kick"],
            ["VB-043", "stone"],
        ],
        [
            ["site_id", "gear"],
            ["VB-040", "kick"],
            ["VB-040", "sweep"],
            ["VB-041", "kick"],
            ["VB-042", "sweep"],
            ["VB-042", "stone"],
            ["VB-042", "kick"],
            ["VB-043", "stone"],
        ],
    )
    t["fresh-title-and-two-row-header"] = (
        "multi-step",
        [
            ["Vell Basin: nutrient ranges, spring", "", "", "", ""],
            ["site_id", "nitrate", "", "phosphate", ""],
            ["", "min", "max", "min", "max"],
            ["VB-014", "0.4", "1.1", "0.02", "0.05"],
            ["VB-015", "0.3", "0.9", "0.01", "0.04"],
        ],
        [
            ["site_id", "a", "b", "c", "d"],
            ["VB-014", "0.4", "1.1", "0.02", "0.05"],
            ["VB-015", "0.3", "0.9", "0.01", "0.04"],
        ],
    )
    t["fresh-note-inside"] = (
        "totals-and-notes",
        [
            ["site_id", "ph", "count"],
            ["VB-010", "7.1", "4"],
            ["Note: VB-011 was dry in April", "", ""],
            ["VB-012", "6.9", "3"],
            ["VB-013", "7.2", "5"],
        ],
        [["site_id", "ph", "count"], ["VB-010", "7.1", "4"], ["VB-012", "6.9", "3"], ["VB-013", "7.2", "5"]],
    )
    t["fresh-two-level-fill"] = (
        "same-as-above",
        [
            ["reach", "site_id", "sampled_on", "ph"],
            ["Upper Vell", "VB-001", "2025-05-01", "7.1"],
            ["", "", "2025-05-08", "7.0"],
            ["", "VB-002", "2025-05-01", "6.8"],
            ["", "", "2025-05-08", "6.9"],
            ["Lower Vell", "VB-030", "2025-05-01", "7.4"],
            ["", "", "2025-05-08", "7.3"],
        ],
        [
            ["reach", "site_id", "sampled_on", "ph"],
            ["Upper Vell", "VB-001", "2025-05-01", "7.1"],
            ["Upper Vell", "VB-001", "2025-05-08", "7.0"],
            ["Upper Vell", "VB-002", "2025-05-01", "6.8"],
            ["Upper Vell", "VB-002", "2025-05-08", "6.9"],
            ["Lower Vell", "VB-030", "2025-05-01", "7.4"],
            ["Lower Vell", "VB-030", "2025-05-08", "7.3"],
        ],
    )
    t["fresh-subtotals"] = (
        "totals-and-notes",
        [
            ["site_id", "count"],
            ["VB-001", "3"],
            ["VB-002", "4"],
            ["Subtotal Upper", "7"],
            ["VB-030", "2"],
            ["Subtotal Lower", "2"],
            ["Grand total", "9"],
        ],
        [["site_id", "count"], ["VB-001", "3"], ["VB-002", "4"], ["VB-030", "2"]],
    )
    t["fresh-numeric-sideways"] = (
        "transposed",
        [
            ["variable", "VB-014", "VB-015", "VB-016"],
            ["ph", "7.1", "6.9", "7.3"],
            ["temp_c", "8.5", "9.0", "8.1"],
            ["nitrate_mg_l", "1.2", "0.8", "1.5"],
        ],
        [
            ["site", "ph", "temp", "nitrate"],
            ["VB-014", "7.1", "8.5", "1.2"],
            ["VB-015", "6.9", "9.0", "0.8"],
            ["VB-016", "7.3", "8.1", "1.5"],
        ],
    )
    t["fresh-tidy-targets"] = (
        "tidy",
        [
            ["site_id", "target_2025", "actual_2025"],
            ["VB-014", "10", "8"],
            ["VB-015", "12", "12"],
            ["VB-016", "9", "11"],
        ],
        [],
    )
    t["fresh-tidy-visits"] = (
        "tidy",
        [
            ["site_id", "visit", "result", "flag"],
            ["VB-014", "1", "0.5", ""],
            ["VB-014", "2", "0.7", "E"],
            ["VB-015", "1", "0.4", ""],
            ["VB-015", "2", "0.6", ""],
        ],
        [],
    )
    t["fresh-tidy-bottle-codes"] = (
        "tidy",
        [
            ["bottle", "site_id", "fraction"],
            ["B-0141/F", "VB-014", "filtered"],
            ["B-0141/T", "VB-014", "total"],
            ["B-0151/F", "VB-015", "filtered"],
            ["B-0151/T", "VB-015", "total"],
        ],
        [],
    )
    t["fresh-tidy-time-of-day"] = (
        "tidy",
        [
            ["gauge_id", "day", "time", "stage_m"],
            ["VG-01", "2025-06-01", "06:00", "0.42"],
            ["VG-01", "2025-06-01", "12:00", "0.47"],
            ["VG-01", "2025-06-01", "18:00", "0.45"],
            ["VG-02", "2025-06-01", "06:00", "0.81"],
        ],
        [],
    )
    return {k: (f, m, e if e else m) for k, (f, m, e) in t.items()}
