"""The result as a reader receives it: the JSON record of ``deckload calc --json`` and the verdict sentence.

``Result.to_json_dict`` is what ``calc --json`` prints and what other programs read: its key
names are the interface, documented in README.md ("``deckload calc --json``").  A renamed key is
a value the reader silently no longer finds.  ``Result.verdict_text`` is the one sentence every
summary (screen, report, log, calc) prints: it must say which sets were assessed, whether they
are met, and what was not assessed.

The Result here is built by hand with a distinct value in every field (a display fixture, not a
computation), so that every key can be checked against the value it must carry.  The expected
record is written out literally; its key names come from README.md's ``calc --json`` section
and, where the README says "…" (keys it does not list one by one), from the field names in
deckload/core/result.py, which the README says the record follows (units in the names).
"""

from __future__ import annotations

import dataclasses
import json
import math

from deckload.core.result import (
    AssessedSet,
    CriterionResult,
    ItemResult,
    NotAssessed,
    Result,
    TankResult,
    Warning,
)
from deckload.logbook.records import summarise
from deckload.report import verdict_format as vf

SET_A22 = AssessedSet("IS2008-A2.2", "IS Code 2008 Part A 2.2 general criteria", True)
SET_EXTRA = AssessedSet("profile-extra", "criteria written in the profile", False)

MET = CriterionResult(
    "IS2008-A2.2.3-gm0", "Initial metacentric height GM0", 0.42, 0.15, "m", ">=", True,
    "IS Code 2008 Part A 2.2.4", note="", set_id="IS2008-A2.2")
FAILED = CriterionResult(
    "profile-max-heel", "Static heel at most", 12.5, 10.0, "deg", "<=", False,
    "profile [[extra_criteria]]", note="flag-State letter 7", set_id="profile-extra")
OPEN = CriterionResult(
    "IS2008-A2.2.2-gz-30", "GZ at 30° or more", float("nan"), 0.20, "m", ">=", False,
    "IS Code 2008 Part A 2.2.2", note="the KN tables end at 25°, before the angle this criterion needs",
    set_id="IS2008-A2.2", assessed=False)

TANK = TankResult(
    id="FO1P", name="Fuel oil 1 port", kind="fuel_oil", fill_pct=61.5, volume_m3=24.6, mass_t=22.14,
    density_t_m3=0.9, sounding_m=1.85, lcg_m=31.2, vcg_m=1.1, tcg_m=-2.4, fsi_m4=14.0, fsm_tm=12.6,
    fs_rule="actual level", state="slack", worst_band_pct=(40.0, 70.0), capacity_m3=40.0)
ITEM = ItemResult(group="deck", id="D3", name="Pipe bundle", mass_t=18.5, lcg_m=44.0, vcg_m=7.25, tcg_m=1.5)
NOT_COMPUTED = (
    NotAssessed("damage stability", "not computed by deckload"),
    NotAssessed("icing allowance", "not computed by deckload"),
    NotAssessed("IS Code 2008 Part A 2.3 weather criterion", "the profile has no windage data", applies=True),
)


def _result(criteria, sets=(SET_A22, SET_EXTRA), not_assessed=NOT_COMPUTED) -> Result:
    return Result(
        vessel_name="Invented Tern", condition_name="Departure, deck cargo", water_density_t_m3=1.02,
        displacement_t=2150.0, lightship_t=1180.0, deadweight_t=970.0, lcg_m=35.5, kg_m=4.9, tcg_m=0.03,
        fsm_total_tm=86.0, fsc_m=0.04, kg_fluid_m=4.94,
        draft_at_lcf_m=3.61, lcb_m=35.7, lcf_m=34.2, km_m=5.8, tpc_t_cm=6.4, mctc_tm_cm=28.1,
        gm_solid_m=0.9, gm_fluid_m=0.86, trim_m=0.35, draft_aft_m=3.78, draft_fwd_m=3.43,
        draft_mean_m=3.605, list_deg=0.6,
        gz_heel_deg=(0.0, 10.0, 20.0), gz_m=(-0.009, 0.14, 0.31), gz_port_m=(0.009, 0.15, 0.32),
        criteria_side="starboard", gz_correction="transfer", fs_rule="is2008",
        max_gz_m=0.61, max_gz_angle_deg=38.0, vanishing_angle_deg=71.0, downflooding_angle_deg=52.0,
        area_0_30_mrad=0.082, area_0_40_mrad=0.131, area_30_40_mrad=0.049,
        criteria=tuple(criteria), tanks=(TANK,), items=(ITEM,),
        warnings=(Warning("slack-worst-band", "FO1P is slack inside its worst band (40–70 %)"),),
        criteria_sets=tuple(sets), not_assessed=tuple(not_assessed), weather=None,
        deck_edge_angle_deg=14.2, freeboard_m=0.94, load_line_margin_m=0.12, gz_end_deg=80.0,
        load_line_mark="summer", load_line_mark_draft_m=3.70, load_line_allowed_draft_m=3.725,
    )


