"""The deadweight split by kind (core/deadweight.py) against a hand sum.

Deadweight = Δ − lightship (common practice: everything aboard that is not the ship).  On the box
barge (lightship 400 t, checks.md §1) with box tanks of several kinds, a hold, a deck load and
constants, filled by volume so that every mass is volume × density by hand:

| line | what | t |
|---|---|---|
| Cargo | hold 30 + deck load 12 + liquid cargo 8 m³ × 0.80 = 6.4 | 48.4 |
| Fuel oil | FO1 10 m³ × 0.95 = 9.5, FO2 4 m³ × 0.95 = 3.8 | 13.3 |
| Diesel oil | 2 m³ × 0.85 | 1.7 |
| Lube oil | LO empty | 0 |
| Fresh water | 5 m³ × 1.000 | 5.0 |
| Ballast water | 20 m³ × 1.025 | 20.5 |
| Stores and constants | the profile's stores 1.5 + the condition's crew 2.5 | 4.0 |

Total 92.9 t = Δ − 400.  No tank of kind "other": no "Other liquids" line.  Tolerance 1e-9 t
(round-off of sums of order 100 t).
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.deadweight import deadweight_by_kind
from deckload.core.model import Condition, DeckItem, Hold, HoldLoad, MassItem, TankFill
from deckload.core.stability import evaluate
from vessel_factories import box_barge, box_tank

ROUND = 1e-9


def vessel():
    def t(tid, kind, rho, x):
        return box_tank(tid, length_m=2.0, breadth_m=2.0, height_m=5.0, lcg_m=x, kind=kind, density_t_m3=rho)

    tanks = (t("FO1", "fuel_oil", 0.95, 5.0), t("FO2", "fuel_oil", 0.95, 8.0), t("DO", "diesel", 0.85, 11.0),
             t("LO", "lube_oil", 0.90, 14.0), t("FW", "fresh_water", 1.0, 17.0), t("BW", "ballast", 1.025, 20.0),
             t("CL", "cargo_liquid", 0.80, 23.0))
    hold = Hold("H1", "Hold 1", capacity_m3=100.0, lcg_m=30.0, vcg_m=2.0)
    return dataclasses.replace(box_barge(tanks=tanks), holds=(hold,),
                               constants=(MassItem("Stores", 1.5, 10.0, 3.0),))


def condition():
    fills = (("FO1", 10.0), ("FO2", 4.0), ("DO", 2.0), ("FW", 5.0), ("BW", 20.0), ("CL", 8.0))
    return Condition(tanks=tuple(TankFill(i, "volume_m3", v) for i, v in fills),
                     holds=(HoldLoad("H1", 30.0),),
                     deck_items=(DeckItem("Crate", 12.0, 25.0, 4.5),),
                     constants=(MassItem("Crew and effects", 2.5, 35.0, 5.0),))


def test_deadweight_lines_by_hand():
    r = evaluate(vessel(), condition())
    got = [(d.kind, d.title, d.mass_t) for d in deadweight_by_kind(r)]
    expect = [("cargo", "Cargo", 48.4), ("fuel_oil", "Fuel oil", 13.3), ("diesel", "Diesel oil", 1.7),
              ("lube_oil", "Lube oil", 0.0), ("fresh_water", "Fresh water", 5.0),
              ("ballast", "Ballast water", 20.5), ("stores", "Stores and constants", 4.0)]
    assert [g[:2] for g in got] == [e[:2] for e in expect]
    assert [g[2] for g in got] == pytest.approx([e[2] for e in expect], abs=ROUND)
    assert r.deadweight_t == pytest.approx(92.9, abs=ROUND)


def test_cargo_and_stores_lines_even_when_nothing_is_aboard():
    """An empty ship (lightship only) still shows the cargo and stores lines, at 0 t, and the lines
    of the tank kinds she has; "Other liquids" only with a tank of that kind."""
    v = dataclasses.replace(vessel(), constants=())
    got = [(d.kind, d.mass_t) for d in deadweight_by_kind(evaluate(v, Condition()))]
    assert got == [("cargo", 0.0), ("fuel_oil", 0.0), ("diesel", 0.0), ("lube_oil", 0.0), ("fresh_water", 0.0),
                   ("ballast", 0.0), ("stores", 0.0)]
    bare = dataclasses.replace(box_barge(tanks=(box_tank("SL", length_m=2.0, breadth_m=2.0, height_m=5.0,
                                                          lcg_m=5.0, kind="other", density_t_m3=0.9),)))
    lines = deadweight_by_kind(evaluate(bare, Condition(tanks=(TankFill("SL", "volume_m3", 10.0),))))
    assert [(d.kind, d.title) for d in lines] == [("cargo", "Cargo"), ("other", "Other liquids"),
                                                  ("stores", "Stores and constants")]
    assert [d.mass_t for d in lines] == pytest.approx([0.0, 9.0, 0.0], abs=ROUND)  # 10 m³ × 0.9 t/m³
