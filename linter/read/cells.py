"""Typed cell values (from a workbook or a Parquet file) written as text the way a provider sees them."""

from __future__ import annotations

import json
import math
from datetime import date, datetime, time, timedelta
from decimal import Decimal

EXCEL_DIGITS = 15
# From memory of Excel's published specifications and limits: number precision is 15 significant digits,
# which is what Excel shows; more digits are binary noise from the float representation.


def number_text(value: float, digits: int | None = EXCEL_DIGITS) -> str:
    """A float as text without float noise: `12` not `12.0`, `0.3` not `0.30000000000000004`."""
    if math.isnan(value):
        return "NaN"
    if math.isinf(value):
        return "Infinity" if value > 0 else "-Infinity"
    if value.is_integer() and abs(value) < 10**EXCEL_DIGITS:
        return str(int(value))
    return format(value, f".{digits}g") if digits else repr(value)


def duration_text(value: timedelta) -> str:
    """ISO 8601 duration, e.g. `PT1H30M` or `P2DT0S`."""
    # Source: ISO 8601-1:2019 §5.5.2 duration format PnDTnHnMnS.
    sign = "-" if value < timedelta(0) else ""
    total = abs(value)
    hours, rest = divmod(total.seconds, 3600)
    minutes, seconds = divmod(rest, 60)
    second_text = f"{seconds}.{total.microseconds:06d}".rstrip("0").rstrip(".")
    day_part = f"{total.days}D" if total.days else ""
    time_part = "".join(f"{n}{u}" for n, u in ((hours, "H"), (minutes, "M")) if n) + (
        f"{second_text}S" if seconds or total.microseconds or not (hours or minutes) else ""
    )
    return f"{sign}P{day_part}T{time_part}"


def cell_text(value: object, *, date_only: bool = False, digits: int | None = EXCEL_DIGITS) -> str | None:
    """Text of one typed value; None only for a truly empty cell.

    `date_only` writes a midnight datetime as a calendar date (a date-formatted cell).
    """
    if value is None:
        return None
    if isinstance(value, str):
        return value if value != "" else None
    if isinstance(value, bool):
        # Common practice (no source): spreadsheets display logical values as TRUE/FALSE.
        return "TRUE" if value else "FALSE"
    if isinstance(value, int):
        return str(value)
    if isinstance(value, float):
        return number_text(value, digits)
    if isinstance(value, Decimal):
        return format(value, "f") if value == value.to_integral_value() else str(value)
    # Source: ISO 8601-1:2019 §5.2.2 calendar date (YYYY-MM-DD), §5.3 time, §5.4 date and time.
    if isinstance(value, datetime):
        if date_only and value.time() == time(0) and value.tzinfo is None:
            return value.date().isoformat()
        return value.isoformat()
    if isinstance(value, date):
        return value.isoformat()
    if isinstance(value, time):
        return value.isoformat()
    if isinstance(value, timedelta):
        return duration_text(value)
    if isinstance(value, list | dict | tuple):
        # Nested Parquet values (lists, structs, maps) as JSON, the text form most tools read back.
        return json.dumps(value, default=str, ensure_ascii=False)
    if isinstance(value, bytes):
        return value.decode("utf-8", errors="backslashreplace")
    return str(value)
