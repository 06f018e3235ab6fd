"""Edges of the criteria stage: the dangers it words for the officer, checked word for word (what he
reads when the program cannot do what the booklet expects; deckload's own wording), and where the
downflooding angle cuts the areas (IS 2008 Part A 2.2.1)."""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.model import LimitCurve, frozen_array
from deckload.core.stability import evaluate
from vessel_factories import barge_at


def test_displacement_off_the_downflooding_curve_is_worded():
    """Box barge 40 × 10 m at T = 2 m in sea water: Δ = 1.025·40·10·2 = 820 t (checks.md §1.1), off a
    downflooding curve given for 5000–6000 t only: θf unknown, so the criteria worked to θf are not
    assessable (IS 2008 Part A 2.2.1, 2.3: standards.md §1, §2.1 step 5)."""
    v, c = barge_at(2.0, 3.0)
    short = LimitCurve(frozen_array([5000.0, 6000.0]), frozen_array([35.0, 35.0]), "downflooding_deg")
    r = evaluate(dataclasses.replace(v, downflooding=short), c)
    assert r.downflooding_angle_deg is None
    notes = [w for w in r.warnings if w.code == "downflooding-range"]
    assert [(w.message, w.severity) for w in notes] == [(
        "displacement 820.0 t is outside the downflooding-angle curve, 5000–6000 t: θf is unknown, so the "
        "criteria worked to θf (areas to 40° or θf, GZ at 30° or more, the weather criterion's θ2) are not "
        "assessable, or failed where no θf could meet them", "danger")]


def test_downflooding_exactly_at_30_degrees_is_not_called_below_30():
    """θf = 30.0° exactly (a curve row at the barge's 820 t, so no interpolation): openings do not
    immerse *before* 30°, so the 'below 30°' danger would be false; the 30°–θf area is nil all the same
    (IS 2008 Part A 2.2.1: the area from 30° to θf when θf < 40°), so the ship is not passed."""
    v, c = barge_at(2.0, 3.0)
    at30 = LimitCurve(frozen_array([820.0, 5000.0]), frozen_array([30.0, 30.0]), "downflooding_deg")
    r = evaluate(dataclasses.replace(v, downflooding=at30), c)
    assert r.downflooding_angle_deg == 30.0
    assert not [w for w in r.warnings if w.code == "downflooding-low"]
    assert r.area_30_40_mrad == 0.0
    assert not r.all_criteria_pass


def test_downflooding_below_30_degrees_is_worded():
    """θf = 20° (a curve row at 820 t): openings immerse before 30°, so the 30°–θf area of IS 2008
    Part A 2.2.1 is nil; the danger says so with θf."""
    v, c = barge_at(2.0, 3.0)
    low = LimitCurve(frozen_array([820.0, 5000.0]), frozen_array([20.0, 20.0]), "downflooding_deg")
    r = evaluate(dataclasses.replace(v, downflooding=low), c)
    notes = [w for w in r.warnings if w.code == "downflooding-low"]
    assert [(w.message, w.severity) for w in notes] == [(
        "downflooding angle θf 20.0° is below 30°: openings immerse before 30°, so the 30°–θf area is nil",
        "danger")]


def test_downflooding_above_40_degrees_leaves_the_areas_to_40():
    """IS 2008 Part A 2.2.1: the areas run to 40°, or to θf only when θf is less than 40°.  With
    θf = 40.5° the 0–40° and 30–40° areas are those of the same barge with no openings at all."""
    v, c = barge_at(2.0, 3.0)
    free = evaluate(v, c)
    at405 = LimitCurve(frozen_array([820.0, 5000.0]), frozen_array([40.5, 40.5]), "downflooding_deg")
    r = evaluate(dataclasses.replace(v, downflooding=at405), c)
    assert r.downflooding_angle_deg == 40.5
    # Same curve, same trapezoids: equal to round-off; the area to 40.5° would be larger by about
    # GZ(40°)·0.5° ≈ 0.009 m·rad.
    assert r.area_0_40_mrad == pytest.approx(free.area_0_40_mrad, abs=1e-12)
    assert r.area_30_40_mrad == pytest.approx(free.area_30_40_mrad, abs=1e-12)
