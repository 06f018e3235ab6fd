"""What the watchkeeper types, checked and turned into a new Condition.

Every function here either returns a new :class:`~deckload.core.model.Condition`
or raises :class:`EntryError` with a sentence fit to show on screen; the
condition passed in is never changed (it is frozen anyway), so refused input
changes nothing.  No textual here: the UI only shows the message.

Amount syntax (case-insensitive, spaces allowed, decimal point only):
``55%`` percent of capacity, ``12.5m3`` (or ``m³``) volume, ``10t`` mass,
``1.2m`` sounding (read from the tank's sounding zero), ``0.85u`` ullage (read down from the
tank's ullage reference point; the profile gives ``ullage_reference_m``).
"""

from __future__ import annotations

import dataclasses

import re

from deckload.core import bounds
from deckload.core.frozen import frozen
from deckload.core.loading import (
    LoadingError,
    apart,
    level_of,
    over_limit,
    reading_limits,
    reading_outside,
    reading_range,
    resolve_tank,
    volume_of,
)
from deckload.core.model import (
    LEVEL_QUANTITIES,
    Condition,
    DeckArea,
    DeckItem,
    Hold,
    HoldLoad,
    MassItem,
    Tank,
    TankFill,
    Vessel,
)
from deckload.core.soundings import level_soundings
from deckload.io.limits import MAX_ENTRY_CHARS, MAX_ITEM_NAME_CHARS
from deckload.io.textsafe import control_char

UNITS: dict[str, str] = {"%": "percent", "m3": "volume_m3", "m³": "volume_m3", "t": "mass_t", "m": "sounding_m",
                         "u": "ullage_m"}
"""Unit as typed → the condition's quantity name."""

UNIT_LABEL: dict[str, str] = {"percent": "%", "volume_m3": "m³", "mass_t": "t", "sounding_m": "m sounding",
                              "ullage_m": "m ullage"}

WATER_DENSITY_RANGE_T_M3 = bounds.WATER_DENSITY_RANGE_T_M3
LIQUID_DENSITY_RANGE_T_M3 = bounds.LIQUID_DENSITY_RANGE_T_M3
"""Accepted density of a tank's contents: the same range as every profile and condition file."""
"""Accepted water density: the same range as every condition file (deckload.core.bounds)."""

EMPTY_VOLUME_M3 = 1e-9

# Linear-time patterns: a digit run belongs to exactly one part, so nothing is tried twice
# (the earlier '[0-9]*\.?[0-9]+' could split a run of digits every way before failing).
_DECIMAL = r"(?:[0-9]+(?:\.[0-9]+)?|\.[0-9]+)"
_AMOUNT = re.compile(rf"^\s*(?P<num>{_DECIMAL})\s*(?P<unit>%|m3|m³|t|m|u)\s*$", re.IGNORECASE)
_NUMBER = re.compile(rf"^\s*(?P<num>[+-]?{_DECIMAL})\s*(?P<unit>[a-z³/%]*[0-9]?)\s*$", re.IGNORECASE)


class EntryError(ValueError):
    """Input refused; the message says why and what would be accepted."""


class AmbiguousId(EntryError):
    """What was typed matches two ids of the profile that differ only in case."""


# --------------------------------------------------------------------------- numbers


def _too_long(raw: str, what: str) -> None:
    if len(raw) > MAX_ENTRY_CHARS:
        raise EntryError(f"{what}: {len(raw)} characters typed; an entry has at most {MAX_ENTRY_CHARS}.")


def parse_amount(text: str) -> tuple[str, float]:
    """``"55%"`` → ``("percent", 55.0)``; refuses a bare number or an unknown unit."""
    raw = text.strip()
    _too_long(raw, "Amount")
    if not raw:
        raise EntryError("Nothing typed: give an amount with its unit, e.g. 55%, 12.5m3, 10t, 1.2m or 0.85u.")
    if "," in raw:
        raise EntryError(f"{raw!r}: use a decimal point, not a comma.")
    m = _AMOUNT.match(raw)
    if m is None:
        if _NUMBER.match(raw) and not _NUMBER.match(raw).group("unit"):
            raise EntryError(f"{raw!r} has no unit: add % (percent), m3 (volume), t (tonnes), m (sounding) "
                             "or u (ullage).")
        raise EntryError(f"{raw!r} is not an amount: write e.g. 55%, 12.5m3, 10t, 1.2m or 0.85u (no minus sign).")
    return UNITS[m.group("unit").lower()], float(m.group("num"))


