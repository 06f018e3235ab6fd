"""The worst free-surface band of a tank, against its exact edges, and inclusive at both ends.

The band is deckload's display aid (core/geometry/transfer.py): the fills at which the
volumetric moment of fluid transfer at 30°, M(f, 30°), is at least 90 % of its largest
value over all fills (IS 2008 Part B 3.1.3 asks for the fill of largest moment of a
variable-level tank; standards.md §4.1).  The program finds it on a 1 % fill grid and
interpolates the edges linearly, so its edges differ from the exact ones by at most
h²·|M''|/(8·|M'|) with h = 1 % (the linear-interpolation error of a smooth curve, plus the
same order from the grid missing the true maximum).  Each tolerance below is that bound,
worked from the closed form, with its numbers beside it.

Box tank l = 6, b = 4, h = 2 m (checks.md §3.2 [A]).  At 30° and 26–43 % fill the
liquid touches the bottom and the low side only (b·tan30 = 2.31 > h, and the triangle
below fits while d ≤ 1.5·tan30 = 0.866 m, i.e. f ≤ 43.3 %): with d = f·h, v = l·b·d,
t = tan30, legs a = √(2·b·d/t) along the bottom and c = a·t up the side, the liquid's
centroid is y_g = b/2 − a/3, z_g = c/3 (checks.md §1.2 case 2, (B, D, T) → (b, h, d)) and

    M(f) = v·[y_g·cos30 + (z_g − d/2)·sin30].

M is largest at 50 %, 6 + 7√3 = 18.124356 m⁴ (checks.md §3.2), and M(f) = M(100 − f).
Solving M(f) = 0.9·(6 + 7√3) on that branch by bisection gives f = 35.98394 %, so the
band is 35.98394–64.01606 %.

Wedge (hopper) tank l = 10 m, section (0, 0), (4, 2), (0, 2) (checks.md §3.3 [A]): the
vertical side at y = 0, the bottom sloping up to starboard.  Heeled 30° to starboard
the liquid runs up the slope; to port it lies against the vertical side, where it moves
less.  Its M(f, ±30°) is worked by clipping the section with the heeled surface in
shapely (an independent general-purpose geometry library, not the program's own
clipper), the level found by bisection on the area: to starboard M is largest at
f = 43.7085 % (17.18317 m⁴) and the band is 26.52586–61.53707 %; the mirror image
(section (0, 0), (−4, 2), (0, 2)) has the same band, governed by heel to port.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest
from shapely.geometry import Polygon

from deckload.core.free_surface import tank_state
from deckload.core.geometry.body import Body
from deckload.core.geometry.hull import compartment_sections
from deckload.core.geometry.spec import CompartmentShape
from deckload.core.geometry.transfer import transfer_moments, worst_band
from deckload.core.model import Condition, TankFill
from deckload.core.stability import evaluate
from vessel_factories import box_barge, box_tank

TH30 = math.radians(30.0)
BOX_BAND = (35.98394, 64.01606)
WEDGE_BAND = (26.52586, 61.53707)
WEDGE_PEAK = (43.7085, 17.18317)


def box_body() -> Body:
    return Body(*compartment_sections(CompartmentShape("box", 0.0, 6.0, -2.0, 2.0, 0.0, 2.0), None))


def prism_body(y, z, length) -> Body:
    shape = CompartmentShape("prism", 0.0, length, section_y_m=np.asarray(y), section_z_m=np.asarray(z))
    return Body(*compartment_sections(shape, None))


def box_m30(fill_pct: float) -> float:
    """M(f, 30°) of the 6 × 4 × 2 box tank on the low-fill branch (module docstring), m⁴."""
    t, d = math.tan(TH30), fill_pct / 100.0 * 2.0
    a = math.sqrt(2.0 * 4.0 * d / t)
    assert a <= 4.0 and a * t <= 2.0, "outside the bottom-and-side branch"
    return 6.0 * 4.0 * d * ((2.0 - a / 3.0) * math.cos(TH30) + (a * t / 3.0 - d / 2.0) * math.sin(TH30))


def shapely_m(section: Polygon, length_m: float, fill_pct: float, heel_rad: float, iters: int = 60) -> float:
    """M(f, θ) = v·(η_heeled − η_upright), η = y·cosθ + z·sinθ, by clipping in shapely (module docstring)."""
    v = fill_pct / 100.0 * section.area
    ct, st = math.cos(heel_rad), math.sin(heel_rad)

    def liquid(c_sin, c_cos, level):
        n = np.array([-c_sin, c_cos])  # upward normal of the heeled surface
        along = np.array([c_cos, c_sin])
        p0, w = n * level, 50.0
        half = Polygon([p0 - w * along, p0 + w * along, p0 + w * along - w * n, p0 - w * along - w * n])
        return section.intersection(half)

    def settled(s, c):
        lo, hi = -20.0, 20.0
        for _ in range(iters):
            mid = (lo + hi) / 2
            lo, hi = (mid, hi) if liquid(s, c, mid).area < v else (lo, mid)
        return liquid(s, c, (lo + hi) / 2).centroid

    up, heeled = settled(0.0, 1.0), settled(st, ct)
    return length_m * v * ((heeled.x - up.x) * ct + (heeled.y - up.y) * st)


WEDGE = Polygon([(0.0, 0.0), (4.0, 2.0), (0.0, 2.0)])


def test_box_band_edges_from_the_closed_form():
    """The exact box band (module docstring) by bisection on the closed form, then the program's."""
    m_max = 6 + 7 * math.sqrt(3)
    lo, hi = 26.0, 43.0
    assert box_m30(lo) < 0.9 * m_max < box_m30(hi)
    for _ in range(60):
        mid = (lo + hi) / 2
        lo, hi = (mid, hi) if box_m30(mid) < 0.9 * m_max else (lo, mid)
    assert lo == pytest.approx(BOX_BAND[0], abs=5e-6)
    got = worst_band(box_body())
    # 1 % grid, linear edges: M' = 0.2211 m⁴/%, |M''| = 0.0109 m⁴/%² at 36 %, bound 1·0.0109/(8·0.2211)
    # = 0.0062 %; the maximum (50 %) is a grid point, so no further error.  A band taken from the
    # grid points without interpolation (36 %) would be 0.016 % out.
    assert got[0] == pytest.approx(BOX_BAND[0], abs=0.0062)
    assert got[1] == pytest.approx(BOX_BAND[1], abs=0.0062)


