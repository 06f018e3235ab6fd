"""Ballast planner speed, by hand: ``python -m tests.benchmarks.bench_planner``.

The demo departure condition with both WB1 wings half full, given about 5° of port list by
pumping WB1S into WB1P; the planner asked for "list 0°" among the four wing tanks.  Prints the
time of one search, the full calculations it made, and the time of one calculation beside it.
"""

from __future__ import annotations

import time
from functools import partial


def main() -> None:
    from deckload.io import paths
    from deckload.core.ballast_plan import Goal, propose
    from deckload.core.model import TankFill
    from deckload.core.stability import evaluate
    from deckload.io.profiles import load_condition, load_profile
    from deckload.ui import entry

    v = load_profile(paths.DEMO_PROFILE)
    c = load_condition(paths.DEMO_CONDITIONS["departure"], v)
    c = c.with_tank(TankFill("WB1P", "percent", 50.0)).with_tank(TankFill("WB1S", "percent", 50.0))
    c = entry.planner_move(v, c, "WB1S", "WB1P", 7.6)
    calls = [0]

    def counted(vessel, condition):
        calls[0] += 1
        return evaluate(vessel, condition)

    t0 = time.perf_counter()
    r = evaluate(v, c)
    one = time.perf_counter() - t0
    t0 = time.perf_counter()
    found = propose(v, c, Goal("list", 0.0, 0.2), ["WB1P", "WB1S", "WB2P", "WB2S"],
                    move=partial(entry.planner_move, v), room=partial(entry.planner_room, v), evaluate=counted)
    search = time.perf_counter() - t0
    print(f"list before {r.list_deg:+.2f}°; {len(found)} single transfers found; best: "
          + (f"{found[0].mass_t:.1f} t {found[0].from_id} → {found[0].to_id}, list after {found[0].after:+.2f}°"
             if found else "none"))
    print(f"search {search * 1000:.0f} ms, {calls[0]} calculations; one calculation {one * 1000:.1f} ms "
          f"(ratio {search / one:.0f})")

    # Plans of several transfers (core.ballast_plan.plan), from the stock departure condition.
    from deckload.core.ballast_plan import plan

    d = load_condition(paths.DEMO_CONDITIONS["departure"], v)
    listed = d.without_tank("WB2S").with_tank(TankFill("WB1P", "percent", 40.0))
    for what, cond, goal, tanks in (
        ("trim 0.15 m", d, Goal("trim", 0.15, 0.01), ["WB2P", "WB2S", "DB3P", "DB3S"]),
        ("GM fluid ≥ 0.85 m", d, Goal("gm", 0.85, 0.001), ["WB2P", "WB2S", "DB3P", "DB3S"]),
        ("list 0 from 16° P", listed, Goal("list", 0.0, 0.1), ["WB1P", "WB2P", "DB3S", "DB2S"]),
        ("trim 0 (no plan)", d, Goal("trim", 0.0, 0.01), ["WB2P", "WB2S", "DB3P", "DB3S"]),
    ):
        calls[0] = 0
        t0 = time.perf_counter()
        p = plan(v, cond, goal, tanks, move=partial(entry.planner_move, v), room=partial(entry.planner_room, v),
                 evaluate=counted)
        took = time.perf_counter() - t0
        n = len(getattr(p, "transfers", ()))
        print(f"plan {what}: {type(p).__name__} with {n} transfer(s), {took * 1000:.0f} ms, {calls[0]} calculations "
              f"(ratio {took / one:.0f})")


if __name__ == "__main__":
    main()
