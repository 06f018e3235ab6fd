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
from deckload.ui.main_screen import MIN_CURVE_ROWS
from deckload.ui.widgets import LinePanel, LoadBoard
from demo_vessels import demo_vessel


@pytest.fixture
def app(tmp_path):
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def _watch_refreshes(monkeypatch, logs: dict) -> None:
    """Record every repaint a watched widget asks for (the regions, or 'all'), in ``logs[widget]``:
    through the panels' own ``widgets._repaint`` or through textual's ``refresh`` directly."""
    from textual.widget import Widget

    from deckload.ui import widgets

    refresh, repaint = Widget.refresh, widgets._repaint
    inside = []

    def refreshed(self, *regions, **kwargs):
        if self in logs and kwargs.get("repaint", True) and not inside:
            logs[self].append(regions or "all")
        return refresh(self, *regions, **kwargs)

    def repainted(widget, *regions):
        if widget in logs:
            logs[widget].append(regions or "all")
        inside.append(widget)
        try:
            return repaint(widget, *regions)
        finally:
            inside.pop()

    monkeypatch.setattr(Widget, "refresh", refreshed)
    monkeypatch.setattr(widgets, "_repaint", repainted)


async def test_a_nudge_repaints_only_the_lines_it_changed(app, monkeypatch):
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
        board_asked: list = []
        _watch_refreshes(monkeypatch, {**{p: asked[pid] for pid, p in panels.items()}, board: board_asked})

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


@pytest.mark.parametrize("size", [(120, 40), (80, 24), (160, 50)])
async def test_the_first_frame_drawn_is_the_whole_screen(app, monkeypatch, size):
    """textual draws a layout's frame before it sends the widgets their Resize event, so panels that
    built their lines only on that event were empty in the first frame, and the criteria panel took
    its height one layout later.  The first frame drawn of the loading screen must already be the
    screen as it settles: every line of the board and the panels, and the criteria/curve split.
    Two things may still come a frame later, as before: the board's scroll bar thumb (textual
    decides to show a scroll bar after the layout that sized the board) and the message line, which
    turns from the start-up hint to the line the cursor rests on."""
    from textual.app import App

    frames: list[list[str]] = []
    display = App._display

    def spy(self, screen, renderable):
        display(self, screen, renderable)
        if renderable is not None and screen is getattr(self, "loading_screen", None):
            frames.append([strip.text for strip in screen._compositor.render_strips()])

    monkeypatch.setattr(App, "_display", spy)
    async with app.run_test(size=size) as pilot:
        for _ in range(4):
            await pilot.pause()
        screen = app.loading_screen
        final = [strip.text for strip in screen._compositor.render_strips()]
        board = screen.query_one(LoadBoard)
        thumb_x = board.region.right - 2  # the gutter, left of the board's right border
        status_y = screen.query_one("#status").region.y
        first = frames[0]
        assert len(first) == len(final) == size[1]
        for y, (a, b) in enumerate(zip(first, final)):
            if y == status_y:
                continue
            assert [x for x, (p, q) in enumerate(zip(a, b)) if p != q] in ([], [thumb_x]), (y, a, b)
        assert any(line.strip() for line in first[board.region.y:board.region.bottom])
        criteria = screen.query_one("#criteria", LinePanel)
        if size[0] >= 110:  # wide: the criteria panel exactly as tall as its lines, the curve below
            assert criteria.size.height == len(criteria.lines) > 4
            assert screen.query_one("#gz").size.height >= MIN_CURVE_ROWS


@pytest.mark.parametrize("start, size", [((80, 24), (100, 30)), ((80, 24), (81, 24)), ((60, 20), (200, 60))])
async def test_the_message_line_is_drawn_in_the_first_frame_after_widening(app, monkeypatch, start, size):
    """The message line (a panel of one line: the tank under the cursor, a refusal) kept its
    finished line until its Resize event, which textual sends after the layout's frame: that frame
    drew the line kept at the old width, shorter than the panel, and the screen behind filled the
    row, blank; nothing marked the panel dirty after it, so the line stayed blank until the next
    message.  Every frame after widening must show the message on that row, at the new width
    (drawn by textual's own compositor, so that only the panel is tested)."""
    from textual._compositor import Compositor
    from textual.app import App

    frames: list[list[str]] = []
    display = App._display

    def spy(self, screen, renderable):
        display(self, screen, renderable)
        if renderable is not None and screen is getattr(self, "loading_screen", None):
            frames.append([strip.text for strip in Compositor.render_strips(screen._compositor)])

    monkeypatch.setattr(App, "_display", spy)
    async with app.run_test(size=start) as pilot:
        for _ in range(3):
            await pilot.pause()
        status = app.loading_screen.query_one("#status", LinePanel)
        message = status.plain().strip()
        assert message  # the line the cursor rests on
        frames.clear()
        await pilot.resize_terminal(*size)
        for _ in range(3):
            await pilot.pause()
        assert frames and status.size.width == size[0]
        for frame in frames:
            assert len(frame) == size[1] and len(frame[status.region.y]) == size[0]
            assert frame[status.region.y].strip() == message, frame[status.region.y]


