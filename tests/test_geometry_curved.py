"""Direct calculation on curved analytic bodies: the Wigley hull and a floating cylinder.

Wigley hull (checks.md §2.1 [A]; derivation repeated here).  Half-breadth
y = (B/2)(1 − ξ²)(1 − ζ²) with ξ = 2x'/L (x' from midships) and ζ = (T − z)/T, the
depth below the design waterline over T; vertical sides above T up to a deck at
D = 10 m.  At the design draft:

* section area A(ξ) = 2∫₀ᵀ y dz = 2·(B/2)(1 − ξ²)·T·(1 − 1/3) = (2/3)·B·T·(1 − ξ²);
  ∇ = ∫ A dx' = (2/3)·B·T·(L/2)·∫₋₁¹ (1 − ξ²) dξ = (2/3)·B·T·(L/2)·(4/3) = 4LBT/9,
  so Cb = ∇/(L·B·T) = 4/9;
* ∬ z dA over a section: 2(B/2)(1 − ξ²)∫₀ᵀ z(1 − ((T − z)/T)²) dz = B(1 − ξ²)·(5T²/12),
  so KB = (5T²/12)/((2/3)T) = 5T/8 (the same at every station);
* I_T = ∫ (2/3)·y_wl³ dx' = (2/3)(B/2)³·(L/2)·∫₋₁¹(1 − ξ²)³dξ = (2/3)(B³/8)(L/2)(32/35)
  = 4LB³/105, and BMt = I_T/∇ = 3B²/(35T);
* A_wp = B·(L/2)·(4/3) = 2LB/3 (Cw = 2/3);  I_L = ∫ x'²·B(1 − ξ²) dx' = B·L³/30;
  BML = I_L/∇ = 3L²/(40T).

Partial drafts τ = t/T: ∇(t) = (2/9)LBTτ²(3 − τ), KB(t) = t(8 − 3τ)/(4(3 − τ)),
BMt = 6B²τ(2 − τ)³/(35T(3 − τ)) (checks.md §2.1 table, from symbolic integration).

The offsets are a polygon through many waterlines (straight between them), so the
comparison carries a small discretisation error: tolerances below are 1e-4
relative for the upright closed forms, and 3e-4 m for the heeled KN (the tolerance
checks.md §2.1 suggests for its converged [N] values).

Circular cylinder, axis horizontal (checks.md §2.2 [A]): every waterline passes at
the same distance from the axis whatever the heel, so the metacentre stays on the
axis and KN = R·sinθ exactly; with G on the axis GZ ≡ 0.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.body import Body
from deckload.core.geometry.cross_curves import cross_curves
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.hydrostatics_calc import upright_hydrostatics
from deckload.core.geometry.spec import HullOffsets

LW, BW, TW, DW = 100.0, 10.0, 6.25, 10.0
RHO = 1.025


def wigley_body(n_stations: int = 41, n_levels: int = 250) -> Body:
    xs = np.linspace(0.0, LW, n_stations)
    xi = 2.0 * (xs - LW / 2) / LW
    z_low = TW * (1.0 - np.cos(np.linspace(0.0, math.pi / 2, n_levels)))  # finer near the keel
    zw = np.concatenate([z_low, [DW]])
    zeta = np.clip((TW - zw) / TW, 0.0, None)
    hb = (BW / 2) * (1.0 - xi[:, None] ** 2) * (1.0 - zeta[None, :] ** 2)
    hull = HullOffsets(xs, zw, hb, np.full(n_stations, DW))
    y, z = hull_sections(hull)
    return Body(xs, y, z)


def test_wigley_upright_closed_forms():
    """checks.md §2.1 [A]: ∇, Cb = 4/9, KB = 5T/8, BMt = 3B²/(35T), BML = 3L²/(40T), Cw = 2/3."""
    body = wigley_body()
    tau = np.array([0.25, 0.5, 0.75, 1.0])
    t = tau * TW
    h = upright_hydrostatics(body, t, RHO, LW, BW)
    np.testing.assert_allclose(h.volume_m3, (2 / 9) * LW * BW * TW * tau**2 * (3 - tau), rtol=1e-4)
    np.testing.assert_allclose(h.vcb_m, t * (8 - 3 * tau) / (4 * (3 - tau)), rtol=1e-4)
    bmt = 6 * BW**2 * tau * (2 - tau) ** 3 / (35 * TW * (3 - tau))
    np.testing.assert_allclose(h.kmt_m - h.vcb_m, bmt, rtol=1e-4)
    bml = 3 * LW**2 * (2 - tau) / (20 * t * (3 - tau))
    np.testing.assert_allclose(h.kml_m - h.vcb_m, bml, rtol=1e-4)
    np.testing.assert_allclose(h.waterplane_area_m2, (2 / 3) * LW * BW * tau * (2 - tau), rtol=1e-4)
    # at the design draft
    assert h.volume_m3[-1] == pytest.approx(4 * LW * BW * TW / 9, rel=1e-4)
    assert h.cb[-1] == pytest.approx(4 / 9, rel=1e-4)
    assert h.cw[-1] == pytest.approx(2 / 3, rel=1e-4)
    assert h.vcb_m[-1] == pytest.approx(5 * TW / 8, rel=1e-4)
    assert h.kmt_m[-1] - h.vcb_m[-1] == pytest.approx(3 * BW**2 / (35 * TW), rel=1e-4)
    assert h.lcb_m[-1] == pytest.approx(LW / 2, abs=1e-9)
    assert h.lcf_m[-1] == pytest.approx(LW / 2, abs=1e-9)


def test_wigley_heeled_kn():
    """checks.md §2.1 [N]: KN at ∇ = 2777.778 m³ with the deck at 10 m (converged clipping,
    confirmed by trimesh slicing), tolerance 3e-4 m.  Fore-and-aft symmetric, so free
    trim must find zero trim."""
    body = wigley_body(n_stations=121)
    heels = np.array([10.0, 20.0, 30.0, 45.0, 60.0, 90.0])
    expected = np.array([0.91825, 1.82009, 2.69372, 3.92901, 4.88128, 5.8624])
    disp = np.array([RHO * 4 * LW * BW * TW / 9])
    cc = cross_curves(body, disp, heels, RHO, "free trim", lcg_m=LW / 2, vcg_m=4.0)
    np.testing.assert_allclose(cc.kn_m[0], expected, atol=3e-4)
    np.testing.assert_allclose(cc.trim_rad, 0.0, atol=1e-9)


def cylinder_body(r: float, n: int = 2000, length: float = 10.0) -> Body:
    phi = np.linspace(0.0, math.pi, n + 1)
    zw = r * (1.0 - np.cos(phi))
    hb = np.abs(r * np.sin(phi))
    hb[0] = hb[-1] = 0.0
    xs = np.array([0.0, length / 2, length])
    hull = HullOffsets(xs, zw, np.tile(hb, (3, 1)), np.full(3, 2 * r))
    y, z = hull_sections(hull)
    return Body(xs, y, z)


def test_cylinder_kn_is_r_sin_theta():
    """checks.md §2.2 [A]: KN = R·sinθ at every heel and draft; G on the axis → GZ ≡ 0.
    The 2000-gon is inscribed in the circle: its KN differs from the circle's by ~1e-6 m."""
    r, length = 5.0, 10.0
    body = cylinder_body(r, length=length)
    heels = np.arange(0.0, 91.0, 15.0)
    drafts = np.array([2.0, 5.0, 8.0])
    areas = r**2 * np.arccos((r - drafts) / r) - (r - drafts) * np.sqrt(2 * r * drafts - drafts**2)
    for basis in ("even keel", "free trim"):
        cc = cross_curves(body, RHO * length * areas, heels, RHO, basis, lcg_m=length / 2, vcg_m=r)
        expected = r * np.sin(np.radians(heels))
        np.testing.assert_allclose(cc.kn_m, np.broadcast_to(expected, cc.kn_m.shape), atol=1e-5)
        gz = cc.kn_m - r * np.sin(np.radians(heels))  # KG = R
        np.testing.assert_allclose(gz, 0.0, atol=1e-5)
    # checks.md §2.2: at half depth KB = R − 4R/(3π), BM = 4R/(3π), so KM = R
    h = upright_hydrostatics(body, np.array([r]), RHO, length, 2 * r)
    assert h.vcb_m[0] == pytest.approx(r - 4 * r / (3 * math.pi), abs=1e-5)
    assert h.kmt_m[0] == pytest.approx(r, abs=1e-5)
