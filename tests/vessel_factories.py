"""Vessels built in code, straight from the frozen model, for the reference tests and the benchmark.

No files are read: every table here comes from a closed form, so a test that
evaluates one of these vessels compares the engine with mathematics, not with
another program's output.

* :func:`box_barge` — the box barge of checks.md §1 (L = 40, B = 10, D = 4 m):
  hydrostatics from the closed forms of §1.1 at several drafts, KN cross curves from
  the exact section formulas of §1.2/§1.4 at heel 0–90° in 5° steps, optional box
  tanks with analytic calibration (i = l·b³/12).
* :func:`parallel_sided_vessel` — a vessel of constant waterplane (TPC, LCF, MCTC and
  KMt constant over its draft range; LCB consistent with LCF), on which the textbook
  worked examples that give only Δ, KM, MCTC, LCF … can be posed as conditions.
* :func:`box_tank` — a rectangular tank with its exact calibration and, optionally,
  its exact moment of fluid transfer (checks.md §3.2).
* :func:`synthetic_vessel` — an N-item vessel and condition for the benchmark.

Analytic section formulas (checks.md §1.2, derived there and re-derived here).
Body axes: y across (+ starboard), z up from the keel; heeled φ to starboard, the
waterline is z = z0 + y·t (t = tan φ) and the submerged part lies below it.  For a
rectangle of breadth B, depth D and section area A = B·T:

1. wall-sided (waterline cuts both sides): y_B = B²t/(12T), z_B = T/2 + B²t²/(24T);
2. waterline cuts the bottom and the starboard side (bilge emerged, deck dry):
   submerged triangle with legs a = √(2A/t) on the bottom and c = a·t up the side,
   y_B = B/2 − a/3, z_B = c/3;
3. waterline cuts the port side and the deck (deck edge immersed, bilge wet):
   the dry triangle at the port deck corner has area E = BD − A, legs a' = √(2E/t)
   along the deck and c' = a'·t down the side, centroid (−B/2 + a'/3, D − c'/3);
   B = [BD·(0, D/2) − E·centroid]/A;
4. waterline cuts deck and bottom: z0 = t(A/D − B/2) + D/2; the submerged part is
   {y ≥ (z − z0)/t}, so with y_l(z) = (z − z0)/t,
   y_B = [B²D/4 − ((D − z0)³ + z0³)/(3t²)]/(2A),
   z_B = [(B/2 + z0/t)·D²/2 − D³/(3t)]/A.

KN = y_B·cos φ + z_B·sin φ (K stays on the centreline at the keel).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from deckload.core.model import (
    CONSUMABLE_KINDS,
    Condition,
    CriteriaSettings,
    CrossCurves,
    DeckItem,
    FluidTransfer,
    FreeSurfaceSettings,
    HydrostaticTable,
    LimitCurve,
    MassItem,
    Particulars,
    Tank,
    TankCalibration,
    TankFill,
    Vessel,
    frozen_array,
)

RHO_SW = 1.025
"""Standard sea water (t/m³): standards.md §6.1 [C]."""

BARGE_L = 40.0
BARGE_B = 10.0
BARGE_D = 4.0
"""The checks.md §1 box barge (m)."""

BARGE_DRAFTS_M = tuple(np.round(np.arange(0.5, 3.5001, 0.25), 10))
"""Table drafts of the barge: 0.50 to 3.50 m in 0.25 m steps (the §1 checks fall on rows)."""

HEELS_DEG = tuple(float(h) for h in range(0, 91, 5))
"""Heel columns of every cross-curve table here by default: 0–90° in 5° steps."""


def heel_grid(step_deg: float = 5.0) -> tuple[float, ...]:
    """Heel columns 0–90° at ``step_deg`` (which must divide 90)."""
    n = round(90.0 / step_deg)
    if abs(n * step_deg - 90.0) > 1e-9:
        raise ValueError(f"heel step {step_deg}° does not divide 90°")
    return tuple(float(x) for x in np.round(np.linspace(0.0, 90.0, n + 1), 10))


# --------------------------------------------------------------------------- section formulas


def box_section_centroid(breadth_m: float, depth_m: float, draft_m: float, heel_rad: float) -> tuple[float, float]:
    """Centroid (y_B, z_B) in body axes of the submerged part of a heeled rectangle.

    Exact closed forms of checks.md §1.2 (regimes 1–4, see the module docstring),
    for a section of the same area as upright at ``draft_m``.  The regime is the one
    whose validity conditions hold.  Also used for a tank's liquid (B, D, T) → (b, h, d).
    """
    b, d, t_up = breadth_m, depth_m, draft_m
    area = b * t_up
    if not 0.0 < t_up < d:
        raise ValueError(f"draft {t_up} must lie strictly between 0 and the depth {d}")
    if heel_rad <= 0.0:
        return 0.0, t_up / 2.0
    if heel_rad >= math.pi / 2 - 1e-12:
        # On her side: submerged part is y ≥ B/2 − A/D over the full depth.
        return b / 2.0 - area / (2.0 * d), d / 2.0
    t = math.tan(heel_rad)
    eps = 1e-12
    # 1. wall-sided
    if b * t / 2.0 <= min(t_up, d - t_up) + eps:
        return b * b * t / (12.0 * t_up), t_up / 2.0 + b * b * t * t / (24.0 * t_up)
    # 2. bottom and starboard side
    a = math.sqrt(2.0 * area / t)
    if a <= b + eps and a * t <= d + eps:
        return b / 2.0 - a / 3.0, a * t / 3.0
    # 3. port side and deck
    e = b * d - area
    a3 = math.sqrt(2.0 * e / t)
    if a3 <= b + eps and a3 * t <= d + eps:
        ey, ez = -b / 2.0 + a3 / 3.0, d - a3 * t / 3.0
        return (0.0 - e * ey) / area, (b * d * d / 2.0 - e * ez) / area
    # 4. deck and bottom
    z0 = t * (area / d - b / 2.0) + d / 2.0
    y_b, y_d = -z0 / t, (d - z0) / t
    if not (y_b >= -b / 2.0 - 1e-9 and y_d <= b / 2.0 + 1e-9):
        raise AssertionError(f"no regime fits B={b} D={d} T={t_up} heel={math.degrees(heel_rad)}")
    yb = (b * b * d / 4.0 - ((d - z0) ** 3 + z0**3) / (3.0 * t * t)) / (2.0 * area)
    zb = ((b / 2.0 + z0 / t) * d * d / 2.0 - d**3 / (3.0 * t)) / area
    return yb, zb


def box_kn_m(breadth_m: float, depth_m: float, draft_m: float, heel_rad: float) -> float:
    """KN (m) of a box section: y_B·cos φ + z_B·sin φ (checks.md conventions)."""
    yb, zb = box_section_centroid(breadth_m, depth_m, draft_m, heel_rad)
    return yb * math.cos(heel_rad) + zb * math.sin(heel_rad)


def box_gz_m(breadth_m: float, depth_m: float, draft_m: float, kg_m: float, heel_rad: float) -> float:
    """Exact GZ (m) of a box: KN − KG·sin φ."""
    return box_kn_m(breadth_m, depth_m, draft_m, heel_rad) - kg_m * math.sin(heel_rad)


def box_dynamic_lever_mrad(breadth_m: float, depth_m: float, draft_m: float, kg_m: float, heel_rad: float) -> float:
    """Exact area under GZ from 0 to φ (m·rad) of a box (checks.md §1.3).

    area(0→φ) = y_B·sin φ + (KG − z_B)·cos φ − (KG − KB): the work of the righting
    couple equals the rise of B relative to G measured normal to the waterline.
    """
    yb, zb = box_section_centroid(breadth_m, depth_m, draft_m, heel_rad)
    return yb * math.sin(heel_rad) + (kg_m - zb) * math.cos(heel_rad) - (kg_m - draft_m / 2.0)


def wall_sided_heel_deg(gm_m: float, bm_m: float, lever_m: float) -> float:
    """First heel (degrees, up to 30°) where the wall-sided GZ = sin φ·(GM + ½·BM·tan²φ) reaches
    ``lever_m`` (the wall-sided formula, checks.md §1: exact for a box until the deck edge or the bilge
    enters the water), by bisection to the last bit."""
    lo, hi = 0.0, math.radians(30.0)
    for _ in range(100):
        mid = (lo + hi) / 2
        if math.sin(mid) * (gm_m + 0.5 * bm_m * math.tan(mid) ** 2) < lever_m:
            lo = mid
        else:
            hi = mid
    return math.degrees(lo)


def deck_edge_angle_rad(breadth_m: float, depth_m: float, draft_m: float) -> float:
    """Angle at which the wall-sided regime ends: tan φ = min(D − T, T)/(B/2)."""
    return math.atan(min(depth_m - draft_m, draft_m) / (breadth_m / 2.0))


# --------------------------------------------------------------------------- tanks


def box_tank(
    tank_id: str,
    *,
    length_m: float,
    breadth_m: float,
    height_m: float,
    lcg_m: float,
    tcg_m: float = 0.0,
    bottom_m: float = 0.0,
    kind: str = "ballast",
    density_t_m3: float = RHO_SW,
    pair: str | None = None,
    fs_category: str | None = None,
    steps: int = 20,
    with_transfer: bool = False,
    name: str | None = None,
) -> Tank:
    """A rectangular tank l × b × h with its exact calibration table.

    At sounding s: V = l·b·s, LCG = x_c, VCG = z_bottom + s/2, TCG = y_c, and the
    free surface is an l × b rectangle whose transverse second moment about its own
    centreline is i = l·b³/12 at every level (standards.md §4.3, textbook).
    ``fs_category`` defaults to 'variable' for consumables, 'fixed' otherwise
    (IS 2008 Part B 3.1.3).  With ``with_transfer`` the tank also carries its exact
    moment of fluid transfer M(f, φ) = v·[y_g·cos φ + (z_g − d/2)·sin φ] (checks.md
    §3.2) at fills 0–100 % in 5 % steps and heel 0–90° in 5° steps, and its worst band
    (fills whose M at 30° is within 10 % of the maximum) from the same formula.
    """
    s = np.linspace(0.0, height_m, steps + 1)
    n = len(s)
    i_fs = length_m * breadth_m**3 / 12.0
    cal = TankCalibration(
        sounding_m=frozen_array(s),
        volume_m3=frozen_array(length_m * breadth_m * s),
        lcg_m=frozen_array(np.full(n, lcg_m)),
        vcg_m=frozen_array(bottom_m + s / 2.0),
        tcg_m=frozen_array(np.full(n, tcg_m)),
        fsi_m4=frozen_array(np.full(n, i_fs)),
    )
    if fs_category is None:
        fs_category = "variable" if kind in CONSUMABLE_KINDS else "fixed"
    transfer = None
    band = (40.0, 60.0)
    if with_transfer:
        fills = np.arange(0.0, 100.0001, 5.0)
        heels = np.array(HEELS_DEG)
        moment = np.array([[box_transfer_moment_m4(length_m, breadth_m, height_m, f, math.radians(h))
                            for h in heels] for f in fills])
        transfer = FluidTransfer(frozen_array(fills), frozen_array(heels), frozen_array(moment))
        band = box_tank_worst_band_pct(length_m, breadth_m, height_m)
    return Tank(
        id=tank_id,
        name=name or f"Box tank {tank_id}",
        kind=kind,
        density_t_m3=density_t_m3,
        capacity_m3=length_m * breadth_m * height_m,
        calibration=cal,
        pair=pair,
        fs_category=fs_category,  # type: ignore[arg-type]
        transfer=transfer,
        worst_band_pct=band,
    )


def box_transfer_moment_m4(length_m: float, breadth_m: float, height_m: float, fill_pct: float, heel_rad: float) -> float:
    """Exact volumetric moment of fluid transfer of a box tank (m⁴), checks.md §3.2.

    M(φ) = v·[y_g·cos φ + (z_g − d/2)·sin φ], d = f·h the liquid depth, (y_g, z_g)
    the heeled liquid centroid from :func:`box_section_centroid` with (B, D, T) → (b, h, d).
    Zero when empty or full.
    """
    d = height_m * fill_pct / 100.0
    if d <= 0.0 or d >= height_m or heel_rad <= 0.0:
        return 0.0
    yg, zg = box_section_centroid(breadth_m, height_m, d, heel_rad)
    v = length_m * breadth_m * d
    return v * (yg * math.cos(heel_rad) + (zg - d / 2.0) * math.sin(heel_rad))


def box_tank_worst_band_pct(length_m: float, breadth_m: float, height_m: float) -> tuple[float, float]:
    """Fills (%) at which M(30°) is within 10 % of its maximum, by bisection.

    M(f) = M(1 − f) (point symmetry of the rectangle, checks.md §3.2) and it is
    largest at 50 %, so the band is symmetric about 50 %.
    """
    phi = math.radians(30.0)
    m_max = box_transfer_moment_m4(length_m, breadth_m, height_m, 50.0, phi)
    lo, hi = 0.0, 50.0
    for _ in range(60):
        mid = (lo + hi) / 2.0
        if box_transfer_moment_m4(length_m, breadth_m, height_m, mid, phi) >= 0.9 * m_max:
            hi = mid
        else:
            lo = mid
    low = round(hi, 6)
    return (low, round(100.0 - low, 6))


# --------------------------------------------------------------------------- box barge


def box_barge_hydrostatics(
    drafts_m=BARGE_DRAFTS_M,
    length_m: float = BARGE_L,
    breadth_m: float = BARGE_B,
    mctc_kg_m: float | None = None,
    rho: float = RHO_SW,
) -> HydrostaticTable:
    """Hydrostatic table of a box from the closed forms of checks.md §1.1.

    Δ = ρ·L·B·T; KB = T/2; BMt = B²/(12T); KMt = KB + BMt; BML = L²/(12T);
    TPC = ρ·L·B/100; LCB = LCF = L/2 (x from the AP at the stern end).
    MCTC = Δ·GML/(100·L): with ``mctc_kg_m`` None, GML is taken as BML (the
    common-practice approximation that makes the table independent of G, giving
    ρ·B·L²/1200); with a KG, GML = KB + BML − KG (as in checks.md §1.1, 13.2567 at T = 2, KG = 3).
    """
    t = np.asarray(drafts_m, dtype=float)
    disp = rho * length_m * breadth_m * t
    kb = t / 2.0
    bml = length_m**2 / (12.0 * t)
    gml = bml if mctc_kg_m is None else kb + bml - mctc_kg_m
    return HydrostaticTable(
        draft_m=frozen_array(t),
        displacement_t=frozen_array(disp),
        lcb_m=frozen_array(np.full_like(t, length_m / 2.0)),
        lcf_m=frozen_array(np.full_like(t, length_m / 2.0)),
        kmt_m=frozen_array(kb + breadth_m**2 / (12.0 * t)),
        tpc_t_cm=frozen_array(np.full_like(t, rho * length_m * breadth_m / 100.0)),
        mctc_tm_cm=frozen_array(disp * gml / (100.0 * length_m)),
        vcb_m=frozen_array(kb),
        kml_m=frozen_array(kb + bml),
    )


def box_barge_cross_curves(
    drafts_m=BARGE_DRAFTS_M,
    length_m: float = BARGE_L,
    breadth_m: float = BARGE_B,
    depth_m: float = BARGE_D,
    rho: float = RHO_SW,
    heel_step_deg: float = 5.0,
) -> CrossCurves:
    """KN of a box by the exact section formulas, one row per draft, heel 0–90° (5° steps by default).

    The box is prismatic, so free trim and fixed trim give the same KN (checks.md §1.2).
    """
    t = np.asarray(drafts_m, dtype=float)
    heels = heel_grid(heel_step_deg)
    kn = np.array([[box_kn_m(breadth_m, depth_m, ti, math.radians(h)) for h in heels] for ti in t])
    return CrossCurves(
        heel_deg=frozen_array(heels),
        displacement_t=frozen_array(rho * length_m * breadth_m * t),
        kn_m=frozen_array(kn),
        trim_basis="free trim",
    )


def box_vessel(
    *,
    length_m: float,
    breadth_m: float,
    depth_m: float,
    drafts_m,
    lightship_t: float,
    lightship_kg_m: float,
    lightship_lcg_m: float | None = None,
    lightship_tcg_m: float = 0.0,
    tanks: tuple[Tank, ...] = (),
    mctc_kg_m: float | None = None,
    free_surface: FreeSurfaceSettings | None = None,
    criteria: CriteriaSettings | None = None,
    heel_step_deg: float = 5.0,
    downflooding: LimitCurve | None = None,
    limit_curve: LimitCurve | None = None,
    name: str = "Analytic box vessel",
) -> Vessel:
    """A box-shaped vessel L × B × D with every table from the closed forms above.

    Hydrostatics by :func:`box_barge_hydrostatics` and KN by
    :func:`box_barge_cross_curves` at ``drafts_m`` (one row each), heel 0–90° in
    ``heel_step_deg`` steps.  The lightship's LCG defaults to midships.
    """
    return Vessel(
        particulars=Particulars(
            name=name, lbp_m=length_m, breadth_m=breadth_m, depth_m=depth_m,
            design_draft_m=float(np.median(np.asarray(drafts_m, dtype=float))),
            table_density_t_m3=RHO_SW, vessel_type="box (analytic test vessel)",
        ),
        lightship=MassItem(
            "Lightship", lightship_t, length_m / 2.0 if lightship_lcg_m is None else lightship_lcg_m,
            lightship_kg_m, lightship_tcg_m,
        ),
        hydrostatics=box_barge_hydrostatics(drafts_m, length_m, breadth_m, mctc_kg_m=mctc_kg_m),
        cross_curves=box_barge_cross_curves(drafts_m, length_m, breadth_m, depth_m, heel_step_deg=heel_step_deg),
        tanks=tuple(tanks),
        downflooding=downflooding,
        limit_curve=limit_curve,
        free_surface=free_surface or FreeSurfaceSettings(),
        criteria=criteria or CriteriaSettings(),
    )


def box_barge(
    *,
    lightship_t: float = 400.0,
    lightship_kg_m: float = 3.0,
    lightship_lcg_m: float = BARGE_L / 2.0,
    lightship_tcg_m: float = 0.0,
    name: str = "Analytic box barge",
    **kw,
) -> Vessel:
    """The checks.md §1 box barge L = 40, B = 10, D = 4 m, tables at drafts 0.5–3.5 m.

    Tables cover Δ = 205 … 1435 t.  Other keywords as :func:`box_vessel`
    (tanks, mctc_kg_m, free_surface, criteria, heel_step_deg, downflooding, limit_curve).
    """
    return box_vessel(
        length_m=BARGE_L, breadth_m=BARGE_B, depth_m=BARGE_D, drafts_m=BARGE_DRAFTS_M,
        lightship_t=lightship_t, lightship_kg_m=lightship_kg_m, lightship_lcg_m=lightship_lcg_m,
        lightship_tcg_m=lightship_tcg_m, name=name, **kw,
    )


def barge_at(draft_m: float, kg_m: float, **kw) -> tuple[Vessel, Condition]:
    """The barge floating upright at ``draft_m`` with solid KG ``kg_m``: all mass in the lightship.

    Δ = ρ·L·B·T (checks.md §1.1), G on the centreline at midships.
    """
    disp = RHO_SW * BARGE_L * BARGE_B * draft_m
    vessel = box_barge(lightship_t=disp, lightship_kg_m=kg_m, **kw)
    return vessel, Condition(name=f"Barge T={draft_m} KG={kg_m}")


def barge_tanks() -> tuple[Tank, ...]:
    """A set of box tanks inside the barge for the property tests.

    Double-bottom ballast pair, a wing fuel pair, a centreline fresh-water tank, a
    lube-oil tank and a cargo-liquid tank; all inside the 40 × 10 × 4 m box.
    """
    return (
        box_tank("DB1P", length_m=8.0, breadth_m=4.5, height_m=0.8, lcg_m=10.0, tcg_m=-2.5, pair="DB1S"),
        box_tank("DB1S", length_m=8.0, breadth_m=4.5, height_m=0.8, lcg_m=10.0, tcg_m=2.5, pair="DB1P"),
        box_tank("FO1P", length_m=6.0, breadth_m=1.5, height_m=3.0, lcg_m=25.0, tcg_m=-4.0, bottom_m=0.8,
                 kind="fuel_oil", density_t_m3=0.95, pair="FO1S"),
        box_tank("FO1S", length_m=6.0, breadth_m=1.5, height_m=3.0, lcg_m=25.0, tcg_m=4.0, bottom_m=0.8,
                 kind="fuel_oil", density_t_m3=0.95, pair="FO1P"),
        box_tank("FW1C", length_m=4.0, breadth_m=3.0, height_m=2.0, lcg_m=34.0, bottom_m=0.8,
                 kind="fresh_water", density_t_m3=1.0),
        box_tank("LO1C", length_m=1.0, breadth_m=1.0, height_m=1.0, lcg_m=30.0, bottom_m=0.8,
                 kind="lube_oil", density_t_m3=0.9),
        box_tank("CL1C", length_m=6.0, breadth_m=3.0, height_m=2.5, lcg_m=18.0, bottom_m=0.8,
                 kind="cargo_liquid", density_t_m3=0.85),
    )


# --------------------------------------------------------------------------- parallel-sided vessel


@dataclass(frozen=True)
class ParallelForm:
    """The numbers a textbook example gives about the hull at one displacement."""

    displacement_t: float
    """The reference displacement Δ0 (t), at table density."""
    draft_m: float
    """Draft at the LCF at Δ0 (m)."""
    lcb_m: float
    """LCB at Δ0 (m from AP)."""
    lcf_m: float
    """LCF (m from AP), constant."""
    kmt_m: float
    """KMt (m), constant."""
    tpc_t_cm: float
    """TPC (t/cm), constant."""
    mctc_tm_cm: float
    """MCTC (t·m/cm), constant."""
    lbp_m: float
    breadth_m: float = 20.0
    depth_m: float = 12.0


def parallel_sided_vessel(
    form: ParallelForm,
    *,
    lightship: MassItem,
    tanks: tuple[Tank, ...] = (),
    extra_displacements_t: tuple[float, ...] = (),
    span_t: float | None = None,
    free_surface: FreeSurfaceSettings | None = None,
    name: str = "Parallel-sided test vessel",
) -> Vessel:
    """A vessel whose waterplane does not change over the tabulated range.

    TPC, LCF, MCTC and KMt are constant; the draft grows by ΔΔ/(100·TPC) and the LCB
    follows the layer relation Δ·LCB = Δ0·LCB0 + (Δ − Δ0)·LCF, which holds exactly
    when each added layer has its centroid at the LCF (textbook: a weight loaded at
    the LCF causes no change of trim).  The table has rows at Δ0 ± span and at every
    ``extra_displacements_t``, so a condition that lands on a row is interpolated exactly.

    Cross curves: KN = KMt·sin φ, the metacentric form, which is exact when M does
    not move with heel (a circular section about its axis, checks.md §2.2); on it the
    angle of list is exactly tan φ = TCG/GM_fluid, the textbook relation.
    """
    d0 = form.displacement_t
    span = span_t if span_t is not None else 0.2 * d0
    rows = sorted({d0 - span, d0, d0 + span, *extra_displacements_t})
    disp = np.array(rows, dtype=float)
    draft = form.draft_m + (disp - d0) / (100.0 * form.tpc_t_cm)
    lcb = (d0 * form.lcb_m + (disp - d0) * form.lcf_m) / disp
    n = len(disp)
    hyd = HydrostaticTable(
        draft_m=frozen_array(draft),
        displacement_t=frozen_array(disp),
        lcb_m=frozen_array(lcb),
        lcf_m=frozen_array(np.full(n, form.lcf_m)),
        kmt_m=frozen_array(np.full(n, form.kmt_m)),
        tpc_t_cm=frozen_array(np.full(n, form.tpc_t_cm)),
        mctc_tm_cm=frozen_array(np.full(n, form.mctc_tm_cm)),
    )
    sin = np.sin(np.radians(HEELS_DEG))
    cc = CrossCurves(
        heel_deg=frozen_array(HEELS_DEG),
        displacement_t=frozen_array(disp),
        kn_m=frozen_array(np.outer(np.full(n, form.kmt_m), sin)),
    )
    return Vessel(
        particulars=Particulars(
            name=name, lbp_m=form.lbp_m, breadth_m=form.breadth_m, depth_m=form.depth_m,
            design_draft_m=form.draft_m, table_density_t_m3=RHO_SW,
        ),
        lightship=lightship,
        hydrostatics=hyd,
        cross_curves=cc,
        tanks=tuple(tanks),
        free_surface=free_surface or FreeSurfaceSettings(),
    )


def mass_to_close(total_t: float, centre: tuple[float, float, float], parts: list[tuple[float, float, float, float]]) -> MassItem:
    """The one mass that, added to ``parts`` [(w, x, z, y)], gives Δ = total at ``centre`` (x, z, y).

    Used to pose a textbook 'Δ … KG …' statement as lightship + listed items:
    w0 = Δ − Σw, x0 = (Δ·X − Σw·x)/w0, and the same for z and y.
    """
    w = sum(p[0] for p in parts)
    w0 = total_t - w
    x0 = (total_t * centre[0] - sum(p[0] * p[1] for p in parts)) / w0
    z0 = (total_t * centre[1] - sum(p[0] * p[2] for p in parts)) / w0
    y0 = (total_t * centre[2] - sum(p[0] * p[3] for p in parts)) / w0
    return MassItem("Lightship and other weights", w0, x0, z0, y0)


# --------------------------------------------------------------------------- benchmark vessel


SYN_L, SYN_B, SYN_D = 100.0, 20.0, 10.0
SYN_DRAFTS_M = tuple(np.round(np.arange(1.0, 9.0001, 0.5), 10))


def synthetic_vessel(n_items: int) -> tuple[Vessel, Condition]:
    """An N-item vessel and a condition that loads every item, for the benchmark.

    The hull is a 100 × 20 × 10 m box (tables from the same closed forms as the
    barge).  Of the ``n_items`` loaded items, 60 % are tanks (transverse pairs of box
    tanks of every liquid kind, plus a centreline tank when the count is odd), 30 %
    deck items and 10 % constants.  Every tank is loaded at a different fill, so the
    free-surface rules, nominally-full and empty states all occur.  Demo data only:
    the masses are invented, the tables are exact for the box.
    """
    if n_items < 3:
        raise ValueError("synthetic_vessel needs at least 3 items")
    n_tanks = max(1, round(0.6 * n_items))
    n_deck = max(1, round(0.3 * n_items))
    n_const = max(1, n_items - n_tanks - n_deck)
    kinds = ("ballast", "fuel_oil", "diesel", "fresh_water", "lube_oil", "cargo_liquid", "other")
    dens = {"ballast": 1.025, "fuel_oil": 0.95, "diesel": 0.86, "fresh_water": 1.0,
            "lube_oil": 0.9, "cargo_liquid": 0.85, "other": 1.0}
    tanks: list[Tank] = []
    k = 0
    while len(tanks) < n_tanks:
        kind = kinds[k % len(kinds)]
        x = 5.0 + (k * 7.3) % 90.0
        if n_tanks - len(tanks) >= 2:
            p, s = f"T{k:03d}P", f"T{k:03d}S"
            for tid, y, partner in ((p, -5.0, s), (s, 5.0, p)):
                tanks.append(box_tank(tid, length_m=2.0, breadth_m=3.0, height_m=1.5, lcg_m=x, tcg_m=y,
                                      bottom_m=0.5 + (k % 5), kind=kind, density_t_m3=dens[kind], pair=partner,
                                      steps=15))
        else:
            tanks.append(box_tank(f"T{k:03d}C", length_m=2.0, breadth_m=3.0, height_m=1.5, lcg_m=x,
                                  bottom_m=0.5 + (k % 5), kind=kind, density_t_m3=dens[kind], steps=15))
        k += 1
    vessel = Vessel(
        particulars=Particulars(name=f"Synthetic {n_items}-item vessel", lbp_m=SYN_L, breadth_m=SYN_B,
                                depth_m=SYN_D, design_draft_m=5.0, table_density_t_m3=RHO_SW),
        lightship=MassItem("Lightship", 6000.0, 49.0, 6.0, 0.0),
        hydrostatics=box_barge_hydrostatics(SYN_DRAFTS_M, SYN_L, SYN_B),
        cross_curves=box_barge_cross_curves(SYN_DRAFTS_M, SYN_L, SYN_B, SYN_D),
        tanks=tuple(tanks),
    )
    fills = tuple(TankFill(t.id, "percent", float((17 * j) % 101)) for j, t in enumerate(tanks))
    deck = tuple(DeckItem(f"Deck item {j}", 5.0 + j % 11, 5.0 + (j * 3.7) % 90.0, 10.5 + j % 3,
                          ((j % 9) - 4) * 1.0) for j in range(n_deck))
    consts = tuple(MassItem(f"Constant {j}", 1.0 + j % 4, 10.0 + (j * 5.1) % 80.0, 8.0, 0.0) for j in range(n_const))
    cond = Condition(name=f"Synthetic {n_items}-item condition", tanks=fills, deck_items=deck, constants=consts)
    return vessel, cond


def pilot_app(tmp_path, **create_kw):
    """The loading screen over the box barge with its tanks, DB1P half full (the screen tests' common
    start); ``create_kw`` for :func:`deckload.ui.launch.create_app` (log_dir, officer, …)."""
    from deckload.core.model import Condition, TankFill
    from deckload.ui.launch import create_app

    condition = Condition(name="Pilot", tanks=(TankFill("DB1P", "percent", 50.0),))
    return create_app(box_barge(tanks=barge_tanks()), condition, work_dir=tmp_path / "work", **create_kw)
