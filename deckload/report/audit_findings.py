"""The plausibility audit of a profile file: findings located in the file and worded for print.

:func:`deckload.core.audit.audit` judges the validated model (pure); this module adds
where each finding sits — the profile file and line (tomlcheck's line finder), or the
CSV file and line when the table was read from a CSV file beside the profile — and
the one-line wording used by ``deckload check`` and the loading screen::

    fv.toml:21: ERROR lightship.lcg_m = -2.1 m from AP: a lightship LCG must lie … ; compare with …
"""

from __future__ import annotations

import os
from pathlib import Path
from typing import TYPE_CHECKING

from deckload.core.frozen import frozen
from deckload.core.model import Vessel
from deckload.io.profiles import Reading
from deckload.io.tomlcheck import Problem, ProfileError
from deckload.report import verdict_format as vf

if TYPE_CHECKING:
    from deckload.core.audit import Finding

# The audit itself (deckload.core.audit), tomllib and csv are imported where they are used: a
# profile read from the cache (load_audited) brings its findings along and needs none of them.


@frozen
class Located:
    """A finding with the file and line it points at."""

    finding: Finding
    file: str
    line: int | None

    @property
    def is_error(self) -> bool:
        from deckload.core.audit import ERROR

        return self.finding.severity == ERROR

    def __str__(self) -> str:
        f = self.finding
        where = f"{self.file}:{self.line}" if self.line else self.file
        return f"{where}: {f.severity.upper()} {f.key} = {f.value}: {f.why}; compare with {f.look}"


class AuditError(ProfileError):
    """The profile meets the schema but its numbers contradict each other: it is not used."""

    def __init__(self, path: str | os.PathLike, found: list[Located]):
        errors = [x for x in found if x.is_error]
        super().__init__([Problem(x.file, x.line, x.finding.key, x.finding.value,
                                  f"ERROR (plausibility audit): {x.finding.why}; compare with {x.finding.look}")
                          for x in errors])
        self.path = str(path)
        self.found = found

    def __str__(self) -> str:
        n = len(self.problems)
        head = (f"{self.path}: the profile fails its plausibility audit ({n} contradiction{'s' if n != 1 else ''}) "
                "and is not opened; put these right (deckload check lists every finding):")
        return "\n".join([head, *(str(p) for p in self.problems)])


NO_BOOKLET_CONDITIONS = "no booklet conditions entered ([[booklet_condition]])"
"""The words every command uses when a profile lists none of the booklet's worked conditions:
``check``'s NOTE (deckload.cli.check) says at length what only they catch; ``calc`` and ``report``
say it once, briefly (:func:`booklet_note`)."""


def booklet_note(profile: "AuditedProfile") -> str | None:
    """The brief note of ``calc`` and ``report`` for a profile without worked booklet conditions
    (an audit that finds nothing is then no sign that the lightship or the datum are right), or None."""
    if profile.reading.booklet_conditions:
        return None
    return (f"NOTE: {NO_BOOKLET_CONDITIONS}: this profile has not been compared with the booklet's "
            "worked conditions, which alone catch a wrong lightship, datum or FSM column "
            "(deckload check says more)")


def doubt_lines(found) -> tuple[str, ...]:
    """The audit's warnings (doubts), one line each, ``key = value: why``: what every result of the
    profile carries to the officer (the screen's notice, calc, the report), not ``check`` alone."""
    return tuple(f"{x.finding.key} = {x.finding.value}: {x.finding.why}" for x in found if not x.is_error)


def warnings_notice(found: list[Located], path: str | os.PathLike, shown: int = 3) -> str | None:
    """One notice naming the audit's warnings (doubts), or None."""
    lines = doubt_lines(found)
    if not lines:
        return None
    more = f" … and {len(lines) - shown} more" if len(lines) > shown else ""
    return (f"Plausibility audit of {Path(path).name}: {len(lines)} warning{'s' if len(lines) != 1 else ''} "
            f"({vf.DOUBTS_HEADING}): " + "; ".join(lines[:shown]) + more)


def audit_or_refuse(path: str | os.PathLike, vessel: Vessel) -> str | None:
    """Before a profile is used on the screen: raise :class:`AuditError` on a contradiction,
    else return the warnings' notice (or None)."""
    return refuse_or_notice(path, audit_profile(path, vessel))


def refuse_or_notice(path: str | os.PathLike, found: list[Located]) -> str | None:
    """:func:`audit_or_refuse` for findings already made (e.g. :attr:`AuditedProfile.found`)."""
    if any(x.is_error for x in found):
        raise AuditError(path, list(found))
    return warnings_notice(list(found), path)


