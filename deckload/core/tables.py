"""Table look-up for the vessel's tabulated data.

Every look-up refuses to extrapolate: a value outside the tabulated range raises
:class:`OutOfRangeError`, which names the quantity, the value asked for and the
valid range.  Hydrostatic and tank tables are interpolated linearly, which is the
method the stability instrument guidance assumes for tabulated booklet data
(MSC.1/Circ.1229 4.5: results from pre-programmed tables are compared "except for
rounding"; linear interpolation between booklet rows is common practice).
"""

from __future__ import annotations

import math

import numpy as np

from deckload.core.frozen import frozen


class OutOfRangeError(ValueError):
    """A look-up fell outside the table: nothing is extrapolated."""

    def __init__(self, quantity: str, value: float, low: float, high: float, unit: str = ""):
        self.quantity = quantity
        self.value = value
        self.low = low
        self.high = high
        self.unit = unit
        u = f" {unit}" if unit else ""
        super().__init__(
            f"{quantity} {value:.4g}{u} is outside the table range "
            f"{low:.4g}–{high:.4g}{u}; deckload does not extrapolate"
        )


def bracket(xs: np.ndarray, x: float, quantity: str, unit: str = "") -> tuple[int, float]:
    """Return ``(i, f)`` with ``x = xs[i] + f·(xs[i+1] − xs[i])``, 0 ≤ f ≤ 1.

    ``xs`` must be strictly increasing (the profile validation guarantees it).
    A value within 1e-9·max(1, |xs[0]|, |xs[-1]|) of an end is clamped onto it so that round-off in a sum
    of masses never turns an exact table end into an error.
    """
    lo = float(xs[0])
    hi = float(xs[-1])
    tol = 1e-9 * max(1.0, abs(lo), abs(hi))
    if not (lo - tol <= x <= hi + tol) or math.isnan(x):
        raise OutOfRangeError(quantity, x, lo, hi, unit)
    if x <= lo:
        return 0, 0.0
    if x >= hi:
        return len(xs) - 2, 1.0
    i = int(np.searchsorted(xs, x, side="right")) - 1
    x0 = float(xs[i])
    return i, (x - x0) / (float(xs[i + 1]) - x0)


def lerp_row(table: np.ndarray, i: int, f: float) -> np.ndarray:
    """Linear blend of rows ``i`` and ``i+1`` of a table (a 1-D column gives a number)."""
    return table[i] * (1.0 - f) + table[i + 1] * f


def interp(xs: np.ndarray, ys: np.ndarray, x: float, quantity: str, unit: str = "") -> float:
    """Linear interpolation of ``ys`` at ``x`` with the range check of :func:`bracket`."""
    i, f = bracket(xs, x, quantity, unit)
    return float(lerp_row(ys, i, f))


@frozen
class CubicSpline:
    """Cubic spline through (x, y), for smooth curves such as KN against heel or displacement.

    Standard construction: second derivatives M_i solve the tridiagonal system
    h_{i-1}·M_{i-1} + 2(h_{i-1}+h_i)·M_i + h_i·M_{i+1} = 6·(Δ_i − Δ_{i-1}), closed by
    either M_0 = M_n = 0 (``end="natural"``, Burden & Faires, *Numerical Analysis*, §3.5:
    right for KN against heel, an odd function of φ with KN''(0) = 0) or by a continuous
    third derivative at the second and the last-but-one knots (``end="not-a-knot"``,
    de Boor, *A Practical Guide to Splines*, ch. IV: for curves whose ends are curved, such
    as KN against displacement, where the natural condition would flatten the end
    intervals).  With three knots not-a-knot is the parabola through them, with two the
    straight line.  ``y`` may be 2-D: each column is splined on the same knots.
    """

    x: np.ndarray
    y: np.ndarray
    m: np.ndarray  # second derivatives at the knots

    @staticmethod
    def fit(x: np.ndarray, y: np.ndarray, end: str = "natural") -> "CubicSpline":
        x = np.asarray(x, dtype=float)
        y = np.asarray(y, dtype=float)
        n = len(x)
        h = np.diff(x)
        m = np.zeros_like(y)
        if end == "not-a-knot" and n == 3:
            d = np.diff(y, axis=0) / (h if y.ndim == 1 else h[:, None])
            m[:] = 2.0 * (d[1] - d[0]) / (x[2] - x[0])
        elif end == "not-a-knot" and n > 3:
            d = np.diff(y, axis=0) / (h if y.ndim == 1 else h[:, None])
            a = np.zeros((n, n))
            rhs = np.zeros((n,) + y.shape[1:])
            for i in range(1, n - 1):
                a[i, i - 1], a[i, i], a[i, i + 1] = h[i - 1], 2.0 * (h[i - 1] + h[i]), h[i]
                rhs[i] = 6.0 * (d[i] - d[i - 1])
            # third derivative continuous at x_1: (M1 − M0)/h0 = (M2 − M1)/h1; likewise at x_{n-2}
            a[0, :3] = (h[1], -(h[0] + h[1]), h[0])
            a[-1, -3:] = (h[-1], -(h[-2] + h[-1]), h[-2])
            m = np.linalg.solve(a, rhs)
        elif end not in ("natural", "not-a-knot"):
            raise ValueError(f"unknown spline end condition {end!r}")
        elif n > 2:
            d = np.diff(y, axis=0) / (h if y.ndim == 1 else h[:, None])
            rhs = 6.0 * (d[1:] - d[:-1])
            a = np.zeros((n - 2, n - 2))
            idx = np.arange(n - 2)
            a[idx, idx] = 2.0 * (h[:-1] + h[1:])
            a[idx[1:], idx[:-1]] = h[1:-1]
            a[idx[:-1], idx[1:]] = h[1:-1]
            m[1:-1] = np.linalg.solve(a, rhs)
        return CubicSpline(x, y, m)

    def __call__(self, xq: np.ndarray | float) -> np.ndarray:
        xq = np.asarray(xq, dtype=float)
        i = np.clip(np.searchsorted(self.x, xq, side="right") - 1, 0, len(self.x) - 2)
        x0 = self.x[i]
        h = self.x[i + 1] - x0
        t = xq - x0
        y0, y1 = self.y[i], self.y[i + 1]
        m0, m1 = self.m[i], self.m[i + 1]
        if self.y.ndim > 1:
            h = h[..., None]
            t = t[..., None]
        b = (y1 - y0) / h - h * (2.0 * m0 + m1) / 6.0
        return y0 + t * (b + t * (m0 / 2.0 + t * (m1 - m0) / (6.0 * h)))
