"""Edges of the plane-section primitives (core/geometry/sections.py), worked by hand.

* ``polygon_edges`` on a stack of polygons: each polygon closes on itself (its last vertex
  joins its own first), never on the next polygon of the stack.
* Sutherland–Hodgman clipping (Sutherland & Hodgman, CACM 17(1), 1974) of a one-vertex
  polygon: the vertex is kept where it satisfies the half-plane(s), else nothing is left.
* When Simpson's first rule applies: it needs equal steps (w = h/3·(1, 4, 2, …, 4, 1), any
  numerical-analysis text).  Steps equal to round-off (1e-9 relative, 1e-12 m: stations
  from ``linspace`` or read from decimals differ by ~1e-16 relative) count as equal; steps
  that differ by more are unequal and take the trapezoidal rule, whose weights are each
  step's half at its two ends, so that they sum to the length (∫ 1 dx exact), which
  Simpson's weights with one h cannot do on unequal steps.  The rule's name is printed in
  the hydrostatic tables (cli/tables.py), and the two rules give different volumes on a
  curved hull.
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.geometry.sections import clip_polygon, clip_to_box, polygon_edges, simpson_weights


def test_polygon_edges_of_a_stack_close_each_polygon_on_itself():
    """Two triangles stacked (shape 2 × 3): the end points of row k are row k's vertices
    shifted by one, the last joining row k's first vertex (not the next row's)."""
    y = np.array([[0.0, 1.0, 1.0], [10.0, 12.0, 12.0]])
    z = np.array([[0.0, 0.0, 1.0], [5.0, 5.0, 7.0]])
    y0, z0, y1, z1 = polygon_edges(y, z)
    np.testing.assert_array_equal(y0, y)
    np.testing.assert_array_equal(z0, z)
    np.testing.assert_array_equal(y1, [[1.0, 1.0, 0.0], [12.0, 12.0, 10.0]])
    np.testing.assert_array_equal(z1, [[0.0, 1.0, 0.0], [5.0, 7.0, 5.0]])


def test_one_vertex_polygon_is_kept_only_inside():
    """A single point (0.5, 5): inside y ≤ 1, outside z ≤ 2, so inside the first half-plane of
    the box y 0…1, z 0…2 but not the box: nothing is left.  The point (0.5, 1) is inside."""
    y, z = np.array([0.5]), np.array([5.0])
    cy, cz = clip_polygon(y, z, 0.0, 1.0, 2.0)
    assert len(cy) == 0 and len(cz) == 0
    cy, cz = clip_polygon(y, z, 1.0, 0.0, 1.0)
    np.testing.assert_array_equal(cy, [0.5])
    np.testing.assert_array_equal(cz, [5.0])
    cy, cz = clip_to_box(y, z, 0.0, 1.0, 0.0, 2.0)
    assert len(cy) == 0 and len(cz) == 0
    cy, cz = clip_to_box(np.array([0.5]), np.array([1.0]), 0.0, 1.0, 0.0, 2.0)
    np.testing.assert_array_equal(cy, [0.5])
    np.testing.assert_array_equal(cz, [1.0])


@pytest.mark.parametrize(
    "x",
    [
        # 5e-6 of a 1 m step: unequal (beyond 1e-9 relative)
        np.array([0.0, 1.0, 2.0 + 5e-6]),
        # 5e-9 m on a 1 m step: still five times the 1e-9 relative round-off allowance
        np.array([0.0, 1.0, 2.0 + 5e-9]),
        # steps 1 − δ, 1, 1 + δ, 1 with δ = 0.9e-9: each within 1e-9 of the middle one, but the
        # first and the third differ by 1.8e-9 relative: not equal steps
        np.array([0.0, 1.0 - 0.9e-9, 2.0 - 0.9e-9, 3.0, 4.0]),
    ],
)
def test_steps_unequal_beyond_round_off_take_the_trapezoidal_rule(x):
    w, rule = simpson_weights(x)
    assert rule == "trapezoid"
    h = np.diff(x)
    expected = np.zeros(len(x))
    expected[:-1] += h / 2.0
    expected[1:] += h / 2.0
    # round-off of sums of O(1) numbers: 1e-12 absolute
    np.testing.assert_allclose(w, expected, rtol=0.0, atol=1e-12)
    # ∫ 1 dx over the stations is the length, exactly (round-off only)
    assert float(np.sum(w)) == pytest.approx(x[-1] - x[0], rel=0.0, abs=1e-13)