def parse_number(text: str, what: str, unit: str = "", *, low: float | None = None, high: float | None = None) -> float:
    """A plain number, optionally followed by ``unit``; checked against [low, high]."""
    raw = text.strip()
    _too_long(raw, what)
    m = _NUMBER.match(raw)
    if raw and "," in raw:
        raise EntryError(f"{what}: {raw!r}: use a decimal point, not a comma.")
    if not raw or m is None:
        raise EntryError(f"{what}: {raw!r} is not a number." if raw else f"{what}: nothing typed.")
    typed_unit = m.group("unit").lower().replace("³", "3")
    if typed_unit and typed_unit != unit.replace("³", "3"):
        raise EntryError(f"{what}: unit {m.group('unit')!r} not understood here; give {unit or 'a plain number'}.")
    value = float(m.group("num"))
    u = f" {unit}" if unit else ""
    if low is not None and value < low:
        raise EntryError(f"{what} {value:g}{u} is below the lowest accepted value {low:g}{u}.")
    if high is not None and value > high:
        kg = bounds.kilograms_hint(value, low or 0.0, high) if unit == "t" else ""
        raise EntryError(f"{what} {value:g}{u} is above the highest accepted value {high:g}{u}{kg}.")
    return value


# --------------------------------------------------------------------------- tanks


def tank_density(tank: Tank, fill: TankFill | None) -> float:
    return fill.density_t_m3 if fill is not None and fill.density_t_m3 is not None else tank.density_t_m3


def max_sounding_m(tank: Tank) -> float:
    """The greatest sounding reading the tank's table covers (m)."""
    return reading_range(tank, "sounding_m")[1]


def amount_hint(tank: Tank, fill: TankFill | None) -> str:
    """The line under the amount field: what may be typed for this tank, and its limits."""
    rho = f"density {tank_density(tank, fill):.3f} t/m³"
    if not tank.level_known:
        return (f"55% · 12.5m3 · 10t (capacity-only tank: no sounding).  Capacity {tank.capacity_m3:.2f} m³, {rho}")
    head = "55% · 12.5m3 · 10t · 1.2m (sounding)"
    if tank.ullage_reference_m is not None:
        lo, hi = reading_limits(tank, "ullage_m")
        return (f"{head} · 0.85u (ullage {lo:.2f}–{hi:.2f} m).  Capacity {tank.capacity_m3:.2f} m³{_table_top(tank)}, greatest sounding "
                f"{max_sounding_m(tank):.2f} m, {rho}")
    return f"{head}.  Capacity {tank.capacity_m3:.2f} m³{_table_top(tank)}, greatest sounding {max_sounding_m(tank):.2f} m, {rho}"


def _table_top(tank: Tank) -> str:
    """A table printed short of full, in the amount hint: what may be stated stops at its top."""
    return f" (table to {tank.table_top_pct:g} %: {tank.fill_limit_m3:.2f} m³)" if tank.short_table else ""


def fill_volume_m3(tank: Tank, fill: TankFill | None) -> float:
    """Volume (m³) a condition entry stands for, as the engine resolves it."""
    if fill is None:
        return 0.0
    return volume_of(tank, fill.quantity, fill.value, tank_density(tank, fill))


def levelled_fill(vessel: Vessel, condition: Condition, fill: TankFill | None):
    """``(fill as the calculation takes it, its correction or None)``: a sounding or ullage read
    with the ship trimmed or listed (the condition's ``sounding_trim_m``, ``sounding_list_deg``)
    turned into the even-keel reading of the same volume by the calculation's own step,
    :func:`deckload.core.soundings.level_soundings`; any other entry as it is."""
    if fill is None or fill.quantity not in LEVEL_QUANTITIES or (
            condition.sounding_trim_m == 0.0 and condition.sounding_list_deg == 0.0):
        return fill, None
    try:
        levelled, done, _ = level_soundings(vessel, condition.replace(tanks=(fill,)))
    except LoadingError as e:
        raise EntryError(str(e)[0].upper() + str(e)[1:] + ".") from None
    return levelled.tanks[0], (done[0] if done else None)


def held_m3(vessel: Vessel, condition: Condition, tank: Tank) -> float:
    """Volume (m³) ``tank`` holds in ``condition`` as the calculation takes it (a sounding read
    trimmed or listed corrected to even keel, :func:`levelled_fill`)."""
    return fill_volume_m3(tank, levelled_fill(vessel, condition, condition.tank_fill(tank.id))[0])


def sounding_way(condition: Condition) -> str:
    """'trim +0.80 m, list +0.0°': how the soundings were taken, as the calculation's caution says."""
    return f"trim {condition.sounding_trim_m:+.2f} m, list {condition.sounding_list_deg:+.1f}°"


