"""Drafts at the marks and the reverse (readings → displacement and LCG), deckload.core.draft_marks.

Analytic basis (derived).  A box L × B × D floating with the plane waterline
z = T + s·(L/2 − x) + y·tanφ in ship axes (trim slope s, list φ), which cuts neither
the bottom nor the deck, displaces exactly ρ·L·B·T: the volume under a plane over a
rectangle is the rectangle's area times the plane's height at the centroid.  A mark
at (x, ±y) reads that height plus the keel thickness.  The trim that LCG a metres
abaft the LCB gives a box is the root of a = s·GM_L + s³·L²/(24T) (derived in
tests/test_reference_trimmed_box.py).
"""

from __future__ import annotations

import dataclasses
import math

import pytest

from deckload.cli.main import main
from deckload.core.draft_marks import DraftMarksError, MarkReadings, condition_from_readings, marks_for
from deckload.core.model import Condition, DraftMark, DraftMarks
from deckload.core.stability import evaluate
from deckload.io.paths import DEMO_CONDITIONS, DEMO_PROFILE
from deckload.io.profiles import ProfileError, load_condition, parse_profile
from test_reference_trimmed_box import exact_trim_slope
from vessel_factories import BARGE_B, BARGE_L, RHO_SW, box_barge
from demo_vessels import demo_vessel

L, B = BARGE_L, BARGE_B
KEEL = 0.015
MARKS = DraftMarks(DraftMark(2.0, 5.0), DraftMark(20.0, 5.0), DraftMark(39.0, 5.0))


def _barge(draft_m: float = 2.0, lcg_m: float = L / 2, kg_m: float = 3.0):
    v = box_barge(lightship_t=RHO_SW * L * B * draft_m, lightship_kg_m=kg_m, lightship_lcg_m=lcg_m)
    return dataclasses.replace(v, draft_marks=MARKS,
                               particulars=dataclasses.replace(v.particulars, keel_thickness_m=KEEL))


def _plane_readings(draft_m: float, slope: float, list_deg: float) -> MarkReadings:
    tan_l = math.tan(math.radians(list_deg))

    def at(mark: DraftMark, side: float) -> float:
        return draft_m + slope * (L / 2 - mark.x_m) + side * mark.y_m * tan_l + KEEL

    return MarkReadings(at(MARKS.aft, -1), at(MARKS.aft, 1), at(MARKS.midships, -1), at(MARKS.midships, 1),
                        at(MARKS.forward, -1), at(MARKS.forward, 1))


@pytest.mark.parametrize("draft_m, slope, list_deg", [(2.0, 0.0, 0.0), (2.1, 0.03, 0.0), (1.8, -0.02, 3.0),
                                                      (2.6, 0.015, -5.0)])
def test_box_readings_give_the_exact_displacement(draft_m, slope, list_deg):
    """Readings from a plane waterline (module docstring) give Δ = ρLBT within 0.5 % (the issue's
    requirement; for a box the table method is exact, so 1e-6 here), the trim s·L, the list,
    drafts at the perpendiculars and no hog or sag."""
    v = _barge(draft_m)
    o = condition_from_readings(v, _plane_readings(draft_m, slope, list_deg), RHO_SW)
    assert o.displacement_t == pytest.approx(RHO_SW * L * B * draft_m, rel=1e-6)
    assert o.trim_m == pytest.approx(slope * L, abs=1e-9)
    assert o.draft_ap_m == pytest.approx(draft_m + slope * L / 2, abs=1e-9)
    assert o.draft_fp_m == pytest.approx(draft_m - slope * L / 2, abs=1e-9)
    assert o.deflection_m == pytest.approx(0.0, abs=1e-9)
    for lst in o.list_at_marks_deg:
        assert lst == pytest.approx(list_deg, abs=1e-9)
    assert o.second_trim_correction_t == pytest.approx(0.0, abs=1e-9)  # a box's MCTC column is constant


@pytest.mark.parametrize("offset_aft_m", [2.5, -1.6])
def test_box_readings_imply_the_lcg(offset_aft_m):
    """The exact trimmed waterline of a box whose G is a metres abaft the LCB, read at the marks,
    implies LCG = LCB − a within 2 % of a (the MCT tolerance of UR L5, standards.md §5.3, since
    the LCG is found through MCT) when the actual KG is given."""
    kg = 3.0
    s = exact_trim_slope(2.0, kg, offset_aft_m)
    v = _barge(2.0, L / 2 - offset_aft_m, kg)
    o = condition_from_readings(v, _plane_readings(2.0, s, 0.0), RHO_SW, kg_fluid_m=kg)
    assert o.mctc_basis == "GML"
    assert o.lcg_m == pytest.approx(L / 2 - offset_aft_m, abs=0.02 * abs(offset_aft_m))


