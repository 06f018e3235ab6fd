"""A tank's contents from a percent, a volume, a mass, a sounding or an ullage (core/loading.py),
against the closed form of a wedge tank, and the weight sums against hand sums.

Wedge tank W (analytic, derived here).  A wing tank of length l = 5 m (x 30–35 m from AP), whose
section is the right triangle with corners (y, z) = (1, 0.5), (4, 2.5), (1, 2.5): a vertical
inboard side at y = 1 m, the shell sloping out from the lowest point (y = 1, z = 0.5) to
y = 4 m at the top, height h = 2 m, half-width w = 3 m.  At a level s above the lowest point
the liquid's section is the similar triangle of breadth b(s) = w·s/h = 1.5·s, so

* V(s) = l·b(s)·s/2 = 3.75·s² m³ (capacity V(2) = 15 m³);
* LCG = 32.5 m (a prism: the middle of its length);
* VCG = 0.5 + 2s/3 m and TCG = 1 + b(s)/3 = 1 + 0.5·s m (centroid of a triangle: the mean of
  its corners (1, 0.5), (1 + 1.5s, 0.5 + s), (1, 0.5 + s));
* free-surface inertia about the surface's own centreline i = l·b³/12 = 1.40625·s³ m⁴
  (rectangle of l × b, standards.md §4.3, textbook).

Its calibration table has rows at s = 0, 0.5, 1.0, 1.5, 2.0 m; between rows the program reads
the table linearly (tables.py, common practice for tank tables), so a reading on a row gives the
closed form to round-off and a reading halfway between two rows gives the mean of the rows.
Every column differs from every other, so a value read from the wrong column is seen.

Readings: the sounding's zero (the striking plate) is 0.1 m above the lowest point and the ullage
reference (the top of the sounding pipe) 3.0 m above it, so level = sounding + 0.1 =
3.0 − ullage (loading.level_of).  The table's levels 0–2 m are therefore soundings −0.1–1.9 m
and ullages 1.0–3.0 m.

Tolerance EXACT = 1e-12: every expected value is a closed form on a table row, or the mean of two
rows, computed in a few floating-point operations on numbers of order 1–40.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.core.loading import (
    LoadingError,
    TankContents,
    level_of,
    over_limit,
    reading_range,
    resolve_tank,
    resolve_tanks,
    sum_weights,
    volume_of,
)
from deckload.core.model import Condition, Tank, TankCalibration, TankFill, frozen_array
from deckload.core.result import ItemResult
from vessel_factories import box_barge, box_tank

EXACT = 1e-12
S = (0.0, 0.5, 1.0, 1.5, 2.0)


def v_of(s: float) -> float:
    return 3.75 * s * s


def row_of(s: float) -> tuple[float, float, float, float, float, float]:
    """(level, V, LCG, VCG, TCG, i) of the wedge at level s (module docstring)."""
    return s, v_of(s), 32.5, 0.5 + 2.0 * s / 3.0, 1.0 + 0.5 * s, 1.40625 * s**3


def wedge(**kw) -> Tank:
    rows = np.array([row_of(s) for s in S])
    cal = TankCalibration(*(frozen_array(rows[:, k]) for k in range(6)))
    base = dict(id="W", name="Wedge W", kind="diesel", density_t_m3=0.85, capacity_m3=15.0, calibration=cal,
                sounding_zero_m=0.1, ullage_reference_m=3.0)
    base.update(kw)
    return Tank(**base)


def fields(c: TankContents) -> tuple[float, ...]:
    return c.sounding_m, c.volume_m3, c.lcg_m, c.vcg_m, c.tcg_m, c.fsi_m4


def test_wedge_rows_are_the_closed_form():
    """The closed forms written out at s = 1 m (module docstring): V = 3.75, VCG = 0.5 + 2/3,
    TCG = 1.5, i = 5·1.5³/12 = 1.40625."""
    assert row_of(1.0) == pytest.approx((1.0, 3.75, 32.5, 1.1666667, 1.5, 1.40625), abs=5e-8)
    assert v_of(2.0) == 15.0  # the capacity


@pytest.mark.parametrize("quantity, value, density, level", [
    ("sounding_m", 0.9, None, 1.0),   # level = 0.9 + 0.1
    ("ullage_m", 2.0, None, 1.0),     # level = 3.0 − 2.0
    ("ullage_m", 1.5, None, 1.5),
    ("sounding_m", 1.4, 0.95, 1.5),
    ("percent", 25.0, None, 1.0),     # 25 % of 15 m³ = 3.75 m³ = V(1)
    ("volume_m3", 8.4375, None, 1.5),  # V(1.5)
    ("mass_t", 3.1875, None, 1.0),    # 3.1875 t / 0.85 t/m³ (the tank's density) = 3.75 m³
    ("mass_t", 3.75, 1.0, 1.0),       # 3.75 t of a liquid of 1.0 t/m³ = 3.75 m³
])
def test_every_way_of_stating_the_contents_reads_the_same_row(quantity, value, density, level):
    """Sounding, ullage, percent, m³ and tonnes resolve to the row of the level they stand for;
    the mass uses the stated density, else the tank's."""
    c = resolve_tank(wedge(), TankFill("W", quantity, value, density_t_m3=density))
    assert fields(c) == pytest.approx(row_of(level), abs=EXACT)
    assert c.density_t_m3 == (density if density is not None else 0.85)
    assert c.tank.id == "W"


