"""Criteria the data cannot decide are never worded as met: an unknown downflooding angle, a limiting
curve that does not reach the displacement, no downflooding angles at all, and an area a of the
weather criterion that runs beyond the KN tables.

Two analytic hulls of tests/vessel_factories.py:

* the parallel-sided vessel (KN = KMt·sinφ, the metacentric form, checks.md §2.2), all mass in the
  lightship: Δ = 2000 t, KMt 6.0 m, G on the centreline, so GM = 6.0 − KG and

      GZ(φ) = GM·sinφ,   area under GZ from α to β = GM·(cos α − cos β)  (m·rad),

  by integrating GM·sinφ (standards.md §4.3: GZ = KN − KG·sinφ; §6.3: areas in m·rad);
* the box barge 40 × 10 × 4 m (checks.md §1), exact GZ and area from the section formulas
  (``box_gz_m``, ``box_dynamic_lever_mrad``, checks.md §1.2–1.3).

θf enters IS 2008 Part A 2.2.1 (areas to 40° or θf when θf < 40°) and Part A 2.3 (θ2 = min(θf, 50°,
θc)): standards.md §1, §2.1 step 5.  When the profile's downflooding curve does not reach the
displacement, θf may be any angle from 0°: a criterion worked to θf is met only if met at every θf,
failed if failed at every θf, and otherwise not assessable.

Tolerances: the program integrates the trapezoidal rule on a 0.1° grid of a spline through KN (5° or
1° columns): for GZ = GM·sinφ the trapezoid error over ≤ 90° is ≤ (π/2)·h²/12·GM ≈ 4e-7·GM and the
spline of sinφ through 5° knots is good to about 1e-6 per metre of KMt, so 1e-5 is well inside every
difference checked here (≥ 1e-3).  The box barge with 1° KN columns: 1e-5 likewise
(tests/test_evaluate_stages.py derives it).
"""

from __future__ import annotations

import dataclasses
import json
import math
import re

import pytest

from deckload.cli.main import main
from deckload.core.model import (
    Condition,
    CriteriaSettings,
    CrossCurves,
    ExtraCriterion,
    LimitCurve,
    MassItem,
    Windage,
    frozen_array,
)
from deckload.core.booklet import compare
from deckload.core.stability import evaluate
from deckload.report import verdict_format as vf
from deckload.report.condition_report import render_report_text
from box_profile_text import BoxTank, box_profile_text
from vessel_factories import (
    BARGE_DRAFTS_M,
    ParallelForm,
    barge_at,
    box_dynamic_lever_mrad,
    box_gz_m,
    parallel_sided_vessel,
)

TOL = 1e-5  # module docstring
DISP = 2000.0
OFF = LimitCurve(frozen_array([5000.0, 6000.0]), frozen_array([35.0, 35.0]), "downflooding_deg")
"""A downflooding curve for 5000–6000 t only: neither hull here floats in that range."""
REASON = "displacement 2000.0 t is outside the downflooding-angle curve, 5000–6000 t"


def vessel(kg_m=4.0, **replace):
    form = ParallelForm(displacement_t=DISP, draft_m=6.0, lcb_m=50.0, lcf_m=50.0, kmt_m=6.0,
                        tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=100.0)
    v = parallel_sided_vessel(form, lightship=MassItem("Lightship", DISP, 50.0, kg_m, 0.0))
    return dataclasses.replace(v, **replace)


def crit(r, cid):
    return {c.id: c for c in r.criteria}[cid]


def area(gm, lo_deg, hi_deg):
    return gm * (math.cos(math.radians(lo_deg)) - math.cos(math.radians(hi_deg)))


def barge_windage(v):
    """The barge's own side above the water: A = L·(D − T), centre (D − T)/2 above it, Lwl = L."""
    t = [float(x) for x in BARGE_DRAFTS_M]
    return dataclasses.replace(v, windage=Windage(
        frozen_array(t), frozen_array([40.0 * (4.0 - x) for x in t]), frozen_array([(4.0 - x) / 2.0 for x in t]),
        frozen_array([40.0] * len(t))))


