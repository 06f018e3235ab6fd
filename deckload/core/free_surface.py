"""Free-surface moments of slack tanks, and the tank states shown to the watchkeeper.

Physics: when she heels, the liquid in a slack tank flows to the low side and its
centroid moves.  For small angles the shift of the ship's G is w·d/Δ with
w·d = ρ·i·sinφ, so she behaves as if G had risen by FSM/Δ, FSM = ρ·i (t·m), with i
the transverse second moment of the free surface (m⁴) about its own centroid.
The free-surface correction (the virtual rise of G) is FSC = ΣFSM/Δ, and
KG_fluid = KG_solid + FSC (standards.md §4.3, textbook).

Which moment each tank contributes follows IS Code 2008 Part B 3.1 under rule
``is2008``:

* at or above 98 % a tank is nominally full and carries no free surface (B 3.1.2);
  nominally full *cargo* tanks are corrected at the 98 % level (B 3.1.2, footnote);
* fixed-level tanks (ballast, cargo) count at their actual level (B 3.1.3);
* variable-level tanks (consumables) count, when slack, at the largest correction
  between their filling limits (B 3.1.3);
* for each kind of consumable liquid, the transverse pair or centreline tank with the
  greatest effect is assumed slack at its largest correction even if it is full or
  empty (B 3.1.4);
* a small tank whose Mfs at 30° over the minimum operating displacement is below
  0.01 m may be left out (B 3.1.12; the 0.01 m value is from memory, standards.md §4.1).

Rule ``actual`` counts every slack tank at its actual level (B 3.1.6, liquid transfers).
"""

from __future__ import annotations

import math
from functools import lru_cache

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.loading import TankContents
from deckload.core.model import FluidTransfer, FreeSurfaceSettings, Tank, Vessel
from deckload.core.tables import bracket, lerp_row

SIN30 = 0.5
TAN30_SQ = 1.0 / 3.0

#: How a tank's free surface is counted.
BASIS_NONE = "none"
BASIS_ACTUAL = "actual"
BASIS_MAX = "max"
BASIS_AT_98 = "at98"


CODE_FULL_PCT = 98.0
"""IS 2008 B 3.1.2's "nominally full" level: the level a nominally full cargo tank is corrected at
(the footnote), whatever fill the profile calls nominally full (``nominally_full_pct`` moves only
where a tank counts as full)."""

CODE_SMALL_TANK_LIMIT_M = 0.01
"""IS 2008 B 3.1.12's small-tank exemption: Mfs(30°)/Δmin below 0.01 m (the paragraph confirmed, the
value from memory: standards.md §4.1, §8 row 16)."""

DEFAULT_EMPTY_PCT = 0.5
"""deckload's own "empty" level: the Code names none; it counts every tank below 98 % as slack
(B 3.1.2) and ignores only the usual remainder in an empty tank (standards.md §4.1, from memory)."""

EXEMPT_RULE = "small tank, exempt (IS 2008 B 3.1.12)"
"""The rule text of a slack tank left out by the small-tank exemption."""


@frozen
class TankFreeSurface:
    """One tank's free-surface treatment in a condition."""

    fsm_tm: float
    """Free-surface moment counted (t·m): ρ·i at the chosen level."""
    basis: str
    """BASIS_NONE, BASIS_ACTUAL, BASIS_MAX or BASIS_AT_98: which level the moment is taken at."""
    rule: str
    """Why, in words, for the screen and the report."""
    state: str
    """'empty', 'slack', 'worst_band' or 'full'."""


def tank_state(fill_pct: float, tank: Tank, empty_pct: float, full_pct: float) -> str:
    """empty / slack / worst_band / full, from the fill and the tank's worst band."""
    # A hair of tolerance so that 98 % typed as m³ (0.98·capacity → 97.99999999999999 %)
    # is judged like 98 % typed as percent.
    if fill_pct <= empty_pct + 1e-9:
        return "empty"
    if fill_pct >= full_pct - 1e-9:
        return "full"
    lo, hi = tank.worst_band_pct
    return "worst_band" if lo <= fill_pct <= hi else "slack"


def pct_text(pct: float, decimals: int = 1) -> str:
    """A percentage to ``decimals`` places without trailing zeros: 50 → '50', 45.34 → '45.3'."""
    text = f"{pct:.{decimals}f}"
    return text.rstrip("0").rstrip(".") if "." in text else text


