"""Trim, drafts, list and the GZ correction for KG: textbook relations.

Sources: standards.md §6.3 (textbook formulas) and §8 rows 24–25 (derived there);
checks.md §4 [T] (Barrass & Derrett, *Ship Stability for Masters and Mates*, 5th ed.
(1999), pp.116–117 and p.165 Ex.2) and the 'further trim case' [A] of checks.md §4.
Each statement is posed as a condition on the parallel-sided vessel of
tests/vessel_factories.py (constant LCF, TPC, MCTC, KMt; LCB from the layer relation),
whose table rows fall on the displacements used, so interpolation adds nothing.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.model import Condition, CrossCurves, DeckItem, MassItem, frozen_array
from deckload.core.stability import evaluate
from deckload.core.hydrostatics import fresh_water_allowance_m, permitted_draft_m
from deckload.core.model import LoadLine
from vessel_factories import (
    BARGE_B,
    ParallelForm,
    barge_at,
    deck_edge_angle_rad,
    mass_to_close,
    parallel_sided_vessel,
)


def test_trim_and_drafts_standards_row_24():
    """standards.md §8 row 24 (textbook, derived): Δ = 10 000 t, G 0.5 m aft of B, MCTC 150 t·m/cm,
    LBP 100, x_F = 48 m, T_F = 6.00 m: t = Δ·(LCB − LCG)/(100·MCTC) = 0.333 m by the stern;
    Ta = T_F + t·x_F/LBP = 6.160 m, Tf = T_F − t·(LBP − x_F)/LBP = 5.827 m."""
    f = ParallelForm(displacement_t=10_000.0, draft_m=6.0, lcb_m=50.0, lcf_m=48.0, kmt_m=8.0,
                     tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=100.0)
    v = parallel_sided_vessel(f, lightship=MassItem("All weights", 10_000.0, 49.5, 6.0, 0.0))
    r = evaluate(v, Condition())
    t = 10_000.0 * 0.5 / (100 * 150.0)
    assert r.trim_m == pytest.approx(t, abs=1e-12)
    assert round(r.trim_m, 3) == 0.333
    assert r.draft_at_lcf_m == pytest.approx(6.0, abs=1e-12)
    assert r.draft_aft_m == pytest.approx(6.0 + t * 48 / 100, abs=1e-12)
    assert r.draft_fwd_m == pytest.approx(6.0 - t * 52 / 100, abs=1e-12)
    assert round(r.draft_aft_m, 3) == 6.160 and round(r.draft_fwd_m, 3) == 5.827
    # Midships draft (the load-line draft) lies on the same straight line: T_F + t·(x_F − L/2)/L.
    assert r.draft_mean_m == pytest.approx(6.0 + t * (48 - 50) / 100, abs=1e-12)


def test_further_trim_case_checks_4():
    """checks.md §4 'further trim case' [A]: LBP 120, drafts F 6.00 / A 6.60, TPC 20, MCTC 150,
    LCF 57 m from AP; load 300 t at 40 m forward of midships (x = 100).  Sinkage 300/(100·20) =
    0.15 m; trim change 300·43/150 = 86 cm by the head; A 6.60 − 0.86·57/120 + 0.15 = 6.3415,
    F 6.00 + 0.86·63/120 + 0.15 = 6.6015.

    Posed: before loading the draft at the LCF is 6.60 − 0.60·57/120 = 6.315 at Δ0 = 10 000 t;
    LCB0 = 58 and LCG0 = LCB0 − 0.60·100·150/Δ0 = 57.1 give the 0.60 m trim by the stern.
    """
    f = ParallelForm(displacement_t=10_000.0, draft_m=6.315, lcb_m=58.0, lcf_m=57.0, kmt_m=8.0,
                     tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=120.0)
    lcg0 = 58.0 - 0.60 * 100 * 150.0 / 10_000.0
    v = parallel_sided_vessel(f, lightship=MassItem("Before loading", 10_000.0, lcg0, 6.0, 0.0),
                              extra_displacements_t=(10_300.0,))
    before = evaluate(v, Condition())
    assert before.draft_fwd_m == pytest.approx(6.00, abs=1e-12)
    assert before.draft_aft_m == pytest.approx(6.60, abs=1e-12)
    after = evaluate(v, Condition(deck_items=(DeckItem("Cargo", 300.0, 100.0, 6.0),)))
    assert after.draft_at_lcf_m == pytest.approx(6.315 + 300 / (100 * 20), abs=1e-12)
    assert after.trim_m == pytest.approx(0.60 - 300 * 43 / 150 / 100, abs=1e-12)
    assert after.draft_aft_m == pytest.approx(6.3415, abs=1e-9)
    assert after.draft_fwd_m == pytest.approx(6.6015, abs=1e-9)


@pytest.mark.parametrize("tcg, gm, expected_deg", [(0.05, 1.00, 2.862), (-0.05, 1.00, -2.862)])
def test_list_standards_row_25(tcg, gm, expected_deg):
    """standards.md §8 row 25 (textbook, derived): tanφ = TCG/GM_fluid; TCG 0.05 m, GM 1.00 m → 2.862°
    to starboard (negative TCG: to port).  On the metacentric cross curves (KN = KM·sinφ) GZ is
    GM·sinφ − TCG·cosφ, which is zero exactly there, so the GZ curve agrees."""
    f = ParallelForm(displacement_t=5000.0, draft_m=4.0, lcb_m=50.0, lcf_m=50.0, kmt_m=7.0,
                     tpc_t_cm=15.0, mctc_tm_cm=80.0, lbp_m=100.0)
    v = parallel_sided_vessel(f, lightship=MassItem("All weights", 5000.0, 50.0, 7.0 - gm, tcg))
    r = evaluate(v, Condition())
    assert r.tcg_m == pytest.approx(tcg, abs=1e-15)
    assert math.degrees(math.atan(tcg / gm)) == pytest.approx(expected_deg, abs=5e-4)
    assert r.list_deg == pytest.approx(expected_deg, abs=5e-4)  # printed to 3 dp
    assert r.criteria_side == ("starboard" if tcg > 0 else "port")
    gz_on_side = r.gz_m if tcg > 0 else r.gz_port_m
    assert gz_on_side[2] < 0 < gz_on_side[3]  # the curve crosses zero between 2° and 3°


def test_list_barrass_derrett_pp116_117():
    """Barrass & Derrett 5th ed. pp.116–117 (checks.md §4 row 1): Δ 8000, KG 7.6, KM 8.7; load 250 t
    at KG 6.1, 7.6 m to starboard; load 300 t of fuel at KG 0.6, 6.1 m to port; discharge 50 t of
    ballast at KG 1.2, 4.6 m to port.  The first item (250 t at KG 6.1, 7.6 m to starboard) is
    reconstructed from the book's printed solution table, not read from its question.
    Book: KG 7.35, GM 1.35, GG1 0.035 m to starboard; the book's final angle was not visible.
    Recomputed here (not the book's figure): Δ 8500, KG 7.34647, GM 1.35353, listing moment
    250·7.6 − 300·6.1 + 50·4.6 = 300 t·m, GG1 0.035294, list atan(GG1/GM) = 1.49368°
    (1.485° with the book's rounded 0.035 and 1.35)."""
    f = ParallelForm(displacement_t=8000.0, draft_m=7.0, lcb_m=60.0, lcf_m=60.0, kmt_m=8.7,
                     tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=120.0)
    rest = mass_to_close(8000.0, (60.0, 7.6, 0.0), [(50.0, 60.0, 1.2, -4.6)])  # ballast still aboard
    v = parallel_sided_vessel(f, lightship=rest, extra_displacements_t=(8500.0,))
    before = evaluate(v, Condition(constants=(MassItem("Ballast", 50.0, 60.0, 1.2, -4.6),)))
    assert before.kg_m == pytest.approx(7.6, abs=1e-12) and before.tcg_m == pytest.approx(0.0, abs=1e-12)
    after = evaluate(v, Condition(deck_items=(DeckItem("Cargo", 250.0, 60.0, 6.1, 7.6),
                                              DeckItem("Fuel", 300.0, 60.0, 0.6, -6.1))))
    assert after.displacement_t == pytest.approx(8500.0, abs=1e-9)
    assert after.kg_m == pytest.approx(7.34647, abs=5e-6) and round(after.kg_m, 2) == 7.35
    assert after.gm_fluid_m == pytest.approx(1.35353, abs=5e-6) and round(after.gm_fluid_m, 2) == 1.35
    assert after.tcg_m * after.displacement_t == pytest.approx(300.0, abs=1e-9)
    assert after.tcg_m == pytest.approx(0.035294, abs=5e-7)
    # recomputed (docstring); KN = KM·sinφ on this vessel makes tanφ = TCG/GM exact, and the crossing of
    # the 0.1° GZ grid is good to 1e-5° (linear chord of GM·sinφ − TCG·cosφ over one step)
    assert after.list_deg == pytest.approx(1.49368, abs=1e-5 + 5e-6)  # + half a unit of the 5th dp


def test_gz_for_another_kg_barrass_derrett_p165_ex2():
    """Barrass & Derrett 5th ed. p.165 Ex.2 (checks.md §4 row 4): GZ tabulated for an assumed KG of
    9 m at 0/15/…/90° is 0, 0.81, 1.90, 2.24, 1.70, 0.68, −0.49 (the last sign inferred in checks.md);
    for the actual KG 8.5 m, GZ = GZ_tab + (KG_tab − KG)·sinφ = 0, 0.94, 2.15, 2.59, 2.13, 1.16, 0.01
    (book, 2 dp).  Posed as cross curves KN = GZ_tab + 9·sinφ at those heels."""
    heels = np.arange(0.0, 91.0, 15.0)
    gz_tab = np.array([0.0, 0.81, 1.90, 2.24, 1.70, 0.68, -0.49])
    kn = gz_tab + 9.0 * np.sin(np.radians(heels))
    f = ParallelForm(displacement_t=10_000.0, draft_m=7.0, lcb_m=60.0, lcf_m=60.0, kmt_m=10.0,
                     tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=120.0)
    v = parallel_sided_vessel(f, lightship=MassItem("All weights", 10_000.0, 60.0, 8.5, 0.0))
    cc = CrossCurves(frozen_array(heels), v.cross_curves.displacement_t,
                     frozen_array(np.tile(kn, (len(v.cross_curves.displacement_t), 1))))
    v = dataclasses.replace(v, cross_curves=cc)
    r = evaluate(v, Condition())
    book = [0.0, 0.94, 2.15, 2.59, 2.13, 1.16, 0.01]
    for h, gt, b in zip(heels, gz_tab, book):
        deg = int(h)
        assert r.gz_m[deg] == pytest.approx(gt + 0.5 * math.sin(math.radians(h)), abs=1e-12)
        assert round(r.gz_m[deg], 2) == pytest.approx(b, abs=1e-9)


def _wall_sided_list_deg(gm: float, bm: float, tcg: float) -> float:
    """Root of tanφ·(GM + ½·BM·tan²φ) = TCG by bisection (the left side rises with φ for GM > 0)."""
    lo, hi = 0.0, 10.0
    for _ in range(200):
        mid = (lo + hi) / 2
        if mid * (gm + 0.5 * bm * mid * mid) < tcg:
            lo = mid
        else:
            hi = mid
    return math.degrees(math.atan(lo))


@pytest.mark.parametrize("kg, tcg", [(3.0, 0.2), (4.5, 0.1), (5.0, 0.05), (5.0, 0.10)])
@pytest.mark.parametrize("step, tol", [(1.0, 0.05), (5.0, 1.0)])
def test_large_list_from_the_gz_curve(kg, tcg, step, tol):
    """List is the angle where the righting lever balances the transverse offset of G.

    Analytic (box barge T = 2, checks.md §1): below deck-edge immersion (21.8°) the wall-sided
    GZ = sinφ·(GM + ½·BM·tan²φ) − TCG·cosφ (derived in test_reference_box_barge), so the list solves
    tanφ·(GM + ½·BM·tan²φ) = TCG, BM = B²/(12T).  tanφ = TCG/GM (standards.md §6.3) is its
    small-angle limit only: for GM 0.167 m and TCG 0.05 m it gives 16.7° where she lists 11.3°.
    From a 1° table within 0.05°; from the 5° table within UR L5's 1° for equilibrium angles
    (standards.md §5.3)."""
    v, c = barge_at(2.0, kg, heel_step_deg=step, lightship_tcg_m=tcg)
    r = evaluate(v, c)
    expected = _wall_sided_list_deg(r.gm_fluid_m, BARGE_B**2 / 24.0, tcg)
    assert expected < math.degrees(deck_edge_angle_rad(BARGE_B, 4.0, 2.0))
    assert r.list_deg == pytest.approx(expected, abs=tol)


def test_fwa_and_dwa_standards_row_23():
    """standards.md §8 row 23: FWA = Δ/(4·TPC) mm [C]: Δ 20 000 t, TPC 25 → 200 mm; DWA at
    1.010 t/m³ = FWA·(1.025 − 1.010)/0.025 = 120 mm [M formula].  checks.md §4 row 12 (Derrett
    exercise, recomputed): FWA 180 mm, dock water 1.010 → DWA 108 mm."""
    assert fresh_water_allowance_m(20_000.0, 25.0) == pytest.approx(0.200, abs=1e-12)
    assert permitted_draft_m(8.0, 0.200, 1.010) - 8.0 == pytest.approx(0.120, abs=1e-12)
    assert permitted_draft_m(8.0, 0.200, 1.000) - 8.0 == pytest.approx(0.200, abs=1e-12)
    assert permitted_draft_m(6.7, 0.180, 1.010) - 6.7 == pytest.approx(0.108, abs=1e-12)


@pytest.mark.parametrize("density, extra_t, over", [
    (1.025, -1.0, False), (1.025, 1.0, True),   # at the summer mark in sea water
    (1.000, -1.0, False), (1.000, 2.0, True),    # fresh water: the mark may sink by FWA = 50 mm
    (1.010, 1.0, True),
])
def test_load_line_warning_with_fwa(density, extra_t, over):
    """Summer mark at 2.000 m on the barge (Δ 820 t, TPC 4.1, FWA = 820/(4·4.1) = 50 mm; checks.md §1.1).
    In water of density ρ the midships draft may reach summer + FWA·(1.025 − ρ)/0.025
    (standards.md §6.1: FWA [C], DWA [M]).  Exactly at the allowed draft she floats at Δ·1.025/ρ
    in table terms; a tonne either side decides the warning (1 t = 1/TPC cm ≈ 2.4 mm of draft at
    TPC 4.1 t/cm)."""
    v, _ = barge_at(1.5, 3.0)  # lightship 615 t; the cargo brings her to the mark
    v = dataclasses.replace(v, load_lines=(LoadLine("summer", 2.0),))
    allowed = 2.0 + 0.050 * (1.025 - density) / 0.025
    # Δ that puts her exactly at the allowed draft in this water, then a tonne either side.
    disp_at_allowed = density * 40 * 10 * allowed
    extra = disp_at_allowed - v.lightship.mass_t + extra_t
    c = Condition(water_density_t_m3=density, constants=(MassItem("Cargo", extra, 20.0, 3.0),))
    r = evaluate(v, c)
    warned = any(w.code == "load-line" and w.severity == "danger" for w in r.warnings)
    assert warned is over
    assert r.draft_mean_m == pytest.approx(r.displacement_t / (density * 400.0), abs=1e-9)


@pytest.mark.parametrize("list_deg, warned", [(1.5, False), (2.5, True)])
def test_list_over_two_degrees_is_a_caution(list_deg, warned):
    """deckload cautions the watchkeeper when she lists more than 2° (its own aid).  On the parallel-sided
    vessel KN = KM·sinφ, so tanφ = TCG/GM exactly (checks.md §2.2 [A]): Δ 8000 t, KM 8.7, KG 7.6,
    GM 1.1 m and TCG = 1.1·tan(list) to starboard."""
    f = ParallelForm(displacement_t=8000.0, draft_m=7.0, lcb_m=60.0, lcf_m=60.0, kmt_m=8.7,
                     tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=120.0)
    tcg = 1.1 * math.tan(math.radians(list_deg))
    v = parallel_sided_vessel(f, lightship=MassItem("Ship", 8000.0, 60.0, 7.6, tcg))
    r = evaluate(v, Condition())
    assert r.list_deg == pytest.approx(list_deg, abs=1e-5)  # the 0.1° grid crossing, as above
    got = [w for w in r.warnings if w.code == "list"]
    assert bool(got) is warned
    if warned:
        assert got[0].severity == "caution"
        assert got[0].message == "list 2.5° to starboard exceeds 2°"
