"""Lines of one style keep their colour on the panels (textual pilot, analytic box barge).

A rich ``Text`` made as ``Text("…", style)`` has a base style and no spans; rich's
``Text.render`` leaves such a base style to the console, so a panel that turns lines into
strips must apply it itself.  These lines are the message line (✔ done / ✖ refused),
"✔ No warnings" and "no result".  The rendered segments of each are read back here.
Colour only reinforces: with NO_COLOR the symbol still carries the state.
"""

from __future__ import annotations

import pytest
from rich.text import Text
from textual.color import Color

from deckload.core.model import Condition, TankFill
from deckload.ui import views
from deckload.ui.launch import create_app
from deckload.ui.main_screen import alert_lines
from deckload.ui.palette import P
from deckload.ui.widgets import LinePanel
from vessel_factories import barge_tanks, box_barge


def _app(tmp_path):
    vessel = box_barge(tanks=barge_tanks())
    condition = Condition(name="Colours", tanks=(TankFill("DB1P", "percent", 50.0),))
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


def _colours(panel: LinePanel, y: int) -> dict[str, object]:
    """Each non-blank piece of line ``y`` as rendered, with the colour it is drawn in."""
    return {seg.text: seg.style.color for seg in panel.render_line(y) if seg.text.strip()}


def _line_colour(panel: LinePanel, y: int):
    colours = set(_colours(panel, y).values())
    assert len(colours) == 1, colours  # a line of one style is drawn in one colour
    return colours.pop()


async def test_message_line_keeps_its_colour(tmp_path):
    app = _app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        screen = app.loading_screen
        status = screen.query_one("#status", LinePanel)
        screen.say("WB1P set to 40 %", ok=True)
        await pilot.pause()
        assert status.lines[0].plain.startswith(" ✔ ") and not status.lines[0].spans
        assert _line_colour(status, 0) == P["ok"].color
        screen.say("no tank FOO", ok=False)
        await pilot.pause()
        assert _line_colour(status, 0) == P["danger"].color
        assert all(seg.style.bold for seg in status.render_line(0) if seg.text.strip())  # danger is bold
        # A refusal wrapped to two lines: both keep the colour (the second is an indent + the rest).
        screen.say("refused: " + "the amount is more than the tank can give " * 4, ok=False)
        await pilot.pause()
        assert len(status.lines) == 2
        assert _line_colour(status, 0) == _line_colour(status, 1) == P["danger"].color


async def test_no_warnings_and_no_result_keep_their_colour(tmp_path):
    app = _app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        screen = app.loading_screen
        alerts = screen.query_one("#alerts", LinePanel)
        alerts.set_lines(alert_lines([], 3, alerts.size.width))
        afloat = screen.query_one("#afloat", LinePanel)
        afloat.set_lines(views.afloat_lines(app.session.vessel, app.session.condition, None, False, afloat.size.width))
        await pilot.pause()
        assert alerts.lines[0].plain.startswith(" ✔ No warnings")
        assert _line_colour(alerts, 0) == P["ok"].color
        assert afloat.lines[1].plain == " no result: see the warning above"
        assert _line_colour(afloat, 1) == P["danger"].color
        # A line wider than its panel takes the general way (cut by the strip): still coloured.
        afloat.set_lines([Text(" no result: " + "x" * 200, P["danger"])])
        await pilot.pause()
        assert _line_colour(afloat, 0) == P["danger"].color


async def test_no_color_keeps_the_symbols(tmp_path, monkeypatch):
    """NO_COLOR: textual's own filter takes the colour away at the screen; the state stays in ✔/✖."""
    monkeypatch.setenv("NO_COLOR", "1")
    app = _app(tmp_path)
    async with app.run_test(size=(120, 40)) as pilot:
        assert app.no_color
        screen = app.loading_screen
        status = screen.query_one("#status", LinePanel)
        for ok, mark, style in ((True, " ✔ ", P["ok"]), (False, " ✖ ", P["danger"])):
            screen.say("WB1P set to 40 %", ok=ok)
            await pilot.pause()
            assert status.plain().startswith(mark)
            segments = list(status.render_line(0))
            for f in app._filters:
                segments = f.apply(segments, Color(0, 0, 0))
            shown = {s.style.color for s in segments if s.text.strip()}
            assert style.color not in shown  # the filter, not our colour, decides what is drawn
