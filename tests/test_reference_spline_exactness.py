"""Table look-up (core/tables.py): splines that must reproduce polynomials exactly, and the
edges of a bracket.

Sources and derivations (each check names which it uses):

* **Not-a-knot spline reproduces cubics** (de Boor, *A Practical Guide to Splines*, ch. IV,
  the not-a-knot end condition).  The not-a-knot spline through n ≥ 4 points is the unique
  C² piecewise cubic whose third derivative is also continuous at x₁ and x_{n−2}.  A cubic
  polynomial p satisfies every one of those conditions, so the spline through (xᵢ, p(xᵢ)) *is* p:
  its second derivatives are Mᵢ = p''(xᵢ) and its value anywhere in [x₀, x_{n−1}] is p(x).
  With three points the condition makes it the parabola through them (tables.py docstring),
  so a parabola is reproduced, M ≡ p''.
  Here p(x) = 1 + 2x − 1.5x² + 0.25x³ (p'' = −3 + 1.5x), q(x) = x³ − 4x (q'' = 6x), the
  straight line r(x) = 3 − 0.5x (r'' = 0), and the parabola P(x) = 2 − x + 0.5x² (P'' = 1);
  worked by hand:  p(0, 1, 3, 4, 7, 8) = 1, 1.75, 0.25, 1, 27.25, 49;
  p(0.5) = 1 + 1 − 0.375 + 0.03125 = 1.65625, p(2) = 1, p(5.5) = 1 + 11 − 45.375 + 41.59375
  = 8.21875, p(7.5) = 1 + 15 − 84.375 + 105.46875 = 37.09375;  q(0, 1, 3, 4, 7) = 0, −3, 15,
  48, 315, q(0.5) = −1.875, q(2) = 0, q(5.5) = 144.375;  P(0, 1, 4) = 2, 1.5, 6, P(0.5) =
  1.625, P(2.5) = 2.625, P(3) = 3.5; P(1, 2, 5) = 1.5, 2, 9.5.  The knots are unequally spaced on purpose: on equal
  spacing h₀ = h₁ and a spline built with the wrong spacing would still pass.

* **Natural spline of a known natural spline** (Burden & Faires, *Numerical Analysis*, §3.5:
  the natural spline through given points is unique).  S(x) = x + x³ + (x−1)₊³ − (x−3)₊³ −
  4(x−4)₊³ is a C² piecewise cubic with breaks at 1, 3, 4; S''(x) = 6·[x + (x−1)₊ − (x−3)₊ −
  4(x−4)₊] is 0 at x = 0 and 6·(6 + 5 − 3 − 8) = 0 at x = 6, so S is the natural spline
  through its own values at the knots 0, 1, 3, 4, 6 (spacings 1, 2, 1, 2):
  S = 0, 2, 38, 94, 288 and M = S'' = 0, 6, 30, 36, 0.  Between the knots S(0.5) = 0.625,
  S(2) = 2 + 8 + 1 = 11, S(3.5) = 3.5 + 42.875 + 15.625 − 0.125 = 61.875,
  S(5) = 5 + 125 + 64 − 8 − 4 = 182.  Five knots give a 3 × 3 interior system, the smallest
  in which every off-diagonal of the tridiagonal matrix is a different entry.

* **Bracket edges** (the contract in tables.bracket's docstring; a relative round-off
  tolerance is common practice): x = xs[i] + f·(xs[i+1] − xs[i]) with 0 ≤ f ≤ 1, both table
  ends inclusive; a value within tol = 1e-9 × max(1, |first|, |last|) beyond an end is clamped
  onto it, the tolerance edge itself included; anything further is refused.

All expected values are exact binary fractions: the tolerance EXACT is round-off only.
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.tables import CubicSpline, OutOfRangeError, bracket, interp

#: Round-off only (values up to a few hundred, exact binary fractions; solve() on a 6 × 6 system).
EXACT = 1e-9


def p(x):
    return 1.0 + 2.0 * x - 1.5 * x**2 + 0.25 * x**3


def q(x):
    return x**3 - 4.0 * x


def r(x):
    return 3.0 - 0.5 * x


QUERIES = np.array([0.5, 2.0, 5.5])


@pytest.mark.parametrize("knots", [(0.0, 1.0, 3.0, 7.0), (0.0, 1.0, 3.0, 4.0, 7.0), (0.0, 1.0, 3.0, 4.0, 7.0, 8.0)])
def test_not_a_knot_reproduces_a_cubic(knots):
    """de Boor ch. IV (module docstring): through 4, 5 and 6 unequally spaced knots the
    not-a-knot spline of p is p itself; second derivatives M = p''(x) = −3 + 1.5x."""
    x = np.array(knots)
    s = CubicSpline.fit(x, p(x), end="not-a-knot")
    assert s.m.tolist() == pytest.approx((-3.0 + 1.5 * x).tolist(), abs=EXACT)
    assert s(QUERIES).tolist() == pytest.approx([1.65625, 1.0, 8.21875], abs=EXACT)
    assert float(s(x[-1])) == pytest.approx(float(p(x[-1])), abs=EXACT)  # the last knot itself


def test_not_a_knot_of_several_columns():
    """Three columns (p, q, r of the module docstring) on five knots: each reproduced exactly.
    The number of columns (3) differs from the number of intervals (4) so that a slope array
    divided along the wrong axis cannot broadcast by accident."""
    x = np.array([0.0, 1.0, 3.0, 4.0, 7.0])
    s = CubicSpline.fit(x, np.column_stack([p(x), q(x), r(x)]), end="not-a-knot")
    assert s.m[:, 0].tolist() == pytest.approx((-3.0 + 1.5 * x).tolist(), abs=EXACT)
    assert s.m[:, 1].tolist() == pytest.approx((6.0 * x).tolist(), abs=EXACT)
    assert s.m[:, 2].tolist() == pytest.approx([0.0] * 5, abs=EXACT)
    got = s(QUERIES)
    assert got.shape == (3, 3)
    assert got[:, 0].tolist() == pytest.approx([1.65625, 1.0, 8.21875], abs=EXACT)
    assert got[:, 1].tolist() == pytest.approx([-1.875, 0.0, 144.375], abs=EXACT)
    assert got[:, 2].tolist() == pytest.approx([2.75, 2.0, 0.25], abs=EXACT)
    one = s(5.5)  # a single query (how gz.kn_curve asks): one value per column
    assert one.tolist() == pytest.approx([8.21875, 144.375, 0.25], abs=EXACT)


def test_not_a_knot_through_three_knots_is_the_parabola():
    """Three unequally spaced knots (0, 1, 4): the parabola P through them, M ≡ P'' = 1
    (tables.py docstring; module docstring values), also column by column (3 columns on 2
    intervals: P, 2P and the line r)."""
    x = np.array([0.0, 1.0, 4.0])
    y = 2.0 - x + 0.5 * x**2
    s = CubicSpline.fit(x, y, end="not-a-knot")
    assert s.m.tolist() == pytest.approx([1.0, 1.0, 1.0], abs=EXACT)
    assert s(np.array([0.5, 2.5, 3.0])).tolist() == pytest.approx([1.625, 2.625, 3.5], abs=EXACT)
    s2 = CubicSpline.fit(x, np.column_stack([y, 2.0 * y, r(x)]), end="not-a-knot")
    assert s2.m[:, 0].tolist() == pytest.approx([1.0] * 3, abs=EXACT)
    assert s2.m[:, 1].tolist() == pytest.approx([2.0] * 3, abs=EXACT)
    assert s2.m[:, 2].tolist() == pytest.approx([0.0] * 3, abs=EXACT)
    assert s2(2.5).tolist() == pytest.approx([2.625, 5.25, 1.75], abs=EXACT)
    # the same parabola on knots that do not start at 0 (1, 2, 5: P = 1.5, 2, 9.5)
    s3 = CubicSpline.fit(np.array([1.0, 2.0, 5.0]), np.array([1.5, 2.0, 9.5]), end="not-a-knot")
    assert s3.m.tolist() == pytest.approx([1.0, 1.0, 1.0], abs=EXACT)
    assert float(s3(2.5)) == pytest.approx(2.625, abs=EXACT)


def test_two_knots_give_the_chord_with_either_end_condition():
    """tables.py docstring: with two knots the spline is the straight line through them, whichever
    end condition is asked (a KN table of two displacements is splined not-a-knot by gz.kn_curve)."""
    for end in ("natural", "not-a-knot"):
        s = CubicSpline.fit(np.array([1.0, 3.0]), np.array([2.0, 6.0]), end=end)
        assert s.m.tolist() == [0.0, 0.0]
        assert float(s(2.5)) == pytest.approx(5.0, abs=EXACT)


def test_natural_spline_on_five_unequal_knots():
    """Burden & Faires §3.5 (module docstring): the natural spline through S at 0, 1, 3, 4, 6 is
    S, M = 0, 6, 30, 36, 0, and S between the knots."""
    x = np.array([0.0, 1.0, 3.0, 4.0, 6.0])
    s = CubicSpline.fit(x, np.array([0.0, 2.0, 38.0, 94.0, 288.0]))
    assert s.m.tolist() == pytest.approx([0.0, 6.0, 30.0, 36.0, 0.0], abs=EXACT)
    got = s(np.array([0.0, 0.5, 1.0, 2.0, 3.5, 5.0, 6.0]))
    assert got.tolist() == pytest.approx([0.0, 0.625, 2.0, 11.0, 61.875, 182.0, 288.0], abs=EXACT)


def test_integer_data_give_the_same_spline():
    """fit() takes any array-like: knots and values given as Python integers must not make the
    second derivatives integers.  The four-knot example of test_reference_tables.py (Burden &
    Faires §3.5, worked there): x = 0, 1, 3, 4, y = 0, 1, 0, 1 give M = 0, −2.25, 2.25, 0."""
    s = CubicSpline.fit([0, 1, 3, 4], [0, 1, 0, 1])
    assert s.m.tolist() == pytest.approx([0.0, -2.25, 2.25, 0.0], abs=EXACT)
    assert float(s(0.5)) == pytest.approx(0.640625, abs=EXACT)


def test_unknown_end_condition_is_refused_by_name():
    with pytest.raises(ValueError) as e:
        CubicSpline.fit(np.array([0.0, 1.0, 2.0]), np.array([0.0, 1.0, 0.0]), end="clamped")
    assert str(e.value) == "unknown spline end condition 'clamped'"


# --------------------------------------------------------------------------- bracket edges


def test_both_table_ends_are_inclusive():
    """Exactly at the first and the last tabulated value (module docstring, bracket edges)."""
    xs = np.array([0.0, 0.5, 1.0])
    assert bracket(xs, 0.0, "q") == (0, 0.0)
    assert bracket(xs, 1.0, "q") == (1, 1.0)
    assert interp(xs, np.array([2.0, 4.0, 7.0]), 1.0, "q") == 7.0


def test_the_tolerance_edge_itself_is_clamped():
    """tol = 1e-9 on a table 0–1 (max(1, 0, 1) = 1): −1e-9 and 1 + 1e-9 are exactly at
    first − tol and last + tol (the same floating-point sums) and are clamped onto the ends;
    2e-9 beyond is refused."""
    xs = np.array([0.0, 0.5, 1.0])
    assert bracket(xs, 0.0 - 1e-9, "q") == (0, 0.0)
    assert bracket(xs, 1.0 + 1e-9, "q") == (1, 1.0)
    for x in (-2e-9, 1.0 + 2e-9):
        with pytest.raises(OutOfRangeError):
            bracket(xs, x, "q")


@pytest.mark.parametrize(
    "xs, x, expected",
    [
        # a displacement-like table to 1000 t: tol = 1e-9 × 1000 = 1e-6 t
        ((0.0, 500.0, 1000.0), 1000.0 + 5e-7, (1, 1.0)),
        # a table starting at −1000 (e.g. a long negative axis): tol from |first| = 1e-6
        ((-1000.0, -500.0, 10.0), -1000.0 - 5e-7, (0, 0.0)),
        # a table whose ends are both below 1 in size: tol = 1e-9 × 1, not 1e-9 × 0.5
        ((0.0, 0.25, 0.5), 0.5 + 8e-10, (1, 1.0)),
    ],
)
def test_tolerance_scales_with_the_larger_table_end(xs, x, expected):
    """tol = 1e-9 × max(1, |first|, |last|) (module docstring): each value lies beyond the end by
    half the tolerance (or 0.8 of it) and is clamped."""
    assert bracket(np.array(xs), x, "q") == expected


@pytest.mark.parametrize("xs, x", [((0.0, 500.0, 1000.0), 1000.0 + 2e-6), ((-1000.0, 10.0), -1000.0 - 2e-6),
                                   ((0.0, 0.5, 1.0), 1.0 + 1.5e-9)])
def test_beyond_the_scaled_tolerance_is_refused(xs, x):
    """Twice (or 1.5 times) the tolerance beyond an end: refused, never extrapolated."""
    with pytest.raises(OutOfRangeError):
        bracket(np.array(xs), x, "q")


def test_refusal_carries_the_quantity_value_and_range():
    """The error keeps what it was raised with (trimmed_tables re-words it from these fields)
    and, with no unit given to bracket, prints none."""
    with pytest.raises(OutOfRangeError) as e:
        bracket(np.array([2.0, 4.0, 6.0]), 7.5, "heel")
    err = e.value
    assert (err.quantity, err.value, err.low, err.high, err.unit) == ("heel", 7.5, 2.0, 6.0, "")
    assert str(err) == "heel 7.5 is outside the table range 2–6; deckload does not extrapolate"
    with pytest.raises(OutOfRangeError) as e:
        bracket(np.array([2.0, 4.0, 6.0]), 1.5, "level", "m")
    assert (e.value.value, e.value.low, e.value.high, e.value.unit) == (1.5, 2.0, 6.0, "m")
    assert str(e.value) == "level 1.5 m is outside the table range 2–6 m; deckload does not extrapolate"
