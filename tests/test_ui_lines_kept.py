"""The panels' lines kept for the same printed words (ui/views.py, ui/verdict.py, ui/main_screen.py).

A key on the loading screen rebuilds every panel's lines; most of them print the same words as
before (a 1 % nudge of one tank leaves KM, the deadweight, most criteria as they were).  Those
lines are kept by their words and handed back as the same Text, which the panel then compares by
identity and does not draw again.  These tests check that a line kept is the line made afresh
(after a walk of edits that fills the caches with other conditions' lines), that a line whose
words did not change is the same object, and that ``views.pieces`` makes the Text rich's
``Text.append`` makes, control codes and empty pieces included.

Only the drawing's consistency with itself is checked (no outside reference).
"""

from __future__ import annotations

import random

from rich.style import Style
from rich.text import Text

from deckload.core.stability import evaluate
from deckload.ui import entry, main_screen, verdict, views
from deckload.ui.main_screen import gz_title_lines
from demo_vessels import demo_departure, trawler_vessel


def _drawn(lines) -> list[tuple]:
    return [(t.plain, list(t.spans), t.style) for t in lines]


def _clear() -> None:
    main_screen._GZ_TITLES.clear()
    for kept in (views._pair_line, views._tables_line, verdict._assessed_line, verdict._unassessed_line,
                 verdict._wrapped_note, verdict._group_heading, verdict._not_assessed_lines):
        kept.cache_clear()


def _walk():
    """The departure and the conditions of a few nudges of each of her first tanks, with results."""
    vessel, condition = demo_departure()
    out = [(vessel, condition, evaluate(vessel, condition))]
    for tank in vessel.tanks[:4]:
        for step in (5.0, -3.0, 1.0):
            condition = entry.nudge_tank(condition, tank, step, vessel)
            out.append((vessel, condition, evaluate(vessel, condition)))
    return out


def _panels(vessel, condition, result, width: int) -> list[list[tuple]]:
    return [_drawn(views.afloat_lines(vessel, condition, result, False, width)),
            _drawn(views.afloat_lines(vessel, condition, result, True, width)),
            _drawn(verdict.criteria_lines(result, False, width)),
            _drawn(verdict.criteria_lines(result, False, width, 12)),
            _drawn(gz_title_lines(result, width)), [_drawn([views.gz_caption(result)])]]


def test_a_kept_line_is_the_line_made_afresh():
    walk = _walk()
    for width in (30, 53, 80):
        _clear()
        fresh = []
        for vessel, condition, result in walk:  # each made with nothing kept
            _clear()
            fresh.append(_panels(vessel, condition, result, width))
        _clear()
        for vessel, condition, result in walk:  # warm: the walk's lines, and back again
            _panels(vessel, condition, result, width)
        for (vessel, condition, result), made in zip(walk, fresh):
            assert _panels(vessel, condition, result, width) == made


def test_a_line_whose_words_did_not_change_is_the_same_object():
    vessel, condition = demo_departure()
    tank = vessel.tanks[0]
    before = evaluate(vessel, condition)
    after = evaluate(vessel, entry.nudge_tank(condition, tank, 1.0, vessel))
    for width in (40, 53):
        a, b = views.afloat_lines(vessel, condition, before, False, width), views.afloat_lines(
            vessel, condition, after, False, width)
        same = [i for i, (x, y) in enumerate(zip(a, b)) if x == y]
        assert len(same) >= 3  # KM and the mark at least; not the whole panel
        assert all(a[i] is b[i] for i in same[1:])  # (the title is made each time)
        # each criterion's line, each set's heading and the not-assessed lines (a note whose words
        # changed is made again, every line of it)
        ca, cb = verdict.criteria_lines(before, False, width), verdict.criteria_lines(after, False, width)
        assert len(ca) == len(cb)
        lines = [verdict._criterion_line(c, False, width < 48) for c in after.criteria]
        kept = [verdict._criterion_line(c, False, width < 48) for c in before.criteria]
        same = [i for i, (x, y) in enumerate(zip(kept, lines)) if x == y]
        assert same and all(kept[i] is lines[i] for i in same)
        assert any(x is y for x, y in zip(ca, cb) if x.plain.startswith(" ▸"))
        assert any(x is y for x, y in zip(ca, cb) if x.plain.startswith(" Not assessed"))


