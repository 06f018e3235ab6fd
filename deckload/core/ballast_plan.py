"""Ballast planner: which transfers between the tanks the officer allows bring the list, the
trim or GM fluid to what is wanted.

Pure: the condition is changed only through the ``move`` function it is given (the loading
screen passes its own transfer, so the planner pumps exactly as the transfer form does), and
every candidate is judged by the full calculation (``evaluate``), never by a linear estimate.

Search (common practice of root finding, not from any source on ship stability): for each
ordered pair of allowed tanks, the quantity after pumping ``m`` tonnes, q(m), is evaluated at
``m = 0`` and at the most that can be pumped (``room``); only a pair whose interval brackets
the target is searched, by regula falsi with the Illinois modification (a bracketing secant
that keeps the root inside and converges superlinearly), until q is within the tolerance.
For GM the target is a lower bound: the least mass that reaches it.  Proposals are returned
smallest transfer first.  The list, trim and GM are whatever ``evaluate`` returns (list + to
starboard, trim + by the stern, GM fluid), so the proposal is exactly what a recompute shows.

A goal she already meets is a plan of no transfers.  When no single transfer reaches the goal,
:func:`plan` pumps, one transfer at a time, the pair whose whole transfer (as much as the one
can give and the other take) comes nearest the goal, and searches single transfers again from
there (a plan as soon as the whole transfers made reach it): a plan of up to ``MAX_TRANSFERS``
transfers, each judged by the full calculation.  It stops, with no plan, as soon as a whole transfer no
longer brings the goal nearer (greedy; common practice of search, not from a stability source).
"""

from __future__ import annotations

import itertools

from typing import Callable, Sequence

from deckload.core.frozen import frozen
from deckload.core.model import Condition, Vessel
from deckload.core.result import Result

GOALS = {
    "list": ("list_deg", "°"),
    "trim": ("trim_m", "m"),
    "gm": ("gm_fluid_m", "m"),
}
"""Goal name → (Result attribute, unit)."""

MAX_STEPS = 40
"""Evaluations per bracketed pair at most (each is one full calculation)."""


@frozen
class Goal:
    quantity: str
    """``list`` (degrees, + starboard), ``trim`` (m, + by the stern) or ``gm`` (GM fluid, m, at least)."""
    target: float
    tolerance: float
    """How close counts as reached (list in degrees, trim and GM in metres)."""


@frozen
class Proposal:
    from_id: str
    to_id: str
    mass_t: float
    condition: Condition
    result: Result
    before: float
    after: float
    evaluations: int


MAX_TRANSFERS = 4
"""Transfers in one plan at most."""

KEEP_LIST_DEG = 1.0
"""A plan for trim or GM must leave her within this list (or the list she had, if more): a
ballast plan that trades a trim for a list is no plan (common practice: keep her upright)."""


@frozen
class Transfer:
    from_id: str
    to_id: str
    mass_t: float


@frozen
class Plan:
    """Transfers made in order; the condition and result after the last."""

    transfers: tuple[Transfer, ...]
    condition: Condition
    result: Result
    before: float
    after: float
    evaluations: int
    spread: tuple[float, float] | None = None
    """The lowest and highest value with any amount :data:`READING_TOLERANCE_T` less or more
    (:func:`as_shown`); None for a plan of exact masses, before it is put as shown."""
    robust: bool = True
    """The goal holds over the whole ``spread`` (GM: the least of it is at least the value; list
    and trim: all of it within the tolerance).  False: it holds at the amounts shown only."""


@frozen
class NoPlan:
    """Why there is no plan: the nearest the allowed tanks come (``best``, after ``transfers``)."""

    before: float
    best: float
    transfers: tuple[Transfer, ...]
    evaluations: int
    list_limit_deg: float | None = None
    """The list every step had to stay within (trim and GM goals)."""


NO_EQUILIBRIUM = "GZ never becomes positive: she has no position of equilibrium"


def value_of(result: Result, goal: Goal) -> float:
    """The goal's quantity in ``result``; ValueError for a list where there is none (no
    position of equilibrium: the planner never passes through such a condition)."""
    value = getattr(result, GOALS[goal.quantity][0])
    if value is None:
        raise ValueError(NO_EQUILIBRIUM)
    return float(value)


