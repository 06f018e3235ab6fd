"""The draft survey (deckload.core.draft_marks.condition_from_readings) where the marks are not where the
other tests put them, and the refusals when her draft falls off the hydrostatic table.

Vessel, posed table and plane readings are those of tests/test_draft_marks_corrections.py (the barge of
checks.md §1 with a table linear in draft: Δ = 410·T t, LCF = 20 + 2·(T − 2) m, rows T = 0.5 … 3.5 m;
keel 0.015 m).  A reading is the draft of the plane at the mark plus the keel, ± y·tanφ for the list.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.draft_marks import DraftMarksError, MarkReadings, condition_from_readings
from deckload.core.model import DraftMark, DraftMarks, frozen_array
from deckload.core.tables import OutOfRangeError
from test_draft_marks_corrections import KEEL, L, vessel
from vessel_factories import RHO_SW


def plane(marks: DraftMarks, t_mid_m: float, trim_m: float, list_deg: float = 0.0) -> MarkReadings:
    """Readings of a plane waterline: draft ``t_mid_m`` at x = L/2, ``trim_m`` by the stern, listed
    ``list_deg`` (positive to starboard: the starboard mark reads deeper by y·tanφ)."""
    tan_l = math.tan(math.radians(list_deg))

    def at(m: DraftMark, side: float) -> float:
        return t_mid_m + trim_m / L * (L / 2 - m.x_m) + side * m.y_m * tan_l + KEEL

    return MarkReadings(at(marks.aft, -1), at(marks.aft, 1), at(marks.midships, -1), at(marks.midships, 1),
                        at(marks.forward, -1), at(marks.forward, 1))


def with_marks(marks: DraftMarks):
    return dataclasses.replace(vessel(), draft_marks=marks)


def test_midships_marks_off_midships_are_carried_to_midships():
    """Step 2 (module docstring): the midships draft is the reading carried along the trim line from
    the mark to L/2: T_mid = T_m + (dT/dx)·(L/2 − x_m).  Marks at x = 22 m on a plane 2.2 m at L/2,
    1 m by the stern (dT/dx = −1/40): the mark reads 2.2 − 2/40 = 2.15 m, carried back to 2.2 m, so the
    deflection (T_AP + T_FP)/2 − T_mid is 0 and the quarter-mean is 2.2 m.  Carried the wrong way it
    would read 2.10 m, a 0.1 m 'hog' that moves Δ by 410·6·0.1/8 ≈ 31 t."""
    marks = DraftMarks(DraftMark(2.0, 5.0), DraftMark(22.0, 5.0), DraftMark(39.0, 5.0))
    o = condition_from_readings(with_marks(marks), plane(marks, 2.2, 1.0), RHO_SW)
    assert o.draft_mid_m == pytest.approx(2.2, abs=1e-9)
    assert o.deflection_m == pytest.approx(0.0, abs=1e-9)
    assert o.quarter_mean_m == pytest.approx(2.2, abs=1e-9)


def test_marks_on_the_centreline_give_no_list_even_when_the_two_readings_differ():
    """Stem and stern marks are cut on the centreline (y = 0, common practice): the port and starboard
    readings are of the same point, and any difference is a reading error, not a list, which would be
    atan((S − P)/(2·0)) = 90°.  deckload takes the list there as 0 and the centreline draft as the mean
    of the two.  Readings 1 cm apart at every pair (P − 0.005, S + 0.005 about the plane of 2.2 m, 1 m
    by the stern) give lists of 0° and the plane's drafts."""
    marks = DraftMarks(DraftMark(2.0, 0.0), DraftMark(20.0, 0.0), DraftMark(39.0, 0.0))
    r = plane(marks, 2.2, 1.0)
    r = MarkReadings(r.aft_port_m - 0.005, r.aft_stbd_m + 0.005, r.mid_port_m - 0.005, r.mid_stbd_m + 0.005,
                     r.fwd_port_m - 0.005, r.fwd_stbd_m + 0.005)
    o = condition_from_readings(with_marks(marks), r, RHO_SW)
    assert o.list_at_marks_deg == (0.0, 0.0, 0.0)
    assert o.list_deg == 0.0
    assert o.draft_mid_m == pytest.approx(2.2, abs=1e-9)
    assert o.trim_m == pytest.approx(1.0, abs=1e-9)


