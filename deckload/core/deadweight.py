"""The deadweight split by kind: what the ship carries, line by line, adding up to DWT.

Deadweight = Δ − lightship (common practice: everything aboard that is not the ship).  Every
tank, hold, deck load and constant of a :class:`~deckload.core.result.Result` falls in exactly
one line, so the lines add up to ``result.deadweight_t`` (to the round-off of the sums).
"""

from __future__ import annotations

from deckload.core.frozen import frozen
from deckload.core.result import Result

DWT_LINES: tuple[tuple[str, str], ...] = (
    ("cargo", "Cargo"),
    ("fuel_oil", "Fuel oil"),
    ("diesel", "Diesel oil"),
    ("lube_oil", "Lube oil"),
    ("fresh_water", "Fresh water"),
    ("ballast", "Ballast water"),
    ("other", "Other liquids"),
    ("stores", "Stores and constants"),
)
"""(kind, title) in the order printed.  Cargo is the holds, the deck loads and the liquid-cargo
tanks; stores and constants are the condition's constants with the profile's fixed ones."""

_TANK_LINE = {"cargo_liquid": "cargo"}
_ITEM_LINE = {"hold": "cargo", "deck": "cargo", "constant": "stores"}


@frozen
class DeadweightLine:
    """The mass of one kind of deadweight (cargo, a liquid, stores and constants)."""

    kind: str
    title: str
    mass_t: float


def deadweight_by_kind(result: Result) -> tuple[DeadweightLine, ...]:
    """One line per kind the vessel can carry (cargo and stores always; a liquid kind when she
    has a tank of it), in :data:`DWT_LINES` order; their masses add up to the deadweight."""
    mass: dict[str, float] = {}
    for t in result.tanks:
        kind = _TANK_LINE.get(t.kind, t.kind)
        mass[kind] = mass.get(kind, 0.0) + t.mass_t
    for it in result.items:
        if it.group in _ITEM_LINE:  # the lightship is not deadweight
            kind = _ITEM_LINE[it.group]
            mass[kind] = mass.get(kind, 0.0) + it.mass_t
    present = set(mass) | {"cargo", "stores"}
    return tuple(DeadweightLine(k, title, mass.get(k, 0.0)) for k, title in DWT_LINES if k in present)
