"""Tidy tables of the invented Vell Basin Water Network: Weir must leave every one unchanged."""

from __future__ import annotations

import random

Rows = list[list[str]]
SITES = [f"VB-{n:03d}" for n in range(1, 60)]
ANALYTES = ["nitrate", "phosphate", "ammonium", "chloride", "sulphate", "turbidity"]
TAXA = ["mayfly", "stonefly", "caddisfly", "midge", "blackfly", "snail", "leech", "shrimp"]
RIVERS = ["Vell", "Orrin Brook", "Tarn Beck", "Skell Water"]
GROUPS = ["Friends of the Vell", "Orrin Watch", "Tarn Beck Volunteers", "Skell Anglers"]
NOTES = [
    "bank eroded, sampled 5 m upstream",
    "",
    "cattle in stream",
    "",
    "bridge works; access via north bank",
    "",
]


def f(rng: random.Random, low: float, high: float, digits: int = 1) -> str:
    return f"{rng.uniform(low, high):.{digits}f}"


def day(rng: random.Random) -> str:
    return f"2025-{rng.randint(1, 12):02d}-{rng.randint(1, 28):02d}"


def tidy_tables(rng: random.Random) -> dict[str, Rows]:
    t: dict[str, Rows] = {}
    for i, n in enumerate([3, 8, 20]):
        t[f"tidy-wide-chemistry-{i}"] = [["site_id", "sampled_on", "ph", "nitrate_mg_l", "temp_c"]] + [
            [s, day(rng), f(rng, 6, 8.5), f(rng, 0, 4, 2), f(rng, 2, 18)] for s in rng.sample(SITES, n)
        ]
    long = [["site_id", "sampled_on", "analyte", "result", "unit", "qualifier"]]
    for s in rng.sample(SITES, 4):
        d = day(rng)
        for a in ANALYTES[:4]:
            long.append([s, d, a, f(rng, 0, 5, 3), "mg/L", rng.choice(["", "", "", "J", "U"])])
    t["tidy-long-chemistry"] = long
    t["tidy-sites"] = [["site_id", "site_name", "river", "lat", "lon", "established"]] + [
        [s, f"{r} at mile {k}", r, f(rng, 54, 55, 4), f(rng, -2.9, -2.1, 4), str(rng.randint(1988, 2024))]
        for k, (s, r) in enumerate(
            zip(rng.sample(SITES, 7), [rng.choice(RIVERS) for _ in range(7)], strict=False)
        )
    ]
    t["tidy-volunteer-groups"] = [["group_name", "site_id", "joined_on", "members"]] + [
        [g, s, day(rng), str(rng.randint(3, 40))] for g, s in zip(GROUPS, rng.sample(SITES, 4), strict=False)
    ]
    counts = [["site_id", "surveyed_on", "taxon", "count"]]
    for s in rng.sample(SITES, 3):
        for taxon in rng.sample(TAXA, 4):
            counts.append([s, "2025-05-12", taxon, str(rng.randint(0, 90))])
    t["tidy-taxa-counts"] = counts
    t["tidy-flow-gauges"] = [["gauge_id", "reading_at", "flow_m3s", "stage_m"]] + [
        ["VG-02", f"2025-02-03T{h:02d}:00", f(rng, 1, 9, 2), f(rng, 0.3, 1.4, 2)] for h in range(0, 24, 3)
    ]
    t["tidy-lab-qc"] = [["batch", "analyte", "spike_recovery_pct", "blank_result"]] + [
        [f"B{k:04d}", a, f(rng, 85, 112), f(rng, 0, 0.02, 3)] for k, a in enumerate(ANALYTES)
    ]
    t["tidy-field-notes"] = [["site_id", "visited_on", "observer", "notes"]] + [
        [s, day(rng), rng.choice(["A. Marsh", "B. Fell", "C. Rowan"]), NOTES[k % len(NOTES)]]
        for k, s in enumerate(rng.sample(SITES, 6))
    ]
    t["tidy-years-as-column"] = [["site_id", "year", "exceedances"]] + [
        [s, str(y), str(rng.randint(0, 6))] for s in rng.sample(SITES, 3) for y in (2023, 2024, 2025)
    ]
    t["tidy-nutrient-species"] = [["site_id", "sampled_on", "po4", "no3", "nh4", "so4"]] + [
        [s, day(rng), f(rng, 0, 1, 3), f(rng, 0, 5, 2), f(rng, 0, 1, 3), f(rng, 5, 40)]
        for s in rng.sample(SITES, 6)
    ]
    t["tidy-ph-field-lab"] = [["site_id", "sampled_on", "ph_field", "ph_lab"]] + [
        [s, day(rng), f(rng, 6, 8.5, 2), f(rng, 6, 8.5, 2)] for s in rng.sample(SITES, 5)
    ]
    t["tidy-short-site-ids"] = [["site", "depth_m", "dissolved_oxygen_mg_l"]] + [
        [f"S{k}", f(rng, 0.5, 5), f(rng, 6, 12)] for k in range(1, 7)
    ]
    t["tidy-two-columns"] = [["site_id", "river"]] + [[s, rng.choice(RIVERS)] for s in rng.sample(SITES, 5)]
    t["tidy-single-row"] = [["site_id", "sampled_on", "ph"], ["VB-014", "2025-03-02", "7.1"]]
    t["tidy-underscore-ids"] = [["site_id", "temp_c", "conductivity_us_cm"]] + [
        [f"VB_{rng.randint(100, 999)}", f(rng, 2, 18), str(rng.randint(80, 600))] for _ in range(6)
    ]
    t["tidy-coordinates"] = [["site_id", "easting", "northing", "altitude_m"]] + [
        [s, str(rng.randint(300000, 399999)), str(rng.randint(500000, 599999)), str(rng.randint(20, 600))]
        for s in rng.sample(SITES, 5)
    ]
    t["tidy-locations-with-slash"] = [["site_id", "location", "ph"]] + [
        [s, loc, f(rng, 6, 8)]
        for s, loc in zip(
            rng.sample(SITES, 7),
            [
                "Mill bridge / north bank",
                "Ford / ds",
                "Weir pool",
                "Old quarry / outfall",
                "Railway culvert",
                "Church lane / ford",
                "Sheep wash",
            ],
            strict=False,
        )
    ]
    t["tidy-sample-codes"] = [["sample_code", "site_id", "bottle", "volume_ml"]] + [
        [f"{s.replace('-', '')}-{b}", s, b, str(rng.choice([250, 500, 1000]))]
        for s in rng.sample(SITES, 3)
        for b in ("A", "B")
    ]
    t["tidy-repeated-ids"] = [["site_id", "sampled_on", "ph"]] + [
        [s, f"2025-09-{k * 7 + 1:02d}", f(rng, 6, 8)] for s in rng.sample(SITES, 3) for k in range(3)
    ]
    t["tidy-replicates"] = [["site_id", "replicate", "chlorophyll_ug_l"]] + [
        [s, str(r), f(rng, 0, 30)] for s in rng.sample(SITES, 3) for r in (1, 2, 3)
    ]
    t["tidy-dmy-dates"] = [["site_id", "sampled_on", "ecoli_cfu"]] + [
        [s, f"{rng.randint(1, 28):02d}/{rng.randint(1, 12):02d}/2025", str(rng.randint(0, 900))]
        for s in rng.sample(SITES, 6)
    ]
    t["tidy-optional-numbers"] = [["site_id", "sampled_on", "ph", "turbidity_ntu"]] + [
        [s, day(rng), f(rng, 6, 8), "" if k % 3 == 0 else f(rng, 0, 40)]
        for k, s in enumerate(rng.sample(SITES, 9))
    ]
    t["tidy-units-in-headers"] = [["site_id", "Temp (C)", "Flow (m3/s)", "Depth (m)"]] + [
        [s, f(rng, 2, 18), f(rng, 0.1, 9, 2), f(rng, 0.2, 3)] for s in rng.sample(SITES, 5)
    ]
    t["tidy-censored-results"] = [["site_id", "analyte", "result_mg_l"]] + [
        [s, a, rng.choice(["<0.01", "<0.05", f(rng, 0.05, 2, 2)])]
        for s in rng.sample(SITES, 3)
        for a in ANALYTES[:3]
    ]
    t["tidy-sex-codes"] = [["fish_id", "site_id", "species", "sex", "length_mm"]] + [
        [
            f"F{k:03d}",
            rng.choice(SITES[:4]),
            rng.choice(["brown trout", "bullhead", "minnow"]),
            rng.choice(["F", "M", "U"]),
            str(rng.randint(30, 420)),
        ]
        for k in range(1, 9)
    ]
    t["tidy-equipment"] = [["kit_id", "kind", "calibrated_on", "holder"]] + [
        [f"K-{k:02d}", kind, day(rng), g]
        for k, (kind, g) in enumerate(
            zip(["ph meter", "do probe", "turbidimeter", "ec meter"], GROUPS, strict=False), start=1
        )
    ]
    t["tidy-rainfall-daily"] = [["gauge_id", "day", "rain_mm"]] + [
        ["VR-01", f"2025-11-{d:02d}", f(rng, 0, 25)] for d in range(1, 15)
    ]
    t["tidy-exceedance-flags"] = [["site_id", "sampled_on", "nitrate_mg_l", "exceeds_limit"]] + [
        [s, day(rng), v, "yes" if float(v) > 3 else "no"]
        for s in rng.sample(SITES, 6)
        for v in [f(rng, 0, 6, 2)]
    ]
    t["tidy-survey-scores"] = [["site_id", "survey_year", "habitat_score", "grade"]] + [
        [s, str(rng.choice([2023, 2024, 2025])), str(rng.randint(20, 90)), rng.choice(["A", "B", "C", "D"])]
        for s in rng.sample(SITES, 7)
    ]
    t["tidy-bottle-volumes-pairs"] = [["site_id", "min_depth_m", "max_depth_m", "bottles"]] + [
        [s, f(rng, 0, 1), f(rng, 1, 4), str(rng.randint(1, 4))] for s in rng.sample(SITES, 5)
    ]
    return t
