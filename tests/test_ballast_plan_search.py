"""Which plan the ballast planner proposes (``deckload.core.ballast_plan``), on small invented
barges whose best plan is derived by hand below.

The planner is pure over the three functions it is given (``move``, ``room``, ``evaluate``; see the
module's docstring), so these tests give it a barge whose response to the tanks is linear and
written out here, and check WHICH transfers it proposes, in what order, the masses, the value it
states after them, the value before, and how many full calculations it says it made.

The invented barge (a box, common practice small-angle formulas with the displacement, GM and
MCT held fixed, since a transfer moves mass but never adds it):

* list (°, + starboard)  = list₀ + Σ m·y / 100   (100 t·m of transverse moment heel her 1°);
* trim (m, + by the stern) = trim₀ − Σ m·x / 1000 (MCT 1000 t·m per metre; x + forward);
* GM fluid (m)            = GM₀ − Σ m·z / 1000   (Δ = 1000 t: a tonne raised 1 m lowers G 1 mm).

``room(a, b)`` is the least of what a holds and what b can take; tanks of different kinds do not
pump into each other (``ValueError``, as the transfer form's own room); a condition trimmed more
than 2 m either way is outside her tables (``evaluate`` raises ``ValueError``).  A straight line
is searched exactly: the first regula-falsi step of a linear response lands on its root (to
round-off), so every search that brackets the target costs two calculations (the whole transfer,
then the root) and one that does not costs one.  Masses are compared to 1e-9 t: the round-off of
that one secant step on numbers of order 10 (about 1e-14) is far inside it.
"""

from __future__ import annotations

from dataclasses import dataclass

import pytest

from deckload.core.ballast_plan import Goal, NoPlan, Plan, Proposal, Transfer, plan, propose

MASS_TOL_T = 1e-9
"""Masses found by one secant step on a straight line: round-off only (see the module docstring)."""


@dataclass(frozen=True)
class Tk:
    id: str
    x_m: float
    y_m: float
    z_m: float
    capacity_t: float
    pair: str | None = None
    kind: str = "water_ballast"


@dataclass(frozen=True)
class Barge:
    tanks: tuple[Tk, ...]
    list0_deg: float = 0.0
    trim0_m: float = 0.0
    gm0_m: float = 1.0

    def tank(self, ident: str) -> Tk:
        return next(t for t in self.tanks if t.id == ident)


@dataclass(frozen=True)
class Res:
    list_deg: float
    trim_m: float
    gm_fluid_m: float


class Calc:
    """``move``, ``room`` and ``evaluate`` of the invented barge; ``calls`` counts the full
    calculations made (an independent count of what the planner reports as ``evaluations``)."""

    def __init__(self, barge: Barge):
        self.barge, self.calls = barge, 0

    def room(self, cond, a: str, b: str) -> float:
        ta, tb = self.barge.tank(a), self.barge.tank(b)
        if ta.kind != tb.kind:
            raise ValueError("a transfer moves one kind of liquid only")
        m = dict(cond)
        return max(0.0, min(m[a], tb.capacity_t - m[b]))

    def move(self, cond, a: str, b: str, mass_t: float):
        if not 0.0 <= mass_t <= self.room(cond, a, b):
            raise ValueError(f"cannot pump {mass_t} t from {a} to {b}")
        m = dict(cond)
        m[a] -= mass_t
        m[b] += mass_t
        return tuple(m.items())

    def evaluate(self, barge: Barge, cond) -> Res:
        self.calls += 1
        m = dict(cond)
        t = {k.id: k for k in barge.tanks}
        trim = barge.trim0_m - sum(w * t[i].x_m for i, w in m.items()) / 1000.0
        if abs(trim) > 2.0:
            raise ValueError(f"trim {trim:.3f} m is outside the tables")
        return Res(barge.list0_deg + sum(w * t[i].y_m for i, w in m.items()) / 100.0, trim,
                   barge.gm0_m - sum(w * t[i].z_m for i, w in m.items()) / 1000.0)

    def kw(self) -> dict:
        return dict(move=self.move, room=self.room, evaluate=self.evaluate)


def cond(**masses: float):
    return tuple(masses.items())