def _start(result: Result) -> None:
    """Refuse to plan from a condition with no position of equilibrium (ValueError)."""
    if result.list_deg is None:
        raise ValueError(NO_EQUILIBRIUM + " as she is: the planner starts from a condition that floats")


def met(value: float, goal: Goal) -> bool:
    """Whether ``value`` meets ``goal``: GM at least its target; list or trim within its tolerance."""
    if goal.quantity == "gm":
        return value >= goal.target - 1e-12
    return abs(value - goal.target) <= goal.tolerance


def propose(
    vessel: Vessel,
    condition: Condition,
    goal: Goal,
    allowed: Sequence[str],
    *,
    move: Callable[[Condition, str, str, float], Condition],
    room: Callable[[Condition, str, str], float],
    evaluate: Callable[[Vessel, Condition], Result],
    list_limit_deg: float | None = None,
) -> list[Proposal]:
    """Single transfers between ``allowed`` tanks that reach ``goal``, smallest first; with
    ``list_limit_deg``, only those that leave the list within it (either side).

    ``move(condition, from_id, to_id, mass_t)`` returns the condition after the transfer (raising
    ``ValueError`` when it cannot be made); ``room(condition, from_id, to_id)`` the most tonnes that
    can be pumped.  A pair whose transfer the calculation refuses is left out.
    """
    if goal.quantity not in GOALS:
        raise ValueError(f"goal {goal.quantity!r} is not one of {', '.join(GOALS)}")
    r0 = evaluate(vessel, condition)
    _start(r0)
    q0 = value_of(r0, goal)
    out: list[Proposal] = []
    for steps, hi, apply in _moves(vessel, condition, allowed, move, room, pairs=False):
        hit, _ = _search(vessel, goal, hi, q0, apply, evaluate)
        if hit is not None and (list_limit_deg is None or abs(hit[2].list_deg) <= list_limit_deg + 1e-9):
            m, c, r, after, n = hit
            (a, b), = steps
            out.append(Proposal(a, b, m, c, r, q0, after, n))
    out.sort(key=lambda p: p.mass_t)
    return out


def _moves(vessel, condition, allowed, move, room, *, pairs: bool):
    """Every way to pump between the allowed tanks: ``(steps, most tonnes, apply(m))``.  A single
    transfer a → b; with ``pairs``, also a → b together with a's partner → b's partner, m tonnes
    each (a wing pair pumped alike keeps her upright while trim or GM changes)."""
    for a in allowed:
        for b in allowed:
            if a == b:
                continue
            try:
                hi = float(room(condition, a, b))
            except ValueError:
                continue
            if hi > 1e-6:
                yield ((a, b),), hi, (lambda m, a=a, b=b: move(condition, a, b, m))
    if not pairs:
        return
    ids = set(allowed)
    twos = []
    for a in allowed:
        for b in allowed:
            pa, pb = vessel.tank(a).pair, vessel.tank(b).pair
            pa, pb = (pa if pa in ids else None), (pb if pb in ids else None)
            if a == b:
                continue
            if pa and pb and len({a, b, pa, pb}) == 4 and a < pa:
                twos.append(((a, b), (pa, pb)))  # each wing pair once (a before its partner), four different tanks
            if pb and not pa and pb != a and b < pb:
                twos.append(((a, b), (a, pb)))  # a tank of no partner split between a wing pair alike
            if pa and not pb and pa != b and a < pa:
                twos.append(((a, b), (pa, b)))  # a wing pair pumped alike into a tank of no partner
    for (s1, s2) in twos:
        try:
            h = min(float(room(condition, *s1)), float(room(condition, *s2)))
            if h <= 1e-6:
                continue
            # the second transfer's room after the first at h: less than h only where the two share
            # a tank that limits them (the one giving has 2m to give, or the one taking 2m of room),
            # and then that tank holds (or has room for) h + r2 in all, so each may be (h + r2)/2
            r2 = float(room(move(condition, *s1, h), *s2))
        except ValueError:
            continue
        hi = h if r2 >= h else (h + r2) / 2.0 * (1 - 1e-9)
        if hi > 1e-6:
            yield (s1, s2), hi, (lambda m, s1=s1, s2=s2: move(move(condition, *s1, m), *s2, m))


