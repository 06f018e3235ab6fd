"""The :class:`Logbook` of one vessel: the lock, the store and the chain put together.

:meth:`Logbook.open` takes the writer's lock (:mod:`.lock`); a writer then opens the log
for appending, sets a torn tail aside and brings the head record forward
(:mod:`.storage`) — unless the head record contradicts the log (:mod:`.chain`), when it
stays read-only rather than write over that evidence.  :meth:`Logbook.append` builds the
next chained line (:mod:`.records`) and returns only once it is on disk.
"""

from __future__ import annotations

import dataclasses
import errno
import glob
import os
from datetime import datetime, timedelta
from pathlib import Path
from typing import Callable

from deckload.core.model import Condition
from deckload.core.result import Result
from deckload.io.limits import MAX_LOG_LINE_BYTES
from deckload.io.paths import vessel_slug
from deckload.io.textsafe import control_char, escaped
from deckload.logbook import lock as locking
from deckload.logbook.chain import (
    GENESIS_SHA256,
    VerifyReport,
    find_anchor,
    head_disagreement,
    verify_lines,
    whole_unterminated,
)
from deckload.logbook.clock import (
    ShipOffsetError,
    configured_offset,
    format_offset,
    format_utc,
    parse_offset,
    utc_now,
)
from deckload.logbook.lock import LogLockedError, WriterLock
from deckload.logbook.records import (
    FORMAT,
    KINDS,
    LogEntry,
    LogFormatError,
    _dumps,
    _entry_from_line,
    condition_record,
    sha256_hex,
    summarise,
    validate_initials,
)
from deckload.logbook.storage import (
    CopyChanges,
    LogStore,
    TornRecovery,
    _split_lines,
    case_stray_words,
    case_strays,
    undo_copy,
)


MAX_TEXT_CHARS = 2000
"""The longest change text or remark a log entry takes (a printed log stays readable)."""