def check_tank_amount(tank: Tank, quantity: str, value: float, density_t_m3: float) -> None:
    """Refuse an amount outside the tank: below zero or above its capacity, or a reading outside its table."""
    if quantity in LEVEL_QUANTITIES:
        try:
            level_of(tank, quantity, value)
        except LoadingError as e:
            raise EntryError(str(e)[0].upper() + str(e)[1:] + ".") from None
        # the bound and its round-off are the condition reader's too (core.loading.reading_outside)
        lo, hi = reading_limits(tank, quantity)
        name = "sounding" if quantity == "sounding_m" else "ullage"
        side = reading_outside(tank, quantity, value)
        if side == "below" and value < 0:
            raise EntryError(f"{tank.id}: {value:g} m is negative.")
        if side == "above":
            v, end = _value_and_bound(value, hi)
            raise EntryError(f"{tank.id}: {name} {v} m is more than its greatest {name} {end} m.")
        if side == "below":
            v, end = _value_and_bound(value, lo)
            raise EntryError(f"{tank.id}: {name} {v} m is less than its smallest {name} {end} m "
                             "(the table's range; nothing is extrapolated).")
        return
    limits = {
        "percent": (tank.table_top_pct, "%"),
        "volume_m3": (tank.fill_limit_m3, "m³"),
        "mass_t": (tank.fill_limit_m3 * density_t_m3, "t"),
    }
    high, unit = limits[quantity]
    if value < 0:
        raise EntryError(f"{tank.id}: {value:g} {unit} is negative.")
    if over_limit(value, high):  # the calculation's own round-off rule (core.loading)
        top = "the top of its table" if tank.short_table else "its capacity"
        what = {"percent": f"{tank.table_top_pct:g} %" + (", the top of its table" if tank.short_table else ""),
                "volume_m3": f"{top} {high:.2f} m³",
                "mass_t": f"{top} {high:.2f} t at {density_t_m3:.3f} t/m³"}[quantity]
        raise EntryError(f"{tank.id}: {value:.12g} {unit} is more than {what}.")


def _value_and_bound(value: float, bound: float) -> tuple[str, str]:
    """A refused reading and the bound it broke, as the form words them ('0.9', '0.800'), or to as
    many digits as tell them apart where those would read alike."""
    v, end = f"{value:g}", f"{bound:.3f}"
    return (v, end) if float(v) != float(end) else apart(value, bound, 6)


def set_tank(condition: Condition, tank: Tank, quantity: str, value: float) -> Condition:
    """The condition with ``tank`` holding ``value`` in ``quantity``; density override kept."""
    fill = condition.tank_fill(tank.id)
    density = tank_density(tank, fill)
    check_tank_amount(tank, quantity, value, density)
    if quantity == "percent":
        value = min(value, tank.table_top_pct)  # within round-off of full is full, as the calculation takes it
    if quantity in ("percent", "volume_m3", "mass_t") and value <= 0:
        # Nothing in her.  A reading of 0 is kept as read: the tank's own table says what it holds
        # (a booklet's first row may be above the bottom: 0.016 m³ at 0.00 m), as in a file.
        return empty_tank(condition, tank)
    override = fill.density_t_m3 if fill is not None else None
    return condition.with_tank(TankFill(tank.id, quantity, float(value), override))


def empty_tank(condition: Condition, tank: Tank) -> Condition:
    """The condition with ``tank`` empty.  A density stated for it (D, a delivery note) stays with
    the tank until changed, as :func:`set_tank_density` keeps one typed for an empty tank: emptying
    and refilling (0 % and back, a nudge through empty) must not silently return to the tank's
    default.  The confirmation says it stays (:func:`density_kept_note`)."""
    fill = condition.tank_fill(tank.id)
    if fill is None or fill.density_t_m3 is None:
        return condition.without_tank(tank.id)
    return condition.with_tank(TankFill(tank.id, "percent", 0.0, fill.density_t_m3))


def density_kept_note(vessel: Vessel, before: Condition, after: Condition, tank_id: str) -> str:
    """' — its stated density 0.950 t/m³ stays for the next fill (D to change)' when ``tank_id``
    held some in ``before``, holds none in ``after`` and keeps a stated density; else ''."""
    if tank_id not in vessel.tank_index:
        return ""
    tank, fill = vessel.tank(tank_id), after.tank_fill(tank_id)
    if fill is None or fill.density_t_m3 is None or held_m3(vessel, after, tank) > EMPTY_VOLUME_M3:
        return ""
    if held_m3(vessel, before, tank) <= EMPTY_VOLUME_M3:
        return ""
    return f" — its stated density {fill.density_t_m3:.3f} t/m³ stays for the next fill (D to change)"


