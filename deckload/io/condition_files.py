"""Where a vessel's conditions are found by name: stock, saved and working.

* **stock** conditions are the files beside the profile named ``<profile stem>.<key>.condition.toml``
  (the demo's ``departure``, ``midvoyage``...); they are never written by the program.
* **saved** conditions are the ones an officer named on the loading screen, one file each in the
  vessel's folder of the working-conditions folder (``paths.saved_conditions_dir``).
* the **working** condition is the loading screen's own file (``paths.working_file``).

:func:`resolve` turns what was typed on a command line into a file, and when nothing matches
:class:`ConditionNotFound` lists what exists.  Reading a title never validates the file (that
is ``profiles.load_condition``'s work when the condition is opened).
"""

from __future__ import annotations

import stat
import tomllib
from pathlib import Path

from deckload.core.frozen import frozen
from deckload.io.textsafe import control_char

WORKING_KEYS = ("working", "work", "screen")
"""Short names of the loading screen's working condition on the command line."""

MAX_NAME_CHARS = 80
"""Longest condition name accepted when saving under a name of one's own."""


@frozen
class Named:
    """A condition found by name: the name to type, its title, its file and where it comes from."""

    key: str
    """Short name to type (``departure``, ``my-arrival``, ``working``)."""
    title: str
    """The condition's own name (``[condition] name``), or the file name if unreadable."""
    path: Path
    origin: str
    """``stock``, ``saved`` or ``working``."""


class ConditionNotFound(LookupError):
    """A condition asked for by a name that matches nothing; the message lists what exists."""


def name_key(name: str) -> str:
    """File-name form of a condition name: 'Sailing 2 Dec, ρ 1.010' → 'sailing-2-dec-ρ-1-010'."""
    from deckload.io.paths import vessel_slug

    return vessel_slug(name)[:60]


def title_of(path: Path) -> str:
    """``[condition] name`` of a condition file, without validating it (the file name if unreadable)."""
    name = _own_name(path)
    return name if name is not None else path.name


def _own_name(path: Path) -> str | None:
    """``[condition] name`` of the file, None when it has none, one the reader refuses as a name (not
    one line, too long), or the file cannot be read or parsed.

    The by-name lookup reads every condition file beside the profile and in the saved folder,
    not only the one asked for: one that cannot be read or parsed, for whatever reason (a file
    over the size limit, bytes that are not UTF-8, TOML nested too deep for the reader — a
    RecursionError —, an integer of too many digits — a ValueError — …), must only fail to
    match by its name, never stop the lookup.  KeyboardInterrupt and SystemExit are not
    Exceptions and still stop the program."""
    from deckload.io.limits import MAX_TOML_BYTES, open_regular

    try:
        with open_regular(path, "a condition file") as fh:
            raw = fh.read(MAX_TOML_BYTES + 1)
        if len(raw) > MAX_TOML_BYTES:
            return None
        name = tomllib.loads(raw.decode("utf-8")).get("condition", {}).get("name")
    except Exception:  # noqa: BLE001  see the docstring: a sibling that cannot be read never matches
        return None
    if (not isinstance(name, str) or not name.strip() or len(name) > MAX_NAME_CHARS or "\n" in name or "\t" in name
            or control_char(name) is not None):
        # a name the reader refuses (profiles.parse_condition: one line, at most MAX_NAME_CHARS) is
        # not listed as the file's title: a line break in it would print lines of its own
        return None
    return name


def _regular(path: Path) -> bool:
    """A regular file (a link to one counts): a pipe, device or socket named like a condition file
    is not one, and opening it to read its name could wait for ever."""
    try:
        return stat.S_ISREG(path.stat().st_mode)
    except (OSError, ValueError):
        return False


def stock(profile_path: Path) -> list[Named]:
    """Condition files beside the profile: ``<stem>.<key>.condition.toml`` (regular files only)."""
    stem = profile_path.name.removesuffix(".toml")
    out = []
    for p in sorted(profile_path.parent.glob(f"{stem}.*.condition.toml")):
        key = p.name[len(stem) + 1: -len(".condition.toml")]
        if key and "." not in key and _regular(p):
            out.append(Named(key, title_of(p), p, "stock"))
    return out


def saved(folder: Path) -> list[Named]:
    """Conditions saved under an officer's own name, in ``folder`` (regular files only)."""
    if not folder.is_dir():
        return []
    return [Named(p.name.removesuffix(".condition.toml"), title_of(p), p, "saved")
            for p in sorted(folder.glob("*.condition.toml")) if _regular(p)]


def all_named(profile_path: Path, vessel_name: str, work_dir: Path) -> list[Named]:
    from deckload.io import paths

    found = stock(profile_path) + saved(paths.saved_conditions_dir(work_dir, vessel_name))
    w = paths.working_file(work_dir, vessel_name)
    if w.is_file():
        found.append(Named("working", title_of(w), w, "working"))
    return found


def resolve(profile_path: Path, typed: str, vessel_name: str, work_dir: Path) -> Path:
    """The file a command line means by ``typed``: a path that exists; ``working`` for the loading
    screen's condition; a stock or saved condition by its key or its name (case ignored)."""
    from deckload.io import paths

    given = Path(typed)
    try:
        is_path = given.exists() and not given.is_dir()
    except (OSError, ValueError):  # a name too long for a file (ENAMETOOLONG) is looked up as a condition's name
        is_path = False
    if is_path:
        # a pipe or device named as the file is that file: reading it refuses it, naming it
        return given
    want = typed.strip().casefold()
    if want in WORKING_KEYS:
        w = paths.working_file(work_dir, vessel_name)
        if w.is_file():
            return w
        raise ConditionNotFound(f"{vessel_name} has no working condition yet ({w} does not exist): "
                                "the loading screen writes it at its first change, or name a condition." + _listing(profile_path, vessel_name, work_dir))
    found = all_named(profile_path, vessel_name, work_dir)
    for n in found:
        if want in (n.key.casefold(), n.title.casefold()) or name_key(typed) == n.key:
            return n.path
    raise ConditionNotFound(f"no condition file or condition named {typed!r} for {vessel_name}."
                            + _listing(profile_path, vessel_name, work_dir))


def _listing(profile_path: Path, vessel_name: str, work_dir: Path) -> str:
    found = all_named(profile_path, vessel_name, work_dir)
    if not found:
        return " It has no stock or saved conditions: give a condition file's path."
    lines = [" Conditions of this vessel (type the short name, or a condition file's path):"]
    for n in found:
        lines.append(f"  {n.key:<22} {n.origin:<8} {n.title}")
    return "\n".join(lines)
