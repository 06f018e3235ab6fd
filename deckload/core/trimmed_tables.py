"""Hydrostatics and KN given at several trims: interpolation in trim and the trim they give.

Many booklets print hydrostatics and KN cross curves at several trims (−1.0, −0.5, 0,
+0.5, +1.0 m, say) beside the even-keel ones.  deckload reads them into
:class:`~deckload.core.model.TrimmedTables` (trim in metres, + by the stern = draft aft −
draft forward, as :mod:`deckload.core.trim` and the whole model use; the even-keel tables
are the tables at trim 0).

**Look-up.**  Each table is looked up at the density-corrected displacement on its own
displacement grid (the grids need not agree; nothing is extrapolated in displacement), and
the values are interpolated linearly in trim between the two tables that bracket it —
common practice for booklet data (MSC.1/Circ.1229 4.5: results from pre-programmed tables
are compared "except for rounding"; standards.md §5.2).

**Equilibrium trim.**  Trim decides which tables apply, and the tables decide the trim, so
it is found by iteration.  In ship axes the upward vertical of a ship trimmed tanψ = t/LBP
by the stern is (sinψ, cosψ) (x forward, z up), so G and B lie on one vertical when

    F(t) = LCB(t) + (KG_fluid − KB(t))·t/LBP − LCG = 0

(derived; LCB and KB of the trimmed tables are in ship axes; KG fluid as in
:mod:`deckload.core.trim`, the conservative choice).  Each step is the trim formula from the
current estimate, t ← t + Δ·F(t)/(100·MCT), MCT from KM_L − KG fluid where the tables give
KM_L, else the tabulated MCTC: Newton's step, since dF/dt = −GM_L/LBP = −100·MCT/(Δ·LBP)
(standards.md §6.3).  It starts at even keel and stops when two estimates agree within
:data:`TRIM_TOLERANCE_M`; after :data:`MAX_STEPS` steps it refuses
(:class:`TrimNotSettledError`): tables whose LCB does not move aft as the trim by the stern
grows have no single equilibrium to find.  With only the even-keel table the first step is
exactly the even-keel trim formula, so the single-table result is unchanged.

Outside the trims the tables cover, the nearest end table is used and the trim is carried on
from it by the same linear step (the even-keel method, started from the end table); the
mean draft follows the trimming about the LCF.  KN are those of the vessel floating at the
equilibrium trim when upright (the usual booklet convention for KN at trims; free-trim KN
made for one LCG are the other case, :func:`deckload.core.trim.kn_reference_note`).

**Outside the covered trims** (:func:`coverage`): always a caution.  Refusal where the error
would exceed tolerance: the end table's values are held beyond the end, so their error
grows as (trim beyond the end) × (their rate of change with trim over the last tabulated
interval).  The mean draft and KMt (UR L5: 1 % / 5 cm, standards.md §5.3) at the displacement
are estimated so; KN, whose change with trim grows with trim (deck edge and bilge), by
:func:`held_error_bound`, that rate plus its change over the last three tables (with two
tables, a change as large as the rate itself), at every
tabulated heel against 5 cm, and against GZ's 5 % / 5 cm (GZ = KN − KG fluid·sinφ) at every
heel to :data:`GZ_JUDGED_TO_DEG`; when any estimate exceeds its tolerance, or the trim
lies beyond the end by more than the last interval's width (beyond that the rate itself is
a guess), or the neighbour table does not reach the displacement (no rate is known), the
condition is refused (:class:`TrimBeyondTablesError`).  A set with the
even-keel table alone has no rate to judge by and keeps the even-keel caution of
:func:`deckload.core.trim.even_keel_note`.
"""

from __future__ import annotations

import math

import numpy as np

from deckload.core.booklet import GZ
from deckload.core.frozen import frozen
from deckload.core.gz import heel_curve, kn_row
from deckload.core.hydrostatics import Upright
from deckload.core.model import CrossCurves, HydrostaticTable, TrimmedTables, Vessel
from deckload.core.tables import OutOfRangeError, bracket, lerp_row
from deckload.core.trim import BASIS_GML, BASIS_TABLE, EVEN_KEEL_TRIM_FRACTION, TrimError, TrimMoment