def band_text(band_pct: tuple[float, float]) -> str:
    """A worst band in words, '33.5–64.6 %': its edges to 0.01 % (trailing zeros left out), so
    that a fill printed to 0.1 % beside it reads inside exactly when it is (the band's edges
    rounded to whole percent, '34–65 %', made 64.7 % read as inside a band ending at 64.6 %)."""
    lo, hi = band_pct
    return f"{pct_text(lo, 2)}–{pct_text(hi, 2)} %"


def fsi_at_fill(tank: Tank, fill_pct: float) -> float:
    """Free-surface inertia (m⁴) at a fill, from the calibration table; a fill up to 100 % above the
    top of a table printed short of full (``Tank.table_top_pct``) reads its last row, the highest
    level the booklet gives."""
    vol = tank.capacity_m3 * fill_pct / 100.0
    if tank.short_table and fill_pct <= 100.0:
        vol = min(vol, tank.fill_limit_m3)
    i, f = bracket(tank.table[:, 1], vol, f"volume of tank {tank.id}", "m³")
    return float(lerp_row(tank.table[:, 5], i, f))


@lru_cache(maxsize=4096)
def mfs30_bound_m4(tank: Tank) -> float:
    """Upper estimate of the tank's volumetric free-surface heeling moment at 30° (m⁴).

    From the transfer table where the tank's shape is known; otherwise the
    wall-sided value i_max·sin30·(1 + ½tan²30), which is never below the exact
    box-tank moment at 30° (checks.md §3.2: 18.667 against 18.124 m⁴ at 50 %).
    Cached per tank: it depends only on the (immutable) tank.
    """
    if tank.transfer is not None:
        # the side that moves more governs: an unsymmetric tank moves its liquid unlike each way
        return float(max(np.max(transfer_column(tank.transfer, math.radians(30.0), port))
                         for port in (False, True) if not port or tank.transfer.moment_port_m4 is not None))
    return tank.max_fsi_m4 * SIN30 * (1.0 + 0.5 * TAN30_SQ)


def transfer_column(tr: FluidTransfer, heel_rad: float, port: bool = False) -> np.ndarray:
    """M (m⁴) at every tabulated fill for one heel angle (linear in heel), heeled to starboard or
    to ``port`` (the port table, which must be there)."""
    h = math.degrees(heel_rad)
    k, f = bracket(tr.heel_deg, h, "heel for fluid transfer", "deg")
    table = tr.moment_port_m4 if port else tr.moment_m4
    return table[:, k] * (1 - f) + table[:, k + 1] * f


def transfer_moment_m4(tank: Tank, basis: str, fill_pct: float, heel_rad: np.ndarray, port: bool = False) -> np.ndarray:
    """Volumetric transfer moment M(φ) (m⁴) for the tank at the given basis, heeled to
    starboard (or to ``port``, from the tank's port table, which must be there).

    ``actual``: M at the actual fill; ``max``: the largest M over all fills at each
    angle (the largest correction between filling limits, IS 2008 B 3.1.3);
    ``at98``: M at 98 %.  Falls back to the small-angle value i·sinφ when the tank
    has no transfer table.
    """
    tr = tank.transfer
    heel_deg = np.degrees(heel_rad)
    if tr is None:
        i = tank.max_fsi_m4 if basis == BASIS_MAX else fsi_at_fill(tank, 98.0 if basis == BASIS_AT_98 else fill_pct)
        return i * np.sin(heel_rad)
    table = tr.moment_port_m4 if port else tr.moment_m4
    if table is None:
        raise ValueError(f"tank {tank.id} has no table of transfer heeled to port")
    if basis == BASIS_MAX:
        per_heel = table.max(axis=0)
    else:
        fill = 98.0 if basis == BASIS_AT_98 else fill_pct
        j, f = bracket(tr.fill_pct, fill, f"fill of tank {tank.id}", "%")
        per_heel = lerp_row(table, j, f)
    return np.interp(heel_deg, tr.heel_deg, per_heel)


