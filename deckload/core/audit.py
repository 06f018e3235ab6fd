"""Plausibility audit of a validated vessel profile: typing and datum errors the schema cannot see.

The schema (``deckload.io.profiles``) checks that every number is a number, every table
increases and every array has its rows.  It cannot see a lightship LCG typed from
midships, a KN of 19.07 typed for 1.907 or a pair of tanks both to starboard: each is a
valid number.  This module looks at the *validated* model and asks whether the numbers
agree with the vessel's own size and with each other.

Two severities:

* ``error`` — a contradiction: the numbers cannot all be right (a centre of gravity
  outside the hull, a metacentre higher than the waterplane allows, KN beyond the
  buoyant envelope).  ``deckload check`` fails and the loading screen refuses the profile.
* ``warning`` — a doubt: unusual for a ship but possible.  Shown, never blocking.

Every finding names where it is (the dotted key as in schema problems, and the path
into the profile for the line finder), the value, why it is suspicious and which
booklet table to compare with.  Every tolerance is written beside its check with the
reason for it.  Marks as in standards.md: "common practice" = a fact of the trade
without a citable source; bounds marked "derived" are proved in the docstring beside them.

Pure: numpy and the standard library only (tests/test_core_purity.py).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from deckload.core import gz as gzmod
from deckload.core.bounds import WATER_DENSITY_RANGE_T_M3, kind_density_note
from deckload.core.criteria import SET_TITLES, SETS_BY_TYPE, evaluate_criteria, reduced_fishing_gm_m
from deckload.core.free_surface import settings_departures
from deckload.core.frozen import frozen
from deckload.core.model import Tank, Vessel
from deckload.core.stability import curve_limit, curve_measures

ERROR = "error"
WARNING = "warning"


@frozen
class Finding:
    """One suspicious number (or pair of numbers) in a profile."""

    severity: str
    """:data:`ERROR` (a contradiction) or :data:`WARNING` (a doubt)."""
    key: str
    """Dotted key as in schema problems, e.g. 'tank[FP].calibration.lcg_m'."""
    path: tuple
    """Where the value sits in the profile's TOML document, for the line finder:
    ``("tank", 3, "calibration", "lcg_m", 5)`` = sixth value of the fourth [[tank]]'s column."""
    value: str
    """The offending value in words, in deckload's conventions (x from AP, + forward)."""
    why: str
    """Why it is suspicious, with the bound it breaks."""
    look: str
    """Which booklet page or table to compare with."""
    check: str
    """Short id of the check, e.g. 'position-x', 'pair-tcg-sign'."""

    def text(self) -> str:
        return f"{self.key} = {self.value}: {self.why}; compare with {self.look}"


# --------------------------------------------------------------------------- tolerances

from deckload.core.bounds import AFT_OVERHANG as ENVELOPE_X_FRACTION  # noqa: E402  one number for both

ENVELOPE_X_FRACTION: float
"""Error beyond this fraction of LBP aft of the AP or forward of the FP.  Overall length
rarely exceeds 1.2 × LBP, so nothing aboard lies further out (common practice)."""

DOUBT_X_FRACTION = 0.1
"""Warning beyond 0.1 × LBP outside the perpendiculars: only an aft peak or a bow
compartment reaches there, and rarely that far (common practice)."""

LIGHTSHIP_X_RANGE = (0.2, 0.8)
"""Error: a lightship LCG outside 0.2–0.8 × LBP from the AP.  She floats with her centre of
buoyancy on the vertical through G, and no hull's centre of buoyancy lies in the end fifths of
its length (common practice; LCB is within ±10 % L of midships on ordinary hulls)."""

LCB_ERROR_RANGE = (0.2, 0.8)
"""Error: LCB or LCF outside 0.2–0.8 × LBP from the AP (as for the lightship; a wholly negative
column is a midships datum entered as if from the AP)."""

LCB_DOUBT_RANGE = (0.3, 0.7)
"""Warning: LCB or LCF outside 0.3–0.7 × LBP (beyond ±20 % L of midships: common practice)."""

VCG_LIMITS_D = {"lightship": (1.5, 2.5), "compartment": (1.5, 3.0), "deck": (2.5, 4.0)}
"""(warning, error) heights above the keel in moulded depths.  Lightship KG is about 0.6–1.3 D on
ordinary ships; tanks and holds lie in the hull or a casing just above it; deck areas reach the
upper tiers at most (common practice)."""

LIGHTSHIP_LOW_VCG_D = 0.3
"""Warning: a lightship KG below 0.3 D (ballast-keeled hulls only; common practice)."""

LIGHTSHIP_TRIM_FRACTION = 0.05
"""Warning: the lightship, by the profile's own hydrostatics, trims more than 5 % of LBP
(trims of 1–3 % L occur on trawlers and tugs; more suggests a datum slip; common practice)."""

LIGHTSHIP_SHARE = (0.10, 1.0)
"""Warning: a lightship below 10 % of her displacement at the summer mark (or, without one, at the
design draft), or at or above it.  Lightships run from about an eighth of the summer displacement
(a large tanker) to three quarters or more (tugs, fishing vessels, from memory); below a tenth a
decimal point has slipped (265 t typed 26.5 t put a coaster's GM 1.6 m too high, found by an
audit); at or above it she could carry nothing."""

PAIR_TCG_ABS_M = 0.05
PAIR_TCG_REL = 0.10
"""Warning: a pair's full-tank TCGs fail to mirror by more than max(0.05 m, 10 % of the larger).
Mirror-image tanks agree within rounding (UR L5 allows 0.05 m on a TCG); a larger difference is
either an asymmetric pair (possible) or a typing error (standards.md §5.3 for the 0.05 m)."""

PAIR_LCG_LBP = 0.02
"""Warning: a pair's full-tank LCGs more than 2 % of LBP apart.  Port and starboard tanks of a pair
span the same frames, so their centres agree within rounding and a little asymmetry of the hull;
one LCG typed with the wrong sign of a midships datum lands it elsewhere along the ship (a 0.3 m
draft error on a 30 m coaster, found by an audit) (common practice)."""

PAIR_CENTRELINE_FRACTION_B = 0.01
"""A pair's TCGs 'have the same sign' only when both are further than 1 % of B from the centreline:
nearer, either could be a centreline rounding (common practice)."""

PAIR_CAPACITY_REL = 0.10
"""Warning: a pair's capacities differ by more than 10 %.  UR L5 allows 2 % on a volume, so two
mirror tanks differ by at most ~4 % through rounding of either; 10 % is beyond it (standards.md §5.3)."""

TPC_INTERVAL = (0.05, 0.15)
"""(warning, error) mismatch between a displacement step and ∫100·TPC dT over that step, as a
fraction of the integral.  The trapezoidal rule errs by h³·f''/12: under 2 % for smooth hulls at
the usual 0.1–0.2 m row spacing, a few % across a chine; a digit slip gives tens of % (derived)."""

TPC_INTERVAL_FLOOR = (0.005, 0.01)
"""...and only when the mismatch also exceeds 0.5 % / 1 % of the displacement, so the rounding of
small steps near the keel (values printed to 0.1 t) cannot trigger it."""

METACENTRE_ALLOWANCE = 0.03
"""3 % allowance on the rigorous BMt bounds below: KMt is tolerated to 1 % (UR L5, standards.md §5.3)
and TPC, Δ and KMt are each printed to 3–4 figures."""

WATERLINE_LENGTH_MAX = 1.2
"""The waterline is at most 1.2 × LBP long (as ENVELOPE_X_FRACTION)."""

MCTC_KML_RANGE = ((0.8, 1.03), (0.5, 1.1))
"""(warning, error) range of MCTC·100·LBP/(Δ·BML).  MCTC = Δ·GML/(100·LBP) (standards.md §6) and
GML = BML − BG; BG is at most a depth, a few % of BML on ordinary ships, so the ratio is 0.8–1.0;
above 1 only by rounding (3 %).  Outside 0.5–1.1 a factor of 2 or 10 has slipped (derived)."""

MCTC_SHAPE_DOUBT = (0.4, 1.3)
"""Warning when c = 12·MCTC/(TPC·LBP) = I_L/(A_wp·LBP²/12) lies outside 0.4–1.3: a diamond-shaped
waterplane gives 0.5, a parabolic one 0.6, a rectangle of length LBP 1.0 (derived in _check_mctc)."""

CB_RANGE = ((0.3, 1.0), (0.1, 1.2))
"""(warning, error) block coefficient ∇/(LBP·B·T) at rows from half the design draft up.  Ships
run from ~0.35 (fast craft) to ~0.9 (barges; common practice); a box of LBP·B·T holds 1.0 and the
waterline can be at most 1.2 LBP long, so above 1.2 is impossible and below 0.1 nothing floats
with that draft (derived / common practice)."""

RISE_TOLERANCE_REL = 0.01
"""TPC or MCTC may fall by 1 % between rows (rounding) before a warning."""

VCB_FALL_TOLERANCE_M = 0.005
"""VCB must rise with draft (each added layer lies above the old centre: derived); it may fall by
half a printed centimetre (rounding) before this is an error."""

KN_ZERO_TOLERANCE_M = 0.01
"""KN at 0° is zero on a symmetric hull (derived: K and B both on the centreline); 1 cm rounding."""

KN_ENVELOPE_DEPTHS = 2.0
"""KN is the distance from K to the line of action of buoyancy, so at most the distance from K to
the furthest buoyant point: within half the breadth across and, counting superstructure, two
moulded depths up (common practice)."""

KN_SMALL_ANGLE = {5.0: 0.05, 10.0: 0.10}
"""Warning: KN/(KMt·sinφ) differs from 1 by more than 5 % up to 5°, 10 % up to 10°.  The wall-sided
formula gives KN = sinφ·(KMt + BMt·tan²φ/2), 1 % above KMt·sinφ at 10° for BMt/KMt ≈ 1 (derived,
standards.md §6); deck-edge immersion lowers it on low-freeboard hulls."""

KN_SMALL_ANGLE_ERROR = 0.30
"""Error: more than 30 % away at ≤ 10°: beyond any hull; a digit or decimal slip (a factor 10 is 900 %)."""

KN_OUTLIER = (0.20, 0.50)
"""(warning, error) an inner KN value differs from the straight line between its neighbours by more
than 20 % / 50 % of that line's value, along the heel AND along the displacement (where both have
neighbours).  A decimal slip is 90 % or 900 %; the sharpest real bend (deck-edge immersion at 15°
spacing on a box) is about 20 % along heel only (derived from checks.md §1.2 values)."""

KN_UNREACHED_WEIGHT = 0.02
"""A KN row none of whose weight in the KN interpolated at any displacement a condition can have
is above 2 % (:func:`kn_unreached_rows`) is not judged for doubts: a warning-level doubt is a cell at
most 50 % off its neighbours' line (:data:`KN_OUTLIER`; beyond it is an error), which moves no KN a
condition reads by more than 1 % of that cell, under the 5 cm KN row of standards.md §5.3 for any
KN below 5 m.  Its errors (contradictions) are still errors.  Found by an audit: a hard-chine
ferry's true KN at 100 t, 10° drew two permanent warnings with every result, her lightship 172 t."""

LONE_CELL_SETTLED = 0.25
"""A lone mistyped cell: see :func:`lone_cell`.  Putting the cell on the chord through its
neighbours must bring each neighbour to within a quarter of the cell's own departure of its
chord, and each neighbour must depart by at least that much before (derived in lone_cell)."""

LONE_CELL_FLOORS = {"kmt_m": (0.02, 0.01), "vcb_m": (0.02, 0.0), "kml_m": (0.02, 0.02),
                    "mctc_tm_cm": (0.0, 0.02), "kn_m": (0.02, 0.02), "limit_m": (0.02, 0.01)}
"""(metres or units, fraction of the value): a cell is judged only when it departs from the chord
through its neighbours by more than the larger of the two.  1 % on KMt and 2 % on KML, MCTC and
KN are beyond the UR L5 tolerances on those quantities (standards.md §5.3) and beyond what printed
rounding makes; 2 cm is four printed half-centimetres.  A limiting KG or GM curve as KMt (a KG or
GM, as KMt, decides GM directly).  LCB by :data:`LONE_CELL_LCB_LBP` × LBP.
LCF and TPC are not judged: they are waterplane quantities that wobble with the hull's shape
(a chine, a knuckle) at a spacing of rows that looks like a lone cell, and a slip in them moves
the drafts by millimetres (the TPC against Δ check covers TPC)."""

LONE_CELL_LCB_LBP = 0.002
"""An LCB cell is judged beyond 0.2 % of LBP (a 0.27 m slip on a 30 m coaster moves her drafts by
8–11 cm; common practice for what a draft reading notices)."""

LONE_CELL_FSM_FRACTION = 0.05
"""A tank's free-surface cell is judged beyond 5 % of the tank's largest tabulated value (an FSM
typed a decimal place out changes GM by centimetres; 5 % is beyond any rounding of the column)."""

KN_ROW_REPEAT_M = 0.0005
"""Two rows of a KN table are 'the same' when they agree within half a printed millimetre at every
heel above 0°.  No two displacements have the same KN at every heel: at small heel KN ≈ KMt·sinφ
and at large heel KN follows the freeboard, which changes with every draft, so two rows may meet at
a heel or two where their curves cross, never at all of them (derived from KN = y_B·cosφ + z_B·sinφ,
standards.md §6; the coaster's rows 3600 t and 4000 t agree at 5° only).  A row typed with another
row's values (found by an audit: row 4000 t typed with row 3600 t's passed unseen)."""

