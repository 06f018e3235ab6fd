"""The weather criterion, IS Code 2008 Part A 2.3, against the reference sheet and a hand calculation.

Sources: standards.md §2 (IS 2008 Part A 2.3; A.749 3.2.2; 46 CFR 28.575) and the check
values of standards.md §8 rows 8–13.  Every factor-table row is marked [M] (from memory)
in standards.md §2.4, and so are the 1.5 gust factor, g = 9.81 and the −0.043·Lwl/100 term
of C: the checks below repeat those marks beside them.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core import weather as wx
from deckload.core.model import Condition, CriteriaSettings, Windage, frozen_array
from deckload.core.stability import evaluate
from vessel_factories import RHO_SW, box_vessel

# --------------------------------------------------------------------------- factor tables


@pytest.mark.parametrize(
    "b_over_d, x1",
    # standards.md §2.4 X1 row — every value from memory [M]
    [(2.4, 1.00), (2.5, 0.98), (2.6, 0.96), (2.7, 0.95), (2.8, 0.93), (2.9, 0.91), (3.0, 0.90),
     (3.1, 0.88), (3.2, 0.86), (3.3, 0.84), (3.4, 0.82), (3.5, 0.80)],
)
def test_x1_table_row_by_row(b_over_d, x1):
    assert wx.table_value(wx.X1_TABLE, b_over_d) == pytest.approx(x1, abs=1e-12)


@pytest.mark.parametrize(
    "cb, x2",
    # standards.md §2.4 X2 row — from memory [M]
    [(0.45, 0.75), (0.50, 0.82), (0.55, 0.89), (0.60, 0.95), (0.65, 0.97), (0.70, 1.00)],
)
def test_x2_table_row_by_row(cb, x2):
    assert wx.table_value(wx.X2_TABLE, cb) == pytest.approx(x2, abs=1e-12)


@pytest.mark.parametrize(
    "ak_ratio, k",
    # standards.md §2.4 k row, against Ak·100/(L·B) — from memory [M]
    [(0.0, 1.00), (1.0, 0.98), (1.5, 0.95), (2.0, 0.88), (2.5, 0.79), (3.0, 0.74), (3.5, 0.72), (4.0, 0.70)],
)
def test_k_table_row_by_row(ak_ratio, k):
    assert wx.table_value(wx.K_TABLE, ak_ratio) == pytest.approx(k, abs=1e-12)
    # through k_factor: Ak chosen so that Ak·100/(L·B) = ak_ratio for L = 50, B = 10
    if ak_ratio > 0:
        assert wx.k_factor(ak_ratio * 50.0 * 10.0 / 100.0, 50.0, 10.0) == pytest.approx(k, abs=1e-12)


@pytest.mark.parametrize(
    "period_s, s",
    # standards.md §2.4 s row, against T — from memory [M]
    [(6.0, 0.100), (7.0, 0.098), (8.0, 0.093), (12.0, 0.065), (14.0, 0.053), (16.0, 0.044),
     (18.0, 0.038), (20.0, 0.035)],
)
def test_s_table_row_by_row(period_s, s):
    assert wx.table_value(wx.S_TABLE, period_s) == pytest.approx(s, abs=1e-12)


def test_tables_take_end_values_beyond_their_ends_and_interpolate_linearly():
    """standards.md §2.4: 'interpolate linearly; values beyond the ends take the end value'."""
    assert wx.table_value(wx.X1_TABLE, 1.8) == 1.00 and wx.table_value(wx.X1_TABLE, 4.2) == 0.80
    assert wx.table_value(wx.X2_TABLE, 0.30) == 0.75 and wx.table_value(wx.X2_TABLE, 0.85) == 1.00
    assert wx.table_value(wx.S_TABLE, 4.0) == 0.100 and wx.table_value(wx.S_TABLE, 25.0) == 0.035
    assert wx.table_value(wx.S_TABLE, 10.0) == pytest.approx((0.093 + 0.065) / 2, abs=1e-12)


def test_k_for_sharp_bilge_and_round_bilge_without_keels():
    """standards.md §8 row 14: k = 0.7 sharp bilge, 1.0 round bilge without keels (46 CFR 28.575 [C])."""
    assert wx.k_factor(0.0, 50.0, 10.0, sharp_bilged=True) == 0.7
    assert wx.k_factor(0.0, 50.0, 10.0) == 1.0


def test_fishing_wind_pressure_by_height():
    """IS 2008 Part B 2.1.4 via standards.md §2.5 — every row from memory [M]."""
    for h, p in [(1.0, 316.0), (2.0, 386.0), (3.0, 429.0), (4.0, 460.0), (5.0, 485.0), (6.0, 504.0)]:
        assert wx.fishing_wind_pressure_pa(h) == pytest.approx(p, abs=1e-12)
    assert wx.fishing_wind_pressure_pa(8.0) == 504.0  # '≥ 6 m → 504 Pa'


# --------------------------------------------------------------------------- check rows 8–13


def test_check_row_8_wind_pressure():
    """standards.md §8 row 8: P = 504 Pa (A.749 3.2.2.2 / IS 2008 2.3 [C])."""
    assert wx.WIND_PRESSURE_PA == 504.0


def test_check_row_9_heeling_levers():
    """standards.md §8 row 9: P 504, A 1000 m², Z 8 m, Δ 10 000 t, g 9.81 → lw1 0.04110 m,
    lw2 0.06165 m (formula [C]; the 1.5 factor and g from memory [M]).  Rounded to 5 decimals
    in the sheet, hence the 5e-6 tolerance."""
    lw1 = wx.wind_lever_m(504.0, 1000.0, 8.0, 10_000.0)
    assert lw1 == pytest.approx(0.04110, abs=5e-6)
    assert wx.GUST_FACTOR * lw1 == pytest.approx(0.06165, abs=5e-6)


def test_check_row_10_theta0_limit_and_row_11_theta2():
    """Rows 10–11: θ0 ≤ min(16°, 0.8·deck edge) (IS 2008 2.3.1.2 [C]); θ2 = min(θf, 50°, θc)
    (A.749 3.2.2.1 [C]).  A straight curve GZ = 0.5·φ(rad) up to 40°, then falling linearly
    to zero at 60°, with a lever lw1 = 0.02: every intercept is found by hand."""
    deg = np.arange(-90.0, 90.0001, 0.1)
    rad = np.radians(deg)
    top = 0.5 * math.radians(40.0)
    gz = np.where(np.abs(deg) <= 40.0, 0.5 * rad, np.sign(deg) * top * (60.0 - np.abs(deg)) / 20.0)
    curve = wx.Curve(deg, gz)
    lw1 = 0.02
    lw2 = 1.5 * lw1
    f = wx.weather_areas(curve, lw1, 5.0, None)
    assert f.theta0_deg == pytest.approx(math.degrees(lw1 / 0.5), abs=1e-6)  # 0.5·φ = lw1
    assert f.theta_r_deg == pytest.approx(math.degrees(lw2 / 0.5), abs=1e-6)
    theta_c = 60.0 - 20.0 * lw2 / top  # the falling straight line meets lw2
    assert f.theta_c_deg == pytest.approx(theta_c, abs=1e-6)
    assert f.theta2_deg == pytest.approx(min(50.0, theta_c), abs=1e-9)
    assert wx.weather_areas(curve, lw1, 5.0, 33.0).theta2_deg == pytest.approx(33.0)  # θf governs
    assert min(wx.THETA0_MAX_DEG, wx.DECK_EDGE_FRACTION * 18.0) == pytest.approx(14.4)
    assert min(wx.THETA0_MAX_DEG, wx.DECK_EDGE_FRACTION * 25.0) == 16.0


def test_check_row_12_roll_coefficient_and_period():
    """Row 12: B 20, d 8, Lwl 100, GM 1.0 → C 0.3875, T 15.5 s (46 CFR 28.575 [C]; the
    −0.043·Lwl/100 term of C from memory [M])."""
    assert wx.roll_coefficient_c(20.0, 8.0, 100.0) == pytest.approx(0.3875, abs=1e-12)
    assert wx.roll_period_s(20.0, 8.0, 100.0, 1.0) == pytest.approx(15.5, abs=1e-9)


def test_check_row_13_roll_angle():
    """Row 13: k 1, B/d 2.5, Cb 0.70, KG 8.5, d 8, T 15.5 s → r 0.7675, s 0.04625, θ1 20.13°
    (the tables from memory [M]; sheet rounded to 0.01°)."""
    r = wx.r_factor(8.5, 8.0)
    s = wx.table_value(wx.S_TABLE, 15.5)
    assert r == pytest.approx(0.7675, abs=1e-12)
    assert s == pytest.approx(0.04625, abs=1e-12)
    x1 = wx.table_value(wx.X1_TABLE, 2.5)
    x2 = wx.table_value(wx.X2_TABLE, 0.70)
    assert wx.roll_angle_deg(1.0, x1, x2, r, s) == pytest.approx(20.13, abs=0.005)
    # the same through roll(): B 20, d 8, Lwl 100 → C 0.3875; GM 1.0 → T 15.5 s
    roll = wx.roll(wx.RollInputs(20.0, 8.0, 100.0, 0.70, 8.5, 1.0))
    assert roll.period_s == pytest.approx(15.5) and roll.theta1_deg == pytest.approx(20.13, abs=0.005)


# --------------------------------------------------------------------------- the box, by hand

L, B, D, T, KG = 60.0, 10.0, 12.0, 6.0, 4.0
DISP = RHO_SW * L * B * T          # 3690 t
BM = B * B / (12.0 * T)             # 1.388889 m
GM = T / 2.0 + BM - KG              # 0.388889 m


def box_gz(phi: np.ndarray) -> np.ndarray:
    """Wall-sided GZ = sinφ·(GM + ½·BM·tan²φ): exact for this box up to atan((D − T)/(B/2)) = 50.19°."""
    return np.sin(phi) * (GM + 0.5 * BM * np.tan(phi) ** 2)


def box_dynamic_lever(phi: float) -> float:
    """e(φ) = ∫₀^φ GZ dφ = GM(1 − cosφ) + ½·BM·(secφ + cosφ − 2), since
    ∫ sinφ·tan²φ dφ = ∫ sinφ(sec²φ − 1) dφ = secφ + cosφ.  GZ is odd, so e is even."""
    return GM * (1.0 - math.cos(phi)) + 0.5 * BM * (1.0 / math.cos(phi) + math.cos(phi) - 2.0)


def _root(f, lo: float, hi: float) -> float:
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        if f(lo) * f(mid) <= 0:
            hi = mid
        else:
            lo = mid
    return 0.5 * (lo + hi)


HAND = """
Box L 60, B 10, D 12 m at T 6 m in sea water (ρ 1.025), KG 4.0 m, sharp bilges, no θf:
  Δ = 1.025·60·10·6 = 3690 t;  KB 3, BM = B²/12T = 1.388889, GM = 0.388889 m.
  Wall-sided to atan(6/5) = 50.19° (deck edge and bilge), so the curve is exact to θ2 ≤ 50°.