def check_transfers(got, want) -> None:
    """Same tanks in the same order; masses to MASS_TOL_T."""
    assert [(t.from_id, t.to_id) for t in got] == [(a, b) for a, b, _ in want]
    for t, (_, _, m) in zip(got, want):
        assert t.mass_t == pytest.approx(m, abs=MASS_TOL_T)


# --------------------------------------------------------------------------- goals

@pytest.mark.parametrize("search", [propose, plan])
def test_a_goal_the_planner_does_not_know_is_refused_naming_it_and_the_goals(search):
    wings = Barge((Tk("WP", 0, -5, 1, 50), Tk("WS", 0, 5, 1, 50)))
    calc = Calc(wings)
    with pytest.raises(ValueError) as e:
        search(wings, cond(WP=30.0, WS=10.0), Goal("heel", 0.0, 0.1), ["WP", "WS"], **calc.kw())
    assert str(e.value) == "goal 'heel' is not one of list, trim, gm"


# --------------------------------------------------------------------------- one transfer, list

WINGS = Barge((Tk("WP", 0, -5, 1, 50), Tk("WS", 0, 5, 1, 50)))
"""Two wing tanks 5 m either side, 50 t each."""


def test_one_transfer_to_a_list_of_half_a_degree_starboard_is_derived_exactly():
    """WP 30 t, WS 10 t: list = (−5·30 + 5·10)/100 = −1.0° (port).  Goal list +0.5° ± 0.1°.
    WP → WS, m t: list = (−5(30 − m) + 5(10 + m))/100 = −1 + m/10, so m = 15 t (list 0.5°
    exactly); room min(30, 50 − 10) = 30 t, the whole transfer gives +2.0°, which brackets
    the goal: two calculations.  WS → WP only lists her further to port (one calculation,
    nothing proposed)."""
    calc = Calc(WINGS)
    c = cond(WP=30.0, WS=10.0)
    found = propose(WINGS, c, Goal("list", 0.5, 0.1), ["WP", "WS"], **calc.kw())
    assert len(found) == 1 and isinstance(found[0], Proposal)
    p = found[0]
    assert (p.from_id, p.to_id) == ("WP", "WS") and p.mass_t == pytest.approx(15.0, abs=MASS_TOL_T)
    assert p.before == -1.0 and p.after == pytest.approx(0.5, abs=1e-12)
    assert dict(p.condition) == pytest.approx({"WP": 15.0, "WS": 25.0}, abs=MASS_TOL_T)
    assert p.result.list_deg == pytest.approx(0.5, abs=1e-12)
    assert p.evaluations == 2
    assert calc.calls == 1 + 2 + 1  # the condition itself, WP → WS, WS → WP

    calc = Calc(WINGS)
    got = plan(WINGS, c, Goal("list", 0.5, 0.1), ["WP", "WS"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("WP", "WS", 15.0)])
    assert got.before == -1.0 and got.after == pytest.approx(0.5, abs=1e-12)
    assert got.result.list_deg == pytest.approx(0.5, abs=1e-12)
    assert dict(got.condition) == pytest.approx({"WP": 15.0, "WS": 25.0}, abs=MASS_TOL_T)
    assert got.evaluations == 4 == calc.calls


def test_a_list_goal_beyond_one_degree_is_not_held_to_the_list_a_trim_plan_keeps():
    """A list goal is the list itself: no 'keep her upright' limit applies to it.  From −1.0°,
    list +1.5°: WP → WS m = 25 t (−1 + 25/10 = 1.5°, exactly)."""
    calc = Calc(WINGS)
    got = plan(WINGS, cond(WP=30.0, WS=10.0), Goal("list", 1.5, 0.1), ["WP", "WS"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("WP", "WS", 25.0)])
    assert got.after == pytest.approx(1.5, abs=1e-12)


