"""Where the downflooding angle cuts the measures of the criteria stage, the angle of maximum GZ of a
curve that never rises above zero, and the criteria stage's notes worded for the officer.

The hull is the parallel-sided vessel of tests/vessel_factories.py: KN = KMt·sinφ (the metacentric
form, exact where M does not move with heel; checks.md §2.2).  With all the mass in the lightship
(Δ = 2000 t, KG 4.0 m on the centreline, KMt 6.0 m) and no tanks:

    GM = KMt − KG = 2.0 m,  GZ(φ) = GM·sinφ,  area under GZ from 0 to θ = GM·(1 − cos θ) (m·rad),

derived by integrating GM·sinφ (standards.md §4.3: GZ = KN − KG·sinφ; §6.3: areas in m·rad).

The program integrates by the trapezoidal rule on a 0.1° grid of a spline through KN at 5° columns.
Tolerances: the trapezoid error over ≤ 90° is ≤ (π/2)·h²/12·GM = 8e-7 m·rad (h = 0.1° = 1.75e-3 rad)
and the spline of sinφ through 5° knots differs from sinφ by ≤ 5·(5°)⁴/384·|sin⁗| ≈ 1e-6 per metre of
KMt, so 1e-5 (m·rad or m) is well inside every difference the checks below must see (≥ 1e-3).
"""

from __future__ import annotations

import dataclasses
import math

import pytest

from deckload.core.model import Condition, CriteriaSettings, ExtraCriterion, LimitCurve, MassItem, frozen_array
from deckload.core.stability import evaluate
from vessel_factories import ParallelForm, parallel_sided_vessel

KMT = 6.0
DISP = 2000.0
TOL = 1e-5  # module docstring: trapezoid and spline error, both below 1e-6


def vessel(kg_m=4.0, tcg_m=0.0, **replace):
    form = ParallelForm(displacement_t=DISP, draft_m=6.0, lcb_m=50.0, lcf_m=50.0, kmt_m=KMT,
                        tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=100.0)
    v = parallel_sided_vessel(form, lightship=MassItem("Lightship", DISP, 50.0, kg_m, tcg_m))
    return dataclasses.replace(v, **replace)


def flood_at(angle_deg):
    """A downflooding curve with θf constant over the table's 1600–2400 t."""
    return LimitCurve(frozen_array([1600.0, 2400.0]), frozen_array([angle_deg, angle_deg]), "downflooding_deg")


def crit(r, cid):
    return {c.id: c for c in r.criteria}[cid]


def area(gm, deg):
    return gm * (1.0 - math.cos(math.radians(deg)))


def test_flood_just_above_30_gives_the_30_to_flood_area_and_the_largest_gz_up_to_flood():
    """θf = 30.5°: IS 2008 Part A 2.2.1 takes the area from 30° to θf when θf < 40°, so
    area(30→30.5) = GM·(cos30° − cos30.5°) = 2·(0.8660254 − 0.8616292) = 0.0087924 m·rad (not nil:
    θf is above 30°).  Part A 2.2.2 (GZ ≥ 0.20 m at 30° or more) is read as the largest GZ from 30° up
    to θf (deckload's reading, common practice: conservative, stability.stage_criteria), which on a
    rising curve is GZ(30.5°) = 2·sin30.5° = 1.015192 m; GZ(30.6°) or GZ(31°) would be a reading past
    the openings."""
    r = evaluate(vessel(downflooding=flood_at(30.5)), Condition())
    assert r.downflooding_angle_deg == 30.5
    assert r.area_30_40_mrad == pytest.approx(2.0 * (math.cos(math.radians(30)) - math.cos(math.radians(30.5))),
                                              abs=TOL)
    assert r.area_30_40_mrad == pytest.approx(0.0087924, abs=TOL)
    assert crit(r, "IS2008-A2.2.1-area-30-40").value == pytest.approx(0.0087924, abs=TOL)
    assert crit(r, "IS2008-A2.2.2-gz-30").value == pytest.approx(2.0 * math.sin(math.radians(30.5)), abs=TOL)


