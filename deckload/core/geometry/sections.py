"""Plane sections cut by an inclined waterline: area, moments and the waterline chord.

Every body in deckload's geometry (hull, tank, hold) is a stack of plane sections
(polygons in the y–z plane at stations along x).  Floating at heel θ (positive to
starboard) the water surface, seen in one section, is a straight line.  We work
in the *heeled frame* of that section:

    η = y·cosθ + z·sinθ        horizontal, towards the low (starboard) side
    ζ = −y·sinθ + z·cosθ       vertical, up

so that the water occupies ζ ≤ c.  KN is then simply the η of the centre of
buoyancy (checks.md conventions: KN = y_B·cosθ + z_B·sinθ).

Clipping without rebuilding the polygon
---------------------------------------
Sutherland–Hodgman clipping of a polygon by the half-plane ζ ≤ c keeps the inside
part of every edge and joins the pieces with segments that lie *on* the line
ζ = c (Sutherland & Hodgman, "Reentrant polygon clipping", CACM 17(1), 1974).
By Green's theorem every integral we need can be written as a line integral in
dζ only:

    A   = ∬ dA   = ∮ η dζ
    Qη  = ∬ η dA = ∮ ½η² dζ
    Qζ  = ∬ ζ dA = ∮ η·ζ dζ

and along the joining segments dζ = 0, so they contribute nothing.  It is
therefore enough to clip each edge to ζ ≤ c on its own and sum closed-form
segment integrals (linear η, ζ along a segment, integrated exactly):

    ∫ η dζ     = Δζ·(ηa + ηb)/2
    ∫ ½η² dζ   = Δζ·(ηa² + ηa·ηb + ηb²)/6
    ∫ η·ζ dζ   = Δζ·(2ηa·ζa + ηa·ζb + ηb·ζa + 2ηb·ζb)/6

This is exact for polygons, convex or not, and runs on whole arrays of sections
at once (numpy), which is what makes the tables fast.

The waterline chord (the section's cut through the water surface) is found from
the edges that cross ζ = c: each crossing at η_k, signed +1 for an edge going up
and −1 for one going down, gives (for a counter-clockwise polygon)

    chord length       L  = Σ s_k·η_k
    first moment       m1 = Σ s_k·η_k²/2      (∫ η ds over the chord)
    second moment      m2 = Σ s_k·η_k³/3      (∫ η² ds over the chord)

An edge counts as crossing when exactly one end has ζ ≤ c (a half-open rule), so a
vertex lying on the line is counted once and a horizontal edge lying on it is the
limit from above.
"""

from __future__ import annotations

import numpy as np

from deckload.core.frozen import frozen


@frozen(eq=False)
class SectionCut:
    """Moments of sections clipped to ζ ≤ c, in the heeled frame.  All arrays share one shape."""

    area_m2: np.ndarray
    """Submerged area of each section (m²)."""
    q_eta_m3: np.ndarray
    """First moment ∬ η dA (m³)."""
    q_zeta_m3: np.ndarray
    """First moment ∬ ζ dA (m³)."""
    chord_m: np.ndarray
    """Length of the waterline chord (m)."""
    chord_m1_m2: np.ndarray
    """∫ η ds over the chord (m²)."""
    chord_m2_m3: np.ndarray
    """∫ η² ds over the chord (m³)."""