def _groups_of_kind(tanks: list[Tank]) -> list[tuple[Tank, ...]]:
    """Transverse pairs and centreline (unpaired) tanks among ``tanks``."""
    seen: set[str] = set()
    ids = {t.id: t for t in tanks}
    groups: list[tuple[Tank, ...]] = []
    for t in tanks:
        if t.id in seen:
            continue
        partner = ids.get(t.pair) if t.pair else None
        group = (t, partner) if partner is not None else (t,)
        seen.update(g.id for g in group)
        groups.append(group)
    return groups


@lru_cache(maxsize=2048)
def _actual_treatment(vessel: Vessel, c: TankContents, rule: str) -> TankFreeSurface:
    """The treatment of a counted tank (not exempt, not the group assumed slack) at its actual
    state: nothing when empty or nominally full (IS 2008 B 3.1.2), a full cargo tank at 98 %,
    ρ·i_max for a variable-level tank (B 3.1.3), ρ·i at the actual level otherwise (B 3.1.3, or
    B 3.1.6 under the transfers rule)."""
    t = c.tank
    fs = vessel.free_surface
    state = tank_state(c.fill_pct, t, fs.empty_pct, fs.nominally_full_pct)
    rho = c.density_t_m3
    if state == "empty":
        return TankFreeSurface(0.0, BASIS_NONE, "empty", state)
    if state == "full":
        if t.kind == "cargo_liquid":
            return TankFreeSurface(rho * fsi_at_fill(t, CODE_FULL_PCT), BASIS_AT_98,
                                   "nominally full cargo tank, at 98 % (IS 2008 B 3.1.2)", state)
        return TankFreeSurface(0.0, BASIS_NONE, _full_rule(fs.nominally_full_pct), state)
    if rule == "is2008" and t.fs_category == "variable":
        return TankFreeSurface(rho * t.max_fsi_m4, BASIS_MAX, "variable level: max between limits (IS 2008 B 3.1.3)",
                               state)
    why = "actual level (IS 2008 B 3.1.3)" if rule == "is2008" else "actual level (IS 2008 B 3.1.6)"
    return TankFreeSurface(rho * c.fsi_m4, BASIS_ACTUAL, why, state)


def _full_rule(full_pct: float) -> str:
    """The rule text of a nominally full tank that carries no correction: IS 2008 B 3.1.2's 98 %, or
    the profile's own threshold named as such (the officer must not read 98 % where 97 % was applied)."""
    if full_pct == CODE_FULL_PCT:
        return "nominally full ≥ 98 % (IS 2008 B 3.1.2)"
    return f"nominally full ≥ {full_pct:g} % (the profile's threshold; IS 2008 B 3.1.2 says 98 %)"


def settings_departures(fs: FreeSurfaceSettings, rule: str) -> tuple[tuple[str, str], ...]:
    """(key, words) of each ``[free_surface]`` setting that leaves out a moment IS 2008 B 3.1 counts.

    * ``nominally_full_pct`` below 98 %: tanks between it and 98 % carry no correction, which
      B 3.1.2 counts (standards.md §4.1, §8 row 15);
    * ``small_tank_limit_m`` above 0.01 m (rule ``is2008`` only: ``actual`` exempts nothing): tanks whose
      Mfs(30°)/Δmin lies between 0.01 m and it are left out (B 3.1.12, value from memory);
    * ``empty_pct`` above deckload's 0.5 %: tanks up to it are taken as empty (the Code ignores only
      the usual remainder, standards.md §4.1 from memory).

    A setting on the conservative side (a higher full level, a lower or no exemption) is no
    departure.  Part B is recommendatory and the Administration decides the treatment for a given
    ship, so such settings are not refused; they are shown wherever they act (the audit, every result).
    """
    out = []
    if fs.nominally_full_pct < CODE_FULL_PCT:
        out.append(("nominally_full_pct", f"nominally_full_pct {fs.nominally_full_pct:g} % (IS 2008 B 3.1.2: "
                    f"{CODE_FULL_PCT:g} %): a tank from {fs.nominally_full_pct:g} % up to 98 % is taken as full, "
                    "with no free surface"))
    if rule == "is2008" and fs.small_tank_limit_m > CODE_SMALL_TANK_LIMIT_M:
        out.append(("small_tank_limit_m", f"small_tank_limit_m {fs.small_tank_limit_m:g} m (IS 2008 B 3.1.12: "
                    f"Mfs(30°)/Δmin < {CODE_SMALL_TANK_LIMIT_M:g} m, from memory): a tank up to "
                    f"{fs.small_tank_limit_m:g} m is left out as small"))
    if fs.empty_pct > DEFAULT_EMPTY_PCT:
        out.append(("empty_pct", f"empty_pct {fs.empty_pct:g} % (the Code counts every tank below 98 % as slack, "
                    f"ignoring only the usual remainder; deckload's default {DEFAULT_EMPTY_PCT:g} %): a tank up to "
                    f"{fs.empty_pct:g} % is taken as empty"))
    return tuple(out)


