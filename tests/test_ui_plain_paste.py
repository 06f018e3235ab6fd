"""A paste the terminal sends as plain keys (no bracketed paste) goes into the focused field as one
text: before, each key waited for the one before, about 100 keys a second (2000 characters took
18 s, and Esc or q waited behind them; found by a real-terminal audit).  The field ends with what
the keys one by one would make (textual's Input inserts each printable key at the cursor)."""

from __future__ import annotations

from textual import events
from textual.widgets import Input

from vessel_factories import pilot_app


def _keys(text: str):
    return [events.Key(c, c) for c in text]


async def test_a_long_plain_paste_lands_whole_and_in_one_go(tmp_path, monkeypatch):
    app = pilot_app(tmp_path, log_dir=tmp_path / "logs", officer="TS")
    sent = []
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("s", "tab")  # the record form's remark field
        assert app.focused is app.screen.query_one("#record-remark", Input)
        real = app._send_key

        async def counting(event):
            sent.append(event.key)
            await real(event)

        monkeypatch.setattr(app, "_send_key", counting)
        text = "Bunkered MGO at the berth, 40 t, soundings taken by the 2/E. " * 30  # 1860 characters
        for key in _keys(text) + [events.Key("enter", None)]:
            app.post_message(key)  # as a terminal delivers a plain paste: all at once
        for _ in range(20):
            await pilot.pause()
            if app.screen is app.loading_screen:
                break
        assert app.screen is app.loading_screen  # ⏎ after the paste recorded the entry
        assert len(sent) < 20  # not one round a key
    from deckload.logbook import Logbook

    book = Logbook.open(tmp_path / "logs", app.session.vessel.particulars.name, readonly=True)
    assert [e.remark for e in book.entries()] == [text.strip()]
