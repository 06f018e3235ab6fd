"""The direct calculation beside the tables, in words and cells, for every view of it (calc, report, screen).

Nothing is judged here: each row's tolerance and whether it is met come from
:func:`deckload.core.equilibrium.compare`.  These helpers only print them alike everywhere, so
that no view shows a row beyond its tolerance without the mark, or the comparison without the
sentence saying how many rows are beyond.
"""

from __future__ import annotations

BEYOND = "BEYOND"
"""The mark of a row whose difference exceeds its tolerance."""
WITHIN = "ok"
NOT_JUDGED = "not judged"


def digits(unit: str) -> int:
    """Angles to 0.1°, areas to 0.0001 m·rad, lengths to the millimetre, as every view."""
    return 1 if unit == "deg" else 4 if unit == "m·rad" else 3


def fixed(value: float, d: int, signed: bool = False) -> str:
    """``value`` to ``d`` decimals; a value that rounds to zero is printed '0.000', without a sign
    (Python prints -0.0004 as '-0.000' and a signed zero as '+0.000')."""
    text = f"{value:+.{d}f}" if signed else f"{value:.{d}f}"
    return f"{0.0:.{d}f}" if float(text) == 0.0 else text


def cells(row) -> tuple[str, str, str, str, str]:
    """(tables, direct, difference, ±allowed, mark) of a :class:`~deckload.core.equilibrium.DirectRow`."""
    d = digits(row.unit)
    # the tolerance may be finer than the row's decimals (areas: 5 % of a small area)
    da = d if row.allowed is None or row.allowed == 0.0 or round(row.allowed, d) != 0.0 else d + 1
    allowed = "—" if row.allowed is None else "±" + fixed(row.allowed, da)
    mark = NOT_JUDGED if row.within_tolerance is None else WITHIN if row.within_tolerance else BEYOND
    return fixed(row.tables, d), fixed(row.direct, d), fixed(row.difference, d, signed=True), allowed, mark


def beyond_message(profile_path, cmp) -> str:
    """The standard-error line of ``calc --direct`` and ``report --direct`` when rows lie beyond
    tolerance (both then exit 1)."""
    return f"deckload: {profile_path}: direct calculation: {cmp.summary()}"


def legend(cmp) -> str:
    """The tolerance rules of the rows, each once, in the order of the rows."""
    rules = list(dict.fromkeys(r.tolerance for r in cmp.rows if r.allowed is not None))
    return f"Tolerance: the largest accepted |direct − tables|, by {cmp.source}: " + "; ".join(rules) + "."


def as_json(row) -> dict:
    """One row of ``calc --json``'s ``direct.rows``."""
    return {"quantity": row.quantity, "unit": row.unit, "tables": row.tables, "direct": row.direct,
            "difference": row.difference, "allowed": row.allowed, "tolerance": row.tolerance,
            "within_tolerance": row.within_tolerance, "note": row.note}
