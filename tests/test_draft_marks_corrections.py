"""The corrections of the draft survey (deckload.core.draft_marks) where the hydrostatic table is not a
box's: the LCF that moves with draft (the fixed point of step 4), Nemoto's second trim correction,
the quarter-mean with hog or sag and its notes, the LCG from the tabulated MCTC, the refusals worded,
and the marks a trimmed, listed condition reads.

Sources: the module docstring of draft_marks.py (draft-survey practice, the UN/ECE draught-survey code
of 1992 — from memory there — and standards.md §6.3 for drafts about the LCF); the worked numbers are
derived below for a table posed for these tests (not a real ship's), chosen linear in draft so that
the program's linear interpolation between its rows is exact:

    Δ(T) = 410·T t  (ρ·L·B = 1.025·40·10, the barge of checks.md §1),
    LCF(T) = 20 + 2·(T − 2) m,  MCTC(T) = 40 + 10·(T − 2) t·m/cm,  LCB = 20 m, KMt 5 m, TPC 4.1 t/cm,
    rows at T = 0.5, 1.0, …, 3.5 m.

Readings from a plane waterline with mean draft T = 2.2 m at midships (x = 20 m) and trim t = 1 m by
the stern (tests/test_draft_marks.py: every mark reads the plane's height plus the keel 0.015 m).
No hog or sag, so the quarter-mean draft is T.  Step 4: u = T + t·(L/2 − LCF(u))/L with
LCF(u) = 20 + 2·(u − 2) gives u·(1 + 2t/L) = T + 4t/L, u = (2.2 + 0.1)/1.05 = 2.1904762 m, LCF(u) =
20.3809524 m, Δ_table = 410·u = 898.0952 t.  Nemoto: MCTC(u + ½) − MCTC(u − ½) = 10 t·m/cm, so
50·t²·10/1 /LBP = 50·1·10/40 = 12.5 t.  In sea water (ρ as the table's) Δ = 910.5952 t.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.draft_marks import DraftMarksError, MarkReadings, condition_from_readings, marks_for
from deckload.core.model import DraftMark, DraftMarks, HydrostaticTable, frozen_array
from deckload.core.tables import OutOfRangeError
from vessel_factories import BARGE_B, BARGE_L, RHO_SW, box_barge

L = BARGE_L
KEEL = 0.015
MARKS = DraftMarks(DraftMark(2.0, 5.0), DraftMark(20.0, 5.0), DraftMark(39.0, 5.0))
T_MEAN, TRIM = 2.2, 1.0


def posed_table() -> HydrostaticTable:
    t = np.arange(0.5, 3.5001, 0.5)
    n = len(t)
    return HydrostaticTable(
        draft_m=frozen_array(t), displacement_t=frozen_array(410.0 * t), lcb_m=frozen_array(np.full(n, 20.0)),
        lcf_m=frozen_array(20.0 + 2.0 * (t - 2.0)), kmt_m=frozen_array(np.full(n, 5.0)),
        tpc_t_cm=frozen_array(np.full(n, 4.1)), mctc_tm_cm=frozen_array(40.0 + 10.0 * (t - 2.0)),
    )


def vessel():
    v = box_barge(lightship_t=RHO_SW * L * BARGE_B * 2.0, lightship_kg_m=3.0)
    return dataclasses.replace(v, draft_marks=MARKS, hydrostatics=posed_table(),
                               particulars=dataclasses.replace(v.particulars, keel_thickness_m=KEEL))


def readings(mid_offset_m=0.0, list_deg=0.0) -> MarkReadings:
    """The plane T = 2.2 m at x = 20, trim 1 m by the stern, listed; the midships pair raised by
    ``mid_offset_m`` (a hog when positive: the middle floats higher than the ends' line)."""
    slope = TRIM / L
    tan_l = math.tan(math.radians(list_deg))

    def at(m: DraftMark, side: float, up: float = 0.0) -> float:
        return T_MEAN + slope * (L / 2 - m.x_m) + side * m.y_m * tan_l + KEEL - up

    return MarkReadings(at(MARKS.aft, -1), at(MARKS.aft, 1), at(MARKS.midships, -1, mid_offset_m),
                        at(MARKS.midships, 1, mid_offset_m), at(MARKS.forward, -1), at(MARKS.forward, 1))


U = (T_MEAN + 4 * TRIM / L) / (1 + 2 * TRIM / L)  # module docstring, step 4 solved
NEMOTO_T = 50.0 * TRIM**2 * 10.0 / 1.0 / L


def test_lcf_fixed_point_and_second_trim_correction():
    """Module docstring: u = 2.1904762 m at LCF 20.3809524 m, Δ_table = 898.0952 t, Nemoto 12.5 t,
    Δ = 910.5952 t.  Tolerances: the fixed point stops when LCF moves < 1e-9 m (contraction 2t/L =
    0.05 per step), so u is within 1e-9 m and Δ within 410·1e-9 t; 1e-6 is well inside every effect
    checked (the LCF correction moves Δ by 410·0.0095 = 3.9 t, Nemoto by 12.5 t)."""
    o = condition_from_readings(vessel(), readings(), RHO_SW)
    assert U == pytest.approx(2.1904762, abs=1e-7)
    assert o.trim_m == pytest.approx(TRIM, abs=1e-9)
    assert o.quarter_mean_m == pytest.approx(T_MEAN, abs=1e-9)
    assert o.draft_at_lcf_m == pytest.approx(U, abs=1e-6)
    assert o.lcf_m == pytest.approx(20.0 + 2.0 * (U - 2.0), abs=1e-6)
    assert o.second_trim_correction_t == pytest.approx(NEMOTO_T, abs=1e-6)
    assert NEMOTO_T == 12.5
    assert o.table_displacement_t == pytest.approx(410.0 * U + 12.5, abs=1e-6)
    assert o.displacement_t == pytest.approx(898.0952381 + 12.5, abs=1e-6)


def test_fresh_water_scales_the_table_displacement():
    """Step 5: her displacement is the table's × ρ_water/ρ_table: (898.0952 + 12.5)·1.000/1.025."""
    o = condition_from_readings(vessel(), readings(), 1.0)
    assert o.displacement_t == pytest.approx((410.0 * U + 12.5) / 1.025, abs=1e-6)


def test_lcg_from_the_tabulated_mctc_is_noted():
    """Step 5 with no KG given: LCG = LCB − t·100·MCTC/Δ with the table's MCTC at her displacement
    (t·m/cm; trim equation of standards.md §6.3 turned round).  Δ = 910.5952 t is at draft
    910.5952/410 = 2.2209640 m, MCTC 40 + 10·0.2209640 = 42.209640 t·m/cm, LCB 20 m:
    LCG = 20 − 100·42.209640/910.5952 = 15.364656 m; the note says the MCTC is the table's."""
    o = condition_from_readings(vessel(), readings(), RHO_SW)
    disp = 410.0 * U + 12.5
    mctc = 40.0 + 10.0 * (disp / 410.0 - 2.0)
    assert o.mctc_basis == "table"
    assert o.mctc_tm_cm == pytest.approx(mctc, abs=1e-6)
    assert o.lcg_m == pytest.approx(20.0 - TRIM * 100.0 * mctc / disp, abs=1e-6)
    assert o.notes == ("LCG from the tabulated MCTC (no KML or no KG given)",)


@pytest.mark.parametrize("offset, word", [(0.08, "hogged 0.080 m"), (-0.06, "sagged 0.060 m")])
def test_hog_and_sag_enter_the_quarter_mean_and_are_worded(offset, word):
    """Step 3: deflection = (T_AP + T_FP)/2 − T_M: the midships reading raised 0.08 m is a hog of
    0.08 m (lowered 0.06 m, a sag of 0.06 m), and T_Q = (T_AP + 6·T_M + T_FP)/8 = T − 6·0.08/8
    = 2.14 m (T + 6·0.06/8 = 2.245 m).  Over 0.05 m (deckload's own threshold, the UR L5 5 cm draught
    tolerance) a note says the quarter-mean allows for it only approximately."""
    o = condition_from_readings(vessel(), readings(mid_offset_m=offset), RHO_SW)
    assert o.deflection_m == pytest.approx(offset, abs=1e-9)
    assert o.draft_mid_m == pytest.approx(T_MEAN - offset, abs=1e-9)
    assert o.quarter_mean_m == pytest.approx(T_MEAN - 6.0 * offset / 8.0, abs=1e-9)
    assert o.notes[0] == f"{word}: the quarter-mean draft allows for it only approximately"


def test_small_deflection_is_not_worded():
    """A hog of 0.03 m is within the 5 cm threshold: no deflection note, only the MCTC note."""
    o = condition_from_readings(vessel(), readings(mid_offset_m=0.03), RHO_SW)
    assert o.deflection_m == pytest.approx(0.03, abs=1e-9)
    assert o.notes == ("LCG from the tabulated MCTC (no KML or no KG given)",)


def test_list_from_each_pair():
    """Step 1: the list at each pair is atan((S − P)/(2y)); a plane listed −2.5° (to port) gives −2.5° at
    all three, and the means are the centreline drafts, so Δ is that of the upright plane."""
    o = condition_from_readings(vessel(), readings(list_deg=-2.5), RHO_SW)
    assert o.list_deg == pytest.approx(-2.5, abs=1e-9)
    for lst in o.list_at_marks_deg:
        assert lst == pytest.approx(-2.5, abs=1e-9)
    assert o.displacement_t == pytest.approx(410.0 * U + 12.5, abs=1e-6)


def test_refusal_names_the_reading_and_the_limits():
    """A reading above the depth plus keel (4 + 0.015 m) is refused, naming the mark, the value and
    both limits (deckload's own rule and wording)."""
    good = readings()
    with pytest.raises(DraftMarksError) as e:
        condition_from_readings(vessel(), dataclasses.replace(good, mid_port_m=4.5), RHO_SW)
    assert str(e.value) == ("midships port reading 4.5 m: must be a draft between the keel (0.015 m) "
                            "and the depth plus keel (4.015 m)")


@pytest.mark.parametrize("value", [KEEL, 4.0 + KEEL])
def test_readings_at_the_keel_and_at_the_deck_are_not_refused_as_readings(value):
    """The limits are inclusive: a reading exactly at the keel or at depth plus keel is a possible
    draft (deckload's rule), so it is not refused as a reading; here it then lies off the posed
    table's 0.5–3.5 m (a table limit, OutOfRangeError), which is what the officer is told instead."""
    with pytest.raises(OutOfRangeError):
        condition_from_readings(vessel(), dataclasses.replace(readings(), aft_port_m=value, aft_stbd_m=value,
                                                              mid_port_m=value, mid_stbd_m=value,
                                                              fwd_port_m=value, fwd_stbd_m=value), RHO_SW)


def test_marks_of_a_trimmed_listed_condition():
    """Forward direction (module docstring): T(x) = T_F + t·(x_F − x)/LBP, plus the keel, ± y·tanφ.
    Draft 2.0 m at the LCF 18 m, trim 0.8 m by the stern, list 3° to port: at the aft marks (x = 2)
    T = 2 + 0.8·16/40 = 2.32 m; at the AP 2.36 m, at the FP 2 − 0.8·22/40 = 1.56 m; the port marks
    read deeper by 5·tan3°.  Deepest point (square bilge): (T_AP + keel)·cos3° + (B/2)·sin3°."""
    cm = marks_for(vessel(), 2.0, 18.0, 0.8, -3.0)
    d = 5.0 * math.tan(math.radians(3.0))
    assert cm.readings.aft_port_m == pytest.approx(2.32 + KEEL + d, abs=1e-12)
    assert cm.readings.aft_stbd_m == pytest.approx(2.32 + KEEL - d, abs=1e-12)
    assert cm.readings.mid_port_m == pytest.approx(2.0 + 0.8 * (18 - 20) / 40 + KEEL + d, abs=1e-12)
    assert cm.readings.fwd_stbd_m == pytest.approx(2.0 + 0.8 * (18 - 39) / 40 + KEEL - d, abs=1e-12)
    assert cm.extreme_aft_m == pytest.approx(2.36 + KEEL, abs=1e-12)
    assert cm.extreme_fwd_m == pytest.approx(1.56 + KEEL, abs=1e-12)
    phi = math.radians(3.0)
    assert cm.deepest_m == pytest.approx((2.36 + KEEL) * math.cos(phi) + 5.0 * math.sin(phi), abs=1e-12)


def test_second_trim_correction_near_the_end_of_the_table():
    """Near the deep end of the table MCTC is taken half a metre below and as far as the table goes
    above: mean draft 3.2 m, trim 0.6 m by the stern (the AP at 3.5 m, the table's end: deeper
    is refused as the forward calculation refuses it), u = (3.2 + 4·0.6/40)/(1 + 2·0.6/40) =
    3.1650485 m (module docstring, step 4 solved), so the step up is 3.5 − u = 0.3349515 m.  MCTC is
    linear, so the difference over that span is still 10 t·m/cm per m and Nemoto's correction is
    50·0.6²·10/40 = 4.5 t; Δ = 410·u + 4.5 t."""
    trim = 0.6
    slope = trim / L
    mean = 3.2

    def at(m: DraftMark) -> float:
        return mean + slope * (L / 2 - m.x_m) + KEEL

    r = MarkReadings(at(MARKS.aft), at(MARKS.aft), at(MARKS.midships), at(MARKS.midships),
                     at(MARKS.forward), at(MARKS.forward))
    o = condition_from_readings(vessel(), r, RHO_SW)
    u = (mean + 4 * trim / L) / (1 + 2 * trim / L)
    assert 3.5 - u == pytest.approx(0.3349515, abs=1e-7)
    assert o.trim_m == pytest.approx(0.6, abs=1e-9)
    assert o.second_trim_correction_t == pytest.approx(4.5, abs=1e-6)
    assert o.displacement_t == pytest.approx(410.0 * u + 4.5, abs=1e-6)


def _lcf_at_the_ap():
    v = vessel()
    h = v.hydrostatics
    return dataclasses.replace(v, hydrostatics=dataclasses.replace(h, lcf_m=frozen_array(np.zeros(len(h.draft_m)))))


def _level_readings(mean: float, trim: float) -> MarkReadings:
    def at(m: DraftMark) -> float:
        return mean + trim / L * (L / 2 - m.x_m) + KEEL

    return MarkReadings(at(MARKS.aft), at(MARKS.aft), at(MARKS.midships), at(MARKS.midships),
                        at(MARKS.forward), at(MARKS.forward))


def test_second_trim_correction_at_the_end_of_the_table_is_one_sided():
    """The draft at the LCF exactly at a table end: the centred span shrank to nothing and the
    correction was dropped.  Posed so that it happens: the table above with the LCF at the AP
    (x = 0) at every draft, so step 4 gives u = T_Q + t·(L/2 − 0)/L = the AP's draft.  Mean 0.8 m,
    trim 0.6 m by the head puts the AP at 0.5 m, the table's shallow end (the FP at 1.1 m).  MCTC
    is linear at 10 t·m/cm per m, so the one-sided difference over [0.5, 1.0] m is that slope and
    Nemoto's correction is 50·0.6²·10/40 = 4.5 t, as in the table's interior; Δ = 410·0.5 + 4.5 t."""
    o = condition_from_readings(_lcf_at_the_ap(), _level_readings(0.8, -0.6), RHO_SW)
    assert o.draft_at_lcf_m == pytest.approx(0.5, abs=1e-9) and o.lcf_m == 0.0  # the premise
    assert o.second_trim_correction_t == pytest.approx(4.5, abs=1e-6)
    assert o.displacement_t == pytest.approx(410.0 * 0.5 + 4.5, abs=1e-6)


def test_at_the_deep_end_the_correction_carries_her_beyond_the_table_and_is_refused():
    """The same at the deep end: mean 3.2 m, 0.6 m by the stern puts the AP, and so u, at 3.5 m.
    With Nemoto's 4.5 t her displacement, 410·3.5 + 4.5 = 1439.5 t, is beyond the table's 1435 t:
    refused (deckload does not extrapolate), where the dropped correction gave 1435 t as if known."""
    with pytest.raises(OutOfRangeError, match="displacement"):
        condition_from_readings(_lcf_at_the_ap(), _level_readings(3.2, 0.6), RHO_SW)
