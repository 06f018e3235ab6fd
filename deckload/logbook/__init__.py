"""The voyage loading log: append-only, hash-chained, one writer at a time.

This is the only module in deckload that reads the clock (:func:`utc_now`).

File layout, in the log folder (``deckload.io.paths.log_dir``), per vessel:

* ``<slug>.log.jsonl`` — the log.  One JSON object per line, UTF-8, ``\\n``-terminated;
* ``<slug>.log.head.json`` — the head record: sequence number and SHA-256 of the newest
  complete line, rewritten atomically after each append.  It lets :meth:`Logbook.verify`
  notice that the newest entries were removed or the last one edited, which a hash chain
  alone cannot (nothing follows the last line to record its hash);
* ``<slug>.log.lock`` — the writer's lock file (``fcntl.flock``); it holds the writer's pid;
* ``<slug>.log.jsonl.torn-<UTC>.txt`` — a torn last line set aside at start (see below).

Each line holds (format ``deckload-log-1``)::

    seq          1, 2, 3 … — equal to the line number
    utc          ISO 8601 UTC time of the append, e.g. "2026-12-01T22:04:05.123Z"
    ship_clock   the ship's clock offset from UTC, "+HH:MM" (local timezone or configured)
    vessel, by, kind, change, change_data, remark
    summary      the computed summary of the Result (Δ, drafts, trim, list, GM fluid, FSC,
                 criteria passed/failed and the smallest margin, the criteria sets assessed,
                 what was not assessed and why, the verdict sentence, freeboard and its margin
                 to the load line, deck-edge and downflooding angles, the weather numbers), or null
    condition    the loading condition as written by deckload.io.profiles.dump_condition, or null
    prev_sha256  SHA-256 (hex) of the previous line's bytes, without its "\\n";
                 64 zeros on line 1

Durability: an append writes the whole line with one ``write`` on an ``O_APPEND``
descriptor, then ``os.fsync`` before returning; only then is the entry reported done.
A power cut can still leave the last line torn (cut short, or padded with zero bytes
by the file system).  When a writer opens the log, a torn last line is copied to a side
file (written and fsynced first), then cut from the log, and reported in
:attr:`Logbook.recovered_torn` — never silently dropped.

One writer at a time: :meth:`Logbook.open` takes ``fcntl.flock(LOCK_EX | LOCK_NB)`` on the
lock file.  If another process holds it, the log opens read-only and says why
(:attr:`Logbook.readonly_reason`).  The kernel releases the lock when the writer dies,
so a power cut or a crash never leaves a stale lock behind.
"""

from __future__ import annotations

import errno
import fcntl
import hashlib
import json
import math
import os
import re
import time
from dataclasses import dataclass, field
from datetime import datetime, timedelta, timezone
from pathlib import Path
from typing import Any, Callable, Iterable

from deckload.io.atomicfile import fsync_dir, write_atomic
from deckload.core.model import Condition
from deckload.core.result import Result
from deckload.io.limits import MAX_LOG_BYTES, MAX_LOG_LINE_BYTES
from deckload.io.textsafe import control_char, escaped
from deckload.io.paths import vessel_slug

FORMAT = "deckload-log-1"
HEAD_FORMAT = "deckload-log-head-1"
GENESIS_SHA256 = "0" * 64
"""``prev_sha256`` of the first entry: there is no previous line."""

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
_OFFSET = re.compile(r"([+-])(\d{2}):(\d{2})")
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


class LogLockedError(RuntimeError):
    """The log is open read-only (another writer holds the lock, or read-only was asked)."""


class LogFormatError(ValueError):
    """A log line could not be read; the message names the file and line."""


# --------------------------------------------------------------------------- clock


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
    off = parse_offset(ship_offset) if ship_offset else _configured_offset()
    ship = now + off
    return f"{now:%Y-%m-%d %H:%M} UTC (ship's time {ship:%Y-%m-%d %H:%M}, {format_offset(off)})"


def _configured_offset() -> timedelta:
    env = os.environ.get("DECKLOAD_SHIP_OFFSET")
    if not env:
        return local_offset()
    try:
        return parse_offset(env)
    except ShipOffsetError as e:
        raise ShipOffsetError(f"DECKLOAD_SHIP_OFFSET: {e}") from None


