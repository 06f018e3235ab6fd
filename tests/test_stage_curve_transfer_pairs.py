"""The transfer-corrected GZ curve heeling to port uses the partner's table for a paired tank, and
the caution naming the tanks that have no geometry is worded for the officer.

Sources.  GZ with the moment of fluid transfer (IS 2008 Part B 3.1, standards.md §4.1 and §4.3):

    GZ_stbd(φ) = KN(φ) − KG_solid·sinφ − Σρ·M(φ)/Δ − TCG·cosφ,
    GZ_port(φ) = KN(φ) − KG_solid·sinφ − Σρ·M'(φ)/Δ + TCG·cosφ,

where M is the tank's volumetric moment of transfer heeled to starboard (its table) and M' the same
tank heeled to port.  A tank heeled to port moves its liquid as its mirror image does heeled to
starboard, and the mirror image of one tank of a transverse pair is its partner: so M' is read from
the partner's table (stability.stage_curve; mirror symmetry, common practice).

The hull is the parallel-sided vessel of tests/vessel_factories.py, KN = KMt·sinφ (exact at the 5°
knots, so at 30° only round-off remains).  The tables are posed for these tests (not a real tank's):
M = 0 upright, empty and full, and the given value at 50 % fill between 29° and 31° heel, linear in
fill and heel between the rows (as free_surface.transfer_moment_m4 reads every table).  So at 30°:
M(50 %) = m and M(98 %) = m·(100 − 98)/50 = 0.04·m.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.model import Condition, FluidTransfer, FreeSurfaceSettings, MassItem, TankFill, frozen_array
from deckload.core.stability import evaluate
from vessel_factories import ParallelForm, box_tank, parallel_sided_vessel

KMT = 6.0
LS_T, LS_KG = 2000.0, 4.0
S30, C30 = 0.5, math.cos(math.radians(30.0))


def vessel(tanks):
    form = ParallelForm(displacement_t=2000.0, draft_m=6.0, lcb_m=50.0, lcf_m=50.0, kmt_m=KMT,
                        tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=100.0)
    # limit 0 m: no tank is small (IS 2008 B 3.1.12 ratio < 0 never holds), every slack tank counts
    fs = FreeSurfaceSettings(min_operating_displacement_t=1000.0, small_tank_limit_m=0.0)
    return parallel_sided_vessel(form, lightship=MassItem("Lightship", LS_T, 50.0, LS_KG, 0.0),
                                 tanks=tuple(tanks), free_surface=fs)


def posed_transfer(m_at_50_pct):
    fills = np.array([0.0, 50.0, 100.0])
    heels = np.array([0.0, 29.0, 31.0, 90.0])
    m = np.zeros((3, 4))
    m[1, 1:3] = m_at_50_pct
    return FluidTransfer(frozen_array(fills), frozen_array(heels), frozen_array(m))


def pair(kind, m_port_table, m_stbd_table, rho):
    """Box tanks 10 × 5 × 2 m at y = ∓3 m, bottom at the keel, with posed tables."""
    p = box_tank("T1P", length_m=10, breadth_m=5, height_m=2, lcg_m=50.0, tcg_m=-3.0, kind=kind,
                 density_t_m3=rho, pair="T1S")
    s = box_tank("T1S", length_m=10, breadth_m=5, height_m=2, lcg_m=50.0, tcg_m=3.0, kind=kind,
                 density_t_m3=rho, pair="T1P")
    return (dataclasses.replace(p, transfer=posed_transfer(m_port_table)),
            dataclasses.replace(s, transfer=posed_transfer(m_stbd_table)))


def expected_gz30(mass_t, vcg_m, tcg_m, rho, m_stbd, m_port):
    """GZ at 30° both ways by the module docstring's formulas, Δ, KG and TCG summed by hand."""
    disp = LS_T + mass_t
    kg = (LS_T * LS_KG + mass_t * vcg_m) / disp
    tcg = mass_t * tcg_m / disp
    stbd = KMT * S30 - kg * S30 - rho * m_stbd / disp - tcg * C30
    port = KMT * S30 - kg * S30 - rho * m_port / disp + tcg * C30
    return stbd, port


