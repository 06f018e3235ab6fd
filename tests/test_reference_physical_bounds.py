"""Every physical bound of :mod:`deckload.core.bounds`, worked by hand for one box-shaped vessel.

The envelope is the program's own design rule (common practice for an envelope check, as the
module says beside each number): positions from 0.2·LBP aft of the AP to 0.2·LBP forward of the
FP, |y| ≤ B/2, z from the keel to depth + 30 m; a hull box of 1.2·LBP × B × (depth + 30 m); a
table trim within min(2·depth, LBP/5); an item at most the largest tabulated displacement less
the lightship.  The vessel here: LBP 40 m, B 10 m, depth 4 m, so by hand

* x: −0.2·40 = −8 m to 1.2·40 = 48 m;  y: ±10/2 = ±5 m;  z: 0 to 4 + 30 = 34 m;
* area: 48 × 10 = 480 m²;  volume: 48 × 10 × 34 = 16 320 m³;
* transfer moment of a 100 m³ tank: 100 · √(10² + 34²) = 100 · √1256 = 3544.01 m⁴;
* table trim: min(2·4, 40/5) = 8 m;  with depth 3 m: min(6, 8) = 6 m.

Each bound is checked at both edges (inclusive), just outside them, and by its message, which
the officer reads when a file or a keystroke is refused.
"""

from __future__ import annotations

import dataclasses
import math

import pytest

from deckload.core import bounds
from deckload.core.model import Particulars

BOX = Particulars(name="Box", lbp_m=40.0, breadth_m=10.0, depth_m=4.0, design_draft_m=2.5)


def _edges(r: bounds.Range, low: float, high: float, unit: str) -> None:
    assert (r.low, r.high, r.unit) == (pytest.approx(low, abs=1e-9), pytest.approx(high, abs=1e-9), unit)
    assert r.rule(low) is None and r.rule(high) is None  # closed interval
    assert low in r and high in r
    step = 1e-6 * max(1.0, abs(low), abs(high))
    assert r.rule(low - step).startswith("below the physical limit") and (low - step) not in r
    assert r.rule(high + step).startswith("above the physical limit") and (high + step) not in r


def test_the_rule_names_the_side_the_interval_and_the_reason():
    r = bounds.Range(1.0, 500.0, "m", "length between perpendiculars of a ship")
    assert r.rule(0.5) == ("below the physical limit: must be between 1 and 500 m "
                           "(length between perpendiculars of a ship)")
    assert r.rule(612.25) == ("above the physical limit: must be between 1 and 500 m "
                              "(length between perpendiculars of a ship)")
    assert r.rule(250) is None and 250 in r  # an int is a number too


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf, True, "12"])
def test_anything_but_a_finite_number_is_refused_by_name(bad):
    r = bounds.Range(0.0, 10.0, "t", "a reason")
    assert r.rule(bad) == "must be a finite number (a reason)"
    assert bad not in r


def test_particulars_bounds():
    """LBP 1–500 m; breadth and depth 0.2 m up to the LBP, and never above 100 m (common practice)."""
    lbp = bounds.lbp_range()
    _edges(lbp, 1.0, 500.0, "m")
    assert lbp.why == "length between perpendiculars of a ship"
    for make in (bounds.beam_range, bounds.depth_range):
        _edges(make(40.0), 0.2, 40.0, "m")
        _edges(make(150.0), 0.2, 100.0, "m")
        assert make(40.0).why == "0.2 m up to the LBP"


def test_position_bounds():
    x, y, z = bounds.x_range(BOX), bounds.y_range(BOX), bounds.z_range(BOX)
    _edges(x, -8.0, 48.0, "m")
    _edges(y, -5.0, 5.0, "m")
    _edges(z, 0.0, 34.0, "m")
    assert bounds.z_max_m(BOX) == pytest.approx(34.0, abs=1e-12)
    assert x.why == "from 0.2·LBP aft of the aft perpendicular to 0.2·LBP forward of the forward one"
    assert y.why == "within half the breadth of the centreline"
    assert z.why == "from the keel to 30 m above the depth"


def test_table_trim_bound_is_the_smaller_of_twice_the_depth_and_a_fifth_of_lbp():
    deep = bounds.table_trim_range(BOX)  # min(8, 8)
    _edges(deep, -8.0, 8.0, "m")
    shallow = bounds.table_trim_range(dataclasses.replace(BOX, depth_m=3.0))  # min(6, 8)
    _edges(shallow, -6.0, 6.0, "m")
    long_ = bounds.table_trim_range(dataclasses.replace(BOX, lbp_m=20.0))  # min(8, 4)
    _edges(long_, -4.0, 4.0, "m")
    assert deep.why == "within twice the depth and a fifth of LBP, by the head or by the stern"


def test_hull_box_bounds():
    assert bounds.box_length_m(BOX) == pytest.approx(48.0, abs=1e-12)
    area, volume = bounds.area_range(BOX), bounds.volume_range(BOX)
    _edges(area, 0.0, 480.0, "m²")
    _edges(volume, 0.0, 16320.0, "m³")
    assert area.why == "at most 1.2·LBP × breadth"
    assert volume.why == "at most the box 1.2·LBP × breadth × (depth + 30 m)"
    moment = bounds.transfer_moment_range(BOX, 100.0)
    r = 100.0 * math.sqrt(10.0 ** 2 + 34.0 ** 2)
    assert r == pytest.approx(3544.01, abs=0.01)  # the hand value above
    _edges(moment, -r, r, "m⁴")
    assert moment.why == "the tank's volume times the largest shift inside the hull"


