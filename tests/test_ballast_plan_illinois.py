"""The ballast planner's search along one transfer (``deckload.core.ballast_plan._search``), step by
step, on responses whose iterates are derived exactly in each docstring.

The rule (the module's docstring; regula falsi with the Illinois modification, common practice of
root finding): with the target bracketed by the masses ``lo`` (value f_lo) and ``hi`` (f_hi), the
next mass is the secant root m = (lo·f_hi − hi·f_lo)/(f_hi − f_lo), never nearer ``lo`` than
1e-9 t; m replaces the end whose f has its sign; when the same end is replaced twice running,
the f kept at the other end is halved.  A list or trim stops at the first m within the tolerance;
a GM goal (at least the target) at the first m that reaches it and is within the tolerance above
it, or within 1e-3 t (1 kg) of the least mass known to reach it, or once the bracket is narrower
than 1e-3 t; with no step reaching it after MAX_STEPS, the whole transfer (when it reaches it).

Here the "transfer" is the mass itself (``apply(m) = m``) and the result carries the chosen
response as its list, trim and GM, so each test fixes f(m) exactly.  Masses are compared to
1e-12 t: the iterates are rationals computed in floating point with a few roundings of 1e-16.
"""

from __future__ import annotations

from fractions import Fraction
from types import SimpleNamespace

import pytest

from deckload.core.ballast_plan import MAX_STEPS, Goal, _search

EXACT = 1e-12
"""Iterates compared to their exact rationals: floating-point round-off only."""


def search(value, goal: Goal, hi: float):
    """Run the search on ``value(m)``; returns (hit, whole, masses evaluated in order)."""
    asked: list[float] = []

    def evaluate(_vessel, m):
        asked.append(m)
        v = value(m)
        return SimpleNamespace(list_deg=v, trim_m=v, gm_fluid_m=v)

    hit, whole = _search(None, goal, hi, value(0.0), lambda m: m, evaluate)
    return hit, whole, asked


def test_a_convex_list_halves_the_far_end_when_the_near_one_moves_twice():
    """list(m) = m² − 2 (°), 0 ≤ m ≤ 2, goal 0 ± 0.01°.  Iterates (f = list):
    whole 2 (f 2); m₁ = (0·2 − 2·(−2))/4 = 1 (f −1, lo);
    m₂ = (1·2 − 2·(−1))/3 = 4/3 (f −2/9, lo again: f_hi 2 → 1);
    m₃ = (4/3·1 + 2·2/9)/(1 + 2/9) = 16/11 (f 14/121, hi);
    m₄ = (4/3·14/121 + 16/11·2/9)/(14/121 + 2/9) = 65/46 (f −7/2116, within 0.01°): 5 calculations."""
    hit, whole, asked = search(lambda m: m * m - 2, Goal("list", 0.0, 0.01), 2.0)
    assert asked == pytest.approx([2.0, 1.0, 4 / 3, 16 / 11, 65 / 46], abs=EXACT)
    m, _, _, after, n = hit
    assert m == pytest.approx(65 / 46, abs=EXACT) and after == pytest.approx(-7 / 2116, abs=EXACT) and n == 5
    assert whole[2] == 2.0


def test_a_concave_list_halves_the_near_end_when_the_far_one_moves_twice():
    """list(m) = 2 − (2 − m)² (°), the mirror: whole 2 (f 2); m₁ = 1 (f 1, hi); m₂ = 2/3 (f 2/9,
    hi again: f_lo −2 → −1); m₃ = (0·2/9 + 2/3·1)/(2/9 + 1) = 6/11 (f −14/121, lo);
    m₄ = 27/46 (f 7/2116): 5 calculations."""
    hit, _, asked = search(lambda m: 2 - (2 - m) ** 2, Goal("list", 0.0, 0.01), 2.0)
    assert asked == pytest.approx([2.0, 1.0, 2 / 3, 6 / 11, 27 / 46], abs=EXACT)
    assert hit[0] == pytest.approx(27 / 46, abs=EXACT) and hit[3] == pytest.approx(7 / 2116, abs=EXACT) and hit[4] == 5