def _search(vessel, goal, hi, q0, apply, evaluate):
    """Regula falsi (Illinois) on the mass pumped.  Returns ``(hit, end)``: ``hit`` the mass that
    reaches the goal ``(m, condition, result, value, evaluations)`` or None; ``end`` the whole
    transfer ``(condition, result, value)`` (None when it cannot be made)."""
    def q(m: float):
        try:
            c = apply(m)
            r = evaluate(vessel, c)
        except (ValueError, KeyError, ArithmeticError):
            return None
        if r.list_deg is None:  # no position of equilibrium: never a step of a plan, whatever the goal
            return None
        return c, r, value_of(r, goal) - goal.target

    f0 = q0 - goal.target
    end = q(hi)
    if end is None:
        return None, None
    n = 1
    c_hi, r_hi, f_hi = end
    whole = (c_hi, r_hi, f_hi + goal.target)
    if f0 * f_hi > 0 or f_hi == f0:
        return None, whole  # the pumping cannot bring it through the target
    lo, f_lo = 0.0, f0
    best = None
    side = 0
    for _ in range(MAX_STEPS):
        m = (lo * f_hi - hi * f_lo) / (f_hi - f_lo)
        m = min(max(m, lo + 1e-9), hi)
        got = q(m)
        n += 1
        if got is None:
            return None, whole
        c, r, f = got
        if met(f + goal.target, goal):
            best = (m, c, r, f)
            if goal.quantity != "gm" or hi - m < 1e-3 or f <= goal.tolerance:
                break  # GM: at least the value, and within its tolerance above it (the least mass, to the mm)
        if f * f_hi > 0:
            hi, f_hi = m, f
            if side == -1:
                f_lo /= 2.0  # Illinois: keep the stale end from stalling the secant
            side = -1
        else:
            lo, f_lo = m, f
            if side == 1:
                f_hi /= 2.0
            side = 1
        if goal.quantity == "gm" and best is not None and hi - lo < 1e-3:
            break
    if best is None:
        if goal.quantity == "gm" and met(f_hi + goal.target, goal):
            best = (hi, c_hi, r_hi, whole[2] - goal.target)  # f_hi may have been halved (Illinois)
        else:
            return None, whole
    m, c, r, f = best
    return (m, c, r, f + goal.target, n), whole


def plan(
    vessel: Vessel,
    condition: Condition,
    goal: Goal,
    allowed: Sequence[str],
    *,
    move: Callable[[Condition, str, str, float], Condition],
    room: Callable[[Condition, str, str], float],
    evaluate: Callable[[Vessel, Condition], Result],
    max_transfers: int = MAX_TRANSFERS,
) -> Plan | NoPlan:
    """The least pumping that reaches ``goal``: none when she already meets it (a plan of no
    transfers); one transfer, or (trim and GM) a wing pair pumped alike; failing that, the whole
    of the pumping that comes nearest without passing the goal, then again from there (a plan as
    soon as that reaches the goal), up to ``max_transfers`` transfers in all.  For a trim or GM goal every
    step leaves the list within ``KEEP_LIST_DEG`` (or the list she had, if more).
    :class:`NoPlan` names the nearest value reached and how."""
    if goal.quantity not in GOALS:
        raise ValueError(f"goal {goal.quantity!r} is not one of {', '.join(GOALS)}")
    r0 = evaluate(vessel, condition)
    _start(r0)
    q0 = value_of(r0, goal)
    limit = None if goal.quantity == "list" else max(abs(r0.list_deg), KEEP_LIST_DEG)

    def upright(r: Result) -> bool:
        return limit is None or abs(r.list_deg) <= limit + 1e-9

    done: list[Transfer] = []
    cond, r, q, n = condition, r0, q0, 1
    while True:
        if met(q, goal):  # as she is, or after the whole transfers made: nothing (more) to pump
            return Plan(tuple(done), cond, r, q0, q, n)
        hits, wholes = [], []
        for steps, hi, apply in _moves(vessel, cond, allowed, move, room, pairs=goal.quantity != "list"):
            if len(done) + len(steps) > max_transfers:
                continue
            hit, whole = _search(vessel, goal, hi, q, apply, evaluate)
            n += hit[4] if hit else 1
            if hit is not None and upright(hit[2]):
                hits.append((hit[0] * len(steps), tuple(Transfer(a, b, hit[0]) for a, b in steps), hit))
            elif whole is not None and upright(whole[1]) and _nearer(whole[2], q, goal) and \
                    (whole[2] - goal.target) * (q - goal.target) > 0:
                wholes.append((whole, tuple(Transfer(a, b, hi) for a, b in steps)))
        if hits:
            _, steps, (m, c, r, after, _) = min(hits, key=lambda h: h[0])
            return Plan((*done, *steps), c, r, q0, after, n)
        if not wholes:
            return NoPlan(q0, q, tuple(done), n, limit)
        (c, r, qa), steps = min(wholes, key=lambda w: abs(w[0][2] - goal.target) if goal.quantity != "gm" else -w[0][2])
        cond, q = c, qa
        done.extend(steps)