TRIM_TOLERANCE_M = 1e-4
"""Two successive trim estimates within 0.1 mm: settled.  Far below UR L5's 5 cm on a draft
(standards.md §5.3), and far above round-off; Newton's steps reach it in 2–4 steps."""

MAX_STEPS = 30
"""Steps allowed before the iteration is refused (Newton's method on a smooth table needs a few)."""

KN_TOLERANCE_M = 0.05
"""UR L5 / MSC.1/Circ.1229 tolerance on cross curves (KN): 5 cm (standards.md §5.3)."""


def draft_tolerance_m(value_m: float) -> float:
    """UR L5 / MSC.1/Circ.1229 tolerance on draughts and KMt: 1 %, not more than 5 cm (standards.md §5.3)."""
    return min(0.01 * abs(value_m), 0.05)


class TrimNotSettledError(OutOfRangeError):
    """The iteration between trim and trimmed tables did not settle: the condition is not assessed."""

    def __init__(self, last_m: float, before_m: float):
        super().__init__("trim (trimmed tables)", last_m, last_m, last_m, "m")
        self.args = (f"the trim did not settle within {MAX_STEPS} steps of the trimmed tables (last estimates "
                     f"{before_m:+.4f} and {last_m:+.4f} m, tolerance {TRIM_TOLERANCE_M * 1000:g} mm): the tables' LCB "
                     "does not move aft as the trim by the stern grows, or their MCTC (or KML) is far too small; check "
                     "[[hydrostatics_at_trim]] (LCB, KML, MCTC) against the booklet",)


class TrimBeyondTablesError(OutOfRangeError):
    """The trim lies so far outside the trimmed tables that their error would exceed tolerance."""


@frozen
class TrimmedRow:
    """The trimmed hydrostatic tables at one displacement (table density) and trim."""

    draft_mid_m: float
    """Mean draft at midships (m), table's convention."""
    lcb_m: float
    lcf_m: float
    kmt_m: float
    tpc_t_cm: float
    mctc_tm_cm: float
    vcb_m: float
    kml_m: float | None


@frozen
class TrimmedEquilibrium:
    """What the trimmed tables give for one condition."""

    trim_m: float
    """Equilibrium trim (m, + by the stern)."""
    upright: Upright
    """Hydrostatics at that trim, density-corrected; ``draft_m`` is the draft at the LCF."""
    moment: TrimMoment
    """MCT at that trim (from KM_L − KG fluid where given)."""
    draft_mid_m: float
    """Mean draft at midships (m)."""
    steps: int
    """Iteration steps taken."""


def _clamp(x: float, xs: np.ndarray) -> float:
    return min(max(x, float(xs[0])), float(xs[-1]))


def _trim_bracket(trims: np.ndarray, trim: float) -> tuple[int, float]:
    """(j, f): the look-up blends tables j and j + 1 with weight f; f = 0 reads table j alone.

    At or beyond the last table that table alone is read, (last, 0), as at or beyond the first:
    its neighbour, weighted 0, must not refuse the look-up (a shorter displacement grid) nor
    turn a column it lacks (KML) into a gap in the end table's row."""
    if len(trims) == 1:
        return 0, 0.0
    j, f = bracket(trims, _clamp(trim, trims), "trim (trimmed tables)", "m")
    return (j + 1, 0.0) if f == 1.0 else (j, f)


def _at(col: np.ndarray, h: HydrostaticTable, d_eq: float, trim: float) -> float:
    i, f = bracket(h.displacement_t, d_eq, f"displacement (hydrostatic table at trim {trim:+.2f} m, at table density)", "t")
    return float(lerp_row(col, i, f))


def _table_row(vessel: Vessel, h: HydrostaticTable, trim: float, d_eq: float) -> np.ndarray:
    """(draft, lcb, lcf, kmt, tpc, mctc, vcb, kml or nan) of one table at a displacement."""
    even = vessel.hydrostatics
    # KB of a trimmed table that does not give it: the even-keel KB at the same displacement.  The
    # change of KB with trim is second order (a box: t²/(24·T), checks in trimmed_tables tests), and it
    # enters F(t) multiplied by t/LBP: below a millimetre of LCG for any trim a booklet tabulates.
    vcb = h.vcb_m if h.vcb_m is not None else even.vcb_m
    return np.array([
        _at(h.draft_m, h, d_eq, trim), _at(h.lcb_m, h, d_eq, trim), _at(h.lcf_m, h, d_eq, trim),
        _at(h.kmt_m, h, d_eq, trim), _at(h.tpc_t_cm, h, d_eq, trim), _at(h.mctc_tm_cm, h, d_eq, trim),
        _at(vcb, h if h.vcb_m is not None else even, d_eq, trim),
        _at(h.kml_m, h, d_eq, trim) if h.kml_m is not None else math.nan,
    ])