# --------------------------------------------------------------------------- 1. θf unknown


def test_unknown_flood_leaves_the_areas_to_flood_not_assessable_and_the_verdict_not_met():
    """GM = 6.0 − 4.0 = 2.0 m.  With θf unknown (anywhere from 0°):
    * area 0°–40°/θf runs from 0 (θf = 0°) up to 2·(1 − cos40°) = 0.467911 ≥ 0.090: not assessable;
    * area 30°–40°/θf from 0 up to 2·(cos30° − cos40°) = 0.199963 ≥ 0.030: not assessable
      (IS 2008 Part A 2.2.1, standards.md §1 rows 2.2.1);
    * GZ ≥ 0.20 m at 30° or more, read from 30° to θf (deckload's reading, common practice): at least
      GZ(30°) = 2·sin30° = 1.0 m whatever θf is, so met, with that value (A 2.2.2);
    * area 0°–30° (A 2.2.1) does not depend on θf: 2·(1 − cos30°) = 0.267949, met.
    The verdict then cannot read "Met:"; the set is not passed."""
    r = evaluate(vessel(downflooding=OFF), Condition())
    assert r.downflooding_angle_deg is None
    for cid in ("IS2008-A2.2.1-area-0-40", "IS2008-A2.2.1-area-30-40"):
        c = crit(r, cid)
        assert (c.assessed, c.passed) == (False, False)
        assert c.note == f"needs θf, which is unknown ({REASON}): not assessable"
    gz30 = crit(r, "IS2008-A2.2.2-gz-30")
    assert gz30.assessed and gz30.passed
    assert gz30.value == pytest.approx(1.0, abs=1e-12)  # at the 30° knot the spline returns KN exactly
    assert crit(r, "IS2008-A2.2.1-area-0-30").value == pytest.approx(area(2.0, 0, 30), abs=TOL)
    assert crit(r, "IS2008-A2.2.1-area-0-30").passed
    assert r.verdict_text().startswith("Met where assessable, 2 criteria not assessable")
    assert not r.verdict_text().startswith("Met:")
    assert [s.passed for s in r.criteria_sets if s.id == "IS2008-A2.2"] == [False]
    assert vf.outcome_word(c for c in r.criteria if c.set_id == "IS2008-A2.2") == "met where assessable"


def test_unknown_flood_fails_what_no_flood_angle_could_pass_and_leaves_the_rest_open():
    """KG 5.75 m: GM = 0.25 m.  Whatever θf is (standards.md §1, IS 2008 Part A 2.2.1–2.2.2):
    * area 0°–40°/θf is at most 0.25·(1 − cos40°) = 0.058489 < 0.090: failed, that value shown;
    * area 30°–40°/θf at most 0.25·(cos30° − cos40°) = 0.024995 < 0.030: failed;
    * GZ at 30° or more: GZ(30°) = 0.125 m < 0.20 m, but GZ(90°) = 0.25 m ≥ 0.20 m, so θf decides
      (met with θf beyond 53.1°, where 0.25·sinφ = 0.2): not assessable, never met."""
    r = evaluate(vessel(kg_m=5.75, downflooding=OFF), Condition())
    for cid, lo, hi in (("IS2008-A2.2.1-area-0-40", 0, 40), ("IS2008-A2.2.1-area-30-40", 30, 40)):
        c = crit(r, cid)
        assert (c.assessed, c.passed) == (True, False)
        assert c.value == pytest.approx(area(0.25, lo, hi), abs=TOL)
        assert c.note == f"θf unknown ({REASON}): fails at any θf; the value is the most it could be"
    assert area(0.25, 0, 40) == pytest.approx(0.058489, abs=1e-6) and area(0.25, 30, 40) == pytest.approx(0.024995, abs=1e-6)
    gz30 = crit(r, "IS2008-A2.2.2-gz-30")
    assert (gz30.assessed, gz30.passed) == (False, False)
    # area 0°–30° = 0.25·(1 − cos30°) = 0.033494 < 0.055 fails too; GM0 0.25 ≥ 0.15 m and the maximum at 90° pass
    assert r.verdict_text().startswith("NOT MET (3 failed)")