# --------------------------------------------------------------------------- helpers


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


def _write_all(fd: int, data: bytes) -> None:
    view = memoryview(data)
    while view:
        n = os.write(fd, view)
        view = view[n:]


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
        "not_assessed": [{"item": n.item, "reason": n.reason} for n in result.not_assessed],
        "verdict": result.verdict_text(),
        "deck_edge_angle_deg": result.deck_edge_angle_deg,
        "downflooding_angle_deg": result.downflooding_angle_deg,
        "freeboard_m": result.freeboard_m,
        "load_line_margin_m": result.load_line_margin_m,
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


# --------------------------------------------------------------------------- entries


@dataclass(frozen=True)
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


def _split_lines(data: bytes) -> tuple[list[bytes], bytes]:
    """Complete lines (without '\\n') and the unterminated remainder."""
    parts = data.split(b"\n")
    return parts[:-1], parts[-1]


# --------------------------------------------------------------------------- verify


@dataclass(frozen=True)
class VerifyReport:
    ok: bool
    """True when every line reads and the chain and head record agree."""
    problems: list[str]
    """Each problem names the line and what is wrong."""
    notes: list[str] = field(default_factory=list)
    """Things worth knowing that do not break the chain (e.g. head record behind by one)."""
    entries: int = 0
    """Number of complete lines read."""
    last_sha256: str = GENESIS_SHA256
    """SHA-256 of the newest complete line: write it in the paper log to anchor the chain."""


def verify_lines(
    lines: list[bytes],
    tail: bytes,
    head: dict | None,
    vessel_name: str | None,
    writer_active: bool = False,
) -> VerifyReport:
    """Check the chain of ``lines`` (complete lines, no '\\n') and the head record.

    Every line must parse; its ``seq`` must equal its line number and its
    ``prev_sha256`` the SHA-256 of the line before.  An edited line changes its hash,
    so the next line's ``prev_sha256`` no longer matches it; a removed, inserted or
    moved line breaks both the numbering and the chain at the place it happened.
    The newest line is checked against the head record.
    """
    problems: list[str] = []
    notes: list[str] = []
    prev_sha = GENESIS_SHA256
    seqs: list[int | None] = []
    offset = 0  # seq − line number: changes exactly where entries were removed, inserted or moved
    for i, line in enumerate(lines, start=1):
        try:
            e = _entry_from_line(line, i)
        except LogFormatError as exc:
            problems.append(f"{exc} — the line was damaged or edited")
            seqs.append(None)
            prev_sha = sha256_hex(line)
            continue
        seqs.append(e.seq)
        chained = e.prev_sha256 == prev_sha
        if e.seq - i != offset:
            offset = e.seq - i
            before = seqs[-2] if len(seqs) > 1 else None
            where = f"entry #{e.seq} follows entry #{before}" if before else f"entry #{e.seq}, expected #{i}"
            problems.append(
                f"line {i}: {where} — an entry was removed, inserted or moved here"
                + ("" if chained else "; the hash chain breaks here too")
            )
        elif not chained and i == 1:
            problems.append(
                "line 1: prev_sha256 should be the genesis value (64 zeros) — line 1 was edited"
            )
        elif not chained:
            problems.append(
                f"line {i - 1}: edited — its SHA-256 is not the one line {i} records for it"
            )
        if vessel_name is not None and e.vessel != vessel_name:
            problems.append(f"line {i}: vessel {e.vessel!r}, but this log belongs to {vessel_name!r}")
        if e.kind not in KINDS:
            problems.append(f"line {i}: kind {e.kind!r} is not one of {', '.join(KINDS)}")
        prev_sha = sha256_hex(line)

    seen: dict[int, int] = {}
    for i, s in enumerate(seqs, start=1):
        if s is None:
            continue
        if s in seen:
            problems.append(f"line {i}: entry #{s} already appears on line {seen[s]} — a duplicate was inserted")
        else:
            seen[s] = i

    n = len(lines)
    if tail:
        if writer_active:
            notes.append(f"line {n + 1}: incomplete — another process is writing the log right now")
        else:
            problems.append(
                f"line {n + 1}: incomplete last line ({len(tail)} bytes, no line end) — torn by a power "
                f"cut or cut short; opening the log for writing sets it aside in a side file"
            )

    if head is None:
        if n:
            problems.append(
                f"head record: missing, but the log has {n} entr{'y' if n == 1 else 'ies'} — it was deleted; "
                "the newest entries may have been removed or edited without trace (tampering suspected)"
            )
    elif head.get("seq") == 0 and head.get("sha256") == GENESIS_SHA256:
        if n:
            notes.append(f"head record is {n} entr{'y' if n == 1 else 'ies'} behind (power cut between the first "
                         "append and its head update); the lines chain correctly from the start")
    else:
        hseq, hsha = head.get("seq"), head.get("sha256")
        if not isinstance(hseq, int) or isinstance(hseq, bool) or not isinstance(hsha, str):
            problems.append("head record: damaged (no valid 'seq'/'sha256'); the newest entries cannot be checked")
        else:
            at = _line_of_seq(seqs, hseq)
            top = max((q for q in seqs if q is not None), default=0)
            if at is None and hseq > top:
                problems.append(
                    f"line {n + 1}: missing — the head record names entry #{hseq} but the log ends with "
                    f"#{top} on line {n} (the newest entries were removed, or the file truncated)"
                )
            elif at is None:
                problems.append(f"head record: names entry #{hseq}, which is not in the log (removed)")
            elif sha256_hex(lines[at - 1]) != hsha:
                problems.append(
                    f"line {at}: its SHA-256 is not the one in the head record — line {at} was edited "
                    f"or replaced"
                )
            elif at < n:
                notes.append(
                    f"head record is {n - at} entr{'y' if n - at == 1 else 'ies'} behind (power cut between "
                    f"an append and its head update); lines {at + 1}–{n} chain correctly from it"
                )
    return VerifyReport(
        ok=not problems,
        problems=problems,
        notes=notes,
        entries=n,
        last_sha256=sha256_hex(lines[-1]) if lines else GENESIS_SHA256,
    )


