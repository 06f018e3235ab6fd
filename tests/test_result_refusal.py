"""The evaluation's last step (deckload/core/bounds.py ``checked_result``): a result holding a
number that is not finite, or an end draft outside the upright tables, is refused with a message
naming the number; every other result passes unchanged.  The results are the hand-built display
fixture of test_result_record.py with one field spoiled at a time; the vessel is the analytic
box barge of vessel_factories (tables to a draft of 3.5 m, Δ up to 1435 t).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.bounds import BeyondTablesError, NonFiniteResultError, checked_result, lightship_mass_range
from deckload.core.result import WeatherResult
from test_result_record import MET, _result
from vessel_factories import box_barge

VESSEL = box_barge()
OK = dataclasses.replace(_result((MET,)), draft_aft_m=3.2, draft_fwd_m=2.9, trim_m=0.3)
WEATHER = WeatherResult(
    wind_pressure_pa=504.0, windage_area_m2=120.0, windage_lever_m=3.0, lw1_m=0.015, lw2_m=0.0225,
    theta0_deg=0.7, theta0_limit_deg=16.0, theta1_deg=16.7, theta2_deg=50.0, theta_c_deg=None,
    area_a_mrad=0.06, area_b_mrad=0.5, roll_period_s=7.7, k=0.7, x1=0.83, x2=1.0, r=0.73, s=0.095)


def refused(result) -> str:
    with pytest.raises(NonFiniteResultError) as e:
        checked_result(VESSEL, result)
    return str(e.value)


def test_a_sound_result_passes_unchanged():
    assert checked_result(VESSEL, OK) is OK
    with_weather = dataclasses.replace(OK, weather=WEATHER, gz_m=np.array([0.0, 0.1, 0.2]),
                                       kg_m=np.float64(4.9), list_deg=0)
    assert checked_result(VESSEL, with_weather) is with_weather


def test_a_sum_that_overflows_is_not_a_refusal():
    """Two finite numbers of 1e308 sum to infinity (IEEE 754): the quick check's sum overflows,
    the number-by-number check finds nothing wrong and the result passes."""
    r = dataclasses.replace(OK, displacement_t=1e308, lightship_t=1e308)
    assert checked_result(VESSEL, r) is r
    r = dataclasses.replace(OK, gz_m=(1e308, 1e308, 0.0))  # a tuple of floats is summed in one call
    assert checked_result(VESSEL, r) is r


@pytest.mark.parametrize("spoil, path", [
    (lambda r: dataclasses.replace(r, gm_fluid_m=math.nan), "gm_fluid_m"),
    (lambda r: dataclasses.replace(r, kg_m=np.float64("inf")), "kg_m"),
    (lambda r: dataclasses.replace(r, gz_m=(0.0, 0.1, -math.inf)), "gz_m[2]"),
    (lambda r: dataclasses.replace(r, gz_m=[0.0, math.nan, 0.2]), "gz_m[1]"),
    (lambda r: dataclasses.replace(r, gz_m=(0.0, np.float64("inf"), 0.2)), "gz_m[1]"),
    (lambda r: dataclasses.replace(r, gz_m=(0.0, None, math.inf)), "gz_m[2]"),
    (lambda r: dataclasses.replace(r, gz_m=np.array([0.0, math.nan, 0.2])), "gz_m[1]"),
    (lambda r: dataclasses.replace(r, tanks=(dataclasses.replace(r.tanks[0], fsm_tm=math.inf),)), "tanks[0].fsm_tm"),
    (lambda r: dataclasses.replace(r, weather=dataclasses.replace(WEATHER, lw1_m=math.nan)), "weather.lw1_m"),
    (lambda r: dataclasses.replace(r, items=[r.items[0], dataclasses.replace(r.items[0], vcg_m=math.nan)]),
     "items[1].vcg_m"),
])
def test_a_number_that_is_not_finite_is_refused_by_name(spoil, path):
    assert refused(spoil(OK)) == (f"the computed {path} is not a finite number: the result is refused "
                                  "(check the condition's masses and positions)")


def test_end_drafts_outside_the_tables_are_refused():
    with pytest.raises(BeyondTablesError) as e:
        checked_result(VESSEL, dataclasses.replace(OK, draft_aft_m=-0.01, trim_m=-2.91))
    assert str(e.value) == ("draft aft -0.01 m (trim -2.91 m) is outside 0–3.5 m, the range the upright "
                            "hydrostatic tables describe: this condition cannot be assessed from them "
                            "(check the positions and masses of the loads)")
    with pytest.raises(BeyondTablesError) as e:
        checked_result(VESSEL, dataclasses.replace(OK, draft_fwd_m=3.6, trim_m=-0.4))
    assert str(e.value).startswith("draft forward 3.6 m (trim -0.4 m) is outside 0–3.5 m")
    # the ends of the range are inside
    r = dataclasses.replace(OK, draft_aft_m=3.5, draft_fwd_m=0.0, trim_m=3.5)
    assert checked_result(VESSEL, r) is r


def test_lightship_mass_bound_names_its_reason():
    """The barge's greatest tabulated displacement: 1.025·40·10·3.5 = 1435 t (checks.md §1.1 form)."""
    rule = lightship_mass_range(VESSEL).rule(1500.0)
    assert rule == ("above the physical limit: must be between 28.7 and 1435 t (from 2 % of the greatest "
                    "displacement in the hydrostatic table to all of it)")


def test_a_bad_number_beside_numpy_values_is_still_found():
    """A numpy array or scalar among the fields does not end the check: a NaN in another field
    is still refused by name."""
    r = dataclasses.replace(OK, gz_m=np.array([0.0, 0.1, 0.2]), gm_fluid_m=math.nan)
    assert "the computed gm_fluid_m is not a finite number" in refused(r)
    r = dataclasses.replace(OK, kg_m=np.float64(4.9), displacement_t=math.nan)
    assert "the computed displacement_t is not a finite number" in refused(r)