def set_tank_density(condition: Condition, tank: Tank, text: str) -> Condition:
    """The condition with the density of ``tank``'s contents stated (a bunker delivery note), or
    back to the tank's default when ``text`` is empty or 'default'.

    The amount stays as it was stated: a sounding, ullage, volume or percentage keeps the volume,
    so the mass becomes V·ρ; a mass keeps the mass, so the volume becomes m/ρ, which must still fit
    the tank.  An empty tank takes the density for what will be put in it (0 %, density kept).
    """
    low, high = LIQUID_DENSITY_RANGE_T_M3
    raw = text.strip()
    rho = None if raw.lower() in ("", "default") else parse_number(
        raw, f"Density in {tank.id}", "t/m3", low=low, high=high)
    fill = condition.tank_fill(tank.id)
    if fill is None:
        return condition if rho is None else condition.with_tank(TankFill(tank.id, "percent", 0.0, rho))
    check_tank_amount(tank, fill.quantity, fill.value, tank.density_t_m3 if rho is None else rho)
    return condition.with_tank(dataclasses.replace(fill, density_t_m3=rho))


def describe_fill(tank: Tank, fill: TankFill | None, vessel: Vessel | None = None,
                  condition: Condition | None = None) -> str:
    """What an entry was understood as, with its volume: '55 % = 12.34 m³', 'sounding 1.2 m = 8.10 m³';
    with ``vessel`` and ``condition``, a reading taken trimmed or listed is corrected as the
    calculation corrects it, and says so: 'sounding 0.5 m at trim +0.80 m, list +0.0° (0.425 m at
    even keel, tank geometry) = 15.19 m³'."""
    if fill is None:
        return "empty"
    done = None
    if vessel is not None and condition is not None:
        fill, done = levelled_fill(vessel, condition, fill)
    vol = fill_volume_m3(tank, fill)
    if fill.quantity == "volume_m3":
        return f"{vol:.2f} m³"
    value = done.observed_m if done is not None else fill.value
    said = {"percent": f"{value:g} %", "mass_t": f"{value:g} t",
            "sounding_m": f"sounding {value:g} m", "ullage_m": f"ullage {value:g} m"}[fill.quantity]
    if done is not None:
        said += f" at {sounding_way(condition)} ({done.even_keel_m:.3f} m at even keel, {done.method})"
    return f"{said} = {vol:.2f} m³"


def fill_text(fill: TankFill | None) -> str:
    """A condition entry as the user would type it: 'percent 55' → '55%'."""
    if fill is None:
        return ""
    return f"{fill.value:g}" + {"percent": "%", "volume_m3": "m3", "mass_t": "t", "sounding_m": "m",
                                "ullage_m": "u"}[fill.quantity]


def tank_from_text(condition: Condition, tank: Tank, text: str) -> Condition:
    quantity, value = parse_amount(text)
    return set_tank(condition, tank, quantity, value)


def amount_preview(condition: Condition, tank: Tank, text: str, vessel: Vessel | None = None) -> str:
    """What an amount typed for ``tank`` comes to, shown before ⏎ in every form the tank can be
    stated in: '= 40.0 % · 12.93 m³ · 13.25 t · sounding 1.204 m · ullage 0.796 m' (sounding and
    ullage only where the tank has a level table and, for ullage, a reference point).  The same
    path as ⏎ (``tank_from_text``, then the calculation's ``resolve_tank``): EntryError when ⏎
    would refuse it.  With ``vessel``, a reading taken with the ship trimmed or listed (the
    condition's sounding trim and list) is corrected as the calculation corrects it
    (:func:`levelled_fill`), the sounding and ullage shown are the even-keel ones, and the
    preview ends with the trim it used."""
    fill = tank_from_text(condition, tank, text).tank_fill(tank.id)
    done = None
    if vessel is not None:
        fill, done = levelled_fill(vessel, condition, fill)
    c = resolve_tank(tank, fill)
    parts = [f"{c.fill_pct:.1f} %", f"{c.volume_m3:.2f} m³", f"{c.mass_t:.2f} t"]
    if tank.level_known:
        level = c.sounding_m  # the level above the tank's lowest point
        even = " at even keel" if done is not None else ""
        parts.append(f"sounding {level - tank.sounding_zero_m:.3f} m{even}")
        if tank.ullage_reference_m is not None:
            parts.append(f"ullage {tank.ullage_reference_m - level:.3f} m{even}")
    if done is not None:
        parts.append(f"read at {sounding_way(condition)}: {done.observed_m:.3f} → {done.even_keel_m:.3f} m "
                     f"({done.method})")
    return "= " + " · ".join(parts)


