"""``evaluate(vessel, condition) -> Result``: the one entry point of the computation.

A pure function: the same profile and condition always give the same result, and
nothing outside is read or written.  It is a pipeline of six named stages, each a
pure function of the vessel, the condition and the stages before it, each with its
own test against a closed form (tests/test_evaluate_stages.py):

1. :func:`stage_weights` — tank contents and item weights (:mod:`loading`): Δ, LCG,
   KG solid, TCG;
2. :func:`stage_free_surface` — free-surface moment of each tank (:mod:`free_surface`);
   FSC = ΣFSM/Δ; KG fluid;
3. :func:`stage_upright` — hydrostatics at the density-corrected displacement
   (:mod:`hydrostatics`), or at the equilibrium trim when the profile has tables at several
   trims (:mod:`trimmed_tables`); GM solid and fluid; MCTC (:mod:`trim`), trim, drafts; the
   load-line draft allowed in this water;
4. :func:`stage_curve` — the GZ curve (:mod:`gz`) on both sides and the list read
   off it: GZ = KN − KG_fluid·sinφ − TCG·cosφ (constant correction), or
   GZ = KN − KG_solid·sinφ − TCG·cosφ − Σρ·M(φ)/Δ with the actual moment of fluid
   transfer M (IS 2008 Part B 3.1, the alternative to a constant correction);
5. :func:`stage_criteria` — the measures on the low side, the criteria sets
   (:mod:`criteria`, :mod:`verdict`), the deck-edge angle;
6. :func:`stage_warnings` — every caution and danger, in one list.

:func:`evaluate` runs them in that order and puts their outputs into one
:class:`~deckload.core.result.Result`.  Each stage's cautions that arise while it
works travel in its output's ``notes`` and are gathered by the last stage.
"""

from __future__ import annotations

import math
from dataclasses import replace
from functools import lru_cache

import numpy as np

from deckload.core import gz as gzmod
from deckload.core.bounds import bounded, off_centre
from deckload.core.criteria import LIMIT_CURVE_SET, SET_TITLES, Measures, limit_curve_criterion, osv_area_end_deg
from deckload.core.free_surface import (BASIS_NONE, TankFreeSurface, band_text, free_surface, pct_text, settings_departures,
                                        transfer_moment_m4)
from deckload.core.frozen import frozen
from deckload.core.hydrostatics import Upright, draft_at, fresh_water_allowance_m, mark_density_t_m3, permitted_draft_m
from deckload.core.loading import (LoadingError, TankContents, WeightSum, apart, fixed, hold_item, resolve_tanks,
                                   stated_density_notes, sum_weights)
from deckload.core.model import Condition, LoadLine, Vessel, effective_constants
from deckload.core.result import CriterionResult, ItemResult, NotAssessed, Result, TankResult, Warning
from deckload.core.tables import OutOfRangeError, bracket, interp, lerp_row
from deckload.core.verdict import Afloat, Verdict, assess, deck_edge_angle
from deckload.core.soundings import level_soundings, sounding_note
from deckload.core.trim import BASIS_TABLE, TrimMoment, even_keel_kn_limit, kn_reference_note
from deckload.core.trimmed_tables import covers_kn, kn_row_for, table_state

LIST_WARNING_DEG = 2.0
NEAR_LIMIT_FRACTION = 0.10


# --------------------------------------------------------------------------- stage outputs


@frozen
class Weights:
    """Stage 1: everything aboard and its centre of gravity (solid, before free surface)."""

    items: tuple[ItemResult, ...]
    """Lightship, hold, deck and constant items, in that order."""
    contents: tuple[TankContents, ...]
    """Every tank's contents (profile order), soundings already levelled to even keel."""
    total: WeightSum
    """Δ (t), LCG, KG solid, TCG (m)."""
    notes: tuple[Warning, ...]
    """Cautions about soundings taken trimmed or listed."""


@frozen
class FreeSurface:
    """Stage 2: the free-surface moments and the KG they give."""

    rule: str
    """'is2008' or 'actual'."""
    per_tank: tuple[TankFreeSurface, ...]
    """The treatment of each tank, in the order of :attr:`Weights.contents`."""
    fsm_total_tm: float
    fsc_m: float
    """FSC = ΣFSM/Δ (m)."""
    kg_fluid_m: float
    """KG solid + FSC (m)."""
    tanks: tuple[TankResult, ...]
    """Each tank's contents with the moment counted for it, as the views show them."""


@frozen
class Floating:
    """Stage 3: upright hydrostatics, metacentric heights, trim and drafts."""

    hydrostatics: Upright
    """The table at the density-corrected displacement (draft at LCF, LCB, LCF, KMt, TPC)."""
    gm_solid_m: float
    gm_fluid_m: float
    trim_moment: TrimMoment
    """MCTC used for the trim and its basis (actual GML or the table's column)."""
    trim_m: float
    """+ by the stern (m)."""
    draft_aft_m: float
    draft_fwd_m: float
    draft_mid_m: float
    load_line: tuple[LoadLine, float | None] | None
    """(governing mark, draft allowed at midships in this water or None when its summer draft is off
    the table), or None when the profile has no marks."""
    notes: tuple[Warning, ...]
    """Cautions on trim beyond the even-keel tables, G far from the KN's LCG, MCTC from the table."""
    kn_beyond: str | None = None
    """Why the criteria read off the GZ curve cannot be judged at this trim: KN at even keel only and
    the trim beyond :data:`~deckload.core.trim.EVEN_KEEL_KN_LIMIT_FRACTION` of LBP; None otherwise."""


@frozen(eq=False)
class Curve:
    """Stage 4: the GZ curve heeling to either side on the fine grid, and the list."""

    correction: str
    """'constant' or 'transfer'."""
    heel_deg: np.ndarray
    """The fine heel grid, 0° up to the KN table's last angle."""
    gz_stbd_m: np.ndarray
    gz_port_m: np.ndarray
    """GZ heeling to port, positive when righting (GZ(−φ) = −GZ_port(φ))."""
    side: str
    """'port' or 'starboard': the side G lies to (starboard when on the centreline), where the criteria are checked."""
    facts: gzmod.CurveFacts
    """Maximum, equilibrium and vanishing angle of the low-side curve."""
    list_deg: float | None
    """Heel of equilibrium, + starboard; None when GZ never becomes positive on the checked side
    (no position of equilibrium up to the curve's last angle)."""
    notes: tuple[Warning, ...]
    """A caution naming tanks whose transfer is taken as i·sinφ for want of geometry."""
    kn_heel_deg: np.ndarray | None = None
    """The KN table's tabulated heels, between which the curve is interpolated."""
    kn_spread_m: np.ndarray | None = None
    """KN by a shape-preserving interpolation (:func:`~deckload.core.gz.pchip_curve`) of the same row,
    less KN by the natural spline, on the fine grid: added to either GZ it gives the second opinion
    the criteria are judged on as well (:func:`stage_criteria`)."""

    @property
    def gz_lee_m(self) -> np.ndarray:
        """GZ heeling to the side she lists to."""
        return self.gz_port_m if self.side == "port" else self.gz_stbd_m

    @property
    def gz_other_m(self) -> np.ndarray:
        """GZ heeling to the other side."""
        return self.gz_stbd_m if self.side == "port" else self.gz_port_m

    @property
    def end_deg(self) -> float:
        """The last angle of the curve (the KN table's last angle)."""
        return float(self.heel_deg[-1])