def test_port_tank_heeled_to_port_moves_as_its_partner_heeled_to_starboard():
    """Ballast pair (fixed level, counted at its actual level, IS 2008 B 3.1.3), fresh water 1.0 t/m³;
    port tank's table 2 m⁴ at 50 %, starboard tank's 8 m⁴.  T1P at 50 %: 10·5·1 = 50 m³ = 50 t at
    VCG 0.5 m, TCG −3 m; T1S empty (no free surface).  Heeled to starboard T1P contributes its own 2 m⁴,
    heeled to port its partner's 8 m⁴: Δ = 2050 t, KG = (8000 + 25)/2050 m, TCG = −150/2050 m, and

        GZ_stbd(30°) = 3 − 0.5·KG − 2/2050 − TCG·cos30°,  GZ_port(30°) = 3 − 0.5·KG − 8/2050 + TCG·cos30°.

    Tolerance 1e-9 m: every term is exact at the 30° knot to round-off (~1e-15 m); the two readings
    of the port moment differ by 6/2050 = 0.0029 m."""
    v = vessel(pair("ballast", 2.0, 8.0, 1.0))
    r = evaluate(v, Condition(tanks=(TankFill("T1P", "percent", 50.0),), gz_correction="transfer"))
    stbd, port = expected_gz30(50.0, 0.5, -3.0, 1.0, 2.0, 8.0)
    assert r.gz_m[30] == pytest.approx(stbd, abs=1e-9)
    assert r.gz_port_m[30] == pytest.approx(port, abs=1e-9)
    assert not [w for w in r.warnings if w.code == "fs-no-geometry"]


def test_full_cargo_tank_heeled_to_port_takes_its_partner_at_98_pct():
    """Cargo-liquid pair (ρ 0.9), T1P at 99 %: nominally full, a cargo tank is corrected at the 98 %
    level (IS 2008 B 3.1.2 footnote, free_surface.py); T1S empty.  Tables: port tank 50 m⁴ at 50 %,
    starboard tank 100 m⁴, so at 98 % M = 0.04·50 = 2 m⁴ and M' = 0.04·100 = 4 m⁴ (module docstring);
    at the actual 99 % they would be 1 and 2 m⁴.  T1P holds 99 m³ = 89.1 t at VCG 0.99 m, TCG −3 m."""
    v = vessel(pair("cargo_liquid", 50.0, 100.0, 0.9))
    r = evaluate(v, Condition(tanks=(TankFill("T1P", "percent", 99.0),), gz_correction="transfer"))
    stbd, port = expected_gz30(0.9 * 99.0, 0.99, -3.0, 0.9, 2.0, 4.0)
    assert r.gz_m[30] == pytest.approx(stbd, abs=1e-9)
    assert r.gz_port_m[30] == pytest.approx(port, abs=1e-9)


def test_tanks_without_geometry_are_named_in_one_caution():
    """Two slack ballast tanks given without a transfer table: with the transfer correction their moment
    is taken as i·sinφ (the small-angle value, standards.md §4.3), and one caution names both, in
    profile order (deckload's own wording)."""
    tanks = [box_tank(tid, length_m=10, breadth_m=5, height_m=2, lcg_m=50.0, density_t_m3=1.0)
             for tid in ("WB1C", "WB2C")]
    r = evaluate(vessel(tanks), Condition(tanks=(TankFill("WB1C", "percent", 50.0), TankFill("WB2C", "percent", 50.0)),
                                          gz_correction="transfer"))
    notes = [(w.code, w.message, w.severity) for w in r.warnings if w.code == "fs-no-geometry"]
    assert notes == [("fs-no-geometry", "no tank geometry for WB1C, WB2C: their transfer is taken as i·sinφ",
                      "caution")]
