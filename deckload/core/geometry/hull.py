"""Offset table → section polygons; compartments (tanks, holds) → section polygons.

A hull section is the polygon through the offsets of one station: up the
starboard side through (half-breadth, waterline) points, across a flat weather
deck at the station's deck height, and down the port side (counter-clockwise seen
from aft, y to starboard, z up).  Waterlines above the deck are ignored; the
half-breadth at the deck is interpolated linearly between the waterlines either
side of it.  The body is closed at the weather deck: the shell and the weather
deck are taken as watertight; superstructures, deckhouses, hatch coamings,
bulwarks and camber are not part of the buoyant body.

Between stations every offset (and the deck height) varies linearly with x.
"""

from __future__ import annotations

import numpy as np

from deckload.core.geometry.body import Body
from deckload.core.geometry.sections import clip_to_box, pad_polygons, polygon_area
from deckload.core.geometry.spec import CompartmentShape, HullOffsets


def section_polygon(waterline_z_m: np.ndarray, half_breadth_m: np.ndarray, deck_z_m: float) -> tuple[np.ndarray, np.ndarray]:
    """The closed section polygon (y, z) of one station, counter-clockwise."""
    zw = np.asarray(waterline_z_m, dtype=float)
    hb = np.asarray(half_breadth_m, dtype=float)
    below = zw < deck_z_m
    z_side = np.append(zw[below], deck_z_m)
    y_side = np.append(hb[below], float(np.interp(deck_z_m, zw, hb)))
    # where the hull does not reach down to the lowest waterlines (rising run, raked
    # stem) start at the last zero offset: the section's true lowest point
    nz = np.flatnonzero(y_side > 0.0)
    if len(nz) and nz[0] > 1:
        z_side = z_side[nz[0] - 1:]
        y_side = y_side[nz[0] - 1:]
    y = np.concatenate([y_side, -y_side[::-1]])
    z = np.concatenate([z_side, z_side[::-1]])
    return y, z


def offsets_at(hull: HullOffsets, x_m: float) -> tuple[np.ndarray, float]:
    """Half-breadths (per waterline) and deck height at any x inside the stations (linear in x)."""
    xs = hull.station_x_m
    i = int(np.clip(np.searchsorted(xs, x_m, side="right") - 1, 0, len(xs) - 2))
    f = (x_m - xs[i]) / (xs[i + 1] - xs[i])
    f = min(max(f, 0.0), 1.0)
    hb = hull.half_breadth_m[i] * (1.0 - f) + hull.half_breadth_m[i + 1] * f
    deck = float(hull.deck_z_m[i] * (1.0 - f) + hull.deck_z_m[i + 1] * f)
    return hb, deck


def hull_sections(hull: HullOffsets) -> tuple[np.ndarray, np.ndarray]:
    """All station polygons as padded arrays of shape (stations, vertices)."""
    polys = [
        section_polygon(hull.waterline_z_m, hull.half_breadth_m[i], float(hull.deck_z_m[i]))
        for i in range(len(hull.station_x_m))
    ]
    return pad_polygons(polys)


def hull_section_at(hull: HullOffsets, x_m: float) -> tuple[np.ndarray, np.ndarray]:
    """The hull section polygon at any x within the stations."""
    hb, deck = offsets_at(hull, x_m)
    return section_polygon(hull.waterline_z_m, hb, deck)


PANELS_PER_PIECE = 1
"""Simpson panels between neighbouring hull stations, for hull-shaped compartments."""


def compartment_stations(shape: CompartmentShape, hull: HullOffsets | None = None) -> tuple[np.ndarray, np.ndarray, str]:
    """Sub-stations along a compartment and their integration weights.

    Boxes and prisms have one section all along: three stations and Simpson's rule
    integrate them exactly.  A hull-shaped compartment is cut at every hull station
    inside it, and each piece is integrated by composite Simpson's rule over
    :data:`PANELS_PER_PIECE` panels: between hull stations the offsets are linear in
    x, so the section properties are smooth there and the kinks at the stations fall
    on piece ends (a free surface meeting a rising bottom still kinks inside a piece;
    one panel per piece already agrees with an independent mesh reference far within
    the UR L5 2 % tolerances, tests/test_geometry_trimesh.py).
    """
    if shape.shape in ("box", "prism") or hull is None:
        xs = np.linspace(shape.x_from_m, shape.x_to_m, 3)
        h = (shape.x_to_m - shape.x_from_m) / 2.0
        return xs, np.array([h / 3.0, 4.0 * h / 3.0, h / 3.0]), "simpson"
    st = hull.station_x_m
    inner = st[(st > shape.x_from_m + 1e-9) & (st < shape.x_to_m - 1e-9)]
    ends = np.concatenate([[shape.x_from_m], inner, [shape.x_to_m]])
    k = PANELS_PER_PIECE
    frac = np.linspace(0.0, 1.0, 2 * k + 1)
    simpson = np.ones(2 * k + 1)
    simpson[1::2] = 4.0
    simpson[2:-1:2] = 2.0
    xs = [ends[0]]
    w = [0.0]
    for a, b in zip(ends[:-1], ends[1:]):
        piece_w = simpson * (b - a) / (6.0 * k)
        w[-1] += piece_w[0]
        xs.extend((a + frac[1:] * (b - a)).tolist())
        w.extend(piece_w[1:].tolist())
    xs = np.array(xs)
    w = np.array(w)
    return xs, w, "simpson between hull stations"


def compartment_polygon(shape: CompartmentShape, hull: HullOffsets | None, x_m: float) -> tuple[np.ndarray, np.ndarray]:
    """Section polygon of a compartment at x: box, prism, or hull ∩ box."""
    if shape.shape == "box":
        y = np.array([shape.y_from_m, shape.y_to_m, shape.y_to_m, shape.y_from_m])
        z = np.array([shape.z_from_m, shape.z_from_m, shape.z_to_m, shape.z_to_m])
        return y, z
    if shape.shape == "prism":
        y = np.asarray(shape.section_y_m, dtype=float)
        z = np.asarray(shape.section_z_m, dtype=float)
        if polygon_area(y, z) < 0.0:
            y, z = y[::-1], z[::-1]
        return y, z
    if hull is None:
        raise ValueError("a hull-shaped compartment needs the hull offsets")
    hy, hz = hull_section_at(hull, x_m)
    return clip_to_box(hy, hz, shape.y_from_m, shape.y_to_m, shape.z_from_m, shape.z_to_m)


def compartment_sections(
    shape: CompartmentShape, hull: HullOffsets | None
) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray, str]:
    """Stations, padded section polygons and integration weights of a compartment:
    (x (n,), y (n, V), z (n, V), weights (n,), rule)."""
    xs, w, rule = compartment_stations(shape, hull)
    polys = [compartment_polygon(shape, hull, float(x)) for x in xs]
    y, z = pad_polygons(polys)
    return xs, y, z, w, rule


def compartment_body(shape: CompartmentShape, hull: HullOffsets | None) -> Body:
    """A compartment as a :class:`Body` ready for calibration and fluid transfer."""
    return Body(*compartment_sections(shape, hull))
