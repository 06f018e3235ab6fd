"""Offsets → section polygons, and compartments → stations and sections (core/geometry/hull.py),
against polygons and integrals worked by hand from the rules in hull.py's docstring: a section
runs up the starboard offsets, across a flat deck and down the port side; offsets and deck vary
linearly in x between stations; a hull-shaped compartment is cut at every hull station inside it
and each piece integrated by Simpson's rule (exact for the quadratics in x used below).
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.geometry.body import immerse
from deckload.core.geometry.hull import (
    compartment_body,
    compartment_polygon,
    compartment_sections,
    compartment_stations,
    hull_section_at,
    hull_sections,
    offsets_at,
    section_polygon,
)
from deckload.core.geometry.sections import polygon_area
from deckload.core.geometry.spec import CompartmentShape, HullOffsets


def test_section_polygon_with_a_rising_floor_and_a_deck_between_waterlines():
    """Waterlines 0…4 m, half-breadths 0, 0, 2, 3, 3; deck at 3.5 m.  The hull starts at the last
    zero offset (z = 1), the deck edge is interpolated at 3.5 m (3 m): starboard (0, 1), (2, 2),
    (3, 3), (3, 3.5), then port in reverse.  Area: ½(0 + 4)·1 + ½(4 + 6)·1 + 6·0.5 = 10 m²."""
    y, z = section_polygon(np.array([0.0, 1.0, 2.0, 3.0, 4.0]), np.array([0.0, 0.0, 2.0, 3.0, 3.0]), 3.5)
    np.testing.assert_allclose(y, [0.0, 2.0, 3.0, 3.0, -3.0, -3.0, -2.0, -0.0])
    np.testing.assert_allclose(z, [1.0, 2.0, 3.0, 3.5, 3.5, 3.0, 2.0, 1.0])
    assert polygon_area(y, z) == pytest.approx(10.0, abs=1e-12)


def test_section_polygon_flat_floor_and_deck_between_waterlines():
    """Half-breadths 1, 2, 3 at z 0, 2, 4 and a deck at 3 m (edge 2.5 m): starboard (1, 0), (2, 2),
    (2.5, 3); the floor is the chord from (1, 0) to (−1, 0).  Area ½(2 + 4)·2 + ½(4 + 5)·1 = 10.5 m².
    A single zero offset at the keel is kept (a V bottom): (0, 0), (2, 2), (3, 3)."""
    y, z = section_polygon(np.array([0.0, 2.0, 4.0]), np.array([1.0, 2.0, 3.0]), 3.0)
    np.testing.assert_allclose(y, [1.0, 2.0, 2.5, -2.5, -2.0, -1.0])
    np.testing.assert_allclose(z, [0.0, 2.0, 3.0, 3.0, 2.0, 0.0])
    assert polygon_area(y, z) == pytest.approx(10.5, abs=1e-12)
    y, z = section_polygon(np.array([0.0, 2.0, 4.0]), np.array([0.0, 2.0, 4.0]), 3.0)
    np.testing.assert_allclose(y, [0.0, 2.0, 3.0, -3.0, -2.0, -0.0])
    np.testing.assert_allclose(z, [0.0, 2.0, 3.0, 3.0, 2.0, 0.0])


def three_station_hull() -> HullOffsets:
    """Stations 0, 10, 20 m; waterlines 0, 4 m; wall-sided half-breadths 2, 3, 5 m; deck 3, 3.5, 4 m."""
    return HullOffsets(np.array([0.0, 10.0, 20.0]), np.array([0.0, 4.0]),
                       np.array([[2.0, 2.0], [3.0, 3.0], [5.0, 5.0]]), np.array([3.0, 3.5, 4.0]))


def test_offsets_between_and_beyond_the_stations():
    """Linear in x between stations, held at the end stations beyond them."""
    h = three_station_hull()
    hb, deck = offsets_at(h, 15.0)
    np.testing.assert_allclose(hb, [4.0, 4.0])
    assert deck == pytest.approx(3.75)
    hb, deck = offsets_at(h, 2.5)
    np.testing.assert_allclose(hb, [2.25, 2.25])
    assert deck == pytest.approx(3.125)
    for x, row, d in ((20.0, 5.0, 4.0), (25.0, 5.0, 4.0), (0.0, 2.0, 3.0), (-5.0, 2.0, 3.0), (10.0, 3.0, 3.5)):
        hb, deck = offsets_at(h, x)
        np.testing.assert_allclose(hb, [row, row])
        assert deck == pytest.approx(d)
    y, z = hull_section_at(h, 15.0)
    assert polygon_area(y, z) == pytest.approx(8.0 * 3.75)
    ys, zs = hull_sections(h)
    assert ys.shape[0] == 3
    assert [polygon_area(a, b) for a, b in zip(ys, zs)] == pytest.approx([4 * 3.0, 6 * 3.5, 10 * 4.0])


def test_stations_of_box_and_prism_compartments():
    """One section all along: x_from, mid, x_to with Simpson weights h/3·(1, 4, 1), h = half the length."""
    xs, w, rule = compartment_stations(CompartmentShape("box", 2.0, 8.0, -1.0, 1.0, 0.0, 1.0))
    np.testing.assert_allclose(xs, [2.0, 5.0, 8.0])
    np.testing.assert_allclose(w, [1.0, 4.0, 1.0])
    assert rule == "simpson"
    xs, w, rule = compartment_stations(CompartmentShape("hull", 2.0, 8.0, -1.0, 1.0, 0.0, 1.0), None)
    np.testing.assert_allclose(xs, [2.0, 5.0, 8.0])
    assert rule == "simpson"


def test_stations_of_a_hull_compartment_are_cut_at_the_hull_stations():
    """Compartment x 5…25 in a hull with stations 0, 10, 20, 30: pieces 5–10, 10–20, 20–25, each by
    Simpson (1, 4, 1)·length/6; the weights at 10 and 20 collect both neighbours' ends."""
    hull = HullOffsets(np.array([0.0, 10.0, 20.0, 30.0]), np.array([0.0, 4.0]), np.full((4, 2), 2.0), np.full(4, 4.0))
    xs, w, rule = compartment_stations(CompartmentShape("hull", 5.0, 25.0, -5.0, 5.0, 0.0, 4.0), hull)
    assert rule == "simpson between hull stations"
    np.testing.assert_allclose(xs, [5.0, 7.5, 10.0, 15.0, 20.0, 22.5, 25.0])
    np.testing.assert_allclose(w, np.array([5, 20, 5 + 10, 40, 10 + 5, 20, 5]) / 6.0)
    # ends on hull stations: no piece of zero length
    xs, w, _ = compartment_stations(CompartmentShape("hull", 10.0, 20.0, -5.0, 5.0, 0.0, 4.0), hull)
    np.testing.assert_allclose(xs, [10.0, 15.0, 20.0])
    np.testing.assert_allclose(w, np.array([1, 4, 1]) * 10.0 / 6.0)


