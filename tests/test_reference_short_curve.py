"""Cross curves that stop short of 90°: what the criteria say where the GZ curve ends.

The box barge of checks.md §1 (L 40, B 10, D 4 m) at T = 2 m, its KN from the exact
section formulas (tests/vessel_factories.py, checks.md §1.2/§1.4), with the KN columns
beyond an angle removed, as a booklet's tables may end at 60° (vessel_profiles/README.md).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core import model as m
from deckload.core.stability import evaluate
from vessel_factories import barge_at, box_gz_m


def _cut(v: m.Vessel, end_deg: float) -> m.Vessel:
    """The same vessel with its KN tables ending at ``end_deg`` (a tabulated heel)."""
    cc = v.cross_curves
    k = int(np.searchsorted(cc.heel_deg, end_deg)) + 1
    return dataclasses.replace(v, cross_curves=m.CrossCurves(m.frozen_array(cc.heel_deg[:k]), cc.displacement_t,
                                                            m.frozen_array(cc.kn_m[:, :k]), cc.trim_basis))


def _crit(r, suffix: str):
    (c,) = [c for c in r.criteria if c.id == "IS2008-A2.2.2-" + suffix or c.id == "IS2008-A2.2.3-" + suffix]
    return c


def test_gz_30_shortfall_beyond_the_table_is_not_assessable_and_says_why():
    """KG 4.9 m at T 2 m (GM = KB + BM − KG = 1 + 10²/(12·2) − 4.9 = 0.2667 m > 0, checks.md §1.1):
    GZ(30°) = KN(30°) − 4.9·sin30° = 2.58771 − 2.45 = 0.138 m (KN: checks.md §1.4) is below the
    IS 2008 A 2.2.2 0.20 m, and GZ falls from there to 60° (box_gz_m at 30, 45, 60° below), so up to
    the table's 60° no angle ≥ 30° reaches 0.20 m; with no θf the criterion looks to 90°, beyond the
    table: not assessable, never 'met', and the note names both angles (IS 2008 A 2.2.2: 'at an angle
    of heel equal to or greater than 30°')."""
    v, c = barge_at(2.0, 4.9)
    gz = [box_gz_m(10.0, 4.0, 2.0, 4.9, math.radians(a)) for a in (30.0, 45.0, 60.0)]
    assert gz[0] < 0.20 and gz[0] > gz[1] > gz[2]  # the premise, from the closed form
    r = evaluate(_cut(v, 60.0), c)
    g = _crit(r, "gz-30")
    assert (g.assessed, g.passed) == (False, False)
    assert g.note == ("GZ stays below 0.20 m up to 60°, where the KN tables end; "
                      "the range runs to 90°: not assessable")
    assert any(w.code == "criterion-not-assessed" and w.severity == "danger"
               and w.message == f"NOT ASSESSED {g.description}: {g.note} ({g.source})" for w in r.warnings)
    # with the whole table the same shortfall is decided: failed, not 'not assessable'
    full = _crit(evaluate(v, c), "gz-30")
    assert (full.assessed, full.passed) == (True, False)


def test_gz_30_met_within_the_table_is_decided():
    """KG 3 m at T 2 m: GZ(30°) = 1.08771 m (checks.md §1.4) ≥ 0.20 m, found within a table to 60°,
    decides IS 2008 A 2.2.2: met, assessed, with no note, although the range would run to 90°."""
    v, c = barge_at(2.0, 3.0)
    g = _crit(evaluate(_cut(v, 60.0), c), "gz-30")
    assert (g.assessed, g.passed) == (True, True)
    assert g.value == pytest.approx(1.08771, abs=5e-5)  # checks.md §1.4 prints 5 decimals
    assert not g.note


def test_a_maximum_at_the_end_of_the_table_is_said_to_lie_there_or_beyond():
    """KG 0.5 m at T 2 m: the exact curve GZ = KN − 0.5·sinφ (vessel_factories.box_gz_m, checks.md
    §1.2) has its maximum near 44.4° (searched below on a 0.1° grid), beyond 40°, and rises from
    35° to 40°; so with KN to 40° the curve's maximum is its last point, and the true maximum lies
    at or beyond it: the IS 2008 A 2.2.3 row says so.  With KN to 60° the maximum lies inside the
    table and the row carries no such note."""
    v, c = barge_at(2.0, 0.5)
    exact_max_deg = max(range(901), key=lambda i: box_gz_m(10.0, 4.0, 2.0, 0.5, math.radians(i / 10))) / 10
    assert 43.0 < exact_max_deg < 46.0  # the premise, from the closed form
    assert box_gz_m(10.0, 4.0, 2.0, 0.5, math.radians(35.0)) < box_gz_m(10.0, 4.0, 2.0, 0.5, math.radians(40.0))
    short = _crit(evaluate(_cut(v, 40.0), c), "angle-max-gz")
    assert short.value == pytest.approx(40.0, abs=1e-9)
    assert short.note == "the maximum lies at or beyond 40°, where the KN tables end"
    inside = _crit(evaluate(_cut(v, 60.0), c), "angle-max-gz")
    # the 5° KN table's spline puts the maximum within 1.5° of the exact one (its knots are exact)
    assert inside.value == pytest.approx(exact_max_deg, abs=1.5)
    assert "KN tables end" not in (inside.note or "")


def test_a_table_ending_half_a_degree_short_of_90_still_leaves_the_range_open():
    """KG 4.9 m as above, KN tabulated every 0.5° but only to 89.5°: the criterion looks to 90° (no θf),
    0.5° beyond the table, so the shortfall is still not assessable — however little is missing."""
    v, c = barge_at(2.0, 4.9, heel_step_deg=0.5)
    g = _crit(evaluate(_cut(v, 89.5), c), "gz-30")
    assert (g.assessed, g.passed) == (False, False)
    assert g.note == ("GZ stays below 0.20 m up to 89.5°, where the KN tables end; "
                      "the range runs to 90°: not assessable")


def test_a_downflooding_angle_at_the_end_of_the_table_decides_the_gz_30_row():
    """KG 4.9 m, KN to 60° and θf = 60°: deckload looks for GZ ≥ 0.20 m between 30° and θf where θf is
    given (openings immerse there), all within the table, so GZ(30°) = 0.138 m < 0.20 m, falling
    beyond (closed form, first test), decides IS 2008 A 2.2.2: failed, assessed."""
    v, c = barge_at(2.0, 4.9)
    flood = m.LimitCurve(m.frozen_array([100.0, 5000.0]), m.frozen_array([60.0, 60.0]), "downflooding_deg")
    g = _crit(evaluate(dataclasses.replace(_cut(v, 60.0), downflooding=flood), c), "gz-30")
    assert (g.assessed, g.passed) == (True, False)
    assert g.value == pytest.approx(2.58771 - 4.9 * 0.5, abs=5e-5)  # checks.md §1.4 KN(30°), 5 decimals
    assert not g.note


def test_a_maximum_half_a_degree_inside_the_table_is_not_said_to_lie_beyond():
    """KG 0.5 m, KN every 1° to 45°: the exact maximum is near 44.4° (test above), inside the table by
    more than the 0.1° grid step, so the angle-of-maximum row carries no 'beyond' note."""
    v, c = barge_at(2.0, 0.5, heel_step_deg=1.0)
    g = _crit(evaluate(_cut(v, 45.0), c), "angle-max-gz")
    assert 44.0 < g.value < 44.9  # exact 44.4° (0.1° grid search above); the spline's within 0.4°
    assert not g.note
