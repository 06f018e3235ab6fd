"""The table builder's compartments, deck areas, openings and messages (core/geometry/builder.py),
on geometries built in code, against closed forms worked here by hand.

Box hull 20 × 6 × 3 m (x 0…20 from the AP, half-breadth 3 m at every station and waterline,
deck 3 m), ρ = 1.025 t/m³, G for free trim at x = 10 m on the centre line:

* box tank x 2…8, y 0.5…2.5, z 0.5…1.5 (l 6, b 2, h 1): capacity 12 m³, centroid x 5, y 1.5;
  upright i = l·b³/12 = 4 m⁴ at every sounding (checks.md §3.1); at 50 % and 15° the surface
  meets both side walls (b/2·tan 15° = 0.268 < d = 0.5 m) so M = i·sinθ·(1 + ½tan²θ)
  (checks.md §3.2, wall-sided);
* hold x 10…18, y 0…3, z 1…3: capacity 8·3·2 = 48 m³, LCG 14, TCG 1.5, levelled at fill f
  its contents reach z = 1 + 2f, VCG = 1 + f (f as a fraction);
* deck rectangle x 2…8, y 1…5 trimmed to the deck edge y ≤ 3: 6 × 2 = 12 m², centre
  (5, 2), deck height 3;
* openings amidships: a wall-sided box heeled θ keeps its waterline through the centre line
  at the draft T (checks.md §1.1), so a point (y, z) on the low side immerses at
  tanθ = (z − T)/y while tanθ ≤ min(T, D − T)/(B/2).  'deck edge' (3, 3): tanθ = (3 − T)/3;
  'low vent' (1.5, 2.5): tanθ = (2.5 − T)/1.5.  At T = 1.5 m (184.5 t) the deck edge goes
  first (0.5 against 0.667); at T = 2.2 m (270.6 t) the vent (0.2 against 0.267).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.builder import (
    TableRangeError,
    build_tables,
    deck_area_tables,
    hold_tables,
    tank_tables,
)
from deckload.core.geometry.spec import (
    CompartmentShape,
    DeckAreaSpec,
    Geometry,
    HoldSpec,
    HullOffsets,
    LateralProfile,
    OpeningSpec,
    TableSpec,
    TankSpec,
    VesselSpec,
)
from deckload.core.geometry.tanks import fill_centroids, sounding_levels
from deckload.core.geometry.hull import compartment_body
from vessel_factories import box_kn_m, box_tank_worst_band_pct

RHO = 1.025


def box_geometry(deck_z=(3.0, 3.0, 3.0, 3.0, 3.0), disp=(184.5, 270.6), **tables) -> Geometry:
    xs = np.array([0.0, 5.0, 10.0, 15.0, 20.0])
    hull = HullOffsets(xs, np.array([0.0, 3.0]), np.full((5, 2), 3.0), np.array(deck_z))
    kw = dict(draft_m=np.array([0.5, 1.0, 1.5, 2.0]), kn_displacement_t=np.array(disp),
              kn_heel_deg=np.array([0.0, 30.0, 60.0, 90.0]), trim_basis="free trim", trim_lcg_m=10.0,
              trim_vcg_m=2.0, transfer_fill_step_pct=12.5)
    kw.update(tables)
    tank = TankSpec("DB", "Double bottom", "ballast", 1.025, CompartmentShape("box", 2.0, 8.0, 0.5, 2.5, 0.5, 1.5))
    hold = HoldSpec("H", "Hold", CompartmentShape("box", 10.0, 18.0, 0.0, 3.0, 1.0, 3.0))
    area = DeckAreaSpec("D", "Deck", 2.0, 8.0, 1.0, 5.0)
    openings = (OpeningSpec("low vent", 10.0, 1.5, 2.5), OpeningSpec("deck edge", 10.0, 3.0, 3.0))
    lateral = LateralProfile(np.array([0.0, 20.0, 20.0, 0.0]), np.array([0.0, 0.0, 5.0, 5.0]))
    return Geometry(VesselSpec("Box", 20.0, 6.0, 3.0, 1.5), hull, TableSpec(**kw), (tank,), (hold,), (area,),
                    openings, lateral)


def test_build_tables_reports_each_step_in_words():
    """The command line prints these lines while it builds (builder.py docstring)."""
    said: list[str] = []
    build_tables(box_geometry(), said.append)
    assert said == [
        "hydrostatics at 4 drafts",
        "cross curves: 2 displacements × 4 heels (free trim)",
        "tank 1/1 DB",
        "downflooding angle for 2 opening(s)",
        "deck-edge immersion angle at midships",
        "windage from the lateral profile",
    ]


def test_build_tables_compartments_openings_and_windage():
    """Module docstring: every table of the box, by hand."""
    vt = build_tables(box_geometry())
    assert vt.hull_rule == "simpson"
    np.testing.assert_allclose(vt.hydrostatics.displacement_t, RHO * 120.0 * np.array([0.5, 1.0, 1.5, 2.0]))
    # KN of the box section at T = 1.5 and 2.2 m, 0–90°: checks.md §1.2 section formulas
    # (vessel_factories.box_kn_m); free trim keeps the symmetric box level fore and aft
    for i, t in enumerate((1.5, 2.2)):
        expected = [box_kn_m(6.0, 3.0, t, math.radians(h)) for h in (0.0, 30.0, 60.0, 90.0)]
        np.testing.assert_allclose(vt.cross_curves.kn_m[i], expected, atol=1e-6)
    (tank,) = vt.tanks
    assert tank.capacity_m3 == pytest.approx(12.0, abs=1e-9)
    assert tank.integration == "simpson"
    s = np.linspace(0.0, 1.0, 11)  # 1 m high, 0.1 m steps: 11 rows
    np.testing.assert_allclose(tank.calibration.sounding_m, s, atol=1e-12)
    np.testing.assert_allclose(tank.calibration.volume_m3, 12.0 * s, atol=1e-9)
    np.testing.assert_allclose(tank.calibration.vcg_m, 0.5 + s / 2, atol=1e-9)
    np.testing.assert_allclose(tank.calibration.tcg_m, 1.5, atol=1e-9)
    np.testing.assert_allclose(tank.calibration.lcg_m, 5.0, atol=1e-9)
    np.testing.assert_allclose(tank.calibration.fsi_m4, 4.0, rtol=1e-9)
    # transfer table on the 12.5 % fill step and, with no transfer heels given, the KN heels
    np.testing.assert_allclose(tank.transfer.fill_pct, np.arange(0.0, 100.1, 12.5))
    np.testing.assert_allclose(tank.transfer.heel_deg, [0.0, 30.0, 60.0, 90.0])
    assert tank.worst_band_pct == pytest.approx(box_tank_worst_band_pct(6.0, 2.0, 1.0), abs=0.01)
    (hold,) = vt.holds
    assert hold.capacity_m3 == pytest.approx(48.0, abs=1e-9)
    assert (hold.lcg_m, hold.vcg_m, hold.tcg_m) == pytest.approx((14.0, 2.0, 1.5), abs=1e-9)
    np.testing.assert_allclose(hold.fill_pct, np.arange(0.0, 100.1, 10.0))
    np.testing.assert_allclose(hold.fill_vcg_m, 1.0 + hold.fill_pct / 100.0, atol=1e-9)
    np.testing.assert_allclose(hold.fill_lcg_m, 14.0, atol=1e-9)
    (area,) = vt.deck_areas
    assert (area.area_m2, area.lcg_m, area.tcg_m, area.deck_height_m) == pytest.approx((12.0, 5.0, 2.0, 3.0), abs=1e-9)
    # openings: the deck edge governs at 184.5 t, the vent at 270.6 t
    assert vt.downflooding.opening == "deck edge / low vent"
    np.testing.assert_allclose(vt.downflooding.displacement_t, [184.5, 270.6])
    np.testing.assert_allclose(vt.downflooding.angle_deg, np.degrees(np.arctan([0.5, 0.2])), atol=1e-6)
    # deck edge amidships: tanθ = (3 − T)/3 at T = 1.5 and 2.2 m
    np.testing.assert_allclose(vt.deck_edge.displacement_t, [184.5, 270.6])
    np.testing.assert_allclose(vt.deck_edge.angle_deg, np.degrees(np.arctan([0.5, 0.8 / 3.0])), atol=1e-6)
    # windage of a 20 × 5 m outline above T: 20·(5 − T), centre (5 − T)/2 above the waterline
    np.testing.assert_allclose(vt.windage.draft_m, [0.5, 1.0, 1.5, 2.0])
    np.testing.assert_allclose(vt.windage.lateral_area_m2, 20.0 * (5.0 - vt.windage.draft_m), atol=1e-9)
    np.testing.assert_allclose(vt.windage.centroid_above_wl_m, (5.0 - vt.windage.draft_m) / 2, atol=1e-9)
    np.testing.assert_allclose(vt.windage.waterline_length_m, 20.0, atol=1e-9)


def test_one_governing_opening_is_named_alone_and_no_openings_no_angle():
    """With the vent alone it governs at both displacements; without openings there is no
    downflooding table (but still the deck-edge angle), and no lateral profile, no windage."""
    g = box_geometry()
    vent = Geometry(g.vessel, g.hull, g.tables, g.tanks, g.holds, g.deck_areas, g.openings[:1], None)
    vt = build_tables(vent)
    assert vt.downflooding.opening == "low vent"
    assert vt.windage is None
    bare = Geometry(g.vessel, g.hull, g.tables)
    said: list[str] = []
    vt = build_tables(bare, said.append)
    assert vt.downflooding is None and vt.windage is None
    assert vt.tanks == () and vt.holds == () and vt.deck_areas == ()
    np.testing.assert_allclose(vt.deck_edge.angle_deg, np.degrees(np.arctan([0.5, 0.8 / 3.0])), atol=1e-6)
    assert said == ["hydrostatics at 4 drafts", "cross curves: 2 displacements × 4 heels (free trim)",
                    "deck-edge immersion angle at midships"]


def test_transfer_heels_given_apart_from_the_kn_heels():
    """TableSpec.transfer_heel_deg, when given, sets the transfer table's heels; at 50 % and 15°
    the box tank is wall-sided: M = 4·sin15°·(1 + ½tan²15°) (module docstring)."""
    g = box_geometry(transfer_heel_deg=np.array([0.0, 15.0, 90.0]), transfer_fill_step_pct=25.0)
    t = tank_tables(g.tanks[0], g, g.tables.transfer_heel_deg)
    np.testing.assert_allclose(t.transfer.fill_pct, [0.0, 25.0, 50.0, 75.0, 100.0])
    th = math.radians(15.0)
    assert t.transfer.moment_m4[2, 1] == pytest.approx(4.0 * math.sin(th) * (1 + 0.5 * math.tan(th) ** 2), abs=1e-9)
    vt = build_tables(g)
    np.testing.assert_allclose(vt.tanks[0].transfer.heel_deg, [0.0, 15.0, 90.0])


def test_a_displacement_above_the_deck_edge_is_refused_with_the_numbers():
    """The lowest deck sets the largest displacement: deck 2.5 m at the FP, so 1.025·120·2.5 =
    307.5 t (the hull is cut at the lowest deck height, builder.py)."""
    g = box_geometry(deck_z=(3.0, 3.0, 3.0, 3.0, 2.5), disp=(184.5, 300.0, 320.0))
    with pytest.raises(TableRangeError) as ei:
        build_tables(g)
    assert str(ei.value) == ("cross-curve displacement 320 t is more than the hull displaces with the deck edge "
                             "at the water (307.5 t)")


def tapered_geometry() -> Geometry:
    """Two stations x = 0 and 10 m, wall-sided: half-breadth 2 m at x = 0 and 4 m at x = 10,
    deck 3 m at x = 0 and 4 m at x = 10 (both linear in x between them)."""
    hull = HullOffsets(np.array([0.0, 10.0]), np.array([0.0, 5.0]), np.array([[2.0, 2.0], [4.0, 4.0]]),
                       np.array([3.0, 4.0]))
    ts = TableSpec(np.array([1.0, 2.0]), np.array([10.0, 20.0]), np.array([0.0, 90.0]))
    return Geometry(VesselSpec("Taper", 10.0, 8.0, 3.0, 1.0), hull, ts)


def test_deck_area_on_a_tapering_deck():
    """Half-breadth h(x) = 2 + 0.2x and deck height z(x) = 3 + 0.1x on x 0…10.  Full width
    (y −5…5): width 2h, area ∫(4 + 0.4x)dx = 60 m², LCG ∫x(4 + 0.4x)dx/60 = (200 + 400/3)/60 = 50/9 m,
    TCG 0, mean deck height ∫(3 + 0.1x)(4 + 0.4x)dx/60 = 2·(60 + 40 + 20/3)/60 = 32/9 m.  Starboard
    half (y 0…5): width h, area 30 m², TCG ∫h²/2 dx/30 = (40 + 40 + 40/3)/60 = 14/9 m.  Simpson's
    rule (used by the builder) is exact for these polynomials of degree ≤ 3."""
    g = tapered_geometry()
    full = deck_area_tables(DeckAreaSpec("F", "Full", 0.0, 10.0, -5.0, 5.0), g)
    assert full.area_m2 == pytest.approx(60.0, abs=1e-9)
    assert full.lcg_m == pytest.approx(50.0 / 9.0, abs=1e-9)
    assert full.tcg_m == pytest.approx(0.0, abs=1e-9)
    assert full.deck_height_m == pytest.approx(32.0 / 9.0, abs=1e-9)
    half = deck_area_tables(DeckAreaSpec("S", "Starboard", 0.0, 10.0, 0.0, 5.0, 2.0), g)
    assert half.area_m2 == pytest.approx(30.0, abs=1e-9)
    assert half.tcg_m == pytest.approx(14.0 / 9.0, abs=1e-9)
    assert half.lcg_m == pytest.approx(50.0 / 9.0, abs=1e-9)
    assert half.deck_height_m == pytest.approx(32.0 / 9.0, abs=1e-9)
    assert half.spec.max_load_t_m2 == 2.0
    # port half mirrors it
    port = deck_area_tables(DeckAreaSpec("P", "Port", 0.0, 10.0, -5.0, 0.0), g)
    assert (port.area_m2, port.tcg_m) == pytest.approx((30.0, -14.0 / 9.0), abs=1e-9)


def test_deck_area_cut_by_the_deck_edge_part_way():
    """The strip y 2.5…5 of the tapering deck is inside the deck edge only where h = 2 + 0.2x > 2.5,
    i.e. x > 2.5: width max(0, 0.2x − 0.5), area ∫₂.₅¹⁰(0.2x − 0.5)dx = 0.1·(100 − 6.25) − 0.5·7.5
    = 5.625 m².  The width kinks at x = 2.5 (slope 0 → 0.2), where Simpson's rule is not exact: over
    the panel holding a kink of slope jump Δ its error is at most Δ·h²/6 (kink on the middle node,
    exact Δh²/2 against Simpson's Δh²/3), 3.3e-4 m² at the builder's h ≤ 0.1 m (builder.py
    docstring); tolerance 4e-4 m²."""
    g = tapered_geometry()
    strip = deck_area_tables(DeckAreaSpec("K", "Outer strip", 0.0, 10.0, 2.5, 5.0), g)
    assert strip.area_m2 == pytest.approx(5.625, abs=4e-4)


def test_deck_area_over_a_short_length_and_outside_the_deck():
    """A 0.2 m strip x 4.9…5.1 of the starboard half, h = 3 + 0.2u with u = x − 5: area
    ∫h du = 0.6 m², ∫x·h du = 5·0.6 + 0.2·∫u²du = 3 + 0.2·0.2³/12, so LCG = 5 + 0.2·0.2³/12/0.6 m;
    a rectangle beyond the deck edge (y 4.5…6, h ≤ 4) is refused with its id."""
    g = tapered_geometry()
    strip = deck_area_tables(DeckAreaSpec("S", "Strip", 4.9, 5.1, 0.0, 5.0), g)
    assert strip.area_m2 == pytest.approx(0.6, abs=1e-12)
    assert strip.lcg_m == pytest.approx(5.0 + 0.2 * 0.2**3 / 12 / 0.6, abs=1e-12)
    with pytest.raises(TableRangeError) as ei:
        deck_area_tables(DeckAreaSpec("D9", "Outboard", 0.0, 10.0, 4.5, 6.0), g)
    assert str(ei.value) == "deck area D9 lies outside the deck"


def test_hold_tables_direct():
    g = box_geometry()
    h = hold_tables(g.holds[0], g)
    assert h.spec is g.holds[0]
    assert (h.capacity_m3, h.lcg_m, h.vcg_m, h.tcg_m) == pytest.approx((48.0, 14.0, 2.0, 1.5), abs=1e-9)


def flared_geometry() -> Geometry:
    """Stations 0, 10, 20 m; waterlines 0 and 3 m; half-breadth at the keel 1, 2, 3 m (1 + 0.1x) and
    3 m at z = 3 at every station; deck 3 m."""
    hull = HullOffsets(np.array([0.0, 10.0, 20.0]), np.array([0.0, 3.0]), np.array([[1.0, 3.0], [2.0, 3.0], [3.0, 3.0]]),
                       np.full(3, 3.0))
    ts = TableSpec(np.array([1.0, 2.0]), np.array([10.0, 20.0]), np.array([0.0, 90.0]), transfer_fill_step_pct=1.0)
    hold = HoldSpec("H", "Hold", CompartmentShape("hull", 0.0, 20.0, 0.0, 5.0, 0.0, 3.0))
    tank = TankSpec("WB", "Wing", "ballast", 1.025, CompartmentShape("hull", 0.0, 20.0, 0.0, 5.0, 0.0, 3.0))
    return Geometry(VesselSpec("Flare", 20.0, 6.0, 3.0, 1.5), hull, ts, (tank,), (hold,))


def test_hull_shaped_hold_in_a_flared_hull():
    """The starboard half of the flared hull, x 0…20: at x its section is the trapezoid from
    h = 1 + 0.1x at the keel to 3 at z = 3, area 1.5·(h + 3); ∫ over x: ∇ = 1.5·(80 + 20) = 150 m³;
    LCG = 1.5·∫x(4 + 0.1x)dx/150 = 1.5·(800 + 800/3)/150 = 32/3 m; ∬y dA = (h² + 3h + 9)/2 per
    section, ∫ = (260/3 + 120 + 180)/2 = 580/3, TCG = 580/450 = 58/45 m; ∬z dA = 1.5h + 9, ∫ = 240,
    VCG = 1.6 m.  The lower layers are longer forward, so the LCG at part fills differs from the
    full one (the table keeps the full hold's centre and the LCG/VCG at each tenth)."""
    g = flared_geometry()
    h = hold_tables(g.holds[0], g)
    assert h.capacity_m3 == pytest.approx(150.0, rel=1e-12)
    assert h.lcg_m == pytest.approx(32.0 / 3.0, rel=1e-12)
    assert h.tcg_m == pytest.approx(58.0 / 45.0, rel=1e-12)
    assert h.vcg_m == pytest.approx(1.6, rel=1e-12)
    assert h.fill_vcg_m[-1] == pytest.approx(1.6, rel=1e-12)
    assert h.fill_lcg_m[-1] == pytest.approx(32.0 / 3.0, rel=1e-12)
    # a thin bottom layer's LCG: ∫x(1 + 0.1x)dx/∫(1 + 0.1x)dx = (200 + 800/3)/40 = 35/3 m
    assert h.fill_lcg_m[0] == pytest.approx(35.0 / 3.0, rel=1e-9)
    assert np.all(np.diff(h.fill_lcg_m) < 0.0)


def test_hull_shaped_tank_on_a_one_percent_fill_step():
    """Same hull, the same space as a tank: capacity 150 m³, its integration along the hull
    stations, and the transfer table on every 1 % (101 rows 0, 1, …, 100)."""
    g = flared_geometry()
    t = tank_tables(g.tanks[0], g, np.array([0.0, 30.0]))
    assert t.spec is g.tanks[0]
    assert t.capacity_m3 == pytest.approx(150.0, rel=1e-12)
    assert t.integration == "simpson between hull stations"
    np.testing.assert_allclose(t.transfer.fill_pct, np.arange(0.0, 100.5, 1.0))
    np.testing.assert_allclose(t.transfer.heel_deg, [0.0, 30.0])


def test_fill_centroids_of_an_empty_off_centre_hold():
    """Empty, the centroid is the limit of a thin layer on the bottom: the bottom's own centre
    (x 14, y 1.5) at the bottom height z 1 (tanks.py); full, the box's centre."""
    g = box_geometry()
    body = compartment_body(g.holds[0].shape, g.hull)
    lcg, vcg, tcg, full = fill_centroids(body, np.array([0.0, 25.0, 100.0]))
    assert full == pytest.approx(48.0, abs=1e-9)
    np.testing.assert_allclose(lcg, 14.0, atol=1e-9)
    np.testing.assert_allclose(tcg, 1.5, atol=1e-9)
    np.testing.assert_allclose(vcg, [1.0, 1.25, 2.0], atol=1e-9)


def test_fill_centroids_of_a_hopper_hold():
    """Wedge section (0, 0), (4, 2), (0, 2), length 10 (checks.md §3.3 [A]): at depth s the contents
    are the triangle (0, 0), (2s, s), (0, s), volume 10·s², centroid y = z = 2s/3; full 40 m³, so
    fill f has s = 2·√f; empty, the bottom edge (y 0, z 0)."""
    from deckload.core.geometry.body import Body
    from deckload.core.geometry.hull import compartment_sections

    shape = CompartmentShape("prism", 0.0, 10.0, section_y_m=np.array([0.0, 4.0, 0.0]),
                             section_z_m=np.array([0.0, 2.0, 2.0]))
    body = Body(*compartment_sections(shape, None))
    f = np.array([0.0, 25.0, 64.0, 100.0])
    lcg, vcg, tcg, full = fill_centroids(body, f)
    s = 2.0 * np.sqrt(f / 100.0)
    assert full == pytest.approx(40.0, abs=1e-9)
    np.testing.assert_allclose(vcg, 2 * s / 3, atol=1e-7)
    np.testing.assert_allclose(tcg, 2 * s / 3, atol=1e-7)
    np.testing.assert_allclose(lcg, 5.0, atol=1e-9)


def test_sounding_levels_rows():
    """tanks.sounding_levels: equal steps no longer than the step asked for, and at least 11 rows
    (its documented default), so a shallow tank still has its table every tenth of its height."""
    np.testing.assert_allclose(sounding_levels(0.5, 0.1), np.linspace(0.0, 0.5, 11))
    np.testing.assert_allclose(sounding_levels(2.0, 0.1), np.linspace(0.0, 2.0, 21))
    np.testing.assert_allclose(sounding_levels(2.05, 0.1), np.linspace(0.0, 2.05, 22))
    np.testing.assert_allclose(sounding_levels(1.0, 0.5, min_rows=2), [0.0, 0.5, 1.0])


def test_cross_curves_use_the_tables_trim_basis_and_reference_centre():
    """Free trim about the centre stated in [tables] (trim_lcg_m 9.5, trim_vcg_m 2): upright, the box
    trims until B is under it, which for a box is the cubic s·(GML + ½·BML·s²) = L/2 − x_G with
    s = tan ψ, BML = L²/(12T), GML = BML + T/2 − z_G (tests/test_geometry_box.py
    test_free_trim_balances_lcb_with_lcg, derived there; checks.md §1.6).  At 184.5 t, T = 1.5 m:
    BML = 22.22 m, GML = 20.97 m, and s ≈ 0.0238 by the stern (G abaft the middle).  Even keel
    (no trim) is a different table: trim nil."""
    g = box_geometry(trim_lcg_m=9.5)
    cc = build_tables(g).cross_curves
    assert cc.trim_basis == "free trim"
    t_m, l_m, zg = 1.5, 20.0, 2.0
    bml = l_m**2 / (12 * t_m)
    gml = bml + t_m / 2 - zg
    lo, hi = -0.5, 0.5
    for _ in range(200):  # bisection on the monotone cubic
        mid = 0.5 * (lo + hi)
        if mid * (gml + 0.5 * bml * mid**2) > l_m / 2 - 9.5:
            hi = mid
        else:
            lo = mid
    assert 0.02 < lo < 0.03
    assert math.tan(cc.trim_rad[0, 0]) == pytest.approx(0.5 * (lo + hi), abs=1e-9)
    ek = build_tables(box_geometry(trim_lcg_m=9.5, trim_basis="even keel")).cross_curves
    assert ek.trim_basis == "even keel"
    np.testing.assert_allclose(ek.trim_rad, 0.0, atol=1e-15)


def test_calibration_of_a_small_off_centre_tank():
    """Box tank 1 × 0.5 × 0.5 m at y 1…1.5 (checks.md §3.1): v = 0.5·s, TCG 1.25, and the free
    surface's inertia about its own centre line l·b³/12 = 0.5³/12 m⁴ at every sounding — not about
    the ship's centre line (∫y² dA = (1.5³ − 1)/3 = 0.79 m⁴), however small the surface (0.5 m²)."""
    from deckload.core.geometry.tanks import calibrate

    body = compartment_body(CompartmentShape("box", 0.0, 1.0, 1.0, 1.5, 0.0, 0.5), None)
    cal = calibrate(body, np.array([0.0, 0.25, 0.5]))
    np.testing.assert_allclose(cal.volume_m3, [0.0, 0.125, 0.25], atol=1e-12)
    np.testing.assert_allclose(cal.tcg_m, 1.25, atol=1e-12)
    np.testing.assert_allclose(cal.fsi_m4, 0.5**3 / 12, rtol=1e-9)


def test_openings_and_deck_edge_follow_the_tables_trim_basis():
    """builder.build_tables: the downflooding and deck-edge angles are found with the hull floating
    as for the cross curves (cross_curves.immersion_angle with the tables' trim basis and reference
    centre, builder.py).  With G 0.5 m abaft the middle the free-trim angles differ from the
    even-keel ones, so the check tells the two apart."""
    from deckload.core.geometry.builder import hull_body
    from deckload.core.geometry.cross_curves import immersion_angle

    g = box_geometry(trim_lcg_m=9.5)
    vt = build_tables(g)
    body = hull_body(g)
    disp = g.tables.kn_displacement_t
    free = [immersion_angle(body, disp, RHO, (o.x_m, o.y_m, o.z_m), "free trim", 9.5, 2.0) for o in g.openings]
    even = [immersion_angle(body, disp, RHO, (o.x_m, o.y_m, o.z_m), "even keel") for o in g.openings]
    np.testing.assert_allclose(vt.downflooding.angle_deg, np.min(free, axis=0), atol=1e-9)
    assert np.max(np.abs(np.min(free, axis=0) - np.min(even, axis=0))) > 1e-3
    edge = immersion_angle(body, disp, RHO, (10.0, 3.0, 3.0), "free trim", 9.5, 2.0)
    np.testing.assert_allclose(vt.deck_edge.angle_deg, edge, atol=1e-9)
