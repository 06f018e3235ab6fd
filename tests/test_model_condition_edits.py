"""The model's small editing and look-up helpers (deckload/core/model.py): a condition edited one
entry at a time, the constants in force, the vessel's indices and usual fills, the derived tank
table.  Expected values are the inputs themselves placed by hand (no computation to source):
each check names the entry that must be kept, replaced or dropped.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.core.model import (
    Condition,
    DeckArea,
    DeckItem,
    Hold,
    HoldLoad,
    MassItem,
    TankFill,
    effective_constants,
    frozen_array,
)
from vessel_factories import box_barge, box_tank


def test_condition_tank_entries_replaced_dropped_and_found():
    c = Condition(tanks=(TankFill("DB1", "fill_pct", 50.0), TankFill("DB2", "volume_m3", 12.0)))
    c2 = c.with_tank(TankFill("DB1", "mass_t", 30.0))
    assert c2.tanks == (TankFill("DB2", "volume_m3", 12.0), TankFill("DB1", "mass_t", 30.0))
    assert c2.tank_fill("DB1") == TankFill("DB1", "mass_t", 30.0)
    assert c2.tank_fill("DB3") is None
    assert c.tanks[0] == TankFill("DB1", "fill_pct", 50.0)  # the original is unchanged
    assert c2.without_tank("DB2").tanks == (TankFill("DB1", "mass_t", 30.0),)
    assert c2.without_tank("XX").tanks == c2.tanks


def test_condition_hold_entries_replaced_and_dropped():
    c = Condition(holds=(HoldLoad("H1", 100.0), HoldLoad("H2", 200.0)))
    c2 = c.with_hold(HoldLoad("H1", 150.0))
    assert c2.holds == (HoldLoad("H2", 200.0), HoldLoad("H1", 150.0))
    assert c2.without_hold("H2").holds == (HoldLoad("H1", 150.0),)
    assert c2.without_hold("H9").holds == c2.holds


def test_condition_deck_items_constants_density_and_replace():
    item = DeckItem("Crate", 5.0, 10.0, 5.0)
    c = Condition(name="A").with_deck_items([item]).with_constants([MassItem("Stores", 3.0, 8.0, 4.0)])
    assert c.deck_items == (item,) and isinstance(c.deck_items, tuple)
    assert c.constants == (MassItem("Stores", 3.0, 8.0, 4.0),) and isinstance(c.constants, tuple)
    assert c.with_density(1.005).water_density_t_m3 == 1.005
    assert c.replace(name="B", remark="r").name == "B" and c.replace(name="B", remark="r").remark == "r"


def test_constants_of_the_condition_replace_the_profile_ones_by_name():
    v = dataclasses.replace(box_barge(), constants=(MassItem("Crew", 2.0, 30.0, 6.0), MassItem("Stores", 4.0, 10.0, 5.0)))
    c = Condition(constants=(MassItem("Stores", 6.0, 12.0, 5.5), MassItem("Spares", 1.0, 20.0, 4.0)))
    assert effective_constants(v, c) == (MassItem("Crew", 2.0, 30.0, 6.0), MassItem("Stores", 6.0, 12.0, 5.5),
                                         MassItem("Spares", 1.0, 20.0, 4.0))
    assert effective_constants(v, Condition()) == v.constants


def test_frozen_array_is_float_and_read_only():
    a = frozen_array([1, 2, 3])
    assert a.dtype == np.float64 and list(a) == [1.0, 2.0, 3.0]
    with pytest.raises(ValueError):
        a[0] = 5.0


def test_vessel_indices_and_usual_fills():
    tanks = (box_tank("FO1", length_m=4.0, breadth_m=3.0, height_m=2.0, lcg_m=10.0, kind="fuel_oil"),
             box_tank("WB1", length_m=4.0, breadth_m=3.0, height_m=2.0, lcg_m=20.0))
    holds = (Hold("H1", "Hold 1", 100.0, 10.0, 2.0), Hold("H2", "Hold 2", 120.0, 25.0, 2.0))
    areas = (DeckArea("FWD", "Forward deck", 40.0, 30.0, 4.0), DeckArea("AFT", "After deck", 30.0, 5.0, 4.0))
    v = dataclasses.replace(box_barge(tanks=tanks), holds=holds, deck_areas=areas,
                            usual_fill_pct=(("fuel_oil", 90.0),))
    assert v.tank("WB1").id == "WB1" and v.tank("FO1").id == "FO1"
    assert v.hold("H2").name == "Hold 2" and v.hold("H1").name == "Hold 1"
    assert v.deck_area("AFT").name == "After deck" and v.deck_area("FWD").name == "Forward deck"
    assert v.usual_max_pct("fuel_oil") == 90.0  # the profile's [usual_fill]
    assert v.usual_max_pct("diesel") == 95.0  # deckload's default for the kind (model.USUAL_MAX_PCT)
    assert v.usual_max_pct("ballast") == 100.0  # ballast is pressed full (model.USUAL_MAX_PCT)


def test_tank_derived_table_and_largest_inertia():
    """A box tank 4 × 3 m: the free-surface inertia is l·b³/12 = 4·27/12 = 9 m⁴ at every slack
    level (rectangular surface, common practice); the derived table stacks the calibration's six
    columns in order and is read-only."""
    t = box_tank("WB1", length_m=4.0, breadth_m=3.0, height_m=2.0, lcg_m=20.0)
    cal = t.calibration
    assert t.max_fsi_m4 == pytest.approx(9.0, rel=1e-12)
    assert t.table.shape == (len(cal.sounding_m), 6)
    for j, col in enumerate((cal.sounding_m, cal.volume_m3, cal.lcg_m, cal.vcg_m, cal.tcg_m, cal.fsi_m4)):
        assert np.array_equal(t.table[:, j], col), j
    assert not t.table.flags.writeable


def test_hydrostatic_columns_name_only_the_columns_given():
    h = box_barge().hydrostatics
    cols = h.columns()
    assert set(cols) >= {"draft_m", "displacement_t", "lcb_m", "lcf_m", "kmt_m", "tpc_t_cm", "mctc_tm_cm"}
    assert all(cols[k] is getattr(h, k) for k in cols)
    assert all(getattr(h, k) is None for k in ("vcb_m", "kml_m") if k not in cols)