def test_mass_bounds_are_the_largest_tabulated_displacement_less_the_lightship():
    """Read from the demo vessel's own tables: its largest tabulated Δ and its lightship mass."""
    from demo_vessels import demo_vessel

    v = demo_vessel()
    top = float(v.hydrostatics.displacement_t[-1])
    assert bounds.max_displacement_t(v) == top
    item = bounds.item_mass_range(v)
    _edges(item, 0.0, top - v.lightship.mass_t, "t")
    assert item.why == "at most the greatest displacement in the hydrostatic table less the lightship"
    light = bounds.lightship_mass_range(v)
    _edges(light, 0.02 * top, top, "t")  # from 2 % (MIN_LIGHTSHIP_FRACTION, common practice)
    heavy = dataclasses.replace(v, lightship=dataclasses.replace(v.lightship, mass_t=top + 5.0))
    _edges(bounds.item_mass_range(heavy), 0.0, 0.0, "t")  # never a negative upper bound


# --------------------------------------------------------------------------- the finiteness pass


@dataclasses.dataclass(frozen=True)
class _Inner:
    values: object
    label: str = "x"


@dataclasses.dataclass(frozen=True)
class _Outer:
    a: float
    inner: _Inner
    items: tuple
    flag: bool = True
    count: int = 3
    note: object = None


def _outer(**change):
    import numpy as np

    good = dict(a=1.5, inner=_Inner(np.array([0.0, 0.25, 1.0])), items=(2.0, [3.0, _Inner(4.0)], np.float64(0.5)))
    good.update(change)
    return _Outer(**good)


def test_the_quick_pass_accepts_every_finite_result_it_knows():
    """The quick pass answers True for a result whose every number is finite, through dataclasses,
    tuples, lists, float and integer arrays and numpy scalars (were it to answer False the slow
    pass would still clear it: this is what keeps a key's recomputation quick, issue 13)."""
    import numpy as np

    assert bounds._all_finite(_outer())
    assert bounds._all_finite(_outer(inner=_Inner(np.arange(5))))  # integer array
    assert bounds._all_finite(_outer(inner=_Inner(np.array([True, False]))))  # boolean array
    assert bounds._all_finite(_outer(note="a string", items=()))
    assert bounds._all_finite(_outer(inner=_Inner(np.array([1.0 + 2.0j]))))  # complex, finite


@pytest.mark.parametrize("where", ["top", "array", "nested list", "numpy scalar", "complex"])
@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf])
def test_the_quick_pass_never_accepts_a_non_finite_number(where, bad):
    """Anything infinite or not-a-number, wherever it sits, makes the quick pass answer False, and
    the refusal names its path (IEEE 754: a sum with an infinity or a NaN in it is not finite)."""
    import numpy as np

    change, path = {
        "top": (dict(a=bad), "a"),
        "array": (dict(inner=_Inner(np.array([0.0, bad]))), "inner.values[1]"),
        "nested list": (dict(items=(2.0, [3.0, _Inner(bad)])), "items[1][1].values"),
        "numpy scalar": (dict(items=(2.0, [3.0], np.float64(bad))), "items[2]"),
        "complex": (dict(inner=_Inner(np.array([1.0 + 0j, complex(bad, 0.0)]))), "inner.values[1]"),
    }[where]
    obj = _outer(**change)
    assert bounds._all_finite(obj) is False
    assert bounds._non_finite(obj, "") == path


def test_the_quick_pass_leaves_unknown_types_and_overflowing_sums_to_the_slow_one():
    """What the quick pass cannot vouch for (a type it does not know, an object array, a sum of
    finite numbers that overflows) it answers False, and the slow pass clears it when finite."""
    import numpy as np

    for obj in (_outer(note={"k": 1.0}), _outer(inner=_Inner(np.array([1.0, "a"], dtype=object))),
                _outer(items=(1e308, 1e308))):
        assert bounds._all_finite(obj) is False
        assert bounds._non_finite(obj, "") is None


def test_the_quick_pass_looks_once_at_a_frozen_record_it_found_finite(monkeypatch):
    """A frozen record of plain values, floats and tuples of floats that the quick pass found finite
    cannot change: a later result holding the same object is not looked into again (a key's result
    holds every unchanged tank's record from the one before), while a new record, even equal to it,
    is; a non-finite value in a new record or around the known ones is still caught."""
    from deckload.core.stability import evaluate
    from deckload.ui import entry
    from demo_vessels import demo_departure

    vessel, condition = demo_departure()
    first = evaluate(vessel, condition)
    second = evaluate(vessel, entry.nudge_tank(condition, vessel.tanks[0], 1.0, vessel))
    tank_type = type(first.tanks[0])
    read = []
    getter = bounds._FIELD_VALUES[tank_type]
    monkeypatch.setitem(bounds._FIELD_VALUES, tank_type, lambda o: read.append(o) or getter(o))
    bounds._KNOWN_FINITE.clear()
    assert bounds._all_finite(first)
    assert len(read) == len(first.tanks)
    read.clear()
    assert bounds._all_finite(second)
    new = [t for t in second.tanks if not any(t is k for k in first.tanks)]
    assert 1 <= len(new) < len(second.tanks) // 2 and read == new  # only the nudged tank's new record
    read.clear()
    copy = dataclasses.replace(second.tanks[3])  # equal, not the same object: looked at
    assert bounds._all_finite(dataclasses.replace(second, tanks=(copy,) + second.tanks[1:])) and read == [copy]
    bad = dataclasses.replace(second.tanks[3], mass_t=math.nan)
    assert bounds._all_finite(dataclasses.replace(second, tanks=(bad,) + second.tanks[1:])) is False
    assert bounds._all_finite(dataclasses.replace(second, displacement_t=math.inf)) is False
    assert bounds._non_finite(dataclasses.replace(second, tanks=second.tanks[:2] + (bad,)), "") == "tanks[2].mass_t"
