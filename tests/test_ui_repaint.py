"""A key repaints what it changed and nothing else (textual pilot, demo vessel).

The loading screen hands every panel its new lines on each change; a panel compares them
with those shown and asks for a repaint of the lines that differ only.  Here a nudge of one
ballast tank: the panels and board lines whose text did not change must keep their finished
strips (not made again) and ask for no repaint; those that changed must show the new text.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui.launch import create_app
from deckload.ui.widgets import LinePanel, LoadBoard
from demo_vessels import demo_vessel


@pytest.fixture
def app(tmp_path):
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def _watch_refreshes(widget, log: list) -> None:
    """Record every repaint the widget asks for (the regions, or 'all')."""
    original = widget.refresh

    def refresh(*regions, **kwargs):
        log.append(regions or "all")
        return original(*regions, **kwargs)

    widget.refresh = refresh


async def test_a_nudge_repaints_only_the_lines_it_changed(app):
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        screen = app.loading_screen
        panels = {p.id: p for p in screen.query(LinePanel)}
        board = screen.query_one(LoadBoard)
        assert board.cursor_key[0] == "tank"  # the first line the cursor rests on is a ballast tank
        await pilot.pause()
        before = {pid: [t.plain for t in p.lines] for pid, p in panels.items()}
        strips = {pid: dict(p._strips) for pid, p in panels.items()}
        board_before = [r.text.plain for r in board.rows]
        board_strips = dict(board._strips)
        asked: dict[str, list] = {pid: [] for pid in panels}
        for pid, p in panels.items():
            _watch_refreshes(p, asked[pid])
        board_asked: list = []
        _watch_refreshes(board, board_asked)

        await pilot.press("plus")
        await pilot.pause()

        after = {pid: [t.plain for t in p.lines] for pid, p in panels.items()}
        unchanged = [pid for pid in panels if after[pid] == before[pid]]
        changed = [pid for pid in panels if after[pid] != before[pid]]
        # The nudge moves the numbers (afloat, status line) and leaves the warning strip as it was.
        assert "afloat" in changed and "status" in changed and "alerts" in unchanged
        for pid in unchanged:
            assert asked[pid] == [], f"{pid}: its lines did not change, yet it asked for a repaint"
            assert all(panels[pid]._strips.get(y) is s for y, s in strips[pid].items()), \
                f"{pid}: its lines did not change, yet they were made again"
        for pid in changed:
            rows_asked = sorted({r.y for call in asked[pid] if call != "all" for r in call})
            rows_changed = [y for y, (a, b) in enumerate(zip(before[pid], after[pid])) if a != b]
            if len(before[pid]) == len(after[pid]):
                assert rows_asked == rows_changed, f"{pid}: repainted {rows_asked}, changed {rows_changed}"
        # The board: the nudged tank's line, its group's total and the deadweight lines changed (a handful,
        # not the board), and exactly those were repainted.
        board_after = [r.text.plain for r in board.rows]
        rows_changed = [i for i, (a, b) in enumerate(zip(board_before, board_after)) if a != b]
        assert board.cursor in rows_changed and len(rows_changed) <= 4 < len(board_after)
        top = int(board.scroll_offset.y)
        rows_asked = sorted({r.y + top for call in board_asked if call != "all" for r in call})
        assert rows_asked == rows_changed
        kept = [i for i in board_strips if i not in rows_changed]
        assert kept and all(board._strips.get(i) is board_strips[i] for i in kept)
