"""``evaluate(vessel, condition) -> Result``: the one entry point of the computation.

A pure function: the same profile and condition always give the same result, and
nothing outside is read or written.  Steps, each in its own module:

1. tank contents and item weights (:mod:`loading`); Δ, LCG, KG solid, TCG;
2. free-surface moment of each tank (:mod:`free_surface`); FSC = ΣFSM/Δ; KG fluid;
3. hydrostatics at the density-corrected displacement (:mod:`hydrostatics`), or at the
   equilibrium trim when the profile has tables at several trims (:mod:`trimmed_tables`);
   GM solid = KMt − KG, GM fluid = KMt − KG fluid; trim, drafts, list;
4. the GZ curve (:mod:`gz`): GZ = KN − KG_fluid·sinφ − TCG·cosφ (constant correction),
   or GZ = KN − KG_solid·sinφ − TCG·cosφ − Σρ·M(φ)/Δ with the actual moment of fluid
   transfer M (IS 2008 Part B 3.1, the alternative to a constant correction);
5. the criteria (:mod:`criteria`) and the warnings.
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np

from deckload.core import gz as gzmod
from deckload.core.bounds import bounded
from deckload.core.criteria import Measures, limit_curve_criterion
from deckload.core.free_surface import BASIS_NONE, free_surface, transfer_moment_m4
from deckload.core.hydrostatics import draft_at, fresh_water_allowance_m, mark_density_t_m3, permitted_draft_m
from deckload.core.loading import LoadingError, hold_item, resolve_tanks, sum_weights
from deckload.core.model import Condition, Vessel, effective_constants
from deckload.core.result import ItemResult, Result, TankResult, Warning
from deckload.core.tables import OutOfRangeError, bracket, interp, lerp_row
from deckload.core.verdict import Afloat, assess, deck_edge_angle
from deckload.core.soundings import level_soundings, sounding_note
from deckload.core.trim import BASIS_TABLE, kn_reference_note
from deckload.core.trimmed_tables import covers_kn, floating

LIST_WARNING_DEG = 2.0
NEAR_LIMIT_FRACTION = 0.10


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


def _curve_limit(curve, displacement_t: float) -> float | None:
    """The curve's value at a displacement, or None outside its range (the caller warns)."""
    if curve is None:
        return None
    try:
        return interp(curve.displacement_t, curve.value, displacement_t, "displacement", "t")
    except OutOfRangeError:
        return None


