"""Actual moment of fluid transfer of a tank, and its worst slack band.

Definition (checks.md §3.2): at fill f the liquid volume is v = f·V.  Upright its
centroid is (y₀, z₀).  Heeled to θ (ship at even keel, no trim) the free surface
levels at the same volume and the centroid moves to (y_g, z_g); the horizontal
shift of the centroid normal to gravity, times the volume, is

    M(f, θ) = v·[(y_g − y₀)·cos θ + (z_g − z₀)·sin θ]     (m⁴)

and the heeling moment is ρ·M (t·m); the GZ reduction is ρ·M/Δ.  For a box tank
where the surface meets both side walls M = i·sin θ·(1 + ½tan²θ) exactly
(checks.md §3.2), which is why a constant i·sinθ correction misstates large angles.

Worst band: the fills at which M at 30° is within 10 % of its largest value over
all fills (IS Code 2008 Part B 3.1 asks for the fill giving the largest moment at
30° for variable-level tanks; the band around it is deckload's own display aid).
Found on a 1 % fill grid with the band edges interpolated linearly.
"""

from __future__ import annotations

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.geometry.body import Body, immerse, level_for_volume


@frozen(eq=False)
class TransferTable:
    fill_pct: np.ndarray
    heel_deg: np.ndarray
    moment_m4: np.ndarray
    """M, shape (fills, heels)."""


def transfer_moments(body: Body, fill_pct: np.ndarray, heel_deg: np.ndarray) -> TransferTable:
    """M(f, θ) on a grid (module docstring)."""
    f = np.asarray(fill_pct, dtype=float)
    h = np.asarray(heel_deg, dtype=float)
    full = float(immerse(body, 1.0, 0.0, body.z_max_m).volume_m3)
    vf = f / 100.0 * full
    v = np.broadcast_to(vf[:, None], (len(f), len(h)))
    th = np.broadcast_to(np.radians(h)[None, :], v.shape)
    ct = np.where(np.abs(np.cos(th)) < 1e-15, 0.0, np.cos(th))
    st = np.sin(th)
    # upright first: its level and surface centroid give the heeled start, exact while the
    # surface pivots about its own centroid (wall-sided), so Newton has little left to do
    z_up = level_for_volume(body, np.ones(len(f)), np.zeros(len(f)), vf)
    up = immerse(body, 1.0, 0.0, z_up)
    with np.errstate(invalid="ignore", divide="ignore"):
        y_s = np.where(up.wp_area_m2 > 0.0, up.wp_eta_m3 / np.where(up.wp_area_m2 > 0.0, up.wp_area_m2, 1.0), 0.0)
    c_start = z_up[:, None] * ct - y_s[:, None] * st
    c = level_for_volume(body, ct, st, v, c_start=c_start)
    im = immerse(body, ct, st, c)
    y0 = up.eta_b_m[:, None]
    z0 = up.zeta_b_m[:, None]
    eta0 = y0 * ct + z0 * st
    m = np.where(v > 0.0, v * (im.eta_b_m - eta0), 0.0)
    # a full tank has no free surface: the contents cannot move
    m = np.where(f[:, None] >= 100.0, 0.0, m)
    return TransferTable(f, h, m)


def worst_band(body: Body, heel_deg: float = 30.0, within: float = 0.10, step_pct: float = 1.0) -> tuple[float, float]:
    """The fill band (%) in which M(θ = 30°) is within 10 % of its maximum (module docstring).

    Both heeling directions are tried and the one with the larger maximum governs,
    so a port tank and its starboard partner (mirror images) get the same band.
    """
    f = np.arange(0.0, 100.0 + step_pct / 2, step_pct)
    # heeled to port the tank behaves as its mirror image heeled to starboard, with the
    # moment's sign reversed: one solve gives both directions
    both = transfer_moments(body, f, np.array([heel_deg, -heel_deg])).moment_m4
    curves = [both[:, 0], -both[:, 1]]
    m = max(curves, key=lambda c: float(np.max(c)))
    k = int(np.argmax(m))
    mmax = m[k]
    if mmax <= 0.0:
        return (0.0, 100.0)
    thr = (1.0 - within) * mmax
    lo_i = k
    while lo_i > 0 and m[lo_i - 1] >= thr:
        lo_i -= 1
    hi_i = k
    while hi_i < len(f) - 1 and m[hi_i + 1] >= thr:
        hi_i += 1

    def edge(i_in: int, i_out: int) -> float:
        if i_out < 0 or i_out >= len(f):
            return float(f[i_in])
        a, b = m[i_out], m[i_in]
        return float(f[i_out] + (thr - a) / (b - a) * (f[i_in] - f[i_out]))

    return edge(lo_i, lo_i - 1), edge(hi_i, hi_i + 1)
