"""Hydrostatics and KN at several trims (core/trimmed_tables.py) against a box's exact trimmed waterline.

Analytic solution: derived in the docstring of tests/trimmed_box.py (box L 40 × B 8 × D 10 m;
LCB(t) = L/2 − L·t/(12·T), KB(t) = T/2 + t²/(24·T), KN(φ, t) = sinφ·[KB(t) + (B²/(12·T))·(1 +
tan²φ/2)], and the equilibrium a = s·(T/2 + L²/(12·T) − KG) + s³·L²/(24·T), s = t/L).

Tolerances: UR L5 / MSC.1/Circ.1229 (standards.md §5.3), and the tighter bounds of the method's one
approximation, as tests/trimmed_box.py states them; each is written beside its check.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.model import Condition, frozen_array
from deckload.core.stability import evaluate
from deckload.core.trimmed_tables import (
    TRIM_TOLERANCE_M,
    TrimBeyondTablesError,
    TrimNotSettledError,
    equilibrium,
)

from trimmed_box import HEELS, B, L, RHO, TRIMS, box, exact_trim, kn_at_trim, kn_exact, ur_l5_draft


@pytest.mark.parametrize("T", [5.0, 4.85])
@pytest.mark.parametrize("offset_aft", [0.98, 0.3, -0.6, 1.25])
def test_equilibrium_trim_and_drafts_against_the_exact_waterline(T, offset_aft):
    """Trim and both drafts within UR L5's 1 %/5 cm of the exact trimmed waterline (module
    docstring); in fact within 2 mm: LCB is linear in t and interpolated exactly in trim, and KB's
    t²/(24T) term, interpolated linearly over 1 m, errs by ≤ 1/(4·24·T) = 2 mm, which enters the
    balance multiplied by tanψ ≤ 0.05 — below 0.1 mm of G.  At T = 4.85 m, between rows, LCB's
    L·t/(12T) is interpolated linearly in displacement over 0.25 m: ≤ (0.25²/8)·(2/T³)·L·|t|/12
    = 0.9 mm of LCB at t = 1.9 m, × L/GM_L = 1.5 → 1.4 mm of trim."""
    kg = 3.0
    v = box(T, kg, offset_aft)
    r = evaluate(v, Condition())
    t = exact_trim(T, kg, offset_aft)
    assert -2.0 < t < 2.0  # inside the tables (the case this test is for)
    t_aft, t_fwd = T + t / 2, T - t / 2
    assert abs(r.trim_m - t) <= ur_l5_draft(t)
    assert abs(r.draft_aft_m - t_aft) <= ur_l5_draft(t_aft)
    assert abs(r.draft_fwd_m - t_fwd) <= ur_l5_draft(t_fwd)
    assert abs(r.trim_m - t) < 2e-3 and abs(r.draft_aft_m - t_aft) < 2e-3 and abs(r.draft_fwd_m - t_fwd) < 2e-3
    assert not any(w.code == "trim-beyond-tables" for w in r.warnings)


def test_iteration_settles_within_its_tolerance_in_a_few_steps():
    """Newton's step in trim: two successive estimates within TRIM_TOLERANCE_M after a few steps
    (module core/trimmed_tables.py); the settled trim is a root of the balance to that tolerance."""
    v = box(5.0, 3.0, 0.98)
    eq = equilibrium(v, RHO * L * B * 5.0, RHO, L / 2 - 0.98, 3.0)
    assert 2 <= eq.steps <= 5
    assert abs(eq.trim_m - exact_trim(5.0, 3.0, 0.98)) < 1e-3


def test_kn_at_the_equilibrium_trim():
    """GZ = KN(φ, t*) − KG·sinφ at the tabulated heels (where the heel spline passes through the
    rows) at T = 5 m (a KN row: no displacement interpolation), against the closed-form KN at the
    exact trim.  Bound: the linear interpolation of t²/(24T) over 1 m errs by ≤ sinφ/(4·24·5) =
    1.3 mm at 40°, plus the trim's own < 1 mm error times ∂KN/∂t = sinφ·t/(12T) < 0.02 → 2 mm.
    UR L5's 5 %/5 cm holds a fortiori."""
    T, kg, a = 5.0, 3.0, 0.98
    r = evaluate(box(T, kg, a), Condition())
    t = exact_trim(T, kg, a)
    for h in HEELS:
        exact = kn_exact(T, t, h) - kg * math.sin(math.radians(h))
        got = r.gz_m[int(h)]
        assert abs(got - exact) <= 0.002, (h, got, exact)


