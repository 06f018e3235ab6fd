"""Immersion angle of a point and the free-trim solver's refusals (core/geometry/cross_curves.py):
the limits and the words an officer reads when a table cannot be made.

Box hull 20 × 6 × 3 m (checks.md §1 form, x 0…20, half-breadth 3, deck 3), ρ = 1.025 t/m³.
Analytic: heeled 90° the water in the heeled frame is ζ = −y ≤ c, each section holds the strip
y ≥ −c over the depth 3 m, so ∇ = 20·3·(3 + c): at 123 t (∇ = 120 m³, T = 1 m upright) c = −1 m.
A point on the centre line (y = 0) has ζ = z·cos 90° = 0 > c there: still dry at 90°.
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.geometry.body import Body
from deckload.core.geometry.cross_curves import NoEquilibriumError, cross_curves, immersion_angle
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.spec import HullOffsets


def box_body() -> Body:
    xs = np.linspace(0.0, 20.0, 5)
    hull = HullOffsets(xs, np.array([0.0, 3.0]), np.full((5, 2), 3.0), np.full(5, 3.0))
    return Body(xs, *hull_sections(hull))


def test_a_point_still_dry_at_the_largest_heel_gets_that_heel():
    """Module docstring (immersion_angle returns max_heel_deg for a point still dry there)."""
    b = box_body()
    np.testing.assert_allclose(immersion_angle(b, np.array([123.0]), 1.025, (10.0, 0.0, 2.9), "even keel"), [90.0])
    np.testing.assert_allclose(
        immersion_angle(b, np.array([123.0]), 1.025, (10.0, 0.0, 2.9), "even keel", max_heel_deg=40.0), [40.0])


def test_a_point_under_water_upright_is_refused_with_the_displacement():
    """At 300 t the box floats at T = 300/(1.025·120) = 2.44 m, above a point 2 m up: refused,
    naming the first such displacement."""
    with pytest.raises(ValueError) as ei:
        immersion_angle(box_body(), np.array([123.0, 300.0, 320.0]), 1.025, (10.0, 2.0, 2.0), "even keel")
    assert str(ei.value) == "the opening is under water upright at displacement 300.0 t"


def test_free_trim_that_cannot_settle_is_refused_with_volume_and_heel():
    """G 30 m abaft the AP of a 20 m box: B can never come under it, the free-trim iteration gives
    up after its 40 steps and says at which volume (184.5/1.025 = 180 m³) and heel."""
    with pytest.raises(NoEquilibriumError) as ei:
        cross_curves(box_body(), np.array([184.5]), np.array([30.0]), 1.025, "free trim", -30.0, 2.0)
    msg = str(ei.value)
    assert msg.startswith("free-trim equilibrium not found at volume 180.00 m³, heel 30° (residual ")
    assert msg.endswith(" m after 40 iterations)")


def test_free_trim_settles_in_few_newton_steps():
    """solve_floating takes Newton steps on tan ψ with the exact derivative along the
    constant-volume path (cross_curves docstring), so it converges quadratically (Press et al.,
    *Numerical Recipes* 3rd ed. §9.4): G 1 m off the middle of the 20 m box trims it up to
    tan ψ = 0.10 (at 90°, 123 t), two steps of the 0.05 cap; then from a residual below 0.1 m
    to the 1e-8 m tolerance it takes at most four more (0.1 → 1e-2 → 1e-4 → 1e-8): at most 6 in
    all, at every heel (5 with G 0.5 m off).  A wrong term in the derivative still ends at the same
    trim but only after more steps (or none)."""
    heels = np.array([0.0, 10.0, 30.0, 60.0, 90.0])
    for lcg, most in ((9.0, 6), (11.0, 6), (9.5, 5)):
        cc = cross_curves(box_body(), np.array([123.0, 184.5]), heels, 1.025, "free trim", lcg, 2.0)
        assert 1 <= cc.iterations <= most, (lcg, cc.iterations)
        # and B is under G: tan ψ has the sign of G's offset (by the stern when G is aft)
        assert np.all(np.sign(cc.trim_rad) == np.sign(10.0 - lcg))
