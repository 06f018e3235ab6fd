"""Which criteria sets apply, their results, and what was not assessed.

Called by :func:`deckload.core.stability.evaluate` once the GZ curve is known.  The sets
follow the vessel's type (``[criteria] ship_type``, :data:`criteria.SETS_BY_TYPE`):

* general: IS 2008 Part A 2.2 + Part A 2.3 (weather);
* fishing: Part B 2.1 + Part A 2.3 (wind pressure by height for 24–45 m, Part B 2.1.4);
* passenger: Part A 2.2 + 2.3 + Part A 3.1 (heel from crowding and from turning);
* offshore supply: Part B 2.4.5 alternative criteria + Part A 2.3;

plus the limiting KG/GM curve and any flag-State or class criteria written in the profile.
Part A applies to ships of 24 m and over (IS 2008 Introduction; passenger ships of any
length): below 24 m the sets are still shown, with a note that national rules govern.
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np

from deckload.core import gz as gzmod
from deckload.core import weather as wx
from deckload.core.criteria import (
    EXTRA_SET,
    FISHING_WIND_BAND_MAX_M,
    PASSENGER_SET,
    SET_TITLES,
    SETS_BY_TYPE,
    WEATHER_SET,
    Measures,
    code_length_m,
    code_length_words,
    evaluate_criteria,
    extra_criterion_result,
    fishing_band_length_caution,
    osv_area_end_deg,
    reduced_fishing_gm_m,
)
from deckload.core.frozen import frozen
from deckload.core.model import PassengerData, Vessel
from deckload.core.result import AssessedSet, CriterionResult, NotAssessed, WeatherResult, meets
from deckload.core.tables import OutOfRangeError, interp

IS_CODE_MIN_LENGTH_M = 24.0
"""IS 2008 applies to ships of 24 m and over unless stated (standards.md §3.6 [C])."""

PASSENGER_HEEL_LIMIT_DEG = 10.0
"""Heel from crowding and from turning ≤ 10° each: IS 2008 Part A 3.1 (standards.md §3.1 [C]; checks row 28)."""

PASSENGERS_PER_M2 = 4.0
"""Crowding density on free deck area (standards.md §3.1: [M] that IS 2008 uses it)."""

KNOT_M_S = 1852.0 / 3600.0

NEVER_ASSESSED: tuple[NotAssessed, ...] = (
    NotAssessed("damage stability", "not computed by deckload"),
    NotAssessed("grain heeling (SOLAS VI, International Grain Code)", "not computed by deckload"),
    NotAssessed("icing allowance (IS Code 2008 Part B 6)", "not computed by deckload"),
    NotAssessed("longitudinal strength (shear forces, bending moments)", "not computed by deckload"),
)
"""What a master might expect from a loading computer and deckload never computes."""


@frozen
class Afloat:
    """The condition's numbers the criteria are measured on (SI; angles in degrees)."""

    displacement_t: float
    water_density_t_m3: float
    draft_mid_m: float
    kg_fluid_m: float
    gm_fluid_m: float
    heel_deg: np.ndarray
    """The fine heel grid of :mod:`gz` (0–90°)."""
    gz_lee_m: np.ndarray
    """GZ heeling to the side the criteria are checked on."""
    gz_other_m: np.ndarray
    """GZ heeling to the other side."""
    flood_deg: float | None
    deck_edge_deg: float
    measures: Measures
    max_gz_m: float
    vanishing_deg: float | None
    equilibrium_deg: float | None
    """Heel of equilibrium on the checked side (≥ 0); None when GZ never becomes positive on it."""
    deck_windage: tuple[tuple[float, float], ...] = ()
    """(lateral area m², height of its centre above the keel m) of each deck item that states it."""
    deck_items_without_windage: tuple[str, ...] = ()
    """Names of the deck items that do not state their windage."""
    flood_unknown: str = ""
    """Why θf is unknown when the profile gives downflooding angles that do not reach this
    displacement ('' otherwise): the criteria worked to θf are then not assessable
    (:func:`without_flood`); ``flood_deg`` is None and the measures are those with no openings."""


