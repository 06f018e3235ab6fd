"""Edge cases of the engine found in review: load-line marks, curves in other water, 98 %, θf < 30°."""

import dataclasses

import numpy as np
import pytest

from deckload.core.hydrostatics import fresh_water_allowance_m, mark_density_t_m3, permitted_draft_m
from deckload.core.model import Condition, LimitCurve, TankFill, frozen_array
from deckload.core.stability import evaluate
from deckload.io.paths import DEMO_CONDITIONS
from deckload.io.profiles import load_condition
from vessel_factories import barge_tanks, box_barge
from demo_vessels import demo_vessel


@pytest.fixture(scope="module")
def demo():
    vessel = demo_vessel()
    return vessel, load_condition(DEMO_CONDITIONS["departure"], vessel)


def test_fresh_water_mark_is_not_given_the_allowance_twice():
    """ICLL (standards.md §6.1): the fresh-water mark F stands FWA above the summer mark S and applies
    in water of 1.000 t/m³. So in fresh water the permitted draft at F is F itself, and in sea water
    it is F − FWA = S. A sea-water mark in fresh water allows S + FWA (DWA = FWA·(1.025 − ρ)/0.025)."""
    fwa = 0.064
    summer, fresh = 2.900, 2.900 + 0.064
    assert mark_density_t_m3("fresh") == 1.000 and mark_density_t_m3("summer") == 1.025
    assert permitted_draft_m(fresh, fwa, 1.000, mark_density_t_m3("fresh")) == pytest.approx(fresh)
    assert permitted_draft_m(fresh, fwa, 1.025, mark_density_t_m3("fresh")) == pytest.approx(summer)
    assert permitted_draft_m(summer, fwa, 1.000) == pytest.approx(summer + fwa)
    # checks.md §1.1: box barge Δ 820 t, TPC 4.1 t/cm → FWA = Δ/(4·TPC) = 50.0 mm
    assert fresh_water_allowance_m(820.0, 4.1) == pytest.approx(0.050)


def test_fresh_mark_warning_in_fresh_water(demo):
    """Loaded just over the demo's fresh mark in fresh water, the warning must come."""
    vessel, dep = demo
    fresh = next(m for m in vessel.load_lines if m.name == "fresh")
    ok = evaluate(vessel, dataclasses.replace(dep, water_density_t_m3=1.000, load_line="fresh"))
    assert ok.draft_mean_m < fresh.draft_m
    assert not any(w.code == "load-line" for w in ok.warnings)
    # sink her to 1 cm over the mark with a deck load at G's height
    extra = (fresh.draft_m + 0.01 - ok.draft_mean_m) * 100.0 * ok.tpc_t_cm
    heavy = dataclasses.replace(
        dep, water_density_t_m3=1.000, load_line="fresh",
        constants=dep.constants + (dataclasses.replace(dep.constants[0], name="test weight", mass_t=extra,
                                                       lcg_m=ok.lcf_m, vcg_m=ok.kg_m, tcg_m=0.0),),
    )
    over = evaluate(vessel, heavy)
    assert over.draft_mean_m > fresh.draft_m
    assert any(w.code == "load-line" for w in over.warnings)


def test_downflooding_angle_is_read_at_the_table_equivalent_displacement(demo):
    """The θf curve is tabulated at the table density (same waterline as the KN curves), so in water
    of density ρ it is read at Δ·ρ_table/ρ (derivation: equal immersed volume ⇒ equal waterline)."""
    vessel, dep = demo
    r = evaluate(vessel, dataclasses.replace(dep, water_density_t_m3=1.000))
    curve = vessel.downflooding
    expected = float(np.interp(r.displacement_t * 1.025 / 1.000, curve.displacement_t, curve.value))
    assert r.downflooding_angle_deg == pytest.approx(expected, abs=1e-9)
    wrong = float(np.interp(r.displacement_t, curve.displacement_t, curve.value))
    assert abs(expected - wrong) > 0.1  # the test can tell the two apart


def test_98_percent_is_nominally_full_however_it_is_typed():
    """IS 2008 Part B 3.1.2: at 98 % a tank is nominally full, whether typed as 98 % or as 0.98·V m³."""
    vessel = box_barge(tanks=barge_tanks())
    tank = vessel.tank("DB1P")
    by_pct = evaluate(vessel, Condition(tanks=(TankFill("DB1P", "percent", 98.0),)))
    by_vol = evaluate(vessel, Condition(tanks=(TankFill("DB1P", "volume_m3", 0.98 * tank.capacity_m3),)))
    for r in (by_pct, by_vol):
        t = next(t for t in r.tanks if t.id == "DB1P")
        assert t.state == "full" and t.fsm_tm == 0.0


def test_downflooding_below_30_degrees_is_a_danger():
    """IS 2008 Part A 2.2.1: with θf < 30° the 30°–θf area is nil, so the criterion fails and she is warned."""
    vessel = box_barge(tanks=barge_tanks())
    low = LimitCurve(frozen_array([100.0, 5000.0]), frozen_array([20.0, 20.0]), "downflooding_deg")
    r = evaluate(dataclasses.replace(vessel, downflooding=low), Condition())
    assert r.downflooding_angle_deg == 20.0
    assert r.area_30_40_mrad == 0.0
    assert not r.all_criteria_pass
    assert any(w.code == "downflooding-low" and w.severity == "danger" for w in r.warnings)


def test_a_displacement_off_the_downflooding_curve_is_a_danger():
    vessel = box_barge(tanks=barge_tanks())
    short = LimitCurve(frozen_array([5000.0, 6000.0]), frozen_array([35.0, 35.0]), "downflooding_deg")
    r = evaluate(dataclasses.replace(vessel, downflooding=short), Condition())
    assert r.downflooding_angle_deg is None
    assert any(w.code == "downflooding-range" and w.severity == "danger" for w in r.warnings)


def test_marks_named_f_and_tf_are_fresh_water_marks():
    """The F (fresh) and TF (tropical fresh) lines of the load line mark are set for fresh water of
    1.000 t/m³, every other line for sea water of 1.025 t/m³ (densities: standards.md §6.1 [C]).
    Which lines are the fresh-water ones is common practice (the ICLL Annex I marks; regulation
    number not confirmed, from memory), as are the spellings accepted here."""
    assert {mark_density_t_m3(n) for n in ("F", "TF", "tropical fresh", "Fresh")} == {1.000}
    assert {mark_density_t_m3(n) for n in ("summer", "winter", "tropical", "WNA")} == {1.025}
