"""Intact stability criteria as data, and their evaluation.

IS Code 2008 (res. MSC.267(85)) Part A 2.2, general criteria, with the GZ curve and
GM already corrected for free surface (standards.md §1):

* 2.2.1 area under GZ 0–30° ≥ 0.055 m·rad; 0–40° (or 0–θf if θf < 40°) ≥ 0.090 m·rad;
  30–40° (or 30–θf) ≥ 0.030 m·rad;
* 2.2.2 GZ ≥ 0.20 m at an angle of heel ≥ 30°;
* 2.2.3 maximum GZ at an angle preferably > 30° and never < 25°;
* 2.2.4 initial GM0 ≥ 0.15 m.

46 CFR 170.173(b) states the same areas in metre-degrees: 3.151, 5.157 and 1.719 m·deg
(0.055, 0.090, 0.030 × 180/π; the CFR rounds to 3.15, 5.15, 1.72).
"""

from __future__ import annotations

import math

from deckload.core.frozen import frozen
from deckload.core.result import CriterionResult, meets
from deckload.core.weather import WIND_PRESSURE_PA

RAD_TO_DEG = 180.0 / math.pi


def mrad_to_mdeg(area_mrad: float) -> float:
    """m·rad → m·deg (× 180/π)."""
    return area_mrad * RAD_TO_DEG


def mdeg_to_mrad(area_mdeg: float) -> float:
    """m·deg → m·rad (× π/180)."""
    return area_mdeg / RAD_TO_DEG


@frozen
class Criterion:
    """One criterion as data: the value it limits, the limit, the comparison and its source."""

    id: str
    description: str
    measure: str
    """Key into :class:`Measures` of the value the limit applies to."""
    limit: float
    unit: str
    comparison: str
    source: str


IS2008_A22: tuple[Criterion, ...] = (
    Criterion("IS2008-A2.2.1-area-0-30", "Area under GZ, 0° to 30°", "area_0_30_mrad",
              0.055, "m·rad", ">=", "IS Code 2008 Part A 2.2.1"),
    Criterion("IS2008-A2.2.1-area-0-40", "Area under GZ, 0° to 40° or θf", "area_0_40_mrad",
              0.090, "m·rad", ">=", "IS Code 2008 Part A 2.2.1"),
    Criterion("IS2008-A2.2.1-area-30-40", "Area under GZ, 30° to 40° or θf", "area_30_40_mrad",
              0.030, "m·rad", ">=", "IS Code 2008 Part A 2.2.1"),
    Criterion("IS2008-A2.2.2-gz-30", "GZ at an angle of 30° or more", "gz_at_30_plus_m",
              0.20, "m", ">=", "IS Code 2008 Part A 2.2.2"),
    Criterion("IS2008-A2.2.3-angle-max-gz", "Angle of maximum GZ", "max_gz_angle_deg",
              25.0, "deg", ">=", "IS Code 2008 Part A 2.2.3"),
    Criterion("IS2008-A2.2.4-gm0", "Initial GM0, corrected for free surface", "gm_fluid_m",
              0.15, "m", ">=", "IS Code 2008 Part A 2.2.4"),
)

FISHING_SOURCE = "IS Code 2008 Part B 2.1 (from memory: Part A 2.2.1–2.2.3 applied, GM0 0.35 m)"
IS2008_B21: tuple[Criterion, ...] = (
    Criterion("IS2008-B2.1-area-0-30", "Area under GZ, 0° to 30°", "area_0_30_mrad",
              0.055, "m·rad", ">=", FISHING_SOURCE),
    Criterion("IS2008-B2.1-area-0-40", "Area under GZ, 0° to 40° or θf", "area_0_40_mrad",
              0.090, "m·rad", ">=", FISHING_SOURCE),
    Criterion("IS2008-B2.1-area-30-40", "Area under GZ, 30° to 40° or θf", "area_30_40_mrad",
              0.030, "m·rad", ">=", FISHING_SOURCE),
    Criterion("IS2008-B2.1-gz-30", "GZ at an angle of 30° or more", "gz_at_30_plus_m",
              0.20, "m", ">=", FISHING_SOURCE),
    Criterion("IS2008-B2.1-angle-max-gz", "Angle of maximum GZ", "max_gz_angle_deg",
              25.0, "deg", ">=", FISHING_SOURCE),
    Criterion("IS2008-B2.1-gm0", "Initial GM0 (fishing vessel), corrected for free surface", "gm_fluid_m",
              0.35, "m", ">=", "IS Code 2008 Part B 2.1 (0.35 m from memory; 46 CFR 28.570 the same)"),
)
"""Fishing vessels, IS 2008 Part B 2.1 (standards.md §3.2): the Part A 2.2.1–2.2.3 criteria
[M that they apply] and GM0 ≥ 0.35 m for single-deck vessels [M; 46 CFR 28.570 [C]]."""

