"""The criteria panel never cuts a line silently (found by a real-terminal trial on the Demo Trawler):
at 200×60 the θ0 note read "limit min(16°, 0.8 × deck edge 17.8°); P 504 Pa, A" and stopped,
losing the windage area, its lever and lw1; at 80 and 100 columns a set's heading read
"▸ B 2.1 fishing vessel crite met".  A note now wraps onto indented lines where the panel has
rows to spare, a line still too wide ends in '…' with no word split (widgets.fit_width), and a
heading shortens the set's title, never its verdict word.  These tests check what the panel
shows against the Result it was given, not the numbers (the engine's tests do that)."""

from __future__ import annotations

import re

import pytest

from deckload.core.stability import evaluate
from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.report import verdict_format as vf
from deckload.ui import verdict
from deckload.ui.launch import create_app
from deckload.ui.widgets import LinePanel
from demo_vessels import demo_departure, trawler_vessel
from verdict_samples import with_verdict

NOTE_INDENT, NOTE_MORE = "   ", "     "
"""A note's first line under its criterion, and the lines it wraps onto (indented further)."""


def _trawler():
    vessel = trawler_vessel()
    return vessel, load_condition(paths.TRAWLER_CONDITIONS["departure"], vessel)


def _app(tmp_path, vessel, condition):
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def _flat(text: str) -> str:
    return re.sub(r"\s+", " ", text).strip()


def _panel(app) -> tuple[list[str], int]:
    box = app.screen.query_one("#criteria", LinePanel)
    lines = box.plain().splitlines()
    assert len(lines) <= box.size.height and all(len(x) <= box.size.width for x in lines), lines
    return lines, box.size.width


def _shown_whole_or_marked(note: str, lines: list[str], start: int) -> None:
    """The note's lines from ``start`` (the line under its criterion, continuation lines indented
    further): the whole note, or its first words ending in '…', each word shown a whole word of it."""
    shown = [lines[start]] + [x for x in _following(lines, start)]
    text = _flat(" ".join(shown))
    if text != _flat(note):
        assert text.endswith("…"), (note, shown)
        kept = text[:-1].split()
        assert kept == note.split()[: len(kept)], (note, shown)  # no word cut, none out of order


def _following(lines: list[str], start: int):
    for x in lines[start + 1:]:
        if not x.startswith(NOTE_MORE) or x.startswith(NOTE_MORE + " "):
            return
        yield x


async def test_the_wind_heel_note_is_shown_whole_at_200x60(tmp_path):
    """The θ0 note names the wind pressure, the windage area and its lever and lw1; at 200×60
    the panel has rows to spare, so all of it shows (wrapped), none of it cut."""
    vessel, condition = _trawler()
    app = _app(tmp_path, vessel, condition)
    async with app.run_test(size=(200, 60)) as pilot:
        await pilot.pause()
        lines, _ = _panel(app)
        theta0 = next(c for c in app.session.result.criteria if c.note.startswith("limit min("))
        assert "lw1" in theta0.note  # the note this test is about
        assert _flat(theta0.note) in _flat("\n".join(lines)), lines
        at = next(i for i, x in enumerate(lines) if x.startswith(" Wind heel θ0"))
        _shown_whole_or_marked(theta0.note, lines, at + 1)


@pytest.mark.parametrize("size", [(80, 24), (100, 30), (120, 40), (200, 60)])
async def test_a_set_heading_keeps_its_verdict_word_and_shortens_its_title_by_words(tmp_path, size):
    vessel, condition = _trawler()
    app = _app(tmp_path, vessel, condition)
    async with app.run_test(size=size) as pilot:
        await pilot.pause()
        lines, _ = _panel(app)
        heads = [x for x in lines if x.startswith(" ▸ ")]
        groups = list(vf.grouped(app.session.result))
        assert len(heads) == len(groups)
        for line, g in zip(heads, groups):
            assert line.rstrip().endswith(" " + g.word), line
            title = _flat(line.rstrip()[3: -len(g.word)])
            full = vf.set_title(g.set.title)
            if title != full:
                assert title.endswith("…"), line
                kept = title[:-1].split()
                assert kept and kept == full.split()[: len(kept)], line  # "fishing vessel", not "crite"


