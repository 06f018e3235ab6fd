"""Tank contents and the weight and moment sums.

A tank's contents may be stated as percent of capacity, m³, tonnes or sounding;
all four resolve to one volume and one row of the calibration table, interpolated
linearly (common practice for tank tables).  The weight sums are the textbook
ones (standards.md §6.3): Δ = Σw, LCG = Σw·x/Δ, KG = Σw·z/Δ, TCG = Σw·y/Δ.
"""

from __future__ import annotations

from functools import lru_cache

import numpy as np

from deckload.core.bounds import below_limit, hold_level_range, kind_density_note, over_limit, stowage_range
from deckload.core.frozen import frozen
from deckload.core.model import Condition, Hold, HoldLoad, Tank, TankFill, Vessel
from deckload.core.result import ItemResult
from deckload.core.tables import bracket, lerp_row


class LoadingError(ValueError):
    """A condition that does not fit its vessel (unknown id, over capacity, …)."""


@frozen
class TankContents:
    """One tank's contents, resolved from whatever quantity was typed."""

    tank: Tank
    volume_m3: float
    density_t_m3: float
    sounding_m: float
    """Level of the liquid above the tank's lowest point (m); the volume fraction for a
    capacity-only tank (see :attr:`Tank.level_known`)."""
    lcg_m: float
    vcg_m: float
    tcg_m: float
    fsi_m4: float
    """Free-surface inertia at this level (m⁴)."""

    @property
    def mass_t(self) -> float:
        return self.volume_m3 * self.density_t_m3

    @property
    def fill_pct(self) -> float:
        return 100.0 * self.volume_m3 / self.tank.capacity_m3


def level_of(tank: Tank, quantity: str, value: float) -> float:
    """Level above the tank's lowest point (m) for a sounding or ullage reading.

    level = sounding + sounding_zero_m = ullage_reference_m − ullage (the reading's own
    zero need not be at the tank bottom).  Raises :class:`LoadingError` for a tank that
    has no level table or no ullage reference.
    """
    what = "a sounding" if quantity == "sounding_m" else "an ullage"
    if not tank.level_known:
        raise LoadingError(f"tank {tank.id}: known only by capacity and centre, so it cannot be stated by "
                           f"{what}; give %, m³ or t")
    if quantity == "sounding_m":
        return value + tank.sounding_zero_m
    if tank.ullage_reference_m is None:
        raise LoadingError(f"tank {tank.id}: the profile gives no ullage_reference_m, so it cannot be stated by "
                           "an ullage; give a sounding, %, m³ or t")
    return tank.ullage_reference_m - value


def reading_range(tank: Tank, quantity: str) -> tuple[float, float]:
    """The readings (sounding or ullage, m) that fall inside the tank's level table, low to high.

    This is the table's whole range, which the calculation reads (an even-keel sounding worked
    out from one taken trimmed may lie anywhere in it); what may be *stated* as a reading, on
    the screen or in a file, is :func:`reading_limits`."""
    lo, hi = float(tank.table[0, 0]), float(tank.table[-1, 0])
    if quantity == "sounding_m":
        return lo - tank.sounding_zero_m, hi - tank.sounding_zero_m
    ref = tank.ullage_reference_m if tank.ullage_reference_m is not None else hi
    return ref - hi, ref - lo


def reading_limits(tank: Tank, quantity: str) -> tuple[float, float]:
    """The readings (m) a sounding or ullage may be stated by, on the loading screen and in a file
    alike: the table's range (:func:`reading_range`) and never below 0.

    A sounding tape or rod reads from its zero upwards, an ullage from its reference point
    downwards: neither reads a negative length (common practice).  Where the sounding zero sits
    above the tank's lowest point (the trawler's FW2, striker plate 30 mm up: ``sounding_zero_m``)
    the level table reaches down to level 0 = sounding −0.03 m through the row 'level 0, volume 0'
    the profile reader adds below the booklet's first printed row (sounding 0.00, 0.016 m³); no
    tape reads those 30 mm, so a reading below 0 is refused, and the contents under the zero
    are stated as %, m³ or t.  Either end is met within the round-off allowance
    (:func:`reading_outside`)."""
    lo, hi = reading_range(tank, quantity)
    return max(lo, 0.0), hi


