"""Plane-section primitives (core/geometry/sections.py) against results worked by hand.

* Simpson's first rule w = h/3·(1, 4, 2, …, 4, 1) and the trapezoidal rule (any
  numerical-analysis text): Simpson integrates cubics exactly, the trapezoidal rule linears.
* Shoelace area of a polygon (positive counter-clockwise); a triangle is ½·base·height.
* A U-shaped section (two legs on a bottom block) cut by a level through its legs, worked below,
  for the clipped area, its moments and the two waterline chords (sections.py docstring).
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.geometry.sections import (
    clip_polygon,
    clip_to_box,
    cut_area_chord,
    cut_sections,
    pad_polygons,
    polygon_area,
    polygon_edges,
    simpson_weights,
)


def test_simpson_weights_and_when_they_apply():
    """Odd count of equal steps: Simpson, exact for x³ (∫₀⁴ x³ dx = 64); otherwise the trapezoidal
    rule, exact for linear functions; fewer than two stations integrate nothing."""
    w, rule = simpson_weights(np.array([0.0, 2.0, 4.0]))
    assert rule == "simpson"
    np.testing.assert_allclose(w, [2 / 3, 8 / 3, 2 / 3], rtol=1e-12)
    x = np.linspace(0.0, 4.0, 5)
    w, rule = simpson_weights(x)
    assert rule == "simpson"
    np.testing.assert_allclose(w, np.array([1, 4, 2, 4, 1]) / 3.0, rtol=1e-12)
    assert float(w @ x**3) == pytest.approx(64.0, rel=1e-12)
    # even count: trapezoid, weights h/2 at the ends and h inside
    w, rule = simpson_weights(np.array([0.0, 1.0, 2.0, 3.0]))
    assert rule == "trapezoid"
    np.testing.assert_allclose(w, [0.5, 1.0, 1.0, 0.5], rtol=1e-12)
    # unequal steps: trapezoid with each step's half at its two ends
    w, rule = simpson_weights(np.array([0.0, 1.0, 3.0, 4.0, 6.0]))
    assert rule == "trapezoid"
    np.testing.assert_allclose(w, [0.5, 1.5, 1.5, 1.5, 1.0], rtol=1e-12)
    w, rule = simpson_weights(np.array([0.0, 2.0]))
    assert rule == "trapezoid"
    np.testing.assert_allclose(w, [1.0, 1.0], rtol=1e-12)
    for n in (0, 1):
        w, rule = simpson_weights(np.zeros(n))
        assert rule == "trapezoid" and w.shape == (n,) and not np.any(w)
    # equal steps far from the origin (round-off in the steps must not switch the rule)
    w, rule = simpson_weights(np.array([1000.1, 1000.2, 1000.3]))
    assert rule == "simpson"
    np.testing.assert_allclose(w, np.array([1, 4, 1]) * 0.1 / 3, rtol=1e-9)


def test_polygon_area_sign_and_degenerate_polygons():
    y = np.array([0.0, 4.0, 0.0])
    z = np.array([0.0, 0.0, 3.0])
    assert polygon_area(y, z) == pytest.approx(6.0, abs=1e-12)  # ½·4·3
    assert polygon_area(y[::-1], z[::-1]) == pytest.approx(-6.0, abs=1e-12)
    assert polygon_area(y[:2], z[:2]) == 0.0
    assert polygon_area(np.array([]), np.array([])) == 0.0


def test_polygon_edges_close_the_polygon():
    y0, z0, y1, z1 = polygon_edges(np.array([0.0, 1.0, 1.0]), np.array([0.0, 0.0, 1.0]))
    np.testing.assert_array_equal(y1, [1.0, 1.0, 0.0])
    np.testing.assert_array_equal(z1, [0.0, 1.0, 0.0])
    np.testing.assert_array_equal(y0, [0.0, 1.0, 1.0])


def test_pad_polygons_repeats_last_vertices_and_empties_are_a_point():
    tri = (np.array([0.0, 1.0, 0.0]), np.array([0.0, 0.0, 1.0]))
    empty = (np.array([]), np.array([]))
    quad = (np.array([0.0, 2.0, 2.0, 0.0]), np.array([0.0, 0.0, 2.0, 2.0]))
    ys, zs = pad_polygons([tri, empty, quad])
    np.testing.assert_array_equal(ys, [[0.0, 1.0, 0.0, 0.0], [0.0] * 4, [0.0, 2.0, 2.0, 0.0]])
    np.testing.assert_array_equal(zs, [[0.0, 0.0, 1.0, 1.0], [0.0] * 4, [0.0, 0.0, 2.0, 2.0]])
    ys, zs = pad_polygons([empty])
    assert ys.shape == (1, 1) and not np.any(ys) and not np.any(zs)
    ys, zs = pad_polygons([])
    assert ys.shape == (0, 1)


def test_clip_polygon_by_a_half_plane():
    """Square 0…2 × 0…2 cut by y + z ≤ 2: the triangle (0, 0), (2, 0), (0, 2), area 2; by z ≤ 0.5:
    a 2 × 0.5 strip; by z ≤ −1 nothing; all of it by z ≤ 5."""
    y = np.array([0.0, 2.0, 2.0, 0.0])
    z = np.array([0.0, 0.0, 2.0, 2.0])
    cy, cz = clip_polygon(y, z, 1.0, 1.0, 2.0)
    assert polygon_area(cy, cz) == pytest.approx(2.0, abs=1e-12)
    assert max(cy + cz) == pytest.approx(2.0, abs=1e-12)
    cy, cz = clip_polygon(y, z, 0.0, 1.0, 0.5)
    assert polygon_area(cy, cz) == pytest.approx(1.0, abs=1e-12)
    np.testing.assert_allclose(sorted(set(cz.tolist())), [0.0, 0.5])
    cy, cz = clip_polygon(y, z, 0.0, 1.0, -1.0)
    assert len(cy) == 0 and len(cz) == 0
    cy, cz = clip_polygon(y, z, 0.0, 1.0, 5.0)
    np.testing.assert_array_equal(cy, y)
    np.testing.assert_array_equal(cz, z)
    cy, cz = clip_polygon(np.array([]), np.array([]), 0.0, 1.0, 1.0)
    assert len(cy) == 0


def test_clip_to_box():
    """Triangle (0, 0), (4, 0), (0, 4) inside y 1…3, z 0…2: the trapezoid between y = 1 and 3 under
    z = 4 − y, capped at z = 2: the part y 1…2 is 1 × 2 = 2 and y 2…3 is ½·(2 + 1)·1 = 1.5: 3.5.
    A box beyond the triangle (y 5…6) leaves nothing."""
    y = np.array([0.0, 4.0, 0.0])
    z = np.array([0.0, 0.0, 4.0])
    cy, cz = clip_to_box(y, z, 1.0, 3.0, 0.0, 2.0)
    assert polygon_area(cy, cz) == pytest.approx(3.5, abs=1e-12)
    assert (min(cy), max(cy), min(cz), max(cz)) == pytest.approx((1.0, 3.0, 0.0, 2.0), abs=1e-12)
    cy, cz = clip_to_box(y, z, 5.0, 6.0, 0.0, 2.0)
    assert len(cy) == 0
    cy, cz = clip_to_box(y, z, 0.0, 0.2, 3.8, 5.0)  # the apex above z = 3.8: legs 0.2 and 0.2
    assert polygon_area(cy, cz) == pytest.approx(0.5 * 0.2 * 0.2, abs=1e-12)


# U-shaped section, counter-clockwise, shifted 1 m to starboard: a bottom block y −2…4, z 0…2
# and two legs y −2…0 and 2…4 up to z = 4.
U_Y = np.array([-3.0, 3.0, 3.0, 1.0, 1.0, -1.0, -1.0, -3.0]) + 1.0
U_Z = np.array([0.0, 0.0, 4.0, 4.0, 2.0, 2.0, 4.0, 4.0])


def test_cut_of_a_u_section_through_its_legs():
    """Upright (η = y, ζ = z), level 3: area 6·2 + 2·(2·1) = 16 m²; ∬y dA = 16·1 (the section is
    symmetric about y = 1); ∬z dA = 12·1 + 4·2.5 = 22.  Two chords, y 2…4 and −2…0: length 4,
    ∫y ds = (16 − 4)/2 + (0 − 4)/2 = 4, ∫y² ds = (64 − 8)/3 + (0 + 8)/3 = 64/3."""
    cut = cut_sections(U_Y, U_Z, 1.0, 0.0, 3.0)
    assert float(cut.area_m2) == pytest.approx(16.0, abs=1e-12)
    assert float(cut.q_eta_m3) == pytest.approx(16.0, abs=1e-12)
    assert float(cut.q_zeta_m3) == pytest.approx(22.0, abs=1e-12)
    assert float(cut.chord_m) == pytest.approx(4.0, abs=1e-12)
    assert float(cut.chord_m1_m2) == pytest.approx(4.0, abs=1e-12)
    assert float(cut.chord_m2_m3) == pytest.approx(64.0 / 3.0, abs=1e-12)
    a, ch = cut_area_chord(U_Y, U_Z, 1.0, 0.0, 3.0)
    assert (float(a), float(ch)) == pytest.approx((16.0, 4.0), abs=1e-12)


def test_cut_at_a_horizontal_edge_is_the_limit_from_above():
    """Level exactly at the notch floor z = 2 (sections.py docstring, half-open rule): the area is
    the block, 12 m², and the chord the limit from above, the two legs' 4 m (not the block's 6 m).
    At the keel (z = 0) the area is nil and the chord the full bottom, 6 m; below it, nothing."""
    cut = cut_sections(U_Y, U_Z, 1.0, 0.0, 2.0)
    assert float(cut.area_m2) == pytest.approx(12.0, abs=1e-12)
    assert float(cut.chord_m) == pytest.approx(4.0, abs=1e-12)
    a, ch = cut_area_chord(U_Y, U_Z, 1.0, 0.0, 2.0)
    assert (float(a), float(ch)) == pytest.approx((12.0, 4.0), abs=1e-12)
    cut = cut_sections(U_Y, U_Z, 1.0, 0.0, 0.0)
    assert float(cut.area_m2) == 0.0
    assert float(cut.chord_m) == pytest.approx(6.0, abs=1e-12)
    a, ch = cut_area_chord(U_Y, U_Z, 1.0, 0.0, 0.0)
    assert (float(a), float(ch)) == pytest.approx((0.0, 6.0), abs=1e-12)
    cut = cut_sections(U_Y, U_Z, 1.0, 0.0, -0.5)
    assert float(cut.area_m2) == 0.0 and float(cut.chord_m) == 0.0 and float(cut.q_zeta_m3) == 0.0


def test_cut_of_a_u_section_on_its_side():
    """Heeled 90° (cos 0, sin 1): η = z, ζ = −y; level ζ ≤ −1 keeps y ≥ 1: the starboard leg
    y 2…4 (z 0…4, 8 m²) and the block's part y 1…2 (z 0…2, 2 m²): 10 m²; ∬η dA = ∬z dA =
    8·2 + 2·1 = 18; ∬ζ dA = −∬y dA = −(8·3 + 2·1.5) = −27.  The chord is the line y = 1, z 0…2,
    crossed in η from 0 to 2: length 2, ∫η ds = 2, ∫η² ds = 8/3."""
    cut = cut_sections(U_Y, U_Z, 0.0, 1.0, -1.0)
    assert float(cut.area_m2) == pytest.approx(10.0, abs=1e-12)
    assert float(cut.q_eta_m3) == pytest.approx(18.0, abs=1e-12)
    assert float(cut.q_zeta_m3) == pytest.approx(-27.0, abs=1e-12)
    assert float(cut.chord_m) == pytest.approx(2.0, abs=1e-12)
    assert float(cut.chord_m1_m2) == pytest.approx(2.0, abs=1e-12)
    assert float(cut.chord_m2_m3) == pytest.approx(8.0 / 3.0, abs=1e-12)
    a, ch = cut_area_chord(U_Y, U_Z, 0.0, 1.0, -1.0)
    assert (float(a), float(ch)) == pytest.approx((10.0, 2.0), abs=1e-12)
