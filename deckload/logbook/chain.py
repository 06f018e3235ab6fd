"""The hash chain and its verification.

Every line records the SHA-256 of the line before (``prev_sha256``; 64 zeros on line 1) and
its own number (``seq``), so an edited line breaks the chain at the next line, and a removed,
inserted or moved line breaks the numbering and the chain where it happened.  The newest
line has nothing after it to record its hash: the head record (:mod:`.storage`) names it.
:func:`verify_lines` gives the full account; :func:`head_disagreement` is the check a writer
makes before it appends (it never writes over evidence); :func:`find_anchor` finds a paper
copy's anchor in the log.
"""

from __future__ import annotations

import json
import re
from dataclasses import field
from datetime import datetime, timedelta

from deckload.core.frozen import frozen
from deckload.io.paths import vessel_slug
from deckload.logbook.clock import span_words
from deckload.logbook.records import KINDS, LogEntry, LogFormatError, _entry_from_line, sha256_hex

GENESIS_SHA256 = "0" * 64
"""``prev_sha256`` of the first entry: there is no previous line."""

_HEAD_BEHIND = ("a power cut between an append and its head update, or a head record that could not be "
                "rewritten: a log folder that refuses new files, e.g. read-only")
"""Why a head record is behind lines that chain from it: both leave that trace."""


@frozen
class VerifyReport:
    """What verifying a voyage log found: whether the chain holds, and each problem by line."""

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
    head_behind: bool = False
    """The head record names an earlier entry than the last line (a power cut between an append and
    its head update, or a head that could not be written): said in a note, never a problem."""
    doubtful_lines: frozenset[int] = frozenset()
    """The lines the problems name as unreadable, edited, moved, inserted, duplicated or another
    vessel's: the views mark their entries (a duplicate showed as a second '#4' like any other)."""

    def failing_words(self, file_name: str) -> str:
        """What a writer says of a log that fails verification before (and after) recording in it."""
        first = self.problems[0] if self.problems else "none"
        return (f"{file_name}: this log fails verification ({len(self.problems)} problem(s), the first: {first}): "
                "run 'deckload log verify'; entries are still recorded after them, and the log stays broken "
                "until what went wrong is looked into")


@frozen
class Chained:
    """What verifying takes from one entry read from its line: enough to follow the chain."""

    seq: int
    prev_sha256: str
    vessel: str
    kind: str
    utc: datetime
    line_no: int


_CHAINED: dict[tuple[str, int], Chained] = {}
"""Lines read and checked before in this process, by (SHA-256, line number): reading a line and
checking each of its fields is nearly all of verifying (2000 entries: 0.5 s), and a log only grows,
so the screen's check after each record, and at start after opening, reads only the lines it has not
read.  A pure function of those two keys (:func:`_entry_from_line` reads nothing else); a damaged
line is never kept.  Bounded by :data:`_CHAINED_MAX` (cleared when full): about 520 bytes a line,
so 10 MiB at most on a low-power PC; a log beyond it is read whole again at each check."""

_CHAINED_MAX = 20_000


def _chained(line: bytes, line_no: int, sha: str) -> Chained:
    """The line's entry as :func:`_entry_from_line` reads and checks it (raising as it does), from
    :data:`_CHAINED` when the same line was read at the same place before."""
    key = (sha, line_no)
    got = _CHAINED.get(key)
    if got is None:
        e = _entry_from_line(line, line_no)
        got = Chained(e.seq, e.prev_sha256, e.vessel, e.kind, e.utc, e.line_no)
        if len(_CHAINED) >= _CHAINED_MAX:
            _CHAINED.clear()
        _CHAINED[key] = got
    return got