Windage: A = L·(D − T) = 360 m², centre 3 m above the WL, Z = 3 + T/2 = 6 m.
  lw1 = 504·360·6/(1000·9.81·3690) = 0.0300738 m;  lw2 = 1.5·lw1 = 0.0451108 m  [1.5 from memory].
Roll: B/d 1.667 → X1 1.0;  Cb 1.0 → X2 1.0;  sharp bilge k 0.7;  r = 0.73 + 0.6·(4 − 6)/6 = 0.53;
  C = 0.373 + 0.023·1.6667 − 0.043·0.60 = 0.385533;  T = 2·C·B/√GM = 12.3646 s;
  s = 0.065 − (0.3646/2)·0.012 = 0.0628126;  θ1 = 109·0.7·√(0.53·0.0628126) = 13.9215°.
θ0: sinφ(GM + ½BM tan²φ) = lw1 → 4.3890°;  θr (lw2) → 6.5093°;  θ2 = 50° (GZ still rising).
a = lw2·(θr − (θ0 − θ1)) − [e(θr) − e(θ0 − θ1)] = 0.015598 m·rad (θ0 − θ1 = −9.5325°)
b = [e(50°) − e(θr)] − lw2·(50° − θr) = 0.239993 m·rad
"""


def test_box_by_hand_in_the_pure_module():
    """The weather module on the exact wall-sided curve against the hand calculation above (HAND).

    Tolerances: angles 1e-3° (roots of a curve linearly interpolated on a 0.1° grid);
    areas 1e-5 m·rad (trapezoidal rule on that grid, error ≈ h²/12·GZ''·range ≈ 1e-6)."""
    deg = np.round(np.arange(-90.0, 90.0001, 0.1), 10)
    phi = np.radians(np.clip(deg, -60.0, 60.0))  # beyond 50.19° the formula is not used (θ2 ≤ 50°)
    curve = wx.Curve(deg, box_gz(phi))
    lw1 = wx.wind_lever_m(504.0, L * (D - T), (D - T) / 2.0 + T / 2.0, DISP)
    assert lw1 == pytest.approx(504.0 * 360.0 * 6.0 / (1000.0 * 9.81 * 3690.0), rel=1e-12)
    assert lw1 == pytest.approx(0.0300738, abs=1e-7)
    roll = wx.roll(wx.RollInputs(B, T, L, 1.0, KG, GM, sharp_bilged=True))
    assert roll.period_s == pytest.approx(12.364574, abs=1e-6)
    assert (roll.x1, roll.x2, roll.k, roll.r) == (1.0, 1.0, 0.7, pytest.approx(0.53))
    assert roll.s == pytest.approx(0.0628126, abs=1e-7)
    assert roll.theta1_deg == pytest.approx(13.921489, abs=1e-5)
    assert "OG/d -0.33 outside −0.3…0.5" in roll.outside_validity  # KG/d range [M]
    f = wx.weather_areas(curve, lw1, roll.theta1_deg, None)
    lw2 = 1.5 * lw1
    th0 = _root(lambda p: float(box_gz(np.array(p))) - lw1, 0.0, 0.5)
    thr = _root(lambda p: float(box_gz(np.array(p))) - lw2, 0.0, 0.5)
    assert f.theta0_deg == pytest.approx(math.degrees(th0), abs=1e-3)
    assert f.theta0_deg == pytest.approx(4.3890, abs=1e-3)
    assert f.theta_r_deg == pytest.approx(math.degrees(thr), abs=1e-3)
    assert f.theta_c_deg is None or f.theta_c_deg > 50.0
    assert f.theta2_deg == 50.0
    lo = th0 - math.radians(roll.theta1_deg)
    a = lw2 * (thr - lo) - (box_dynamic_lever(thr) - box_dynamic_lever(lo))
    b = (box_dynamic_lever(math.radians(50.0)) - box_dynamic_lever(thr)) - lw2 * (math.radians(50.0) - thr)
    assert a == pytest.approx(0.015598, abs=1e-6) and b == pytest.approx(0.239993, abs=1e-6)  # HAND
    assert f.area_a_mrad == pytest.approx(a, abs=1e-5)
    assert f.area_b_mrad == pytest.approx(b, abs=1e-5)


def _box(**criteria) -> tuple:
    windage = Windage(
        draft_m=frozen_array([5.0, 6.0, 7.0]),
        lateral_area_m2=frozen_array([L * (D - t) for t in (5.0, 6.0, 7.0)]),
        centroid_above_wl_m=frozen_array([(D - t) / 2.0 for t in (5.0, 6.0, 7.0)]),
        waterline_length_m=frozen_array([L, L, L]),
    )
    v = box_vessel(length_m=L, breadth_m=B, depth_m=D, drafts_m=[5.0, 6.0, 7.0], lightship_t=DISP,
                   lightship_kg_m=KG, heel_step_deg=1.0, criteria=CriteriaSettings(sharp_bilged=True, **criteria))
    import dataclasses

    return dataclasses.replace(v, windage=windage), Condition(name="box by hand")


def test_box_by_hand_through_evaluate():
    """The same box through the whole engine: KN from the exact section (vessel_factories,
    1° steps, cubic spline in heel) — tolerances 5e-5 m·rad / 0.01° cover the spline's error,
    largest next to the kink of the curve at the deck edge (50.19°, just past θ2 = 50°).  The wall-sided deck-edge angle atan(6/5) = 50.19° is exact for a box."""
    v, c = _box()
    r = evaluate(v, c)
    w = r.weather
    assert w is not None
    assert w.lw1_m == pytest.approx(0.0300738, abs=1e-7)
    assert w.theta1_deg == pytest.approx(13.921489, abs=1e-4)
    assert w.theta0_deg == pytest.approx(4.3890, abs=0.01)
    assert w.area_a_mrad == pytest.approx(0.015598, abs=5e-5)
    assert w.area_b_mrad == pytest.approx(0.239993, abs=5e-5)
    assert r.deck_edge_angle_deg == pytest.approx(math.degrees(math.atan(6.0 / 5.0)), abs=1e-9)
    assert w.theta0_limit_deg == 16.0  # 0.8·50.19° > 16°
    crit = {c.id: c for c in r.criteria}
    assert crit["IS2008-A2.3-area-b-a"].passed and crit["IS2008-A2.3-theta0"].passed
    assert crit["IS2008-A2.3-area-b-a"].value == pytest.approx(w.area_b_mrad)
    assert crit["IS2008-A2.3-area-b-a"].limit == pytest.approx(w.area_a_mrad)
    assert [s.id for s in r.criteria_sets] == ["IS2008-A2.2", "IS2008-A2.3"]


def test_lower_wind_pressure_from_the_profile_scales_lw1():
    """P from the profile (restricted service, standards.md §2.2): lw1 is proportional to P."""
    v, c = _box(wind_pressure_pa=252.0)
    assert evaluate(v, c).weather.lw1_m == pytest.approx(0.0300738 / 2.0, abs=1e-7)


def test_a_steady_wind_that_overturns_her_fails_and_is_said():
    """lw1 above the greatest GZ: no θ0 — failed, and the area criterion cannot be assessed."""
    v, c = _box(wind_pressure_pa=1500.0)
    import dataclasses

    v = dataclasses.replace(v, windage=Windage(v.windage.draft_m, frozen_array([9000.0] * 3),
                                               frozen_array([40.0] * 3), v.windage.waterline_length_m))
    r = evaluate(v, c)
    crit = {c.id: c for c in r.criteria}
    assert not crit["IS2008-A2.3-theta0"].passed and "overturn" in crit["IS2008-A2.3-theta0"].note
    assert not crit["IS2008-A2.3-area-b-a"].assessed
    assert not r.all_criteria_pass and r.weather is None
    assert "NOT MET" in r.verdict_text()


def _cut_at_40(v):
    """The same vessel with its KN tables ending at 40° (a booklet that stops there)."""
    import dataclasses

    from deckload.core.model import CrossCurves

    cc = v.cross_curves
    keep = cc.heel_deg <= 40.0
    return dataclasses.replace(v, cross_curves=CrossCurves(frozen_array(cc.heel_deg[keep]), cc.displacement_t,
                                                           frozen_array(cc.kn_m[:, keep]), cc.trim_basis))


def test_short_kn_tables_count_area_b_to_their_end_when_that_is_enough():
    """KN to 40° only: θ2 would be 50°, so b is known to 40°: e(40°) − e(θr) − lw2·(40° − θr)
    = 0.1354 m·rad by the HAND formulas, already above a — met, and the note says so."""
    v, c = _box()
    r = evaluate(_cut_at_40(v), c)
    crit = {c.id: c for c in r.criteria}["IS2008-A2.3-area-b-a"]
    lw2 = 1.5 * 0.0300738
    thr = math.radians(6.509253)
    b40 = box_dynamic_lever(math.radians(40.0)) - box_dynamic_lever(thr) - lw2 * (math.radians(40.0) - thr)
    assert crit.assessed and crit.passed
    assert crit.value == pytest.approx(b40, abs=5e-5)  # spline tolerance as above
    assert "counted to 40°" in crit.note


def test_short_kn_tables_leave_a_short_area_b_not_assessable():
    """With six times the windage area, a grows and b to 40° no longer covers it, though the whole
    curve (to θ2 = 50°) meets the criterion: what lies beyond the table is unknown, so with KN to
    40° only the criterion is not assessable (never met)."""
    import dataclasses

    v, c = _box()
    w = v.windage
    v = dataclasses.replace(v, windage=Windage(w.draft_m, frozen_array(6.0 * w.lateral_area_m2),
                                               w.centroid_above_wl_m, w.waterline_length_m))
    full = {c.id: c for c in evaluate(v, c).criteria}["IS2008-A2.3-area-b-a"]
    r = evaluate(_cut_at_40(v), c)
    crit = {c.id: c for c in r.criteria}["IS2008-A2.3-area-b-a"]
    assert full.assessed and full.passed
    assert not crit.assessed and not crit.passed and "beyond the KN tables' 40°" in crit.note
    assert crit.value < crit.limit
    assert not r.all_criteria_pass


def test_deck_cargo_windage_adds_to_the_area_and_moves_its_centre():
    """IS 2008 A 2.3 counts the lateral area of 'ship and deck cargo'.  The HAND box plus a deck
    stow of 60 m² (negligible mass) centred 14 m above the keel, i.e. 8 m above the waterline:
    A = 360 + 60 = 420 m², h = (360·3 + 60·8)/420 = 3.714286 m, Z = h + 3 = 6.714286 m,
    lw1 = 504·420·6.714286/(1000·9.81·Δ)."""
    from deckload.core.model import DeckItem

    v, c = _box()
    stow = DeckItem("timber stow", 1e-6, L / 2, 14.0, 0.0, windage_area_m2=60.0, windage_centroid_z_m=14.0)
    hidden = DeckItem("hidden crate", 1e-6, L / 2, 12.5, 0.0)  # no windage stated: a caution names it
    r = evaluate(v, c.with_deck_items((stow, hidden)))
    w = r.weather
    # 1e-6: the items' 2e-6 t sink her by 3e-9 m, which the windage table turns into 2e-7 m²
    assert w.windage_area_m2 == pytest.approx(420.0, abs=1e-6)
    assert w.windage_centroid_above_wl_m == pytest.approx((360.0 * 3.0 + 60.0 * 8.0) / 420.0, abs=1e-6)
    disp = DISP + 2e-6
    assert w.lw1_m == pytest.approx(504.0 * 420.0 * (3.714286 + 3.0) / (1000.0 * 9.81 * disp), rel=1e-6)
    assert any("hidden crate" in x.message and "not included" in x.message for x in r.warnings)
    assert not any("timber stow" in x.message for x in r.warnings)


def test_the_windward_side_mirrors_the_other_curve_and_theta0_may_lie_to_windward():
    """Derived: heeling to windward by φ the righting lever is −GZ_windward(φ).  A ship listed to
    windward: GZ_lee = 0.5·φ + 0.05 and GZ_windward = 0.5·φ − 0.05, so GZ(0) = 0.05 > lw1 = 0.02
    and on the windward side GZ(−φ) = −0.5·φ + 0.05 meets lw1 at φ = 0.06 rad: θ0 = −3.4377°."""
    deg = np.round(np.arange(0.0, 90.0001, 0.1), 10)
    rad = np.radians(deg)
    curve = wx.Curve.from_sides(deg, 0.5 * rad + 0.05, 0.5 * rad - 0.05)
    assert curve.at(-10.0) == pytest.approx(-(0.5 * math.radians(10.0) - 0.05), abs=1e-12)
    assert curve.at(10.0) == pytest.approx(0.5 * math.radians(10.0) + 0.05, abs=1e-12)
    f = wx.weather_areas(curve, 0.02, 5.0, None)
    assert f.theta0_deg == pytest.approx(math.degrees(-0.06), abs=1e-6)


def test_a_roll_to_windward_past_the_gust_lever_fails_the_criterion():
    """Box L 40, B 10, D 4 m at T 3.5 m, KG 3.6 m (GM 0.531 m), upright; windage A = L·(D − T).
    Her exact GZ (box section clipped at every heel, vessel_factories.box_kn_m, checks.md §1.2)
    vanishes at about 12°: the deck edge is in at atan((D − T)/(B/2)) = 5.7°.  The roll of
    IS 2008 A 2.3.1 (θ1 ≈ 22.6°) takes her to windward past the angle where GZ to windward
    (GZ(−φ) = −GZ(φ), the curve being odd when upright) exceeds the gust lever lw2: there the gust no
    longer brings her back, and area a, ∫(lw2 − GZ) from θ0 − θ1, turns negative (−0.012 m·rad), so
    b ≥ a held only by that sign (found by an exact-case audit).  The criterion must fail, and
    the windward intercept is −φ with GZ(φ) = −lw2 (root of the exact curve)."""
    import dataclasses

    from vessel_factories import box_kn_m

    L_, B_, D_, T_, KG_ = 40.0, 10.0, 4.0, 3.5, 3.6
    drafts = [3.0, 3.5, 3.9]
    windage = Windage(draft_m=frozen_array(drafts), lateral_area_m2=frozen_array([L_ * (D_ - t) for t in drafts]),
                      centroid_above_wl_m=frozen_array([(D_ - t) / 2.0 for t in drafts]),
                      waterline_length_m=frozen_array([L_] * 3))
    v = box_vessel(length_m=L_, breadth_m=B_, depth_m=D_, drafts_m=drafts, lightship_t=RHO_SW * L_ * B_ * T_,
                   lightship_kg_m=KG_, heel_step_deg=1.0)
    r = evaluate(dataclasses.replace(v, windage=windage), Condition(name="windward"))
    crit = {c.id: c for c in r.criteria}["IS2008-A2.3-area-b-a"]
    assert crit.assessed and not crit.passed
    assert crit.limit < 0.0 < crit.value  # a negative: b ≥ a would have passed on the sign alone
    assert crit.margin < 0.0  # failed: its margin is counted against it, never "+0.019 … FAIL"
    assert "she heels on to windward; fails" in crit.note and r.weather is None
    lw2 = 1.5 * wx.wind_lever_m(504.0, L_ * (D_ - T_), (D_ - T_) / 2.0 + T_ / 2.0, RHO_SW * L_ * B_ * T_)

    def gz(deg: float) -> float:
        return box_kn_m(B_, D_, T_, math.radians(deg)) - KG_ * math.sin(math.radians(deg))

    vanish = _root(gz, 5.0, 30.0)
    past = _root(lambda d: gz(d) + lw2, vanish, 40.0)
    assert 11.0 < vanish < 13.0
    curve = wx.Curve.from_sides(np.asarray(r.gz_heel_deg), np.asarray(r.gz_m), np.asarray(r.gz_port_m))
    f = wx.weather_areas(curve, lw2 / 1.5, 22.6, None)
    assert f.windward_deg == pytest.approx(-past, abs=0.05)  # the curve is read linearly on a 1° grid
    # The usual case is untouched: at KG 2.5 (GM 1.63 m, GZ to beyond 40°) the roll stays inside, and
    # b ≥ a is judged on its areas.
    v3 = box_vessel(length_m=L_, breadth_m=B_, depth_m=D_, drafts_m=drafts, lightship_t=RHO_SW * L_ * B_ * T_,
                    lightship_kg_m=2.5, heel_step_deg=1.0)
    ok = {c.id: c for c in evaluate(dataclasses.replace(v3, windage=windage), Condition(name="ok")).criteria}
    assert ok["IS2008-A2.3-area-b-a"].passed and ok["IS2008-A2.3-area-b-a"].limit > 0.0