def test_emptying_the_port_wing_lands_exactly_on_upright_and_is_proposed():
    """list₀ = −0.5° from the rest of her, WP 10 t, WS empty: −0.5 − 5·10/100 = −1.0°.  The
    whole of WP into WS (10 t) gives −0.5 + 50/100 = 0.0° exactly: the end of the interval is
    the target itself, and that whole transfer is the plan."""
    barge = Barge(WINGS.tanks, list0_deg=-0.5)
    for search in (propose, plan):
        calc = Calc(barge)
        got = search(barge, cond(WP=10.0, WS=0.0), Goal("list", 0.0, 0.1), ["WP", "WS"], **calc.kw())
        transfers = got.transfers if search is plan else [Transfer(p.from_id, p.to_id, p.mass_t) for p in got]
        check_transfers(transfers, [("WP", "WS", 10.0)])


def test_a_tank_of_another_liquid_or_a_transfer_outside_the_tables_is_left_out_not_the_rest():
    """Fresh water FW (centreline) cannot take ballast, and the fore peak FPK (40 m forward)
    would trim her 30·40/1000 = 1.2 m more by the head from −1.0 m: −2.2 m, outside her
    tables.  Both are left out; WP → WS (15 t, as above) is still found.  Every transfer
    tried costs a calculation, the refused whole ones too: the condition, WP → WS (2),
    WP → FPK (1, refused), WS → WP (1), WS → FPK (1) = 6."""
    barge = Barge((Tk("WP", 0, -5, 1, 50), Tk("FW", 0, 0, 1, 20, kind="fresh_water"), Tk("WS", 0, 5, 1, 50),
                   Tk("FPK", 40, 0, 1, 60)), trim0_m=-1.0)
    calc = Calc(barge)
    c = cond(WP=30.0, FW=10.0, WS=10.0, FPK=0.0)
    got = plan(barge, c, Goal("list", 0.5, 0.1), ["WP", "FW", "WS", "FPK"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("WP", "WS", 15.0)])
    assert got.evaluations == 6 == calc.calls
    calc = Calc(barge)
    found = propose(barge, c, Goal("list", 0.5, 0.1), ["WP", "FW", "WS", "FPK"], **calc.kw())
    assert [(p.from_id, p.to_id) for p in found] == [("WP", "WS")]


# --------------------------------------------------------------------------- what counts as something to pump

@pytest.mark.parametrize("have_t, proposed", [(1e-6, False), (2e-6, True)])
def test_a_tank_holding_a_millionth_of_a_tonne_has_nothing_to_give(have_t, proposed):
    """WP holds ``have_t``, WS is empty: list = −5·have/100.  Goal upright ± 1e-8°: the whole
    of WP into WS gives +5·have/100, which brackets it (m = have/2).  A tank with 1e-6 t or
    less counts as empty (nothing to pump); 2e-6 t is pumped."""
    for search in (propose, plan):
        calc = Calc(WINGS)
        got = search(WINGS, cond(WP=have_t, WS=0.0), Goal("list", 0.0, 1e-8), ["WP", "WS"], **calc.kw())
        if search is propose:
            assert [(p.from_id, p.to_id, p.mass_t) for p in got] == ([("WP", "WS", pytest.approx(have_t / 2, rel=1e-6))]
                                                                      if proposed else [])
        elif proposed:
            assert isinstance(got, Plan)
            check_transfers(got.transfers, [("WP", "WS", have_t / 2)])
        else:
            assert isinstance(got, NoPlan) and got.transfers == () and got.best == got.before == -5 * have_t / 100


def test_a_transfer_of_under_a_tonne_is_found():
    """list₀ = +0.01°, WP 0.8 t, WS empty: list = 0.01 − 0.04 + m/10 after m t WP → WS,
    upright at m = 0.3 t (room 0.8 t)."""
    barge = Barge(WINGS.tanks, list0_deg=0.01)
    calc = Calc(barge)
    got = plan(barge, cond(WP=0.8, WS=0.0), Goal("list", 0.0, 0.01), ["WP", "WS"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("WP", "WS", 0.3)])
    found = propose(barge, cond(WP=0.8, WS=0.0), Goal("list", 0.0, 0.01), ["WP", "WS"], **calc.kw())
    assert [(p.from_id, p.to_id) for p in found] == [("WP", "WS")]
    assert found[0].mass_t == pytest.approx(0.3, abs=MASS_TOL_T)


# --------------------------------------------------------------------------- wing pairs pumped alike (trim)

