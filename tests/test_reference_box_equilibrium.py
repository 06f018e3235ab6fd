"""The direct equilibrium of the hull (core/equilibrium.py) against a box whose every number has a
closed form, and the side-by-side comparison with the table method.

Analytic solution (derived here).  A box L × B × D, x from the aft end (the AP), y to starboard,
z from the keel, floats in water of density ρ with displacement Δ, so its volume is ∇ = Δ/ρ and
its mean draft T = ∇/(L·B).

* **Even keel.**  With G at midships the box is symmetric fore and aft about G, so the free-trim
  equilibrium has zero trim at every heel: drafts T at the AP, midships and FP, trim 0.  At heel
  θ every section is the same rectangle, so KN(θ) is the section formula of
  tests/vessel_factories.py (``box_kn_m``; checks.md §1.2 [A]), exact at the solved grid heels,
  and GZ = KN − KG·sinθ ∓ TCG·cosθ (starboard −, port +) there (the spline passes through its knots).
  Upright, KB = T/2 and the waterplane is an L × B rectangle about the centreline,
  I_T = L·B³/12, so KMt = KB + I_T/∇ = T/2 + B²/(12·T) and GM = KMt − KG.
* **Trimmed.**  tests/trimmed_box.py derives it: while the waterline cuts both end walls the
  draft at x is d(x) = T + t·(L/2 − x)/L (t the trim, + by the stern) and the volume does not
  depend on t; LCB = L/2 − L·t/(12·T), KB = T/2 + t²/(24·T) in ship axes.  G and B are on one
  vertical when LCG − LCB = (KG − KB)·tanψ, tanψ = t/L, i.e. with LCG = L/2 − a,
  a = s·(T/2 + L²/(12·T) − KG) + s³·L²/(24·T), s = t/L.  So for t = 1 m (L 40, T 2, KG 3) the
  box with a = 1/40·(1 + 1600/24 − 3) + 1/64000·1600/48 = 1.6171875 m floats at T_AP = T + t/2,
  T_FP = T − t/2, midships T, ψ = atan(t/L).  KMt as equilibrium.py defines it (KB + I_T/∇, the
  waterplane's transverse moment in the section frame, which is B wide at every station):
  T/2 + t²/(24·T) + B²/(12·T).
* **Off the centreline.**  Move the whole box by e to starboard: the waterplane's centroid moves
  to y = e and its second moment about the centreline becomes L·B³/12 + L·B·e², but about its
  own centroid (the axis the metacentric radius takes, parallel-axis theorem) it stays L·B³/12, so
  KMt = T/2 + B²/(12·T) still.  KN(θ) gains e·cosθ, so with TCG = e the GZ curve, and the list,
  are those of the centred box.
* **Angle of loll.**  Below deck-edge immersion (tanθ < (D − T)/(B/2)) the box is wall-sided:
  GZ = sinθ·(GM + ½·BM·tan²θ), BM = B²/(12·T) (the wall-sided formula, derived from the same
  section centroid).  With GM < 0 and TCG = 0, GZ rises through zero at tanθ = √(−2·GM/BM).
* **A list.**  With TCG ≠ 0 and the same formula, the list θ solves
  tanθ·(GM + ½·BM·tan²θ) = TCG (a cubic in tanθ, solved below by bisection).

The box is that of checks.md §1 (L 40, B 10, D 4 m) at T = 2 m, KG = 3 m.  Tolerances: the
solver stops when the fore-and-aft balance is within 1e-8 m and the volume within 1e-11 of itself
(cross_curves.solve_floating, body.level_for_volume), which moves drafts and KMt by well under
1e-7 m (the largest lever, L²/(12·T·GM_L) ≈ 1, times 1e-8): NUMERIC = 1e-7 m.  The list is read
on the 0.1° grid by linear interpolation of a natural spline through GZ every 5° of heel
(equilibrium.HEEL_STEP_DEG): its error is written beside each such check.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.equilibrium import DirectError, compare, direct_state, hull_capacity_m3
from deckload.core.geometry.body import Body
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.spec import HullOffsets
from deckload.core.model import Condition, LimitCurve, TankFill, frozen_array
from deckload.core.stability import evaluate
from deckload.core.tables import OutOfRangeError
from vessel_factories import BARGE_B, BARGE_D, BARGE_L, RHO_SW, box_barge, box_gz_m, box_kn_m, box_tank, \
    box_transfer_moment_m4

L, B, D = BARGE_L, BARGE_B, BARGE_D
T, KG = 2.0, 3.0
DISP = RHO_SW * L * B * T  # 820 t
BM = B * B / (12 * T)
KMT = T / 2 + BM  # 5.1666… m
NUMERIC = 1e-7  # module docstring: the solver's own tolerances, with a margin
RAD = math.radians


def box_body(length=L, breadth=B, depth=D, offset=0.0, stations=41) -> Body:
    """The box's sections (``offset`` m to starboard), as the geometry files give a hull."""
    x = np.linspace(0.0, length, stations)
    hull = HullOffsets(station_x_m=x, waterline_z_m=np.array([0.0, depth]),
                       half_breadth_m=np.full((stations, 2), breadth / 2), deck_z_m=np.full(stations, depth))
    y, z = hull_sections(hull)
    return Body(x, y + offset, z)


