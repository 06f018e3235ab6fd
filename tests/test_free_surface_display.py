"""Free surface at a glance: an exempt slack tank shows "ex" with its moment at the actual level;
a full or empty tank is never called exempt (IS 2008 B 3.1.2: ≥ 98 % is nominally full;
B 3.1.12: the small-tank exemption is for slack tanks)."""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.core.free_surface import EXEMPT_RULE
from deckload.core.model import TankFill
from deckload.core.stability import evaluate
from deckload.io.profiles import load_condition
from deckload.report.condition_report import render_report_text
from deckload.ui import views
from demo_vessels import demo_vessel


@pytest.fixture(scope="module")
def demo():
    v = demo_vessel()
    return v, load_condition(paths.DEMO_CONDITIONS["departure"], v)


def test_exempt_slack_tank_shows_ex_and_its_actual_moment(demo):
    v, c = demo
    r = evaluate(v, c)
    fw2p = next(t for t in r.tanks if t.id == "FW2P")
    assert fw2p.fs_rule == EXEMPT_RULE and fw2p.fsm_tm == 0.0 and fw2p.state == "slack"
    actual = fw2p.fsi_m4 * fw2p.density_t_m3  # FSM = ρ·i at the actual level (IS 2008 B 3.1)
    assert actual > 1.0  # at 95 % the tank has a real moment: that is why "0.0" misled
    row = next(row for row in views.board_rows(v, c, r, False, width=120) if row.key == ("tank", "FW2P"))
    assert f" ex{actual:4.1f}" in row.text.plain
    text = render_report_text(r, v, c)
    line = next(ln for ln in text.splitlines() if ln.startswith("FW2P"))
    assert "exempt" in line and f"{actual:.2f} at level, uncounted" in line


@pytest.mark.parametrize("pct, expected", [(100.0, "nominally full"), (0.0, "empty")])
def test_a_full_or_empty_small_tank_is_never_called_exempt(demo, pct, expected):
    v, c = demo
    c2 = c.with_tank(TankFill("FW2P", "percent", pct)) if pct else c.without_tank("FW2P")
    r = evaluate(v, c2)
    fw2p = next(t for t in r.tanks if t.id == "FW2P")
    assert fw2p.fsm_tm == 0.0 and fw2p.fs_rule.startswith(expected)
    text = render_report_text(r, v, c2)
    assert not any(ln.startswith("FW2P") and "exempt" in ln for ln in text.splitlines())
    assert not any("exempt" in ln and "FW2P" in ln for ln in text.splitlines())