def verify_lines(
    lines: list[bytes],
    tail: bytes,
    head: dict | None,
    vessel_name: str | None,
    writer_active: bool = False,
    file_name: str | None = None,
) -> VerifyReport:
    """Check the chain of ``lines`` (complete lines, no '\\n') and the head record.

    Every line must parse; its ``seq`` must equal its line number and its
    ``prev_sha256`` the SHA-256 of the line before.  An edited line changes its hash,
    so the next line's ``prev_sha256`` no longer matches it; a removed, inserted or
    moved line breaks both the numbering and the chain at the place it happened.
    The newest line is checked against the head record.

    Every entry must record ``vessel_name``; when the log was found by its file (``file_name``,
    ``<slug>.log.jsonl``, and ``vessel_name`` None) every entry must record a vessel whose
    file name is that one, and all the same vessel: a log whose first line was edited to name
    another vessel, or another vessel's log saved under this one's name, is a problem.
    """
    problems: list[str] = []
    notes: list[str] = []
    if whole_unterminated(tail, head):
        lines, tail = [*lines, tail], b""
        notes.append(f"line {len(lines)}: complete, but the file ends without its line end (copied or saved "
                     "without it); its SHA-256 is the one the head record names, so the entry is intact; "
                     "the next record (or 'deckload log verify --recover') restores the line end")
    prev_sha = GENESIS_SHA256
    seqs: list[int | None] = []
    unsound: set[int] = set()  # lines unreadable, or not chained or numbered from the line before
    doubt: set[int] = set()  # every line a problem names (VerifyReport.doubtful_lines)

    def problem(line: int, text: str) -> None:
        """A problem of the entry on ``line``: said, and the line marked doubtful."""
        problems.append(text)
        doubt.add(line)
    recorded: tuple[int, str] | None = None  # (line, vessel) of the first entry, for a log found by its file
    offset = 0  # seq − line number: changes exactly where entries were removed, inserted or moved
    read: list[Chained] = []
    for i, line in enumerate(lines, start=1):
        sha = sha256_hex(line)
        try:
            e = _chained(line, i, sha)
        except LogFormatError as exc:
            problem(i, f"{exc} — the line was damaged or edited")
            unsound.add(i)
            seqs.append(None)
            prev_sha = sha
            continue
        seqs.append(e.seq)
        read.append(e)
        chained = e.prev_sha256 == prev_sha
        if not chained or e.seq - i != offset:
            unsound.add(i)
        if e.seq - i != offset:
            offset = e.seq - i
            before = seqs[-2] if len(seqs) > 1 else None
            where = f"entry #{e.seq} follows entry #{before}" if before else f"entry #{e.seq}, expected #{i}"
            problem(i, f"line {i}: {where} — an entry was removed, inserted or moved here"
                    + ("" if chained else "; the hash chain breaks here too"))
        elif not chained and i == 1:
            problem(1, "line 1: prev_sha256 should be the genesis value (64 zeros) — line 1 was edited")
        elif not chained:
            problem(i - 1, f"line {i - 1}: edited — its SHA-256 is not the one line {i} records for it")
        if vessel_name is not None and e.vessel != vessel_name:
            problem(i, f"line {i}: vessel {e.vessel!r}, but this log belongs to {vessel_name!r}")
        elif file_name is not None and vessel_slug(e.vessel) != file_name.removesuffix(".log.jsonl"):
            problem(i, f"line {i}: vessel {e.vessel!r}, but the file {file_name} is the log of the vessel "
                       f"its name says ({file_name.removesuffix('.log.jsonl')!r}) — the line was edited, "
                       "or another vessel's log was saved under this name")
        elif file_name is not None:
            if recorded is None:
                recorded = (i, e.vessel)
            elif e.vessel != recorded[1]:
                problem(i, f"line {i}: vessel {e.vessel!r}, but line {recorded[0]} records "
                        f"{recorded[1]!r} — one log holds one vessel's entries")
        if e.kind not in KINDS:
            problem(i, f"line {i}: kind {e.kind!r} is not one of {', '.join(KINDS)}")
        prev_sha = sha

    back = clock_back(read)
    for e in read:
        if e.line_no in back and e.line_no not in unsound:  # (a line joined or moved is the problems' to name)
            before, span = back[e.line_no]
            notes.append(f"line {e.line_no}: entry #{e.seq} is timed {span_words(span)} earlier than entry #{before} "
                         f"before it ({e.utc:%Y-%m-%d %H:%M:%S} against {e.utc + span:%Y-%m-%d %H:%M:%S} UTC): the "
                         "PC's clock was set back, or was wrong before; the lines keep the order of recording")

    seen: dict[int, int] = {}
    for i, s in enumerate(seqs, start=1):
        if s is None:
            continue
        if s in seen:
            problem(i, f"line {i}: entry #{s} already appears on line {seen[s]} — a duplicate was inserted")
        else:
            seen[s] = i

    n = len(lines)
    behind = False  # the head record behind lines that chain from it (VerifyReport.head_behind)
    if tail:
        if writer_active:
            notes.append(f"line {n + 1}: incomplete — another process is writing the log right now")
        else:
            problems.append(
                f"line {n + 1}: incomplete last line ({len(tail)} bytes, no line end) — torn by a power "
                f"cut or cut short; opening the log for writing sets it aside in a side file, unless the "
                f"head record disagrees with the lines before it (then nothing more is recorded)"
            )

    if head is None:
        if n:
            problems.append(
                f"head record: missing, but the log has {n} entr{'y' if n == 1 else 'ies'} — it was deleted; "
                "the newest entries may have been removed or edited without trace (tampering suspected)"
            )
    elif head.get("seq") == 0 and head.get("sha256") == GENESIS_SHA256:
        if n and not unsound:
            behind = True
            notes.append(f"head record is {n} entr{'y' if n == 1 else 'ies'} behind ({_HEAD_BEHIND}); the lines "
                         "chain correctly from the start")
        elif n:
            notes.append(f"head record names no entry yet, and the log has {n}: they do not all chain from the start "
                         "(see the problems above), which is not the trace of a power cut")
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
                after = f"line {n}" if at + 1 == n else f"lines {at + 1}–{n}"
                sound = not any(at < k <= n for k in unsound)
                if sound:
                    behind = True
                    notes.append(f"head record is {n - at} entr{'y' if n - at == 1 else 'ies'} behind ({_HEAD_BEHIND}); "
                                 f"{after} {'chains' if at + 1 == n else 'chain'} correctly from it")
                else:  # (a power cut leaves the head behind lines that chain from it: these do not)
                    notes.append(f"head record names entry #{hseq} on line {at}; {after} after it "
                                 f"{'does' if at + 1 == n else 'do'} not chain from it (see the problems above): not "
                                 "the trace of a power cut, but of lines joined, inserted or edited")
    return VerifyReport(
        ok=not problems,
        problems=problems,
        notes=notes,
        entries=n,
        last_sha256=sha256_hex(lines[-1]) if lines else GENESIS_SHA256,
        head_behind=behind,
        doubtful_lines=frozenset(doubt),
    )


