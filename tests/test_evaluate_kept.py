"""What the evaluation keeps from one call to the next gives the results it would make afresh.

A condition edited on the screen changes one item at a time, and every evaluation resolves
every tank, treats its free surface and fits the KN curves against displacement.  These are
kept (``functools.lru_cache``): a tank's contents for its fill (``loading.resolve_tank``),
its free-surface treatment and result line for those contents (``free_surface._actual_treatment``,
``stability._tank_result``), the displacement spline of a KN table (``gz._displacement_spline``)
and the matrix that turns a row of KN at the tabulated heels into KN on the fine grid
(``gz._heel_weights``: the natural spline is linear in the row it goes through).
The model's tanks and tables compare as themselves (``@frozen(eq=False)``) and are immutable,
so a kept value is keyed by the very object it was made from.

No outside reference here: the check is that keeping changes nothing, to the last bit (the fine-grid
matrix: to rounding, against the spline fitted to each row afresh).
"""

from __future__ import annotations

import json

import pytest

from deckload.core import free_surface, gz, loading, stability
from deckload.core.model import Condition, TankFill
from deckload.core.stability import evaluate
from deckload.core.tables import CubicSpline
from deckload.io import paths
from deckload.io.profiles import load_condition
from demo_vessels import demo_vessel
from vessel_factories import box_barge, box_tank

KEPT = (loading.resolve_tank, free_surface._actual_treatment, stability._tank_result, gz._displacement_spline,
        gz._heel_weights)


def _forget() -> None:
    for cache in KEPT:
        cache.cache_clear()


def _doc(result) -> str:
    return json.dumps(result.to_json_dict(), sort_keys=True, allow_nan=True)


@pytest.mark.parametrize("fs_rule", ["is2008", "actual"])
def test_a_walk_of_edits_gives_the_results_made_afresh(fs_rule):
    """Each tank of the demo vessel's departure condition nudged in turn, down then up, under
    both free-surface rules: the result with what earlier evaluations kept equals the result
    with nothing kept, field for field."""
    vessel = demo_vessel()
    condition = load_condition(paths.DEMO_CONDITIONS["departure"], vessel).replace(fs_rule=fs_rule)
    walk = [condition]
    for tank in vessel.tanks[:12]:
        fill = next((f for f in walk[-1].tanks if f.tank_id == tank.id), None)
        pct = fill.value if fill is not None and fill.quantity == "percent" else 50.0
        for value in (max(0.0, pct - 7.0), min(100.0, pct + 3.0)):
            tanks = tuple(f for f in walk[-1].tanks if f.tank_id != tank.id) + (TankFill(tank.id, "percent", value),)
            walk.append(walk[-1].replace(tanks=tanks))
    warm = [_doc(evaluate(vessel, c)) for c in walk]
    warm += [_doc(evaluate(vessel, c)) for c in reversed(walk)]  # every one of them kept by now
    cold = []
    for c in walk + walk[::-1]:
        _forget()
        cold.append(_doc(evaluate(vessel, c)))
    assert warm == cold


def test_a_tank_is_kept_as_itself_not_by_its_name():
    """Two vessels with a tank of the same id and fill but of other sizes: each gets its own
    contents (8 × 4.5 × 0.8 m against 8 × 3 × 0.8 m at 50 %: 14.4 m³ against 9.6 m³)."""
    wide = box_tank("DB1S", length_m=8.0, breadth_m=4.5, height_m=0.8, lcg_m=10.0, tcg_m=2.5)
    narrow = box_tank("DB1S", length_m=8.0, breadth_m=3.0, height_m=0.8, lcg_m=10.0, tcg_m=2.5)
    fill = TankFill("DB1S", "percent", 50.0)
    a = loading.resolve_tank(wide, fill)
    b = loading.resolve_tank(narrow, fill)
    assert a.tank is wide and b.tank is narrow
    assert a.volume_m3 == pytest.approx(14.4) and b.volume_m3 == pytest.approx(9.6)
    assert loading.resolve_tank(wide, fill) is a  # kept


def test_a_fill_that_does_not_fit_is_refused_every_time():
    """A refusal is not kept as an answer: the same over-full fill is refused again."""
    tank = box_tank("DB1S", length_m=8.0, breadth_m=4.5, height_m=0.8, lcg_m=10.0, tcg_m=2.5)
    for _ in range(2):
        with pytest.raises(loading.LoadingError, match="outside 0–100 %"):
            loading.resolve_tank(tank, TankFill("DB1S", "percent", 120.0))


def test_the_kept_displacement_spline_is_the_one_fitted_afresh():
    """KN at displacements between the rows of the demo vessel's cross curves, bit for bit."""
    cc = demo_vessel().cross_curves
    lo, hi = float(cc.displacement_t[0]), float(cc.displacement_t[-1])
    fresh = CubicSpline.fit(cc.displacement_t, cc.kn_m, end="not-a-knot")
    for k in range(1, 20):
        d = lo + (hi - lo) * k / 20.0
        assert gz.kn_row(cc, d).tolist() == fresh(d).tolist()
    assert gz._displacement_spline(cc) is gz._displacement_spline(cc)


def test_an_empty_barge_condition_is_not_confused_with_a_loaded_one():
    """The same barge evaluated loaded, empty, then loaded again: the first and the last agree,
    the empty one differs by the tank's half capacity of ballast (Δ = Σw, standards.md §6.3)."""
    tank = box_tank("DB1S", length_m=8.0, breadth_m=4.5, height_m=0.8, lcg_m=10.0, tcg_m=2.5)
    vessel = box_barge(lightship_t=400.0, lightship_kg_m=3.0, lightship_lcg_m=20.0, tanks=(tank,))
    loaded = Condition(name="loaded", tanks=(TankFill("DB1S", "percent", 50.0),))
    empty = Condition(name="empty", tanks=())
    first, nothing, last = (evaluate(vessel, c) for c in (loaded, empty, loaded))
    assert _doc(first) == _doc(last)
    assert first.displacement_t - nothing.displacement_t == pytest.approx(tank.capacity_m3 * 0.5 * tank.density_t_m3)


def test_kn_on_the_fine_grid_is_the_spline_through_the_row_to_rounding():
    """``heel_curve`` as one product with the kept matrix against the natural spline fitted to the
    row afresh (``CubicSpline.fit``): any row, not only KN rows, on a table to 90° and on one that
    stops at 60° (the grid stops there too).  Both are the same linear map of the row, evaluated
    in another order: they agree to a few units of the last place (1e-12 m here)."""
    import numpy as np

    from vessel_factories import box_barge_cross_curves

    rng = np.random.default_rng(20261203)
    whole = demo_vessel().cross_curves
    short = box_barge_cross_curves()
    cut = np.flatnonzero(short.heel_deg <= 60.0)
    short = type(short)(short.heel_deg[cut], short.displacement_t, short.kn_m[:, cut])
    for cc in (whole, short):
        n_grid = gz.grid_points(cc)
        for _ in range(25):
            row = rng.normal(0.0, 3.0, len(cc.heel_deg))
            fresh = CubicSpline.fit(cc.heel_deg, row)(gz.FINE_DEG[:n_grid])
            kept = gz.heel_curve(cc, row)
            assert kept.shape == fresh.shape == (n_grid,)
            assert np.max(np.abs(kept - fresh)) < 1e-12
        assert gz._heel_weights(cc) is gz._heel_weights(cc) and not gz._heel_weights(cc).flags.writeable
