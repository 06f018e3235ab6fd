"""KN rows no condition reads (below the lightship) are not judged for doubts; their errors stay errors.

The table is the exact box KN (checks.md §1.2; tests/vessel_factories.box_kn_m) of the 22 m box of
tests/fv22_audit.py (L 22, B 6.5, D 3.0 m, ρ 1.025: Δ = 146.575·T t), at eight drafts 0.5–2.25 m,
heel 0–90° every 10°.  With the lightship at the 1.5 m displacement the lightest condition reads KN at
219.86·1.025/1.04 t at least (the densest water a condition may state, bounds.WATER_DENSITY_RANGE_T_M3),
between the rows of 1.25 and 1.5 m; the rows of 0.5 and 0.75 m weigh under 2 % there
(audit.kn_unreached_rows, computed from the same spline as deckload.core.gz.kn_row).  Found by an
audit: a hard-chine ferry's true KN at 100 t, 10° drew two warnings with every result, her lightship
172 t.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from deckload.core import audit as au
from deckload.core.audit import ERROR
from deckload.core.model import frozen_array
from fv22_audit import found, vessel
from vessel_factories import box_kn_m

DRAFTS = np.array([0.5, 0.75, 1.0, 1.25, 1.5, 1.75, 2.0, 2.25])
PER_M = 1.025 * 22.0 * 6.5


def box(spike_row: int | None = None, spike: float = 0.0, lightship_t: float = 1.5 * PER_M):
    v = vessel()
    heel = np.asarray(v.cross_curves.heel_deg, dtype=float)
    kn = np.array([[box_kn_m(6.5, 3.0, t, np.radians(h)) for h in heel] for t in DRAFTS])
    if spike_row is not None:
        kn[spike_row, 3] *= 1.0 + spike  # 30°: an inner cell along heel and displacement
    cc = dataclasses.replace(v.cross_curves, displacement_t=frozen_array(DRAFTS * PER_M), kn_m=frozen_array(kn))
    return dataclasses.replace(v, cross_curves=cc, lightship=dataclasses.replace(v.lightship, mass_t=lightship_t))


KN_CHECKS = ("kn-outlier", "kn-lone", "kn-kmt")


def test_the_rows_below_the_lightship_are_the_ones_no_condition_reads():
    lightest = 1.5 * PER_M * 1.025 / 1.04
    assert au.kn_unreached_rows(DRAFTS * PER_M, lightest) == frozenset({0, 1})
    assert au.kn_unreached_rows(DRAFTS * PER_M, 0.6 * PER_M) == frozenset()


def test_a_doubt_in_a_row_below_the_lightship_is_not_raised_but_one_above_is():
    assert found(box(), *KN_CHECKS) == []
    # 25 % off at 30° in the 0.5 m row: a doubt (20–50 %, audit.KN_OUTLIER) no condition can meet
    assert found(box(0, 0.25), *KN_CHECKS) == []
    # the same slip in the 0.5 m row is a doubt when the lightship is light enough to read it
    assert [f.path[2] for f in found(box(0, 0.25, lightship_t=0.5 * PER_M), *KN_CHECKS)] == [0]
    # and in a row a condition reads
    assert [f.path[2] for f in found(box(5, 0.25), *KN_CHECKS)] == [5]


def test_a_contradiction_in_a_row_below_the_lightship_is_still_an_error():
    fs = found(box(0, 0.6), *KN_CHECKS)  # 60 % off (66 % of its neighbours' line): beyond 50 %, an error
    assert [(f.severity, f.check, f.path[2]) for f in fs] == [(ERROR, "kn-outlier", 0)]