BODY = box_body()


def wall_sided_list_deg(gm, tcg):
    """tanθ·(GM + ½·BM·tan²θ) = TCG by bisection on tanθ in (0, 0.4) (module docstring)."""
    lo, hi = 0.0, 0.4
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        if mid * (gm + 0.5 * BM * mid * mid) < tcg:
            lo = mid
        else:
            hi = mid
    return math.degrees(math.atan(0.5 * (lo + hi)))


# --------------------------------------------------------------------------- direct_state


def test_even_keel_box_every_field():
    """Even keel (module docstring): every field of the state against its closed form."""
    tcg = 0.2
    d = direct_state(BODY, L, DISP, RHO_SW, L / 2, KG, tcg)
    assert d.displacement_t == DISP
    assert d.heel_deg.tolist() == [5.0 * k for k in range(19)]
    kn = [box_kn_m(B, D, T, RAD(h)) for h in range(0, 91, 5)]
    assert d.kn_m.tolist() == pytest.approx(kn, abs=NUMERIC)
    assert np.max(np.abs(d.trim_grid_rad)) < NUMERIC
    for h in range(0, 91, 5):
        plain = box_gz_m(B, D, T, KG, RAD(h))
        assert d.gz_stbd_m[10 * h] == pytest.approx(plain - tcg * math.cos(RAD(h)), abs=NUMERIC), h
        assert d.gz_port_m[10 * h] == pytest.approx(plain + tcg * math.cos(RAD(h)), abs=NUMERIC), h
    assert d.kmt_m == pytest.approx(KMT, abs=NUMERIC)
    assert d.gm_fluid_m == pytest.approx(KMT - KG, abs=NUMERIC)
    # wall-sided, the waterline pivots about the centreline at height T: heeled to the list the
    # centreline draft is still T at every station (the plane ζ = T·cosθ meets y = 0 at z = T)
    phi = wall_sided_list_deg(KMT - KG, tcg)
    assert d.list_deg == pytest.approx(phi, abs=0.01)  # spline error on this smooth (wall-sided) part: < 0.002°
    assert d.list_deg > 5.0  # a real list: the drafts below are read on a heeled plane
    for got in (d.draft_aft_m, d.draft_mid_m, d.draft_fwd_m):
        assert got == pytest.approx(T, abs=NUMERIC)
    assert abs(d.trim_m) < NUMERIC