class Logbook:
    """One vessel's voyage log.  Open with :meth:`open`; close with :meth:`close`."""

    readonly: bool
    readonly_reason: str
    path: Path
    vessel_name: str
    recovered_torn: TornRecovery | None
    restored_line_end: int | None
    """The line whose lost line end (a copy without it) was restored at opening, else None."""
    repaired_copy: tuple[CopyChanges, Path] | None
    """What a copy had changed and where the file as found was kept, when opening repaired it."""
    ship_clock: str | None

    def __init__(self) -> None:  # use Logbook.open
        self._store: LogStore | None = None
        self._lock: WriterLock | None = None
        self._last_seq = 0
        self._last_utc: datetime | None = None
        self.clock_back: tuple[int, timedelta] | None = None
        """After :meth:`append`: (the entry before's number, how much earlier) when the clock read
        earlier than the newest entry's time (set back, or wrong before), else None."""
        self._last_sha = GENESIS_SHA256
        self._cache: tuple[tuple[int, int], list[LogEntry]] | None = None
        self.skipped: list[str] = []
        """Lines :meth:`entries` could not read at its last call, each naming its line."""
        self.skipped_lines: list[tuple[int, str]] = []
        """The same, as (line number, what is wrong), for a view that shows them in their place."""
        self.by_file = False
        """Opened by :meth:`open_file`: the log of the vessel its file name says, for reading and checking."""
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
        repair_copy: bool = False,
    ) -> "Logbook":
        """Open (creating the folder and file for a writer) the log of ``vessel_name``.

        ``ship_offset`` ('+HH:MM') fixes the ship's clock offset; otherwise
        ``$DECKLOAD_SHIP_OFFSET``, otherwise the local timezone.  ``clock`` replaces
        :func:`utc_now` (tests).  If another process holds the writer's lock the log
        opens read-only with :attr:`readonly_reason` saying so.  A log a copy changed (a BOM,
        CR LF line ends: :func:`~deckload.logbook.storage.undo_copy`) opens read-only too, unless
        ``repair_copy`` (``log verify --recover``) and its entries are intact without them: it is
        then rewritten without them, the file as found kept beside it (:attr:`repaired_copy`).
        """
        return cls._open(Path(directory), vessel_slug(vessel_name), vessel_name, readonly=readonly,
                         ship_offset=ship_offset, clock=clock, repair_copy=repair_copy)

    @classmethod
    def open_file(cls, path: Path, *, readonly: bool = True, repair_copy: bool = False) -> "Logbook":
        """Open the log file ``path`` found in a log folder (``<slug>.log.jsonl``), for reading and
        checking (``readonly=False`` takes the writer's lock to set a torn tail aside; it never records).

        The file is what is read, whatever its lines say: the vessel is the one its file name
        names (:meth:`verify` reports an entry recording another), and :attr:`vessel_name` is
        the name the entries record when it is that vessel's, else the file name's slug.  A
        vessel name read from inside a file never chooses which file is opened or made.
        """
        path = Path(path)
        slug = path.name.removesuffix(".log.jsonl")
        if not readonly and not path.exists():
            readonly = True  # (a writer would create it: a missing log is evidence verify reports)
        self = cls._open(path.parent, slug, slug, readonly=readonly, by_file=True, repair_copy=repair_copy)
        try:
            self.vessel_name = next((e.vessel for e in self.entries() if vessel_slug(e.vessel) == slug), slug)
        except BaseException:
            self.close()
            raise
        return self

    @classmethod
    def _open(cls, directory: Path, slug: str, vessel_name: str, *, readonly: bool, ship_offset: str | None = None,
              clock: Callable[[], datetime] | None = None, by_file: bool = False,
              repair_copy: bool = False) -> "Logbook":
        self = cls()
        self.by_file = by_file
        self.vessel_name = vessel_name
        self.path = directory / f"{slug}.log.jsonl"
        self.head_path = directory / f"{slug}.log.head.json"
        self.lock_path = directory / f"{slug}.log.lock"
        self._store = LogStore(self.path, self.head_path)
        self._lock = WriterLock(self.lock_path)
        self.recovered_torn = None
        self.restored_line_end = None
        self.repaired_copy = None
        self._repair_copy = repair_copy
        self.ship_clock = format_offset(parse_offset(ship_offset)) if ship_offset else None
        if clock is not None:
            self._clock = clock
        self.readonly = True
        self.readonly_reason = "opened read-only on request"
        strays = [] if readonly or by_file else case_strays(directory, slug)
        if strays:  # (a new chain beside the one the copy renamed: never)
            self.readonly_reason = ("nothing will be recorded: "
                                    + "; ".join(case_stray_words(*s) for s in strays))
        elif not readonly:
            directory.mkdir(parents=True, exist_ok=True)
            holder = self._lock.acquire()
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

    def _open_for_append(self) -> None:
        """Under the lock: set aside a torn tail, bring the head record up to date.

        If the head record disagrees with the log (the newest entries gone, or the
        last one changed) nothing is written: appending would overwrite that evidence.
        The log then stays read-only and the reason says what to do.
        """
        if self._store.open_for_append() and not self.head_path.exists():
            # The head record exists from the start (seq 0, the genesis hash), so that a log
            # with entries and no head record always means the head was deleted.
            self._write_head()
        head = self._store.read_head()
        if not self._undo_copy(head):
            return
        lines, torn = self._store.scan()
        whole = whole_unterminated(torn, head)
        problem = head_disagreement(head, [*lines, torn] if whole else lines)
        if problem is not None:
            self._write_nothing(f"{problem}; nothing will be written to this log until that is looked into "
                                f"(run 'deckload log verify'; to start a fresh log, move {self.path.name} and "
                                f"{self.head_path.name} aside)")
            return
        if not self.by_file:
            other = _other_vessel(lines, self.vessel_name)
            if other is not None:
                self._write_nothing(
                    f"{self.path.name} holds entries of another vessel: line {other[0]} records {other[1]!r}, not "
                    f"{self.vessel_name!r}; nothing will be recorded in it (run 'deckload log verify'; to start "
                    f"this vessel's log, move {self.path.name} and {self.head_path.name} aside)")
                return
        if whole:
            # The last line is the one the head names, whole: a copy dropped its line end only.
            self._store.end_last_line()
            lines.append(torn)
            self.restored_line_end = len(lines)
        elif torn:
            self.recovered_torn = self._store.set_aside_torn(torn, len(lines) + 1, self._clock())
        if lines:
            self._last_sha = sha256_hex(lines[-1])
            try:
                newest = _entry_from_line(lines[-1], len(lines))
                self._last_seq, self._last_utc = newest.seq, newest.utc
            except LogFormatError:
                self._last_seq = len(lines)
            if head is None or head.get("seq") != self._last_seq:
                self._write_head()

    def _undo_copy(self, head: dict | None) -> bool:
        """Under the lock: False (and read-only, saying why) when a copy changed the log's line ends
        or put a BOM before it; with ``repair_copy`` and the entries intact without them, the log is
        rewritten without them first, the file as found kept beside it.  Never mix line ends."""
        norm, changes = undo_copy(self._store.read_open())
        if changes is None:
            return True
        if not self._repair_copy:
            self._write_nothing(f"{changes} by a copy; nothing is recorded in it until {changes.them} are taken out "
                                "(never a line of another kind among them): run 'deckload log verify' (it says "
                                "whether the entries are intact without them), then 'deckload log verify --recover'")
            return False
        rep = self._verify_data(*_split_lines(norm), head, writer_active=False)
        if rep.problems:
            self._write_nothing(f"{changes} by a copy, but with {changes.them} taken out the log still "
                                f"fails verification ({len(rep.problems)} problem(s)): not rewritten; run "
                                "'deckload log verify' and look into them first")
            return False
        keep = self._store.side_file("as-copied", self._clock(), ".bak")
        self._store.replace_with(norm, keep)
        self.repaired_copy = (changes, keep)
        return True

    def _verify_data(self, lines: list[bytes], tail: bytes, head: dict | None, *, writer_active: bool) -> VerifyReport:
        return verify_lines(lines, tail, head, None if self.by_file else self.vessel_name,
                            writer_active=writer_active, file_name=self.path.name if self.by_file else None)

    def _lines(self) -> tuple[list[bytes], bytes, CopyChanges | None]:
        """The log's complete lines and unterminated end, as deckload wrote them (a copy's BOM and
        CR LF line ends taken out: the views and verify read the entries under them), and what
        a copy changed (None: nothing)."""
        data, changes = undo_copy(self._read())
        lines, tail = _split_lines(data)
        return lines, tail, changes

    def _entry_lines(self) -> list[bytes]:
        """The log's entry lines: the complete ones, and a whole last line whose line end a copy
        dropped (its SHA-256 the head record's; verify notes it), for the views and anchors."""
        lines, tail, _ = self._lines()
        if tail and whole_unterminated(tail, self._store.read_head()):
            lines.append(tail)
        return lines

    def _write_head(self) -> None:
        self._store.write_head(self._last_seq, self._last_sha)

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
        (unknown kind, initials not 1–4 letters, empty change text, data not JSON, the PC's time
        zone beyond ±14:00, any line the reader would refuse): the line is read back as verify
        reads it before anything is written.
        """
        if self.readonly or self._store is None or self._store.fd is None:
            raise LogLockedError(f"{self.path.name}: {self.readonly_reason or 'log is closed'}")
        if self.by_file:
            raise LogLockedError(f"{self.path.name}: opened from its file name for checking; "
                                 "a vessel's entries are recorded through her profile")
        if kind not in KINDS:
            raise ValueError(f"kind {kind!r} is not one of: {', '.join(KINDS)}")
        initials = validate_initials(by)
        if not isinstance(change_text, str) or not change_text.strip():
            raise ValueError("change text must say what changed (it is empty)")
        for what, text in (("change text", change_text), ("remark", remark)):
            if not isinstance(text, str) or len(text) > MAX_TEXT_CHARS:
                raise ValueError(f"{what}: at most {MAX_TEXT_CHARS} characters of text")
            bad = control_char(text)
            if bad is not None:
                raise ValueError(f"{what} holds the control character {bad}: type plain text")
        if not isinstance(change_data, dict):
            raise ValueError(f"change data must be a mapping, not {type(change_data).__name__}")
        self.clock_back = None
        now = self._clock()
        if now.tzinfo is None:
            raise ValueError("the clock returned a time without a timezone")
        offset = parse_offset(self.ship_clock) if self.ship_clock else configured_offset()
        if not self.ship_clock and not os.environ.get("DECKLOAD_SHIP_OFFSET"):
            offset = _local_offset_checked(offset)
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
        # The line is read back as every view and verify will read it BEFORE it is written: a line
        # the reader refuses would stand in the chain for ever as damage (nothing can remove it).
        try:
            entry = _entry_from_line(line, record["seq"])
        except LogFormatError as exc:
            raise ValueError(f"the entry would not read back ({exc}); nothing was written") from None
        if entry.vessel != self.vessel_name:  # (verify_lines: every entry records this log's vessel)
            raise ValueError(f"the vessel name {escaped(self.vessel_name)!r} would not read back as written "
                             "(a control character); nothing was written")
        why = self._store.head_unwritable()
        if why is not None:  # (else the entries would go on with the head record left behind: no check of them)
            raise OSError(errno.EACCES, f"the head record {self.head_path.name} cannot be updated: its folder "
                          f"{self.head_path.parent} refuses a new file ({why}), so the newest entries could not be "
                          "checked against it; make the log folder writable")
        self._store.append_line(line)
        before = self._last_utc
        self.clock_back = (self._last_seq, before - entry.utc) if before is not None and entry.utc < before else None
        self._last_utc = entry.utc
        self._last_seq += 1
        self._last_sha = sha256_hex(line)
        try:
            self._write_head()
        except OSError as exc:
            # The entry itself is on disk; a head record left behind is brought forward at
            # the next open (it still names an entry the later lines chain from).
            self.head_problem = f"head record not updated: {exc}"
        return entry

    # ----------------------------------------------------------------- reading

    def _read(self) -> bytes:
        return self._store.read()

    def find(self, anchor_text: str) -> tuple[int, int] | None:
        """Where a printed copy's anchor (SHA-256 or its first 12+ hex digits, optionally 'N:HASH')
        is in this log: (line number, entry number), else None.  ValueError for a malformed anchor."""
        return find_anchor(self._entry_lines(), anchor_text)

    def entries(self) -> list[LogEntry]:
        """Every complete, readable entry, oldest first.

        An unterminated last line is left out (it is being written, or torn), unless it is the
        whole line the head record names (a copy dropped only its line end).  An
        unreadable line is left out too and named in :attr:`skipped`, so a view can
        say so; :meth:`verify` gives the full account.
        """
        try:
            st = os.stat(self.path)
        except FileNotFoundError:
            self.skipped, self.skipped_lines = [], []
            return []
        try:
            hst = os.stat(self.head_path)
            head_key = (hst.st_size, hst.st_mtime_ns, hst.st_ino)
        except OSError:
            head_key = None
        key = (st.st_size, st.st_mtime_ns, head_key)
        if self._cache is None or self._cache[0] != key:
            lines = self._entry_lines()
            out: list[LogEntry] = []
            skipped: list[tuple[int, str]] = []
            for i, line in enumerate(lines, start=1):
                try:
                    out.append(_entry_from_line(line, i))
                except LogFormatError as exc:
                    skipped.append((i, str(exc)))
            self._cache = (key, out)
            self.skipped_lines = skipped
            self.skipped = [s for _, s in skipped]
        return list(self._cache[1])

    def writer_active(self) -> bool:
        """True when some process (this one included) holds the writer's lock."""
        if self._lock is not None and self._lock.held:
            return True
        return locking.writer_active(self.lock_path)

    def verify(self) -> VerifyReport:
        """Check the whole log: see :func:`~deckload.logbook.chain.verify_lines`.

        A log whose line ends a copy turned into CR LF, or before which it put a BOM, fails with
        one problem that says so, and its lines are verified with them taken out (what deckload
        wrote): whether the entries are intact under them, or what else is wrong."""
        lines, tail, changes = self._lines()
        head = self._store.read_head()
        if not lines and not tail and head is None:
            return VerifyReport(ok=True, problems=[], notes=["the log is empty"], entries=0)
        if not self.path.exists() and head is not None:
            return VerifyReport(ok=False, entries=0, notes=[], problems=[
                f"{self.path.name}: missing, but its head record {self.head_path.name} names entry "
                f"#{head.get('seq')} — the log was deleted or moved (tampering suspected)"])
        rep = self._verify_data(lines, tail, head, writer_active=self.writer_active() and not self._lock.held)
        side = sorted(self.path.parent.glob(f"{glob.escape(self.path.name)}.torn-*.txt"))
        if side:  # (a torn line set aside is kept, never dropped: whoever checks the log must hear of it)
            rep = dataclasses.replace(rep, notes=[
                *rep.notes, *(f"{p.name}: a torn last line set aside earlier ({_size(p)}), kept beside the log: "
                              "the append it belonged to never reported done" for p in side)])
        if rep.head_behind:
            why = self._store.head_unwritable()
            if why is not None:
                rep = dataclasses.replace(rep, notes=[
                    *rep.notes, f"the log folder {self.head_path.parent} refuses a new file now ({why}): the head "
                                "record cannot be updated there, which leaves it behind as entries are appended "
                                "(deckload refuses to record there)"])
        if changes is None:
            return rep
        if rep.problems:
            then = (f"with {changes.them} taken out the lines were verified as written, and the problems below remain; "
                    "'deckload log verify --recover' will not rewrite the file until they are looked into")
        else:
            then = (f"with {changes.them} taken out every entry is intact (each line verified without them: "
                    f"{rep.entries} entries, chain and head record agree); to repair it, run 'deckload log "
                    "verify --recover': it takes them out and keeps the file as found beside it (….bak)")
        return dataclasses.replace(rep, ok=False, problems=[
            f"{self.path.name}: changed by a copy, not by an edit: {changes}; {then}. Nothing is recorded in this "
            "log until it is repaired", *rep.problems])

    @property
    def restored_note(self) -> str:
        """What opening for writing did to a whole last line that had lost its line end ('' if nothing)."""
        if self.restored_line_end is None:
            return ""
        return (f"{self.path.name}: line {self.restored_line_end} was whole but had lost its line end (a copy "
                "without it; its SHA-256 is the head record's): the line end was restored, nothing else changed")

    @property
    def newest(self) -> tuple[int, str] | None:
        """The newest entry's number and SHA-256 as this writer knows them (None: no entry yet)."""
        return (self._last_seq, self._last_sha) if self._last_seq > 0 else None

    def _write_nothing(self, reason: str) -> None:
        """Give up the writer's lock and stay read-only for ``reason`` (said to whoever records)."""
        self.close()
        self.readonly = True
        self.readonly_reason = reason

    def close(self) -> None:
        """Close the log and release the writer's lock."""
        if self._store is not None:
            self._store.close()
        if self._lock is not None:
            self._lock.release()

    def __enter__(self) -> "Logbook":
        return self

    def __exit__(self, *exc) -> None:
        self.close()

    def __del__(self) -> None:
        try:
            self.close()
        except Exception:
            pass


