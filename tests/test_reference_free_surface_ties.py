"""IS 2008 Part B 3.1.4: which consumable group is assumed slack when two groups come close, or tie.

Source: IMO 2008 IS Code Part B 3.1.4 as summarised in standards.md §4.1 ("for each type of consumable
liquid ... the single transverse pair or single centreline tank ... where the effect of free surfaces
is the greatest"); the effect is the free-surface moment ρ·i with i = l·b³/12 for a rectangular free
surface (standards.md §4.3, textbook).  Box tanks of tests/vessel_factories.box_tank on the
parallel-sided vessel of test_reference_free_surface_rules.py (limit 0 m: no tank is small, B 3.1.12).
"""

from __future__ import annotations

import pytest

from deckload.core.model import Condition, TankFill
from deckload.core.stability import evaluate
from test_reference_free_surface_rules import ACTUAL_IS2008, X_MID, tank_of, vessel
from vessel_factories import box_tank

ASSUMED = "assumed slack: worst centreline tank of fuel oil (IS 2008 B 3.1.4)"


def fuel(tid, length_m):
    """Fixed-level fuel tank l × 4 × 2 m at 0.95 t/m³: ρ·i = 0.95·l·4³/12 = 5.0667·l t·m."""
    return box_tank(tid, length_m=length_m, breadth_m=4, height_m=2, lcg_m=X_MID, kind="fuel_oil",
                    density_t_m3=0.95, fs_category="fixed")


def test_the_greater_moment_governs_even_when_the_two_are_close():
    """FO1C 7.92 m long: ρ·i = 0.95·7.92·64/12 = 40.128 t·m, empty; FO2C 7.97 m: 40.381 t·m, at 50 %.
    B 3.1.4 takes the greater effect, FO2C (assumed slack, ρ·i_max = 40.381 t·m); FO1C, empty, carries
    nothing.  Total 40.381 t·m.  Only an exact tie of ρ·i (to round-off) may be broken another way, so
    groups 0.25 t·m apart are never treated as tied."""
    r = evaluate(vessel([fuel("FO1C", 7.92), fuel("FO2C", 7.97)], limit_m=0.0),
                 Condition(tanks=(TankFill("FO2C", "percent", 50.0),)))
    rho_i_2 = 0.95 * 7.97 * 4**3 / 12
    assert rho_i_2 == pytest.approx(40.381, abs=1e-3)
    assert tank_of(r, "FO2C").fs_rule == ASSUMED
    assert tank_of(r, "FO2C").fsm_tm == pytest.approx(rho_i_2, rel=1e-12)
    assert (tank_of(r, "FO1C").fs_rule, tank_of(r, "FO1C").fsm_tm) == ("empty", 0.0)
    assert r.fsm_total_tm == pytest.approx(rho_i_2, rel=1e-12)


def test_an_exact_tie_keeps_the_first_in_profile_order():
    """Two identical fuel tanks 8 × 4 × 2 m, both empty: equal ρ·i (40.533 t·m) and equal moment added,
    so either is 'the worst'; the total is ρ·i either way.  deckload's own rule then keeps the first in
    the profile's order (stable from one calculation to the next), and the second reads 'empty'."""
    r = evaluate(vessel([fuel("FO1C", 8.0), fuel("FO2C", 8.0)], limit_m=0.0), Condition())
    rho_i = 0.95 * 8 * 4**3 / 12
    assert tank_of(r, "FO1C").fs_rule == ASSUMED
    assert tank_of(r, "FO1C").fsm_tm == pytest.approx(rho_i, rel=1e-12)
    assert tank_of(r, "FO2C").fs_rule == "empty"
    assert r.fsm_total_tm == pytest.approx(rho_i, rel=1e-12)


def test_a_slack_fixed_level_tank_beside_the_assumed_one_counts_at_its_level():
    """FO2C (40.381 t·m) assumed slack; FO1C (40.128 t·m) at 50 % counts at its actual level (B 3.1.3):
    total 40.381 + 40.128 = 80.509 t·m."""
    r = evaluate(vessel([fuel("FO1C", 7.92), fuel("FO2C", 7.97)], limit_m=0.0),
                 Condition(tanks=(TankFill("FO1C", "percent", 50.0),)))
    assert tank_of(r, "FO2C").fs_rule == ASSUMED
    assert tank_of(r, "FO1C").fs_rule == ACTUAL_IS2008
    assert r.fsm_total_tm == pytest.approx(0.95 * (7.92 + 7.97) * 4**3 / 12, rel=1e-12)