@pytest.mark.parametrize("quantity, value", [("sounding_m", 1.15), ("ullage_m", 1.75), ("volume_m3", 6.09375)])
def test_between_rows_the_table_is_read_linearly(quantity, value):
    """Level 1.25 m (sounding 1.15, ullage 1.75) is halfway between the 1.0 and 1.5 m rows: the program
    gives the mean of the two rows (linear interpolation, module docstring), V = (3.75 + 8.4375)/2
    = 6.09375 m³ — not the wedge's own 3.75·1.25² = 5.859 m³, which only a finer table would give.
    The volume 6.09375 m³ is read back to the same row."""
    c = resolve_tank(wedge(), TankFill("W", quantity, value))
    mean = tuple((a + b) / 2 for a, b in zip(row_of(1.0), row_of(1.5)))
    assert fields(c) == pytest.approx(mean, abs=EXACT)


def test_an_empty_tank_is_the_first_row_at_the_tank_density():
    c = resolve_tank(wedge(), None)
    assert fields(c) == pytest.approx(row_of(0.0), abs=EXACT)
    assert c.density_t_m3 == 0.85


def test_levels_from_readings():
    """level = sounding + sounding_zero = ullage_reference − ullage (module docstring)."""
    assert level_of(wedge(), "sounding_m", 0.9) == pytest.approx(1.0, abs=EXACT)
    assert level_of(wedge(), "ullage_m", 2.25) == pytest.approx(0.75, abs=EXACT)


def test_reading_ranges_of_the_table():
    """Levels 0–2 m are soundings −0.1–1.9 m and ullages 3.0 − 2.0 = 1.0 to 3.0 − 0 = 3.0 m."""
    assert reading_range(wedge(), "sounding_m") == pytest.approx((-0.1, 1.9), abs=EXACT)
    assert reading_range(wedge(), "ullage_m") == pytest.approx((1.0, 3.0), abs=EXACT)


@pytest.mark.parametrize("quantity, value, level", [
    ("sounding_m", -0.1, 0.0), ("sounding_m", 1.9, 2.0), ("ullage_m", 3.0, 0.0), ("ullage_m", 1.0, 2.0),
    ("sounding_m", 1.9 + 0.9e-9, 2.0), ("ullage_m", 1.0 - 0.9e-9, 2.0),
])
def test_readings_at_the_ends_of_the_table_are_accepted(quantity, value, level):
    """A reading at either end of the table's range, or beyond it by less than the 1e-9 m round-off
    allowance, is the end row."""
    c = resolve_tank(wedge(), TankFill("W", quantity, value))
    assert fields(c) == pytest.approx(row_of(level), abs=1e-8)  # 1e-9 m of level moves V by < 1e-8 m³