def test_trimmed_box_drafts_trim_and_metacentre():
    """Trimmed (module docstring): G 1.6171875 m abaft midships trims the box exactly 1 m by the stern."""
    t = 1.0
    s = t / L
    a = s * (T / 2 + L * L / (12 * T) - KG) + s**3 * L * L / (24 * T)
    assert a == pytest.approx(1.6171875, abs=1e-12)
    d = direct_state(BODY, L, DISP, RHO_SW, L / 2 - a, KG, 0.0)
    assert d.list_deg == 0.0
    assert d.draft_aft_m == pytest.approx(T + t / 2, abs=NUMERIC)
    assert d.draft_fwd_m == pytest.approx(T - t / 2, abs=NUMERIC)
    assert d.draft_mid_m == pytest.approx(T, abs=NUMERIC)
    assert d.trim_m == pytest.approx(t, abs=NUMERIC)
    assert d.trim_grid_rad[0] == pytest.approx(math.atan(t / L), abs=1e-9)
    kmt = T / 2 + t * t / (24 * T) + B * B / (12 * T)
    assert d.kmt_m == pytest.approx(kmt, abs=NUMERIC)
    assert d.gm_fluid_m == pytest.approx(kmt - KG, abs=NUMERIC)


def test_fresh_water_floats_the_same_volume():
    """∇ = Δ/ρ: Δ = 1.000·L·B·T in fresh water floats at T (module docstring)."""
    d = direct_state(BODY, L, 1.0 * L * B * T, 1.0, L / 2, KG, 0.0)
    assert d.draft_mid_m == pytest.approx(T, abs=NUMERIC)
    assert d.kmt_m == pytest.approx(KMT, abs=NUMERIC)


def test_box_off_the_centreline_small():
    """Off the centreline (module docstring): a 2 m × 0.4 m × 0.2 m box 0.05 m to starboard at
    T = 0.1 m (∇ 0.08 m³, waterplane 0.8 m²: nothing in the method has a scale) with TCG = 0.05 m:
    KMt = T/2 + B²/(12T) = 0.05 + 0.16/1.2, upright, drafts T."""
    small = box_body(2.0, 0.4, 0.2, offset=0.05)
    d = direct_state(small, 2.0, 0.08, 1.0, 1.0, 0.1, 0.05)
    assert d.kmt_m == pytest.approx(0.05 + 0.16 / 1.2, abs=1e-9)  # ∇ 0.08 m³: tolerances scale down
    assert d.gm_fluid_m == pytest.approx(0.05 + 0.16 / 1.2 - 0.1, abs=1e-9)
    assert d.list_deg == 0.0
    assert d.draft_aft_m == pytest.approx(0.1, abs=1e-9)


def test_angle_of_loll_is_to_starboard_as_in_the_table_method():
    """KG 5.4 > KMt 5.1667 (module docstring): loll at atan√(2·0.2333/4.1667) = 18.50°.  The
    direct list is within 0.2° (the spline through GZ every 5° beside the deck-edge kink at 21.8°:
    measured 0.12°) and on the same side as the table method's (starboard when G is on the centreline)."""
    kg = 5.4
    loll = math.degrees(math.atan(math.sqrt(2 * (kg - KMT) / BM)))
    assert loll == pytest.approx(18.5035, abs=1e-4)
    d = direct_state(BODY, L, DISP, RHO_SW, L / 2, kg, 0.0)
    assert d.list_deg == pytest.approx(loll, abs=0.2)
    table = evaluate(box_barge(lightship_t=DISP, lightship_kg_m=kg), Condition())
    assert table.list_deg == pytest.approx(loll, abs=0.2)


def test_with_gz_never_positive_the_drafts_stay_inside_the_hull():
    """G three depths above the keel: GZ is negative at every heel, so the list is reported as
    90°.  The drafts are still worked out just short of 90° (89°), where the box's waterline is a
    plane through her; they must lie within her depth (a draft deeper than the hull is not a
    draft: derived), and she is not trimmed (G over the middle of a box: symmetric)."""
    d = direct_state(BODY, L, DISP, RHO_SW, L / 2, 3.0 * D, 0.0)
    assert d.list_deg == 90.0 and d.gm_fluid_m < 0.0
    for draft in (d.draft_aft_m, d.draft_fwd_m):
        assert 0.0 <= draft <= D
    assert d.trim_m == pytest.approx(0.0, abs=1e-9)


