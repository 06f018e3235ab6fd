"""Tank calibration and the actual moment of fluid transfer, against closed forms.

Box tank l = 6, b = 4, h = 2 (checks.md §3.1–3.2 [A]).  Upright i = l·b³/12 = 32 m⁴ at
every level.  Heeled to θ at fill f (liquid depth d = f·h) the definition is
M(θ) = v·[(y_g − y₀)·cosθ + (z_g − z₀)·sinθ], relative to the upright centroid
(y₀, z₀) = (0, d/2).  While the surface meets both side walls the liquid wedge
argument of the wall-sided formula gives M = i·sinθ·(1 + ½tan²θ) exactly,
independent of fill; otherwise the section formulas of checks.md §1.2 apply with
(B, D, T) → (b, h, d).  At 30° and 50 % the surface meets top and bottom and
M = 6 + 7√3 m⁴ exactly (checks.md §3.2).  The rectangle is point-symmetric, so
M(f) = M(1 − f).

Wedge tank l = 10, section (0,0), (4,2), (0,2) (checks.md §3.3 [A]): at sounding s the
liquid is the triangle (0,0), (2s,s), (0,s): V = l·s², y_g = z_g = 2s/3,
i = l·(2s)³/12 = (2/3)·l·s³.

Horizontal cylindrical tank r = 1.5, l = 8 (checks.md §3.3 [A]): φ = 2·arccos((r − s)/r),
V = l·r²(φ − sinφ)/2, z_g = r − 4r·sin³(φ/2)/(3(φ − sinφ)), w = 2√(s(2r − s)),
i = l·w³/12.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.body import Body
from deckload.core.geometry.hull import compartment_sections
from deckload.core.geometry.spec import CompartmentShape
from deckload.core.geometry.tanks import calibrate, fill_centroids, sounding_levels
from deckload.core.geometry.transfer import transfer_moments, worst_band


def box_tank(x0=0.0, y_from=-2.0, z0=0.0) -> Body:
    shape = CompartmentShape("box", x0, x0 + 6.0, y_from, y_from + 4.0, z0, z0 + 2.0)
    return Body(*compartment_sections(shape, None))


def prism(y, z, length) -> Body:
    shape = CompartmentShape("prism", 0.0, length, section_y_m=np.asarray(y), section_z_m=np.asarray(z))
    return Body(*compartment_sections(shape, None))


# checks.md §3.2 [A]: M (m⁴) at fills 10–50 % (60–90 % mirror them)
M_TABLE = {
    10.0: [4.7719, 5.6431, 5.6431, 5.6431, 5.6431],
    20.0: [6.1221, 9.6504, 11.3755, 11.6696, 11.6696],
    30.0: [6.5360, 11.3181, 14.7909, 17.1130, 18.1244],
    40.0: [6.5447, 12.0573, 16.6826, 19.8144, 20.8584],
}


def test_box_tank_transfer_moments():
    """checks.md §3.2 [A]: the M table at 10°, 20°, 30°, 40° and fills 10–90 %."""
    body = box_tank()
    fills = np.arange(10.0, 91.0, 10.0)
    heels = np.array([10.0, 20.0, 30.0, 40.0])
    m = transfer_moments(body, fills, heels).moment_m4
    for k, h in enumerate(heels):
        expected = np.array(M_TABLE[h] + M_TABLE[h][:4][::-1])
        np.testing.assert_allclose(m[:, k], expected, atol=5e-5)
    # 30°, 50 %: exactly 6 + 7√3
    assert m[4, 2] == pytest.approx(6 + 7 * math.sqrt(3), abs=1e-9)
    # point symmetry of the rectangle: M(f) = M(1 − f)
    np.testing.assert_allclose(m, m[::-1], atol=1e-9)
    # wall-sided regime (10°, 20–80 %): i·sinθ·(1 + ½tan²θ) with i = l·b³/12
    th = math.radians(10.0)
    assert m[3, 0] == pytest.approx(6 * 4**3 / 12 * math.sin(th) * (1 + 0.5 * math.tan(th) ** 2), abs=1e-9)


def test_box_tank_on_its_side():
    """Analytic: heeled 90° the liquid lies against the low wall over the whole height h, so its
    centroid is at mid-height, z_g = h/2, against d/2 upright, and the moment is normal to gravity:
    M(f, 90°) = v·(h/2 − d/2) = l·b·d·(h − d)/2 (checks.md §3.2 definition, θ = 90°).  l = 6, b = 4,
    h = 2: 9, 12, 9 m⁴ at 25, 50, 75 %."""
    m = transfer_moments(box_tank(), np.array([25.0, 50.0, 75.0]), np.array([90.0])).moment_m4[:, 0]
    d = np.array([0.5, 1.0, 1.5])
    np.testing.assert_allclose(m, 6 * 4 * d * (2 - d) / 2, atol=1e-9)
    np.testing.assert_allclose(m, [9.0, 12.0, 9.0], atol=1e-9)


def test_transfer_is_independent_of_tank_position():
    """Analytic: M is measured from the tank's own upright centroid, so moving the tank
    (off the centreline, up, along) changes nothing."""
    a = transfer_moments(box_tank(), np.array([25.0, 50.0, 75.0]), np.array([15.0, 30.0, 60.0])).moment_m4
    b = transfer_moments(box_tank(x0=11.0, y_from=1.5, z0=0.9), np.array([25.0, 50.0, 75.0]),
                         np.array([15.0, 30.0, 60.0])).moment_m4
    np.testing.assert_allclose(a, b, atol=1e-9)


def test_empty_and_full_tanks_have_no_transfer():
    """Definition: an empty tank has no liquid, a full one cannot shift it."""
    m = transfer_moments(box_tank(), np.array([0.0, 100.0]), np.array([0.0, 30.0, 90.0])).moment_m4
    np.testing.assert_allclose(m, 0.0, atol=1e-12)


def test_box_tank_worst_band():
    """checks.md §3.2 [A]: M(30°) peaks at 50 % (6 + 7√3 = 18.124 m⁴); 0.9·max is reached at
    35.98394 % and, by point symmetry, 64.01606 % (derived in tests/test_reference_worst_band.py).
    Tolerance: the program's 1 % grid with linear edges, ≤ 1²·|M''|/(8·M') = 0.0062 % there."""
    lo, hi = worst_band(box_tank())
    assert lo == pytest.approx(35.98394, abs=0.0062)
    assert hi == pytest.approx(64.01606, abs=0.0062)


def test_box_tank_calibration():
    """checks.md §3.1 [A]: v = l·b·s, VCG = s/2, i = l·b³/12 = 32 m⁴ at every sounding (the
    bottom and top rows as limits from inside the tank)."""
    body = box_tank(y_from=1.0, z0=0.9)
    s = sounding_levels(2.0, 0.1)
    cal = calibrate(body, s)
    np.testing.assert_allclose(cal.sounding_m, np.linspace(0.0, 2.0, 21))
    np.testing.assert_allclose(cal.volume_m3, 6 * 4 * s, atol=1e-10)
    np.testing.assert_allclose(cal.vcg_m, 0.9 + s / 2, atol=1e-10)
    np.testing.assert_allclose(cal.tcg_m, 3.0, atol=1e-10)
    np.testing.assert_allclose(cal.lcg_m, 3.0, atol=1e-10)
    np.testing.assert_allclose(cal.fsi_m4, 6 * 4**3 / 12, rtol=1e-9)


def test_wedge_tank_calibration():
    """checks.md §3.3 [A]: V = l·s², y_g = z_g = 2s/3, i = (2/3)·l·s³ at s = 0.5 … 2."""
    body = prism([0.0, 4.0, 0.0], [0.0, 2.0, 2.0], 10.0)
    s = np.array([0.0, 0.5, 1.0, 1.5, 2.0])
    cal = calibrate(body, s)
    np.testing.assert_allclose(cal.volume_m3, 10.0 * s**2, atol=1e-10)
    np.testing.assert_allclose(cal.vcg_m[1:], 2 * s[1:] / 3, atol=1e-10)
    np.testing.assert_allclose(cal.tcg_m[1:], 2 * s[1:] / 3, atol=1e-10)
    # top row: limit from below, the full-width surface (2/3)·l·2³
    np.testing.assert_allclose(cal.fsi_m4[1:], (2 / 3) * 10.0 * s[1:] ** 3, rtol=1e-6)
    assert cal.volume_m3[-1] == pytest.approx(40.0)


def test_cylindrical_tank_calibration():
    """checks.md §3.3 [A] values for r = 1.5, l = 8 (a 4000-gon, inscribed: ~1e-6 relative)."""
    r, length = 1.5, 8.0
    phi = np.linspace(0.0, 2 * math.pi, 4000, endpoint=False) - math.pi / 2
    body = prism(r * np.cos(phi), r + r * np.sin(phi), length)
    s = np.array([0.3, 0.75, 1.5, 2.25, 2.7])
    cal = calibrate(body, s)
    np.testing.assert_allclose(cal.volume_m3, [2.94302, 11.05533, 28.27433, 45.49334, 53.60565], rtol=1e-5)
    np.testing.assert_allclose(cal.vcg_m, [0.17891, 0.44247, 0.86338, 1.24301, 1.42747], atol=2e-5)
    np.testing.assert_allclose(cal.fsi_m4, [3.88800, 11.69134, 18.00000, 11.69134, 3.88800], rtol=1e-5)
    ph = 2 * np.arccos((r - s) / r)  # the closed forms themselves
    np.testing.assert_allclose(cal.volume_m3, length * r**2 * (ph - np.sin(ph)) / 2, rtol=1e-5)
    np.testing.assert_allclose(cal.fsi_m4, length * (2 * np.sqrt(s * (2 * r - s))) ** 3 / 12, rtol=1e-5)


def test_fill_centroids_of_a_box_hold():
    """Analytic: contents levelled at fill f in a box l × b × h have VCG = z₀ + f·h/2."""
    shape = CompartmentShape("box", 2.0, 12.0, -3.0, 3.0, 1.0, 4.0)
    body = Body(*compartment_sections(shape, None))
    f = np.array([0.0, 10.0, 50.0, 100.0])
    lcg, vcg, tcg, full = fill_centroids(body, f)
    assert full == pytest.approx(10 * 6 * 3)
    np.testing.assert_allclose(vcg, 1.0 + f / 100 * 3.0 / 2, atol=1e-9)
    np.testing.assert_allclose(lcg, 7.0, atol=1e-9)
    np.testing.assert_allclose(tcg, 0.0, atol=1e-9)
