"""Results with the verdict fields filled by hand, for the tests of the views (screen, report, log, calc).

These are DISPLAY fixtures, not computations: they take a real ``evaluate()`` result
of the demo vessel and fill the verdict fields (criteria sets, what was not
assessed, the weather criterion) with hand-set values, so that the tests can check
that every view shows what the Result holds.  The engine's own tests check the
numbers.  The weather numbers are made to agree with the demo's GZ curve (θ0 and the
lw2 crossing are read off it here) so that the plots look like a real case.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from deckload.io import paths
from deckload.core.result import AssessedSet, CriterionResult, NotAssessed, Result, WeatherResult
from deckload.core.stability import evaluate
from deckload.io.profiles import load_condition
from demo_vessels import demo_vessel

A22 = AssessedSet("IS2008-A2.2", "IS Code 2008 Part A 2.2 general criteria", True)
A23 = AssessedSet("IS2008-A2.3", "IS Code 2008 Part A 2.3 severe wind and rolling", True)
NOT_ASSESSED = (
    NotAssessed("damage stability", "not computed by deckload"),
    NotAssessed("grain heeling moments", "not computed by deckload"),
    NotAssessed("icing", "not computed by deckload"),
    NotAssessed("longitudinal strength", "not computed by deckload"),
)


def demo(name: str = "departure"):
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS[name], vessel)
    return vessel, condition, evaluate(vessel, condition)


def _first_crossing(heel, gz, level, start):
    """First heel ≥ start where the curve reaches ``level`` going up (linear between points)."""
    for i in range(len(heel) - 1):
        if heel[i + 1] < start:
            continue
        if (gz[i] - level) <= 0 <= (gz[i + 1] - level):
            return heel[i] + (level - gz[i]) / (gz[i + 1] - gz[i]) * (heel[i + 1] - heel[i])
    return float(heel[-1])


def weather_for(r: Result, *, area_a_mrad: float = 0.0041, area_b_mrad: float = 0.0315) -> WeatherResult:
    """Hand-set weather numbers laid over the result's own GZ curve (display fixture)."""
    heel = np.asarray(r.gz_heel_deg)
    gz = np.asarray(r.gz_port_m if r.criteria_side == "port" else r.gz_m)
    lw1 = 504.0 * 128.0 * 3.4 / (1000 * 9.81 * r.displacement_t)  # P·A·Z/(1000·g·Δ), A and Z hand-set
    theta0 = _first_crossing(heel, gz, lw1, 0.0)
    return WeatherResult(
        wind_pressure_pa=504.0, windage_area_m2=128.0, windage_lever_m=3.4, lw1_m=lw1, lw2_m=1.5 * lw1,
        theta0_deg=theta0, theta0_limit_deg=16.0, theta1_deg=19.6, theta2_deg=36.0, theta_c_deg=None,
        area_a_mrad=area_a_mrad, area_b_mrad=area_b_mrad, roll_period_s=7.9, k=1.0, x1=0.98, x2=0.90,
        r=0.96, s=0.061, deck_edge_angle_deg=20.2,
    )


def with_verdict(r: Result, *, weather_fails: bool = False, unassessable: bool = False) -> Result:
    """``r`` with its A 2.2 criteria put in set A 2.2, a weather set added and the not-assessed list."""
    crit = []
    for c in r.criteria:
        if not c.id.startswith("IS2008-A2.2"):  # the engine's own weather criteria give way to the hand-set ones
            continue
        c = dataclasses.replace(c, set_id=A22.id)
        if unassessable and c.id.endswith("gz-30"):
            c = dataclasses.replace(c, assessed=False, passed=False, value=float("nan"),
                                    note="the KN tables end at 25°, before the angle this criterion needs")
        crit.append(c)
    w = weather_for(r, area_b_mrad=0.0030 if weather_fails else 0.0315)
    crit.append(CriterionResult(
        "IS2008-A2.3-area-b-a", "Weather: area b at least area a", w.area_b_mrad, w.area_a_mrad, "m·rad",
        ">=", not weather_fails, "IS Code 2008 Part A 2.3.1.2", set_id=A23.id))
    crit.append(CriterionResult(
        "IS2008-A2.3-theta0", "Weather: heel under steady wind θ0", w.theta0_deg, w.theta0_limit_deg, "deg",
        "<=", True, "IS Code 2008 Part A 2.3.1.1", set_id=A23.id))
    sets = (dataclasses.replace(A22, passed=not unassessable), dataclasses.replace(A23, passed=not weather_fails))
    return dataclasses.replace(
        r, criteria=tuple(crit), criteria_sets=sets, not_assessed=NOT_ASSESSED, weather=w,
        deck_edge_angle_deg=20.2, freeboard_m=4.5 - r.draft_mean_m, load_line_margin_m=2.9 - r.draft_mean_m,
    )


def demo_with_verdict(name: str = "departure", **kw):
    vessel, condition, r = demo(name)
    return vessel, condition, with_verdict(r, **kw)