def test_json_record_carries_every_documented_key_with_its_value():
    """Every key of the record, with the value it must carry (README.md, ``calc --json``).

    A criterion that could not be assessed has no measured value and no margin: both are
    null, never the NaN that stands in the object (``json.dumps(allow_nan=False)``, as ``calc``
    prints, would refuse it).  The margin of an assessed criterion is value − limit for
    "at least" and limit − value for "at most" (0.42 − 0.15 = 0.27; 10.0 − 12.5 = −2.5)."""
    r = _result((MET, FAILED, OPEN))
    doc = r.to_json_dict()
    expected = {
        "vessel": "Invented Tern", "condition": "Departure, deck cargo", "water_density_t_m3": 1.02,
        "displacement_t": 2150.0, "lightship_t": 1180.0, "deadweight_t": 970.0, "lcg_m": 35.5,
        "kg_m": 4.9, "tcg_m": 0.03, "fsm_total_tm": 86.0, "fsc_m": 0.04, "kg_fluid_m": 4.94,
        "km_m": 5.8, "gm_solid_m": 0.9, "gm_fluid_m": 0.86, "lcb_m": 35.7, "lcf_m": 34.2,
        "tpc_t_cm": 6.4, "mctc_tm_cm": 28.1, "draft_at_lcf_m": 3.61, "draft_aft_m": 3.78,
        "draft_fwd_m": 3.43, "draft_mean_m": 3.605, "trim_m": 0.35, "list_deg": 0.6,
        "gz_correction": "transfer", "fs_rule": "is2008", "criteria_side": "starboard",
        "max_gz_m": 0.61, "max_gz_angle_deg": 38.0, "vanishing_angle_deg": 71.0,
        "downflooding_angle_deg": 52.0, "area_0_30_mrad": 0.082, "area_0_40_mrad": 0.131,
        "area_30_40_mrad": 0.049,
        "gz": [{"heel_deg": 0.0, "gz_m": -0.009}, {"heel_deg": 10.0, "gz_m": 0.14}, {"heel_deg": 20.0, "gz_m": 0.31}],
        "gz_port": [{"heel_deg": 0.0, "gz_m": 0.009}, {"heel_deg": 10.0, "gz_m": 0.15},
                    {"heel_deg": 20.0, "gz_m": 0.32}],
        "criteria": [
            {"id": "IS2008-A2.2.3-gm0", "description": "Initial metacentric height GM0", "value": 0.42,
             "limit": 0.15, "unit": "m", "comparison": ">=", "margin": 0.42 - 0.15, "pass": True,
             "assessed": True, "set": "IS2008-A2.2", "source": "IS Code 2008 Part A 2.2.4", "note": ""},
            {"id": "profile-max-heel", "description": "Static heel at most", "value": 12.5, "limit": 10.0,
             "unit": "deg", "comparison": "<=", "margin": 10.0 - 12.5, "pass": False, "assessed": True,
             "set": "profile-extra", "source": "profile [[extra_criteria]]", "note": "flag-State letter 7"},
            {"id": "IS2008-A2.2.2-gz-30", "description": "GZ at 30° or more", "value": None, "limit": 0.20,
             "unit": "m", "comparison": ">=", "margin": None, "pass": False, "assessed": False,
             "set": "IS2008-A2.2", "source": "IS Code 2008 Part A 2.2.2",
             "note": "the KN tables end at 25°, before the angle this criterion needs"},
        ],
        "tanks": [{"id": "FO1P", "name": "Fuel oil 1 port", "kind": "fuel_oil", "fill_pct": 61.5,
                   "volume_m3": 24.6, "mass_t": 22.14, "density_t_m3": 0.9, "sounding_m": 1.85,
                   "fsm_tm": 12.6, "fs_rule": "actual level", "state": "slack"}],
        "items": [{"group": "deck", "id": "D3", "name": "Pipe bundle", "mass_t": 18.5, "lcg_m": 44.0,
                   "vcg_m": 7.25, "tcg_m": 1.5}],
        "warnings": ["FO1P is slack inside its worst band (40–70 %)"],
        "assessed": [{"id": "IS2008-A2.2", "title": "IS Code 2008 Part A 2.2 general criteria", "pass": True},
                     {"id": "profile-extra", "title": "criteria written in the profile", "pass": False}],
        "not_assessed": [{"item": "damage stability", "reason": "not computed by deckload", "applies": False},
                         {"item": "icing allowance", "reason": "not computed by deckload", "applies": False},
                         {"item": "IS Code 2008 Part A 2.3 weather criterion",
                          "reason": "the profile has no windage data", "applies": True}],
        "verdict": (
            "NOT MET (1 failed) — assessed: IS Code 2008 Part A 2.2 general criteria, criteria written in the "
            "profile. Not assessed: damage stability, icing allowance (not computed by deckload); IS Code 2008 "
            "Part A 2.3 weather criterion (the profile has no windage data)."),
        "weather": None, "deck_edge_angle_deg": 14.2, "freeboard_m": 0.94, "load_line_margin_m": 0.12,
        "load_line_mark": "summer", "load_line_mark_draft_m": 3.70, "load_line_allowed_draft_m": 3.725,
        "gz_end_deg": 80.0,
    }
    assert sorted(doc) == sorted(expected)  # no key renamed, missing or added
    for key in expected:
        assert doc[key] == expected[key], key
    # prints as strict JSON although the unassessed criterion holds NaN
    assert math.isnan(OPEN.value)
    assert json.loads(json.dumps(doc, allow_nan=False))["criteria"][2]["value"] is None