def test_refusals_name_the_displacement():
    """Nothing that cannot float is computed: no displacement, a negative or an infinite one."""
    for disp, shown in ((0.0, "0.0"), (-10.0, "-10.0"), (math.inf, "inf")):
        with pytest.raises(DirectError) as e:
            direct_state(BODY, L, disp, RHO_SW, L / 2, KG, 0.0)
        assert str(e.value) == f"displacement {shown} t cannot float"


def test_hull_capacity_is_the_whole_box_and_is_exclusive():
    """The closed box holds L·B·D = 1600 m³; a displacement filling it exactly (ρ = 1, Δ = the
    capacity) has no freeboard left and is refused with the range in m³, as is 101 %; 95 % floats."""
    cap = hull_capacity_m3(BODY)
    assert cap == pytest.approx(L * B * D, abs=1e-9)
    with pytest.raises(OutOfRangeError) as e:
        direct_state(BODY, L, cap, 1.0, L / 2, KG, 0.0)
    assert str(e.value) == ("displacement (hull geometry, volume) 1600 m³ is outside the table range "
                            "0–1600 m³; deckload does not extrapolate")
    with pytest.raises(OutOfRangeError) as e:
        direct_state(BODY, L, 1.01 * L * B * D, 1.0, L / 2, 1.0, 0.0)
    assert str(e.value).startswith("displacement (hull geometry, volume) 1616 m³ is outside the table range 0–1600 m³")
    d = direct_state(BODY, L, 0.95 * L * B * D, 1.0, L / 2, 1.0, 0.0)
    assert d.draft_mid_m == pytest.approx(0.95 * D, abs=NUMERIC)


def test_g_beyond_the_hull_end_has_no_equilibrium():
    """G 80 m forward of a 40 m box: B can never come under it; refused with the solver's reason."""
    with pytest.raises(DirectError) as e:
        direct_state(BODY, L, DISP, RHO_SW, 3 * L, KG, 0.0)
    assert str(e.value).startswith("free-trim equilibrium not found at volume 800.00 m³")


# --------------------------------------------------------------------------- compare


ROWS = ["Draft aft", "Draft forward", "Draft midships", "Trim (+ by the stern)", "List (+ starboard)", "KMt",
        "GM fluid", "GZ at 10°", "GZ at 20°", "GZ at 30°", "GZ at 40°", "GZ at 50°", "GZ at 60°", "Max GZ",
        "Angle of max GZ", "Area 0–30°", "Area 0–40.0°", "Area 30–40.0°"]
UNITS = ["m"] * 4 + ["deg", "m", "m"] + ["m"] * 7 + ["deg", "m·rad", "m·rad", "m·rad"]


def _with_hull(v):
    return dataclasses.replace(v, hull=BODY)