def test_flood_below_30_reads_gz_at_30_only():
    """θf = 25°: the 'at 30° or more' reading runs from 30° to max(30°, θf) = 30°, so it is GZ(30°) =
    2·sin30° = 1.0 m exactly at a KN knot (IS 2008 Part A 2.2.2 with deckload's reading, common practice);
    GZ(30.1°) = 1.00302 m or GZ(31°) = 1.03008 m would read past both 30° and θf."""
    r = evaluate(vessel(downflooding=flood_at(25.0)), Condition())
    # at the 30° knot the spline returns KN exactly: only round-off remains
    assert crit(r, "IS2008-A2.2.2-gz-30").value == pytest.approx(1.0, abs=1e-12)


def test_offshore_area_to_the_maximum_stops_at_flood():
    """IS 2008 Part B 2.4.5 (from memory, criteria.py): the area from 0° to the angle of maximum GZ, or to
    θf if less.  GZ = 2·sinφ is largest at 90°; with θf = 25° the area is to 25°:
    2·(1 − cos25°) = 0.187384 m·rad (not 2·(1 − cos90°) = 2.0 m·rad)."""
    v = vessel(downflooding=flood_at(25.0), criteria=CriteriaSettings(ship_type="offshore_supply"))
    r = evaluate(v, Condition())
    assert crit(r, "IS2008-B2.4.5-area-0-max").value == pytest.approx(area(2.0, 25.0), abs=TOL)
    assert area(2.0, 25.0) == pytest.approx(0.187384, abs=1e-6)


def test_offshore_area_stops_at_30_when_the_maximum_lies_beyond():
    """IS 2008 Part B 2.4.5 (from memory, criteria.osv_area_end_deg): "0.055 m·rad up to an angle of
    30° when the maximum GZ occurs at 30° or above".  GZ = 2·sinφ peaks at 90° with no θf: the area
    is to 30°, 2·(1 − cos30°) = 0.267949 m·rad, against 0.055 (not 2·(1 − cos90°) = 2.0 to θmax)."""
    r = evaluate(vessel(criteria=CriteriaSettings(ship_type="offshore_supply")), Condition())
    c = crit(r, "IS2008-B2.4.5-area-0-max")
    assert c.value == pytest.approx(area(2.0, 30.0), abs=TOL) and c.limit == pytest.approx(0.055, abs=1e-12)


def test_profile_area_criterion_stops_at_flood():
    """A flag-State area criterion written in the profile, 0° to 40°, is measured to θf when the
    openings immerse first (the same cut as IS 2008 Part A 2.2.1's 0–40°/θf): with θf = 25° it is
    2·(1 − cos25°) = 0.187384 m·rad, not the area to 40°, 2·(1 − cos40°) = 0.467911 m·rad."""
    extra = ExtraCriterion("min_area", 0.09, "posed flag-State rule for this test", from_deg=0.0, to_deg=40.0)
    v = vessel(downflooding=flood_at(25.0), criteria=CriteriaSettings(extra=(extra,)))
    r = evaluate(v, Condition())
    rows = [c for c in r.criteria if c.source == "posed flag-State rule for this test"]
    assert len(rows) == 1
    assert rows[0].value == pytest.approx(area(2.0, 25.0), abs=TOL)


def test_curve_below_zero_everywhere_has_no_angle_of_maximum():
    """KG 6.5 m (GM = 6.0 − 6.5 = −0.5 m) and G 1.0 m to starboard: heeling to starboard
    GZ(φ) = −0.5·sinφ − 1.0·cosφ (standards.md §6.3, GZ = KN − KG·sinφ − TCG·cosφ), negative from
    −1.0 m at 0° to −0.5 m at 90°, where it is largest.  A curve that is never positive has no
    meaningful angle of maximum GZ (stability.stage_criteria), so IS 2008 Part A 2.2.3 (≥ 25°) is
    measured as 0° and fails; reading 90° (or any other angle) there would pass or flatter her."""
    r = evaluate(vessel(kg_m=6.5, tcg_m=1.0), Condition())
    assert r.criteria_side == "starboard"
    assert r.max_gz_m == pytest.approx(-0.5, abs=TOL)
    c = crit(r, "IS2008-A2.2.3-angle-max-gz")
    assert c.value == 0.0
    assert not c.passed


