"""One writer at a time: the writer's lock on ``<slug>.log.lock``.

:meth:`WriterLock.acquire` takes ``fcntl.flock(LOCK_EX | LOCK_NB)`` on the lock file and
writes the holder's pid in it; if another process (or another open in this one) holds it,
it says who, and the log opens read-only.  The kernel releases the lock when the writer
dies, so a power cut or a crash never leaves a stale lock behind.  :func:`writer_active`
probes for a writer without taking the lock for more than an instant.
"""

from __future__ import annotations

import errno
import fcntl
import os
import time
from pathlib import Path

from deckload.logbook.clock import format_utc, utc_now


class LogLockedError(RuntimeError):
    """The log is open read-only (another writer holds the lock, or read-only was asked)."""


class WriterLock:
    """The writer's lock of one log; held from :meth:`acquire` until :meth:`release`."""

    def __init__(self, path: Path) -> None:
        self.path = path
        self._fd: int | None = None

    @property
    def held(self) -> bool:
        """True while this object holds the lock."""
        return self._fd is not None

    def acquire(self) -> str | None:
        """Take the writer's lock; None on success, else a description of the holder."""
        fd = os.open(self.path, os.O_RDWR | os.O_CREAT, 0o644)
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
        self._fd = fd
        os.ftruncate(fd, 0)
        os.pwrite(fd, f"pid {os.getpid()} since {format_utc(utc_now())}\n".encode(), 0)
        return None

    def release(self) -> None:
        """Release the lock (closing its descriptor); nothing when not held."""
        if self._fd is not None:
            try:
                fcntl.flock(self._fd, fcntl.LOCK_UN)
            finally:
                os.close(self._fd)
                self._fd = None


def writer_active(lock_path: Path) -> bool:
    """True when some process holds the writer's lock of ``lock_path`` (a shared probe, released at once)."""
    try:
        # O_NONBLOCK: a pipe put in the lock file's place would otherwise wait for a writer for ever
        fd = os.open(lock_path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0))
    except FileNotFoundError:
        return False
    try:
        fcntl.flock(fd, fcntl.LOCK_SH | fcntl.LOCK_NB)
    except OSError:
        return True
    finally:
        os.close(fd)  # closing releases the probe lock at once
    return False
