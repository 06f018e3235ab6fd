"""The plausibility audit of a profile file: findings located in the file and worded for print.

:func:`deckload.core.audit.audit` judges the validated model (pure); this module adds
where each finding sits — the profile file and line (tomlcheck's line finder), or the
CSV file and line when the table was read from a CSV file beside the profile — and
the one-line wording used by ``deckload check`` and the loading screen::

    fv.toml:21: ERROR lightship.lcg_m = -2.1 m from AP: a lightship LCG must lie … ; compare with …
"""

from __future__ import annotations

import csv
import os
import tomllib
from dataclasses import dataclass
from pathlib import Path

from deckload.core.audit import ERROR, Finding, audit
from deckload.core.model import Vessel
from deckload.tomlcheck import key_lines


@dataclass(frozen=True)
class Located:
    """A finding with the file and line it points at."""

    finding: Finding
    file: str
    line: int | None

    @property
    def is_error(self) -> bool:
        return self.finding.severity == ERROR

    def __str__(self) -> str:
        f = self.finding
        where = f"{self.file}:{self.line}" if self.line else self.file
        return f"{where}: {f.severity.upper()} {f.key} = {f.value}: {f.why}; compare with {f.look}"


def audit_profile(path: str | os.PathLike, vessel: Vessel) -> list[Located]:
    """Audit ``vessel`` (read from ``path``) and locate every finding in its files.

    A file that cannot be re-read (moved meanwhile) only loses the line numbers."""
    findings = audit(vessel)
    if not findings:
        return []
    try:
        text = Path(path).read_text(encoding="utf-8")
    except (OSError, UnicodeDecodeError):
        return [Located(f, str(path), None) for f in findings]
    return locate(findings, str(path), text, vessel)


def locate(findings, filename: str, text: str, vessel: Vessel) -> list[Located]:
    lines = key_lines(text)
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError:
        doc = {}
    out = []
    for f in findings:
        csv_file = _csv_of(doc, f.path)
        if csv_file is not None:
            out.append(_in_csv(f, Path(filename).parent / csv_file, vessel))
            continue
        line = None
        for k in range(len(f.path), 0, -1):
            if f.path[:k] in lines:
                line = lines[f.path[:k]]
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
    """The CSV line of the finding's row: the data row at the model's row index (rows as typed)."""
    name = str(full)
    try:
        with open(full, newline="", encoding="utf-8") as fh:
            rows = [(n, r) for n, r in enumerate(csv.reader(fh), 1) if any(c.strip() for c in r)]
    except (OSError, UnicodeDecodeError, csv.Error):
        return Located(f, name, None)
    if len(rows) < 2:
        return Located(f, name, None)
    header = [c.strip() for c in rows[0][1]]
    data = rows[1:]
    ints = [p for p in f.path if isinstance(p, int)]
    if f.path[:2] == ("cross_curves", "kn_m") and len(ints) == 2:
        i, j = ints
        heel = float(vessel.cross_curves.heel_deg[j])
        col = next((c for c in header if c.startswith("kn_") and _float(c[3:]) == heel), None)
        r = i
    else:
        col = next((p for p in reversed(f.path) if isinstance(p, str)), None)
        r = ints[-1] if ints else None
    if r is None or col not in header:
        return Located(f, name, None)
    # A converted table may have gained a row (a level-0 row below a table starting above the
    # bottom) or been reversed (ullage): only a row count that matches is trusted.
    n_model = _rows_in_model(f, vessel)
    if n_model is None or n_model != len(data) or not 0 <= r < len(data):
        return Located(f, name, None)
    return Located(f, name, data[r][0])


def _rows_in_model(f: Finding, vessel: Vessel) -> int | None:
    p = f.path
    if p[0] == "hydrostatics":
        return len(vessel.hydrostatics.draft_m)
    if p[0] == "cross_curves":
        return len(vessel.cross_curves.displacement_t)
    if p[0] == "tank" and len(p) > 2 and p[2] == "calibration":
        return len(vessel.tanks[p[1]].calibration.sounding_m)
    return None


def _float(s: str) -> float | None:
    try:
        return float(s)
    except ValueError:
        return None
