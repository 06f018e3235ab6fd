"""Two things a real-terminal trial of the loading screen found after the day's changes.

1. A sign-on or -off entered with the PC's clock set back was warned of only at the next save that
   landed, which could be never (sign off, then quit), and then read as if about that edit.
2. The message line kept the width it was said at: widened from 80 to 200 columns it still showed
   the text cut for 80, until the cursor moved.
"""

from __future__ import annotations

from datetime import datetime, timedelta, timezone

from demo_vessels import status_text
from vessel_factories import pilot_app


async def test_signing_off_with_the_clock_set_back_is_warned_of_at_once(tmp_path, monkeypatch):
    at = [datetime(2026, 12, 3, 12, 0, tzinfo=timezone.utc)]
    monkeypatch.setattr("deckload.logbook.book.utc_now", lambda: at[0])
    monkeypatch.setenv("DECKLOAD_SHIP_OFFSET", "+02:00")
    app = pilot_app(tmp_path, log_dir=tmp_path / "logs", officer="TS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("s", "enter")  # entry #1 at 12:00
        await pilot.pause()
        at[0] -= timedelta(hours=1)
        await pilot.press("o", "-", "enter")  # TS signs off at 11:00: entry #2
        await pilot.pause()
        said = [str(n.message) for n in app._notifications]
        assert any(m.startswith("Logged, but the clock reads 1 h 00 min earlier than entry #1") for m in said), said
        assert app.session.journal.clock_warning is None  # said once: not again at the next save


async def test_the_message_line_is_fitted_again_when_the_screen_widens(tmp_path):
    words = ("a long message to the officer that cannot fit on one line of eighty columns and so is cut "
             "short there, but fits whole on a line of two hundred columns, ending here")
    app = pilot_app(tmp_path, log_dir=tmp_path / "logs")
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.pause()
        app.screen.say(words, ok=None)  # a hint: one line, cut with '…' at 80
        await pilot.pause()
        assert "ending here" not in status_text(app)
        await pilot.resize_terminal(200, 60)
        for _ in range(100):  # until the screen has had its Resize (the size changes before it is sent)
            await pilot.pause(0.01)
            if "ending here" in status_text(app):
                break
        assert "ending here" in status_text(app), status_text(app)


# ------------------------------------------------------------------ 3. criteria notes: rows and cuts

ADVISORY = "passes, but IS 2008 A 2.2.3 prefers the maximum beyond 30°"
THETA0 = "limit min(16°, 0.8 × deck edge 17.8°); P 504 Pa, A 240.7 m², Z 5.19 m, lw1 0.0794 m"


def test_a_clause_too_long_for_any_line_fills_the_line_it_starts_on():
    """At 40 columns the advisory note took three lines, 'passes,' alone on the first (its second
    clause, too long for a line, was put on a line of its own and wrapped there); it takes two."""
    from deckload.ui import verdict

    lines = [x.plain for x in verdict._note_lines(ADVISORY, 40)]
    assert len(lines) == 2 and lines[0].strip().startswith("passes, but"), lines
    assert " ".join(x.strip() for x in lines) == ADVISORY


def test_a_clause_that_fits_a_line_of_its_own_still_starts_one():
    """'lw1 0.0794 m' is never split across lines (the clause rule the wrapping was made for)."""
    from deckload.ui import verdict

    for width in range(30, 90):
        lines = [x.plain for x in verdict._note_lines(THETA0, width)]
        assert any("lw1 0.0794 m" in x for x in lines), (width, lines)
        assert all(len(x) <= width for x in lines)


def test_a_note_cut_to_one_line_ends_after_a_whole_clause():
    """Folded to one line, the θ0 note read 'P 504 Pa, A…': a label kept without its value.  It now
    ends after the last whole clause that fits, '…, P 504 Pa, …', at every width it is cut at."""
    from deckload.ui import verdict

    for width in range(50, 95):
        lines = verdict._note_lines(THETA0, width)
        if len(lines) < 2:
            continue
        (cut,) = [x.plain for x in verdict._first_rows(lines, 1, width)]
        assert len(cut) <= width and cut.endswith(("…", "m")), (width, cut)
        if cut.endswith("…"):
            assert cut.endswith((", …", "; …")), (width, cut)