AFT_P, AFT_S = Tk("AP", -20, -4, 1, 30, pair="AS"), Tk("AS", -20, 4, 1, 30, pair="AP")
FWD_P, FWD_S = Tk("FP", 20, -4, 1, 15, pair="FS"), Tk("FS", 20, 4, 1, 15, pair="FP")
PAIRS = Barge((AFT_P, AFT_S, FWD_P, FWD_S))
"""Aft wings AP/AS (x −20 m, y ∓4 m, 30 t) and forward wings FP/FS (x +20 m, y ∓4 m, 15 t)."""
PAIRS_LOADED = cond(AP=25.0, AS=25.0, FP=0.0, FS=0.0)
"""Trim = −(25·(−20)·2)/1000 = +1.0 m by the stern; list 0°."""
ALL4 = ["AP", "AS", "FP", "FS"]


def test_a_trim_goal_beyond_what_one_forward_wing_can_take_is_reached_by_the_wing_pairs_alike():
    """Trim 0.2 m ± 0.01 from 1.0 m: 0.8 m of trim is 800 t·m, 20 t moved 40 m forward.  One
    forward wing takes 15 t at most (trim 1.0 − 15·40/1000 = 0.4 m), and a cross transfer
    (AP → FS) lists her (15·8/100 = 1.2° > the 1° she must keep).  The pair AP → FP with
    AS → FS, m t each: trim = 1.0 − 0.08·m, so m = 10 t each (room min(15, 15) = 15).  The
    crossed pair AP → FS with AS → FP needs the same 10 t each: the straight pair, found first,
    is the plan.

    Calculations: the condition; single transfers AP → AS and AS → AP (5 t of room: no change
    in trim), AP → FP, AP → FS, AS → FP, AS → FS (one each, none brackets); the two pairs (two
    each); a tank's own partner is never its pair, the forward wings have nothing to give:
    1 + 6 + 4 = 11."""
    calc = Calc(PAIRS)
    got = plan(PAIRS, PAIRS_LOADED, Goal("trim", 0.2, 0.01), ALL4, **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("AP", "FP", 10.0), ("AS", "FS", 10.0)])
    assert got.before == 1.0 and got.after == pytest.approx(0.2, abs=1e-12)
    assert got.result.trim_m == pytest.approx(0.2, abs=1e-12) and got.result.list_deg == pytest.approx(0.0, abs=1e-12)
    assert got.evaluations == 11 == calc.calls


@pytest.mark.parametrize("most, planned", [(2, True), (1, False)])
def test_a_pair_counts_as_two_transfers_of_the_most_allowed(most, planned):
    """As above, with at most ``most`` transfers.  With 2, the pair is the plan.  With 1 the
    pair is out; the nearest single whole transfer, AP → FP 15 t (0.4 m, upright; AS → FS gives
    the same and comes later), is made and no second is allowed: no plan, nearest 0.4 m."""
    calc = Calc(PAIRS)
    got = plan(PAIRS, PAIRS_LOADED, Goal("trim", 0.2, 0.01), ALL4, max_transfers=most, **calc.kw())
    if planned:
        assert isinstance(got, Plan)
        check_transfers(got.transfers, [("AP", "FP", 10.0), ("AS", "FS", 10.0)])
    else:
        assert isinstance(got, NoPlan)
        check_transfers(got.transfers, [("AP", "FP", 15.0)])
        assert got.best == pytest.approx(0.4, abs=1e-12) and got.before == 1.0 and got.list_limit_deg == 1.0