@pytest.mark.parametrize("quantity, value, message", [
    ("sounding_m", 1.95, "tank W: sounding 1.95 m is outside the calibration table -0.1–1.9 m; "
                         "deckload does not extrapolate"),
    # beyond an end by more than the allowance (bounds.ROUND_OFF: 1e-9·max(1, |end|)), the value and
    # the end written to as many digits as tell them apart
    ("sounding_m", -0.1 - 3e-9, "tank W: sounding -0.100000003 m is outside the calibration table -0.1–1.9 m; "
                                "deckload does not extrapolate"),
    ("sounding_m", 1.9 + 3e-9, "tank W: sounding 1.900000003 m is outside the calibration table -0.1–1.9 m; "
                               "deckload does not extrapolate"),
    ("ullage_m", 0.9, "tank W: ullage 0.9 m is outside the calibration table 1–3 m; deckload does not extrapolate"),
    ("ullage_m", 3.0 + 6e-9, "tank W: ullage 3.00000001 m is outside the calibration table 1–3 m; "
                             "deckload does not extrapolate"),
])
def test_readings_outside_the_table_are_refused_by_name(quantity, value, message):
    with pytest.raises(LoadingError) as e:
        resolve_tank(wedge(), TankFill("W", quantity, value))
    assert str(e.value) == message
    with pytest.raises(LoadingError) as e:
        volume_of(wedge(), quantity, value, 0.85)
    assert str(e.value) == message


def test_a_tank_without_a_level_or_an_ullage_reference_refuses_those_readings():
    blind = wedge(level_known=False)
    for quantity, what in (("sounding_m", "a sounding"), ("ullage_m", "an ullage")):
        with pytest.raises(LoadingError) as e:
            resolve_tank(blind, TankFill("W", quantity, 1.0))
        assert str(e.value) == (f"tank W: known only by capacity and centre, so it cannot be stated by {what}; "
                                "give %, m³ or t")
    with pytest.raises(LoadingError) as e:
        resolve_tank(wedge(ullage_reference_m=None), TankFill("W", "ullage_m", 1.0))
    assert str(e.value) == ("tank W: the profile gives no ullage_reference_m, so it cannot be stated by an ullage; "
                            "give a sounding, %, m³ or t")
    # the sounding of the same tank still works
    c = resolve_tank(wedge(ullage_reference_m=None), TankFill("W", "sounding_m", 0.9))
    assert c.volume_m3 == pytest.approx(3.75, abs=EXACT)


def test_volume_of_at_and_beyond_the_capacity():
    """15 m³ = 100 % = 12.75 t at 0.85 t/m³ are accepted as the full tank; more is refused, naming the
    volume it would need and the capacity (12.8 t / 0.85 = 15.06 m³)."""
    t = wedge()
    assert volume_of(t, "percent", 100.0, 0.85) == 15.0
    assert volume_of(t, "volume_m3", 15.0, 0.85) == 15.0
    assert volume_of(t, "mass_t", 12.75, 0.85) == pytest.approx(15.0, abs=EXACT)
    assert volume_of(t, "mass_t", 6.375, 0.85) == pytest.approx(7.5, abs=EXACT)
    assert volume_of(t, "percent", 40.0, 0.85) == pytest.approx(6.0, abs=EXACT)
    # an empty tank and a small amount are amounts too (0 % and 0.5 % = 0.075 m³; 0 m³; 0 t)
    assert volume_of(t, "percent", 0.0, 0.85) == 0.0
    assert volume_of(t, "percent", 0.5, 0.85) == pytest.approx(0.075, abs=EXACT)
    assert volume_of(t, "volume_m3", 0.0, 0.85) == 0.0
    assert volume_of(t, "mass_t", 0.0, 0.85) == 0.0
    assert volume_of(t, "mass_t", 0.5, 0.85) == pytest.approx(0.5 / 0.85, abs=EXACT)
    for quantity, value, message in (
        ("mass_t", 12.8, "tank W: 15.06 m³ exceeds its capacity of 15.00 m³"),
        ("volume_m3", 15.01, "tank W: 15.01 m³ exceeds its capacity of 15.00 m³"),
        ("percent", 100.001, "tank W: 100.001 % is outside 0–100 %"),
        ("mass_t", -0.5, "tank W: a negative amount (-0.5) cannot be loaded"),
    ):
        with pytest.raises(LoadingError) as e:
            volume_of(t, quantity, value, 0.85)
        assert str(e.value) == message


