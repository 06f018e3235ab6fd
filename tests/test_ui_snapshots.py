"""Snapshots of the loading screen on the demo vessel's departure condition (pytest-textual-snapshot).

Regenerate after an intended change of the screen with ``pytest tests/test_ui_snapshots.py --snapshot-update``
and look at the SVGs before committing them.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui.launch import create_app
from demo_vessels import demo_vessel


@pytest.fixture
def demo_app(tmp_path):
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


async def _keys_then_saved(pilot, keys=()):
    """Press the keys, then wait until every change has landed on disk: the title says
    "saving…" until it has, and a snapshot must not depend on the writer thread's timing."""
    await pilot.pause()  # run_before comes before the screen is ready for keys
    for key in keys:
        await pilot.press(key)
        await pilot.pause()
    quiet = 0
    for _ in range(500):  # settled: nothing pending at three looks in a row
        quiet = quiet + 1 if not pilot.app.session.saves_pending else 0
        if quiet == 3:
            break
        await pilot.pause(0.02)
    await pilot.pause()


def test_main_screen_120x40(snap_compare, demo_app):
    assert snap_compare(demo_app, terminal_size=(120, 40))


def test_main_screen_80x24(snap_compare, demo_app):
    assert snap_compare(demo_app, terminal_size=(80, 24))


def test_main_screen_80x24_curve_after_a_ballast_edit(snap_compare, demo_app):
    assert snap_compare(demo_app, terminal_size=(80, 24),
                        run_before=lambda pilot: _keys_then_saved(pilot, ["enter", *"20%", "enter", "g"]))


def test_transfer_preview_120x40(snap_compare, demo_app):
    """WB2P → its receiving tank, 5 t: the before/after with every criterion."""
    assert snap_compare(demo_app, terminal_size=(120, 40), press=["down"] * 9 + ["t", *"5t"])


def test_transfer_preview_80x24(snap_compare, demo_app):
    """WB2P → WB1P 5 t: every criterion row and the message line fit at 80×24 (a QA trial found the
    last row hidden)."""
    assert snap_compare(demo_app, terminal_size=(80, 24), press=["down"] * 9 + ["t", *"5t"])


def test_set_dialog_with_its_preview_80x24(snap_compare, demo_app):
    """The set dialog's whole hint, and what 0.3m comes to before ⏎ (cursor moved to LO1)."""
    keys = ["down"] * 16 + ["enter", *"0.3m"]
    assert snap_compare(demo_app, terminal_size=(80, 24), press=keys)


def test_every_snapshot_file_belongs_to_a_test():
    """A snapshot file that no test compares against is a check that silently stopped running.
    syrupy fails a run in one process that leaves one, but not a run split over pytest-xdist workers
    (its unused-snapshot report is not merged across workers), so the rule is kept here for both."""
    import inspect
    from pathlib import Path

    here = Path(__file__)
    folder = here.parent / "__snapshots__" / here.stem
    snapshot_tests = {name for name, f in globals().items()
                      if name.startswith("test_") and "snap_compare" in inspect.signature(f).parameters}
    files = {p.name.split("[")[0].removesuffix(".svg") for p in folder.iterdir()}
    assert snapshot_tests, "no snapshot test found in this module"
    assert files == snapshot_tests, f"files without a test: {sorted(files - snapshot_tests)}; " \
                                    f"tests without a file: {sorted(snapshot_tests - files)}"
