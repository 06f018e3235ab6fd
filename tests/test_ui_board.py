"""The loading board on the demo vessel as it is painted: the IS-rule mark, group heading rows,
the deadweight breakdown by kind (textual pilot, App.run_test)."""

from __future__ import annotations

import pytest

from deckload import paths
from deckload.profiles import load_condition, load_profile
from deckload.ui.launch import create_app
from deckload.ui.widgets import LoadBoard


@pytest.fixture
def app(tmp_path):
    vessel = load_profile(paths.DEMO_PROFILE)
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def painted(board: LoadBoard) -> list[str]:
    """The board's lines exactly as painted in its content region (what the officer sees)."""
    return ["".join(seg.text for seg in board.render_line(y)) for y in range(board.scrollable_content_region.height)]


def ruled_tanks(app) -> set[str]:
    """Tanks whose FSM the IS 2008 B 3.1 rule sets (assumed/maximum), not the actual level."""
    return {t.id for t in app.session.result.tanks
            if t.fs_rule.startswith(("assumed", "variable", "nominally full cargo"))}


@pytest.mark.parametrize("size", [(120, 40), (80, 24)])
async def test_the_rule_mark_survives_scrolling_and_narrow_screens(app, size):
    async with app.run_test(size=size) as pilot:
        board = app.screen.query_one(LoadBoard)
        ruled = ruled_tanks(app)
        assert {"FO1P", "CF2S"} <= ruled  # the demo's fuel (variable level) and cargo (nominally full) tanks
        seen: set[str] = set()
        for key in ("home", *["pagedown"] * 6, "end"):  # every scroll position the keys reach
            await pilot.press(key)
            await pilot.pause()
            for line in painted(board):
                words = line[1:].split()
                if words and words[0] in ruled:
                    assert line.rstrip().endswith("*"), f"{size}: mark lost on {line!r}"
                    seen.add(words[0])
                elif words and words[0] in {t.id for t in app.session.vessel.tanks}:
                    assert not line.rstrip().endswith("*"), line
        assert seen == ruled  # every ruled tank was painted, with its mark, at some scroll position
        assert board.scroll_offset.y > 0 or size == (120, 40)  # 80×24 really scrolled
