"""IS Code 2008 Part A 2.2 general criteria as deckload implements them.

Limits from standards.md §1 and §8 rows 1–7: IS Code 2008 (res. MSC.267(85)) Part A
2.2.1–2.2.4, restated in 46 CFR 170.173(b) in metre-degrees.  Evaluated end to end on
the analytic box barge of checks.md §1 (tests/vessel_factories.py).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.criteria import (
    IS2008_A22,
    Measures,
    evaluate_criteria,
    mdeg_to_mrad,
    mrad_to_mdeg,
)
from deckload.core.model import CriteriaSettings, LimitCurve, frozen_array
from deckload.core.stability import evaluate
from vessel_factories import barge_at, box_dynamic_lever_mrad, box_gz_m

# (criterion id, limit, unit, source paragraph) — IS 2008 Part A 2.2, standards.md §8 rows 1–6.
IS2008_LIMITS = [
    ("IS2008-A2.2.1-area-0-30", 0.055, "m·rad", "2.2.1"),     # §8 row 1
    ("IS2008-A2.2.1-area-0-40", 0.090, "m·rad", "2.2.1"),     # §8 row 2
    ("IS2008-A2.2.1-area-30-40", 0.030, "m·rad", "2.2.1"),    # §8 row 3
    ("IS2008-A2.2.2-gz-30", 0.20, "m", "2.2.2"),              # §8 row 4
    ("IS2008-A2.2.3-angle-max-gz", 25.0, "deg", "2.2.3"),     # §8 row 5
    ("IS2008-A2.2.4-gm0", 0.15, "m", "2.2.4"),                # §8 row 6
]


def by_id(result, cid):
    matches = [c for c in result.criteria if c.id == cid]
    assert len(matches) == 1, f"criterion {cid} appears {len(matches)} times"
    return matches[0]


@pytest.mark.parametrize("cid, limit, unit, para", IS2008_LIMITS)
def test_is2008_limits_as_data(cid, limit, unit, para):
    """IS 2008 Part A 2.2 limits (standards.md §1; §8 rows 1–6): value, unit, '>=' and the paragraph."""
    c = {c.id: c for c in IS2008_A22}[cid]
    assert c.limit == limit
    assert c.unit == unit
    assert c.comparison == ">="
    assert para in c.source and "2008" in c.source
    assert len(IS2008_A22) == 6  # 2.2.1 three areas, 2.2.2, 2.2.3, 2.2.4 (standards.md §1)


@pytest.mark.parametrize("cid, limit, unit, para", IS2008_LIMITS)
def test_is2008_limits_reach_the_result(cid, limit, unit, para):
    """Every IS 2008 A 2.2 criterion is evaluated for a condition, with its limit and source."""
    v, c = barge_at(2.0, 3.0)
    r = evaluate(v, c)
    crit = by_id(r, cid)
    assert crit.limit == limit and crit.unit == unit and para in crit.source


@pytest.mark.parametrize(
    "mrad, mdeg_exact, mdeg_cfr",
    [(0.055, 3.151, 3.15), (0.090, 5.157, 5.15), (0.030, 1.719, 1.72)],
)
def test_mrad_mdeg(mrad, mdeg_exact, mdeg_cfr):
    """46 CFR 170.173(b) gives the IS areas in m·deg: 3.151/5.157/1.719 (CFR prints 3.15/5.15/1.72).

    m·deg = m·rad × 180/π (standards.md §8 row 7).
    """
    assert round(mrad_to_mdeg(mrad), 3) == mdeg_exact
    assert abs(mrad_to_mdeg(mrad) - mdeg_cfr) < 0.01
    # back from the CFR's 3-dp metre-degrees: half a unit of the last digit, 5e-4 m·deg = 8.7e-6 m·rad
    assert mdeg_to_mrad(mdeg_exact) == pytest.approx(mrad, abs=8.8e-6)


def test_one_radian_in_degrees():
    """1 rad = 57.2958° (standards.md §6.3, printed to 4 dp): the conversion the areas are printed with."""
    assert mrad_to_mdeg(1.0) == pytest.approx(57.2958, abs=5e-5)
    assert mdeg_to_mrad(57.2958) == pytest.approx(1.0, abs=1e-6)


def _measures(**kw):
    base = dict(area_0_30_mrad=0.1, area_0_40_mrad=0.2, area_30_40_mrad=0.1, gz_at_30_plus_m=0.5,
                max_gz_angle_deg=35.0, gm_fluid_m=1.0)
    base.update(kw)
    return Measures(**base)


@pytest.mark.parametrize("cid, limit, unit, para", IS2008_LIMITS)
def test_limit_itself_passes_and_just_below_fails(cid, limit, unit, para):
    """IS 2008 A 2.2 says 'not less than': the limit value passes, anything below fails."""
    measure = {c.id: c.measure for c in IS2008_A22}[cid]
    at = {c.id: c for c in evaluate_criteria("IS2008-A2.2", _measures(**{measure: limit}))}[cid]
    below = {c.id: c for c in evaluate_criteria("IS2008-A2.2", _measures(**{measure: limit * (1 - 1e-6)}))}[cid]
    assert at.passed and at.margin == pytest.approx(0.0, abs=1e-15)
    assert not below.passed and below.margin < 0


def test_stricter_gm_from_profile():
    """An Administration may require more GM0, e.g. 0.35 m for single-deck fishing vessels
    (46 CFR 28.570 [C]; IS 2008 Part B 2.1 [M], standards.md §8 row 27): the stricter limit governs."""
    r = {c.id: c for c in evaluate_criteria("IS2008-A2.2", _measures(gm_fluid_m=0.30), min_gm_m=0.35)}
    assert r["IS2008-A2.2.4-gm0"].limit == 0.35 and not r["IS2008-A2.2.4-gm0"].passed
    # A laxer profile value never relaxes the Code's 0.15 m.
    r = {c.id: c for c in evaluate_criteria("IS2008-A2.2", _measures(gm_fluid_m=0.12), min_gm_m=0.10)}
    assert r["IS2008-A2.2.4-gm0"].limit == 0.15 and not r["IS2008-A2.2.4-gm0"].passed
    v, c = barge_at(2.0, 4.95, criteria=CriteriaSettings(min_gm_m=0.35))  # GM = 5.16667 − 4.95 = 0.21667
    g = by_id(evaluate(v, c), "IS2008-A2.2.4-gm0")
    assert g.limit == 0.35 and not g.passed
    assert g.value == pytest.approx(10**2 / (12 * 2.0) + 2.0 / 2 - 4.95, abs=1e-12)


def test_downflooding_angle_cuts_the_areas():
    """IS 2008 A 2.2.1: with θf < 40° the 0–40° and 30–40° areas stop at θf.

    Barge T = 2, KG = 3 (checks.md §1), θf = 35°: expected areas from the exact
    dynamic lever of checks.md §1.3, area(0→φ) = y_B·sinφ + (KG − z_B)·cosφ − (KG − KB).
    Tables at 1° heel steps so that interpolation error is below 1e-4 m·rad.
    """
    flood = LimitCurve(frozen_array([200.0, 1500.0]), frozen_array([35.0, 35.0]), "downflooding_deg")
    v, c = barge_at(2.0, 3.0, heel_step_deg=1.0, downflooding=flood)
    r = evaluate(v, c)
    a30 = box_dynamic_lever_mrad(10, 4, 2, 3.0, math.radians(30))
    a35 = box_dynamic_lever_mrad(10, 4, 2, 3.0, math.radians(35))
    assert r.downflooding_angle_deg == 35.0
    assert r.area_0_30_mrad == pytest.approx(a30, abs=1e-4)
    assert by_id(r, "IS2008-A2.2.1-area-0-40").value == pytest.approx(a35, abs=1e-4)
    assert by_id(r, "IS2008-A2.2.1-area-30-40").value == pytest.approx(a35 - a30, abs=1e-4)
    # GZ ≥ 0.20 m 'at an angle of 30° or more' (A 2.2.2): the barge's GZ falls after 29.18°,
    # so the largest value at or beyond 30° is GZ(30°) = 1.08771 (checks.md §1.2).
    assert by_id(r, "IS2008-A2.2.2-gz-30").value == pytest.approx(box_gz_m(10, 4, 2, 3.0, math.radians(30)), abs=1e-9)


def test_limiting_kg_curve():
    """IS 2008 A 2.1.7: a maximum-KG curve against displacement proves compliance where used.

    Limit at Δ = 820 t interpolated linearly between (600 t, 3.4 m) and (1000 t, 3.8 m):
    3.4 + (820 − 600)/(400)·0.4 = 3.62 m; KG fluid 3.0 passes, 3.7 fails.
    """
    curve = LimitCurve(frozen_array([600.0, 1000.0]), frozen_array([3.4, 3.8]), "max_kg_m")
    limit = 3.4 + (820.0 - 600.0) / 400.0 * 0.4
    for kg, ok in ((3.0, True), (3.7, False)):
        v, c = barge_at(2.0, kg, limit_curve=curve)
        crit = by_id(evaluate(v, c), "limit-curve-max-kg")
        assert crit.limit == pytest.approx(limit, abs=1e-12)
        assert crit.value == pytest.approx(kg, abs=1e-12)
        assert bool(crit.passed) is ok


def test_limit_curves_name_what_they_check():
    """The result says what a limiting curve checks, in which unit and against which source (the
    profile's approved curve, IS 2008 A 2.1.7), so the watchkeeper can tell the two kinds apart."""
    kg_curve = LimitCurve(frozen_array([600.0, 1000.0]), frozen_array([3.4, 3.8]), "max_kg_m")
    v, c = barge_at(2.0, 3.0, limit_curve=kg_curve)
    crit = by_id(evaluate(v, c), "limit-curve-max-kg")
    assert (crit.description, crit.unit, crit.comparison, crit.source) == (
        "KG (fluid) within the limiting KG curve", "m", "<=", "vessel profile limiting-KG curve")


@pytest.mark.parametrize("kg, ok", [(3.0, True), (3.5, False)])
def test_minimum_gm_curve(kg, ok):
    """IS 2008 A 2.1.7: a minimum-GM curve against displacement.  Barge at T = 2 m (Δ 820 t), KM 5.16667
    (checks.md §1.1 [A]): GM = 5.16667 − KG, 2.16667 at KG 3 and 1.66667 at KG 3.5.  Limit at 820 t
    between (600 t, 1.6 m) and (1000 t, 2.4 m): 1.6 + 220/400·0.8 = 2.04 m, so KG 3 passes, 3.5 fails."""
    curve = LimitCurve(frozen_array([600.0, 1000.0]), frozen_array([1.6, 2.4]), "min_gm_m")
    v, c = barge_at(2.0, kg, limit_curve=curve)
    r = evaluate(v, c)
    crit = by_id(r, "limit-curve-min-gm")
    assert crit.limit == pytest.approx(2.04, abs=1e-12)
    assert crit.value == pytest.approx(1.0 + 100.0 / 24.0 - kg, abs=1e-12)
    assert crit.passed is ok
    assert (crit.description, crit.unit, crit.comparison, crit.source) == (
        "GM (fluid) above the minimum GM curve", "m", ">=", "vessel profile minimum-GM curve")
    assert not any(x.id == "limit-curve-max-kg" for x in r.criteria)


def test_a_value_exactly_at_a_limit_curve_passes():
    """A limit is met by a value equal to it: KG fluid not above the maximum-KG curve, GM fluid not below
    the minimum-GM curve (IS 2008 A 2.1.7; the curve values are limits, common practice).  The barge at
    T = 2 m, KG 3 (Δ 820 t, on the curves' first row, so nothing is interpolated): KG 3.0 against a
    limit of 3.0, GM = KM − KG = (1 + 100/24) − 3 against exactly that limit."""
    gm = (1.0 + 100.0 / 24.0) - 3.0
    for kind, value, cid in (("max_kg_m", 3.0, "limit-curve-max-kg"), ("min_gm_m", gm, "limit-curve-min-gm")):
        curve = LimitCurve(frozen_array([820.0, 1000.0]), frozen_array([value, value]), kind)
        v, c = barge_at(2.0, 3.0, limit_curve=curve)
        crit = by_id(evaluate(v, c), cid)
        assert crit.value == crit.limit == value
        assert crit.passed is True


def test_failed_criterion_warns():
    """A failed criterion is named in a 'danger' warning (barge KG 4.5 fails the 30–40° area,
    0.028741 < 0.030 m·rad, checks.md §1.3)."""
    v, c = barge_at(2.0, 4.5)
    r = evaluate(v, c)
    assert not by_id(r, "IS2008-A2.2.1-area-30-40").passed
    assert any(w.code == "criterion-failed" and "30° to 40°" in w.message and w.severity == "danger"
               for w in r.warnings)
    assert not r.all_criteria_pass
    assert r.smallest_margin.id in {"IS2008-A2.2.1-area-30-40", "IS2008-A2.2.3-angle-max-gz"}
    assert np.isfinite(r.smallest_margin.margin)


def test_a_criterion_within_ten_percent_of_its_limit_is_a_caution():
    """The watchkeeper is cautioned when a criterion passes by less than 10 % of its limit (deckload's
    own aid).  Barge T = 2 m, KG 3: GM fluid = 2.16667 m (checks.md §1.1 [A]); with the profile's
    minimum GM raised to 2.0 m the margin is 0.16667/2.0 = 8.3 % < 10 %."""
    v, c = barge_at(2.0, 3.0, criteria=CriteriaSettings(min_gm_m=2.0))
    r = evaluate(v, c)
    near = [w for w in r.warnings if w.code == "criterion-near"]
    assert len(near) == 1 and near[0].severity == "caution"
    assert near[0].message == ("Initial GM0, corrected for free surface within 10 % of its limit: "
                               "2.167 m against 2.000")
    v, c = barge_at(2.0, 3.0, criteria=CriteriaSettings(min_gm_m=1.9))  # margin 14 %: no caution
    assert not any(w.code == "criterion-near" for w in evaluate(v, c).warnings)
