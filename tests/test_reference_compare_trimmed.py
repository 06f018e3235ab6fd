"""The side-by-side comparison (equilibrium.compare) on a profile with tables at several trims: the
direct column is the hull's own GZ, whatever the tables at her trim say.

Analytic solution: tests/trimmed_box.py (derived there).  Box L 40 × B 8 × D 10 m at mean draft
T = 5 m, KG = 3 m, G 1 m abaft midships: she floats at the trim t of ``trimmed_box.exact_trim``
(a = s·(T/2 + L²/(12T) − KG) + s³·L²/(24T), s = t/L), about 1.53 m by the stern.  At that trim every
station stays wall-sided to 41° of heel, and

    KN(φ, t) = sinφ·[T/2 + t²/(24T) + (B²/(12T))·(1 + tan²φ/2)],   GZ = KN − KG·sinφ

(no tanks, no list).  The closed form leaves out the cosψ factors of the trimmed axis
(trimmed_box.py: 1 − cosψ = 3·10⁻⁴ at t = 1 m on L = 40 m), so the hull's GZ is checked to
(1 − cosψ)·KN(φ) (1.8 mm at 40°, 0.4 mm at 10°; measured differences are below 3·10⁻⁵ m).

The comparison carries over the result's free-surface treatment as the difference between the
result's GZ and KN − KG_fluid·sinφ − TCG·cosφ worked with the KN the result used: at her trim
(``kn_for``), not the even-keel table.  With no slack tank that difference is nil, so the
direct column is the hull's GZ.  The KN tables at each trim are KN(φ, t) above to 40°; past the
deck-edge angle the tables here continue with the even-keel box section formula at T
(vessel_factories.box_kn_m) plus the same t²/(24T)·sinφ — not this box's KN there, and no check
reads those angles: compare only needs tables to 90° to run.  The even-keel table differs from the
table at 1.53 m of trim by t²/(24T)·sinφ (3.4 mm at 10°, 12.5 mm at 40°), so reading it in place of
the trimmed one would move the direct column by that much.
"""

from __future__ import annotations

import dataclasses
import math

import pytest

import trimmed_box as tb
from deckload.core.equilibrium import compare
from deckload.core.model import Condition, CrossCurves, frozen_array
from deckload.core.stability import evaluate
from test_reference_box_equilibrium import box_body
from vessel_factories import box_kn_m

T, KG, OFFSET_AFT = 5.0, 3.0, 1.0
HEELS_TO_90 = tuple(float(h) for h in range(0, 91, 5))


def kn_to_90(t: float) -> CrossCurves:
    """KN at trim t (module docstring): exact to 40°, the even-keel section formula plus t²/(24T) beyond."""
    kn = [[box_kn_m(tb.B, tb.D, d, math.radians(h)) + math.sin(math.radians(h)) * t * t / (24 * d) for h in HEELS_TO_90]
          for d in tb.KN_DRAFTS]
    return CrossCurves(heel_deg=frozen_array(HEELS_TO_90),
                       displacement_t=frozen_array([tb.RHO * tb.L * tb.B * d for d in tb.KN_DRAFTS]),
                       kn_m=frozen_array(kn), trim_basis="even keel")


def test_kn_to_90_is_the_closed_form_to_40_degrees():
    """The posed table agrees with trimmed_box.kn_exact wherever the box is wall-sided (to round-off)."""
    for h in (10.0, 25.0, 40.0):
        assert kn_to_90(1.0).kn_m[2, int(h / 5)] == pytest.approx(tb.kn_exact(5.0, 1.0, h), abs=1e-12)


def test_direct_column_is_the_hulls_gz_at_her_trim():
    v = dataclasses.replace(tb.box(T, KG, OFFSET_AFT, kn_table=kn_to_90), hull=box_body(tb.L, tb.B, tb.D))
    r = evaluate(v, Condition())
    cmp = compare(v, r)
    t = tb.exact_trim(T, KG, OFFSET_AFT)
    assert t == pytest.approx(1.5275, abs=1e-4)
    # the solver's balance to 1e-8 m times a lever of about 1 (test_reference_box_equilibrium.py): 1e-6 m
    assert cmp.direct.trim_m == pytest.approx(t, abs=1e-6)
    assert r.trim_m > 1.0  # the tables at several trims are read, not the even-keel one
    psi = math.atan(t / tb.L)
    for deg in (10, 20, 30, 40):
        kn = tb.kn_exact(T, t, deg)
        exact = kn - KG * math.sin(math.radians(deg))
        tol = (1.0 - math.cos(psi)) * kn
        assert cmp.gz_direct_m[deg] == pytest.approx(exact, abs=tol), deg
        assert {r.quantity: r.direct for r in cmp.rows}[f"GZ at {deg}°"] == pytest.approx(exact, abs=tol), deg
