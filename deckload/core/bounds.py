"""The physical bounds of every number a file or a keystroke can reach, from the vessel's own extent.

One place for them: the profile and condition readers (:mod:`deckload.io.physcheck`) and the
screen's forms (:mod:`deckload.ui.entry`) both ask here, so that no file can produce a result
the screen could not, and no result can pass that the ship could not float in.

Every range is derived from the particulars (LBP, breadth B, depth D), the table density ρ
and the hydrostatic table, with the reasoning beside it:

* **Positions.**  x from −0.2·LBP to 1.2·LBP (overhangs, rudder and bow beyond the
  perpendiculars), |y| ≤ B/2, z from the keel to D + 30 m (masts and deck stows).  These are
  the limits the item form has always used (common practice for an envelope check).
* **Hull box.**  The hull lies inside a box of length 1.2·LBP (overall length; the audit's
  waterline bound), breadth B and height depth + 30 m: a compartment's volume, a deck area
  and a transfer moment (volume × the largest centroid shift, √(B² + z_max²)) are at most
  the box's.  Derived: every section inside the box has less.
* **Profile tables** (positions of tanks and lightship, hydrostatic rows, KN, free-surface
  inertias) are judged by the plausibility audit (:mod:`deckload.core.audit`) on the same
  envelope, which every command runs before it uses a profile.
* **Masses.**  No item can weigh more than the vessel's greatest tabulated displacement
  less her lightship (she would not float: Δ beyond the table is refused anyway, but a
  single item past it is an input mistake to name at its key).
* **Particulars** themselves: LBP 1–500 m, B and D 0.2–100 m and neither above LBP (every
  ship afloat is within these; common practice).
* **Holds.**  A stowage factor between the specific volume of solid lead and that of air
  (:data:`STOWAGE_FACTOR_RANGE_M3_T`); a cargo centre of gravity between the hold's floor
  and its top as its fill table gives them (:func:`hold_vcg_range`).
* **Sizes with a floor.**  A deck area, a deck item's footprint, the lightship's mass and the
  waterline length have a least value too (:func:`deck_area_range`, :func:`footprint_range`,
  :func:`lightship_mass_range`, :func:`waterline_length_range`): a vanishing one would only
  divide a load into an absurd pressure or a lever; a tank's calibration cannot imply a
  surface larger than the hull's plan area (:func:`max_plan_area_m2`).

The evaluation's last step (:func:`checked_result`) refuses any non-finite number and any
result whose end drafts leave the range the upright, even-keel tables describe (keel out of
the water at an end, or an end deeper than the table reaches): such a condition cannot be
assessed from these tables and must never be called compliant.
"""

from __future__ import annotations

import dataclasses
import functools
import math
from typing import Callable

import numpy as np

from deckload.core.frozen import frozen, values_getter
from deckload.core.model import DeckArea, Hold, Particulars, Vessel
from deckload.core.tables import OutOfRangeError

AFT_OVERHANG = 0.2
"""How far beyond either perpendicular a position may lie, as a fraction of LBP: the plausibility
audit's envelope (deckload.core.audit.ENVELOPE_X_FRACTION is this number), so the profile audit,
the readers and the forms agree.  Overall length rarely exceeds 1.2 × LBP (common practice).
(Defined here, not in the audit, so that a calculation does not load the audit.)"""
LENGTH_FACTOR = 1.0 + AFT_OVERHANG
"""A hull is at most 1.2·LBP long overall (common practice; the audit's waterline bound too)."""
ABOVE_DEPTH_M = 30.0
"""How far above the depth a centre of gravity may lie (masts, deck stows), m (common practice)."""

WATER_DENSITY_RANGE_T_M3 = (0.99, 1.04)
"""The water a vessel floats in (t/m³): fresh river water 1.000 to dense sea water (common practice)."""

LIQUID_DENSITY_RANGE_T_M3 = (0.5, 2.5)
"""What a tank may hold (t/m³), in a profile, a condition file or typed on the screen from a bunker
delivery note: from liquefied gas near 0.5 (propane at its boiling point) through oils 0.8–1.0
and water 1.000–1.025 to the liquid mud and completion brines of an offshore supply vessel, whose
tanks are commonly specified for a specific gravity of 2.5 (common practice, from memory; heavy
zinc/calcium bromide brines are about 2.3).  A density outside it is a typing error (a shifted
point, kg/m³ for t/m³), not a liquid."""