# --------------------------------------------------------------------------- torn tail


@dataclass(frozen=True)
class TornRecovery:
    """A torn last line found at start and set aside in a side file."""

    log_path: Path
    side_path: Path
    line_no: int
    n_bytes: int

    def __str__(self) -> str:
        return (
            f"{self.log_path.name}: torn line {self.line_no} ({self.n_bytes} bytes) set aside in "
            f"{self.side_path.name}; the append it belonged to never reported done (power cut or "
            f"crash during the write)"
        )


# --------------------------------------------------------------------------- logbook


class Logbook:
    """One vessel's voyage log.  Open with :meth:`open`; close with :meth:`close`."""

    readonly: bool
    readonly_reason: str
    path: Path
    vessel_name: str
    recovered_torn: TornRecovery | None
    ship_clock: str | None

    def __init__(self) -> None:  # use Logbook.open
        self._lock_fd: int | None = None
        self._fd: int | None = None
        self._last_seq = 0
        self._last_sha = GENESIS_SHA256
        self._cache: tuple[tuple[int, int], list[LogEntry]] | None = None
        self.skipped: list[str] = []
        """Lines :meth:`entries` could not read at its last call, each naming its line."""
        self.head_problem: str | None = None
        """Set when an append reached the disk but the head record could not be updated."""
        self._clock: Callable[[], datetime] = utc_now

    # ----------------------------------------------------------------- opening

    @classmethod
    def open(
        cls,
        directory: Path,
        vessel_name: str,
        *,
        readonly: bool = False,
        ship_offset: str | None = None,
        clock: Callable[[], datetime] | None = None,
    ) -> "Logbook":
        """Open (creating the folder and file for a writer) the log of ``vessel_name``.

        ``ship_offset`` ('+HH:MM') fixes the ship's clock offset; otherwise
        ``$DECKLOAD_SHIP_OFFSET``, otherwise the local timezone.  ``clock`` replaces
        :func:`utc_now` (tests).  If another process holds the writer's lock the log
        opens read-only with :attr:`readonly_reason` saying so.
        """
        self = cls()
        directory = Path(directory)
        slug = vessel_slug(vessel_name)
        self.vessel_name = vessel_name
        self.path = directory / f"{slug}.log.jsonl"
        self.head_path = directory / f"{slug}.log.head.json"
        self.lock_path = directory / f"{slug}.log.lock"
        self.recovered_torn = None
        self.ship_clock = format_offset(parse_offset(ship_offset)) if ship_offset else None
        if clock is not None:
            self._clock = clock
        self.readonly = True
        self.readonly_reason = "opened read-only on request"
        if not readonly:
            directory.mkdir(parents=True, exist_ok=True)
            holder = self._take_lock()
            if holder is None:
                self.readonly = False
                self.readonly_reason = ""
                try:
                    self._open_for_append()
                except BaseException:
                    self.close()
                    raise
            else:
                self.readonly_reason = (
                    f"another deckload process ({holder}) is writing this log; opened read-only"
                )
        return self

    def _take_lock(self) -> str | None:
        """Take the writer's lock; None on success, else a description of the holder."""
        fd = os.open(self.lock_path, os.O_RDWR | os.O_CREAT, 0o644)
        # A reader probing the lock (see writer_active) holds it for microseconds; retry briefly.
        for attempt in range(5):
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
                break
            except OSError as exc:
                if exc.errno not in (errno.EWOULDBLOCK, errno.EAGAIN, errno.EACCES):
                    os.close(fd)
                    raise
                time.sleep(0.02 * (attempt + 1))
        else:
            try:
                holder = os.pread(fd, 200, 0).decode("utf-8", "replace").strip() or "pid unknown"
            finally:
                os.close(fd)
            return holder
        self._lock_fd = fd
        os.ftruncate(fd, 0)
        os.pwrite(fd, f"pid {os.getpid()} since {format_utc(utc_now())}\n".encode(), 0)
        return None

    def _read_head(self) -> dict | None:
        try:
            with open(self.head_path, "rb") as f:
                raw = f.read(64 * 1024)  # a head record is one short line; more is damage
        except FileNotFoundError:
            return None
        try:
            head = json.loads(raw.decode("utf-8"))
        except (ValueError, RecursionError):
            return {"damaged": True}
        return head if isinstance(head, dict) else {"damaged": True}

    def _open_for_append(self) -> None:
        """Under the lock: set aside a torn tail, bring the head record up to date.

        If the head record disagrees with the log (the newest entries gone, or the
        last one changed) nothing is written: appending would overwrite that evidence.
        The log then stays read-only and the reason says what to do.
        """
        from deckload.io.atomicfile import leftover_temp_files

        for tmp in leftover_temp_files(self.path.parent):
            # a head record or side file whose write was killed before its rename: under the
            # writer's lock nobody else can be writing it, so the half copy goes
            if tmp.name.startswith((f".{self.head_path.name}.", f".{self.path.name}.")):
                tmp.unlink(missing_ok=True)
        created = not self.path.exists()
        self._fd = os.open(self.path, os.O_RDWR | os.O_APPEND | os.O_CREAT, 0o644)
        if created:
            os.fsync(self._fd)
            fsync_dir(self.path.parent)
            if not self.head_path.exists():
                # The head record exists from the start (seq 0, the genesis hash), so that a log
                # with entries and no head record always means the head was deleted.
                self._write_head()
        data = _read_fd(self._fd)
        lines, torn = _split_lines(data)
        if not torn and lines and not _parses(lines[-1]):
            # A complete-looking but unreadable last line: zero-filled or half-flushed blocks.
            torn = lines.pop() + b"\n"
        head = self._read_head()
        problem = _head_disagreement(head, lines)
        if problem is not None:
            os.close(self._fd)
            self._fd = None
            self.close()
            self.readonly = True
            self.readonly_reason = (
                f"{problem}; nothing will be written to this log until that is looked into "
                f"(run 'deckload log verify'; to start a fresh log, move {self.path.name} and "
                f"{self.head_path.name} aside)"
            )
            return
        if torn:
            line_no = len(lines) + 1
            self.recovered_torn = self._set_aside(torn, line_no)
            os.ftruncate(self._fd, len(data) - len(torn))
            os.fsync(self._fd)
        if lines:
            self._last_sha = sha256_hex(lines[-1])
            try:
                self._last_seq = _entry_from_line(lines[-1], len(lines)).seq
            except LogFormatError:
                self._last_seq = len(lines)
            if head is None or head.get("seq") != self._last_seq:
                self._write_head()

    def _set_aside(self, torn: bytes, line_no: int) -> TornRecovery:
        stamp = self._clock().astimezone(timezone.utc).strftime("%Y%m%dT%H%M%SZ")
        side = self.path.with_name(f"{self.path.name}.torn-{stamp}.txt")
        k = 1
        while side.exists():
            k += 1
            side = self.path.with_name(f"{self.path.name}.torn-{stamp}-{k}.txt")
        write_atomic(side, torn)
        return TornRecovery(self.path, side, line_no, len(torn))

    def _write_head(self) -> None:
        write_atomic(
            self.head_path,
            (_dumps({"format": HEAD_FORMAT, "seq": self._last_seq, "sha256": self._last_sha}) + "\n").encode(),
        )

    # ----------------------------------------------------------------- writing

    def append(
        self,
        *,
        kind: str,
        by: str,
        change_text: str,
        change_data: dict,
        result: Result | None,
        condition: Condition | None,
        remark: str = "",
    ) -> LogEntry:
        """Append one entry; returns only after the line is on disk (write, fsync).

        Raises :class:`LogLockedError` when read-only and ``ValueError`` for bad input
        (unknown kind, initials not 1–4 letters, empty change text, data not JSON).
        """
        if self.readonly or self._fd is None:
            raise LogLockedError(f"{self.path.name}: {self.readonly_reason or 'log is closed'}")
        if kind not in KINDS:
            raise ValueError(f"kind {kind!r} is not one of: {', '.join(KINDS)}")
        initials = validate_initials(by)
        if not isinstance(change_text, str) or not change_text.strip():
            raise ValueError("change text must say what changed (it is empty)")
        for what, text in (("change text", change_text), ("remark", remark)):
            if not isinstance(text, str) or len(text) > 2000:
                raise ValueError(f"{what}: at most 2000 characters of text")
            bad = control_char(text)
            if bad is not None:
                raise ValueError(f"{what} holds the control character {bad}: type plain text")
        if not isinstance(change_data, dict):
            raise ValueError(f"change data must be a mapping, not {type(change_data).__name__}")
        now = self._clock()
        if now.tzinfo is None:
            raise ValueError("the clock returned a time without a timezone")
        offset = parse_offset(self.ship_clock) if self.ship_clock else _configured_offset()
        record = {
            "format": FORMAT,
            "seq": self._last_seq + 1,
            "utc": format_utc(now),
            "ship_clock": format_offset(offset),
            "vessel": self.vessel_name,
            "by": initials,
            "kind": kind,
            "change": change_text.strip(),
            "change_data": change_data,
            "remark": remark.strip(),
            "summary": None if result is None else summarise(result),
            "condition": None if condition is None else condition_record(condition),
            "prev_sha256": self._last_sha,
        }
        try:
            text = _dumps(record)
        except (TypeError, ValueError) as exc:
            raise ValueError(f"change data cannot be stored as JSON: {exc}") from None
        line = text.encode("utf-8")
        if len(line) > MAX_LOG_LINE_BYTES:
            raise ValueError(f"the entry would be {len(line)} bytes, more than the {MAX_LOG_LINE_BYTES} allowed")
        size_before = os.fstat(self._fd).st_size
        try:
            _write_all(self._fd, line + b"\n")
            os.fsync(self._fd)
        except OSError:
            # Disk full or I/O error: cut back to the last good line so the next append
            # does not land after a half line, then report the failure.
            try:
                os.ftruncate(self._fd, size_before)
                os.fsync(self._fd)
            except OSError:
                pass
            raise
        self._last_seq += 1
        self._last_sha = sha256_hex(line)
        try:
            self._write_head()
        except OSError as exc:
            # The entry itself is on disk; a head record left behind is brought forward at
            # the next open (it still names an entry the later lines chain from).
            self.head_problem = f"head record not updated: {exc}"
        return _entry_from_line(line, self._last_seq)

    # ----------------------------------------------------------------- reading

    def _read(self) -> bytes:
        from deckload.io.limits import read_limited

        try:
            return read_limited(self.path, MAX_LOG_BYTES, "one voyage log (start a new log)")
        except FileNotFoundError:
            return b""

    def entries(self) -> list[LogEntry]:
        """Every complete, readable entry, oldest first.

        An unterminated last line is left out (it is being written, or torn).  An
        unreadable line is left out too and named in :attr:`skipped`, so a view can
        say so; :meth:`verify` gives the full account.
        """
        try:
            st = os.stat(self.path)
        except FileNotFoundError:
            self.skipped = []
            return []
        key = (st.st_size, st.st_mtime_ns)
        if self._cache is None or self._cache[0] != key:
            lines, _tail = _split_lines(self._read())
            out: list[LogEntry] = []
            skipped: list[str] = []
            for i, line in enumerate(lines, start=1):
                try:
                    out.append(_entry_from_line(line, i))
                except LogFormatError as exc:
                    skipped.append(str(exc))
            self._cache = (key, out)
            self.skipped = skipped
        return list(self._cache[1])

    def writer_active(self) -> bool:
        """True when some process (this one included) holds the writer's lock."""
        if self._lock_fd is not None:
            return True
        try:
            fd = os.open(self.lock_path, os.O_RDONLY)
        except FileNotFoundError:
            return False
        try:
            fcntl.flock(fd, fcntl.LOCK_SH | fcntl.LOCK_NB)
        except OSError:
            return True
        finally:
            os.close(fd)  # closing releases the probe lock at once
        return False

    def verify(self) -> VerifyReport:
        """Check the whole log: see :func:`verify_lines`."""
        lines, tail = _split_lines(self._read())
        head = self._read_head()
        if not lines and not tail and head is None:
            return VerifyReport(ok=True, problems=[], notes=["the log is empty"], entries=0)
        if not self.path.exists() and head is not None:
            return VerifyReport(ok=False, entries=0, notes=[], problems=[
                f"{self.path.name}: missing, but its head record {self.head_path.name} names entry "
                f"#{head.get('seq')} — the log was deleted or moved (tampering suspected)"])
        return verify_lines(lines, tail, head, self.vessel_name, writer_active=self.writer_active() and
                            self._lock_fd is None)

    @property
    def newest(self) -> tuple[int, str] | None:
        """The newest entry's number and SHA-256 as this writer knows them (None: no entry yet)."""
        return (self._last_seq, self._last_sha) if self._last_seq > 0 else None

    def close(self) -> None:
        """Close the log and release the writer's lock."""
        if self._fd is not None:
            os.close(self._fd)
            self._fd = None
        if self._lock_fd is not None:
            try:
                fcntl.flock(self._lock_fd, fcntl.LOCK_UN)
            finally:
                os.close(self._lock_fd)
                self._lock_fd = None

    def __enter__(self) -> "Logbook":
        return self

    def __exit__(self, *exc) -> None:
        self.close()

    def __del__(self) -> None:
        try:
            self.close()
        except Exception:
            pass


