"""A tank's state word and its free-surface moment agree: a tank with liquid whose moment is counted is
not called 'empty'; a tank called empty with liquid in it carries no moment.

IS 2008 Part B 3.1.2 counts every tank below 98 % as slack and 3.1.4 assumes, per kind of
consumable, the pair or centreline tank of greatest effect slack whatever its state (standards.md
§4.1, confirmed); deckload's 'empty' level (free_surface.DEFAULT_EMPTY_PCT, 0.5 %) only leaves out
the usual remainder of a tank taken as empty (standards.md §4.1, from memory).  The trawler's FW2,
her one centreline fresh-water tank, is the one assumed slack (B 3.1.4); at 0.01 m³ (0.2 %) it
was shown 'empty' beside 12.0 t·m of FSM.
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.model import TankFill
from deckload.core.stability import evaluate
from deckload.io import paths
from deckload.io.profiles import load_condition, parse_condition
from demo_vessels import trawler_vessel


def departure_with(fill: TankFill | None):
    v = trawler_vessel()
    c = load_condition(paths.TRAWLER_CONDITIONS["departure"], v)
    c = c.without_tank("FW2") if fill is None else c.with_tank(fill)
    return v, c


def tank(result, ident):
    return next(t for t in result.tanks if t.id == ident)


@pytest.mark.parametrize("fill", [TankFill("FW2", "volume_m3", 0.01), TankFill("FW2", "sounding_m", 0.0)])
def test_a_tank_with_liquid_assumed_slack_is_not_called_empty(fill):
    """0.01 m³ and sounding 0 (the booklet's first row, 0.016 m³: demo_trawler/tanks/FW2.csv) are
    below 0.5 % of 5.943 m³; the B 3.1.4 moment is counted, so the state is 'slack'."""
    v, c = departure_with(fill)
    fw2 = tank(evaluate(v, c), "FW2")
    assert fw2.volume_m3 > 0 and fw2.fill_pct < 0.5
    assert fw2.fsm_tm > 0 and "IS 2008 B 3.1.4" in fw2.fs_rule
    assert fw2.state == "slack"


def test_state_and_moment_agree_in_every_tank():
    """Whatever the fill: a tank called empty holding liquid has no moment, and a tank with liquid and a
    moment is slack, in its worst band, or a full cargo tank (B 3.1.2's 98 %)."""
    v = trawler_vessel()
    base = load_condition(paths.TRAWLER_CONDITIONS["departure"], v)
    for t in v.tanks:
        for pct in (0.0, 0.1, 0.4, 0.6, 50.0):
            c = base.with_tank(TankFill(t.id, "percent", pct)) if pct else base.without_tank(t.id)
            for r in evaluate(v, c).tanks:
                if r.state == "empty" and r.volume_m3 > 0:
                    assert r.fsm_tm == 0.0, (t.id, pct, r.id, r.fs_rule)
                if r.fsm_tm > 0 and r.volume_m3 > 0:
                    assert r.state != "empty", (t.id, pct, r.id)


def test_an_empty_tank_assumed_slack_keeps_its_word_and_its_rule():
    """With nothing in FW2 the B 3.1.4 moment is still counted (the Code's assumption, not its
    contents): the state stays 'empty' and the rule says why there is a moment."""
    v, c = departure_with(None)
    fw2 = tank(evaluate(v, c), "FW2")
    assert fw2.volume_m3 == 0.0 and fw2.state == "empty"
    assert fw2.fsm_tm > 0 and fw2.fs_rule.startswith("assumed slack")
    # the same from a file
    text = ('format = "deckload-condition-1"\n[condition]\nname = "p"\nwater_density_t_m3 = 1.025\n'
            '[tanks.FW2]\nvolume_m3 = 0.01\n')
    r = evaluate(v, dataclasses.replace(c, tanks=parse_condition(text, "p.condition.toml", v).tanks))
    assert tank(r, "FW2").state == "slack"