KN_REPEAT_MIN_HEELS = 3
"""...judged only on rows with at least three heels above 0° (fewer could agree by chance)."""

KN_CIRCLE_KN_M = 0.05
KN_CIRCLE_KMT = (0.01, 0.05)
"""Every row of a KN table the same (three rows at least): no row was copied, KN does not depend on
the displacement.  Of all sections only the circle does that: its metacentre stays at the axis at
every draft and heel, so KN = R·sinφ and KMt = R at every draft (checks.md §2.2 [A]).  Such a table
is accepted when it is that circle's: KMt from the hydrostatic table at each row's displacement
within 1 % / 5 cm (the smaller) of their mean, and every KN within 5 cm of mean KMt·sinφ (UR L5 KMt
and cross-curve tolerances, standards.md §5.3).  Otherwise one error says so (the rows typed from
one?), not one per pair of rows (found by an audit: a cylinder's exact table drew 300 errors)."""

KN_SLIP_GAIN = 20.0
"""A KN table is a smooth surface: at a fixed heel KN is a smooth function of displacement (the
underwater body grows layer by layer), at a fixed displacement a smooth function of heel (common
practice: booklets fair their cross curves; KN = y_B·cosφ + z_B·sinφ with B moving continuously).
Two typing slips keep every value plausible and move whole rows or columns: two rows' values
exchanged, and one heel's column typed one displacement row down or up.  Each is judged by putting
it right: when exchanging the two rows (or moving the column back by one row) makes the table's
departure from smoothness (the sum of squares named at each check) at least 20 times smaller, the
printed table is the slipped one.  On the true tables of both demo vessels and of an invented 72 m
coaster every such move makes the table rougher (ratios below 1.2), while each slip seeded into the
coaster's table gives 95–160 (found by an audit; tests/test_audit_kn_slips.py)."""

KN_SLIP_FLOOR_M = 0.02
"""...and only when the slip itself matters: the as-typed departure exceeds 2 cm (root mean square
over the column, or the largest difference between the exchanged rows), the floor of the lone-cell
test on KN (:data:`LONE_CELL_FLOORS`)."""


LONE_CELL_ANGLE_DEG = 2.0
"""A downflooding-angle cell is judged beyond 2° (angles are printed to 0.1°; a transposed digit
moves one by 9° or more)."""


# A tank's density outside the usual range of its kind: deckload.core.bounds.KIND_DENSITY_T_M3 (a
# warning here; a density stated in a condition is judged alike, a caution in the result).


EMPTY_FSI_RISE = 1.1
"""Warning: at the empty row (volume 0) the free surface is the limit from inside, the tank's
bottom; a tank widens upward from its bottom (or keeps its breadth), so a value more than 10 %
above the next row's is a doubt — an FSM typed against the empty row (derived; 10 % for rounding)."""

FSI_BOX_ALLOWANCE = 1.1
"""Warning: fsi above 1.1 × A·B²/12, the inertia of a box-shaped free surface of the tank's own
area A (from its calibration) and the ship's breadth B (issue 8's bound l·b³/12, b ≤ B); 10 % for
estimating A from the calibration's steps."""

FSI_AREA_FACTOR = 2.0
"""Error: fsi above A·B²/4 with A doubled.  B²/4 is the largest variance of any distribution over
a width B (Popoviciu's inequality), so no free surface of area A within the ship's breadth has a
larger inertia (derived); the area from a calibration step can be half the surface at its top (a
V-shaped bottom: area growing from zero), hence the factor 2."""

CENTRE_ROUNDING_M = 0.005
"""Half a printed centimetre: the rounding allowed on any tabulated centre (m)."""

VOLUME_ROUNDING_REL = 0.0005
"""Rounding allowed on a tabulated volume, relative to the capacity (as profiles.CAPACITY_TOLERANCE)."""


# --------------------------------------------------------------------------- helpers


def _q(x: float) -> str:
    """A quantity in a message, four significant figures without e-notation below a million
    (24540 t, not 2.454e+04 t): an ordinary magnitude reads as the booklet prints it."""
    if not math.isfinite(x) or abs(x) < 1e4 or abs(x) >= 1e6:
        return f"{x:.4g}"
    return f"{x:.0f}"


TPC_AREA_SLIP_FACTOR = 2.0
"""A TPC whose waterplane 100·TPC/ρ is more than twice the hull's plan 1.2·LBP × B (every waterplane
lies within it: derived) is a slip of its unit (t per metre is 100 times), not a mistyped digit:
named at TPC, and the checks that take the waterplane from TPC (KMt, MCTC) skip its rows.  Below
twice, those checks run as before and name what they find."""


def _tpc_area_ok(tpc_t_cm: float, rho: float, plan_m2: float) -> bool:
    """Whether TPC's waterplane A = 100·TPC/ρ is within :data:`TPC_AREA_SLIP_FACTOR` × the plan."""
    return 100.0 * tpc_t_cm / rho <= plan_m2 * TPC_AREA_SLIP_FACTOR


def _f(x: float, unit: str = "m") -> str:
    # one decimal in the thousands (a displacement); beyond 1e6 no table of a ship holds the
    # value, and fixed point would print hundreds of digits of a typing error: six significant
    s = f"{x:.4g}" if abs(x) < 1000 else f"{x:.1f}" if abs(x) < 1e6 else f"{x:.6g}"
    return f"{s} {unit}" if unit else s


def lone_cell(x, y, floor) -> tuple[int, float, float] | None:
    """The cell of a column that stands alone out of a smooth curve: ``(index, departure,
    the value on the chord)`` for the largest such departure, or None.

    The departure of an inner cell j is r_j = y_j − c_j, c_j the chord through its neighbours at
    x_j.  A smooth curve departs by about h²·y''/8 at every cell alike; a kink (a chine, the deck
    edge immersing) makes one cell depart and leaves its neighbours on their chords.  One mistyped
    cell, y_j + δ, departs by δ and drags each neighbour's chord by δ·w (w its weight in that
    chord, ½ at even spacing), so the neighbours depart by −δ·w, the other way (derived).  So a
    cell is lone when (1) |r_j| exceeds ``floor(y_j)``; (2) each neighbour with a chord of its own
    departs by at least :data:`LONE_CELL_SETTLED` × |r_j|; and (3) with y_j put on its chord c_j,
    each of them departs by at most that: the mistyped cell explains its neighbours' bends.  A kink
    fails (2); smooth curvature fails (3) (its neighbours bend alike, before and after).  Only a
    cell whose two neighbours have chords of their own is judged (from the third to the third-last;
    five cells at least): with one neighbour, a kink between few rows (the deck edge immersing
    between two drafts of a short KN column) looks alike.
    """
    x = np.asarray(x, dtype=float)
    y = np.asarray(y, dtype=float)
    n = len(y)
    if n < 5:
        return None

    def departure(values, j):
        w = (x[j] - x[j - 1]) / (x[j + 1] - x[j - 1])
        return float(values[j] - (values[j - 1] + w * (values[j + 1] - values[j - 1])))

    found = None
    for j in range(2, n - 2):
        r = departure(y, j)
        if not abs(r) > floor(float(y[j])):
            continue
        near = (j - 1, j + 1)
        if any(abs(departure(y, k)) < LONE_CELL_SETTLED * abs(r) for k in near):
            continue
        settled = y.copy()
        settled[j] = y[j] - r
        if all(abs(departure(settled, k)) <= LONE_CELL_SETTLED * abs(r) for k in near) \
                and (found is None or abs(r) > abs(found[1])):
            found = (j, r, float(y[j] - r))
    return found


def _second_differences(x, y) -> np.ndarray:
    """Second divided differences of y over x at the inner points: 2·[(y₊−y)/h₊ − (y−y₋)/h₋]/(h₋+h₊),
    the second derivative of the parabola through three neighbours (any spacing; derived).  A 2-D
    ``y`` is taken column by column (x along its rows)."""
    x = np.asarray(x, dtype=float)
    y = np.asarray(y, dtype=float)
    h1, h2 = np.diff(x)[:-1], np.diff(x)[1:]
    if y.ndim == 2:
        h1, h2 = h1[:, None], h2[:, None]
    return 2.0 * ((y[2:] - y[1:-1]) / h2 - (y[1:-1] - y[:-2]) / h1) / (h1 + h2)


def _leave_out(x, j: int) -> tuple[list[int], np.ndarray] | None:
    """The value at x[j] from its neighbours alone, as (indices, weights): y_j ≈ Σ w·y[indices], the
    polynomial through up to two neighbours on each side (Lagrange), or None without a neighbour on
    each side.  For a smooth curve a cubic through four neighbours errs by h⁴·(fourth
    derivative)-sized amounts, far below a row's step (derived)."""
    x = np.asarray(x, dtype=float)
    idx = [k for k in (j - 2, j - 1, j + 1, j + 2) if 0 <= k < len(x)]
    if not any(k < j for k in idx) or not any(k > j for k in idx):
        return None
    w = np.ones(len(idx))
    with np.errstate(all="ignore"):  # heels a hair apart (a table no booklet prints): no prediction
        for a, ka in enumerate(idx):
            for kb in idx:
                if kb != ka:
                    w[a] *= (x[j] - x[kb]) / (x[ka] - x[kb])
    return (idx, w) if bool(np.all(np.isfinite(w))) else None


def kn_unreached_rows(disp, lightest_t: float) -> frozenset[int]:
    """KN rows no condition reads to more than :data:`KN_UNREACHED_WEIGHT`.

    KN at a displacement between rows is a not-a-knot cubic spline in displacement through every
    row (deckload.core.gz.kn_row), linear in the rows: KN(Δ) = Σ w_i(Δ)·KN_i.  A condition weighs at
    least ``lightest_t`` (at table density), so row i matters only through max |w_i(Δ)| over
    Δ from ``lightest_t`` to the last row: evaluated on the knots and 50 points per interval.  Rows
    whose every weight is below the bound are returned (with the spline's decay, about 0.27 per row
    for a cubic spline, those two or more rows below the one bracketing the lightest condition)."""
    from deckload.core.tables import CubicSpline

    d = np.asarray(disp, dtype=float)
    if len(d) < 3 or not d[0] < lightest_t < d[-1]:  # (a table wholly below her is the range check's error)
        return frozenset()
    first = max(0, int(np.searchsorted(d, lightest_t, side="right")) - 1)
    grid = np.concatenate([np.linspace(max(lightest_t, d[j]), d[j + 1], 51) for j in range(first, len(d) - 1)])
    with np.errstate(all="ignore"):  # rows a hair apart (no booklet's table): every row judged
        w = np.abs(CubicSpline.fit(d, np.eye(len(d)), end="not-a-knot")(grid))
    if not bool(np.all(np.isfinite(w))):
        return frozenset()
    return frozenset(i for i in range(first) if float(w[:, i].max()) < KN_UNREACHED_WEIGHT)


def kn_repeated_rows(disp, kn, heel) -> list[tuple[int, int]]:
    """Pairs (copy, original) of KN rows equal within :data:`KN_ROW_REPEAT_M` at every heel above 0°.

    Of two equal rows the copy is the one further from the curve through the rows around the pair
    (linear interpolation along the displacement with both left out); without rows on both sides,
    the later row."""
    disp = np.asarray(disp, dtype=float)
    kn = np.asarray(kn, dtype=float)
    heeled = np.asarray(heel, dtype=float) > 0.0
    if int(np.sum(heeled)) < KN_REPEAT_MIN_HEELS:
        return []
    out = []
    for a in range(len(disp)):
        for b in range(a + 1, len(disp)):
            if not np.all(np.abs(kn[a, heeled] - kn[b, heeled]) <= KN_ROW_REPEAT_M + 1e-9):
                continue
            copy, original = b, a
            keep = [k for k in range(len(disp)) if k not in (a, b)]
            if keep and keep[0] < a and keep[-1] > b:
                def miss(r):
                    return sum(abs(float(kn[r, j]) - float(np.interp(disp[r], disp[keep], kn[keep, j])))
                               for j in np.flatnonzero(heeled))
                if miss(a) > miss(b):
                    copy, original = a, b
            out.append((copy, original))
    return out


def kn_swapped_rows(disp, kn) -> tuple[int, float] | None:
    """(i, gain): rows i and i+1 of a KN table whose values look exchanged, or None.

    The roughness of the rows around the pair, Σ (second divided difference along the displacement)²
    over every heel at the inner rows i−1 … i+2, is compared with the same after exchanging the two
    rows; ``gain`` is as-typed ÷ exchanged, judged against :data:`KN_SLIP_GAIN`; the rows must differ
    by more than :data:`KN_SLIP_FLOOR_M` somewhere.  Needs four rows."""
    disp = np.asarray(disp, dtype=float)
    kn = np.asarray(kn, dtype=float)
    n = len(disp)
    if n < 4:
        return None
    best = None
    for i in range(n - 1):
        if float(np.max(np.abs(kn[i] - kn[i + 1]))) <= KN_SLIP_FLOOR_M:
            continue
        lo, hi = max(i - 2, 0), min(i + 4, n)  # the rows whose second differences the swap changes
        window = kn[lo:hi]
        swapped = window.copy()
        swapped[[i - lo, i + 1 - lo]] = window[[i + 1 - lo, i - lo]]
        with np.errstate(all="ignore"):  # rows a hair apart (no booklet's table): nothing to judge by
            after = float(np.sum(_second_differences(disp[lo:hi], swapped) ** 2))
            before = float(np.sum(_second_differences(disp[lo:hi], window) ** 2))
        if not (math.isfinite(after) and math.isfinite(before)):
            continue
        gain = before / after if after > 0.0 else math.inf
        if gain >= KN_SLIP_GAIN and (best is None or gain > best[1]):
            best = (i, gain)
    return best


