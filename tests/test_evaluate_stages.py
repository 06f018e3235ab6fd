"""Each stage of :func:`deckload.core.stability.evaluate` on its own, against a closed form.

The pipeline is weights → free surface → upright → curve → criteria → warnings
(``stage_weights`` … ``stage_warnings``).  Every test here feeds one stage the outputs
of the stages before it and checks that stage's own output against a value worked by
hand for a box, derived in the test's docstring.

Sources: checks.md §1 [A] (box barge L = 40, B = 10, D = 4 m, ρ = 1.025 t/m³: upright
hydrostatics §1.1, GZ §1.2, areas and IS 2008 Part A 2.2 criteria §1.3, loll §1.5,
trim §1.6) and §3.2 [A] (moment of fluid transfer of a box tank); standards.md §4.3
(FSM = ρ·i, i = l·b³/12, FSC = ΣFSM/Δ; textbook), §6.1 (FWA = Δ/(4·TPC), ICLL [C];
dock-water rule [M], from memory) and §6.3 (weight sums, trim and drafts; textbook).
The vessels come from tests/vessel_factories.py, whose tables are the closed forms
sampled at drafts 0.5–3.5 m (0.25 m steps) and heel 0–90°.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.model import Condition, DeckItem, LimitCurve, LoadLine, MassItem, TankFill, frozen_array
from deckload.core.stability import (
    stage_criteria,
    stage_curve,
    stage_free_surface,
    stage_upright,
    stage_warnings,
    stage_weights,
)
from deckload.core.trim import BASIS_GML, BASIS_TABLE
from vessel_factories import BARGE_B, BARGE_D, BARGE_L, RHO_SW, barge_at, box_barge, box_kn_m, box_tank

L, B, D, RHO = BARGE_L, BARGE_B, BARGE_D, RHO_SW
RAD = math.radians
ROUND = 1e-9
"""Round-off of a few dozen floating-point operations on numbers of order 10³ (relative 1e-12 and below)."""


def _run(vessel, condition, *, rule="actual", correction="constant", upto="warnings"):
    """The stages in order up to ``upto``; returns the outputs so far."""
    out = {"weights": stage_weights(vessel, condition)}
    out["fs"] = stage_free_surface(vessel, out["weights"], rule)
    if upto == "fs":
        return out
    out["upright"] = stage_upright(vessel, condition, out["weights"], out["fs"])
    if upto == "upright":
        return out
    out["curve"] = stage_curve(vessel, out["weights"], out["fs"], out["upright"], correction)
    if upto == "curve":
        return out
    out["criteria"] = stage_criteria(vessel, condition, out["weights"], out["fs"], out["upright"], out["curve"])
    out["warnings"] = stage_warnings(vessel, condition, out["weights"], out["fs"], out["upright"], out["curve"],
                                     out["criteria"])
    return out


def _loaded_barge():
    """The barge with a lightship 400 t at (x 20, z 3.0, y 0) and two box tanks.

    DB1S, ballast 8 × 4.5 × 0.8 m at x 10, y +2.5, bottom on the keel; FW1C, fresh
    water 6 × 4 × 2 m at x 30 on the centreline, bottom 0.8 m above the keel.
    """
    tanks = (
        box_tank("DB1S", length_m=8.0, breadth_m=4.5, height_m=0.8, lcg_m=10.0, tcg_m=2.5),
        box_tank("FW1C", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=30.0, bottom_m=0.8,
                 kind="fresh_water", density_t_m3=1.0),
    )
    vessel = box_barge(lightship_t=400.0, lightship_kg_m=3.0, lightship_lcg_m=20.0, tanks=tanks)
    condition = Condition(
        name="hand-worked",
        tanks=(TankFill("DB1S", "percent", 50.0), TankFill("FW1C", "percent", 100.0)),
        deck_items=(DeckItem("skiff", 20.0, 30.0, 5.0, -1.0),),
        constants=(MassItem("crew", 2.0, 35.0, 6.0, 0.0),),
    )
    return vessel, condition


# --------------------------------------------------------------------------- 1. weights


def test_weights_stage_sums_by_hand():
    """Δ = Σw; LCG = Σw·x/Δ; KG = Σw·z/Δ; TCG = Σw·y/Δ (standards.md §6.3, textbook).

    By hand, (w; x, z, y):
      lightship 400 t; 20, 3.0, 0
      DB1S at 50 %: V = 8·4.5·0.4 = 14.4 m³, w = 1.025·14.4 = 14.76 t; 10, 0.4/2 = 0.2, +2.5
      FW1C at 100 %: V = 6·4·2 = 48 m³, w = 48 t; 30, 0.8 + 1.0 = 1.8, 0
      skiff (deck) 20 t; 30, 5.0, −1.0
      crew (constant) 2 t; 35, 6.0, 0
    Δ = 484.76 t; Σw·x = 8000 + 147.6 + 1440 + 600 + 70 = 10257.6;
    Σw·z = 1200 + 2.952 + 86.4 + 100 + 12 = 1401.352; Σw·y = 36.9 − 20 = 16.9.
    """
    vessel, condition = _loaded_barge()
    w = stage_weights(vessel, condition)
    assert w.total.mass_t == pytest.approx(484.76, abs=ROUND)
    assert w.total.lcg_m == pytest.approx(10257.6 / 484.76, abs=ROUND)
    assert w.total.vcg_m == pytest.approx(1401.352 / 484.76, abs=ROUND)
    assert w.total.tcg_m == pytest.approx(16.9 / 484.76, abs=ROUND)
    assert [(i.group, i.name, i.mass_t) for i in w.items] == [
        ("lightship", "Lightship", 400.0), ("deck", "skiff", 20.0), ("constant", "crew", 2.0)]
    assert [(c.tank.id, c.volume_m3) for c in w.contents] == [
        ("DB1S", pytest.approx(14.4, abs=ROUND)), ("FW1C", pytest.approx(48.0, abs=ROUND))]
    assert w.notes == ()  # soundings taken on an even keel: nothing to level


def test_weights_stage_refuses_an_unknown_hold():
    """A condition naming a hold the vessel has not is refused by the first stage (LoadingError)."""
    from deckload.core.loading import LoadingError
    from deckload.core.model import HoldLoad

    vessel, condition = _loaded_barge()
    with pytest.raises(LoadingError, match="hold 'H9'"):
        stage_weights(vessel, dataclasses.replace(condition, holds=(HoldLoad("H9", 10.0),)))


# --------------------------------------------------------------------------- 2. free surface


def test_free_surface_stage_actual_and_is2008():
    """FSM = ρ·i, i = l·b³/12; FSC = ΣFSM/Δ; KG fluid = KG + FSC (standards.md §4.3, textbook).

    DB1S (ballast, fixed level, IS 2008 B 3.1.3) slack at 50 %: i = 8·4.5³/12 = 60.75 m⁴,
    FSM = 1.025·60.75 = 62.26875 t·m under either rule.
    FW1C (fresh water, a consumable) at 100 %: under rule ``actual`` (B 3.1.6) it is
    full, FSM = 0; under ``is2008`` it is the only fresh-water tank, so the worst
    centreline tank of its kind is assumed slack at its largest FSM (B 3.1.4):
    i = 6·4³/12 = 32 m⁴, FSM = 1.0·32 = 32 t·m.  It is not a "small tank": its moment
    at 30° is near i·sin30° = 16 m⁴, 16/400 = 0.04 m ≥ 0.01 m (B 3.1.12).
    Δ = 484.76 t and KG = 1401.352/484.76 m from the weights test.
    """
    vessel, condition = _loaded_barge()
    w = stage_weights(vessel, condition)
    kg = 1401.352 / 484.76
    actual = stage_free_surface(vessel, w, "actual")
    assert [t.fsm_tm for t in actual.tanks] == [pytest.approx(62.26875, abs=ROUND), 0.0]
    assert actual.fsm_total_tm == pytest.approx(62.26875, abs=ROUND)
    assert actual.fsc_m == pytest.approx(62.26875 / 484.76, abs=ROUND)
    assert actual.kg_fluid_m == pytest.approx(kg + 62.26875 / 484.76, abs=ROUND)
    assert [t.state for t in actual.tanks] == ["worst_band", "full"]  # 50 % lies in box_tank's 40–60 % band

    rule = stage_free_surface(vessel, w, "is2008")
    assert [t.fsm_tm for t in rule.tanks] == [pytest.approx(62.26875, abs=ROUND), pytest.approx(32.0, abs=ROUND)]
    assert rule.kg_fluid_m == pytest.approx(kg + (62.26875 + 32.0) / 484.76, abs=ROUND)
    assert "B 3.1.4" in rule.tanks[1].fs_rule


# --------------------------------------------------------------------------- 3. upright


def test_upright_stage_barge_with_a_weight_shifted_aft():
    """checks.md §1.1 and §1.6 [A]: the barge at T = 2 m, KG = 3 m, 10 t shifted 15 m aft.

    Δ = ρ·L·B·T = 820 t (a table row, so no interpolation error); KMt = T/2 + B²/(12T)
    = 1 + 100/24 = 5.16667 m; GM = KMt − KG = 2.16667 m.  The profile has KML, so
    MCTC = Δ·(KML − KG)/(100·L) = 820·(1 + 1600/24 − 3)/4000 = 13.2567 t·m/cm.
    The shift moves G aft by 150/820 m: trim = Δ·(LCB − LCG)/(100·MCTC) = 150/1325.67
    = 0.113150 m by the stern; with the LCF at L/2, T_A = 2 + t/2 = 2.05658 m,
    T_F = 2 − t/2 = 1.94342 m, midships 2.0 m (standards.md §6.3).
    """
    vessel, condition = barge_at(2.0, 3.0, lightship_lcg_m=L / 2 - 150.0 / 820.0)
    up = _run(vessel, condition, upto="upright")["upright"]
    gml = 1.0 + L**2 / 24.0 - 3.0
    assert up.hydrostatics.draft_m == pytest.approx(2.0, abs=ROUND)
    assert up.hydrostatics.kmt_m == pytest.approx(5.16667, abs=5e-6)  # checks.md prints 5 decimals
    assert up.gm_solid_m == pytest.approx(1.0 + B**2 / 24.0 - 3.0, abs=ROUND)
    assert up.gm_fluid_m == pytest.approx(1.0 + B**2 / 24.0 - 3.0, abs=ROUND)  # no tanks, no free surface
    assert up.trim_moment.basis == BASIS_GML
    assert up.trim_moment.mctc_tm_cm == pytest.approx(820.0 * gml / (100.0 * L), abs=ROUND)
    assert up.trim_moment.mctc_tm_cm == pytest.approx(13.2567, abs=5e-5)  # checks.md §1.1, 4 decimals
    assert up.trim_m == pytest.approx(150.0 / (820.0 * gml / L), abs=ROUND)
    assert up.trim_m == pytest.approx(0.11315, abs=5e-6)  # checks.md §1.6: 11.315 cm, half its last digit
    assert up.draft_aft_m == pytest.approx(2.05658, abs=5e-6)
    assert up.draft_fwd_m == pytest.approx(1.94342, abs=5e-6)
    assert up.draft_mid_m == pytest.approx(2.0, abs=ROUND)
    assert up.notes == ()  # trim 0.11 m is within 1 % of LBP (0.4 m); MCTC from the actual GML


def test_upright_stage_without_kml_uses_the_table_mctc_and_says_so():
    """checks.md §1.1 [A]: the table's MCTC made with BML is ρ·B·L²/1200 = 13.6667 t·m/cm.

    Then trim = 150/1366.67 = 0.109756 m, smaller than with the actual GML, and the
    stage notes the caution 'trim-from-table-mctc'.
    """
    vessel, condition = barge_at(2.0, 3.0, lightship_lcg_m=L / 2 - 150.0 / 820.0)
    vessel = dataclasses.replace(vessel, hydrostatics=dataclasses.replace(vessel.hydrostatics, kml_m=None))
    up = _run(vessel, condition, upto="upright")["upright"]
    assert up.trim_moment.basis == BASIS_TABLE
    assert up.trim_moment.mctc_tm_cm == pytest.approx(RHO * B * L**2 / 1200.0, abs=ROUND)
    assert up.trim_m == pytest.approx(150.0 / (100.0 * RHO * B * L**2 / 1200.0), abs=ROUND)
    assert [n.code for n in up.notes] == ["trim-from-table-mctc"]


def test_upright_stage_load_line_in_fresh_water():
    """FWA and the permitted draft (standards.md §6.1; checks.md §1.1 [A]).

    Summer mark at 2.0 m.  At the summer draft Δ = 820 t and TPC = ρ·L·B/100 = 4.1
    t/cm, so FWA = Δ/(4·TPC) = 50 mm.  In fresh water (1.000 t/m³) the draft allowed
    is 2.0 + 0.050·(1.025 − 1.000)/0.025 = 2.050 m.  The barge of 820 t sinks there to
    the table-equivalent 820·1.025 = 840.5 t, T = 840.5/(1.025·400) = 2.050 m: exactly
    at the mark, as the FWA is defined to make it.
    """
    vessel, condition = barge_at(2.0, 3.0)
    vessel = dataclasses.replace(vessel, load_lines=(LoadLine("summer", 2.0),))
    fresh = dataclasses.replace(condition, water_density_t_m3=1.0)
    up = _run(vessel, fresh, upto="upright")["upright"]
    mark, allowed = up.load_line
    assert mark.name == "summer"
    assert allowed == pytest.approx(2.05, abs=ROUND)
    assert up.hydrostatics.table_displacement_t == pytest.approx(840.5, abs=ROUND)
    assert up.draft_mid_m == pytest.approx(2.05, abs=ROUND)
    assert up.hydrostatics.tpc_t_cm == pytest.approx(1.0 * L * B / 100.0, abs=ROUND)  # TPC scaled to the water


# --------------------------------------------------------------------------- 4. curve


def _list_tcg(heel_deg: float, kg: float = 3.0, draft: float = 2.0) -> float:
    """TCG (m) that lists the wall-sided barge to ``heel_deg``: GZ = 0 there.

    Wall-sided (below 21.8° at T = 2, checks.md §1.1): KN − KG·sinφ = sinφ·(GM + ½BM·tan²φ)
    (checks.md §1.2), so GZ = sinφ·(GM + ½BM·tan²φ) − TCG·cosφ = 0 gives
    TCG = tanφ·(GM + ½BM·tan²φ).
    """
    bm = B**2 / (12.0 * draft)
    gm = draft / 2.0 + bm - kg
    t = math.tan(RAD(heel_deg))
    return t * (gm + 0.5 * bm * t * t)


def test_curve_stage_gz_at_the_tabulated_heels():
    """checks.md §1.2 [A]: GZ = KN − KG·sinφ of the box at T = 2, KG = 3.

    At a tabulated heel the natural spline through the table passes through the row
    itself, and Δ = 820 t is a table row, so GZ there is the closed form
    :func:`vessel_factories.box_kn_m` − 3·sinφ to round-off, and the checks.md column
    to its 5 printed decimals.  Upright, G on the centreline: no list, starboard side.
    """
    vessel, condition = barge_at(2.0, 3.0)
    curve = _run(vessel, condition, upto="curve")["curve"]
    for deg, gz_checks in ((10, 0.38749), (20, 0.83544), (30, 1.08771), (50, 0.60917), (70, -0.18189)):
        k = deg * 10
        assert curve.heel_deg[k] == pytest.approx(deg, abs=1e-9)
        assert curve.gz_stbd_m[k] == pytest.approx(box_kn_m(B, D, 2.0, RAD(deg)) - 3.0 * math.sin(RAD(deg)),
                                                   abs=ROUND)
        assert curve.gz_stbd_m[k] == pytest.approx(gz_checks, abs=5e-6)
    assert curve.side == "starboard" and curve.list_deg == 0.0
    assert curve.end_deg == 90.0


@pytest.mark.parametrize("sign, side", [(1.0, "starboard"), (-1.0, "port")])
def test_curve_stage_list_where_gz_rises_through_zero(sign, side):
    """The list is where the low-side GZ rises through zero (standards.md §6.3 for small angles).

    TCG = ±tan5°·(GM + ½BM·tan²5°) = ±0.190954 m (:func:`_list_tcg`) puts the zero of
    GZ = KN − KG·sinφ − |TCG|·cosφ exactly at 5°, a tabulated heel and a grid point,
    so the crossing found on the grid is 5° to round-off: +5° to starboard, −5° to
    port.  The other side's curve at 5° is GZ + 2·|TCG|·cos5°.
    """
    tcg = sign * _list_tcg(5.0)
    assert abs(tcg) == pytest.approx(0.190954, abs=5e-7)
    vessel, condition = barge_at(2.0, 3.0, lightship_tcg_m=tcg)
    curve = _run(vessel, condition, upto="curve")["curve"]
    assert curve.side == side
    assert curve.list_deg == pytest.approx(sign * 5.0, abs=1e-9)
    assert curve.gz_lee_m[50] == pytest.approx(0.0, abs=ROUND)
    assert curve.gz_other_m[50] == pytest.approx(2.0 * abs(tcg) * math.cos(RAD(5.0)), abs=ROUND)


def test_curve_stage_transfer_correction_of_a_box_tank():
    """GZ = KN − KG_solid·sinφ − ρ·M(φ)/Δ with the actual moment of fluid transfer (IS 2008 B 3.1).

    A centreline ballast tank 6 × 4 × 2 m, bottom on the keel, at 50 % (V = 24 m³,
    w = 24.6 t, z = 0.5 m); lightship 795.4 t at KG 3, so Δ = 820 t (a table row).
    KG solid = (795.4·3 + 24.6·0.5)/820.  checks.md §3.2 [A]: M(50 %, 30°) = 6 + 7√3 m⁴
    (the transfer table is built from the same closed form, and 50 % and 30° are
    nodes of it).  With the constant correction instead, GZ = KN − (KG + ρ·i/Δ)·sinφ,
    i = 6·4³/12 = 32 m⁴ (standards.md §4.3).
    """
    tank = box_tank("BW1C", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=20.0, with_transfer=True)
    vessel = box_barge(lightship_t=795.4, lightship_kg_m=3.0, tanks=(tank,))
    condition = Condition(tanks=(TankFill("BW1C", "percent", 50.0),))
    kg = (795.4 * 3.0 + 24.6 * 0.5) / 820.0
    kn30 = box_kn_m(B, D, 2.0, RAD(30.0))
    transfer = _run(vessel, condition, correction="transfer", upto="curve")["curve"]
    assert transfer.gz_stbd_m[300] == pytest.approx(kn30 - kg * 0.5 - RHO * (6.0 + 7.0 * math.sqrt(3.0)) / 820.0,
                                                    abs=ROUND)
    assert transfer.gz_port_m[300] == pytest.approx(transfer.gz_stbd_m[300], abs=ROUND)  # centreline tank
    assert transfer.notes == ()  # the tank has its geometry
    constant = _run(vessel, condition, correction="constant", upto="curve")["curve"]
    assert constant.gz_stbd_m[300] == pytest.approx(kn30 - (kg + RHO * 32.0 / 820.0) * 0.5, abs=ROUND)


# --------------------------------------------------------------------------- 5. criteria

AREA_TOL = 1e-5
"""m·rad.  checks.md §1.3 prints 6 decimals (5e-7); the trapezoidal rule on the 0.1° grid errs
by at most (θ/12)·h²·max|GZ''| ≈ (0.7/12)·(1.75e-3)²·6 ≈ 1e-6; the natural spline through the
1° KN table rounds the kink of GZ at 21.8° (deck edge and bilge at once) by a few 1e-6.  1e-5 is
0.02 % of the smallest IS 2008 A 2.2.1 limit (0.030 m·rad): no verdict can turn on it."""


def test_criteria_stage_areas_and_is2008_general_criteria():
    """checks.md §1.3 [A]: the barge at T = 2 with a 1° KN table, KG 3 and KG 4.5.

    Exact areas area(0→θ) = y_B·sinθ + (KG − z_B)·cosθ − (KG − KB):
    KG 3: A0–30 = 0.316025, A0–40 = 0.494738, A30–40 = 0.178713, GZmax at 29.182°;
    KG 4.5: A30–40 = 0.028741 < 0.030 and GZmax at 24.88° < 25°, so IS 2008 Part A
    2.2.1 (30–40°) and 2.2.3 fail while the rest pass; GM0 = KMt − KG is
    5.16667 − 4.5 = 0.66667 m against 0.15 m (2.2.4).
    """
    vessel, condition = barge_at(2.0, 3.0, heel_step_deg=1.0)
    a = _run(vessel, condition, upto="criteria")["criteria"]
    assert a.area_0_30_mrad == pytest.approx(0.316025, abs=AREA_TOL)
    assert a.area_0_40_mrad == pytest.approx(0.494738, abs=AREA_TOL)
    assert a.area_30_40_mrad == pytest.approx(0.178713, abs=AREA_TOL)
    assert a.flood_deg is None
    # no downflooding angles (θf taken as none), no deck-edge table (wall-sided estimate, common
    # practice) and no windage data: cautions, no danger
    assert [(n.code, n.severity) for n in a.notes] == [("downflooding-not-given", "caution"),
                                                       ("deck-edge-approximate", "caution"),
                                                       ("weather-not-assessed", "caution")]
    assert a.deck_edge_deg == pytest.approx(21.8014, abs=5e-5)  # checks.md §1.1: tanθ = (D − T)/(B/2) = 0.4
    by_id = {c.id: c for c in a.criteria}
    assert by_id["IS2008-A2.2.3-angle-max-gz"].value == pytest.approx(29.182, abs=0.01)  # 3 decimals + parabola fit
    assert all(c.passed for c in a.criteria if c.set_id == "IS2008-A2.2")

    vessel, condition = barge_at(2.0, 4.5, heel_step_deg=1.0)
    a = _run(vessel, condition, upto="criteria")["criteria"]
    by_id = {c.id: c for c in a.criteria}
    assert by_id["IS2008-A2.2.1-area-30-40"].value == pytest.approx(0.028741, abs=AREA_TOL)
    assert by_id["IS2008-A2.2.4-gm0"].value == pytest.approx(1.0 + B**2 / 24.0 - 4.5, abs=ROUND)
    failed = sorted(c.id for c in a.criteria if c.set_id == "IS2008-A2.2" and not c.passed)
    assert failed == ["IS2008-A2.2.1-area-30-40", "IS2008-A2.2.3-angle-max-gz"]


def test_criteria_stage_downflooding_angle_cuts_the_areas():
    """IS 2008 Part A 2.2.1: with θf < 40° the areas stop at θf; with θf < 30° the 30°–θf area is nil.

    θf = 35° (flat over the table): A0–40 becomes A0–35 and A30–40 becomes A0–35 − A0–30,
    each from the exact dynamic lever of checks.md §1.3 [A],
    area(0→θ) = y_B·sinθ + (KG − z_B)·cosθ − (KG − KB) (tests/vessel_factories.py).
    θf = 25°: the area 30–40 is 0 and the stage raises the danger 'downflooding-low'.
    """
    from vessel_factories import box_dynamic_lever_mrad

    def flat(deg):
        return LimitCurve(frozen_array([205.0, 1435.0]), frozen_array([deg, deg]), "downflooding_deg")

    vessel, condition = barge_at(2.0, 3.0, heel_step_deg=1.0, downflooding=flat(35.0))
    a = _run(vessel, condition, upto="criteria")["criteria"]
    a35 = box_dynamic_lever_mrad(B, D, 2.0, 3.0, RAD(35.0))
    a30 = box_dynamic_lever_mrad(B, D, 2.0, 3.0, RAD(30.0))
    assert a.flood_deg == 35.0
    assert a.area_0_40_mrad == pytest.approx(a35, abs=AREA_TOL)
    assert a.area_30_40_mrad == pytest.approx(a35 - a30, abs=AREA_TOL)
    assert "downflooding-low" not in [n.code for n in a.notes]

    vessel, condition = barge_at(2.0, 3.0, heel_step_deg=1.0, downflooding=flat(25.0))
    a = _run(vessel, condition, upto="criteria")["criteria"]
    assert a.area_30_40_mrad == 0.0
    assert [(n.code, n.severity) for n in a.notes][0] == ("downflooding-low", "danger")


# --------------------------------------------------------------------------- 6. warnings


def test_warnings_stage_loll():
    """checks.md §1.5 [A]: KG 5.3 gives GM = −0.13333 m and loll at tanθ = √(2|GM|/BM), 14.1969°.

    With a 1° KN table the crossing is found to 1e-4° (the wall-sided GZ is smooth below
    21.8°: the spline and the linear crossing on the 0.1° grid err by under 1e-4°).  The
    stage names the loll first ('negative-gm', danger, 14.2°: to either side, G being on the
    centreline; corrected by lowering G, never by weight moved to the high side, common practice),
    the list over 2° ('list', caution) and every IS 2008 A 2.2 criterion as failed.
    """
    vessel, condition = barge_at(2.0, 5.3, heel_step_deg=1.0)
    out = _run(vessel, condition)
    bm = B**2 / 24.0
    loll = math.degrees(math.atan(math.sqrt(2.0 * (5.3 - 1.0 - bm) / bm)))
    assert loll == pytest.approx(14.1969, abs=5e-5)
    assert out["curve"].list_deg == pytest.approx(loll, abs=1e-4)
    by_code = {w.code: w for w in out["warnings"]}
    assert by_code["negative-gm"].severity == "danger"
    assert out["warnings"][0].code == "negative-gm"  # her state before the criteria it fails
    assert "-0.133 m" in by_code["negative-gm"].message and "14.2° to either side" in by_code["negative-gm"].message
    assert "never move weight to the high side" in by_code["negative-gm"].message
    assert by_code["list"].message == "list 14.2° to starboard exceeds 2°"
    failed = [w for w in out["warnings"] if w.code == "criterion-failed"]
    assert len(failed) == 6 and all(w.severity == "danger" for w in failed)


def test_a_loll_with_g_off_the_centreline_names_its_side():
    """The same loll with the lightship's G 2 cm to port (checks.md §1.5 box, KG 5.3 m): the off-centre
    weight decides the side, GZ = KN − KG·sinφ + 0.02·cosφ heeling to port being larger."""
    vessel, condition = barge_at(2.0, 5.3, heel_step_deg=1.0)
    vessel = dataclasses.replace(vessel, lightship=dataclasses.replace(vessel.lightship, tcg_m=-0.02))
    loll = next(w for w in _run(vessel, condition)["warnings"] if w.code == "negative-gm")
    assert "° to port; lower G" in loll.message and "either side" not in loll.message


def test_warnings_stage_load_line_and_order():
    """The midships draft against the permitted draft (standards.md §6.1), checks before notes.

    Summer mark 2.0 m; fresh water: allowed 2.050 m (FWA 50 mm, checks.md §1.1).  At
    820 t she floats at 2.050 m, on the mark: no warning.  At 830 t the table-
    equivalent displacement is 830·1.025 t, T = 830/400 = 2.075 m > 2.050: 'load-line'
    danger.  A list of 1° (TCG from :func:`_list_tcg`) is below 2°: no 'list'.  Rule
    ``actual`` adds its caution last.
    """
    for disp, over in ((820.0, False), (830.0, True)):
        vessel = box_barge(lightship_t=disp, lightship_kg_m=3.0, lightship_tcg_m=_list_tcg(1.0, draft=disp / 400.0))
        vessel = dataclasses.replace(vessel, load_lines=(LoadLine("summer", 2.0),))
        condition = Condition(water_density_t_m3=1.0)
        out = _run(vessel, condition)
        codes = [w.code for w in out["warnings"]]
        assert out["upright"].draft_mid_m == pytest.approx(disp / 400.0, abs=ROUND)
        assert ("load-line" in codes) is over
        # 1e-3°: 840.5 and 850.75 t lie between table rows and 1° between the 0° and 5° columns, so KN
        # is a spline there, not the closed form (measured 5e-4°); the 'list' threshold is 2°.
        assert "list" not in codes and out["curve"].list_deg == pytest.approx(1.0, abs=1e-3)
        assert codes[-1] == "fs-rule-actual"
    line = next(w for w in out["warnings"] if w.code == "load-line")
    assert line.severity == "danger"
    assert line.message == ("midships draft 2.075 m is over the summer load line "
                            "(2.050 m allowed in water of 1.000 t/m³)")


def test_criteria_stage_decides_the_sets_from_the_criteria_as_the_cuts_leave_them():
    """A KN table that stops at 35° with θf = 35° (built here without the profile validation), on
    every branch of the stage: with the shape-preserving second opinion (``kn_spread_m``), without it,
    and with the KN table judged unusable at this trim (``kn_beyond``).  Each set's pass must be that
    of its criteria as the stage leaves them (every one assessed and met), whichever branch ran.

    Barge T = 2, exact GZ = KN − KG·sinθ (checks.md §1.2): KG 3.0 gives GZ(30°) = 1.088 m, met;
    KG 4.8 gives GZ(30°) = 0.188 m and 0.001 m at 35° = θf, so "GZ ≥ 0.20 m at 30° or more"
    (IS 2008 Part A 2.2.2) fails and the set is not passed."""
    flood35 = LimitCurve(frozen_array([205.0, 1435.0]), frozen_array([35.0, 35.0]), "downflooding_deg")
    for kg, a22 in ((3.0, True), (4.8, False)):
        vessel, condition = barge_at(2.0, kg, heel_step_deg=5.0, downflooding=flood35)
        kn = vessel.cross_curves
        keep = np.asarray(kn.heel_deg) <= 35.0
        short = dataclasses.replace(kn, heel_deg=frozen_array(np.asarray(kn.heel_deg)[keep]),
                                    kn_m=frozen_array(np.asarray(kn.kn_m)[:, keep]))
        vessel = dataclasses.replace(vessel, cross_curves=short)
        out = _run(vessel, condition, upto="curve")
        assert out["curve"].end_deg == 35.0
        beyond = dataclasses.replace(out["upright"], kn_beyond="KN at even keel beyond the trim limit")
        for curve, upright in ((out["curve"], out["upright"]),
                               (dataclasses.replace(out["curve"], kn_spread_m=None), out["upright"]),
                               (out["curve"], beyond)):
            a = stage_criteria(vessel, condition, out["weights"], out["fs"], upright, curve)
            gz30 = {c.id: c for c in a.criteria}["IS2008-A2.2.2-gz-30"]
            if upright is beyond:
                assert (gz30.assessed, gz30.passed) == (False, False)
            else:
                assert gz30.passed is a22
                assert {s.id: s.passed for s in a.verdict.sets}["IS2008-A2.2"] is a22
            assert a.verdict.sets
            for s in a.verdict.sets:
                assert s.passed == all(c.passed and c.assessed for c in a.criteria if c.set_id == s.id)
