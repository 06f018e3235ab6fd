"""A criterion decided by the interpolation between the KN table's heels is not met with certainty.

The GZ curve is KN interpolated in heel by a natural cubic spline (core/gz.py).  Every criterion is
judged a second time on the same tabulated KN interpolated by a shape-preserving cubic (PCHIP,
``gz.pchip_curve``); a criterion the spline passes and the second fails is "marginal" (not
assessable); the angle of maximum GZ, read where the curve is flat, is marginal too when the run of
angles where GZ comes within the two interpolations' difference of its top reaches past the limit
(``gz.max_band``).  A failure stays a failure.

Source of the true answers: the checks.md §1 box barge (L 40, B 10, D 4 m, T 2 m), whose section
closed forms (checks.md §1.2, regimes 1–4; ``vessel_factories.box_gz_m``) give the exact GZ at any
heel.  checks.md §1.3: KG 4.0 m has its maximum at 26.08° (passes IS 2008 A 2.2.3, ≥ 25°), KG 4.5 m
at 24.88° (fails).  For KG 4.47 m the exact maximum is found below from the closed form by golden
section: 24.95°, a fail, which every coarse table turned into a pass (found by an audit).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core import gz as gzmod
from deckload.core.result import CriterionResult
from deckload.core.stability import MARGINAL, _marginal, evaluate
from vessel_factories import barge_at, box_gz_m, box_kn_m

ANGLE = "IS2008-A2.2.3-angle-max-gz"


def exact_max_angle_deg(kg_m: float) -> float:
    """θ of the largest exact GZ of the box (checks.md §1.2 closed forms), golden section on 20°–30°
    (GZ is unimodal there: it rises to the maximum and falls after it, checks.md §1.2 table)."""
    f = lambda deg: -box_gz_m(10.0, 4.0, 2.0, kg_m, math.radians(deg))  # noqa: E731
    a, b = 20.0, 30.0
    g = (math.sqrt(5.0) - 1.0) / 2.0
    for _ in range(100):
        c, d = b - g * (b - a), a + g * (b - a)
        a, b = (a, d) if f(c) < f(d) else (c, b)
    return 0.5 * (a + b)


def _angle_row(step_deg: float, kg_m: float) -> CriterionResult:
    v, c = barge_at(2.0, kg_m, heel_step_deg=step_deg)
    r = evaluate(v, c)
    return next(x for x in r.criteria if x.id == ANGLE), r


@pytest.mark.parametrize("step_deg", [5.0, 10.0, 15.0])
def test_a_fail_hidden_by_a_coarse_table_is_marginal_not_met(step_deg):
    """KG 4.47 m: exact θmax 24.95° fails A 2.2.3; the spline through 5°, 10°, 15° tables puts it at
    25.4°, 25.9°, 26.6° (a pass).  Now the criterion is not assessable, its note says why, and the
    verdict does not say Met."""
    assert exact_max_angle_deg(4.5) == pytest.approx(24.88, abs=0.005)   # the closed form as checks.md §1.3
    assert exact_max_angle_deg(4.47) == pytest.approx(24.95, abs=0.01)
    row, r = _angle_row(step_deg, 4.47)
    assert not row.assessed and not row.passed
    assert row.note.startswith(MARGINAL) and "compare with the booklet" in row.note
    assert not r.verdict_text().startswith("Met:")
    assert not next(s for s in r.criteria_sets if s.id == "IS2008-A2.2").passed


def test_a_fine_table_decides_it_and_fails_it():
    """A 1° table resolves the maximum (24.95°, the closed form's to 0.01°): a plain failure."""
    row, r = _angle_row(1.0, 4.47)
    assert row.assessed and not row.passed
    assert row.value == pytest.approx(exact_max_angle_deg(4.47), abs=0.01)
    assert r.verdict_text().startswith("NOT MET (1 failed)")


@pytest.mark.parametrize("step_deg", [5.0, 10.0])
def test_a_maximum_clear_of_the_limit_is_still_met(step_deg):
    """KG 4.0 m: exact θmax 26.08° (checks.md §1.3); 5° and 10° tables decide it (the run of
    near-maximum angles stays above 25°): met, not marginal.  The other A 2.2 criteria, far from their
    limits, are met on both interpolations."""
    assert exact_max_angle_deg(4.0) == pytest.approx(26.08, abs=0.005)   # checks.md §1.3
    row, r = _angle_row(step_deg, 4.0)
    assert row.assessed and row.passed
    assert all(x.assessed and x.passed for x in r.criteria if x.set_id == "IS2008-A2.2")


def test_pchip_is_scipys_construction():
    """The second opinion against a general-purpose reference library: scipy's PchipInterpolator
    through the box's KN row at T 2 m (checks.md §1.2 closed form at 5° steps), on the fine grid."""
    from scipy.interpolate import PchipInterpolator

    heels = np.arange(0.0, 90.1, 5.0)
    row = np.array([box_kn_m(10.0, 4.0, 2.0, math.radians(h)) for h in heels])
    ours = gzmod.pchip_curve(heels, row, len(gzmod.FINE_DEG))
    assert np.max(np.abs(ours - PchipInterpolator(heels, row)(gzmod.FINE_DEG))) < 1e-12
    uneven = np.array([0.0, 10.0, 12.0, 20.0, 30.0, 40.0, 60.0, 75.0, 90.0])
    row = np.array([box_kn_m(10.0, 4.0, 2.0, math.radians(h)) - 4.4 * math.sin(math.radians(h)) for h in uneven])
    ours = gzmod.pchip_curve(uneven, row, len(gzmod.FINE_DEG))
    assert np.max(np.abs(ours - PchipInterpolator(uneven, row)(gzmod.FINE_DEG))) < 1e-12


def test_a_failure_stays_a_failure_and_a_pass_both_agree_on_stands():
    """The comparison never softens a failure into 'not assessable' (it says the other interpolation
    passes it), and leaves alone a pass both interpolations agree on."""
    def crit(value, passed):
        return CriterionResult("IS2008-A2.2.1-area-30-40", "Area under GZ, 30° to 40° or θf", value, 0.030,
                               "m·rad", ">=", passed, "IS Code 2008 Part A 2.2.1", set_id="IS2008-A2.2")
    failed, = _marginal([crit(0.0295, False)], [crit(0.0305, True)], None)
    assert failed.assessed and not failed.passed
    assert MARGINAL in failed.note and "0.0305 m·rad by a shape-preserving one" in failed.note
    flip, = _marginal([crit(0.0305, True)], [crit(0.0295, False)], None)
    assert not flip.assessed and not flip.passed and flip.note.endswith("compare with the booklet")
    same, = _marginal([crit(0.0405, True)], [crit(0.0395, True)], None)
    assert same.assessed and same.passed and same.note == ""


def _every_condition():
    from deckload.io.paths import DEMO_CONDITIONS, TRAWLER_CONDITIONS
    from deckload.io.profiles import load_condition
    from demo_vessels import demo_vessel, trawler_vessel

    for vessel, conditions in ((demo_vessel(), DEMO_CONDITIONS), (trawler_vessel(), TRAWLER_CONDITIONS)):
        for path in conditions.values():
            yield vessel, load_condition(path, vessel)
    for step in (5.0, 10.0, 15.0):
        for kg in (3.0, 4.0, 4.3, 4.47, 4.5):
            yield barge_at(2.0, kg, heel_step_deg=step)


def test_skipping_the_second_opinion_never_changes_a_criterion(monkeypatch):
    """The second opinion is worked out only when it could judge a criterion otherwise
    (stability._second_opinion_may_differ, its bounds derived in the docstring); forced every time,
    every criterion of every demo condition and of the box at KG 3–4.5 m on 5°, 10° and 15° tables
    comes out the same.  The demo's departure, far from every limit, skips it (the screen's key)."""
    import deckload.core.stability as st

    cases = list(_every_condition())
    skipped = [evaluate(v, c) for v, c in cases]
    real = st._second_opinion_may_differ
    monkeypatch.setattr(st, "_second_opinion_may_differ", lambda *a: True)
    forced = [evaluate(v, c) for v, c in cases]
    for a, b in zip(skipped, forced):
        assert a.criteria == b.criteria
    monkeypatch.setattr(st, "_second_opinion_may_differ", real)
    calls = []
    monkeypatch.setattr(st, "_second_opinion_may_differ", lambda *a: calls.append(real(*a)) or calls[-1])
    evaluate(*cases[0])
    assert calls == [False]