def test_a_tight_list_tolerance_is_searched_to_the_end_however_narrow_the_bracket():
    """list(m) = m² − 2, goal 0 ± 1e-9°: after m₄ = 65/46 the bracket (65/46, 16/11) is 0.04 t,
    then 1.4141971, 1.4142295, 1.41421356228: within 1e-9° of √2's list (m = √2 = 1.41421356237,
    list −2.6e-10°), in 8 calculations; the bracket was below 1e-3 t two steps before."""
    hit, _, asked = search(lambda m: m * m - 2, Goal("list", 0.0, 1e-9), 2.0)
    assert len(asked) == 8 and hit[4] == 8
    assert abs(hit[0] - 2 ** 0.5) < 1e-9 and abs(hit[3]) <= 1e-9


def test_a_gm_goal_is_searched_on_past_a_step_well_above_the_least_value():
    """GM(m) = 0.5 + 2 − (2 − m)² (m), at least 0.5 m (± 0.001 above).  As the concave list:
    m₁ = 1 (GM 1.5: reached, 1 m above, 1 t short of the whole: searched on), m₂ = 2/3,
    m₃ = 6/11 (short), m₄ = 27/46 (0.0033 m above: on), m₅ = the secant of (6/11, −14/121) and
    (27/46, 7/2116) = 850/1451 = 0.585803 t, 0.0000465 m above: within 0.001, 6 calculations.
    The least mass is 2 − √2 = 0.585786 t."""
    hit, _, asked = search(lambda m: 2.5 - (2 - m) ** 2, Goal("gm", 0.5, 0.001), 2.0)
    assert asked == pytest.approx([2.0, 1.0, 2 / 3, 6 / 11, 27 / 46, float(Fraction(850, 1451))], abs=EXACT)
    m, _, _, after, n = hit
    assert m == pytest.approx(850 / 1451, abs=EXACT) and n == 6
    assert 0.5 <= after <= 0.501 and 0 < m - (2 - 2 ** 0.5) < 1e-3


def test_a_gm_that_jumps_above_the_least_value_is_found_to_the_kilogram():
    """GM(m) = 0.4 m below m = 1.2345 t, 0.55 m from there on (a step, as a slack tank's free
    surface lost when it is pressed up), at least 0.5 m: no mass gives GM within 0.001 m above
    it, so the search narrows the bracket round the step until it is under 1 kg: it ends on the
    least mass known to reach it, 1.2349879 t, within 1e-3 t above the step, after 15
    calculations."""
    hit, _, asked = search(lambda m: 0.55 if m >= 1.2345 else 0.4, Goal("gm", 0.5, 0.001), 2.0)
    m, _, r, after, n = hit
    assert 1.2345 <= m < 1.2345 + 1e-3 and after == 0.55 and r.gm_fluid_m == 0.55
    assert n == 15 == len(asked) and m == pytest.approx(1.2349878914122163, abs=EXACT)


def test_one_kilogram_from_the_least_mass_known_is_the_edge_not_yet_inside():
    """GM through (0, 0.0), (0.001, 0.75), (0.002, 1.0) t (straight between), at least 0.5 m:
    m₁ = 0.002·0.5/1.0 = 0.001 t reaches it 0.25 m above, exactly 1e-3 t short of the whole:
    not yet "within 1 kg", and the bracket (0, 0.001) is not yet narrower than 1 kg; m₂ =
    0.001·0.5/0.75 = 0.000667 t is the root of the first segment (GM 0.5 to round-off): 3
    calculations."""
    def gm(m):
        return 0.75 * m / 0.001 if m <= 0.001 else 0.75 + 0.25 * (m - 0.001) / 0.001

    hit, _, asked = search(gm, Goal("gm", 0.5, 0.001), 0.002)
    assert asked == pytest.approx([0.002, 0.001, 0.001 / 1.5], abs=EXACT)
    assert hit[0] == pytest.approx(0.001 / 1.5, abs=EXACT) and hit[4] == 3


def test_a_gm_exactly_its_tolerance_above_the_target_is_within_it():
    """GM through (0, 0.0), (1, 0.75), (2, 1.0) t, at least 0.5 m ± 0.25: m₁ = 2·0.5/1.0 = 1 t,
    GM 0.75 = 0.5 + 0.25 exactly: within the tolerance (the edge included), 2 calculations."""
    hit, _, asked = search(lambda m: 0.75 * m if m <= 1 else 0.75 + 0.25 * (m - 1), Goal("gm", 0.5, 0.25), 2.0)
    assert asked == [2.0, 1.0] and hit[0] == 1.0 and hit[3] == 0.75 and hit[4] == 2


