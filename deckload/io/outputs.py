"""A file the user names for output never replaces a file deckload reads or keeps.

Every command that writes a file named on its command line (``report -o``, ``log export -o``,
``tables -o``, the files ``csv`` writes in its folder) asks :func:`refuse_overwrite` (or
:func:`refuse_overwrites` for several) before it writes anything.  It refuses
(:class:`OutputRefused`, naming the path and what the file is) when the output is:

* an input of the command: the profile, the condition, and every file the profile reads
  (:func:`profile_inputs`: its CSV tables, its hull geometry file, its booklet conditions'
  files, the stock condition files beside it);
* a file of a voyage log in a log folder (:func:`log_folder_files`: the log, its head
  record, its lock file, a torn line set aside), or a working or saved condition of the
  loading screen (``working/`` in the log folder);
* wherever it is, an existing file named as a voyage log's files are (:data:`LOG_FILE_PATTERNS`)
  or whose first line is a record of a voyage log or its head (:func:`is_voyage_log`): a log
  kept in a folder the command was not told of (one named with ``log --dir``, a copy on a
  stick) is as much evidence as the one in use;
* an existing thing that is not a regular file (a folder, a pipe, a device, a socket): the
  atomic save would put a regular file in its place (:func:`not_a_regular_file`).

"The same file" is decided as the system sees it: ``os.stat`` of both (symbolic links
followed) with the same device and inode — a hard link, a symbolic link or another
spelling of the path is the same file — or, for a file not there yet, the same path once
links and ``..`` are resolved (``os.path.realpath``): writing a log's name in a log folder,
or a table's name the profile would read, would make such a file.

Refusing is the rule, never a backup: these are the values as the booklet was typed and the
hash-chained evidence of the log; a copy beside them would be one more file to mistake for them.
"""

from __future__ import annotations

import fnmatch
import json
import os
import re
import stat
from collections.abc import Iterable
from pathlib import Path

LOG_FILE_PATTERNS = ("*.log.jsonl", "*.log.head.json", "*.log.lock", "*.log.jsonl.torn-*")
"""The files the voyage log keeps per vessel in its folder (deckload.logbook): the log, its
head record, its writer's lock and a torn last line set aside."""

LOG_FORMAT = re.compile(r"deckload-log(-head)?-[0-9]+")
"""The ``format`` of a voyage log's lines (``deckload-log-1``) and of its head record
(``deckload-log-head-1``), as :mod:`deckload.logbook` writes them (this layer cannot import it;
a test holds the two to this pattern)."""

FILE_KEYS = ("csv", "hull_geometry", "condition_file")
"""Keys of a profile whose value names a file the profile reads, relative to the profile's folder."""


class OutputRefused(Exception):
    """Writing the named output would replace a file deckload reads or keeps; the message names
    the path and what the file is (the command adds what it did not write, and the way out)."""


def is_voyage_log(path: str | os.PathLike) -> bool:
    """``path`` is a regular file whose first line is a JSON object with the ``format`` of a voyage
    log's line or head record (:data:`LOG_FORMAT`).  A file that cannot be read says False (the
    write that follows fails on it by itself)."""
    from deckload.io.limits import MAX_LOG_LINE_BYTES, open_regular

    try:
        with open_regular(path, "an output") as fh:
            first = fh.read(MAX_LOG_LINE_BYTES + 1).split(b"\n", 1)[0]
    except (OSError, ValueError):  # unreadable, or not a regular file (NotRegularFileError is an OSError)
        return False
    try:
        doc = json.loads(first.decode("utf-8"))
    except (UnicodeDecodeError, ValueError, RecursionError):
        return False
    return isinstance(doc, dict) and isinstance(doc.get("format"), str) and LOG_FORMAT.fullmatch(doc["format"]) is not None


_KINDS = ((stat.S_ISDIR, "a folder"), (stat.S_ISFIFO, "a pipe (FIFO)"), (stat.S_ISCHR, "a character device"),
          (stat.S_ISBLK, "a block device"), (stat.S_ISSOCK, "a socket"))


def not_a_regular_file(path: str | os.PathLike) -> str | None:
    """What ``path`` is when it exists and is not a regular file (links followed), else None."""
    try:
        mode = os.stat(path).st_mode
    except (OSError, ValueError):
        return None
    if stat.S_ISREG(mode):
        return None
    return next((word for test, word in _KINDS if test(mode)), "not a file")


def _kind_refusal(output: str | os.PathLike) -> str | None:
    """Why ``output`` may not be written whatever folder it is in (see the module docstring), or None."""
    kind = not_a_regular_file(output)
    if kind is not None:
        return (f"{output}: is not a regular file but {kind}; writing there would put a regular file in its "
                "place")
    if _ident(output) is None:
        return None
    if any(fnmatch.fnmatch(Path(output).name, pat) for pat in LOG_FILE_PATTERNS):
        return f"{output}: has the name of a file of a voyage log; writing there would replace it"
    if is_voyage_log(output):
        return (f"{output}: is a voyage log (its first line is a deckload log record); writing there would "
                "replace it")
    return None


def _ident(path: str | os.PathLike) -> tuple[int, int] | None:
    try:
        st = os.stat(path)
    except (OSError, ValueError):
        return None
    return st.st_dev, st.st_ino


def _real(path: str | os.PathLike) -> str:
    try:
        return os.path.realpath(path)
    except (OSError, ValueError):
        return os.path.abspath(path)