def whole_unterminated(tail: bytes, head: dict | None) -> bool:
    """True when the log's unterminated end is the whole line the head record names (its SHA-256 is
    the head's): a copy dropped only the final line end, and the entry is intact.  A torn write
    never matches: the head is rewritten only after the whole line and its end are on disk."""
    sha = head.get("sha256") if isinstance(head, dict) else None
    return bool(tail) and isinstance(sha, str) and sha == sha256_hex(tail)


def clock_back(entries: list[LogEntry] | list[Chained]) -> dict[int, tuple[int, timedelta]]:
    """Entries timed earlier than the entry before them in the log (by line: a clock set back, or
    wrong before): line number → (the entry before's number, how much earlier)."""
    out = {}
    for before, e in zip(entries, entries[1:]):
        if e.utc < before.utc:
            out[e.line_no] = (before.seq, before.utc - e.utc)
    return out


def clock_back_words(seq: int, before: int, span: timedelta) -> str:
    """The warning of a record whose time is earlier than the newest entry's before it."""
    return (f"the clock reads {span_words(span)} earlier than entry #{before}, the newest before this one: the "
            f"PC's clock was set back, or was wrong then; entry #{seq} is recorded with the time the clock gives "
            "(check the clock; 'deckload log verify' names every entry timed earlier than the one before it)")


def back_words(back: tuple[int, timedelta] | None) -> str:
    """An entry's mark in show and the exports when it is timed earlier than the entry before it
    (``back`` as :func:`clock_back` gives it; '' for None)."""
    return "" if back is None else f"timed {span_words(back[1])} earlier than #{back[0]} before it (clock set back?)"


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


def head_disagreement(head: dict | None, lines: list[bytes]) -> str | None:
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


def find_anchor(lines: list[bytes], anchor_text: str) -> tuple[int, int] | None:
    """Where a paper copy's anchor (a SHA-256, or its first 12+ hex digits, optionally as
    'N:HASH' or '#N HASH') is in the log: (line number, entry number), else None."""
    m = re.fullmatch(r"\s*(?:#?(\d+)\s*[:\s]\s*)?([0-9a-fA-F]{12,64})\s*", anchor_text, re.ASCII)
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
