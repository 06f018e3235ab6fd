"""Lateral windage and the deck-edge point, from the geometry, for the weather criterion.

* The lateral profile is a closed outline (x, z) of the vessel seen from the side: hull,
  bulwarks, superstructures, deckhouses and anything else that catches the wind.  At a
  draft T the windage area A (IS 2008 Part A 2.3.2.2) is the part of the outline above
  z = T (Sutherland–Hodgman clip, shoelace area), and its centre's height above the
  waterline is z̄ − T with z̄ = ∫z dA / A (polygon centroid formula).
* Lwl is the length over which the hull offsets at z = T are non-zero, with the ends
  placed where the offsets fall to zero between stations (linear in x).
* The deck-edge point at midships is (LBP/2, half breadth at the deck, deck height).
"""

from __future__ import annotations

import numpy as np

from deckload.core.geometry.hull import offsets_at
from deckload.core.geometry.sections import clip_polygon, polygon_area
from deckload.core.geometry.spec import HullOffsets


def polygon_centroid_z(x: np.ndarray, z: np.ndarray) -> float:
    """z of the centroid of a simple polygon: Σ (z_i + z_j)(x_i z_j − x_j z_i) / (6A)."""
    xj, zj = np.roll(x, -1), np.roll(z, -1)
    cross = x * zj - xj * z
    a = 0.5 * float(np.sum(cross))
    return float(np.sum((z + zj) * cross)) / (6.0 * a)


def windage_above(x: np.ndarray, z: np.ndarray, draft_m: float) -> tuple[float, float]:
    """(area m², height of its centre above the waterline m) of the outline above z = draft."""
    cx, cz = clip_polygon(np.asarray(x, float), np.asarray(z, float), 0.0, -1.0, -draft_m)
    area = abs(polygon_area(cx, cz))
    if area <= 0.0:
        return 0.0, 0.0
    return area, polygon_centroid_z(cx, cz) - draft_m


def waterline_length_m(hull: HullOffsets, draft_m: float) -> float:
    """Length of the waterline at an even-keel draft, from the stations' half-breadths at that height."""
    xs = hull.station_x_m
    hb = np.array([np.interp(draft_m, hull.waterline_z_m, row) for row in hull.half_breadth_m])
    wet = np.flatnonzero(hb > 0.0)
    if len(wet) == 0:
        return 0.0
    i0, i1 = int(wet[0]), int(wet[-1])
    x0 = xs[i0] if i0 == 0 else xs[i0 - 1] + (xs[i0] - xs[i0 - 1]) * (0.0 - hb[i0 - 1]) / (hb[i0] - hb[i0 - 1])
    x1 = xs[i1] if i1 == len(xs) - 1 else xs[i1] + (xs[i1 + 1] - xs[i1]) * hb[i1] / (hb[i1] - hb[i1 + 1])
    return float(x1 - x0)


def deck_edge_point(hull: HullOffsets, x_m: float) -> tuple[float, float, float]:
    """(x, y, z) of the deck edge at a station: half breadth at the deck height (starboard)."""
    hb, deck = offsets_at(hull, x_m)
    return x_m, float(np.interp(deck, hull.waterline_z_m, hb)), deck
