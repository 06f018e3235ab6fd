"""Direct calculation on a box barge, against closed forms.

Source: checks.md §1 (analytic, re-derived below) for the box barge L = 40, B = 10,
D = 4 m in sea water ρ = 1.025 t/m³.

Derivations used here (body axes y to starboard, z up from the keel; heel θ to
starboard; t = tan θ; a rectangular section B × D floating with area A = B·T):

* upright: ∇ = L·B·T, KB = T/2, I_T = L·B³/12 so BMt = B²/(12T), I_L = B·L³/12 so
  BMl = L²/(12T), TPC = ρ·L·B/100, MCTC (with BMl for GMl) = ρ·I_L/(100·L);
* wall-sided (the waterline cuts both sides, tan θ ≤ min(T, D−T)/(B/2)): the
  immersed wedge and the emerged wedge are triangles of legs B/2 and (B/2)·t;
  moving one to the other shifts the centre of the section by
  y_B = B²t/(12T), z_B = T/2 + B²t²/(24T), hence
  KN = y_B·cos θ + z_B·sin θ and GZ = sin θ·(GM + ½·BM·tan²θ) (the wall-sided
  formula, e.g. Barrass & Derrett 5th ed. ch. 14);
* past deck-edge immersion the section regimes 2–4 of checks.md §1.2 apply; the
  expected KN values there are exact to 1e-5 m.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.body import Body, immerse
from deckload.core.geometry.cross_curves import cross_curves, immersion_angle
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.hydrostatics_calc import upright_hydrostatics
from deckload.core.geometry.sections import clip_polygon, cut_sections, simpson_weights
from deckload.core.geometry.spec import HullOffsets
from vessel_factories import box_tank_worst_band_pct

L, B, D = 40.0, 10.0, 4.0
RHO = 1.025


def box_body(n_stations: int = 5, x0: float = 0.0) -> Body:
    xs = np.linspace(x0, x0 + L, n_stations)
    hull = HullOffsets(xs, np.array([0.0, D]), np.full((n_stations, 2), B / 2), np.full(n_stations, D))
    y, z = hull_sections(hull)
    return Body(xs, y, z)


def test_upright_hydrostatics_closed_forms():
    """checks.md §1.1 [A]: the table at T = 1, 2, 3 m."""
    body = box_body()
    t = np.array([1.0, 2.0, 3.0])
    h = upright_hydrostatics(body, t, RHO, L, B)
    np.testing.assert_allclose(h.volume_m3, L * B * t, rtol=1e-12)  # ∇ = LBT
    np.testing.assert_allclose(h.displacement_t, RHO * L * B * t, rtol=1e-12)
    np.testing.assert_allclose(h.vcb_m, t / 2, rtol=1e-12)  # KB = T/2
    np.testing.assert_allclose(h.kmt_m, t / 2 + B**2 / (12 * t), rtol=1e-12)  # KB + B²/12T
    np.testing.assert_allclose(h.kml_m, t / 2 + L**2 / (12 * t), rtol=1e-12)  # KB + L²/12T
    np.testing.assert_allclose(h.tpc_t_cm, RHO * L * B / 100, rtol=1e-12)
    np.testing.assert_allclose(h.mctc_tm_cm, RHO * (B * L**3 / 12) / (100 * L), rtol=1e-12)  # 13.6667
    np.testing.assert_allclose(h.lcb_m, L / 2, atol=1e-12)
    np.testing.assert_allclose(h.lcf_m, L / 2, atol=1e-12)
    np.testing.assert_allclose(h.cb, 1.0, rtol=1e-12)
    np.testing.assert_allclose(h.cw, 1.0, rtol=1e-12)
    assert h.rule == "simpson"
    # the T = 2 m row of checks.md §1.1
    assert h.displacement_t[1] == pytest.approx(820.0, abs=1e-9)
    assert h.kmt_m[1] == pytest.approx(5.16667, abs=5e-6)
    assert h.kml_m[1] == pytest.approx(67.6667, abs=5e-5)


# checks.md §1.2 [A]: KN at T = 2 m, 5° … 90°, exact to 1e-5
KN_T2 = {5: 0.45169, 10: 0.90843, 15: 1.37595, 20: 1.86150, 25: 2.31359, 30: 2.58771, 35: 2.75383,
         40: 2.85134, 45: 2.89914, 50: 2.90730, 55: 2.88180, 60: 2.82650, 65: 2.74421, 70: 2.63719,
         75: 2.50740, 80: 2.35671, 85: 2.18695, 90: 2.00000}

# checks.md §1.4 [A]: KN at T = 1 and 3 m
KN_T1 = {10: 1.55639, 20: 2.68414, 30: 3.19743, 40: 3.45955, 50: 3.47903, 60: 3.29594, 70: 2.96747, 80: 2.52674, 90: 2.0}
KN_T3 = {10: 0.75033, 20: 1.35074, 30: 1.73248, 40: 2.01023, 50: 2.18107, 60: 2.25335, 70: 2.24208, 80: 2.15533, 90: 2.0}


@pytest.mark.parametrize("basis", ["free trim", "even keel"])
def test_kn_table_incl_past_deck_edge_immersion(basis):
    """checks.md §1.2 and §1.4 [A]: the full KN table, through deck-edge immersion (21.8°)
    and bilge emergence; prismatic, so free trim equals even keel."""
    body = box_body()
    heels = np.arange(0.0, 91.0, 5.0)
    disp = RHO * L * B * np.array([1.0, 2.0, 3.0])
    cc = cross_curves(body, disp, heels, RHO, basis, lcg_m=L / 2, vcg_m=3.0)
    for row, table in zip(cc.kn_m, (KN_T1, KN_T2, KN_T3)):
        for h, kn in table.items():
            assert row[int(h // 5)] == pytest.approx(kn, abs=1e-5), f"heel {h}"
    np.testing.assert_allclose(cc.trim_rad, 0.0, atol=1e-9)
    # invariant of checks.md §1.4: KN(T=3) = (KN(T=1) + D·sinθ)/3 (point symmetry of the rectangle)
    np.testing.assert_allclose(cc.kn_m[2], (cc.kn_m[0] + D * np.sin(np.radians(heels))) / 3, atol=1e-9)


def test_wall_sided_formula_below_deck_edge_immersion():
    """Analytic (module docstring): below 21.8° GZ = sinθ·(GM + ½·BM·tan²θ) for KG = 3 m, T = 2 m."""
    body = box_body()
    heels = np.array([2.0, 5.0, 10.0, 15.0, 20.0, 21.0])
    cc = cross_curves(body, np.array([RHO * L * B * 2.0]), heels, RHO, "even keel")
    th = np.radians(heels)
    kg, kb, bm = 3.0, 1.0, B**2 / (12 * 2.0)
    gz_wall = np.sin(th) * (kb + bm - kg + 0.5 * bm * np.tan(th) ** 2)
    np.testing.assert_allclose(cc.kn_m[0] - kg * np.sin(th), gz_wall, atol=1e-9)
    # the same through the section centre: y_B = B²t/(12T), z_B = T/2 + B²t²/(24T), T = 2
    T = 2.0
    t = np.tan(th)
    kn = (B**2 * t / (12 * T)) * np.cos(th) + (T / 2 + B**2 * t**2 / (24 * T)) * np.sin(th)
    np.testing.assert_allclose(cc.kn_m[0], kn, atol=1e-9)


def test_free_trim_balances_lcb_with_lcg():
    """A box with G forward of the middle trims by the head until B is in line with G.

    Upright, the plane z = T − (x − L/2)·t (t = tan ψ) keeps the box wall-sided fore and
    aft, and integrating the trapezoidal immersed profile gives (analytic, derived here)

        x_B = L/2 − t·L²/(12T),   z_B = T/2 + t²·L²/(24T),

    so the free-trim condition (x_B − x_G) − t·(z_B − z_G) = 0 (cross_curves docstring)
    is the cubic t·(GML + ½·BML·t²) = L/2 − x_G with BML = L²/(12T), GML = BML + T/2 − z_G:
    the exact longitudinal wall-sided equation of checks.md §1.6.  Heeled, the defining
    residual itself is checked.
    """
    body = box_body(9)
    lcg, vcg, T = 21.0, 3.0, 2.0
    heels = np.array([0.0, 30.0, 60.0])
    cc = cross_curves(body, np.array([RHO * L * B * T]), heels, RHO, "free trim", lcg_m=lcg, vcg_m=vcg)
    psi = cc.trim_rad[0]
    assert np.all(psi < 0.0)  # by the head
    bml = L**2 / (12 * T)
    gml = bml + T / 2 - vcg
    lo, hi = -0.5, 0.5  # bisection on the cubic (monotone in t)
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        if mid * (gml + 0.5 * bml * mid**2) > L / 2 - lcg:
            hi = mid
        else:
            lo = mid
    assert math.tan(psi[0]) == pytest.approx(0.5 * (lo + hi), abs=1e-10)
    th = np.radians(heels)
    im = immerse(body, np.cos(th), np.sin(th), cc.level_m[0], np.tan(psi), cc.x_ref_m)
    np.testing.assert_allclose(im.volume_m3, L * B * T, rtol=1e-10)
    resid = (im.x_b_m - lcg) - np.tan(psi) * (im.zeta_b_m - vcg * np.cos(th))
    np.testing.assert_allclose(resid, 0.0, atol=1e-7)


def test_clipping_primitives():
    """Sutherland–Hodgman against shoelace areas of hand-clipped squares (analytic)."""
    y = np.array([0.0, 2.0, 2.0, 0.0])
    z = np.array([0.0, 0.0, 2.0, 2.0])
    cy, cz = clip_polygon(y, z, 1.0, 1.0, 2.0)  # below y + z = 2: the lower triangle, area 2
    assert 0.5 * abs(np.sum(cy * np.roll(cz, -1) - np.roll(cy, -1) * cz)) == pytest.approx(2.0)
    cut = cut_sections(y[None], z[None], math.cos(math.pi / 4), math.sin(math.pi / 4), np.array([0.0]))
    # ζ = (z − y)/√2 ≤ 0: the half below the diagonal z = y, area 2, chord = diagonal 2√2
    assert cut.area_m2[0] == pytest.approx(2.0)
    assert cut.chord_m[0] == pytest.approx(2 * math.sqrt(2))


def test_integration_rule_choice():
    """Simpson's weights for equal odd spacing; trapezoid otherwise (the rules themselves)."""
    w, rule = simpson_weights(np.linspace(0, 4, 5))
    assert rule == "simpson"
    np.testing.assert_allclose(w, [1 / 3, 4 / 3, 2 / 3, 4 / 3, 1 / 3])
    w, rule = simpson_weights(np.array([0.0, 1.0, 3.0]))
    assert rule == "trapezoid"
    np.testing.assert_allclose(w, [0.5, 1.5, 1.0])
    w, rule = simpson_weights(np.linspace(0, 3, 4))
    assert rule == "trapezoid"


