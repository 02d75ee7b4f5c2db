"""Recognises units of measure (`mg/L`, `µS/cm`, `°C`, `cfu/100mL`) so a unit is never taken for a code."""

from __future__ import annotations

import re

# Source: SI Brochure, 9th edition (BIPM 2019), tables 2, 4 and 8 (base, derived and accepted
# units) and table 7 (prefixes), limited to the ones partner data files write.
_SI_WORDS = "m g s A K mol cd L l Hz N Pa J W C V Ω ohm S h min d ha t bar °C degC"
SI_SYMBOLS = frozenset(_SI_WORDS.split())
PREFIXES = ("", "k", "M", "G", "c", "m", "µ", "μ", "u", "n", "d")
# Common practice (no source): units written in water-quality, trade and survey files.
_TRADE_WORDS = (
    "% ‰ ppm ppb ppt NTU FNU cfu CFU MPN pH °F degF in ft yd mi mph kmh kph knots lb lbs oz "
    "gal acre acres sq pcs pc ea each units unit items tonnes tons kWh MWh Wh hrs hr yrs yr "
    "wk day days sec mmHg psi cal kcal bpm"
)
TRADE_UNITS = frozenset(_TRADE_WORDS.split())
UNIT_PART = re.compile(r"^(\d+(?:\.\d+)?)?\s*([^\d\s]+?)([23²³])?$")


def _is_symbol(token: str) -> bool:
    if token in TRADE_UNITS or token.lower() in {u.lower() for u in TRADE_UNITS if len(u) > 2}:
        return True
    return any(token.startswith(p) and token[len(p) :] in SI_SYMBOLS for p in PREFIXES if len(token) > len(p))


def is_unit(text: str) -> bool:
    """True for a unit symbol or a ratio/product of them (`mg/L`, `cfu/100mL`, `kg m-2` is not)."""
    text = text.strip()
    if not text or len(text) > 16:
        return False
    for part in re.split(r"[/·*]", text):
        match = UNIT_PART.match(part.strip())
        if not match or not _is_symbol(match.group(2)):
            return False
    return True