def test_marks_half_a_metre_off_the_centreline_still_give_the_list():
    """Step 1: the list at a pair is atan((S − P)/(2y)) for any y > 0: with marks at y = 0.5 m and the
    plane listed 1.5° to starboard, S − P = 2·0.5·tan1.5°, so every pair gives 1.5°."""
    marks = DraftMarks(DraftMark(2.0, 0.5), DraftMark(20.0, 0.5), DraftMark(39.0, 0.5))
    o = condition_from_readings(with_marks(marks), plane(marks, 2.2, 1.0, list_deg=1.5), RHO_SW)
    for lst in o.list_at_marks_deg:
        assert lst == pytest.approx(1.5, abs=1e-9)
    assert o.list_deg == pytest.approx(1.5, abs=1e-9)


def test_a_quarter_mean_draft_below_the_table_is_refused_by_name():
    """Every reading 0.3 m above the keel, on an even keel: the quarter-mean draft is 0.3 m, below the
    table's first row (0.5 m).  deckload does not extrapolate (tables.py); the refusal names the
    quantity, the value, the table's range and the unit."""
    r = MarkReadings(*([0.3 + KEEL] * 6))
    with pytest.raises(OutOfRangeError) as e:
        condition_from_readings(vessel(), r, RHO_SW)
    assert str(e.value) == ("quarter-mean draft (hydrostatic table) 0.3 m is outside the table range 0.5–3.5 m; "
                            "deckload does not extrapolate")


def test_a_draft_at_the_lcf_below_the_table_is_refused_by_name():
    """Quarter-mean inside the table but the draft at the LCF outside it.  Plane 0.55 m at L/2, trimmed
    1.0 m by the head (trim −1.0 m): quarter-mean 0.55 m, LCF there 20 + 2·(0.55 − 2) = 17.1 m, and the
    first step of the fixed point (module docstring, step 4) gives the draft at the LCF
    0.55 + (−1.0)·(20 − 17.1)/40 = 0.4775 m, below the first row: refused under that name.  (The aft
    marks read 0.55 − 1.0·18/40 + 0.015 = 0.115 m, above the keel, and the AP 0.05 m is afloat, so
    nothing is refused first; at 1.2 m by the head the AP would be out of the water, refused as such.)"""
    marks = vessel().draft_marks
    r = plane(marks, 0.55, -1.0)
    assert min(r.as_tuple()) >= KEEL
    with pytest.raises(OutOfRangeError) as e:
        condition_from_readings(vessel(), r, RHO_SW)
    assert 0.55 - 1.0 * (20 - 17.1) / 40 == pytest.approx(0.4775, abs=1e-12)
    assert str(e.value) == ("draft at the LCF (hydrostatic table) 0.4775 m is outside the table range 0.5–3.5 m; "
                            "deckload does not extrapolate")


def kinked_mctc_vessel():
    """The posed table with MCTC 40 t·m/cm up to T = 1.5 m and rising 20 t·m/cm per m above (rows at
    0.5 m, so the program's linear interpolation is exact on each piece): the central difference of
    Nemoto's correction then depends on how far either side of the draft at the LCF it is taken."""
    v = vessel()
    t = np.asarray(v.hydrostatics.draft_m)
    mctc = np.where(t <= 1.5, 40.0, 40.0 + 20.0 * (t - 1.5))
    return dataclasses.replace(v, hydrostatics=dataclasses.replace(v.hydrostatics, mctc_tm_cm=frozen_array(mctc)))


def u_of(mean_m: float, trim_m: float) -> float:
    """Step 4 solved for the posed LCF(T) = 20 + 2·(T − 2): u = (T + 4t/L)/(1 + 2t/L)
    (tests/test_draft_marks_corrections.py)."""
    return (mean_m + 4 * trim_m / L) / (1 + 2 * trim_m / L)


