"""The engine against a box barge, whose every number has a closed form.

Source: checks.md §1 [A] (box barge L = 40, B = 10, D = 4 m, ρ = 1.025 t/m³), the
analytic solution derived in tests/vessel_factories.py and below, and Barrass &
Derrett, *Ship Stability for Masters and Mates*, 5th ed. (1999), p.130 Ex.1 and Ex.2.
The vessels are built in code (tests/vessel_factories.py); their tables are sampled
from the closed forms at drafts 0.5–3.5 m (0.25 m steps) and heel 0–90° (5° steps,
or 1° where a test needs finer tabulation), so the only errors the engine may add
are those of interpolating the tables.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.model import Condition, DeckItem
from deckload.core.stability import evaluate
from deckload.core.tables import OutOfRangeError
from vessel_factories import (
    BARGE_B,
    BARGE_D,
    BARGE_L,
    RHO_SW,
    barge_at,
    box_barge,
    box_dynamic_lever_mrad,
    box_gz_m,
    box_kn_m,
    box_transfer_moment_m4,
    box_vessel,
    deck_edge_angle_rad,
)

L, B, D, RHO = BARGE_L, BARGE_B, BARGE_D, RHO_SW
RAD = math.radians

# checks.md §1.2 [A]: KN and exact GZ (KG = 3) of the barge at T = 2, heel 5°…90°.
CHECKS_1_2 = {
    5: (0.45169, 0.19023), 10: (0.90843, 0.38749), 15: (1.37595, 0.59949), 20: (1.86150, 0.83544),
    25: (2.31359, 1.04573), 30: (2.58771, 1.08771), 35: (2.75383, 1.03310), 40: (2.85134, 0.92298),
    45: (2.89914, 0.77782), 50: (2.90730, 0.60917), 55: (2.88180, 0.42434), 60: (2.82650, 0.22842),
    65: (2.74421, 0.02529), 70: (2.63719, -0.18189), 75: (2.50740, -0.39037), 80: (2.35671, -0.59771),
    85: (2.18695, -0.80164), 90: (2.00000, -1.00000),
}
# checks.md §1.4 [A]: KN at T = 1 and T = 3, heel 10°…90°.
CHECKS_1_4 = {
    1.0: (1.55639, 2.68414, 3.19743, 3.45955, 3.47903, 3.29594, 2.96747, 2.52674, 2.00000),
    3.0: (0.75033, 1.35074, 1.73248, 2.01023, 2.18107, 2.25335, 2.24208, 2.15533, 2.00000),
}
ROUND5 = 6e-6  # the checks tables are printed to 5 decimals


# --------------------------------------------------------------------------- the factory itself


def test_factory_kn_matches_checks_1_2_and_1_4():
    """The closed forms in vessel_factories reproduce checks.md §1.2 and §1.4 (printed to 5 dp)
    and the point-symmetry invariant KN(T=3) = (KN(T=1) + D·sinθ)/3 (checks.md §1.4)."""
    for deg, (kn, gz) in CHECKS_1_2.items():
        assert box_kn_m(B, D, 2.0, RAD(deg)) == pytest.approx(kn, abs=ROUND5)
        assert box_gz_m(B, D, 2.0, 3.0, RAD(deg)) == pytest.approx(gz, abs=ROUND5)
    for t, row in CHECKS_1_4.items():
        for k, kn in enumerate(row):
            assert box_kn_m(B, D, t, RAD(10 * (k + 1))) == pytest.approx(kn, abs=ROUND5)
    for deg in range(0, 91, 5):
        kn1, kn3 = box_kn_m(B, D, 1.0, RAD(deg)), box_kn_m(B, D, 3.0, RAD(deg))
        assert kn3 == pytest.approx((kn1 + D * math.sin(RAD(deg))) / 3.0, abs=1e-12)


def test_factory_kn_against_polygon_clipping():
    """Independent check of the regime formulas: clip the rectangle with shapely at the
    waterline found by bisection on the area, KN = y_B·cosθ + z_B·sinθ (checks.md §1.2 method)."""
    from shapely.geometry import Polygon, box  # a test dependency (pyproject "test" extra): never skipped

    def kn_clip(t_draft, deg):
        th = RAD(deg)
        rect = box(-B / 2, 0, B / 2, D)
        c, s = math.cos(th), math.sin(th)

        def under(c0):
            # submerged: earth height −y·sinθ + z·cosθ below c0, i.e. z < c0/cosθ + y·tanθ
            w, t = 2 * B, s / c
            floor = c0 / c - w * t - 100.0
            pts = [(-w, c0 / c - w * t), (w, c0 / c + w * t), (w, floor), (-w, floor)]
            return rect.intersection(Polygon(pts))

        lo, hi = -20.0, 20.0
        for _ in range(200):
            mid = (lo + hi) / 2
            if under(mid).area < B * t_draft:
                lo = mid
            else:
                hi = mid
        cen = under((lo + hi) / 2).centroid
        return cen.x * c + cen.y * s

    # the clipper itself reproduces checks.md §1.2/§1.4 [A] (printed to 5 dp: half a unit of the last digit)
    assert kn_clip(2.0, 30) == pytest.approx(2.58771, abs=5e-6)
    assert kn_clip(1.0, 60) == pytest.approx(3.29594, abs=5e-6)
    for t_draft in (1.0, 2.0, 2.75):
        for deg in (10, 22, 35, 60, 80, 89):
            assert box_kn_m(B, D, t_draft, RAD(deg)) == pytest.approx(kn_clip(t_draft, deg), abs=1e-9)


def test_factory_transfer_moment_matches_checks_3_2():
    """Box tank l=6, b=4, h=2 at 30° (checks.md §3.2 [A]): M at 10…90 % fill, max 6 + 7√3 at 50 %."""
    table = [6.53604, 11.31813, 14.79089, 17.11298, 18.12436, 17.11298, 14.79089, 11.31813, 6.53604]
    for k, m in enumerate(table):
        assert box_transfer_moment_m4(6, 4, 2, 10.0 * (k + 1), RAD(30)) == pytest.approx(m, abs=ROUND5)
    assert box_transfer_moment_m4(6, 4, 2, 50.0, RAD(30)) == pytest.approx(6 + 7 * math.sqrt(3), abs=1e-12)
    # Wall-sided at 10°: M = i·sinθ·(1 + ½tan²θ), i = l·b³/12 (checks.md §3.2).
    i = 6 * 4**3 / 12
    assert box_transfer_moment_m4(6, 4, 2, 50.0, RAD(10)) == pytest.approx(
        i * math.sin(RAD(10)) * (1 + 0.5 * math.tan(RAD(10)) ** 2), abs=1e-12)


# --------------------------------------------------------------------------- upright hydrostatics


@pytest.mark.parametrize("t_draft", [1.0, 1.5, 2.0, 2.5, 3.0])
@pytest.mark.parametrize("kg", [2.0, 3.0])
def test_upright_hydrostatics(t_draft, kg):
    """checks.md §1.1 [A]: Δ = ρLBT, KB = T/2, BM = B²/12T, KM = KB + BM, GM = KM − KG,
    TPC = ρLB/100, LCB = LCF = L/2, MCTC = Δ·GML/(100L) with GML = KB + BML − KG, BML = L²/12T
    (the profile has KML, so the actual GML is used: 13.2567 at T = 2, KG = 3 in checks.md §1.1;
    the table column ρBL²/1200 stands BML for GML).  Drafts on table rows: exact to round-off."""
    v, c = barge_at(t_draft, kg)
    r = evaluate(v, c)
    assert r.displacement_t == pytest.approx(RHO * L * B * t_draft, rel=1e-12)
    assert r.km_m == pytest.approx(t_draft / 2 + B**2 / (12 * t_draft), abs=1e-12)
    assert r.gm_solid_m == pytest.approx(t_draft / 2 + B**2 / (12 * t_draft) - kg, abs=1e-12)
    assert r.gm_fluid_m == r.gm_solid_m and r.fsc_m == 0.0
    assert r.tpc_t_cm == pytest.approx(RHO * L * B / 100, abs=1e-12)
    assert r.mctc_tm_cm == pytest.approx(RHO * L * B * t_draft * (t_draft / 2 + L**2 / (12 * t_draft) - kg) / (100 * L),
                                         abs=1e-9)
    if (t_draft, kg) == (2.0, 3.0):
        assert r.mctc_tm_cm == pytest.approx(13.2567, abs=5e-5)
    assert r.lcb_m == pytest.approx(L / 2) and r.lcf_m == pytest.approx(L / 2)
    assert r.draft_mean_m == pytest.approx(t_draft, abs=1e-12)
    assert r.draft_aft_m == pytest.approx(t_draft, abs=1e-12) and r.draft_fwd_m == pytest.approx(t_draft, abs=1e-12)
    assert r.trim_m == pytest.approx(0.0, abs=1e-12) and r.list_deg == 0.0


def test_checks_1_1_numbers():
    """checks.md §1.1 printed values at T = 2, KG = 3: Δ 820.000, KMt 5.16667, GMt 2.16667, TPC 4.1000."""
    r = evaluate(*barge_at(2.0, 3.0))
    assert r.displacement_t == pytest.approx(820.000, abs=5e-4)
    assert r.km_m == pytest.approx(5.16667, abs=5e-6)
    assert r.gm_fluid_m == pytest.approx(2.16667, abs=5e-6)
    assert r.tpc_t_cm == pytest.approx(4.1000, abs=5e-5)


@pytest.mark.parametrize("t_draft", [2.1, 2.6, 3.3])
def test_between_table_rows_within_ur_l5(t_draft):
    """Between rows, linear interpolation (common practice; MSC.1/Circ.1229 4.5) of tables
    sampled every 0.25 m stays within the UR L5 tolerances (standards.md §5.3, §8 rows 18–21):
    Δ 2 %, draft 1 %/5 cm, KMt 1 %/5 cm, KN 5 cm → GZ 5 %/5 cm.  Δ and draft are linear in
    T for a box, so those are exact."""
    v, c = barge_at(t_draft, 3.0)
    r = evaluate(v, c)
    km = t_draft / 2 + B**2 / (12 * t_draft)
    assert r.draft_mean_m == pytest.approx(t_draft, abs=1e-12)
    assert abs(r.km_m - km) <= min(0.01 * km, 0.05)
    for deg in range(0, 91, 5):
        exact = box_gz_m(B, D, t_draft, 3.0, RAD(deg))
        assert abs(r.gz_m[deg] - exact) <= 0.05


def test_cross_curves_between_displacement_rows():
    """Midway between the T = 2.00 and 2.25 m rows the engine's KN lies within 1 mm of the exact
    box KN at every tabulated heel (not-a-knot spline in displacement; the closed forms of
    checks.md §1.2, and tests/test_reference_kn_interpolation.py for rows further apart)."""
    v, c = barge_at(2.125, 3.0)
    r = evaluate(v, c)
    for deg in range(0, 91, 5):
        assert r.gz_m[deg] == pytest.approx(box_kn_m(B, D, 2.125, RAD(deg)) - 3.0 * math.sin(RAD(deg)), abs=1e-3)


def test_outside_the_tables_is_refused():
    """Nothing is extrapolated (DEVELOPERS.md): Δ beyond the last row (T 3.5 m) raises OutOfRangeError."""
    v, _ = barge_at(3.4, 3.0)
    heavy = Condition(deck_items=(DeckItem("Extra", 60.0, 20.0, 3.0),))  # Δ 1394 + 60 > 1435 t
    with pytest.raises(OutOfRangeError) as e:
        evaluate(v, heavy)
    # the error names the quantity, the value asked for and the range (DEVELOPERS.md "How the numbers
    # are made"): Δ 1454 t against the table's 205–1435 t (1.025·40·10·T for T 0.5–3.5 m)
    assert str(e.value) == ("displacement (hydrostatic table, at table density) 1454 t is outside the table "
                            "range 205–1435 t; deckload does not extrapolate")
    assert (e.value.quantity, e.value.unit) == ("displacement (hydrostatic table, at table density)", "t")
    assert e.value.value == pytest.approx(1.025 * 400 * 3.4 + 60.0, abs=1e-9)
    assert (e.value.low, e.value.high) == pytest.approx((205.0, 1435.0), abs=1e-9)


def test_out_of_range_message_without_a_unit():
    """A unitless quantity is printed with no stray space or unit."""
    assert str(OutOfRangeError("fill ratio", 1.5, 0.0, 1.0)) == (
        "fill ratio 1.5 is outside the table range 0–1; deckload does not extrapolate")


# --------------------------------------------------------------------------- GZ curve


@pytest.mark.parametrize("kg", [2.0, 3.0, 3.5])
def test_gz_wall_sided_up_to_deck_edge(kg):
    """Wall-sided formula GZ = sinφ·(GM + ½·BM·tan²φ), valid while the waterline cuts both sides.

    Derivation (analytic): heeled to φ with t = tanφ, the emerged and immersed wedges are
    triangles of legs B/2 and (B/2)·t; moving the emerged wedge (area B²t/8) across moves
    B by y_B = B²t/(12T) horizontally and z_B − KB = B²t²/(24T) vertically in body axes.
    GZ = y_B·cosφ + z_B·sinφ − KG·sinφ = sinφ·[(KB + BM − KG) + ½·BM·tan²φ] with BM = B²/(12T).
    It holds up to deck-edge immersion or bilge emergence, tanφ = min(D − T, T)/(B/2):
    21.80° for the barge at T = 2 (checks.md §1.1).  Tables at 1° steps: exact at every degree.
    """
    t_draft = 2.0
    v, c = barge_at(t_draft, kg, heel_step_deg=1.0)
    r = evaluate(v, c)
    gm = t_draft / 2 + B**2 / (12 * t_draft) - kg
    bm = B**2 / (12 * t_draft)
    edge = math.degrees(deck_edge_angle_rad(B, D, t_draft))
    assert edge == pytest.approx(21.8014, abs=5e-5)
    for deg in range(0, int(edge) + 1):
        phi = RAD(deg)
        assert r.gz_m[deg] == pytest.approx(math.sin(phi) * (gm + 0.5 * bm * math.tan(phi) ** 2), abs=1e-9)
    # Beyond the deck edge the wall-sided formula is wrong (checks.md §1.2: 1.43056 against 1.08771 at 30°).
    assert r.gz_m[30] < math.sin(RAD(30)) * (gm + 0.5 * bm * math.tan(RAD(30)) ** 2) - 0.3


def test_gz_beyond_deck_edge_matches_checks_1_2():
    """Exact GZ (KG 3) at 5°…90° from checks.md §1.2 [A], at the tabulated heels (5° table)."""
    r = evaluate(*barge_at(2.0, 3.0))
    assert r.gz_heel_deg == tuple(float(d) for d in range(91))
    for deg, (_, gz) in CHECKS_1_2.items():
        assert r.gz_m[deg] == pytest.approx(gz, abs=ROUND5)


def test_gz_between_tabulated_heels():
    """Between the 5° columns the spline through KN may differ from the exact curve by the
    tabulation error only: within the UR L5 GZ tolerance 5 %/5 cm (standards.md §5.3); we
    hold it to 1 cm, which the 5° table of the barge allows (largest error just past the
    21.8° kink)."""
    r = evaluate(*barge_at(2.0, 3.0))
    for deg in range(1, 91):
        assert r.gz_m[deg] == pytest.approx(box_gz_m(B, D, 2.0, 3.0, RAD(deg)), abs=0.01)


# --------------------------------------------------------------------------- areas and criteria

# checks.md §1.3 [A]: KG → (GM, A0–30, A0–40, A30–40, GZ30, GZmax, θmax, vanishing)
CHECKS_1_3 = {
    3.0: (2.16667, 0.316025, 0.494738, 0.178713, 1.08771, 1.08904, 29.18, 65.61),
    4.0: (1.16667, 0.182051, 0.260783, 0.078732, 0.58771, 0.62681, 26.08, 46.59),
    4.5: (0.66667, 0.115064, 0.143805, 0.028741, 0.33771, 0.41186, 24.88, 39.10),
}


@pytest.mark.parametrize("kg", sorted(CHECKS_1_3))
def test_areas_and_curve_facts_5deg_table(kg):
    """checks.md §1.3 [A] from the 5° table: areas within 1e-3 m·rad (checks.md §1.3 advice for
    tabulated GZ, tighter than UR L5's 0.0012 m·rad); GZmax within 5 mm; θmax within 0.5°
    (the kink at 21.8° limits what a 5° table can say); vanishing angle within 0.1°."""
    gm, a30, a40, a3040, gz30, gzmax, thmax, vanish = CHECKS_1_3[kg]
    r = evaluate(*barge_at(2.0, kg))
    assert r.gm_fluid_m == pytest.approx(gm, abs=5e-6)
    assert r.area_0_30_mrad == pytest.approx(a30, abs=1e-3)
    assert r.area_0_40_mrad == pytest.approx(a40, abs=1e-3)
    assert r.area_30_40_mrad == pytest.approx(a3040, abs=1e-3)
    assert r.max_gz_m == pytest.approx(gzmax, abs=5e-3)
    assert r.max_gz_angle_deg == pytest.approx(thmax, abs=0.5)
    assert r.vanishing_angle_deg == pytest.approx(vanish, abs=0.1)
    crit = {c.id: c for c in r.criteria}
    assert crit["IS2008-A2.2.2-gz-30"].value == pytest.approx(gz30, abs=ROUND5)


@pytest.mark.parametrize("kg", sorted(CHECKS_1_3))
def test_areas_criteria_table_1deg_table(kg):
    """checks.md §1.3 [A] in full from a 1° table: areas within 1e-4 m·rad of the exact dynamic
    lever area(0→φ) = y_B·sinφ + (KG − z_B)·cosφ − (KG − KB), θmax within 0.05°, and the
    pass/fail row of the IS 2008 A 2.2 limits exactly as checks.md §1.3 gives it (KG 4.5 fails
    the 30–40° area, 0.028741 < 0.030, and θmax, 24.88° < 25°)."""
    gm, a30, a40, a3040, gz30, gzmax, thmax, vanish = CHECKS_1_3[kg]
    r = evaluate(*barge_at(2.0, kg, heel_step_deg=1.0))
    exact30 = box_dynamic_lever_mrad(B, D, 2.0, kg, RAD(30))
    exact40 = box_dynamic_lever_mrad(B, D, 2.0, kg, RAD(40))
    assert exact30 == pytest.approx(a30, abs=1e-6) and exact40 == pytest.approx(a40, abs=1e-6)
    assert r.area_0_30_mrad == pytest.approx(exact30, abs=1e-4)
    assert r.area_0_40_mrad == pytest.approx(exact40, abs=1e-4)
    assert r.area_30_40_mrad == pytest.approx(exact40 - exact30, abs=1e-4)
    assert r.max_gz_m == pytest.approx(gzmax, abs=1e-4)
    assert r.max_gz_angle_deg == pytest.approx(thmax, abs=0.05)
    assert r.vanishing_angle_deg == pytest.approx(vanish, abs=0.01)
    crit = {c.id: c for c in r.criteria}
    expected_pass = {
        "IS2008-A2.2.1-area-0-30": a30 >= 0.055,
        "IS2008-A2.2.1-area-0-40": a40 >= 0.090,
        "IS2008-A2.2.1-area-30-40": a3040 >= 0.030,
        "IS2008-A2.2.2-gz-30": gz30 >= 0.20,
        "IS2008-A2.2.3-angle-max-gz": thmax >= 25.0,
        "IS2008-A2.2.4-gm0": gm >= 0.15,
    }
    assert {k: bool(crit[k].passed) for k in expected_pass} == expected_pass
    if kg == 4.5:
        assert not crit["IS2008-A2.2.1-area-30-40"].passed and not crit["IS2008-A2.2.3-angle-max-gz"].passed


def test_kg_change_shifts_area_by_one_minus_cos():
    """checks.md §1.3: area(KG) = area(KG0) − (KG − KG0)·(1 − cosθ), since GZ falls by ΔKG·sinφ.

    To 1e-6 m·rad: the quadrature of ΔKG·sinφ on the engine's grid, nothing of the table."""
    r3 = evaluate(*barge_at(2.0, 3.0))
    r4 = evaluate(*barge_at(2.0, 4.0))
    assert r4.area_0_30_mrad == pytest.approx(r3.area_0_30_mrad - 1.0 * (1 - math.cos(RAD(30))), abs=1e-6)
    assert r4.area_0_40_mrad == pytest.approx(r3.area_0_40_mrad - 1.0 * (1 - math.cos(RAD(40))), abs=1e-6)


# --------------------------------------------------------------------------- loll


@pytest.mark.parametrize("step, tol", [(1.0, 0.01), (5.0, 1.0)])
def test_angle_of_loll(step, tol):
    """checks.md §1.5 [A]: KG 5.3, GM = −0.13333; wall-sided tanθ = √(2|GM|/BM) → 14.1969°;
    GZ(5°) = −0.01023, GZ(10°) = −0.01191; GZ back to zero at 28.2037°.
    From a 1° table within 0.01°; from the 5° table within UR L5's 1° for equilibrium
    angles (standards.md §5.3)."""
    v, c = barge_at(2.0, 5.3, heel_step_deg=step)
    r = evaluate(v, c)
    gm = 5.16667 - 5.3
    bm = B**2 / 24
    loll = math.degrees(math.atan(math.sqrt(2 * abs(r.gm_fluid_m) / bm)))
    assert r.gm_fluid_m == pytest.approx(gm, abs=5e-6)
    assert loll == pytest.approx(14.1969, abs=5e-5)
    assert abs(r.list_deg) == pytest.approx(loll, abs=tol)
    assert r.gz_m[5] == pytest.approx(-0.01023, abs=ROUND5)
    assert r.gz_m[10] == pytest.approx(-0.01191, abs=ROUND5)
    assert r.vanishing_angle_deg == pytest.approx(28.2037, abs=tol)
    assert any(w.code == "negative-gm" and w.severity == "danger" for w in r.warnings)
    assert not {c.id: c for c in r.criteria}["IS2008-A2.2.4-gm0"].passed


# --------------------------------------------------------------------------- trim and density


def test_trim_from_weight_shift_checks_1_6():
    """checks.md §1.6 [A]: 10 t shifted 15 m aft on the barge at T = 2, KG = 3.
    Trim = w·d/MCTC = 150/13.2567 = 11.315 cm by the stern (MCTC = Δ·GML/(100L), GML = 64.6667);
    dA = T + t/2 = 2.05658, dF = T − t/2 = 1.94342 (LCF at midships)."""
    v = box_barge(lightship_t=810.0, lightship_kg_m=3.0, mctc_kg_m=3.0)
    c = Condition(deck_items=(DeckItem("Shifted weight", 10.0, L / 2 - 15.0, 3.0),))
    r = evaluate(v, c)
    gml = 2.0 / 2 + L**2 / (12 * 2.0) - 3.0
    mctc = RHO * L * B * 2.0 * gml / (100 * L)
    assert mctc == pytest.approx(13.2567, abs=5e-5)
    assert r.mctc_tm_cm == pytest.approx(mctc, abs=1e-9)
    assert r.trim_m == pytest.approx(10 * 15 / mctc / 100, abs=1e-12)
    assert r.trim_m == pytest.approx(0.113150, abs=1e-6)
    assert r.draft_aft_m == pytest.approx(2.05658, abs=5e-6)
    assert r.draft_fwd_m == pytest.approx(1.94342, abs=5e-6)
    assert r.draft_mean_m == pytest.approx(2.0, abs=1e-12)


def test_fresh_water_sinkage_equals_fwa():
    """checks.md §1.1 [A] and standards.md §6.1 (FWA, shipboard formula [C]): in fresh water
    (ρ = 1.000) the barge of Δ = 820 t sinks by FWA = Δ/(4·TPC) mm = 820/(4·4.1) = 50.0 mm;
    for a box the exact sinkage is the same.  Δ is unchanged; TPC scales with ρ."""
    v, c = barge_at(2.0, 3.0)
    r_sw = evaluate(v, c)
    r_fw = evaluate(v, c.with_density(1.000))
    fwa_m = r_sw.displacement_t / (4 * r_sw.tpc_t_cm) / 1000
    assert fwa_m == pytest.approx(0.050, abs=1e-12)
    assert r_fw.displacement_t == r_sw.displacement_t
    assert r_fw.draft_mean_m - r_sw.draft_mean_m == pytest.approx(fwa_m, abs=1e-9)
    assert r_fw.draft_mean_m == pytest.approx(820 / (1.000 * L * B), abs=1e-9)
    assert r_fw.tpc_t_cm == pytest.approx(1.000 * L * B / 100, abs=1e-12)


# --------------------------------------------------------------------------- textbook boxes


def test_barrass_derrett_p130_ex2_box():
    """Barrass & Derrett 5th ed. p.130 Ex.2: box 65 × 12 × 8 m, draft 4 m, KG 4 m, salt water.
    Book: W = 3198 t, KB 2, BM 3, GM 1 (so KM = 5).  At 25° (deck edge at atan(4/6) = 33.7°) the
    wall-sided GZ = sinφ(GM + ½BM tan²φ) = 0.560461 m and RM = W·GZ = 1792.4 t·m (checks.md §4 row 3,
    recomputed; the book's 25° value was not seen)."""
    v = box_vessel(length_m=65.0, breadth_m=12.0, depth_m=8.0, drafts_m=(3.0, 3.5, 4.0, 4.5, 5.0),
                   lightship_t=RHO * 65 * 12 * 4, lightship_kg_m=4.0)
    r = evaluate(v, Condition())
    assert round(r.displacement_t) == 3198
    assert r.km_m == pytest.approx(2.0 + 3.0, abs=1e-12)
    assert r.gm_fluid_m == pytest.approx(1.0, abs=1e-12)
    gz25 = math.sin(RAD(25)) * (1.0 + 0.5 * 3.0 * math.tan(RAD(25)) ** 2)
    assert gz25 == pytest.approx(0.560461, abs=5e-7)
    assert r.gz_m[25] == pytest.approx(gz25, abs=1e-9)
    assert r.displacement_t * r.gz_m[25] == pytest.approx(1792.4, abs=0.05)


def test_barrass_derrett_p130_ex1_wall_sided():
    """Barrass & Derrett 5th ed. p.130 Ex.1: Δ 6000 t, KB 3, KM 6, KG 5.5, wall-sided at 25°:
    GZ = sinφ(GM + ½BM tan²φ) = 0.349152 m (book 0.35), RM = 2094.9 t·m (book 2100, rounded).
    Posed as a box with T = 6 (KB = T/2 = 3), B = √(12·T·BM) = √216 (BM = 3), L from Δ = ρLBT,
    and D = 12 m so that the deck edge (atan(6/(B/2)) = 39.2°) stays dry at 25°."""
    t_draft, bm = 6.0, 3.0
    b = math.sqrt(12 * t_draft * bm)
    length = 6000.0 / (RHO * b * t_draft)
    v = box_vessel(length_m=length, breadth_m=b, depth_m=12.0, drafts_m=(5.0, 5.5, 6.0, 6.5, 7.0),
                   lightship_t=6000.0, lightship_kg_m=5.5)
    r = evaluate(v, Condition())
    assert r.km_m == pytest.approx(6.0, abs=1e-12)
    assert r.gz_m[25] == pytest.approx(0.349152, abs=5e-7)
    assert round(r.gz_m[25], 2) == 0.35
    assert r.displacement_t * r.gz_m[25] == pytest.approx(2094.9, abs=0.05)


def test_cross_curves_narrower_than_the_hydrostatics_are_refused():
    """The KN table is looked up at the equivalent displacement too and never extrapolated: with KN
    rows only for T = 1.0–3.0 m (Δ 410–1230 t) the barge at T = 3.2 m (Δ 1312 t) lies inside the
    hydrostatic table but outside the cross curves, and the error says which table."""
    from deckload.core.model import CrossCurves
    from vessel_factories import box_barge_cross_curves

    v, c = barge_at(3.2, 3.0)
    narrow = dataclasses.replace(v, cross_curves=box_barge_cross_curves((1.0, 2.0, 3.0)))
    with pytest.raises(OutOfRangeError) as e:
        evaluate(narrow, c)
    assert str(e.value).startswith("displacement (KN cross curves, at table density) 1312 t is outside "
                                   "the table range 410–1230 t")
    # and a table that does not start upright is refused rather than extrapolated in heel
    cc = narrow.cross_curves
    late = CrossCurves(heel_deg=cc.heel_deg[1:], displacement_t=cc.displacement_t, kn_m=cc.kn_m[:, 1:])
    v2, c2 = barge_at(2.0, 3.0)
    with pytest.raises(OutOfRangeError, match=r"^heel \(KN cross curves\) 0 deg is outside the table range 5–90 deg"):
        evaluate(dataclasses.replace(v2, cross_curves=late), c2)


def test_area_under_gz_by_the_trapezoidal_rule():
    """gz.py integrates GZ by the trapezoidal rule on the 0.1° grid, with a linear last part-panel.
    For GZ = 2φ (φ in radians) the rule is exact: area(0→θ) = θ² at any θ, on or off the grid
    (an off-grid θf, e.g. 35.25°, uses the part-panel).  For a curved GZ = sin 2φ + φ² the rule must
    equal numpy's trapezoid over the same samples (a general-purpose implementation of the rule)."""
    from deckload.core import gz as gzmod

    line = 2.0 * gzmod.FINE_RAD
    for deg in (0.5, 30.0, 35.25, 40.0, 89.95, 90.0):
        assert gzmod.area_to(line, deg) == pytest.approx(math.radians(deg) ** 2, abs=1e-12)
    assert gzmod.area_to(line, 0.0) == 0.0
    curve = np.sin(2.0 * gzmod.FINE_RAD) + gzmod.FINE_RAD**2
    assert gzmod.area_to(curve, 90.0) == pytest.approx(np.trapezoid(curve, gzmod.FINE_RAD), abs=1e-12)
    k = int(round(40.0 / gzmod.STEP_DEG))
    assert gzmod.area_to(curve, 40.0) == pytest.approx(np.trapezoid(curve[: k + 1], gzmod.FINE_RAD[: k + 1]), abs=1e-12)


def test_curve_facts_on_curves_with_known_answers():
    """gz.facts on curves whose answers are known exactly (gz.py: maximum refined by a parabola
    through the three best grid points, crossings by linear interpolation on the 0.1° grid):

    * GZ = sin 3φ: maximum 1 at 30°, vanishing at 60° (both on the grid);
    * GZ = 1 − (φ − θ0)²: a parabola, so the refinement is exact: maximum 1 at θ0 for θ0 = 29.1823°
      (the barge's value, checks.md §1.2), and for θ0 = 0.12° and 89.93° (next to either end of the grid);
    * GZ = cos φ: largest at 0°, the first grid point, where there is nothing to refine;
    * GZ = sin(φ − 10°): negative up to 10°, where she comes to rest (equilibrium 10°)."""
    from deckload.core import gz as gzmod

    phi = gzmod.FINE_RAD
    f = gzmod.facts(np.sin(3 * phi))
    assert (f.max_gz_m, f.max_gz_angle_deg, f.vanishing_angle_deg, f.equilibrium_deg) == pytest.approx(
        (1.0, 30.0, 60.0, 0.0), abs=1e-9)
    for theta0 in (0.12, 29.1823, 89.93):
        f = gzmod.facts(1.0 - (phi - math.radians(theta0)) ** 2)
        assert (f.max_gz_m, f.max_gz_angle_deg) == pytest.approx((1.0, theta0), abs=1e-9)
    f = gzmod.facts(np.cos(phi))
    assert (f.max_gz_m, f.max_gz_angle_deg) == pytest.approx((1.0, 0.0), abs=1e-12)
    f = gzmod.facts(np.sin(phi - math.radians(10.0)))
    assert f.equilibrium_deg == pytest.approx(10.0, abs=1e-9)
    assert f.max_gz_angle_deg == pytest.approx(90.0, abs=1e-9) and f.vanishing_angle_deg is None
