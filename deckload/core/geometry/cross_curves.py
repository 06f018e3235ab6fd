"""KN cross curves by direct calculation: the hull heeled to each angle, sunk to each
displacement, and (free trim) trimmed until B is in line with a reference centre.

Frame and formulas.  Heel θ to starboard, trim ψ (positive by the stern).  In body
axes the upward vertical is u = (sin ψ, −sin θ·cos ψ, cos θ·cos ψ); the water
occupies, in every section, ζ = −y·sinθ + z·cosθ ≤ c0 − (x − x_ref)·tan ψ.  The
horizontal transverse direction normal to the ship's axis is e = (0, cos θ, sin θ),
so the lever of B about the keel point K is

    KN = η_B = y_B·cos θ + z_B·sin θ     (checks.md conventions; K on the centreline at the keel)

and GZ = KN − KG·sin θ − TCG·cos θ.

Free trim.  The horizontal fore-and-aft direction is f = (cos ψ, sin ψ·sin θ,
−sin ψ·cos θ); B and the reference centre G_ref = (x_G, 0, z_G) are on one vertical
when (B − G_ref)·f = 0, i.e.

    R = (x_B − x_G) − tan ψ·(ζ_B − ζ_G) = 0,   ζ_G = z_G·cos θ.

The reference centre is stated with the tables (``trim_lcg_m``, ``trim_vcg_m``):
the cross curves are exact for a vessel whose G lies there and a close
approximation nearby (the usual basis of free-trim cross curves, common practice).
Even keel: ψ = 0 and only the volume is solved for.

Solution.  For each (displacement, heel) the level c0 is found by a safeguarded
Newton iteration on the volume (d∇/dc0 = waterplane area), and tan ψ by Newton's
method on R using the derivative along the constant-volume path
dR/dt = ∂R/∂t − ∂R/∂c0·(∂∇/∂t)/(∂∇/∂c0), with the partial derivatives from the
waterline chords (d A_i/d c_i = chord_i, d Qζ_i/d c_i = c_i·chord_i).  All cases
are solved together (numpy).
"""

from __future__ import annotations

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.geometry.body import Body, immerse, level_for_volume


class NoEquilibriumError(ValueError):
    """The free-trim iteration did not settle (e.g. the hull cannot float at that volume)."""


@frozen(eq=False)
class CrossCurveResult:
    displacement_t: np.ndarray
    heel_deg: np.ndarray
    kn_m: np.ndarray
    """KN (m), shape (displacements, heels)."""
    trim_rad: np.ndarray
    """Trim angle ψ at each case (rad, + by the stern); zero for even keel."""
    level_m: np.ndarray
    """c0 at each case (m), in the heeled frame at x_ref."""
    trim_basis: str
    x_ref_m: float
    iterations: int


def solve_floating(
    body: Body,
    volume_m3: np.ndarray,
    heel_rad: np.ndarray,
    trim_basis: str = "free trim",
    lcg_m: float = 0.0,
    vcg_m: float = 0.0,
    x_ref_m: float = 0.0,
    tol_m: float = 1e-8,
    max_outer: int = 40,
    c_start: np.ndarray | None = None,
    t_start: np.ndarray | None = None,
) -> tuple[np.ndarray, np.ndarray, int]:
    """Level c0 and tan ψ for each case (volume, heel), any case shape.  Module docstring."""
    vol, th = np.broadcast_arrays(np.asarray(volume_m3, dtype=float), np.asarray(heel_rad, dtype=float))
    ct = np.cos(th)
    st = np.sin(th)
    ct = np.where(np.abs(ct) < 1e-15, 0.0, ct)
    t = np.zeros(vol.shape) if t_start is None else np.array(t_start, dtype=float)
    c = level_for_volume(body, ct, st, vol, t, x_ref_m, c_start=c_start)
    iterations = 0
    if trim_basis != "free trim":
        return c, t, iterations
    zeta_g = vcg_m * ct
    r = np.zeros(vol.shape)
    for iterations in range(1, max_outer + 1):
        im = immerse(body, ct, st, c, t, x_ref_m)
        v = im.volume_m3
        r = (im.x_b_m - lcg_m) - t * (im.zeta_b_m - zeta_g)
        if np.all(np.abs(r) <= tol_m):
            return c, t, iterations
        dv_dc = im.wp_area_m2
        dv_dt = -im.wp_xref_m3
        dr_dc = (im.wp_x_m3 - im.x_b_m * dv_dc) / v - t * (im.wp_c_m3 - im.zeta_b_m * dv_dc) / v
        dr_dt_p = (
            (-im.wp_xxref_m4 - im.x_b_m * dv_dt) / v
            - t * (-im.wp_cxref_m4 - im.zeta_b_m * dv_dt) / v
            - (im.zeta_b_m - zeta_g)
        )
        with np.errstate(invalid="ignore", divide="ignore"):
            step = r / (dr_dt_p - dr_dc * dv_dt / dv_dc)
        step = np.clip(np.where(np.isfinite(step), step, 0.0), -0.05, 0.05)
        t = np.where(np.abs(r) <= tol_m, t, t - step)
        c = level_for_volume(body, ct, st, vol, t, x_ref_m, c_start=c)
    bad = np.unravel_index(int(np.argmax(np.abs(r))), r.shape)
    raise NoEquilibriumError(
        f"free-trim equilibrium not found at volume {float(vol[bad]):.2f} m³, heel "
        f"{float(np.degrees(th[bad])):g}° (residual {float(r[bad]):.3g} m after {max_outer} iterations)"
    )


