"""A tank's own tables are never extrapolated: the free-surface look-ups refuse a volume, a fill or a
heel outside them, naming the tank, the quantity, its value and unit, and the table's range.

Rule: deckload's own (tables.py, ``bracket``: nothing is extrapolated; DEVELOPERS.md, "Standing rules":
a refusal names the value and the rule broken).  The words are those of ``tables.OutOfRangeError``.

Through the profile reader these refusals are guarded upstream (a calibration starts at volume 0
and ends at the capacity within 0.05 %, loading clamps a volume to the table's top, a transfer
table runs 0–100 % and 0–90°: io/profiles.py).  They still guard every model built in code — the
vessel factories, the benchmark, a future reader — and a tank whose transfer table stops short is
refused with these words rather than given a moment read off the end of its table.  The tanks are
the box tanks of tests/vessel_factories.py (capacity l·b·h, transfer table 0–100 % × 0–90°).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.free_surface import BASIS_ACTUAL, fsi_at_fill, mfs30_bound_m4, transfer_column, transfer_moment_m4
from deckload.core.model import FluidTransfer, frozen_array
from deckload.core.tables import OutOfRangeError
from vessel_factories import box_tank

TAIL = "; deckload does not extrapolate"


def ballast(with_transfer=False):
    """Box ballast tank 10 × 5 × 2 m: capacity 100 m³, calibration volumes 0–100 m³."""
    return box_tank("WB3C", length_m=10, breadth_m=5, height_m=2, lcg_m=30.0, with_transfer=with_transfer)


@pytest.mark.parametrize("fill_pct, text", [
    (120.0, "volume of tank WB3C 120 m³ is outside the table range 0–100 m³"),
    (-5.0, "volume of tank WB3C -5 m³ is outside the table range 0–100 m³"),
])
def test_inertia_at_a_fill_off_the_calibration_is_refused(fill_pct, text):
    """fsi_at_fill looks the volume f·capacity up in the calibration: 120 % of 100 m³ is 120 m³, above
    the table's 100 m³; −5 % is −5 m³, below its 0."""
    with pytest.raises(OutOfRangeError) as e:
        fsi_at_fill(ballast(), fill_pct)
    assert str(e.value) == text + TAIL
    assert (e.value.quantity, e.value.unit, e.value.value) == ("volume of tank WB3C", "m³", fill_pct)


def test_inertia_inside_the_calibration_is_the_box_value():
    """Control beside the refusals: at 100 % (the table's last row) the box's i = l·b³/12 = 10·125/12
    = 104.1667 m⁴ (standards.md §4.3, textbook); exact to round-off."""
    assert fsi_at_fill(ballast(), 100.0) == pytest.approx(10 * 5**3 / 12, rel=1e-12)


def test_a_transfer_table_that_stops_short_of_30_degrees_is_refused():
    """The small-tank bound Mfs(30°) reads the transfer table's column at 30° (IS 2008 B 3.1.12 via
    ``mfs30_bound_m4``).  A table posed to stop at 20° (the box's exact moments, columns 0–20°) has
    no 30° column: refused, naming the heel, its unit and the table's range."""
    tank = ballast(with_transfer=True)
    tr = tank.transfer
    short = FluidTransfer(tr.fill_pct, frozen_array(tr.heel_deg[:5]), frozen_array(tr.moment_m4[:, :5]))
    assert float(short.heel_deg[-1]) == 20.0
    tank = dataclasses.replace(tank, transfer=short)
    with pytest.raises(OutOfRangeError) as e:
        mfs30_bound_m4(tank)
    assert str(e.value) == "heel for fluid transfer 30 deg is outside the table range 0–20 deg" + TAIL
    with pytest.raises(OutOfRangeError) as e:
        transfer_column(tr, math.radians(95.0))
    assert str(e.value) == "heel for fluid transfer 95 deg is outside the table range 0–90 deg" + TAIL
    assert (e.value.quantity, e.value.unit) == ("heel for fluid transfer", "deg")


@pytest.mark.parametrize("fill_pct, text", [
    (120.0, "fill of tank WB3C 120 % is outside the table range 0–100 %"),
    (-5.0, "fill of tank WB3C -5 % is outside the table range 0–100 %"),
])
def test_transfer_moment_at_a_fill_off_the_table_is_refused(fill_pct, text):
    """The moment at the actual fill (B 3.1.3/B 3.1.6) is read in the transfer table's fills, 0–100 %."""
    heel = np.radians([0.0, 30.0])
    with pytest.raises(OutOfRangeError) as e:
        transfer_moment_m4(ballast(with_transfer=True), BASIS_ACTUAL, fill_pct, heel)
    assert str(e.value) == text + TAIL
    assert (e.value.quantity, e.value.unit, e.value.value) == ("fill of tank WB3C", "%", fill_pct)