def hydro_at(vessel: Vessel, tt: TrimmedTables, d_eq: float, trim: float) -> TrimmedRow:
    """The hydrostatic tables at a table-equivalent displacement, linearly interpolated in trim
    (held at the end table beyond the covered trims)."""
    j, f = _trim_bracket(tt.hydro_trim_m, trim)
    ts = tt.hydro_trim_m
    a = _table_row(vessel, tt.hydrostatics[j], float(ts[j]), d_eq)
    row = a if len(ts) == 1 or f == 0.0 else (
        a * (1.0 - f) + _table_row(vessel, tt.hydrostatics[j + 1], float(ts[j + 1]), d_eq) * f)
    kml = None if math.isnan(row[7]) else float(row[7])
    return TrimmedRow(*(float(x) for x in row[:7]), kml_m=kml)


def kn_row_at(tt: TrimmedTables, d_eq: float, trim: float) -> np.ndarray:
    """KN (m) at the tabulated heels for a displacement (table density) and trim, linear in trim."""
    j, f = _trim_bracket(tt.kn_trim_m, trim)

    def one(k: int) -> np.ndarray:
        try:
            return kn_row(tt.cross_curves[k], d_eq)
        except OutOfRangeError as e:
            raise OutOfRangeError(f"displacement (KN cross curves at trim {float(tt.kn_trim_m[k]):+.2f} m, "
                                  "at table density)", e.value, e.low, e.high, e.unit) from None

    row = one(j)
    if len(tt.kn_trim_m) > 1 and f > 0.0:
        row = row * (1.0 - f) + one(j + 1) * f
    return row


def _moment(vessel: Vessel, row: TrimmedRow, disp: float, ratio: float, kg_fluid: float) -> TrimMoment:
    if row.kml_m is None:
        return TrimMoment(row.mctc_tm_cm * ratio, BASIS_TABLE, None, None)
    gml = row.kml_m - kg_fluid
    if not gml > 0.0:
        raise TrimError(f"KG fluid {kg_fluid:.6g} m is not below KML {row.kml_m:.3f} m: "
                        "no longitudinal stability, no trim can be computed")
    return TrimMoment(disp * gml / (100.0 * vessel.particulars.lbp_m), BASIS_GML, row.kml_m, gml)


def equilibrium(vessel: Vessel, displacement_t: float, water_density_t_m3: float, lcg_m: float,
                kg_fluid_m: float) -> TrimmedEquilibrium:
    """The equilibrium trim from the trimmed tables and the hydrostatics there (module docstring)."""
    tt = vessel.trimmed
    lbp = vessel.particulars.lbp_m
    ratio = water_density_t_m3 / vessel.particulars.table_density_t_m3
    d_eq = displacement_t / ratio
    lo, hi = float(tt.hydro_trim_m[0]), float(tt.hydro_trim_m[-1])
    trim, before = 0.0, math.nan
    for step in range(1, MAX_STEPS + 1):
        at = min(max(trim, lo), hi)
        row = hydro_at(vessel, tt, d_eq, at)
        mct = _moment(vessel, row, displacement_t, ratio, kg_fluid_m)
        f = row.lcb_m + (kg_fluid_m - row.vcb_m) * at / lbp - lcg_m
        new = at + displacement_t * f / (100.0 * mct.mctc_tm_cm)
        if not math.isfinite(new):
            raise TrimNotSettledError(new, trim)
        if abs(new - trim) <= TRIM_TOLERANCE_M:
            trim = new
            break
        before, trim = trim, new
    else:
        raise TrimNotSettledError(trim, before)
    at = min(max(trim, lo), hi)
    row = hydro_at(vessel, tt, d_eq, at)
    mct = _moment(vessel, row, displacement_t, ratio, kg_fluid_m)
    # beyond the end table she trims about its LCF at constant displacement: dT_mid/dt = (LCF − L/2)/L
    mid = row.draft_mid_m + (trim - at) * (row.lcf_m - lbp / 2.0) / lbp
    at_lcf = mid - trim * (row.lcf_m - lbp / 2.0) / lbp
    up = Upright(table_displacement_t=d_eq, draft_m=at_lcf, lcb_m=row.lcb_m, lcf_m=row.lcf_m, kmt_m=row.kmt_m,
                 tpc_t_cm=row.tpc_t_cm * ratio, mctc_tm_cm=row.mctc_tm_cm * ratio)
    return TrimmedEquilibrium(trim, up, mct, mid, step)


