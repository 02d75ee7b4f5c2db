"""Read the unit of measure a column name carries: `Nitrate (mg/L)`, `temp_C`, `depth_m`."""

from __future__ import annotations

import re

BRACKETED = re.compile(r"[(\[]\s*([^()\[\]]+?)\s*[)\]]\s*$")
MADE_UP_LABEL = re.compile(r"^column [A-Z]{1,3}$")
"""`(column C)` is what the reader appends to a blank or repeated header, not a unit."""
SUFFIXES: dict[str, str] = {
    "c": "degC",
    "degc": "degC",
    "f": "degF",
    "mm": "mm",
    "cm": "cm",
    "m": "m",
    "km": "km",
    "g": "g",
    "kg": "kg",
    "mg_l": "mg/L",
    "mgl": "mg/L",
    "ug_l": "ug/L",
    "ugl": "ug/L",
    "pct": "%",
    "percent": "%",
    "us_cm": "uS/cm",
    "ntu": "NTU",
}
"""Name endings that are units, spelt the way Weir writes units elsewhere (degC, mg/L).
Common practice (no source): snake_case column names end in their unit, as in `flipper_length_mm`."""


def header_unit(name: str) -> str | None:
    """The unit a column name ends with, or None when it names none Weir knows."""
    bracketed = BRACKETED.search(name)
    if bracketed and not MADE_UP_LABEL.match(bracketed.group(1)):
        return bracketed.group(1)
    lowered = name.strip().lower()
    for suffix in sorted(SUFFIXES, key=len, reverse=True):
        if lowered.endswith("_" + suffix) and len(lowered) > len(suffix) + 1:
            return SUFFIXES[suffix]
    return None
