"""The booklet's worked conditions as the acceptance test: deckload's result beside the booklet's.

Before a loading instrument is accepted, its results for the approved booklet's own
loading conditions are compared with the booklet's, row by row, each within the
tolerance of MSC.1/Circ.1229 (Annex, §4 table) and IACS UR L5 Table 1, as listed in
standards.md §5.3.  Rules applied as written there (standards.md §5.2):

* the deviation is taken against the booklet's value (the base value);
* where two values are given ("1 % / 5 cm max"), the percentage of the base value applies
  but may not exceed the linear value (Circ.1461 §5.1 wording);
* the TCG row is a percentage of the breadth B, not of the value.

Trim has no row of its own in the table: it is the difference of the aft and forward
draughts, so its tolerance here is the sum of theirs (derived).

Pure: no files; the booklet's numbers arrive as a mapping (see vessel_profiles/README.md,
"Booklet conditions").
"""

from __future__ import annotations

import math
from typing import Callable

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.result import Result

SOURCE = "standards.md §5.3 (MSC.1/Circ.1229; IACS UR L5 Table 1)"


@frozen
class Tolerance:
    """'pct % / linear max' (either may be None); ``of_breadth``: the % is of B, not of the value."""

    pct: float | None
    linear: float | None
    row: str
    """The row of the tolerance table it comes from."""
    of_breadth: bool = False

    def allowed(self, base: float, breadth_m: float) -> float:
        """The largest |deckload − booklet| accepted for a booklet value ``base``.

        Where a row gives two values (e.g. GZ "5 % / 5 cm max", areas "5 % or 0.0012 m·rad") the
        percentage applies but may not exceed the linear value (MSC.1/Circ.1461 5.1, reproducing
        the Circ.1229 tolerances), hence the smaller of the two."""
        parts = []
        if self.pct is not None:
            parts.append(self.pct / 100.0 * (breadth_m if self.of_breadth else abs(base)))
        if self.linear is not None:
            parts.append(self.linear)
        return min(parts)

    def text(self, unit: str) -> str:
        if self.pct is None:
            return f"{self.linear:g} {unit}"
        pct = f"{self.pct:g} %" + (" of B" if self.of_breadth else "")
        return pct if self.linear is None else f"{pct} / {self.linear:g} {unit} max"


# The rows of standards.md §5.3 that more than one comparison uses (the booklet's conditions here,
# the direct calculation from the hull in deckload.core.equilibrium): written once.
DRAUGHT = Tolerance(1.0, 0.05, "draughts")
GZ = Tolerance(5.0, 0.05, "GZ values")
KMT = Tolerance(1.0, 0.05, "KMt")
GMT = Tolerance(1.0, 0.05, "GMt")
AREA = Tolerance(5.0, 0.0012, "areas under GZ")
EQUILIBRIUM_ANGLE = Tolerance(None, 1.0, "equilibrium angles")
TRIM_WORDS = "aft + forward draught tolerances (derived)"


def trim_allowed(draft_aft_m: float, draft_fwd_m: float, breadth_m: float) -> float:
    """The largest accepted difference of trim: the table has no trim row, and trim is the
    difference of the aft and forward draughts, so the sum of their tolerances (derived)."""
    return DRAUGHT.allowed(draft_aft_m, breadth_m) + DRAUGHT.allowed(draft_fwd_m, breadth_m)


def within(got: float | None, base: float, allowed: float) -> bool:
    """|got − base| ≤ allowed, with :data:`ROUNDOFF` on a difference exactly at the tolerance;
    no value (None) or a value that is not finite is never within."""
    return got is not None and math.isfinite(got) and abs(got - base) <= allowed + ROUNDOFF * max(1.0, abs(base))

