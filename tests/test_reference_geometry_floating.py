"""The floating solver of ``core.geometry.cross_curves`` on a box, against the exact solution.

A box L × B × D = 40 × 10 × 4 m (the geometry tests' box).  At heel 0 the water occupies
z ≤ c0 − (x − x_ref)·t, t = tan ψ, so where neither the keel nor the deck is cut the draft is
d(x) = Tm − (x − L/2)·t, Tm the draft at mid-length.  Integrating over 0 ≤ x ≤ L (derived):

    ∇ = B·L·Tm
    x_B = L/2 − t·L²/(12·Tm)
    z_B = Tm/2 + t²·L²/(24·Tm)

B lies on the earth vertical through G, which in ship axes has the direction (sin ψ, 0, cos ψ):
x_B − x_G = t·(z_B − z_G).  With the above this is the cubic

    −L²/(24·Tm)·t³ + (z_G − Tm/2 − L²/(12·Tm))·t + (L/2 − x_G) = 0,

solved here by ``numpy.roots`` (a general-purpose library), its one real root being the trim.
Any heel: the level found must give back the volume asked for (the definition of the level).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.body import Body, immerse
from deckload.core.geometry.cross_curves import solve_floating
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.spec import HullOffsets

L, B, D = 40.0, 10.0, 4.0


def box_body(n: int = 9) -> Body:
    xs = np.linspace(0.0, L, n)
    hull = HullOffsets(xs, np.array([0.0, D]), np.full((n, 2), B / 2), np.full(n, D))
    return Body(xs, *hull_sections(hull))


@pytest.mark.parametrize("x_g, z_g", [(L / 2 - 1.0, 3.0), (L / 2 + 0.6, 1.5)])
def test_free_trim_of_a_box_with_g_off_the_middle_is_the_cubic_s_root(x_g, z_g):
    """G 1 m abaft (0.6 m forward of) the middle: the solver trims her until B is under G.  The
    draft is not half the depth, so a level lost in the iteration (the body's mid-height) cannot
    happen to hold the same volume."""
    tm = 1.5
    volume = B * L * tm
    roots = np.roots([-L * L / (24 * tm), 0.0, z_g - tm / 2 - L * L / (12 * tm), L / 2 - x_g])
    exact_t = float(next(r.real for r in roots if abs(r.imag) < 1e-12 and abs(r.real) < 0.1))
    assert abs(exact_t) * L / 2 < min(tm, D - tm)  # neither end's keel nor deck is cut: the formulas hold
    x_ref = 7.0
    c, t, iterations = solve_floating(box_body(), np.array([volume]), np.array([0.0]), "free trim",
                                      lcg_m=x_g, vcg_m=z_g, x_ref_m=x_ref)
    assert iterations >= 2  # she had to be trimmed and levelled again, not found level at once
    # The solver stops at a residual of 1e-8 m; dR/dt ≈ 87 m, so t is good to well under 1e-9.
    assert float(t[0]) == pytest.approx(exact_t, abs=1e-9)
    assert float(c[0]) - (L / 2 - x_ref) * float(t[0]) == pytest.approx(tm, abs=1e-9)  # the draft at mid-length
    im = immerse(box_body(), 1.0, 0.0, c, t, x_ref)
    assert float(im.volume_m3[0]) == pytest.approx(volume, rel=1e-9)


@pytest.mark.parametrize("heel_deg", [0.0, 30.0, 60.0, 90.0])
def test_the_level_gives_back_the_volume_at_any_heel_even_ninety_degrees(heel_deg):
    """cos 90° is 6e-17 in floating point; the solver takes it as 0 (the box on her side), and the
    level it returns holds the volume asked for when the plane is cut at that heel."""
    volume = B * L * 1.5
    th = math.radians(heel_deg)
    c, t, _ = solve_floating(box_body(), np.array([volume]), np.array([th]), "even keel")
    ct = 0.0 if heel_deg == 90.0 else math.cos(th)
    im = immerse(box_body(), ct, math.sin(th), c, t)
    assert float(im.volume_m3[0]) == pytest.approx(volume, rel=1e-9)