def test_immersion_angle_of_deck_edge():
    """Analytic: the deck edge at midships of the T = 2 m box immerses at atan((D−T)/(B/2)) = 21.8014°
    (checks.md §1.1), wall-sided up to there so the waterline pivots about the centreline."""
    body = box_body()
    ang = immersion_angle(body, np.array([RHO * L * B * 2.0]), RHO, (L / 2, B / 2, D), "even keel")
    assert ang[0] == pytest.approx(math.degrees(math.atan(2.0 / 5.0)), abs=1e-6)


BOX_GEOMETRY = """
format = "deckload-geometry-1"

[vessel]
name = "Box"
lbp_m = 20.0
breadth_m = 6.0
depth_m = 3.0
design_draft_m = 1.5

[hull]
station_x_m = [0.0, 5.0, 10.0, 15.0, 20.0]
waterline_z_m = [0.0, 3.0]
deck_z_m = [3.0, 3.0, 3.0, 3.0, 3.0]
half_breadth_m = [[3.0, 3.0], [3.0, 3.0], [3.0, 3.0], [3.0, 3.0], [3.0, 3.0]]

[tables]
draft_m = [0.5, 1.0, 1.5, 2.0]
kn_displacement_t = [184.5, 246.0]
kn_heel_deg = [0.0, 30.0, 60.0, 90.0]
trim_basis = "free trim"
trim_lcg_m = 10.0
trim_vcg_m = 2.0

[[tank]]
id = "DB"
name = "Double bottom"
kind = "ballast"
density_t_m3 = 1.025
shape = "hull"
x_m = [2.0, 8.0]
y_m = [-5.0, 5.0]
z_m = [0.0, 0.5]

[[hold]]
id = "H"
name = "Hold"
shape = "hull"
x_m = [10.0, 18.0]
y_m = [-3.0, 3.0]
z_m = [1.0, 3.0]

[[deck_area]]
id = "D"
name = "Deck"
x_m = [2.0, 8.0]
y_m = [-4.0, 2.0]

[[opening]]
name = "deck edge"
x_m = 10.0
y_m = 3.0
z_m = 3.0
"""