QUANTITIES: dict[str, tuple[str, str, Tolerance | None]] = {
    # key: (label, unit, tolerance)  — tolerance None: worked out per row (trim, GZ)
    "displacement_t": ("displacement", "t", Tolerance(2.0, None, "displacement")),
    "deadweight_t": ("deadweight", "t", Tolerance(2.0, None, "volume or deadweight")),
    "lcg_m": ("LCG from AP", "m", Tolerance(1.0, 0.50, "LCG")),
    "tcg_m": ("TCG", "m", Tolerance(0.5, 0.05, "TCG", of_breadth=True)),
    "kg_m": ("KG solid", "m", Tolerance(1.0, 0.05, "VCG")),
    "fsm_tm": ("free-surface moment", "t·m", Tolerance(2.0, None, "free surface moment")),
    "fsc_m": ("FS correction", "m", Tolerance(2.0, None, "FS correction")),
    "kg_fluid_m": ("KG fluid", "m", Tolerance(1.0, 0.05, "VCG")),
    "km_m": ("KMt", "m", KMT),
    "gm_solid_m": ("GM solid", "m", GMT),
    "gm_m": ("GM fluid", "m", GMT),
    "draft_aft_m": ("draft aft", "m", DRAUGHT),
    "draft_mid_m": ("draft midships", "m", DRAUGHT),
    "draft_fwd_m": ("draft forward", "m", DRAUGHT),
    "trim_m": ("trim (+ by stern)", "m", None),
    "list_deg": ("list (+ starboard)", "°", EQUILIBRIUM_ANGLE),
    "max_gz_m": ("maximum GZ", "m", GZ),
    "area_0_30_mrad": ("area 0–30°", "m·rad", AREA),
    "area_0_40_mrad": ("area 0–40° (or θf)", "m·rad", AREA),
    "area_30_40_mrad": ("area 30–40° (or θf)", "m·rad", AREA),
    "downflooding_angle_deg": ("downflooding angle", "°", Tolerance(None, 2.0, "downflooding angle")),
    # The weather criterion (IS 2008 Part A 2.3), as booklets print it per condition.  lw1 is a
    # heeling lever measured against GZ, so the GZ row; θ0 is the equilibrium under the steady wind;
    # θ1 (the roll to windward) and θ2 (the end of area b) are angles of heel that have no row of
    # their own: the nearest row, equilibrium angles 1°; a and b are areas under the GZ curve.
    "lw1_m": ("weather lw1", "m", GZ),
    "theta0_deg": ("weather θ0 (wind heel)", "°", EQUILIBRIUM_ANGLE),
    "theta1_deg": ("weather θ1 (roll)", "°", Tolerance(None, 1.0, "equilibrium angles, nearest row")),
    "theta2_deg": ("weather θ2", "°", Tolerance(None, 1.0, "equilibrium angles, nearest row")),
    "area_a_mrad": ("weather area a", "m·rad", AREA),
    "area_b_mrad": ("weather area b", "m·rad", AREA),
    # Freeboard at midships, deck line to waterline: a distance from the waterline, as the row for
    # the distance to unprotected openings / the margin line from the WL.
    "freeboard_m": ("freeboard midships", "m", Tolerance(5.0, 0.05, "distance to openings from WL")),
}
"""The booklet results that can be compared, in the order printed."""

_FROM_RESULT = {
    "displacement_t": "displacement_t", "deadweight_t": "deadweight_t", "lcg_m": "lcg_m", "tcg_m": "tcg_m",
    "kg_m": "kg_m", "fsm_tm": "fsm_total_tm", "fsc_m": "fsc_m", "kg_fluid_m": "kg_fluid_m", "km_m": "km_m",
    "gm_solid_m": "gm_solid_m", "gm_m": "gm_fluid_m", "draft_aft_m": "draft_aft_m", "draft_mid_m": "draft_mean_m",
    "draft_fwd_m": "draft_fwd_m", "trim_m": "trim_m", "list_deg": "list_deg", "max_gz_m": "max_gz_m",
    "area_0_30_mrad": "area_0_30_mrad", "area_0_40_mrad": "area_0_40_mrad", "area_30_40_mrad": "area_30_40_mrad",
    "downflooding_angle_deg": "downflooding_angle_deg", "freeboard_m": "freeboard_m",
}

_FROM_WEATHER = {
    "lw1_m": "lw1_m", "theta0_deg": "theta0_deg", "theta1_deg": "theta1_deg", "theta2_deg": "theta2_deg",
    "area_a_mrad": "area_a_mrad", "area_b_mrad": "area_b_mrad",
}
"""Booklet keys read from the result's weather criterion (deckload.core.result.WeatherResult)."""

ROUNDOFF = 1e-9
"""Floating-point allowance on a comparison exactly at the tolerance."""


@frozen
class Row:
    """One line of the side-by-side table."""

    key: str
    """The expected key, e.g. 'gm_m', or 'gz_m@30' for GZ at 30°."""
    label: str
    unit: str
    booklet: float
    deckload: float | None
    """None when deckload cannot give the value (e.g. an angle beyond the KN table)."""
    allowed: float
    """Largest accepted |deckload − booklet| (same unit)."""
    tolerance: str
    """The tolerance rule in words, with its table row, e.g. '1 % / 0.05 m max (GMt)'."""
    passed: bool
    note: str = ""

    @property
    def difference(self) -> float | None:
        return None if self.deckload is None else self.deckload - self.booklet