@bounded
def evaluate(vessel: Vessel, condition: Condition) -> Result:
    """Complete intact-stability state of ``vessel`` in ``condition``.

    Raises :class:`~deckload.core.loading.LoadingError` for a condition that does not
    fit the vessel and :class:`~deckload.core.tables.OutOfRangeError` when the
    displacement lies outside the hydrostatic or cross-curve tables.
    """
    rho_w = condition.water_density_t_m3
    fs_rule = condition.fs_rule or vessel.free_surface.rule
    correction = condition.gz_correction or vessel.free_surface.gz_correction

    items = _items(vessel, condition)
    # soundings taken trimmed or listed → the even-keel soundings of the same volumes (core/soundings.py)
    levelled, s_done, s_not = level_soundings(vessel, condition)
    contents = resolve_tanks(vessel, levelled)
    w = sum_weights(items, contents)
    disp = w.mass_t

    fs = free_surface(vessel, contents, fs_rule)
    fsm_total = sum(t.fsm_tm for t in fs)
    fsc = fsm_total / disp
    kg_fluid = w.vcg_m + fsc

    # even-keel tables, or tables at several trims interpolated at the equilibrium trim
    # (core/trimmed_tables.py); MCT from the actual GM_L where the profile has KM_L (core/trim.py)
    fl = floating(vessel, disp, rho_w, w.lcg_m, kg_fluid)
    hy, mct, trim = fl.upright, fl.moment, fl.trim_m
    gm_solid = hy.kmt_m - w.vcg_m
    gm_fluid = hy.kmt_m - kg_fluid
    lbp = vessel.particulars.lbp_m
    t_aft = draft_at(0.0, hy.draft_m, hy.lcf_m, trim, lbp)
    t_fwd = draft_at(lbp, hy.draft_m, hy.lcf_m, trim, lbp)
    t_mid = draft_at(lbp / 2.0, hy.draft_m, hy.lcf_m, trim, lbp)

    kn = fl.kn_m
    # The curve stops at the KN table's last angle (booklets may end at 60°): cut the grid.
    n_grid = len(kn)
    fine_deg, fine_rad = gzmod.FINE_DEG[:n_grid], gzmod.FINE_RAD[:n_grid]
    sin, cos = gzmod.SIN[:n_grid], gzmod.COS[:n_grid]
    gz_end = float(fine_deg[-1])
    warnings: list[Warning] = [Warning(code, msg, "caution") for code, msg in sounding_note(condition, s_done, s_not)]
    if fl.trim_note is not None:
        warnings.append(Warning("trim-beyond-tables", fl.trim_note, "caution"))
    kn_note = None if covers_kn(vessel, trim) else kn_reference_note(vessel.cross_curves, w.lcg_m, lbp)
    if kn_note is not None:
        warnings.append(Warning("kn-reference-lcg", kn_note, "caution"))
    if mct.basis == BASIS_TABLE and not fl.trimmed:
        warnings.append(Warning("trim-from-table-mctc",
                                "the profile has no KML: trim is worked from the tabulated MCTC (made with BML, "
                                "not the actual GML), so it is slightly too small", "caution"))
    if correction == "transfer":
        # The upright (0°) inertia still gives GM fluid; the curve takes the actual
        # moment of fluid transfer of each counted tank at each heel.  The tables are
        # for heel to starboard; heeling to port, a paired tank behaves as its mirror
        # image, the partner, heeled to starboard.
        shift_stbd = np.zeros_like(kn)
        shift_port = np.zeros_like(kn)
        no_geometry = []
        for c, t in zip(contents, fs):
            if t.basis == BASIS_NONE:
                continue
            if c.tank.transfer is None:
                no_geometry.append(c.tank.id)
            m_stbd = transfer_moment_m4(c.tank, t.basis, c.fill_pct, fine_rad)
            mirror = vessel.tank(c.tank.pair) if c.tank.pair else None
            m_port = (transfer_moment_m4(mirror, t.basis, c.fill_pct, fine_rad)
                      if mirror is not None and mirror.transfer is not None else m_stbd)
            shift_stbd += c.density_t_m3 * m_stbd
            shift_port += c.density_t_m3 * m_port
        base_stbd = kn - w.vcg_m * sin - shift_stbd / disp
        base_port = kn - w.vcg_m * sin - shift_port / disp
        if no_geometry:
            warnings.append(Warning("fs-no-geometry",
                                    "no tank geometry for " + ", ".join(no_geometry)
                                    + ": their transfer is taken as i·sinφ", "caution"))
    else:
        base_stbd = base_port = kn - kg_fluid * sin
    gz_stbd = base_stbd - w.tcg_m * cos
    gz_port = base_port + w.tcg_m * cos
    side = "port" if w.tcg_m < 0 else "starboard"
    gz = gz_port if side == "port" else gz_stbd

    # Both curves are tabulated against displacement at the table density, like the KN
    # curves they are made with: the same waterline, so the same equivalent displacement.
    flood = _curve_limit(vessel.downflooding, hy.table_displacement_t)
    if vessel.downflooding is not None and flood is None:
        warnings.append(Warning("downflooding-range",
                                f"displacement {disp:.1f} t is outside the downflooding-angle curve: θf is unknown "
                                "and the criteria are worked to 40° as if there were no openings", "danger"))
    elif flood is not None and flood < 30.0:
        warnings.append(Warning("downflooding-low",
                                f"downflooding angle θf {flood:.1f}° is below 30°: openings immerse before 30°, "
                                "so the 30°–θf area is nil", "danger"))
    f = gzmod.facts(gz)
    top = min(40.0, flood) if flood is not None else 40.0
    a30 = gzmod.area_to(gz, 30.0)
    a40 = gzmod.area_to(gz, top)
    a3040 = a40 - a30 if top > 30.0 else 0.0
    hi = max(30.0, flood) if flood is not None else 90.0
    k30 = int(round(30.0 / gzmod.STEP_DEG))
    khi = int(round(hi / gzmod.STEP_DEG))
    gz30 = float(np.max(gz[k30 : khi + 1]))

    # A curve with no positive GZ has no meaningful 'angle of maximum': it fails 2.2.3.
    angle_of_max = f.max_gz_angle_deg if f.max_gz_m > 0.0 else 0.0
    # Area to the angle of maximum GZ (or θf if less), for the OSV set of Part B 2.4.5.
    a_max = gzmod.area_to(gz, min(angle_of_max, flood) if flood is not None else angle_of_max)
    measures = Measures(a30, a40, a3040, gz30, angle_of_max, gm_fluid, a_max)
    limit_rows = []
    if vessel.limit_curve is not None:
        lim = _curve_limit(vessel.limit_curve, hy.table_displacement_t)
        if lim is None:
            warnings.append(Warning("limit-curve-range",
                                    f"displacement {disp:.1f} t is outside the limiting curve: that check was not made",
                                    "danger"))
        else:
            limit_rows.append(limit_curve_criterion(vessel.limit_curve.kind, lim, kg_fluid, gm_fluid))
    deck_edge, deck_edge_note = deck_edge_angle(vessel, hy.table_displacement_t, t_mid)
    if deck_edge_note:
        warnings.append(Warning("deck-edge-approximate", deck_edge_note, "caution"))
    afloat = Afloat(
        displacement_t=disp, water_density_t_m3=rho_w, draft_mid_m=t_mid, kg_fluid_m=kg_fluid,
        gm_fluid_m=gm_fluid, heel_deg=fine_deg, gz_lee_m=gz,
        gz_other_m=gz_stbd if side == "port" else gz_port, flood_deg=flood, deck_edge_deg=deck_edge,
        measures=measures, max_gz_m=f.max_gz_m, vanishing_deg=f.vanishing_angle_deg,
        equilibrium_deg=f.equilibrium_deg, has_deck_cargo=bool(condition.deck_items),
        deck_windage=tuple((d.windage_area_m2, d.windage_centroid_z_m) for d in condition.deck_items
                           if d.windage_area_m2 is not None and d.windage_centroid_z_m is not None),
        deck_items_without_windage=tuple(d.name for d in condition.deck_items
                                         if d.windage_area_m2 is None or d.windage_centroid_z_m is None),
    )
    verdict = assess(vessel, afloat, limit_rows)
    criteria = list(verdict.criteria)
    if gz_end < 90.0 - 1e-9:
        criteria = _short_curve(criteria, gz_end, hi, top, f.max_gz_angle_deg)
    for note in verdict.cautions:
        code = "weather-not-assessed" if "not assessed" in note else "verdict-note"
        warnings.append(Warning(code, note, "caution"))

    # The list is where the GZ curve on the low side rises through zero: for small
    # angles this is tanφ = TCG/GM fluid (standards.md §6.3), and it stays right at
    # large angles, where the small-angle formula overstates the list.
    heel = f.equilibrium_deg if side == "starboard" else -f.equilibrium_deg
    if gm_fluid <= 0.0:
        warnings.append(Warning("negative-gm",
                                f"GM fluid {gm_fluid:.3f} m is not positive: she lolls, about "
                                f"{abs(heel):.1f}° to {side}", "danger"))
    if f.equilibrium_deg >= 90.0:
        warnings.append(Warning("no-equilibrium", "GZ never becomes positive: no position of equilibrium", "danger"))

    tanks = tuple(
        TankResult(
            id=c.tank.id, name=c.tank.name, kind=c.tank.kind, fill_pct=c.fill_pct, volume_m3=c.volume_m3,
            mass_t=c.mass_t, density_t_m3=c.density_t_m3, lcg_m=c.lcg_m,
            sounding_m=c.sounding_m if c.tank.level_known else None,
            vcg_m=c.vcg_m, tcg_m=c.tcg_m, fsi_m4=c.fsi_m4, fsm_tm=t.fsm_tm, fs_rule=t.rule, state=t.state,
            worst_band_pct=c.tank.worst_band_pct, capacity_m3=c.tank.capacity_m3,
        )
        for c, t in zip(contents, fs)
    )
    if fs_rule == "actual":
        warnings.append(Warning("fs-rule-actual",
                                "free surface at actual levels (IS 2008 B 3.1.6): the B 3.1.3–3.1.4 allowance "
                                "for consumables is off", "caution"))
    allowed = _allowed_draft(vessel, condition)
    warnings = _warnings(vessel, condition, tanks, criteria, items, heel, t_mid, allowed) + warnings

    return Result(
        vessel_name=vessel.particulars.name,
        condition_name=condition.name,
        water_density_t_m3=rho_w,
        displacement_t=disp,
        lightship_t=vessel.lightship.mass_t,
        deadweight_t=disp - vessel.lightship.mass_t,
        lcg_m=w.lcg_m,
        kg_m=w.vcg_m,
        tcg_m=w.tcg_m,
        fsm_total_tm=fsm_total,
        fsc_m=fsc,
        kg_fluid_m=kg_fluid,
        draft_at_lcf_m=hy.draft_m,
        lcb_m=hy.lcb_m,
        lcf_m=hy.lcf_m,
        km_m=hy.kmt_m,
        tpc_t_cm=hy.tpc_t_cm,
        mctc_tm_cm=mct.mctc_tm_cm,
        gm_solid_m=gm_solid,
        gm_fluid_m=gm_fluid,
        trim_m=trim,
        draft_aft_m=t_aft,
        draft_fwd_m=t_fwd,
        draft_mean_m=t_mid,
        list_deg=heel,
        gz_heel_deg=tuple(fine_deg[gzmod.WHOLE_DEGREES].tolist()),
        gz_m=tuple(gz_stbd[gzmod.WHOLE_DEGREES].tolist()),
        gz_port_m=tuple(gz_port[gzmod.WHOLE_DEGREES].tolist()),
        criteria_side=side,
        gz_correction=correction,
        fs_rule=fs_rule,
        max_gz_m=f.max_gz_m,
        max_gz_angle_deg=f.max_gz_angle_deg,
        vanishing_angle_deg=f.vanishing_angle_deg,
        downflooding_angle_deg=flood,
        area_0_30_mrad=a30,
        area_0_40_mrad=a40,
        area_30_40_mrad=a3040,
        criteria=tuple(criteria),
        gz_end_deg=gz_end,
        tanks=tanks,
        items=tuple(items),
        warnings=tuple(warnings),
        criteria_sets=verdict.sets,
        not_assessed=verdict.not_assessed,
        weather=verdict.weather,
        deck_edge_angle_deg=deck_edge,
        freeboard_m=vessel.particulars.depth_m - t_mid,
        load_line_margin_m=None if allowed is None or allowed[1] is None else allowed[1] - t_mid,
    )


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
            out.append(Warning("criterion-failed",
                               f"FAILED {c.description}: {c.value:.3f} {c.unit} against {c.limit:.3f} ({c.source})",
                               "danger"))
        elif c.margin_fraction < NEAR_LIMIT_FRACTION:
            out.append(Warning("criterion-near",
                               f"{c.description} within 10 % of its limit: {c.value:.3f} {c.unit} "
                               f"against {c.limit:.3f}", "caution"))
    for t in tanks:
        if t.state == "worst_band":
            lo, hi = t.worst_band_pct
            out.append(Warning("slack-worst-band",
                               f"{t.id} ({t.name}) at {t.fill_pct:.0f} % is in its worst free-surface band "
                               f"{lo:.0f}–{hi:.0f} %", "caution"))
    if abs(heel) > LIST_WARNING_DEG:
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
    return out


def _permitted_draft(vessel: Vessel, summer_draft_m: float, mark, water_density: float) -> float:
    """Draft allowed at a mark in this water: FWA from Δ and TPC at the summer draft."""
    h = vessel.hydrostatics
    i, f = bracket(h.draft_m, summer_draft_m, "summer load-line draft", "m")
    disp = float(lerp_row(h.displacement_t, i, f))
    tpc = float(lerp_row(h.tpc_t_cm, i, f))
    return permitted_draft_m(mark.draft_m, fresh_water_allowance_m(disp, tpc), water_density,
                             mark_density_t_m3(mark.name))