"""The clock and the ship's clock offset: the one place in deckload that reads the clock.

Times are stored in UTC (:func:`format_utc`); the ship's clock is stored beside them as
an offset '+HH:MM' (:func:`parse_offset`, within ±14:00), taken from the Logbook's
``ship_offset``, else ``$DECKLOAD_SHIP_OFFSET``, else the local timezone.
"""

from __future__ import annotations

import os
import re
from datetime import datetime, timedelta, timezone

_OFFSET = re.compile(r"([+-])(\d{2}):(\d{2})", re.ASCII)


def utc_now() -> datetime:
    """The current UTC time.  The one place in deckload that reads the clock."""
    return datetime.now(timezone.utc)


def local_offset() -> timedelta:
    """The local timezone's current offset from UTC (the ship's clock, by default)."""
    off = utc_now().astimezone().utcoffset()
    return off if off is not None else timedelta(0)


class ShipOffsetError(ValueError):
    """A ship's clock offset that is not +HH:MM / -HH:MM within ±14:00."""


def parse_offset(text: str) -> timedelta:
    """Parse a ship's clock offset ``"+HH:MM"`` / ``"-HH:MM"`` (within ±14:00)."""
    m = _OFFSET.fullmatch(text.strip())
    if not m:
        raise ShipOffsetError(f"ship's clock offset {text!r} is not of the form +HH:MM or -HH:MM")
    sign, hh, mm = m.groups()
    minutes = int(hh) * 60 + int(mm)
    if int(mm) >= 60 or minutes > 14 * 60:
        raise ShipOffsetError(f"ship's clock offset {text!r} is outside -14:00 … +14:00")
    return timedelta(minutes=-minutes if sign == "-" else minutes)


def format_offset(off: timedelta) -> str:
    minutes = round(off.total_seconds() / 60)
    sign = "-" if minutes < 0 else "+"
    minutes = abs(minutes)
    return f"{sign}{minutes // 60:02d}:{minutes % 60:02d}"


def format_utc(t: datetime) -> str:
    """ISO 8601 UTC with milliseconds and a 'Z', e.g. ``2026-12-01T22:04:05.123Z``."""
    return t.astimezone(timezone.utc).isoformat(timespec="milliseconds").replace("+00:00", "Z")


def clock_stamp(ship_offset: str | None = None) -> str:
    """'2026-12-01 22:04 UTC (ship's time 2026-12-02 00:04, +02:00)' for printed reports."""
    now = utc_now()
    off = parse_offset(ship_offset) if ship_offset else configured_offset()
    ship = now + off
    return f"{now:%Y-%m-%d %H:%M} UTC (ship's time {ship:%Y-%m-%d %H:%M}, {format_offset(off)})"


def configured_offset() -> timedelta:
    """The ship's clock offset from ``$DECKLOAD_SHIP_OFFSET``, else the local timezone's."""
    env = os.environ.get("DECKLOAD_SHIP_OFFSET")
    if not env:
        return local_offset()
    try:
        return parse_offset(env)
    except ShipOffsetError as e:
        raise ShipOffsetError(f"DECKLOAD_SHIP_OFFSET: {e}") from None


def span_words(span: timedelta) -> str:
    """A length of time in words, to the second below a minute: '45 s', '1 h 00 min', '1 d 23 h 30 min'."""
    total = round(abs(span.total_seconds()))
    if total < 60:
        return f"{total} s"
    days, rest = divmod(total // 60, 24 * 60)
    hours, minutes = divmod(rest, 60)
    if days:
        return f"{days} d {hours:02d} h {minutes:02d} min"
    if hours:
        return f"{hours} h {minutes:02d} min"
    return f"{minutes} min"