KIND_DENSITY_T_M3 = {"fuel_oil": (0.80, 1.010), "diesel": (0.80, 0.900), "lube_oil": (0.85, 0.95),
                     "fresh_water": (0.99, 1.01), "ballast": (0.995, 1.035)}
"""A tank's density outside the usual range of its kind (t/m³): a warning of the profile's audit
(deckload.core.audit) for the profile's density, a caution in the result
(:func:`kind_density_note`) for one stated in a condition (a file or the screen's D).  Residual fuel at most
1.010 and distillate 0.900 at 15 °C (ISO 8217, standards.md §6.2); fresh water 1.000 and sea water
1.025 (standards.md §6.2) with a little for temperature; gas oil from about 0.80 and lubricating
oil 0.85–0.95 (from memory).  A ballast tank at 1.25 (for 1.025) added 2.7–5.4 t unseen (found
by an audit).  Cargo liquids and 'other' are not judged."""


def kind_density_note(kind: str, density_t_m3: float) -> str | None:
    """Words for a density outside the usual range of the tank's ``kind``
    (:data:`KIND_DENSITY_T_M3`), or None (inside it, or a kind not judged)."""
    usual = KIND_DENSITY_T_M3.get(kind)
    if usual is None or usual[0] <= density_t_m3 <= usual[1]:
        return None
    return (f"outside {usual[0]:g}–{usual[1]:g} t/m³, the usual range of {kind.replace('_', ' ')} "
            "(a digit slipped, or the tank's kind?)")


STOWAGE_FACTOR_RANGE_M3_T = (1.0 / 11.34, 1.0 / 0.0012)
"""A hold's stowage factor (m³ per tonne of cargo as stowed, broken stowage included): from
0.0882 m³/t, the specific volume of solid lead (11.34 t/m³; the densest cargo carried in
quantity, as ingots: from memory), to 833 m³/t, that of air at sea level (1.2 kg/m³; from
memory).  No cargo stows denser than the solid material it is made of (stowed, it takes that
room and more; solid steel is 0.127 m³/t, the densest ores stow at 0.3–0.4 m³/t: common
practice), and a cargo lighter than air would not rest on the hold's floor.  Below the floor a catch of fish
typed as 0.01 m³/t (a density of 100 t/m³) would be put at the hold's floor, KG too low."""

MIN_FOOTPRINT_M2 = 0.01
"""The least footprint of a deck item, m²: a 10 cm × 10 cm foot (common practice; a container's
four corner castings bear on about 0.1 m²).  A smaller one is a point, not a footprint: its
pressure (mass ÷ footprint) would be meaningless."""
MIN_DECK_AREA_M2 = 1.0
"""The least deck area that takes cargo, m² (common practice: a square metre; a smaller spot is
an item's footprint, not an area)."""
MIN_WATERLINE_FRACTION = 0.5
"""The waterline length at any tabulated draft is at least half the LBP (common practice: LBP is
measured on the summer waterline, and rake and cut-up shorten a lighter waterline by far less)."""
MIN_LIGHTSHIP_FRACTION = 0.02
"""The lightship mass is at least 2 % of the greatest tabulated displacement (common practice,
from memory: a large tanker's lightship, among the lightest relative to her size, is about 8 %
of her displacement at the depth; a trawler's 40–60 %)."""

LBP_RANGE_M = (1.0, 500.0)
BEAM_DEPTH_RANGE_M = (0.2, 100.0)


ROUND_OFF = 1e-9
"""Round-off allowance when a stated amount meets its limit: ``limit + 1e-9·max(1, |limit|)``.
The profile and condition reader (tomlcheck.REL_TOL, ``at_most``; :func:`reading_outside` for a
sounding or ullage) and the screen's entry check use the same allowance, so an amount one accepts
the other and the calculation never refuse."""


def over_limit(value: float, limit: float) -> bool:
    """True when ``value`` exceeds ``limit`` by more than the round-off allowance."""
    return not value <= limit + ROUND_OFF * max(1.0, abs(limit))


def below_limit(value: float, limit: float) -> bool:
    """True when ``value`` is below ``limit`` by more than the round-off allowance (:data:`ROUND_OFF`)."""
    return not value >= limit - ROUND_OFF * max(1.0, abs(limit))