def reading_outside(tank: Tank, quantity: str, value: float) -> str | None:
    """'below' or 'above' when a stated reading lies outside :func:`reading_limits` by more than the
    round-off allowance, else None: the one test the screen's entry check and the condition
    reader both make, so a reading one accepts the other never refuses (a full FO1P stated by
    the ullage 0.349 m printed in its table, where ``reading_range`` gives 0.3490000000000002)."""
    lo, hi = reading_limits(tank, quantity)
    if below_limit(value, lo):
        return "below"
    if over_limit(value, hi):
        return "above"
    return None


def fixed(x: float, decimals: int) -> str:
    """``x`` to ``decimals`` places, a value that rounds to zero without a sign ("0.000", not the
    "-0.000" of an area of −0.0002 m·rad)."""
    text = f"{x:.{decimals}f}"
    return text[1:] if text.startswith("-") and float(text) == 0.0 else text


def apart(value: float, bound: float, digits: int = 4) -> tuple[str, str]:
    """``value`` and ``bound`` written with the fewest significant digits (at least ``digits``) that
    tell them apart, so a message refusing a value never reads as the bound itself ('0.349 below
    0.349'); equal numbers are written alike."""
    for d in range(digits, 18):
        a, b = f"{value:.{d}g}", f"{bound:.{d}g}"
        if a != b:
            return a, b
    return f"{value!r}", f"{bound!r}"


def _row_at_reading(tank: Tank, quantity: str, value: float) -> np.ndarray:
    level = level_of(tank, quantity, value)
    lo, hi = reading_range(tank, quantity)
    name = "sounding" if quantity == "sounding_m" else "ullage"
    if below_limit(value, lo) or over_limit(value, hi):
        v, end = apart(value, lo if below_limit(value, lo) else hi)
        lo_t, hi_t = (end, f"{hi:.4g}") if below_limit(value, lo) else (f"{lo:.4g}", end)
        raise LoadingError(f"tank {tank.id}: {name} {v} m is outside the calibration table "
                           f"{lo_t}–{hi_t} m; deckload does not extrapolate")
    # within the round-off allowance of an end is that end (the allowance on the reading may
    # exceed the table's own on the level where the zero lies below the tank's lowest point)
    level = min(max(level, float(tank.table[0, 0])), float(tank.table[-1, 0]))
    i, f = bracket(tank.table[:, 0], level, f"level of tank {tank.id}", "m")
    return lerp_row(tank.table, i, f)


def _row_at_volume(tank: Tank, volume_m3: float) -> np.ndarray:
    i, f = bracket(tank.table[:, 1], volume_m3, f"volume of tank {tank.id}", "m³")
    return lerp_row(tank.table, i, f)


