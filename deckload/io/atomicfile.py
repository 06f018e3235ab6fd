"""Replace a file so that, after a power cut at any instant, it holds the old or the new bytes.

A temporary file in the same folder is written, flushed and fsync'ed, then moved over the
target with ``os.replace`` (atomic on POSIX and Windows); the folder is fsync'ed so that the
rename itself survives.  On any failure the temporary file is removed and the old file is
untouched.  Every file deckload rewrites (conditions, profiles, the log's side files) goes
through :func:`write_atomic`.
"""

from __future__ import annotations

import os
import tempfile
from pathlib import Path


def _read_umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


# Read once, at import, while there is one thread: os.umask can only be read by setting it,
# and setting it while the screen's writer thread creates files would leak a 0 umask.
_UMASK = _read_umask()


def _write_all(fh, data: bytes) -> None:
    fh.write(data)


def fsync_dir(folder: Path) -> None:
    """fsync a folder so that a new or renamed file's name is durable."""
    try:
        dfd = os.open(folder, os.O_RDONLY | getattr(os, "O_DIRECTORY", 0))
    except OSError:  # e.g. Windows cannot open a folder; os.replace is durable enough there
        return
    try:
        os.fsync(dfd)
    except OSError:
        pass
    finally:
        os.close(dfd)


def write_atomic(path: str | os.PathLike, data: bytes | str) -> None:
    """Atomically replace ``path`` with ``data`` (str is written as UTF-8), keeping its permissions."""
    path = Path(path)
    if isinstance(data, str):
        data = data.encode("utf-8")
    folder = path.parent if str(path.parent) else Path(".")
    try:
        mode = os.stat(path).st_mode & 0o777
    except FileNotFoundError:
        mode = 0o666 & ~_UMASK
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    try:
        with os.fdopen(fd, "wb") as fh:
            _write_all(fh, data)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, mode)
        os.replace(tmp, path)
    except BaseException:
        try:
            os.unlink(tmp)
        except OSError:
            pass
        raise
    fsync_dir(folder)


def leftover_temp_files(folder: Path) -> list[Path]:
    """Temporary files :func:`write_atomic` left in ``folder`` when it was killed mid-write
    (``.NAME.XXXXXXXX.tmp``).  Call only where no other writer can be at work (under the
    writer's lock, or at start before anything is saved)."""
    try:
        return sorted(p for p in Path(folder).glob(".*.tmp") if p.is_file())
    except OSError:
        return []