KILOGRAM_SLIP_EXCESS = 20.0
"""A mass above its limit is said to look like kilograms only when it is at least 20 times the limit
and its thousandth lies within the allowed range.  A kilogram slip is a factor of 1000; a few times
the limit is a mistyped or misread load (110 t in a 55 t hold read 'it looks like kilograms:
0.11 t?' at the earlier factor of 2, found in review), and 20 × still hints for every load from 2 %
of the limit up (common practice: booklets print masses in tonnes, cargo papers often in kg; a hold
of 2100 t typed 2 100 000 was told only that it was above the structural limit, found by an audit)."""


def kilograms_hint(x: float, low: float, high: float) -> str:
    """``"; it looks like kilograms: … t?"`` when a mass ``x`` (t) above ``high`` is 1000 × a mass
    within [low, high] and at least :data:`KILOGRAM_SLIP_EXCESS` × ``high``; else ``""``.  The one
    place every mass bound (:class:`Range` in tonnes, the hold's structural limit in the condition
    reader and on the screen) asks."""
    if not (math.isfinite(x) and high > 0.0 and x >= KILOGRAM_SLIP_EXCESS * high):
        return ""
    t = x / 1000.0
    if not low <= t <= high:
        return ""
    return f"; it looks like kilograms: {t:.6g} t?"


@frozen
class Range:
    """An allowed closed interval with its unit and the reason, worded for a message."""

    low: float
    high: float
    unit: str
    why: str

    def rule(self, x: float) -> str | None:
        """None when ``x`` is a finite number inside, else the broken rule in words."""
        if not isinstance(x, (int, float)) or isinstance(x, bool) or not math.isfinite(x):
            return f"must be a finite number ({self.why})"
        if self.low <= x <= self.high:
            return None
        side = "below" if x < self.low else "above"
        kg = kilograms_hint(x, self.low, self.high) if self.unit == "t" else ""
        return (f"{side} the physical limit: must be between {_n(self.low)} and {_n(self.high)} {self.unit} "
                f"({self.why}){kg}")

    def __contains__(self, x: float) -> bool:
        return self.rule(x) is None


def _n(x: float) -> str:
    return f"{x:.6g}"


# --------------------------------------------------------------------------- particulars


def lbp_range() -> Range:
    return Range(*LBP_RANGE_M, "m", "length between perpendiculars of a ship")


def beam_range(lbp_m: float) -> Range:
    return Range(BEAM_DEPTH_RANGE_M[0], min(BEAM_DEPTH_RANGE_M[1], lbp_m), "m", "0.2 m up to the LBP")


def depth_range(lbp_m: float) -> Range:
    return Range(BEAM_DEPTH_RANGE_M[0], min(BEAM_DEPTH_RANGE_M[1], lbp_m), "m", "0.2 m up to the LBP")


# --------------------------------------------------------------------------- positions


def x_range(p: Particulars) -> Range:
    """Longitudinal positions from the AP: −0.2·LBP … 1.2·LBP."""
    return Range(-AFT_OVERHANG * p.lbp_m, (1 + AFT_OVERHANG) * p.lbp_m, "m",
                 "from 0.2·LBP aft of the aft perpendicular to 0.2·LBP forward of the forward one")


def y_range(p: Particulars) -> Range:
    """Transverse positions: within half the breadth of the centreline."""
    return Range(-p.breadth_m / 2, p.breadth_m / 2, "m", "within half the breadth of the centreline")


def z_max_m(p: Particulars) -> float:
    return p.depth_m + ABOVE_DEPTH_M


def z_range(p: Particulars) -> Range:
    """Heights above the keel: 0 … depth + 30 m."""
    return Range(0.0, z_max_m(p), "m", f"from the keel to {_n(ABOVE_DEPTH_M)} m above the depth")


def table_trim_range(p: Particulars) -> Range:
    """The trim of a table at a trim (m, + by the stern): |t| ≤ min(2·depth, 0.2·LBP).

    Beyond twice the depth one end's keel is out of the water or the other's deck under at
    any mean draft (the ends lie at T_mid ± t/2, derived); a fifth of LBP is the limit the
    sounding corrections keep (:data:`deckload.core.soundings.MAX_TRIM_FRACTION`)."""
    t = min(2.0 * p.depth_m, 0.2 * p.lbp_m)
    return Range(-t, t, "m", "within twice the depth and a fifth of LBP, by the head or by the stern")


# --------------------------------------------------------------------------- hull box


def box_length_m(p: Particulars) -> float:
    return LENGTH_FACTOR * p.lbp_m


