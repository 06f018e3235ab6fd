"""Keys typed ahead for a form that was refused are dropped, not taken as the board's commands.

Found by a real-terminal audit: in a window whose voyage log is not writable, an officer typed
``s`` then "fuel received⏎"; ``s`` was refused, and ``f``, ``u``, ``e`` filled, undid and then
emptied a tank, and ``l`` opened the log.  The keys after a refused form key are dropped up to and
including ⏎ or Esc (deckload.ui.app.DeckloadApp.drop_typeahead); a key typed after that works.
"""

from __future__ import annotations

from vessel_factories import pilot_app


async def test_what_was_typed_for_a_refused_record_form_is_dropped(tmp_path):
    app = pilot_app(tmp_path, log_dir=None)
    async with app.run_test(size=(120, 40)) as pilot:
        before = app.session.condition
        assert not app.session.journal.writable  # the premise: s is refused here
        await pilot.press("s", *"fuel received", "enter")
        await pilot.pause()
        assert app.session.condition == before and app.screen is app.loading_screen
        assert "keys typed for it are ignored" in " ".join(
            app.screen.query_one("#status").plain().split())
        await pilot.press("f")  # after ⏎ the board takes keys again: f fills the tank under the cursor
        await pilot.pause()
        assert app.session.condition != before
