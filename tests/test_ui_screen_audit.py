"""What a trial of the loading screen found, each checked by keys on the Demo Islander (or by the
screen's own entry functions where the keys add nothing):

* a condition outside the tables has no result: no panel may word a criterion of the last good
  condition as met or ok (DEVELOPERS.md: no view words an unassessed criterion as a pass), the
  tanks' state marks are the calculation's rule applied to the fill, not 'slack' for anything held,
  and recording it says it went in without a result;
* a sounding typed in a condition sounded trimmed (``sounding_trim_m``) is previewed, confirmed and
  nudged from the volume the calculation takes, not the even-keel table's;
* a density stated with D stays with the tank through emptying, and the confirmation says so;
* the help's amounts, the worst band's edges, the deck-area field's case and a deck load of 0 t.

The references are the calculation itself (``evaluate``): the screen must say what it computes.
"""

from __future__ import annotations

import re

import pytest

from deckload.core.model import TankFill
from deckload.core.stability import evaluate
from deckload.io.profiles import load_condition, save_condition
from deckload.ui import entry, verdict
from deckload.ui.dialogs import PromptForm
from deckload.ui.widgets import LoadBoard
from demo_vessels import demo_departure, departure_app, status_text

VERDICT_WORD = re.compile(r"\b(met|ok|NEAR|FAIL|NOT MET|pass\w*)\b", re.IGNORECASE)


def _app(tmp_path, condition=None):
    return departure_app(tmp_path, condition, officer="AU")


def _marks(app) -> dict[str, str]:
    """Each tank's state mark on the board (the row's first cell)."""
    board = app.screen.query_one(LoadBoard)
    return {r.key[1]: r.text.plain[0] for r in board.rows if r.key and r.key[0] == "tank"}


_status = status_text


# --------------------------------------------------------------------------- outside the tables


async def test_a_condition_outside_the_tables_shows_no_verdict_anywhere_and_records_as_without_result(tmp_path):
    """Demo departure, H1 ⏎ 250 t: 1008 t, above the hydrostatic table's 1000 t (the trial's case)."""
    from textual.widgets import Input

    app = _app(tmp_path)
    async with app.run_test(size=(160, 50)) as pilot:
        await pilot.pause()
        marks_before = _marks(app)
        assert "met" in app.screen.query_one("#criteria").plain()  # the premise: a verdict is on show
        assert app.screen.query_one(LoadBoard).select(("hold", "H1"))
        await pilot.press("enter", *"250", "enter")
        await pilot.pause()
        assert app.session.stale  # the premise: no result for the condition on screen
        criteria = app.screen.query_one("#criteria").plain()
        assert "NO VERDICT" in criteria and "outside the vessel's tables" in criteria
        assert not VERDICT_WORD.search(criteria), criteria
        # every tank's fill is unchanged: its mark is the one the calculation gave (WB2P, FPT full ■)
        assert _marks(app) == marks_before and marks_before["WB2P"] == "■" and marks_before["FPT"] == "■"
        gz = app.screen.query_one("#gz").plain()
        assert "last good condition" in gz.splitlines()[0]
        await pilot.press("b")  # the wind plot: the last a and b are not this condition's
        await pilot.pause()
        wind = app.screen.query_one("#gz").plain()
        assert "m·rad" not in wind and "no result" in wind
        await pilot.press("s")
        await pilot.pause()
        app.screen.query_one("#record-remark", Input).value = "outside?"
        await pilot.press("enter")
        await pilot.pause()
        assert "WITHOUT A RESULT" in _status(app) and "no stability computed" in _status(app)


def test_the_criteria_lines_of_a_stale_result_carry_no_verdict_word_at_any_width():
    vessel, departure = demo_departure()
    last_good = evaluate(vessel, departure)
    for width in (30, 48, 60, 94):
        text = "\n".join(t.plain for t in verdict.criteria_lines(last_good, True, width))
        assert "NO VERDICT" in text and not VERDICT_WORD.search(text), (width, text)
        assert all(len(line) <= width for line in text.splitlines())
    assert len(verdict.criteria_lines(last_good, True, 60, 1)) == 1