def _read_fd(fd: int) -> bytes:
    size = os.fstat(fd).st_size
    chunks = []
    pos = 0
    while pos < size:
        b = os.pread(fd, size - pos, pos)
        if not b:
            break
        chunks.append(b)
        pos += len(b)
    return b"".join(chunks)


def _parses(line: bytes) -> bool:
    try:
        return isinstance(json.loads(line.decode("utf-8")), dict)
    except (ValueError, RecursionError):
        return False


def _line_of_seq(seqs: list[int | None], seq: int) -> int | None:
    """1-based line holding entry ``seq``, searched from the end (where the head points)."""
    for i in range(len(seqs) - 1, -1, -1):
        if seqs[i] == seq:
            return i + 1
    return None


def _seq_of(line: bytes) -> int | None:
    try:
        obj = json.loads(line.decode("utf-8"))
    except (ValueError, RecursionError):
        return None
    seq = obj.get("seq") if isinstance(obj, dict) else None
    return seq if isinstance(seq, int) and not isinstance(seq, bool) else None


def _head_disagreement(head: dict | None, lines: list[bytes]) -> str | None:
    """Why the head record contradicts the log's complete lines, or None if it does not.

    The head names the newest entry appended (its seq and SHA-256).  It agrees when that
    entry is in the log unchanged and every later line chains from it: the head is then
    only behind (a power cut, or a failed head update, after an append).
    """
    if head is None:
        # Every log gets its head record when it is created: entries without one mean it was deleted.
        return None if not lines else "the head record is missing although the log has entries (deleted)"
    seq, sha = head.get("seq"), head.get("sha256")
    if not isinstance(seq, int) or isinstance(seq, bool) or not isinstance(sha, str):
        return "the head record is damaged"
    if seq == 0 and sha == GENESIS_SHA256:
        prev = GENESIS_SHA256
        for k, line in enumerate(lines):
            try:
                got = json.loads(line.decode("utf-8")).get("prev_sha256")
            except (ValueError, RecursionError, AttributeError):
                got = None
            if got != prev:
                return f"line {k + 1} does not chain from the start of the log the head record names"
            prev = sha256_hex(line)
        return None
    for at in range(len(lines) - 1, -1, -1):
        if _seq_of(lines[at]) != seq:
            continue
        if sha256_hex(lines[at]) != sha:
            return f"line {at + 1} (entry #{seq}) does not match the head record (edited or replaced)"
        for k in range(at + 1, len(lines)):
            try:
                prev = json.loads(lines[k].decode("utf-8")).get("prev_sha256")
            except (ValueError, RecursionError, AttributeError):
                prev = None
            if prev != sha256_hex(lines[k - 1]):
                return f"line {k + 1} does not chain from the entry the head record names (#{seq})"
        return None
    last = _seq_of(lines[-1]) if lines else None
    return (
        f"the head record names entry #{seq} but the log ends with "
        f"{'entry #' + str(last) if last is not None else 'no readable entry'} "
        f"(entries removed, the file truncated, or the last line damaged)"
    )


