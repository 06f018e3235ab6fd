"""The intercepts of a constant heeling lever with the GZ curve, on curves small enough to do by hand.

The weather criterion (IS Code 2008 Part A 2.3, standards.md §2.1 [C]) needs θ0 (GZ rises
through lw1), the first intercept θr of lw2 and the second intercept θc (GZ falls through lw2).
weather.Curve finds them on the curve's grid by linear interpolation: a crossing is where
GZ − lever CHANGES SIGN, from below to above (rising) or above to below (falling).  These
curves are piecewise linear with values exact in binary, so every expected angle below is
exact: derived in each docstring, compared with a tolerance of 1e-12° (float rounding only).
They are not ship curves; they pin the rule at the places a mistake would hide: a lever met
exactly at a grid point, a lever touched but not crossed, a segment that lies above the lever
before the crossing, and a crossing exactly at the start of the search.
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core import weather as wx

EXACT = 1e-12  # degrees; the data are exact binary fractions, so only float rounding remains


def _curve(heel, gz) -> wx.Curve:
    return wx.Curve(np.array(heel, dtype=float), np.array(gz, dtype=float))


def test_rising_crossing_is_the_first_sign_change_after_the_start():
    """Heel −20…20° by 10°, GZ 0.75, 0.625, 0, 0.25, 0.75 m, lever 0.5 m:
    GZ − lever = 0.25, 0.125, −0.5, −0.25, 0.25.  GZ is above the lever on the windward side
    (it never rises through it there) and rises through it only between 10° and 20°:
    x = 10 + 10·0.25/(0.25 + 0.25) = 15°.  Searched from 0°, from 15° itself (a crossing at the
    start counts) and from 15° + 1e-12° (within the method's 1e-12° rounding allowance)."""
    c = _curve([-20, -10, 0, 10, 20], [0.75, 0.625, 0.0, 0.25, 0.75])
    assert c.crossing(0.5, 0.0, rising=True) == pytest.approx(15.0, abs=EXACT)
    assert c.crossing(0.5, 15.0, rising=True) == pytest.approx(15.0, abs=EXACT)
    assert c.crossing(0.5, 15.0 + 1e-12, rising=True) == pytest.approx(15.0, abs=EXACT)
    assert c.crossing(0.5, 15.5, rising=True) is None  # nothing rises through it after 15°


def test_a_lever_met_exactly_at_a_grid_point_is_found_there():
    """GZ 0, 0.5, 1.0, 1.5 m at 0, 10, 20, 30°, lever 0.5: GZ − lever = −0.5, 0, 0.5, 1.0 — it
    reaches zero AT 10° and is above after: the rising crossing is 10°.  Falling, GZ 1.0, 0.5,
    0, −0.5: GZ − lever = 0.5, 0, −0.5, −1.0 — the falling crossing is 10°."""
    up = _curve([0, 10, 20, 30], [0.0, 0.5, 1.0, 1.5])
    assert up.crossing(0.5, 0.0, rising=True) == pytest.approx(10.0, abs=EXACT)
    down = _curve([0, 10, 20, 30], [1.0, 0.5, 0.0, -0.5])
    assert down.crossing(0.5, 0.0, rising=False) == pytest.approx(10.0, abs=EXACT)


def test_a_lever_touched_but_not_crossed_is_no_intercept():
    """Rising: GZ 0, 1.0, 0.5, 1.0, 1.5 at 0…40°, lever 0.5: GZ − lever = −0.5, 0.5, 0, 0.5, 1.0.
    It rises through the lever at 5°; at 20° it comes down to touch it and goes up again — no
    sign change, so searched from 15° there is no rising crossing (None).
    Falling: GZ 0, 0.5, 0, −0.5 at 0…30°, lever 0.5: GZ − lever = −0.5, 0, −0.5, −1.0 — it touches
    the lever at 10° from below and goes back down: never above, so no falling crossing."""
    touch_above = _curve([0, 10, 20, 30, 40], [0.0, 1.0, 0.5, 1.0, 1.5])
    assert touch_above.crossing(0.5, 0.0, rising=True) == pytest.approx(5.0, abs=EXACT)
    assert touch_above.crossing(0.5, 15.0, rising=True) is None
    touch_below = _curve([0, 10, 20, 30], [0.0, 0.5, 0.0, -0.5])
    assert touch_below.crossing(0.5, 0.0, rising=False) is None


def test_the_windward_equilibrium_is_the_last_rising_crossing_below_the_end():
    """θ0 to windward (a ship listed to windward more than the wind heels her, weather.py):
    the LARGEST angle ≤ end where GZ − lever rises through zero.  Heel −40…0° by 10°, GZ 0, 1.0,
    0.5, 1.0, 1.5 m, lever 0.5: GZ − lever = −0.5, 0.5, 0, 0.5, 1.0.  The only sign change from
    below to above is between −40° and −30°: x = −40 + 10·0.5/(0.5 + 0.5) = −35°.  At −20° GZ
    comes down to touch the lever and rises again: no crossing.  Searched up to 0°, up to −35°
    itself (a crossing at the end counts), up to −35° − 1e-12° (the method's rounding allowance)
    and up to −35.5° (none)."""
    c = _curve([-40, -30, -20, -10, 0], [0.0, 1.0, 0.5, 1.0, 1.5])
    assert c.last_below(0.5, 0.0, rising=True) == pytest.approx(-35.0, abs=EXACT)
    assert c.last_below(0.5, -35.0, rising=True) == pytest.approx(-35.0, abs=EXACT)
    assert c.last_below(0.5, -35.0 - 1e-12, rising=True) == pytest.approx(-35.0, abs=EXACT)
    assert c.last_below(0.5, -35.5, rising=True) is None


def test_the_windward_equilibrium_at_a_grid_point():
    """Heel −30…0° by 10°, GZ −1.0, 0, 0.5, 1.0 m, lever 0.5: GZ − lever = −1.5, −0.5, 0, 0.5 —
    zero AT −10°, above after: the rising crossing is −10°."""
    c = _curve([-30, -20, -10, 0], [-1.0, 0.0, 0.5, 1.0])
    assert c.last_below(0.5, 0.0, rising=True) == pytest.approx(-10.0, abs=EXACT)


def test_area_between_lever_and_curve_on_a_straight_curve():
    """∫ (GZ − lever) dφ on GZ = 0.05·φ(deg) m (heel 0…40° by 10°), lever 0.5 m, from 10° to 30°:
    ∫ 0.05·φ dφ − 0.5·20 = 0.025·(900 − 100) − 10 = 10 m·deg = 10·π/180 m·rad (the trapezoid
    rule is exact on a straight line).  Over an empty interval (10° to 10°) the integral is 0."""
    c = _curve([0, 10, 20, 30, 40], [0.0, 0.5, 1.0, 1.5, 2.0])
    assert c.area_between(0.5, 10.0, 30.0) == pytest.approx(10.0 * np.pi / 180.0, abs=1e-12)
    assert c.area_between(0.5, 10.0, 10.0) == 0.0


def test_weather_areas_on_a_straight_curve_with_a_roll_past_its_first_angle():
    """The procedure of standards.md §2.1 [C] (IS 2008 A 2.3.1.4: a from θ0 − θ1 to the first
    intercept of lw2, b from there to θ2 = min(θf, 50°, θc)) on GZ = 0.01·φ(deg) m, −20…60° by 10°.
    lw1 = 0.05 → θ0 = 5°; lw2 = 1.5·lw1 = 0.075 (1.5 from memory [M]) → θr = 7.5°; GZ never falls
    back, so no θc and θ2 = 50°.  A roll θ1 = 30° would start a at −25°, before the curve's first
    angle: a starts at −20° (nothing is known beyond the curve).  In m·deg:
      a = −∫_{−20}^{7.5} (0.01φ − 0.075) dφ = −[0.005·(56.25 − 400) − 0.075·27.5] = 3.78125,
      b =  ∫_{7.5}^{50} (0.01φ − 0.075) dφ = 0.005·(2500 − 56.25) − 0.075·42.5 = 9.03125;
    ×π/180 for m·rad.  Tolerance 1e-9: the trapezoid rule is exact on a straight line, only float
    rounding (of 0.01·φ and the interpolated intercepts) remains."""
    deg = [-20, -10, 0, 10, 20, 30, 40, 50, 60]
    c = _curve(deg, [0.01 * d for d in deg])
    f = wx.weather_areas(c, 0.05, 30.0, None, 60.0)
    assert f.lw2_m == pytest.approx(0.075, abs=1e-15)
    assert f.theta0_deg == pytest.approx(5.0, abs=1e-9)
    assert f.theta_r_deg == pytest.approx(7.5, abs=1e-9)
    assert f.theta_c_deg is None and f.theta2_deg == 50.0
    assert f.area_a_mrad == pytest.approx(3.78125 * np.pi / 180.0, abs=1e-9)
    assert f.area_b_mrad == pytest.approx(9.03125 * np.pi / 180.0, abs=1e-9)


def test_a_light_wind_heels_her_less_than_a_degree():
    """A stiff ship in a light wind: the same straight curve GZ = 0.01·φ(deg) m, lw1 = 0.005 m
    → θ0 = 0.5° (to leeward: GZ(0) = 0 < lw1, searched from 0°); lw2 = 0.0075 → θr = 0.75°."""
    deg = [-20, -10, 0, 10, 20, 30, 40, 50, 60]
    f = wx.weather_areas(_curve(deg, [0.01 * d for d in deg]), 0.005, 10.0, None, 60.0)
    assert f.theta0_deg == pytest.approx(0.5, abs=1e-9)
    assert f.theta_r_deg == pytest.approx(0.75, abs=1e-9)


def test_when_gz_at_upright_exceeds_lw1_theta0_is_searched_to_windward_only():
    """weather.py's rule: GZ(0) ≥ lw1 puts θ0 to windward (the last rising crossing at or below
    0°), never to leeward.  Heel −20, −10, 0, 0.5, 1, 10°, GZ −0.5, 0.25, 0.75, 0.25, 1.0, 1.5 m,
    lw1 0.5: GZ − lw1 = −1, −0.25, 0.25, −0.25, 0.5, 1.0.  To windward it rises through lw1 at
    x = −10 + 10·0.25/0.5 = −5°; the rising crossing at 0.5 + 0.5·0.25/0.75 = 0.667° lies to
    leeward and is not θ0."""
    c = _curve([-20, -10, 0, 0.5, 1, 10], [-0.5, 0.25, 0.75, 0.25, 1.0, 1.5])
    assert wx.weather_areas(c, 0.5, 5.0, None, 10.0).theta0_deg == pytest.approx(-5.0, abs=EXACT)


def test_a_flooding_angle_before_the_gust_intercept_leaves_no_area_b():
    """θ2 = min(θf, 50°, θc) (A.749 3.2.2.1 [C]); b runs from θr to θ2.  On the straight curve
    above (θr = 7.5°) a flooding angle θf = 6° gives θ2 = 6° < θr: there is no area b (0), and
    a is unchanged, 3.78125 m·deg (tolerance as above)."""
    deg = [-20, -10, 0, 10, 20, 30, 40, 50, 60]
    f = wx.weather_areas(_curve(deg, [0.01 * d for d in deg]), 0.05, 30.0, 6.0, 60.0)
    assert f.theta2_deg == 6.0
    assert f.area_b_mrad == 0.0
    assert f.area_a_mrad == pytest.approx(3.78125 * np.pi / 180.0, abs=1e-9)


def test_no_wind_and_no_roll_leave_no_area_a():
    """The calm limit: lw1 = lw2 = 0 and θ1 = 0 on the straight curve GZ = 0.01·φ(deg).
    θ0 = θr = 0° (GZ rises through 0 at upright), so area a, from θ0 − θ1 = 0° to θr = 0°, is 0;
    b = ∫_0^50 0.01·φ dφ = 0.005·2500 = 12.5 m·deg (×π/180 for m·rad; tolerance as above)."""
    deg = [-20, -10, 0, 10, 20, 30, 40, 50, 60]
    f = wx.weather_areas(_curve(deg, [0.01 * d for d in deg]), 0.0, 0.0, None, 60.0)
    assert f.theta0_deg == pytest.approx(0.0, abs=EXACT) and f.theta_r_deg == pytest.approx(0.0, abs=EXACT)
    assert f.area_a_mrad == 0.0
    assert f.area_b_mrad == pytest.approx(12.5 * np.pi / 180.0, abs=1e-9)


def test_without_a_roll_angle_theta0_is_still_found():
    """GM not positive: no roll period, so θ1 is None (weather.py) and a, b cannot be found;
    θ0 does not depend on θ1 and is still the intercept of lw1: 0.01·φ = 0.05 → 5°."""
    deg = [-20, -10, 0, 10, 20, 30, 40, 50, 60]
    f = wx.weather_areas(_curve(deg, [0.01 * d for d in deg]), 0.05, None, None, 60.0)
    assert f.theta0_deg == pytest.approx(5.0, abs=1e-9)
    assert f.theta_r_deg is None and f.area_a_mrad is None and f.area_b_mrad is None


def test_gz_that_never_reaches_the_gust_lever_has_area_a_to_the_end_and_no_b():
    """GZ = 0.004·φ(deg) m up to 10°, then a plateau of 0.04 m to 60° (grid −20…60° by 10°);
    lw1 = 0.03 → θ0 = 7.5°; lw2 = 0.045 is above the greatest GZ: no θr, area b nil, and area a
    runs from θ0 − θ1 = 7.5 − 2.5 = 5° to the curve's end, 60° (in m·deg):
      a = −[∫_5^10 (0.004φ − 0.045) dφ + ∫_10^60 (0.04 − 0.045) dφ]
        = −[0.002·(100 − 25) − 0.045·5 − 0.005·50] = −[0.15 − 0.225 − 0.25] = 0.325.
    Tolerance 1e-9 m·rad: straight pieces meeting at grid points, float rounding only."""
    deg = [-20, -10, 0, 10, 20, 30, 40, 50, 60]
    gz = [0.004 * d if d <= 10 else 0.04 for d in deg]
    f = wx.weather_areas(_curve(deg, gz), 0.03, 2.5, None, 60.0)
    assert f.theta0_deg == pytest.approx(7.5, abs=1e-9)
    assert f.theta_r_deg is None and f.area_b_mrad == 0.0
    assert f.lw2_m == pytest.approx(0.045, abs=1e-15)  # 1.5·lw1 (the 1.5 from memory [M]); printed in the note
    assert f.area_a_mrad == pytest.approx(0.325 * np.pi / 180.0, abs=1e-9)


def test_the_second_intercept_close_after_the_first():
    """θc, the second intercept of lw2 (A.749 3.2.2.1 [C]), found even within a degree of θr:
    heel −10, 0, 0.5, 1, 10°, GZ −1, 0, 1, 0, −1 m (a narrow hump), lw1 = 0.2 → θ0 = 0.1°,
    lw2 = 0.3 → θr = 0.15°; GZ falls back through 0.3 at 0.5 + 0.5·0.7/1.0 = 0.85° = θc = θ2."""
    f = wx.weather_areas(_curve([-10, 0, 0.5, 1, 10], [-1.0, 0.0, 1.0, 0.0, -1.0]), 0.2, 0.05, None, 10.0)
    assert f.theta0_deg == pytest.approx(0.1, abs=1e-9)
    assert f.theta_r_deg == pytest.approx(0.15, abs=1e-9)
    assert f.theta_c_deg == pytest.approx(0.85, abs=1e-9) and f.theta2_deg == pytest.approx(0.85, abs=1e-9)