@frozen
class Verdict:
    """The criteria assessed for a condition, the sets they belong to, and what could not be assessed."""

    criteria: tuple[CriterionResult, ...]
    sets: tuple[AssessedSet, ...]
    not_assessed: tuple[NotAssessed, ...]
    weather: WeatherResult | None
    cautions: tuple[str, ...]


def _crit(cid: str, desc: str, value: float, limit: float, unit: str, comp: str, source: str,
          set_id: str, note: str = "", assessed: bool = True, fails: bool = False) -> CriterionResult:
    """One criterion's result; ``fails`` where it fails whatever its value and limit (the note says why)."""
    passed = assessed and not fails and meets(value, limit, comp)
    return CriterionResult(cid, desc, value, limit, unit, comp, passed, source, note, set_id=set_id,
                           assessed=assessed)


def _first_heel(heel_deg: np.ndarray, gz: np.ndarray, lever_m: float) -> float | None:
    """First angle from 0° where GZ rises through a constant heeling lever (None: never)."""
    curve = wx.Curve(heel_deg, gz)
    if curve.at(0.0) >= lever_m:
        return 0.0
    return curve.crossing(lever_m, 0.0, rising=True)


def windage_at(vessel: Vessel, draft_m: float) -> tuple[float, float, float] | None:
    """(A m², centre of A above the waterline m, Lwl m) at a mean draft, None outside the table."""
    w = vessel.windage
    if w is None:
        return None
    try:
        return (interp(w.draft_m, w.lateral_area_m2, draft_m, "draft (windage table)", "m"),
                interp(w.draft_m, w.centroid_above_wl_m, draft_m, "draft (windage table)", "m"),
                interp(w.draft_m, w.waterline_length_m, draft_m, "draft (windage table)", "m"))
    except OutOfRangeError:
        return None