def same_file(a: str | os.PathLike, b: str | os.PathLike) -> bool:
    """``a`` and ``b`` are one file: same device and inode when both exist (links followed),
    else the same resolved path."""
    ia, ib = _ident(a), _ident(b)
    if ia is not None and ib is not None:
        return ia == ib
    return _real(a) == _real(b)


def _walk_names(node, out: list[str]) -> None:
    if isinstance(node, dict):
        for k, v in node.items():
            if k in FILE_KEYS and isinstance(v, str) and v.strip():
                out.append(v)
            else:
                _walk_names(v, out)
    elif isinstance(node, list):
        for v in node:
            _walk_names(v, out)


def profile_inputs(profile: str | os.PathLike) -> list[tuple[Path, str]]:
    """(file, what it is) for the profile and every file it reads or that is looked up beside it.

    The files are those its keys name (:data:`FILE_KEYS`, relative to the profile's folder, as
    the reader resolves them) and the stock condition files beside it (``<stem>.*.condition.toml``,
    read by the by-name lookup).  A profile that cannot be parsed names only itself (the command
    that reads it has refused it before any output is written)."""
    import tomllib

    from deckload.io.limits import MAX_TOML_BYTES, open_regular

    path = Path(profile)
    out: list[tuple[Path, str]] = [(path, "the vessel profile read")]
    try:
        with open_regular(path, "a vessel profile") as fh:
            raw = fh.read(MAX_TOML_BYTES + 1)
        doc = tomllib.loads(raw.decode("utf-8")) if len(raw) <= MAX_TOML_BYTES else {}
    except Exception:  # noqa: BLE001  unreadable or not TOML: nothing more is named (see the docstring)
        doc = {}
    names: list[str] = []
    _walk_names(doc, names)
    for name in names:
        out.append((path.parent / name, f"a file the profile {path} reads ({name!r})"))
    stem = path.name.removesuffix(".toml")
    try:
        for p in sorted(path.parent.glob(f"{stem}.*.condition.toml")):
            out.append((p, f"a condition file of the profile {path}"))
    except (OSError, ValueError):
        pass
    return out


def log_folder_files(folder: str | os.PathLike) -> list[tuple[Path, str]]:
    """(file, what it is) for every existing file of a voyage log in ``folder`` and every working
    or saved condition of the loading screen kept there (``working/``)."""
    d = Path(folder)
    out: list[tuple[Path, str]] = []
    try:
        with os.scandir(d) as it:
            for e in it:
                if any(fnmatch.fnmatch(e.name, pat) for pat in LOG_FILE_PATTERNS):
                    out.append((Path(e.path), f"a file of the voyage log in {d}"))
    except OSError:
        pass
    try:
        for p in (d / "working").rglob("*.condition.toml"):
            out.append((p, "a condition the loading screen keeps"))
    except OSError:
        pass
    return out


def _log_name_in(output: str, folders: list[Path]) -> Path | None:
    """The log folder ``output`` would land in under a log file's name (a file not there yet)."""
    real = Path(output)
    for d in folders:
        if _ident(d) is None:
            continue
        if same_file(real.parent, d) and any(fnmatch.fnmatch(real.name, pat) for pat in LOG_FILE_PATTERNS):
            return d
        work = d / "working"
        if real.name.endswith(".condition.toml") and _ident(work) is not None:
            if any(same_file(parent, work) for parent in real.parents):
                return d
    return None


def refuse_overwrite(output: str | os.PathLike, inputs: Iterable[tuple[str | os.PathLike, str]] = (),
                     log_dirs: Iterable[str | os.PathLike] = ()) -> None:
    """Raise :class:`OutputRefused` when writing ``output`` would replace one of ``inputs``
    ((file, what it is) pairs), a file of a voyage log or a condition the loading screen keeps,
    in any of ``log_dirs`` and in the log folder in use (``deckload.io.paths.log_dir``)."""
    refuse_overwrites([output], inputs, log_dirs)


def refuse_overwrites(outputs: Iterable[str | os.PathLike], inputs: Iterable[tuple[str | os.PathLike, str]] = (),
                      log_dirs: Iterable[str | os.PathLike] = ()) -> None:
    """:func:`refuse_overwrite` for each of ``outputs`` in turn (the first refused raises), the
    log folders read once for them all; each output is also refused wherever it is when it is not
    a regular file, or is a voyage log's file by name or by content (:func:`_kind_refusal`)."""
    from deckload.io.paths import log_dir

    try:
        in_use = [log_dir()]
    except (OSError, RuntimeError):  # no home folder to find: there is no default log folder either
        in_use = []
    folders: list[Path] = []
    for d in [*log_dirs, *in_use]:
        if not any(same_file(d, f) for f in folders):
            folders.append(Path(d))
    protected = list(inputs)
    for d in folders:
        protected += log_folder_files(d)
    for output in outputs:
        why = _kind_refusal(output)
        if why is not None:
            raise OutputRefused(why)
        for path, what in protected:
            if same_file(output, path):
                alias = "" if str(path) == str(output) else f" (the same file as {path})"
                raise OutputRefused(f"{output}: is {what}{alias}; writing there would replace it")
        d = _log_name_in(_real(output), folders)
        if d is not None:
            raise OutputRefused(f"{output}: has the name of a file the voyage log or the loading screen keeps in "
                                f"{d}; writing there would put another file in its place")