# --------------------------------------------------------------------------- soundings taken trimmed


def _sounded_trimmed():
    vessel, departure = demo_departure()
    return vessel, departure.replace(sounding_trim_m=0.8)


def _calc_db1p(vessel, condition):
    return next(t for t in evaluate(vessel, condition).tanks if t.id == "DB1P")


def test_the_preview_confirmation_and_nudge_of_a_sounding_use_the_conditions_sounding_trim():
    vessel, cond = _sounded_trimmed()
    tank = vessel.tank("DB1P")
    after = entry.tank_from_text(cond, tank, "0.5m")
    calc = _calc_db1p(vessel, after)  # the calculation corrects 0.500 m read at 0.8 m trim by the stern
    level = _calc_db1p(vessel, cond.replace(sounding_trim_m=0.0, tanks=after.tanks))
    assert abs(calc.volume_m3 - level.volume_m3) > 1.0  # the premise: the correction matters here
    preview = entry.amount_preview(cond, tank, "0.5m", vessel)
    assert preview.startswith(f"= {calc.fill_pct:.1f} % · {calc.volume_m3:.2f} m³ · {calc.mass_t:.2f} t")
    assert "trim +0.80 m" in preview
    said = entry.describe_fill(tank, after.tank_fill("DB1P"), vessel, after)
    assert said.endswith(f"= {calc.volume_m3:.2f} m³") and "trim +0.80 m" in said
    nudged = _calc_db1p(vessel, entry.nudge_tank(after, tank, 1.0, vessel))
    assert nudged.fill_pct == pytest.approx(calc.fill_pct + 1.0, abs=1e-6)


async def test_the_screen_previews_and_confirms_a_trimmed_sounding_as_the_board_shows_it(tmp_path):
    vessel, cond = _sounded_trimmed()
    app = _app(tmp_path, cond)
    async with app.run_test(size=(160, 50)) as pilot:
        await pilot.pause()
        assert app.screen.query_one(LoadBoard).select(("tank", "DB1P"))
        await pilot.press("enter", *"0.5m")
        await pilot.pause()
        assert isinstance(app.screen, PromptForm)
        preview = str(app.screen.query_one("#prompt-preview").render())
        await pilot.press("enter")
        await pilot.pause()
        calc = _calc_db1p(vessel, app.session.condition)
        assert f"{calc.volume_m3:.2f} m³" in preview and "trim +0.80 m" in preview
        assert f"= {calc.volume_m3:.2f} m³" in _status(app) and "trim +0.80 m" in _status(app)


# --------------------------------------------------------------------------- stated density


def test_a_stated_density_stays_with_the_tank_through_emptying_and_refilling(tmp_path):
    vessel, cond = demo_departure()
    tank = vessel.tank("FO1P")
    stated = entry.set_tank_density(cond, tank, "0.95")
    for emptied in (entry.tank_from_text(stated, tank, "0%"), entry.nudge_tank(
            entry.tank_from_text(stated, tank, "0.5%"), tank, -1.0, vessel)):
        assert emptied.tank_fill("FO1P").density_t_m3 == 0.95
        assert entry.held_m3(vessel, emptied, tank) == 0.0
        assert "0.950 t/m³ stays" in entry.density_kept_note(vessel, stated, emptied, "FO1P")
        refilled = entry.tank_from_text(emptied, tank, "10m3")
        got = next(t for t in evaluate(vessel, refilled).tanks if t.id == "FO1P")
        assert got.mass_t == pytest.approx(10.0 * 0.95, rel=1e-12)  # m = V·ρ at the stated density
        path = tmp_path / "emptied.condition.toml"  # an empty tank with its density reads back
        save_condition(path, emptied)
        assert load_condition(path, vessel).tank_fill("FO1P") == emptied.tank_fill("FO1P")
    assert entry.density_kept_note(vessel, cond, entry.tank_from_text(cond, tank, "0%"), "FO1P") == ""


