"""Immersion angle of a point (core/geometry/cross_curves.py, ``immersion_angle``): free trim off
the middle, a point exactly at the water, a point just dry at the largest heel, and the number of
heels the root finder tries.

Box hull 20 × 6 × 3 m (L × B × D, x 0…20, half-breadth 3, deck 3, five stations), ρ = 1.025 t/m³.

Free trim, wall-sided box (derived here).  In the heeled frame of the module docstring the water
is −y·sinθ + z·cosθ ≤ c0 − (x − x_ref)·t (t = tan ψ), i.e. in body axes it lies below

    h(x, y) = a + b·(x − L/2) + y·tanθ,   b = −t/cosθ,   a = [c0 − (L/2 − x_ref)·t]/cosθ.

While 0 < h < D over the whole waterplane (no bottom out of the water, no deck in it) the
immersed body is the box cut by that plane, and with the origin at mid-length on the centre line
(the cross terms vanish by symmetry):

    ∇ = a·L·B  (so a = ∇/(L·B), the upright mean draft, whatever θ and t),
    x_B = L/2 + b·L²/(12a),   y_B = tanθ·B²/(12a),   z_B = (a² + b²L²/12 + tan²θ·B²/12)/(2a).

G = (x_G, 0, z_G) is on B's vertical when R(t) = (x_B − x_G) − t·(ζ_B − z_G·cosθ) = 0 with
ζ_B = −y_B·sinθ + z_B·cosθ (module docstring): a cubic in t, solved here by ``numpy.roots``.
A point (x_p, y_p, z_p) on the low side (y_p > 0) is at the water when z_p = h(x_p, y_p), a
function of θ alone once t(θ) is known; its root is found here by bisection on those closed forms.

The program finds the same equilibrium by Newton's method to |R| ≤ 1e-8 m (tan ψ to about
1e-8 m / |dR/dt| ≈ 1e-8/16 here) and the heel to 1e-10 m of the margin, i.e. about 1e-8°:
the tolerance below, 1e-6°, is a hundred times that and far below the 0.1° an angle is read to.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

import deckload.core.geometry.cross_curves as cross_curves_module
from deckload.core.geometry.body import Body
from deckload.core.geometry.cross_curves import immersion_angle, solve_floating
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.spec import HullOffsets

L, B, D = 20.0, 6.0, 3.0
RHO = 1.025


def box_body() -> Body:
    xs = np.linspace(0.0, L, 5)
    hull = HullOffsets(xs, np.array([0.0, D]), np.full((5, 2), B / 2), np.full(5, D))
    return Body(xs, *hull_sections(hull))


def free_trim_tan(a: float, theta: float, x_g: float, z_g: float) -> float:
    """t solving R(t) = 0 for the wall-sided box (module docstring), the real root nearest 0."""
    c, s, tn = math.cos(theta), math.sin(theta), math.tan(theta)
    y_b = tn * B * B / (12.0 * a)
    # x_B − x_G = (L/2 − x_G) − t·L²/(12·a·cosθ)
    # ζ_B − ζ_G = −y_B·s + cosθ·(a² + t²L²/(12c²) + tn²B²/12)/(2a) − z_G·c
    k0 = -y_b * s + c * (a * a + tn * tn * B * B / 12.0) / (2.0 * a) - z_g * c
    k2 = L * L / (24.0 * a * c)  # coefficient of t² in ζ_B
    # R(t) = (L/2 − x_G) − t·L²/(12ac) − t·(k0 + k2·t²)
    roots = np.roots([-k2, 0.0, -(L * L / (12.0 * a * c) + k0), L / 2 - x_g])
    real = roots[np.abs(roots.imag) < 1e-12].real
    return float(real[np.argmin(np.abs(real))])


def free_trim_immersion_deg(disp_t: float, point, x_g: float, z_g: float) -> tuple[float, float]:
    """Heel (deg) at which the point reaches h(x_p, y_p), by bisection on the closed forms, and
    the largest and smallest h over the waterplane's corners there (for the wall-sided check)."""
    a = disp_t / RHO / (L * B)
    x_p, y_p, z_p = point

    def h(theta, x, y):
        t = free_trim_tan(a, theta, x_g, z_g)
        return a - t * (x - L / 2) / math.cos(theta) + y * math.tan(theta)

    lo, hi = 0.0, math.radians(60.0)
    assert h(lo, x_p, y_p) < z_p < h(hi, x_p, y_p)
    for _ in range(100):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if h(mid, x_p, y_p) < z_p else (lo, mid)
    theta = 0.5 * (lo + hi)
    corners = [h(theta, x, y) for x in (0.0, L) for y in (-B / 2, B / 2)]
    return math.degrees(theta), min(corners), max(corners)


