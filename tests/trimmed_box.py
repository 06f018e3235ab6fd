"""The trimmed box of tests/test_reference_trimmed_tables.py and tests/test_tables_trims.py:
its hydrostatics and KN at trims in closed form, and its exact equilibrium trim.

Hydrostatics and KN at several trims (core/trimmed_tables.py) against a box's exact trimmed waterline.

Analytic solution (derived here).  Box L × B × D, x from the aft end (the AP), z from the
keel, mean draft T (at midships), trim t (m, + by the stern), tanψ = t/L.  Every station is
the same rectangle, so while the waterline cuts both ends' sides (0 < T ± t/2 < D) the draft
at x is d(x) = T + t·(L/2 − x)/L; the volume ∫B·d dx = L·B·T does not depend on t.  In ship axes

    LCB(t) = ∫x·d dx / ∫d dx = L/2 − L·t/(12·T)
    KB(t)  = ∫d²/2 dx / ∫d dx = (T² + t²/12)/(2T) = T/2 + t²/(24·T)
    LCF    = L/2 (the waterplane is a rectangle centred at midships)

A table at trim t then has, row by row in T: Δ = ρ·L·B·T, TPC = ρ·L·B/100 per cm of mean
draft (dΔ/dT exactly), BMt = B²/(12·T·cosψ) and BML = L²/(12·T·cos³ψ) (the waterplane is
L/cosψ long), KMt = KB + BMt, KML = KB + BML, MCTC = Δ·BML/(100·L).  (BMt, BML and MCTC only
set the size of the iteration's steps and GM: the equilibrium does not depend on them.)

KN at a fixed trim t, heeled φ about the fore-and-aft axis: each station is a wall-sided
rectangle of draft d(x), its waterline pivoting about the centreline, so its buoyancy moves
to y = B²·tanφ/(12·d), z = d/2 + B²·tan²φ/(24·d) (the wall-sided formula per section,
valid while d(x) ± (B/2)·tanφ stays within 0…D at every x).  Summing over the length,

    KN(φ, t) = sinφ·[KB(t) + (B²/(12·T))·(1 + tan²φ/2)]

(the lever measured square to the ship's fore-and-aft axis; the cosψ factors of the tilted
axis are left out, 1 − cosψ = 3·10⁻⁴ at t = 1 m on L = 40 m).

Equilibrium: in ship axes the upward vertical of the trimmed ship is (sinψ, cosψ), so G and B
are on one vertical when LCG − LCB(t) = (KG − KB(t))·tanψ.  With LCG = L/2 − a this is

    a = s·(T/2 + L²/(12·T) − KG) + s³·L²/(24·T),   s = t/L,

found by bisection to 1e-15; then T_aft = T + t/2, T_fwd = T − t/2.  The box is L 40, B 8,
D 10 m at T 4.5–5.5 m, trims −2…+2 m: every station stays wall-sided to 41° of heel.

Tolerances: UR L5 / MSC.1/Circ.1229 (standards.md §5.3, "Trim & stability"): draughts
1 % / 5 cm; GZ 5 % / 5 cm.  Tighter bounds, from the only approximation the method makes
(linear interpolation in trim of a quantity quadratic in t, which errs by at most
(Δt)²/4 × its t² coefficient), are written beside each check.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from deckload.core.model import (
    CrossCurves,
    HydrostaticTable,
    MassItem,
    Particulars,
    TrimmedTables,
    Vessel,
    frozen_array,
)

RHO = 1.025
L, B, D = 40.0, 8.0, 10.0
DRAFTS = tuple(np.round(np.arange(4.0, 6.0001, 0.25), 10))
KN_DRAFTS = (4.5, 4.75, 5.0, 5.25, 5.5)
HEELS = tuple(float(h) for h in range(0, 45, 5))
TRIMS = (-2.0, -1.0, 0.0, 1.0, 2.0)


def kb(T, t):
    return T / 2 + t * t / (24 * T)


def kn_exact(T, t, heel_deg):
    """KN(φ, t) of the module docstring."""
    p = math.radians(heel_deg)
    return math.sin(p) * (kb(T, t) + B * B / (12 * T) * (1 + math.tan(p) ** 2 / 2))


def hydro_at_trim(t: float) -> HydrostaticTable:
    T = np.asarray(DRAFTS)
    cos = math.cos(math.atan(t / L))
    disp = RHO * L * B * T
    bml = L * L / (12 * T * cos**3)
    return HydrostaticTable(
        draft_m=frozen_array(T), displacement_t=frozen_array(disp),
        lcb_m=frozen_array(L / 2 - L * t / (12 * T)), lcf_m=frozen_array(np.full_like(T, L / 2)),
        kmt_m=frozen_array(kb(T, t) + B * B / (12 * T * cos)), tpc_t_cm=frozen_array(np.full_like(T, RHO * L * B / 100)),
        mctc_tm_cm=frozen_array(disp * bml / (100 * L)), vcb_m=frozen_array(kb(T, t)), kml_m=frozen_array(kb(T, t) + bml),
    )


def kn_at_trim(t: float) -> CrossCurves:
    kn = [[kn_exact(T, t, h) for h in HEELS] for T in KN_DRAFTS]
    return CrossCurves(heel_deg=frozen_array(HEELS), displacement_t=frozen_array([RHO * L * B * T for T in KN_DRAFTS]),
                       kn_m=frozen_array(kn), trim_basis="even keel")


def box(T: float, kg: float, offset_aft: float, trims=TRIMS, kn_trims=TRIMS, kn_table=kn_at_trim) -> Vessel:
    """The box at mean draft T with G ``offset_aft`` m abaft midships, tables at ``trims``."""
    v = Vessel(
        particulars=Particulars(name="Trimmed box", lbp_m=L, breadth_m=B, depth_m=D, design_draft_m=5.0),
        lightship=MassItem("Lightship", RHO * L * B * T, L / 2 - offset_aft, kg),
        hydrostatics=hydro_at_trim(0.0), cross_curves=kn_table(0.0), tanks=(),
    )
    tt = TrimmedTables(frozen_array(trims), tuple(hydro_at_trim(t) for t in trims),
                       frozen_array(kn_trims), tuple(kn_table(t) for t in kn_trims))
    return dataclasses.replace(v, trimmed=tt)


def exact_trim(T: float, kg: float, offset_aft: float) -> float:
    """Root t of a = s·GM_L + s³·L²/(24T), s = t/L (module docstring), by bisection."""
    gml = T / 2 + L * L / (12 * T) - kg
    lo, hi = -1.0, 1.0
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        if mid * gml + mid**3 * L * L / (24 * T) < offset_aft:
            lo = mid
        else:
            hi = mid
    return 0.5 * (lo + hi) * L


def ur_l5_draft(value_m: float) -> float:
    """UR L5 draughts (standards.md §5.3): 1 %, not more than 5 cm."""
    return min(0.01 * abs(value_m), 0.05)