def free_surface(vessel: Vessel, contents: list[TankContents], rule: str) -> list[TankFreeSurface]:
    """Free-surface treatment of every tank (in profile order) under ``rule``."""
    fs = vessel.free_surface
    full_pct = fs.nominally_full_pct
    dmin = fs.min_operating_displacement_t or vessel.lightship.mass_t
    out: list[TankFreeSurface | None] = [None] * len(contents)

    exempt = [False] * len(contents)
    if rule == "is2008":
        by_id = {c.tank.id: c.tank for c in contents}
        for k, c in enumerate(contents):
            # A pair is judged as one: the transfer tables are for heel to starboard, where
            # the two halves of a shell-following pair behave differently.
            partner = by_id.get(c.tank.pair) if c.tank.pair else None
            m30 = max(mfs30_bound_m4(c.tank), mfs30_bound_m4(partner) if partner else 0.0)
            exempt[k] = c.density_t_m3 * m30 / dmin < fs.small_tank_limit_m

    # B 3.1.4: per consumable kind, the group with the greatest effect is assumed slack.
    assumed: dict[str, str] = {}
    if rule == "is2008":
        index = {c.tank.id: k for k, c in enumerate(contents)}
        kinds = sorted({c.tank.kind for c in contents if c.tank.is_consumable})
        for kind in kinds:
            cands = [c.tank for k, c in enumerate(contents) if c.tank.kind == kind and not exempt[k]]
            best, best_key = None, (0.0, 0.0)
            for group in _groups_of_kind(cands):
                m = sum(t.max_fsi_m4 * contents[index[t.id]].density_t_m3 for t in group)
                # B 3.1.4 names no tie-break.  Between groups of equal ρ·i the one assumed slack is
                # the one that adds most to the total (ρ·i less the moment its actual state would
                # carry anyway, e.g. an empty tank rather than a slack one): conservative, and the
                # answer no longer depends on the order of the tanks in the profile.
                own = sum(_actual_treatment(vessel, contents[index[t.id]], rule).fsm_tm for t in group)
                key = (round(m, 9), m - own)
                if m > 0.0 and key > best_key:
                    best, best_key = group, key
            if best:
                label = "pair" if len(best) == 2 else "centreline tank"
                for t in best:
                    assumed[t.id] = f"assumed slack: worst {label} of {kind.replace('_', ' ')} (IS 2008 B 3.1.4)"

    for k, c in enumerate(contents):
        t = c.tank
        fill = c.fill_pct
        state = tank_state(fill, t, fs.empty_pct, full_pct)
        rho = c.density_t_m3
        if t.fsi_given == "none":
            out[k] = TankFreeSurface(0.0, BASIS_NONE, "no free surface given in the profile (capacity only)", state)
        elif exempt[k] and (state == "empty" or (state == "full" and t.kind != "cargo_liquid")):
            # Empty or nominally full needs no exemption: say the rule that leaves it at zero (B 3.1.2).
            out[k] = _actual_treatment(vessel, c, rule)
        elif exempt[k]:
            out[k] = TankFreeSurface(0.0, BASIS_NONE, EXEMPT_RULE, state)
        elif t.id in assumed:
            # A tank holding liquid whose free surface is counted is slack, whatever deckload's
            # 'empty' level says (that level only leaves out the remainder of a tank taken as
            # empty, with no moment): 'empty' beside 12 t·m of FSM read as a contradiction.  A tank
            # with nothing in it stays 'empty', its moment the B 3.1.4 assumption the rule names.
            shown = "slack" if state == "empty" and c.volume_m3 > 0.0 else state
            out[k] = TankFreeSurface(rho * t.max_fsi_m4, BASIS_MAX, assumed[t.id], shown)
        else:
            out[k] = _actual_treatment(vessel, c, rule)
    return out  # type: ignore[return-value]