_TO_FLOODING = ("area_0_40_mrad", "area_30_40_mrad")
"""Areas that stop at θf: no value while θf is unknown."""

_THETA_F_UNKNOWN = "θf unknown: the profile's downflooding angles do not reach this displacement"

_NO_VALUE = {
    "list_deg": "no list: GZ never becomes positive on the side she heels to (no position of equilibrium)",
    "downflooding_angle_deg": "deckload has no value here: the profile gives no downflooding angles",
}
"""Why a result holds no value for a booklet quantity (None in the result)."""


def compare(result: Result, expected: dict, breadth_m: float) -> tuple[Row, ...]:
    """Rows for every booklet value given in ``expected``.

    ``expected`` maps the keys of :data:`QUANTITIES` to the booklet's numbers, and may
    hold ``gz`` = a sequence of (heel_deg, gz_m) pairs.  GZ is read on the side the
    criteria were checked on (the side she lists to), as the booklet's curve is.
    """
    rows: list[Row] = []
    for key, (label, unit, tol) in QUANTITIES.items():
        if key not in expected:
            continue
        base = float(expected[key])
        if key in _TO_FLOODING:
            got = result.area_to_flooding_mrad(key)
        elif key in _FROM_WEATHER:
            got = None if result.weather is None else getattr(result.weather, _FROM_WEATHER[key])
        else:
            got = getattr(result, _FROM_RESULT[key])
        got = None if got is None else float(got)
        note = "" if got is not None else _no_value_note(key, result)
        if key == "trim_m":
            aft = float(expected.get("draft_aft_m", result.draft_aft_m))
            fwd = float(expected.get("draft_fwd_m", result.draft_fwd_m))
            allowed = trim_allowed(aft, fwd, breadth_m)
            words = TRIM_WORDS
        else:
            allowed = tol.allowed(base, breadth_m)
            words = f"{tol.text(unit)} ({tol.row})"
        rows.append(_row(key, label, unit, base, got, allowed, words, note))
    curve_heel = np.asarray(result.gz_heel_deg, dtype=float)
    curve = np.asarray(result.gz_port_m if result.criteria_side == "port" else result.gz_m, dtype=float)
    for heel, base in expected.get("gz", ()):
        heel, base = float(heel), float(base)
        if heel > result.gz_end_deg + ROUNDOFF or heel > curve_heel[-1] + ROUNDOFF:
            got, note = None, f"beyond the KN table's last angle {result.gz_end_deg:g}°"
        else:
            got, note = float(np.interp(heel, curve_heel, curve)), ""
        allowed = GZ.allowed(base, breadth_m)
        rows.append(_row(f"gz_m@{heel:g}", f"GZ at {heel:g}°", "m", base, got, allowed,
                         f"{GZ.text('m')} ({GZ.row})", note))
    return tuple(rows)


def _no_value_note(key: str, result: Result) -> str:
    """Why deckload has no value for ``key`` in this condition."""
    if result.downflooding_unknown and key in (*_TO_FLOODING, "downflooding_angle_deg"):
        return _THETA_F_UNKNOWN
    if key in _FROM_WEATHER:
        why = next((n.reason for n in result.not_assessed if "A 2.3" in n.item), "")
        return "the weather criterion was not worked here" + (f": {why}" if why else "")
    return _NO_VALUE.get(key, "deckload has no value here")


def _row(key, label, unit, base, got, allowed, words, note) -> Row:
    return Row(key, label, unit, base, got, allowed, words, within(got, base, allowed), note)


# --------------------------------------------------------------------------- the page against itself

@frozen
class Disagreement:
    """Booklet values of one condition that contradict each other as printed."""

    keys: tuple[str, ...]
    """The expected keys involved, the one computed first."""
    text: str
    """The relation with the values, e.g. 'gm_m 1.462 ≠ km_m − kg_fluid_m = 4.636 − 3.211 = 1.425'."""
    difference: float
    allowed: float
    """The rounding of the printed decimals, carried through the relation."""


