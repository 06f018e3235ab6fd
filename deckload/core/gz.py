"""The GZ (righting lever) curve from the KN cross curves, and what is read off it.

GZ(φ) = KN(φ) − KG·sinφ − TCG·cosφ for heel to starboard (checks.md conventions;
standards.md §6.3).  KN at the actual displacement is interpolated between the
tabulated displacements by a not-a-knot cubic spline in displacement, then a natural cubic spline through the tabulated heel
angles gives KN at any angle.  The curve is evaluated on a fine grid (0.1°) so that
areas, the maximum and the crossing angles carry no coarse-grid error of their own;
areas are integrated in radians (1 rad = 57.2958°) by the trapezoidal rule on that
grid.
"""

from __future__ import annotations

import math
from functools import lru_cache

import numpy as np

from deckload.core.frozen import frozen
from deckload.core.model import CrossCurves
from deckload.core.tables import CubicSpline, OutOfRangeError, bracket, lerp_row

STEP_DEG = 0.1
FINE_DEG = np.round(np.arange(0.0, 90.0 + STEP_DEG / 2, STEP_DEG), 10)
FINE_RAD = np.radians(FINE_DEG)
SIN = np.sin(FINE_RAD)
COS = np.cos(FINE_RAD)
WHOLE_DEGREES = slice(0, None, int(round(1.0 / STEP_DEG)))


def kn_row(cc: CrossCurves, table_displacement_t: float) -> np.ndarray:
    """KN (m) at the tabulated heels for a displacement (table density), never extrapolated.

    Between tabulated displacements each heel column is interpolated by a not-a-knot
    cubic spline in displacement (:class:`~deckload.core.tables.CubicSpline`), which
    keeps the curvature of KN against displacement that a straight line between rows
    cuts off (tests/test_reference_kn_interpolation.py).  On a row it returns the row.
    """
    i, f = bracket(cc.displacement_t, table_displacement_t, "displacement (KN cross curves, at table density)", "t")
    if f == 0.0 or f == 1.0 or len(cc.displacement_t) == 2:
        return lerp_row(cc.kn_m, i, f)
    return _displacement_spline(cc)(float(table_displacement_t))


@lru_cache(maxsize=256)
def _displacement_spline(cc: CrossCurves) -> CubicSpline:
    """The not-a-knot spline of every heel column against displacement: it depends on the table
    alone (``CrossCurves`` compares as itself and is immutable), so it is fitted once, not at
    every evaluation (a linear solve as large as the table has rows)."""
    return CubicSpline.fit(cc.displacement_t, cc.kn_m, end="not-a-knot")


def kn_curve(cc: CrossCurves, table_displacement_t: float) -> np.ndarray:
    """KN (m) on the fine heel grid at a displacement (table density), up to the table's last angle."""
    return heel_curve(cc, kn_row(cc, table_displacement_t))


def heel_curve(cc: CrossCurves, row: np.ndarray) -> np.ndarray:
    """KN (m) on the fine heel grid from one row at ``cc``'s heels: a natural cubic spline in heel.

    The spline's value at any angle is linear in the row it goes through (its second derivatives
    solve a linear system whose right-hand side is linear in the row), so the fine grid is
    ``W @ row`` with ``W`` the spline of each unit row on the grid (:func:`_heel_weights`): one
    product at each evaluation, the same curve to rounding."""
    if cc.heel_deg[0] != 0.0:
        # The profile validation requires the table to start upright; refuse rather than extrapolate.
        raise OutOfRangeError("heel (KN cross curves)", 0.0, float(cc.heel_deg[0]), float(cc.heel_deg[-1]), "deg")
    return _heel_weights(cc) @ np.asarray(row, dtype=float)


@lru_cache(maxsize=256)
def _heel_weights(cc: CrossCurves) -> np.ndarray:
    """``W`` (fine-grid points × tabulated heels) with column j the natural spline through the
    unit row e_j evaluated on the fine grid (:class:`~deckload.core.tables.CubicSpline` splines
    each column of a 2-D ``y`` on the same knots): made once per table."""
    n = len(cc.heel_deg)
    weights = CubicSpline.fit(cc.heel_deg, np.eye(n))(FINE_DEG[: grid_points(cc)])
    weights.flags.writeable = False
    return weights


