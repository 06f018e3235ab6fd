"""Loading-screen keys on the demo vessel (holds, deck-item edits, water density, log)."""

from __future__ import annotations

import pytest

from deckload.core.model import HoldLoad
from deckload.io import paths
from deckload.io.profiles import load_condition
from deckload.ui.dialogs import PromptForm
from deckload.ui.launch import create_app
from deckload.ui.widgets import LinePanel, LoadBoard
from demo_vessels import demo_vessel


@pytest.fixture
def app(tmp_path):
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    return create_app(vessel, condition, work_dir=tmp_path / "work", log_dir=tmp_path / "logs")


def hold_mass(app, hold_id):
    return next((h.mass_t for h in app.session.condition.holds if h.hold_id == hold_id), 0.0)


async def test_hold_mass_is_set_and_its_structural_limit_enforced(app):
    async with app.run_test(size=(120, 40)) as pilot:
        assert app.screen.query_one(LoadBoard).select(("hold", "H1"))
        await pilot.press("enter", *"120", "enter")  # the old value is selected: typing replaces it
        assert hold_mass(app, "H1") == 120.0
        await pilot.press("plus")
        assert hold_mass(app, "H1") == 121.0
        limit = app.session.vessel.hold("H1").max_mass_t
        await pilot.press("enter", *f"{limit + 1:g}", "enter")
        assert isinstance(app.screen, PromptForm) and "structural limit" in str(
            app.screen.query_one("#form-message").render())
        await pilot.press("escape")
        assert hold_mass(app, "H1") == 121.0


async def test_editing_a_deck_item_keeps_what_the_form_does_not_show(app):
    async with app.run_test(size=(120, 40)) as pilot:
        before = app.session.condition.deck_items[0]
        assert before.footprint_m2 is not None
        app.screen.query_one(LoadBoard).select(("deck", 0))
        await pilot.press("enter", "tab", *"15", "enter")  # name kept, mass 15 t
        after = app.session.condition.deck_items[0]
        assert (after.name, after.mass_t, after.footprint_m2, after.area_id) == (
            before.name, 15.0, before.footprint_m2, before.area_id)


async def test_water_density_changes_drafts_and_bad_density_is_refused(app):
    async with app.run_test(size=(120, 40)) as pilot:
        t_sea = app.session.result.draft_mean_m
        await pilot.press("d", *"1.000", "enter")
        assert app.session.condition.water_density_t_m3 == 1.0
        # Same mass in lighter water displaces more volume: she sinks (Archimedes).
        assert app.session.result.draft_mean_m > t_sea
        await pilot.press("d", *"1.2", "enter")
        assert isinstance(app.screen, PromptForm)
        await pilot.press("escape")
        assert app.session.condition.water_density_t_m3 == 1.0


async def test_sign_on_then_changes_are_logged_and_the_log_screen_opens(app):
    from deckload.ui.log_screen import LogScreen

    async with app.run_test(size=(120, 40)) as pilot:
        title = app.screen.query_one("#titlebar", LinePanel)
        assert "NOT logged" in title.plain()
        await pilot.press("o", *"jm", "enter")
        assert app.session.journal.officer == "JM" and "watch JM" in title.plain()
        await pilot.press("f")
        app.session.flush()
        await pilot.press("l")
        assert isinstance(app.screen, LogScreen)
        entries = app.session.journal.logbook.entries()
        # the sign-on is itself an entry, then the fill
        assert [(e.kind, e.by) for e in entries] == [("remark", "JM"), ("ballast", "JM")]
        assert entries[0].change_text == "JM signed on as officer of the watch"


async def _cursor_to(pilot, app, key) -> None:
    board = app.screen.query_one(LoadBoard)
    await pilot.press("home")
    for _ in range(60):
        if board.cursor_key == key:
            return
        await pilot.press("down")
    raise AssertionError(f"cursor never reached {key}")


async def test_new_user_scenario_transfer_undo_and_sounding(app):
    """The issue's walk-through on the demo: pump ballast from one wing tank to another with a
    preview, undo it, fill a tank by sounding, and see the numbers and the GZ curve follow."""
    from textual.widgets import Input

    from deckload.ui.dialogs import TransferForm

    async with app.run_test(size=(120, 40)) as pilot:
        c0, r0 = app.session.condition, app.session.result
        await _cursor_to(pilot, app, ("tank", "WB2S"))
        await pilot.press("t")
        form = app.screen
        assert isinstance(form, TransferForm)
        form.query_one("#xfer-to", Input).value = "WB1S"
        form.query_one("#xfer-amount", Input).value = "10t"
        await pilot.pause()
        after = app.session.preview(form.plan.condition)[0]
        preview = form.query_one("#xfer-preview", LinePanel).plain()
        assert f"{r0.gm_fluid_m:.3f}" in preview and f"{after.gm_fluid_m:.3f}" in preview
        assert app.session.condition is c0  # the preview changes nothing
        await pilot.press("enter")
        await pilot.pause()
        r1 = app.session.result
        assert r1.displacement_t == pytest.approx(r0.displacement_t, abs=1e-9)  # mass conserved
        wb1s = next(t for t in r1.tanks if t.id == "WB1S")
        assert wb1s.mass_t == pytest.approx(10.0)
        assert r1.gm_fluid_m == pytest.approx(after.gm_fluid_m)
        assert r1.gz_port_m != r0.gz_port_m
        await pilot.press("u")
        await pilot.pause()
        assert app.session.condition == c0
        assert app.session.result.gm_fluid_m == pytest.approx(r0.gm_fluid_m)

        await _cursor_to(pilot, app, ("tank", "DB1P"))
        await pilot.press("enter")
        await pilot.press(*"0.5m", "enter")
        await pilot.pause()
        fill = app.session.condition.tank_fill("DB1P")
        assert (fill.quantity, fill.value) == ("sounding_m", 0.5)
        r2 = app.session.result
        db1p = next(t for t in r2.tanks if t.id == "DB1P")
        assert db1p.sounding_m == pytest.approx(0.5) and db1p.mass_t > 0
        assert r2.displacement_t == pytest.approx(r0.displacement_t + db1p.mass_t)
        assert f"{r2.displacement_t:.1f}" in app.screen.query_one("#afloat", LinePanel).plain()