LOAD_LINE_LENGTH_OVER_LBP = (0.95, 1.15)
"""Bounds of ``[vessel] length_ll_m`` as a fraction of LBP (common practice).  The Load Line length
(ICLL 1966 Annex I reg. 3, from memory: 96 % of the total length on a waterline at 85 % of the least
moulded depth, or the length from the fore side of the stem to the axis of the rudder stock on that
waterline, if greater) is taken on a waterline above the load waterline, so it is normally at least
LBP; a little less only for a deep-laden hull whose stem rakes; and 0.96 × a waterline length that
reaches past the perpendiculars stays within about 1.15·LBP even for a stern trawler's long
overhang.  Outside these it is a typing error (feet, LOA, another ship's length)."""

FISHING_WIND_BAND_MAX_M = 45.0
"""Fishing vessels of 24 m ≤ L ≤ 45 m may take the wind pressure by height (IS 2008 Part B 2.1.4,
standards.md §2.5 [M])."""


def code_length_m(p) -> float:
    """The length L the IS Code's length thresholds are read against (m): ``[vessel] length_ll_m``,
    the Load Line length, where given, else LBP.

    IS 2008 takes L as defined in the Load Line Convention in force (from memory), not LBP.  The
    one reading of L for the 24 m applicability note, the fishing wind-pressure band of Part B 2.1.4
    and the 70 m of a fishing vessel's reduced GM0 (Part B 2.1).  ``p`` is a
    :class:`deckload.core.model.Particulars`."""
    return p.length_ll_m if p.length_ll_m is not None else p.lbp_m


def code_length_words(p) -> str:
    """L as :func:`code_length_m` takes it, in words for a message: 'LBP 22 m' or 'Load Line length 46 m'."""
    return f"LBP {p.lbp_m:g} m" if p.length_ll_m is None else f"Load Line length {p.length_ll_m:g} m"


def fishing_band_length_caution(p, pressure_pa: float) -> tuple[str, ...]:
    """A caution where the fishing wind pressure by height (``pressure_pa``, below 504 Pa, IS 2008
    Part B 2.1.4 for 24 m ≤ L ≤ 45 m) was chosen on LBP, no Load Line length given, and the Load Line
    length the reader would accept (up to ``LOAD_LINE_LENGTH_OVER_LBP[1]``·LBP) could pass 45 m: she
    would then take 504 Pa and lw1 = P·A·Z/(1000·g·Δ) grows by 504/P (standards.md §2.2, §2.5)."""
    if p.length_ll_m is not None or not p.lbp_m <= FISHING_WIND_BAND_MAX_M < LOAD_LINE_LENGTH_OVER_LBP[1] * p.lbp_m:
        return ()
    full = WIND_PRESSURE_PA
    if pressure_pa >= full:
        return ()
    return (f"weather criterion: L taken as LBP {p.lbp_m:g} m ([vessel] length_ll_m not given), so the fishing "
            f"vessels' wind pressure by height of IS Code 2008 Part B 2.1.4 (24–45 m) gave P {pressure_pa:.0f} Pa; "
            f"if her Load Line length exceeds {FISHING_WIND_BAND_MAX_M:g} m, P is {full:.0f} Pa and the wind "
            f"lever lw1 {full / pressure_pa:.2f} times this one: give length_ll_m from her Load Line certificate",)


FISHING_MIN_GM_FLOOR_M = 0.15
"""Fishing vessels with a complete superstructure or L ≥ 70 m: GM0 may be reduced with the
Administration's agreement, never below 0.15 m (standards.md §3.2 [M])."""
FISHING_REDUCED_GM_LENGTH_M = 70.0
"""L (:func:`code_length_m`, the Load Line length) from which a fishing vessel's GM0 may be reduced."""


def reduced_fishing_gm_m(ship_type: str, min_gm_m: float | None) -> float | None:
    """The fishing set's GM0 limit where the profile reduces it below its 0.35 m (Part B 2.1, with the
    Administration's agreement; the profile reader allows it only where that applies), else None.
    The one reading of it for the verdict and the audit of a limiting curve."""
    own = next(c.limit for c in IS2008_B21 if c.measure == "gm_fluid_m")
    return min_gm_m if ship_type == "fishing" and min_gm_m is not None and min_gm_m < own else None

