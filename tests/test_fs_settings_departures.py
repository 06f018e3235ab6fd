"""``[free_surface]`` settings that leave out moments IS 2008 Part B 3.1 counts: an audit warning
naming the key and the Code's value, and a caution on every result.

The Code's values (standards.md §4.1 and §8 rows 15–16): a tank is nominally full at 98 % (B 3.1.2,
confirmed); a small tank may be left out when Mfs(30°)/Δmin < 0.01 m (B 3.1.12: the paragraph
confirmed, the 0.01 m from memory).  The "empty" level is deckload's own 0.5 % (the Code ignores only
the usual remainder, from memory).

The tank is a box 8 × 4.5 × 0.8 m double-bottom ballast tank of the checks.md §1 barge (DB1P of
``vessel_factories.barge_tanks``), ρ 1.025: i = l·b³/12 = 8·4.5³/12 = 60.75 m⁴ (standards.md §4.3,
textbook), FSM = ρ·i = 62.269 t·m at any slack level (a box's free surface does not change with level).
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.audit import WARNING, audit
from deckload.core.model import Condition, FreeSurfaceSettings, TankFill
from deckload.core.stability import evaluate
from fv22_audit import vessel as fv22
from vessel_factories import barge_tanks, box_barge

FSM_DB1P = 1.025 * 8.0 * 4.5 ** 3 / 12.0  # ρ·l·b³/12 (standards.md §4.3)


def _barge(**fs):
    tanks = tuple(t for t in barge_tanks() if t.id in ("DB1P", "DB1S"))
    return box_barge(lightship_t=700.0, lightship_kg_m=3.0, tanks=tanks,
                     free_surface=FreeSurfaceSettings(min_operating_displacement_t=700.0, **fs))


def _at_60_pct(v):
    return evaluate(v, Condition(name="DB1P at 60 %", tanks=(TankFill("DB1P", "percent", 60.0),)))


def _departure(r):
    return [w for w in r.warnings if w.code == "fs-settings-departure"]


def test_a_tank_at_60_pct_counts_under_the_code_and_the_profile_that_calls_it_full_is_named():
    """At the Code's 98 % the ballast tank at 60 % is slack and counts ρ·i (IS 2008 B 3.1.2, B 3.1.3:
    fixed level, actual level); with ``nominally_full_pct = 50`` it counts nothing, and the result
    says which setting did that and what the Code says (a caution, as for rule 'actual')."""
    code = _at_60_pct(_barge())
    assert code.fsm_total_tm == pytest.approx(FSM_DB1P, rel=1e-9)
    assert not _departure(code)
    off = _at_60_pct(_barge(nominally_full_pct=50.0))
    assert off.fsm_total_tm == 0.0
    (w,) = _departure(off)
    assert w.severity == "caution"
    assert "nominally_full_pct 50 % (IS 2008 B 3.1.2: 98 %)" in w.message
    assert "left out of GM and GZ" in w.message


def test_a_small_tank_limit_above_the_codes_is_named_under_the_part_b_rule_only():
    """``small_tank_limit_m = 5`` exempts the 62 t·m tank (Mfs(30°)/Δmin ≈ 0.05 m, far above the
    Code's 0.01 m, B 3.1.12): the caution names the key and the 0.01 m; under rule 'actual' nothing is
    exempted (B 3.1.6), so nothing departs."""
    v = _barge(small_tank_limit_m=5.0)
    r = _at_60_pct(v)
    assert r.fsm_total_tm == 0.0
    (w,) = _departure(r)
    assert "small_tank_limit_m 5 m (IS 2008 B 3.1.12: Mfs(30°)/Δmin < 0.01 m, from memory)" in w.message
    actual = evaluate(v, Condition(tanks=(TankFill("DB1P", "percent", 60.0),), fs_rule="actual"))
    assert actual.fsm_total_tm == pytest.approx(FSM_DB1P, rel=1e-9)
    assert not _departure(actual)


@pytest.mark.parametrize("key,value,words", [
    ("nominally_full_pct", 97.0, "nominally_full_pct 97 % (IS 2008 B 3.1.2: 98 %)"),
    ("small_tank_limit_m", 0.02, "small_tank_limit_m 0.02 m (IS 2008 B 3.1.12: Mfs(30°)/Δmin < 0.01 m"),
    ("empty_pct", 5.0, "empty_pct 5 % (the Code counts every tank below 98 % as slack"),
])
def test_the_audit_warns_of_each_departure_with_its_key_and_the_codes_value(key, value, words):
    """Each departure is a warning (a doubt: Part B is recommendatory and the Administration may have
    accepted it), located at ``free_surface.<key>``, with the Code's value in its words."""
    v = fv22()
    v = dataclasses.replace(v, free_surface=dataclasses.replace(v.free_surface, **{key: value}))
    (f,) = [f for f in audit(v) if f.check == "fs-setting"]
    assert (f.severity, f.key, f.path) == (WARNING, f"free_surface.{key}", ("free_surface", key))
    assert words in f.why


def test_settings_on_the_safe_side_of_the_code_are_no_departure():
    """A higher full level, a lower or no small-tank exemption, a lower empty level count more free
    surface than the Code, never less: no caution, no audit warning; the same profile a hair on the
    other side of the Code's value draws both."""
    for fs in (dict(nominally_full_pct=99.0), dict(small_tank_limit_m=0.0), dict(small_tank_limit_m=0.005),
               dict(empty_pct=0.1), {}):
        v = _barge(**fs)
        assert not _departure(_at_60_pct(v))
        assert not [f for f in audit(v) if f.check == "fs-setting"]
    for fs in (dict(nominally_full_pct=97.9), dict(small_tank_limit_m=0.0101), dict(empty_pct=0.6)):
        v = _barge(**fs)
        assert len(_departure(_at_60_pct(v))) == 1
        assert len([f for f in audit(v) if f.check == "fs-setting"]) == 1