def area_range(p: Particulars) -> Range:
    return Range(0.0, box_length_m(p) * p.breadth_m, "m²", "at most 1.2·LBP × breadth")


def max_plan_area_m2(p: Particulars) -> float:
    """The hull's greatest plan area, 1.2·LBP × B (the hull box): no waterplane, and so no tank's
    liquid surface, is larger (derived)."""
    return box_length_m(p) * p.breadth_m


def deck_area_range(p: Particulars) -> Range:
    """A deck area: at least :data:`MIN_DECK_AREA_M2`, at most the hull's plan area."""
    return Range(MIN_DECK_AREA_M2, max_plan_area_m2(p), "m²",
                 f"at least {_n(MIN_DECK_AREA_M2)} m² and at most 1.2·LBP × breadth")


def footprint_range(p: Particulars, deck_area_m2: float | None = None) -> Range:
    """A deck item's footprint: at least :data:`MIN_FOOTPRINT_M2`, at most the deck area it stands on
    (or the hull's plan area when it names none)."""
    if deck_area_m2 is None:
        return Range(MIN_FOOTPRINT_M2, max_plan_area_m2(p), "m²",
                     f"at least {_n(MIN_FOOTPRINT_M2)} m² and at most 1.2·LBP × breadth")
    return Range(MIN_FOOTPRINT_M2, max(MIN_FOOTPRINT_M2, deck_area_m2), "m²",
                 f"at least {_n(MIN_FOOTPRINT_M2)} m² and at most the deck area it stands on")


AREA_EDGE_TOLERANCE_M = 0.05
"""How far beyond a deck area's stated ends or edges (``x_m``, ``y_m``) a deck load's centre may
lie, m: half a unit of a position printed to 0.1 m, as deck plans and cargo plans commonly print
them (common practice).  Further off, the load is not on the area it names: most often its centre
was measured from another datum (midships, the FP) than a loading condition's AP."""


def _on_span(x: float, span: tuple[float, float]) -> bool:
    return span[0] - AREA_EDGE_TOLERANCE_M <= x <= span[1] + AREA_EDGE_TOLERANCE_M


def off_deck_area_x(area: DeckArea, lbp_m: float, x_m: float) -> str | None:
    """None when a deck load's LCG ``x_m`` (m from AP, + forward) lies on ``area``'s stated length
    (:attr:`DeckArea.x_extent_m`, within :data:`AREA_EDGE_TOLERANCE_M`) or the area states none;
    else the broken rule in words, naming the datum the same number would be on the area from
    (midships + forward or + aft, the FP + aft), which is the usual slip.  The file reader
    (:mod:`deckload.io.physcheck`) and the screen's deck-load form (:mod:`deckload.ui.entry`) both
    ask here."""
    return off_span_x(area.x_extent_m, f"deck area {area.id}", "area", "load", lbp_m, x_m)


def off_span_x(span: tuple[float, float] | None, what: str, noun: str, load: str, lbp_m: float,
               x_m: float) -> str | None:
    """:func:`off_deck_area_x` for any space with stated ends ``span`` (m from AP, aft end first), e.g.
    a hold's (:attr:`Hold.x_extent_m`): ``what`` names it ("hold H1"), ``noun`` ("hold") and ``load``
    (what stands in it: "cargo") word the message."""
    if span is None or _on_span(x_m, span):
        return None
    msg = (f"outside {what} that the {load} names: the {noun} spans {_n(span[0])}–{_n(span[1])} m "
           f"from the AP (its x_m in the profile, ± {_n(AREA_EDGE_TOLERANCE_M)} m)")
    fits = [f"{words} ({_n(round(alt, 6))} m from the AP)"
            for alt, words in ((lbp_m / 2 + x_m, "from midships, + forward"), (lbp_m / 2 - x_m, "from midships, + aft"),
                               (lbp_m - x_m, "from the FP, + aft")) if _on_span(alt, span)]
    if fits:
        return (f"{msg}; {_n(x_m)} m {' or '.join(fits)} would lie on it: a loading condition's and the "
                "loading screen's LCG is from the AP, + forward")
    return msg


