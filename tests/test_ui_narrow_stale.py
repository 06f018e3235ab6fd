"""At 80×24 (narrow) a panel hidden and shown again shows the current condition, and the last good
numbers shown outside the tables are marked as such at every width (found by a real-terminal trial
of the Demo Islander's departure):

* the curve panel, hidden behind the numbers (g), kept the drawing it last made: after a change to
  the condition and g (or b), it showed the old condition's curve and title as current; after
  outside the tables and undo, "GZ curve of the last good condition" over a condition with a verdict;
* the 'Afloat' panel's "(last good, stale)" was cut to "(last …" at 80 columns;
* b outside the tables said "Wind and roll plot: …" where there is no result to plot;
* the board's hint line cut a number ("z 5.8…" for 5.80).

The references are the calculation itself (``evaluate`` through the session): the screen must
show what it computes for the condition on screen.
"""

from __future__ import annotations

from rich.text import Text
from textual.geometry import Region

from deckload.core.stability import evaluate
from deckload.ui import views
from deckload.ui.main_screen import fit_lines, gz_title_lines
from deckload.ui.widgets import LoadBoard, fit_width
from demo_vessels import demo_departure, departure_app, status_text


def _app(tmp_path):
    return departure_app(tmp_path, officer="AU")


def _shown(app, ident: str) -> list[str]:
    """The panel's lines as textual paints them (its render at its size), trailing blanks dropped."""
    panel = app.screen.query_one(f"#{ident}")
    size = panel.size
    strips = panel.render_lines(Region(0, 0, size.width, size.height))
    return ["".join(seg.text for seg in strip).rstrip() for strip in strips]


_status = status_text


async def _set_h1(app, pilot, tonnes: str) -> None:
    assert app.screen.query_one(LoadBoard).select(("hold", "H1"))
    await pilot.press("enter", *tonnes, "enter")
    await pilot.pause()


def _title_of(app, width: int) -> list[str]:
    """The GZ curve's title for the condition on screen (what the panel must show on top)."""
    return [t.plain.rstrip() for t in gz_title_lines(app.session.result, width)]


async def _curve_then_numbers_then_200_t(app, pilot) -> tuple[int, list[str]]:
    """g (the departure's curve shown), g (back to the numbers), H1 ⏎ 200 t: the curve panel's
    width and the departure's curve title."""
    await pilot.pause()
    await pilot.press("g")
    await pilot.pause()
    width = app.screen.query_one("#gz").size.width
    before = _title_of(app, width)
    assert _shown(app, "gz")[: len(before)] == before  # the premise: the departure's curve on show
    await pilot.press("g")
    await pilot.pause()
    await _set_h1(app, pilot, "200")
    return width, before


async def test_the_curve_shown_again_after_a_change_is_the_new_conditions(tmp_path):
    """g (curve), g (numbers), H1 ⏎ 200 t, g: the curve and its title are the new condition's."""
    app = _app(tmp_path)
    async with app.run_test(size=(80, 24)) as pilot:
        width, before = await _curve_then_numbers_then_200_t(app, pilot)
        assert not app.session.stale
        after = _title_of(app, width)
        assert after != before  # the premise: 200 t in H1 changes the curve
        await pilot.press("g")
        await pilot.pause()
        shown = _shown(app, "gz")
        assert shown[: len(after)] == after, shown


async def test_b_after_a_change_behind_the_numbers_shows_the_wind_plot_not_the_old_curve(tmp_path):
    """The trial's steps: g, g, H1 ⏎ 200 t, b: the wind and roll panel, not the departure's curve."""
    app = _app(tmp_path)
    async with app.run_test(size=(80, 24)) as pilot:
        _, old = await _curve_then_numbers_then_200_t(app, pilot)
        await pilot.press("b")
        await pilot.pause()
        shown = _shown(app, "gz")
        assert shown[0].startswith(" Wind"), shown
        assert not set(old) & set(shown), shown