def test_each_step_goes_at_least_a_nanotonne_past_the_mass_known_short():
    """GM = 0.5 − 5e-12 + 0.01·m, at least 0.5 m: the secant root is 5e-10 t; the step is taken
    to 1e-9 t instead (so that every step makes progress): GM 0.5 + 5e-12, 2 calculations."""
    hit, _, asked = search(lambda m: 0.5 - 5e-12 + 0.01 * m, Goal("gm", 0.5, 0.001), 10.0)
    assert asked == [10.0, 1e-9] and hit[0] == 1e-9 and hit[4] == 2


def test_when_no_step_reaches_a_gm_goal_the_whole_transfer_does():
    """GM 5e-12 m short of 0.5 m for every mass below 10 t, 1.0 m at the whole 10 t: the
    secant crawls from 0 (each step 1e-9 t or a little more; the far end halved each time) and
    after MAX_STEPS = 40 steps has not reached it; the whole transfer reaches it and is the
    answer: 10 t, with the result of the whole transfer (GM 1.0 m), 41 calculations."""
    hit, whole, asked = search(lambda m: 1.0 if m >= 10.0 else 0.5 - 5e-12, Goal("gm", 0.5, 0.001), 10.0)
    assert len(asked) == MAX_STEPS + 1 and max(asked[1:]) < 10.0
    m, c, r, _, n = hit
    assert m == 10.0 and c == 10.0 and r.gm_fluid_m == 1.0 and n == MAX_STEPS + 1
    assert whole[2] == 1.0


def test_a_transfer_that_cannot_bring_her_through_the_target_costs_one_calculation():
    """list 0.5° → 0.6° over the whole transfer, goal 0 ± 0.1: it never brackets the target;
    only the whole transfer is calculated, and nothing is proposed."""
    hit, whole, asked = search(lambda m: 0.5 + 0.01 * m, Goal("list", 0.0, 0.1), 10.0)
    assert hit is None and asked == [10.0] and whole[2] == pytest.approx(0.6, abs=EXACT)


def test_a_gm_step_that_moves_less_than_a_kilogram_ends_the_search():
    """GM 0.4 m up to 0.02 t pumped, 0.5015 m from there to the whole 0.05 t (a plateau just
    above the 0.001 m tolerance), at least 0.5 m: m₁ = 0.05·0.1/(0.0015 + 0.1) = 0.0492611 t
    reaches it 0.0015 m above, 0.74 kg short of the whole transfer: within 1 kg of the least mass
    known to reach it, so the search ends there, in 2 calculations (to the kilogram of what it
    has seen; the plateau's start at 0.02 t is not looked for)."""
    hit, _, asked = search(lambda m: 0.5015 if m >= 0.02 else 0.4, Goal("gm", 0.5, 0.001), 0.05)
    assert asked == pytest.approx([0.05, 0.005 / 0.1015], abs=EXACT)
    assert hit[0] == pytest.approx(0.005 / 0.1015, abs=EXACT) and hit[4] == 2


def test_a_gm_step_is_closed_in_on_until_the_bracket_is_under_a_kilogram():
    """GM 0.4 m below 0.5 t pumped, 0.55 m from 0.5 t (a step), at least 0.5 m, whole 2 t: no
    mass gives GM within 0.001 m above it; the bracket round the step closes to under 1 kg after
    a step that falls short of it, and the least mass known to reach it is the answer: 0.5006689 t,
    15 calculations."""
    hit, _, asked = search(lambda m: 0.55 if m >= 0.5 else 0.4, Goal("gm", 0.5, 0.001), 2.0)
    assert 0.5 <= hit[0] < 0.5 + 1e-3 and hit[3] == 0.55
    assert hit[0] == pytest.approx(0.500668935968, abs=1e-11) and hit[4] == 15 == len(asked)


def test_a_list_that_jumps_across_the_goal_is_not_met_by_the_end_of_the_bracket():
    """List 0.2° to port below 1.05 t pumped, 5° to starboard from there (a vessel that flops
    over to a loll on the other side), goal upright ± 0.1°: no mass is within 0.1°.  After
    MAX_STEPS steps the bracket has closed on the jump and its far end has been halved towards
    zero, but a list is only ever met by a mass that gives it: nothing is proposed."""
    hit, whole, asked = search(lambda m: 5.0 if m >= 1.05 else -0.2, Goal("list", 0.0, 0.1), 2.0)
    assert hit is None and whole[2] == 5.0 and len(asked) == MAX_STEPS + 1
