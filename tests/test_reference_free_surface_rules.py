"""Which free-surface moment each tank carries, and the rule the watchkeeper reads for it.

Sources: IMO 2008 IS Code Part B 3.1 as summarised in standards.md §4.1 (B 3.1.2 nominally full at
98 %, B 3.1.3 fixed/variable level, B 3.1.4 the worst consumable group assumed slack, B 3.1.6 liquid
transfers at the actual level, B 3.1.12 small tanks; the 0.01 m limit is from memory there, and the
profile may set its own ``small_tank_limit_m``); FSM = ρ·i with i = l·b³/12 for a rectangular free
surface (standards.md §4.3, textbook).  Every tank here is a box (tests/vessel_factories.box_tank),
so i is the same at every level.

The hull is the parallel-sided vessel of tests/vessel_factories.py: KN = KMt·sinφ exactly, so with
the ``transfer`` GZ correction GZ(φ) = (KMt − KG_solid)·sinφ − Σρ·M(φ)/Δ (standards.md §4.3 with the
moment of fluid transfer of §4.1).  A tank that carries no free surface must add nothing to that sum
and must not be named in the "no tank geometry" caution (that caution lists the tanks whose
transfer is taken as i·sinφ).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.free_surface import EXEMPT_RULE, mfs30_bound_m4
from deckload.core.model import Condition, FluidTransfer, FreeSurfaceSettings, MassItem, TankFill, frozen_array
from deckload.core.stability import evaluate
from vessel_factories import ParallelForm, box_tank, box_transfer_moment_m4, parallel_sided_vessel

X_MID = 50.0
KMT = 6.0
KG_LS = 4.0

# The texts the program shows beside each tank (deckload's own wording, naming the paragraph).
NOMINALLY_FULL = "nominally full ≥ 98 % (IS 2008 B 3.1.2)"
FULL_CARGO = "nominally full cargo tank, at 98 % (IS 2008 B 3.1.2)"
VARIABLE = "variable level: max between limits (IS 2008 B 3.1.3)"
ACTUAL_IS2008 = "actual level (IS 2008 B 3.1.3)"
ACTUAL_TRANSFERS = "actual level (IS 2008 B 3.1.6)"
NO_FS = "no free surface given in the profile (capacity only)"


def vessel(tanks, *, limit_m=0.01, dmin_t=1000.0, lightship_t=2000.0):
    form = ParallelForm(displacement_t=2000.0, draft_m=6.0, lcb_m=X_MID, lcf_m=X_MID, kmt_m=KMT,
                        tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=100.0)
    fs = FreeSurfaceSettings(min_operating_displacement_t=dmin_t, small_tank_limit_m=limit_m)
    return parallel_sided_vessel(form, lightship=MassItem("Lightship", lightship_t, X_MID, KG_LS, 0.0),
                                 tanks=tuple(tanks), free_surface=fs)


def tank_of(r, tid):
    return {t.id: t for t in r.tanks}[tid]


def fill(tid, pct):
    return TankFill(tid, "percent", float(pct))


def ballast(tid="WB1C", **kw):
    """Box ballast tank l = 10, b = 5, h = 2 (ρ·i = 1.025·10·5³/12 = 106.77 t·m), fixed level."""
    return box_tank(tid, length_m=10, breadth_m=5, height_m=2, lcg_m=X_MID, **kw)


def no_free_surface_curve_holds(r):
    """GZ(φ) = (KMt − KG_solid)·sinφ at 10°, 30°, 60°: no free-surface term at all."""
    for deg in (10, 30, 60):
        expected = (KMT - r.kg_m) * math.sin(math.radians(deg))
        # 1e-9 m: the spline of KN = KMt·sinφ and the sums are exact to round-off (~1e-14 m).
        assert r.gz_m[deg] == pytest.approx(expected, abs=1e-9)
    assert not [w for w in r.warnings if w.code == "fs-no-geometry"]
    assert r.fsm_total_tm == 0.0


# --------------------------------------------------------------------------- tanks carrying nothing


@pytest.mark.parametrize("pct, state, rule", [
    (0.0, "empty", "empty"),
    (99.0, "full", NOMINALLY_FULL),
    (50.0, "worst_band", EXEMPT_RULE),
])
def test_small_tank_carries_nothing_and_says_why(pct, state, rule):
    """B 3.1.12 with the profile's limit set to 1 m (allowed: any non-negative value): the ballast tank's
    Mfs(30°)/Δmin ≤ ρ·i·sin30·(1 + ½tan²30)/1000 = 106.77·0.5833/1000 = 0.062 m < 1 m, so it is a small
    tank.  Empty it says "empty", at 99 % it is nominally full (B 3.1.2, no exemption needed, and the
    rule says so), slack it is exempt.  In each case its moment is nil and the transfer-corrected
    curve carries no free-surface term (module docstring)."""
    v = vessel([ballast()], limit_m=1.0)
    r = evaluate(v, Condition(tanks=(fill("WB1C", pct),), gz_correction="transfer"))
    t = tank_of(r, "WB1C")
    assert (t.state, t.fs_rule, t.fsm_tm) == (state, rule, 0.0)
    no_free_surface_curve_holds(r)


def test_small_nominally_full_cargo_tank_is_exempt():
    """A nominally full cargo tank would count at 98 % (B 3.1.2 footnote), but a small one is left out
    (B 3.1.12): limit 1 m, box 8 × 6 × 2 at ρ 0.85: Mfs(30°)/Δmin ≤ 0.85·64·0.5833/1000 = 0.032 m < 1 m.
    Its moment is nil and the rule says it is the exemption that leaves it out."""
    tank = box_tank("CG1C", length_m=8, breadth_m=6, height_m=2, lcg_m=X_MID, kind="cargo_liquid", density_t_m3=0.85)
    r = evaluate(vessel([tank], limit_m=1.0), Condition(tanks=(fill("CG1C", 99.0),), gz_correction="transfer"))
    t = tank_of(r, "CG1C")
    assert (t.state, t.fs_rule, t.fsm_tm) == ("full", EXEMPT_RULE, 0.0)
    no_free_surface_curve_holds(r)


@pytest.mark.parametrize("pct, state, rule", [(0.0, "empty", "empty"), (99.0, "full", NOMINALLY_FULL)])
def test_counted_tank_empty_or_nominally_full_carries_nothing(pct, state, rule):
    """B 3.1.2 (≥ 98 % nominally full: no free surface) and an empty fixed-level ballast tank (B 3.1.3,
    at its actual level: none).  Limit 0 m: no tank is small (ratio < 0 never holds)."""
    v = vessel([ballast()], limit_m=0.0)
    r = evaluate(v, Condition(tanks=(fill("WB1C", pct),), gz_correction="transfer"))
    t = tank_of(r, "WB1C")
    assert (t.state, t.fs_rule, t.fsm_tm) == (state, rule, 0.0)
    no_free_surface_curve_holds(r)


def test_capacity_only_tank_without_free_surface():
    """A tank the profile gives by capacity and centre only, with no free surface (profiles.py sets its
    inertia column to 0 and ``fsi_given`` to 'none'): nil moment, its own rule text, its state from
    the fill (50 % of a tank with worst band (0, 0) is slack), and it is not listed as a tank whose
    transfer is taken as i·sinφ."""
    base = ballast("CAP1")
    cal = dataclasses.replace(base.calibration, fsi_m4=frozen_array(np.zeros(len(base.calibration.fsi_m4))))
    tank = dataclasses.replace(base, calibration=cal, fsi_given="none", level_known=False, worst_band_pct=(0.0, 0.0))
    v = vessel([tank], limit_m=0.0)
    r = evaluate(v, Condition(tanks=(fill("CAP1", 50.0),), gz_correction="transfer"))
    t = tank_of(r, "CAP1")
    assert (t.state, t.fs_rule, t.fsm_tm) == ("slack", NO_FS, 0.0)
    no_free_surface_curve_holds(r)


# --------------------------------------------------------------------------- tanks counted


def test_rule_texts_of_counted_tanks():
    """B 3.1.2 footnote: a nominally full cargo tank counts at 98 % (box: ρ·i = 0.85·8·6³/12 = 122.4 t·m);
    B 3.1.3: a slack ballast tank counts at its actual level (106.77 t·m), a slack fuel tank at its
    largest value between the filling limits.  Two fuel tanks so that the worst one (FO1C, 0.95·8·6³/12
    = 136.8 t·m) is the B 3.1.4 assumption and the other (FO2C, 0.95·6·4³/12 = 30.4 t·m) is plainly
    variable.  Rule 'actual' (B 3.1.6) counts every slack tank at its actual level."""
    tanks = [
        ballast(),
        box_tank("CG1C", length_m=8, breadth_m=6, height_m=2, lcg_m=X_MID, kind="cargo_liquid", density_t_m3=0.85),
        box_tank("FO1C", length_m=8, breadth_m=6, height_m=2, lcg_m=X_MID, kind="fuel_oil", density_t_m3=0.95),
        box_tank("FO2C", length_m=6, breadth_m=4, height_m=2, lcg_m=X_MID, kind="fuel_oil", density_t_m3=0.95),
    ]
    v = vessel(tanks, limit_m=0.0)
    fills_ = (fill("WB1C", 30.0), fill("CG1C", 99.0), fill("FO2C", 30.0))
    r = evaluate(v, Condition(tanks=fills_))
    assert (tank_of(r, "WB1C").fs_rule, tank_of(r, "WB1C").state) == (ACTUAL_IS2008, "slack")
    assert tank_of(r, "WB1C").fsm_tm == pytest.approx(1.025 * 10 * 5**3 / 12, rel=1e-12)
    assert (tank_of(r, "CG1C").fs_rule, tank_of(r, "CG1C").state) == (FULL_CARGO, "full")
    assert tank_of(r, "CG1C").fsm_tm == pytest.approx(0.85 * 8 * 6**3 / 12, rel=1e-12)
    assert tank_of(r, "FO1C").fs_rule == "assumed slack: worst centreline tank of fuel oil (IS 2008 B 3.1.4)"
    assert (tank_of(r, "FO2C").fs_rule, tank_of(r, "FO2C").state) == (VARIABLE, "slack")
    assert tank_of(r, "FO2C").fsm_tm == pytest.approx(0.95 * 6 * 4**3 / 12, rel=1e-12)
    a = evaluate(v, Condition(tanks=fills_, fs_rule="actual"))
    for tid in ("WB1C", "FO2C"):
        assert tank_of(a, tid).fs_rule == ACTUAL_TRANSFERS


def test_variable_tank_transfer_takes_largest_moment_over_fills():
    """B 3.1.3 (largest correction between filling limits) with the transfer-corrected curve: the slack
    variable-level fuel tank FO2C (box 6 × 4 × 2, at 20 %) counts at each heel the largest M over the
    tabulated fills (at 30° the 50 % value 6 + 7√3 = 18.1244 m⁴, checks.md §3.2 [A]), not its own
    20 % value (11.3181 m⁴).  FO1C (box 8 × 6 × 2, ρ·i 136.8 t·m against FO2C's 30.4) is the worst fuel
    tank, assumed slack though empty (B 3.1.4), also at its largest M.  Both carry transfer tables,
    so GZ(30°) = (KMt − KG)·sin30 − 0.95·(M1max + M2max)/Δ (module docstring)."""
    fo1 = box_tank("FO1C", length_m=8, breadth_m=6, height_m=2, lcg_m=X_MID, kind="fuel_oil",
                   density_t_m3=0.95, with_transfer=True)
    fo2 = box_tank("FO2C", length_m=6, breadth_m=4, height_m=2, lcg_m=X_MID, kind="fuel_oil",
                   density_t_m3=0.95, with_transfer=True)
    v = vessel([fo1, fo2], limit_m=0.0)
    r = evaluate(v, Condition(tanks=(fill("FO2C", 20.0),), gz_correction="transfer"))
    assert (tank_of(r, "FO2C").fs_rule, tank_of(r, "FO2C").state) == (VARIABLE, "slack")
    phi = math.radians(30.0)
    grid = range(0, 101, 5)  # the factory's tabulated fills
    m1 = max(box_transfer_moment_m4(8, 6, 2, f, phi) for f in grid)
    m2 = max(box_transfer_moment_m4(6, 4, 2, f, phi) for f in grid)
    assert m2 == pytest.approx(6 + 7 * math.sqrt(3), abs=5e-5)
    assert box_transfer_moment_m4(6, 4, 2, 20.0, phi) == pytest.approx(11.3181, abs=5e-5)
    disp = 2000.0 + 0.95 * 48.0 * 0.2
    assert r.displacement_t == pytest.approx(disp, abs=1e-9)
    expected = (KMT - r.kg_m) * 0.5 - 0.95 * (m1 + m2) / disp
    # 1e-9 m: exact closed forms on tabulated fills and heels; only round-off remains.
    assert r.gz_m[30] == pytest.approx(expected, abs=1e-9)
    assert not [w for w in r.warnings if w.code == "fs-no-geometry"]


# --------------------------------------------------------------------------- B 3.1.4 choice and wording


def test_assumed_pair_and_centreline_wording():
    """B 3.1.4: the worst transverse pair of fuel oil (2·0.95·8·4³/12 = 81.07 t·m) is assumed slack though
    empty; lube oil's only tank is assumed slack as a centreline tank; the kind is written in words."""
    tanks = [
        box_tank("FO1P", length_m=8, breadth_m=4, height_m=2, lcg_m=X_MID, tcg_m=-4, kind="fuel_oil",
                 density_t_m3=0.95, pair="FO1S"),
        box_tank("FO1S", length_m=8, breadth_m=4, height_m=2, lcg_m=X_MID, tcg_m=4, kind="fuel_oil",
                 density_t_m3=0.95, pair="FO1P"),
        box_tank("LO1C", length_m=2, breadth_m=2, height_m=1, lcg_m=X_MID, kind="lube_oil", density_t_m3=0.9),
    ]
    r = evaluate(vessel(tanks, limit_m=0.0), Condition())
    for tid in ("FO1P", "FO1S"):
        assert tank_of(r, tid).fs_rule == "assumed slack: worst pair of fuel oil (IS 2008 B 3.1.4)"
        assert tank_of(r, tid).fsm_tm == pytest.approx(0.95 * 8 * 4**3 / 12, rel=1e-12)
    assert tank_of(r, "LO1C").fs_rule == "assumed slack: worst centreline tank of lube oil (IS 2008 B 3.1.4)"


def test_assumed_group_below_one_tonne_metre():
    """B 3.1.4 has no lower bound: with no small-tank exemption (limit 0 m) a lube-oil tank 1 × 1 × 1 m
    (ρ·i = 0.9·1·1³/12 = 0.075 t·m), empty, is still the worst (only) lube-oil tank and is assumed slack."""
    tank = box_tank("LO1C", length_m=1, breadth_m=1, height_m=1, lcg_m=X_MID, kind="lube_oil", density_t_m3=0.9)
    r = evaluate(vessel([tank], limit_m=0.0), Condition())
    t = tank_of(r, "LO1C")
    assert t.state == "empty"
    assert t.fsm_tm == pytest.approx(0.9 / 12, rel=1e-12)
    assert "B 3.1.4" in t.fs_rule


def test_worst_group_is_judged_by_density_times_inertia():
    """B 3.1.4 'the greatest effect' is the free-surface moment ρ·i (standards.md §4.3), not i alone nor
    i/ρ.  FO1C: i = 8·5³/12 = 83.33 m⁴ at 0.85 t/m³ → 70.83 t·m; FO2C: i = 7.2·5³/12 = 75 m⁴ at
    0.99 t/m³ → 74.25 t·m.  FO2C governs though its i is smaller
    (i/ρ would pick FO1C: 98.0 against 75.8).  Both empty: only FO2C carries a moment."""
    tanks = [
        box_tank("FO1C", length_m=8, breadth_m=5, height_m=2, lcg_m=X_MID, kind="fuel_oil", density_t_m3=0.85),
        box_tank("FO2C", length_m=7.2, breadth_m=5, height_m=2, lcg_m=X_MID, kind="fuel_oil", density_t_m3=0.99),
    ]
    r = evaluate(vessel(tanks, limit_m=0.0), Condition())
    assert 7.2 * 5**3 / 12 == pytest.approx(75.0, rel=1e-12)
    assert tank_of(r, "FO2C").fsm_tm == pytest.approx(0.99 * 75.0, rel=1e-12)
    assert tank_of(r, "FO1C").fsm_tm == 0.0


@pytest.mark.parametrize("order", [("FO1C", "FO2C"), ("FO2C", "FO1C")])
def test_a_tie_between_equal_groups_is_broken_toward_the_larger_total(order):
    """B 3.1.4 names no tie-break.  Two identical fixed-level fuel-oil tanks 8 × 4 × 2 m at 0.95 t/m³
    (ρ·i = 0.95·8·4³/12 = 40.53 t·m each, the same at every level of a box): FO1C empty, FO2C at
    50 %.  Assuming the empty one slack gives ρ·i + ρ·i (FO2C at its actual level) = 81.07 t·m;
    assuming the slack one gives only 40.53 t·m.  The conservative answer, 81.07 t·m, whatever the
    order of the tanks in the profile."""
    dims = dict(length_m=8, breadth_m=4, height_m=2, lcg_m=X_MID, kind="fuel_oil", density_t_m3=0.95,
                fs_category="fixed")
    tanks = {tid: box_tank(tid, **dims) for tid in order}
    r = evaluate(vessel([tanks[tid] for tid in order], limit_m=0.0),
                 Condition(tanks=(fill("FO1C", 0), fill("FO2C", 50))))
    rho_i = 0.95 * 8 * 4**3 / 12
    assert tank_of(r, "FO1C").fs_rule == "assumed slack: worst centreline tank of fuel oil (IS 2008 B 3.1.4)"
    assert tank_of(r, "FO2C").fs_rule == ACTUAL_IS2008
    assert r.fsm_total_tm == pytest.approx(2 * rho_i, rel=1e-12)


# --------------------------------------------------------------------------- B 3.1.12 small tanks


def test_small_unpaired_tank_judged_at_its_own_moment():
    """B 3.1.12 with the profile's limit 1e-4 m and Δmin 1000 t: the lube-oil tank 1 × 1 × 1 m has the
    wall-sided bound i·sin30·(1 + ½tan²30) = (1/12)·0.5·(7/6) = 0.048611 m⁴ (free_surface.py), so
    ρ·Mfs/Δmin = 0.9·0.048611/1000 = 4.375e-5 m < 1e-4 m: exempt, even from the B 3.1.4 assumption
    (it has no partner, so nothing else enters its bound)."""
    tank = box_tank("LO1C", length_m=1, breadth_m=1, height_m=1, lcg_m=X_MID, kind="lube_oil", density_t_m3=0.9)
    assert mfs30_bound_m4(tank) == pytest.approx(0.048611, abs=5e-7)
    r = evaluate(vessel([tank], limit_m=1e-4), Condition(tanks=(fill("LO1C", 50.0),)))
    t = tank_of(r, "LO1C")
    assert (t.fsm_tm, t.fs_rule) == (0.0, EXEMPT_RULE)


def posed_transfer(moment_at_30_m4):
    """A transfer table posed for these tests (not a real tank's): M = 0 upright, empty and full, and
    the given value at 50 % from 29° to 31°, so the 30° value read from it is that value."""
    fills = np.array([0.0, 50.0, 100.0])
    heels = np.array([0.0, 29.0, 31.0, 90.0])
    m = np.zeros((3, 4))
    m[1, 1:3] = moment_at_30_m4
    return FluidTransfer(frozen_array(fills), frozen_array(heels), frozen_array(m))


def test_small_tank_limit_is_strict():
    """B 3.1.12: a tank may be left out if Mfs(30°)/Δmin is *less than* the limit.  A fresh-water-ballast
    box tank (ρ 1.0) whose posed transfer table gives Mfs(30°) = 8 m⁴, with Δmin = 800 t: 1.0·8/800 =
    0.01 m exactly (in floating point too), equal to the 0.01 m limit, so it is not small and counts at
    its actual level: ρ·i = 1.0·10·5³/12 = 104.17 t·m (B 3.1.3)."""
    tank = dataclasses.replace(ballast(density_t_m3=1.0), transfer=posed_transfer(8.0))
    assert mfs30_bound_m4(tank) == 8.0
    assert 1.0 * 8.0 / 800.0 == 0.01
    r = evaluate(vessel([tank], limit_m=0.01, dmin_t=800.0), Condition(tanks=(fill("WB1C", 30.0),)))
    t = tank_of(r, "WB1C")
    assert t.fs_rule == ACTUAL_IS2008
    assert t.fsm_tm == pytest.approx(1.0 * 10 * 5**3 / 12, rel=1e-12)


def test_pair_is_judged_by_its_larger_moment():
    """A transverse pair is judged as one (free_surface.py): transfer tables give heel to starboard, and
    heeled to port the port tank of a mirror pair moves its liquid as the starboard tank does heeled to
    starboard, so its Mfs at 30° (either side) is the larger of the two tables' values.  Posed tables:
    WBP 2 m⁴, WBS 8 m⁴ at 30°; ρ 1.0, Δmin 400 t, limit 0.01 m.  Alone WBP would be small
    (2/400 = 0.005 m); judged with WBS (8/400 = 0.02 m) it is not, and counts at its actual level:
    ρ·i = 1.0·10·5³/12 = 104.17 t·m (B 3.1.3)."""
    wbp = dataclasses.replace(ballast("WBP", tcg_m=-3, pair="WBS", density_t_m3=1.0), transfer=posed_transfer(2.0))
    wbs = dataclasses.replace(ballast("WBS", tcg_m=3, pair="WBP", density_t_m3=1.0), transfer=posed_transfer(8.0))
    v = vessel([wbp, wbs], limit_m=0.01, dmin_t=400.0)
    r = evaluate(v, Condition(tanks=(fill("WBP", 30.0), fill("WBS", 30.0))))
    for tid in ("WBP", "WBS"):
        t = tank_of(r, tid)
        assert t.fs_rule == ACTUAL_IS2008
        assert t.fsm_tm == pytest.approx(1.0 * 10 * 5**3 / 12, rel=1e-12)