def test_the_trawler_lines_kept_are_the_lines_made_afresh():
    """The trawler's criteria (fishing sets, notes that wrap, unassessable ones) the same way."""
    from deckload.io import paths
    from deckload.io.profiles import load_condition

    vessel = trawler_vessel()
    for name in paths.TRAWLER_CONDITIONS:
        condition = load_condition(paths.TRAWLER_CONDITIONS[name], vessel)
        result = evaluate(vessel, condition)
        for width in (30, 53):
            _clear()
            made = _panels(vessel, condition, result, width)
            assert _panels(vessel, condition, result, width) == made


def test_cells_is_rich_cell_len():
    """widgets.cells gives rich's own cell_len for our symbols, wide characters and control codes."""
    from rich.cells import cell_len

    from deckload.ui.widgets import _ONE_CELL, cells

    rng = random.Random(3)
    alphabet = sorted(_ONE_CELL) + ["漢", "\u200d", "\ufe0f", "\x07", "é", "👍", "\t", "ｱ"]
    for _ in range(2000):
        text = "".join(rng.choice(alphabet) for _ in range(rng.randrange(0, 30)))
        assert cells(text) == cell_len(text), repr(text)


def test_pieces_is_rich_append():
    rng = random.Random(7)
    styles = [None, "", Style(bold=True), Style(color="red"), "bold"]
    words = ["", " ", "GM", "0.412 ", "x\x07y", "\x1b[31m", "θf 39.6°", "│"]
    for _ in range(500):
        first, style = rng.choice(words), rng.choice(styles[1:])
        rest = [(rng.choice(words), rng.choice(styles)) for _ in range(rng.randrange(0, 6))]
        made = views.pieces(style, first, *rest)
        want = Text(first, style)
        for text, st in rest:
            want.append(text, st)
        assert (made.plain, made.spans, made.style) == (want.plain, want.spans, want.style)


async def test_the_focused_cursor_line_is_drawn_as_before_without_rich_rendering(tmp_path, monkeypatch):
    """The board's cursor line, focused: each piece of the line on the board's style with the
    cursor's colours over it, as the line drawn by rich, coloured and put on the board's style
    (the way it was drawn before) gives it; without rich's Text.render (widgets._strip)."""
    from rich.segment import Segment
    from rich.style import Style
    from textual.strip import Strip

    from deckload.ui import widgets
    from deckload.ui.widgets import LoadBoard, _strip, fit_width
    from demo_vessels import departure_app

    app = departure_app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        board = app.screen.query_one(LoadBoard)
        assert board.has_focus
        for key in ("down", "plus", "down", "down", "minus"):
            await pilot.press(key)
            await pilot.pause()
            own, cursor = board.rich_style, board.get_component_rich_style("board--cursor")
            width = board.scrollable_content_region.width
            text = board.rows[board.cursor].text
            before = _strip(fit_width(text, width), app.console).crop_extend(0, width, None)
            before = Strip([Segment(s.text, (s.style or Style()) + cursor) for s in before], width).apply_style(own)

            def refused(*args):
                raise AssertionError("the cursor line went through rich's rendering")

            monkeypatch.setattr(widgets, "_strip", refused)
            board._strips.clear()
            drawn = board.render_line(board.cursor - int(board.scroll_offset.y))
            monkeypatch.undo()
            assert [(s.text, s.style) for s in drawn] == [(s.text, s.style) for s in before]
            assert drawn.cell_length == width


async def test_a_change_of_the_cursor_style_is_drawn(tmp_path):
    """The cursor's style is kept with the board's look: a change of the cursor component's own
    styles (here an inline colour, as a stylesheet or theme change moves the same count) is drawn."""
    from textual.color import Color

    from deckload.ui.widgets import LoadBoard
    from demo_vessels import departure_app

    app = departure_app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        board = app.screen.query_one(LoadBoard)
        y = board.cursor - int(board.scroll_offset.y)
        board.render_lines(board.region.reset_offset.intersection(board.region.reset_offset))
        before = {s.style.color for s in board.render_line(y)}
        board._component_styles["board--cursor"].inline.color = Color.parse("#123456")
        board.refresh()
        await pilot.pause()
        board.render_lines(board.region.reset_offset)
        after = {s.style.color for s in board.render_line(y)}
        want = board.get_component_rich_style("board--cursor").color
        assert want not in before and after == {want}