def test_kn_interpolated_in_trim_is_exact_for_kn_linear_in_trim():
    """KN tables that vary linearly with trim (KN_j = KN₀(φ) + 0.03·t_j·sinφ, invented data) are
    reproduced exactly by linear interpolation in trim at the equilibrium trim (derived: a linear
    function is its own linear interpolant); round-off only (1e-9)."""
    def kn_linear(t):
        base = kn_at_trim(0.0)
        sin = np.sin(np.radians(base.heel_deg))
        return dataclasses.replace(base, kn_m=frozen_array(base.kn_m + 0.03 * t * sin))

    T, kg, a = 5.0, 3.0, 0.98
    v = box(T, kg, a, kn_table=kn_linear)
    r = evaluate(v, Condition())
    sin = np.sin(np.radians(HEELS))
    base = np.array([kn_exact(T, 0.0, h) for h in HEELS])
    expect = base + 0.03 * r.trim_m * sin - kg * sin
    assert np.allclose([r.gz_m[int(h)] for h in HEELS], expect, atol=1e-9)


def test_single_even_keel_set_gives_the_even_keel_result():
    """With the even-keel tables alone in the trimmed set, the first step is the even-keel trim
    formula from the even-keel tables, and KN are the even-keel KN (core/trimmed_tables.py):
    the same trim within the iteration's tolerance as a profile without trimmed tables."""
    T, kg, a = 5.0, 3.0, 0.3
    only = box(T, kg, a, trims=(0.0,), kn_trims=(0.0,))
    plain = dataclasses.replace(only, trimmed=None)
    r1, r2 = evaluate(only, Condition()), evaluate(plain, Condition())
    assert abs(r1.trim_m - r2.trim_m) <= TRIM_TOLERANCE_M
    assert abs(r1.gz_m[30] - r2.gz_m[30]) < 1e-9


def test_caution_outside_the_covered_trims():
    """Tables covering −1…+1 m; G 1.25 m abaft gives about 1.9 m by the stern: outside, within one
    interval (1 m) beyond the end, and the end table's error estimate is small (the box's mean
    draft does not change with trim; KMt and KN change by t²/(24T), 2.5 cm/m over the last
    interval at most): a caution naming the covered range, not a refusal.  The trim itself is
    carried on from the +1 m table by the linear step; against the exact waterline it stays
    within UR L5's 1 %/5 cm (standards.md §5.3)."""
    T, kg, a = 5.0, 3.0, 1.25
    v = box(T, kg, a, trims=(-1.0, 0.0, 1.0), kn_trims=(-1.0, 0.0, 1.0))
    r = evaluate(v, Condition())
    t = exact_trim(T, kg, a)
    assert 1.0 < t < 2.0
    notes = [w.message for w in r.warnings if w.code == "trim-beyond-tables"]
    assert len(notes) == 1 and "-1.00 to +1.00 m" in notes[0] and "by the stern" in notes[0]
    assert abs(r.trim_m - t) <= ur_l5_draft(t)
    assert abs(r.draft_aft_m - (T + t / 2)) <= ur_l5_draft(T + t / 2)


def test_refused_beyond_one_interval():
    """Tables covering −1…+1 m; G 2.0 m abaft trims her about 3.0 m by the stern, 2 m beyond the
    end: more than the last interval (1 m), where the error cannot be bounded: refused, the
    message naming the covered range."""
    v = box(5.0, 3.0, 2.0, trims=(-1.0, 0.0, 1.0), kn_trims=(-1.0, 0.0, 1.0))
    with pytest.raises(TrimBeyondTablesError, match=r"outside the hydrostatics tables' trims \(-1.00 to \+1.00 m\)"):
        evaluate(v, Condition())


