"""Density at the tank: a liquid's density per tank per condition (a bunker delivery note), stated
on the screen (key D), saved in the condition file, shown on the board and in the report, and
logged as an edit.  Mass = V·ρ (common practice: the definition of density)."""

from __future__ import annotations

import pytest

from deckload.core.model import TankFill
from deckload.core.stability import evaluate
from deckload.io import paths
from deckload.io.tomlcheck import ProfileError
from deckload.io.profiles import dump_condition, load_condition, parse_condition
from deckload.logbook import Logbook
from deckload.report.condition_report import render_report_html, render_report_text
from deckload.ui import entry, views
from deckload.ui.dialogs import PromptForm
from deckload.ui.launch import create_app, load_inputs
from deckload.ui.widgets import LinePanel, LoadBoard
from demo_vessels import demo_vessel

BDN_RHO = 0.9912
"""Density from an (invented) bunker delivery note, t/m³ at 15 °C, four decimals as such notes give it."""


@pytest.fixture(scope="module")
def demo():
    v = demo_vessel()
    return v, load_condition(paths.DEMO_CONDITIONS["departure"], v)


def _tank(result, tid):
    return next(t for t in result.tanks if t.id == tid)


def test_a_stated_density_keeps_the_volume_and_makes_the_mass_v_rho(demo):
    v, c = demo
    before = _tank(evaluate(v, c), "FO1P")
    c2 = entry.set_tank_density(c, v.tank("FO1P"), f"{BDN_RHO}")
    assert c2.tank_fill("FO1P") == TankFill("FO1P", "percent", 95.0, BDN_RHO)
    after = _tank(evaluate(v, c2), "FO1P")
    assert after.volume_m3 == before.volume_m3  # the stated 95 % is the same volume
    assert after.density_t_m3 == BDN_RHO
    assert after.mass_t == pytest.approx(after.volume_m3 * BDN_RHO, rel=1e-15)  # one multiplication
    assert after.mass_t == pytest.approx(0.95 * 13.1773 * BDN_RHO, rel=1e-12)  # by hand: 95 % of 13.1773 m³
    back = entry.set_tank_density(c2, v.tank("FO1P"), "default")
    assert back.tank_fill("FO1P") == TankFill("FO1P", "percent", 95.0, None)


def test_a_mass_keeps_the_mass_and_must_still_fit_the_tank(demo):
    v, c = demo
    tank = v.tank("FO1P")  # 13.1773 m³
    c2 = c.with_tank(TankFill("FO1P", "mass_t", 11.0))
    r = _tank(evaluate(v, entry.set_tank_density(c2, tank, "0.95")), "FO1P")
    assert r.mass_t == 11.0 and r.volume_m3 == pytest.approx(11.0 / 0.95, rel=1e-12)
    with pytest.raises(entry.EntryError, match=r"FO1P: 11 t is more than its capacity 10\.54 t at 0\.800 t/m³"):
        entry.set_tank_density(c2, tank, "0.8")  # 11 t of 0.8 t/m³ is 13.75 m³ > 13.18 m³


@pytest.mark.parametrize("typed, why", [("0.45", "below the lowest accepted value 0.5"),
                                        ("2.6", "above the highest accepted value 2.5"),
                                        ("991.2", "above the highest accepted value 2.5"),  # kg/m³ for t/m³
                                        ("0,99", "decimal point"), ("heavy", "not a number")])
def test_a_density_outside_physics_is_refused_with_the_rule(demo, typed, why):
    v, c = demo
    with pytest.raises(entry.EntryError, match=why) as err:
        entry.set_tank_density(c, v.tank("FO1P"), typed)
    assert "Density in FO1P" in str(err.value)


