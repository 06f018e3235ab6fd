"""The tank states at the edges of their round-off allowance: empty and nominally full are inclusive.

Rule (free_surface.tank_state, deckload's own; the 98 % nominally-full level is IS 2008 Part B 3.1.2,
standards.md §4.1, the 0.5 % empty level the profile's default): a fill at or below ``empty_pct``
plus 1e-9 % is empty, at or above ``full_pct`` less 1e-9 % is full — the hair of allowance lets
98 % typed as m³ (0.98·capacity → 97.99999999999999 %) count as 98 % typed as percent.  The edge
itself belongs to the empty (full) side: the value exactly ``empty_pct + 1e-9`` is empty, the next
float above it is not; likewise ``full_pct − 1e-9`` is full and the next float below it is not.
"""

from __future__ import annotations

import math

from deckload.core.free_surface import tank_state
from vessel_factories import box_tank

EMPTY_PCT, FULL_PCT = 0.5, 98.0  # model.FreeSurfaceSettings defaults


def tank():
    """Box tank 10 × 5 × 2 m, worst band 40–60 % (box_tank's default for a tank without transfer)."""
    return box_tank("WB1C", length_m=10, breadth_m=5, height_m=2, lcg_m=30.0)


def test_the_empty_allowance_is_inclusive():
    edge = EMPTY_PCT + 1e-9
    assert tank_state(edge, tank(), EMPTY_PCT, FULL_PCT) == "empty"
    assert tank_state(math.nextafter(edge, 1.0), tank(), EMPTY_PCT, FULL_PCT) == "slack"


def test_the_full_allowance_is_inclusive():
    edge = FULL_PCT - 1e-9
    assert tank_state(edge, tank(), EMPTY_PCT, FULL_PCT) == "full"
    assert tank_state(math.nextafter(edge, 0.0), tank(), EMPTY_PCT, FULL_PCT) == "slack"


def test_98_percent_typed_as_volume_is_full():
    """A tank of 33.3 m³ holding 0.98 × 33.3 m³: 100·V/capacity (loading.TankContents.fill_pct) is
    97.99999999999999 %, one float below 98: still nominally full."""
    fill = 100.0 * (0.98 * 33.3) / 33.3
    assert fill < FULL_PCT
    assert tank_state(fill, tank(), EMPTY_PCT, FULL_PCT) == "full"