def test_unknown_flood_fails_gz_at_30_when_no_angle_reaches_it():
    """KG 5.85 m: GM = 0.15 m, GZ = 0.15·sinφ never reaches 0.20 m (largest 0.15 m at 90°), so GZ at 30°
    or more fails whatever θf is (IS 2008 Part A 2.2.2), the value the most it could be: 0.15 m."""
    r = evaluate(vessel(kg_m=5.85, downflooding=OFF), Condition())
    c = crit(r, "IS2008-A2.2.2-gz-30")
    assert (c.assessed, c.passed) == (True, False)
    assert c.value == pytest.approx(0.15, abs=TOL)
    assert c.note == f"θf unknown ({REASON}): fails at any θf; the value is the most it could be"


def test_unknown_flood_takes_the_largest_area_where_gz_falls_through_zero():
    """Box barge at T = 2 m (Δ = 820 t), KG 4.75 m, 1° KN columns: GZ falls through zero at θv ≈ 35.7°
    (bisection of the exact GZ, checks.md §1.2), before 40°.  An area cut at an unknown θf is largest with
    θf at θv, not at 40°: area(0→θv) ≥ 0.090 > area(0→40°) (exact areas, checks.md §1.3), so 0°–40°/θf is
    not assessable (the area to 40° alone would fail it); 30°–40°/θf is at most area(30°→θv) < 0.030:
    failed with that value (IS 2008 Part A 2.2.1)."""
    kg = 4.75
    gz = lambda d: box_gz_m(10.0, 4.0, 2.0, kg, math.radians(d))  # noqa: E731
    lo, hi = 30.0, 40.0
    for _ in range(60):
        mid = (lo + hi) / 2
        lo, hi = (mid, hi) if gz(mid) > 0 else (lo, mid)
    theta_v = lo
    a = lambda d: box_dynamic_lever_mrad(10.0, 4.0, 2.0, kg, math.radians(d))  # noqa: E731
    assert 35.0 < theta_v < 36.0
    assert a(40.0) < 0.090 <= a(theta_v) - 1e-3  # the two readings fall either side of the limit
    v, c = barge_at(2.0, kg, heel_step_deg=1.0)
    r = evaluate(dataclasses.replace(v, downflooding=OFF), c)
    c040 = crit(r, "IS2008-A2.2.1-area-0-40")
    assert (c040.assessed, c040.passed) == (False, False)
    c3040 = crit(r, "IS2008-A2.2.1-area-30-40")
    assert (c3040.assessed, c3040.passed) == (True, False)
    assert c3040.value == pytest.approx(a(theta_v) - a(30.0), abs=TOL)
    assert abs((a(40.0) - a(30.0)) - (a(theta_v) - a(30.0))) > 1e-3  # not the area to 40°


def test_unknown_flood_in_the_offshore_and_the_profile_areas():
    """IS 2008 Part B 2.4.5 (from memory, criteria.py): area 0° to θmax or θf.  GM 2.0 m: GZ = 2·sinφ is
    largest at 90°, the area up to 2·(1 − cos90°) = 2.0 m·rad ≥ the limit, 0 at θf = 0°: not assessable.
    A profile criterion "area 0°–40° ≥ 0.09" (posed for this test) is cut at θf the same way: not
    assessable at GM 2.0 m; at GM 0.25 m at most 0.25·(1 − cos40°) = 0.058489 < 0.09: failed."""
    extra = ExtraCriterion("min_area", 0.09, "posed flag-State rule for this test", from_deg=0.0, to_deg=40.0)
    cs = CriteriaSettings(ship_type="offshore_supply", extra=(extra,))
    r = evaluate(vessel(downflooding=OFF, criteria=cs), Condition())
    assert not crit(r, "IS2008-B2.4.5-area-0-max").assessed
    assert not crit(r, "IS2008-B2.4.5-area-30-40").assessed
    row = next(c for c in r.criteria if c.source == "posed flag-State rule for this test")
    assert (row.assessed, row.passed) == (False, False)
    assert row.note == f"needs θf, which is unknown ({REASON}): not assessable"
    r = evaluate(vessel(kg_m=5.75, downflooding=OFF, criteria=cs), Condition())
    row = next(c for c in r.criteria if c.source == "posed flag-State rule for this test")
    assert (row.assessed, row.passed) == (True, False)
    assert row.value == pytest.approx(area(0.25, 0, 40), abs=TOL)