OSV_SOURCE = "IS Code 2008 Part B 2.4.5 (from memory)"
IS2008_B245: tuple[Criterion, ...] = (
    Criterion("IS2008-B2.4.5-area-0-max", "Area under GZ, 0° to the angle of maximum GZ or 30°", "area_0_max_mrad",
              0.055, "m·rad", ">=", OSV_SOURCE),
    Criterion("IS2008-B2.4.5-area-30-40", "Area under GZ, 30° to 40° or θf", "area_30_40_mrad",
              0.030, "m·rad", ">=", OSV_SOURCE),
    Criterion("IS2008-B2.4.5-gz-30", "GZ at an angle of 30° or more", "gz_at_30_plus_m",
              0.20, "m", ">=", OSV_SOURCE),
    Criterion("IS2008-B2.4.5-angle-max-gz", "Angle of maximum GZ", "max_gz_angle_deg",
              15.0, "deg", ">=", OSV_SOURCE),
    Criterion("IS2008-B2.4.5-gm0", "Initial GM0, corrected for free surface", "gm_fluid_m",
              0.15, "m", ">=", OSV_SOURCE),
)
"""Offshore supply vessels, IS 2008 Part B 2.4.5 alternative criteria (standards.md §3.3, all [M]).
The area limit to θmax depends on θmax: see :func:`osv_area_limit_mrad`."""


def osv_area_end_deg(theta_max_deg: float, flood_deg: float | None = None) -> float:
    """Where the OSV area criterion's area ends: at θmax, but at 30° when the maximum lies at 30° or
    beyond, and at θf when θf is less.

    IS 2008 Part B 2.4.5 (from memory; standards.md §3.3 gives the limits [M]): "0.070 m·rad up to
    an angle of 15° when the maximum GZ occurs at 15°, and 0.055 m·rad up to an angle of 30° when
    it occurs at 30° or above", in between 0.055 + 0.001·(30° − θmax) m·rad up to θmax.  The area
    to 30° is the smaller of the two readings of "to θmax" beyond 30°, so it is also the safe one.
    θf: common practice, as for every area of Part A 2.2.1."""
    end = min(theta_max_deg, 30.0)
    return end if flood_deg is None else min(end, flood_deg)


def osv_area_limit_mrad(theta_max_deg: float) -> float:
    """Area to θmax: 0.070 m·rad at θmax ≤ 15°, 0.055 at θmax ≥ 30°, else 0.055 + 0.001·(30° − θmax)
    (IS 2008 Part B 2.4.5, standards.md §3.3 [M]; checks row 30: 0.065 at 20°)."""
    return 0.055 + 0.001 * (30.0 - min(max(theta_max_deg, 15.0), 30.0))


CRITERIA_SETS: dict[str, tuple[Criterion, ...]] = {
    "IS2008-A2.2": IS2008_A22,
    "IS2008-B2.1": IS2008_B21,
    "IS2008-B2.4.5": IS2008_B245,
}
"""The criteria sets that are plain value-against-limit checks on the GZ curve."""

def own_gm_limit_m(ship_type: str) -> tuple[float, str]:
    """The GM0 limit of the sets of ``ship_type`` (:data:`SETS_BY_TYPE`), and its source: what
    ``[criteria] min_gm_m`` must exceed to change anything outside the fishing set, whose limit alone
    may be reduced (Part B 2.1)."""
    rows = [c for sid in SETS_BY_TYPE[ship_type] for c in CRITERIA_SETS.get(sid, ()) if c.measure == "gm_fluid_m"]
    top = max(rows, key=lambda c: c.limit)
    return top.limit, top.source


WEATHER_SET = "IS2008-A2.3"
PASSENGER_SET = "IS2008-A3.1"
EXTRA_SET = "profile-extra"
LIMIT_CURVE_SET = "limit-curve"

SET_TITLES: dict[str, str] = {
    "IS2008-A2.2": "IS Code 2008 Part A 2.2 general criteria",
    WEATHER_SET: "IS Code 2008 Part A 2.3 weather criterion",
    PASSENGER_SET: "IS Code 2008 Part A 3.1 passenger ship heel",
    "IS2008-B2.1": "IS Code 2008 Part B 2.1 fishing vessel criteria",
    "IS2008-B2.4.5": "IS Code 2008 Part B 2.4.5 offshore supply vessel criteria",
    EXTRA_SET: "flag State / class criteria from the vessel profile",
    LIMIT_CURVE_SET: "limiting KG/GM curve from the vessel profile",
}

SETS_BY_TYPE: dict[str, tuple[str, ...]] = {
    "general": ("IS2008-A2.2", WEATHER_SET),
    "fishing": ("IS2008-B2.1", WEATHER_SET),
    "passenger": ("IS2008-A2.2", WEATHER_SET, PASSENGER_SET),
    "offshore_supply": ("IS2008-B2.4.5", WEATHER_SET),
}
"""Sets assessed for each vessel type.  Part A 2.3 applies to ships of 24 m and over; the
fishing and OSV sets take the place of Part A 2.2 (IS 2008 Part B 2.1, 2.4.5)."""


