"""One log line: its format, its fields, and the entry read back from it.

Each line is one JSON object (format ``deckload-log-1``), UTF-8, ``\\n``-terminated, with the keys
of :data:`_REQUIRED`; :func:`_entry_from_line` reads one back as a :class:`LogEntry`, text
fields with control characters escaped, and :class:`LogFormatError` naming the line when it
cannot.  :func:`summarise` is the computed summary an entry stores; :func:`sha256_hex` the hash
of a line's bytes (without its ``\\n``) that the next line records (:mod:`.chain`).
"""

from __future__ import annotations

import hashlib
import json
import math
import re
from datetime import datetime
from typing import Any, Iterable

from deckload.core.deadweight import deadweight_by_kind
from deckload.core.frozen import frozen
from deckload.core.model import Condition
from deckload.core.result import Result
from deckload.io.limits import MAX_LOG_LINE_BYTES
from deckload.io.textsafe import escaped
from deckload.logbook.clock import parse_offset

FORMAT = "deckload-log-1"

KINDS: tuple[str, ...] = (
    "condition",
    "transfer",
    "bunkering",
    "cargo",
    "ballast",
    "remark",
    "edit",
    "restore",
)
"""Event kinds: a condition recorded, a fluid transfer, bunkering, cargo work, ballast
exchange, a remark, an edit committed on the loading screen, a past condition restored."""

KIND_LABELS: dict[str, str] = {
    "condition": "condition recorded",
    "transfer": "transfer",
    "bunkering": "bunkering",
    "cargo": "cargo",
    "ballast": "ballast exchange",
    "remark": "remark",
    "edit": "edit",
    "restore": "restore",
}

_INITIALS = re.compile(r"[A-Za-z]{1,4}")

_REQUIRED: dict[str, type | tuple[type, ...]] = {
    "format": str,
    "seq": int,
    "utc": str,
    "ship_clock": str,
    "vessel": str,
    "by": str,
    "kind": str,
    "change": str,
    "change_data": dict,
    "remark": str,
    "summary": (dict, type(None)),
    "condition": (dict, str, type(None)),
    "prev_sha256": str,
}


class LogFormatError(ValueError):
    """A log line could not be read; the message names the file and line."""


def validate_initials(by: str) -> str:
    """Initials of the officer: 1–4 letters, stored in capitals."""
    if not isinstance(by, str) or not _INITIALS.fullmatch(by.strip()):
        raise ValueError(f"initials {by!r} must be 1 to 4 letters (A–Z), e.g. 'JM'")
    return by.strip().upper()


def sha256_hex(data: bytes) -> str:
    return hashlib.sha256(data).hexdigest()


def _json_safe(obj: Any) -> Any:
    """Plain JSON types; non-finite floats become the strings 'inf', '-inf', 'nan'."""
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else repr(obj)
    if isinstance(obj, dict):
        return {str(k): _json_safe(v) for k, v in obj.items()}
    if isinstance(obj, (list, tuple)):
        return [_json_safe(v) for v in obj]
    if hasattr(obj, "tolist"):  # numpy scalars and arrays
        return _json_safe(obj.tolist())
    return obj


def _dumps(obj: Any) -> str:
    return json.dumps(_json_safe(obj), ensure_ascii=False, separators=(",", ":"), allow_nan=False)


def summarise(result: Result) -> dict:
    """The computed summary stored in each entry (units in the key names)."""
    sm = result.smallest_margin
    return {
        "condition_name": result.condition_name,
        "water_density_t_m3": result.water_density_t_m3,
        "displacement_t": result.displacement_t,
        "deadweight_t": result.deadweight_t,
        "draft_fwd_m": result.draft_fwd_m,
        "draft_aft_m": result.draft_aft_m,
        "draft_mean_m": result.draft_mean_m,
        "trim_m": result.trim_m,
        "list_deg": result.list_deg,
        "kg_fluid_m": result.kg_fluid_m,
        "fsc_m": result.fsc_m,
        "gm_fluid_m": result.gm_fluid_m,
        "criteria_pass": result.all_criteria_pass,
        "criteria_failed": [c.id for c in result.criteria if c.assessed and not c.passed],
        "criteria_not_assessable": [{"id": c.id, "note": c.note} for c in result.criteria if not c.assessed],
        "criteria_sets": [{"id": a.id, "title": a.title, "pass": a.passed} for a in result.criteria_sets],
        "not_assessed": [{"item": n.item, "reason": n.reason, "applies": n.applies} for n in result.not_assessed],
        "verdict": result.verdict_text(),
        "deck_edge_angle_deg": result.deck_edge_angle_deg,
        "downflooding_angle_deg": result.downflooding_angle_deg,
        "freeboard_m": result.freeboard_m,
        "load_line_margin_m": result.load_line_margin_m,
        "load_line_mark": result.load_line_mark,
        "load_line_allowed_draft_m": result.load_line_allowed_draft_m,
        "deadweight_by_kind_t": {d.title: d.mass_t for d in deadweight_by_kind(result)},
        "weather": None if result.weather is None else {
            k: getattr(result.weather, k) for k in (
                "lw1_m", "lw2_m", "theta0_deg", "theta0_limit_deg", "theta1_deg", "theta2_deg",
                "area_a_mrad", "area_b_mrad")},
        "smallest_margin": None
        if sm is None
        else {
            "id": sm.id,
            "description": sm.description,
            "value": sm.value,
            "limit": sm.limit,
            "unit": sm.unit,
            "margin": sm.margin,
            "passed": sm.passed,
        },
        "warnings": [w.message for w in result.warnings],
    }