def test_compare_carries_the_transfer_correction_over():
    """IS 2008 B 3.1 transfer correction (the set-up of test_reference_free_surface.py::
    test_gz_with_actual_moment_of_fluid_transfer: box tank 6 × 4 × 2 m at 50 % in the barge, Δ = 820 t,
    checks.md §3.2 [A]).  The direct curve takes the result's correction beyond KG fluid, so at the
    whole degrees of the rows GZ = KN − KG_solid·sinφ − ρ·M(φ)/Δ with the exact KN and M; drafts,
    KMt and GM fluid (KG + ρ·i/Δ, i = 6·4³/12) from the even-keel closed forms."""
    tank = box_tank("DB1C", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0, with_transfer=True)
    w = RHO_SW * 24.0
    v = _with_hull(box_barge(lightship_t=DISP - w, lightship_kg_m=KG, tanks=(tank,)))
    r = evaluate(v, Condition(tanks=(TankFill("DB1C", "percent", 50.0),), gz_correction="transfer"))
    kg_solid = ((DISP - w) * KG + w * 0.5) / DISP
    kg_fluid = kg_solid + RHO_SW * 6 * 4**3 / 12 / DISP
    cmp = compare(v, r)
    assert [r.quantity for r in cmp.rows] == ROWS
    assert [r.unit for r in cmp.rows] == UNITS
    rows = {r.quantity: (r.tables, r.direct) for r in cmp.rows}
    for name in ("Draft aft", "Draft forward", "Draft midships"):
        assert rows[name][1] == pytest.approx(T, abs=NUMERIC)
    assert rows["Trim (+ by the stern)"][1] == pytest.approx(0.0, abs=NUMERIC)
    assert rows["List (+ starboard)"][1] == 0.0
    assert rows["KMt"][1] == pytest.approx(KMT, abs=NUMERIC)
    assert rows["GM fluid"][1] == pytest.approx(KMT - kg_fluid, abs=NUMERIC)
    assert cmp.direct.kmt_m == pytest.approx(KMT, abs=NUMERIC)
    assert len(cmp.gz_direct_m) == 91
    for deg in range(10, 61, 10):
        exact = box_kn_m(B, D, T, RAD(deg)) - kg_solid * math.sin(RAD(deg)) \
            - RHO_SW * box_transfer_moment_m4(6, 4, 2, 50.0, RAD(deg)) / DISP
        assert rows[f"GZ at {deg}°"][1] == pytest.approx(exact, abs=NUMERIC), deg
        assert rows[f"GZ at {deg}°"][0] == pytest.approx(exact, abs=NUMERIC), deg  # the tables' own, same knots
        assert cmp.gz_direct_m[deg] == pytest.approx(exact, abs=NUMERIC), deg


@pytest.mark.parametrize("tcg", [0.3, -0.3])
def test_compare_on_either_side(tcg):
    """A list to starboard and to port (module docstring, 'A list'): the rows take the curve on the
    side G lies to — GZ = KN − KG·sinφ − |TCG|·cosφ at the whole tens of degrees, exact — and the
    list's sign from it; the size within 0.01° (spline error on the wall-sided part < 0.002°)."""
    v = _with_hull(box_barge(lightship_t=DISP, lightship_kg_m=KG, lightship_tcg_m=tcg))
    r = evaluate(v, Condition())
    cmp = compare(v, r)
    rows = {r.quantity: (r.tables, r.direct) for r in cmp.rows}
    phi = wall_sided_list_deg(KMT - KG, abs(tcg))
    assert rows["List (+ starboard)"][1] == pytest.approx(math.copysign(phi, tcg), abs=0.01)
    for deg in range(10, 61, 10):
        exact = box_gz_m(B, D, T, KG, RAD(deg)) - abs(tcg) * math.cos(RAD(deg))
        assert rows[f"GZ at {deg}°"][1] == pytest.approx(exact, abs=NUMERIC), deg
        assert cmp.gz_direct_m[deg] == pytest.approx(exact, abs=NUMERIC), deg


def test_compare_in_fresh_water():
    """ρ = 1.000: Δ = L·B·T floats the box at T; the tables are entered at Δ·1.025/1.000 (their
    density), the same draft, so both columns give the exact GZ (no correction to carry over)."""
    v = _with_hull(box_barge(lightship_t=1.0 * L * B * T, lightship_kg_m=KG))
    r = evaluate(v, Condition(water_density_t_m3=1.0))
    cmp = compare(v, r)
    rows = {r.quantity: (r.tables, r.direct) for r in cmp.rows}
    assert rows["Draft midships"][1] == pytest.approx(T, abs=NUMERIC)
    for deg in range(10, 61, 10):
        exact = box_gz_m(B, D, T, KG, RAD(deg))
        assert rows[f"GZ at {deg}°"][1] == pytest.approx(exact, abs=NUMERIC), deg


