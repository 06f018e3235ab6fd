"""Table look-up (core/tables.py) against values worked by hand.

Natural cubic spline (Burden & Faires, *Numerical Analysis*, §3.5, natural spline; the
construction quoted in tables.py): with knot spacings h_i and slopes Δ_i = (y_{i+1} − y_i)/h_i,
the second derivatives M_i solve
h_{i-1}·M_{i-1} + 2(h_{i-1} + h_i)·M_i + h_i·M_{i+1} = 6·(Δ_i − Δ_{i-1}), M_0 = M_n = 0, and on
[x_i, x_{i+1}], t = x − x_i,
S(x) = y_i + t·b_i + t²·M_i/2 + t³·(M_{i+1} − M_i)/(6h_i), b_i = Δ_i − h_i·(2M_i + M_{i+1})/6.

* Knots (0, 0), (1, 1), (2, 0): 4·M_1 = 6·(−1 − 1), M_1 = −3; on [0, 1] b = 1 + 3/6 = 1.5,
  S(0.5) = 0.75 − 0.125·3/6 = 0.6875.
* Unequal knots x = 0, 1, 3, 4, y = 0, 1, 0, 1: h = 1, 2, 1; Δ = 1, −0.5, 1; the system
  6M_1 + 2M_2 = −9, 2M_1 + 6M_2 = 9 gives M_1 = −2.25, M_2 = 2.25.  On [0, 1]: b = 1.375,
  S(0.5) = 0.5·(1.375 − 0.5·0.1875) = 0.640625; on [1, 3]: b = 0.25, S(2) = 0.5; by the point
  symmetry of the data about (2, 0.5), S(3.5) = 1 − S(0.5) = 0.359375.
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.tables import CubicSpline, OutOfRangeError, bracket, interp

#: Round-off only: the expected values are exact binary fractions.
EXACT = 1e-12


def test_spline_through_three_knots():
    s = CubicSpline.fit(np.array([0.0, 1.0, 2.0]), np.array([0.0, 1.0, 0.0]))
    assert s.m.tolist() == pytest.approx([0.0, -3.0, 0.0], abs=EXACT)
    assert float(s(0.5)) == pytest.approx(0.6875, abs=EXACT)
    assert float(s(1.5)) == pytest.approx(0.6875, abs=EXACT)  # mirror image


def test_spline_on_unequal_knots():
    s = CubicSpline.fit(np.array([0.0, 1.0, 3.0, 4.0]), np.array([0.0, 1.0, 0.0, 1.0]))
    assert s.m.tolist() == pytest.approx([0.0, -2.25, 2.25, 0.0], abs=EXACT)
    got = s(np.array([0.0, 0.5, 1.0, 2.0, 3.0, 3.5, 4.0]))
    assert got.tolist() == pytest.approx([0.0, 0.640625, 1.0, 0.5, 0.0, 0.359375, 1.0], abs=EXACT)


def test_spline_of_several_columns_splines_each_column():
    """A 2-D y is splined column by column on the same (unequal) knots: the second column is twice the
    first, so at 0.5, 2 and 3.5 it gives twice 0.640625, 0.5 and 0.359375 (module docstring)."""
    y1 = np.array([0.0, 1.0, 0.0, 1.0])
    s = CubicSpline.fit(np.array([0.0, 1.0, 3.0, 4.0]), np.column_stack([y1, 2.0 * y1]))
    got = s(np.array([0.5, 2.0, 3.5]))
    assert got[:, 0].tolist() == pytest.approx([0.640625, 0.5, 0.359375], abs=EXACT)
    assert got[:, 1].tolist() == pytest.approx([1.28125, 1.0, 0.71875], abs=EXACT)


def test_a_straight_line_is_its_own_spline():
    """Two knots: no interior second derivative; the spline is the chord."""
    s = CubicSpline.fit(np.array([0.0, 2.0]), np.array([1.0, 3.0]))
    assert float(s(0.5)) == pytest.approx(1.5, abs=EXACT)


def test_bracket_and_interp():
    """x = xs[i] + f·(xs[i+1] − xs[i]); values within 1e-9 of an end are clamped onto it (round-off in a
    sum of masses, tables.py); further out is refused, naming the quantity and the range."""
    xs = np.array([0.0, 10.0, 20.0])
    assert bracket(xs, 15.0, "q") == (1, pytest.approx(0.5, abs=EXACT))
    assert bracket(xs, 10.0, "q") == (1, 0.0)
    assert bracket(xs, 20.0 + 1e-9, "q") == (1, 1.0)
    assert bracket(xs, -1e-9, "q") == (0, 0.0)
    assert interp(xs, np.array([1.0, 3.0, 7.0]), 12.5, "q") == pytest.approx(4.0, abs=EXACT)
    with pytest.raises(OutOfRangeError) as e:
        interp(xs, np.array([1.0, 3.0, 7.0]), 20.5, "draft", "m")
    assert str(e.value) == "draft 20.5 m is outside the table range 0–20 m; deckload does not extrapolate"
    with pytest.raises(OutOfRangeError):
        bracket(xs, float("nan"), "q")
    with pytest.raises(OutOfRangeError) as e:  # no unit given: none printed
        interp(xs, np.array([1.0, 3.0, 7.0]), 25.0, "ratio")
    assert str(e.value) == "ratio 25 is outside the table range 0–20; deckload does not extrapolate"
