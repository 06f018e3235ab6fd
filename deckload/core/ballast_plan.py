"""Ballast planner: which single transfer between the tanks the officer allows brings the list, the
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
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Callable, Sequence

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


@dataclass(frozen=True)
class Goal:
    quantity: str
    """``list`` (degrees, + starboard), ``trim`` (m, + by the stern) or ``gm`` (GM fluid, m, at least)."""
    target: float
    tolerance: float
    """How close counts as reached (list in degrees, trim and GM in metres)."""


@dataclass(frozen=True)
class Proposal:
    from_id: str
    to_id: str
    mass_t: float
    condition: Condition
    result: Result
    before: float
    after: float
    evaluations: int


def value_of(result: Result, goal: Goal) -> float:
    return float(getattr(result, GOALS[goal.quantity][0]))


def _met(value: float, goal: Goal) -> bool:
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
) -> list[Proposal]:
    """Single transfers between ``allowed`` tanks that reach ``goal``, smallest first.

    ``move(condition, from_id, to_id, mass_t)`` returns the condition after the transfer (raising
    ``ValueError`` when it cannot be made); ``room(condition, from_id, to_id)`` the most tonnes that
    can be pumped.  A pair whose transfer the calculation refuses is left out.
    """
    if goal.quantity not in GOALS:
        raise ValueError(f"goal {goal.quantity!r} is not one of {', '.join(GOALS)}")
    base = evaluate(vessel, condition)
    q0 = value_of(base, goal)
    out: list[Proposal] = []
    for a in allowed:
        for b in allowed:
            if a == b:
                continue
            try:
                hi = float(room(condition, a, b))
            except ValueError:
                continue
            if not hi > 1e-6:
                continue
            found = _search(vessel, condition, goal, a, b, hi, q0, move, evaluate)
            if found is not None:
                out.append(found)
    out.sort(key=lambda p: p.mass_t)
    return out


def _search(vessel, condition, goal, a, b, hi, q0, move, evaluate) -> Proposal | None:
    def q(m: float):
        try:
            c = move(condition, a, b, m)
            r = evaluate(vessel, c)
        except (ValueError, KeyError, ArithmeticError):
            return None
        return c, r, value_of(r, goal) - goal.target

    f0 = q0 - goal.target
    end = q(hi)
    if end is None:
        return None
    n = 1
    c_hi, r_hi, f_hi = end
    if f0 * f_hi > 0 or f_hi == f0:
        return None  # the pair cannot bring it through the target
    lo, f_lo = 0.0, f0
    best = None
    side = 0
    for _ in range(MAX_STEPS):
        m = (lo * f_hi - hi * f_lo) / (f_hi - f_lo)
        m = min(max(m, lo + 1e-9), hi)
        got = q(m)
        n += 1
        if got is None:
            return None
        c, r, f = got
        if _met(f + goal.target, goal):
            best = (m, c, r, f)
            if goal.quantity != "gm" or hi - m < 1e-3:
                break
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
        if goal.quantity == "gm" and _met(f_hi + goal.target, goal):
            best = (hi, c_hi, r_hi, f_hi)
        else:
            return None
    m, c, r, f = best
    return Proposal(a, b, m, c, r, f0 + goal.target, f + goal.target, n)
