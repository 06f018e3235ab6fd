"""Upright, even-keel hydrostatics of a hull by direct integration of its sections.

For each draft T (waterplane z = T, no heel, no trim):

* ∇ = ∫ A(x) dx, Δ = ρ·∇; LCB = ∫ x·A dx / ∇; VCB = ∫ Qz dx / ∇;
* waterplane A_wp = ∫ b(x) dx (b the waterline breadth), LCF = ∫ x·b dx / A_wp;
* I_T = ∫ (∫ y² dy) dx about the centreline, minus A_wp·ȳ² (ȳ = 0 for a symmetric hull);
* I_L = ∫ x²·b dx − A_wp·LCF² (about the centre of flotation);
* BMt = I_T/∇, KMt = VCB + BMt; BMl = I_L/∇, KMl = VCB + BMl;
* TPC = ρ·A_wp/100 (t/cm);
* MCTC = Δ·GMl/(100·L) ≈ ρ·I_L/(100·LBP), i.e. with BMl standing for GMl, since the
  table cannot know KG (common practice; checks.md §1.1 shows the size of the
  difference for a box: 13.2567 with GMl against 13.6667 with BMl);
* Cb = ∇/(LBP·B·T), Cw = A_wp/(LBP·B), on LBP and moulded breadth.

Standard definitions, e.g. Barrass & Derrett, *Ship Stability for Masters and
Mates*, 5th ed., chapters on TPC, MCTC and BM.
"""

from __future__ import annotations

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.geometry.body import Body, immerse, level_for_volume


@frozen(eq=False)
class UprightHydrostatics:
    draft_m: np.ndarray
    volume_m3: np.ndarray
    displacement_t: np.ndarray
    lcb_m: np.ndarray
    vcb_m: np.ndarray
    lcf_m: np.ndarray
    waterplane_area_m2: np.ndarray
    it_m4: np.ndarray
    il_m4: np.ndarray
    kmt_m: np.ndarray
    kml_m: np.ndarray
    tpc_t_cm: np.ndarray
    mctc_tm_cm: np.ndarray
    cb: np.ndarray
    cw: np.ndarray
    rule: str
    """Integration rule along the stations: 'simpson' or 'trapezoid'."""


def waterplane(im) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """Volume, waterplane area, LCF and the waterplane's transverse and longitudinal second
    moments about its own centroid (parallel-axis theorem: I = I_origin − A·x̄²) of an immersion."""
    awp = im.wp_area_m2
    lcf = im.wp_x_m3 / awp
    ybar = im.wp_eta_m3 / awp
    it = im.wp_etaeta_m4 - awp * ybar**2
    il = im.wp_xx_m4 - awp * lcf**2
    return im.volume_m3, awp, lcf, it, il


def upright_hydrostatics(
    body: Body, draft_m: np.ndarray, density_t_m3: float, lbp_m: float, breadth_m: float
) -> UprightHydrostatics:
    """The hydrostatic table at the given drafts (formulas in the module docstring)."""
    d = np.asarray(draft_m, dtype=float)
    im = immerse(body, np.ones_like(d), np.zeros_like(d), d)
    vol, awp, lcf, it, il = waterplane(im)
    vcb = im.zeta_b_m
    return UprightHydrostatics(
        draft_m=d,
        volume_m3=vol,
        displacement_t=density_t_m3 * vol,
        lcb_m=im.x_b_m,
        vcb_m=vcb,
        lcf_m=lcf,
        waterplane_area_m2=awp,
        it_m4=it,
        il_m4=il,
        kmt_m=vcb + it / vol,
        kml_m=vcb + il / vol,
        tpc_t_cm=density_t_m3 * awp / 100.0,
        mctc_tm_cm=density_t_m3 * il / (100.0 * lbp_m),
        cb=vol / (lbp_m * breadth_m * d),
        cw=awp / (lbp_m * breadth_m),
        rule=body.rule,
    )


def draft_for_volume(body: Body, volume_m3: np.ndarray) -> np.ndarray:
    """Even-keel upright draft at which the hull displaces ``volume_m3``."""
    v = np.asarray(volume_m3, dtype=float)
    return level_for_volume(body, np.ones_like(v), np.zeros_like(v), v)
