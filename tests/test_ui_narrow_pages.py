"""The ballast planner and the hull-comparison page on an 80×24 terminal (found by a real-terminal
audit): the planner's ⚠ notes (a tank left in its worst free-surface band or nominally full,
criteria failing after the plan) and the end of its message fell below the form's edge, unseen
before ⏎ applies the plan; the `h` page could be scrolled by the mouse wheel only, so the rows
below the fold (two of its three BEYOND rows) and its legend could not be reached by keys."""

from __future__ import annotations

import re

import pytest
from textual.containers import VerticalScroll
from textual.widgets import Static

from demo_vessels import demo_departure, departure_app

ALL_BALLAST = "APT DB1P DB1S WB1P WB1S DB2P DB2S DB3P DB3S WB2P WB2S FPT"


def _flat(text: str) -> str:
    return re.sub(r"\s+", " ", text).strip()


async def _search(pilot, app, goal):
    await pilot.press("i")
    await pilot.pause()
    app.screen.query_one("#plan-goal").value = goal
    app.screen.query_one("#plan-tanks").value = ALL_BALLAST
    app.screen.query_one("#plan-goal").focus()
    await pilot.pause()
    await pilot.press("enter")
    for _ in range(600):
        await pilot.pause(0.05)
        if not getattr(app.screen, "searching", False):
            break
    assert not getattr(app.screen, "searching", False), "the search did not end within 30 s"
    await pilot.pause()


def _message_fits(app) -> str:
    """The message's text, after checking every line of it is inside the form's frame."""
    form = app.screen.query_one(".form")
    msg = app.screen.query_one("#form-message", Static)
    text = msg.render()  # textual's Content
    wrapped = text.wrap(msg.size.width)
    assert msg.size.height >= len(wrapped) > 0
    assert msg.region.bottom <= form.region.bottom - 1 <= app.size.height - 1  # above the bottom border
    return text.plain


@pytest.mark.parametrize("goal, notes, said", [
    # the demo departure (checks.md has no such case: the notes are those plan_notes gives, asserted below)
    ("gm 0.94", ["DB2P is left nominally full", "DB2S is left nominally full"], "at least GM fluid"),
    ("list 3", ["WB1S is left at", "WB2P is left at"], "list 2.9° S to list 3.1° S"),
])
async def test_the_planners_notes_and_whole_message_show_at_80x24(tmp_path, goal, notes, said):
    from deckload.ui.planner import plan_notes
    from deckload.ui.widgets import LinePanel

    app = departure_app(tmp_path)
    async with app.run_test(size=(80, 24)) as pilot:
        await _search(pilot, app, goal)
        form = app.screen
        assert form.proposal is not None
        expected = plan_notes(app.session.result, form.proposal)
        assert all(any(n.startswith(w) for n in expected) for w in notes), expected
        panel = form.query_one("#xfer-preview", LinePanel)
        assert len(panel.lines) <= panel.size.height  # nothing below the panel's edge
        assert panel.region.bottom <= form.query_one(".form").region.bottom - 1
        shown = _flat(panel.plain())
        for n in expected:  # whole, not cut with "…"
            assert _flat("⚠ " + n) in shown
        assert "…" not in shown
        message = _message_fits(app)
        assert said in message and message.rstrip().endswith("Esc cancels")


async def test_a_refusal_wraps_whole_under_the_panel_at_80x24(tmp_path):
    app = departure_app(tmp_path)
    async with app.run_test(size=(80, 24)) as pilot:
        await _search(pilot, app, "trim 0.8")
        message = _message_fits(app)
        assert "beyond what" in message and message.rstrip().endswith("read off the GZ curve).")


async def test_rows_past_a_short_panel_are_said_and_pgdn_shows_them(tmp_path):
    """At 80×18 a GM plan's rows and notes do not fit: the notes come before the criteria rows, the
    panel's last row says how many rows are below and the key, and PgDn brings them in."""
    from deckload.ui.widgets import LinePanel

    app = departure_app(tmp_path)
    async with app.run_test(size=(80, 18)) as pilot:
        await _search(pilot, app, "gm 0.94")
        panel = app.screen.query_one("#xfer-preview", LinePanel)
        first = panel.plain()
        assert len(panel.lines) <= panel.size.height
        assert "more rows below: PgDn" in panel.lines[-1].plain
        assert "DB2P is left nominally full" in first
        _message_fits(app)
        seen = first
        for _ in range(5):
            await pilot.press("pagedown")
            await pilot.pause()
            seen += "\n" + panel.plain()
        assert "more rows below" not in panel.plain() and "rows above: PgUp" in panel.plain()
        assert "DB2S is left nominally full" in seen and "Criteria" in seen
        await pilot.press("pageup", "pageup", "pageup", "pageup", "pageup")
        await pilot.pause()
        assert panel.plain() == first


async def test_the_h_page_scrolls_by_keys_at_80x24_and_says_which(tmp_path):
    from deckload.ui.hull_compare import HullCompareScreen

    app = departure_app(tmp_path)
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.press("h")
        await app.workers.wait_for_complete()
        await pilot.pause()
        assert isinstance(app.screen, HullCompareScreen)
        page = app.screen.query_one("#hull-compare-page", VerticalScroll)
        assert app.screen.focused is page
        assert "PgDn" in str(page.border_subtitle) and "Esc" in str(page.border_subtitle)
        assert page.max_scroll_y > 0 and page.scroll_y == 0  # the premise: longer than the screen
        await pilot.press("pagedown")
        await pilot.pause()
        assert page.scroll_y > 0
        await pilot.press("home")
        await pilot.pause()
        assert page.scroll_y == 0
        await pilot.press("down")
        await pilot.pause()
        assert page.scroll_y == 1
        await pilot.press("end")
        await pilot.pause()
        assert page.scroll_y == page.max_scroll_y
        await pilot.press("escape")
        await pilot.pause()
        assert not isinstance(app.screen, HullCompareScreen)


def test_the_comparison_rows_fit_74_columns_with_headings_apart():
    """Every row of the table, 'not judged' included, fits the page beside its scroll bar on an
    80-column terminal (80 − border 2 − padding 2 − scroll bar 2 = 74), and the headings are words
    apart ('direct difference', not 'directdifference')."""
    from deckload.core.equilibrium import compare
    from deckload.core.stability import evaluate
    from deckload.ui.hull_compare import comparison_text

    v, c = demo_departure()
    cmp = compare(v, evaluate(v, c))
    lines = comparison_text(cmp).plain.splitlines()
    head = next(line for line in lines if line.split()[:1] == ["tables"])
    assert head.split() == ["tables", "direct", "difference", "tolerance"]
    rows = [line for line in lines if line.rstrip().endswith(("ok", "BEYOND", "not judged"))]
    assert any(r.endswith("not judged") for r in rows) and len(rows) == len(cmp.rows)
    assert max(len(r) for r in rows + [head]) <= 74
    # each heading ends over the end of its column's cells
    for word in ("tables", "direct", "difference"):
        end = head.index(word) + len(word)
        assert all(r[end - 1] != " " and (end == len(r) or r[end] == " ") for r in rows)
