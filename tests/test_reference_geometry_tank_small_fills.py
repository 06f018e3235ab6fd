"""Tank calibration and fill centroids (core/geometry/tanks.py) of two small tanks, derived here.

Small tanks (under 1 m³) so that every sounding or fill is a small volume: the centroid of a small
volume is its own centroid, not the bottom's (the bottom's is only the limit at no volume).

Sloped tank: stations x = 10, 11, 12 m (u = x − 10 = 0, 1, 2), each a rectangle y 0…0.2 m,
z from the bottom z_b = u/2 up to 2 m (a bottom rising forward, common in end tanks).  At a level
c ≥ 1 m the bottom is wetted everywhere and, per metre of x, A(u) = 0.2·(c − u/2), ∫∫z dA =
0.1·(c² − u²/4), ∫∫y dA = 0.1·A(u) (ȳ = 0.1, the middle of y 0…0.2).  Integrating over u 0…2:

    V = 0.2·(2c − 1),   LCG = 10 + (2c − 4/3)/(2c − 1),   VCG = (c² − 1/3)/(2c − 1),   TCG = 0.1

(integrands linear or quadratic in u: Simpson's rule on the three stations is exact).  Full
(c = 2): V = 0.6 m³, LCG = 10 + 8/9, VCG = 11/9.  Half full (V = 0.3): c = 1.25, LCG = 10 + 7/9,
VCG = (1.5625 − 1/3)/1.5.  At c = 1.5: V = 0.4, LCG = 10 + 5/6, VCG = (2.25 − 1/3)/2.
With no volume, the limit of a thin layer is the lowest point's: only the station u = 0 reaches
down to z = 0, so LCG = 10, TCG = 0.1 (the middle of its flat bottom), VCG = 0.

Triangular prism tank: stations x = 0, 1, 2, each the right triangle (0, 0), (1, 0), (0, 1) in
(y, z).  Filled to a sounding s < 1 the wetted part is the trapezoid under z = s of width 1 − z:
A = s − s²/2, ∫∫y dA = ∫₀ˢ (1 − z)²/2 dz = (1 − (1 − s)³)/6, ∫∫z dA = s²/2 − s³/3.
At s = 0.5: A = 0.375 (V = 0.75 m³ over 2 m), TCG = 0.875/2.25 = 7/18, VCG = (1/8 − 1/24)/0.375 = 2/9,
while the free surface's own centre is at y = (1 − s)/2 = 0.25.

Tolerance: 1e-9 m, round-off (the polygons and Simpson's rule are exact here; the level search for
a fill stops at 1e-11 of the volume, ~1e-11 m of level).
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.geometry.body import Body
from deckload.core.geometry.tanks import calibrate, fill_centroids

TOL_M = 1e-9  # round-off, see the module docstring


def sloped_tank() -> Body:
    xs = np.array([10.0, 11.0, 12.0])
    zb = (xs - 10.0) / 2.0
    y = np.tile([0.0, 0.2, 0.2, 0.0], (3, 1))
    z = np.stack([[b, b, 2.0, 2.0] for b in zb])
    return Body(xs, y, z)


def triangle_tank() -> Body:
    xs = np.array([0.0, 1.0, 2.0])
    return Body(xs, np.tile([0.0, 1.0, 0.0], (3, 1)), np.tile([0.0, 0.0, 1.0], (3, 1)))


def lcg(c: float) -> float:
    return 10.0 + (2 * c - 4 / 3) / (2 * c - 1)


def vcg(c: float) -> float:
    return (c * c - 1 / 3) / (2 * c - 1)


def test_calibration_of_the_sloped_tank():
    cal = calibrate(sloped_tank(), np.array([0.0, 1.5, 2.0]))
    np.testing.assert_allclose(cal.volume_m3, [0.0, 0.4, 0.6], rtol=0, atol=1e-12)
    np.testing.assert_allclose(cal.lcg_m, [10.0, lcg(1.5), lcg(2.0)], rtol=0, atol=TOL_M)
    np.testing.assert_allclose(cal.vcg_m, [0.0, vcg(1.5), vcg(2.0)], rtol=0, atol=TOL_M)
    np.testing.assert_allclose(cal.tcg_m, [0.1, 0.1, 0.1], rtol=0, atol=TOL_M)


def test_calibration_of_the_triangular_tank_at_half_its_height():
    cal = calibrate(triangle_tank(), np.array([0.5]))
    assert float(cal.volume_m3[0]) == pytest.approx(0.75, abs=1e-12)
    assert float(cal.tcg_m[0]) == pytest.approx(7 / 18, abs=TOL_M)
    assert float(cal.vcg_m[0]) == pytest.approx(2 / 9, abs=TOL_M)
    assert float(cal.lcg_m[0]) == pytest.approx(1.0, abs=TOL_M)  # a prism: the middle station


def test_fill_centroids_of_the_sloped_tank():
    lc, vc, tc, full = fill_centroids(sloped_tank(), np.array([0.0, 50.0, 100.0]))
    assert full == pytest.approx(0.6, abs=1e-12)
    np.testing.assert_allclose(lc, [10.0, lcg(1.25), lcg(2.0)], rtol=0, atol=TOL_M)
    np.testing.assert_allclose(vc, [0.0, vcg(1.25), vcg(2.0)], rtol=0, atol=TOL_M)
    np.testing.assert_allclose(tc, [0.1, 0.1, 0.1], rtol=0, atol=TOL_M)