async def test_an_unassessable_criterions_reason_is_never_cut_silently_at_80x24(tmp_path, monkeypatch):
    """At 80 columns the panel is 34 wide: the reason a criterion could not be decided wraps where
    there are rows, else ends in '…'; it read 'the KN tables end at 25°, befor'."""
    import deckload.core.stability as st

    real = st.evaluate
    monkeypatch.setattr(st, "evaluate", lambda v, c: with_verdict(real(v, c), weather_fails=True, unassessable=True))
    vessel, condition = demo_departure()
    app = _app(tmp_path, vessel, condition)
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        lines, _ = _panel(app)
        c = next(c for c in app.session.result.criteria if not c.assessed)
        at = next(i for i, x in enumerate(lines) if "not assessable" in x and x.startswith(" GZ at"))
        _shown_whole_or_marked(c.note, lines, at + 1)


@pytest.mark.parametrize("width", [34, 54, 90])
def test_the_panel_gives_way_a_line_at_a_time_and_every_cut_line_ends_in_an_ellipsis(width):
    """From its full height down, the panel is never taller than it may be; the note's wrapped lines
    go before a criterion does, and a note shortened to one line ends in '…'."""
    vessel, condition = _trawler()
    r = evaluate(vessel, condition)
    theta0 = next(c for c in r.criteria if c.note.startswith("limit min("))
    full = verdict.criteria_lines(r, False, width)
    criteria_rows = sum(1 for x in full if x.plain.startswith((" Area", " GZ", " ∠", " GM0", " Wind")))
    for height in range(len(full), 3, -1):
        lines = [x.plain for x in verdict.criteria_lines(r, False, width, height)]
        assert len(lines) <= height and all(len(x) <= width for x in lines), (height, lines)
        rows = sum(1 for x in lines if x.startswith((" Area", " GZ", " ∠", " GM0", " Wind")))
        at = next((i for i, x in enumerate(lines) if x.startswith(" Wind heel θ0")), None)
        if at is not None and at + 1 < len(lines) and lines[at + 1].startswith(NOTE_INDENT + "limit"):
            assert rows == criteria_rows, (height, lines)  # the note still shows: no criterion gave way
            _shown_whole_or_marked(theta0.note, lines, at + 1)


# --------------------------------------------------------------------------- the side's share of a wide screen


def _widths(app) -> tuple[int, int, int]:
    """The board's width (its edge included), its widest line as made, and the right side's width."""
    from deckload.ui.widgets import LoadBoard

    board = app.screen.query_one(LoadBoard)
    widest = max(len(r.text.plain.rstrip()) for r in board.rows)
    return board.outer_size.width, widest, app.screen.query_one("#side").outer_size.width


async def test_a_wide_screen_gives_the_side_what_the_board_does_not_need(tmp_path):
    """At 200×60 the board took 146 cells for lines of at most 83 while the criteria panel (54)
    cut its notes.  Now the board keeps what shows every line of it whole (its widest line, its
    scrollbar gutter and edge, and room for a longer tank id) and the side takes the rest; at 120
    and 80 columns the widths are as they were (54 and 34, the snapshots' layout)."""
    vessel, condition = _trawler()
    app = _app(tmp_path, vessel, condition)
    async with app.run_test(size=(200, 60)) as pilot:
        await pilot.pause()
        board, widest, side = _widths(app)
        assert board + side == 200
        # every line whole (its gutter and edge beside it), at most the 3 cells of a longer id to spare
        assert widest + 2 <= board <= widest + 2 + 3, (board, widest)
        wide_side = side
        for size, side_cols in (((100, 30), 34), ((120, 40), 54), ((142, 40), 54), ((200, 60), wide_side)):
            await pilot.resize_terminal(*size)
            for _ in range(40):  # the resize reaches the screen, then its layout is made
                await pilot.pause(0.05)
                if app.screen.has_class("-narrow") == (size[0] < 110) and sum(_widths(app)[::2]) == size[0]:
                    break
            await pilot.pause()
            board, widest, side = _widths(app)
            assert side == side_cols and board + side == size[0], (size, board, side)
            if size[0] >= 110:  # no line of the wide board is cut (the narrow one shows less)
                assert widest + 2 <= board