@frozen
class Assessment:
    """Stage 5: what the criteria are measured on and what they say."""

    flood_deg: float | None
    """Downflooding angle θf at this displacement, None without a curve or outside it."""
    area_0_30_mrad: float
    area_0_40_mrad: float
    """Area to 40° or θf if less."""
    area_30_40_mrad: float
    criteria: tuple[CriterionResult, ...]
    verdict: Verdict
    deck_edge_deg: float
    notes: tuple[Warning, ...]
    """Dangers on downflooding and the limiting curve; cautions on the deck edge and the verdict."""


# --------------------------------------------------------------------------- the pipeline


@bounded
def evaluate(vessel: Vessel, condition: Condition) -> Result:
    """Complete intact-stability state of ``vessel`` in ``condition``: the six stages in order.

    Raises :class:`~deckload.core.loading.LoadingError` for a condition that does not
    fit the vessel and :class:`~deckload.core.tables.OutOfRangeError` when the
    displacement lies outside the hydrostatic or cross-curve tables.
    """
    weights = stage_weights(vessel, condition)
    fs = stage_free_surface(vessel, weights, condition.fs_rule or vessel.free_surface.rule)
    floating = stage_upright(vessel, condition, weights, fs)
    curve = stage_curve(vessel, weights, fs, floating, condition.gz_correction or vessel.free_surface.gz_correction)
    assessment = stage_criteria(vessel, condition, weights, fs, floating, curve)
    warnings = stage_warnings(vessel, condition, weights, fs, floating, curve, assessment)
    return _result(vessel, condition, weights, fs, floating, curve, assessment, warnings)


def stage_weights(vessel: Vessel, condition: Condition) -> Weights:
    """Stage 1: Δ = Σw; LCG = Σw·x/Δ; KG = Σw·z/Δ; TCG = Σw·y/Δ (standards.md §6.3).

    The items are the lightship, the hold loads, the deck items and the constants
    (the profile's and the condition's); each tank's contents come from its
    calibration table (:func:`~deckload.core.loading.resolve_tanks`) after a sounding
    taken trimmed or listed is turned into the even-keel sounding of the same volume
    (:mod:`soundings`).  Raises :class:`LoadingError` for a hold, deck area or mass
    that does not fit the vessel.
    """
    items = _items(vessel, condition)
    levelled, s_done, s_not = level_soundings(vessel, condition)
    contents = resolve_tanks(vessel, levelled)
    total = sum_weights(items, contents)
    notes = tuple(Warning(code, msg, "caution") for code, msg in
                  sounding_note(condition, s_done, s_not) + stated_density_notes(vessel, condition))
    return Weights(tuple(items), tuple(contents), total, notes)


def stage_free_surface(vessel: Vessel, weights: Weights, rule: str) -> FreeSurface:
    """Stage 2: FSM per tank under ``rule``; FSC = ΣFSM/Δ; KG fluid = KG solid + FSC.

    FSM = ρ·i with i the transverse second moment of the free surface (standards.md
    §4.3, textbook); which level each tank is taken at follows IS 2008 Part B 3.1
    (rule ``is2008``, :func:`~deckload.core.free_surface.free_surface`) or the actual
    level of every slack tank (rule ``actual``, B 3.1.6).  FSC is the virtual rise of
    G (standards.md §4.3).
    """
    contents = list(weights.contents)
    fs = free_surface(vessel, contents, rule)
    fsm_total = sum(t.fsm_tm for t in fs)
    fsc = fsm_total / weights.total.mass_t
    kg_fluid = weights.total.vcg_m + fsc
    tanks = tuple(map(_tank_result, contents, fs))
    return FreeSurface(rule, tuple(fs), fsm_total, fsc, kg_fluid, tanks)


@lru_cache(maxsize=2048)
def _tank_result(c: TankContents, t: TankFreeSurface) -> TankResult:
    """One tank's line of the result (kept for equal contents and treatment: most tanks are
    unchanged from one evaluation to the next)."""
    return TankResult(
        id=c.tank.id, name=c.tank.name, kind=c.tank.kind, fill_pct=c.fill_pct, volume_m3=c.volume_m3,
        mass_t=c.mass_t, density_t_m3=c.density_t_m3, lcg_m=c.lcg_m,
        sounding_m=c.sounding_m if c.tank.level_known else None,
        vcg_m=c.vcg_m, tcg_m=c.tcg_m, fsi_m4=c.fsi_m4, fsm_tm=t.fsm_tm, fs_rule=t.rule, state=t.state,
        worst_band_pct=c.tank.worst_band_pct, capacity_m3=c.tank.capacity_m3,
    )