def test_compartment_polygons():
    """Box: its rectangle, counter-clockwise.  Prism given clockwise: turned round (area positive).
    Hull: the hull section cut to the box limits.  A hull shape without offsets is refused."""
    y, z = compartment_polygon(CompartmentShape("box", 0.0, 1.0, -1.0, 2.0, 0.5, 1.5), None, 0.5)
    np.testing.assert_allclose(y, [-1.0, 2.0, 2.0, -1.0])
    np.testing.assert_allclose(z, [0.5, 0.5, 1.5, 1.5])
    cw = CompartmentShape("prism", 0.0, 1.0, section_y_m=np.array([0.0, 0.0, 4.0]), section_z_m=np.array([0.0, 2.0, 2.0]))
    y, z = compartment_polygon(cw, None, 0.5)
    assert polygon_area(y, z) == pytest.approx(4.0)
    np.testing.assert_allclose(y, [4.0, 0.0, 0.0])
    ccw = CompartmentShape("prism", 0.0, 1.0, section_y_m=np.array([0.0, 4.0, 0.0]), section_z_m=np.array([0.0, 2.0, 2.0]))
    y, z = compartment_polygon(ccw, None, 0.5)
    np.testing.assert_allclose(y, [0.0, 4.0, 0.0])
    h = three_station_hull()
    y, z = compartment_polygon(CompartmentShape("hull", 0.0, 20.0, 1.0, 9.0, 0.5, 9.0), h, 15.0)
    # hull half-breadth 4 at x = 15, deck 3.75: the rectangle y 1…4, z 0.5…3.75
    assert polygon_area(y, z) == pytest.approx(3.0 * 3.25)
    with pytest.raises(ValueError) as ei:
        compartment_polygon(CompartmentShape("hull", 0.0, 20.0, 1.0, 9.0, 0.5, 9.0), None, 15.0)
    assert str(ei.value) == "a hull-shaped compartment needs the hull offsets"
    # a small prism section given counter-clockwise keeps its order (area +0.125 m², not reversed)
    small = CompartmentShape("prism", 0.0, 1.0, section_y_m=np.array([0.0, 0.5, 0.0]),
                             section_z_m=np.array([0.0, 0.0, 0.5]))
    y, z = compartment_polygon(small, None, 0.5)
    np.testing.assert_allclose(y, [0.0, 0.5, 0.0])
    assert polygon_area(y, z) == pytest.approx(0.125)