def test_a_wing_pair_is_pumped_alike_only_when_all_four_tanks_are_allowed():
    """Allowed AP, AS, FP (not FS): no pair.  AP → FP 15 t (0.4 m, upright) is the nearest
    whole transfer; from there AP → AS and AS → AP leave the trim, FP → AP and FP → AS trim her
    back: no plan, nearest 0.4 m after AP → FP 15 t.  FS not allowed, FP counts as a tank of no
    partner: the aft pair pumped alike into it (7.5 t each, what FP takes: 0.4 m, no nearer) and,
    once FP is full, FP split between AP and AS alike (5 t each, what AS takes) are tried too.
    Calculations 1 + 4 (AP → AS, AP → FP, AS → AP, AS → FP) + 1 (AP and AS → FP) + 4 (AP → AS,
    AS → AP, FP → AP, FP → AS) + 1 (FP → AP and AS) = 11.

    Allowed AP, FP, FS (not AS): AP counts as a tank of no partner, split between the forward
    wings alike: AP holds 25 t, so 12.5 t each at most (trim 1.0 − 25·40/1000 = 0), and 0.2 m
    is reached at 10 t each, listing her (−4·5 + 4·25 − 4·10 + 4·10)/100 = 0.8° (within 1°).
    Calculations 1 + 1 (AP → FP whole, 0.4 m) + 1 (AP → FS whole) + 2 (the split: whole, root)
    = 5.  (Before splits were searched, the plan was AP → FP 15 t then AP → FS 5 t.)"""
    calc = Calc(PAIRS)
    got = plan(PAIRS, PAIRS_LOADED, Goal("trim", 0.2, 0.01), ["AP", "AS", "FP"], **calc.kw())
    assert isinstance(got, NoPlan)
    check_transfers(got.transfers, [("AP", "FP", 15.0)])
    assert got.best == pytest.approx(0.4, abs=1e-12) and got.evaluations == 11 == calc.calls

    calc = Calc(PAIRS)
    got = plan(PAIRS, PAIRS_LOADED, Goal("trim", 0.2, 0.01), ["AP", "FP", "FS"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("AP", "FP", 10.0), ("AP", "FS", 10.0)])
    assert got.after == pytest.approx(0.2, abs=1e-12) and got.result.list_deg == pytest.approx(0.8, abs=1e-12)
    assert got.evaluations == 5 == calc.calls


def test_a_tank_of_another_liquid_among_the_allowed_does_not_hide_the_wing_pairs():
    """Fresh-water wings WP/WS (amidships, a pair) allowed between the ballast wings: every
    transfer between the two liquids is refused by ``room``, and the ballast pair AP → FP with
    AS → FS (10 t each, as above) is still the plan."""
    barge = Barge((AFT_P, AFT_S, Tk("WP", 0, -4, 1, 10, pair="WS", kind="fresh_water"),
                   Tk("WS", 0, 4, 1, 10, pair="WP", kind="fresh_water"), FWD_P, FWD_S))
    calc = Calc(barge)
    c = cond(AP=25.0, AS=25.0, WP=5.0, WS=5.0, FP=0.0, FS=0.0)
    got = plan(barge, c, Goal("trim", 0.2, 0.01), ["AP", "AS", "WP", "WS", "FP", "FS"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("AP", "FP", 10.0), ("AS", "FS", 10.0)])


@pytest.mark.parametrize("have_t, cap_t, goal, want", [
    (1e-6, 15.0, Goal("trim", 0.0, 1e-9), None),
    (0.8, 0.5, Goal("trim", 0.0, 0.001), [("AP", "FP", 0.4), ("AS", "FS", 0.4)]),
])
def test_small_wing_pair_transfers(have_t, cap_t, goal, want):
    """Aft wings hold ``have_t`` each, forward wings (room ``cap_t``) are empty, trim₀ = 0:
    trim = 2·have·20/1000.

    * 1e-6 t each (trim 4e-8 m; goal 0 ± 1e-9 m): the aft wings have nothing to give, alone or
      as a pair: no plan, as she is.
    * 0.8 t each, forward wings of 0.5 t (trim 0.032 m; goal 0 ± 0.001 m): one forward wing
      takes 0.5 t (0.032 − 0.02 = 0.012 m); the pair, m t each, gives 0.032 − 0.08·m, level at
      m = 0.4 t each, within the 0.5 t of room."""
    barge = Barge((AFT_P, AFT_S, Tk("FP", 20, -4, 1, cap_t, pair="FS"), Tk("FS", 20, 4, 1, cap_t, pair="FP")))
    calc = Calc(barge)
    got = plan(barge, cond(AP=have_t, AS=have_t, FP=0.0, FS=0.0), goal, ALL4, **calc.kw())
    if want is None:
        assert isinstance(got, NoPlan) and got.transfers == () and got.best == got.before
    else:
        assert isinstance(got, Plan)
        check_transfers(got.transfers, want)


