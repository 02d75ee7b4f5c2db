"""Longer cases (dozens of rows, seeded random values) so detectors are not judged on toy tables only."""

from __future__ import annotations

import random

from corpus_case import Rows, add, gather

MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"]
STREETS = ["Corran", "Mill", "Harbour", "Depot", "Quay", "Fold", "Reed", "Tarn", "Wick", "Orrin"]
KINDS = ["Street", "Yard", "Row", "Lane", "End"]
SPECIES = ["dipper", "grey heron", "kingfisher", "pied wagtail", "moorhen", "coot", "mallard"]


def _shops(rng: random.Random, n: int) -> list[str]:
    names = sorted({f"{rng.choice(STREETS)} {rng.choice(KINDS)}" for _ in range(n * 3)})
    return rng.sample(names, n)


def register() -> None:
    rng = random.Random(2024)
    header = ["shop", *MONTHS]
    rows: Rows = [
        [shop, *("" if rng.random() < 0.05 else str(rng.randint(300, 3000)) for _ in MONTHS)]
        for shop in _shops(rng, 24)
    ]
    add(
        "large-shop-months",
        "values-in-headers",
        "spreadsheet",
        "24 shops by 12 month columns with a few blank months; gather to shop, month, sales, blanks kept",
        [header, *rows],
        gather(header, rows, 1, "month", "sales"),
    )
    log: Rows = [["logger", "logged_at", "level_m", "temp_c", "battery_v", "note"]]
    for i in range(60):
        note = rng.choice(["", "", "", "", "cleaned sensor", "gap, restarted; ok"])
        level = "" if rng.random() < 0.1 else f"{rng.uniform(0.8, 2.4):.2f}"
        log.append(
            [
                f"LG-{1 + i % 3:02d}",
                f"2024-06-{1 + i // 3:02d}T{(i % 3) * 8:02d}:00:00",
                level,
                f"{rng.uniform(6, 18):.1f}",
                f"{rng.uniform(3.1, 3.7):.2f}",
                note,
            ]
        )
    add(
        "tidy-large-logger",
        "tidy",
        "notebook",
        "60 logger readings with missing levels and free-text notes; already tidy",
        log,
        log,
    )
    packed: Rows = [["sample", "site", "chloride"]]
    tidy: Rows = [["sample", "site", "chloride", "unit"]]
    for i in range(40):
        value = f"{rng.uniform(5, 90):.1f}"
        site = f"VB-{rng.randint(1, 60):03d}"
        packed.append([f"LS-{i + 1:03d}", site, f"{value} mg/L"])
        tidy.append([f"LS-{i + 1:03d}", site, value, "mg/L"])
    add(
        "large-value-unit",
        "packed-column",
        "spreadsheet",
        "40 samples whose chloride cells carry 'mg/L'; split into value and unit",
        packed,
        tidy,
    )
    listed: Rows = [["survey", "site", "species_seen"]]
    tidy = [["survey", "site", "species"]]
    for i in range(25):
        seen = rng.sample(SPECIES, rng.randint(1, 4))
        site = f"VB-{rng.randint(1, 60):03d}"
        listed.append([f"SV-{i + 1:02d}", site, "; ".join(seen)])
        tidy.extend([f"SV-{i + 1:02d}", site, s] for s in seen)
    add(
        "large-list-species",
        "list-cells",
        "spreadsheet",
        "25 surveys listing the species seen with '; '; one row per survey and species",
        listed,
        tidy,
    )
    grouped: Rows = [["site", "date", "ph", "temp_c"]]
    tidy = [["site", "date", "ph", "temp_c"]]
    for s in range(8):
        site = f"VB-{10 + 3 * s:03d}"
        for d in range(4):
            row = [f"2024-07-{1 + 7 * d:02d}", f"{rng.uniform(6.2, 8.1):.1f}", f"{rng.uniform(9, 19):.1f}"]
            grouped.append([site if d == 0 else "", *row])
            tidy.append([site, *row])
    add(
        "large-fill-down-sites",
        "same-as-above",
        "spreadsheet",
        "8 sites written once over their 4 visit rows; fill the site down",
        grouped,
        tidy,
    )
    sparse: Rows = [["household", "member", "age", "school", "occupation"]]
    for h in range(15):
        for m in range(rng.randint(1, 4)):
            age = rng.randint(1, 85)
            school = rng.choice(["Lowmoor Primary", "Fenwick Academy"]) if 4 < age < 18 else ""
            work = rng.choice(["farm hand", "nurse", "driver", "teacher", ""]) if age >= 18 else ""
            sparse.append([f"H-{h + 1:02d}", str(m + 1), str(age), school, work])
    add(
        "tidy-large-household-blanks",
        "tidy",
        "spreadsheet",
        "household roster whose many blanks are real (no school, no occupation), not same-as-above",
        sparse,
        sparse,
    )
    sections: Rows = [["item", "bin", "count"]]
    tidy = [["store", "item", "bin", "count"]]
    for store in ["Corran Street store", "Mill Yard store", "Harbour Row store"]:
        sections.append([store, "", ""])
        total = 0
        for k in range(6):
            count = rng.randint(0, 400)
            total += count
            item = f"Part {chr(65 + k)}{rng.randint(10, 99)}"
            bin_code = f"{chr(65 + k)}-{rng.randint(1, 40):02d}"
            sections.append([item, bin_code, str(count)])
            tidy.append([store, item, bin_code, str(count)])
        sections.append(["Subtotal", "", str(total)])
    add(
        "large-sections-subtotals",
        "multi-step",
        "spreadsheet",
        "store title rows over their items and a Subtotal row under each; lift store, drop subtotals",
        sections,
        tidy,
    )
