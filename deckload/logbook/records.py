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

from deckload.core import bounds
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


# ----------------------------------------------------------------- what a stored summary may hold
#
# deckload writes a summary only from a Result whose every number is finite (core/bounds.bounded)
# and with ``allow_nan=False``: a number outside what the evaluation can give was put there by
# hand, and must never be shown as if deckload had computed it.

_MAX_LENGTH_M = bounds.LENGTH_FACTOR * bounds.LBP_RANGE_M[1]
"""600 m: the hull box of the longest ship a profile may describe (1.2 × LBP 500 m,
core/bounds.py): no draft, trim, freeboard or heeling lever of hers is longer."""
_MAX_LEVER_M = 1.0e4
"""A GM, KG fluid, free-surface correction or criterion value (m, m·rad or degrees) of at most
10 km: BMt = B²/(12·T) of the broadest hull a profile may describe (B = 100 m, core/bounds.py)
reaches it only at a draft of 8 cm (derived for a box); a GM beyond is no ship's."""
_MAX_MASS_T = (bounds.LENGTH_FACTOR * bounds.LBP_RANGE_M[1] * bounds.BEAM_DEPTH_RANGE_M[1]
               * (bounds.BEAM_DEPTH_RANGE_M[1] + bounds.ABOVE_DEPTH_M) * bounds.WATER_DENSITY_RANGE_T_M3[1])
"""The hull box of the largest particulars a profile may describe (1.2·500 × 100 × (100 + 30) m,
core/bounds.py) full of the densest sea water: no displacement or deadweight is larger (derived)."""

_LENGTH = bounds.Range(-_MAX_LENGTH_M, _MAX_LENGTH_M, "m", "no length of a ship exceeds her hull box, at most "
                       "1.2 × 500 m")
_LEVER = bounds.Range(-_MAX_LEVER_M, _MAX_LEVER_M, "m", "beyond any ship's stability")
_CRITERION = bounds.Range(-_MAX_LEVER_M, _MAX_LEVER_M, "in the criterion's unit", "beyond any ship's stability")
_MASS = bounds.Range(-_MAX_MASS_T, _MAX_MASS_T, "t", "more than the largest hull box full of sea water")
_ANGLE = bounds.Range(-180.0, 180.0, "°", "an angle of heel")
_DENSITY = bounds.Range(*bounds.WATER_DENSITY_RANGE_T_M3, "t/m³", "the water a vessel floats in")

_SUMMARY: dict[str, Any] = {
    "condition_name": str,
    "water_density_t_m3": _DENSITY,
    "displacement_t": _MASS,
    "deadweight_t": _MASS,
    "draft_fwd_m": _LENGTH,
    "draft_aft_m": _LENGTH,
    "draft_mean_m": _LENGTH,
    "trim_m": _LENGTH,
    "list_deg": _ANGLE,
    "kg_fluid_m": _LEVER,
    "fsc_m": _LEVER,
    "gm_fluid_m": _LEVER,
    "criteria_pass": bool,
    "criteria_failed": [str],
    "criteria_not_assessable": [{"id": str, "note": str}],
    "criteria_sets": [{"id": str, "title": str, "pass": bool}],
    "not_assessed": [{"item": str, "reason": str, "applies": bool}],
    "verdict": str,
    "deck_edge_angle_deg": _ANGLE,
    "downflooding_angle_deg": _ANGLE,
    "freeboard_m": _LENGTH,
    "load_line_margin_m": _LENGTH,
    "load_line_mark": (str, None),
    "load_line_allowed_draft_m": _LENGTH,
    "deadweight_by_kind_t": ({str: _MASS}, None),
    "weather": ({"lw1_m": _LENGTH, "lw2_m": _LENGTH, "theta0_deg": _ANGLE, "theta0_limit_deg": _ANGLE,
                 "theta1_deg": _ANGLE, "theta2_deg": _ANGLE, "area_a_mrad": _CRITERION, "area_b_mrad": _CRITERION}, None),
    "smallest_margin": ({"id": str, "description": str, "value": _CRITERION, "limit": _CRITERION, "unit": str,
                         "margin": _CRITERION, "passed": bool}, None),
    "warnings": [str],
}
"""The shape of a stored summary (:func:`summarise`): a key may be missing (older entries have
fewer), but one that is there holds what deckload writes: text, a flag, a list or a record of
them, or a number inside its range (None where deckload writes None: every number, the flags,
the mark, the weather and the smallest margin).  Other keys are kept and never shown."""


