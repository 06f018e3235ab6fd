"""Ballast planner (deckload.core.ballast_plan): one proposed transfer brings a 5° list back to
upright, verified by recomputing the proposed condition with the full calculation.

The list the planner reads is the calculation's own (GZ rising through zero on the low side,
DEVELOPERS.md "List"), so the check is against an independent recompute, not the search's value.
"""

from __future__ import annotations

from functools import partial

import pytest

from deckload.io import paths
from deckload.core.ballast_plan import Goal, propose
from deckload.core.model import TankFill
from deckload.core.stability import evaluate
from deckload.io.profiles import load_condition, load_profile
from deckload.ui import entry


@pytest.fixture(scope="module")
def listed():
    """Departure with both WB1 wings half full, then ballast pumped from WB1S into its partner WB1P
    until she lists about 5° to port (the mass found by bisection on the full calculation)."""
    v = load_profile(paths.DEMO_PROFILE)
    c = load_condition(paths.DEMO_CONDITIONS["departure"], v)
    c = c.with_tank(TankFill("WB1P", "percent", 50.0)).with_tank(TankFill("WB1S", "percent", 50.0))
    lo, hi = 0.0, entry.planner_room(v, c, "WB1S", "WB1P")
    for _ in range(40):
        m = (lo + hi) / 2
        lst = evaluate(v, entry.planner_move(v, c, "WB1S", "WB1P", m)).list_deg
        lo, hi = (m, hi) if lst > -5.0 else (lo, m)
    cond = entry.planner_move(v, c, "WB1S", "WB1P", (lo + hi) / 2)
    assert evaluate(v, cond).list_deg == pytest.approx(-5.0, abs=0.05)
    return v, cond


def test_one_transfer_brings_a_5_degree_list_back_within_0_2(listed):
    v, c = listed
    goal = Goal("list", 0.0, 0.2)
    found = propose(v, c, goal, ["WB1P", "WB1S", "WB2P", "WB2S"],
                    move=partial(entry.planner_move, v), room=partial(entry.planner_room, v), evaluate=evaluate)
    assert found, "no single transfer proposed"
    best = found[0]
    # Recompute the proposed condition from scratch: the list is within 0.2° of upright.
    assert abs(evaluate(v, best.condition).list_deg) <= 0.2
    assert best.before == pytest.approx(-5.0, abs=0.05)
    # Every proposal moves weight to starboard (from a port tank into a starboard one) and is upright.
    for p in found:
        assert p.from_id.endswith("P") and p.to_id.endswith("S")
        assert abs(evaluate(v, p.condition).list_deg) <= 0.2
    # Mass is conserved by the transfer (the form's own pumping).
    before = sum(t.mass_t for t in evaluate(v, c).tanks)
    after = sum(t.mass_t for t in best.result.tanks)
    assert after == pytest.approx(before, abs=1e-6)


def test_gm_goal_is_a_least_mass_and_an_unreachable_goal_proposes_nothing(listed):
    v, c = listed
    r0 = evaluate(v, c)
    kw = dict(move=partial(entry.planner_move, v), room=partial(entry.planner_room, v), evaluate=evaluate)
    # One tank allowed: nothing to pump between.
    assert propose(v, c, Goal("list", 0.0, 0.2), ["WB1P"], **kw) == []
    # GM fluid 5 m is beyond anything a ballast transfer on this vessel can give (GM ≈ 0.7 m).
    assert propose(v, c, Goal("gm", r0.gm_fluid_m + 5.0, 0.001), ["WB1P", "WB1S", "WB2P", "WB2S"], **kw) == []


async def test_planner_form_proposes_then_applies_one_transfer(listed, tmp_path):
    """By keys: i opens the planner; ⏎ proposes (before/after shown), ⏎ again applies it as one
    undoable transfer; the recomputed list is within 0.2° of upright."""
    from deckload.ui.launch import create_app
    from deckload.ui.planner import PlannerForm

    v, c = listed
    app = create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="JS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("i")
        await pilot.pause()
        assert isinstance(app.screen, PlannerForm)
        app.screen.query_one("#plan-tanks").value = "WB1P WB1S"
        app.screen.query_one("#plan-goal").focus()
        await pilot.press("enter")
        await pilot.pause()
        assert app.screen.proposal is not None
        assert "Pump" in str(app.screen.query_one("#form-message").render())
        assert app.session.condition == c  # nothing applied yet
        await pilot.press("enter")
        await pilot.pause()
        assert not isinstance(app.screen, PlannerForm)
        assert abs(evaluate(v, app.session.condition).list_deg) <= 0.2
        assert app.session.undo_depth == 1