@pytest.mark.parametrize("key", sorted(DEMO_CONDITIONS))
def test_demo_readings_round_trip_within_half_a_percent(key):
    """Demo vessel: the marks the engine computes, read back, give the computed displacement within
    0.5 % (issue 10's requirement; the second trim correction, which the forward computation
    does not make, is the difference) and the LCG within 1 cm."""
    v = demo_vessel()
    c = load_condition(DEMO_CONDITIONS[key], v)
    r = evaluate(v, c)
    cm = marks_for(v, r.draft_at_lcf_m, r.lcf_m, r.trim_m, r.list_deg)
    o = condition_from_readings(v, cm.readings, c.water_density_t_m3, r.kg_fluid_m)
    assert o.displacement_t == pytest.approx(r.displacement_t, rel=0.005)
    assert o.lcg_m == pytest.approx(r.lcg_m, abs=0.01)
    assert o.trim_m == pytest.approx(r.trim_m, abs=1e-9)
    assert o.list_deg == pytest.approx(r.list_deg, abs=1e-9)


def test_marks_read_the_list_and_the_keel():
    """A list φ to starboard: the starboard mark reads y·tanφ deeper, the port y·tanφ shallower, than
    the centreline draft plus keel; the mean of the pair is the centreline (module docstring)."""
    v = _barge(2.0)
    cm = marks_for(v, 2.0, L / 2, 0.0, 4.0)
    d = 5.0 * math.tan(math.radians(4.0))
    assert cm.readings.mid_stbd_m == pytest.approx(2.0 + KEEL + d, abs=1e-12)
    assert cm.readings.mid_port_m == pytest.approx(2.0 + KEEL - d, abs=1e-12)
    assert cm.extreme_aft_m == pytest.approx(2.0 + KEEL, abs=1e-12)
    # square-bilge bound: the bilge corner of a box at (B/2, −keel) is that deep below the water
    phi = math.radians(4.0)
    assert cm.deepest_m == pytest.approx((2.0 + KEEL) * math.cos(phi) + B / 2 * math.sin(phi), abs=1e-12)


def test_impossible_readings_and_missing_marks_are_refused():
    v = _barge(2.0)
    good = _plane_readings(2.0, 0.0, 0.0)
    with pytest.raises(DraftMarksError, match="forward starboard reading"):
        condition_from_readings(v, dataclasses.replace(good, fwd_stbd_m=9.0), RHO_SW)
    with pytest.raises(DraftMarksError, match="aft port reading nan"):
        condition_from_readings(v, dataclasses.replace(good, aft_port_m=float("nan")), RHO_SW)
    with pytest.raises(DraftMarksError, match="no \\[draft_marks\\]"):
        marks_for(dataclasses.replace(v, draft_marks=None), 2.0, L / 2, 0.0, 0.0)


def test_profile_draft_marks_are_validated():
    text = DEMO_PROFILE.read_text(encoding="utf-8")
    v = parse_profile(text, str(DEMO_PROFILE))
    assert v.draft_marks.forward.x_m == 36.0 and v.particulars.keel_thickness_m == 0.012
    swapped = text.replace("[draft_marks.forward]\nx_m = 36.0", "[draft_marks.forward]\nx_m = 10.0")
    with pytest.raises(ProfileError, match="draft_marks.midships"):
        parse_profile(swapped, str(DEMO_PROFILE))
    wide = text.replace("[draft_marks.midships]\nx_m = 19.0\ny_m = 5.0", "[draft_marks.midships]\nx_m = 19.0\ny_m = 6.0")
    with pytest.raises(ProfileError, match=r"draft_marks\.midships\.y_m = 6\.0.*between"):
        parse_profile(wide, str(DEMO_PROFILE))
    far = text.replace("[draft_marks.forward]\nx_m = 36.0", "[draft_marks.forward]\nx_m = 50.0")
    with pytest.raises(ProfileError, match=r"draft_marks\.forward\.x_m = 50\.0.*within 20 % of LBP"):
        parse_profile(far, str(DEMO_PROFILE))


def test_marks_command(capsys):
    assert main(["marks", "demo", "departure"]) == 0
    out = capsys.readouterr().out
    assert "Draft marks" in out and "never replaces" in out
    assert main(["marks", "demo", "departure", "--aft", "3.02", "3.00", "--mid", "2.86", "2.84",
                 "--fwd", "2.70", "2.69"]) == 0
    out = capsys.readouterr().out
    assert "Displacement (t)" in out and "observed" in out and "difference" in out
    assert main(["marks", "demo", "departure", "--aft", "3.02", "3.00"]) == 2
    assert "all six readings" in capsys.readouterr().err
    assert main(["marks", "demo", "departure", "--aft", "3.02", "3.00", "--mid", "9", "2.84",
                 "--fwd", "2.70", "2.69"]) == 1
    assert "midships port reading 9.0 m" in capsys.readouterr().err
