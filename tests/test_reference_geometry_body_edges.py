"""Edges of a body's immersion (core/geometry/body.py), worked by hand on a box.

Box L = 40 (x 0…40 from the AP), B = 10, D = 4 m, upright, keel at z = 0 (the form of
checks.md §1).  A level below the keel (c0 = −1 m) leaves nothing under water: volume,
waterplane area and every moment are 0 exactly (no section is cut, the sums are of zeros).
The centroid of no volume has no value of its own, but every number the program computes must
be finite (deckload's rule: finite or refused, core/bounds.py): the callers replace it by the bottom's
centroid (tanks.py), so a NaN here would only be hidden, never needed.
"""

from __future__ import annotations

import numpy as np

from deckload.core.geometry.body import Body, immerse, level_for_volume
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.spec import HullOffsets

L, B, D = 40.0, 10.0, 4.0


def box_body(n: int = 5) -> Body:
    xs = np.linspace(0.0, L, n)
    hull = HullOffsets(xs, np.array([0.0, D]), np.full((n, 2), B / 2), np.full(n, D))
    return Body(xs, *hull_sections(hull))


def test_nothing_below_the_level_gives_zeros_and_finite_centroids():
    im = immerse(box_body(), np.ones(2), np.zeros(2), np.array([-1.0, -0.5]))
    for name in ("volume_m3", "wp_area_m2", "wp_x_m3", "wp_xx_m4", "wp_eta_m3", "wp_etaeta_m4"):
        np.testing.assert_array_equal(getattr(im, name), [0.0, 0.0], err_msg=name)
    for name in ("x_b_m", "eta_b_m", "zeta_b_m"):
        assert np.all(np.isfinite(getattr(im, name))), name


def test_level_of_a_trimmed_box_with_one_end_dry_or_its_deck_under():
    """Box as above with stations every 2.5 m (17), upright, trimmed t = ∓0.01 about x_ref = 15 m:
    the level in section x is c(x) = c0 − (x − 15)·t (body.py), so the section's area is
    B·clip(c(x), 0, D).  With t = −0.01:

    * c0 = 3.9: c(x) = 3.75 … 4.15, the deck (z = 4) under water from x = 25 m on:
      ∇ = B·[∫₀²⁵ (3.9 + 0.01(x − 15)) dx + 15·4] = 10·(97.5 − 0.625 + 60) = 1568.75 m³.
    * c0 = −0.2: c(x) = −0.35 … 0.05, wetted only from x = 35 m on:
      ∇ = B·∫₃₅⁴⁰ 0.01·(x − 35) dx = 10·0.01·12.5 = 1.25 m³.

    With t = +0.01 and c0 = 4.2: c(x) = 4.35 … 3.95, the deck under water except from x = 35 m on:
      ∇ = B·[35·4 + ∫₃₅⁴⁰ (4.35 − 0.01x) dx] = 10·(140 + 21.75 − 1.875) = 1598.75 m³
    (1.25 m³ short of the whole box).

    The kinks (x = 25, 35) are stations at the ends of Simpson panels, and the pieces are linear:
    the rule is exact, so the level searched for each volume is c0 to the search's own tolerance
    (1e-11 of the volume over a waterplane of ≥ 50 m²: < 1e-9 m; 1e-9 m allowed)."""
    body = box_body(17)
    c = level_for_volume(body, np.ones(3), np.zeros(3), np.array([1568.75, 1.25, 1598.75]),
                         np.array([-0.01, -0.01, 0.01]), 15.0)
    np.testing.assert_allclose(c, [3.9, -0.2, 4.2], rtol=0, atol=1e-9)


def keel_bar_body() -> Body:
    """Stations x = 0, 5, 10; each section a keel bar 0.2 m wide from z = 0 to 3 m under a body
    10 m wide from z = 3 to 5 m (counter-clockwise)."""
    y = np.tile([-0.1, 0.1, 0.1, 5.0, 5.0, -5.0, -5.0, -0.1], (3, 1))
    z = np.tile([0.0, 0.0, 3.0, 3.0, 5.0, 5.0, 3.0, 3.0], (3, 1))
    return Body(np.array([0.0, 5.0, 10.0]), y, z)


def test_level_in_a_body_with_a_deep_narrow_keel():
    """Keel-bar body above, upright, length 10 m: ∇(c) = 0.2·c·10 for c ≤ 3 and
    6 + 10·10·(c − 3) for 3 ≤ c ≤ 5 (sections constant along x: every rule exact).
    ∇ = 106 m³ ⇒ c = 4; ∇ = 4 m³ ⇒ c = 2 (in the keel bar).  Where the waterplane is only the
    keel's 2 m², a Newton step from inside the keel bar jumps far above the body and the search
    must bisect towards the top from where it stands (the search's bracket, body.py docstring).
    Tolerance 1e-9 m: the search stops at 1e-11 of the largest volume (1e-9 m³) over a waterplane
    of ≥ 2 m²."""
    c = level_for_volume(keel_bar_body(), np.ones(2), np.zeros(2), np.array([106.0, 4.0]))
    np.testing.assert_allclose(c, [4.0, 2.0], rtol=0, atol=1e-9)


