"""Hydrostatics and KN of a box at a fixed trim (core/geometry/trimmed.py), against closed forms.

Box barge of checks.md §1: L = 40, B = 10, D = 4 m, ρ = 1.025 t/m³, x from the aft end (the AP),
LBP = L.  Analytic solution (derived here).  The program cuts the hull, upright, by the plane
z = T − (x − L/2)·s with s = trim/L (trim + by the stern), T the draft at midships
(trimmed.py docstring).  Every station is the same rectangle, so while both ends' waterlines lie
between keel and deck the section at x holds B·d(x) with d(x) = T − (x − L/2)·s, and

* ∇ = ∫B·d dx = L·B·T (the linear term integrates to zero about midships);
* LCB = ∫x·B·d dx/∇ = L/2 − s·∫(x − L/2)²dx/(L·T) = L/2 − s·L²/(12·T);
* KB = ∫B·d²/2 dx/∇ = [L·T² + s²·L³/12]/(2·L·T) = T/2 + s²·L²/(24·T);
* every section's chord is B, so the waterplane measured in the section frame (the cos ψ
  factors are left out, trimmed.py docstring) has A = L·B, LCF = L/2, I_T = L·B³/12,
  I_L = B·L³/12; KMt = KB + B²/(12·T), KML = KB + L²/(12·T), TPC = ρ·L·B/100,
  MCTC = ρ·I_L/(100·L) (with BML, as trimmed.py states).

KN at a fixed trim, heel θ: in the heeled frame the level of section x is
c(x) = c0 − (x − L/2)·s, so its centreline draft is d(x) = c(x)/cos θ, linear in x with slope
s/cos θ, and again ∇ = L·B·T with T = d(L/2).  While the waterline cuts both sides of every
section (wall-sided, checks.md §1.2 case 1) the section's centre is y = B²·tanθ/(12·d),
z = d/2 + B²·tan²θ/(24·d), so A·η = B·d·(y·cosθ + z·sinθ) = B·sinθ·[B²/12 + d²/2 + B²·tan²θ/24] and

    KN = sinθ·[T/2 + (s/cosθ)²·L²/(24·T) + B²·(1 + ½·tan²θ)/(12·T)].

The box has 5 equally spaced stations: Simpson's rule integrates these polynomials in x
(degree ≤ 2) exactly, so the tolerances are round-off (1e-9).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.body import Body
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.spec import HullOffsets
from deckload.core.geometry.trimmed import (
    TrimTableError,
    drafts_for_trim,
    hydrostatics_at_trim,
    kn_at_trim,
    tables_at_trims,
)

L, B, D = 40.0, 10.0, 4.0
RHO = 1.025


def box_body(n: int = 5) -> Body:
    xs = np.linspace(0.0, L, n)
    hull = HullOffsets(xs, np.array([0.0, D]), np.full((n, 2), B / 2), np.full(n, D))
    return Body(xs, *hull_sections(hull))


def lcb(t_m: float, trim_m: float) -> float:
    return L / 2 - (trim_m / L) * L**2 / (12 * t_m)


def kb(t_m: float, trim_m: float) -> float:
    return t_m / 2 + (trim_m / L) ** 2 * L**2 / (24 * t_m)


def kn(t_m: float, trim_m: float, heel_deg: float) -> float:
    th = math.radians(heel_deg)
    s = trim_m / L / math.cos(th)
    return math.sin(th) * (t_m / 2 + s**2 * L**2 / (24 * t_m) + B**2 * (1 + 0.5 * math.tan(th) ** 2) / (12 * t_m))


@pytest.mark.parametrize("trim_m", [1.0, -1.2])
def test_hydrostatics_at_trim_of_a_box(trim_m):
    """Module docstring: ∇, LCB, KB, LCF, KMt, KML, TPC, MCTC at T = 1.5, 2, 2.5 m and a trim by
    the stern (+1 m) and by the head (−1.2 m); both ends stay between keel and deck."""
    t = np.array([1.5, 2.0, 2.5])
    h = hydrostatics_at_trim(box_body(), t, trim_m, RHO, L)
    np.testing.assert_allclose(h.draft_m, t)
    np.testing.assert_allclose(h.displacement_t, RHO * L * B * t, rtol=1e-12)
    np.testing.assert_allclose(h.lcb_m, [lcb(x, trim_m) for x in t], atol=1e-9)
    np.testing.assert_allclose(h.vcb_m, [kb(x, trim_m) for x in t], atol=1e-9)
    np.testing.assert_allclose(h.lcf_m, L / 2, atol=1e-9)
    np.testing.assert_allclose(h.kmt_m, [kb(x, trim_m) + B**2 / (12 * x) for x in t], atol=1e-9)
    np.testing.assert_allclose(h.kml_m, [kb(x, trim_m) + L**2 / (12 * x) for x in t], atol=1e-9)
    np.testing.assert_allclose(h.tpc_t_cm, RHO * L * B / 100, rtol=1e-12)
    np.testing.assert_allclose(h.mctc_tm_cm, RHO * (B * L**3 / 12) / (100 * L), rtol=1e-12)
    # the trim moves B aft (by the stern) or forward (by the head) by s·L²/(12T): 1.6667 m at T = 2
    assert h.lcb_m[1] == pytest.approx(20.0 - trim_m * 40.0 / 24.0, abs=1e-9)


@pytest.mark.parametrize("trim_m", [1.0, -1.0])
def test_kn_at_trim_of_a_box_wall_sided(trim_m):
    """Module docstring: KN at a fixed trim while every section is wall-sided, T = 1.8 and 2.2 m,
    heel 0, 5, 10° (at 10°: d ranges over T ± 0.508 m and the waterline over d ± 0.882 m, inside
    0…4 m).  The trim term (s/cosθ)²·L²/(24T) is 0.0015 m at 10°, far above round-off."""
    t = np.array([1.8, 2.2])
    heels = np.array([0.0, 5.0, 10.0])
    cc = kn_at_trim(box_body(), RHO * L * B * t, heels, trim_m, RHO, L)
    assert cc.trim_basis == "even keel"
    np.testing.assert_allclose(cc.heel_deg, heels)
    np.testing.assert_allclose(cc.displacement_t, RHO * L * B * t)
    expected = np.array([[kn(x, trim_m, h) for h in heels] for x in t])
    np.testing.assert_allclose(cc.kn_m, expected, atol=1e-9)


def test_kn_at_trim_on_its_side():
    """Heeled 90° the water in the heeled frame is ζ = −y ≤ c(x): each section holds the strip
    y ≥ −c(x) over the whole depth D, whose centre is at z = D/2, and KN = η_B = z_B = D/2 = 2 m at
    any trim, while −B/2 < c(x) < B/2 along the length: here ∇ = L·D·(B/2 + c0) gives
    c0 = −0.5 and +0.5 m at 738 and 902 t, and the trim 1 m moves c by ±0.5 m at the ends."""
    cc = kn_at_trim(box_body(), [738.0, 902.0], [0.0, 90.0], 1.0, RHO, L)
    np.testing.assert_allclose(cc.kn_m[:, 1], D / 2, atol=1e-9)
    np.testing.assert_allclose(cc.kn_m[:, 0], 0.0, atol=1e-9)


def test_drafts_for_trim_keeps_both_ends_strictly_between_keel_and_deck():
    """Module docstring: a row is kept when 0 < T − |t|/2 and T + |t|/2 < depth, strictly: a
    waterline exactly at the keel or at the deck edge has no area to interpolate beyond."""
    d = np.array([0.5, 0.75, 2.0, 3.25, 3.5])
    np.testing.assert_allclose(drafts_for_trim(d, 1.0, 4.0), [0.75, 2.0, 3.25])
    np.testing.assert_allclose(drafts_for_trim(d, -1.0, 4.0), [0.75, 2.0, 3.25])
    np.testing.assert_allclose(drafts_for_trim(d, 0.0, 4.0), d)
    np.testing.assert_allclose(drafts_for_trim(d, 1.6, 4.0), [2.0])


def test_two_drafts_are_enough_for_a_table():
    """Two rows are the fewest a table can be interpolated in (trimmed.MIN_ROWS): at trim 2.5 m
    the drafts 1.5 and 2.5 m of 0.5…3.5 m keep both ends within 0…4 m (±1.25 m), and the table
    is made with those two."""
    (x,) = tables_at_trims(box_body(), np.array([0.5, 1.0, 1.5, 2.5, 3.0, 3.5]), [738.0, 902.0], [0.0, 10.0],
                           [2.5], RHO, L, D)
    np.testing.assert_allclose(x.hydrostatics.draft_m, [1.5, 2.5])
    np.testing.assert_allclose(x.hydrostatics.lcb_m, [lcb(1.5, 2.5), lcb(2.5, 2.5)], atol=1e-9)


def test_tables_at_trims_one_table_per_trim():
    """Each trim gets the hydrostatics on its own drafts and KN on the whole KN grid (module
    docstring); the values are the closed forms above."""
    drafts = np.array([0.5, 1.0, 2.0, 3.0, 3.5])
    out = tables_at_trims(box_body(), drafts, [738.0, 902.0], [0.0, 10.0], [-1.0, 1.0], RHO, L, D)
    assert [x.trim_m for x in out] == [-1.0, 1.0]
    for x in out:
        np.testing.assert_allclose(x.hydrostatics.draft_m, [1.0, 2.0, 3.0])
        np.testing.assert_allclose(x.hydrostatics.lcb_m, [lcb(d, x.trim_m) for d in (1.0, 2.0, 3.0)], atol=1e-9)
        np.testing.assert_allclose(x.cross_curves.kn_m[:, 1], [kn(1.8, x.trim_m, 10.0), kn(2.2, x.trim_m, 10.0)],
                                   atol=1e-9)


def test_a_trim_that_leaves_one_draft_is_refused_with_the_numbers():
    """At trim 3 m only T = 2 m of 0.5…3.5 m keeps both ends within 0…4 m (2 ± 1.5): the refusal
    names the trim, the count, the half-trim, the depth and the two rows needed."""
    with pytest.raises(TrimTableError) as ei:
        tables_at_trims(box_body(), np.array([0.5, 1.0, 2.0, 3.0, 3.5]), [820.0], [0.0, 10.0], [0.0, 3.0],
                        RHO, L, D)
    msg = str(ei.value)
    assert msg == ("trim +3 m leaves 1 of the table's drafts with both ends' waterline between keel and deck "
                   "(draft ± 1.5 m within 0…4 m); at least 2 are needed")