def cross_curves(
    body: Body,
    displacement_t: np.ndarray,
    heel_deg: np.ndarray,
    density_t_m3: float,
    trim_basis: str = "free trim",
    lcg_m: float = 0.0,
    vcg_m: float = 0.0,
    x_ref_m: float | None = None,
) -> CrossCurveResult:
    """KN at every (displacement, heel).  Formulas in the module docstring."""
    disp = np.asarray(displacement_t, dtype=float)
    heel = np.asarray(heel_deg, dtype=float)
    vol = np.broadcast_to((disp / density_t_m3)[:, None], (len(disp), len(heel)))
    th = np.broadcast_to(np.radians(heel)[None, :], vol.shape)
    if x_ref_m is None:
        x_ref_m = float(lcg_m) if trim_basis == "free trim" else 0.5 * float(body.x_m[0] + body.x_m[-1])
    c, t, iterations = solve_floating(body, vol, th, trim_basis, lcg_m, vcg_m, x_ref_m)
    ct = np.where(np.abs(np.cos(th)) < 1e-15, 0.0, np.cos(th))
    im = immerse(body, ct, np.sin(th), c, t, x_ref_m)
    return CrossCurveResult(
        displacement_t=disp,
        heel_deg=heel,
        kn_m=im.eta_b_m,
        trim_rad=np.arctan(t),
        level_m=c,
        trim_basis=trim_basis,
        x_ref_m=float(x_ref_m),
        iterations=iterations,
    )


def immersion_angle(
    body: Body,
    displacement_t: np.ndarray,
    density_t_m3: float,
    point_m: tuple[float, float, float],
    trim_basis: str = "free trim",
    lcg_m: float = 0.0,
    vcg_m: float = 0.0,
    max_heel_deg: float = 90.0,
) -> np.ndarray:
    """Heel (deg) at which a point (x, y, z) reaches the water, for each displacement.

    Heel is taken towards the point's side (the hull is symmetric).  The point is
    immersed when its ζ reaches the level of its station,
    ζ_p = c0 − (x_p − x_ref)·tan ψ, with the hull floating at the same equilibrium
    as the cross curves (same trim basis and reference centre).  Found by the
    Illinois variant of regula falsi on the heel, to 1e-10 m of the margin or 1e-9°;
    returns ``max_heel_deg`` for a point still dry there.
    """
    x_p, y_p, z_p = point_m
    y_side = abs(y_p)
    disp = np.asarray(displacement_t, dtype=float)
    vol = disp / density_t_m3
    x_ref = float(lcg_m) if trim_basis == "free trim" else 0.5 * float(body.x_m[0] + body.x_m[-1])
    state: dict[str, np.ndarray | None] = {"c": None, "t": None}

    def margin(heel_deg: np.ndarray) -> np.ndarray:
        th = np.radians(heel_deg)
        c, t, _ = solve_floating(
            body, vol, th, trim_basis, lcg_m, vcg_m, x_ref, c_start=state["c"], t_start=state["t"]
        )
        state["c"], state["t"] = c, t
        zeta_p = -y_side * np.sin(th) + z_p * np.cos(th)
        return zeta_p - (c - (x_p - x_ref) * t)  # > 0: dry

    m0 = margin(np.zeros_like(disp))
    if np.any(m0 <= 0.0):
        i = int(np.argmax(m0 <= 0.0))
        raise ValueError(f"the opening is under water upright at displacement {disp[i]:.1f} t")
    lo = np.zeros_like(disp)
    hi = np.full_like(disp, max_heel_deg)
    f_lo = m0
    f_hi = margin(hi)
    dry_at_max = f_hi > 0.0
    state["c"], state["t"] = None, None
    side = np.zeros_like(disp)
    x = 0.5 * (lo + hi)
    for _ in range(60):
        # Illinois regula falsi on the margin (dry > 0), bracket kept (Dowell & Jarratt 1971)
        with np.errstate(invalid="ignore", divide="ignore"):
            x = np.where(f_lo != f_hi, (lo * f_hi - hi * f_lo) / (f_hi - f_lo), 0.5 * (lo + hi))
        x = np.where((x > lo) & (x < hi), x, 0.5 * (lo + hi))
        m = margin(x)
        dry = m > 0.0
        lo, f_lo = np.where(dry, x, lo), np.where(dry, m, f_lo)
        hi, f_hi = np.where(dry, hi, x), np.where(dry, f_hi, m)
        f_hi = np.where(dry & (side > 0), 0.5 * f_hi, f_hi)
        f_lo = np.where(~dry & (side < 0), 0.5 * f_lo, f_lo)
        side = np.where(dry, 1.0, -1.0)
        if np.all((np.abs(m) < 1e-10) | (hi - lo < 1e-9) | dry_at_max):
            break
    return np.where(dry_at_max, max_heel_deg, x)