def test_builder_end_to_end_on_a_box():
    """Analytic, box 20 × 6 × 3 m: the builder's compartments and downflooding angle.

    * deck rectangle x 2–8, y −4…2 trimmed to the deck edge y ≥ −3: area 6·5 = 30 m²,
      centroid x = 5, y = −0.5, deck height 3;
    * hold = hull between x 10–18, z 1–3: capacity 8·6·2 = 96 m³, VCG 2, LCG 14, and
      levelled at 50 % its contents reach z = 2, VCG 1.5;
    * double bottom 6 × 6 × 0.5: 18 m³, i = 6·6³/12 = 108 m⁴; a full-width box tank's
      worst band is centred on 50 % (point symmetry, checks.md §3.2);
    * downflooding: at T = D/2 the deck edge amidships immerses at atan((D − T)/(B/2))
      = atan(0.5) (checks.md §1.1, wall-sided up to there); G on the centre line at
      mid-length, so free trim gives no trim.
    """
    from deckload.core.geometry.builder import build_tables
    from deckload.io.geometry_files import parse_geometry

    vt = build_tables(parse_geometry(BOX_GEOMETRY, "box.geometry.toml"))
    area = vt.deck_areas[0]
    assert area.area_m2 == pytest.approx(30.0)
    assert area.lcg_m == pytest.approx(5.0)
    assert area.tcg_m == pytest.approx(-0.5)
    assert area.deck_height_m == pytest.approx(3.0)
    hold = vt.holds[0]
    assert hold.capacity_m3 == pytest.approx(96.0)
    assert hold.vcg_m == pytest.approx(2.0)
    assert hold.lcg_m == pytest.approx(14.0)
    assert hold.fill_vcg_m[list(hold.fill_pct).index(50.0)] == pytest.approx(1.5)
    tank = vt.tanks[0]
    assert tank.capacity_m3 == pytest.approx(18.0)
    np.testing.assert_allclose(tank.calibration.fsi_m4, 6 * 6**3 / 12)
    # Exact band of a 6 × 0.5 m section at 30°: the surface meets top and bottom (checks.md §1.2 case 4,
    # (B, D, T) → (b, h, d)); bisection on that closed form (vessel_factories.box_tank_worst_band_pct)
    # gives 34.276155–65.723845 %.  The program interpolates on a 1 % grid: at the edge M' = 0.1541 and
    # |M''| = 0.0098 m⁴ per %, so its edges are within 1²·0.0098/(8·0.1541) = 0.0080 % of the exact ones.
    assert box_tank_worst_band_pct(6.0, 6.0, 0.5) == pytest.approx((34.276155, 65.723845), abs=1e-6)
    assert tank.worst_band_pct[0] == pytest.approx(34.276155, abs=0.008)
    assert tank.worst_band_pct[1] == pytest.approx(65.723845, abs=0.008)
    assert vt.downflooding.angle_deg[0] == pytest.approx(math.degrees(math.atan(0.5)), abs=1e-6)
    h = vt.hydrostatics
    np.testing.assert_allclose(h.displacement_t, 1.025 * 20 * 6 * np.array([0.5, 1.0, 1.5, 2.0]))
    np.testing.assert_allclose(vt.cross_curves.trim_rad, 0.0, atol=1e-9)