@pytest.mark.parametrize("mean_m, trim_m, stc_t", [
    # u = 2.3/1.05 = 2.1904762: MCTC(u ± 0.5) both on the rising piece, 20 t·m/cm per m:
    # 50·1²·20/40 = 25 t.
    (2.2, 1.0, 25.0),
    # u = 1.35/1.05 = 1.2857143: MCTC(u + 0.5) = 40 + 20·0.2857143 = 45.714286, MCTC(u − 0.5) = 40:
    # 5.714286 per m, 50·1²·5.714286/40 = 7.1428571 t.
    (1.25, 1.0, 50.0 * (20.0 * (u_of(1.25, 1.0) + 0.5 - 1.5)) / 1.0 / L),
])
def test_second_trim_correction_takes_mctc_half_a_metre_either_side(mean_m, trim_m, stc_t):
    """Nemoto's second trim correction (module docstring): 50·t²·(MCTC(u + ½) − MCTC(u − ½))/LBP, with
    MCTC read half a metre either side of the draft at the LCF u.  On the kinked table the difference
    quotient changes if the step is not ½ m (1.31 m either side, as far as the table goes, would give
    50·(80 − 40)/2.619/40 = 19.1 t instead of 25 t)."""
    marks = vessel().draft_marks
    o = condition_from_readings(kinked_mctc_vessel(), plane(marks, mean_m, trim_m), RHO_SW)
    u = u_of(mean_m, trim_m)
    assert o.draft_at_lcf_m == pytest.approx(u, abs=1e-8)
    assert o.second_trim_correction_t == pytest.approx(stc_t, abs=1e-6)
    assert o.table_displacement_t == pytest.approx(410.0 * u + stc_t, abs=1e-6)


def test_second_trim_correction_near_the_shallow_end_of_the_table():
    """Mean draft 0.8 m, trim 0.4 m by the stern: u = (0.8 + 0.04)/1.02 = 0.8235294 m, only 0.3235294 m
    above the table's first row (0.5 m), so MCTC is read that far either side, [0.5, 1.1470588] m, both
    on the flat piece: the correction is 0 and Δ_table = 410·u.  Half a metre below u lies off the
    table (which deckload would refuse: it does not extrapolate)."""
    marks = vessel().draft_marks
    o = condition_from_readings(kinked_mctc_vessel(), plane(marks, 0.8, 0.4), RHO_SW)
    u = u_of(0.8, 0.4)
    assert u == pytest.approx(0.8235294, abs=1e-7)
    assert o.second_trim_correction_t == 0.0
    assert o.table_displacement_t == pytest.approx(410.0 * u, abs=1e-6)


def test_at_the_last_row_of_the_table_there_is_no_second_trim_correction():
    """Even keel at 3.5 m, the table's last row: no MCTC can be read beyond it, and with no trim
    Nemoto's 50·t²·ΔMCTC/LBP is 0 anyway; Δ = 410·3.5 = 1435 t, and the LCB the table gives (20 m)."""
    r = MarkReadings(*([3.5 + KEEL] * 6))
    o = condition_from_readings(vessel(), r, RHO_SW)
    assert o.second_trim_correction_t == 0.0
    assert o.displacement_t == pytest.approx(1435.0, abs=1e-6)
    assert o.lcb_m == pytest.approx(20.0, abs=1e-12)


def test_a_profile_without_draft_marks_is_told_what_is_missing():
    """deckload's own refusal: the survey needs the marks' positions."""
    with pytest.raises(DraftMarksError) as e:
        condition_from_readings(dataclasses.replace(vessel(), draft_marks=None), plane(vessel().draft_marks, 2.2, 1.0),
                                RHO_SW)
    assert str(e.value) == "the vessel profile has no [draft_marks]: their positions are needed"


# ------------------------------------------------------------------ twist and a list past the deck edge