# (result key, terms (coefficient, key)): result = Σ coefficient·term, each an identity of the
# booklet's own page: GM = KM − KG; KG fluid = KG + FSC; draft at midships = mean of the
# draughts at the perpendiculars (midships lies halfway); trim = aft − forward (deckload's
# definition, + by the stern).  Each holds for extreme as for moulded drafts (both sides move by
# the keel, or the keel cancels), so the values are taken as typed.
_LINEAR = (
    ("gm_m", ((1.0, "km_m"), (-1.0, "kg_fluid_m")), "KMt − KG fluid"),
    ("gm_solid_m", ((1.0, "km_m"), (-1.0, "kg_m")), "KMt − KG solid"),
    ("kg_fluid_m", ((1.0, "kg_m"), (1.0, "fsc_m")), "KG solid + FSC"),
    ("draft_mid_m", ((0.5, "draft_aft_m"), (0.5, "draft_fwd_m")), "(draft aft + draft forward)/2"),
    ("trim_m", ((1.0, "draft_aft_m"), (-1.0, "draft_fwd_m")), "draft aft − draft forward"),
)


def disagreements(typed: dict, half_unit: Callable[[float | int], float]) -> tuple[Disagreement, ...]:
    """The relations among a booklet condition's printed values that its own numbers break.

    ``typed`` maps expected keys to the values as typed from the page (before any conversion of
    datum or draft basis).  Checked where every value of a relation is given: GM fluid = KMt − KG
    fluid; GM solid = KMt − KG solid; KG fluid = KG solid + FSC, or KG solid + FSM/Δ when no FSC is
    given; FSC = FSM/Δ; draft midships = (aft + forward)/2; trim = aft − forward.  A relation is broken
    when its two sides differ by more than the rounding of the printed decimals carried through it
    (``half_unit`` of each value as typed — the reader's ``tomlcheck.printed_half_unit``: half a unit
    of its last printed decimal; for a sum Σ|c|·h, for FSM/Δ h_FSM/Δ + FSM·h_Δ/Δ², first order)
    plus :data:`ROUNDOFF`.  Such a page cannot be the booklet's as printed: one of its values was
    typed wrong, and no comparison with deckload can say which."""
    out: list[Disagreement] = []

    def f(x: float) -> str:
        return f"{x:.6g}"

    def add(keys, got, want, allowed, words):
        if abs(got - want) > allowed + ROUNDOFF * max(1.0, abs(got)):
            out.append(Disagreement(tuple(keys), words, got - want, allowed))

    for key, terms, name in _LINEAR:
        if key not in typed or not all(k in typed for _, k in terms):
            continue
        want = sum(c * float(typed[k]) for c, k in terms)
        allowed = half_unit(typed[key]) + sum(abs(c) * half_unit(typed[k]) for c, k in terms)
        values = " ".join(("" if i == 0 and c > 0 else "+ " if c > 0 else "− ") + f"{k} {f(float(typed[k]))}"
                          for i, (c, k) in enumerate(terms))
        if terms[0][0] == 0.5:
            values = f"({values})/2"
        add((key, *(k for _, k in terms)), float(typed[key]), want, allowed,
            f"{key} {f(float(typed[key]))}, but {name} = {values} = {f(want)}")
    if all(k in typed for k in ("fsm_tm", "displacement_t")) and float(typed["displacement_t"]) > 0:
        fsm, disp = float(typed["fsm_tm"]), float(typed["displacement_t"])
        h_q = half_unit(typed["fsm_tm"]) / disp + fsm * half_unit(typed["displacement_t"]) / disp ** 2
        q = fsm / disp
        if "fsc_m" in typed:
            add(("fsc_m", "fsm_tm", "displacement_t"), float(typed["fsc_m"]), q, half_unit(typed["fsc_m"]) + h_q,
                f"fsc_m {f(float(typed['fsc_m']))}, but FSM/Δ = fsm_tm {f(fsm)} / displacement_t {f(disp)} = {f(q)}")
        elif all(k in typed for k in ("kg_fluid_m", "kg_m")):
            kg = float(typed["kg_m"])
            add(("kg_fluid_m", "kg_m", "fsm_tm", "displacement_t"), float(typed["kg_fluid_m"]), kg + q,
                half_unit(typed["kg_fluid_m"]) + half_unit(typed["kg_m"]) + h_q,
                f"kg_fluid_m {f(float(typed['kg_fluid_m']))}, but KG solid + FSM/Δ = kg_m {f(kg)} + fsm_tm {f(fsm)} / "
                f"displacement_t {f(disp)} = {f(kg + q)}")
    return tuple(out)
