"""A watch's day on the loading screen, by keys (textual pilot), on the demo vessel:

transfer, bunker by sounding, a deck item, dock water ρ 1.010, name the condition, record it,
print from the screen, quit, reopen — the header, the log and the report carry the new name and
the values that were on the screen.  Built with the same factory and start-up as ``deckload``
(create_app, load_inputs), the working folder and the log in tmp folders.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.logbook import Logbook
from deckload.io.profiles import load_condition
from deckload.ui.conditions import ReportWritten
from deckload.ui.launch import create_app, load_inputs
from deckload.ui.widgets import LinePanel, LoadBoard
from demo_vessels import demo_vessel

NAME = "Sailing 2 Dec, dock water"


def panel(app, name: str) -> str:
    return app.screen.query_one(f"#{name}", LinePanel).plain()


async def to_tank(pilot, app, tank_id: str) -> None:
    board = app.screen.query_one(LoadBoard)
    board.select(("tank", tank_id))
    await pilot.pause()
    assert board.cursor_key == ("tank", tank_id)


@pytest.mark.long
async def test_the_watch_day(tmp_path):
    work, logs = tmp_path / "work", tmp_path / "logs"
    vessel = demo_vessel()
    start = load_condition(paths.DEMO_CONDITIONS["departure"], vessel)
    app = create_app(vessel, start, work_dir=work, log_dir=logs, officer="JS", profile_path=paths.DEMO_PROFILE)
    async with app.run_test(size=(120, 40)) as pilot:
        # 1. ballast transfer: 10 t from WB2P into the empty WB1P
        await to_tank(pilot, app, "WB2P")
        await pilot.press("t")
        await pilot.pause()
        app.screen.query_one("#xfer-to").value = "WB1P"
        app.screen.query_one("#xfer-amount").value = "10t"
        app.screen.query_one("#xfer-amount").focus()
        await pilot.press("enter")
        await pilot.pause()
        assert app.session.condition.tank_fill("WB1P") is not None
        # 2. bunkering by sounding: FO1P to 90 % of the level it shows now
        await to_tank(pilot, app, "FO1P")
        level = next(t for t in app.session.result.tanks if t.id == "FO1P").sounding_m
        await pilot.press("enter")
        await pilot.pause()
        await pilot.press(*f"{0.9 * level:.2f}m", "enter")
        await pilot.pause()
        assert app.session.condition.tank_fill("FO1P").quantity == "sounding_m"
        # 3. a deck item
        await pilot.press("a")
        await pilot.pause()
        await pilot.press(*"Spare anchor", "tab", *"2.5", "tab", *"20", "tab", *"5.2", "enter")
        await pilot.pause()
        assert "Spare anchor" in [d.name for d in app.session.condition.deck_items]
        # 4. dock water
        await pilot.press("d")
        await pilot.pause()
        await pilot.press(*"1.010", "enter")
        await pilot.pause()
        assert app.session.condition.water_density_t_m3 == 1.010
        assert "(modified from Departure, full stores)" in panel(app, "titlebar")
        # 5. name it
        await pilot.press("n")
        await pilot.pause()
        await pilot.press(*NAME, "enter")
        await pilot.pause()
        assert NAME in panel(app, "titlebar") and "modified" not in panel(app, "titlebar")
        # 6. record it
        await pilot.press("s")
        await pilot.pause()
        await pilot.press("tab", *"ready to sail", "enter")
        await pilot.pause()
        # 7. print from the screen
        shown_gm = f"{app.session.result.gm_fluid_m:.3f}"
        shown_disp = f"{app.session.result.displacement_t:.1f}"
        assert shown_gm in panel(app, "afloat") and shown_disp in panel(app, "afloat")
        await pilot.press("p")
        await pilot.pause()
        assert isinstance(app.screen, ReportWritten)
        await pilot.press("escape")
        await pilot.pause()
        # 8. quit
        await pilot.press("q")
        await pilot.pause()

    # 9. reopen as `deckload` does: the working file comes back with its name
    vessel2, condition2, _, _, _ = load_inputs(None, None, work)
    assert condition2.name == NAME and condition2.modified_from == ""
    assert condition2.water_density_t_m3 == 1.010
    app2 = create_app(vessel2, condition2, work_dir=work, log_dir=logs, officer="JS", profile_path=paths.DEMO_PROFILE)
    async with app2.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        assert NAME in panel(app2, "titlebar")
        assert f"{app2.session.result.gm_fluid_m:.3f}" == shown_gm  # same condition, same numbers
    book = Logbook.open(logs, vessel.particulars.name, readonly=True)
    entries = book.entries()
    book.close()
    recorded = [e for e in entries if e.kind == "condition"]
    assert len(recorded) == 1 and recorded[0].change_text == f"condition recorded: {NAME}"
    assert recorded[0].remark == "ready to sail" and recorded[0].summary["condition_name"] == NAME
    assert any(e.kind == "transfer" for e in entries)
    reports = sorted((logs / "reports").glob("*.txt"))
    assert len(reports) == 1
    text = reports[0].read_text(encoding="utf-8")
    assert f"Condition: {NAME}" in text
    assert shown_gm in text and shown_disp in text and "1.010" in text
    assert "never replaces" in text  # the caution stays on every printed output
