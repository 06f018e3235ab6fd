"""The demo vessels, read once per test process.

Reading and validating the Demo Islander's profile costs about 0.3 s of CPU (half of it the hull
geometry file it names); forty-odd tests and fixtures used to read it again each time.  The model is
immutable (frozen dataclasses, read-only arrays: ``deckload.core.model``), so one copy is safely
shared by every test in the process, the way a session-scoped fixture would share it; these
functions also serve helpers that are not fixtures.  A test of the reading itself (``test_profiles``,
``test_ui_launch`` through ``load_inputs``, the command line) still reads the file.
"""

from __future__ import annotations

import functools

from deckload.core.model import Vessel
from deckload.io import paths
from deckload.io.profiles import load_profile


@functools.cache
def demo_vessel() -> Vessel:
    """The Demo Islander as ``load_profile(paths.DEMO_PROFILE)`` reads it."""
    return load_profile(paths.DEMO_PROFILE)


def demo_departure():
    """The Demo Islander and her stock departure condition, as the screen tests start from."""
    from deckload.io.profiles import load_condition

    v = demo_vessel()
    return v, load_condition(paths.DEMO_CONDITIONS["departure"], v)


def departure_app(tmp_path, condition=None, officer: str = "TS"):
    """The loading screen on the Demo Islander's departure (or ``condition``), saving and logging
    under ``tmp_path``, signed on as ``officer``."""
    from deckload.ui.launch import create_app

    v, c = demo_departure()
    return create_app(v, condition or c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer=officer)


def status_text(app) -> str:
    """The loading screen's status line as shown."""
    return app.screen.query_one("#status").plain()


@functools.cache
def trawler_vessel() -> Vessel:
    """The Demo Trawler as ``load_profile(paths.TRAWLER_PROFILE)`` reads it."""
    return load_profile(paths.TRAWLER_PROFILE)


def copy_of_demo(folder, stem: str):
    """A copy of a demo vessel's browsable files (``vessel_profiles/<stem>*``: the profile, its
    CSV tables or hull geometry, its stock conditions) in ``folder``, made if need be, for tests
    that change or write beside them; the copied profile's path."""
    import shutil
    from pathlib import Path

    folder = Path(folder)
    folder.mkdir(parents=True, exist_ok=True)
    for f in (Path(__file__).resolve().parent.parent / "vessel_profiles").glob(f"{stem}*"):
        (shutil.copytree if f.is_dir() else shutil.copy)(f, folder / f.name)
    return folder / f"{stem}.toml"
