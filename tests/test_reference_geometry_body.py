"""Every integrated quantity of a heeled and trimmed box (core/geometry/body.py), against the exact
section formulas integrated along x by Gauss–Legendre quadrature (numpy), not the program's Simpson.

Box L = 40 (x 0…40 from the AP), B = 10, D = 4 m (checks.md §1 form), heeled θ to starboard and
cut by the level c(x) = c0 − (x − x_ref)·s in each section's heeled frame (body.py docstring),
here c0 = 2·cos θ, s = 0.01, x_ref = 15 m (not midships, so that x and x − x_ref differ).
Derived here for one rectangular section, wall-sided (the waterline cuts both sides):

* its centreline draft is d = c/cos θ (the centre line point (0, d) has ζ = d·cos θ = c), so the
  area is A = B·d and its centre (checks.md §1.2 case 1) y = B²·tanθ/(12d),
  z = d/2 + B²·tan²θ/(24d); Qη = A·(y·cosθ + z·sinθ), Qζ = A·(−y·sinθ + z·cosθ);
* the waterline ζ = c meets the side y = ±B/2 where z = (c + y·sinθ)/cosθ, i.e. at
  η = y·cosθ + z·sinθ = y/cosθ + c·tanθ: a chord of length b = B/cosθ centred on η₀ = c·tanθ, so
  ∫η ds = b·η₀ and ∫η² ds = b³/12 + b·η₀².

At θ = 10°, c(x) runs 2.15…1.75 m (d 2.18…1.78) and B/2·tanθ = 0.88 m: wall-sided everywhere.
The Immersion fields are these per-section quantities integrated along x (body.py): ∇ = ∫A,
x_B = ∫x·A/∇, η_B = ∫Qη/∇, ζ_B = ∫Qζ/∇, then ∫b, ∫b·x, ∫b·x², ∫b·η₀, ∫(b³/12 + b·η₀²),
∫b·(x − x_ref), ∫b·c, ∫b·c·(x − x_ref), ∫b·x·(x − x_ref).  Every integrand is a polynomial of
degree ≤ 3 in x, so both Simpson's rule on the 5 stations and a 6-point Gauss rule are exact:
tolerance 1e-9 relative (round-off).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from deckload.core.geometry.body import Body, immerse, level_for_volume, volume_and_area
from deckload.core.geometry.hull import hull_sections
from deckload.core.geometry.hydrostatics_calc import upright_hydrostatics, waterplane
from deckload.core.geometry.spec import HullOffsets

L, B, D = 40.0, 10.0, 4.0
S, XREF = 0.01, 15.0


def box_body(n: int = 5) -> Body:
    xs = np.linspace(0.0, L, n)
    hull = HullOffsets(xs, np.array([0.0, D]), np.full((n, 2), B / 2), np.full(n, D))
    return Body(xs, *hull_sections(hull))


def exact(theta: float, c0: float) -> dict[str, float]:
    ct, st, tt = math.cos(theta), math.sin(theta), math.tan(theta)
    xg, wg = np.polynomial.legendre.leggauss(6)
    x = L / 2 * (xg + 1.0)
    w = L / 2 * wg
    c = c0 - (x - XREF) * S
    d = c / ct
    a = B * d
    y = B**2 * tt / (12 * d)
    z = d / 2 + B**2 * tt**2 / (24 * d)
    q_eta = a * (y * ct + z * st)
    q_zeta = a * (-y * st + z * ct)
    b = np.full_like(x, B / ct)
    eta0 = c * tt
    vol = float(w @ a)
    return {
        "volume_m3": vol,
        "x_b_m": float(w @ (x * a)) / vol,
        "eta_b_m": float(w @ q_eta) / vol,
        "zeta_b_m": float(w @ q_zeta) / vol,
        "wp_area_m2": float(w @ b),
        "wp_x_m3": float(w @ (b * x)),
        "wp_xx_m4": float(w @ (b * x * x)),
        "wp_eta_m3": float(w @ (b * eta0)),
        "wp_etaeta_m4": float(w @ (b**3 / 12 + b * eta0**2)),
        "wp_xref_m3": float(w @ (b * (x - XREF))),
        "wp_c_m3": float(w @ (b * c)),
        "wp_cxref_m4": float(w @ (b * c * (x - XREF))),
        "wp_xxref_m4": float(w @ (b * x * (x - XREF))),
    }


@pytest.mark.parametrize("heel_deg", [0.0, 10.0, -10.0])
def test_immerse_every_field_of_a_heeled_trimmed_box(heel_deg):
    """Module docstring; heel 0 and ±10° (to port the box is its own mirror image: η and the
    chord moments change sign with θ, the rest do not)."""
    th = math.radians(heel_deg)
    c0 = 2.0 * math.cos(th)
    im = immerse(box_body(), math.cos(th), math.sin(th), c0, S, XREF)
    for k, v in exact(th, c0).items():
        got = float(getattr(im, k))
        assert got == pytest.approx(v, rel=1e-9, abs=1e-9), k
    vol, wpa = volume_and_area(box_body(), math.cos(th), math.sin(th), c0, S, XREF)
    assert float(vol) == pytest.approx(exact(th, c0)["volume_m3"], rel=1e-12)
    assert float(wpa) == pytest.approx(exact(th, c0)["wp_area_m2"], rel=1e-12)


def test_immerse_over_many_cases_at_once_and_in_chunks():
    """The same formulas over a (3, 2) grid of heels and levels, and over 5000 cases (more than
    one chunk of the case loop): every case equals its own single-case closed form."""
    heels = np.radians(np.array([[0.0, 5.0], [10.0, -5.0], [-10.0, 0.0]]))
    c0 = np.array([[1.8, 2.0], [2.1, 1.9], [2.0, 2.2]]) * np.cos(heels)
    im = immerse(box_body(), np.cos(heels), np.sin(heels), c0, S, XREF)
    assert im.volume_m3.shape == (3, 2)
    for i in range(3):
        for j in range(2):
            e = exact(float(heels[i, j]), float(c0[i, j]))
            assert float(im.eta_b_m[i, j]) == pytest.approx(e["eta_b_m"], rel=1e-9, abs=1e-12)
            assert float(im.wp_cxref_m4[i, j]) == pytest.approx(e["wp_cxref_m4"], rel=1e-9, abs=1e-12)
    many = np.linspace(1.8, 2.2, 5000)
    im = immerse(box_body(), 1.0, 0.0, many, S, XREF)
    vol, wpa = volume_and_area(box_body(), np.ones(5000), np.zeros(5000), many, S, XREF)
    # upright: ∇ = B·∫c dx = B·(c0·L − s·∫(x − 15)dx) = 10·(40·c0 − 0.01·200)
    np.testing.assert_allclose(im.volume_m3, 10.0 * (40.0 * many - 2.0), rtol=1e-12)
    np.testing.assert_allclose(vol, 10.0 * (40.0 * many - 2.0), rtol=1e-12)
    np.testing.assert_allclose(wpa, 400.0, rtol=1e-12)
    np.testing.assert_allclose(im.wp_xref_m3, 10.0 * 200.0, rtol=1e-12)


def test_level_for_volume_finds_the_level_back():
    """The level whose volume is the closed-form ∇ of the docstring is c0 itself (the volume grows
    strictly with the level while the box is neither empty nor full)."""
    for heel_deg in (0.0, 10.0, -10.0):
        th = math.radians(heel_deg)
        c0 = 2.0 * math.cos(th)
        v = exact(th, c0)["volume_m3"]
        c = level_for_volume(box_body(), math.cos(th), math.sin(th), v, S, XREF)
        assert float(c) == pytest.approx(c0, abs=1e-9)
    # several at once, with a start near and one far from the answer
    t = np.array([0.5, 1.0, 3.5])
    c = level_for_volume(box_body(), np.ones(3), np.zeros(3), L * B * t)
    np.testing.assert_allclose(c, t, atol=1e-9)
    c = level_for_volume(box_body(), np.ones(3), np.zeros(3), L * B * t, c_start=np.array([0.4, 3.9, 0.1]))
    np.testing.assert_allclose(c, t, atol=1e-9)
    # empty and full: the lowest and the highest point
    np.testing.assert_allclose(level_for_volume(box_body(), np.ones(2), np.zeros(2), [0.0, L * B * D]), [0.0, D],
                               atol=1e-12)


def test_zeta_range_of_a_heeled_box():
    """Corners (±5, 0) and (±5, 4): ζ = −y·sinθ + z·cosθ is lowest at the starboard bilge (5, 0),
    −5·sinθ, and highest at the port deck edge (−5, 4), 4·cosθ + 5·sinθ."""
    th = math.radians(20.0)
    lo, hi = box_body().zeta_range(np.array([math.cos(th)]), np.array([math.sin(th)]))
    assert lo.shape == (1, 5)
    np.testing.assert_allclose(lo, -5 * math.sin(th), atol=1e-12)
    np.testing.assert_allclose(hi, 4 * math.cos(th) + 5 * math.sin(th), atol=1e-12)


def test_waterplane_about_its_own_centre_off_the_centre_line():
    """A box 6 × 4 × 2 m (x 2…8, y 1…5): its waterplane (upright, any level) is 24 m², centre
    x 5, y 3; the second moments about its own centre are l·b³/12 = 32 and b·l³/12 = 72 m⁴
    (parallel-axis theorem, hydrostatics_calc.waterplane)."""
    from deckload.core.geometry.hull import compartment_body
    from deckload.core.geometry.spec import CompartmentShape

    body = compartment_body(CompartmentShape("box", 2.0, 8.0, 1.0, 5.0, 0.0, 2.0), None)
    vol, awp, lcf, it, il = waterplane(immerse(body, 1.0, 0.0, np.array([0.5, 1.5])))
    np.testing.assert_allclose(vol, [12.0, 36.0], rtol=1e-12)
    np.testing.assert_allclose(awp, 24.0, rtol=1e-12)
    np.testing.assert_allclose(lcf, 5.0, rtol=1e-12)
    np.testing.assert_allclose(it, 6 * 4**3 / 12, rtol=1e-9)
    np.testing.assert_allclose(il, 4 * 6**3 / 12, rtol=1e-9)
    # the whole upright table of that box as a 'hull' of LBP 6 m and breadth 4 m in water of
    # 1.025 t/m³ (hydrostatics_calc docstring: TPC = ρ·A/100, MCTC = ρ·I_L/(100·LBP), Cb, Cw)
    d = np.array([0.5, 1.5])
    h = upright_hydrostatics(body, d, 1.025, 6.0, 4.0)
    np.testing.assert_allclose(h.draft_m, d)
    np.testing.assert_allclose(h.volume_m3, 24.0 * d, rtol=1e-12)
    np.testing.assert_allclose(h.displacement_t, 1.025 * 24.0 * d, rtol=1e-12)
    np.testing.assert_allclose(h.lcb_m, 5.0, rtol=1e-12)
    np.testing.assert_allclose(h.vcb_m, d / 2, rtol=1e-12)
    np.testing.assert_allclose(h.lcf_m, 5.0, rtol=1e-12)
    np.testing.assert_allclose(h.waterplane_area_m2, 24.0, rtol=1e-12)
    np.testing.assert_allclose(h.it_m4, 32.0, rtol=1e-9)
    np.testing.assert_allclose(h.il_m4, 72.0, rtol=1e-9)
    # KMt = KB + I_T/∇ with I_T about the waterplane's own centre line (y = 3), not y = 0
    np.testing.assert_allclose(h.kmt_m, [0.25 + 32 / 12, 0.75 + 32 / 36], rtol=1e-9)
    np.testing.assert_allclose(h.kml_m, [0.25 + 72 / 12, 0.75 + 72 / 36], rtol=1e-9)
    np.testing.assert_allclose(h.tpc_t_cm, 1.025 * 24.0 / 100.0, rtol=1e-12)
    np.testing.assert_allclose(h.mctc_tm_cm, 1.025 * 72.0 / (100.0 * 6.0), rtol=1e-9)
    np.testing.assert_allclose(h.cb, 1.0, rtol=1e-12)
    np.testing.assert_allclose(h.cw, 1.0, rtol=1e-12)
    assert h.rule == "simpson"


def test_draft_for_volume_of_a_box():
    """Even keel upright the box displaces L·B·T: the draft for 400, 800, 1400 m³ is 1, 2, 3.5 m."""
    from deckload.core.geometry.hydrostatics_calc import draft_for_volume

    np.testing.assert_allclose(draft_for_volume(box_body(), np.array([400.0, 800.0, 1400.0])), [1.0, 2.0, 3.5],
                               atol=1e-9)
    np.testing.assert_allclose(draft_for_volume(box_body(), [800.0]), [2.0], atol=1e-9)


def test_a_level_search_turns_the_sections_once_and_finds_the_same_levels(monkeypatch):
    """A level search turns the sections into each heel once per chunk of cases and keeps them for
    every later step (body._LevelCuts); the levels are bit for bit those found when the sections
    are turned again at every step (the same operations on the same values), and each holds its
    volume (∇(c) = target to the search's 1e-11 relative tolerance).  A V-bottomed hull of 9
    stations, 1200 cases (heels 0–60° to either side, 20–80 % of the volume): several chunks."""
    import deckload.core.geometry.body as body_mod

    xs = np.linspace(0.0, L, 9)
    wl = np.array([0.0, 0.5, 1.5, D])
    half = np.array([[0.5, 3.0, 4.5, 5.0]] * 9) * np.linspace(0.6, 1.0, 9)[:, None]
    body = Body(xs, *hull_sections(HullOffsets(xs, wl, half, np.full(9, D))))
    heels = np.radians(np.linspace(-60.0, 60.0, 40))[:, None] * np.ones((1, 30))
    full = float(volume_and_area(body, 1.0, 0.0, 10.0 * D)[0])
    target = full * np.linspace(0.2, 0.8, 30)[None, :] * np.ones((40, 1))

    calls = []
    turn = body_mod.heeled_edges
    monkeypatch.setattr(body_mod, "heeled_edges", lambda *a: calls.append(1) or turn(*a))
    kept = level_for_volume(body, np.cos(heels), np.sin(heels), target, S, XREF)
    chunks = -(-1200 // max(1, body_mod._CHUNK_ELEMENTS // body.y_m.size))
    assert chunks > 1 and len(calls) == chunks

    calls.clear()
    monkeypatch.setattr(body_mod, "_KEEP_TURNED_ELEMENTS", 0)
    again = level_for_volume(body, np.cos(heels), np.sin(heels), target, S, XREF)
    assert len(calls) > 3 * chunks  # turned again at every step
    assert np.array_equal(kept, again)
    vol, _ = volume_and_area(body, np.cos(heels), np.sin(heels), kept, S, XREF)
    np.testing.assert_allclose(vol, target, rtol=1e-10)