def nudge_tank(condition: Condition, tank: Tank, step_pct: float, vessel: Vessel | None = None) -> Condition:
    """Raise or lower the fill by ``step_pct`` of capacity, from the fill the calculation takes (with
    ``vessel``, a sounding read trimmed is corrected first), clamped to 0–100 %, or to the top of a
    table printed short of full (``Tank.table_top_pct``)."""
    vol = held_m3(vessel, condition, tank) if vessel is not None else fill_volume_m3(tank, condition.tank_fill(tank.id))
    pct = 100.0 * vol / tank.capacity_m3
    new = min(tank.table_top_pct, max(0.0, round(pct + step_pct, 6)))
    if new == pct:
        edge = "full" if step_pct > 0 else "empty"
        raise EntryError(f"{tank.id} is already {edge}.")
    return set_tank(condition, tank, "percent", new)


# --------------------------------------------------------------------------- transfer


@frozen
class TransferPlan:
    """A pumping from one tank to another, as the dialog returns it."""

    from_id: str
    to_id: str
    mass_t: float
    volume_from_m3: float
    condition: Condition
    """The condition after the transfer."""

    @property
    def label(self) -> str:
        return f"Transfer {self.mass_t:.2f} t ({self.volume_from_m3:.2f} m³) {self.from_id} → {self.to_id}"


def plan_transfer(vessel: Vessel, condition: Condition, from_id: str, to_id: str, amount: str) -> TransferPlan:
    """Move ``amount`` (t, m³ or % of the from-tank's capacity) between two tanks.

    Only liquids of one kind are pumped between tanks: fuel into ballast, or cargo
    fuel into a bunker tank, is refused.  The liquid keeps its own density: the
    receiving tank gains the pumped volume, and its contents take the mixed density
    (m_to + m)/(v_to + v) (the pumped liquid's density if it was empty).  Mass is
    conserved; both tanks are then stated by volume.
    """
    for tid, role in ((from_id, "From"), (to_id, "To")):
        if tid not in vessel.tank_index:
            raise EntryError(f"{role}-tank {tid!r} is not a tank of {vessel.particulars.name}.")
    if from_id == to_id:
        raise EntryError("From-tank and to-tank are the same tank.")
    src, dst = vessel.tank(from_id), vessel.tank(to_id)
    if src.kind != dst.kind:
        raise EntryError(f"{from_id} holds {src.kind.replace('_', ' ')} and {to_id} {dst.kind.replace('_', ' ')}: "
                         "a transfer moves one kind of liquid only.")
    sf, df = condition.tank_fill(from_id), condition.tank_fill(to_id)
    rho_s, rho_d = tank_density(src, sf), tank_density(dst, df)
    quantity, value = parse_amount(amount)
    if quantity in LEVEL_QUANTITIES:
        raise EntryError("A transfer amount is given in t, m3 or % (of the from-tank), not as a sounding or ullage.")
    vol_s = {"percent": src.capacity_m3 * value / 100.0, "volume_m3": value, "mass_t": value / rho_s}[quantity]
    if vol_s <= 0:
        raise EntryError("Transfer amount must be more than zero.")
    have_s = held_m3(vessel, condition, src)
    if vol_s > have_s * (1 + 1e-9):
        raise EntryError(f"{from_id} holds only {have_s:.2f} m³ ({have_s * rho_s:.2f} t); cannot pump {vol_s:.2f} m³.")
    mass = vol_s * rho_s
    have_d = held_m3(vessel, condition, dst)
    new_d = have_d + vol_s
    if new_d > dst.fill_limit_m3 * (1 + 1e-9):
        room = dst.fill_limit_m3 - have_d
        raise EntryError(f"{to_id} has room for only {room:.2f} m³ ({room * rho_s:.2f} t of this liquid).")
    rho_mix = (have_d * rho_d + mass) / new_d
    after = set_tank(condition, src, "volume_m3", max(0.0, have_s - vol_s))
    override = None if abs(rho_mix - dst.density_t_m3) < 1e-9 else rho_mix
    after = after.with_tank(TankFill(dst.id, "volume_m3", float(min(dst.fill_limit_m3, new_d)), override))
    return TransferPlan(from_id, to_id, mass, vol_s, after)


# --------------------------------------------------------------------------- holds and items


def hold_from_text(condition: Condition, hold: Hold, text: str, vessel: Vessel | None = None) -> Condition:
    """Set a hold's cargo mass (t); 0 empties it.  The structural limit is enforced, and with
    ``vessel`` the physical bound of one item's mass (:func:`deckload.core.bounds.item_mass_range`)."""
    high = bounds.item_mass_range(vessel).high if vessel is not None else None
    mass = parse_number(text, f"{hold.id} cargo mass", "t", low=0.0, high=high)
    return _hold_mass(condition, hold, mass)