def weather_criterion(vessel: Vessel, a: Afloat, ship_type: str) -> tuple[list[CriterionResult], WeatherResult | None,
                                                                          NotAssessed | None, list[str]]:
    """IS 2008 Part A 2.3 for this condition: two criteria (θ0 and b ≥ a) and the numbers behind them."""
    cs = vessel.criteria
    p = vessel.particulars
    notes: list[str] = []
    if vessel.windage is None:
        return [], None, NotAssessed(SET_TITLES[WEATHER_SET], "the profile has no windage data", applies=True), notes
    wind = windage_at(vessel, a.draft_mid_m)
    if wind is None:
        w = vessel.windage
        return [], None, NotAssessed(SET_TITLES[WEATHER_SET],
                                     f"midships draft {a.draft_mid_m:.3f} m is outside the windage table "
                                     f"({w.draft_m[0]:g}–{w.draft_m[-1]:g} m)", applies=True), notes
    area, h_wl, lwl = wind
    d = a.draft_mid_m
    extra_area = sum(ai for ai, _ in a.deck_windage)
    if extra_area > 0.0:
        # Deck cargo adds its stated side area, centre at its own height (IS 2008 A 2.3: "ship and
        # deck cargo"); shielding is what the item's stated area already leaves out.
        moment = area * h_wl + sum(ai * (zi - d) for ai, zi in a.deck_windage)
        area = area + extra_area
        h_wl = moment / area
    z = h_wl + d / 2.0  # Z to about half the mean draft (standards.md §2.2; that option [M])
    if cs.wind_pressure_pa is not None:
        pressure, p_source = cs.wind_pressure_pa, "P from the vessel profile (Administration)"
    elif ship_type == "fishing" and IS_CODE_MIN_LENGTH_M <= code_length_m(p) <= FISHING_WIND_BAND_MAX_M:
        pressure = wx.fishing_wind_pressure_pa(h_wl)
        notes += fishing_band_length_caution(p, pressure)
        p_source = f"P {pressure:.0f} Pa for h {h_wl:.2f} m, IS Code 2008 Part B 2.1.4 (from memory)"
    else:
        pressure, p_source = wx.WIND_PRESSURE_PA, "P 504 Pa"
    lw1 = wx.wind_lever_m(pressure, area, z, a.displacement_t)
    curve = wx.Curve.from_sides(a.heel_deg, a.gz_lee_m, a.gz_other_m)
    end = float(a.heel_deg[-1])  # the KN tables may stop before 90° (a booklet's 60°)
    theta0_limit = min(wx.THETA0_MAX_DEG, wx.DECK_EDGE_FRACTION * a.deck_edge_deg)
    roll = None
    if a.gm_fluid_m > 0.0:
        volume = a.displacement_t / a.water_density_t_m3
        cb = volume / (lwl * p.breadth_m * d)
        roll = wx.roll(wx.RollInputs(p.breadth_m, d, lwl, cb, a.kg_fluid_m, a.gm_fluid_m,
                                     cs.bilge_keel_area_m2, cs.sharp_bilged))
    f = wx.weather_areas(curve, lw1, None if roll is None else roll.theta1_deg, a.flood_deg, end)
    src0 = "IS Code 2008 Part A 2.3.1.2"
    srcb = "IS Code 2008 Part A 2.3.1.4 (A.749 3.2.2.1.4)"
    common = f"{p_source}, A {area:.1f} m²" + (f" incl. deck cargo {extra_area:.1f} m²" if extra_area > 0 else "") \
        + f", Z {z:.2f} m, lw1 {lw1:.4f} m"
    out: list[CriterionResult] = []
    if f.theta0_deg is None:
        # Beyond the end of the curve (≥ 40°, profile validation) θ0 is past its 16° limit in any case.
        out.append(_crit("IS2008-A2.3-theta0", "Heel under the steady wind θ0", end, theta0_limit, "deg", "<=",
                         src0, WEATHER_SET, f"GZ never reaches lw1 up to {end:g}°: the steady wind alone would "
                         "overturn her; " + common))
        out.append(_crit("IS2008-A2.3-area-b-a", "Weather: area b against area a", 0.0, 0.0, "m·rad", ">=",
                         srcb, WEATHER_SET, "no equilibrium under the steady wind", assessed=False))
        return out, None, None, notes
    out.append(_crit("IS2008-A2.3-theta0", "Heel under the steady wind θ0", f.theta0_deg, theta0_limit, "deg", "<=",
                     src0, WEATHER_SET, f"limit min(16°, 0.8 × deck edge {a.deck_edge_deg:.1f}°); " + common))
    if roll is None:
        out.append(_crit("IS2008-A2.3-area-b-a", "Weather: area b against area a", 0.0, 0.0, "m·rad", ">=",
                         srcb, WEATHER_SET, "GM not positive: no roll period T = 2CB/√GM", assessed=False))
        return out, None, None, notes
    assert f.area_a_mrad is not None and f.area_b_mrad is not None
    note = f"θ1 {roll.theta1_deg:.1f}°, θ2 {f.theta2_deg:.1f}°" if f.theta2_deg is not None else \
        f"θ1 {roll.theta1_deg:.1f}°; GZ never reaches lw2 = {f.lw2_m:.4f} m"
    if roll.outside_validity:
        note += "; outside the range the roll tables were made for (" + ", ".join(roll.outside_validity) + \
            "; standards.md §2.3, from memory)"
    start = f.theta0_deg - roll.theta1_deg
    if start < -end - 1e-9:
        # Area a runs from θ0 − θ1; the curve to windward is known only to the KN tables' end, and
        # area a cut there is too small, which flatters b/a (IS 2008 A 2.3.1.4 takes it from θ0 − θ1).
        out.append(_crit("IS2008-A2.3-area-b-a", "Weather: area b against area a", f.area_b_mrad, f.area_a_mrad,
                         "m·rad", ">=", srcb, WEATHER_SET,
                         f"area a needs GZ to {-start:.1f}° to windward (θ0 − θ1), beyond the KN tables' {end:g}°: "
                         f"not assessable (b {f.area_b_mrad:.4f} m·rad; a counted from {end:g}° only: {f.area_a_mrad:.4f} "
                         "m·rad); " + note,
                         assessed=False))
        return out, None, None, notes
    if f.windward_deg is not None:
        # Area a counts ∫(lw2 − GZ), which turns negative past the windward intercept and would let
        # b ≥ a pass on a ship that capsizes to windward (found by an exact-case audit: a −0.0125 m·rad).
        out.append(_crit("IS2008-A2.3-area-b-a", "Weather: area b against area a", f.area_b_mrad, f.area_a_mrad,
                         "m·rad", ">=", srcb, WEATHER_SET,
                         f"rolled to windward to {start:.1f}° (θ0 − θ1), past {f.windward_deg:.1f}° where GZ to "
                         f"windward exceeds lw2 = {f.lw2_m:.4f} m: the gust does not bring her back, she heels on "
                         "to windward; fails; " + note, fails=True))
        return out, None, None, notes
    # Where the KN tables stop before θ2 could be reached, area b is known only up to their end:
    # enough when it already covers a (more curve can only add to b), else not assessable.
    wanted = min(wx.THETA2_MAX_DEG, a.flood_deg) if a.flood_deg is not None else wx.THETA2_MAX_DEG
    cut = end < wanted - 1e-9 and (f.theta_r_deg is None or f.theta_c_deg is None)
    if cut and f.area_b_mrad < f.area_a_mrad:
        out.append(_crit("IS2008-A2.3-area-b-a", "Weather: area b against area a", f.area_b_mrad, f.area_a_mrad,
                         "m·rad", ">=", srcb, WEATHER_SET,
                         f"needs GZ to {wanted:g}°, beyond the KN tables' {end:g}°: not assessable; " + note,
                         assessed=False))
        return out, None, None, notes
    if a.flood_unknown:
        if f.theta2_deg is not None:
            note = note.replace(f"θ2 {f.theta2_deg:.1f}°", f"θ2 {f.theta2_deg:.1f}° with no openings", 1)
        # θ2 = min(θf, 50°, θc): between the first intercept and θc GZ lies above lw2, so area b only
        # grows with θ2 and is largest with no opening at all, as worked here.  Short of a even then,
        # it fails whatever θf is; else θf decides it (IS 2008 A 2.3.1.4, standards.md §2.1 step 5).
        if f.area_b_mrad < f.area_a_mrad:
            out.append(_crit("IS2008-A2.3-area-b-a", "Weather: area b against area a", f.area_b_mrad,
                             f.area_a_mrad, "m·rad", ">=", srcb, WEATHER_SET,
                             f"θf unknown ({a.flood_unknown}): b falls short of a even with θ2 at 50° or θc, "
                             "the most any θf allows; " + note))
        else:
            out.append(_crit("IS2008-A2.3-area-b-a", "Weather: area b against area a", f.area_b_mrad,
                             f.area_a_mrad, "m·rad", ">=", srcb, WEATHER_SET,
                             f"θ2 = min(θf, 50°, θc) needs θf, unknown ({a.flood_unknown}): not assessable (b with no "
                             f"openings {f.area_b_mrad:.4f} m·rad); " + note,
                             assessed=False))
        return out, None, None, notes
    if cut:
        note += f"; area b counted to {end:g}°, where the KN tables end (already enough)"
    out.append(_crit("IS2008-A2.3-area-b-a", "Weather: area b against area a", f.area_b_mrad, f.area_a_mrad,
                     "m·rad", ">=", srcb, WEATHER_SET, note))
    if f.theta2_deg is None:
        return out, None, None, notes  # GZ never reaches lw2: no θ2 to report, the note says why
    wr = WeatherResult(
        wind_pressure_pa=pressure, windage_area_m2=area, windage_lever_m=z, lw1_m=lw1, lw2_m=f.lw2_m,
        theta0_deg=f.theta0_deg, theta0_limit_deg=theta0_limit, theta1_deg=roll.theta1_deg,
        theta2_deg=f.theta2_deg,
        theta_c_deg=f.theta_c_deg, area_a_mrad=f.area_a_mrad, area_b_mrad=f.area_b_mrad,
        roll_period_s=roll.period_s, k=roll.k, x1=roll.x1, x2=roll.x2, r=roll.r, s=roll.s,
        deck_edge_angle_deg=a.deck_edge_deg, theta_r_deg=f.theta_r_deg, windage_centroid_above_wl_m=h_wl,
        waterline_length_m=lwl,
    )
    return out, wr, None, notes