def condition_record(condition: Condition) -> str:
    """The condition as stored in a log entry: the TOML text of ``profiles.dump_condition``."""
    from deckload.io.profiles import dump_condition

    return dump_condition(condition)


def condition_of(entry: "LogEntry", vessel) -> Condition:
    """The condition stored in ``entry``, validated against ``vessel`` (for viewing or restoring).

    Raises ``ValueError`` when the entry holds no condition and ``profiles.ProfileError``
    (naming the log line) when the stored text no longer fits the vessel profile.
    """
    from deckload.io.profiles import parse_condition

    if entry.condition is None:
        raise ValueError(f"log line {entry.line_no} ({entry.kind}) holds no loading condition")
    if not isinstance(entry.condition, str):
        raise ValueError(f"log line {entry.line_no}: the stored condition is not TOML text")
    return parse_condition(entry.condition, f"log line {entry.line_no}", vessel)


@frozen
class LogEntry:
    """One line of the log, as read back."""

    line_no: int
    """1-based line number in the log file."""
    seq: int
    """Sequence number written in the entry (equals ``line_no`` in an intact log)."""
    utc: datetime
    """Time of the append (UTC, timezone-aware)."""
    ship_clock: str
    """Ship's clock offset from UTC at the time, '+HH:MM'."""
    vessel: str
    by: str
    """Initials of the officer."""
    kind: str
    """One of :data:`KINDS`."""
    change_text: str
    """The change in words."""
    change_data: dict
    """The change as data."""
    remark: str
    summary: dict | None
    """The computed summary (see :func:`summarise`), or None for a remark."""
    condition: dict | str | None
    """The condition as written by ``deckload.io.profiles.dump_condition``, or None."""
    prev_sha256: str
    sha256: str
    """SHA-256 of this line's bytes (what the next entry records as ``prev_sha256``)."""

    @property
    def ship_time(self) -> datetime:
        """The time by the ship's clock (naive: the offset is in :attr:`ship_clock`)."""
        return (self.utc + parse_offset(self.ship_clock)).replace(tzinfo=None)

    @property
    def gm_fluid_m(self) -> float | None:
        return None if self.summary is None else self.summary.get("gm_fluid_m")

    @property
    def criteria_pass(self) -> bool | None:
        return None if self.summary is None else self.summary.get("criteria_pass")


def _entry_from_line(line: bytes, line_no: int) -> LogEntry:
    """Parse one line; :class:`LogFormatError` names the line and what is wrong.

    Text fields are read back with control characters escaped (deckload.io.textsafe): a line
    edited to hold terminal escapes is shown, never obeyed."""
    if len(line) > MAX_LOG_LINE_BYTES:
        raise LogFormatError(f"line {line_no}: {len(line)} bytes, more than the {MAX_LOG_LINE_BYTES} allowed "
                             "for one entry")
    try:
        obj = json.loads(line.decode("utf-8"))
    except (ValueError, RecursionError) as exc:
        raise LogFormatError(f"line {line_no}: not valid JSON ({str(exc)[:200]})") from None
    if not isinstance(obj, dict):
        raise LogFormatError(f"line {line_no}: not a JSON object")
    for key, typ in _REQUIRED.items():
        if key not in obj:
            raise LogFormatError(f"line {line_no}: key {key!r} is missing")
        if not isinstance(obj[key], typ) or (typ is int and isinstance(obj[key], bool)):
            raise LogFormatError(f"line {line_no}: key {key!r} has the wrong type ({obj[key]!r})")
    if obj["format"] != FORMAT:
        raise LogFormatError(f"line {line_no}: format {obj['format']!r}, expected {FORMAT!r}")
    try:
        utc = datetime.fromisoformat(obj["utc"])
        parse_offset(obj["ship_clock"])
    except ValueError as exc:
        raise LogFormatError(f"line {line_no}: {exc}") from None
    if utc.tzinfo is None:
        raise LogFormatError(f"line {line_no}: utc {obj['utc']!r} has no timezone")
    return LogEntry(
        line_no=line_no,
        seq=obj["seq"],
        utc=utc,
        ship_clock=obj["ship_clock"],
        vessel=escaped(obj["vessel"]),
        by=escaped(obj["by"]),
        kind=obj["kind"],
        change_text=escaped(obj["change"]),
        change_data=obj["change_data"],
        remark=escaped(obj["remark"]),
        summary=obj["summary"],
        condition=obj["condition"],
        prev_sha256=obj["prev_sha256"],
        sha256=sha256_hex(line),
    )


def filter_entries(
    entries: Iterable[LogEntry],
    *,
    kinds: Iterable[str] | None = None,
    date_from: "datetime | None" = None,
    date_to: "datetime | None" = None,
) -> list[LogEntry]:
    """Entries of the given kinds with UTC time in [date_from, date_to) (either end open)."""
    ks = set(kinds) if kinds is not None else None
    out = []
    for e in entries:
        if ks is not None and e.kind not in ks:
            continue
        if date_from is not None and e.utc < date_from:
            continue
        if date_to is not None and e.utc >= date_to:
            continue
        out.append(e)
    return out