@pytest.mark.parametrize("point", [(2.0, 2.0, 2.2), (17.0, 2.5, 2.0)])
def test_free_trim_immersion_of_a_point_off_the_middle(point):
    """Module docstring (free trim, wall-sided box).  G at x 9.5 m, 2 m up: the box trims by the
    stern (t ≈ 0.024) and a point aft (x 2 m, 8 m from mid-length) goes under sooner than it
    would on an even keel, a point forward (x 17 m) later.  Checked wall-sided at the answer
    (0 < h < D at every corner).  At 184.5 t (∇ = 180 m³, a = 1.5 m)."""
    expected, h_min, h_max = free_trim_immersion_deg(184.5, point, 9.5, 2.0)
    assert 0.0 < h_min and h_max < D
    got = immersion_angle(box_body(), np.array([184.5]), RHO, point, "free trim", 9.5, 2.0)
    assert got[0] == pytest.approx(expected, abs=1e-6)
    # and the even-keel answer differs by far more than that (the trim matters here):
    # z_p − a = y_p·tanθ on an even keel
    even = math.degrees(math.atan((point[2] - 1.5) / point[1]))
    assert abs(expected - even) > 0.5


def test_a_point_exactly_at_the_water_upright_is_refused():
    """Analytic: upright the box floats at T = Δ/(ρ·L·B): 123 t → 1.0 m, 184.5 t → 1.5 m.  A point
    1.0 m up is at the water at 123 t (awash counts as immersed: the margin ≤ 0) and under it at
    184.5 t; the first displacement at which it is awash or under is named.  Awash exactly: the
    level search lands on T = 1.0 m exactly for the box (its volume is linear in the level, so
    a Newton step is exact), checked first so that a failure names its cause."""
    body = box_body()
    level, _, _ = solve_floating(body, np.array([120.0]), np.array([0.0]), "even keel", 0.0, 0.0, 10.0)
    assert level[0] == 1.0
    for disps, named in (([61.5, 123.0], "123.0"), ([61.5, 123.0, 184.5], "123.0")):
        with pytest.raises(ValueError) as ei:
            immersion_angle(body, np.array(disps), RHO, (10.0, 2.0, 1.0), "even keel")
        assert str(ei.value) == f"the opening is under water upright at displacement {named} t"


def test_a_point_just_dry_at_the_largest_heel_gets_exactly_that_heel():
    """Analytic: heeled 90° the 123 t box holds the strip y ≥ −c over the depth, ∇ = L·D·(B/2 + c)
    = 120 m³ → c = −1 m.  A point at y = 0.5 (any z) has ζ = −y = −0.5 there, 0.5 m above the
    water: still dry, so the function returns ``max_heel_deg`` itself (its docstring), exactly,
    not an iterate just short of it."""
    got = immersion_angle(box_body(), np.array([123.0]), RHO, (10.0, 0.5, 2.9), "even keel")
    assert got[0] == 90.0


def test_a_point_reaching_the_water_exactly_at_the_largest_heel():
    """Analytic (as above): heeled 90° the 123 t box has c = −1 m, and a point at y = 1 m has
    ζ = −1 m there: it reaches the water exactly at 90°, so the answer is 90° (the root finder
    closes on the end of its bracket, to its 1e-9° tolerance; 1e-6° allowed, as above)."""
    got = immersion_angle(box_body(), np.array([123.0]), RHO, (10.0, 1.0, 2.9), "even keel")
    assert got[0] == pytest.approx(90.0, abs=1e-6)


def test_the_heel_is_found_in_few_trials(monkeypatch):
    """The heel is found by the Illinois variant of regula falsi (docstring; Dowell & Jarratt,
    BIT 11 (1971) 168–174), superlinear of order 1.44 per trial, with the bracket kept.  Each
    trial is one free-floating solution for every displacement (one call of ``solve_floating``).
    Deck edge (10, 3, 3) of the box at 123 t and 184.5 t: from the 0…90° bracket to 1e-10 m of
    the margin it needs 7 trials after the two ends (counted: 9 calls).  Bisection would need
    log2(90°/2e-9°) ≈ 35 (the margin changes by about 3 m per radian here, so 1e-10 m is
    2e-9°), plain regula falsi stalls on one end: the bound 12 allows a few more than measured
    and fails either.  The angles themselves: 184.5 t (T = 1.5 m): wall-sided to the deck edge,
    tanθ = (D − T)/(B/2) = 0.5 (checks.md §1.1); 123 t (T = 1 m): the bottom is out before, the
    section under water is the triangle of legs p (bottom) and q = D (side) with p·q/2 = B·T =
    6 m², so p = 4 m and tanθ = q/p = 0.75."""
    body = box_body()
    calls = []
    real = cross_curves_module.solve_floating

    def counting(*args, **kwargs):
        calls.append(1)
        return real(*args, **kwargs)

    monkeypatch.setattr(cross_curves_module, "solve_floating", counting)
    got = immersion_angle(body, np.array([123.0, 184.5]), RHO, (10.0, 3.0, 3.0), "even keel")
    np.testing.assert_allclose(got, np.degrees(np.arctan([0.75, 0.5])), rtol=0, atol=1e-6)
    assert 3 <= len(calls) <= 12, len(calls)
