"""IS 2008 Part B 3.1.4 between two fuel groups of equal ρ·i_max, one of them a variable-level tank
that is slack at a narrow level; and that slack tank's own moment (B 3.1.3).

Sources: IMO 2008 IS Code Part B 3.1.3 (variable-level tanks count, when slack, at the largest
correction between their filling limits) and B 3.1.4 (for each kind of consumable, the pair or
centreline tank of greatest effect is assumed slack), as summarised in standards.md §4.1;
FSM = ρ·i with i = l·b³/12 for a rectangular free surface (standards.md §4.3, textbook).  B 3.1.4
names no tie-break: deckload's own (free_surface.py, issue A-F1) takes, between groups of equal
ρ·i, the one that adds most to the total (ρ·i less what its tanks' own states would carry anyway).

Posed tanks (fuel oil, ρ = 0.95 t/m³, all variable level, on the parallel-sided vessel of
test_reference_free_surface_rules.py with the small-tank limit 0 m: none is exempt):

* FO1C, centreline, 8 m long, its section narrowing upward: breadth b(s) = 4 − s m at level s
  (0 ≤ s ≤ 2).  Derived: i(s) = 8·b(s)³/12, so i_max = i(0) = 8·4³/12 = 42.667 m⁴ and at s = 1.5 m
  (b = 2.5 m) i = 8·2.5³/12 = 10.417 m⁴; V(s) = 8·(4s − s²/2), the contents' centre at height
  (2s² − s³/3)/(4s − s²/2).  Sounded at 1.5 m: slack.
* FO2P/FO2S, a pair of boxes 4 × 4 × 2 m: i = 4·4³/12 = 21.333 m⁴ each, 42.667 m⁴ together.
  FO2P at 50 % (slack), FO2S empty.

Both groups have ρ·i_max = 0.95·42.667 = 40.533 t·m (a tie).  FO1C, slack and variable, carries
ρ·i_max = 40.533 t·m whether assumed or not: assuming it adds nothing.  The pair carries 20.267 t·m
(FO2P slack, variable) on its own; assuming it adds FO2S's 20.267 t·m.  So the pair is assumed
slack, FO1C counts at its largest value between its limits, and the total is
0.95·(42.667 + 2·21.333) = 81.067 t·m.  (Taking FO1C's actual 10.417 m⁴ as what it carries
anyway would make assuming FO1C look the larger addition and give 60.800 t·m: unconservative.)
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.model import Condition, Tank, TankCalibration, TankFill, frozen_array
from deckload.core.stability import evaluate
from test_reference_free_surface_rules import VARIABLE, X_MID, tank_of, vessel
from vessel_factories import box_tank

RHO_FO = 0.95
PAIR = "assumed slack: worst pair of fuel oil (IS 2008 B 3.1.4)"


def narrowing_tank() -> Tank:
    """FO1C of the module docstring: rows every 0.25 m, every value from the closed forms."""
    s = np.linspace(0.0, 2.0, 9)
    b = 4.0 - s
    vol = 8.0 * (4.0 * s - s**2 / 2.0)
    with np.errstate(invalid="ignore", divide="ignore"):
        zc = np.where(s > 0, (2.0 * s**2 - s**3 / 3.0) / np.where(s > 0, 4.0 * s - s**2 / 2.0, 1.0), 0.0)
    n = len(s)
    cal = TankCalibration(sounding_m=frozen_array(s), volume_m3=frozen_array(vol),
                          lcg_m=frozen_array(np.full(n, X_MID)), vcg_m=frozen_array(1.0 + zc),
                          tcg_m=frozen_array(np.zeros(n)), fsi_m4=frozen_array(8.0 * b**3 / 12.0))
    return Tank(id="FO1C", name="Fuel oil 1 centre", kind="fuel_oil", density_t_m3=RHO_FO,
                capacity_m3=float(vol[-1]), calibration=cal, fs_category="variable")


def pair_tank(tid, partner, tcg):
    return box_tank(tid, length_m=4, breadth_m=4, height_m=2, lcg_m=X_MID, tcg_m=tcg, kind="fuel_oil",
                    density_t_m3=RHO_FO, pair=partner)


def test_the_tie_goes_to_the_pair_that_adds_most_and_the_slack_tank_keeps_its_maximum():
    v = vessel([narrowing_tank(), pair_tank("FO2P", "FO2S", -4.0), pair_tank("FO2S", "FO2P", 4.0)], limit_m=0.0)
    r = evaluate(v, Condition(tanks=(TankFill("FO1C", "sounding_m", 1.5), TankFill("FO2P", "percent", 50.0))))
    i1_max, i1_at_15 = 8 * 4**3 / 12, 8 * 2.5**3 / 12
    i2 = 4 * 4**3 / 12
    assert (i1_max, i1_at_15, i2) == pytest.approx((42.6667, 10.4167, 21.3333), abs=1e-4)
    fo1 = tank_of(r, "FO1C")
    assert fo1.fs_rule == VARIABLE
    assert fo1.fsm_tm == pytest.approx(RHO_FO * i1_max, rel=1e-12)
    for tid in ("FO2P", "FO2S"):
        assert tank_of(r, tid).fs_rule == PAIR
        assert tank_of(r, tid).fsm_tm == pytest.approx(RHO_FO * i2, rel=1e-12)
    assert r.fsm_total_tm == pytest.approx(RHO_FO * (i1_max + 2 * i2), rel=1e-12)
    assert r.fsm_total_tm == pytest.approx(81.067, abs=1e-3)
