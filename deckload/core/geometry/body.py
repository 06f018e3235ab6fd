"""A body as a stack of sections, and its volume and moments below a plane.

The plane is given, in each section's heeled frame (see
:mod:`deckload.core.geometry.sections`), by the level ``c_i = c0 − (x_i − x_ref)·t``
with t = tan ψ, ψ the trim angle (positive by the stern: the plane sits lower
towards the bow).  Along x the section quantities are integrated with the
weights of :func:`~deckload.core.geometry.sections.simpson_weights` (Simpson's
first rule when the stations are equally spaced and odd in number, else the
trapezoidal rule; :attr:`Body.rule` says which).
"""

from __future__ import annotations

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.geometry.sections import HeeledEdges, area_chord_below, cut_sections, heeled_edges, simpson_weights


@frozen(eq=False)
class Body:
    """A hull or a compartment as sections: station positions and the closed outline of each section."""

    x_m: np.ndarray
    """Station positions (m from AP)."""
    y_m: np.ndarray
    """Section vertices y (m), shape (stations, vertices), counter-clockwise."""
    z_m: np.ndarray
    """Section vertices z (m), same shape."""
    weights: np.ndarray | None = None
    """Integration weights along x; by default from :func:`simpson_weights`."""
    rule: str = ""
    """'simpson', 'trapezoid', or the rule that came with given weights."""

    def __post_init__(self) -> None:
        if self.weights is None:
            w, rule = simpson_weights(self.x_m)
            object.__setattr__(self, "weights", w)
            object.__setattr__(self, "rule", rule)

    @property
    def z_min_m(self) -> float:
        """Lowest point of the sections that have area (zero-area sections are ignored)."""
        return float(np.min(self.z_m[self._solid]))

    @property
    def z_max_m(self) -> float:
        """Highest point of the sections that have area."""
        return float(np.max(self.z_m[self._solid]))

    @property
    def _solid(self) -> np.ndarray:
        a = 0.5 * np.sum(self.y_m * np.roll(self.z_m, -1, axis=1) - np.roll(self.y_m, -1, axis=1) * self.z_m, axis=1)
        solid = a > 1e-12
        return solid if np.any(solid) else np.ones_like(solid)

    def zeta_range(self, cos_t: np.ndarray, sin_t: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Lowest and highest ζ of each station's vertices, for heels (...): shapes (..., S)."""
        ct = np.asarray(cos_t, dtype=float)[..., None, None]
        st = np.asarray(sin_t, dtype=float)[..., None, None]
        zeta = self.z_m * ct - self.y_m * st
        return zeta.min(axis=-1), zeta.max(axis=-1)


@frozen(eq=False)
class Immersion:
    """Integrated quantities of the part of a body below a plane; arrays of the case shape."""

    volume_m3: np.ndarray
    x_b_m: np.ndarray
    """Longitudinal centroid of the immersed volume (m from AP)."""
    eta_b_m: np.ndarray
    """Centroid η = y·cosθ + z·sinθ (m): KN when the body is the hull."""
    zeta_b_m: np.ndarray
    """Centroid ζ = −y·sinθ + z·cosθ (m)."""
    wp_area_m2: np.ndarray
    """Area of the cut (waterplane), measured in the heeled section frame (m²)."""
    wp_x_m3: np.ndarray
    """∫ chord·x dx (m³)."""
    wp_xx_m4: np.ndarray
    """∫ chord·x² dx (m⁴)."""
    wp_eta_m3: np.ndarray
    """∫∫ η dA over the cut (m³)."""
    wp_etaeta_m4: np.ndarray
    """∫∫ η² dA over the cut (m⁴)."""
    wp_xref_m3: np.ndarray
    """∫ chord·(x − x_ref) dx, with the x_ref the levels were given about (m³)."""
    wp_c_m3: np.ndarray
    """∫ chord·c dx (m³): rate of the ζ-moment with the level."""
    wp_cxref_m4: np.ndarray
    """∫ chord·c·(x − x_ref) dx (m⁴)."""
    wp_xxref_m4: np.ndarray
    """∫ chord·x·(x − x_ref) dx (m⁴)."""


_CHUNK_ELEMENTS = 40_000
"""Cases are processed in chunks of about this many section vertices, so that the
temporaries stay in the processor cache (about five times faster than one big pass)."""

_FIELDS = (
    "volume_m3", "x_b_m", "eta_b_m", "zeta_b_m", "wp_area_m2", "wp_x_m3", "wp_xx_m4", "wp_eta_m3",
    "wp_etaeta_m4", "wp_xref_m3", "wp_c_m3", "wp_cxref_m4", "wp_xxref_m4",
)


def immerse(body: Body, cos_t, sin_t, c0, t=0.0, x_ref_m: float = 0.0) -> Immersion:
    """Volume and moments of ``body`` below the plane (c0, t) at heel (cos_t, sin_t).

    ``cos_t``, ``sin_t``, ``c0``, ``t`` broadcast to one case shape (...).
    Volume ∇ = Σ wᵢ·Aᵢ, centroid x = Σ wᵢ·xᵢ·Aᵢ/∇, η = Σ wᵢ·Qηᵢ/∇, ζ = Σ wᵢ·Qζᵢ/∇.
    """
    cos_t, sin_t, c0, t = np.broadcast_arrays(
        np.asarray(cos_t, dtype=float), np.asarray(sin_t, dtype=float),
        np.asarray(c0, dtype=float), np.asarray(t, dtype=float),
    )
    shape = cos_t.shape
    ct, st, cf, tf = (a.reshape(-1) for a in (cos_t, sin_t, c0, t))
    n = ct.shape[0]
    out = {k: np.empty(n) for k in _FIELDS}
    dx = body.x_m - x_ref_m
    w = body.weights
    xw = body.x_m * w
    step = max(1, _CHUNK_ELEMENTS // max(1, body.y_m.size))
    for a in range(0, n, step):
        sl = slice(a, min(n, a + step))
        c = cf[sl, None] - dx * tf[sl, None]  # (k, S)
        cut = cut_sections(body.y_m, body.z_m, ct[sl, None], st[sl, None], c)
        vol = cut.area_m2 @ w
        safe = np.where(vol > 0.0, vol, 1.0)
        ch = cut.chord_m
        out["volume_m3"][sl] = vol
        out["x_b_m"][sl] = cut.area_m2 @ xw / safe
        out["eta_b_m"][sl] = cut.q_eta_m3 @ w / safe
        out["zeta_b_m"][sl] = cut.q_zeta_m3 @ w / safe
        out["wp_area_m2"][sl] = ch @ w
        out["wp_x_m3"][sl] = ch @ xw
        out["wp_xx_m4"][sl] = ch @ (xw * body.x_m)
        out["wp_eta_m3"][sl] = cut.chord_m1_m2 @ w
        out["wp_etaeta_m4"][sl] = cut.chord_m2_m3 @ w
        out["wp_xref_m3"][sl] = ch @ (dx * w)
        out["wp_c_m3"][sl] = (ch * c) @ w
        out["wp_cxref_m4"][sl] = (ch * c) @ (dx * w)
        out["wp_xxref_m4"][sl] = ch @ (xw * dx)
    return Immersion(**{k: v.reshape(shape) for k, v in out.items()})


class _LevelCuts:
    """Volume below the plane and waterplane area of ``body`` at fixed heels and trims (...), for
    any levels c0: what a level search asks for again and again.

    The same sums as :func:`immerse` for those two quantities.  The sections are turned into
    each heel once per chunk of cases (:func:`~deckload.core.geometry.sections.heeled_edges`) and
    kept for the next level, up to :data:`_KEEP_TURNED_ELEMENTS` vertices in all (beyond that they
    are turned again at each call, with the same result): about a third fewer array operations
    a step (the demo's geometry → tables 1.77 → 1.55 s of CPU)."""

    def __init__(self, body: Body, cos_t, sin_t, t, x_ref_m: float) -> None:
        cos_t, sin_t, t = np.broadcast_arrays(
            np.asarray(cos_t, dtype=float), np.asarray(sin_t, dtype=float), np.asarray(t, dtype=float))
        self.shape = cos_t.shape
        self.body = body
        self.ct, self.st, self.tf = (a.reshape(-1) for a in (cos_t, sin_t, t))
        self.dx = body.x_m - x_ref_m
        n = self.ct.shape[0]
        step = max(1, _CHUNK_ELEMENTS // max(1, body.y_m.size))
        self.chunks = [slice(a, min(n, a + step)) for a in range(0, n, step)]
        self.keep = n * body.y_m.size <= _KEEP_TURNED_ELEMENTS
        self.turned: dict[int, HeeledEdges] = {}

    def _edges(self, i: int, sl: slice) -> HeeledEdges:
        edges = self.turned.get(i)
        if edges is None:
            edges = heeled_edges(self.body.y_m, self.body.z_m, self.ct[sl, None], self.st[sl, None])
            if self.keep:
                self.turned[i] = edges
        return edges

    def __call__(self, c0) -> tuple[np.ndarray, np.ndarray]:
        cf = np.broadcast_to(np.asarray(c0, dtype=float), self.shape).reshape(-1)
        n = cf.shape[0]
        vol = np.empty(n)
        wpa = np.empty(n)
        w = self.body.weights
        for i, sl in enumerate(self.chunks):
            c = cf[sl, None] - self.dx * self.tf[sl, None]
            area, chord = area_chord_below(self._edges(i, sl), c)
            vol[sl] = area @ w
            wpa[sl] = chord @ w
        return vol.reshape(self.shape), wpa.reshape(self.shape)


_KEEP_TURNED_ELEMENTS = 300_000
"""A level search keeps the turned sections of up to this many vertices (seven arrays of
doubles: about 17 MB at most)."""


def volume_and_area(body: Body, cos_t, sin_t, c0, t=0.0, x_ref_m: float = 0.0) -> tuple[np.ndarray, np.ndarray]:
    """Volume below the plane and the waterplane area only (d∇/dc0): what a level search needs.

    The same sums as :func:`immerse` for those two quantities, without the other moments."""
    cos_t, sin_t, c0, t = np.broadcast_arrays(
        np.asarray(cos_t, dtype=float), np.asarray(sin_t, dtype=float),
        np.asarray(c0, dtype=float), np.asarray(t, dtype=float),
    )
    return _LevelCuts(body, cos_t, sin_t, t, x_ref_m)(c0)


def level_for_volume(
    body: Body,
    cos_t,
    sin_t,
    volume_m3,
    t=0.0,
    x_ref_m: float = 0.0,
    c_start=None,
    tol_rel: float = 1e-11,
    max_iter: int = 100,
) -> np.ndarray:
    """The level c0 at which the body's volume below the plane equals ``volume_m3``.

    Safeguarded Newton: volume grows monotonically with c0 and d∇/dc0 is the cut
    area, so a Newton step is taken when it stays inside the current bracket and
    a bisection step otherwise (a textbook hybrid, e.g. Press et al., *Numerical
    Recipes* 3rd ed. §9.4 'rtsafe').  Vectorised over the case shape (...).
    """
    cos_t, sin_t, target, t = np.broadcast_arrays(
        np.asarray(cos_t, dtype=float), np.asarray(sin_t, dtype=float),
        np.asarray(volume_m3, dtype=float), np.asarray(t, dtype=float),
    )
    zlo, zhi = body.zeta_range(cos_t, sin_t)  # (..., S)
    dx = body.x_m - x_ref_m
    lo = np.min(zlo + dx * t[..., None], axis=-1)
    hi = np.max(zhi + dx * t[..., None], axis=-1)
    scale = max(float(np.max(np.abs(target))), 1e-12)
    # the ends are known exactly: nothing below the lowest vertex, everything below the highest
    cuts = _LevelCuts(body, cos_t, sin_t, t, x_ref_m)
    v_max = cuts(hi)[0]
    at_lo = target <= 1e-13 * scale
    at_hi = target >= v_max - 1e-12 * scale  # round-off must not leave a full body to bisection
    if c_start is None:
        with np.errstate(invalid="ignore", divide="ignore"):
            frac = np.clip(np.where(v_max > 0.0, target / v_max, 0.5), 0.0, 1.0)
        c = lo + (hi - lo) * frac
    else:
        c = np.clip(np.broadcast_to(np.asarray(c_start, dtype=float), lo.shape), lo, hi).copy()
    c = np.where(at_lo, lo, np.where(at_hi, hi, c))
    fixed = at_lo | at_hi
    for _ in range(max_iter):
        vol, wpa = cuts(c)
        f = vol - target
        done = fixed | (np.abs(f) <= tol_rel * scale)
        if np.all(done):
            break
        lo = np.where(f < 0.0, np.maximum(lo, c), lo)
        hi = np.where(f > 0.0, np.minimum(hi, c), hi)
        a = wpa
        with np.errstate(invalid="ignore", divide="ignore"):
            step = np.where(a > 0.0, f / np.where(a > 0.0, a, 1.0), np.nan)
        cn = c - step
        bad = ~np.isfinite(cn) | (cn <= lo) | (cn >= hi)
        cn = np.where(bad, 0.5 * (lo + hi), cn)
        c = np.where(done, c, cn)
        if np.all(hi - lo <= 1e-14 * np.maximum(1.0, np.abs(hi))):
            break
    return c