def test_wedge_band_edges_against_shapely():
    """The wedge's band (module docstring), its reference values re-checked in shapely here, and the
    program's band for the wedge and for its mirror image (heel to port governs)."""
    f_peak, m_peak = WEDGE_PEAK
    assert shapely_m(WEDGE, 10.0, f_peak, TH30) == pytest.approx(m_peak, abs=5e-6)
    for df in (-0.5, 0.5):  # a maximum: M is lower half a percent either side
        assert shapely_m(WEDGE, 10.0, f_peak + df, TH30) < m_peak
    for edge in WEDGE_BAND:
        # 5-dp edges: M' ≈ 0.2 m⁴/% there, so M at the printed edge is within 2e-6·… of 0.9·max
        assert shapely_m(WEDGE, 10.0, edge, TH30) == pytest.approx(0.9 * m_peak, abs=2e-5)
    # Tolerance: 1 % grid, linear edges: |M''|/(8|M'|) = 0.0131/(8·0.2056) = 0.0080 % at the low edge,
    # 0.0104/(8·0.1907) = 0.0068 % at the high one; the grid misses the peak (43.71 %) by 0.29 %,
    # lowering 0.9·max by 0.9·½·0.0111·0.29² = 4.3e-4 m⁴, i.e. ≤ 0.0023 % at either edge.  0.011 % bounds both.
    for section_y in ([0.0, 4.0, 0.0], [0.0, -4.0, 0.0]):
        lo, hi = worst_band(prism_body(section_y, [0.0, 2.0, 2.0], 10.0))
        assert lo == pytest.approx(WEDGE_BAND[0], abs=0.011)
        assert hi == pytest.approx(WEDGE_BAND[1], abs=0.011)


def test_wedge_transfer_moment_both_ways_against_shapely():
    """M(f, ±30°) of the wedge from core/geometry/transfer.py against shapely (module docstring):
    heeled to starboard the liquid runs up the slope (M > 0), to port it shifts less and M < 0.
    Tolerance 1e-4 m⁴: the program's Newton level solve and section integration are good to ~1e-9
    relative; the shapely reference to 60 bisections of the level (1e-17 m)."""
    body = prism_body([0.0, 4.0, 0.0], [0.0, 2.0, 2.0], 10.0)
    fills = np.array([10.0, 50.0, 90.0])
    m = transfer_moments(body, fills, np.array([30.0, -30.0])).moment_m4
    for k, f in enumerate(fills):
        for j, heel in enumerate((TH30, -TH30)):
            assert m[k, j] == pytest.approx(shapely_m(WEDGE, 10.0, f, heel), abs=1e-4)
    assert m[1, 0] == pytest.approx(16.96552, abs=5e-5) and m[1, 1] == pytest.approx(-5.85200, abs=5e-5)


def test_band_is_inclusive_at_both_ends():
    """A fill exactly at either edge of the band is in it (the band is 'M ≥ 90 % of max', closed)."""
    band = worst_band(box_body())
    box = box_tank("T", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=20.0)
    tank = dataclasses.replace(box, worst_band_pct=band)
    lo, hi = band
    assert tank_state(lo, tank, 0.0, 98.0) == "worst_band"
    assert tank_state(hi, tank, 0.0, 98.0) == "worst_band"
    assert tank_state(lo - 0.01, tank, 0.0, 98.0) == "slack"
    assert tank_state(hi + 0.01, tank, 0.0, 98.0) == "slack"


@pytest.mark.parametrize("fill, state", [(24.9, "slack"), (25.0, "worst_band"), (75.0, "worst_band"), (75.1, "slack")])
def test_band_edges_reach_the_result(fill, state):
    """Through evaluate: a tank whose band is 25–75 % (chosen so that 25 % and 75 % of 48 m³ are
    12 and 36 m³, read back as exactly 25.0 and 75.0 %) is in its band at both edges and the
    watchkeeper is warned; just outside it is slack."""
    tank = dataclasses.replace(box_tank("DB1C", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=20.0),
                               worst_band_pct=(25.0, 75.0))
    r = evaluate(box_barge(tanks=(tank,)), Condition(tanks=(TankFill("DB1C", "percent", fill),)))
    t = r.tanks[0]
    assert t.fill_pct == pytest.approx(fill, abs=1e-12)
    assert t.state == state
    assert any(w.code == "slack-worst-band" for w in r.warnings) is (state == "worst_band")