@frozen
class AuditedProfile:
    """A validated profile with how its tables were written and its located audit findings:
    everything the commands and the screen take from a profile file, as the cache holds it."""

    vessel: Vessel
    reading: Reading
    found: tuple[Located, ...]


def read_audited(path: str | os.PathLike) -> AuditedProfile:
    """Read, validate and audit a profile from its files.  Raises OSError, ProfileError."""
    from deckload.io.profiles import read_profile

    vessel, reading = read_profile(path)
    return AuditedProfile(vessel, reading, tuple(audit_profile(path, vessel, reading)))


def load_audited(path: str | os.PathLike) -> AuditedProfile:
    """:func:`read_audited`, from the profile cache (deckload.io.profile_cache) when the profile
    and every file it reads are unchanged since the entry was written."""
    from deckload.io.profile_cache import cached

    return cached(path, read_audited, AuditedProfile, _is_whole)


def _is_whole(a: AuditedProfile) -> bool:
    """A cached entry holds the types it should, all the way down to its findings."""
    if not (isinstance(a.vessel, Vessel) and isinstance(a.reading, Reading) and isinstance(a.found, tuple)):
        return False
    if a.found:
        from deckload.core.audit import Finding

        return all(isinstance(x, Located) and isinstance(x.finding, Finding) for x in a.found)
    return True


def audit_profile(path: str | os.PathLike, vessel: Vessel, reading: Reading | None = None) -> list[Located]:
    """Audit ``vessel`` (read from ``path``) and locate every finding in its files.

    With ``reading`` (how the tables were written), a finding in a table typed in the TOML in
    reverse (deepest draft first) or read with a row added is located on the row as typed.
    A file that cannot be re-read (moved meanwhile) only loses the line numbers."""
    from deckload.core.audit import audit

    findings = audit(vessel)
    if not findings:
        return []
    from deckload.io.limits import MAX_TOML_BYTES, read_limited

    try:
        text = read_limited(path, MAX_TOML_BYTES, "a profile").decode("utf-8")
    except (OSError, UnicodeDecodeError):
        return [Located(f, str(path), None) for f in findings]
    return locate(findings, str(path), text, vessel, reading)


def _as_written(path: tuple, vessel: Vessel, reading: Reading | None) -> tuple:
    """A finding's path into the model's table turned into the path of the row as typed: the
    model's tables rise, and a table typed falling was read reversed (and a calibration may
    have gained a level-0 row, cross curves a 0° column); a table at a trim is the model's n-th by
    rising trim + by the stern, and its entry as written is the reading's (typed + by the head, the
    entries run the other way)."""
    if reading is None or len(path) < 2:
        return path
    if path[0] in ("hydrostatics_at_trim", "cross_curves_at_trim") and isinstance(path[1], int):
        return _entry_as_written(path, vessel, reading)
    if len(path) < 3:
        return path
    if path[0] in ("hydrostatics", "cross_curves"):
        key, at = path[0], 2
        n = len(vessel.hydrostatics.draft_m if key == "hydrostatics" else vessel.cross_curves.displacement_t)
    elif path[0] == "tank" and len(path) > 4 and path[2] == "calibration" and isinstance(path[1], int):
        if not 0 <= path[1] < len(vessel.tanks) or vessel.tanks[path[1]].calibration is None:
            return path
        key, at = f"tank[{vessel.tanks[path[1]].id}].calibration", 4
        n = len(vessel.tanks[path[1]].calibration.volume_m3)
    else:
        return path
    tr = reading.tables.get(key)
    if tr is None or len(path) <= at or not isinstance(path[at], int):
        return path
    r = path[at]
    if tr.added_bottom_row:
        r, n = max(r - 1, 0), n - 1
    if tr.reversed:
        r = n - 1 - r
    out = list(path)
    out[at] = r
    if tr.added_upright and len(path) > at + 1 and isinstance(path[at + 1], int):
        out[at + 1] = max(path[at + 1] - 1, 0)
    return tuple(out)


def _entry_as_written(path: tuple, vessel: Vessel, reading: Reading) -> tuple:
    """``path`` with the model's index of a table at a trim turned into its entry as written."""
    from deckload.core.audit import trim_table_name  # (the audit is loaded only where findings are located)

    tt = vessel.trimmed
    if tt is None:
        return path
    hydro = path[0] == "hydrostatics_at_trim"
    trims, tables = (tt.hydro_trim_m, tt.hydrostatics) if hydro else (tt.kn_trim_m, tt.cross_curves)
    even = vessel.hydrostatics if hydro else vessel.cross_curves
    others = [float(t) for t, table in zip(trims, tables) if table is not even]
    if not 0 <= path[1] < len(others):
        return path
    tr = reading.tables.get(trim_table_name(path[0], others[path[1]]))
    if tr is None or tr.entry is None:
        return path
    return (path[0], tr.entry) + tuple(path[2:])