def polygon_edges(y: np.ndarray, z: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """Start and end points of each closed polygon's edges (last vertex joins the first)."""
    return y, z, np.roll(y, -1, axis=-1), np.roll(z, -1, axis=-1)


@frozen(eq=False)
class HeeledEdges:
    """Every section edge in the heeled frame of its case, (η, ζ) from start a to end b.

    What cutting at any level shares: a search for the level at one heel turns the sections
    into that heel once (:func:`heeled_edges`) and then cuts them at each trial level
    (:func:`area_chord_below`), instead of turning them again at every step."""

    e0: np.ndarray
    z0: np.ndarray
    e1: np.ndarray
    z1: np.ndarray
    de: np.ndarray
    """e1 − e0."""
    dz_safe: np.ndarray
    """z1 − z0, with 1 where the edge is level (it never crosses a level: no division by 0)."""
    rising: np.ndarray
    """sign(z1 − z0): +1 for an edge going up, −1 going down, 0 level."""


def heeled_edges(y: np.ndarray, z: np.ndarray, cos_t: np.ndarray | float, sin_t: np.ndarray | float) -> HeeledEdges:
    """The edges of section polygons ``y``, ``z`` (..., V) turned into heel (cos_t, sin_t) (...):
    η = y·cosθ + z·sinθ, ζ = z·cosθ − y·sinθ (module docstring)."""
    ct = np.asarray(cos_t, dtype=float)[..., None]
    st = np.asarray(sin_t, dtype=float)[..., None]
    e0, z0, e1, z1 = polygon_edges(y * ct + z * st, z * ct - y * st)
    dz = z1 - z0
    return HeeledEdges(e0, z0, e1, z1, e1 - e0, np.where(dz == 0.0, 1.0, dz), np.sign(dz))


def cut_sections(
    y: np.ndarray,
    z: np.ndarray,
    cos_t: np.ndarray | float,
    sin_t: np.ndarray | float,
    c: np.ndarray | float,
) -> SectionCut:
    """Clip counter-clockwise section polygons to the water side ζ ≤ c and integrate.

    ``y``, ``z``: vertices, shape (..., V); polygons with fewer vertices are padded
    by repeating their last vertex (a zero-length edge adds nothing).
    ``cos_t``, ``sin_t``, ``c`` broadcast against the leading shape (...).
    Formulas in the module docstring.
    """
    edges = heeled_edges(y, z, cos_t, sin_t)
    cross, ex, ea, za, eb, zb, d = _clipped_edges(edges, c)
    area = np.sum(d * (ea + eb), axis=-1) * 0.5
    q_eta = np.sum(d * (ea * ea + ea * eb + eb * eb), axis=-1) / 6.0
    q_zeta = np.sum(d * (2.0 * ea * za + ea * zb + eb * za + 2.0 * eb * zb), axis=-1) / 6.0
    s = np.where(cross, edges.rising, 0.0)
    exs = np.where(cross, ex, 0.0)
    chord = np.sum(s * exs, axis=-1)
    m1 = np.sum(s * exs * exs, axis=-1) * 0.5
    m2 = np.sum(s * exs * exs * exs, axis=-1) / 3.0
    return SectionCut(area, q_eta, q_zeta, chord, m1, m2)


def area_chord_below(edges: HeeledEdges, c: np.ndarray | float) -> tuple[np.ndarray, np.ndarray]:
    """Submerged area and waterline chord of turned sections below the level ζ = c, as
    :func:`cut_sections` computes them (the same operations on the same values)."""
    cross, ex, ea, _, eb, _, d = _clipped_edges(edges, c)
    area = np.sum(d * (ea + eb), axis=-1) * 0.5
    chord = np.sum(np.where(cross, edges.rising * ex, 0.0), axis=-1)
    return area, chord


def _clipped_edges(edges: HeeledEdges, c: np.ndarray | float):
    """Each edge clipped on its own to the water side ζ ≤ c (module docstring): whether it crosses
    the level, the crossing's η, the clipped segment's ends a → b (η, ζ) and its Δζ (0 for an edge
    wholly above the water)."""
    cc = np.asarray(c, dtype=float)[..., None]
    e0, z0, e1, z1 = edges.e0, edges.z0, edges.e1, edges.z1
    in0 = z0 <= cc
    in1 = z1 <= cc
    t = (cc - z0) / edges.dz_safe
    ex = e0 + t * edges.de  # crossing point (meaningful only where in0 != in1)
    ea = np.where(in0, e0, ex)
    za = np.where(in0, z0, cc)
    eb = np.where(in1, e1, ex)
    zb = np.where(in1, z1, cc)
    d = np.where(in0 | in1, zb - za, 0.0)
    return in0 != in1, ex, ea, za, eb, zb, d


def cut_area_chord(
    y: np.ndarray,
    z: np.ndarray,
    cos_t: np.ndarray | float,
    sin_t: np.ndarray | float,
    c: np.ndarray | float,
) -> tuple[np.ndarray, np.ndarray]:
    """Submerged area and waterline chord only, as :func:`cut_sections` computes them.

    What the search for a level needs (volume and its derivative, the waterplane area),
    at about half the work of the full set of moments."""
    return area_chord_below(heeled_edges(y, z, cos_t, sin_t), c)


def clip_polygon(y: np.ndarray, z: np.ndarray, ny: float, nz: float, c: float) -> tuple[np.ndarray, np.ndarray]:
    """Sutherland–Hodgman: the part of one polygon with ny·y + nz·z ≤ c (vertex lists).

    Used to cut hull sections down to a compartment (between planes); the
    floating computations use :func:`cut_sections`, which never builds polygons.
    Returns empty arrays when nothing is left.
    """
    n = len(y)
    if n == 0:
        return y, z
    # Plain floats in the loop: indexing a numpy array gives a numpy scalar, whose arithmetic costs
    # some ten times a float's (hull-shaped compartments clip every section four times).  The
    # values and the operations are the same IEEE doubles, so the result is bit for bit the same.
    ya = np.asarray(y, dtype=float)
    za = np.asarray(z, dtype=float)
    f = (ny * ya + nz * za - c).tolist()
    ys, zs = ya.tolist(), za.tolist()
    out_y: list[float] = []
    out_z: list[float] = []
    for i in range(n):
        j = i + 1 if i + 1 < n else 0
        fi, fj = f[i], f[j]
        if fi <= 0.0:
            out_y.append(ys[i])
            out_z.append(zs[i])
        if (fi <= 0.0) != (fj <= 0.0):
            t = fi / (fi - fj)
            out_y.append(ys[i] + t * (ys[j] - ys[i]))
            out_z.append(zs[i] + t * (zs[j] - zs[i]))
    return np.array(out_y), np.array(out_z)


def clip_to_box(
    y: np.ndarray, z: np.ndarray, y_lo: float, y_hi: float, z_lo: float, z_hi: float
) -> tuple[np.ndarray, np.ndarray]:
    """The part of a polygon inside y_lo ≤ y ≤ y_hi, z_lo ≤ z ≤ z_hi (four half-planes)."""
    for ny, nz, c in ((1.0, 0.0, y_hi), (-1.0, 0.0, -y_lo), (0.0, 1.0, z_hi), (0.0, -1.0, -z_lo)):
        y, z = clip_polygon(y, z, ny, nz, c)
        if len(y) == 0:
            break
    return y, z


def polygon_area(y: np.ndarray, z: np.ndarray) -> float:
    """Shoelace area (positive for counter-clockwise)."""
    if len(y) < 3:
        return 0.0
    return 0.5 * float(np.sum(y * np.roll(z, -1) - np.roll(y, -1) * z))


def pad_polygons(polys: list[tuple[np.ndarray, np.ndarray]]) -> tuple[np.ndarray, np.ndarray]:
    """Stack polygons of unequal vertex counts into (n, Vmax) arrays, repeating last vertices.

    An empty polygon becomes a single point at the origin repeated (zero area).
    """
    vmax = max(1, max((len(p[0]) for p in polys), default=1))
    ys = np.zeros((len(polys), vmax))
    zs = np.zeros((len(polys), vmax))
    for i, (py, pz) in enumerate(polys):
        k = len(py)
        if k == 0:
            continue
        ys[i, :k] = py
        zs[i, :k] = pz
        ys[i, k:] = py[-1]
        zs[i, k:] = pz[-1]
    return ys, zs


def simpson_weights(x: np.ndarray) -> tuple[np.ndarray, str]:
    """Integration weights along stations: Simpson's first rule when the stations are
    equally spaced and their number is odd (≥ 3), else the trapezoidal rule.

    Returns ``(w, rule)`` with ∫ f dx ≈ Σ w_i f_i and rule 'simpson' or 'trapezoid'.
    Simpson: w = h/3·(1, 4, 2, 4, …, 2, 4, 1) (any numerical-analysis text).
    """
    x = np.asarray(x, dtype=float)
    n = len(x)
    if n < 2:
        return np.zeros(n), "trapezoid"
    h = np.diff(x)
    if n >= 3 and n % 2 == 1 and np.allclose(h, h[0], rtol=1e-9, atol=1e-12):
        w = np.full(n, 2.0)
        w[1::2] = 4.0
        w[0] = w[-1] = 1.0
        return w * h[0] / 3.0, "simpson"
    w = np.zeros(n)
    w[:-1] += h / 2.0
    w[1:] += h / 2.0
    return w, "trapezoid"