def _without_deck_windage(rows: list[CriterionResult], names: tuple[str, ...]) -> list[CriterionResult]:
    """The weather criterion when deck items do not state their windage: a failure stands, a pass
    cannot be told.

    Derived: an item on deck adds side area A_i with its centre above the waterline, so the wind's
    moment P·ΣA·Z grows (Z measured from half the draught below the waterline, IS 2008 A 2.3) and
    lw1 = P·A·Z/(1000·g·Δ) with it; a larger lw1 raises θ0, and the larger lw2 = 1.5·lw1 grows area
    a and shrinks area b (standards.md §2.1).  Each criterion can only get worse: one failed
    without the items fails with them; one met may not be."""
    which = ", ".join(names)
    out = []
    for c in rows:
        if c.assessed and c.passed:
            c = replace(c, passed=False, assessed=False,
                        note=f"met without the side area of deck item(s) {which}, which state no windage; with it the "
                             f"wind can only heel her further: not assessable; " + c.note)
        elif c.assessed:
            c = replace(c, note=f"fails even without the side area of deck item(s) {which} (no windage stated); "
                                + c.note)
        out.append(c)
    return out


def crowding_tcg_m(pd: PassengerData, breadth_m: float) -> float:
    """Where the crowd stands (m from the centreline): the centroid of the outboard part of the
    standing area that the passengers fill at 4 per m².

    IS 2008 Part A 3.1 / A.749 3.5.2.9 [C]: passengers are placed in the most unfavourable way that
    can occur in practice; 4 persons per m² (standards.md §3.1, [M] for IS 2008).  Derived: the area
    taken as a strip of even length from y_in to y_out (y_out the outboard edge, the ship's side
    B/2 unless the profile gives it; y_in = 2·y_c − y_out so that its centroid is y_c); n people
    fill its outboard fraction f = min(1, n/(4·A)) of the width, whose centroid is
    y_out − f·(y_out − y_in)/2 = y_out − f·(y_out − y_c).  f = 1 gives y_c, the whole area."""
    y_c = pd.standing_tcg_m
    y_out = breadth_m / 2.0 if pd.standing_outboard_m is None else pd.standing_outboard_m
    y_out = max(y_out, y_c)
    f = min(1.0, pd.count / (PASSENGERS_PER_M2 * pd.standing_area_m2))
    return y_out - f * (y_out - y_c)