def nudge_hold(condition: Condition, hold: Hold, step_t: float, vessel: Vessel | None = None) -> Condition:
    """One nudge of a hold's cargo mass (:func:`nudge_mass`, bounded as :func:`hold_from_text` is).
    No form or file gives a mass over the structural limit (the condition reader refuses it as the
    form does); should a condition built in code hold one (its danger warning says so), a step
    down is still taken: it moves towards the limit, and refusing it would leave the officer no
    way down but retyping."""
    load = next((h for h in condition.holds if h.hold_id == hold.id), None)
    old = load.mass_t if load is not None else 0.0
    mass = nudge_mass(old, step_t, hold.id, vessel)
    return _hold_mass(condition, hold, mass, over_limit_ok=mass < old)


def _hold_mass(condition: Condition, hold: Hold, mass: float, over_limit_ok: bool = False) -> Condition:
    # the limit and its round-off are the condition reader's too (profiles._read_hold_loads, at_most)
    if hold.max_mass_t is not None and over_limit(mass, hold.max_mass_t) and not over_limit_ok:
        raise EntryError(f"{hold.id}: {mass:g} t is over the hold's structural limit {hold.max_mass_t:g} t"
                         f"{bounds.kilograms_hint(mass, 0.0, hold.max_mass_t)}.")
    if mass == 0:
        return condition.without_hold(hold.id)
    old = next((h for h in condition.holds if h.hold_id == hold.id), None)
    if old is None:
        return condition.with_hold(HoldLoad(hold.id, mass))
    return condition.with_hold(HoldLoad(hold.id, mass, old.stowage_m3_t, old.lcg_m, old.vcg_m, old.tcg_m, old.description))


def nudge_mass(mass_t: float, step_t: float, what: str, vessel: Vessel | None = None, *, deck: bool = False) -> float:
    """One nudge of a mass; a step below zero stops at empty (0 t), except a deck load (``deck``),
    which must weigh more than 0 t (as its form holds it): that step is refused.  With ``vessel``, a step up
    past the physical bound of one item's mass (:func:`deckload.core.bounds.item_mass_range`, as
    every form and file holds it) is refused: the saved working condition would be a file the
    reader refuses."""
    if mass_t <= 0 and step_t < 0:
        raise EntryError(f"{what} is already empty.")
    mass = max(0.0, round(mass_t + step_t, 6))
    if deck and mass <= 0.0:
        raise EntryError(f"{what}: a deck load of {mass:g} t is refused (remove it with e).")
    if vessel is not None and step_t > 0:
        why = bounds.item_mass_range(vessel).rule(mass)
        if why:
            raise EntryError(f"{what}: {mass:g} t is {why}.")
    return mass


@frozen
class ItemForm:
    """The fields of the item dialog, as typed."""

    name: str
    mass: str
    lcg: str
    vcg: str
    tcg: str = "0"
    area: str = ""
    windage: str = ""
    """A deck load's side area for the wind (m²): blank when not known, 0 when hidden."""
    windage_z: str = ""
    """Height of that area's centre above the keel (m): blank for the item's VCG."""


def item_from_form(vessel: Vessel, form: ItemForm, *, deck: bool, base: MassItem | None = None) -> MassItem:
    """A deck item (``deck=True``) or constant from the dialog's fields, every field checked.

    ``base``: the item being edited; what the form does not show (a deck item's
    footprint) is kept from it.  A deck load's side area for the wind is the form's: blank is
    unknown (the weather criterion cannot then be passed), 0 hidden; its centre defaults to the VCG.

    Mass and position must lie within the vessel's physical bounds, the same ones every
    file is held to (:mod:`deckload.core.bounds`): x from −0.2·LBP to 1.2·LBP, |y| ≤ B/2,
    z from 0 to depth + 30 m, mass up to the greatest tabulated displacement less lightship.
    """
    p = vessel.particulars
    name = form.name.strip()
    if not name:
        raise EntryError("Name: give the item a name.")
    if len(name) > MAX_ITEM_NAME_CHARS:  # the condition reader's bound too
        raise EntryError(f"Name: at most {MAX_ITEM_NAME_CHARS} characters.")
    if control_char(name) is not None:
        raise EntryError(f"Name: holds the control character {control_char(name)}; type plain text.")
    mr, xr, zr, yr = bounds.item_mass_range(vessel), bounds.x_range(p), bounds.z_range(p), bounds.y_range(p)
    mass = parse_number(form.mass, "Mass", "t", low=mr.low, high=mr.high)
    lcg = parse_number(form.lcg, "LCG (from AP)", "m", low=xr.low, high=xr.high)
    vcg = parse_number(form.vcg, "VCG (above keel)", "m", low=zr.low, high=zr.high)
    tcg = parse_number(form.tcg or "0", "TCG (+ starboard)", "m", low=yr.low, high=yr.high)
    if not deck:
        return MassItem(name, mass, lcg, vcg, tcg)
    if mass <= 0.0:  # a deck load of nothing is a slip: the file reader refuses it too
        raise EntryError("Mass: a deck load must weigh more than 0 t (remove it with e instead).")
    area = deck_area_id(vessel, form.area)
    if area is not None:
        # a load stands on the area it names: the condition reader refuses the same (io.physcheck)
        on = vessel.deck_area(area)
        off_x, off_y = bounds.off_deck_area_x(on, p.lbp_m, lcg), bounds.off_deck_area_y(on, tcg)
        if off_x:
            raise EntryError(f"LCG (from AP) {lcg:g} m: {off_x}.")
        if off_y:
            raise EntryError(f"TCG (+ starboard) {tcg:g} m: {off_y}.")
    footprint = getattr(base, "footprint_m2", None)
    windage: dict[str, float] = {}
    if form.windage.strip():
        wr = bounds.deck_windage_range(p)
        windage["windage_area_m2"] = parse_number(form.windage, "Side area for the wind", "m2", low=wr.low, high=wr.high)
        windage["windage_centroid_z_m"] = parse_number(form.windage_z, "Its centre above keel", "m", low=zr.low,
                                                       high=zr.high) if form.windage_z.strip() else vcg
    elif form.windage_z.strip():
        raise EntryError("Side area for the wind: give the area (m²) that centre belongs to, or leave both blank.")
    return DeckItem(name, mass, lcg, vcg, tcg, area_id=area, footprint_m2=footprint, **windage)