def test_unknown_flood_leaves_the_weather_criterion_open_or_failed():
    """IS 2008 Part A 2.3 (standards.md §2.1 steps 4–5): θ2 = min(θf, 50°, θc), and between the first
    intercept of lw2 and θc GZ lies above lw2, so area b only grows with θ2: largest with no opening.
    * barge T = 2 m, KG 3 m, windage of its own side: with no openings b ≥ a, so θf decides: not
      assessable, and no weather numbers are reported as the criterion's;
    * barge T = 1 m, KG 4 m: with no openings b < a already, so it fails at any θf.
    The steady-wind heel θ0 (A 2.3.1.2) does not depend on θf and stays assessed."""
    for t, kg, open_ in ((2.0, 3.0, True), (1.0, 4.0, False)):
        v, c = barge_at(t, kg)
        v = barge_windage(v)
        free = evaluate(v, c)
        wb = crit(free, "IS2008-A2.3-area-b-a")
        assert wb.assessed and (wb.value >= wb.limit) == open_  # the two cases are what they are said to be
        r = evaluate(dataclasses.replace(v, downflooding=OFF), c)
        row = crit(r, "IS2008-A2.3-area-b-a")
        assert crit(r, "IS2008-A2.3-theta0").assessed and crit(r, "IS2008-A2.3-theta0").passed
        reason = f"displacement {1.025 * 400 * t:.1f} t is outside the downflooding-angle curve, 5000–6000 t"
        if open_:
            assert (row.assessed, row.passed) == (False, False)
            assert row.note.startswith(f"θ2 = min(θf, 50°, θc) needs θf, unknown ({reason}): not assessable "
                                       f"(b with no openings {wb.value:.4f} m·rad); ")
            assert "θ2 50.0° with no openings" in row.note
        else:
            assert (row.assessed, row.passed) == (True, False)
            assert row.value == pytest.approx(wb.value, abs=1e-12) and row.limit == pytest.approx(wb.limit, abs=1e-12)
            assert row.note.startswith(f"θf unknown ({reason}): b falls short of a even with θ2 at 50° or θc")
        assert r.weather is None
        assert not any(s.passed for s in r.criteria_sets if s.id == "IS2008-A2.3")


def test_unknown_flood_danger_says_what_it_means():
    r = evaluate(vessel(downflooding=OFF), Condition())
    assert [(w.message, w.severity) for w in r.warnings if w.code == "downflooding-range"] == [(
        f"{REASON}: θf is unknown, so the criteria worked to θf (areas to 40° or θf, GZ at 30° or more, "
        "the weather criterion's θ2) are not assessable, or failed where no θf could meet them", "danger")]


# --------------------------------------------------------------------------- 2. limiting curve off its range


def test_a_limiting_curve_off_the_displacement_is_listed_as_not_assessed():
    """IS 2008 Part A 2.1.7 (standards.md §1): a limiting KG/GM curve used to prove compliance must cover
    the condition.  One for 5000–6000 t at Δ = 2000 t cannot be read: the set is named among what was not
    assessed, with the reason, in the result and in the verdict sentence."""
    lim = LimitCurve(frozen_array([5000.0, 6000.0]), frozen_array([5.0, 5.0]), "max_kg_m")
    r = evaluate(vessel(limit_curve=lim), Condition())
    reason = "displacement 2000.0 t is outside the limiting curve, 5000–6000 t"
    assert ("limiting KG/GM curve from the vessel profile", reason) in [(n.item, n.reason) for n in r.not_assessed]
    assert f"limiting KG/GM curve from the vessel profile ({reason})" in r.verdict_text()
    assert not [s for s in r.criteria_sets if s.id == "limit-curve"]
    # in fresh water the curve is read at the table-equivalent 2000·1.025/1.000 = 2050 t (the same
    # waterline: hydrostatics module, standards.md §6.3), and the reason says so
    r = evaluate(vessel(limit_curve=lim), Condition(water_density_t_m3=1.0))
    assert ("limiting KG/GM curve from the vessel profile", "displacement 2000.0 t (2050.0 t at the tables' density) "
            "is outside the limiting curve, 5000–6000 t") in [(n.item, n.reason) for n in r.not_assessed]
    # read where it reaches: a set of its own, not listed as not assessed
    lim = LimitCurve(frozen_array([1000.0, 3000.0]), frozen_array([5.0, 5.0]), "max_kg_m")
    r = evaluate(vessel(limit_curve=lim), Condition())
    assert [s.id for s in r.criteria_sets][-1] == "limit-curve"
    assert not [n for n in r.not_assessed if n.item.startswith("limiting")]


