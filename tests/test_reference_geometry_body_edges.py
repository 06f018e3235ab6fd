"""Edges of a body's immersion (core/geometry/body.py), worked by hand on a box.

Box L = 40 (x 0…40 from the AP), B = 10, D = 4 m, upright, keel at z = 0 (the form of
checks.md §1).  A level below the keel (c0 = −1 m) leaves nothing under water: volume,
waterplane area and every moment are 0 exactly (no section is cut, the sums are of zeros).
The centroid of no volume has no value of its own, but every number the program computes must
be finite (HELPER_RULES hard rule: finite or refused): the callers replace it by the bottom's
centroid (tanks.py), so a NaN here would only be hidden, never needed.
"""

from __future__ import annotations

import numpy as np

from deckload.core.geometry.body import Body, immerse
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.spec import HullOffsets

L, B, D = 40.0, 10.0, 4.0


def box_body(n: int = 5) -> Body:
    xs = np.linspace(0.0, L, n)
    hull = HullOffsets(xs, np.array([0.0, D]), np.full((n, 2), B / 2), np.full(n, D))
    return Body(xs, *hull_sections(hull))


def test_nothing_below_the_level_gives_zeros_and_finite_centroids():
    im = immerse(box_body(), np.ones(2), np.zeros(2), np.array([-1.0, -0.5]))
    for name in ("volume_m3", "wp_area_m2", "wp_x_m3", "wp_xx_m4", "wp_eta_m3", "wp_etaeta_m4"):
        np.testing.assert_array_equal(getattr(im, name), [0.0, 0.0], err_msg=name)
    for name in ("x_b_m", "eta_b_m", "zeta_b_m"):
        assert np.all(np.isfinite(getattr(im, name))), name