async def test_e_keeps_the_stated_density_and_says_so(tmp_path):
    app = _app(tmp_path)
    async with app.run_test(size=(160, 50)) as pilot:
        await pilot.pause()
        assert app.screen.query_one(LoadBoard).select(("tank", "FO1P"))
        await pilot.press("D", *"0.95", "enter")
        await pilot.pause()
        await pilot.press("e")
        await pilot.pause()
        assert app.session.condition.tank_fill("FO1P").density_t_m3 == 0.95
        assert "stated density 0.950 t/m³ stays" in _status(app)
        await pilot.press("e")
        await pilot.pause()
        assert "already empty" in _status(app)


# --------------------------------------------------------------------------- smaller ones


def test_the_help_lists_ullage_among_the_amounts():
    from rich.console import Console

    from deckload.ui.dialogs import help_page

    console = Console(width=200, record=True)
    console.print(help_page())
    amounts = next(x for x in console.export_text().splitlines() if x.startswith("Amounts:"))
    assert "0.85u (ullage)" in amounts


def test_the_worst_band_is_worded_with_the_edges_the_check_uses():
    """Demo DB1P: worst band [33.5, 64.6] % (its profile); at 45 % it is flagged, at 64.7 % not."""
    vessel, cond = demo_departure()
    assert vessel.tank("DB1P").worst_band_pct == (33.5, 64.6)
    inside = evaluate(vessel, cond.with_tank(TankFill("DB1P", "percent", 45.0)))
    words = [w.message for w in inside.warnings if w.code == "slack-worst-band"]
    assert words == ["DB1P (No.1 double bottom ballast port) at 45 % is in its worst free-surface band 33.5–64.6 %"]
    outside = evaluate(vessel, cond.with_tank(TankFill("DB1P", "percent", 64.7)))
    assert not [w for w in outside.warnings if w.code == "slack-worst-band"]


def test_the_deck_area_field_ignores_case_and_refuses_an_ambiguous_one():
    import dataclasses

    vessel, _ = demo_departure()
    form = entry.ItemForm("crate", "2", "6.5", "5.0", "0", "aftdeck")
    assert entry.item_from_form(vessel, form, deck=True).area_id == "AFTDECK"
    twin = dataclasses.replace(vessel.deck_areas[0], id="AftDeck")
    two = dataclasses.replace(vessel, deck_areas=vessel.deck_areas + (twin,))
    assert entry.item_from_form(two, dataclasses.replace(form, area="AftDeck"), deck=True).area_id == "AftDeck"
    with pytest.raises(entry.EntryError, match="differ only in case"):
        entry.item_from_form(two, form, deck=True)
    with pytest.raises(entry.EntryError, match="not one of this vessel's deck areas"):
        entry.item_from_form(vessel, dataclasses.replace(form, area="foredeck"), deck=True)


def test_a_deck_load_of_nothing_is_refused_by_its_form_and_by_a_nudge():
    import dataclasses

    vessel, _ = demo_departure()
    form = entry.ItemForm("crate", "0", "6.5", "5.0", "0", "")
    with pytest.raises(entry.EntryError, match="more than 0 t"):
        entry.item_from_form(vessel, form, deck=True)
    assert entry.item_from_form(vessel, form, deck=False).mass_t == 0.0  # a constant of 0 t replaces a fixed one
    assert entry.item_from_form(vessel, dataclasses.replace(form, mass="0.001"), deck=True).mass_t == 0.001
    with pytest.raises(entry.EntryError, match="remove it with e"):
        entry.nudge_mass(1.0, -1.0, "crate", vessel, deck=True)
    assert entry.nudge_mass(1.0, -1.0, "stores", vessel) == 0.0