def test_one_transfer_over_a_longer_lever_beats_a_pair_that_moves_more_in_all():
    """The wing pairs as above plus centreline tanks AC (x −30 m, 30 t of 40) and FC (x +30 m,
    empty, 40 t): trim = −0.9 + (25·20·2 + 30·30)/1000 = 1.0 m.  Trim 0.2 m by:
      AC → FC, m t: 1.0 − 0.06·m → 13.333 t;
      AP → FC or AS → FC: 1.0 − 0.05·m → 16 t (list ±0.64°, within 1°);
      the wing pairs alike: 10 t each, 20 t in all.
    The least pumping in all is AC → FC, 13.333 t."""
    barge = Barge((AFT_P, AFT_S, FWD_P, FWD_S, Tk("AC", -30, 0, 1, 40), Tk("FC", 30, 0, 1, 40)), trim0_m=-0.9)
    calc = Calc(barge)
    c = cond(AP=25.0, AS=25.0, FP=0.0, FS=0.0, AC=30.0, FC=0.0)
    got = plan(barge, c, Goal("trim", 0.2, 0.01), ALL4 + ["AC", "FC"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("AC", "FC", 0.8 / 0.06)])
    # propose offers single transfers only, smallest first: AC → FC, then AP → FC and AS → FC
    # (16 t each), then any other that brackets it.
    found = propose(barge, c, Goal("trim", 0.2, 0.01), ALL4 + ["AC", "FC"], **calc.kw())
    assert [(p.from_id, p.to_id) for p in found[:3]] == [("AC", "FC"), ("AP", "FC"), ("AS", "FC")]
    assert [p.mass_t for p in found[:3]] == pytest.approx([0.8 / 0.06, 16.0, 16.0], abs=MASS_TOL_T)
    assert all(isinstance(p, Proposal) for p in found)


# --------------------------------------------------------------------------- several transfers: the nearest whole one first

def test_trim_by_the_stern_in_two_steps_the_nearest_whole_transfer_first():
    """Centreline tanks F1 (x +10 m) and F2 (x +20 m), 5 t each of 10, A1 (x −20 m) empty, 10 t;
    trim₀ = 0.25 m: trim = 0.25 − (5·10 + 5·20)/1000 = 0.1 m.  Goal 0.4 m ± 0.01 m.
    Whole transfers: F1 → A1 (5 t) +0.15 → 0.25 m; F2 → A1 (5 t) +0.2 → 0.3 m; F2 → F1 (5 t)
    +0.05 → 0.15 m; F1 → F2 trims her by the head.  None reaches 0.4 m; the nearest is F2 → A1
    (0.3 m).  From there F1 → A1 (room 5 t) gives 0.3 + 0.03·m: 0.4 m at m = 3.333 t.
    Calculations 1 + 4 (first round) + 1 + 2 + 1 + 1 (F1 → F2, F1 → A1, A1 → F1, A1 → F2) = 10."""
    barge = Barge((Tk("F1", 10, 0, 1, 10), Tk("F2", 20, 0, 1, 10), Tk("A1", -20, 0, 1, 10)), trim0_m=0.25)
    calc = Calc(barge)
    got = plan(barge, cond(F1=5.0, F2=5.0, A1=0.0), Goal("trim", 0.4, 0.01), ["F1", "F2", "A1"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("F2", "A1", 5.0), ("F1", "A1", 0.1 / 0.03)])
    assert got.before == pytest.approx(0.1, abs=1e-12) and got.after == pytest.approx(0.4, abs=1e-12)
    assert got.evaluations == 10 == calc.calls