def off_deck_area_y(area: DeckArea, y_m: float) -> str | None:
    """None when a deck load's TCG ``y_m`` (m, + starboard) lies within ``area``'s stated breadth
    (:attr:`DeckArea.y_extent_m`, within :data:`AREA_EDGE_TOLERANCE_M`) or the area states none;
    else the broken rule in words (and whether the other sign would lie on it)."""
    span = area.y_extent_m
    if span is None or _on_span(y_m, span):
        return None
    msg = (f"outside deck area {area.id} that the load names: the area spans {_n(span[0])} … {_n(span[1])} m "
           f"from the centreline, + starboard (its y_m in the profile, ± {_n(AREA_EDGE_TOLERANCE_M)} m)")
    if _on_span(-y_m, span):
        msg += "; with the sign reversed it would lie on it: a TCG here is + starboard"
    return msg


def waterline_length_range(p: Particulars) -> Range:
    """The waterline length (windage table): 0.5·LBP … 1.5·LBP (the upper bound the windage reader
    has always used; the lower :data:`MIN_WATERLINE_FRACTION`)."""
    return Range(MIN_WATERLINE_FRACTION * p.lbp_m, 1.5 * p.lbp_m, "m", "from 0.5 × LBP to 1.5 × LBP")


# --------------------------------------------------------------------------- holds


def stowage_range() -> Range:
    """A hold's stowage factor (:data:`STOWAGE_FACTOR_RANGE_M3_T`)."""
    return Range(*STOWAGE_FACTOR_RANGE_M3_T, "m³/t",
                 "from solid lead, 11.34 t/m³, to air, 1.2 kg/m³: no cargo stows denser or lighter")


def hold_floor_top_m(hold: Hold) -> tuple[float, float] | None:
    """The height of the hold's floor and of its top (m above the keel), from its fill table;
    None when it has none.

    The table gives the centroid z̄(f) of cargo levelled to fill f (0 … 100 %, as the reader
    requires).  The floor is z̄(0): a layer of no thickness lies on it.  The top is the cargo's
    level when the hold is full: the moment M(f) = f·C·z̄(f) grows by the level's height times
    each volume added, so level(f) = d(f·z̄)/df, and with z̄ linear between the last two rows
    level(100) = z̄₁₀₀ + 100·(z̄₁₀₀ − z̄ₙ₋₁)/(100 − fₙ₋₁) (derived; on the demo trawler's table it
    gives 3.892 m for her hold's 3.9 m top, on the demo islander's 4.500 m for her 4.5 m deck).
    Any cargo in the hold, levelled or not, has its centre between these two.  These are not
    the table's lowest and highest centroids: the highest, the full hold's, lies below the top,
    and cargo stowed high in a part-filled hold (on shelves, a tween deck) is above it."""
    if hold.fill_pct is None or hold.fill_vcg_m is None or len(hold.fill_pct) < 2:
        return None
    f = np.asarray(hold.fill_pct, dtype=float)
    z = np.asarray(hold.fill_vcg_m, dtype=float)
    floor = float(z.min())
    level_full = float(z[-1] + f[-1] * (z[-1] - z[-2]) / (f[-1] - f[-2]))
    return floor, max(level_full, float(z.max()))


def hold_level_range(hold: Hold) -> Range | None:
    """The height a hold's cargo's centre of gravity may have: from the hold's floor to its top
    (:func:`hold_floor_top_m`); None when it has no fill table to give them."""
    ft = hold_floor_top_m(hold)
    if ft is None:
        return None
    return Range(*ft, "m", f"within hold {hold.id}: from its floor to its top, as its fill table gives them")


def hold_vcg_range(p: Particulars, hold: Hold) -> Range:
    """Where a condition may put the centre of gravity of a hold's cargo: :func:`hold_level_range`
    when it has a fill table, else the keel to depth + 30 m (:func:`z_range`: the profile gives no
    more of the hold's extent).  The profile gives no longitudinal or transverse extent of a hold:
    an LCG or TCG override is held to the hull's (:func:`x_range`, :func:`y_range`)."""
    level = hold_level_range(hold)
    if level is None:
        return z_range(p)
    lo, hi = max(0.0, level.low), min(z_max_m(p), level.high)
    return Range(lo, max(lo, hi), "m", level.why)


def volume_range(p: Particulars) -> Range:
    """A compartment's volume: at most the box 1.2·LBP × B × (depth + 30 m)."""
    return Range(0.0, box_length_m(p) * p.breadth_m * z_max_m(p), "m³",
                 "at most the box 1.2·LBP × breadth × (depth + 30 m)")


def transfer_moment_range(p: Particulars, capacity_m3: float) -> Range:
    r = capacity_m3 * math.hypot(p.breadth_m, z_max_m(p))
    return Range(-r, r, "m⁴", "the tank's volume times the largest shift inside the hull")