def _size(path: Path) -> str:
    try:
        return f"{path.stat().st_size} bytes"
    except OSError as exc:
        return f"unreadable: {exc.strerror or exc}"


def _local_offset_checked(offset: timedelta) -> timedelta:
    """The PC's time zone offset as the ship's clock, refused beyond ±14:00 (what the reader takes:
    ``clock.parse_offset``), with the setting to blame and the way round it named."""
    text = format_offset(offset)
    try:
        return parse_offset(text)
    except ShipOffsetError:
        tz = os.environ.get("TZ")
        where = f"TZ={tz!r}" if tz is not None else "TZ is not set: /etc/localtime"
        raise ShipOffsetError(
            f"the PC's time zone ({where}) puts the ship's clock at {text} from UTC, outside -14:00 … +14:00, "
            "which no ship's clock reads; give the ship's clock with --ship-offset +HH:MM (or "
            "DECKLOAD_SHIP_OFFSET), or correct the time zone; nothing was written") from None


def _other_vessel(lines: list[bytes], vessel_name: str) -> tuple[int, str] | None:
    """(line, vessel) of the first readable entry that records a vessel other than ``vessel_name``."""
    import json

    for i, line in enumerate(lines, start=1):
        try:
            obj = json.loads(line.decode("utf-8"))
        except (ValueError, RecursionError):
            continue  # (an unreadable line is verify's to report)
        vessel = obj.get("vessel") if isinstance(obj, dict) else None
        if isinstance(vessel, str) and vessel != vessel_name:
            return i, escaped(vessel)
    return None


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
