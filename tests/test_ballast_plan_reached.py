"""A goal the ship already meets, or meets part-way through a whole transfer, is a plan: the
ballast planner (``deckload.core.ballast_plan.plan``) must not pump to get there, nor say that no
plan reaches it.

Before this was fixed, a GM already above the least wanted was "no plan of up to 4 transfers
reaches GM fluid at least …: the nearest is GM fluid <higher> after: pump …" on the demo vessel,
a trim already within its tolerance was answered with a transfer, and a whole transfer that
brought the trim within its tolerance without passing the target was "no plan" though it had
reached it.  The invented barge and its hand-derived responses are those of
``test_ballast_plan_search.py``.
"""

from __future__ import annotations

import pytest

from deckload.core.ballast_plan import Goal, Plan, plan
from test_ballast_plan_illinois import search
from test_ballast_plan_search import ALL4, PAIRS, PAIRS_LOADED, Barge, Calc, Tk, check_transfers, cond


@pytest.mark.parametrize("goal", [Goal("trim", 0.95, 0.1), Goal("gm", 0.9, 0.001), Goal("list", 0.05, 0.1)])
def test_a_goal_she_already_meets_is_a_plan_of_no_transfers(goal):
    """The wing-pair barge as loaded: trim 1.0 m (within 0.95 ± 0.1), GM 1.0 − 50·1/1000 =
    0.95 m (at least 0.9 m), list 0° (within 0.05 ± 0.1).  A goal met as she is: no transfer,
    her own condition and result, one calculation."""
    calc = Calc(PAIRS)
    got = plan(PAIRS, PAIRS_LOADED, goal, ALL4, **calc.kw())
    assert isinstance(got, Plan) and got.transfers == ()
    assert got.condition == PAIRS_LOADED and got.result == calc.evaluate(PAIRS, PAIRS_LOADED)
    assert got.before == got.after == {"trim": 1.0, "gm": 0.95, "list": 0.0}[goal.quantity]
    assert got.evaluations == 1


def test_a_whole_transfer_that_ends_within_the_tolerance_is_the_plan():
    """Centreline tanks A1 (x −20 m) 5 t of 10 and F1 (x +20 m) empty; trim₀ = 0.13 m: trim =
    0.13 + 0.1 = 0.23 m.  Goal 0.025 ± 0.01 m: the whole of A1 forward (5 t, −0.2 m) ends at
    0.03 m, within 0.01 of 0.025 without passing it.  The plan is that whole transfer."""
    barge = Barge((Tk("A1", -20, 0, 1, 10), Tk("F1", 20, 0, 1, 10)), trim0_m=0.13)
    calc = Calc(barge)
    got = plan(barge, cond(A1=5.0, F1=0.0), Goal("trim", 0.025, 0.01), ["A1", "F1"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("A1", "F1", 5.0)])
    assert got.after == pytest.approx(0.03, abs=1e-12) and got.result.trim_m == got.after
    assert dict(got.condition) == {"A1": 0.0, "F1": 5.0} and got.before == pytest.approx(0.23, abs=1e-12)
    assert got.evaluations == 2 == calc.calls  # the condition, the whole A1 → F1; F1 has nothing to give


def test_the_gm_stated_when_only_the_whole_transfer_reaches_it_is_that_of_the_whole_transfer():
    """As test_ballast_plan_illinois's crawl to the whole transfer (GM 5e-12 m short below 10 t,
    1.0 m at 10 t): the GM the search states after it is the whole transfer's 1.0 m, not the
    halved value its secant was working with."""
    hit, _, _ = search(lambda m: 1.0 if m >= 10.0 else 0.5 - 5e-12, Goal("gm", 0.5, 0.001), 10.0)
    assert hit[0] == 10.0 and hit[3] == 1.0 == hit[2].gm_fluid_m


async def test_the_form_says_a_goal_already_met_needs_no_pumping_and_applies_nothing(tmp_path):
    """Demo departure, GM fluid 0.778 m; goal GM at least 0.5 m: the form says so, and ⏎ again
    changes nothing."""
    from deckload.io import paths
    from deckload.io.profiles import load_condition
    from deckload.ui.launch import create_app
    from deckload.ui.planner import PlannerForm
    from demo_vessels import demo_vessel

    v = demo_vessel()
    c = load_condition(paths.DEMO_CONDITIONS["departure"], v)
    app = create_app(v, c, work_dir=tmp_path / "work", log_dir=tmp_path / "logs", officer="JS")
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.press("i")
        await pilot.pause()
        app.screen.query_one("#plan-goal").value = "gm 0.5"
        app.screen.query_one("#plan-tanks").value = "WB2P WB2S DB3P DB3S"
        app.screen.query_one("#plan-goal").focus()
        await pilot.pause()
        await pilot.press("enter")
        for _ in range(600):
            await pilot.pause(0.05)
            if not app.screen.searching:
                break
        await pilot.pause()
        said = str(app.screen.query_one("#form-message").render())
        assert "already has GM fluid 0.778 m" in said and "nothing to pump" in said
        assert app.screen.proposal is None
        await pilot.press("enter")
        await pilot.pause()
        assert isinstance(app.screen, PlannerForm) and app.session.condition == c