def _beyond(trims: np.ndarray, trim: float) -> tuple[int, int, float] | None:
    """(end index, neighbour index, metres beyond the end) when ``trim`` is outside ``trims``."""
    lo, hi = float(trims[0]), float(trims[-1])
    tol = 1e-9 * max(1.0, abs(lo), abs(hi))
    if trim < lo - tol:
        return 0, 1, lo - trim
    if trim > hi + tol:
        n = len(trims) - 1
        return n, n - 1, trim - hi
    return None


def _range_words(trims: np.ndarray) -> str:
    return f"{float(trims[0]):+.2f} to {float(trims[-1]):+.2f} m"


def coverage(vessel: Vessel, trim: float, d_eq: float, kg_fluid_m: float | None = None) -> str | None:
    """A caution when the trim lies outside the trims the tables cover, else None; raises
    :class:`TrimBeyondTablesError` where the error would exceed tolerance (module docstring).
    Given ``kg_fluid_m`` the KN estimate is also held to the GZ tolerance (:func:`_worst_error`)."""
    tt = vessel.trimmed
    lbp = vessel.particulars.lbp_m
    way = "by the stern" if trim > 0 else "by the head"
    out = []
    for what, trims in (("hydrostatics", tt.hydro_trim_m), ("KN", tt.kn_trim_m)):
        b = _beyond(trims, trim)
        if b is None:
            continue
        if len(trims) == 1:
            # even-keel table only for this set: the even-keel rule (caution beyond 1 % LBP)
            if abs(trim) > EVEN_KEEL_TRIM_FRACTION * lbp:
                out.append(f"{what} are for even keel only")
            continue
        end, nb, e = b
        t_end, t_nb = float(trims[end]), float(trims[nb])
        width = abs(t_end - t_nb)
        worst = _worst_error(vessel, tt, what, end, nb, d_eq, e, kg_fluid_m)
        if e > width or worst is not None:
            reason = (f"{e:.2f} m beyond them, more than their last interval ({width:.2f} m), where the error "
                      "cannot be bounded" if e > width
                      else f"{worst}, beyond UR L5's tolerance (standards.md §5.3)")
            err = TrimBeyondTablesError(f"trim ({what} tables)", trim, float(trims[0]), float(trims[-1]), "m")
            err.args = (f"trim {abs(trim):.2f} m {way} is outside the {what} tables' trims ({_range_words(trims)}): "
                        f"{reason}; this condition cannot be assessed from these tables",)
            raise err
        out.append(f"{what} tables cover {_range_words(trims)}; the {t_end:+.2f} m table is used")
    if not out:
        return None
    return f"trim {abs(trim):.2f} m {way} is outside the trims tabulated: " + "; ".join(out) + "; drafts and KN less certain"


GZ_JUDGED_TO_DEG = 50.0
"""The largest heel an IS 2008 criterion reads off the GZ curve: area b of the weather criterion runs to
θ2 ≤ 50° (Part A 2.3); the areas and GZ of Part A 2.2 stop at 40°.  Beyond the tables' trims the GZ
tolerance is checked at every tabulated heel above 0° up to here (KN's 5 cm at every heel)."""


def gz_tolerance_m(gz_m: float) -> float:
    """UR L5 / MSC.1/Circ.1229 tolerance on a GZ value: 5 %, not more than 5 cm (standards.md §5.3),
    the booklet comparison's row (:data:`deckload.core.booklet.GZ`)."""
    return GZ.allowed(gz_m, 0.0)