def pchip_curve(heel_deg: np.ndarray, row: np.ndarray, n: int) -> np.ndarray:
    """KN (m) on the first ``n`` points of the fine grid by a shape-preserving piecewise cubic (PCHIP)
    through the same tabulated row: the second opinion on the natural spline between the table's heels.

    Hermite cubics on each interval with slopes by Fritsch & Carlson's method (*SIAM J. Numer. Anal.*
    17, 1980) as Fritsch & Butland give it: at an inner knot the weighted harmonic mean of the two
    secants, w₁ = 2h_k + h_{k−1}, w₂ = h_k + 2h_{k−1}, d = (w₁ + w₂)/(w₁/Δ_{k−1} + w₂/Δ_k), and 0 where
    the secants differ in sign or either is 0; at an end the three-point formula
    ((2h₀ + h₁)Δ₀ − h₀Δ₁)/(h₀ + h₁), set to 0 when its sign is not Δ₀'s and to 3Δ₀ when the secants
    differ in sign and it exceeds that.  The curve keeps the data's monotone runs and never overshoots
    them, where the spline rounds a peak off; it is the construction of scipy's PchipInterpolator
    (tests/test_interpolation_margin.py compares them).  The slopes are not linear in the row and are
    worked at each call (plain floats: a table has a dozen or two heels); the curve is then one
    product with the Hermite basis of the table's heels (:func:`_hermite_weights`, made once).
    """
    x = tuple(float(v) for v in heel_deg)
    y = np.asarray(row, dtype=float)
    yl = y.tolist()
    # a dozen or two knots: the slopes in plain floats cost less than numpy's per-call overhead
    h = [b - a for a, b in zip(x, x[1:])]
    d = [(q - p) / w for p, q, w in zip(yl, yl[1:], h)]
    if len(x) == 2:
        m = [d[0], d[0]]
    else:
        m = [_pchip_end(h[0], h[1], d[0], d[1])]
        for k in range(1, len(x) - 1):
            d0, d1, h0, h1 = d[k - 1], d[k], h[k - 1], h[k]
            if d0 * d1 > 0.0:
                w1, w2 = 2.0 * h1 + h0, h1 + 2.0 * h0
                m.append((w1 + w2) / (w1 / d0 + w2 / d1))
            else:
                m.append(0.0)
        m.append(_pchip_end(h[-1], h[-2], d[-1], d[-2]))
    return _hermite_weights(x, n) @ np.concatenate((y, np.asarray(m)))


@lru_cache(maxsize=256)
def _hermite_weights(heel_deg: tuple[float, ...], n: int) -> np.ndarray:
    """``W`` (first ``n`` fine-grid points × 2·knots): the cubic Hermite interpolant through values
    y and slopes m at the knots is ``W @ [y, m]`` on the grid.  It depends on the heels alone: made
    once per table, as the spline's weights are (:func:`_heel_weights`)."""
    x = np.asarray(heel_deg)
    k = len(x)
    xq = FINE_DEG[:n]
    i = np.clip(np.searchsorted(x, xq, side="right") - 1, 0, k - 2)
    hi = x[i + 1] - x[i]
    t = (xq - x[i]) / hi
    t2, t3 = t * t, t * t * t
    w = np.zeros((n, 2 * k))
    rows = np.arange(n)
    w[rows, i] = 2 * t3 - 3 * t2 + 1
    w[rows, i + 1] = -2 * t3 + 3 * t2
    w[rows, k + i] = (t3 - 2 * t2 + t) * hi
    w[rows, k + i + 1] = (t3 - t2) * hi
    w.flags.writeable = False
    return w


def _pchip_end(h0: float, h1: float, d0: float, d1: float) -> float:
    """The end slope of :func:`pchip_curve` (three-point formula, kept to the end secant's sign)."""
    s = ((2.0 * h0 + h1) * d0 - h0 * d1) / (h0 + h1)
    if _sign(s) != _sign(d0):
        return 0.0
    if _sign(d0) != _sign(d1) and abs(s) > abs(3.0 * d0):
        return 3.0 * d0
    return s


def _sign(v: float) -> int:
    return (v > 0.0) - (v < 0.0)


def max_band(gz: np.ndarray, heel_deg: np.ndarray, spread_m: np.ndarray) -> tuple[float, float, float] | None:
    """(lowest, highest angle, ε): the run of the fine grid around the maximum of ``gz`` where GZ comes
    within ε of its top, ε the largest ``spread_m`` (the two interpolations' difference) over the
    tabulated intervals that touch the maximum; None when GZ is nowhere positive.

    The angle of maximum GZ is read where the curve is flat, so a small error in GZ moves it far (a
    parabola's top: δθ = √(2ε/|GZ''|), derived).  With GZ known to ε between the table's heels, the
    maximum may lie anywhere the curve comes within ε of its top: the criterion on its angle is decided
    only when the whole run lies on one side of the limit."""
    k = int(np.argmax(gz))
    top = float(gz[k])
    if not top > 0.0:
        return None
    theta = float(FINE_DEG[k])
    x = np.asarray(heel_deg, dtype=float)
    lo_knot = float(x[max(int(np.searchsorted(x, theta, side="left")) - 1, 0)])
    hi_knot = float(x[min(int(np.searchsorted(x, theta, side="right")), len(x) - 1)])
    a, b = int(round(lo_knot / STEP_DEG)), min(int(round(hi_knot / STEP_DEG)), len(gz) - 1)
    eps = float(np.max(np.abs(spread_m[a : b + 1])))
    near = gz >= top - eps
    below_left = np.flatnonzero(~near[:k])
    below_right = np.flatnonzero(~near[k:])
    left = int(below_left[-1]) + 1 if len(below_left) else 0
    right = k + int(below_right[0]) - 1 if len(below_right) else len(gz) - 1
    return float(FINE_DEG[left]), float(FINE_DEG[right]), eps