def stage_upright(vessel: Vessel, condition: Condition, weights: Weights, fs: FreeSurface) -> Floating:
    """Stage 3: hydrostatics, GM, trim and drafts of the upright ship.

    * table look-ups at the equivalent displacement Δ·ρ_table/ρ_water, TPC and MCTC
      scaled by ρ_water/ρ_table (:func:`~deckload.core.hydrostatics.upright`);
    * GM solid = KMt − KG, GM fluid = KMt − KG fluid (standards.md §4.3);
    * MCTC = Δ·(KML − KG fluid)/(100·LBP) where the profile has KML, else the table's
      (:func:`~deckload.core.trim.trim_moment`);
    * trim t = Δ·(LCB − LCG)/(100·MCTC), + by the stern; T(x) = T_F + t·(x_F − x)/LBP
      at the AP (x = 0), FP (x = LBP) and midships (standards.md §6.3);
    * with tables at several trims, the tables interpolated in trim and the trim found by
      iteration (:func:`~deckload.core.trimmed_tables.table_state`), a caution outside the
      trims covered and refusal where the error would exceed tolerance;
    * the draft allowed at the condition's load-line mark (or summer) in this water:
      mark + FWA·(ρ_mark − ρ)/0.025, FWA = Δ_s/(4·TPC_s) mm at the summer draft
      (standards.md §6.1, ICLL; the dock-water rule from memory there).

    The list is not worked here: it is where the low-side GZ curve rises through
    zero (:func:`stage_curve`), right at large angles where tanφ = TCG/GM is not.
    """
    w = weights.total
    disp = w.mass_t
    lbp = vessel.particulars.lbp_m
    # even-keel tables, or tables at several trims interpolated at the equilibrium trim
    # (core/trimmed_tables.py); MCT from the actual GM_L where the profile has KM_L (core/trim.py)
    ts = table_state(vessel, disp, condition.water_density_t_m3, w.lcg_m, fs.kg_fluid_m)
    hy, mct, trim = ts.upright, ts.moment, ts.trim_m
    gm_solid = hy.kmt_m - w.vcg_m
    gm_fluid = hy.kmt_m - fs.kg_fluid_m
    t_aft = draft_at(0.0, hy.draft_m, hy.lcf_m, trim, lbp)
    t_fwd = draft_at(lbp, hy.draft_m, hy.lcf_m, trim, lbp)
    t_mid = draft_at(lbp / 2.0, hy.draft_m, hy.lcf_m, trim, lbp)
    notes: list[Warning] = []
    if ts.trim_note is not None:
        notes.append(Warning("trim-beyond-tables", ts.trim_note, "caution"))
    # KN at even keel only (no KN at trims, or the even-keel set alone): beyond the bound they cannot
    # support a verdict on what is read off the GZ curve (core/trim.py, EVEN_KEEL_KN_LIMIT_FRACTION)
    kn_even_only = vessel.trimmed is None or len(vessel.trimmed.kn_trim_m) == 1
    kn_beyond = even_keel_kn_limit(trim, lbp) if kn_even_only else None
    # trimmed KN covering the trim are made for her own trim: the free-trim reference LCG does not apply
    kn_note = (None if covers_kn(vessel, trim) or kn_beyond is not None
               else kn_reference_note(vessel.cross_curves, w.lcg_m, lbp, trim))
    if kn_note is not None:
        notes.append(Warning("kn-reference-lcg", kn_note, "caution"))
    if mct.basis == BASIS_TABLE and not ts.trimmed:
        notes.append(Warning("trim-from-table-mctc",
                             "the profile has no KML: trim is worked from the tabulated MCTC (made with BML, "
                             "not the actual GML), so it is slightly too small", "caution"))
    return Floating(hy, gm_solid, gm_fluid, mct, trim, t_aft, t_fwd, t_mid,
                    _allowed_draft(vessel, condition), tuple(notes), kn_beyond)


def _port_transfer_m4(vessel: Vessel, tank, basis: str, fill_pct: float, heel_rad: np.ndarray,
                      m_stbd: np.ndarray, taken_as_stbd: list[str]) -> np.ndarray:
    """M'(φ), the tank's moment of transfer heeled to port: its own port table where the
    profile gives one (made from the tank's shape); else, in a pair, the partner's starboard
    table (the mirror image heeled to starboard); else its own starboard table, which is
    right only for a tank symmetric about its own centre plane (derived: the mirror of
    such a tank is the tank itself), so an unpaired tank off the centreline is named in
    ``taken_as_stbd`` for a caution.  Without any table (i·sinφ) both sides are alike."""
    tr = tank.transfer
    if tr is not None and tr.moment_port_m4 is not None:
        return transfer_moment_m4(tank, basis, fill_pct, heel_rad, port=True)
    mirror = vessel.tank(tank.pair) if tank.pair else None
    if mirror is not None and mirror.transfer is not None:
        return transfer_moment_m4(mirror, basis, fill_pct, heel_rad)
    if tr is not None and off_centre(tank.calibration.tcg_m, vessel.particulars.breadth_m):
        taken_as_stbd.append(tank.id)
    return m_stbd


def stage_curve(vessel: Vessel, weights: Weights, fs: FreeSurface, floating: Floating, correction: str) -> Curve:
    """Stage 4: GZ heeling to starboard and to port on the fine grid, and the list.

    KN at the table-equivalent displacement (:func:`~deckload.core.gz.kn_curve`), then
    GZ(φ) = KN(φ) − KG_fluid·sinφ ∓ TCG·cosφ with ``constant`` correction (standards.md
    §4.3, §6.3), or GZ(φ) = KN(φ) − KG_solid·sinφ − Σρ·M(φ)/Δ ∓ TCG·cosφ with the
    actual volumetric moment of fluid transfer M of each counted tank (``transfer``;
    IS 2008 Part B 3.1, standards.md §4.1).  Heeled to port each tank takes
    :func:`_port_transfer_m4`: its own port table where the profile gives one, else a
    paired tank its partner's (the mirror image heeled to starboard), else its own
    starboard table.  The curve stops at the KN table's last angle.

    The criteria side is the side G lies to.  The list is where that side's curve
    rises through zero: tanφ = TCG/GM fluid for small angles (standards.md §6.3) and
    still right at large ones, where the small-angle formula overstates it; with
    GM ≤ 0 it is the angle of loll.
    """
    w = weights.total
    disp = w.mass_t
    kn_table, kn_row = kn_row_for(vessel, floating.hydrostatics.table_displacement_t, floating.trim_m)
    kn = gzmod.heel_curve(kn_table, kn_row)  # as kn_for gives it; the row is kept for the second opinion
    kn_heels = kn_table.heel_deg
    # The curve stops at the KN table's last angle (booklets may end at 60°): cut the grid.
    n_grid = len(kn)
    spread = gzmod.pchip_curve(kn_heels, kn_row, n_grid) - kn
    fine_deg, fine_rad = gzmod.FINE_DEG[:n_grid], gzmod.FINE_RAD[:n_grid]
    sin, cos = gzmod.SIN[:n_grid], gzmod.COS[:n_grid]
    notes: list[Warning] = []
    if correction == "transfer":
        # The upright (0°) inertia still gives GM fluid; the curve takes the actual
        # moment of fluid transfer of each counted tank at each heel.
        shift_stbd = np.zeros_like(kn)
        shift_port = np.zeros_like(kn)
        no_geometry = []
        taken_as_stbd: list[str] = []
        for c, t in zip(weights.contents, fs.per_tank):
            if t.basis == BASIS_NONE:
                continue
            if c.tank.transfer is None:
                no_geometry.append(c.tank.id)
            m_stbd = transfer_moment_m4(c.tank, t.basis, c.fill_pct, fine_rad)
            m_port = _port_transfer_m4(vessel, c.tank, t.basis, c.fill_pct, fine_rad, m_stbd, taken_as_stbd)
            shift_stbd += c.density_t_m3 * m_stbd
            shift_port += c.density_t_m3 * m_port
        base_stbd = kn - w.vcg_m * sin - shift_stbd / disp
        base_port = kn - w.vcg_m * sin - shift_port / disp
        if no_geometry:
            notes.append(Warning("fs-no-geometry",
                                 "no tank geometry for " + ", ".join(no_geometry)
                                 + ": their transfer is taken as i·sinφ", "caution"))
        if taken_as_stbd:
            notes.append(Warning("fs-port-as-starboard",
                                 "heeling to port, the transfer of " + ", ".join(taken_as_stbd)
                                 + " is taken from its starboard table (no port table and no pair): right only "
                                 "for a tank symmetric about its own centre plane; give moment_port_m4, or make the "
                                 "tables again with 'deckload tables' from the tank's shape", "caution"))
    else:
        base_stbd = base_port = kn - fs.kg_fluid_m * sin
    gz_stbd = base_stbd - w.tcg_m * cos
    gz_port = base_port + w.tcg_m * cos
    side = "port" if w.tcg_m < 0 else "starboard"
    f = gzmod.facts(gz_port if side == "port" else gz_stbd)
    eq = f.equilibrium_deg
    heel = None if eq is None else eq if side == "starboard" else -eq
    return Curve(correction, fine_deg, gz_stbd, gz_port, side, f, heel, tuple(notes), kn_heels, spread)


