"""The audit's smooth-curve check of the KN table (audit.py, ``cross_curves``): which value it names
when two stand out equally, and that the 0° column is left to the KN-at-0° check.

Rule (audit.py, derived there): an inner value is judged by its distance from the line through its
two neighbours, along heel and along displacement (the smaller of the two, in metres and as a
fraction of the line's value, the fraction judged against at least 5 % of the envelope
√((B/2)² + (2·D)²)); beyond 20 % a warning, beyond 50 % an error, and one finding, for the value
that departs most in metres.  On an exact tie the first in the table's order (by displacement,
then heel) is named — deckload's own rule, so that the same table always names the same value.

Tables posed for these tests on the 22 m box of tests/box_profile_text.py (B 6.5, D 3.0 m; heel
0–90° every 10°, four displacements).  KN = 0.25 m per 10° of heel at every displacement (a
straight line in heel and constant along displacement, so every line through two neighbours is
exact in binary and every value off it by exactly its own spike).
"""

from __future__ import annotations

import dataclasses

import numpy as np

from deckload.core.audit import ERROR, WARNING
from deckload.core.model import frozen_array
from fv22_audit import found, vessel


def with_kn(kn, v=None):
    v = v or vessel()
    return dataclasses.replace(v, cross_curves=dataclasses.replace(v.cross_curves, kn_m=frozen_array(kn)))


def straight():
    kn = np.tile(0.25 * np.arange(10.0), (4, 1))
    assert kn.shape == np.asarray(vessel().cross_curves.kn_m).shape
    return kn


def test_the_straight_table_raises_no_outlier():
    assert found(with_kn(straight()), "kn-outlier") == []


def test_of_two_values_standing_out_equally_the_first_is_named():
    """Spikes of +0.5 m at (Δ row 2, 30°) and (Δ row 3, 60°): each is 0.5 m off the line along heel
    and along displacement (its neighbours 0.75 m and 1.5 m; the displacement spacing does not
    matter, both neighbours being equal); its neighbours are off by 0.25 m along one direction only
    and by 0 along the other, so they are not judged.  Tied at 0.5 m: the first, at 30°, is named;
    it is 0.5/0.75 = 67 % off, an error (the second, 0.5/1.5 = 33 %, would be a warning)."""
    kn = straight()
    kn[1, 3] += 0.5
    kn[2, 6] += 0.5
    (f,) = found(with_kn(kn), "kn-outlier")
    assert (f.severity, f.path) == (ERROR, ("cross_curves", "kn_m", 1, 3))
    assert f.why.startswith("stands out of a smooth curve: 67% away from the line through its neighbours along "
                            "heel and displacement")
    kn[1, 3] -= 0.5  # alone, the second one is a warning: the two are told apart by their severity
    (f,) = found(with_kn(kn), "kn-outlier")
    assert (f.severity, f.path) == (WARNING, ("cross_curves", "kn_m", 2, 6))


def test_a_zero_degree_value_within_its_rounding_is_not_an_outlier():
    """KN at 0° is zero (upright, the line of buoyancy passes through K); a printed 0.01 m is within
    the KN-at-0° check's rounding (audit.py KN_ZERO_TOLERANCE_M, not more than 0.01 m: no finding).
    The smooth-curve check starts at the first heel above 0°, so it does not call that 0.01 m a slipped
    digit either.  It would on a small craft: with B 1.2 m and D 0.35 m the envelope is
    √(0.6² + 0.7²) = 0.922 m and its 5 % floor 0.046 m, so 0.01 m off the zero line through its
    neighbours is 22 % (more than the 20 % warning).  The 22 m box's particulars are replaced by
    those two; the KN table is the straight one scaled to stay inside that envelope (0.05 m per
    10°, at most 0.45 m)."""
    v = vessel()
    v = dataclasses.replace(v, particulars=dataclasses.replace(v.particulars, breadth_m=1.2, depth_m=0.35))
    kn = straight() / 5.0
    kn[1, 0] = 0.01
    assert found(with_kn(kn, v), "kn-zero", "kn-negative", "kn-envelope", "kn-outlier") == []