def tank_id(vessel: Vessel, typed: str, role: str = "Tank") -> str:
    """The tank named by ``typed``: its id as the profile spells it, matched without regard to
    case ('wb1p' is WB1P, and 'WB1P' is wb1p in a profile that spells it so).  Refused when no
    tank, or more than one (ids differing only in case), matches."""
    t = typed.strip()
    return _as_spelled(vessel.tank_index, t, role, f"{role} {t!r} is not a tank of {vessel.particulars.name}.")


def _as_spelled(ids, typed: str, what: str, unknown: str) -> str:
    """The id of ``ids`` that ``typed`` names, as the profile spells it, matched without regard to
    case; refused with ``unknown`` when none matches, and when several do (ids differing only in case)."""
    if typed in ids:
        return typed
    same = [i for i in ids if i.casefold() == typed.casefold()]
    if len(same) > 1:
        raise AmbiguousId(f"{what} {typed!r} matches {', '.join(same)} (they differ only in case): type it as spelled.")
    if not same:
        raise EntryError(unknown)
    return same[0]


def tank_id_or_none(vessel: Vessel, typed: str) -> str | None:
    """:func:`tank_id`, or None where it refuses (for what a field offers while it is typed)."""
    try:
        return tank_id(vessel, typed)
    except EntryError:
        return None


def deck_area_id(vessel: Vessel, typed: str) -> str | None:
    """The deck area named by ``typed``: its id as the profile spells it, matched without regard
    to case as the tank fields are ('aftdeck' is AFTDECK); None when nothing is typed.  Refused
    when no area, or more than one (ids differing only in case), matches."""
    area = typed.strip()
    if not area:
        return None
    known = ", ".join(vessel.area_index) or "none"
    return _as_spelled(vessel.area_index, area, "Deck area",
                       f"Deck area {area!r} is not one of this vessel's deck areas ({known}).")


def form_of(item: MassItem) -> ItemForm:
    area = getattr(item, "area_id", None) or ""
    wa, wz = getattr(item, "windage_area_m2", None), getattr(item, "windage_centroid_z_m", None)
    return ItemForm(item.name, f"{item.mass_t:g}", f"{item.lcg_m:g}", f"{item.vcg_m:g}", f"{item.tcg_m:g}", area,
                    "" if wa is None else f"{wa:g}", "" if wz is None else f"{wz:g}")


def replace_at(items: tuple, index: int, item) -> tuple:
    """``items`` with entry ``index`` replaced (``index == len`` appends; ``item is None`` removes)."""
    lst = list(items)
    if item is None:
        del lst[index]
    elif index == len(lst):
        lst.append(item)
    else:
        lst[index] = item
    return tuple(lst)


def density_from_text(condition: Condition, text: str) -> Condition:
    low, high = WATER_DENSITY_RANGE_T_M3
    rho = parse_number(text, "Water density", "t/m3", low=low, high=high)
    return condition.with_density(rho)


# --------------------------------------------------------------------------- ballast planner


def planner_move(vessel: Vessel, condition: Condition, from_id: str, to_id: str, mass_t: float) -> Condition:
    """The transfer form's own pumping, for the planner (deckload.core.ballast_plan): ValueError
    when it cannot be made."""
    from decimal import Decimal

    # the shortest digits that give mass_t back, written without an exponent ('1e-09' is not a
    # number to the form's reader: the search would lose that step)
    try:
        return plan_transfer(vessel, condition, from_id, to_id, f"{Decimal(repr(mass_t)):f}t").condition
    except EntryError as exc:
        raise ValueError(str(exc)) from None