def held_error_bound(end: np.ndarray, nb: np.ndarray, nb2: np.ndarray | None, w: float, w2: float,
                     e: float) -> np.ndarray:
    """Conservative estimate of the error of a value held at the end table, ``e`` metres of trim beyond it.

    ``end``, ``nb`` and ``nb2`` are the value in the end table and in the next two inward (``nb2``
    None when the set has only two tables), ``w`` and ``w2`` the widths of the last and the one
    before it.  Derived (Taylor's theorem with the end table's slope): with f″ bounded by M
    between the tables and the point,

        |f(t_end + e) − f(t_end)| ≤ e·|f′(t_end)| + M·e²/2,   |f′(t_end)| ≤ |r| + M·w/2,

    r = (end − nb)/w the last interval's rate (the slope at the end of an interval differs from its
    secant by at most M·w/2).  Hence the bound e·|r| + M·e·(w + e)/2, M taken as the second
    divided difference of the last three tables, |r − r₂|/((w + w₂)/2), r₂ = (nb − nb2)/w₂.  It is
    exact for a quantity quadratic in trim (the box's KB and KMt, tests/trimmed_box.py) and, with
    absolute values, never lets a change of rate cancel the rate.  The last interval's rate alone
    (the former estimate) misses the growth of KN's change with trim: on a box at
    2.47 m beyond tables to 2 m it estimated 4.0 cm at 30° where the exact error is 5.3 cm.  With
    two tables only no change of rate is known, and M is taken as 2·|r|/w: the quantity quadratic in
    trim with no slope at the inner table (f = f_nb + c·(t − t_nb)², whose secant over the interval
    is c·w and whose slope at its end is twice that), so the bound is e·|r|·(2 + e/w).  A box's KN
    is close to that about even keel (its rate over +1…+2 m is 1.95 times that over +0.5…+1 m, where
    c·t² gives 2): with tables at 0 and +1 m and a trim of 1.47 m, c·t² errs by c·(1.47² − 1) =
    1.16·c, the bound gives 0.47·c·2.47 = 1.16·c, the rate alone 0.47·c.
    """
    r = (end - nb) / w
    est = np.abs(r) * e
    m = np.abs(r - (nb - nb2) / w2) / ((w + w2) / 2.0) if nb2 is not None else 2.0 * np.abs(r) / w
    return est + m * e * (w + e) / 2.0


def _worst_error(vessel: Vessel, tt: TrimmedTables, what: str, end: int, nb: int, d_eq: float,
                 e: float, kg_fluid_m: float | None = None) -> str | None:
    """The first quantity whose estimated error beyond the end exceeds its tolerance, in words, or None.

    Mean draft and KMt: (end value − neighbour value)·e/w, the change over the last interval (width
    w) carried on at its rate, against 1 %/5 cm.  KN: :func:`held_error_bound` (the rate and its
    change over the last three tables) at every tabulated heel, against 5 cm; and, given KG fluid,
    against the GZ tolerance 5 %/5 cm of GZ = KN − KG fluid·sinφ (end table) at every heel above 0°
    up to :data:`GZ_JUDGED_TO_DEG`: the error of KN is the error of GZ.
    """
    try:
        if what == "KN":
            trims = tt.kn_trim_m
            step = nb - end
            nb2 = nb + step if 0 <= nb + step < len(trims) else None
            w = abs(float(trims[end]) - float(trims[nb]))
            a, b = kn_row(tt.cross_curves[end], d_eq), kn_row(tt.cross_curves[nb], d_eq)
            c = kn_row(tt.cross_curves[nb2], d_eq) if nb2 is not None else None
            w2 = abs(float(trims[nb]) - float(trims[nb2])) if nb2 is not None else 0.0  # (unread without nb2)
            est = held_error_bound(a, b, c, w, w2, e)
            heels = np.asarray(tt.cross_curves[end].heel_deg, dtype=float)
            k = int(np.argmax(est))
            if est[k] > KN_TOLERANCE_M:
                return f"KN at {heels[k]:g}° would be off by about {est[k] * 100:.1f} cm (tolerance 5 cm)"
            if kg_fluid_m is None:
                return None
            gz = a - kg_fluid_m * np.sin(np.radians(heels))
            tol = np.array([gz_tolerance_m(g) for g in gz])
            judged = (heels > 0.0) & (heels <= GZ_JUDGED_TO_DEG + 1e-9)
            over = judged & (est > tol)
            if not over.any():
                return None
            k = int(np.argmax(np.where(over, est - tol, -np.inf)))
            return (f"GZ at {heels[k]:g}° would be off by about {est[k] * 100:.1f} cm (tolerance {tol[k] * 100:.1f} cm, "
                    f"5 % of GZ {gz[k]:.3f} m)")
        ta, tb = float(tt.hydro_trim_m[end]), float(tt.hydro_trim_m[nb])
        a = _table_row(vessel, tt.hydrostatics[end], ta, d_eq)
        b = _table_row(vessel, tt.hydrostatics[nb], tb, d_eq)
    except OutOfRangeError as err:
        return f"the error cannot be estimated ({err})"
    fraction = e / abs(ta - tb)
    for idx, name in ((0, "mean draft"), (3, "KMt")):
        est = abs(a[idx] - b[idx]) * fraction
        tol = draft_tolerance_m(a[idx])
        if est > tol:
            return f"{name} would be off by about {est * 100:.1f} cm (tolerance {tol * 100:.1f} cm)"
    return None


