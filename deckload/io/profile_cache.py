"""A cache of validated profiles in the per-user data folder, so that start-up skips the parse.

Reading the demo profile (134 KiB of TOML, then its hull geometry file) and validating it takes
a few hundred milliseconds on a slow PC; the finished, validated object loads from this cache in
about a millisecond.  What is cached is whatever the caller builds from the profile file (the
command line and the screen cache the vessel, how its tables were written and its located
plausibility audit: ``deckload.report.audit_findings.load_audited``).

Where: ``data_home()/cache/profiles/`` (``deckload.io.paths.data_home``), one file per entry, or
the folder ``DECKLOAD_CACHE_DIR`` names (a cache kept apart from the data folder: the test suite
gives each of its processes one, shared by its tests).

Key: the file's name is the SHA-256 of the program version, a stamp of the program's own
source files (name, size and modification time of every module of the package, so a changed
reader in a checkout never meets an old entry), the Python and numpy versions, the profile's
path as given and as an absolute path (messages name the path as given; CSV tables and the
hull geometry file are found relative to it), and the SHA-256 of the profile's bytes.  Inside,
every other file the build read (CSV tables, the hull geometry file) is listed with the SHA-256
of the bytes read, or as absent (an optional geometry file that was not there); each is hashed
again on every use, and one byte changed anywhere, or a file appeared or gone, is a miss.

Format: one header line of JSON (format, version, stamp, the files and their hashes, the
payload's length and SHA-256), then the payload, a pickle.  Written atomically
(``deckload.io.atomicfile``).  An entry that cannot be read, is cut short, fails its payload
hash (a flipped bit would otherwise be a wrong number), is from another version or holds
another type is ignored and rebuilt; a folder that cannot be written just means no cache.

Why pickle is acceptable here: the folder is the user's own (``~/.local/share/deckload`` or
``$DECKLOAD_HOME``), so whoever can plant a file there can equally edit the user's shell start-up
files or the installed program itself: the cache has the same trust as the code.  Even so the
unpickler is restricted (:class:`_Unpickler`): it resolves only dataclasses and enums defined in
deckload's own modules and the few numpy names an array needs, so a planted file cannot name
``os.system`` or any other callable; and the object loaded must be of the type the caller expects.

Set ``DECKLOAD_NO_CACHE`` (to anything but empty or ``0``), or give ``deckload --no-cache``, to
read every profile from its files; delete the folder to clear the cache (it is rebuilt as needed).
"""

from __future__ import annotations

import io
import json
import os
import pickle
import sys
from pathlib import Path
from typing import Callable, TypeVar

T = TypeVar("T")

FORMAT = "deckload-profile-cache-1"
MAX_ENTRIES = 64
"""Entries kept; beyond this the least recently written are removed after a write."""
_HEADER_LIMIT = 1 << 20
"""A header line longer than this is not ours (a profile reads at most a few dozen files)."""
_PAYLOAD_LIMIT = 1 << 28
"""256 MiB: far above the largest profile's model (a 4 MiB profile, deckload.io.limits), so a header
claiming more is not ours (the demo, hull geometry included, is 0.3 MB)."""

_NUMPY_NAMES = {
    ("numpy", "dtype"), ("numpy", "ndarray"),
    ("numpy._core.numeric", "_frombuffer"), ("numpy.core.numeric", "_frombuffer"),
    ("numpy._core.multiarray", "_reconstruct"), ("numpy.core.multiarray", "_reconstruct"),
}
"""What numpy's own pickles of arrays name: the dtype and array types and their two rebuilders."""
_OWN_LAYERS = ("deckload.core.", "deckload.io.", "deckload.report.")
"""Where the classes of a cached object may come from (never ``deckload.__main__``, which runs the program)."""


def enabled() -> bool:
    """False when ``DECKLOAD_NO_CACHE`` is set (to anything but empty or ``0``)."""
    return os.environ.get("DECKLOAD_NO_CACHE", "") in ("", "0")


