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
from dataclasses import dataclass

from deckload.core.result import CriterionResult

RAD_TO_DEG = 180.0 / math.pi


def mrad_to_mdeg(area_mrad: float) -> float:
    """m·rad → m·deg (× 180/π)."""
    return area_mrad * RAD_TO_DEG


def mdeg_to_mrad(area_mdeg: float) -> float:
    """m·deg → m·rad (× π/180)."""
    return area_mdeg / RAD_TO_DEG


@dataclass(frozen=True)
class Criterion:
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

CRITERIA_SETS: dict[str, tuple[Criterion, ...]] = {"IS2008-A2.2": IS2008_A22}


@dataclass(frozen=True)
class Measures:
    """The values the criteria are measured on, for one condition."""

    area_0_30_mrad: float
    area_0_40_mrad: float
    area_30_40_mrad: float
    gz_at_30_plus_m: float
    max_gz_angle_deg: float
    gm_fluid_m: float


def evaluate_criteria(code: str, measures: Measures, min_gm_m: float | None = None) -> tuple[CriterionResult, ...]:
    """Each criterion of the set with its value, limit and pass/fail.

    ``min_gm_m`` raises the GM0 limit where the Administration requires more than
    0.15 m (e.g. 0.35 m for single-deck fishing vessels, IS 2008 Part B 2.1, from memory).
    """
    out = []
    for c in CRITERIA_SETS[code]:
        limit, source = c.limit, c.source
        if c.measure == "gm_fluid_m" and min_gm_m is not None and min_gm_m > limit:
            limit, source = min_gm_m, "vessel profile (Administration requirement)"
        value = getattr(measures, c.measure)
        passed = bool(value >= limit) if c.comparison == ">=" else bool(value <= limit)
        note = ""
        if c.measure == "max_gz_angle_deg" and passed and value <= 30.0:
            note = "passes, but IS 2008 A 2.2.3 prefers the maximum beyond 30°"
        out.append(CriterionResult(c.id, c.description, value, limit, c.unit, c.comparison, passed, source, note))
    return tuple(out)


def limit_curve_criterion(kind: str, limit: float, kg_fluid_m: float, gm_fluid_m: float) -> CriterionResult:
    """The approved limiting-KG (or minimum-GM) curve at this displacement (IS 2008 Part A 2.1.7)."""
    if kind == "max_kg_m":
        return CriterionResult("limit-curve-max-kg", "KG (fluid) within the limiting KG curve", kg_fluid_m,
                               limit, "m", "<=", bool(kg_fluid_m <= limit), "vessel profile limiting-KG curve")
    return CriterionResult("limit-curve-min-gm", "GM (fluid) above the minimum GM curve", gm_fluid_m,
                           limit, "m", ">=", bool(gm_fluid_m >= limit), "vessel profile minimum-GM curve")