# --------------------------------------------------------------------------- 3. no downflooding angles


def test_no_downflooding_angles_is_a_caution_worded_as_the_report_words_it():
    """A profile with no [downflooding] gives no θf: it is taken as none (no opening floods), which the
    officer is told, in the words the report prints ("not given: taken as none")."""
    r = evaluate(vessel(), Condition())
    notes = [(w.message, w.severity) for w in r.warnings if w.code == "downflooding-not-given"]
    assert notes == [("θf not given: the profile gives no downflooding angles, so θf is taken as none (no opening "
                      "that floods): the areas run to 40°, GZ at 30° or more is read up to 90° and the weather "
                      "criterion's θ2 is the lesser of 50° and θc; check the booklet's downflooding angle",
                      "caution")]
    assert vf.flood_words(r) == "not given: taken as none"
    assert not [w for w in evaluate(vessel(downflooding=OFF), Condition()).warnings
                if w.code == "downflooding-not-given"]
    covering = LimitCurve(frozen_array([1000.0, 3000.0]), frozen_array([45.0, 45.0]), "downflooding_deg")
    r = evaluate(vessel(downflooding=covering), Condition())
    assert not [w for w in r.warnings if w.code.startswith("downflooding")]
    assert vf.flood_words(r) == "45.0°"


# --------------------------------------------------------------------------- 4. area a beyond the KN tables


def _to_40(cc: CrossCurves) -> CrossCurves:
    keep = [i for i, h in enumerate(cc.heel_deg) if h <= 40.0]
    return dataclasses.replace(cc, heel_deg=frozen_array(cc.heel_deg[keep]), kn_m=frozen_array(cc.kn_m[:, keep]))


def test_area_a_beyond_the_kn_tables_is_not_assessable():
    """Barge T = 1 m (Δ = 410 t), KG 4 m, windage of its own side, θf 40°, KN to 40° only.  θ1 =
    109·k·X1·X2·√(r·s) (standards.md §2.3–2.4, tables from memory): k = 1 (round bilge, no keels), B/d = 10
    → X1 = 0.80, Cb = 1 → X2 = 1.00, r = 0.73 + 0.6·(4 − 1)/1 = 2.53, GM = 0.5 + 10²/12 − 4 = 4.8333 m,
    C = 0.373 + 0.023·10 − 0.043·0.4 = 0.5858, T = 2·0.5858·10/√4.8333 = 5.33 s → s = 0.100; θ1 =
    109·0.8·√0.253 = 43.86°.  θ0 is under 1°, so area a runs from θ0 − θ1 ≈ −43.5°, beyond −40°: cut at
    the table's end it is too small (IS 2008 A 2.3.1.4 takes it from θ0 − θ1): not assessable.  KG 3 m:
    r = 1.93, GM 5.8333, T = 4.85 s, θ1 = 87.2·√0.193 = 38.31°, θ0 − θ1 > −40°: assessed."""
    assert 109 * 0.8 * math.sqrt(2.53 * 0.1) == pytest.approx(43.8608, abs=1e-4)
    assert 109 * 0.8 * math.sqrt(1.93 * 0.1) == pytest.approx(38.3085, abs=1e-4)
    flood40 = LimitCurve(frozen_array([205.0, 1435.0]), frozen_array([40.0, 40.0]), "downflooding_deg")
    v, c = barge_at(1.0, 4.0, downflooding=flood40)
    v = barge_windage(v)
    short = dataclasses.replace(v, cross_curves=_to_40(v.cross_curves))
    r = evaluate(short, c)
    assert r.gz_end_deg == 40.0
    row = crit(r, "IS2008-A2.3-area-b-a")
    assert (row.assessed, row.passed) == (False, False)
    assert row.note.startswith("area a needs GZ to 43.5° to windward (θ0 − θ1), beyond the KN tables' 40°: "
                               "not assessable (b ")
    assert f"; a counted from 40° only: {row.limit:.4f} m·rad); θ1 43.9°" in row.note
    assert r.weather is None
    full = crit(evaluate(v, c), "IS2008-A2.3-area-b-a")  # the whole curve: a counted from θ0 − θ1
    assert full.assessed and full.limit > row.limit + 0.03  # the cut a was smaller (0.7701 against 0.7172)
    v3, c3 = barge_at(1.0, 3.0, downflooding=flood40)
    v3 = barge_windage(v3)
    assert crit(evaluate(dataclasses.replace(v3, cross_curves=_to_40(v3.cross_curves)), c3),
                "IS2008-A2.3-area-b-a").assessed