def passenger_criteria(vessel: Vessel, a: Afloat) -> tuple[list[CriterionResult], list[str]]:
    """IS 2008 Part A 3.1: heel from crowding and from turning, each ≤ 10° (standards.md §3.1).

    Crowding: heeling lever n·m·y/Δ, y where the crowd stands on one side (:func:`crowding_tcg_m`),
    the passengers' mass taken as already in the condition near the centreline.  Turning:
    MR/(g·Δ) = 0.2·v0²·(KG − d/2)/(g·Lwl) (the 0.2/g form; formula from memory), v0 in m/s.
    Both levers are held constant with heel (conservative; common practice), and the heel
    is where GZ first reaches the lever.
    """
    pd = vessel.passengers
    notes: list[str] = []
    src = "IS Code 2008 Part A 3.1"
    if pd is None:
        return [], notes
    y_crowd = crowding_tcg_m(pd, vessel.particulars.breadth_m)
    lever_c = pd.count * pd.mass_per_person_t * y_crowd / a.displacement_t
    if pd.count > PASSENGERS_PER_M2 * pd.standing_area_m2:
        notes.append(f"{pd.count} passengers need {pd.count / PASSENGERS_PER_M2:.0f} m² at 4 per m² "
                     f"(from memory); the standing area is {pd.standing_area_m2:g} m²: all taken at its centroid")
    wind = windage_at(vessel, a.draft_mid_m)
    lwl = wind[2] if wind is not None else vessel.particulars.lbp_m
    v0 = pd.service_speed_kn * KNOT_M_S
    lever_t = max(0.0, 0.2 * v0**2 * (a.kg_fluid_m - a.draft_mid_m / 2.0) / (wx.G_M_S2 * lwl))
    out = []
    for cid, desc, lever, extra in (
        ("IS2008-A3.1-crowding", "Heel from passengers crowding to one side", lever_c,
         f"{pd.count} × {pd.mass_per_person_t:g} t at {y_crowd:.3f} m from the centreline, "
         + ("the standing area's centroid" if math.isclose(y_crowd, pd.standing_tcg_m, rel_tol=1e-9, abs_tol=1e-12) else
            f"the outboard part of the standing area they fill at {PASSENGERS_PER_M2:g} per m²")),
        ("IS2008-A3.1-turning", "Heel from turning at service speed", lever_t,
         f"{pd.service_speed_kn:g} kn, 0.2·v²·(KG − d/2)/(g·Lwl) from memory"
         + ("" if wind is not None else ", Lwl taken as LBP")),
    ):
        heel = _first_heel(a.heel_deg, a.gz_lee_m, lever)
        note = f"lever {lever:.4f} m ({extra})"
        if heel is None:  # beyond the curve's last angle, which stands for it (as θ0 of A 2.3 does)
            end = float(a.heel_deg[-1])
            out.append(_crit(cid, desc, end, PASSENGER_HEEL_LIMIT_DEG, "deg", "<=", src, PASSENGER_SET,
                             f"GZ never reaches the heeling lever up to {end:g}°; " + note))
        else:
            out.append(_crit(cid, desc, heel, PASSENGER_HEEL_LIMIT_DEG, "deg", "<=", src, PASSENGER_SET, note))
    return out, notes


