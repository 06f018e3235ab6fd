"""Size limits on everything deckload reads, so that a huge or hostile file is refused at once.

Each limit is far above anything a real vessel needs (the demo profile is 137 kB with tables
of at most 37 rows) and far below what would take the program seconds or gigabytes to read:

* a profile, condition or geometry file: :data:`MAX_TOML_BYTES`;
* one table (array) in such a file: :data:`MAX_TABLE_VALUES` values; tables at trims: :data:`MAX_TABLES_AT_TRIMS` per set;
* one line of the voyage log: :data:`MAX_LOG_LINE_BYTES`; a whole log: :data:`MAX_LOG_BYTES`;
* an amount typed on the loading screen: :data:`MAX_ENTRY_CHARS` characters.

Numbers too large for a float (TOML integers are unbounded) are refused as not finite,
and nesting too deep for the TOML reader is refused as a problem of the file.

A file over its limit is refused with a message naming the file and the limit; the file is
never read past the limit.  A file that is not a regular file (a pipe, a device, a socket) is
refused before a byte is read (:func:`open_regular`): opening a pipe with no writer, or reading
one, would wait for ever.
"""

from __future__ import annotations

import errno
import os
import stat
from contextvars import ContextVar
from pathlib import Path

MAX_TOML_BYTES = 4 * 1024 * 1024
"""4 MiB: about 30 times the demo profile."""
MAX_TABLE_VALUES = 20_000
"""Values in one array (a cross-curve matrix counts every cell): 100 × 200 would be a very fine table."""
MAX_TABLES_AT_TRIMS = 40
"""Tables at trims other than even keel, per set ([[hydrostatics_at_trim]], [[cross_curves_at_trim]]):
booklets print 4–10; each may name a CSV file of its own, so their number is bounded too."""
MAX_LOG_LINE_BYTES = 1024 * 1024
"""One log entry (with its condition) is a few kB."""
MAX_LOG_BYTES = 512 * 1024 * 1024
"""A log of 100,000 entries of 5 kB each."""
MAX_ENTRY_CHARS = 64
"""An amount such as '12.5 m3' is a few characters."""
MAX_ITEM_NAME_CHARS = 200
"""A deck item's or constant's name, typed in the screen's item form or read from a condition file;
a hold's cargo description too (shown beside the hold's name)."""
MAX_REMARK_CHARS = 2000
"""A condition's remark in a file: the screen takes a remark of up to this many characters for the
log (logbook.book.MAX_TEXT_CHARS), and the same here."""


class TooLargeError(OSError):
    """A file over its size limit; the message names the file and the limit."""


def size_text(n: int) -> str:
    for unit, k in (("GiB", 1 << 30), ("MiB", 1 << 20), ("kiB", 1 << 10)):
        if n >= k:
            return f"{n / k:g} {unit}"
    return f"{n} bytes"


class NotRegularFileError(TooLargeError):
    """A pipe, device or socket named (or found) where a file is read; the message names it.

    A :class:`TooLargeError`, so that every reader that refuses an over-size file unread
    (as a problem of the file, naming it) refuses this the same way."""


_KINDS = ((stat.S_ISFIFO, "a pipe (FIFO)"), (stat.S_ISCHR, "a character device"),
          (stat.S_ISBLK, "a block device"), (stat.S_ISSOCK, "a socket"))


def _not_regular(path: str | os.PathLike, mode: int, what: str) -> NotRegularFileError:
    kind = next((word for test, word in _KINDS if test(mode)), "not a file")
    return NotRegularFileError(f"{path}: is not a regular file but {kind}: only a regular file is allowed "
                               f"for {what}; refused unread")


def open_regular(path: str | os.PathLike, what: str = "a file deckload reads"):
    """``path`` opened for reading in binary, refusing anything but a regular file.

    The file is opened with ``O_NONBLOCK`` (opening a pipe that no one writes to would
    otherwise wait for ever) and its type is taken from the open descriptor (``fstat``, so
    a file swapped in between cannot slip through): a pipe, device or socket raises
    :class:`NotRegularFileError`, a folder :class:`IsADirectoryError` (as ``open`` does).
    Symbolic links are followed: a link to a regular file is read."""
    flags = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_BINARY", 0) | getattr(os, "O_CLOEXEC", 0)
    try:
        fd = os.open(path, flags)
    except OSError as e:
        if e.errno == errno.ENXIO:  # a socket cannot be opened: say what it is
            try:
                mode = os.stat(path).st_mode
            except OSError:
                raise e from None
            if not stat.S_ISREG(mode):
                raise _not_regular(path, mode, what) from None
        raise
    try:
        mode = os.fstat(fd).st_mode
        if stat.S_ISDIR(mode):
            raise IsADirectoryError(errno.EISDIR, os.strerror(errno.EISDIR), str(path))
        if not stat.S_ISREG(mode):
            raise _not_regular(path, mode, what)
        if hasattr(os, "set_blocking"):
            os.set_blocking(fd, True)  # no effect on a regular file's reads; the descriptor as open() makes it
        return os.fdopen(fd, "rb")
    except BaseException:
        os.close(fd)
        raise


def read_limited(path: str | os.PathLike, limit: int, what: str) -> bytes:
    """The bytes of ``path``, refusing (:class:`TooLargeError`) a file larger than ``limit`` and
    (:class:`NotRegularFileError`) anything but a regular file (:func:`open_regular`)."""
    with open_regular(Path(path), what) as f:
        data = f.read(limit + 1)
    if len(data) > limit:
        raise TooLargeError(f"{path}: larger than the {size_text(limit)} allowed for {what}: refused unread")
    note_read(path, data)
    return data


# ----------------------------------------------------------------- reads noted for a cache
# The profile cache (deckload.io.profile_cache) must miss when any file a profile was built
# from changes: while it builds a profile, every file read here (the profile, its CSV tables,
# its hull geometry file) is noted with the SHA-256 of the very bytes read, and a file looked
# for and not found (an optional hull geometry file) is noted as absent.
_noted: ContextVar[list[tuple[str, str | None]] | None] = ContextVar("deckload_noted_reads", default=None)


def note_read(path: str | os.PathLike, data: bytes) -> None:
    """Note a file's bytes, when something is noting reads (else nothing)."""
    noted = _noted.get()
    if noted is not None:
        import hashlib

        noted.append((os.path.abspath(path), hashlib.sha256(data).hexdigest()))


def note_absent(path: str | os.PathLike) -> None:
    """Note that a file the reading depends on was looked for and not found."""
    noted = _noted.get()
    if noted is not None:
        noted.append((os.path.abspath(path), None))


def noting_reads():
    """Start noting reads in this context: returns (list that fills up, token to stop)."""
    noted: list[tuple[str, str | None]] = []
    return noted, _noted.set(noted)


def stop_noting(token) -> None:
    _noted.reset(token)
