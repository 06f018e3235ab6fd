"""Windage area and its centre, waterline length and the deck-edge point (core/geometry/windage.py),
against closed forms worked here by hand.

* Centroid of a triangle: the mean of its vertices (any geometry text); of a trapezoid: split
  into a rectangle and a triangle, area-weighted mean of their centroids.
* Lwl: the offsets vary linearly in x between stations (hull.py docstring), so the waterline
  at draft T ends where the half-breadth at T falls to zero; a station whose half-breadth at T
  is zero is that end.
* Deck edge at x: the half-breadth at the deck height there, both linear in x between stations
  and linear in z between waterlines (hull.py docstring).
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.geometry.spec import HullOffsets
from deckload.core.geometry.windage import (
    deck_edge_point,
    polygon_centroid_z,
    waterline_length_m,
    windage_above,
)


def test_centroid_of_a_triangle_either_way_round():
    """Triangle (0, 0), (6, 0), (0, 3): centroid z = (0 + 0 + 3)/3 = 1, whatever the orientation
    (the signed area divides the signed moment); shifted up 2 m it is 3."""
    x = np.array([0.0, 6.0, 0.0])
    z = np.array([0.0, 0.0, 3.0])
    assert polygon_centroid_z(x, z) == pytest.approx(1.0, abs=1e-12)
    assert polygon_centroid_z(x[::-1], z[::-1]) == pytest.approx(1.0, abs=1e-12)
    assert polygon_centroid_z(x, z + 2.0) == pytest.approx(3.0, abs=1e-12)
    # a right triangle with its apex high: (0, 1), (4, 1), (4, 7): (1 + 1 + 7)/3 = 3
    assert polygon_centroid_z(np.array([0.0, 4.0, 4.0]), np.array([1.0, 1.0, 7.0])) == pytest.approx(3.0, abs=1e-12)


def test_windage_of_a_sheered_outline():
    """Outline x 0…20, bottom z = 0, top rising from 3 (at x = 20) to 5 (at x = 0): above T = 1
    it is a 20 × 2 rectangle (centre 1 m above the waterline, 40 m²) and the triangle
    (0, 3), (20, 3), (0, 5) (20 m², centre 3 + 2/3 − 1 = 8/3 m above): A = 60 m²,
    centre (40·1 + 20·8/3)/60 = 14/9 m above the waterline.  Either orientation gives the same."""
    x = np.array([0.0, 20.0, 20.0, 0.0])
    z = np.array([0.0, 0.0, 3.0, 5.0])
    area, h = windage_above(x, z, 1.0)
    assert area == pytest.approx(60.0, abs=1e-9)
    assert h == pytest.approx(14.0 / 9.0, abs=1e-9)
    area2, h2 = windage_above(x[::-1], z[::-1], 1.0)
    assert (area2, h2) == pytest.approx((60.0, 14.0 / 9.0), abs=1e-9)
    # above T = 4 only the triangle (0, 4), (10, 4), (0, 5) is left: 5 m², centre 1/3 m above
    area, h = windage_above(x, z, 4.0)
    assert area == pytest.approx(5.0, abs=1e-9)
    assert h == pytest.approx(1.0 / 3.0, abs=1e-9)
    # above T = 4.6 a sliver: the triangle (0, 4.6), (4, 4.6), (0, 5), 0.8 m², centre 0.4/3 m above
    area, h = windage_above(x, z, 4.6)
    assert area == pytest.approx(0.8, abs=1e-9)
    assert h == pytest.approx(0.4 / 3.0, abs=1e-9)


def test_no_windage_above_the_outline():
    """Nothing of the outline above the waterline: no area and no lever (not a division by zero)."""
    x = np.array([0.0, 20.0, 20.0, 0.0])
    z = np.array([0.0, 0.0, 3.0, 3.0])
    assert windage_above(x, z, 3.0) == (0.0, 0.0)
    assert windage_above(x, z, 3.5) == (0.0, 0.0)


def fine_ended_hull() -> HullOffsets:
    """Seven stations 5 m apart.  Stations 0 and 6 are dry below z = 4; stations 1 and 5 are dry
    below z = 2 and 2 m wide (half-breadth) at z = 4; stations 2–4 are 3 m at every waterline."""
    xs = np.arange(7) * 5.0
    zw = np.array([0.0, 2.0, 4.0, 6.0])
    end = [0.0, 0.0, 0.0, 1.0]
    near = [0.0, 0.0, 2.0, 2.0]
    mid = [3.0, 3.0, 3.0, 3.0]
    hb = np.array([end, near, mid, mid, mid, near, end])
    return HullOffsets(xs, zw, hb, np.full(7, 6.0))


def test_waterline_length_ends_where_the_offsets_fall_to_zero():
    """At T = 1 stations 2–4 are wet and 1, 5 dry: the waterline runs x 5…25, Lwl = 20 m.
    At T = 3 stations 1–5 are wet (half-breadth 1 m) and 0, 6 dry: x 0…30, Lwl = 30 m.
    At T = 5 every station is wet: the stations' span, 30 m.  At T = 0 on a hull whose every
    station is dry at the keel there is no waterline: 0."""
    hull = fine_ended_hull()
    assert waterline_length_m(hull, 1.0) == pytest.approx(20.0, abs=1e-12)
    assert waterline_length_m(hull, 3.0) == pytest.approx(30.0, abs=1e-12)
    assert waterline_length_m(hull, 5.0) == pytest.approx(30.0, abs=1e-12)
    dry = HullOffsets(hull.station_x_m, hull.waterline_z_m, np.vstack([hull.half_breadth_m[:2]] * 3 + [hull.half_breadth_m[:1]]),
                      hull.deck_z_m)
    assert waterline_length_m(dry, 0.0) == 0.0


def test_waterline_length_with_wet_end_stations():
    """Wet first and last stations: the waterline ends at the stations themselves (no taper
    beyond them): Lwl = 30 m; wet only from station 0 to 2 (a hull cut square aft): 15 m."""
    xs = np.arange(7) * 5.0
    zw = np.array([0.0, 4.0])
    hb = np.array([[2.0, 2.0]] * 3 + [[0.0, 1.0]] * 4)
    hull = HullOffsets(xs, zw, hb, np.full(7, 4.0))
    # at T = 1 stations 0–2 are wet (2 m), 3–6 have 0.25 m: all wet
    assert waterline_length_m(hull, 1.0) == pytest.approx(30.0, abs=1e-12)
    hb2 = np.array([[2.0, 2.0]] * 3 + [[0.0, 0.0]] * 4)
    assert waterline_length_m(HullOffsets(xs, zw, hb2, np.full(7, 4.0)), 1.0) == pytest.approx(15.0, abs=1e-12)
    hb3 = np.array([[0.0, 0.0]] * 4 + [[2.0, 2.0]] * 3)
    assert waterline_length_m(HullOffsets(xs, zw, hb3, np.full(7, 4.0)), 1.0) == pytest.approx(15.0, abs=1e-12)
    # only the aftmost station dry: x 0…30; only the foremost station wet: x 25…30
    hb4 = np.array([[0.0, 0.0]] + [[2.0, 2.0]] * 6)
    assert waterline_length_m(HullOffsets(xs, zw, hb4, np.full(7, 4.0)), 1.0) == pytest.approx(30.0, abs=1e-12)
    hb5 = np.array([[0.0, 0.0]] * 6 + [[2.0, 2.0]])
    assert waterline_length_m(HullOffsets(xs, zw, hb5, np.full(7, 4.0)), 1.0) == pytest.approx(5.0, abs=1e-12)
    hb6 = np.array([[2.0, 2.0]] + [[0.0, 0.0]] * 6)
    assert waterline_length_m(HullOffsets(xs, zw, hb6, np.full(7, 4.0)), 1.0) == pytest.approx(5.0, abs=1e-12)


def test_deck_edge_point_interpolates_in_x_and_z():
    """Stations x = 0 and 10 m, waterlines z = 0, 2, 4 m.  Half-breadths [2, 3, 3.5] at x = 0 and
    [4, 5, 5.5] at x = 10; deck 3 m at x = 0 and 3.5 m at x = 10.  At x = 4: offsets
    [2.8, 3.8, 4.3], deck 3.2 m, so the deck edge is at y = 3.8 + 0.6·(4.3 − 3.8) = 4.1 m."""
    hull = HullOffsets(np.array([0.0, 10.0]), np.array([0.0, 2.0, 4.0]),
                       np.array([[2.0, 3.0, 3.5], [4.0, 5.0, 5.5]]), np.array([3.0, 3.5]))
    x, y, z = deck_edge_point(hull, 4.0)
    assert x == 4.0
    assert y == pytest.approx(4.1, abs=1e-12)
    assert z == pytest.approx(3.2, abs=1e-12)