def covers_kn(vessel: Vessel, trim: float) -> bool:
    """True when trimmed KN tables (more than the even-keel one) cover ``trim``: G's LCG then
    agrees with the KN's trim by construction, and the free-trim reference-LCG caution does not apply."""
    tt = vessel.trimmed
    return tt is not None and len(tt.kn_trim_m) > 1 and _beyond(tt.kn_trim_m, trim) is None


@frozen
class TableState:
    """Hydrostatics and trim of a condition, from whichever tables the profile has."""

    upright: Upright
    """Hydrostatics at the displacement (and trim, with trimmed tables); ``draft_m`` at the LCF."""
    moment: TrimMoment
    trim_m: float
    trim_note: str | None
    """The caution on the trim against the tables' trims, or None."""
    trimmed: bool
    """True when trimmed tables were used (the trim then does not depend on MCT: no MCTC caution)."""


def table_state(vessel: Vessel, displacement_t: float, water_density_t_m3: float, lcg_m: float,
                kg_fluid_m: float) -> TableState:
    """The hydrostatics and trim step of :func:`deckload.core.stability.stage_upright`.

    Even-keel tables only: the even-keel method unchanged (:mod:`deckload.core.hydrostatics`,
    :mod:`deckload.core.trim`).  With trimmed tables: the iteration of :func:`equilibrium` and
    :func:`coverage`.
    """
    from deckload.core.hydrostatics import trim_m, upright
    from deckload.core.trim import even_keel_note, trim_moment

    if vessel.trimmed is None:
        hy = upright(vessel, displacement_t, water_density_t_m3)
        mct = trim_moment(vessel, hy, displacement_t, kg_fluid_m)
        trim = trim_m(displacement_t, lcg_m, hy.lcb_m, mct.mctc_tm_cm)
        return TableState(hy, mct, trim, even_keel_note(trim, vessel.particulars.lbp_m), False)
    eq = equilibrium(vessel, displacement_t, water_density_t_m3, lcg_m, kg_fluid_m)
    return TableState(eq.upright, eq.moment, eq.trim_m, coverage(vessel, eq.trim_m, eq.upright.table_displacement_t,
                                                                       kg_fluid_m), True)


def kn_row_for(vessel: Vessel, table_displacement_t: float, trim_m: float) -> tuple[CrossCurves, np.ndarray]:
    """(the KN table whose heels the row is at, KN at them) at a displacement (table density): the
    even-keel row, or the rows of the tables at trims interpolated at ``trim_m``.  :func:`kn_for`
    splines it in heel; :func:`deckload.core.gz.pchip_curve` gives the second opinion of the same row."""
    if vessel.trimmed is None:
        return vessel.cross_curves, kn_row(vessel.cross_curves, table_displacement_t)
    return vessel.trimmed.cross_curves[0], kn_row_at(vessel.trimmed, table_displacement_t, trim_m)


