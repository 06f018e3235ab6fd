"""The equilibrium (list) angle and the vanishing angle read from a GZ curve, against closed forms.

``gz.facts`` works on GZ sampled every 0.1° and finds a zero crossing by linear interpolation
between the two grid points that bracket it.  Each curve below has a root known in closed form:
* GZ(φ) = GM·sinφ − t·cosφ (a vessel with G off the centreline by t, wall-sided near upright,
  common practice) is zero at tanφ = t/GM;
* GZ(φ) = sinφ·(φ° − φ0) is zero at 0° and at φ0;
* GZ(φ) = −0.1 − 0.2·sinφ is negative everywhere (no equilibrium on the curve: she lies over).
The expected value is the linear root between the bracketing grid points (to 1e-12), and the
exact root lies within the same 0.1° step (a smaller bound is given where the curve is nearly
straight over the step).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.gz import FINE_DEG, FINE_RAD, facts


def _linear_root(gz: np.ndarray, k: int) -> float:
    g0, g1 = gz[k], gz[k + 1]
    return float(FINE_DEG[k] + 0.1 * g0 / (g0 - g1))


def test_a_list_smaller_than_one_grid_step_is_found_not_rounded_to_upright():
    """t = GM·tan 0.05°: the curve crosses zero at 0.05°, between the first two grid points."""
    gm = 0.5
    t = gm * math.tan(math.radians(0.05))
    gz = gm * np.sin(FINE_RAD) - t * np.cos(FINE_RAD)
    assert gz[0] < 0 < gz[1]
    f = facts(gz)
    assert f.equilibrium_deg == pytest.approx(0.05, abs=1e-5)
    assert f.equilibrium_deg == pytest.approx(_linear_root(gz, 0), abs=1e-12)


def test_a_curve_starting_at_zero_and_falling_first_has_its_equilibrium_where_it_rises_again():
    """GZ = sinφ·(φ° − 0.15): zero at 0°, negative to 0.15°, positive after: she lists to 0.15°."""
    gz = np.sin(FINE_RAD) * (FINE_DEG - 0.15)
    assert gz[0] == 0.0 and gz[1] < 0 < gz[2]
    f = facts(gz)
    # sinφ doubles from 0.1° to 0.2°: the chord's root is 0.133°, within the step that holds 0.15°
    assert 0.1 < f.equilibrium_deg < 0.2
    assert f.equilibrium_deg == pytest.approx(_linear_root(gz, 1), abs=1e-12)


def test_a_curve_negative_everywhere_has_no_equilibrium_and_no_vanishing_angle():
    """GZ = −0.1 − 0.2·sinφ < 0 for every φ: no angle of equilibrium (None: no number stands for a
    heel beyond the curve), the largest GZ is the upright −0.1 m and there is no range of positive
    stability.  The same on a curve cut at 60° (KN tables that end there)."""
    gz = -0.1 - 0.2 * np.sin(FINE_RAD)
    f = facts(gz)
    assert f.equilibrium_deg is None
    assert facts(gz[:601]).equilibrium_deg is None and facts(gz[:601]).vanishing_angle_deg is None
    assert f.vanishing_angle_deg is None
    assert (f.max_gz_m, f.max_gz_angle_deg) == (pytest.approx(-0.1, abs=1e-12), 0.0)
