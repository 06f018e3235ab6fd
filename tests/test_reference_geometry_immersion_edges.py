"""Immersion angle of an opening (core/geometry/cross_curves.py ``immersion_angle``): two edges
worked by hand on a box 20 × 6 × 3 m (x 0…20 from the AP, 5 stations), ρ = 1.025 t/m³.

Free trim, trimmed by the head.  Upright, a box at mean draft T whose level falls by t per metre
forward (c(x) = c0 − (x − x_ref)·t, cross_curves.py) has the draft d(x) = T − (x − L/2)·t, so
(integrals of a linear draft over the length)

    x_B = L/2 − t·L²/(12·T),      z_B = (T² + t²·L²/12)/(2·T),

and B is on the vertical through G when (x_B − x_G) − t·(z_B − z_G) = 0 (cross_curves.py), i.e.
t = (L/2 − x_G)/(L²/(12T) + z_B − z_G).  With Δ = 184.5 t (T = 1.5 m), x_G = 11 m, z_G = 2 m:
z_B ≈ 0.775 m and t ≈ −1/(22.22 + 0.775 − 2) = −0.0476 (by the head): the draft at x = 19 m is
d(19) ≈ 1.5 + 9·0.0476 = 1.93 m, and a vent at x = 19 m, 1.8 m above the keel is under water
upright (by 0.13 m, far more than the few millimetres the approximations here leave).  The
tool must refuse it, naming the displacement.  Solved to the end (two steps of the fixed point
above), t = −0.047625 and d(1) = 1.5 − 9·0.047625 = 1.0714 m: a vent aft at x = 1 m, y = 1 m,
1.3 m above the keel is dry upright.  Heeled, the box stays wall-sided up to tan θ = 0.3
(3·0.3 = 0.9 m < d(1) and < D − d(20) = 1.02 m): the waterline turns about the centre line and
the vent immerses at tan θ = (1.3 − d(1))/1 = 0.2286, θ = 12.88°, if the trim stays as upright.
At heel ζ_B − ζ_G changes by a few centimetres against the 21 m of the denominator: t by
< 0.5 %, d(1) by < 3 mm, θ by < 0.2°; 0.3° allowed.

Even keel, on its side.  Heeled 90°, ζ = −y (sections.py), and the box floats on its side with
the water at y ≥ −c, L·D·(c + B/2) = ∇: at Δ = 147.6 t (T = 1.2 m), c = T·B/D − B/2 = −0.6 m.
A vent on the centre line (y = 0) 2.5 m above the keel has ζ = 0 there, 0.6 m above the water:
still dry at 90°, so the tool returns the largest heel asked for, 90° exactly (its docstring).
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.geometry.body import Body
from deckload.core.geometry.cross_curves import immersion_angle
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.spec import HullOffsets

RHO = 1.025


def box_body() -> Body:
    xs = np.linspace(0.0, 20.0, 5)
    hull = HullOffsets(xs, np.array([0.0, 3.0]), np.full((5, 2), 3.0), np.full(5, 3.0))
    return Body(xs, *hull_sections(hull))


def test_a_vent_under_water_upright_when_trimmed_by_the_head_is_refused():
    with pytest.raises(ValueError, match=r"under water upright at displacement 184\.5 t"):
        immersion_angle(box_body(), np.array([184.5]), RHO, (19.0, 1.0, 1.8), "free trim", 11.0, 2.0)


def test_a_centre_line_vent_dry_on_the_side_gives_the_largest_heel():
    a = immersion_angle(box_body(), np.array([147.6]), RHO, (10.0, 0.0, 2.5), "even keel")
    np.testing.assert_array_equal(a, [90.0])


def test_a_vent_aft_dry_upright_when_trimmed_by_the_head():
    a = immersion_angle(box_body(), np.array([184.5]), RHO, (1.0, 1.0, 1.3), "free trim", 11.0, 2.0)
    assert float(a[0]) == pytest.approx(np.degrees(np.arctan(1.3 - (1.5 - 9 * 0.047625))), abs=0.3)
