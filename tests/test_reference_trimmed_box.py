"""Trim of a box barge whose G is off the centre of buoyancy, against its exact waterline.

Analytic solution (derived here).  Box L × B × D, x from the aft end (the AP), floating
at mean draft T (volume L·B·T), trimmed by tan ψ = s (positive by the stern).  Every
station of a box is the same rectangle, so while the waterline cuts both ends' sides
(0 < T ± s·L/2 < D) the draft at x is d(x) = T + s·(L/2 − x): the volume ∫B·d dx = L·B·T
is the same at any s, so the waterline pivots about midships (the LCF of a box) and

    x_B = ∫x·d dx / ∫d dx = L/2 − s·L²/(12·T)
    z_B = ∫d²/2 dx / ∫d dx = T/2 + s²·L²/(24·T)

in ship axes.  The upward vertical in ship axes is (sin ψ, 0, cos ψ), so B and G lie on
one vertical when x_B − x_G = s·(z_B − z_G).  With x_G = L/2 − a (G a metres abaft the
upright LCB = L/2) and z_G = KG this is

    a = s·(T/2 + L²/(12·T) − KG) + s³·L²/(24·T) = s·GM_L + s³·L²/(24·T),

GM_L = KB + BM_L − KG the upright longitudinal metacentric height.  The root s is found
by bisection to 1e-15; trim = s·L, T_aft = T + s·L/2, T_fwd = T − s·L/2 (drafts
measured square to the keel at the perpendiculars, as draft marks are).  The moment that
changes trim 1 cm is then, by definition, Δ·a/(100·trim_cm/100) → MCT = Δ·a/(100·trim).

Tolerances: UR L5 / MSC.1/Circ.1229 (standards.md §5.3): draughts and trim 1 % but not
more than 5 cm; MCT 1 cm 2 %.  The barge is checks.md §1 (L 40, B 10, D 4 m), its
tables built from the closed forms of checks.md §1.1 at 0.25 m draft steps
(tests/vessel_factories.py), KM_L = KB + BM_L included.
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.model import Condition
from deckload.core.stability import evaluate
from vessel_factories import BARGE_B, BARGE_D, BARGE_L, RHO_SW, box_barge

L, B, D = BARGE_L, BARGE_B, BARGE_D


def exact_trim_slope(draft_m: float, kg_m: float, offset_aft_m: float) -> float:
    """Root s of a = s·GM_L + s³·L²/(24T) (module docstring), by bisection."""
    gml = draft_m / 2 + L**2 / (12 * draft_m) - kg_m
    lo, hi = -1.0, 1.0
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        if mid * gml + mid**3 * L**2 / (24 * draft_m) < offset_aft_m:
            lo = mid
        else:
            hi = mid
    return 0.5 * (lo + hi)


def ur_l5_draft_tol(value_m: float) -> float:
    """UR L5 draughts (standards.md §5.3): 1 %, not more than 5 cm."""
    return min(0.01 * abs(value_m), 0.05)


def _barge(draft_m: float, kg_m: float, offset_aft_m: float, **kw):
    disp = RHO_SW * L * B * draft_m
    return box_barge(lightship_t=disp, lightship_kg_m=kg_m, lightship_lcg_m=L / 2 - offset_aft_m, **kw)


@pytest.mark.parametrize("draft_m", [2.0, 2.1, 1.6])
@pytest.mark.parametrize("offset_aft_m", [2.5, -2.5])
def test_trim_and_drafts_from_the_actual_gml(draft_m, offset_aft_m):
    """LCG 2.5 m off the LCB (abaft: by the stern; forward: by the head), KG 3 m: trim and both
    drafts within UR L5's 1 %/5 cm of the exact waterline, MCT within 2 % (module docstring).
    T = 2.1 and 1.6 m lie between table rows, so KM_L is interpolated."""
    kg = 3.0
    v = _barge(draft_m, kg, offset_aft_m)
    r = evaluate(v, Condition())
    s = exact_trim_slope(draft_m, kg, offset_aft_m)
    trim = s * L
    t_aft, t_fwd = draft_m + s * L / 2, draft_m - s * L / 2
    assert 0.0 < min(t_aft, t_fwd) and max(t_aft, t_fwd) < D  # the derivation's range
    assert abs(r.trim_m - trim) <= ur_l5_draft_tol(trim)
    assert abs(r.draft_aft_m - t_aft) <= ur_l5_draft_tol(t_aft)
    assert abs(r.draft_fwd_m - t_fwd) <= ur_l5_draft_tol(t_fwd)
    mct_exact = r.displacement_t * offset_aft_m / (100.0 * trim)
    assert r.mctc_tm_cm == pytest.approx(mct_exact, rel=0.02)
    assert not any(w.code == "trim-from-table-mctc" for w in r.warnings)


def test_without_kml_the_table_mctc_is_used_with_a_caution():
    """Without KM_L the booklet's MCTC (made with BM_L, checks.md §1.1) is used and a caution says so.

    It is the approximation this module replaces: for the barge at T = 2, KG 3 it makes the
    trim BM_L/GM_L − 1 = 3.1 % small, outside UR L5's 1 % — the exact-waterline test above
    would fail with it."""
    v = _barge(2.0, 3.0, 2.5)
    v = dataclasses.replace(v, hydrostatics=dataclasses.replace(v.hydrostatics, kml_m=None))
    r = evaluate(v, Condition())
    assert [(w.message, w.severity) for w in r.warnings if w.code == "trim-from-table-mctc"] == [
        ("the profile has no KML: trim is worked from the tabulated MCTC (made with BML, not the actual GML), "
         "so it is slightly too small", "caution")]
    trim = exact_trim_slope(2.0, 3.0, 2.5) * L
    assert r.mctc_tm_cm == pytest.approx(RHO_SW * B * L**2 / 1200, rel=1e-9)  # ρ·I_L/(100·L), I_L = BL³/12
    assert r.trim_m < trim * (1 - 0.025)


def test_trim_in_fresh_water_uses_the_actual_displacement():
    """In water of density ρ the same mass floats at volume Δ/ρ: the table-equivalent displacement
    Δ·1.025/ρ gives the draft and KM_L (geometry), while MCT = Δ·GM_L/(100·L) takes the actual Δ.
    Exact: the box at T = Δ/(ρLB), with the same trim equation (module docstring)."""
    kg, a = 3.0, 2.5
    v = _barge(2.0, kg, a)  # Δ = 820 t
    r = evaluate(v, Condition(water_density_t_m3=1.000))
    draft = 820.0 / (1.000 * L * B)
    s = exact_trim_slope(draft, kg, a)
    assert r.draft_at_lcf_m == pytest.approx(draft, abs=1e-9)
    assert abs(r.trim_m - s * L) <= ur_l5_draft_tol(s * L)
    assert abs(r.draft_fwd_m - (draft - s * L / 2)) <= ur_l5_draft_tol(draft - s * L / 2)


@pytest.mark.parametrize("offset_aft_m, warned", [(0.5, False), (-0.5, False), (0.8, True), (1.0, True), (2.5, True),
                                                   (-2.5, True)])
def test_caution_when_trimmed_beyond_the_even_keel_tables(offset_aft_m, warned):
    """The barge's tables are for even keel; a trim beyond 1 % of LBP (0.40 m; deckload's own
    threshold, core/trim.py) draws a caution naming the trim.  G 0.5 m off the LCB trims her
    about 0.31 m (exact, module docstring), 0.8 m about 0.50 m (1.2 % of LBP), 1.0 m about 0.62 m
    (1.55 %), 2.5 m about 1.6 m.  Up to 1.5 % of LBP the caution gives the size of the GZ error
    (deckload's estimate, 2.5 cm per 1 % of LBP: core/trim.py derives it by direct calculation);
    beyond it the criteria read off the GZ curve are not assessed, and the caution says so."""
    r = evaluate(_barge(2.0, 3.0, offset_aft_m), Condition())
    trim = exact_trim_slope(2.0, 3.0, offset_aft_m) * L
    assert abs(trim) > 0.4 if warned else abs(trim) < 0.4
    notes = [w for w in r.warnings if w.code == "trim-beyond-tables"]
    assert bool(notes) is warned
    if warned:
        way = "by the stern" if offset_aft_m > 0 else "by the head"
        pct = 100 * abs(r.trim_m) / L
        head = f"trim {abs(r.trim_m):.2f} m {way} ({pct:.1f} % of LBP): the tables are for even keel; "
        # the trim itself is checked against the exact waterline above; here the words and the share of LBP
        if pct <= 1.5:  # UR L5's 5 cm on KN: standards.md §5.3
            assert notes[0].message == head + (f"drafts less certain, and GZ may be off by up to about "
                                               f"{round(2.5 * pct)} cm (UR L5 allows 5 cm on KN)")
        else:
            assert notes[0].message == head + ("beyond 1.5 % of LBP the criteria read off the GZ curve are not "
                                               "assessed (KN tables at trims needed); drafts less certain")
        assert notes[0].severity == "caution"
        assert all(c.assessed for c in r.criteria) is (pct <= 1.5)


def test_kg_above_the_longitudinal_metacentre_is_refused():
    """KM_L = KB + BM_L = T/2 + L²/(12·T) = 1 + 1600/24 = 67.667 m at T = 2 m (checks.md §1.1): with KG
    70 m there is no longitudinal stability and no trim can be worked; the refusal names both."""
    from deckload.core.trim import TrimError

    with pytest.raises(TrimError) as e:
        evaluate(_barge(2.0, 70.0, 0.0), Condition())
    assert str(e.value) == ("KG fluid 70 m is not below KML 67.667 m: "
                            "no longitudinal stability, no trim can be computed")