def extra_criteria(vessel: Vessel, a: Afloat, weather: list[CriterionResult],
                   windage_missing: bool) -> list[CriterionResult]:
    """The flag-State / class criteria written in the profile, each measured on this condition."""
    out = []
    gz = a.gz_lee_m
    end = float(a.heel_deg[-1])
    short = f"beyond the KN tables' end at {end:g}°: not assessable"
    theta0 = next((c for c in weather if c.id == "IS2008-A2.3-theta0"), None)
    for n, ec in enumerate(vessel.criteria.extra):
        value: float | None = None
        why = note = ""
        if ec.kind == "min_gm":
            value = a.gm_fluid_m
        elif ec.kind == "min_area":
            hi = ec.to_deg if a.flood_deg is None else min(ec.to_deg, a.flood_deg)
            if hi > end + 1e-9:
                why = f"needs GZ to {hi:g}°, " + short
            elif a.flood_unknown:
                # The area stops at θf when θf is less: with θf unknown it is at most the largest area
                # from its start to any angle up to its end (IS 2008 A 2.2.1 cuts the areas at θf).
                best = best_area(gz, ec.from_deg, ec.to_deg)
                if best < ec.limit:
                    value, note = best, fails_at_any_flood(a.flood_unknown)
                else:
                    why = needs_flood(a.flood_unknown)
            else:
                value = max(0.0, gzmod.area_to(gz, hi) - gzmod.area_to(gz, ec.from_deg)) if hi > ec.from_deg else 0.0
        elif ec.kind == "min_gz_at":
            if ec.at_deg > end + 1e-9:
                why = f"{ec.at_deg:g}° is " + short
            else:
                value = float(np.interp(ec.at_deg, a.heel_deg, gz))
        elif ec.kind in ("min_max_gz", "min_angle_max_gz"):
            value = a.max_gz_m if ec.kind == "min_max_gz" else a.measures.max_gz_angle_deg
            at_end = a.measures.max_gz_angle_deg >= end - 0.05 and end < 90.0 - 1e-9
            if at_end and value < ec.limit:
                value, why = None, "the maximum lies at or " + short
        elif ec.kind == "min_range":
            if a.max_gz_m <= 0.0 or a.equilibrium_deg is None:
                value = 0.0
            elif a.vanishing_deg is not None:
                value = a.vanishing_deg - a.equilibrium_deg
            else:
                value = end - a.equilibrium_deg  # positive to the end of the curve: at least this
                if end < 90.0 - 1e-9 and value < ec.limit:
                    value, why = None, "GZ is still positive where the curve ends; the range runs " + short
        elif ec.kind == "max_static_heel":
            value = a.equilibrium_deg
            if value is None:
                # No equilibrium up to the curve's end: the heel is beyond it.  That fails a limit
                # below the end; a limit beyond the end cannot be judged.
                if ec.limit < end:
                    value, note = end, f"GZ never becomes positive up to {end:g}°: she heels beyond it"
                else:
                    why = f"GZ never becomes positive up to {end:g}°, the curve's end"
        elif ec.kind == "max_wind_heel":
            if theta0 is not None and (theta0.assessed or theta0.value > ec.limit):
                value = theta0.value  # (not assessed: θ0 without some deck windage, the least it can be)
            elif theta0 is not None:
                why = "needs the weather criterion's steady-wind heel θ0: " + theta0.note
            else:
                why = "needs the weather criterion's steady-wind heel: " + (
                    "the profile has no windage data" if windage_missing else "windage not available at this draft")
        out.append(extra_criterion_result(n, ec, value, why, note))
    return out