def cache_dir() -> Path:
    """``$DECKLOAD_CACHE_DIR`` when set, else ``data_home()/cache/profiles``."""
    own = os.environ.get("DECKLOAD_CACHE_DIR")
    if own:
        return Path(own)
    from deckload.io.paths import data_home

    return data_home() / "cache" / "profiles"


def cached(path: str | os.PathLike, build: Callable[[str | os.PathLike], T], expect: type,
           check: Callable[[object], bool] = lambda obj: True) -> T:
    """``build(path)``, from the cache when an entry for exactly these files is there.

    ``build`` reads the profile (through ``deckload.io.limits.read_limited``, which notes every
    file it reads) and raises what reading raises (``OSError``, ``ProfileError``): nothing is
    cached then.  A cached object is returned only if it is an ``expect`` and ``check`` accepts it.
    """
    if not enabled():
        return build(path)
    from deckload.io.limits import MAX_TOML_BYTES, note_read, noting_reads, read_limited, stop_noting

    try:
        data = read_limited(path, MAX_TOML_BYTES, "a profile or condition")
    except OSError:
        return build(path)  # which reports it as reading always does (e.g. a file too large is a ProfileError)
    import hashlib

    digest = hashlib.sha256(data).hexdigest()
    entry = _entry_path(path, digest)
    if entry is not None:
        obj = _read_entry(entry, digest, expect, check)
        if obj is not None:
            return obj
    noted, token = noting_reads()
    try:
        note_read(path, data)  # the profile itself is read again by build: its bytes are compared below
        obj = build(path)
    finally:
        stop_noting(token)
    hashes: dict[str, set] = {}
    for p, h in noted:
        hashes.setdefault(p, set()).add(h)
    # a file that changed while it was read (two hashes) is not cached: which bytes were built?
    if entry is not None and hashes[os.path.abspath(path)] == {digest} and all(len(h) == 1 for h in hashes.values()):
        _write_entry(entry, digest, noted, obj)
    return obj


# ----------------------------------------------------------------------------- the key


def _code_stamp() -> str:
    """Name, size and modification time of every module of the package: a module edited or replaced
    (a checkout updated without a new version number) changes the key.  About a hundred ``stat``
    calls: well under a millisecond."""
    root = Path(__file__).resolve().parent.parent
    parts = []
    stack = [str(root)]
    while stack:
        folder = stack.pop()
        try:
            with os.scandir(folder) as it:
                for e in it:
                    if e.is_dir(follow_symlinks=False) and e.name != "__pycache__" and e.name != "data":
                        stack.append(e.path)
                    elif e.name.endswith(".py"):
                        st = e.stat()
                        parts.append(f"{e.path[len(str(root)):]}:{st.st_size}:{st.st_mtime_ns}")
        except OSError:
            parts.append(f"{folder}:unreadable")
    return "\n".join(sorted(parts))


def _key(path: str | os.PathLike, digest: str) -> str:
    import hashlib

    import numpy

    from deckload import __version__

    h = hashlib.sha256()
    for part in (FORMAT, __version__, sys.version, numpy.__version__, _code_stamp(),
                 str(path), os.path.abspath(path), digest):
        h.update(part.encode("utf-8", "surrogateescape") + b"\0")
    return h.hexdigest()


def _entry_path(path: str | os.PathLike, digest: str) -> Path | None:
    try:
        return cache_dir() / f"{_key(path, digest)}.cache"
    except (OSError, RuntimeError):  # no home folder to find
        return None


def _header(digest: str, noted: list[tuple[str, str | None]], payload: bytes) -> dict:
    import hashlib

    from deckload import __version__

    return {"format": FORMAT, "version": __version__, "profile_sha256": digest,
            "files": sorted({p: h for p, h in noted}.items()),
            "payload_bytes": len(payload), "payload_sha256": hashlib.sha256(payload).hexdigest()}


# ----------------------------------------------------------------------------- read and write


