"""A nominally full cargo tank is corrected at the 98 % level, whatever fill the profile calls
nominally full.

Source: IMO 2008 IS Code Part B 3.1.2 and its footnote, standards.md §4.1: "at 98 % or more it is
'nominally full' and ignored.  Exception (footnote): nominally full cargo tanks are corrected at
98 %".  The profile may set its own ``nominally_full_pct`` (vessel_profiles/README.md): that moves
where a tank counts as full, not the level the footnote corrects a full cargo tank at — and the
rule text the program prints says "at 98 %", as the transfer-corrected curve takes it
(free_surface.transfer_moment_m4, basis ``at98``).

Tank posed for this test: the narrowing tank of test_reference_free_surface_variable_tie.py (8 m
long, breadth 4 − s at level s, rows every 0.25 m, capacity V(2) = 48 m³), here a cargo tank at
0.85 t/m³, on the parallel-sided vessel with nominally_full_pct = 95 % and loaded to 96 % (so
nominally full).  Derived: at 98 % the volume is 47.04 m³, between the rows at s = 1.75 m
(V = 8·(7 − 1.53125) = 43.75 m³, b = 2.25 m, i = 8·2.25³/12 = 7.59375 m⁴) and s = 2.0 m (V = 48 m³,
b = 2 m, i = 5.33333 m⁴); the calibration is read linearly in volume (tables.py), f = 3.29/4.25 =
0.774118, i = 7.59375 − f·2.260417 = 5.84392 m⁴, FSM = 0.85·i = 4.96733 t·m.  (At 95 %, 45.6 m³, the
same reading gives i = 6.60980 m⁴, FSM 5.61833 t·m: that is the level the tank counts as full from,
not the one it is corrected at.)
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.model import Condition, TankFill
from deckload.core.stability import evaluate
from test_reference_free_surface_rules import tank_of, vessel
from test_reference_free_surface_variable_tie import narrowing_tank

FULL_CARGO = "nominally full cargo tank, at 98 % (IS 2008 B 3.1.2)"


def test_full_cargo_tank_is_corrected_at_98_percent_under_a_95_percent_threshold():
    tank = dataclasses.replace(narrowing_tank(), id="CG1C", name="Cargo 1 centre", kind="cargo_liquid",
                               fs_category="fixed", density_t_m3=0.85)
    v = vessel([tank], limit_m=0.0)
    v = dataclasses.replace(v, free_surface=dataclasses.replace(v.free_surface, nominally_full_pct=95.0))
    r = evaluate(v, Condition(tanks=(TankFill("CG1C", "percent", 96.0),)))
    t = tank_of(r, "CG1C")
    assert (t.state, t.fs_rule) == ("full", FULL_CARGO)
    f = (0.98 * 48.0 - 43.75) / (48.0 - 43.75)
    i98 = 8 * 2.25**3 / 12 + f * (8 * 2.0**3 / 12 - 8 * 2.25**3 / 12)
    assert i98 == pytest.approx(5.84392, abs=1e-5)
    assert t.fsm_tm == pytest.approx(0.85 * i98, rel=1e-12)
    assert r.fsm_total_tm == pytest.approx(4.96733, abs=1e-5)


@pytest.mark.parametrize("full_pct, fill_pct, expected", [
    (98.0, 99.0, "nominally full ≥ 98 % (IS 2008 B 3.1.2)"),
    (95.0, 96.0, "nominally full ≥ 95 % (the profile's threshold; IS 2008 B 3.1.2 says 98 %)"),
])
def test_a_full_tank_names_the_threshold_it_was_judged_by(full_pct, fill_pct, expected):
    """IS 2008 B 3.1.2 (standards.md §4.1): a tank at 98 % or more is nominally full and carries no
    correction.  A profile may set another threshold; the rule text then names the one applied and
    the Code's 98 %, so the officer never reads "≥ 98 %" beside a tank at 96 %."""
    tank = dataclasses.replace(narrowing_tank(), id="WB1C", name="Ballast 1 centre", kind="ballast",
                               fs_category="fixed", density_t_m3=1.025)
    v = vessel([tank], limit_m=0.0)
    v = dataclasses.replace(v, free_surface=dataclasses.replace(v.free_surface, nominally_full_pct=full_pct))
    t = tank_of(evaluate(v, Condition(tanks=(TankFill("WB1C", "percent", fill_pct),))), "WB1C")
    assert (t.state, t.fsm_tm, t.fs_rule) == ("full", 0.0, expected)