def test_trim_by_the_head_in_two_steps_the_nearest_whole_transfer_not_the_largest():
    """The mirror: A1 (x −10 m) and A2 (x −20 m), 5 t each of 10, F1 (x +20 m) empty;
    trim₀ = 0.55 m: trim = 0.55 + 0.15 = 0.7 m.  Goal 0.4 m ± 0.01 m.  Whole transfers:
    A1 → F1 −0.15 → 0.55 m; A2 → F1 −0.2 → 0.5 m; A2 → A1 −0.05 → 0.65 m.  The nearest is
    A2 → F1 (0.5 m); then A1 → F1: 0.5 − 0.03·m = 0.4 m at m = 3.333 t."""
    barge = Barge((Tk("A1", -10, 0, 1, 10), Tk("A2", -20, 0, 1, 10), Tk("F1", 20, 0, 1, 10)), trim0_m=0.55)
    calc = Calc(barge)
    got = plan(barge, cond(A1=5.0, A2=5.0, F1=0.0), Goal("trim", 0.4, 0.01), ["A1", "A2", "F1"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("A2", "F1", 5.0), ("A1", "F1", 0.1 / 0.03)])
    assert got.before == pytest.approx(0.7, abs=1e-12) and got.after == pytest.approx(0.4, abs=1e-12)


def test_gm_in_two_steps_the_highest_whole_transfer_first():
    """High tanks H1 (z 8 m) and H2 (z 6 m), 5 t each of 10, L1 (z 0) empty; GM₀ = 0.57 m:
    GM = 0.57 − (5·8 + 5·6)/1000 = 0.5 m.  Goal GM at least 0.56 m.  Whole transfers:
    H1 → L1 +0.04 → 0.54 m; H2 → L1 +0.03 → 0.53 m; H1 → H2 +0.01 → 0.51 m.  None reaches it;
    the highest is H1 → L1.  Then H2 → L1: 0.54 + 0.006·m = 0.56 m at m = 3.333 t.
    Calculations 1 + 4 + (2 + 1 + 1 + 1) = 10."""
    barge = Barge((Tk("H1", 0, 0, 8, 10), Tk("H2", 0, 0, 6, 10), Tk("L1", 0, 0, 0, 10)), gm0_m=0.57)
    calc = Calc(barge)
    got = plan(barge, cond(H1=5.0, H2=5.0, L1=0.0), Goal("gm", 0.56, 0.001), ["H1", "H2", "L1"], **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("H1", "L1", 5.0), ("H2", "L1", 0.02 / 0.006)])
    assert got.before == pytest.approx(0.5, abs=1e-12)
    assert got.after == pytest.approx(0.56, abs=1e-12) and got.result.gm_fluid_m >= 0.56 - 1e-12
    assert got.evaluations == 10 == calc.calls


def test_a_list_goal_does_not_try_the_wing_pairs_alike():
    """On the wing-pair barge, list 0.6° to port ± 0.1° from upright: AS → FP, m t, lists her
    −8·m/100, so m = 7.5 t (trim 1.0 − 0.3 = 0.7 m, no limit on it).  A wing pair pumped alike
    cannot change the list, so a list goal does not try them.  Calculations: the condition;
    AP → AS, AP → FP, AP → FS, AS → AP, AS → FS (one each), AS → FP (two): 8."""
    calc = Calc(PAIRS)
    got = plan(PAIRS, PAIRS_LOADED, Goal("list", -0.6, 0.1), ALL4, **calc.kw())
    assert isinstance(got, Plan)
    check_transfers(got.transfers, [("AS", "FP", 7.5)])
    assert got.evaluations == 8 == calc.calls


# --------------------------------------------------------------------------- the list a trim or GM plan must keep

CENTRE = Barge((Tk("AC", -20, 0, 1, 40), Tk("FC", 20, 0, 1, 40)))
"""Two centreline tanks 40 m apart: pumping between them changes the trim, never the list."""