def test_volume_of_a_hull_compartment_in_a_flaring_hull():
    """Wall-sided hull, half-breadth h(x) linear 2 → 3 → 5 at x 0, 10, 20; compartment x 5…15,
    full width, z 0…2: ∫2h·2 dx = 4·(∫₅¹⁰(2 + 0.1x)dx + ∫₁₀¹⁵(1 + 0.2x)dx) = 4·(13.75 + 17.5) = 125 m³;
    its LCG ∫x·4h dx/125 = 4·(∫₅¹⁰(2x + 0.1x²)dx + ∫₁₀¹⁵(x + 0.2x²)dx)/125 = 4·(75 + 175/6 + 62.5 + 475/3)/125
    = 4·325/125 = 10.4 m."""
    h = three_station_hull()
    body = compartment_body(CompartmentShape("hull", 5.0, 15.0, -10.0, 10.0, 0.0, 2.0), h)
    assert body.rule == "simpson between hull stations"
    im = immerse(body, 1.0, 0.0, 2.0)
    assert float(im.volume_m3) == pytest.approx(125.0, rel=1e-12)
    assert float(im.x_b_m) == pytest.approx(10.4, rel=1e-12)
    xs, y, z, w, rule = compartment_sections(CompartmentShape("hull", 5.0, 15.0, -10.0, 10.0, 0.0, 2.0), h)
    np.testing.assert_allclose(xs, [5.0, 7.5, 10.0, 12.5, 15.0])
    assert y.shape[0] == 5 and z.shape == y.shape
    assert rule == "simpson between hull stations"


def test_section_polygon_starts_at_the_last_zero_offset_whatever_the_first_breadth():
    """Half-breadths 0, 0, 0.5, 2 at z 0…3, deck 3: the hull starts at (0, 1), the last zero offset,
    however small the first breadth above it (0.5 m): area ½(0 + 1)·1 + ½(1 + 4)·1 = 3 m².  With only
    the deck-edge offset non-zero (0, 0, 2 at z 0, 1, 2; deck 2): the triangle (0, 1), (2, 2),
    (−2, 2), area 2 m²."""
    y, z = section_polygon(np.array([0.0, 1.0, 2.0, 3.0]), np.array([0.0, 0.0, 0.5, 2.0]), 3.0)
    np.testing.assert_allclose(z[0], 1.0)
    assert polygon_area(y, z) == pytest.approx(3.0, abs=1e-12)
    y, z = section_polygon(np.array([0.0, 1.0, 2.0]), np.array([0.0, 0.0, 2.0]), 2.0)
    np.testing.assert_allclose(y, [0.0, 2.0, -2.0, -0.0])
    np.testing.assert_allclose(z, [1.0, 2.0, 2.0, 1.0])
    assert polygon_area(y, z) == pytest.approx(2.0, abs=1e-12)


def test_a_prism_in_a_hull_keeps_its_three_stations():
    """A prism has one section all along, so even inside a hull with stations it takes the three
    stations x_from, mid, x_to and Simpson's rule (hull.compartment_stations docstring)."""
    hull = HullOffsets(np.array([0.0, 10.0, 20.0, 30.0]), np.array([0.0, 4.0]), np.full((4, 2), 2.0), np.full(4, 4.0))
    shape = CompartmentShape("prism", 5.0, 25.0, section_y_m=np.array([0.0, 1.0, 0.0]),
                             section_z_m=np.array([0.0, 0.0, 1.0]))
    xs, w, rule = compartment_stations(shape, hull)
    np.testing.assert_allclose(xs, [5.0, 15.0, 25.0])
    np.testing.assert_allclose(w, np.array([1.0, 4.0, 1.0]) * 10.0 / 3.0)
    assert rule == "simpson"


def test_a_hull_station_close_to_a_compartment_end_is_still_a_cut():
    """Compartment x 9.5…20.5 in a hull with stations 0, 10, 20, 30: the stations 10 and 20, half a
    metre inside its ends, still cut it (the offsets kink there): pieces 9.5–10, 10–20, 20–20.5."""
    hull = HullOffsets(np.array([0.0, 10.0, 20.0, 30.0]), np.array([0.0, 4.0]), np.full((4, 2), 2.0), np.full(4, 4.0))
    xs, w, _ = compartment_stations(CompartmentShape("hull", 9.5, 20.5, -5.0, 5.0, 0.0, 4.0), hull)
    np.testing.assert_allclose(xs, [9.5, 9.75, 10.0, 15.0, 20.0, 20.25, 20.5])
    np.testing.assert_allclose(w, np.array([0.5, 2.0, 0.5 + 10.0, 40.0, 10.0 + 0.5, 2.0, 0.5]) / 6.0)