def kn_shifted_column(heel, kn) -> tuple[int, int, float, float] | None:
    """(j, step, gain, rms): a heel column j of a KN table typed one displacement row down (step +1:
    each value is the row above's) or up (step −1), or None.

    Each cell of the column is predicted from its own row's neighbouring heels (:func:`_leave_out`);
    the departures of the column as typed are compared with those of the column moved back by one
    row (over the rows both have): ``gain`` = Σ departure² as typed ÷ Σ departure² moved back,
    judged against :data:`KN_SLIP_GAIN`, and ``rms`` the as-typed root mean square departure (metres),
    against :data:`KN_SLIP_FLOOR_M`.  The last heel (no neighbour beyond it) is not judged; three
    rows at least."""
    heel = np.asarray(heel, dtype=float)
    kn = np.asarray(kn, dtype=float)
    n, m = kn.shape
    if n < 3:
        return None
    best = None
    for j in range(1, m - 1):
        near = _leave_out(heel, j)
        if near is None:
            continue
        with np.errstate(all="ignore"):
            pred = kn[:, near[0]] @ near[1]
        if not bool(np.all(np.isfinite(pred))):
            continue
        for step in (1, -1):
            rows = np.arange(0, n - 1) if step == 1 else np.arange(1, n)
            typed = kn[rows, j] - pred[rows]
            moved = kn[rows + step, j] - pred[rows]  # the column put back: row i from the typed row i + step
            with np.errstate(all="ignore"):
                rms = float(np.sqrt(np.mean(typed ** 2)))
                s_typed, s_moved = float(np.sum(typed ** 2)), float(np.sum(moved ** 2))
            if not (math.isfinite(s_typed) and math.isfinite(s_moved)):
                continue
            gain = s_typed / s_moved if s_moved > 0.0 else math.inf
            if rms > KN_SLIP_FLOOR_M and gain >= KN_SLIP_GAIN and (best is None or gain > best[2]):
                best = (j, step, gain, rms)
    return best


def box_kn(breadth_m: float, depth_m: float, draft_m: float, heel_deg: float) -> tuple[float, int] | None:
    """KN of a box section (breadth B, depth D, upright draft T) heeled φ, and which of its four
    waterline regimes holds: (KN, regime), or None for a draft not inside the box.

    Closed forms of checks.md §1.2 [A] (t = tanφ, area A = B·T, the waterline z = z0 + y·t in body
    axes, heel to starboard; KN = y_B·cosφ + z_B·sinφ):
    1. wall-sided (waterline cuts both sides: T − t·B/2 ≥ 0, T + t·B/2 ≤ D):
       y_B = B²t/(12T), z_B = T/2 + B²t²/(24T);
    2. bilge emerged, deck dry: the submerged triangle of legs a = √(2A/t) ≤ B along the bottom and
       c = a·t ≤ D up the side: y_B = B/2 − a/3, z_B = c/3;
    3. deck edge immersed, bilge wet: case 2 for the dry triangle at the high deck corner (area
       E = B·D − A): B = [B·D·(0, D/2) − E·e]/A, e the dry triangle's centroid;
    4. waterline cuts deck and bottom: z0 = D/2 + t(A/D − B/2); the submerged part is the rectangle
       [y_d, B/2]×[0, D] and the triangle (y_b, 0), (y_d, 0), (y_d, D), y_b = −z0/t, y_d = (D − z0)/t.
    Exactly one regime's conditions hold at any heel (the submerged area grows with z0), so the
    first whose own conditions hold is the one.  At 90° the box lies on its side: KN = z_B = D/2.
    """
    B, D, T = float(breadth_m), float(depth_m), float(draft_m)
    if not (B > 0.0 and 0.0 < T < D and math.isfinite(T) and math.isfinite(D)):
        return None
    phi = math.radians(float(heel_deg))
    if phi <= 0.0:
        return 0.0, 1
    if phi >= math.pi / 2 - 1e-9:
        return D / 2.0, 4
    s, c, t = math.sin(phi), math.cos(phi), math.tan(phi)
    A = B * T
    if T - t * B / 2.0 >= 0.0 and T + t * B / 2.0 <= D:
        y, z, regime = B * B * t / (12.0 * T), T / 2.0 + B * B * t * t / (24.0 * T), 1
    else:
        a = math.sqrt(2.0 * A / t)
        e_area = B * D - A
        a3 = math.sqrt(2.0 * e_area / t)
        if a <= B and a * t <= D:
            y, z, regime = B / 2.0 - a / 3.0, a * t / 3.0, 2
        elif a3 <= B and a3 * t <= D:
            ey, ez = -B / 2.0 + a3 / 3.0, D - a3 * t / 3.0
            y, z, regime = (-e_area * ey) / A, (B * D * D / 2.0 - e_area * ez) / A, 3
        else:
            z0 = D / 2.0 + t * (A / D - B / 2.0)
            yb, yd = -z0 / t, (D - z0) / t
            r_area, t_area = (B / 2.0 - yd) * D, (yd - yb) * D / 2.0
            y = (r_area * (yd + B / 2.0) / 2.0 + t_area * (yb + 2.0 * yd) / 3.0) / A
            z = (r_area * D / 2.0 + t_area * D / 3.0) / A
            regime = 4
    return y * c + z * s, regime


BOX_REGIME_WORDS = {2: "its bilge out of the water", 3: "its deck edge in the water",
                    4: "its bilge out of the water and deck edge in it"}


def kn_kmt_allowance(box, breadth_m: float, heel_deg: float) -> tuple[float, str]:
    """(allowance, what happened to the box) added to both tolerances of KN against KMt·sinφ at a
    heel where the waterplane of a box of her breadth B and depth D at the row's draft T has already
    changed, or (0, "") where it has not.

    KN = KMt·sinφ (to within BMt·tan²φ/2·sinφ, the wall-sided formula, standards.md §6) holds only
    while the waterline cuts the same two sides it cuts upright.  A hull of breadth B and depth D
    floating at T, its waterline pivoting about the centreline (the centre of a symmetric
    waterplane), first meets its deck at the side when T + (B/2)·tanφ = D (no deck edge lies lower
    than D or further out than B/2), and lifts a bottom at the keel out of the water when
    T − (B/2)·tanφ = 0 (no bottom lies lower than the keel or further out than B/2); a box meets
    both corners at exactly those angles, min(atan(2T/B), atan(2(D − T)/B)), so it is the hull of
    that breadth and depth whose waterplane changes earliest at a hard corner, and most abruptly.
    (A rising floor or a chine just under the waterline meets the water sooner, but at a slope, so
    KN bends gradually there: what the 5 %/10 % tolerances were set for, as before.)  Past
    that angle KN departs from KMt·sinφ by what the lost or gained waterplane gives; the box's own
    departure, |KN_box/(KMt_box·sinφ) − 1| with KMt_box = T/2 + B²/(12T) (checks.md §1.1, KN_box by
    :func:`box_kn`, checks.md §1.2 [A]), is the allowance: at light draft a flat-bottomed barge's
    bilge emerges at 2–4° and its KN falls to half of KMt·sinφ by 10° (found by an audit: a box
    barge's exact KN with drafts from 0.2 m were refused).  Below that angle nothing is added:
    every slip the check was made for is judged as before."""
    if box is None or box[1] == 1:
        return 0.0, ""
    kn_box, regime, t = box
    km_box = t / 2.0 + breadth_m * breadth_m / (12.0 * t)
    return abs(kn_box / (km_box * math.sin(math.radians(float(heel_deg)))) - 1.0), BOX_REGIME_WORDS[regime]


def kn_bend_allowance(boxes, w: float) -> float:
    """The allowance (metres) of a KN cell against the line through its two neighbours: the box's
    own departure from its line, |KN_box,j − (KN_box,j−1 + w·(KN_box,j+1 − KN_box,j−1))|, where the
    box of her breadth and depth (:meth:`_Audit.box_kn_table`) changes waterline regime between the
    two neighbours (bilge emerging, deck edge immersing: a kink of the curve), else 0.

    ``boxes`` holds the three (KN, regime, draft) of the cell and its neighbours, along the heel or
    along the displacement, ``w`` the cell's weight in the line.  A kink between neighbours bends
    the line through them by as much as the kink turns; a box, the hull whose waterplane changes
    earliest and most abruptly at her breadth and depth (:func:`kn_kmt_allowance`), bends most.  At
    light draft its bilge emerges between 0° and 10° and its KN at 5° stands 60 % above the line
    through 0° and 10° (checks.md §1.2 closed forms, :func:`box_kn`)."""
    if any(b is None for b in boxes) or len({b[1] for b in boxes}) == 1:
        return 0.0
    a, m, c = (b[0] for b in boxes)
    return abs(m - (a + w * (c - a)))


def _lone_floor(name: str):
    metres, fraction = LONE_CELL_FLOORS[name]
    return lambda value: max(metres, fraction * abs(value))


def _lone_why(r: float, chord: float, unit: str, along: str = "",
              guess: str = "a transposed or mistyped digit?") -> str:
    return (f"stands alone out of a smooth curve{along}: the line through its neighbours gives {chord:.4g}{unit} "
            f"({r:+.3g}{unit} away), and with that value its neighbours lie smoothly again ({guess})")


LIMIT_CURVE_PRINT_M = 0.01
"""A limiting curve's row is called unattainable only beyond this (m): a curve printed to 0.01 m
(common practice) rounds by 0.005 m at most; the bound it is held to is exact (derived)."""
LIMIT_CURVE_KG_MARGIN_M = 0.05
"""A limiting-curve row is doubted only when its KG, 5 cm lower, still fails her intact criteria on
her KN tables: room for the booklet's own method (free-trim KN, its openings, rounding) within the
5 cm a stability instrument may differ in GMt and KN (standards.md §5.3)."""


LIMIT_CURVE_UNJUDGED = ("-angle-max-gz", "-area-0-max")
"""Criteria a limiting-curve row is not doubted on: the angle of maximum GZ and the OSV area to it.
Where GZ is flat near its top that angle moves by degrees with the way KN is read between the
tabulated heels (read linearly, as by hand, it falls on a tabulated heel), far more than 5 cm of KG
moves it: an invented booklet's curve, worked with KN linear in heel, put θmax at 25.0° where
deckload's spline finds 24.5°."""