def test_liquid_mud_of_a_supply_vessel_is_a_density_not_a_typing_error(demo, tmp_path):
    """Liquid mud at 2.4 t/m³ (an offshore supply vessel's liquid-mud tanks are commonly specified
    for a specific gravity of 2.5: common practice, from memory) was refused above 2.0.  Stated on
    the screen for 10 m³ in a tank it is 24.0 t (mass = V·ρ), and a condition file keeps it."""
    v, c = demo
    c2 = entry.set_tank_density(c, v.tank("DB1P"), "2.4")
    c3 = entry.set_tank(c2, v.tank("DB1P"), "volume_m3", 10.0)
    assert _tank(evaluate(v, c3), "DB1P").mass_t == pytest.approx(24.0, rel=1e-15)
    again = parse_condition(dump_condition(c3), "mud.condition.toml", v)
    assert again.tank_fill("DB1P") == TankFill("DB1P", "volume_m3", 10.0, 2.4)
    top = entry.set_tank_density(c, v.tank("DB1P"), "2.5")  # the highest accepted, itself accepted
    assert top.tank_fill("DB1P").density_t_m3 == 2.5


def test_an_empty_tank_keeps_a_stated_density_for_what_is_put_in(demo):
    v, c = demo
    c2 = entry.set_tank_density(c, v.tank("DB1P"), "1.010")
    assert c2.tank_fill("DB1P") == TankFill("DB1P", "percent", 0.0, 1.010)
    c3 = entry.set_tank(c2, v.tank("DB1P"), "volume_m3", 10.0)
    assert _tank(evaluate(v, c3), "DB1P").mass_t == pytest.approx(10.0 * 1.010, rel=1e-15)


def test_the_condition_file_keeps_the_density_and_the_report_shows_it(demo):
    v, c = demo
    c2 = entry.set_tank_density(c, v.tank("FO1P"), f"{BDN_RHO}")
    text = dump_condition(c2)
    assert f"density_t_m3 = {BDN_RHO}" in text
    again = parse_condition(text, "fo1p.condition.toml", v)
    assert again.tank_fill("FO1P") == c2.tank_fill("FO1P")
    r = evaluate(v, again)
    report = render_report_text(r, v, again)
    row = next(ln for ln in report.splitlines() if ln.startswith("Tank") and " FO1P " in ln)
    assert row.rstrip().endswith(f"{BDN_RHO:.3f}◆") and f"{_tank(r, 'FO1P').mass_t:.2f}" in row
    assert "◆ density stated for this condition (bunker delivery note)" in report
    other = next(ln for ln in report.splitlines() if ln.startswith("Tank") and " FO1S " in ln)
    assert other.rstrip().endswith("0.850")  # the default is not marked
    assert "0.991◆" in render_report_html(r, v, again)


def test_a_file_density_outside_physics_names_the_key(demo):
    v, c = demo
    text = dump_condition(c).replace("[tanks.FO1P]\n", "[tanks.FO1P]\ndensity_t_m3 = 2.6\n")
    with pytest.raises(ProfileError) as err:
        parse_condition(text, "bdn.condition.toml", v)
    said = str(err.value)
    assert "bdn.condition.toml" in said and "tanks.FO1P.density_t_m3" in said and "2.6" in said


