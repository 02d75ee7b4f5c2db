"""Ranges a draft proposes: the values seen, widened by a margin, rounded outward, within physical limits."""

from __future__ import annotations

import math

COORDINATE_LIMITS = {
    "latitude": (-90.0, 90.0),
    "lat": (-90.0, 90.0),
    "longitude": (-180.0, 180.0),
    "lon": (-180.0, 180.0),
    "lng": (-180.0, 180.0),
}


def margin_range(low: float, high: float, integer: bool) -> tuple[float, float]:
    """The seen range widened by half its span or 5% of its size, rounded outward; 0 stays the floor.

    Common practice (no source): a drafted range must let next month's ordinary values through,
    and a quantity that was never negative (a concentration, a count) is bounded below by 0.
    """
    pad = max((high - low) / 2, max(abs(low), abs(high)) * 0.05, 1.0 if integer else 0.0)
    if pad == 0:
        pad = 1.0
    step = 1.0 if integer else 10.0 ** (math.floor(math.log10(pad)) - 1)
    digits = max(0, -math.floor(math.log10(step)))
    minimum = round(math.floor(round((low - pad) / step, 6)) * step, digits)
    maximum = round(math.ceil(round((high + pad) / step, 6)) * step, digits)
    if low >= 0 > minimum:
        minimum = 0.0
    return minimum, maximum


def physical_range(name: str, minimum: float, maximum: float) -> tuple[float, float]:
    """Margins never pass what a coordinate can be.

    Source: ISO 6709 (standard representation of geographic point location): latitude from -90 to
    +90 degrees, longitude from -180 to +180; the section number is not given (from memory).
    """
    limits = COORDINATE_LIMITS.get(name.strip().lower())
    if limits is None:
        return minimum, maximum
    return max(minimum, limits[0]), min(maximum, limits[1])


def shown(number: float) -> str:
    return str(int(number)) if number == int(number) else f"{number:g}"
