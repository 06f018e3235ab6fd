"""Criteria limits raised or reduced by the profile, limits met exactly, and profile criteria
that cannot be assessed — against the published limits.

Sources (standards.md §2 and §3.2):
* IS Code 2008 Part A 2.2.1–2.2.4: areas 0.055 / 0.090 / 0.030 m·rad, GZ ≥ 0.20 m at ≥ 30°,
  angle of GZmax ≥ 25°, GM0 ≥ 0.15 m, each "not less than", so a value equal to its limit meets it.
* IS Code 2008 Part B 2.1 (fishing vessels): GM0 ≥ 0.35 m, which the Administration may reduce,
  never below 0.15 m (standards.md marks the reduction [M], from memory).
* A profile (flag State / class) criterion is a limit with its own source; "at least" and
  "at most" include the limit itself (common practice: a rule's limit is the last permitted value).
"""

from __future__ import annotations

import pytest

from deckload.core.criteria import CRITERIA_SETS, Measures, evaluate_criteria, extra_criterion_result
from deckload.core.model import ExtraCriterion

# A curve that meets every IS 2008 A 2.2 criterion with room to spare.
AMPLE = Measures(area_0_30_mrad=0.10, area_0_40_mrad=0.16, area_30_40_mrad=0.06, gz_at_30_plus_m=0.40,
                 max_gz_angle_deg=35.0, gm_fluid_m=0.80, area_0_max_mrad=0.09)


def _by_suffix(results, suffix: str):
    return next(r for r in results if r.id.endswith(suffix))


def test_fishing_gm_reduced_by_the_administration_replaces_0_35_m_in_the_fishing_set_only():
    """Part B 2.1: GM0 0.35 m, reduced by agreement to 0.20 m; GM0 0.25 m then meets it."""
    m = Measures(**{**AMPLE.__dict__, "gm_fluid_m": 0.25})
    plain = _by_suffix(evaluate_criteria("IS2008-B2.1", m), "gm0")
    assert (plain.limit, plain.passed) == (0.35, False)
    reduced = _by_suffix(evaluate_criteria("IS2008-B2.1", m, fishing_gm_m=0.20), "gm0")
    assert (reduced.limit, reduced.passed) == (0.20, True)
    assert reduced.source == "vessel profile (Administration agreement, IS Code 2008 Part B 2.1)"
    # the reduction touches GM0 only, and never another set's GM0 (Part A 2.2.4 stays 0.15 m)
    others = [r for r in evaluate_criteria("IS2008-B2.1", m, fishing_gm_m=0.20) if not r.id.endswith("gm0")]
    assert [r.limit for r in others] == [r.limit for r in evaluate_criteria("IS2008-B2.1", m)
                                         if not r.id.endswith("gm0")]
    general = _by_suffix(evaluate_criteria("IS2008-A2.2", m, fishing_gm_m=0.20), "gm0")
    assert general.limit == 0.15 and general.source.startswith("IS Code 2008")


def test_an_administration_minimum_gm_raises_the_limit_only_when_it_is_higher():
    """A profile's min GM of 0.50 m raises A 2.2.4's 0.15 m; 0.10 m, or exactly 0.15 m, leaves the
    set's own limit and its source."""
    raised = _by_suffix(evaluate_criteria("IS2008-A2.2", AMPLE, 0.50), "gm0")
    assert (raised.limit, raised.source) == (0.50, "vessel profile (Administration requirement)")
    for lower in (0.10, 0.15):
        kept = _by_suffix(evaluate_criteria("IS2008-A2.2", AMPLE, lower), "gm0")
        assert kept.limit == 0.15 and kept.source.startswith("IS Code 2008"), lower
    # areas and GZ are not touched by a GM requirement
    area = _by_suffix(evaluate_criteria("IS2008-A2.2", AMPLE, 0.50), "area-0-30")
    assert area.limit == 0.055


def test_a_value_equal_to_its_limit_meets_it():
    """Every A 2.2 limit is "not less than": the curve exactly at each limit passes all six."""
    exact = Measures(area_0_30_mrad=0.055, area_0_40_mrad=0.090, area_30_40_mrad=0.030, gz_at_30_plus_m=0.20,
                     max_gz_angle_deg=25.0, gm_fluid_m=0.15)
    results = evaluate_criteria("IS2008-A2.2", exact)
    assert [r.passed for r in results] == [True] * 6
    assert [r.note for r in results if not r.id.endswith("angle-max-gz")] == [""] * 5
    # A 2.2.3 prefers the maximum beyond 30°: at 25° it passes with that remark
    assert _by_suffix(results, "angle-max-gz").note == "passes, but IS 2008 A 2.2.3 prefers the maximum beyond 30°"


def test_profile_criteria_include_their_limit_and_say_when_they_cannot_be_assessed():
    at_least = ExtraCriterion("min_area", 0.070, "Flag notice 1/2026 para 2", from_deg=0.0, to_deg=35.0)
    r = extra_criterion_result(0, at_least, 0.070)
    assert (r.id, r.description, r.passed, r.source, r.unit, r.comparison) == (
        "profile-1-min-area", "Area under GZ, 0° to 35°", True, "Flag notice 1/2026 para 2", "m·rad", ">=")
    assert r.note == "" and r.assessed
    assert not extra_criterion_result(0, at_least, 0.0699).passed
    at_most = ExtraCriterion("max_static_heel", 10.0, "Class rule 3.4")
    assert extra_criterion_result(2, at_most, 10.0).passed
    assert not extra_criterion_result(2, at_most, 10.01).passed
    assert extra_criterion_result(2, at_most, 10.0).id == "profile-3-max-static-heel"
    gz_at = ExtraCriterion("min_gz_at", 0.25, "Flag notice 1/2026 para 3", at_deg=40.0)
    missing = extra_criterion_result(1, gz_at, None, "the KN tables end at 30°")
    assert (missing.description, missing.value, missing.limit, missing.source, missing.note) == (
        "GZ at 40°", 0.0, 0.25, "Flag notice 1/2026 para 3", "the KN tables end at 30°")
    assert (missing.passed, missing.assessed, missing.unit, missing.comparison) == (False, False, "m", ">=")
    assert extra_criterion_result(1, gz_at, None).note == ""


