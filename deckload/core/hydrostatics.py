"""Hydrostatics at the actual displacement and water density; trim, drafts and list.

The tables are made for one density ρ_t (usually 1.025 t/m³).  Floating in water of
density ρ_w, she displaces the same volume as a displacement Δ·ρ_t/ρ_w would in
table water, so every look-up is made at that equivalent displacement; TPC and
MCTC, which are proportional to density, are then scaled by ρ_w/ρ_t
(textbook: TPC = A_wp·ρ/100, MCTC = Δ·GM_L/(100·L), standards.md §6.3).
"""

from __future__ import annotations

from deckload.core.frozen import frozen
from deckload.core.model import HydrostaticTable, Vessel
from deckload.core.tables import bracket, lerp_row


@frozen
class Upright:
    """Hydrostatic particulars at one displacement, corrected for water density."""

    table_displacement_t: float
    """The equivalent displacement in table water (t): Δ·ρ_table/ρ_water."""
    draft_m: float
    """Even-keel mean draft, which is the draft at the LCF when she trims (m)."""
    lcb_m: float
    lcf_m: float
    kmt_m: float
    tpc_t_cm: float
    mctc_tm_cm: float


def upright(vessel: Vessel, displacement_t: float, water_density_t_m3: float) -> Upright:
    """Interpolate the hydrostatic table at the density-corrected displacement."""
    h: HydrostaticTable = vessel.hydrostatics
    ratio = water_density_t_m3 / vessel.particulars.table_density_t_m3
    d_eq = displacement_t / ratio
    i, f = bracket(h.displacement_t, d_eq, "displacement (hydrostatic table, at table density)", "t")

    def at(col):
        return float(lerp_row(col, i, f))

    return Upright(
        table_displacement_t=d_eq,
        draft_m=at(h.draft_m),
        lcb_m=at(h.lcb_m),
        lcf_m=at(h.lcf_m),
        kmt_m=at(h.kmt_m),
        tpc_t_cm=at(h.tpc_t_cm) * ratio,
        mctc_tm_cm=at(h.mctc_tm_cm) * ratio,
    )


def trim_m(displacement_t: float, lcg_m: float, lcb_m: float, mctc_tm_cm: float) -> float:
    """Trim (m, + by the stern) = Δ·(LCB − LCG)/(100·MCTC), x from AP + forward.

    The trimming moment Δ·(LCB − LCG) divided by the moment to change trim 1 cm
    gives the trim in cm (textbook; standards.md §6.3).
    """
    return displacement_t * (lcb_m - lcg_m) / (100.0 * mctc_tm_cm)


def draft_at(x_m: float, draft_at_lcf_m: float, lcf_m: float, trim: float, lbp_m: float) -> float:
    """Draft (m) at x from AP for a ship trimmed about the LCF.

    T(x) = T_F + t·(x_F − x)/LBP: at the AP (x = 0) T_A = T_F + t·x_F/LBP, at the FP
    T_F − t·(LBP − x_F)/LBP (standards.md §6.3).
    """
    return draft_at_lcf_m + trim * (lcf_m - x_m) / lbp_m


def fresh_water_allowance_m(displacement_t: float, tpc_t_cm: float) -> float:
    """FWA (m) = Δ/(4·TPC) mm, Δ and TPC at the summer draft in sea water.

    Standards.md §6.1 (ICLL; shipboard formula).
    """
    return displacement_t / (4.0 * tpc_t_cm) / 1000.0


FRESH_WATER_MARKS = frozenset({"fresh", "tropical fresh", "tropical_fresh", "f", "tf"})
"""Load-line marks that stand for fresh water (ICLL: the F and TF marks); all others are sea-water marks."""


def mark_density_t_m3(name: str) -> float:
    """Water density a load-line mark is set for: 1.000 t/m³ for F and TF, else 1.025 (ICLL, standards.md §6.1)."""
    return 1.000 if name.strip().lower() in FRESH_WATER_MARKS else 1.025


def permitted_draft_m(mark_draft_m: float, fwa_m: float, water_density_t_m3: float,
                      mark_density: float = 1.025) -> float:
    """Draft allowed at a load-line mark in water of the given density.

    The draft changes by FWA for each 0.025 t/m³ of density (dock water allowance
    DWA = FWA·(1.025 − ρ)/0.025, standards.md §6.1; textbook, marked from memory
    there).  A fresh-water mark already includes the FWA, so it is measured from
    1.000 t/m³: lighter water than the mark's raises the allowed draft, heavier lowers it.
    """
    return mark_draft_m + fwa_m * (mark_density - water_density_t_m3) / 0.025