def stage_criteria(vessel: Vessel, condition: Condition, weights: Weights, fs: FreeSurface,
                   floating: Floating, curve: Curve) -> Assessment:
    """Stage 5: the measures on the low-side curve and every criteria set that applies.

    Areas under GZ by the trapezoidal rule on the 0.1° grid, in m·rad (standards.md
    §6.3): 0–30°, 0–40° (or 0–θf when θf < 40°, IS 2008 Part A 2.2.1) and their
    difference; the largest GZ from 30° up to θf (or 90°) for "GZ ≥ 0.20 m at 30° or
    more" (common practice: conservative); the angle of maximum GZ (0 when GZ is
    never positive); the area to that angle (or θf) for IS 2008 Part B 2.4.5.  θf and
    the limiting KG/GM are read at the table-equivalent displacement, like the KN
    they are made with.  The sets themselves are :func:`~deckload.core.verdict.assess`'s;
    a curve that stops before 90° leaves undecided what lies beyond it
    (:func:`_short_curve`).
    """
    disp = weights.total.mass_t
    table_disp = floating.hydrostatics.table_displacement_t
    kg_fluid, gm_fluid = fs.kg_fluid_m, floating.gm_fluid_m
    gz, f = curve.gz_lee_m, curve.facts
    notes: list[Warning] = []
    # Both curves are tabulated against displacement at the table density, like the KN
    # curves they are made with: the same waterline, so the same equivalent displacement.
    flood = curve_limit(vessel.downflooding, table_disp)
    flood_unknown = ""
    if vessel.downflooding is None:
        notes.append(Warning("downflooding-not-given", flood_not_given(curve.end_deg), "caution"))
    elif flood is None:
        flood_unknown = _off_curve(vessel.downflooding, "downflooding-angle curve", disp, table_disp)
        notes.append(Warning("downflooding-range",
                             f"{flood_unknown}: θf is unknown, so the criteria worked to θf "
                             "(areas to 40° or θf, GZ at 30° or more, the weather criterion's θ2) are not assessable, "
                             "or failed where no θf could meet them", "danger"))
    elif flood < 30.0:
        notes.append(Warning("downflooding-low",
                             f"downflooding angle θf {flood:.1f}° is below 30°: openings immerse before 30°, "
                             "so the 30°–θf area is nil", "danger"))
    measures = curve_measures(gz, f, flood, gm_fluid)
    limit_rows = []
    limit_missing = None
    if vessel.limit_curve is not None:
        lim = curve_limit(vessel.limit_curve, table_disp)
        off = None
        if lim is None:
            off = _off_curve(vessel.limit_curve, "limiting curve", disp, table_disp)
        elif (trims := vessel.limit_curve.trim_range_m) is not None and not (
                trims[0] - 1e-9 <= floating.trim_m <= trims[1] + 1e-9):
            # IS 2008 Part A 2.1.7: the curve proves nothing at a trim it was not made for.
            off = (f"trim {floating.trim_m:+.3f} m is outside the trims the limiting curve covers, "
                   f"{trims[0]:+.2f} to {trims[1]:+.2f} m")
        if off is not None:
            notes.append(Warning("limit-curve-range", f"{off}: that check was not made", "danger"))
            limit_missing = NotAssessed(SET_TITLES[LIMIT_CURVE_SET], off, applies=True)
        else:
            limit_rows.append(limit_curve_criterion(vessel.limit_curve.kind, lim, kg_fluid, gm_fluid))
    deck_edge, deck_edge_note = deck_edge_angle(vessel, table_disp, floating.draft_mid_m)
    if deck_edge_note:
        notes.append(Warning("deck-edge-approximate", deck_edge_note, "caution"))
    afloat = Afloat(
        displacement_t=disp, water_density_t_m3=condition.water_density_t_m3, draft_mid_m=floating.draft_mid_m,
        kg_fluid_m=kg_fluid, gm_fluid_m=gm_fluid, heel_deg=curve.heel_deg, gz_lee_m=gz,
        gz_other_m=curve.gz_other_m, flood_deg=flood, deck_edge_deg=deck_edge,
        measures=measures, max_gz_m=f.max_gz_m, vanishing_deg=f.vanishing_angle_deg,
        equilibrium_deg=f.equilibrium_deg,
        deck_windage=tuple((d.windage_area_m2, d.windage_centroid_z_m) for d in condition.deck_items
                           if d.windage_area_m2 is not None and d.windage_centroid_z_m is not None),
        deck_items_without_windage=tuple(d.name for d in condition.deck_items
                                         if d.windage_area_m2 is None or d.windage_centroid_z_m is None),
        flood_unknown=flood_unknown,
    )
    verdict = assess(vessel, afloat, limit_rows, limit_missing)
    criteria = list(verdict.criteria)
    top, hi = _area_top(flood), _gz30_top(flood)
    if curve.end_deg < 90.0 - 1e-9:
        criteria = _short_curve(criteria, curve.end_deg, hi, top, f.max_gz_angle_deg)
    if floating.kn_beyond is not None:
        criteria = [replace(c, assessed=False, passed=False, note=floating.kn_beyond) if reads_gz_curve(c) else c
                    for c in criteria]
        # the weather criterion's numbers are read off the same curve: none is shown as if it stood
        verdict = replace(verdict, weather=None)
    elif curve.kn_spread_m is not None:
        # The same KN row by a shape-preserving interpolation: a criterion the spline passes and it
        # fails was decided by the interpolation between the table's heels, not by the table.
        if _second_opinion_may_differ(criteria, curve.heel_deg, gz, curve.kn_heel_deg, curve.kn_spread_m):
            gz2 = gz + curve.kn_spread_m
            f2 = gzmod.facts(gz2)
            afloat2 = replace(afloat, gz_lee_m=gz2, gz_other_m=curve.gz_other_m + curve.kn_spread_m,
                              measures=curve_measures(gz2, f2, flood, gm_fluid), max_gz_m=f2.max_gz_m,
                              vanishing_deg=f2.vanishing_angle_deg, equilibrium_deg=f2.equilibrium_deg)
            second = list(assess(vessel, afloat2, limit_rows).criteria)
            if curve.end_deg < 90.0 - 1e-9:
                second = _short_curve(second, curve.end_deg, hi, top, f2.max_gz_angle_deg)
        else:
            second = criteria  # no criterion is near enough its limit for the second opinion to decide it
        band = gzmod.max_band(gz, curve.kn_heel_deg, curve.kn_spread_m)
        criteria = _marginal(criteria, second, band)
    # Each set's pass is decided again from its criteria as the cuts above left them, whichever ran.
    verdict = _with_sets(verdict, criteria)
    for note in verdict.cautions:
        code = "weather-not-assessed" if "not assessed" in note else "verdict-note"
        notes.append(Warning(code, note, "caution"))
    return Assessment(flood, measures.area_0_30_mrad, measures.area_0_40_mrad, measures.area_30_40_mrad,
                      tuple(criteria), verdict, deck_edge, tuple(notes))


