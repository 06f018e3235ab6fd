"""The log on disk: appends that reach the disk, torn-tail recovery, the head record, reading.

Durability: an append writes the whole line with one ``write`` on an ``O_APPEND``
descriptor, then ``os.fsync`` before returning; only then is the entry reported done.  A
failed write (disk full, I/O error) is cut back to the last good line.  A power cut can
still leave the last line torn (cut short, or padded with zero bytes by the file system):
:meth:`LogStore.scan` finds it and :meth:`LogStore.set_aside_torn` copies it to a side file
(written and fsynced first), then cuts it from the log — never silently dropped.  The head
record is rewritten atomically (:mod:`deckload.io.atomicfile`).
"""

from __future__ import annotations

import json
import os
import tempfile
from datetime import datetime, timezone
from pathlib import Path

from deckload.core.frozen import frozen
from deckload.io.atomicfile import fsync_dir, leftover_temp_files, write_atomic
from deckload.io.limits import MAX_LOG_BYTES
from deckload.logbook.records import LogFormatError, _dumps, _entry_from_line

HEAD_FORMAT = "deckload-log-head-1"


@frozen
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


class LogStore:
    """One vessel's log file and head record; the descriptor is open only for a writer."""

    def __init__(self, path: Path, head_path: Path) -> None:
        self.path = path
        self.head_path = head_path
        self.fd: int | None = None

    def open_for_append(self) -> bool:
        """Open the log for appending (creating it, fsynced with its folder); True when created.

        Call under the writer's lock: a head record or side file whose write was killed
        before its rename is a half copy nobody else can be writing, so it goes.
        """
        for tmp in leftover_temp_files(self.path.parent):
            if tmp.name.startswith((f".{self.head_path.name}.", f".{self.path.name}.")):
                tmp.unlink(missing_ok=True)
        created = not self.path.exists()
        self.fd = os.open(self.path, os.O_RDWR | os.O_APPEND | os.O_CREAT, 0o644)
        if created:
            os.fsync(self.fd)
            fsync_dir(self.path.parent)
        return created

    def read_open(self) -> bytes:
        """The whole log as the writer's descriptor reads it."""
        return _read_fd(self.fd)

    def replace_with(self, data: bytes, keep_as: Path) -> None:
        """Replace the log with ``data``: the bytes found are first written to ``keep_as``
        (fsynced), then the log is rewritten atomically and reopened for appending."""
        write_atomic(keep_as, _read_fd(self.fd))
        write_atomic(self.path, data)
        self.close()
        self.open_for_append()

    def scan(self) -> tuple[list[bytes], bytes]:
        """The complete lines of the open log and its torn tail (b"" when there is none).

        A complete-looking but unreadable last line (zero-filled or half-flushed blocks) is
        torn too, with its line end.
        """
        lines, torn = _split_lines(_read_fd(self.fd))
        if not torn and lines and not _parses(lines[-1]):
            torn = lines.pop() + b"\n"
        return lines, torn

    def side_file(self, what: str, now: datetime, suffix: str) -> Path:
        """A file beside the log that does not exist yet, named for what it keeps and the UTC time
        (``<log>.<what>-<stamp>[-k]<suffix>``): a second one in the same second gets a number."""
        stamp = now.astimezone(timezone.utc).strftime("%Y%m%dT%H%M%SZ")
        side = self.path.with_name(f"{self.path.name}.{what}-{stamp}{suffix}")
        k = 1
        while side.exists():
            k += 1
            side = self.path.with_name(f"{self.path.name}.{what}-{stamp}-{k}{suffix}")
        return side

    def set_aside_torn(self, torn: bytes, line_no: int, now: datetime) -> TornRecovery:
        """Copy the torn tail to a side file named for ``now`` (fsynced), then cut it from the log."""
        side = self.side_file("torn", now, ".txt")
        write_atomic(side, torn)
        os.ftruncate(self.fd, os.fstat(self.fd).st_size - len(torn))
        os.fsync(self.fd)
        return TornRecovery(self.path, side, line_no, len(torn))

    def end_last_line(self) -> None:
        """Append the line end a copy dropped after the last (whole) line, then fsync: one byte
        written on ``O_APPEND``, nothing else of the file touched."""
        _write_all(self.fd, b"\n")
        os.fsync(self.fd)

    def append_line(self, line: bytes) -> None:
        """Write ``line`` and its line end, then fsync; on failure cut back to the last good line."""
        size_before = os.fstat(self.fd).st_size
        try:
            _write_all(self.fd, line + b"\n")
            os.fsync(self.fd)
        except OSError:
            # Disk full or I/O error: cut back to the last good line so the next append
            # does not land after a half line, then report the failure.
            try:
                os.ftruncate(self.fd, size_before)
                os.fsync(self.fd)
            except OSError:
                pass
            raise

    def read_head(self) -> dict | None:
        """The head record, None when there is none, ``{"damaged": True}`` when unreadable."""
        from deckload.io.limits import open_regular

        try:
            with open_regular(self.head_path, "a log's head record") as f:
                raw = f.read(64 * 1024)  # a head record is one short line; more is damage
        except FileNotFoundError:
            return None
        try:
            head = json.loads(raw.decode("utf-8"))
        except (ValueError, RecursionError):
            return {"damaged": True}
        return head if isinstance(head, dict) else {"damaged": True}

    def head_unwritable(self) -> str | None:
        """Why the head record could not be rewritten now, or None: :func:`write_atomic` makes a new
        file in its folder, which a read-only folder refuses although the log itself takes appends.
        The probe makes and removes such a file (named as write_atomic's, so a leftover is cleared)."""
        try:
            fd, tmp = tempfile.mkstemp(prefix=f".{self.head_path.name}.", suffix=".tmp", dir=self.head_path.parent)
        except OSError as exc:
            return exc.strerror or str(exc)
        os.close(fd)
        os.unlink(tmp)
        return None

    def write_head(self, seq: int, sha256: str) -> None:
        """Rewrite the head record atomically: the newest entry's number and SHA-256."""
        write_atomic(self.head_path, (_dumps({"format": HEAD_FORMAT, "seq": seq, "sha256": sha256}) + "\n").encode())

    def read(self) -> bytes:
        """The whole log (b"" when there is none), refused beyond the size limit."""
        from deckload.io.limits import read_limited

        try:
            return read_limited(self.path, MAX_LOG_BYTES, "one voyage log (start a new log)")
        except FileNotFoundError:
            return b""

    def close(self) -> None:
        if self.fd is not None:
            os.close(self.fd)
            self.fd = None