@frozen
class Measures:
    """The values the criteria are measured on, for one condition."""

    area_0_30_mrad: float
    area_0_40_mrad: float
    area_30_40_mrad: float
    gz_at_30_plus_m: float
    max_gz_angle_deg: float
    gm_fluid_m: float
    area_0_max_mrad: float = 0.0
    """Area under GZ from 0° to the angle of maximum GZ (or θf if less), for Part B 2.4.5."""


def evaluate_criteria(code: str, measures: Measures, min_gm_m: float | None = None, *,
                      fishing_gm_m: float | None = None) -> tuple[CriterionResult, ...]:
    """Each criterion of the set with its value, limit and pass/fail.

    ``min_gm_m`` raises the GM0 limit where the Administration requires more than the
    set's own.  ``fishing_gm_m`` replaces the fishing set's 0.35 m where Part B 2.1 lets the
    Administration reduce it (the profile reader checks the floor of 0.15 m and when it applies).
    """
    out = []
    for c in CRITERIA_SETS[code]:
        limit, source = c.limit, c.source
        note = ""
        if c.measure == "gm_fluid_m" and fishing_gm_m is not None and code == "IS2008-B2.1":
            limit, source = fishing_gm_m, "vessel profile (Administration agreement, IS Code 2008 Part B 2.1)"
        elif c.measure == "gm_fluid_m" and min_gm_m is not None and min_gm_m > limit:
            limit, source = min_gm_m, "vessel profile (Administration requirement)"
        if c.measure == "area_0_max_mrad":
            limit = osv_area_limit_mrad(measures.max_gz_angle_deg)
            note = f"limit for θmax {measures.max_gz_angle_deg:.1f}°"
        value = getattr(measures, c.measure)
        passed = meets(value, limit, c.comparison)
        if c.id == "IS2008-A2.2.3-angle-max-gz" and passed and value <= 30.0:
            note = "passes, but IS 2008 A 2.2.3 prefers the maximum beyond 30°"
        out.append(CriterionResult(c.id, c.description, value, limit, c.unit, c.comparison, passed, source, note,
                                   set_id=code))
    return tuple(out)


def limit_curve_criterion(kind: str, limit: float, kg_fluid_m: float, gm_fluid_m: float) -> CriterionResult:
    """The approved limiting-KG (or minimum-GM) curve at this displacement (IS 2008 Part A 2.1.7)."""
    if kind == "max_kg_m":
        return CriterionResult("limit-curve-max-kg", "KG (fluid) within the limiting KG curve", kg_fluid_m,
                               limit, "m", "<=", meets(kg_fluid_m, limit, "<="), "vessel profile limiting-KG curve",
                               set_id=LIMIT_CURVE_SET)
    return CriterionResult("limit-curve-min-gm", "GM (fluid) above the minimum GM curve", gm_fluid_m,
                           limit, "m", ">=", meets(gm_fluid_m, limit, ">="), "vessel profile minimum-GM curve",
                           set_id=LIMIT_CURVE_SET)


EXTRA_FORMS: dict[str, tuple[str, str, str]] = {
    "min_gm": ("Initial GM0, corrected for free surface", "m", ">="),
    "min_area": ("Area under GZ, {from_deg:g}° to {to_deg:g}°", "m·rad", ">="),
    "min_gz_at": ("GZ at {at_deg:g}°", "m", ">="),
    "min_max_gz": ("Maximum GZ", "m", ">="),
    "min_angle_max_gz": ("Angle of maximum GZ", "deg", ">="),
    "min_range": ("Range of positive stability", "deg", ">="),
    "max_static_heel": ("Static heel (list)", "deg", "<="),
    "max_wind_heel": ("Heel under the steady wind lw1 (θ0)", "deg", "<="),
}
"""Description, unit and comparison of each kind of profile criterion (model.EXTRA_KINDS)."""


def extra_criterion_result(n: int, ec, value: float | None, why_not: str = "", note: str = "") -> CriterionResult:
    """A profile (flag State / class) criterion against its measured value; None = not assessable
    (``why_not`` says why); ``note`` goes with a value."""
    text, unit, comp = EXTRA_FORMS[ec.kind]
    desc = text.format(from_deg=ec.from_deg, to_deg=ec.to_deg, at_deg=ec.at_deg)
    cid = f"profile-{n + 1}-{ec.kind.replace('_', '-')}"
    if value is None:
        return CriterionResult(cid, desc, 0.0, ec.limit, unit, comp, False, ec.source, why_not,
                               set_id=EXTRA_SET, assessed=False)
    passed = meets(value, ec.limit, comp)
    return CriterionResult(cid, desc, value, ec.limit, unit, comp, passed, ec.source, note, set_id=EXTRA_SET)