def _nearer(a: float, b: float, goal: Goal) -> bool:
    """``a`` is nearer the goal than ``b`` (GM: higher, when below the least wanted)."""
    if goal.quantity == "gm":
        return a > b + 1e-9
    return abs(a - goal.target) < abs(b - goal.target) - 1e-9


SHOWN_STEP_T = 0.1
"""Every amount a plan states and applies is a whole number of tenths of a tonne: what the form
shows, so that what the officer reads is exactly what is applied and logged."""

READING_TOLERANCE_T = 0.1
"""How far from an amount as shown the crew may end up: one step of the shown precision
(:data:`SHOWN_STEP_T`), less or more.  deckload's own rule (common practice: an amount given to
0.1 t is pumped to the nearest 0.1 t the gauges or the sounding table give, no closer).  A plan is
checked with each amount, and all of them together, that much less and more (:func:`as_shown`):
a plan that holds only at one mass to the kilogram (a tank just reaching the 98 % "nominally full"
line of IS 2008 Part B 3.1, where its free-surface moment stops counting) is not offered as
reaching the goal."""

BUMP_STEPS = 30
"""GM: how many steps of :data:`SHOWN_STEP_T` the last transfer may be raised past the least
mass found to reach the goal with the reading tolerance (e.g. past the 98 % line by a margin)."""


def _tenths(mass_t: float, step_t: float, down: bool = False) -> float:
    n = (mass_t / step_t + 1e-6) // 1 if down else round(mass_t / step_t)
    return round(n * step_t, 9)