def test_round_off_allowance_of_a_stated_amount():
    """An amount over its limit by at most 1e-9·max(1, |limit|) is the limit (bounds.ROUND_OFF): so
    100 % + 5e-8 is full (allowance 1e-7 on 100) and 100 % + 2e-7 is refused; on a limit below 1 the
    allowance is 1e-9 itself (0.5 + 0.5e-9 within, 0.5 + 2e-9 beyond)."""
    assert not over_limit(100.0 + 5e-8, 100.0) and over_limit(100.0 + 2e-7, 100.0)
    assert not over_limit(0.5 + 0.5e-9, 0.5) and over_limit(0.5 + 2e-9, 0.5)
    assert not over_limit(100.0, 100.0) and not over_limit(0.0, 0.0)
    assert volume_of(wedge(), "percent", 100.0 + 5e-8, 0.85) == 15.0
    assert volume_of(wedge(), "volume_m3", 15.0 + 1e-8, 0.85) == 15.0  # allowance 1.5e-8 on 15 m³
    with pytest.raises(LoadingError):
        volume_of(wedge(), "volume_m3", 15.0 + 3e-8, 0.85)
    # "is the limit itself": on a capacity just below the table's top (the loader allows 0.05 %), 100 %
    # + 5e-8 is exactly the capacity, not 5e-10 of it more
    assert volume_of(wedge(capacity_m3=14.995), "percent", 100.0 + 5e-8, 0.85) == pytest.approx(14.995, abs=EXACT)
    assert volume_of(wedge(capacity_m3=14.995), "volume_m3", 14.995 + 1e-8, 0.85) == 14.995


def test_resolve_tanks_keeps_profile_order_and_refuses_unknown_ids():
    """Every tank of the vessel in profile order; a tank the condition does not list is empty."""
    a = box_tank("A1", length_m=2.0, breadth_m=2.0, height_m=1.0, lcg_m=5.0)
    v = dataclasses.replace(box_barge(), tanks=(a, wedge()))
    got = resolve_tanks(v, Condition(tanks=(TankFill("W", "sounding_m", 0.9),)))
    assert [c.tank.id for c in got] == ["A1", "W"]
    assert got[0].volume_m3 == 0.0 and got[1].volume_m3 == pytest.approx(3.75, abs=EXACT)
    with pytest.raises(LoadingError) as e:
        resolve_tanks(v, Condition(tanks=(TankFill("X9", "percent", 10.0),)))
    assert str(e.value) == "condition names tank 'X9', which the vessel does not have"


def test_weight_sums_by_hand():
    """Δ = Σw, LCG = Σw·x/Δ, KG = Σw·z/Δ, TCG = Σw·y/Δ (standards.md §6.3), by hand:

    | item | w (t) | x | z | y |
    |---|---|---|---|---|
    | lightship | 400 | 20 | 3 | 0.1 |
    | hold | 60 | 12 | 2 | −1 |
    | wedge at s = 1 m (3.75 m³ × 0.8 t/m³) | 3 | 32.5 | 7/6 | 1.5 |

    Δ = 463 t; Σw·x = 8000 + 720 + 97.5 = 8817.5; Σw·z = 1200 + 120 + 3.5 = 1323.5;
    Σw·y = 40 − 60 + 4.5 = −15.5.  LCG = 19.04428, KG = 2.85853, TCG = −0.0334773 m.
    """
    items = [ItemResult("lightship", "LS", "Lightship", 400.0, 20.0, 3.0, 0.1),
             ItemResult("hold", "H1", "Hold 1", 60.0, 12.0, 2.0, -1.0)]
    tank = resolve_tank(wedge(), TankFill("W", "sounding_m", 0.9, density_t_m3=0.8))
    w = sum_weights(items, [tank])
    assert (w.mass_t, w.lcg_m, w.vcg_m, w.tcg_m) == pytest.approx(
        (463.0, 8817.5 / 463.0, 1323.5 / 463.0, -15.5 / 463.0), abs=EXACT)
    assert (w.lcg_m, w.vcg_m, w.tcg_m) == pytest.approx((19.04428, 2.85853, -0.0334773), abs=5e-6)


def test_nothing_aboard_is_refused():
    with pytest.raises(LoadingError) as e:
        sum_weights([], [])
    assert str(e.value) == "total displacement is zero or negative"
    # only nothing (or less) is refused: half a tonne sums like any other mass
    w = sum_weights([ItemResult("constant", "c1", "Spares", 0.5, 10.0, 2.0, 0.0)], [])
    assert (w.mass_t, w.lcg_m, w.vcg_m) == (0.5, 10.0, 2.0)