PASSENGER_WORDS = ("passeng", "pax", "person", "people")
"""A constant or deck item whose name holds one of these (any case) is taken to hold the
passengers: "Passengers", "120 pax", "Persons on board and effects"."""


def _names_passengers(name: str) -> bool:
    low = name.lower()
    return any(w in low for w in PASSENGER_WORDS)

LOLL_EITHER_SIDE_TCG_M = 1e-6
"""A TCG within a micrometre of the centreline (round-off of the weight sums) leaves the side of a
loll undetermined: she may lie over to either side."""


def stage_warnings(vessel: Vessel, condition: Condition, weights: Weights, fs: FreeSurface,
                   floating: Floating, curve: Curve, assessment: Assessment) -> tuple[Warning, ...]:
    """Stage 6: every caution and danger of the condition: her state first (a loll, no position of
    equilibrium), then the checks, then the stages' notes.

    The checks (:func:`_warnings`): each criterion not assessed, failed, or within
    10 % of its limit; tanks in their worst slack band; a list over 2° (both thresholds
    deckload's own); the midships draft over the permitted load-line
    draft; deck loads per m² over the area's limit, item by item and area by area;
    hold loads over the hold's limit; two deck items or constants alike in every field.  Then the
    notes of stages 1–5 in order, then
    the ``actual`` free-surface rule (the consumables' allowance is off), and ``[free_surface]``
    settings that leave out moments IS 2008 B 3.1 counts
    (:func:`~deckload.core.free_surface.settings_departures`).
    """
    notes = [*weights.notes, *floating.notes, *curve.notes, *assessment.notes]
    # Her own state first: a loll or no equilibrium at all outranks every criterion it fails.
    state: list[Warning] = []
    if floating.gm_fluid_m <= 0.0:
        # (with no position of equilibrium there is no angle of loll: the next danger says so)
        loll = ""
        if curve.list_deg is not None:
            # G on the centreline leaves her balanced on neither side: she may flop over to either.
            # A loll is corrected by lowering G (an empty low tank, the low side first), never by
            # moving weight to the high side, which throws her over to the other side (common practice).
            side = "either side" if abs(weights.total.tcg_m) < LOLL_EITHER_SIDE_TCG_M else curve.side
            loll = (f": she lolls, about {abs(curve.list_deg):.1f}° to {side}; lower G, never move weight to "
                    "the high side (fill an empty low tank, the low side first)")
        state.append(Warning("negative-gm", f"GM fluid {floating.gm_fluid_m:.3f} m is not positive{loll}", "danger"))
    if curve.list_deg is None:
        # No number stands for the list here: the heel lies beyond the last angle the tables know.
        state.append(Warning("no-equilibrium", f"GZ never becomes positive heeling to {curve.side} up to "
                             f"{curve.heel_deg[-1]:g}°: no position of equilibrium", "danger"))
    pax = vessel.passengers
    if pax is not None and not any(_names_passengers(it.name) for it in weights.items if it.group != "lightship"):
        # [passengers] serves the crowding heel only (vessel_profiles/README.md): their mass is the
        # condition's to carry, and a crowd judged without it reads Met where the laden ship fails
        # (found by a criteria-set audit: 10.2° with 7.5 t of passengers aboard, 7.8° without).
        notes.append(Warning("passengers-not-entered",
                             f"no constant or deck item is named for the {pax.count} passengers "
                             f"({pax.count * pax.mass_per_person_t:.1f} t) whose crowding IS 2008 A 3.1 judges: "
                             "unless entered under another name, their mass is missing from Δ, KG and the "
                             "drafts (enter them named 'passengers')", "caution"))
    if fs.rule == "actual":
        notes.append(Warning("fs-rule-actual",
                             "free surface at actual levels (IS 2008 B 3.1.6): the B 3.1.3–3.1.4 allowance "
                             "for consumables is off", "caution"))
    departures = settings_departures(vessel.free_surface, fs.rule)
    if departures:
        notes.append(Warning("fs-settings-departure",
                             "free surface: " + "; ".join(words for _, words in departures)
                             + ": moments IS 2008 B 3.1 counts are left out of GM and GZ (the vessel profile's "
                             "[free_surface] settings)", "caution"))
    checks = _warnings(vessel, condition, fs.tanks, assessment.criteria, weights.items, curve.list_deg,
                       floating.draft_mid_m, floating.load_line)
    return tuple(state + checks + notes)