def _checked(value: Any, spec: Any, where: str) -> Any:
    """``value`` as ``spec`` allows, text escaped; ValueError naming ``where`` and what is wrong."""
    if isinstance(spec, tuple):  # (shape, None): the shape, or null
        return None if value is None else _checked(value, spec[0], where)
    if isinstance(spec, bounds.Range):
        if value is None:
            return None
        if not isinstance(value, (int, float)) or isinstance(value, bool):
            raise ValueError(f"{where} is {_shown(value)}, not a number")
        rule = spec.rule(value)
        if rule is not None:
            raise ValueError(f"{where} = {_shown(value)} is {rule}; deckload never writes such a value")
        return value
    if spec is str:
        if not isinstance(value, str):
            raise ValueError(f"{where} is {_shown(value)}, not text")
        return escaped(value)
    if spec is bool:
        if value is not None and not isinstance(value, bool):
            raise ValueError(f"{where} is {_shown(value)}, not true or false")
        return value
    if isinstance(spec, list):
        if not isinstance(value, list):
            raise ValueError(f"{where} is {_shown(value)}, not a list")
        return [_checked(v, spec[0], f"{where}[{i}]") for i, v in enumerate(value)]
    if not isinstance(value, dict):
        raise ValueError(f"{where} is {_shown(value)}, not a record")
    if str in spec:  # a mapping of names to values
        return {escaped(str(k)): _checked(v, spec[str], f"{where}.{escaped(str(k))}") for k, v in value.items()}
    return {k: (_checked(v, spec[k], f"{where}.{k}") if k in spec else v) for k, v in value.items()}


def _shown(value: Any) -> str:
    """A stored value in a message, cut short (a number's 309 digits, a long list)."""
    text = escaped(repr(value) if not isinstance(value, float) else f"{value:.6g}")
    return text if len(text) <= 40 else text[:39] + "…"


def _finite_float(text: str) -> float:
    """json's reader for a number with a point or exponent: refused when not finite (1e999)."""
    x = float(text)
    if not math.isfinite(x):
        raise ValueError(f"the number {text[:40]} is not finite; deckload never writes one")
    return x


def _no_constant(text: str) -> float:
    """json's reader for NaN and Infinity, which deckload never writes (``allow_nan=False``)."""
    raise ValueError(f"{text} is not a number deckload writes")


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
        text = line.decode("utf-8")
    except ValueError as exc:
        raise LogFormatError(f"line {line_no}: not valid UTF-8 ({str(exc)[:200]})") from None
    try:
        obj = json.loads(text, parse_float=_finite_float, parse_constant=_no_constant)
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
        offset = parse_offset(obj["ship_clock"])
    except ValueError as exc:
        raise LogFormatError(f"line {line_no}: {exc}") from None
    if utc.tzinfo is None:
        raise LogFormatError(f"line {line_no}: utc {obj['utc']!r} has no timezone")
    try:  # every view shows the ship's time: one beyond the calendar (year 9999 + 14 h) is damage
        (utc + offset).replace(tzinfo=None)
    except OverflowError:
        raise LogFormatError(f"line {line_no}: utc {escaped(obj['utc'])!r} at ship's clock "
                             f"{escaped(obj['ship_clock'])} is beyond the calendar") from None
    try:
        summary = None if obj["summary"] is None else _checked(obj["summary"], _SUMMARY, "summary")
    except ValueError as exc:
        raise LogFormatError(f"line {line_no}: {exc}") from None
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
        summary=summary,
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