async def test_outside_the_tables_then_undo_b_shows_the_wind_plot_of_the_condition_with_a_verdict(tmp_path):
    """H1 ⏎ 250 t (1008 t, beyond the 1000 t table), b, b, u, b: the departure is back with its
    verdict: the panel is its wind and roll plot, not the last good curve; and b while outside the
    tables says there is no result, not "Wind and roll plot"."""
    app = _app(tmp_path)
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        await _set_h1(app, pilot, "250")
        assert app.session.stale  # the premise: outside the tables
        await pilot.press("b")
        await pilot.pause()
        assert "no result" in "\n".join(_shown(app, "gz"))
        status = _status(app)
        assert "outside the tables" in status and "Wind and roll plot" not in status, status
        await pilot.press("b", "u")
        await pilot.pause()
        assert not app.session.stale and app.session.result.weather is not None  # the premise
        await pilot.press("b")
        await pilot.pause()
        shown = _shown(app, "gz")
        assert shown[0].startswith(" Wind") and "m·rad" in shown[0], shown
        assert "last good" not in "\n".join(shown), shown
        await pilot.press("b", "g")  # and the plain curve: the departure's, not "last good"
        await pilot.pause()
        shown = _shown(app, "gz")
        title = _title_of(app, app.screen.query_one("#gz").size.width)
        assert shown[: len(title)] == title, shown


async def test_the_last_good_numbers_are_marked_at_80_and_60_columns(tmp_path):
    """Outside the tables the 'Afloat' panel shows the last good Δ, drafts and GM: its first line
    shows the mark whole at every width the screen takes."""
    for size in ((80, 24), (60, 20)):
        app = _app(tmp_path / f"{size[0]}")
        async with app.run_test(size=size) as pilot:
            await pilot.pause()
            assert "LAST GOOD" not in "\n".join(_shown(app, "afloat"))
            await _set_h1(app, pilot, "250")
            assert app.session.stale
            shown = _shown(app, "afloat")
            assert "LAST GOOD" in shown[0], (size, shown)
            # the premise: Δ of the last good condition (807.7 t) is what the panel shows
            assert f"{app.session.result.displacement_t:.1f}" in "\n".join(shown), shown


def test_the_afloat_mark_is_whole_at_any_width():
    vessel, departure = demo_departure()
    result = evaluate(vessel, departure)
    for width in range(14, 60):
        first = fit_width(views.afloat_lines(vessel, departure, result, True, width)[0], width).plain
        assert "LAST GOOD" in first, (width, first)
        assert "LAST GOOD" not in views.afloat_lines(vessel, departure, result, False, width)[0].plain


def test_a_one_line_hint_never_ends_in_part_of_a_number():
    """'… 13.00 t at x 6.50 m, z 5.80 m, …' cut at 80 columns read 'z 5.8…'."""
    text = " 20 ft container, provisions · 13.00 t at x 6.50 m, z 5.80 m, on the centreline · on MAIN"
    words = text.split()
    for width in range(20, len(text)):
        line = fit_lines(Text(text), width, 1)[0].plain
        assert len(line) <= width and line.endswith("…"), (width, line)
        assert all(w in words for w in line[:-1].split()), (width, line)


async def test_the_board_hint_at_80_columns_shows_no_cut_number(tmp_path):
    """The cursor on each deck load and constant: the message line shows its summary, whole words only."""
    from deckload.ui.main_screen import item_summary

    app = _app(tmp_path)
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        board = app.screen.query_one(LoadBoard)
        cut = 0
        for row in [r for r in board.rows if r.key and r.key[0] in ("deck", "const")]:
            board.select(row.key)
            await pilot.pause()
            c = app.session.condition
            items = c.deck_items if row.key[0] == "deck" else c.constants
            full = item_summary(items[row.key[1]]).split()
            shown = _status(app)
            if shown.endswith("…"):
                cut += 1
            assert all(w in full for w in shown.rstrip("…").split()), (shown, full)
        assert cut > 0  # the premise: at 80 columns some summaries are longer than the line