# --------------------------------------------------------------------------- masses


def max_displacement_t(v: Vessel) -> float:
    return float(v.hydrostatics.displacement_t[-1])


def deck_windage_range(p: Particulars) -> Range:
    """A deck item's side area for the wind (m²): 0 … 1.5·LBP × 30 m (a stow no longer than the ship
    nor 30 m above her deck; 0 when another item or the bulwark hides it)."""
    return Range(0.0, 1.5 * p.lbp_m * 30.0, "m²", "1.5 × LBP × 30 m: not a deck item's side")


def item_mass_range(v: Vessel) -> Range:
    """One item's mass: 0 … the greatest tabulated displacement less the lightship."""
    high = max(0.0, max_displacement_t(v) - v.lightship.mass_t)
    return Range(0.0, high, "t", "at most the greatest displacement in the hydrostatic table less the lightship")


def lightship_mass_range(v: Vessel) -> Range:
    """The lightship: :data:`MIN_LIGHTSHIP_FRACTION` … 1 × the greatest tabulated displacement."""
    hi = max_displacement_t(v)
    return Range(MIN_LIGHTSHIP_FRACTION * hi, hi, "t",
                 "from 2 % of the greatest displacement in the hydrostatic table to all of it")


OFF_CENTRE_FRACTION_B = 0.01
"""A tank whose centre lies within 1 % of B of the centreline is taken as a centreline tank,
symmetric about it, when no port table of transfer says otherwise (common practice)."""


def off_centre(tcg_m, breadth_m: float) -> bool:
    """Whether a tank's centres (its calibration's TCG column) lie off the centreline by more than
    :data:`OFF_CENTRE_FRACTION_B` of the breadth at any level: the one test for the table builder
    (a port table written) and the GZ curve (a caution without one)."""
    return float(np.max(np.abs(tcg_m))) > OFF_CENTRE_FRACTION_B * breadth_m


# --------------------------------------------------------------------------- the evaluation's last step


class NonFiniteResultError(ValueError):
    """A computed number came out infinite or not-a-number: the result is refused."""


class BeyondTablesError(OutOfRangeError):
    """The condition puts an end of the ship where the upright tables do not reach."""


_FIELD_VALUES: dict[type, Callable[[object], tuple]] = {}
"""Per dataclass type, a getter of its field values as one tuple: made once per type, not per object."""
_PLAIN = frozenset((str, bool, int, type(None)))
_FROZEN: dict[type, bool] = {}
"""Per dataclass type, whether it is frozen (its instances' fields cannot be set again)."""
_KNOWN_FINITE: dict[int, object] = {}
"""Records found finite before, by identity (each held here, so that its id is never another
object's while it is kept): a frozen record whose every value is a plain value, a float or a
tuple of floats cannot change, so a later result holding the same object needs no second look
at it.  The evaluation keeps each tank's result for its fill (``stability._tank_result``): a key
that nudges one tank hands the check 26 tank records it has seen, and one new."""
_KNOWN_MAX = 4096
"""A bound on :data:`_KNOWN_FINITE` (emptied when it is reached)."""