def _result(vessel: Vessel, condition: Condition, weights: Weights, fs: FreeSurface, floating: Floating,
            curve: Curve, assessment: Assessment, warnings: tuple[Warning, ...]) -> Result:
    """The stages' outputs as one :class:`Result` (GZ kept at whole degrees)."""
    w, hy, f, verdict = weights.total, floating.hydrostatics, curve.facts, assessment.verdict
    allowed = floating.load_line
    return Result(
        vessel_name=vessel.particulars.name,
        condition_name=condition.name,
        water_density_t_m3=condition.water_density_t_m3,
        displacement_t=w.mass_t,
        lightship_t=vessel.lightship.mass_t,
        deadweight_t=w.mass_t - vessel.lightship.mass_t,
        lcg_m=w.lcg_m,
        kg_m=w.vcg_m,
        tcg_m=w.tcg_m,
        fsm_total_tm=fs.fsm_total_tm,
        fsc_m=fs.fsc_m,
        kg_fluid_m=fs.kg_fluid_m,
        draft_at_lcf_m=hy.draft_m,
        lcb_m=hy.lcb_m,
        lcf_m=hy.lcf_m,
        km_m=hy.kmt_m,
        tpc_t_cm=hy.tpc_t_cm,
        mctc_tm_cm=floating.trim_moment.mctc_tm_cm,
        gm_solid_m=floating.gm_solid_m,
        gm_fluid_m=floating.gm_fluid_m,
        trim_m=floating.trim_m,
        draft_aft_m=floating.draft_aft_m,
        draft_fwd_m=floating.draft_fwd_m,
        draft_mean_m=floating.draft_mid_m,
        list_deg=curve.list_deg,
        gz_heel_deg=tuple(curve.heel_deg[gzmod.WHOLE_DEGREES].tolist()),
        gz_m=tuple(curve.gz_stbd_m[gzmod.WHOLE_DEGREES].tolist()),
        gz_port_m=tuple(curve.gz_port_m[gzmod.WHOLE_DEGREES].tolist()),
        criteria_side=curve.side,
        gz_correction=curve.correction,
        fs_rule=fs.rule,
        max_gz_m=f.max_gz_m,
        max_gz_angle_deg=f.max_gz_angle_deg,
        vanishing_angle_deg=f.vanishing_angle_deg,
        downflooding_angle_deg=assessment.flood_deg,
        downflooding_given=vessel.downflooding is not None,
        area_0_30_mrad=assessment.area_0_30_mrad,
        area_0_40_mrad=assessment.area_0_40_mrad,
        area_30_40_mrad=assessment.area_30_40_mrad,
        criteria=assessment.criteria,
        gz_end_deg=curve.end_deg,
        tanks=fs.tanks,
        items=weights.items,
        warnings=warnings,
        criteria_sets=verdict.sets,
        not_assessed=verdict.not_assessed,
        weather=verdict.weather,
        deck_edge_angle_deg=assessment.deck_edge_deg,
        freeboard_m=vessel.particulars.depth_m - floating.draft_mid_m,
        load_line_margin_m=None if allowed is None or allowed[1] is None else allowed[1] - floating.draft_mid_m,
        load_line_mark=None if allowed is None else allowed[0].name,
        load_line_mark_draft_m=None if allowed is None else allowed[0].draft_m,
        load_line_allowed_draft_m=None if allowed is None else allowed[1],
    )


# --------------------------------------------------------------------------- helpers of the stages


def _items(vessel: Vessel, condition: Condition) -> list[ItemResult]:
    ls = vessel.lightship
    items = [ItemResult("lightship", "lightship", "Lightship", ls.mass_t, ls.lcg_m, ls.vcg_m, ls.tcg_m)]
    for load in condition.holds:
        if load.hold_id not in vessel.hold_index:
            raise LoadingError(f"condition names hold {load.hold_id!r}, which the vessel does not have")
        items.append(hold_item(vessel.hold(load.hold_id), load))
    for n, d in enumerate(condition.deck_items):
        if d.area_id is not None and d.area_id not in vessel.area_index:
            raise LoadingError(f"deck item {d.name!r} names deck area {d.area_id!r}, which the vessel does not have")
        items.append(ItemResult("deck", f"deck{n + 1}", d.name, d.mass_t, d.lcg_m, d.vcg_m, d.tcg_m))
    for n, c in enumerate(effective_constants(vessel, condition)):
        items.append(ItemResult("constant", f"const{n + 1}", c.name, c.mass_t, c.lcg_m, c.vcg_m, c.tcg_m))
    for it in items:
        if it.mass_t < 0 or not math.isfinite(it.mass_t):
            raise LoadingError(f"{it.group} item {it.name!r}: mass {it.mass_t!r} t is not a non-negative number")
    return items


def flood_not_given(end_deg: float) -> str:
    """The caution of a profile with no downflooding angles: θf is taken as none, and what that means."""
    return ("θf not given: the profile gives no downflooding angles, so θf is taken as none (no opening that "
            f"floods): the areas run to 40°, GZ at 30° or more is read up to {end_deg:g}° and the weather "
            "criterion's θ2 is the lesser of 50° and θc; check the booklet's downflooding angle")


def _off_curve(curve, name: str, disp: float, table_disp: float) -> str:
    """'displacement 820.0 t is outside the limiting curve, 900–1230 t', with the table-density
    equivalent the curve is read at when the water differs from the tables' (the same waterline)."""
    at = "" if abs(table_disp - disp) < 0.05 else f" ({table_disp:.1f} t at the tables' density)"
    lo, hi = float(curve.displacement_t[0]), float(curve.displacement_t[-1])
    return f"displacement {disp:.1f} t{at} is outside the {name}, {lo:g}–{hi:g} t"


def curve_limit(curve, displacement_t: float) -> float | None:
    """The curve's value at a displacement, or None outside its range (the caller warns)."""
    if curve is None:
        return None
    try:
        return interp(curve.displacement_t, curve.value, displacement_t, "displacement", "t")
    except OutOfRangeError:
        return None


def _allowed_draft(vessel: Vessel, condition: Condition):
    """(mark, permitted midships draft or None when the summer draft is off the table), or None without marks."""
    marks = {m.name: m for m in vessel.load_lines}
    mark = marks.get(condition.load_line) or marks.get("summer")
    if mark is None:
        return None
    summer = marks.get("summer", mark)
    try:
        return mark, _permitted_draft(vessel, summer.draft_m, mark, condition.water_density_t_m3)
    except OutOfRangeError:
        return mark, None


def _area_top(flood: float | None) -> float:
    """Where the areas of IS 2008 A 2.2.1 end: 40° or θf if less."""
    return min(40.0, flood) if flood is not None else 40.0


