"""When the ballast planner counts a goal as reached, and one result as nearer than another.

The rules are the planner's own (``deckload.core.ballast_plan``): a GM goal is a least value
("GM fluid, m, at least"), reached at the target itself, with 1e-12 m of round-off allowed; a list
or trim goal is reached within its tolerance, the edge included ("how close counts as reached").
A result is nearer only by more than 1e-9 (m or degrees): a difference of floating-point noise
must not count as progress, or the search could keep a move that changes nothing (common practice
for comparisons in an iteration).  Each edge is checked on both sides.
"""

from __future__ import annotations

import pytest

from deckload.core.ballast_plan import Goal, _met, _nearer


def test_a_gm_goal_is_a_least_value_reached_at_the_target_itself():
    g = Goal("gm", 0.35, 0.0)
    assert _met(0.35, g) and _met(0.50, g)
    assert _met(0.35 - 1e-12, g)  # round-off below the target still counts
    assert not _met(0.35 - 1e-9, g)


@pytest.mark.parametrize("quantity", ["trim", "list"])
def test_a_trim_or_list_goal_is_reached_within_its_tolerance_edges_included(quantity):
    g = Goal(quantity, 0.5, 0.25)
    assert _met(0.75, g) and _met(0.25, g)  # |0.75 − 0.5| = 0.25 exactly, in binary too
    assert _met(0.5, g)
    assert not _met(0.75 + 1e-9, g) and not _met(0.25 - 1e-9, g)


def test_for_gm_higher_is_nearer_but_only_beyond_noise():
    g = Goal("gm", 0.35, 0.0)
    assert _nearer(0.30, 0.20, g) and not _nearer(0.20, 0.30, g)
    assert not _nearer(0.20, 0.20, g)
    assert _nearer(0.60, 0.40, g)  # higher still, even past the least value wanted
    assert not _nearer(0.20 + 0.5e-9, 0.20, g) and not _nearer(0.20 + 1e-9, 0.20, g)  # the edge itself
    assert _nearer(0.20 + 2e-9, 0.20, g)


@pytest.mark.parametrize("quantity", ["trim", "list"])
def test_for_trim_or_list_nearer_means_closer_to_the_target_beyond_noise(quantity):
    g = Goal(quantity, 1.0, 0.1)
    assert _nearer(1.2, 1.5, g) and _nearer(0.9, 1.5, g) and not _nearer(1.5, 1.2, g)
    assert not _nearer(0.5, 1.5, g)  # both 0.5 away: neither is nearer
    assert not _nearer(1.0 + 0.25 - 0.5e-9, 1.25, g)
    assert _nearer(1.0 + 0.25 - 2e-9, 1.25, g)
    assert not _nearer(2.0, 0.0, g)  # higher is not nearer for a trim or list: both are 1.0 away
    level = Goal(quantity, 0.0, 0.1)
    assert not _nearer(1.0 - 1e-9, 1.0, level)  # exactly 1e-9 nearer (the same float both ways): the edge


@pytest.mark.parametrize("typed", ["gm 0_8", "trim 1_0", "list ٣", "gm ０.８", "gm 1e1", "gm nan", "list inf"])
def test_the_goal_is_read_as_every_other_typed_number(typed):
    """The planner's goal went through Python's float(), which reads '0_8' as 8, '1e1' as 10 and
    digits of other scripts; every other field refuses them (deckload.ui.entry.parse_number)."""
    from deckload.ui.entry import EntryError
    from deckload.ui.planner import parse_goal

    with pytest.raises(EntryError, match="goal"):
        parse_goal(typed)
    assert parse_goal("gm 0.8") == Goal("gm", 0.8, 0.001) and parse_goal("list -2").target == -2.0


def test_a_tiny_step_of_the_search_is_pumped_not_refused_as_text():
    """The planner pumps through the transfer form's own reader; a mass of 1e-09 t was written as
    '1e-09t', which the reader refuses as not an amount, and the search lost that step."""
    from deckload.ui import entry
    from demo_vessels import demo_departure

    v, c = demo_departure()
    before = entry.fill_volume_m3(v.tank("FO1S"), c.tank_fill("FO1S"))
    after = entry.planner_move(v, c, "FO1P", "FO1S", 1e-09)
    assert entry.fill_volume_m3(v.tank("FO1S"), after.tank_fill("FO1S")) > before
