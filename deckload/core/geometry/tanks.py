"""Tank and hold calibration by sounding, from the compartment's section polygons.

The ship is upright at even keel (the usual basis of calibration tables, common
practice).  The sounding s is measured from the lowest point of the compartment;
at each sounding the liquid occupies z ≤ z_bottom + s and

* volume v = ∫ A(x) dx, centroid (LCG, TCG, VCG) = first moments / v;
* fsi_m4 = transverse second moment of the free surface about its own
  fore-and-aft centroidal axis: ∫ (∫ y² dy) dx − A_s·ȳ², A_s the surface area
  (i = l·b³/12 for a rectangle, checks.md §3.1).

At the lowest row the surface is the limit from above (the tank bottom for a flat
bottom) and at the top row the limit from below (the surface just short of the
tank top), so the free-surface column never drops to zero at the ends of a table
that is interpolated linearly.
"""

from __future__ import annotations

import numpy as np

from deckload.core.geometry.body import Body, immerse, level_for_volume
from deckload.core.model import TankCalibration


def sounding_levels(height_m: float, max_step_m: float, min_rows: int = 11) -> np.ndarray:
    """Soundings 0 … height in equal steps no longer than ``max_step_m`` (at least ``min_rows`` rows)."""
    n = max(min_rows, int(np.ceil(height_m / max_step_m - 1e-9)) + 1)
    return np.linspace(0.0, height_m, n)


def calibrate(body: Body, soundings_m: np.ndarray) -> TankCalibration:
    """Calibration at the given soundings (module docstring)."""
    s = np.asarray(soundings_m, dtype=float)
    zb = body.z_min_m
    zt = body.z_max_m
    level = zb + s
    im = immerse(body, np.ones_like(s), np.zeros_like(s), level)
    # free surface: limit from above at the bottom, from below at the top
    eps = 1e-9 * max(1.0, zt - zb)
    surf_level = np.clip(level, zb + eps, zt - eps)
    sf = immerse(body, np.ones_like(s), np.zeros_like(s), surf_level)
    a = sf.wp_area_m2
    with np.errstate(invalid="ignore", divide="ignore"):
        ybar = np.where(a > 0.0, sf.wp_eta_m3 / np.where(a > 0.0, a, 1.0), 0.0)
    fsi = np.maximum(sf.wp_etaeta_m4 - a * ybar**2, 0.0)
    v = im.volume_m3
    # centroid at zero volume: the bottom's own centroid (limit from above)
    lcg = np.where(v > 0.0, im.x_b_m, sf.wp_x_m3 / np.where(a > 0.0, a, 1.0))
    tcg = np.where(v > 0.0, im.eta_b_m, ybar)
    vcg = np.where(v > 0.0, im.zeta_b_m, zb)
    return TankCalibration(s, v, lcg, vcg, tcg, fsi)


def fill_centroids(body: Body, fill_pct: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray, float]:
    """Centroid (LCG, VCG, TCG) of contents levelled at each fill (% of capacity), and the capacity.

    For 0 % the centroid of the bottom (the limit of a thin layer) is returned.
    """
    f = np.asarray(fill_pct, dtype=float)
    full = float(immerse(body, 1.0, 0.0, body.z_max_m).volume_m3)
    v = f / 100.0 * full
    c = level_for_volume(body, np.ones_like(f), np.zeros_like(f), v)
    im = immerse(body, np.ones_like(f), np.zeros_like(f), c)
    zb = body.z_min_m
    bottom = immerse(body, 1.0, 0.0, zb + 1e-9 * max(1.0, body.z_max_m - zb))
    x0 = float(bottom.wp_x_m3 / bottom.wp_area_m2) if bottom.wp_area_m2 > 0 else float(np.mean(body.x_m))
    y0 = float(bottom.wp_eta_m3 / bottom.wp_area_m2) if bottom.wp_area_m2 > 0 else 0.0
    pos = v > 0.0
    lcg = np.where(pos, im.x_b_m, x0)
    vcg = np.where(pos, im.zeta_b_m, zb)
    tcg = np.where(pos, im.eta_b_m, y0)
    return lcg, vcg, tcg, full