async def test_density_by_key_shows_on_the_board_is_logged_and_comes_back_on_reopen(tmp_path):
    v = demo_vessel()
    c = load_condition(paths.DEMO_CONDITIONS["departure"], v)
    work, logs = tmp_path / "work", tmp_path / "logs"
    app = create_app(v, c, work_dir=work, log_dir=logs, officer="TS", profile_path=paths.DEMO_PROFILE)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        board = app.screen.query_one(LoadBoard)
        volume = _tank(app.session.result, "FO1P").volume_m3
        assert board.select(("tank", "FO1P"))
        await pilot.press("D")
        await pilot.pause()
        assert isinstance(app.screen, PromptForm)
        await pilot.press(*"2.6", "enter")  # replaces the selected value; refused: the form stays, naming the range
        assert isinstance(app.screen, PromptForm)
        assert "above the highest accepted value" in str(app.screen.query_one("#form-message").render())
        await pilot.press("end", "ctrl+u", *f"{BDN_RHO}", "enter")
        await pilot.pause()
        assert app.session.condition.tank_fill("FO1P").density_t_m3 == BDN_RHO
        fo1p = _tank(app.session.result, "FO1P")
        assert fo1p.volume_m3 == volume and fo1p.mass_t == pytest.approx(volume * BDN_RHO, rel=1e-15)
        row = next(r.text.plain for r in board.rows if r.key == ("tank", "FO1P"))
        assert row.startswith("≈ FO1P ◆") and f"{fo1p.mass_t:8.2f}{BDN_RHO:6.3f}" in row
        plain = next(r.text.plain for r in board.rows if r.key == ("tank", "FO1S"))
        assert "◆" not in plain and f"{0.85:6.3f}" in plain
        assert "FO1P density 0.991 t/m³ (delivery note), was 0.850" in app.screen.query_one("#status", LinePanel).plain()
        await pilot.press("q")
        await pilot.pause()
    book = Logbook.open(logs, v.particulars.name, readonly=True)
    entries = book.entries()
    book.close()
    assert [e.change_text for e in entries if "density" in e.change_text] == [
        "FO1P density 0.991 t/m³ (delivery note), was 0.850"]
    # reopen as `deckload` does: the working file brings the stated density back
    v2, c2, _, _, _ = load_inputs(None, None, work)
    assert c2.tank_fill("FO1P") == TankFill("FO1P", "percent", 95.0, BDN_RHO)
    assert _tank(evaluate(v2, c2), "FO1P").mass_t == pytest.approx(volume * BDN_RHO, rel=1e-15)


def test_the_legend_explains_the_mark():
    assert "◆ density stated for this condition" in views.LEGEND


def _density_cautions(result):
    return [w for w in result.warnings if w.code == "tank-density"]


@pytest.mark.parametrize("tid, typed, usual", [("FO1P", "1.25", "0.8–1.01 t/m³, the usual range of fuel oil"),
                                               ("FW1P", "1.25", "0.99–1.01 t/m³, the usual range of fresh water"),
                                               ("WB2P", "1.25", "0.995–1.035 t/m³, the usual range of ballast")])
def test_a_stated_density_unusual_for_the_tanks_kind_is_a_caution_from_a_file_and_the_screen(demo, tid, typed, usual):
    """1.25 t/m³ stated for a fuel, fresh-water or ballast tank: the profile's audit warns for the
    same density as a tank's own (audit.tank_density, bounds.KIND_DENSITY_T_M3: ISO 8217 and
    standards.md §6.2), but stated in a condition it passed silently (found by an audit).  From a
    condition file and from the screen's D alike it is accepted (inside the physical 0.5–2.5 t/m³
    both refuse beyond) and the result carries the same caution, which calc, the report and the
    screen print with the other cautions."""
    v, c = demo
    by_key = entry.set_tank_density(c, v.tank(tid), typed)
    text = dump_condition(c).replace(f"[tanks.{tid}]\n", f"[tanks.{tid}]\ndensity_t_m3 = {typed}\n")
    assert text != dump_condition(c)
    from_file = parse_condition(text, "bdn.condition.toml", v)
    assert from_file.tank_fill(tid) == by_key.tank_fill(tid)
    for cond in (by_key, from_file):
        r = evaluate(v, cond)
        (w,) = _density_cautions(r)
        assert (w.severity, w.message) == (
            "caution", f"{tid}: density {typed} t/m³ stated for this condition is outside {usual} "
                       "(a digit slipped, or the tank's kind?)")
        assert w.message in " ".join(render_report_text(r, v, cond).replace("\n", " ").split())  # wrapped at 120


def test_a_usual_stated_density_and_a_cargo_liquid_raise_no_caution(demo):
    """The delivery note's 0.9912 for a fuel tank is usual; a cargo liquid's density is not judged
    (its kind has no usual range: bounds.KIND_DENSITY_T_M3), even at 1.8."""
    v, c = demo
    c2 = entry.set_tank_density(c, v.tank("FO1P"), f"{BDN_RHO}")
    c2 = entry.set_tank_density(c2, v.tank("CF1P"), "1.8")
    assert _density_cautions(evaluate(v, c2)) == []
    assert _density_cautions(evaluate(v, c)) == []