@pytest.mark.parametrize("code", ["IS2008-A2.2", "IS2008-B2.1", "IS2008-B2.4.5"])
def test_every_set_names_its_criteria_by_set(code):
    assert {r.set_id for r in evaluate_criteria(code, AMPLE)} == {code}


@pytest.mark.parametrize("angle, remark", [(30.0, True), (29.9, True), (30.5, False), (35.0, False)])
def test_the_preference_for_a_maximum_beyond_30_degrees_is_remarked_up_to_30_degrees(angle, remark):
    """A 2.2.3: "preferably exceeding 30° but not less than 25°": a maximum at 30.0° or below
    passes with the remark, one beyond 30° passes without it."""
    m = Measures(**{**AMPLE.__dict__, "max_gz_angle_deg": angle})
    r = _by_suffix(evaluate_criteria("IS2008-A2.2", m), "angle-max-gz")
    assert r.passed
    assert r.note == ("passes, but IS 2008 A 2.2.3 prefers the maximum beyond 30°" if remark else "")


def test_the_offshore_supply_area_limit_names_the_angle_it_was_taken_for():
    """B 2.4.5 (standards.md §3.3, [M]; checks.md row 30): area to θmax ≥ 0.055 + 0.001·(30° − θmax),
    so 0.060 m·rad at θmax 25°; the criterion says for which θmax."""
    m = Measures(**{**AMPLE.__dict__, "max_gz_angle_deg": 25.0, "area_0_max_mrad": 0.060})
    r = _by_suffix(evaluate_criteria("IS2008-B2.4.5", m), "area-0-max")
    assert r.limit == pytest.approx(0.060, abs=1e-12) and r.passed
    assert r.note == "limit for θmax 25.0°"


def test_an_assessed_profile_criterion_carries_its_words_and_unit():
    ec = ExtraCriterion("max_wind_heel", 16.0, "Flag notice 1/2026 para 4")
    r = extra_criterion_result(0, ec, 12.5)
    assert (r.description, r.value, r.limit, r.unit, r.comparison, r.passed) == (
        "Heel under the steady wind lw1 (θ0)", 12.5, 16.0, "deg", "<=", True)
    assert r.source == "Flag notice 1/2026 para 4"
    assert r.set_id and r.set_id not in CRITERIA_SETS  # a set of its own, never an IS Code set


def test_a_value_at_its_limit_by_binary_round_off_meets_it_and_shows_no_negative_margin():
    """IS 2008 Part B 2.1 (fishing GM0 ≥ 0.35 m, standards.md §3.2 [M]) and Part A 2.2.4 word their
    limits "not less than": the limit itself meets them.  A GM worked out from decimal data as
    0.34999999999999964 m (0.35 less one unit in the last binary place's neighbourhood) is 0.35 m:
    it meets 0.35, its margin is nil, and the view prints "+0.00" beside "pass", never "-0.00000"
    beside "FAIL".  A shortfall of a micrometre still fails (bounds.ROUND_OFF = 1e-9)."""
    from deckload.report import verdict_format as vf

    at = 0.35 - 4e-16
    assert at < 0.35
    m = Measures(0.1, 0.2, 0.05, 0.3, 35.0, at)
    gm0 = _by_suffix(evaluate_criteria("IS2008-B2.1", m), "gm0")
    assert gm0.passed and gm0.margin == 0.0
    assert vf.margin_text(gm0).strip() in ("+0.00", "+0.000") and "-" not in vf.value_text(gm0)
    short = _by_suffix(evaluate_criteria("IS2008-B2.1", Measures(0.1, 0.2, 0.05, 0.3, 35.0, 0.35 - 1e-6)), "gm0")
    assert not short.passed and short.margin < 0.0


def test_meets_takes_its_limit_and_round_off_of_exactly_1e_9_relative():
    """result.meets (derived from its docstring): the limit itself meets ("not less than" / "not more
    than", IS 2008 Part A 2.2 wording), as does a value short of it by at most 1e-9 × max(1, |limit|);
    a value short by twice that does not.  Pinned at limits below and above 1 m, both comparisons."""
    from deckload.core.bounds import ROUND_OFF as LIMIT_ROUNDOFF
    from deckload.core.result import meets

    for limit in (0.5, 10.0):
        tol = LIMIT_ROUNDOFF * max(1.0, abs(limit))
        assert meets(limit, limit, ">=") and meets(limit, limit, "<=")
        assert meets(limit - tol, limit, ">=") and meets(limit + tol, limit, "<=")
        assert not meets(limit - 2.0 * tol, limit, ">=") and not meets(limit + 2.0 * tol, limit, "<=")
        assert meets(limit - 0.5 * tol, limit, ">=") and meets(limit + 0.5 * tol, limit, "<=")