async def test_the_criteria_panel_follows_its_number_of_lines(app):
    """Wide: the criteria panel is as tall as the verdict's lines (CSS height auto, the screen
    says how many); a result with another number of lines lays the side panel out again."""
    from deckload.ui.verdict import criteria_lines

    async with app.run_test(size=(160, 50)) as pilot:
        await pilot.pause()
        screen = app.loading_screen
        criteria, gz = screen.query_one("#criteria", LinePanel), screen.query_one("#gz")
        side = screen.query_one("#side")
        before = criteria.size.height
        assert before == len(criteria.lines)
        other = load_condition(paths.DEMO_CONDITIONS["midvoyage"], app.session.vessel)
        screen.commit(other, "midvoyage loaded")
        for _ in range(3):
            await pilot.pause()
        r = app.session.result
        afloat = screen.query_one("#afloat").size.height
        want = criteria_lines(r, False, side.size.width, side.size.height - afloat - MIN_CURVE_ROWS)
        assert len(want) != before  # this pair of demo conditions differs in the count of lines
        assert criteria.size.height == len(criteria.lines) == len(want)
        assert [t.plain for t in criteria.lines] == [t.plain for t in want]
        assert criteria.size.height + gz.size.height + afloat == side.size.height


async def test_the_criteria_panel_keeps_to_its_lines_through_resizes(app):
    """Wide, the criteria panel is exactly as tall as its lines for the side panel's height (what
    ``criteria_lines`` gives for the room the 'Afloat' panel and 10 rows of curve leave, at least 4);
    narrow (under 110 columns) it takes the rest of the side and its lines fit it.  Checked after
    each resize of a sequence that crosses the narrow width both ways."""
    from deckload.ui.verdict import criteria_lines

    async with app.run_test(size=(120, 40)) as pilot:
        for size in [(160, 50), (80, 24), (120, 40), (200, 60), (110, 30), (109, 30), (130, 28)]:
            await pilot.resize_terminal(*size)
            for _ in range(3):
                await pilot.pause()
            screen = app.loading_screen
            criteria, side = screen.query_one("#criteria", LinePanel), screen.query_one("#side")
            if size[0] < 110:
                assert screen.has_class("-narrow") and len(criteria.lines) <= criteria.size.height, size
                continue
            room = max(4, side.size.height - screen.query_one("#afloat").size.height - MIN_CURVE_ROWS)
            want = criteria_lines(app.session.result, False, side.size.width, room)
            assert criteria.size.height == len(criteria.lines) == len(want), size
            assert [t.plain for t in criteria.lines] == [t.plain for t in want], size


async def test_a_change_goes_to_the_writer_only_after_its_frame_is_drawn(app, monkeypatch):
    """The session hands a change's save and log entry to the writer thread once the change's
    frame is drawn (``Session.write_in_background``: the writer's work would otherwise take the
    interpreter from the frame).  textual runs ``call_after_refresh`` callbacks at the screen's
    first idle with no repaint pending: a panel that told the screen of its repaint only at its own
    idle left the screen looking idle, and the writes went to the writer before the frame.  Each
    nudge here must reach the terminal before its writes are handed over."""
    from textual.app import App

    events: list[str] = []
    display = App._display

    def spy(self, screen, renderable):
        display(self, screen, renderable)
        if renderable is not None:
            events.append("frame")

    monkeypatch.setattr(App, "_display", spy)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        session = app.loading_screen.session
        commit, release = session.commit, session.release_writes

        def committed(*args, **kwargs):
            events.append("change")
            return commit(*args, **kwargs)

        def released():
            if session._held:
                events.append("writes")
            release()

        monkeypatch.setattr(session, "commit", committed)
        monkeypatch.setattr(session, "release_writes", released)
        for key in ("plus", "minus", "plus"):
            await pilot.press(key)
            await pilot.pause()
        session.flush()
    # (flushing at the end hands over one more: the run of nudges settles into its log entry)
    changes = [i for i, e in enumerate(events) if e == "change"]
    assert len(changes) == 3, events
    for c in changes:
        w = events.index("writes", c)
        assert "frame" in events[c:w], events