def test_verdict_only_unassessable_criteria_is_not_a_plain_met():
    """No criterion failed, one could not be assessed: the sentence must not read "Met:"
    (an officer reading "Met" would take the unassessed criterion as met)."""
    text = _result((MET, OPEN)).verdict_text()
    assert text == (
        "Met where assessable, 1 criterion not assessable, 1 set of criteria not assessed — assessed: "
        "IS Code 2008 Part A 2.2 general criteria, "
        "criteria written in the profile. Not assessed: damage stability, icing allowance (not computed by "
        "deckload); IS Code 2008 Part A 2.3 weather criterion (the profile has no windage data).")


def test_verdict_every_criterion_met_names_the_sets():
    text = _result((MET,), sets=(SET_A22,), not_assessed=NOT_COMPUTED[:1]).verdict_text()
    assert text == ("Met: IS Code 2008 Part A 2.2 general criteria. "
                    "Not assessed: damage stability (not computed by deckload).")


def test_verdict_without_any_criteria_set_says_so():
    """With no set assessed the sentence names none, in words, rather than an empty list."""
    text = _result((), sets=(), not_assessed=()).verdict_text()
    assert text == "Met: no criteria set."
    text = _result((OPEN,), sets=(), not_assessed=()).verdict_text()
    assert text == "Met where assessable, 1 criterion not assessable — assessed: no criteria set."


def test_verdict_counts_several_unassessable_criteria_in_the_plural():
    """Two criteria that could not be assessed: "2 criteria not assessable" (the singular is for one
    only, as in the test above)."""
    other = dataclasses.replace(OPEN, id=OPEN.id + "-b")
    text = _result((MET, OPEN, other), sets=(), not_assessed=()).verdict_text()
    assert text == "Met where assessable, 2 criteria not assessable — assessed: no criteria set."


def test_verdict_with_a_set_that_applies_left_out_is_not_a_plain_met():
    """Every criterion assessed and met, but the weather criterion (A 2.3, which applies to her) had no
    data: not "Met:", the word is "met where assessable", and all_criteria_pass is False; a set of
    scope deckload never computes (damage stability) does not change the word."""
    r = _result((MET,), sets=(SET_A22,))
    assert r.verdict_text().startswith("Met where assessable, 1 set of criteria not assessed — assessed: "
                                       "IS Code 2008 Part A 2.2 general criteria. Not assessed:")
    assert not r.all_criteria_pass and vf.verdict_word(r) == "met where assessable"
    scope_only = _result((MET,), sets=(SET_A22,), not_assessed=NOT_COMPUTED[:2])
    assert scope_only.verdict_text().startswith("Met: IS Code 2008 Part A 2.2 general criteria.")
    assert scope_only.all_criteria_pass and vf.verdict_word(scope_only) == "met"
    two = _result((MET,), sets=(SET_A22,), not_assessed=(*NOT_COMPUTED, dataclasses.replace(NOT_COMPUTED[2], item="x")))
    assert two.verdict_text().startswith("Met where assessable, 2 sets of criteria not assessed")


def test_a_log_summary_with_a_set_left_out_reads_met_where_assessable():
    """The stored summary's word (log table, log show): a not-assessed item that applies makes it
    'met where assessable'; entries written before 'applies' was stored read as they did."""
    r = _result((MET,), sets=(SET_A22,))
    summary = summarise(r)
    assert summary["criteria_pass"] is False
    assert vf.stored_word(summary) == "met where assessable" and vf.stored_short(summary) == "met, n/a A2.2"
    old = {**summary, "criteria_pass": True,
           "not_assessed": [{"item": n.item, "reason": n.reason} for n in r.not_assessed]}
    assert vf.stored_word(old) == "met"
