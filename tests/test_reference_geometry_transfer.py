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


def test_a_full_tank_has_exactly_no_transfer():
    """Definition (transfer.py): a full tank has no free surface, its contents cannot move, so its M
    is exactly 0 at every heel, for a box, a wedge (checks.md §3.3 section) and a hull-shaped tank —
    not the 1e-14 m⁴ of round-off that the heeled and upright centroids of the whole body differ by."""
    from deckload.core.geometry.hull import compartment_body
    from test_reference_geometry_builder import flared_geometry

    g = flared_geometry()
    wedge = Body(*compartment_sections(CompartmentShape("prism", 0.0, 10.0, section_y_m=np.array([0.0, 4.0, 0.0]),
                                                        section_z_m=np.array([0.0, 2.0, 2.0])), None))
    for body in (box_tank(), wedge, compartment_body(g.tanks[0].shape, g.hull)):
        m = transfer_moments(body, np.array([100.0]), np.array([10.0, 30.0, 60.0, 90.0])).moment_m4
        assert np.all(m == 0.0)


def test_worst_band_of_a_small_tank():
    """A box tank 2 × 1 × 0.5 m has the proportions b/h = 2 of the 6 × 4 × 2 m tank of checks.md
    §3.2, so the same band (M scales with l·b³, the fills do not): 35.98394–64.01606 % by bisection
    on the closed form (vessel_factories.box_tank_worst_band_pct), though its largest M is only
    0.094 m⁴.  Tolerance 0.0062 % as for the large tank (tests/test_geometry_tanks.py)."""
    from deckload.core.geometry.transfer import worst_band
    from vessel_factories import box_tank_worst_band_pct

    small = Body(*compartment_sections(CompartmentShape("box", 0.0, 2.0, 0.0, 1.0, 0.0, 0.5), None))
    lo, hi = worst_band(small)
    exp_lo, exp_hi = box_tank_worst_band_pct(2.0, 1.0, 0.5)
    assert (exp_lo, exp_hi) == pytest.approx((35.98394, 64.01606), abs=1e-5)
    assert lo == pytest.approx(exp_lo, abs=0.0062)
    assert hi == pytest.approx(exp_hi, abs=0.0062)


def test_no_moment_at_any_fill_gives_the_whole_range():
    """A compartment of no height holds nothing and moves nothing: with no largest moment there is
    no worst band, and the whole range 0–100 % is reported (transfer.worst_band)."""
    from deckload.core.geometry.transfer import worst_band

    flat = Body(*compartment_sections(CompartmentShape("box", 0.0, 2.0, 0.0, 1.0, 0.5, 0.5), None))
    assert worst_band(flat) == (0.0, 100.0)