@pytest.mark.parametrize("list0, kept", [(1.0 + 1e-9, True), (-(1.0 + 1e-9), True), (1.0, True), (1.5, False), (-1.5, False)])
def test_propose_keeps_to_the_list_limit_it_is_given_either_side(list0, kept):
    """AC 20 t, FC empty: trim = 20·20/1000 = 0.4 m; goal 0.2 m: AC → FC 5 t (0.04 m a tonne).
    The list, ``list0`` from the rest of her, does not change.  With a limit of 1°, a list of
    exactly 1° or 1° + 1e-9 (round-off allowed) either side is kept, 1.5° is not."""
    barge = Barge(CENTRE.tanks, list0_deg=list0)
    calc = Calc(barge)
    found = propose(barge, cond(AC=20.0, FC=0.0), Goal("trim", 0.2, 0.01), ["AC", "FC"], list_limit_deg=1.0, **calc.kw())
    if kept:
        assert [(p.from_id, p.to_id) for p in found] == [("AC", "FC")] and found[0].mass_t == pytest.approx(5.0, abs=MASS_TOL_T)
        assert found[0].result.list_deg == list0
    else:
        assert found == []
    # Without a limit the list is not looked at.
    found = propose(barge, cond(AC=20.0, FC=0.0), Goal("trim", 0.2, 0.01), ["AC", "FC"], **calc.kw())
    assert [(p.from_id, p.to_id) for p in found] == [("AC", "FC")]


@pytest.mark.parametrize("list0, kept", [(0.5 + 1e-9, True), (0.5 + 1e-9 + 0.5, False)])
def test_a_trim_plan_keeps_her_within_one_degree_the_edge_included(list0, kept):
    """AC (x −20 m, y 0) 20 t and FS (x +20 m, y +10 m) empty, list₀ as given: AC → FS, m t,
    trims her 0.04·m m by the head and lists her m/10° to starboard.  Trim 0.4 → 0.2 m at
    m = 5 t, which lists her 0.5° more.

    From list₀ = 0.5 + 1e-9 the plan ends at exactly 1 + 1e-9 (to the last bit): the limit,
    max(|list₀|, 1°) = 1°, plus the 1e-9 of round-off allowed: kept.  From list₀ = 1 + 1e-9
    the limit is her own list, and the plan ends 0.5° beyond it: not kept, and nothing else
    helps (the whole of AC lists her 2°, FS has nothing to give): no plan."""
    barge = Barge((Tk("AC", -20, 0, 1, 40), Tk("FS", 20, 10, 1, 40)), list0_deg=list0)
    calc = Calc(barge)
    got = plan(barge, cond(AC=20.0, FS=0.0), Goal("trim", 0.2, 0.01), ["AC", "FS"], **calc.kw())
    if kept:
        assert isinstance(got, Plan)
        check_transfers(got.transfers, [("AC", "FS", 5.0)])
        assert got.result.list_deg == 1.0 + 1e-9
    else:
        assert isinstance(got, NoPlan) and got.transfers == () and got.list_limit_deg == list0


# --------------------------------------------------------------------------- a list that jumps

class Lolling(Calc):
    """The wings barge with a negative GM: she lies at a 3° angle of loll to whichever side the
    transverse moment is (starboard at zero), plus the moment's own heel: list = ±3 + Σ m·y/100.
    No list within 3° of upright exists (common practice: weight moved across a vessel at an
    angle of loll makes her flop over to the other side; she comes upright only when G is
    lowered)."""

    def evaluate(self, barge, cond):
        r = super().evaluate(barge, cond)
        return Res(r.list_deg + (3.0 if r.list_deg >= 0 else -3.0), r.trim_m, r.gm_fluid_m)


def test_a_list_goal_across_an_angle_of_loll_has_no_plan_and_says_where_she_stays():
    """WP 30 t, WS 10 t: moment −100 t·m, list −4°.  Upright ± 0.1°: WP → WS brackets it (the
    whole 30 t gives +5°) but every mass lists her at least 3°: after MAX_STEPS no step is
    within 0.1°, and the whole transfer, on the other side, is not a step nearer to take.
    WS → WP lists her further.  No plan; she stays at −4° as she is, with no list limit (the
    goal is the list); the failed search counts one calculation in ``evaluations`` (the
    condition, WP → WS, WS → WP: 3)."""
    calc = Lolling(WINGS)
    got = plan(WINGS, cond(WP=30.0, WS=10.0), Goal("list", 0.0, 0.1), ["WP", "WS"], **calc.kw())
    assert isinstance(got, NoPlan)
    assert got.before == got.best == -4.0 and got.transfers == () and got.list_limit_deg is None
    assert got.evaluations == 3
    assert propose(WINGS, cond(WP=30.0, WS=10.0), Goal("list", 0.0, 0.1), ["WP", "WS"], **calc.kw()) == []