def _gz30_top(flood: float | None) -> float:
    """How far "GZ ≥ 0.20 m at 30° or more" looks: to θf (at least 30°), else 90° (common practice)."""
    return max(30.0, flood) if flood is not None else 90.0


def curve_measures(gz: np.ndarray, f: gzmod.CurveFacts, flood: float | None, gm_fluid_m: float) -> Measures:
    """The values the criteria sets are measured on, from one GZ curve on the low side
    (:func:`stage_criteria`'s docstring gives each)."""
    top, hi = _area_top(flood), _gz30_top(flood)
    a30 = gzmod.area_to(gz, 30.0)
    a40 = gzmod.area_to(gz, top)
    a3040 = a40 - a30 if top > 30.0 else 0.0
    k30 = int(round(30.0 / gzmod.STEP_DEG))
    khi = int(round(hi / gzmod.STEP_DEG))
    gz30 = float(np.max(gz[k30 : khi + 1]))
    # A curve with no positive GZ has no meaningful 'angle of maximum': it fails 2.2.3.
    angle_of_max = f.max_gz_angle_deg if f.max_gz_m > 0.0 else 0.0
    # Area to the angle of maximum GZ, 30° at most (or θf if less), for the OSV set of Part B 2.4.5.
    a_max = gzmod.area_to(gz, osv_area_end_deg(angle_of_max, flood))
    return Measures(a30, a40, a3040, gz30, angle_of_max, gm_fluid_m, a_max)


MARGINAL = "marginal: decided by the interpolation between the KN table's heels"


def _second_opinion_may_differ(criteria, heel_deg: np.ndarray, gz: np.ndarray, kn_heel_deg: np.ndarray,
                               spread_m: np.ndarray) -> bool:
    """Whether the second opinion (GZ + ``spread_m``, |spread| ≤ ε everywhere) could judge some
    criterion on the GZ curve otherwise; when it cannot, working it out (a second assessment, the
    weather criterion's the costliest) is skipped: the screen evaluates on every key.

    Bounds on how far each criterion's value moves when GZ moves by at most ε (derived):

    * an area (m·rad): by at most ε × its span; the weather criterion's b and a together span at most
      π rad, their limits at crossings of GZ with a heeling lever add nothing to first order (the
      integrand is zero there), so by ε·π;
    * a GZ value (m): by ε;
    * an angle where GZ crosses a lever (deg): by ε/s rad, s the least slope of GZ between the angle
      and its limit (taken twice over); a slope of 0 or less there: it may move any distance;
    * the angle of maximum GZ: the second opinion's maximum lies where GZ comes within 2ε of its top
      (GZ₂(θ₂) ≥ GZ₂(θ) gives GZ(θ₂) ≥ GZ(θ) − 2ε), so it may differ only if that run reaches the limit.

    A criterion not assessed, or of GM and KG alone (:func:`reads_gz_curve`), cannot differ.
    """
    eps = float(np.max(np.abs(spread_m)))
    if eps == 0.0:
        return False
    heel = np.asarray(heel_deg, dtype=float)
    for c in criteria:
        if not c.assessed or not reads_gz_curve(c):
            continue
        margin = abs(c.margin)
        if c.id.endswith("angle-max-gz"):
            band = gzmod.max_band(gz, kn_heel_deg, 2.0 * spread_m)
            if band is None or band[0] <= c.limit <= band[1]:
                return True
        elif c.id.endswith("area-0-max"):
            # The area's end and its limit both follow θmax below 30° (Part B 2.4.5), and θmax may
            # move anywhere in its band: only with the whole band at 30° or beyond are both fixed.
            band = gzmod.max_band(gz, kn_heel_deg, 2.0 * spread_m)
            if band is None or band[0] < 30.0 or margin <= eps * math.pi:
                return True
        elif c.unit == "m·rad":
            if margin <= eps * math.pi:
                return True
        elif c.unit == "m":
            if margin <= eps:
                return True
        elif c.unit == "deg":
            lo, hi = sorted((c.value, c.limit))
            span = (heel >= lo - 1e-9) & (heel <= hi + 1e-9)
            if span.sum() < 2:
                return True
            slope = float(np.min(np.diff(gz[span]) / np.radians(np.diff(heel[span]))))
            if slope <= 0.0 or margin <= 2.0 * math.degrees(eps / slope):
                return True
        else:
            return True
    return False


def _marginal(criteria: list[CriterionResult], second: list[CriterionResult],
              band: tuple[float, float, float] | None) -> list[CriterionResult]:
    """Each criterion against its second opinion (the same KN row by a shape-preserving interpolation).

    A criterion the spline passes is not assessable ("marginal ... compare with the booklet") when the
    second opinion fails it or cannot assess it, and an angle-of-maximum criterion also when the run
    of angles where GZ is within the two interpolations' spread of its top (``band``,
    :func:`~deckload.core.gz.max_band`) reaches past the limit.  A failure stays a failure (never
    softened into "not assessable"); the note says when the second opinion passes it.
    """
    out = []
    for c, d in zip(criteria, second):
        if not c.assessed:
            out.append(c)
            continue
        why = ""
        if d.passed != c.passed or not d.assessed:
            other = f"{d.value:.4g} {d.unit}" if d.assessed else "not assessable"
            why = f"{c.value:.4g} {c.unit} by the cubic spline, {other} by a shape-preserving one"
        elif c.id.endswith("angle-max-gz") and band is not None:
            lo, hi, eps = band
            if (lo < c.limit <= c.value) if c.comparison == ">=" else (c.value <= c.limit < hi):
                why = (f"GZ comes within {eps * 1000:.0f} mm, the two interpolations' difference, of its "
                       f"maximum from {lo:.1f}° to {hi:.1f}°")
        if why and c.passed:
            # (a note that it passes, as A 2.2.3's 'prefers beyond 30°', no longer applies)
            keep = c.note if c.note and not c.note.startswith("passes") else ""
            c = replace(c, assessed=False, passed=False,
                        note=f"{MARGINAL} ({why}); compare with the booklet" + (f"; {keep}" if keep else ""))
        elif why:
            c = replace(c, note=(f"{c.note}; " if c.note else "") + f"{MARGINAL} ({why})")
        out.append(c)
    return out


def reads_gz_curve(c: CriterionResult) -> bool:
    """True for a criterion measured on the GZ curve (areas, GZ values and angles, the weather and
    passenger heels, the profile's curve criteria); False for those of GM and KG alone (GM0, the
    limiting curve, a profile's minimum GM), which the hydrostatic table decides."""
    return not (c.id.endswith("-gm0") or c.id.startswith("limit-curve-") or c.id.endswith("-min-gm"))