def _read_entry(entry: Path, digest: str, expect: type, check: Callable[[object], bool]):
    """The cached object, or None when the entry is missing, unreadable, stale or not ours."""
    import hashlib

    from deckload import __version__

    from deckload.io.limits import open_regular

    try:
        with open_regular(entry, "a profile cache entry") as fh:
            line = fh.readline(_HEADER_LIMIT)
            head = json.loads(line)
            if not (isinstance(head, dict) and head.get("format") == FORMAT and head.get("version") == __version__
                    and head.get("profile_sha256") == digest and isinstance(head.get("files"), list)
                    and isinstance(head.get("payload_bytes"), int) and 0 < head["payload_bytes"] <= _PAYLOAD_LIMIT
                    and isinstance(head.get("payload_sha256"), str)):
                return None
            payload = fh.read(head["payload_bytes"] + 1)
    except (OSError, ValueError, UnicodeDecodeError):
        return None
    if len(payload) != head["payload_bytes"] or hashlib.sha256(payload).hexdigest() != head["payload_sha256"]:
        return None  # cut short, or bytes changed on disk
    for item in head["files"]:
        if not (isinstance(item, list) and len(item) == 2 and isinstance(item[0], str)):
            return None
        if _file_hash(item[0]) != item[1]:
            return None  # a table or geometry file changed, appeared or went
    try:
        obj = _Unpickler(io.BytesIO(payload)).load()
    except Exception:  # noqa: BLE001  any failure to rebuild the object is a miss, never an error
        return None
    if not isinstance(obj, expect):
        return None
    try:
        return obj if check(obj) else None
    except Exception:  # noqa: BLE001
        return None


def _file_hash(path: str) -> str | None:
    """SHA-256 of the file's bytes now; None when it is not there; '' when it cannot be read."""
    from deckload.io.limits import MAX_TOML_BYTES, open_regular

    import hashlib

    try:
        with open_regular(path) as fh:  # a pipe put in a table's place is a miss, not a wait
            data = fh.read(MAX_TOML_BYTES + 1)
    except FileNotFoundError:
        return None
    except OSError:
        return "" if os.path.exists(path) else None
    return hashlib.sha256(data).hexdigest()


def _write_entry(entry: Path, digest: str, noted: list[tuple[str, str | None]], obj: object) -> None:
    """Write the entry atomically; any failure (read-only folder, full disk) leaves no cache."""
    from deckload.io.atomicfile import write_atomic

    try:
        payload = pickle.dumps(obj, protocol=pickle.HIGHEST_PROTOCOL)
        head = json.dumps(_header(digest, noted, payload), ensure_ascii=True).encode("ascii")
        entry.parent.mkdir(parents=True, exist_ok=True)
        write_atomic(entry, head + b"\n" + payload)
    except Exception:  # noqa: BLE001  the cache is an optimisation: never a reason to fail
        return
    _prune(entry.parent)


def _prune(folder: Path) -> None:
    """Keep the newest :data:`MAX_ENTRIES` entries; remove temporary files a killed write left
    behind (an hour old: a write in progress in another deckload takes milliseconds, and if it
    lost its file it would only leave no entry)."""
    import time

    try:
        entries, stale = [], []
        for e in os.scandir(folder):
            st = e.stat()
            if e.name.endswith(".cache"):
                entries.append((st.st_mtime_ns, e.path))
            elif e.name.startswith(".") and e.name.endswith(".tmp") and time.time() - st.st_mtime > 3600:
                stale.append(e.path)
        entries.sort(reverse=True)
        for p in [p for _, p in entries[MAX_ENTRIES:]] + stale:
            os.unlink(p)
    except OSError:
        pass


class _Unpickler(pickle.Unpickler):
    """Resolves only deckload's own dataclasses and enums and numpy's array rebuilders."""

    def find_class(self, module: str, name: str):
        if (module, name) in _NUMPY_NAMES:
            return super().find_class(module, name)
        if module.startswith(_OWN_LAYERS) and "." not in name:
            obj = super().find_class(module, name)
            import dataclasses
            import enum

            if isinstance(obj, type) and obj.__module__ == module and (
                    dataclasses.is_dataclass(obj) or issubclass(obj, enum.Enum)):
                return obj
        raise pickle.UnpicklingError(f"not allowed in a profile cache: {module}.{name}")