async def test_a_nudge_reads_the_cursor_style_no_more(tmp_path, monkeypatch):
    """A nudge repaints the board (its _repaint clears textual's cache of component styles, as
    refresh does): the cursor's style is read again only when a style it is made from moved."""
    from deckload.ui.widgets import LoadBoard
    from demo_vessels import departure_app

    app = departure_app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        reads = []
        read = LoadBoard.get_component_rich_style
        monkeypatch.setattr(LoadBoard, "get_component_rich_style",
                            lambda self, *a, **k: reads.append(a) or read(self, *a, **k))
        for key in ("plus", "minus", "plus"):
            await pilot.press(key)
            await pilot.pause()
        assert reads == []


def test_the_board_keeps_each_row_whose_line_is_kept():
    """A nudge of one tank gives the board new rows for that tank, its group's total and the
    deadweight only: every other row is the Row of the board before (not a new record of the same
    line), and the board made afresh is the same board."""
    vessel, condition = demo_departure()
    tank = vessel.tanks[0]
    after_c = entry.nudge_tank(condition, tank, 1.0, vessel)
    before = views.board_rows(vessel, condition, evaluate(vessel, condition), False, width=66)
    after = views.board_rows(vessel, after_c, evaluate(vessel, after_c), False, width=66)
    kept = [i for i, (a, b) in enumerate(zip(before, after)) if a is b]
    assert len(before) == len(after) and len(after) - len(kept) <= 6 and len(kept) > len(after) // 2
    views._ROWS.clear()
    afresh = views.board_rows(vessel, after_c, evaluate(vessel, after_c), False, width=66)
    assert [(r.key, r.text.plain, r.text.spans) for r in afresh] == [(r.key, r.text.plain, r.text.spans) for r in after]


async def test_a_nudge_reads_each_panels_geometry_twice_at_most(tmp_path, monkeypatch):
    """Each read of a widget's size walks to its screen and through the compositor's map: a panel
    reads it once when it builds its lines (and compares them) and once when it is drawn (the title
    is drawn twice, again once the save has landed; the screen reads the criteria panel's height
    to see whether it must be laid out again)."""
    import collections

    from textual.widget import Widget

    from deckload.ui.widgets import LinePanel
    from demo_vessels import departure_app

    app = departure_app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        reads = collections.Counter()
        region = Widget.region.fget

        def counted(self):
            if isinstance(self, LinePanel):
                reads[self.id] += 1
            return region(self)

        monkeypatch.setattr(Widget, "region", property(counted))
        await pilot.press("plus")
        await pilot.pause()
        assert reads["afloat"] >= 1, reads
        assert all(n <= 2 for p, n in reads.items() if p not in ("titlebar", "criteria")), reads
        assert reads["titlebar"] <= 4 and reads["criteria"] <= 3, reads


async def test_a_line_that_comes_back_is_not_made_again(tmp_path, monkeypatch):
    """A panel keeps the strip of each line it made by the line's identity (kept lines are shared and
    never modified): a line shown again, on its row or another, is not made again; the same words
    in a new Text are, and a change of the panel's width or style makes every line again."""
    from deckload.ui import widgets
    from deckload.ui.widgets import LinePanel
    from demo_vessels import departure_app

    app = departure_app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        panel = app.screen.query_one("#status", LinePanel)
        made = []
        line_strip = widgets._line_strip
        monkeypatch.setattr(widgets, "_line_strip", lambda text, *a: made.append(text) or line_strip(text, *a))
        a, b = Text(" one", "bold"), Text(" two", "italic")
        panel.set_lines([a])
        first = panel.render_line(0)
        panel.set_lines([b])
        panel.render_line(0)
        panel.set_lines([a])
        assert panel.render_line(0) is first and made == [a, b]
        again = Text(" one", "bold")  # equal to a, another object
        panel.set_lines([b])
        panel.render_line(0)
        panel.set_lines([again])
        drawn = panel.render_line(0)
        assert drawn is not first and [(s.text, s.style) for s in drawn] == [(s.text, s.style) for s in first]
        assert len(made) == 3 and made[-1] is again
        panel._style = None  # (as a theme's change: the panel's style is read again and differs)
        await pilot.resize_terminal(100, 40)
        await pilot.pause()
        panel.set_lines([a])
        await pilot.pause()
        made.clear()
        panel.render_line(0)
        assert made in ([a], [])  # made at the new width once: by the frame just drawn or here
        assert panel.render_line(0).cell_length == panel.size.width