class _Audit:
    def __init__(self, vessel: Vessel):
        self.v = vessel
        p = vessel.particulars
        self.L, self.B, self.D, self.T = p.lbp_m, p.breadth_m, p.depth_m, p.design_draft_m
        self.rho = p.table_density_t_m3
        self.out: list[Finding] = []
        self.half_trim_m = 0.0
        """Half the trim of the hydrostatic table being judged (0 at even keel)."""

    def add(self, severity, key, path, value, why, look, check):
        self.out.append(Finding(severity, key, tuple(path), value, why, look, check))

    # ----------------------------------------------------------------- positions
    def x_position(self, key, path, x, look, *, lightship=False):
        L = self.L
        if lightship:
            lo, hi = LIGHTSHIP_X_RANGE
            if not lo * L <= x <= hi * L:
                self.add(ERROR, key, path, _f(x) + " from AP",
                         f"a lightship LCG must lie between {lo:g} and {hi:g} × LBP from the AP "
                         f"({_f(lo * L)}–{_f(hi * L)}): she floats with B under G, and no hull's LCB lies "
                         "in the end fifths of her length (a value from midships or the FP typed as from the AP?)",
                         look, "lightship-x")
            return
        e, d = ENVELOPE_X_FRACTION, DOUBT_X_FRACTION
        if x < -e * L or x > (1 + e) * L:
            self.add(ERROR, key, path, _f(x) + " from AP",
                     f"outside the vessel: more than {e:g} × LBP beyond the {'AP' if x < 0 else 'FP'} "
                     f"(the hull runs about {_f(-e * L)} to {_f((1 + e) * L)} from the AP at most)",
                     look, "position-x")
        elif x < -d * L or x > (1 + d) * L:
            self.add(WARNING, key, path, _f(x) + " from AP",
                     f"more than {d:g} × LBP beyond the {'AP' if x < 0 else 'FP'} ({_f(-d * L)} to "
                     f"{_f((1 + d) * L)} from the AP is where compartments usually end)", look, "position-x")

    def z_position(self, key, path, z, look, kind):
        warn, err = VCG_LIMITS_D[kind]
        D = self.D
        if z > err * D:
            self.add(ERROR, key, path, _f(z) + " above keel",
                     f"more than {err:g} × the depth ({_f(err * D)}) above the keel: above anything aboard",
                     look, "position-z")
        elif z > warn * D:
            self.add(WARNING, key, path, _f(z) + " above keel",
                     f"more than {warn:g} × the depth ({_f(warn * D)}) above the keel", look, "position-z")

    def y_position(self, key, path, y, look):
        if abs(y) > self.B / 2 + CENTRE_ROUNDING_M:
            self.add(ERROR, key, path, _f(y) + " from CL",
                     f"outside the vessel: |TCG| above half the breadth ({_f(self.B / 2)})", look, "position-y")

    def positions(self):
        v = self.v
        ls = v.lightship
        look = "the booklet's lightship particulars (inclining test summary)"
        self.x_position("lightship.lcg_m", ("lightship", "lcg_m"), ls.lcg_m, look, lightship=True)
        self.z_position("lightship.vcg_m", ("lightship", "vcg_m"), ls.vcg_m, look, "lightship")
        if ls.vcg_m < LIGHTSHIP_LOW_VCG_D * self.D:
            self.add(WARNING, "lightship.vcg_m", ("lightship", "vcg_m"), _f(ls.vcg_m) + " above keel",
                     f"below {LIGHTSHIP_LOW_VCG_D:g} × the depth: unusually low for a lightship KG", look, "position-z")
        self.y_position("lightship.tcg_m", ("lightship", "tcg_m"), ls.tcg_m, look)
        for i, t in enumerate(v.tanks):
            self.tank_positions(i, t)
        for i, h in enumerate(v.holds):
            key, path = f"hold[{h.id}]", ("hold", i)
            look = f"the booklet's capacity plan / hold table for {h.id}"
            self.x_position(f"{key}.lcg_m", path + ("lcg_m",), h.lcg_m, look)
            self.z_position(f"{key}.vcg_m", path + ("vcg_m",), h.vcg_m, look, "compartment")
            self.y_position(f"{key}.tcg_m", path + ("tcg_m",), h.tcg_m, look)
            for col, kind in (("fill_lcg_m", "x"), ("fill_vcg_m", "z")):
                arr = getattr(h, col)
                if arr is None:
                    continue
                for r, val in enumerate(arr):
                    n = len(self.out)
                    if kind == "x":
                        self.x_position(f"{key}.{col}", path + (col, r), float(val), look)
                    else:
                        self.z_position(f"{key}.{col}", path + (col, r), float(val), look, "compartment")
                    if len(self.out) > n:
                        break
        for i, c in enumerate(v.constants):
            key, path = f"constant[{c.name}]", ("constant", i)  # by its name, unique in a profile, as the reader names it
            look = f"the booklet's list of fixed constants ({c.name})"
            self.x_position(f"{key}.lcg_m", path + ("lcg_m",), c.lcg_m, look)
            self.z_position(f"{key}.vcg_m", path + ("vcg_m",), c.vcg_m, look, "deck")
            self.y_position(f"{key}.tcg_m", path + ("tcg_m",), c.tcg_m, look)
        for i, a in enumerate(v.deck_areas):
            key, path = f"deck_area[{a.id}]", ("deck_area", i)
            look = f"the booklet's deck plan / deck-load table for {a.id}"
            self.x_position(f"{key}.lcg_m", path + ("lcg_m",), a.lcg_m, look)
            self.z_position(f"{key}.deck_height_m", path + ("deck_height_m",), a.deck_height_m, look, "deck")
            self.y_position(f"{key}.tcg_m", path + ("tcg_m",), a.tcg_m, look)

    def tank_positions(self, i: int, t: Tank):
        cal = t.calibration
        look = f"the booklet's calibration table of tank {t.id}"
        for col, kind in (("lcg_m", "x"), ("vcg_m", "z"), ("tcg_m", "y")):
            arr = getattr(cal, col)
            for r, val in enumerate(arr):
                n = len(self.out)
                key, path = f"tank[{t.id}].calibration.{col}", ("tank", i, "calibration", col, r)
                if kind == "x":
                    self.x_position(key, path, float(val), look)
                elif kind == "z":
                    self.z_position(key, path, float(val), look, "compartment")
                else:
                    self.y_position(key, path, float(val), look)
                if len(self.out) > n:
                    break  # one finding per column: the first row that is out

    # ----------------------------------------------------------------- lightship trim
    def lightship_trim(self):
        v, h = self.v, self.v.hydrostatics
        disp = v.lightship.mass_t
        if not h.displacement_t[0] <= disp <= h.displacement_t[-1]:
            return
        lcb = float(np.interp(disp, h.displacement_t, h.lcb_m))
        mctc = float(np.interp(disp, h.displacement_t, h.mctc_tm_cm))
        trim = disp * (lcb - v.lightship.lcg_m) / (100.0 * mctc)  # standards.md §6 trim formula
        if abs(trim) > LIGHTSHIP_TRIM_FRACTION * self.L:
            self.add(WARNING, "lightship.lcg_m", ("lightship", "lcg_m"), _f(v.lightship.lcg_m) + " from AP",
                     f"with the profile's LCB {_f(lcb)} and MCTC {mctc:.4g} t·m/cm at the lightship "
                     f"displacement she would trim {_f(abs(trim))} by the {'stern' if trim > 0 else 'head'}, "
                     f"more than {LIGHTSHIP_TRIM_FRACTION:g} × LBP", "the booklet's lightship particulars "
                     "and its lightship condition (trim)", "lightship-trim")

    def lightship_share(self):
        """The lightship against her loaded displacement (:data:`LIGHTSHIP_SHARE`)."""
        v, h = self.v, self.v.hydrostatics
        marks = {m.name: m.draft_m for m in v.load_lines}
        draft, where = (marks["summer"], "the summer mark") if "summer" in marks else (self.T, "the design draft")
        if not h.draft_m[0] <= draft <= h.draft_m[-1]:
            return
        loaded = float(np.interp(draft, h.draft_m, h.displacement_t))
        share = v.lightship.mass_t / loaded
        lo, hi = LIGHTSHIP_SHARE
        if share < lo or share >= hi:
            self.add(WARNING, "lightship.mass_t", ("lightship", "mass_t"), f"{v.lightship.mass_t:.6g} t",
                     f"{share:.0%} of her displacement at {where} ({loaded:.6g} t at {draft:g} m): "
                     + (f"a lightship is rarely below {lo:.0%} of it (a decimal point slipped?)" if share < lo
                        else "she could carry nothing"),
                     "the booklet's lightship particulars (inclining test summary)", "lightship-share")

    # ----------------------------------------------------------------- pairs
    def pairs(self):
        v = self.v
        seen = set()
        for i, a in enumerate(v.tanks):
            if a.pair is None or a.pair not in v.tank_index or (a.pair, a.id) in seen:
                continue
            seen.add((a.id, a.pair))
            b = v.tank(a.pair)
            ya, yb = float(a.calibration.tcg_m[-1]), float(b.calibration.tcg_m[-1])
            key, path = f"tank[{a.id}].calibration.tcg_m", ("tank", i, "calibration", "tcg_m", len(a.calibration.tcg_m) - 1)
            look = f"the booklet's calibration tables of {a.id} and {b.id} (full-tank TCG)"
            near = PAIR_CENTRELINE_FRACTION_B * self.B
            if ya * yb > 0 and abs(ya) > near and abs(yb) > near:
                self.add(ERROR, key, path, f"{_f(ya)} (pair {b.id}: {_f(yb)})",
                         f"{a.id} and {b.id} are a port/starboard pair but both centres are on the "
                         f"{'starboard' if ya > 0 else 'port'} side: one sign is wrong", look, "pair-tcg-sign")
            elif abs(ya + yb) > max(PAIR_TCG_ABS_M, PAIR_TCG_REL * max(abs(ya), abs(yb))):
                self.add(WARNING, key, path, f"{_f(ya)} (pair {b.id}: {_f(yb)})",
                         f"the pair's full-tank TCGs do not mirror: they differ by {_f(abs(ya + yb))} "
                         f"(more than max({PAIR_TCG_ABS_M:g} m, {PAIR_TCG_REL:.0%} of the larger))", look, "pair-tcg")
            xa, xb = float(a.calibration.lcg_m[-1]), float(b.calibration.lcg_m[-1])
            if abs(xa - xb) > PAIR_LCG_LBP * self.L:
                self.add(WARNING, f"tank[{a.id}].calibration.lcg_m",
                         ("tank", i, "calibration", "lcg_m", len(a.calibration.lcg_m) - 1),
                         f"{_f(xa)} from AP (pair {b.id}: {_f(xb)})",
                         f"the pair's full-tank LCGs are {_f(abs(xa - xb))} apart (more than {PAIR_LCG_LBP:.0%} of "
                         "LBP): a pair spans the same frames (a sign of a midships datum slipped?)",
                         look.replace("full-tank TCG", "full-tank LCG"), "pair-lcg")
            ca, cb = a.capacity_m3, b.capacity_m3
            if abs(ca - cb) > PAIR_CAPACITY_REL * max(ca, cb):
                self.add(WARNING, f"tank[{a.id}].capacity_m3", ("tank", i, "capacity_m3"),
                         f"{ca:.4g} m³ (pair {b.id}: {cb:.4g} m³)",
                         f"the pair's capacities differ by {abs(ca - cb) / max(ca, cb):.0%} (more than "
                         f"{PAIR_CAPACITY_REL:.0%}: UR L5 allows 2 % on a volume)", look.replace("full-tank TCG", "capacity"),
                         "pair-capacity")

    # ----------------------------------------------------------------- hydrostatics
    def hydrostatics(self):
        h = self.v.hydrostatics
        L, B, rho = self.L, self.B, self.rho
        T, disp, tpc, kmt = h.draft_m, h.displacement_t, h.tpc_t_cm, h.kmt_m
        look = "the booklet's hydrostatic particulars table"
        hp = ("hydrostatics",)

        def row(i):
            return f"{look}, row at draft {T[i]:.4g} m"

        # LCB / LCF ranges: a midships datum typed as if from the AP gives a wholly negative column.
        for col in ("lcb_m", "lcf_m"):
            arr = getattr(h, col)
            elo, ehi = LCB_ERROR_RANGE
            dlo, dhi = LCB_DOUBT_RANGE
            bad = np.flatnonzero((arr < elo * L) | (arr > ehi * L))
            if bad.size:
                r = int(bad[0])
                every = " (every row: a datum or sign slip?)" if bad.size == arr.size else ""
                self.add(ERROR, f"hydrostatics.{col}", hp + (col, r), _f(float(arr[r])) + " from AP",
                         f"outside {elo:g}–{ehi:g} × LBP from the AP ({_f(elo * L)}–{_f(ehi * L)}): no hull's "
                         f"{col[:3].upper()} lies in the end fifths of its length{every}", row(r), "hydro-lcb-range")
                continue
            doubt = np.flatnonzero((arr < dlo * L) | (arr > dhi * L))
            if doubt.size:
                r = int(doubt[0])
                self.add(WARNING, f"hydrostatics.{col}", hp + (col, r), _f(float(arr[r])) + " from AP",
                         f"outside {dlo:g}–{dhi:g} × LBP from the AP: unusually far from midships", row(r), "hydro-lcb-range")

        # Displacement against the integral of TPC (100·TPC t per m of draft, at table density).
        for i in range(1, len(T)):
            step = float(disp[i] - disp[i - 1])
            integral = 50.0 * float(tpc[i] + tpc[i - 1]) * float(T[i] - T[i - 1])
            miss = abs(step - integral)
            for sev, frac, floor in ((ERROR, TPC_INTERVAL[1], TPC_INTERVAL_FLOOR[1]),
                                     (WARNING, TPC_INTERVAL[0], TPC_INTERVAL_FLOOR[0])):
                if miss > frac * integral and miss > floor * float(disp[i]):
                    per_m = (" (about 100 times the step: TPC typed in t per metre, not t per cm?)"
                             if step > 0 and 80.0 <= integral / step <= 125.0 else "")
                    self.add(sev, "hydrostatics.displacement_t", hp + ("displacement_t", i), f"{disp[i]:.6g} t",
                             f"the step from {disp[i - 1]:.6g} t ({T[i - 1]:.4g} m) is {_q(step)} t but 100·TPC over "
                             f"the draft gives {_q(integral)} t ({miss / integral:.0%} apart, more than {frac:.0%}): "
                             f"the displacement or a TPC value is mistyped{per_m}", row(i), "hydro-tpc")
                    break
            else:
                continue
            break  # one finding: the first step that disagrees

        # Block coefficient at rows from half the design draft up.
        (wlo, whi), (elo, ehi) = CB_RANGE
        for i in range(len(T)):
            if T[i] < 0.5 * self.T or T[i] <= 0:
                continue
            cb = float(disp[i]) / rho / (L * B * float(T[i]))
            # 0.5 % rounding allowance at the box's 1.0 (Δ and the draft are printed to 3–4 figures)
            sev = ERROR if not elo <= cb <= ehi else WARNING if not wlo <= cb <= whi * 1.005 else None
            if sev:
                self.add(sev, "hydrostatics.displacement_t", hp + ("displacement_t", i), f"{disp[i]:.6g} t",
                         f"block coefficient Δ/(ρ·LBP·B·T) = {cb:.3g} at {T[i]:.4g} m: "
                         + ("no hull of this length, breadth and draft can hold that" if sev == ERROR
                            else f"outside the usual {wlo:g}–{whi:g}"), row(i), "hydro-cb")
                break

        # Quantities that must rise with draft.
        if h.vcb_m is not None:
            d = np.diff(h.vcb_m)
            bad = np.flatnonzero(d < -VCB_FALL_TOLERANCE_M)
            if bad.size:
                r = int(bad[0]) + 1
                self.add(ERROR, "hydrostatics.vcb_m", hp + ("vcb_m", r), _f(float(h.vcb_m[r])),
                         f"falls from {_f(float(h.vcb_m[r - 1]))} as the draft rises: every added layer lies above "
                         "the old centre of buoyancy, so VCB can only rise", row(r), "hydro-rise")
            for i in range(len(T)):
                # trimmed by t, the waterline reaches T + |t|/2 at the deeper end (self.half_trim_m)
                top = T[i] + self.half_trim_m
                if T[i] > 0 and not 0.0 < h.vcb_m[i] < top + VCB_FALL_TOLERANCE_M:
                    self.add(ERROR, "hydrostatics.vcb_m", hp + ("vcb_m", i), _f(float(h.vcb_m[i])),
                             f"the centre of buoyancy must lie between the keel and the waterline (0–{top:.4g} m)",
                             row(i), "hydro-vcb")
                    break
        for col, what in (("tpc_t_cm", "TPC"), ("mctc_tm_cm", "MCTC")):
            arr = getattr(h, col)
            bad = np.flatnonzero(arr[1:] < arr[:-1] * (1 - RISE_TOLERANCE_REL))
            if bad.size:
                r = int(bad[0]) + 1
                self.add(WARNING, f"hydrostatics.{col}", hp + (col, r), f"{arr[r]:.5g}",
                         f"{what} falls from {arr[r - 1]:.5g} as the draft rises (it rises on a flared hull; "
                         "tumblehome above the waterline can make it fall)", row(r), "hydro-rise")

        # KMt against KB + BMt.  Derived bounds with waterplane area A = 100·TPC/ρ, every
        # point of it within the breadth B, waterline length ≤ 1.2·LBP, ∇ = Δ/ρ, BMt = I_T/∇:
        #   any waterplane:  I_T = A·var(y) ≤ A·B²/4  (Popoviciu)                 → error above
        #   single hull (half-breadths y(x) ≤ B/2): I_T = ∫(2/3)y³dx ≤ (B²/12)·A   → warning above
        #   any waterplane:  I_T ≥ ∫w³/12 dx ≥ A³/(12·Lwl²)  (area packed on the centreline; Hölder)
        # Without VCB, KB lies between 0 and T.
        plan = WATERLINE_LENGTH_MAX * L * B
        too_big = [i for i in range(len(T)) if not _tpc_area_ok(float(tpc[i]), rho, plan)]
        if too_big:
            r = too_big[0]
            self.add(ERROR, "hydrostatics.tpc_t_cm", hp + ("tpc_t_cm", r), f"{_q(float(tpc[r]))} t/cm",
                     f"gives a waterplane of 100·TPC/ρ = {_q(100.0 * float(tpc[r]) / rho)} m², more than twice her plan "
                     f"1.2·LBP × B = {_q(plan)} m² ({len(too_big)} of {len(T)} rows): TPC typed in t per metre, "
                     "not t per cm? (KMt and MCTC, judged through the waterplane TPC gives, are not judged at these rows)",
                     row(r), "hydro-tpc-area")
        for i in range(len(T)):
            if T[i] <= 0 or disp[i] <= 0 or i in too_big:
                continue
            area = 100.0 * float(tpc[i]) / rho
            vol = float(disp[i]) / rho
            bm_any = area * B * B / 4.0 / vol
            bm_mono = area * B * B / 12.0 / vol
            lwl = WATERLINE_LENGTH_MAX * L
            bm_lo = area ** 3 / (12.0 * lwl * lwl) / vol
            a = METACENTRE_ALLOWANCE
            if h.vcb_m is not None:
                kb_lo = kb_hi = float(h.vcb_m[i])
            else:
                kb_lo, kb_hi = 0.0, float(T[i])
            km = float(kmt[i])
            if km > (kb_hi + bm_any) * (1 + a):
                sev, bound, rule = ERROR, kb_hi + bm_any, "BMt = I_T/∇ ≤ A·B²/(4∇) for any waterplane within the breadth"
            elif km < (kb_lo + bm_lo) * (1 - a):
                sev, bound, rule = ERROR, kb_lo + bm_lo, "BMt = I_T/∇ ≥ A³/(12·Lwl²·∇) for any waterplane"
            elif km > (kb_hi + bm_mono) * (1 + a):
                sev, bound, rule = WARNING, kb_hi + bm_mono, "BMt ≤ A·B²/(12∇) for a single hull (a multihull may exceed it)"
            else:
                continue
            self.add(sev, "hydrostatics.kmt_m", hp + ("kmt_m", i), _f(km),
                     f"{'below' if km < bound else 'above'} what KB + BMt allows at {T[i]:.4g} m ({_f(bound)}): "
                     f"{rule}, with A = 100·TPC/ρ = {_q(area)} m²", row(i), "hydro-kmt")
            break

        # MCTC against the waterplane and against KML.
        self._check_mctc(row)

        # LCB against LCF: d(∇·LCB) = LCF·d∇, so LCB follows from LCF and Δ (derived).
        moment = float(disp[0] * h.lcb_m[0])
        worst = None
        for i in range(1, len(T)):
            moment += 0.5 * float(h.lcf_m[i] + h.lcf_m[i - 1]) * float(disp[i] - disp[i - 1])
            pred = moment / float(disp[i])
            gap = abs(pred - float(h.lcb_m[i]))
            if worst is None or gap > worst[0]:
                worst = (gap, i, pred)
        if worst is not None:
            gap, i, pred = worst
            for sev, frac in ((ERROR, 0.05), (WARNING, 0.01)):
                # 1 % of LBP: UR L5's LCB tolerance is 1 % / 0.5 m (standards.md §5.3); 5 %: a datum slip
                if gap > frac * L:
                    self.add(sev, "hydrostatics.lcb_m", hp + ("lcb_m", i), _f(float(h.lcb_m[i])) + " from AP",
                             f"the LCF column integrated over the displacement gives LCB {_f(pred)} here, "
                             f"{_f(gap)} away (more than {frac:.0%} of LBP): LCB and LCF contradict each other",
                             row(i), "hydro-lcb-lcf")
                    break

        # A lone mistyped cell in a column that follows the draft smoothly.
        for col, unit, floor in (("kmt_m", " m", _lone_floor("kmt_m")), ("vcb_m", " m", _lone_floor("vcb_m")),
                                 ("kml_m", " m", _lone_floor("kml_m")),
                                 ("mctc_tm_cm", " t·m/cm", _lone_floor("mctc_tm_cm")),
                                 ("lcb_m", " m", lambda value: LONE_CELL_LCB_LBP * L)):
            arr = getattr(h, col)
            lone = None if arr is None else lone_cell(T, arr, floor)
            if lone is not None:
                i, r, chord = lone
                self.add(WARNING, f"hydrostatics.{col}", hp + (col, i), f"{float(arr[i]):.5g}{unit}",
                         _lone_why(r, chord, unit), row(i), "hydro-lone")

    def _check_mctc(self, row):
        """MCTC against the waterplane (always) and against KML (when given).

        Derived: MCTC = ρ·I_L/(100·LBP) and TPC = ρ·A/100, so c = 12·MCTC/(TPC·LBP) = 12·I_L/(A·LBP²).
        I_L about the LCF is A times the variance of x over the waterplane: at most A·Lwl²/4
        (Popoviciu), so c ≤ 3·(Lwl/LBP)² ≤ 4.32; at least that of the area packed in a strip of
        breadth B (length A/B): I_L ≥ A³/(12·B²), so c ≥ Cw² with Cw = A/(LBP·B).  MCTC made
        with GML < BML is lower by BG/BML, a few % (10 % allowed).
        """
        h, L, B, rho = self.v.hydrostatics, self.L, self.B, self.rho
        hp = ("hydrostatics",)
        for i in range(len(h.draft_m)):
            tpc, mctc = float(h.tpc_t_cm[i]), float(h.mctc_tm_cm[i])
            if not _tpc_area_ok(tpc, rho, WATERLINE_LENGTH_MAX * L * B):
                continue  # TPC's own slip, named by hydrostatics(): c would blame MCTC for it
            c = 12.0 * mctc / (tpc * L)
            cw = 100.0 * tpc / rho / (L * B)
            hi = 3.0 * WATERLINE_LENGTH_MAX ** 2 * (1 + METACENTRE_ALLOWANCE)
            lo = 0.9 * cw * cw
            wlo, whi = MCTC_SHAPE_DOUBT
            sev = ERROR if not lo <= c <= hi else WARNING if not wlo <= c <= whi else None
            if sev:
                self.add(sev, "hydrostatics.mctc_tm_cm", hp + ("mctc_tm_cm", i), f"{mctc:.5g} t·m/cm",
                         f"12·MCTC/(TPC·LBP) = {c:.3g} at {h.draft_m[i]:.4g} m: "
                         + (f"no waterplane of this area and breadth gives that (bounds {lo:.2g}–{hi:.3g})" if sev == ERROR
                            else f"outside {wlo:g}–{whi:g} (diamond 0.5, rectangle 1.0)"), row(i), "hydro-mctc")
                break
        if h.kml_m is None:
            return
        (wlo, whi), (elo, ehi) = MCTC_KML_RANGE
        for i in range(len(h.draft_m)):
            kb = float(h.vcb_m[i]) if h.vcb_m is not None else 0.55 * float(h.draft_m[i])  # KB ≈ 0.55 T (common practice)
            bml = float(h.kml_m[i]) - kb
            if bml <= 0:
                self.add(ERROR, "hydrostatics.kml_m", hp + ("kml_m", i), _f(float(h.kml_m[i])),
                         "KML is not above the centre of buoyancy", row(i), "hydro-mctc")
                break
            if float(h.displacement_t[i]) <= 0.0:
                continue  # an empty row (Δ = 0, a draft of 0): no MCTC to compare
            ratio = 100.0 * L * float(h.mctc_tm_cm[i]) / (float(h.displacement_t[i]) * bml)
            sev = ERROR if not elo <= ratio <= ehi else WARNING if not wlo <= ratio <= whi else None
            if sev:
                self.add(sev, "hydrostatics.mctc_tm_cm", hp + ("mctc_tm_cm", i), f"{h.mctc_tm_cm[i]:.5g} t·m/cm",
                         f"MCTC ≈ Δ·GML/(100·LBP) with GML ≤ BML = KML − KB = {_f(bml)}: the table's MCTC is "
                         f"{ratio:.4g} × Δ·BML/(100·LBP), outside {(elo if sev == ERROR else wlo):g}–"
                         f"{(ehi if sev == ERROR else whi):g}", row(i), "hydro-mctc-kml")
                break

    # ----------------------------------------------------------------- cross curves
    def cross_curves(self):
        k, h = self.v.cross_curves, self.v.hydrostatics
        heel, disp, kn = k.heel_deg, k.displacement_t, k.kn_m
        cp = ("cross_curves", "kn_m")
        look = "the booklet's KN cross curves table"

        def where(i, j):
            return f"{look}, Δ {disp[i]:.6g} t at {heel[j]:g}°"

        bound = math.hypot(self.B / 2.0, KN_ENVELOPE_DEPTHS * self.D)
        found = False
        for i in range(len(disp)):
            for j in range(len(heel)):
                x = float(kn[i, j])
                if heel[j] == 0.0 and abs(x) > KN_ZERO_TOLERANCE_M:
                    self.add(ERROR, "cross_curves.kn_m", cp + (i, j), _f(x),
                             "KN at 0° must be zero: upright, the line of buoyancy passes through K", where(i, j), "kn-zero")
                elif heel[j] > 0 and x < -KN_ZERO_TOLERANCE_M:
                    self.add(ERROR, "cross_curves.kn_m", cp + (i, j), _f(x),
                             "KN is negative: heeled to starboard, the centre of buoyancy moves to starboard "
                             "and up, so KN = y_B·cosφ + z_B·sinφ ≥ 0", where(i, j), "kn-negative")
                elif x > bound:
                    self.add(ERROR, "cross_curves.kn_m", cp + (i, j), _f(x),
                             f"longer than the distance from K to any buoyant point (√((B/2)² + (2·D)²) = {_f(bound)}): "
                             "a decimal point slipped?", where(i, j), "kn-envelope")
                else:
                    continue
                found = True
        if found:
            return  # the smooth-curve tests below would only repeat these

        # Rows no condition reads (below the lightship): their doubts would accompany every result
        # of the profile for nothing; their errors stay errors (KN_UNREACHED_WEIGHT).
        lightest = self.v.lightship.mass_t * self.rho / WATER_DENSITY_RANGE_T_M3[1]
        unreached = kn_unreached_rows(disp, lightest)

        # Small heel against KMt from the hydrostatic table at the same displacement.
        hd = h.displacement_t
        box = self.box_kn_table(heel, disp)
        done = False
        for i in range(len(disp)):
            if done or not hd[0] <= disp[i] <= hd[-1]:
                continue
            km = float(np.interp(disp[i], hd, h.kmt_m))
            for j in range(len(heel)):
                if not 0.0 < heel[j] <= 10.0:
                    continue
                ratio = float(kn[i, j]) / (km * math.sin(math.radians(float(heel[j]))))
                tol = KN_SMALL_ANGLE[5.0] if heel[j] <= 5.0 else KN_SMALL_ANGLE[10.0]
                off = abs(ratio - 1.0)
                allow, past = kn_kmt_allowance(box[i][j], self.B, heel[j])
                sev = (ERROR if off > KN_SMALL_ANGLE_ERROR + allow else WARNING if off > tol + allow else None)
                if sev == WARNING and i in unreached:
                    continue
                if sev:
                    self.add(sev, "cross_curves.kn_m", cp + (i, j), _f(float(kn[i, j])),
                             f"at small heel KN ≈ KMt·sinφ = {_f(km * math.sin(math.radians(float(heel[j]))))} "
                             f"(KMt {_f(km)} from the hydrostatic table): {off:.0%} apart"
                             + (f", beyond the {allow:.0%} a box of her breadth and depth departs here ({past})"
                                if allow > 0.0 else "")
                             + ("" if sev == ERROR or allow > 0.0 else
                                " (deck edge immersing or bilge emerging before this angle?)"), where(i, j), "kn-kmt")
                    done = True
                    break

        if self.kn_slips(heel, disp, kn, cp, where):
            return  # the outlier and lone-cell tests below would only name a cell of the same slip

        # Isolated outliers: an inner value far from the line between its neighbours, along
        # heel and along displacement.
        def resid(xs, ys, j, boxes):
            """(|value − line through its neighbours|, that as a fraction of the line's value, the
            allowance added to both :data:`KN_OUTLIER` fractions for a box's bend b there, as a
            fraction alike (:func:`kn_bend_allowance`): max(0, 2·b − 20 %), nothing while the box bends
            by 10 % or less (within what KN_OUTLIER was set for), the cell allowed twice the box's
            bend from 20 % up (continuous in b; a decimal slip is still 90 % beyond that))."""
            if j <= 0 or j >= len(xs) - 1:
                return None
            w = (xs[j] - xs[j - 1]) / (xs[j + 1] - xs[j - 1])
            line = ys[j - 1] + w * (ys[j + 1] - ys[j - 1])
            scale = max(abs(line), 0.05 * bound)  # near 0° the line is near zero: judge against 5 % of the envelope
            bend = kn_bend_allowance(boxes[j - 1:j + 2], w) / scale
            return abs(ys[j] - line), abs(ys[j] - line) / scale, max(0.0, 2.0 * bend - KN_OUTLIER[0])

        # A single slipped value also bends the lines through its neighbours (by half as much
        # at even spacing), so the value judged is the one that departs most in metres.
        wl, el = KN_OUTLIER
        worst = None
        for i in range(len(disp)):
            for j in range(1, len(heel)):
                both = [r for r in (resid(heel, kn[i, :], j, box[i]), resid(disp, kn[:, j], i, [b[j] for b in box]))
                        if r is not None]
                if not both:
                    continue
                metres = min(r[0] for r in both)
                frac, allow = min(((r[1], r[2]) for r in both), key=lambda fa: fa[0] - fa[1])
                if i in unreached and frac - allow <= el:
                    continue  # a doubt in a row no condition reads
                if frac - allow > wl and (worst is None or metres > worst[0]):
                    worst = (metres, frac, allow, i, j, len(both))
        if worst is not None:
            _, frac, allow, i, j, n = worst
            sev = ERROR if frac - allow > el else WARNING
            along = "heel and displacement" if n == 2 else "heel" if 0 < j < len(heel) - 1 else "displacement"
            self.add(sev, "cross_curves.kn_m", cp + (i, j), _f(float(kn[i, j])),
                     f"stands out of a smooth curve: {frac:.0%} away from the line through its neighbours along "
                     f"{along} (a shifted decimal point or a transposed digit?)"
                     + (f"; more than twice the {(allow + wl) / 2:.0%} a box of her breadth and depth bends there"
                        if allow > 0.0 else ""), where(i, j), "kn-outlier")
            return  # the lone-cell test below would name the same cell again

        # A lone mistyped cell along the heel (in each displacement's row) and along the
        # displacement (in each heel's column); a column typed with the next heel's values makes
        # its cell lone in every row, which is said.
        floor = _lone_floor("kn_m")
        every = [(i, lone_cell(heel, kn[i, :], floor)) for i in range(len(disp))]
        every = [(i, x) for i, x in every if x is not None]
        rows = [(i, x) for i, x in every if i not in unreached]  # a row no condition reads is not named...
        named = None
        if rows:
            i, (j, r, chord) = max(rows, key=lambda ix: abs(ix[1][1]))
            named = (i, j)
            alike = sum(1 for _, x in every if x[0] == j)  # ...but counts to tell a column slip
            guess = (f"the {heel[j]:g}° value stands out so in {alike} of the {len(disp)} rows: a column typed "
                     "with another heel's values?") if alike >= max(3, len(disp) // 2) else "a transposed or mistyped digit?"
            self.add(WARNING, "cross_curves.kn_m", cp + (i, j), _f(float(kn[i, j])),
                     _lone_why(r, chord, " m", " along the heel", guess), where(i, j), "kn-lone")
        cols = [(j, lone_cell(disp, kn[:, j], floor)) for j in range(len(heel))]
        cols = [(j, x) for j, x in cols if x is not None and (x[0], j) != named and x[0] not in unreached]
        if cols:
            j, (i, r, chord) = max(cols, key=lambda jx: abs(jx[1][1]))
            self.add(WARNING, "cross_curves.kn_m", cp + (i, j), _f(float(kn[i, j])),
                     _lone_why(r, chord, " m", " along the displacement"), where(i, j), "kn-lone")

    def kn_circle(self, heel, disp, kn) -> str | None:
        """Why a KN table whose rows are all alike is not a circular section's, or None when it is
        (:data:`KN_CIRCLE_KN_M`): KMt constant and KN = KMt·sinφ within the UR L5 tolerances."""
        h = self.v.hydrostatics
        hd = np.asarray(h.displacement_t, dtype=float)
        d = np.asarray(disp, dtype=float)
        inside = (d >= hd[0]) & (d <= hd[-1])
        if not bool(np.any(inside)):
            return "no row lies within the hydrostatic table to compare her KMt with"
        km = np.interp(d[inside], hd, h.kmt_m)
        mean = float(np.mean(km))
        rel, metres = KN_CIRCLE_KMT
        if float(np.max(np.abs(km - mean))) > min(rel * abs(mean), metres):
            return f"her KMt runs from {_f(float(np.min(km)))} to {_f(float(np.max(km)))} over those displacements"
        off = np.abs(np.asarray(kn, dtype=float)[0] - mean * np.sin(np.radians(np.asarray(heel, dtype=float))))
        j = int(np.argmax(off))
        if float(off[j]) > KN_CIRCLE_KN_M:
            return (f"at {heel[j]:g}° the rows hold {_f(float(kn[0][j]))}, not KMt·sinφ = "
                    f"{_f(mean * math.sin(math.radians(float(heel[j]))))} (KMt {_f(mean)})")
        return None

    def box_kn_table(self, heel, disp) -> list[list[tuple[float, int, float] | None]]:
        """(KN, regime, draft) of :func:`box_kn` for a box of her breadth and depth at each KN row's draft (read from the
        hydrostatic table at the row's displacement; None beyond it) and each tabulated heel."""
        h = self.v.hydrostatics
        hd = np.asarray(h.displacement_t, dtype=float)
        out = []
        for d in np.asarray(disp, dtype=float):
            if not hd[0] <= d <= hd[-1]:
                out.append([None] * len(heel))
                continue
            t = float(np.interp(d, hd, h.draft_m))
            out.append([None if b is None else (b[0], b[1], t)
                        for b in (box_kn(self.B, self.D, t, float(x)) for x in heel)])
        return out

    def kn_slips(self, heel, disp, kn, cp, where) -> bool:
        """Whole rows or columns of the KN table typed in the wrong place: a row repeating another
        row, two rows' values exchanged, a heel's column moved one displacement row down or up.
        Each is an ERROR: the printed table cannot be both right and smooth (the tolerances'
        docstrings: :data:`KN_ROW_REPEAT_M`, :data:`KN_SLIP_GAIN`).  True when rows were exchanged or a
        column moved: then every cell the later tests would name is part of that slip."""
        found = False
        heeled = int(np.flatnonzero(np.asarray(heel) > 0.0)[0]) if np.any(np.asarray(heel) > 0.0) else 0
        repeated = kn_repeated_rows(disp, kn, heel)
        if len(disp) >= 3 and len(repeated) == len(disp) * (len(disp) - 1) // 2:
            # Every row the same: no single row copied (KN_CIRCLE_KN_M).
            circle = self.kn_circle(heel, disp, kn)
            if circle is not None:
                self.add(ERROR, "cross_curves.kn_m", cp + (0, heeled), f"{len(disp)} rows alike",
                         "every row holds the same KN at every heel: KN independent of the displacement is the "
                         "circular section's alone (KN = R·sinφ with KMt = R at every draft), and " + circle
                         + " (the rows typed from one?)", "the booklet's KN cross curves table, every row", "kn-row-repeat")
            repeated = []
        for copy, original in repeated:
            self.add(ERROR, "cross_curves.kn_m", cp + (copy, heeled), f"row Δ {disp[copy]:.6g} t",
                     f"repeats the row at Δ {disp[original]:.6g} t at every heel: no two displacements have the "
                     "same KN at every heel (a row typed with another row's values?)",
                     f"the booklet's KN cross curves table, rows Δ {disp[copy]:.6g} t and {disp[original]:.6g} t",
                     "kn-row-repeat")
            # the copy stays where it was typed, so the tests below still judge the other cells
        swap = kn_swapped_rows(disp, kn)
        if swap is not None:
            i, gain = swap
            j = int(np.argmax(np.abs(np.asarray(kn[i]) - np.asarray(kn[i + 1]))))
            self.add(ERROR, "cross_curves.kn_m", cp + (i, j), f"rows Δ {disp[i]:.6g} t and {disp[i + 1]:.6g} t",
                     f"their values look exchanged: with the two rows swapped the table runs {gain:.0f} times "
                     "more smoothly along the displacement (KN at a fixed heel is a smooth curve of displacement)",
                     f"the booklet's KN cross curves table, rows Δ {disp[i]:.6g} t and {disp[i + 1]:.6g} t", "kn-row-swap")
            found = True
        shift = kn_shifted_column(heel, kn)
        if shift is not None:
            j, step, gain, rms = shift
            i = 1 if step == 1 else len(disp) - 2  # the first cell holding another row's value
            self.add(ERROR, "cross_curves.kn_m", cp + (i, j), f"the {heel[j]:g}° column",
                     f"typed one row {'down' if step == 1 else 'up'}: its values fit the heel curve of the row "
                     f"{'above' if step == 1 else 'below'} each ({gain:.0f} times better than their own; "
                     f"{rms:.3g} m off their own rows' curves on average), and KN at a fixed displacement is a "
                     f"smooth curve of heel; e.g. Δ {disp[i]:.6g} t holds {_f(float(kn[i, j]))}, "
                     f"the value of the row Δ {disp[i - step]:.6g} t",
                     f"the booklet's KN cross curves table, column {heel[j]:g}°", "kn-column-shift")
            found = True
        return found

    # ----------------------------------------------------------------- tanks
    def tanks(self):
        for i, t in enumerate(self.v.tanks):
            self.tank_fsi(i, t)
            self.tank_centres(i, t)
            self.tank_lone_fsm(i, t)
            self.tank_density(i, t)

    def tank_density(self, i: int, t: Tank):
        why = kind_density_note(t.kind, t.density_t_m3)
        if why is not None:
            self.add(WARNING, f"tank[{t.id}].density_t_m3", ("tank", i, "density_t_m3"), f"{t.density_t_m3:g} t/m³",
                     why, f"the booklet's tank list (tank {t.id})", "tank-density")

    def tank_lone_fsm(self, i: int, t: Tank):
        """A lone mistyped free-surface cell (an FSM typed a decimal place out in one row)."""
        cal = t.calibration
        fsi = cal.fsi_m4
        if not t.level_known or t.fsi_given == "max" or len(fsi) < 5:
            return
        top = float(np.max(fsi))
        lone = lone_cell(cal.volume_m3, fsi, lambda value: LONE_CELL_FSM_FRACTION * top)
        if lone is not None:
            k, departure_m4, chord_m4 = lone
            rho = t.density_t_m3  # told in t·m, as the booklet prints a tank's FSM
            self.add(WARNING, f"tank[{t.id}].calibration.fsi_m4", ("tank", i, "calibration", "fsi_m4", k),
                     f"{float(fsi[k]):.5g} m⁴ (FSM {float(fsi[k]) * rho:.4g} t·m) at sounding {cal.sounding_m[k]:.4g} m",
                     _lone_why(departure_m4 * rho, chord_m4 * rho, " t·m"),
                     f"the booklet's calibration table of tank {t.id} (free-surface column)", "tank-lone")

    def tank_fsi(self, i: int, t: Tank):
        cal = t.calibration
        s, v, fsi = cal.sounding_m, cal.volume_m3, cal.fsi_m4
        look = f"the booklet's calibration table of tank {t.id} (free-surface column)"
        if len(s) < 2 or not t.level_known:
            return  # a capacity-only tank has no levels, so no surface area to bound its FSM by
        areas = np.diff(v) / np.diff(s)  # mean free-surface area of each step (m²)
        constant = t.fsi_given == "max" or bool(np.all(fsi == fsi[0]))
        B = self.B
        for r in range(len(s)):
            if constant:
                area = float(np.max(areas))  # one value per tank: must fit the largest surface
            else:
                neigh = [areas[r - 1]] if r > 0 else []
                if r < len(areas):
                    neigh.append(areas[r])
                area = float(max(neigh))
            box = area * B * B / 12.0
            hard = FSI_AREA_FACTOR * area * B * B / 4.0
            x = float(fsi[r])
            sev = ERROR if x > hard else WARNING if x > FSI_BOX_ALLOWANCE * box else None
            if sev:
                empty = " (at the empty row)" if r == 0 and not constant else ""
                self.add(sev, f"tank[{t.id}].calibration.fsi_m4", ("tank", i, "calibration", "fsi_m4", r),
                         f"{x:.5g} m⁴ (FSM {x * t.density_t_m3:.4g} t·m at {t.density_t_m3:g} t/m³)",
                         f"above what the tank's own surface allows{empty}: its calibration gives a surface of "
                         f"{area:.4g} m², and "
                         + (f"no surface of even twice that area within the breadth {B:g} m exceeds "
                            f"2·A·B²/4 = {hard:.4g} m⁴" if sev == ERROR
                            else f"a box of that area {B:g} m wide has A·B²/12 = {box:.4g} m⁴"),
                         look, "tank-fsi")
                return
        if not constant and v[0] == 0 and fsi[0] > EMPTY_FSI_RISE * fsi[1] + 1e-9:
            self.add(WARNING, f"tank[{t.id}].calibration.fsi_m4", ("tank", i, "calibration", "fsi_m4", 0),
                     f"{float(fsi[0]):.5g} m⁴ at the empty row",
                     f"non-zero when empty and larger than just above ({float(fsi[1]):.5g} m⁴): an empty tank has no "
                     "free surface, and its bottom-most surface is no larger than the one above it", look, "tank-fsi-empty")

    def tank_centres(self, i: int, t: Tank):
        """The liquid added between two calibration rows lies inside the ship and inside its layer.

        Derived: between rows k−1 and k the added volume ΔV has its centroid at
        c_slab = (V_k·c_k − V_{k−1}·c_{k−1})/ΔV, which lies inside the hull (x, y), and
        between the two levels: z_bottom + s_{k−1} ≤ z_slab ≤ z_bottom + s_k, for one
        tank-bottom height z_bottom common to all rows.  Rounding of the printed centres
        (half a centimetre) and volumes (0.05 % of capacity) is allowed, amplified as the
        formula amplifies it.
        """
        cal = t.calibration
        s, V = cal.sounding_m, cal.volume_m3
        look = f"the booklet's calibration table of tank {t.id}"
        L, B = self.L, self.B
        if not t.level_known:
            return  # capacity and centre only: one fixed centre, no layers to check
        e, ev = CENTRE_ROUNDING_M, VOLUME_ROUNDING_REL * t.capacity_m3
        zb_lo, zb_hi = -math.inf, math.inf
        tp = ("tank", i, "calibration")
        for k in range(1, len(s)):
            dv = float(V[k] - V[k - 1])
            if dv <= 0:
                continue
            va, vb = float(V[k - 1]), float(V[k])
            for col in ("lcg_m", "tcg_m", "vcg_m"):
                arr = getattr(cal, col)
                ca, cb = float(arr[k - 1]), float(arr[k])
                slab = (vb * cb - va * ca) / dv
                tol = (va + vb) * e / dv + (abs(ca) + abs(cb)) * ev / dv
                key = f"tank[{t.id}].calibration.{col}"
                val = f"{_f(cb)} at sounding {s[k]:.4g} m"
                if col == "lcg_m" and not -ENVELOPE_X_FRACTION * L - tol <= slab <= (1 + ENVELOPE_X_FRACTION) * L + tol:
                    self.add(ERROR, key, tp + (col, k), val,
                             f"the liquid added from {s[k - 1]:.4g} to {s[k]:.4g} m would have its centre at x = {_f(slab)}, "
                             "outside the vessel: this centre or the one above it is mistyped", look, "tank-centre")
                    return
                if col == "tcg_m" and abs(slab) > B / 2 + tol:
                    self.add(ERROR, key, tp + (col, k), val,
                             f"the liquid added from {s[k - 1]:.4g} to {s[k]:.4g} m would have its centre at y = {_f(slab)}, "
                             "outside the breadth: this centre or the one above it is mistyped", look, "tank-centre")
                    return
                if col == "vcg_m":
                    lo = max(zb_lo, slab - float(s[k]) - tol, cb - float(s[k]) - e)
                    hi = min(zb_hi, slab - float(s[k - 1]) + tol, cb + e)
                    if lo > hi:
                        self.add(ERROR, key, tp + (col, k), val,
                                 f"the contents' centres leave the tank: the liquid added from {s[k - 1]:.4g} to "
                                 f"{s[k]:.4g} m would have its centre at {_f(slab)} above the keel, which no tank "
                                 "bottom height makes lie within that layer together with the rows below", look, "tank-centre")
                        return
                    zb_lo, zb_hi = lo, hi

    # ----------------------------------------------------------------- curves against displacement
    def curves(self):
        v = self.v
        h = v.hydrostatics
        light, top = v.lightship.mass_t, float(h.displacement_t[-1])
        for name, curve, look in (("limit_curve", v.limit_curve, "the booklet's limiting KG / GM curve"),
                                  ("downflooding", v.downflooding, "the booklet's downflooding angle curve")):
            if curve is None:
                continue
            d = curve.displacement_t
            if float(d[-1]) < light or float(d[0]) > top:
                drafts = " They look like drafts (m): a curve against draft typed as against displacement?" \
                    if float(d[-1]) <= self.D + 1e-9 else ""
                self.add(ERROR, f"{name}.displacement_t", (name, "displacement_t", 0),
                         f"{float(d[0]):.5g}–{float(d[-1]):.5g} t",
                         f"the curve lies wholly outside the displacements she can have (lightship {light:.5g} t to "
                         f"the table's {top:.5g} t): it can never be used{'.' + drafts if drafts else ''}", look,
                         "curve-range")
                continue
            angle = curve.kind == "downflooding_deg"
            unit = "°" if angle else " m"
            col = {"downflooding_deg": "angle_deg"}.get(curve.kind, curve.kind)  # the column's name in the file
            lone = lone_cell(d, curve.value, (lambda value: LONE_CELL_ANGLE_DEG) if angle else _lone_floor("limit_m"))
            if lone is not None:
                i, r, chord = lone
                self.add(WARNING, f"{name}.{col}", (name, col, i), f"{float(curve.value[i]):.5g}{unit} at "
                         f"{float(d[i]):.5g} t", _lone_why(r, chord, unit), look, "curve-lone")
        k = v.cross_curves
        if float(k.displacement_t[-1]) < float(h.displacement_t[0]) or float(k.displacement_t[0]) > top:
            self.add(ERROR, "cross_curves.displacement_t", ("cross_curves", "displacement_t", 0),
                     f"{float(k.displacement_t[0]):.5g}–{float(k.displacement_t[-1]):.5g} t",
                     f"no overlap with the hydrostatic table's {float(h.displacement_t[0]):.5g}–{top:.5g} t",
                     "the booklet's KN table (displacement column)", "curve-range")


    def limit_curve_attainable(self):
        """A limiting KG (or minimum GM) curve that no condition of hers can meet is impossible.
        Every weight added to the lightship lies above the keel, so a condition of displacement Δ
        has KG ≥ Δ_L·KG_L/Δ (Δ_L, KG_L her lightship's mass and KG; derived: the moment about the
        keel of what is added is never negative), and so GM ≤ KMt(Δ) − Δ_L·KG_L/Δ.  A maximum KG
        below that least KG, or a minimum GM above that greatest GM (at or above KMt itself, which
        would need G below the keel), fails every condition: an error, naming the likely slip (a GM
        curve typed as KG, or a KG curve typed as GM) where the values read the other way would
        be attainable.  Allowance :data:`LIMIT_CURVE_PRINT_M` for a curve printed to 0.01 m."""
        v, lc = self.v, self.v.limit_curve
        if lc is None or lc.kind not in ("max_kg_m", "min_gm_m"):
            return
        h, ls = v.hydrostatics, v.lightship
        col, bad = lc.kind, []
        for i, (d, value) in enumerate(zip((float(x) for x in lc.displacement_t), (float(x) for x in lc.value))):
            if not (ls.mass_t <= d and float(h.displacement_t[0]) <= d <= float(h.displacement_t[-1])):
                continue
            least_kg = ls.mass_t * ls.vcg_m / d
            kmt = float(np.interp(d, h.displacement_t, h.kmt_m))
            if col == "max_kg_m" and value < least_kg - LIMIT_CURVE_PRINT_M:
                bad.append((i, d, value, least_kg, kmt))
            elif col == "min_gm_m" and value > kmt - least_kg + LIMIT_CURVE_PRINT_M:
                bad.append((i, d, value, least_kg, kmt))
        if not bad:
            return
        i, d, value, least_kg, kmt = bad[0]
        n = len(lc.value)
        rows = f"{len(bad)} of its {n} rows" if len(bad) > 1 else f"1 of its {n} rows"
        basis = (f"no condition of hers at {d:.5g} t can have a KG below {_f(least_kg)} (lightship "
                 f"{ls.mass_t:.5g} t × KG {_f(ls.vcg_m)} ÷ {d:.5g} t: every weight added lies above the keel)")
        if col == "max_kg_m":
            why = f"the curve allows KG at most {_f(value)} at {d:.5g} t, yet {basis}"
            slip = (f" A minimum-GM curve typed under max_kg_m? (read as GM it would allow KG up to KMt "
                    f"{_f(kmt)} − {_f(value)} = {_f(kmt - value)})" if kmt - value >= least_kg else
                    " A row or the column mistyped?")
        else:
            above = " (at or above KMt: G below the keel)" if value >= kmt else ""
            why = (f"the curve asks GM at least {_f(value)} at {d:.5g} t{above}, yet her GM there is at most "
                   f"KMt {_f(kmt)} − {_f(least_kg)} = {_f(kmt - least_kg)}: {basis}")
            slip = (" A maximum-KG curve typed under min_gm_m?" if least_kg <= value <= kmt + LIMIT_CURVE_PRINT_M
                    else " A row or the column mistyped?")
        self.add(ERROR, f"limit_curve.{col}", ("limit_curve", col, i), f"{value:.5g} m at {d:.5g} t",
                 f"{why}; every condition would fail it ({rows}).{slip}",
                 "the booklet's limiting KG / GM curve (its heading: KG or GM)", "curve-unattainable")

    def limit_curve_against_kn(self):
        """A limiting KG (or minimum GM) curve is the least of what the intact and the damage
        criteria allow (IS 2008 A 2.1.7, standards.md §6.3), so at each of its displacements it
        can allow no higher KG than her own intact set (IS 2008 A 2.2, or the fishing or OSV set of
        Part B that takes its place) does on her KN tables: GZ(φ) = KN(φ) − KG·sinφ, θf from the
        profile's downflooding curve where it reaches (else the areas end at 40°, the kinder
        reading), GM = KMt − KG.  A row whose KG, lowered by :data:`LIMIT_CURVE_KG_MARGIN_M`, still
        fails a criterion of that set is a doubt: a row or column of the curve mistyped or shifted
        (the swaps and shifts that raise the allowed KG are the dangerous ones, and exactly these
        are caught; one that lowers it errs on the safe side and passes).  A warning, not an error:
        the booklet's curve may rest on assumptions the tables do not hold (trim, openings).
        The criteria on the angle of maximum GZ are left out (:data:`LIMIT_CURVE_UNJUDGED`)."""
        v, lc = self.v, self.v.limit_curve
        if lc is None or lc.kind not in ("max_kg_m", "min_gm_m"):
            return
        cs = v.criteria
        sid = SETS_BY_TYPE[cs.ship_type][0]
        fishing_gm = reduced_fishing_gm_m(cs.ship_type, cs.min_gm_m)
        h, kc, fl = v.hydrostatics, v.cross_curves, v.downflooding
        lo = max(float(h.displacement_t[0]), float(kc.displacement_t[0]))
        hi = min(float(h.displacement_t[-1]), float(kc.displacement_t[-1]))
        col = lc.kind
        for i, (d, value) in enumerate(zip((float(x) for x in lc.displacement_t), (float(x) for x in lc.value))):
            if not lo <= d <= hi:
                continue
            kmt = float(np.interp(d, h.displacement_t, h.kmt_m))
            with np.errstate(all="ignore"):  # KN rows a hair apart: not read here (the calculation refuses)
                kn = gzmod.kn_curve(kc, d)
            sin = gzmod.SIN[:len(kn)]
            if not (math.isfinite(kmt) and bool(np.all(np.isfinite(kn)))):
                continue
            flood = curve_limit(fl, d)  # θf as the calculation reads it; None off the curve

            def failed(kg: float):
                gz = kn - kg * sin
                with np.errstate(all="ignore"):  # a KN table the other checks refuse may hold anything
                    measures = curve_measures(gz, gzmod.facts(gz), flood, kmt - kg)
                if not all(math.isfinite(x) for x in dataclasses.astuple(measures)):
                    return []  # nothing to judge by: the other checks name what is wrong
                rows = evaluate_criteria(sid, measures, cs.min_gm_m, fishing_gm_m=fishing_gm)
                return [r for r in rows if not r.passed and not r.id.endswith(LIMIT_CURVE_UNJUDGED)]

            kg = value if col == "max_kg_m" else kmt - value
            bad = failed(kg - LIMIT_CURVE_KG_MARGIN_M)
            if not bad:
                continue
            # the highest KG the set allows here, by bisection (a fixed 30 halvings of a span under
            # KMt: below a micrometre), for the officer to compare with the booklet
            top, low = kg - LIMIT_CURVE_KG_MARGIN_M, kmt - 2.0 * max(self.B, self.D)
            allowed = None
            if not failed(low):
                for _ in range(30):
                    mid = 0.5 * (top + low)
                    top, low = (mid, low) if failed(mid) else (top, mid)
                allowed = low
            c = bad[0]
            said = f"KG {_f(kg)}" if col == "max_kg_m" else f"GM {_f(value)} (KG {_f(kg)} with KMt {_f(kmt)})"
            most = (f"; her tables allow KG {_f(allowed)} at most there" if allowed is not None
                    else "; no KG meets it there")
            self.add(WARNING, f"limit_curve.{col}", ("limit_curve", col, i), f"{value:.5g} m at {d:.5g} t",
                     f"the curve allows {said}, yet even {LIMIT_CURVE_KG_MARGIN_M:g} m lower her KN tables fail "
                     f"{SET_TITLES[sid]}: {c.description} {c.value:.4g} against {c.limit:.4g}{most}. A limiting "
                     "curve lies at or below what the intact criteria allow: a row or column of the curve "
                     "mistyped or shifted?", "the booklet's limiting KG / GM curve", "curve-above-criteria")


def _trim_name(trim: float) -> str:
    """The trim in a table's name: six significant digits, rounded to the micrometre first."""
    return f"{round(float(trim), 6):.6g}"


def trim_table_name(kind: str, trim: float) -> str:
    """How a table at a trim is named (``hydrostatics_at_trim[1 m]``): the audit's keys, the reader's
    tables as read, ``deckload csv``'s files."""
    return f"{kind}[{_trim_name(trim)} m]"


def _trimmed_tables(a: _Audit) -> None:
    """Every table at a trim gets every check of its even-keel counterpart, with the same tolerances.

    The checks hold at a fixed trim as they do at even keel: a layer added at fixed trim lies at
    the waterplane's centre (LCB from LCF, Δ from TPC), and KB rises with the mean draft; only the
    waterline's height at the deeper end grows by |t|/2 (the VCB bound).  Findings are named by the
    table's key (``hydrostatics_at_trim[1 m].lcb_m``) and located at its entry.
    """
    v = a.v
    tt = v.trimmed
    if tt is None:
        return
    by_trim = dict(zip((float(t) for t in tt.hydro_trim_m), tt.hydrostatics))
    for key, trims, tables, even in (("hydrostatics_at_trim", tt.hydro_trim_m, tt.hydrostatics, v.hydrostatics),
                                     ("cross_curves_at_trim", tt.kn_trim_m, tt.cross_curves, v.cross_curves)):
        entry = 0
        for trim, table in zip(trims, tables):
            if table is even:
                continue  # the even-keel table, judged as [hydrostatics] / [cross_curves]
            t = float(trim)
            if key == "hydrostatics_at_trim":
                sub = _Audit(dataclasses.replace(v, hydrostatics=table))
                sub.half_trim_m = abs(t) / 2.0
                sub.hydrostatics()
                old = "hydrostatics"
            else:
                sub = _Audit(dataclasses.replace(v, cross_curves=table, hydrostatics=by_trim.get(t, v.hydrostatics)))
                sub.cross_curves()
                old = "cross_curves"
            name = trim_table_name(key, t)
            for f in sub.out:
                a.out.append(dataclasses.replace(
                    f, key=name + f.key[len(old):], path=(key, entry) + tuple(f.path[1:]),
                    look=f"{f.look} at trim {t:+g} m"))
            entry += 1


TRIM_LCB_TOLERANCE_M = 0.01
TRIM_LCB_TOLERANCE_LBP = 0.0005
"""A pair of tables at two trims is judged only where LCB at one displacement differs between them
by more than max(1 cm, 0.05 % of LBP): LCB is printed to the centimetre or finer, and read between
rows linearly (common practice).  The signal is far larger: on a box BML·δt/L = L·δt/(12·T)
(below), 0.74 m for 1 m of trim on L 40 m at T 4.5 m; 3 cm for 10 cm of trim on L 20 m at T 5 m."""


def _trim_lcb_moves(trims, tables) -> list[tuple[int, np.ndarray, np.ndarray]]:
    """For each two neighbouring trims t_i < t_(i+1) whose tables share displacements: (i, the
    displacements, LCB at t_(i+1) − LCB at t_i there), at every tabulated displacement of either
    table within both, each table read linearly between its rows (as the tables are used)."""
    out = []
    for i in range(len(trims) - 1):
        a, b = tables[i], tables[i + 1]
        lo = max(float(a.displacement_t[0]), float(b.displacement_t[0]))
        hi = min(float(a.displacement_t[-1]), float(b.displacement_t[-1]))
        if not lo < hi:
            continue
        disp = np.union1d(a.displacement_t, b.displacement_t)
        disp = disp[(disp >= lo) & (disp <= hi)]
        out.append((i, disp, np.interp(disp, b.displacement_t, b.lcb_m) - np.interp(disp, a.displacement_t, a.lcb_m)))
    return out


def _trim_sign(a: _Audit) -> None:
    """Tables at trims whose trims have the wrong sign: at one displacement, LCB must lie further
    aft at the larger trim by the stern.

    Derived: trim the ship by a small δt (+ by the stern, angle δψ = δt/L) about the centre of
    flotation at constant displacement.  The wedge immersed abaft the LCF and the wedge emerged
    forward of it hold equal volumes, and their moment about the LCF (x + forward) is
    ∫ x·(−x·δψ) dA = −I_L·δψ, I_L the waterplane's longitudinal second moment about the LCF.  B moves
    by that moment over the volume ∇: δLCB = −I_L·δψ/∇ = −BML·δt/L.  I_L > 0 for any waterplane, so
    at a fixed displacement LCB moves aft as the trim by the stern grows, at every trim, and so over
    any finite step too.  (The box of tests/trimmed_box.py: LCB(t) = L/2 − L·t/(12·T), BML = L²/(12·T).)

    Each two neighbouring trims of the hydrostatic set (the even-keel table at 0 among them) with
    displacements in common are compared: a pair runs the right way where LCB is further aft at the
    larger trim at every displacement they share, the wrong way where it is further forward at every
    one, each by more than the tolerance (:data:`TRIM_LCB_TOLERANCE_M`, :data:`TRIM_LCB_TOLERANCE_LBP`);
    else it is not judged.  No pair the right way and some the wrong way: the trims were typed + by
    the head (the booklet's sign), an error naming the key that says so.  Some pairs each way: an
    error naming each table of a wrong pair.  Not judged: fewer than two trims or no displacements
    in common.
    """
    tt = a.v.trimmed
    if tt is None or len(tt.hydro_trim_m) < 2:
        return
    trims = [float(t) for t in tt.hydro_trim_m]
    tables = tt.hydrostatics
    tol = max(TRIM_LCB_TOLERANCE_M, TRIM_LCB_TOLERANCE_LBP * a.L)
    moves = _trim_lcb_moves(trims, tables)
    wrong = [(i, disp, d) for i, disp, d in moves if np.min(d) > tol]
    right = [i for i, _, d in moves if np.max(d) < -tol]
    if not wrong:
        return
    even = a.v.hydrostatics
    entries = [k for k, table in enumerate(tables) if table is not even]

    def name(k: int) -> str:
        return "hydrostatics" if tables[k] is even else trim_table_name("hydrostatics_at_trim", trims[k])

    def path(k: int) -> tuple:
        return ("hydrostatics",) if tables[k] is even else ("hydrostatics_at_trim", entries.index(k), "trim_m")

    def moved(i: int, disp, d) -> str:
        r = int(np.argmin(d))
        return (f"from {disp[0]:.6g} to {disp[-1]:.6g} t LCB lies further forward at {trims[i + 1]:+g} m than at "
                f"{trims[i]:+g} m (by {_f(float(d[r]))} at {disp[r]:.6g} t, the least)")

    look = "the booklet's hydrostatic tables at trims and the way it counts trim (by the head or by the stern)"
    physics = "trimming by the stern at constant displacement moves the centre of buoyancy aft"
    if not right:
        i, disp, d = wrong[0]
        names = ", ".join(name(k) for k in entries)
        a.add(ERROR, "hydrostatics_at_trim.trim_m", path(entries[0]), ", ".join(f"{trims[k]:+g}" for k in entries) + " m",
              f"in every pair of neighbouring trims judged LCB lies further forward at the larger trim by the stern "
              f"({names}; {moved(i, disp, d)}), but {physics}: the trims look typed + by the head.  If the booklet "
              'counts trim by the head as positive, say so with trim_positive = "head" in [vessel] (or in each '
              "table at a trim); else turn the trims' sign", look, "trim-sign")
        return
    for i, disp, d in wrong:
        k = i + 1 if tables[i + 1] is not even else i
        a.add(ERROR, f"{name(k)}.trim_m", path(k), f"{trims[k]:+g} m",
              f"{moved(i, disp, d)} ({name(i + 1)} against {name(i)}), but {physics}, as it does between the "
              "other trims: this table's trim has the wrong sign, or its rows are another trim's", look, "trim-sign")


def _free_surface_settings(a: _Audit) -> None:
    """A warning for each ``[free_surface]`` setting that leaves out a moment IS 2008 B 3.1 counts
    (:func:`deckload.core.free_surface.settings_departures`): nominally full below 98 %, a small-tank
    limit above 0.01 m, an empty level above 0.5 %.  A doubt, not a contradiction: Part B is
    recommendatory, and the Administration may have accepted the setting for this ship."""
    fs = a.v.free_surface
    # judged under the Part B 3.1 rule: a condition may choose it whatever the profile's rule
    for key, words in settings_departures(fs, "is2008"):
        a.add(WARNING, f"free_surface.{key}", ("free_surface", key), _f(getattr(fs, key), "m" if key.endswith("_m") else "%"),
              "departs from the Code on the side that leaves out free surface: " + words
              + "; every result says so", "the booklet's free-surface notes and the Administration's acceptance",
              "fs-setting")


TYPE_WORDS: tuple[tuple[str, str, tuple[str, ...]], ...] = (
    ("fishing", "a fishing vessel", ("fishing", "fishery", "trawler", "trawlers", "seiner", "seiners",
                                     "longliner", "longliners", "long liner", "long liners")),
    ("passenger", "a passenger ship", ("passenger", "passengers", "ferry", "ferries")),
    ("offshore_supply", "an offshore supply vessel", ("offshore supply", "osv", "psv", "platform supply")),
)
"""Words of ``[vessel] vessel_type`` (whole words, any case) that name a ``ship_type``: the trade's
names of the kinds (common practice); a hyphen reads as a space.  'supply' alone does not: an island-supply vessel is a cargo ship."""


def _type_words(a: _Audit) -> None:
    """A warning when the free-text ``vessel_type`` names a kind of ship (:data:`TYPE_WORDS`) and
    ``[criteria] ship_type`` is none of the kinds it names: the sets are chosen by ship_type alone, so
    a trawler typed without it is judged by the general criteria (GM0 0.15 m where IS 2008 Part B 2.1
    asks 0.35 m, standards.md §3.2 [M]).  A doubt: the words are free and may mean something else."""
    text = a.v.particulars.vessel_type
    spaced = " " + " ".join("".join(c if c.isalnum() else " " for c in text.lower()).split()) + " "
    named = [(kind, words) for kind, words, phrases in TYPE_WORDS if any(f" {w} " in spaced for w in phrases)]
    in_force = a.v.criteria.ship_type
    if not named or any(kind == in_force for kind, _ in named):
        return
    kind, words = named[0]

    def sets(st: str, other: str) -> str:  # the sets one type has and the other lacks
        return " + ".join(SET_TITLES[sid] for sid in SETS_BY_TYPE[st] if sid not in SETS_BY_TYPE[other])

    ours, theirs = sets(in_force, kind), sets(kind, in_force)
    judged = f"by {ours}, not {theirs}" if ours else f"without {theirs}"
    a.add(WARNING, "vessel.vessel_type", ("vessel", "vessel_type"), repr(text),
          f"names {words}, but criteria.ship_type is {in_force!r} ('general' where not given), so she is judged "
          f'{judged}; if she is {words}, give [criteria] ship_type = "{kind}"',
          "the booklet's criteria and the vessel's certificates", "ship-type-words")


def audit(vessel: Vessel) -> tuple[Finding, ...]:
    """Every plausibility finding on ``vessel``, errors first, each group in profile order."""
    a = _Audit(vessel)
    _type_words(a)
    a.positions()
    a.lightship_trim()
    a.lightship_share()
    a.pairs()
    a.hydrostatics()
    a.cross_curves()
    _trimmed_tables(a)
    _trim_sign(a)
    a.tanks()
    _free_surface_settings(a)
    a.curves()
    a.limit_curve_attainable()
    a.limit_curve_against_kn()
    return tuple(sorted(a.out, key=lambda f: 0 if f.severity == ERROR else 1))


def has_errors(findings) -> bool:
    return any(f.severity == ERROR for f in findings)
