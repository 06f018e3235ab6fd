"""The moment of fluid transfer of a nearly empty and a nearly full box tank
(core/geometry/transfer.py), against the exact section formulas.

Box tank l = 6, b = 4, h = 2 m (checks.md §3.2 [A]).  At fill f the liquid depth is d = f·h; heeled
30° with d < (b/2)·tan 30° the surface meets the bottom and the low side only (checks.md §1.2 case 2,
(B, D, T) → (b, h, d)), and M = v·[y_g·cos θ + (z_g − d/2)·sin θ] (transfer.py docstring),
evaluated by vessel_factories.box_transfer_moment_m4 from those closed forms.  The rectangle is
point-symmetric, so M(f) = M(100 − f) (checks.md §3.2): the same values at 99 and 99.5 %.
At 1 % the liquid is only 0.48 m³, at 0.5 % 0.24 m³: small volumes must still shift.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.body import Body
from deckload.core.geometry.hull import compartment_sections
from deckload.core.geometry.spec import CompartmentShape
from deckload.core.geometry.transfer import transfer_moments
from vessel_factories import box_transfer_moment_m4


def box_tank() -> Body:
    return Body(*compartment_sections(CompartmentShape("box", 0.0, 6.0, -2.0, 2.0, 0.0, 2.0), None))


def test_nearly_empty_and_nearly_full_box_tank():
    fills = np.array([0.5, 1.0, 99.0, 99.5])
    heels = np.array([10.0, 30.0])
    m = transfer_moments(box_tank(), fills, heels).moment_m4
    for i, f in enumerate(fills):
        for k, h in enumerate(heels):
            expected = box_transfer_moment_m4(6.0, 4.0, 2.0, min(f, 100.0 - f), math.radians(h))
            # round-off of the level search (1e-11 relative on the volume) on moments of 0.1–0.8 m⁴
            assert m[i, k] == pytest.approx(expected, rel=1e-7, abs=1e-12), (f, h)
    assert m[1, 1] > 0.7  # 0.78 m⁴ at 1 %, 30°: not nil