def test_displacement_off_the_limiting_curve_is_a_danger_worded():
    """A limiting KG curve given for 5000–6000 t only: at Δ = 2000 t the check cannot be made; the
    officer is told so, with the displacement (deckload's own wording; a danger, since a limit of the
    booklet is then unchecked)."""
    lim = LimitCurve(frozen_array([5000.0, 6000.0]), frozen_array([5.0, 5.0]), "max_kg_m")
    r = evaluate(vessel(limit_curve=lim), Condition())
    notes = [(w.code, w.message, w.severity) for w in r.warnings if "limiting curve" in w.message]
    assert notes == [("limit-curve-range",
                      "displacement 2000.0 t is outside the limiting curve, 5000–6000 t: that check was not made",
                      "danger")]


def test_approximate_deck_edge_angle_is_worded():
    """No deck-edge table in the profile: the deck-edge angle is the wall-sided tanφ = freeboard/(B/2)
    at midships (common practice, verdict.deck_edge_angle): depth 12 m − draft 6 m = 6 m freeboard,
    B/2 = 10 m, atan(0.6) = 30.96°, and the caution says it is approximate and why."""
    r = evaluate(vessel(), Condition())
    assert math.degrees(math.atan(0.6)) == pytest.approx(30.96376, abs=1e-5)
    assert r.deck_edge_angle_deg == pytest.approx(30.96376, abs=1e-5)
    notes = [(w.code, w.message, w.severity) for w in r.warnings if w.code == "deck-edge-approximate"]
    assert notes == [("deck-edge-approximate",
                      "deck-edge angle 31.0° approximate: wall-sided at midships, common practice "
                      "(no deck-edge table)", "caution")]


def test_a_curve_to_90_degrees_is_not_called_short():
    """GZ = 2·sinφ is largest at 90°, the last angle of a KN table that reaches 90°: nothing lies beyond
    the table, so the angle-of-maximum row carries no 'the KN tables end' note (that note is for tables
    stopping before 90°, stability._short_curve), and IS 2008 Part A 2.2.3 (≥ 25°) passes at 90°."""
    r = evaluate(vessel(), Condition())
    assert r.gz_end_deg == 90.0
    c = crit(r, "IS2008-A2.2.3-angle-max-gz")
    assert c.value == pytest.approx(90.0, abs=1e-9)
    assert (c.note, c.passed, c.assessed) == ("", True, True)


def test_verdict_notes_are_cautions_coded_by_what_they_say():
    """The criteria stage passes the verdict's notes on as cautions: a weather criterion that could not
    be assessed (no windage data in the profile: IS 2008 Part A 2.3 needs the lateral area) is coded
    'weather-not-assessed'; any other note, e.g. a deck item stated without windage (its side area is
    left out of A 2.3's lateral area), is coded 'verdict-note' (deckload's own codes and wording)."""
    from deckload.core.model import DeckItem
    from test_reference_weather import L as BOX_L
    from test_reference_weather import _box

    r = evaluate(vessel(), Condition())
    assert [(w.code, w.message, w.severity) for w in r.warnings if "windage" in w.message] == [
        ("weather-not-assessed", "IS Code 2008 Part A 2.3 weather criterion not assessed: the profile has no "
         "windage data", "caution")]
    v, c = _box()
    crate = DeckItem("hidden crate", 1e-6, BOX_L / 2, 12.5, 0.0)
    r = evaluate(v, c.with_deck_items((crate,)))
    assert [(w.code, w.message, w.severity) for w in r.warnings if w.code == "verdict-note" and "windage" in w.message] == [
        ("verdict-note", "weather criterion: no windage given for deck item(s) hidden crate; their side area "
         "is not included, so a pass cannot be told (give windage_area_m2, 0 where sheltered)", "caution")]