def test_refused_where_the_estimated_error_exceeds_tolerance():
    """KN that change 10 cm per metre of trim at 40° (invented: KN_j = KN₀ + 0.1556·t_j·sinφ,
    0.1 m/m at 40°) over −1…+1 m.  Linear in trim, so the bound of trimmed_tables.held_error_bound is
    the last interval's rate alone: beyond +1 m by e the end table's KN are off by about
    0.1556·sinφ·e.  Over UR L5's 5 cm on KN (standards.md §5.3) past 0.5 m at 40° → refused; and
    the GZ tolerance (§5.3: 5 % of GZ, not more than 5 cm) bites first where GZ is small: at 25°,
    GZ = KN₀(25°) + 0.1556·sin25° − 3·sin25° = 0.354 m (box closed form, tests/trimmed_box.py, KG 3 m),
    tolerance 1.8 cm, reached at e = 0.0177/(0.1556·sin25°) = 0.27 m.  So about 1.35 m by the stern
    (0.35 m beyond, 2.3 cm at 25°) is refused on GZ, and about 1.15 m (0.15 m beyond, 1.0 cm) draws a
    caution."""
    def kn_steep(t):
        base = kn_at_trim(0.0)
        sin = np.sin(np.radians(base.heel_deg))
        return dataclasses.replace(base, kn_m=frozen_array(base.kn_m + 0.1556 * t * sin))

    def run(a):
        return evaluate(box(5.0, 3.0, a, trims=TRIMS, kn_trims=(-1.0, 0.0, 1.0), kn_table=kn_steep), Condition())

    a_caution = 0.75  # ≈ 1.15 m by the stern
    t = exact_trim(5.0, 3.0, a_caution)
    assert 1.1 < t < 1.2
    r = run(a_caution)
    assert any("KN tables cover -1.00 to +1.00 m" in w.message for w in r.warnings)
    gz25 = kn_exact(5.0, 0.0, 25.0) + (0.1556 - 3.0) * math.sin(math.radians(25.0))
    assert f"{gz25:.3f}" == "0.354"
    a_gz = 0.88  # ≈ 1.35 m by the stern: about 2.3 cm estimated at 25°, over 5 % of GZ
    assert 1.3 < exact_trim(5.0, 3.0, a_gz) < 1.4
    with pytest.raises(TrimBeyondTablesError, match=r"GZ at 25° would be off by about 2\.[23] cm \(tolerance 1\.8 cm, "
                                                    r"5 % of GZ 0\.354 m\)"):
        run(a_gz)
    a_refuse = 1.05  # ≈ 1.6 m by the stern: about 6 cm estimated on KN at 40°
    assert 1.55 < exact_trim(5.0, 3.0, a_refuse) < 1.7
    with pytest.raises(TrimBeyondTablesError, match=r"KN at 40° would be off by about [56]\.\d cm \(tolerance 5 cm\)"):
        run(a_refuse)


def test_tables_whose_lcb_runs_the_wrong_way_are_refused():
    """LCB moving forward as the trim by the stern grows (a sign slip in the trimmed tables: LCB =
    L/2 + 20·L·t/(12T)) leaves no equilibrium for Newton's step to settle on: refused with the
    rule, never a number."""
    v = box(5.0, 3.0, 0.5)
    tt = v.trimmed
    bad = tuple(dataclasses.replace(h, lcb_m=frozen_array(L / 2 + 20 * L * t / (12 * h.draft_m)))
                for t, h in zip(tt.hydro_trim_m, tt.hydrostatics))
    v = dataclasses.replace(v, trimmed=dataclasses.replace(tt, hydrostatics=bad))
    with pytest.raises((TrimNotSettledError, TrimBeyondTablesError)):
        evaluate(v, Condition())


def test_kn_at_trims_with_even_keel_hydrostatics_keeps_the_even_keel_caution():
    """KN given at trims, hydrostatics at even keel only: the hydrostatics set has no rate of change to
    judge by, so beyond 1 % of LBP (0.4 m here) it keeps the even-keel caution
    (core/trim.even_keel_note's threshold) and is never refused on that account; the KN, covered
    (−2…+2 m), draw no caution and no free-trim reference-LCG caution."""
    v = box(5.0, 3.0, 0.98, trims=(0.0,), kn_trims=TRIMS)
    r = evaluate(v, Condition())
    assert 1.4 < r.trim_m < 1.6
    notes = [w.message for w in r.warnings if w.code == "trim-beyond-tables"]
    assert len(notes) == 1 and "hydrostatics are for even keel only" in notes[0] and "KN tables" not in notes[0]


def test_each_table_on_its_own_displacement_grid_never_beyond_it():
    """The +1 m table cut to drafts 4.0–4.75 m (its own grid; the others reach 6 m): a condition at
    T = 5 m trimming between 0 and +1 m needs it at Δ = 1640 t, beyond its rows: refused, naming
    that table (nothing is extrapolated in displacement)."""
    from deckload.core.tables import OutOfRangeError

    v = box(5.0, 3.0, 0.5)
    tt = v.trimmed
    k = list(tt.hydro_trim_m).index(1.0)
    h = tt.hydrostatics[k]
    cut = dataclasses.replace(h, **{c: frozen_array(getattr(h, c)[:4]) for c in h.columns()})
    tables = tt.hydrostatics[:k] + (cut,) + tt.hydrostatics[k + 1:]
    v = dataclasses.replace(v, trimmed=dataclasses.replace(tt, hydrostatics=tables))
    with pytest.raises(OutOfRangeError, match=r"hydrostatic table at trim \+1\.00 m"):
        evaluate(v, Condition())