def _write_all(fd: int, data: bytes) -> None:
    view = memoryview(data)
    while view:
        n = os.write(fd, view)
        view = view[n:]


BOM = b"\xef\xbb\xbf"
"""The UTF-8 byte-order mark some Windows editors and copy tools put before a text file's first line."""


@frozen
class CopyChanges:
    """What a copy (a Windows editor or copy tool) did to a log's bytes: a byte-order mark put
    before line 1, line ends turned into CR LF.  deckload never writes either: a raw CR or a BOM
    at the start cannot stand in a line it wrote (JSON escapes control characters in text)."""

    bom: bool
    crlf_lines: int
    lines: int

    def __str__(self) -> str:
        what = []
        if self.bom:
            what.append("a byte-order mark (BOM) was put before line 1")
        if self.crlf_lines:
            of = "every line" if self.crlf_lines == self.lines else f"{self.crlf_lines} of {self.lines} lines"
            what.append(f"the line ends of {of} were turned into Windows line ends (CR LF)")
        return " and ".join(what)

    @property
    def them(self) -> str:
        """What is to be taken out, in words: 'the BOM', 'the CRs', 'the BOM and the CRs'."""
        return " and ".join(w for w, on in (("the BOM", self.bom), ("the CRs", self.crlf_lines)) if on)


def undo_copy(data: bytes) -> tuple[bytes, CopyChanges | None]:
    """The log's bytes with a copy's BOM and CR LF line ends taken out, and what was taken out
    (None: the bytes are as deckload writes them).  Only a BOM at the very start and a CR right
    before a line end (or ending the file) are taken: nothing else of a line is touched."""
    bom = data.startswith(BOM)
    if bom:
        data = data[len(BOM):]
    crlf = data.count(b"\r\n")
    if crlf:
        data = data.replace(b"\r\n", b"\n")
    if data.endswith(b"\r"):
        data, crlf = data[:-1], crlf + 1
    if not bom and not crlf:
        return data, None
    return data, CopyChanges(bom, crlf, data.count(b"\n") + (0 if data.endswith(b"\n") or not data else 1))


def _split_lines(data: bytes) -> tuple[list[bytes], bytes]:
    """Complete lines (without '\\n') and the unterminated remainder."""
    parts = data.split(b"\n")
    return parts[:-1], parts[-1]


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


def log_files(directory: Path) -> list[Path]:
    """The vessel logs in ``directory`` (sorted by name), including logs whose file is gone but
    whose head record remains (verify reports those)."""
    d = Path(directory)
    logs = set(d.glob("*.log.jsonl"))
    logs |= {h.with_name(h.name.removesuffix(".head.json") + ".jsonl") for h in d.glob("*.log.head.json")}
    return sorted(logs)


LOG_SUFFIXES = (".log.jsonl", ".log.head.json")
"""The names a voyage log's files end with: the log and its head record."""


def case_strays(directory: Path, slug: str | None = None) -> list[tuple[Path, Path]]:
    """Files in ``directory`` named as a log's files in other letters' case (``DEMO-ISLANDER.LOG.JSONL``:
    a copy through a file system or tool that changed the case of names), each with the name deckload
    reads, (found, expected); only those of ``slug``'s log when given.  deckload's names are all
    casefolded (``paths.vessel_slug``), so such a file is never read, and a new log would start beside it."""
    d = Path(directory)
    try:
        names = sorted(os.listdir(d))
    except OSError:
        return []
    out = []
    for name in names:
        folded = name.casefold()
        if folded == name or not folded.endswith(LOG_SUFFIXES):
            continue
        if slug is not None and folded not in {slug + s for s in LOG_SUFFIXES}:
            continue
        expected = d / folded
        try:
            if expected.exists() and os.path.samefile(d / name, expected):
                continue  # (a file system blind to case: the file deckload reads is this one)
        except OSError:
            pass
        out.append((d / name, expected))
    return out


def case_stray_words(found: Path, expected: Path) -> str:
    """What verify, show and record say of a file :func:`case_strays` found."""
    also = (f"; {expected.name} exists as well: two logs of one vessel, look into which holds the voyage's "
            "entries before recording more" if expected.exists() else "")
    return (f"{found.name}: named as a voyage log's file in other letters' case (a copy that changed the case of "
            f"file names?): deckload reads {expected.name} and never this one, which is not read or checked; "
            f"rename it {expected.name}" + also)


def vessel_of_log(path: Path) -> str:
    """The vessel name recorded in a log's first readable line (else its file-name slug)."""
    from deckload.io.limits import open_regular

    try:
        with open_regular(path, "a voyage log") as f:
            for i, line in enumerate(f, start=1):
                if line.endswith(b"\n"):
                    try:
                        return _entry_from_line(line[:-1], i).vessel
                    except LogFormatError:
                        continue
    except FileNotFoundError:
        pass
    return path.name.removesuffix(".log.jsonl")