# --------------------------------------------------------------------------- the views


OFF_CURVE = """
[downflooding]
displacement_t = [900.0, 1230.0]
angle_deg = [25.0, 20.0]

[limit_curve]
displacement_t = [900.0, 1230.0]
max_kg_m = [4.0, 4.0]
"""


@pytest.fixture
def off_curve_files(tmp_path):
    """Box 40 × 10 × 4 m, lightship 820 t at KG 3 m (T = 2 m), one empty tank, curves for 900–1230 t only."""
    text = box_profile_text(name="Box barge 40x10x4", length_m=40.0, breadth_m=10.0, depth_m=4.0,
                            drafts_m=[1.0, 1.5, 2.0, 2.5, 3.0], kn_drafts_m=[1.0, 2.0, 3.0], heel_step_deg=5.0,
                            lightship=(820.0, None, 3.0), tanks=(BoxTank("T1", (1.0, 3.0), (-1.0, 1.0), (0.0, 1.0)),),
                            extra=OFF_CURVE)
    prof = tmp_path / "box.toml"
    prof.write_text(text, encoding="utf-8")
    cond = tmp_path / "empty.condition.toml"
    cond.write_text('format = "deckload-condition-1"\n\n[condition]\nname = "Empty"\nwater_density_t_m3 = 1.025\n',
                    encoding="utf-8")
    return prof, cond


def test_calc_text_and_json_show_what_the_missing_curves_leave_open(off_curve_files, capsys):
    prof, cond = off_curve_files
    assert main(["calc", str(prof), str(cond)]) == 0
    out = capsys.readouterr().out
    flat = " ".join(out.split())
    assert "θf unknown: off its curve" in flat
    assert "A 2.2 general criteria [IS2008-A2.2]: met where assessable" in out
    row = next(x for x in out.splitlines() if "Area under GZ, 0° to 40° or θf" in x)
    assert row.strip().startswith("[not assessable]")
    assert "- limiting KG/GM curve from the vessel profile: displacement 820.0 t is outside the limiting curve, " \
           "900–1230 t" in flat
    assert "Met where assessable, 2 criteria not assessable" in flat and "Met: " not in flat
    assert main(["calc", str(prof), str(cond), "--json"]) == 0
    doc = json.loads(capsys.readouterr().out)
    rows = {c["id"]: c for c in doc["criteria"]}
    assert rows["IS2008-A2.2.1-area-0-40"]["assessed"] is False and rows["IS2008-A2.2.1-area-0-40"]["value"] is None
    assert {"item": "limiting KG/GM curve from the vessel profile",
            "reason": "displacement 820.0 t is outside the limiting curve, 900–1230 t", "applies": True} in doc["not_assessed"]
    assert doc["verdict"].startswith("Met where assessable")
    assert [a["pass"] for a in doc["assessed"] if a["id"] == "IS2008-A2.2"] == [False]
    # The areas that stop at θf have no value either: the stored ones are the areas with no openings.
    assert doc["area_0_40_mrad"] is None and doc["area_30_40_mrad"] is None
    assert doc["downflooding_angle_deg"] is None and doc["area_0_30_mrad"] > 0.0