def kn_for(vessel: Vessel, table_displacement_t: float, trim_m: float) -> np.ndarray:
    """KN on the fine heel grid at a displacement (table density): the even-keel curves, or the
    tables at trims interpolated at ``trim_m`` (the equilibrium trim upright)."""
    return heel_curve(*kn_row_for(vessel, table_displacement_t, trim_m))


@frozen
class TablesBasis:
    """Which tables a result was taken from, for the views (calc, report, screen)."""

    trimmed: bool
    """True when the profile has tables at trims (they were used for this result)."""
    trim_m: float
    """The trim they were looked up at (m, + by the stern): the equilibrium trim."""
    hydro_trims_m: tuple[float, ...]
    """The hydrostatic tables used: two (interpolated between), one (at, or held at, that table)."""
    kn_trims_m: tuple[float, ...]
    outside: bool
    """True when the trim lies outside the trims of either set (the end table was held)."""
    words: str
    """One sentence (calc, report)."""
    short: str
    """A few words for the screen."""

    def as_dict(self) -> dict:
        return {"tables": "at trims" if self.trimmed else "even keel", "trim_m": self.trim_m,
                "hydrostatics_trims_m": list(self.hydro_trims_m), "kn_trims_m": list(self.kn_trims_m),
                "outside_tabulated_trims": self.outside, "text": self.words}


def _used(trims: np.ndarray, trim: float) -> tuple[tuple[float, ...], bool]:
    """The tables of one set a look-up at ``trim`` uses, and whether the trim is outside them."""
    if len(trims) == 1:
        return (float(trims[0]),), False
    b = _beyond(trims, trim)
    if b is not None:
        return (float(trims[b[0]]),), True
    j, f = _trim_bracket(trims, trim)
    if f <= 1e-12:
        return (float(trims[j]),), False
    if f >= 1.0 - 1e-12:
        return (float(trims[j + 1]),), False
    return (float(trims[j]), float(trims[j + 1])), False


def _t(x: float) -> str:
    return "0.00" if abs(x) < 0.005 else f"{x:+.2f}"


def _phrase(used: tuple[float, ...], outside: bool, only_even: bool) -> str:
    if only_even:
        return "from the even-keel table alone"
    if len(used) == 2:
        return f"interpolated between the tables at {_t(used[0])} and {_t(used[1])} m"
    if outside:
        return f"from the end table at {_t(used[0])} m (the trim is outside the trims tabulated)"
    return f"from the table at {_t(used[0])} m"


def _span(used: tuple[float, ...], outside: bool, only_even: bool) -> str:
    if only_even:
        return "even keel"
    return "…".join(_t(u) for u in used) + " m" + (" (end)" if outside else "")


def tables_basis(vessel: Vessel, trim_m: float) -> TablesBasis:
    """Which hydrostatic and KN tables a condition at equilibrium trim ``trim_m`` was taken from
    (the look-ups of :func:`hydro_at` and :func:`kn_row_at`, in words)."""
    tt = vessel.trimmed
    if tt is None:
        return TablesBasis(False, trim_m, (0.0,), (0.0,), False,
                           "even-keel hydrostatics and KN (the profile has no tables at trims)", "even keel only")
    way = ("even keel" if abs(trim_m) < 0.005
           else f"trim {abs(trim_m):.2f} m {'by the stern' if trim_m > 0 else 'by the head'}")
    h, h_out = _used(tt.hydro_trim_m, trim_m)
    k, k_out = _used(tt.kn_trim_m, trim_m)
    h_even, k_even = len(tt.hydro_trim_m) == 1, len(tt.kn_trim_m) == 1
    hp, kp = _phrase(h, h_out, h_even), _phrase(k, k_out, k_even)
    if hp == kp:
        words = f"hydrostatics and KN at {way}, {hp}"
    else:
        words = f"at {way}: hydrostatics {hp}; KN {kp}"
    hs, ks = _span(h, h_out, h_even), _span(k, k_out, k_even)
    short = f"at {_t(trim_m)} m: " + (hs if hs == ks else f"hyd {hs}, KN {ks}")
    return TablesBasis(True, trim_m, h, k, h_out or k_out, words, short)