def planner_room(vessel: Vessel, condition: Condition, from_id: str, to_id: str) -> float:
    """The most tonnes that can be pumped from ``from_id`` into ``to_id`` (one kind of liquid only)."""
    src, dst = vessel.tank(from_id), vessel.tank(to_id)
    if src.kind != dst.kind:
        raise ValueError("a transfer moves one kind of liquid only")
    sf = condition.tank_fill(from_id)
    have = held_m3(vessel, condition, src)
    free = dst.fill_limit_m3 - held_m3(vessel, condition, dst)
    return max(0.0, min(have, free) * tank_density(src, sf) * (1 - 1e-9))


def tank_matches(vessel: Vessel, typed: str, want=None) -> list[Tank]:
    """The tanks a tank field offers as the officer types: those whose id starts with the text
    first, then those whose id, name or kind contains it (case-insensitive), in profile order;
    every tank when nothing is typed.  ``want(tank)`` keeps only the tanks that fit the field."""
    t = typed.strip().lower()
    pool = [k for k in vessel.tanks if want is None or want(k)]
    if not t:
        return pool
    first = [k for k in pool if k.id.lower().startswith(t)]
    rest = [k for k in pool if k not in first and (t in k.id.lower() or t in k.name.lower()
                                                   or t in k.kind.replace("_", " "))]
    return first + rest


def tank_choice(condition: Condition, tank: Tank) -> str:
    """One line of the tank list: id, kind, level, contents and room (mass at the tank's density)."""
    fill = condition.tank_fill(tank.id)
    vol = fill_volume_m3(tank, fill)
    rho = tank_density(tank, fill)
    room = (tank.fill_limit_m3 - vol) * rho
    return (f"{tank.id:<6} {tank.kind.replace('_', ' '):<11.11} {100 * vol / tank.capacity_m3:5.1f} % "
            f"{vol * rho:7.2f} t  room {room:7.2f} t  {tank.name}")


def area_matches(vessel: Vessel, typed: str) -> list[DeckArea]:
    """The deck areas a deck-area field offers as the officer types, as ``tank_matches``: id
    starting with the text first, then id or name containing it; every area when nothing is typed."""
    t = typed.strip().lower()
    if not t:
        return list(vessel.deck_areas)
    first = [a for a in vessel.deck_areas if a.id.lower().startswith(t)]
    return first + [a for a in vessel.deck_areas if a not in first and (t in a.id.lower() or t in a.name.lower())]


def area_choice(condition: Condition, area: DeckArea) -> str:
    """One line of the deck-area list: id, area, the deck items already on it and, where the
    profile states a permissible uniform load, the room left under it (max_load_t_m2 × area_m2
    less those items: the limit the deck-load check applies, core.stability), then the name."""
    on = sum(d.mass_t for d in condition.deck_items if d.area_id == area.id)
    if area.max_load_t_m2 is None:
        room = "no load limit stated"
    else:
        room = f"room {area.max_load_t_m2 * area.area_m2 - on:7.1f} t (≤ {area.max_load_t_m2:.2f} t/m²)"
    return f"{area.id:<10} {area.area_m2:6.1f} m²  on it {on:6.1f} t  {room}  {area.name}"


def receiving_tank(vessel: Vessel, condition: Condition, from_id: str) -> str:
    """The transfer form's default to-tank: the partner if it has room, else the tank of the same
    liquid with the most room; '' when no tank of that liquid can take any."""
    src = vessel.tank(from_id)

    def room(t) -> float:
        return t.fill_limit_m3 - held_m3(vessel, condition, t)

    if src.pair and src.pair in vessel.tank_index and room(vessel.tank(src.pair)) > 1e-6:
        return src.pair
    others = [t for t in vessel.tanks if t.kind == src.kind and t.id != from_id and room(t) > 1e-6]
    return max(others, key=room).id if others else ""


def giving_tank(vessel: Vessel, condition: Condition, to_id: str) -> str:
    """The transfer form's default from-tank when the tank chosen to fill is empty: the partner if
    it holds some, else the tank of the same liquid holding the most; '' when none holds any."""
    dst = vessel.tank(to_id)

    def held(t) -> float:
        return held_m3(vessel, condition, t)

    if dst.pair and dst.pair in vessel.tank_index and held(vessel.tank(dst.pair)) > 1e-6:
        return dst.pair
    others = [t for t in vessel.tanks if t.kind == dst.kind and t.id != to_id and held(t) > 1e-6]
    return max(others, key=held).id if others else ""