def test_booklet_areas_to_flooding_have_no_deckload_value_while_theta_f_is_unknown():
    """The booklet's area 0–40° (or θf) is worked to θf; with θf unknown deckload's area with no
    openings (here 2·(1 − cos40°) = 0.4679 m·rad, GM 2 m) would agree or disagree by chance, so the
    row has no deckload value and says why; area 0–30° does not depend on θf and is compared."""
    r = evaluate(vessel(downflooding=OFF), Condition())
    rows = {x.key: x for x in compare(r, {"area_0_40_mrad": area(2.0, 0, 40), "area_30_40_mrad": 0.2,
                                              "area_0_30_mrad": area(2.0, 0, 30), "downflooding_angle_deg": 35.0},
                                           breadth_m=20.0)}
    for key in ("area_0_40_mrad", "area_30_40_mrad", "downflooding_angle_deg"):
        assert rows[key].deckload is None and not rows[key].passed
        assert rows[key].note.startswith("θf unknown")
    assert rows["area_0_30_mrad"].passed and rows["area_0_30_mrad"].deckload == pytest.approx(area(2.0, 0, 30), abs=TOL)


def test_report_words_theta_f_as_the_cautions_do():
    """The report's θf line: the angle, "unknown: off its curve", or "not given: taken as none" (the
    caution's own words)."""
    v = vessel()
    for vv, words in ((v, "Downflooding θf not given: taken as none"),
                      (dataclasses.replace(v, downflooding=OFF), "Downflooding θf unknown: off its curve")):
        text = " ".join(render_report_text(evaluate(vv, Condition()), vv, Condition()).split())
        assert words in text


async def test_the_screen_says_theta_f_is_unknown_and_the_criteria_open(tmp_path):
    """The barge at T = 2 m, KG 3 m with its side's windage, off its downflooding curve (as in
    test_unknown_flood_leaves_the_weather_criterion_open_or_failed): the afloat panel says θf is
    unknown, the criteria panel shows the areas and b ≥ a as n/a and no set as met, the whole
    verdict (key v) carries the sentence and the reason, and the wind plot (key b) says why it has none."""
    from deckload.ui.dialogs import TextScreen
    from deckload.ui.launch import create_app
    from deckload.ui.widgets import LinePanel

    v, c = barge_at(2.0, 3.0)
    v = dataclasses.replace(barge_windage(v), downflooding=OFF)
    app = create_app(v, c, work_dir=None, log_dir=None)
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        afloat = app.screen.query_one("#afloat", LinePanel).plain()
        assert re.search(r"θf\s+unknown", afloat)
        crit = app.screen.query_one("#criteria", LinePanel).plain()
        assert crit.splitlines()[0].startswith(" Criteria met where assessable")
        for name in ("Area 0–40°", "Area 30–40°", "Wind b ≥ a"):
            row = next(x for x in crit.splitlines() if x.startswith(" " + name))
            assert "n/a" in row and " ok" not in row
        await pilot.press("v")
        await pilot.pause()
        assert isinstance(app.screen, TextScreen)
        text = " ".join(app.screen.query_one("Static").render().plain.split())
        assert " ".join(app.session.result.verdict_text().split()) in text
        assert "needs θf, which is unknown (displacement 820.0 t is outside the downflooding-angle curve, " \
               "5000–6000 t): not assessable" in text
        await pilot.press("escape")
        await pilot.press("b")
        await pilot.pause()
        wind = " ".join(app.screen.query_one("#gz", LinePanel).plain().split())
        assert "No plot: the angles that bound areas a and b are not all known." in wind
        assert "n/a Weather: area b against area a: θ2 = min(θf, 50°, θc) needs θf" in wind