def test_level_at_the_ends_ignores_the_start_given():
    """An empty body's level is its lowest point and a full one's its highest (body.py: 'the ends
    are known exactly'), whatever start the caller passes (the previous case's levels)."""
    c = level_for_volume(box_body(), np.ones(2), np.zeros(2), np.array([0.0, L * B * D]),
                         c_start=np.array([2.5, 1.0]))
    np.testing.assert_array_equal(c, [0.0, D])


def test_level_in_a_small_tank_with_a_narrow_trunk():
    """A small tank (under 1 m³, e.g. a lubricating-oil tank) with a filling trunk: stations
    x = 0, 0.5, 1; each section 1 m wide from z = 0 to 0.1 m under a trunk 0.02 m wide up to
    z = 0.5 m (counter-clockwise).  Length 1 m: ∇(c) = 1·c for c ≤ 0.1 and 0.1 + 0.02·(c − 0.1)
    above (sections constant along x: every rule exact).  ∇ = 0.05 m³ ⇒ c = 0.05 m;
    ∇ = 0.104 m³ ⇒ c = 0.3 m (in the trunk).
    From a start inside the trunk a Newton step falls far below the tank and the search must
    bisect below the level it stands at; in the trunk the waterplane is only 0.02 m², so a step
    must be the volume missing divided by it (Newton, body.py docstring).  Tolerance 1e-9 m: the
    search stops at 1e-11 of the largest volume (1.04e-12 m³) over a waterplane of ≥ 0.02 m²."""
    y = np.tile([-0.5, 0.5, 0.5, 0.01, 0.01, -0.01, -0.01, -0.5], (3, 1))
    z = np.tile([0.0, 0.0, 0.1, 0.1, 0.5, 0.5, 0.1, 0.1], (3, 1))
    body = Body(np.array([0.0, 0.5, 1.0]), y, z)
    c = level_for_volume(body, np.ones(2), np.zeros(2), np.array([0.05, 0.104]))
    np.testing.assert_allclose(c, [0.05, 0.3], rtol=0, atol=1e-9)


def test_level_of_the_keel_bar_body_on_its_side():
    """Keel-bar body above heeled 90° to starboard: ζ = −y (sections.py), so the water is y ≥ −c
    and the section's area is ∫ from −c to 5 of its height at y: 5 m where |y| ≤ 0.1, else 2 m.
    c = 0.05: 2·4.9 + 5·0.1 + 5·0.05 = 10.55 m², ∇ = 105.5 m³ (length 10 m, every rule exact:
    sections constant along x).  c = 0: 10.3 m², ∇ = 103 m³.  The search's bracket is −5 … 5 m
    here, symmetric about 0.  From a start at c = 1 m a Newton step for 103 m³ crosses the bar
    and lands 0.15 m beyond it on the other side, and from there back again (the waterplane is
    20 m² on either side of the bar, 50 m² on it): only the bracket stops that.
    Tolerance 1e-9 m as above (waterplane ≥ 20 m²)."""
    c = level_for_volume(keel_bar_body(), np.zeros(1), np.ones(1), np.array([105.5]))
    np.testing.assert_allclose(c, [0.05], rtol=0, atol=1e-9)
    c = level_for_volume(keel_bar_body(), np.zeros(1), np.ones(1), np.array([103.0]), c_start=np.array([1.0]))
    np.testing.assert_allclose(c, [0.0], rtol=0, atol=1e-9)


def test_level_from_a_start_at_the_top_of_a_box():
    """Box 40 × 10 × 4 m (5 stations), ∇ = 800 m³ ⇒ c = 2 m.  A start at the deck (c = 4 m): the
    deck lying on the level has no waterline chord (sections.py: a horizontal edge on the line
    is the limit from above), so no Newton step exists there and the search must bisect.
    Tolerance 1e-9 m as above."""
    c = level_for_volume(box_body(), np.ones(1), np.zeros(1), np.array([800.0]), c_start=np.array([D]))
    np.testing.assert_allclose(c, [2.0], rtol=0, atol=1e-9)


def test_level_for_a_tiny_volume_in_a_pointed_bottom():
    """Stations x = 0 … 10 (5), each a square on its corner, (0, 5), (2, 7), (0, 9), (−2, 7): a
    pointed bottom 5 m above the base line (a tank's V-shaped bottom).  Below c ≤ 7 m the wetted
    part is a triangle of half-width c − 5 and height c − 5: area (c − 5)², ∇ = 10·(c − 5)².
    ∇ = 1e-12 m³ ⇒ c = 5 + √1e-13 = 5.000000316… m.  Here one round-off step of the level
    (9e-16 m at 5 m) changes the volume by more than the search's volume tolerance (1e-11 of it,
    1e-23 m³), so the search ends on its bracket (1e-14 of the level) rather than on the volume:
    tolerance 1e-12 m (about a thousand round-off steps of a level of 5 m)."""
    y = np.tile([0.0, 2.0, 0.0, -2.0], (5, 1))
    z = np.tile([5.0, 7.0, 9.0, 7.0], (5, 1))
    body = Body(np.linspace(0.0, 10.0, 5), y, z)
    c = level_for_volume(body, np.ones(1), np.zeros(1), np.array([1e-12]))
    np.testing.assert_allclose(c, [5.0 + np.sqrt(1e-13)], rtol=0, atol=1e-12)
