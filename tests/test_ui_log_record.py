"""A log that reads like a record: a run of nudges is one entry with the level reached, a transfer
one entry, a plan none until applied, sign-on and sign-off entries.

The demo vessel through the same factory as ``deckload open`` (create_app), log in a tmp folder.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.ui.conditions import PlanEndForm
from deckload.ui.launch import create_app
from deckload.ui.session import Session, run_text
from deckload.ui.widgets import LoadBoard
from demo_vessels import demo_departure


@pytest.fixture(scope="module")
def demo():
    return demo_departure()


@pytest.fixture
def app(demo, tmp_path):
    v, c = demo
    return create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="JS",
                      profile_path=paths.DEMO_PROFILE)


def entries(app):
    app.session.flush()
    return app.session.journal.logbook.entries()


async def to_tank(pilot, app, tank_id: str) -> None:
    board = app.screen.query_one(LoadBoard)
    board.select(("tank", tank_id))
    await pilot.pause()
    assert board.cursor_key == ("tank", tank_id)


def test_run_text_names_the_values_reached():
    assert run_text("WB1P", (12.0, 7.1), (22.0, 13.04), "WB1P +1 %", 10) == \
        "WB1P 12 % → 22 %, 7.1 t → 13.0 t (10 changes)"
    assert run_text("H1", (None, 20.0), (None, 23.0), "H1 +1 t", 3) == "H1 20.0 t → 23.0 t (3 changes)"


async def test_ten_nudges_are_one_entry_with_the_level_reached(app):
    async with app.run_test(size=(120, 40)) as pilot:
        await to_tank(pilot, app, "WB1P")
        before = next(t for t in app.session.result.tanks if t.id == "WB1P")
        n0 = len(entries(app))
        for _ in range(10):
            await pilot.press("plus")
        await pilot.pause()
        assert app.session.undo_depth == 10  # each nudge still undoable on its own
        await pilot.press("down")  # the cursor moves on: the run ends
        await pilot.pause()
        new = entries(app)[n0:]
        after = next(t for t in app.session.result.tanks if t.id == "WB1P")
        assert len(new) == 1, [e.change_text for e in new]
        e = new[0]
        assert e.kind == "ballast" and e.by == "JS"
        assert e.change_text == (f"WB1P {before.fill_pct:.1f} % → {after.fill_pct:.1f} %, ".replace(".0 %", " %")
                                 + f"{before.mass_t:.1f} t → {after.mass_t:.1f} t (10 changes)")
        # 10 nudges of 1 % of capacity (common practice of the screen: a nudge is 1 % of capacity)
        assert after.fill_pct == pytest.approx(before.fill_pct + 10.0, abs=1e-6)
        assert e.change_data["to_pct"] == pytest.approx(after.fill_pct, abs=0.01)


async def test_a_pause_ends_a_run_of_nudges_and_each_nudge_starts_the_pause_again(app, monkeypatch):
    """The run of nudges of one tank is logged when the keys stop for RUN_PAUSE_S (here 0.5 s): a
    nudge inside the pause starts it again, and the one entry counts both nudges."""
    import asyncio
    import time

    from deckload.ui import main_screen

    monkeypatch.setattr(main_screen, "RUN_PAUSE_S", 0.5)
    async with app.run_test(size=(120, 40)) as pilot:
        await to_tank(pilot, app, "WB1P")
        n0 = len(entries(app))
        pressed = time.monotonic()  # the first key is handled after this, so its pause ends after pressed + 0.5
        await pilot.press("plus")
        first = time.monotonic()
        await asyncio.sleep(0.3)
        before_second = time.monotonic()  # the second key is handled after this
        await pilot.press("plus")  # inside the pause: the run goes on, the pause starts again
        second = time.monotonic()  # the key was handled by now (press waits for it)
        # The first key was handled between `pressed` and `first`, its pause ends 0.5 s later; the
        # second between `before_second` and `second`.  Certainly inside the first pause, or
        # certainly after it; a machine so loaded that neither is certain may do either.
        in_time = second < pressed + 0.5
        late = before_second >= first + 0.5
        await asyncio.sleep(0.3)
        # past the first nudge's pause, inside the second's (unless the machine stalled past it too)
        run, now = app.session._run, time.monotonic()
        assert now - first > 0.5
        if in_time and now - second < 0.45:
            assert run is not None and run.steps == 2
        while time.monotonic() - second < 0.5 + 0.3:
            await asyncio.sleep(0.05)
        await pilot.pause()
        assert app.session._run is None and app.loading_screen._settle_timer is None  # the pause ended it
        new = [e.change_text for e in entries(app)[n0:]]
        if in_time:
            assert [t.endswith("(2 changes)") for t in new] == [True], new
        elif late:
            assert len(new) == 2 and not any(t.endswith("changes)") for t in new), new
        else:
            assert len(new) in (1, 2), new


async def test_a_confirmed_transfer_is_one_entry(app):
    async with app.run_test(size=(120, 40)) as pilot:
        await to_tank(pilot, app, "WB2P")  # full; its partner WB2S is full too, so name WB1P
        n0 = len(entries(app))
        await pilot.press("t")
        await pilot.pause()
        app.screen.query_one("#xfer-to").value = "WB1P"
        app.screen.query_one("#xfer-amount").value = "2t"
        app.screen.query_one("#xfer-amount").focus()
        await pilot.press("enter")
        await pilot.pause()
        new = entries(app)[n0:]
        assert [e.kind for e in new] == ["transfer"]


async def test_plan_edits_enter_the_log_only_when_applied_as_one_entry(app):
    async with app.run_test(size=(120, 40)) as pilot:
        await to_tank(pilot, app, "WB1P")
        n0 = len(entries(app))
        await pilot.press("x")
        await pilot.pause()
        assert app.session.planning and "PLAN" in app.screen.query_one("#titlebar").plain()
        for _ in range(3):
            await pilot.press("plus")
        await pilot.press("down", "plus")  # and the next line's tank
        await pilot.pause()
        assert len(entries(app)) == n0  # nothing logged while planning
        planned = app.session.condition
        await pilot.press("x")
        await pilot.pause()
        assert isinstance(app.screen, PlanEndForm)
        await pilot.press("enter")
        await pilot.pause()
        new = entries(app)[n0:]
        assert len(new) == 1 and new[0].change_text.startswith("Plan applied (4 changes): WB1P +1 % ×3; ")
        assert app.session.condition == planned and not app.session.planning


async def test_a_discarded_plan_logs_nothing_and_returns(app):
    async with app.run_test(size=(120, 40)) as pilot:
        await to_tank(pilot, app, "WB1P")
        start = app.session.condition
        n0 = len(entries(app))
        await pilot.press("x", "plus", "plus", "x")
        await pilot.pause()
        await pilot.press("d")
        await pilot.pause()
        assert app.session.condition == start and len(entries(app)) == n0


async def test_sign_off_and_handover_are_logged(app):
    async with app.run_test(size=(120, 40)) as pilot:
        n0 = len(entries(app))
        await pilot.press("o")
        await pilot.pause()
        app.screen.query_one("#prompt-input").value = ""
        await pilot.press(*"km", "enter")
        await pilot.pause()
        await pilot.press("o")
        await pilot.pause()
        app.screen.query_one("#prompt-input").value = ""
        await pilot.press("minus", "enter")
        await pilot.pause()
        texts = [(e.by, e.change_text) for e in entries(app)[n0:]]
        assert texts == [("JS", "JS signed off watch, handing over to KM"),
                         ("KM", "KM signed on as officer of the watch"),
                         ("KM", "KM signed off watch")]
        assert app.session.journal.officer == ""


def test_session_run_is_logged_when_another_change_comes(demo, tmp_path):
    from deckload.ui.launch import open_journal

    v, c = demo
    j = open_journal(tmp_path / "logs", v.particulars.name)
    j.officer = "JS"
    s = Session(v, c, save_path=None, journal=j)
    from deckload.ui import entry

    tank = v.tank("WB1P")
    for _ in range(3):
        s.commit(entry.nudge_tank(s.condition, tank, 1.0), "WB1P +1 %", "ballast", run=("tank", "WB1P"))
    assert j.logbook.entries() == []
    s.commit(s.condition.with_density(1.010), "ρ 1.010")
    texts = [e.change_text for e in j.logbook.entries()]
    assert len(texts) == 2 and texts[0].startswith("WB1P ") and texts[0].endswith("(3 changes)")
    assert texts[1] == "ρ 1.010"
    j.logbook.close()


async def test_f_fills_to_the_usual_maximum_then_to_100(app):
    """Fuel oil to 95 % (the demo profile gives no [usual_fill]: model.USUAL_MAX_PCT, common
    practice), a second f to 100 %; ballast straight to 100 %."""
    from deckload.core.model import TankFill

    async with app.run_test(size=(120, 40)) as pilot:
        c = app.session.condition.with_tank(TankFill("FO1P", "percent", 40.0))
        app.loading_screen.commit(c, "setup")
        await to_tank(pilot, app, "FO1P")
        await pilot.press("f")
        await pilot.pause()
        assert app.session.condition.tank_fill("FO1P") == TankFill("FO1P", "percent", 95.0)
        await pilot.press("f")
        await pilot.pause()
        assert app.session.condition.tank_fill("FO1P") == TankFill("FO1P", "percent", 100.0)
        await to_tank(pilot, app, "WB1P")
        await pilot.press("f")
        await pilot.pause()
        assert app.session.condition.tank_fill("WB1P") == TankFill("WB1P", "percent", 100.0)


def test_usual_fill_from_the_profile_and_its_bounds():
    from deckload.io.profiles import ProfileError, parse_profile

    text = paths.DEMO_PROFILE.read_text(encoding="utf-8")
    v = parse_profile(text + "\n[usual_fill]\nfuel_oil = 90.0\n", str(paths.DEMO_PROFILE))
    assert v.usual_max_pct("fuel_oil") == 90.0 and v.usual_max_pct("ballast") == 100.0
    with pytest.raises(ProfileError, match="usual_fill.fuel_oil"):
        parse_profile(text + "\n[usual_fill]\nfuel_oil = 120.0\n", str(paths.DEMO_PROFILE))


def test_receiving_tank_is_one_that_can_take_it(demo):
    """The partner when it has room; when it is full (WB2S in the departure condition), the ballast
    tank with the most room (WB1P/WB1S, 38.2 m³ empty, the largest of the demo's ballast tanks)."""
    from deckload.core.model import TankFill
    from deckload.ui.entry import receiving_tank

    v, c = demo
    assert receiving_tank(v, c, "WB2P") in {"WB1P", "WB1S"}
    assert receiving_tank(v, c.with_tank(TankFill("WB2S", "percent", 50.0)), "WB2P") == "WB2S"