def volume_of(tank: Tank, quantity: str, value: float, density_t_m3: float) -> float:
    """Volume (m³) for an amount stated as ``quantity`` (percent, volume_m3, mass_t, sounding_m, ullage_m).

    An amount over its limit by no more than the round-off allowance (:func:`over_limit`)
    is the limit itself.  Raises :class:`LoadingError` when the amount does not fit the tank.
    """
    cap, top_pct = tank.capacity_m3, tank.table_top_pct
    if quantity == "percent":
        if not value >= 0.0 or over_limit(value, top_pct):
            if tank.short_table and value >= 0.0:
                raise LoadingError(f"tank {tank.id}: {value:g} % is above {tank.fill_limit_words}: the table "
                                   "reads no fill above its last row")
            raise LoadingError(f"tank {tank.id}: {value:g} % is outside 0–100 %")
        return min(cap * min(value, top_pct) / 100.0, float(tank.table[-1, 1]))
    limit_m3 = tank.fill_limit_m3
    if quantity == "volume_m3":
        limit, volume = limit_m3, value
    elif quantity == "mass_t":
        limit, volume = limit_m3 * density_t_m3, value / density_t_m3
    elif quantity in ("sounding_m", "ullage_m"):
        return float(_row_at_reading(tank, quantity, value)[1])
    else:
        raise LoadingError(f"tank {tank.id}: unknown quantity {quantity!r}")
    if not value >= 0.0:
        raise LoadingError(f"tank {tank.id}: a negative amount ({value:g}) cannot be loaded")
    if over_limit(value, limit):
        raise LoadingError(f"tank {tank.id}: {volume:.2f} m³ exceeds {tank.fill_limit_words}")
    # capacity_m3 and the table's top may differ by round-off (the loader allows 0.05 %):
    # never ask the table for more than it holds.
    return min(volume, cap, float(tank.table[-1, 1]))


def contents_at_volume(tank: Tank, volume_m3: float, density_t_m3: float) -> TankContents:
    """The tank's contents at ``volume_m3`` (interpolated calibration row)."""
    row = _row_at_volume(tank, volume_m3)
    return TankContents(
        tank, float(row[1]), density_t_m3, float(row[0]), float(row[2]), float(row[3]), float(row[4]), float(row[5])
    )


@lru_cache(maxsize=2048)
def resolve_tank(tank: Tank, fill: TankFill | None) -> TankContents:
    """Resolve a :class:`TankFill` (or None = empty) to the tank's contents.

    Kept for the same tank (by identity: a ``Tank`` compares as itself) and an equal fill: a
    condition edited on the screen changes one tank at a time, and every evaluation resolves
    them all.  Both are immutable, so the kept contents are the ones this would make again;
    a fill that does not fit raises, and nothing is kept for it.
    """
    if fill is None:
        return contents_at_volume(tank, 0.0, tank.density_t_m3)
    density = fill.density_t_m3 if fill.density_t_m3 is not None else tank.density_t_m3
    if fill.quantity in ("sounding_m", "ullage_m"):
        row = _row_at_reading(tank, fill.quantity, fill.value)
        return TankContents(
            tank, float(row[1]), density, float(row[0]), float(row[2]), float(row[3]), float(row[4]), float(row[5])
        )
    return contents_at_volume(tank, volume_of(tank, fill.quantity, fill.value, density), density)


def resolve_tanks(vessel: Vessel, condition: Condition) -> list[TankContents]:
    """Contents of every tank of the vessel, in profile order (unlisted tanks empty)."""
    fills: dict[str, TankFill] = {}
    for f in condition.tanks:
        if f.tank_id not in vessel.tank_index:
            raise LoadingError(f"condition names tank {f.tank_id!r}, which the vessel does not have")
        fills[f.tank_id] = f
    return [resolve_tank(t, fills.get(t.id)) for t in vessel.tanks]