def log_files(directory: Path) -> list[Path]:
    """The vessel logs in ``directory`` (sorted by name), including logs whose file is gone but
    whose head record remains (verify reports those)."""
    d = Path(directory)
    logs = set(d.glob("*.log.jsonl"))
    logs |= {h.with_name(h.name.removesuffix(".head.json") + ".jsonl") for h in d.glob("*.log.head.json")}
    return sorted(logs)


def anchor(directory: Path, vessel_name: str) -> tuple[int, str] | None:
    """The newest entry's number and SHA-256 in a vessel's log (for printed copies), or None."""
    try:
        book = Logbook.open(Path(directory), vessel_name, readonly=True)
    except OSError:
        return None
    try:
        entries = book.entries()
    except OSError:
        return None
    finally:
        book.close()
    return (entries[-1].seq, entries[-1].sha256) if entries else None


def find_anchor(lines: list[bytes], anchor_text: str) -> tuple[int, int] | None:
    """Where a paper copy's anchor (a SHA-256, or its first 12+ hex digits, optionally as
    'N:HASH' or '#N HASH') is in the log: (line number, entry number), else None."""
    m = re.fullmatch(r"\s*(?:#?(\d+)\s*[:\s]\s*)?([0-9a-fA-F]{12,64})\s*", anchor_text)
    if m is None:
        raise ValueError(f"anchor {anchor_text!r} is not a SHA-256 (12 to 64 hex digits), optionally after 'N:'")
    want_seq = int(m.group(1)) if m.group(1) else None
    prefix = m.group(2).lower()
    for i, line in enumerate(lines, start=1):
        if sha256_hex(line).startswith(prefix):
            seq = _seq_of(line)
            if want_seq is None or seq == want_seq:
                return i, seq if seq is not None else i
    return None


def vessel_of_log(path: Path) -> str:
    """The vessel name recorded in a log's first readable line (else its file-name slug)."""
    try:
        with open(path, "rb") as f:
            for i, line in enumerate(f, start=1):
                if line.endswith(b"\n"):
                    try:
                        return _entry_from_line(line[:-1], i).vessel
                    except LogFormatError:
                        continue
    except FileNotFoundError:
        pass
    return path.name.removesuffix(".log.jsonl")


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
