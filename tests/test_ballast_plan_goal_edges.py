"""When the ballast planner counts a goal as reached, and one result as nearer than another.

The rules are the planner's own (``deckload.core.ballast_plan``): a GM goal is a least value
("GM fluid, m, at least"), reached at the target itself, with 1e-12 m of round-off allowed; a list
or trim goal is reached within its tolerance, the edge included ("how close counts as reached").
A result is nearer only by more than 1e-9 (m or degrees): a difference of floating-point noise
must not count as progress, or the search could keep a move that changes nothing (common practice
for comparisons in an iteration).  Each edge is checked on both sides.
"""

from __future__ import annotations

import math

import pytest

from deckload.core.ballast_plan import Goal, _nearer, met


def test_a_gm_goal_is_a_least_value_reached_at_the_target_itself():
    g = Goal("gm", 0.35, 0.0)
    assert met(0.35, g) and met(0.50, g)
    assert met(0.35 - 1e-12, g)  # round-off below the target still counts
    assert not met(0.35 - 1e-9, g)


@pytest.mark.parametrize("quantity", ["trim", "list"])
def test_a_trim_or_list_goal_is_reached_within_its_tolerance_edges_included(quantity):
    g = Goal(quantity, 0.5, 0.25)
    assert met(0.75, g) and met(0.25, g)  # |0.75 − 0.5| = 0.25 exactly, in binary too
    assert met(0.5, g)
    assert not met(0.75 + 1e-9, g) and not met(0.25 - 1e-9, g)


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
    from demo_vessels import demo_vessel

    v = demo_vessel()
    with pytest.raises(EntryError, match="goal"):
        parse_goal(typed, v)
    assert parse_goal("gm 0.8", v) == Goal("gm", 0.8, 0.001) and parse_goal("list -2", v).target == -2.0


@pytest.mark.parametrize("vessel_of", ["demo_vessel", "trawler_vessel"])
def test_a_goal_is_bounded_by_the_vessels_own_tables(vessel_of):
    """A typed goal is bounded where it is read by what the vessel's tables can give (derived in
    :func:`deckload.ui.planner.goal_range`): a trim within ± her greatest tabulated draft (both
    ends between 0 and it) and, with even-keel KN only, within ± 1.5 % of LBP (core/trim.py
    EVEN_KEEL_KN_LIMIT_FRACTION: beyond it the criteria are not assessable), a GM above 0 and at most her greatest KMt (GM = KMt − KG − FSC), a
    list within ± the KN table's last heel and 30°.  The fixed ±10 m trim and 10 m GM took goals
    no hull of this size can reach (a 10 m trim on a vessel drawing a few metres)."""
    import demo_vessels
    from deckload.ui.entry import EntryError
    from deckload.ui.planner import parse_goal

    v = getattr(demo_vessels, vessel_of)()
    top_draft = float(v.hydrostatics.draft_m[-1])
    top_km = float(max(v.hydrostatics.kmt_m))
    end = min(30.0, float(v.cross_curves.heel_deg[-1]))
    assert top_draft < 10.0 and top_km < 10.0  # the premise: the old fixed bounds let these through
    from deckload.core.trim import EVEN_KEEL_KN_LIMIT_FRACTION
    assert v.trimmed is None or len(v.trimmed.kn_trim_m) == 1  # the premise: even-keel KN only
    top_draft = min(top_draft, EVEN_KEEL_KN_LIMIT_FRACTION * v.particulars.lbp_m)
    draft_in, km_in = math.floor(top_draft * 1000) / 1000, math.floor(top_km * 1000) / 1000  # printed, not beyond
    for typed, target in ((f"trim {draft_in:.3f}", draft_in), (f"trim -{draft_in:.3f}", -draft_in),
                          (f"gm {km_in:.3f}", km_in), ("gm 0.001", 0.001), (f"list {end:g}", end), (f"list -{end:g}", -end)):
        assert parse_goal(typed, v).target == target
    for typed in (f"trim {top_draft + 0.01:.3f}", f"trim -{top_draft + 0.01:.3f}", "trim 9.9",
                  f"gm {top_km + 0.01:.3f}", "gm 9.9", "gm 0", "gm -0.5", f"list {end + 0.1:g}", f"list -{end + 0.1:g}"):
        with pytest.raises(EntryError, match=r"beyond what .* can reach: a (trim|gm|list) goal is"):
            parse_goal(typed, v)


def test_a_tiny_step_of_the_search_is_pumped_not_refused_as_text():
    """The planner pumps through the transfer form's own reader; a mass of 1e-09 t was written as
    '1e-09t', which the reader refuses as not an amount, and the search lost that step."""
    from deckload.ui import entry
    from demo_vessels import demo_departure

    v, c = demo_departure()
    before = entry.fill_volume_m3(v.tank("FO1S"), c.tank_fill("FO1S"))
    after = entry.planner_move(v, c, "FO1P", "FO1S", 1e-09)
    assert entry.fill_volume_m3(v.tank("FO1S"), after.tank_fill("FO1S")) > before
