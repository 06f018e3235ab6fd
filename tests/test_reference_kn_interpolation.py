"""KN between tabulated displacements, against the closed forms of a box, at mid-points between rows.

Analytic solution (derived).  A box of breadth B heeled φ with the waterline cutting both
sides (wall-sided: (B/2)·tanφ ≤ min(T, D − T)) has, with t = tanφ (derivation in
tests/test_reference_box_barge.py, test_gz_wall_sided_up_to_deck_edge, and checks.md §1.2),

    y_B = B²t/(12T),  z_B = T/2 + B²t²/(24T),
    KN = y_B·cosφ + z_B·sinφ = sinφ·[T/2 + B²/(12T)·(1 + ½tan²φ)],

a curve in T (so in Δ = ρLBT) with curvature ∝ 1/T³ that a straight line between rows
cuts off.  Beyond the wall-sided range the exact KN comes from the section formulas of
tests/vessel_factories.py (checks.md §1.2, regimes 1–4).

The barge of checks.md §1 (L 40, B 10, D 4 m) is tabulated here at drafts 0.5 m apart
(205 t, the row spacing of many booklets) and evaluated at the mid-points between rows,
where interpolation errs most.  Tolerances are tied to UR L5 (standards.md §5.3: KN
5 cm, GZ 5 %/5 cm, areas 5 % or 0.0012 m·rad); the tests ask for a fifth of the KN
tolerance or less where the curve is smooth.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.gz import kn_row
from deckload.core.model import Condition
from deckload.core.stability import evaluate
from deckload.core.tables import OutOfRangeError
from vessel_factories import RHO_SW, box_dynamic_lever_mrad, box_kn_m, box_vessel

L, B, D = 40.0, 10.0, 4.0
ROWS_M = tuple(np.round(np.arange(0.5, 3.5001, 0.5), 10))
MIDS_M = (1.25, 1.75, 2.25, 2.75)
KG = 3.0


def wall_sided_kn(draft_m: float, phi_rad: float) -> float:
    """KN = sinφ·[T/2 + B²/(12T)·(1 + ½tan²φ)] (module docstring)."""
    return math.sin(phi_rad) * (draft_m / 2 + B**2 / (12 * draft_m) * (1 + 0.5 * math.tan(phi_rad) ** 2))


def _barge(draft_m: float, heel_step_deg: float = 5.0):
    return box_vessel(length_m=L, breadth_m=B, depth_m=D, drafts_m=ROWS_M, lightship_t=RHO_SW * L * B * draft_m,
                      lightship_kg_m=KG, heel_step_deg=heel_step_deg)


@pytest.mark.parametrize("draft_m", MIDS_M)
@pytest.mark.parametrize("deg", [5, 10])
def test_kn_at_mid_rows_keeps_the_curvature(draft_m, deg):
    """Wall-sided KN (closed form above) at mid-points between rows 0.5 m apart: within 1 cm,
    a fifth of UR L5's 5 cm for KN (the largest, 9 mm, next to the strongly curved shallow end
    of the table at T = 1.25 m, 5°; 3 mm and less from T = 1.75 m up).  The straight line
    between the rows misses by 2.4 cm (5°) and 4.9 cm (10°) at T = 1.25 m; the check below
    shows that this test would catch it."""
    phi = math.radians(deg)
    assert B / 2 * math.tan(phi) <= min(draft_m, D - draft_m)  # inside the wall-sided range
    v = _barge(draft_m)
    cc = v.cross_curves
    d = RHO_SW * L * B * draft_m
    k = list(cc.heel_deg).index(float(deg))
    exact = wall_sided_kn(draft_m, phi)
    assert box_kn_m(B, D, draft_m, phi) == pytest.approx(exact, abs=1e-12)  # the two closed forms agree
    assert abs(kn_row(cc, d)[k] - exact) <= (0.01 if draft_m == 1.25 else 0.003)
    if draft_m == 1.25:
        straight = float(np.interp(d, cc.displacement_t, cc.kn_m[:, k]))
        assert abs(straight - exact) > 0.02


@pytest.mark.parametrize("draft_m", MIDS_M)
def test_gz_and_areas_at_mid_rows(draft_m):
    """The whole GZ curve (KG 3 m, 1° heel table) at mid-rows against the exact box GZ, every degree
    0–90°: within 1.5 cm (UR L5 5 cm; the largest errors sit beside the deck-edge kinks of the
    box, which no smooth interpolation follows); areas 0–30° and 0–40° within 0.3 % of the exact
    dynamic lever (tests/vessel_factories.py, checks.md §1.3; UR L5 allows 5 %)."""
    r = evaluate(_barge(draft_m, heel_step_deg=1.0), Condition())
    for deg in range(91):
        phi = math.radians(deg)
        assert abs(r.gz_m[deg] - (box_kn_m(B, D, draft_m, phi) - KG * math.sin(phi))) <= 0.015
    assert r.area_0_30_mrad == pytest.approx(box_dynamic_lever_mrad(B, D, draft_m, KG, math.radians(30)), rel=0.003)
    assert r.area_0_40_mrad == pytest.approx(box_dynamic_lever_mrad(B, D, draft_m, KG, math.radians(40)), rel=0.003)


def test_on_a_row_the_row_itself_and_nothing_beyond_the_table():
    """On a tabulated displacement the row is returned unchanged; outside the rows the look-up is
    refused (DEVELOPERS.md: nothing is extrapolated)."""
    cc = _barge(2.0).cross_curves
    for j, d in enumerate(cc.displacement_t):
        assert np.array_equal(kn_row(cc, float(d)), cc.kn_m[j])
    with pytest.raises(OutOfRangeError):
        kn_row(cc, float(cc.displacement_t[-1]) + 1.0)
    with pytest.raises(OutOfRangeError):
        kn_row(cc, float(cc.displacement_t[0]) - 1.0)