async def test_restoring_a_logged_condition_is_one_undoable_change_logged_as_restore(app):
    from deckload.ui.log_screen import LogScreen

    async with app.run_test(size=(120, 40)) as pilot:
        c0 = app.session.condition
        await pilot.press("o", *"jm", "enter")
        await pilot.press("f")  # the tank under the cursor filled: logged with its condition
        app.session.flush()
        c1 = app.session.condition
        await pilot.press("u")  # back to the departure condition (logged too)
        app.session.flush()
        assert app.session.condition == c0
        await pilot.press("l")
        assert isinstance(app.screen, LogScreen)
        await pilot.press("end", "up")  # the fill entry, one above the undo
        await pilot.press("r", "r")
        await pilot.pause()
        assert not isinstance(app.screen, LogScreen)
        assert app.session.condition == c1
        app.session.flush()
        kinds = [e.kind for e in app.session.journal.logbook.entries()]
        assert kinds[-1] == "restore"
        await pilot.press("u")
        assert app.session.condition == c0


async def test_restoring_from_the_log_keeps_an_edited_working_condition_beside_it(app):
    """The edited condition a restore replaces is in no file of its own: it is kept as the working
    file's .previous, as ``deckload open`` keeps the working file it replaces (undo alone would
    lose it when the session ends)."""
    from deckload.ui.log_screen import LogScreen

    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("o", *"jm", "enter")
        await pilot.press("f")  # logged with its condition
        app.session.flush()
        c1 = app.session.condition
        await pilot.press("minus", "minus")
        await pilot.pause()
        edited = app.session.condition
        assert edited.modified_from and edited != c1
        await pilot.press("l")
        assert isinstance(app.screen, LogScreen)
        await pilot.press("end")
        await pilot.press("r", "r")
        await pilot.pause()
        assert app.session.condition == c1
        kept = app.session.save_path.with_name(app.session.save_path.name + ".previous")
        assert load_condition(kept, app.session.vessel) == edited


@pytest.mark.parametrize("kind", ["deck", "const"])
async def test_a_nudge_never_takes_an_item_past_what_a_file_may_hold(app, kind):
    """+ on a deck load or constant already at the greatest mass one item may have (the table's
    greatest displacement less the lightship, deckload.core.bounds.item_mass_range) is refused: the
    saved working condition would be a file the reader refuses, set aside as unreadable at the
    next start.  The working file stays one that reads back."""
    import dataclasses

    from deckload.core import bounds

    top = bounds.item_mass_range(app.session.vessel).high
    async with app.run_test(size=(120, 40)) as pilot:
        s = app.session
        items = s.condition.deck_items if kind == "deck" else s.condition.constants
        at_top = dataclasses.replace(items[0], mass_t=top)
        field = "deck_items" if kind == "deck" else "constants"
        app.loading_screen.commit(s.condition.replace(**{field: (at_top, *items[1:])}), "to the top", "edit")
        await pilot.pause()
        assert app.screen.query_one(LoadBoard).select((kind, 0))
        await pilot.press("plus")
        await pilot.pause()
        items = s.condition.deck_items if kind == "deck" else s.condition.constants
        assert items[0].mass_t == top
        assert "above the physical limit" in app.screen.query_one("#status", LinePanel).plain()
        await pilot.press("minus")
        await pilot.pause()
        s.flush()
        back = load_condition(s.save_path, s.vessel)
        assert (back.deck_items if kind == "deck" else back.constants)[0].mass_t == top - 1.0


async def test_a_hold_steps_down_by_nudges_from_any_mass(app):
    """− on a hold whose mass has decimals (1.00001 t) gives 0.00001 t, which the old text round
    trip wrote as '1e-05' and refused as not a number; and from a mass over the structural limit
    (no form or file gives one, a condition built in code may, with its danger warning) − steps down towards it, while + and a typed
    mass over it are still refused."""
    hold = app.session.vessel.hold("H1")
    async with app.run_test(size=(120, 40)) as pilot:
        assert app.screen.query_one(LoadBoard).select(("hold", "H1"))
        await pilot.press("enter", *"1.00001", "enter", "minus")
        await pilot.pause()
        assert hold_mass(app, "H1") == pytest.approx(1e-05, abs=1e-12)
        over = hold.max_mass_t + 5.0
        s = app.session
        app.loading_screen.commit(s.condition.with_hold(HoldLoad("H1", over)), "over the limit", "cargo")
        await pilot.pause()
        await pilot.press("plus")
        await pilot.pause()
        assert hold_mass(app, "H1") == over and "structural limit" in app.screen.query_one("#status", LinePanel).plain()
        await pilot.press("minus")
        await pilot.pause()
        assert hold_mass(app, "H1") == over - 1.0
