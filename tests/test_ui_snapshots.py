"""Snapshots of the loading screen on the demo vessel's departure condition (pytest-textual-snapshot).

Regenerate after an intended change of the screen with ``pytest tests/test_ui_snapshots.py --snapshot-update``
and look at the SVGs before committing them.
"""

from __future__ import annotations

import pytest

from deckload import paths
from deckload.profiles import load_condition, load_profile
from deckload.ui.launch import create_app


@pytest.fixture
def demo_app(tmp_path):
    vessel = load_profile(paths.DEMO_PROFILE)
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def test_main_screen_120x40(snap_compare, demo_app):
    assert snap_compare(demo_app, terminal_size=(120, 40))


def test_main_screen_80x24(snap_compare, demo_app):
    assert snap_compare(demo_app, terminal_size=(80, 24))


def test_main_screen_80x24_curve_after_a_ballast_edit(snap_compare, demo_app):
    assert snap_compare(demo_app, terminal_size=(80, 24), press=["enter", *"20%", "enter", "g"])


def test_transfer_preview_120x40(snap_compare, demo_app):
    assert snap_compare(demo_app, terminal_size=(120, 40), press=["t", *"5t"])