def best_area(gz: np.ndarray, lo_deg: float, hi_deg: float) -> float:
    """The largest area under GZ from ``lo_deg`` to any angle from ``lo_deg`` up to ``hi_deg`` (m·rad; 0 at
    ``lo_deg`` itself): what an area cut at an unknown θf could be at most.

    ∫ GZ dφ from lo to θ, trapezoidal on the 0.1° grid (:func:`gz.area_to`), read at every grid angle
    between and at ``hi_deg``.  It is largest at an end or where GZ falls through zero; a zero between
    two grid angles is missed by the sliver of area between it and the grid angle before it, under
    ½·|ΔGZ over 0.1°|·0.1° (about 1e-6 m·rad for a slope of 1 m/rad): finer than any table it is read from."""
    step = gzmod.STEP_DEG
    base = gzmod.area_to(gz, lo_deg)
    k0 = int(math.ceil(lo_deg / step - 1e-9))
    k1 = int(math.floor(hi_deg / step + 1e-9))
    panels = (gz[1 : k1 + 1] + gz[:k1]) * (0.5 * math.radians(step))
    cum = np.concatenate(([0.0], np.cumsum(panels)))  # area from 0° to each grid angle up to k1
    inner = float(np.max(cum[k0 : k1 + 1])) - base if k1 >= k0 else 0.0
    return max(0.0, inner, gzmod.area_to(gz, hi_deg) - base)


def needs_flood(why: str) -> str:
    """The note of a criterion that θf decides when θf is unknown."""
    return f"needs θf, which is unknown ({why}): not assessable"


def fails_at_any_flood(why: str) -> str:
    """The note of a criterion that fails whatever the unknown θf is."""
    return f"θf unknown ({why}): fails at any θf; the value is the most it could be"


FLOOD_AREAS = {"area-0-40": (0.0, 40.0), "area-30-40": (30.0, 40.0)}
"""Areas of IS 2008 Part A 2.2.1 cut at θf when θf < 40° (Part B 2.1 and 2.4.5 repeat them): (from, to)."""


def without_flood(c: CriterionResult, a: Afloat) -> CriterionResult:
    """A criterion of a plain set when θf is unknown (``a.flood_unknown``): unchanged unless it is
    worked to θf, then met only if met at every θf, failed if failed at every θf, else not assessable.

    The measures were worked with no openings (θf beyond 90°); θf may be any angle from 0° up.
    * areas to 40° or θf, 30° to 40° or θf (IS 2008 A 2.2.1), to θmax or θf (B 2.4.5): zero at θf = 0,
      so never met for sure; at most :func:`best_area` over the angles they may stop at;
    * GZ at 30° or more, read from 30° up to θf (deckload's conservative reading of A 2.2.2, common
      practice): at least GZ at 30° itself, at most the largest GZ from 30° to the curve's end (the
      measure as worked)."""
    why = a.flood_unknown
    gz = a.gz_lee_m
    span = next((v for k, v in FLOOD_AREAS.items() if c.id.endswith("-" + k)), None)
    if c.id.endswith("-area-0-max"):
        span = (0.0, osv_area_end_deg(a.measures.max_gz_angle_deg))
    if span is not None:
        best = best_area(gz, *span)
        if best < c.limit:
            return replace(c, value=best, passed=False, note=fails_at_any_flood(why))
        return replace(c, passed=False, assessed=False, note=needs_flood(why))
    if c.id.endswith("-gz-30"):
        at30 = float(gz[int(round(30.0 / gzmod.STEP_DEG))])
        if at30 >= c.limit:
            return replace(c, value=at30, passed=True, note=f"θf unknown ({why}): met at 30° itself, whatever θf")
        if not c.passed:
            return replace(c, note=fails_at_any_flood(why))
        return replace(c, passed=False, assessed=False, note=needs_flood(why))
    return c