def as_shown(
    vessel: Vessel,
    condition: Condition,
    goal: Goal,
    found: Plan,
    *,
    move: Callable[[Condition, str, str, float], Condition],
    evaluate: Callable[[Vessel, Condition], Result],
    step_t: float = SHOWN_STEP_T,
    tolerance_t: float = READING_TOLERANCE_T,
) -> Plan:
    """``found`` (exact masses from :func:`plan`) with every amount a multiple of ``step_t``, the
    condition and result those amounts give, and the ``spread`` of the value with each amount,
    and all together, ``tolerance_t`` less and more (a transfer a tank cannot give or take is
    left out of the spread: more cannot be pumped than it holds or has room for).

    The amounts tried, first that holds over the whole spread wins: the exact masses to the
    nearest step (a whole transfer made before the last one rounded down, so that it can be
    pumped), and with the last transfer rounded down (the nearest step up may be more than a tank
    holds or has room for); for list and trim the last transfer (or wing pair) one step less or
    more; for GM, a lower bound whose shortfall is the danger, the last transfer raised a step at a
    time (up to :data:`BUMP_STEPS`, and no further than the tanks allow).  None holding over the
    spread: the first that meets the goal at the amounts shown, with ``robust`` False, for the
    form to say so plainly.  None meeting the goal at amounts that can be shown: a :class:`NoPlan`
    with the nearest (a plan is never offered for a goal its shown amounts miss).

    The spread tries every amount alone and every combination of all of them ``tolerance_t`` less
    or more (at most 2^4 with :data:`MAX_TRANSFERS`): a wing pair pumped one a little over and the
    other a little under is what moves her list.
    """
    if not found.transfers:
        return found
    ts = found.transfers
    last = ts[-1].mass_t
    k = 1
    while k < len(ts) and ts[-1 - k].mass_t == last and k < 2:
        k += 1  # a wing pair (or a split) pumped alike: the last two transfers move together
    base = [_tenths(t.mass_t, step_t, down=i < len(ts) - k) for i, t in enumerate(ts)]
    floor = [_tenths(t.mass_t, step_t, down=True) for t in ts]
    n = 0

    def replay(amounts):
        nonlocal n
        cur = condition
        try:
            for t, m in zip(ts, amounts):
                if m > 1e-9:
                    cur = move(cur, t.from_id, t.to_id, m)
            n += 1
            r = evaluate(vessel, cur)
        except (ValueError, KeyError, ArithmeticError):
            return None
        if r.list_deg is None:
            return None
        return cur, r, value_of(r, goal)

    def spread(amounts, at):
        values = [at]
        n_amounts = len(amounts)
        steps = [tuple(d if j == i else 0.0 for j in range(n_amounts)) for i in range(n_amounts)
                 for d in (-tolerance_t, tolerance_t)]
        steps += list(itertools.product((-tolerance_t, tolerance_t), repeat=n_amounts)) if n_amounts > 1 else []
        for ds in steps:
            got = replay([max(0.0, round(m + d, 9)) for m, d in zip(amounts, ds)])
            if got is not None:
                values.append(got[2])
        return min(values), max(values)

    def holds(lo_hi):
        if goal.quantity == "gm":
            return met(lo_hi[0], goal)
        return all(abs(v - goal.target) <= goal.tolerance for v in lo_hi)

    tries = [base] + ([floor] if floor != base else [])
    head = base[:len(ts) - k]
    if goal.quantity == "gm":
        tries += [head + [round(m + j * step_t, 9) for m in base[-k:]] for j in range(1, BUMP_STEPS + 1)]
    else:
        tries += [head + [round(m + d, 9) for m in base[-k:]] for d in (-step_t, step_t)]
    fallback = None
    for amounts in tries:
        if any(m <= 0 for m in amounts[-k:]):
            continue
        got = replay(amounts)
        if got is None:
            if goal.quantity == "gm" and amounts is not base:
                break  # raised past what the tanks allow: no further
            continue
        c, r, v = got
        if fallback is None or (met(v, goal) and not met(fallback[3], goal)) or \
                (not met(fallback[3], goal) and abs(v - goal.target) < abs(fallback[3] - goal.target)):
            fallback = (amounts, c, r, v, None)
        if not met(v, goal):
            continue
        lo_hi = spread(amounts, v)
        if holds(lo_hi):
            return Plan(tuple(Transfer(t.from_id, t.to_id, m) for t, m in zip(ts, amounts)), c, r,
                        found.before, v, found.evaluations + n, lo_hi, True)
        if fallback[0] is amounts:
            fallback = (amounts, c, r, v, lo_hi)
    if fallback is None or not met(fallback[3], goal):
        # Nothing that can be shown to the tenth reaches the goal: no plan, with the nearest.
        if fallback is None:
            return NoPlan(found.before, found.before, (), found.evaluations + n)
        near = fallback[0]
        return NoPlan(found.before, fallback[3], tuple(Transfer(t.from_id, t.to_id, m) for t, m in zip(ts, near)),
                      found.evaluations + n)
    amounts, c, r, v, lo_hi = fallback
    if lo_hi is None:
        lo_hi = spread(amounts, v)
    return Plan(tuple(Transfer(t.from_id, t.to_id, m) for t, m in zip(ts, amounts)), c, r,
                found.before, v, found.evaluations + n, lo_hi, False)