def listed_by_pair(marks: DraftMarks, t_mid_m: float, trim_m: float, lists_deg: tuple[float, float, float]):
    """:func:`plane`'s readings with each pair (aft, midships, forward) listed on its own: a twisted
    waterline no rigid hull floats at, as misread marks give it."""
    r = [plane(marks, t_mid_m, trim_m, lst) for lst in lists_deg]
    return MarkReadings(r[0].aft_port_m, r[0].aft_stbd_m, r[1].mid_port_m, r[1].mid_stbd_m,
                        r[2].fwd_port_m, r[2].fwd_stbd_m)


def test_a_twist_between_the_pairs_is_refused_as_a_misread_mark():
    """Before: aft listed +10°, forward −10° (midships upright) was taken as upright, 'List 0.00', and
    worked into a displacement with no word.  The bound (draft_marks.twist_bound, derived there):
    |tan φa − tan φb| ≤ (LBP/100)·(1/ya + 1/yb); marks at y = 5 m on the 40 m barge give 0.4·0.4 = 0.16,
    and tan 10° + tan 10° = 0.353 is beyond it."""
    from deckload.core.draft_marks import twist_bound

    marks = DraftMarks(DraftMark(2.0, 5.0), DraftMark(20.0, 5.0), DraftMark(39.0, 5.0))
    assert twist_bound(L, 5.0, 5.0) == pytest.approx(0.01 * L * (1 / 5.0 + 1 / 5.0))
    with pytest.raises(DraftMarksError, match=r"list of \+10\.00° at the aft marks and -10\.00° at the forward"):
        condition_from_readings(with_marks(marks), listed_by_pair(marks, 2.2, 1.0, (10.0, 0.0, -10.0)), RHO_SW)
    # A misread midships pair is caught as well (it is the list that is printed).
    with pytest.raises(DraftMarksError, match="midships marks"):
        condition_from_readings(with_marks(marks), listed_by_pair(marks, 2.2, 1.0, (1.0, 12.0, 1.0)), RHO_SW)


@pytest.mark.parametrize("y_fwd_m", [5.0, 0.5])
def test_readings_within_the_draught_tolerance_are_never_taken_for_a_twist(y_fwd_m):
    """UR L5 (standards.md §5.3): 5 cm on a draught.  The four end marks each 5 cm off, in the senses
    that twist most (aft P −, S +; forward P +, S −), at a forward pair as narrow as 0.5 m: accepted."""
    marks = DraftMarks(DraftMark(2.0, 5.0), DraftMark(20.0, 5.0), DraftMark(39.0, y_fwd_m))
    r = plane(marks, 2.2, 1.0, 1.0)
    e = 0.05
    r = MarkReadings(r.aft_port_m - e, r.aft_stbd_m + e, r.mid_port_m, r.mid_stbd_m,
                     r.fwd_port_m + e, r.fwd_stbd_m - e)
    o = condition_from_readings(with_marks(marks), r, RHO_SW)
    assert o.list_deg == pytest.approx(1.0, abs=1e-9)


def test_a_list_beyond_the_deck_edge_angle_is_refused():
    """Before: a list past the deck-edge immersion angle was worked from the upright tables as any
    other.  With the profile's deck-edge table at 10° (a hull with sheer or a low deck at the side,
    where the table is below the wall-sided angle atan(1.8/5) = 19.8° at 2.2 m), a consistent 12°
    list at every pair is refused; 9° is worked."""
    from deckload.core.model import LimitCurve

    marks = DraftMarks(DraftMark(2.0, 5.0), DraftMark(20.0, 5.0), DraftMark(39.0, 5.0))
    edge = LimitCurve(frozen_array(np.array([100.0, 2000.0])), frozen_array(np.array([10.0, 10.0])), "deck_edge_deg")
    v = dataclasses.replace(with_marks(marks), deck_edge=edge)
    with pytest.raises(DraftMarksError, match=r"list of \+12\.00° .*beyond the deck-edge immersion angle of 10\.0°"):
        condition_from_readings(v, plane(marks, 2.2, 1.0, 12.0), RHO_SW)
    assert condition_from_readings(v, plane(marks, 2.2, 1.0, 9.0), RHO_SW).list_deg == pytest.approx(9.0)
