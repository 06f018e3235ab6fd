"""A profile's range-of-stability rule on a curve that is never positive, with KN tables that stop
short of 90°: the range is nil and the rule fails — it is not "not assessable".

Source: the range of positive stability is the span of heel over which GZ is positive, measured
from the equilibrium angle (common practice; IS Code 2008 Part A 2.2 uses the same notion for its
GZ criteria).  A curve with no positive GZ has no such span, so the range is 0° whatever angle the
KN tables reach: only a curve still positive at the tables' end leaves the range unknown
(verdict.extra_criteria; tests/test_verdict_wording.py::test_profile_range_rules for the tables
to 90°).

The vessel is the box of tests/test_verdict_wording.py (L 40 × B 10 × D 6 m) at T 3 m with KG 5 m:
GZ is never positive (test_profile_range_rules asserts max GZ ≤ 0 there); its largest GZ is the
0.0 at 0° (KN(0°) = 0, TCG = 0).  The KN tables are cut at 60° and at 40°.
"""

from __future__ import annotations

import pytest

from deckload.core.model import CriteriaSettings, ExtraCriterion
from test_verdict_wording import _short, box, crit

RULE = (ExtraCriterion("min_range", 95.0, "r"),)


@pytest.mark.parametrize("kn_end_deg", [60.0, 40.0])
def test_no_positive_gz_is_a_nil_range_even_where_the_tables_stop_short(kn_end_deg):
    r = _short(kn_end_deg, RULE, box(3.0, 5.0, CriteriaSettings(sharp_bilged=True, extra=RULE)))
    assert r.max_gz_m == 0.0 and r.vanishing_angle_deg is None
    x = crit(r, "profile-1-min-range")
    assert (x.assessed, x.value, x.passed, x.note) == (True, 0.0, False, "")