def hold_item(hold: Hold, load: HoldLoad) -> ItemResult:
    """A hold's cargo as a weight item.

    The centre is, in order of preference: the condition's override; the hold's
    centroid-against-fill table at fill = mass·stowage/capacity (when a stowage factor
    is given); the full-hold centroid, which for a partly filled hold puts G higher
    than it is (a conservative choice: common practice).

    Refused (:class:`LoadingError`) whatever made the condition: a stowage factor outside
    :data:`deckload.core.bounds.STOWAGE_FACTOR_RANGE_M3_T` (denser than solid lead or lighter
    than air), cargo whose volume mass × stowage exceeds the hold's capacity, and a VCG
    override outside the hold's floor and top as its fill table gives them
    (:func:`deckload.core.bounds.hold_level_range`).
    """
    if load.mass_t < 0:
        raise LoadingError(f"hold {hold.id}: negative cargo mass {load.mass_t:g} t")
    lcg, vcg, tcg = hold.lcg_m, hold.vcg_m, hold.tcg_m
    if load.stowage_m3_t is not None:
        why = stowage_range().rule(load.stowage_m3_t)
        if why:
            raise LoadingError(f"hold {hold.id}: stowage factor {load.stowage_m3_t:g} m³/t is {why}")
        fill = 100.0 * load.mass_t * load.stowage_m3_t / hold.capacity_m3
        if fill > 100.0 + 1e-9:
            raise LoadingError(
                f"hold {hold.id}: {load.mass_t:g} t at {load.stowage_m3_t:g} m³/t needs "
                f"{load.mass_t * load.stowage_m3_t:.1f} m³, more than its {hold.capacity_m3:.1f} m³"
            )
    level = hold_level_range(hold) if load.vcg_m is not None else None
    if level is not None and load.vcg_m not in level:  # the reader's own rule, for a condition made in code
        raise LoadingError(f"hold {hold.id}: VCG {load.vcg_m:g} m is outside the hold, whose floor is at "
                           f"{level.low:.4g} m and top at {level.high:.4g} m above the keel (its fill table)")
    if load.stowage_m3_t is not None and hold.fill_pct is not None:
        i, f = bracket(hold.fill_pct, min(fill, 100.0), f"fill of hold {hold.id}", "%")
        if hold.fill_vcg_m is not None:
            vcg = float(lerp_row(hold.fill_vcg_m, i, f))
        if hold.fill_lcg_m is not None:
            lcg = float(lerp_row(hold.fill_lcg_m, i, f))
    lcg = load.lcg_m if load.lcg_m is not None else lcg
    vcg = load.vcg_m if load.vcg_m is not None else vcg
    tcg = load.tcg_m if load.tcg_m is not None else tcg
    return ItemResult("hold", hold.id, load.description or hold.name, load.mass_t, lcg, vcg, tcg)


@frozen
class WeightSum:
    """Δ and centre of gravity of everything aboard (solid, before free surface)."""

    mass_t: float
    lcg_m: float
    vcg_m: float
    tcg_m: float


def sum_weights(items: list[ItemResult], tanks: list[TankContents]) -> WeightSum:
    """Δ = Σw; LCG = Σw·x/Δ; KG = Σw·z/Δ; TCG = Σw·y/Δ (standards.md §6.3)."""
    m = mx = mz = my = 0.0
    for it in items:
        m += it.mass_t
        mx += it.mass_t * it.lcg_m
        mz += it.mass_t * it.vcg_m
        my += it.mass_t * it.tcg_m
    for c in tanks:
        w = c.volume_m3 * c.density_t_m3
        m += w
        mx += w * c.lcg_m
        mz += w * c.vcg_m
        my += w * c.tcg_m
    if m <= 0.0:
        raise LoadingError("total displacement is zero or negative")
    return WeightSum(m, mx / m, mz / m, my / m)


def stated_density_notes(vessel: Vessel, condition: Condition) -> list[tuple[str, str]]:
    """(code, message) cautions for each density stated in ``condition`` (a file's ``density_t_m3``
    or the screen's D) outside the usual range of its tank's kind: the same range and words as the
    profile audit's warning on a tank's own density (:func:`deckload.core.bounds.kind_density_note`).
    A ballast tank stated at 1.25 t/m³ for 1.025 adds 2.7–5.4 t unseen (found by an audit); the
    physical range 0.5–2.5 t/m³ is refused where it is read, here only a doubt is said."""
    out = []
    for fill in condition.tanks:
        if fill.density_t_m3 is None or fill.tank_id not in vessel.tank_index:
            continue
        tank = vessel.tank(fill.tank_id)
        why = kind_density_note(tank.kind, fill.density_t_m3)
        if why is not None:
            out.append(("tank-density", f"{tank.id}: density {fill.density_t_m3:g} t/m³ stated for this condition is {why}"))
    return out
