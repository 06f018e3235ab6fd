"""KN by direct calculation at free trim with G off the middle, the axes a cross-curve result
carries, and which case a free-trim refusal names (core/geometry/cross_curves.py).

Box hull 20 × 6 × 3 m (x 0…20, half-breadth 3, deck 3, five stations), ρ = 1.025 t/m³, as in
``test_reference_geometry_immersion.py``, whose docstring derives the wall-sided free-trim box:
below h(x, y) = a + b·(x − L/2) + y·tanθ with a = ∇/(L·B), b = −tanψ/cosθ,

    y_B = tanθ·B²/(12a),   z_B = (a² + b²L²/12 + tan²θ·B²/12)/(2a),

tanψ the root of the cubic R(t) = 0 found there (``free_trim_tan``).  KN is the lever of B about
the keel point in the heeled frame (module docstring): KN = y_B·cosθ + z_B·sinθ.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.cross_curves import NoEquilibriumError, cross_curves
from test_reference_geometry_immersion import B, D, L, RHO, box_body, free_trim_tan


def test_free_trim_kn_with_g_off_the_middle():
    """G at x 9.5 m (0.5 m aft of mid-length), 2 m up, 184.5 t (∇ = 180 m³, a = 1.5 m): the box
    trims by the stern (tanψ ≈ 0.024).  At 0°, 5°, 10° and 15° it stays wall-sided (checked:
    0 < h < D at the four corners), so KN and tanψ follow the closed forms above.  Tolerance
    1e-7 m on KN: the trim is solved to |R| ≤ 1e-8 m and the sections are integrated exactly
    (plane sections of a box: Simpson is exact for the quadratics in x involved)."""
    heels = np.array([0.0, 5.0, 10.0, 15.0])
    a = 180.0 / (L * B)
    cc = cross_curves(box_body(), np.array([184.5]), heels, RHO, "free trim", 9.5, 2.0)
    for k, heel in enumerate(heels):
        th = math.radians(heel)
        t = free_trim_tan(a, th, 9.5, 2.0)
        b = -t / math.cos(th)
        corners = [a + b * (x - L / 2) + y * math.tan(th) for x in (0.0, L) for y in (-B / 2, B / 2)]
        assert 0.0 < min(corners) and max(corners) < D
        y_b = math.tan(th) * B * B / (12 * a)
        z_b = (a * a + b * b * L * L / 12 + math.tan(th) ** 2 * B * B / 12) / (2 * a)
        assert cc.kn_m[0, k] == pytest.approx(y_b * math.cos(th) + z_b * math.sin(th), abs=1e-7)
        assert math.tan(cc.trim_rad[0, k]) == pytest.approx(t, abs=1e-8)
    # the trim raises z_B by b²L²/(24a) ≈ 0.006 m: KN at 15° differs from the even-keel one
    # ((a² + tan²θ·B²/12)/(2a)·sinθ + y_B·cosθ) by ≈ 0.0016 m, far more than the tolerance
    th = math.radians(15.0)
    even = (math.tan(th) * B * B / (12 * a)) * math.cos(th) + (a * a + math.tan(th) ** 2 * B * B / 12) / (2 * a) * math.sin(th)
    assert abs(cc.kn_m[0, 3] - even) > 1e-3


def test_a_cross_curve_result_carries_its_axes():
    """The tables written from a result (cli/tables.py) take its displacements and heels from it:
    they are the ones asked for, as float arrays."""
    cc = cross_curves(box_body(), [123.0, 184.5], [0.0, 10.0, 20.0], RHO, "even keel")
    assert cc.displacement_t.dtype == float and cc.heel_deg.dtype == float
    np.testing.assert_array_equal(cc.displacement_t, [123.0, 184.5])
    np.testing.assert_array_equal(cc.heel_deg, [0.0, 10.0, 20.0])
    assert cc.kn_m.shape == (2, 3)


def test_a_free_trim_refusal_names_the_case_furthest_from_equilibrium():
    """G 30 m abaft the AP of the 20 m box: B can never come under it (as in
    test_reference_geometry_openings.py).  The cases are solved side by side, each on its own,
    so each one's residual after the 40 steps is the one it has when solved alone; asked for
    both 120 m³ (123 t) and 180 m³ (184.5 t) at 30°, the refusal names the case whose residual
    is the larger, here the second one: not simply the first case."""
    body = box_body()

    def refusal(disps):
        with pytest.raises(NoEquilibriumError) as ei:
            cross_curves(body, np.array(disps), np.array([30.0]), RHO, "free trim", -30.0, 2.0)
        return str(ei.value)

    def residual(msg):
        return abs(float(msg.split("(residual ")[1].split(" m after")[0]))

    alone = {d: refusal([d]) for d in (123.0, 184.5)}
    worst = max(alone, key=lambda d: residual(alone[d]))
    assert residual(alone[184.5]) > residual(alone[123.0])  # so the named case is not the first
    both = refusal([123.0, 184.5])
    assert both == alone[worst]
    assert both.startswith(f"free-trim equilibrium not found at volume {worst / RHO:.2f} m³, heel 30° (residual ")