def _all_finite(obj) -> bool:
    """True when every number in ``obj`` is certainly finite: the quick pass over a result (no
    path strings are built); False sends :func:`_non_finite` the slow way to name the bad one.

    One walk without recursion: the floats met are gathered and summed once, each numpy array
    of floats is checked in one call, a tuple or list of plain floats (a GZ curve) is summed in
    one call, and a record's plain values are taken from it in one call, not put on the stack
    one by one.  A sum of floats is finite only if every one of them is (an infinity or a NaN
    makes the sum infinite or NaN, derived from IEEE 754 addition); a finite sum that overflowed
    is a false alarm the slow pass clears.  Anything not known here (another type) is False:
    the slow pass decides.  A frozen record of plain values, floats and tuples of floats found
    finite is remembered (:data:`_KNOWN_FINITE`) and not looked at again."""
    floats: list[float] = []
    keep = floats.append
    stack = [obj]
    pop, push, extend = stack.pop, stack.append, stack.extend
    getter_of = _FIELD_VALUES.get
    known = _KNOWN_FINITE
    while stack:
        o = pop()
        t = type(o)
        if t is float:
            keep(o)
        elif t in _PLAIN:
            continue
        elif t is tuple or t is list:
            if o and type(o[0]) is float:
                try:
                    total = sum(o)  # raises on a string, None or a record among them
                except TypeError:
                    extend(o)
                    continue
                if type(total) is float:  # else numpy scalars or arrays among them: one by one
                    keep(total)
                    continue
            extend(o)
        else:
            getter = getter_of(t)
            if getter is None:
                if dataclasses.is_dataclass(o) and not isinstance(o, type):
                    _FROZEN[t] = bool(t.__dataclass_params__.frozen)
                    getter = _FIELD_VALUES[t] = values_getter([f.name for f in dataclasses.fields(o)])
                elif t is np.ndarray:
                    if o.dtype.kind in "fc":
                        if not np.isfinite(o).all():
                            return False
                    elif o.dtype.kind not in "biu":
                        return False
                    continue
                elif isinstance(o, np.floating):
                    keep(float(o))
                    continue
                else:
                    return False
            if not _FROZEN[t]:
                for v in getter(o):
                    tv = type(v)
                    if tv is float:
                        keep(v)
                    elif tv not in _PLAIN:
                        push(v)
                continue
            if known.get(id(o)) is o:
                continue
            own = 0.0
            simple = True
            for v in getter(o):
                tv = type(v)
                if tv is float:
                    own += v
                elif tv in _PLAIN:
                    continue
                elif tv is tuple and v and type(v[0]) is float:
                    try:
                        total = sum(v)
                    except TypeError:
                        total = None
                    if type(total) is float:
                        own += total
                    else:
                        simple = False
                        push(v)
                else:
                    simple = False
                    push(v)
            if not math.isfinite(own):
                return False  # (or a finite sum that overflowed: the slow pass decides)
            if simple:
                if len(known) >= _KNOWN_MAX:
                    known.clear()
                known[id(o)] = o
    return math.isfinite(sum(floats))


def _non_finite(obj, path: str) -> str | None:
    if _all_finite(obj):
        return None
    return _first_non_finite(obj, path)


def _first_non_finite(obj, path: str) -> str | None:
    if isinstance(obj, bool) or obj is None or isinstance(obj, str):
        return None
    if isinstance(obj, (int, float)):
        return None if math.isfinite(obj) else path
    if isinstance(obj, complex):  # a complex array's items (tolist): both parts must be finite
        return None if math.isfinite(obj.real) and math.isfinite(obj.imag) else path
    if dataclasses.is_dataclass(obj):
        for f in dataclasses.fields(obj):
            bad = _first_non_finite(getattr(obj, f.name), f"{path}.{f.name}" if path else f.name)
            if bad:
                return bad
        return None
    if isinstance(obj, (tuple, list)):
        for i, x in enumerate(obj):
            bad = _first_non_finite(x, f"{path}[{i}]")
            if bad:
                return bad
    if hasattr(obj, "dtype") and hasattr(obj, "tolist"):  # numpy scalars/arrays
        return _first_non_finite(obj.tolist(), path)
    return None


def checked_result(vessel: Vessel, result):
    """``result`` if every number in it is finite and both end drafts lie in 0 … the table's
    greatest draft; else raise (:class:`NonFiniteResultError`, :class:`BeyondTablesError`)."""
    bad = _non_finite(result, "")
    if bad:
        raise NonFiniteResultError(f"the computed {bad} is not a finite number: the result is refused "
                                   "(check the condition's masses and positions)")
    top = float(vessel.hydrostatics.draft_m[-1])
    for name, d in (("draft aft", result.draft_aft_m), ("draft forward", result.draft_fwd_m)):
        if not 0.0 <= d <= top * (1 + 1e-9):
            err = BeyondTablesError(f"{name} (trim {result.trim_m:.3g} m)", d, 0.0, top, "m")
            err.args = (f"{name} {d:.4g} m (trim {result.trim_m:.4g} m) is outside 0–{top:.4g} m, the range the "
                        "upright hydrostatic tables describe: this condition cannot be assessed from them "
                        "(check the positions and masses of the loads)",)
            raise err
    return result


def bounded(evaluate):
    """Decorator for the evaluation entry point: its result passes :func:`checked_result`."""

    @functools.wraps(evaluate)
    def wrapper(vessel: Vessel, condition, *args, **kwargs):
        # Floating-point warnings are not shown: a non-finite number is refused just below instead.
        with np.errstate(all="ignore"):
            return checked_result(vessel, evaluate(vessel, condition, *args, **kwargs))

    return wrapper