def locate(findings, filename: str, text: str, vessel: Vessel, reading: Reading | None = None) -> list[Located]:
    import tomllib

    from deckload.io.tomlcheck import key_lines

    lines = key_lines(text)
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError:
        doc = {}
    out = []
    for f in findings:
        path = _as_written(f.path, vessel, reading)
        csv_file = _csv_of(doc, path)
        if csv_file is not None:
            out.append(_in_csv(f, Path(filename).parent / csv_file, vessel))
            continue
        line = None
        for k in range(len(path), 0, -1):
            if path[:k] in lines:
                line = lines[path[:k]]
                break
        out.append(Located(f, filename, line))
    return out


def _csv_of(doc: dict, path: tuple) -> str | None:
    """The CSV file named by the table on ``path`` (``csv = "…"``), if it was read from one."""
    node = doc
    for part in path:
        if isinstance(node, dict):
            if isinstance(node.get("csv"), str):
                return node["csv"]
            node = node.get(part)
        elif isinstance(node, list) and isinstance(part, int) and 0 <= part < len(node):
            node = node[part]
        else:
            return None
    return None


def _in_csv(f: Finding, full: Path, vessel: Vessel) -> Located:
    """The CSV line of the finding's row (the finding's key names the column, as the model has it)."""
    import csv
    import io

    from deckload.io.limits import open_regular

    name = str(full)
    try:
        with io.TextIOWrapper(open_regular(full, "a CSV table"), newline="", encoding="utf-8") as fh:
            rows = [(n, r) for n, r in enumerate(csv.reader(fh), 1) if any(c.strip() for c in r)]
    except (OSError, UnicodeDecodeError, csv.Error):
        return Located(f, name, None)
    if len(rows) < 2:
        return Located(f, name, None)
    header = [c.strip() for c in rows[0][1]]
    data = rows[1:]
    ints = [p for p in f.path if isinstance(p, int)]
    # the table's row: kn_m[i][j] is row i (column kn_<heel>), a column's value [r] is row r
    kn = f.path[:2] == ("cross_curves", "kn_m") or (f.path[:1] == ("cross_curves_at_trim",) and "kn_m" in f.path)
    r = ints[-2] if kn and len(ints) >= 2 else ints[-1] if ints else None
    if r is None:
        return Located(f, name, None)
    # (the finding's column may be a converted one, e.g. fsi_m4 typed as fsm_tm: the row is what counts)
    # The row is found by its abscissa, which no convention changes (displacement, volume): a
    # converted table may have been reversed (ullage) or gained a level-0 row.
    anchor = _anchor(f, vessel, r)
    if anchor is None or anchor[0] not in header:
        return Located(f, name, None)
    k = header.index(anchor[0])
    for line, cells in data:
        x = _float(cells[k]) if k < len(cells) else None
        if x is not None and abs(x - anchor[1]) <= 1e-6 * max(1.0, abs(anchor[1])):
            return Located(f, name, line)
    return Located(f, name, None)


def _anchor(f: Finding, vessel: Vessel, r: int) -> tuple[str, float] | None:
    """(CSV column, value) that identifies the model's row ``r`` of the finding's table."""
    p = f.path
    try:
        if p[0] == "hydrostatics":
            return "displacement_t", float(vessel.hydrostatics.displacement_t[r])
        if p[0] == "cross_curves":
            return "displacement_t", float(vessel.cross_curves.displacement_t[r])
        if p[0] in ("hydrostatics_at_trim", "cross_curves_at_trim") and vessel.trimmed is not None:
            # the n-th entry in the file is the n-th table at a trim other than 0 (trims increase in file order)
            hydro = p[0] == "hydrostatics_at_trim"
            sets = vessel.trimmed.hydrostatics if hydro else vessel.trimmed.cross_curves
            even = vessel.hydrostatics if hydro else vessel.cross_curves
            return "displacement_t", float([t for t in sets if t is not even][p[1]].displacement_t[r])
        if p[0] in ("downflooding", "limit_curve"):
            curve = vessel.downflooding if p[0] == "downflooding" else vessel.limit_curve
            return "displacement_t", float(curve.displacement_t[r])
        if p[0] == "tank" and len(p) > 2 and p[2] == "calibration":
            return "volume_m3", float(vessel.tanks[p[1]].calibration.volume_m3[r])
    except IndexError:
        return None
    return None


def _float(s: str) -> float | None:
    try:
        return float(s)
    except ValueError:
        return None