@pytest.mark.parametrize("flood_deg, top", [(35.0, 35.0), (45.0, 40.0), (None, 40.0), (30.5, 30.5)])
def test_compare_areas_stop_at_the_downflooding_angle(flood_deg, top):
    """IS 2008 A 2.2.1: the areas to 40° or θf if less (no downflooding curve: 40°).  Direct areas of the exact GZ (the dynamic
    lever of the box, vessel_factories.box_dynamic_lever_mrad, checks.md §1) within 5e-4 m·rad (the
    spline through 5° knots beside the deck-edge kink at 21.8°: measured 1.4e-4 to 30°, 1.9e-4 to 35°;
    IS 2008's limits are 0.055–0.09 m·rad, so 5e-4 is under 1 % of the smallest)."""
    from vessel_factories import box_dynamic_lever_mrad

    curve = None if flood_deg is None else LimitCurve(frozen_array([100.0, 2000.0]), frozen_array([flood_deg, flood_deg]),
                                                       "downflooding_deg")
    v = _with_hull(box_barge(lightship_t=DISP, lightship_kg_m=KG, downflooding=curve))
    cmp = compare(v, evaluate(v, Condition()))
    rows = {r.quantity: (r.tables, r.direct) for r in cmp.rows}
    a30 = box_dynamic_lever_mrad(B, D, T, KG, RAD(30))
    a_top = box_dynamic_lever_mrad(B, D, T, KG, RAD(top))
    assert rows["Area 0–30°"][1] == pytest.approx(a30, abs=5e-4)
    assert rows[f"Area 0–{top:.1f}°"][1] == pytest.approx(a_top, abs=5e-4)
    assert rows[f"Area 30–{top:.1f}°"][1] == pytest.approx(a_top - a30, abs=5e-4)


def test_compare_area_from_30_degrees_is_nil_when_downflooding_comes_first():
    """IS 2008 A 2.2.1: the area between 30° and 40° (or θf if less); with θf = 25° there is no
    such range, and both columns show 0 (the booklet's convention for an empty range, common
    practice).  The area to θf is the box's exact dynamic lever to 25° (checks.md §1), within the
    5e-4 m·rad of the test above."""
    from vessel_factories import box_dynamic_lever_mrad

    curve = LimitCurve(frozen_array([100.0, 2000.0]), frozen_array([25.0, 25.0]), "downflooding_deg")
    v = _with_hull(box_barge(lightship_t=DISP, lightship_kg_m=KG, downflooding=curve))
    rows = {r.quantity: (r.tables, r.direct) for r in compare(v, evaluate(v, Condition())).rows}
    assert rows["Area 30–25.0°"] == (0.0, 0.0)
    assert rows["Area 0–25.0°"][1] == pytest.approx(box_dynamic_lever_mrad(B, D, T, KG, RAD(25)), abs=5e-4)


def test_compare_without_a_hull_is_refused_in_words():
    v = box_barge(lightship_t=DISP, lightship_kg_m=KG)
    with pytest.raises(DirectError) as e:
        compare(v, evaluate(v, Condition()))
    assert str(e.value) == ("the profile names no hull_geometry (or its file is not there): "
                            "the direct calculation needs the hull")


def test_compare_refuses_kn_tables_that_stop_short_of_90_degrees():
    """The profile reader accepts KN tables that end at 40° (or θf); the side-by-side rows need the
    tables' curve to 90°.  Such a profile is refused in words (DirectError, which the CLI and the
    screen show), not with a traceback (it raised a bare ValueError before).  tests/trimmed_box.py:
    box 40 × 8 × 10 m with tables at several trims, KN to 40°."""
    import trimmed_box

    v = dataclasses.replace(trimmed_box.box(5.0, 4.0, 0.5), hull=box_body(40.0, 8.0, 10.0))
    r = evaluate(v, Condition())
    with pytest.raises(DirectError) as e:
        compare(v, r)
    assert str(e.value) == ("the KN tables stop at 40° of heel: the side-by-side comparison with the hull "
                            "needs them to 90°")
