"""The draft survey (deckload.core.draft_marks.condition_from_readings) where the marks are not where the
other tests put them, and the refusals when her draft falls off the hydrostatic table.

Vessel, posed table and plane readings are those of tests/test_draft_marks_corrections.py (the barge of
checks.md §1 with a table linear in draft: Δ = 410·T t, LCF = 20 + 2·(T − 2) m, rows T = 0.5 … 3.5 m;
keel 0.015 m).  A reading is the draft of the plane at the mark plus the keel, ± y·tanφ for the list.
"""

from __future__ import annotations

import dataclasses
import math

import pytest

from deckload.core.draft_marks import MarkReadings, condition_from_readings
from deckload.core.model import DraftMark, DraftMarks
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
    1.2 m by the head (trim −1.2 m): quarter-mean 0.55 m, LCF there 20 + 2·(0.55 − 2) = 17.1 m, and the
    first step of the fixed point (module docstring, step 4) gives the draft at the LCF
    0.55 + (−1.2)·(20 − 17.1)/40 = 0.463 m, below the first row: refused under that name.  (The aft
    marks read 0.55 − 1.2·18/40 + 0.015 = 0.025 m, above the keel, so no reading is refused first.)"""
    marks = vessel().draft_marks
    r = plane(marks, 0.55, -1.2)
    assert min(r.as_tuple()) >= KEEL
    with pytest.raises(OutOfRangeError) as e:
        condition_from_readings(vessel(), r, RHO_SW)
    assert 0.55 - 1.2 * (20 - 17.1) / 40 == pytest.approx(0.463, abs=1e-12)
    assert str(e.value) == ("draft at the LCF (hydrostatic table) 0.463 m is outside the table range 0.5–3.5 m; "
                            "deckload does not extrapolate")