def _with_sets(verdict: Verdict, criteria: list[CriterionResult]) -> Verdict:
    """``verdict`` with its criteria replaced and each set's pass worked again from them."""
    sets = tuple(replace(s, passed=all(c.passed and c.assessed for c in criteria if c.set_id == s.id))
                 for s in verdict.sets)
    return replace(verdict, criteria=tuple(criteria), sets=sets)


def _short_curve(criteria: list, end_deg: float, gz30_to_deg: float, area_to_deg: float,
                 max_angle_deg: float) -> list:
    """Criteria of a GZ curve whose KN table stops at ``end_deg`` < 90°: nothing beyond it is known.

    "GZ ≥ 0.20 m at 30° or more" looks up to ``gz30_to_deg`` (θf, else 90°): a value found
    within the table decides it, but a shortfall where the range runs past the table
    cannot be decided, so it is not assessable (never met).  The areas need
    ``area_to_deg`` (40° or θf), which the profile validation keeps within the table; a
    maximum at the table's last angle lies there or beyond, which the note says.
    """
    out = []
    for c in criteria:
        if c.id.endswith("gz-30") and gz30_to_deg > end_deg + 1e-9 and not c.passed:
            c = replace(c, assessed=False, passed=False,
                        note=f"GZ stays below {c.limit:.2f} m up to {end_deg:g}°, where the KN tables end; "
                             f"the range runs to {gz30_to_deg:g}°: not assessable")
        elif c.id.endswith("area-0-40") or c.id.endswith("area-30-40"):
            if area_to_deg > end_deg + 1e-9:
                c = replace(c, assessed=False, passed=False,
                            note=f"needs GZ to {area_to_deg:g}°, beyond the KN tables' {end_deg:g}°: not assessable")
        elif c.id.endswith("angle-max-gz") and max_angle_deg >= end_deg - 0.05:
            c = replace(c, note=f"the maximum lies at or beyond {end_deg:g}°, where the KN tables end")
        out.append(c)
    return out


def _warnings(vessel, condition, tanks, criteria, items, heel, t_mid, allowed_draft) -> list[Warning]:
    out: list[Warning] = []
    for c in criteria:
        if not c.assessed:
            out.append(Warning("criterion-not-assessed",
                               f"NOT ASSESSED {c.description}: {c.note} ({c.source})", "danger"))
        elif not c.passed:
            value, limit = fixed(c.value, 3), fixed(c.limit, 3)
            if value == limit:  # failed by less than the printed decimals: as many as tell them apart
                value, limit = apart(c.value, c.limit, 4)
            out.append(Warning("criterion-failed",
                               f"FAILED {c.description}: {value} {c.unit} against {limit} ({c.source})", "danger"))
        elif c.margin_fraction < NEAR_LIMIT_FRACTION:
            out.append(Warning("criterion-near",
                               f"{c.description} within 10 % of its limit: {c.value:.3f} {c.unit} "
                               f"against {c.limit:.3f}", "caution"))
    for t in tanks:
        if t.state == "worst_band":
            out.append(Warning("slack-worst-band",
                               f"{t.id} ({t.name}) at {pct_text(t.fill_pct)} % is in its worst free-surface band "
                               f"{band_text(t.worst_band_pct)}", "caution"))
    if heel is not None and abs(heel) > LIST_WARNING_DEG:  # (None: the no-equilibrium danger says more)
        out.append(Warning("list", f"list {abs(heel):.1f}° to {'starboard' if heel > 0 else 'port'} exceeds "
                                   f"{LIST_WARNING_DEG:.0f}°", "caution"))
    if allowed_draft is not None:
        mark, allowed = allowed_draft
        if allowed is None:
            out.append(Warning("load-line-range", "summer load line lies outside the hydrostatic table",
                               "caution"))
        else:
            if t_mid > allowed + 1e-9:
                out.append(Warning("load-line",
                                   f"midships draft {t_mid:.3f} m is over the {mark.name} load line "
                                   f"({allowed:.3f} m allowed in water of {condition.water_density_t_m3:.3f} t/m³)",
                                   "danger"))
    by_area: dict[str, float] = {}
    for d in condition.deck_items:
        if d.area_id is None:
            continue
        by_area[d.area_id] = by_area.get(d.area_id, 0.0) + d.mass_t
        area = vessel.deck_area(d.area_id)
        if d.footprint_m2 and area.max_load_t_m2 is not None and d.mass_t / d.footprint_m2 > area.max_load_t_m2:
            out.append(Warning("deck-load-local",
                               f"{d.name}: {d.mass_t / d.footprint_m2:.2f} t/m² on {area.name} exceeds "
                               f"{area.max_load_t_m2:.2f} t/m²", "danger"))
    for area_id, mass in by_area.items():
        area = vessel.deck_area(area_id)
        if area.max_load_t_m2 is not None and mass / area.area_m2 > area.max_load_t_m2:
            out.append(Warning("deck-load",
                               f"{area.name}: {mass:.1f} t over {area.area_m2:.0f} m² averages "
                               f"{mass / area.area_m2:.2f} t/m², above {area.max_load_t_m2:.2f} t/m²", "danger"))
    for it in items:
        if it.group == "hold":
            hold = vessel.hold(it.id)
            if hold.max_mass_t is not None and it.mass_t > hold.max_mass_t:
                out.append(Warning("hold-load", f"hold {hold.id}: {it.mass_t:.1f} t exceeds its limit of "
                                                f"{hold.max_mass_t:.1f} t", "danger"))
    # Two entries alike in every field are both counted; one typed or pasted twice doubles a weight
    # without a sign (two crates of a name at two places are not alike: no caution).
    for group, entries in (("deck item", condition.deck_items), ("constant", condition.constants)):
        seen: set = set()
        for e in entries:
            if e in seen:
                out.append(Warning("duplicate-entry", f"two {group}s “{e.name}” alike in every field ({e.mass_t:g} t "
                                   "at the same place): both are counted; entered twice?", "caution"))
            seen.add(e)
    return out


def _permitted_draft(vessel: Vessel, summer_draft_m: float, mark, water_density: float) -> float:
    """Draft allowed at a mark in this water: FWA from Δ and TPC at the summer draft."""
    h = vessel.hydrostatics
    i, f = bracket(h.draft_m, summer_draft_m, "summer load-line draft", "m")
    disp = float(lerp_row(h.displacement_t, i, f))
    tpc = float(lerp_row(h.tpc_t_cm, i, f))
    return permitted_draft_m(mark.draft_m, fresh_water_allowance_m(disp, tpc), water_density,
                             mark_density_t_m3(mark.name))