"""Edges of the GZ curve helpers: the area's refusal past the curve's end, curves that start flat or
only touch zero, and KN between three tabulated displacements.

Sources beside each check: closed forms derived in the docstrings (∫ sinφ dφ = 1 − cosφ; the
interpolating parabola through three points), the trapezoidal rule's error bound
(b − a)·h²/12·max|f''| (any numerical-analysis text), and definitions of the trade (common practice):
the equilibrium angle is the first angle from upright where GZ is zero going up; the angle of
vanishing stability is where a positive GZ falls back to zero, so a curve never above zero has none.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.gz import FINE_DEG, FINE_RAD, area_to, facts, kn_row
from deckload.core.model import CrossCurves, frozen_array
from deckload.core.tables import OutOfRangeError


def test_area_of_a_curve_ending_at_60_degrees_and_its_refusal_beyond():
    """GZ = sinφ (m) sampled to 60° (a KN table ending at 60°): ∫₀^60° sinφ dφ = 1 − cos60° = 0.5 m·rad.
    Trapezoids of h = 0.1° = 1.745e-3 rad err by at most (π/3)·h²/12·1 = 2.7e-7 m·rad.  Half a degree
    past the end there is no curve to integrate: the area is refused with the angle and the curve's
    range in the message (deckload never extrapolates)."""
    n = int(np.searchsorted(FINE_DEG, 60.0)) + 1
    gz = np.sin(FINE_RAD[:n])
    assert FINE_DEG[n - 1] == 60.0
    assert area_to(gz, 60.0) == pytest.approx(0.5, abs=3e-7)
    with pytest.raises(OutOfRangeError) as e:
        area_to(gz, 60.5)
    assert str(e.value) == "heel (GZ curve area) 60.5 deg is outside the table range 0–60 deg; deckload does not extrapolate"


def test_curve_flat_at_zero_for_the_first_degree_is_upright():
    """GZ = 0 from 0° to 1° (neutral over the first degree), then sin(φ − 1°) > 0: nowhere negative, so
    the first angle where GZ is zero going up is 0°, upright (common practice); the curve stays positive
    to 90°, so there is no vanishing angle on it."""
    gz = np.where(FINE_DEG <= 1.0, 0.0, np.sin(FINE_RAD - math.radians(1.0)))
    assert gz[0] == 0.0 and gz[1] == 0.0 and gz[11] > 0.0
    f = facts(gz)
    assert f.equilibrium_deg == 0.0
    assert f.vanishing_angle_deg is None
    # Largest at 90°: sin 89° (grid end, no parabola there).
    assert f.max_gz_m == pytest.approx(math.sin(math.radians(89.0)), abs=1e-12)


def test_curve_that_only_touches_zero_has_no_vanishing_angle():
    """GZ = −1e-4·(i − 300)² (m) at grid point i: negative everywhere except 0 at 30°, where it touches
    zero.  Never positive, so no range of positive stability and no vanishing angle (common practice);
    the largest GZ is 0 at 30° (the parabola through the three top points is the curve itself), and
    the equilibrium (first zero going up) is 30°."""
    i = np.arange(len(FINE_DEG), dtype=float)
    gz = -1e-4 * (i - 300.0) ** 2 + 0.0  # + 0.0 turns −0.0 at i = 300 into +0.0
    assert gz[300] == 0.0 and not np.signbit(gz[300])
    f = facts(gz)
    assert f.vanishing_angle_deg is None
    assert f.max_gz_m == 0.0
    assert f.max_gz_angle_deg == pytest.approx(30.0, abs=1e-9)
    assert f.equilibrium_deg == pytest.approx(30.0, abs=1e-9)


def test_kn_between_three_displacements_is_the_parabola_through_them():
    """Three KN rows (Δ = 1000, 2000, 3000 t) with KN = sinφ·(2 + 2e-3·Δ − 3e-7·Δ²): KN is a parabola
    in Δ at each heel.  A not-a-knot cubic through three points is that parabola (with one interior
    knot the not-a-knot condition makes both pieces one cubic; through three points and with the
    parabola satisfying every condition, uniqueness gives the parabola), so at Δ = 1500 t KN is
    sinφ·(2 + 3 − 0.675) = 4.325·sinφ, where a straight line between the rows would give
    sinφ·(4.7 + 4.8)/2 = 4.75·sinφ."""
    heels = np.array([0.0, 30.0, 60.0, 90.0])
    disp = np.array([1000.0, 2000.0, 3000.0])
    kn = np.outer(2.0 + 2e-3 * disp - 3e-7 * disp**2, np.sin(np.radians(heels)))
    cc = CrossCurves(frozen_array(heels), frozen_array(disp), frozen_array(kn))
    row = kn_row(cc, 1500.0)
    # 1e-9 m: exact arithmetic but for round-off in the spline's solve (~1e-15 m).
    assert row == pytest.approx(4.325 * np.sin(np.radians(heels)), abs=1e-9)