def test_windage_and_deck_edge_tables_from_the_box_geometry():
    """Analytic, box 20 × 6 × 3 m with a deckhouse x 12–18 m, 2 m high on the deck (z 3–5):
    at draft T the lateral area is 20·(3 − T) + 6·2, its centre at
    [20·(3 − T)·(3 − T)/2 + 12·(3 − T + 1)] / A above the waterline; Lwl = 20 m at every draft.
    The deck-edge angle at midships is atan((D − T)/(B/2)) (checks.md §1.1, wall-sided to there),
    at T = 184.5/(1.025·20·6) = 1.5 m and T = 2.0 m."""
    from deckload.core.geometry.builder import build_tables
    from deckload.io.geometry_files import parse_geometry

    outline = ('\n[lateral_profile]\nx_m = [0.0, 20.0, 20.0, 18.0, 18.0, 12.0, 12.0, 0.0]\n'
               'z_m = [0.0, 0.0, 3.0, 3.0, 5.0, 5.0, 3.0, 3.0]\n')
    vt = build_tables(parse_geometry(BOX_GEOMETRY + outline, "box.geometry.toml"))
    w = vt.windage
    for t, area, h, lwl in zip(w.draft_m, w.lateral_area_m2, w.centroid_above_wl_m, w.waterline_length_m):
        f = 3.0 - t
        expected = 20.0 * f + 12.0
        assert area == pytest.approx(expected, abs=1e-9)
        assert h == pytest.approx((20.0 * f * f / 2.0 + 12.0 * (f + 1.0)) / expected, abs=1e-9)
        assert lwl == pytest.approx(20.0, abs=1e-9)
    drafts = vt.deck_edge.displacement_t / (1.025 * 20 * 6)
    np.testing.assert_allclose(vt.deck_edge.angle_deg, np.degrees(np.arctan((3.0 - drafts) / 3.0)), atol=1e-6)


def test_lateral_profile_must_stand_above_every_table_draft():
    from deckload.io.geometry_files import GeometryError, parse_geometry

    low = '\n[lateral_profile]\nx_m = [0.0, 20.0, 20.0, 0.0]\nz_m = [0.0, 0.0, 1.8, 1.8]\n'
    with pytest.raises(GeometryError) as ei:
        parse_geometry(BOX_GEOMETRY + low, "box.geometry.toml")
    (p,) = ei.value.problems
    assert p.key == "lateral_profile.z_m" and "no area above the table draft 2 m" in p.rule
    assert p.line is not None
