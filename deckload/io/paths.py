"""Where deckload finds its demo vessels and keeps its logs and working conditions.

This module only computes paths; it creates nothing.  The demo vessels ship as
package data (``deckload/data``) so that ``pip install .`` finds them from any
working folder; ``vessel_profiles/`` in the checkout is the browsable copy.
"""

from __future__ import annotations

import hashlib
import os
import re
from pathlib import Path

PACKAGE_DATA = Path(__file__).resolve().parent.parent / "data"
DEMO_PROFILE = PACKAGE_DATA / "demo_islander.toml"
DEMO_CONDITIONS = {
    "departure": PACKAGE_DATA / "demo_islander.departure.condition.toml",
    "midvoyage": PACKAGE_DATA / "demo_islander.midvoyage.condition.toml",
    "arrival": PACKAGE_DATA / "demo_islander.arrival.condition.toml",
    "light": PACKAGE_DATA / "demo_islander.light.condition.toml",
}
TRAWLER_PROFILE = PACKAGE_DATA / "demo_trawler.toml"
"""The second demo vessel, an invented stern trawler entered from booklet-style tables (CSV)."""
TRAWLER_CONDITIONS = {
    "departure": PACKAGE_DATA / "demo_trawler.departure.condition.toml",
    "grounds": PACKAGE_DATA / "demo_trawler.grounds.condition.toml",
    "arrival": PACKAGE_DATA / "demo_trawler.arrival.condition.toml",
}
DEMO_VESSELS = {
    "demo": (DEMO_PROFILE, DEMO_CONDITIONS),
    "trawler": (TRAWLER_PROFILE, TRAWLER_CONDITIONS),
}
"""Shorthand names on the command line: name → (profile, {condition key: file})."""


def demo_start_condition(profile: Path | None) -> Path | None:
    """The condition a packaged demo vessel opens on when none is saved: its departure.

    ``None`` stands for the default demo vessel; any other profile gets ``None`` back.
    """
    if profile is None:
        return DEMO_CONDITIONS["departure"]
    for demo_profile, conditions in DEMO_VESSELS.values():
        if Path(profile).resolve() == demo_profile.resolve():
            return conditions["departure"]
    return None


def _checkout_root(start: Path) -> Path | None:
    """The deckload project checkout containing ``start``, if any."""
    for d in (start, *start.parents):
        if (d / "pyproject.toml").is_file() and (d / "deckload").is_dir() and (d / "logs").is_dir():
            return d
    return None


def exists_quietly(path: Path) -> bool:
    """``Path.exists`` that says False where it would raise (a folder on the way that cannot be
    searched, a name too long): the command then reads or writes the file and says why it cannot."""
    try:
        return path.exists()
    except (OSError, ValueError):
        return False


def is_file_quietly(path: Path) -> bool:
    """``Path.is_file``, False where it would raise (as :func:`exists_quietly`)."""
    try:
        return path.is_file()
    except (OSError, ValueError):
        return False


def free_name(path: Path, suffix: str) -> Path:
    """``path`` + ``suffix``, or + ``suffix.2``, ``.3`` … : a name that holds nothing yet."""
    candidate = path.with_name(path.name + suffix)
    n = 1
    while candidate.exists():
        n += 1
        candidate = path.with_name(f"{path.name}{suffix}.{n}")
    return candidate


def data_home() -> Path:
    """Per-user data folder: $DECKLOAD_HOME, else $XDG_DATA_HOME/deckload, else ~/.local/share/deckload."""
    if os.environ.get("DECKLOAD_HOME"):
        return Path(os.environ["DECKLOAD_HOME"])
    xdg = os.environ.get("XDG_DATA_HOME")
    base = Path(xdg) if xdg else Path.home() / ".local" / "share"
    return base / "deckload"


def log_dir(cwd: Path | None = None) -> Path:
    """Log folder: $DECKLOAD_LOG_DIR, else ./logs inside a project checkout, else the per-user folder."""
    if os.environ.get("DECKLOAD_LOG_DIR"):
        return Path(os.environ["DECKLOAD_LOG_DIR"])
    root = _checkout_root((cwd or Path.cwd()).resolve())
    if root is not None:
        return root / "logs"
    return data_home() / "logs"


def working_dir(cwd: Path | None = None) -> Path:
    """Where the loading screen keeps each vessel's working condition (beside the logs)."""
    return log_dir(cwd) / "working"


def working_file(work_dir: Path, vessel_name: str) -> Path:
    """A vessel's working condition: ``<slug>-<hash>.condition.toml``.

    The slug keeps letters of any script (for people reading the folder); the first 10 hex
    digits of the SHA-256 of the full name make the name unique per vessel, so that "Bjørn"
    and "Björn", or two names in a script the slug cannot show, never share one file.
    """
    import hashlib


    digest = hashlib.sha256(vessel_name.encode("utf-8")).hexdigest()[:10]
    return work_dir / f"{vessel_slug(vessel_name)[:60]}-{digest}.condition.toml"


def legacy_working_file(work_dir: Path, vessel_name: str) -> Path:
    """The name earlier versions used (ASCII letters and digits only; shared by some vessels)."""
    import re

    slug = re.sub(r"[^a-z0-9]+", "-", vessel_name.lower()).strip("-") or "vessel"
    return work_dir / f"{slug}.condition.toml"


def saved_conditions_dir(work_dir: Path, vessel_name: str) -> Path:
    """Conditions an officer saved under a name of their own: one folder per vessel, beside the
    vessel's working file (``<slug>-<hash>.conditions/``), one ``<name>.condition.toml`` each."""
    w = working_file(work_dir, vessel_name)
    return w.with_name(w.name.removesuffix(".condition.toml") + ".conditions")


def reports_dir(log_folder: Path) -> Path:
    """Reports printed from the loading screen: ``reports/`` beside the logs."""
    return log_folder / "reports"


def vessel_slug(vessel_name: str) -> str:
    """File-name form of a vessel name: 'Demo Islander' → 'demo-islander', 'Øya 1' → 'øya-1'.

    Letters of any script are kept; a name with none gets a stable name from its hash.
    """
    slug = re.sub(r"[\W_]+", "-", vessel_name.casefold()).strip("-")
    if not slug:
        slug = "vessel-" + hashlib.sha256(vessel_name.encode("utf-8")).hexdigest()[:12]
    return slug