def grid_points(cc: CrossCurves) -> int:
    """Points of the fine grid the KN table covers: 0° up to its last tabulated angle.

    A booklet's cross curves may stop before 90° (e.g. at 60°): the curve, its areas
    and its plot then stop there too; nothing is extrapolated.  Every array the
    caller builds on the grid is cut to this length (``SIN[:n]``, ``COS[:n]``, ...).
    """
    return int(math.floor(float(cc.heel_deg[-1]) / STEP_DEG + 1e-6)) + 1


@frozen
class CurveFacts:
    """What the criteria need from a GZ curve (angles in degrees, areas in m·rad)."""

    max_gz_m: float
    max_gz_angle_deg: float
    vanishing_angle_deg: float | None
    equilibrium_deg: float | None
    """First angle where GZ = 0 going up from 0° (0 for an upright ship with GM > 0); None when GZ
    never becomes positive on the curve: no position of equilibrium up to its last angle."""


def area_to(gz: np.ndarray, angle_deg: float) -> float:
    """Area under GZ from 0 to ``angle_deg`` (m·rad), trapezoidal on the fine grid."""
    if angle_deg <= 0.0:
        return 0.0
    if angle_deg > FINE_DEG[len(gz) - 1] + 1e-9:  # a short curve (KN ending before 90°): never extrapolate
        raise OutOfRangeError("heel (GZ curve area)", angle_deg, 0.0, float(FINE_DEG[len(gz) - 1]), "deg")
    k = min(int(angle_deg / STEP_DEG), len(gz) - 2)
    full = float(np.sum(gz[1 : k + 1] + gz[:k]) * 0.5 * math.radians(STEP_DEG))
    # Partial last panel, linear GZ inside it.
    rem = math.radians(angle_deg - FINE_DEG[k])
    if rem > 0.0:
        g0 = gz[k]
        g1 = gz[k] + (gz[k + 1] - gz[k]) * (angle_deg - FINE_DEG[k]) / STEP_DEG
        full += 0.5 * (g0 + g1) * rem
    return full


def _crossing(gz: np.ndarray, start: int, rising: bool) -> float | None:
    """First angle at or after index ``start`` where GZ crosses zero (rising or falling)."""
    seg = gz[start:]
    s = np.signbit(seg)
    if rising:
        idx = np.nonzero(s[:-1] & ~s[1:])[0]
    else:
        idx = np.nonzero(~s[:-1] & s[1:])[0]
    if len(idx) == 0:
        return None
    k = start + int(idx[0])
    g0, g1 = gz[k], gz[k + 1]
    return float(FINE_DEG[k] + STEP_DEG * g0 / (g0 - g1))


def facts(gz: np.ndarray) -> CurveFacts:
    """Maximum (refined by a parabola through the three best grid points), equilibrium and vanishing angle."""
    k = int(np.argmax(gz))
    angle = float(FINE_DEG[k])
    gmax = float(gz[k])
    if 0 < k < len(gz) - 1:
        a, b, c = gz[k - 1], gz[k], gz[k + 1]
        den = a - 2 * b + c
        if den < 0:
            off = 0.5 * (a - c) / den
            angle += off * STEP_DEG
            gmax = float(b - 0.25 * (a - c) * off)
    if gz[0] < 0 or (gz[0] == 0 and gz[1] < 0):
        equilibrium = _crossing(gz, 0, rising=True)
    else:
        equilibrium = 0.0
    if equilibrium is None:  # GZ never positive: nothing vanishes either
        return CurveFacts(float(gmax), float(angle), None, None)
    start = max(k, int(round(equilibrium / STEP_DEG)))
    vanish = _crossing(gz, start, rising=False) if gmax > 0 else None
    return CurveFacts(float(gmax), float(angle), None if vanish is None else float(vanish), float(equilibrium))