def assess(vessel: Vessel, a: Afloat, limit_curve: list[CriterionResult],
           limit_missing: NotAssessed | None = None) -> Verdict:
    """All criteria for the vessel's type, the sets with their result, and what was not assessed.

    ``limit_missing`` says why the profile's limiting KG/GM curve could not be read at this
    displacement (IS 2008 A 2.1.7): it is listed with what was not assessed, never dropped."""
    cs = vessel.criteria
    p = vessel.particulars
    ship_type = cs.ship_type
    criteria: list[CriterionResult] = []
    not_assessed: list[NotAssessed] = []
    cautions: list[str] = []
    weather = None
    set_ids: list[str] = []
    windage_missing = vessel.windage is None
    fishing_gm = reduced_fishing_gm_m(ship_type, cs.min_gm_m)
    weather_rows: list[CriterionResult] = []
    for sid in SETS_BY_TYPE[ship_type]:
        if sid == WEATHER_SET:
            weather_rows, weather, missing, notes = weather_criterion(vessel, a, ship_type)
            cautions += notes
            if missing is not None:
                not_assessed.append(missing)
                cautions.append(f"{missing.item} not assessed: {missing.reason}")
                continue
            if a.deck_items_without_windage:
                weather_rows = _without_deck_windage(weather_rows, a.deck_items_without_windage)
                cautions.append("weather criterion: no windage given for deck item(s) "
                                + ", ".join(a.deck_items_without_windage) + "; their side area is not included, so "
                                "a pass cannot be told (give windage_area_m2, 0 where sheltered)")
            criteria += weather_rows
        elif sid == PASSENGER_SET:
            rows, notes = passenger_criteria(vessel, a)
            cautions += notes
            if not rows:
                not_assessed.append(NotAssessed(SET_TITLES[sid], "the profile has no passenger data", applies=True))
                continue
            criteria += rows
        else:
            rows = evaluate_criteria(sid, a.measures, cs.min_gm_m, fishing_gm_m=fishing_gm)
            criteria += [without_flood(c, a) for c in rows] if a.flood_unknown else rows
        set_ids.append(sid)
    if limit_curve:
        criteria += limit_curve
        set_ids.append(limit_curve[0].set_id)
    elif limit_missing is not None:
        not_assessed.append(limit_missing)
    if cs.extra:
        criteria += extra_criteria(vessel, a, weather_rows, windage_missing)
        set_ids.append(EXTRA_SET)
    if code_length_m(p) < IS_CODE_MIN_LENGTH_M and ship_type != "passenger":
        not_assessed.append(NotAssessed(
            "national rules for vessels under 24 m",
            f"IS Code 2008 applies to ships of 24 m and over ({code_length_words(p)}): the IS Code criteria are shown "
            "for guidance; the flag State's rules govern"))
    not_assessed += NEVER_ASSESSED
    sets = tuple(
        AssessedSet(sid, SET_TITLES[sid], all(c.passed and c.assessed for c in criteria if c.set_id == sid))
        for sid in set_ids
    )
    return Verdict(tuple(criteria), sets, tuple(not_assessed), weather, tuple(cautions))


def deck_edge_angle(vessel: Vessel, table_displacement_t: float, draft_mid_m: float) -> tuple[float, str | None]:
    """Deck-edge immersion angle (deg) and a caution when it is only approximate.

    From the profile's deck-edge table against displacement (made by ``deckload tables``
    from the geometry) when it covers the displacement; otherwise the wall-sided
    approximation tanφ = freeboard/(B/2) at midships (common practice), with a caution.
    """
    de = vessel.deck_edge
    if de is not None:
        try:
            return interp(de.displacement_t, de.value, table_displacement_t, "displacement (deck-edge table)", "t"), None
        except OutOfRangeError:
            pass
    p = vessel.particulars
    freeboard = max(p.depth_m - draft_mid_m, 0.0)
    angle = math.degrees(math.atan2(freeboard, p.breadth_m / 2.0))
    why = "no deck-edge table" if de is None else "off the deck-edge table"
    return angle, f"deck-edge angle {angle:.1f}° approximate: wall-sided at midships, common practice ({why})"
