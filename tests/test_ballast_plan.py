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
from deckload.io.profiles import load_condition
from deckload.ui import entry
from demo_vessels import demo_vessel


async def searched(pilot, app) -> None:
    """The planner searches off the screen's thread: wait until it has answered (30 s at most)."""
    for _ in range(600):
        await pilot.pause(0.05)
        if not getattr(app.screen, "searching", False):
            break
    await pilot.pause()


@pytest.fixture(scope="module")
def listed():
    """Departure with both WB1 wings half full, then ballast pumped from WB1S into its partner WB1P
    until she lists about 5° to port (the mass found by bisection on the full calculation)."""
    v = demo_vessel()
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
        await searched(pilot, app)
        await pilot.pause()
        assert app.screen.proposal is not None
        assert "Pump" in str(app.screen.query_one("#form-message").render())
        assert app.session.condition == c  # nothing applied yet
        await pilot.press("enter")
        await pilot.pause()
        assert not isinstance(app.screen, PlannerForm)
        assert abs(evaluate(v, app.session.condition).list_deg) <= 0.2
        assert app.session.undo_depth == 1


# --------------------------------------------------------------------------- plans: trim, GM, several transfers

WINGS_AND_BOTTOMS = ["WB2P", "WB2S", "DB3P", "DB3S"]


@pytest.fixture(scope="module")
def departure():
    v = demo_vessel()
    return v, load_condition(paths.DEMO_CONDITIONS["departure"], v)


def _plan(v, c, goal, allowed):
    from deckload.core.ballast_plan import plan

    return plan(v, c, goal, allowed, move=partial(entry.planner_move, v), room=partial(entry.planner_room, v),
                evaluate=evaluate)


def _recompute(v, c, transfers):
    """Pump the proposed transfers one after the other with the transfer form's own pumping, from
    the condition the planner was given, and compute the result from scratch."""
    for t in transfers:
        c = entry.planner_move(v, c, t.from_id, t.to_id, t.mass_t)
    return c, evaluate(v, c)


def _mass(v, c) -> float:
    return sum(t.mass_t for t in evaluate(v, c).tanks)


def test_a_trim_goal_is_reached_by_pumping_a_wing_pair_alike_verified_by_recomputing(departure):
    """Departure trims 0.313 m by the stern.  Trim 0.15 m (± 0.01 m): ballast from the wing tanks
    WB2P/S down and forward into DB3P/S, the same mass each side, so the list stays within 1°."""
    from deckload.core.ballast_plan import Goal, KEEP_LIST_DEG, Plan

    v, c = departure
    p = _plan(v, c, Goal("trim", 0.15, 0.01), WINGS_AND_BOTTOMS)
    assert isinstance(p, Plan) and len(p.transfers) == 2
    c2, r2 = _recompute(v, c, p.transfers)
    assert abs(r2.trim_m - 0.15) <= 0.01
    assert abs(r2.list_deg) <= KEEP_LIST_DEG
    assert {(t.from_id, t.to_id) for t in p.transfers} == {("WB2P", "DB3P"), ("WB2S", "DB3S")}
    assert _mass(v, c2) == pytest.approx(_mass(v, c), abs=1e-6)  # a transfer moves mass, never adds it


def test_a_gm_goal_is_at_least_the_value_and_the_least_pumping_verified_by_recomputing(departure):
    """GM fluid 0.778 m; at least 0.85 m by moving ballast down.  The recomputed GM fluid is at
    least 0.85 m; 2 % less pumping would not be enough (the least mass, not any mass)."""
    from dataclasses import replace

    from deckload.core.ballast_plan import Goal, KEEP_LIST_DEG, Plan

    v, c = departure
    p = _plan(v, c, Goal("gm", 0.85, 0.001), WINGS_AND_BOTTOMS)
    assert isinstance(p, Plan)
    _, r2 = _recompute(v, c, p.transfers)
    assert r2.gm_fluid_m >= 0.85 and abs(r2.list_deg) <= KEEP_LIST_DEG
    _, short = _recompute(v, c, [replace(t, mass_t=0.98 * t.mass_t) for t in p.transfers])
    assert short.gm_fluid_m < 0.85


def test_a_list_too_great_for_one_transfer_takes_two_verified_by_recomputing(departure):
    """WB2S emptied and WB1P 40 % full: about 16° to port.  With WB1P, WB2P, DB3S and DB2S allowed,
    no single transfer can take enough to starboard (DB2S has room for 23.9 t); the plan fills
    DB2S from WB2P, then tops up DB3S, and she comes back within 0.1° of upright."""
    from deckload.core.ballast_plan import Goal, Plan

    v, c = departure
    c = c.without_tank("WB2S").with_tank(TankFill("WB1P", "percent", 40.0))
    assert evaluate(v, c).list_deg < -15.0
    p = _plan(v, c, Goal("list", 0.0, 0.1), ["WB1P", "WB2P", "DB3S", "DB2S"])
    assert isinstance(p, Plan) and len(p.transfers) >= 2
    c2, r2 = _recompute(v, c, p.transfers)
    assert abs(r2.list_deg) <= 0.1
    assert _mass(v, c2) == pytest.approx(_mass(v, c), abs=1e-6)


async def test_when_no_plan_is_possible_the_planner_says_why_and_changes_nothing(departure, tmp_path):
    """Even keel is beyond these four tanks (the nearest is about 0.12 m by the stern): the form
    names the goal, the nearest trim and the pumping that gives it; ⏎ again applies nothing."""
    from deckload.core.ballast_plan import Goal, NoPlan
    from deckload.ui.launch import create_app
    from deckload.ui.planner import PlannerForm

    v, c = departure
    why = _plan(v, c, Goal("trim", 0.0, 0.01), WINGS_AND_BOTTOMS)
    assert isinstance(why, NoPlan) and 0.05 < why.best < 0.313
    app = create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="JS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("i")
        await pilot.pause()
        app.screen.query_one("#plan-goal").value = "trim 0"
        app.screen.query_one("#plan-tanks").value = " ".join(WINGS_AND_BOTTOMS)
        app.screen.query_one("#plan-goal").focus()
        await pilot.pause()
        await pilot.press("enter")
        await searched(pilot, app)
        await pilot.pause()
        said = str(app.screen.query_one("#form-message").render())
        assert "The search found no plan reaching trim 0.000 m" in said
        assert f"the nearest it came is trim {why.best:.3f} m A" in said and "keeping the list within" in said
        await pilot.press("enter")
        await pilot.pause()
        assert isinstance(app.screen, PlannerForm) and app.session.condition == c
