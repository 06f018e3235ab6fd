"""The forms driven by keys typed without pauses, the tank picker, the set dialog's hint and preview.

The pilot's ``press`` waits for the app to be idle after every key; an officer typing quickly
does not.  ``type_fast`` hands every key to the terminal driver at once, as a fast typist or a
paste does, and only then waits: each key must land in the field that had focus when it was
typed (before the fix the keys typed while a form was opening were lost or taken by the screen
underneath, and the transfer form's fields filled out of order).
"""

from __future__ import annotations

import pytest
from textual import events
from textual.widgets import Input

from deckload.io import paths
from deckload.io.profiles import load_condition, load_profile
from deckload.ui.dialogs import ItemFormScreen, TransferForm
from deckload.ui.launch import create_app

_NAMES = {"%": "percent_sign", ".": "full_stop", " ": "space"}


@pytest.fixture(scope="module")
def demo():
    v = load_profile(paths.DEMO_PROFILE)
    return v, load_condition(paths.DEMO_CONDITIONS["departure"], v)


@pytest.fixture
def app(demo, tmp_path):
    v, c = demo
    return create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="TS")


async def type_fast(app, pilot, keys: list[str]) -> None:
    """Every key to the driver at once (no wait between keys), then wait until all are handled."""
    await pilot.pause()
    for k in keys:
        char = k if len(k) == 1 else None
        app._driver.send_message(events.Key(_NAMES.get(k, k), char))
    quiet = 0
    for _ in range(400):  # up to 20 s on a loaded machine; ends once every key is handled
        await pilot.pause(0.05)
        quiet = quiet + 1 if not app._held_keys and app._key_in_flight is None else 0
        if quiet == 4:
            break
    await pilot.pause()


def fields(app) -> dict[str, str]:
    return {i.id: i.value for i in app.screen.query(Input)}


async def test_keys_typed_at_once_fill_the_transfer_form_field_by_field(app):
    """t opens the form on WB2P (focus on the amount: from and to are given); the keys that follow
    at once go to the amount, then Tab to the from-tank (the field after the last), and so on."""
    from deckload.ui.widgets import LoadBoard

    async with app.run_test(size=(120, 40)) as pilot:
        app.screen.query_one(LoadBoard).select(("tank", "WB2P"))
        await type_fast(app, pilot, ["t", *"12t", "shift+tab", *"DB1S", "shift+tab", *"WB2S"])
        assert isinstance(app.screen, TransferForm)
        assert fields(app) == {"xfer-from": "WB2S", "xfer-to": "DB1S", "xfer-amount": "12t"}
        assert app.screen.plan is not None and app.screen.plan.from_id == "WB2S"


async def test_keys_typed_at_once_fill_the_deck_item_form_and_enter_saves_it(app, demo):
    v, c0 = demo
    async with app.run_test(size=(120, 40)) as pilot:
        await type_fast(app, pilot, ["a", *"Crane", "tab", *"12", "tab", *"20", "tab", *"6", "tab", *"1.5", "enter"])
        assert not isinstance(app.screen, ItemFormScreen)
        crane = app.session.condition.deck_items[-1]
        assert (crane.name, crane.mass_t, crane.lcg_m, crane.vcg_m, crane.tcg_m) == ("Crane", 12.0, 20.0, 6.0, 1.5)
        assert len(app.session.condition.deck_items) == len(c0.deck_items) + 1


async def test_a_key_typed_after_enter_closes_a_form_reaches_the_loading_screen(app, demo):
    """⏎ commits the amount; the 'u' typed right after it is the loading screen's undo, not a
    letter in the closing form."""
    v, c0 = demo
    async with app.run_test(size=(120, 40)) as pilot:
        await type_fast(app, pilot, ["enter", *"50%", "enter", "u"])
        assert app.session.condition == c0 and app.session.redo_depth == 1
