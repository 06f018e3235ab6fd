"""A box vessel in fresh water and in dock water, against closed forms at the actual density.

The tables of every vessel are made for one water density ρt (1.025 t/m³ here,
standards.md §6.1 [C]).  Afloat in water of density ρw she displaces ∇ = Δ/ρw, so every
quantity that depends on the immersed shape is that of the table at the equivalent
displacement Δ·ρt/ρw, and every quantity that is a weight or a moment per unit of
immersion (TPC, MCTC) scales with ρw (standards.md §6.3: TPC = A_wp·ρ/100,
MCTC = Δ·GM_L/(100·L)).  The free-surface correction and the trim are worked from the
actual Δ: both are moments divided by the mass that carries them.

Analytic vessel (checks.md §1.1 [A], with ρ → ρw): box L = 40, B = 10, D = 4 m, one
box ballast tank l = 6, b = 4, h = 2 m at 50 % (24 m³) on the centre line at midships
(x = 20), bottom on the keel, VCG 0.5 m.  The lightship is chosen
so that the whole ship has Δ = ρw·L·B·T with T = 2.000 m, KG solid 3.000 m and LCG
19.500 m (0.5 m aft of the LCB at midships).  Then, in any water ρw:

* draft at the LCF T = Δ/(ρw·L·B) = 2.000 m (a table row: no interpolation error);
* KB = T/2 = 1, BMt = B²/(12T) = 4.16667, KMt = 5.16667 m: shape only, density-free;
* TPC = ρw·L·B/100 = 4·ρw t/cm;
* GML = KB + L²/(12T) − KG.  With the profile's KML column the program takes G at KG fluid:
  GML = 67.6667 − (3 + FSC) and MCTC = Δ·GML/(100·L), Δ the actual displacement.  Without a KML
  column it scales the tabulated MCTC (made here with KG 3, GML 64.6667) by ρw/ρt:
  MCTC = ρw·800·64.6667/4000 = 12.93333·ρw t·m/cm;
* FSM = ρ_liquid·l·b³/12 = 1.025·32 = 32.8 t·m; FSC = FSM/Δ (standards.md §4.3);
  KG fluid = 3 + FSC; GM solid = 2.16667; GM fluid = 2.16667 − FSC;
* trim t = Δ·(LCB − LCG)/(100·MCTC) = L·(LCB − LCG)/GML: with the table's MCTC 40·0.5/64.6667
  = 0.309278 m by the stern whatever the density (the Δ cancels, standards.md §6.3); with KML,
  40·0.5/(64.6667 − FSC), where FSC = FSM/Δ does depend on the water;
* drafts about the LCF at midships: T_A = T + t/2 = 2.154639, T_F = T − t/2 = 1.845361 m;
* GZ(30°) = KN(T = 2, 30°) − KG_fluid·sin30, KN = 2.58771 m (checks.md §1.2 [A]).

With a wrong density treatment each of these moves by a factor 1.025/ρw, i.e. by 2.5 %
in fresh water and 1.5 % in dock water of 1.010 t/m³ (a dock-water density used in
textbook examples, checks.md §4 row 12): far more than the round-off tolerances below.
"""

from __future__ import annotations

import dataclasses
import math

import pytest

from deckload.core.model import Condition, TankFill
from deckload.core.stability import evaluate
from vessel_factories import RHO_SW, box_barge, box_kn_m, box_tank, box_transfer_moment_m4

L, B, T, KG, LCG = 40.0, 10.0, 2.0, 3.0, 19.5
TANK_V = 6.0 * 4.0 * 1.0  # m³ at 50 % of a 2 m deep 6 × 4 tank
I_TANK = 6.0 * 4.0**3 / 12.0  # 32 m⁴
GML = T / 2 + L**2 / (12 * T) - KG  # 64.6667 m
#: Round-off only: every value is a closed form evaluated on a table row (no interpolation).
EXACT = 1e-9


def vessel_in(rho_w: float, tank_density: float = RHO_SW, with_transfer: bool = False):
    """The analytic box at T = 2.000 m in water ρw, with KG solid 3 and LCG 19.5 (module docstring)."""
    disp = rho_w * L * B * T
    w_tank = tank_density * TANK_V
    ls = disp - w_tank
    tank = box_tank("DB1C", length_m=6.0, breadth_m=4.0, height_m=2.0, lcg_m=20.0, with_transfer=with_transfer)
    v = box_barge(lightship_t=ls, lightship_kg_m=(KG * disp - w_tank * 0.5) / ls,
                  lightship_lcg_m=(LCG * disp - w_tank * 20.0) / ls, tanks=(tank,), mctc_kg_m=KG)
    return v, disp


def without_kml(v):
    """The same vessel with no KML column: the trim is then worked from the tabulated MCTC."""
    return dataclasses.replace(v, hydrostatics=dataclasses.replace(v.hydrostatics, kml_m=None))


@pytest.mark.parametrize("with_kml", [True, False])
@pytest.mark.parametrize("rho_w", [1.000, 1.010, 1.025])
def test_box_vessel_in_water_of_any_density(rho_w, with_kml):
    """Closed forms of the module docstring at ρw = 1.000 (fresh), 1.010 (dock) and 1.025 (sea)."""
    v, disp = vessel_in(rho_w)
    if not with_kml:
        v = without_kml(v)
    r = evaluate(v, Condition(water_density_t_m3=rho_w, tanks=(TankFill("DB1C", "percent", 50.0),),
                              fs_rule="actual"))
    assert r.displacement_t == pytest.approx(disp, abs=EXACT)
    assert r.kg_m == pytest.approx(KG, abs=EXACT) and r.lcg_m == pytest.approx(LCG, abs=EXACT)
    fsm = RHO_SW * I_TANK  # 32.8 t·m: the liquid's density, not the sea's
    fsc = fsm / disp  # FW 0.041000, dock 0.040594, SW 0.040000 m
    assert r.fsm_total_tm == pytest.approx(32.8, abs=EXACT)
    assert r.fsc_m == pytest.approx(fsc, abs=EXACT)
    assert r.kg_fluid_m == pytest.approx(KG + fsc, abs=EXACT)
    assert r.draft_at_lcf_m == pytest.approx(T, abs=EXACT)
    assert r.km_m == pytest.approx(1.0 + 100.0 / 24.0, abs=EXACT)  # 5.16667
    assert r.gm_solid_m == pytest.approx(1.0 + 100.0 / 24.0 - KG, abs=EXACT)  # 2.16667
    assert r.gm_fluid_m == pytest.approx(1.0 + 100.0 / 24.0 - KG - fsc, abs=EXACT)
    assert r.tpc_t_cm == pytest.approx(rho_w * L * B / 100.0, abs=EXACT)  # 4.00 / 4.04 / 4.10
    gml = GML - fsc if with_kml else GML  # G at KG fluid with KML; the table's KG 3 without
    assert r.mctc_tm_cm == pytest.approx(disp * gml / (100.0 * L), abs=EXACT)  # = 12.9333·ρw without KML
    trim = L * (L / 2 - LCG) / gml  # 0.309278 m by the stern from the table's MCTC, in every water
    assert L * (L / 2 - LCG) / GML == pytest.approx(0.309278, abs=5e-7)
    assert r.trim_m == pytest.approx(trim, abs=EXACT)
    assert r.draft_aft_m == pytest.approx(T + trim / 2, abs=EXACT)
    assert r.draft_fwd_m == pytest.approx(T - trim / 2, abs=EXACT)
    assert r.draft_mean_m == pytest.approx(T, abs=EXACT)
    kn30 = box_kn_m(B, 4.0, T, math.radians(30.0))
    assert kn30 == pytest.approx(2.58771, abs=5e-6)  # checks.md §1.2 [A], printed to 5 dp
    assert r.gz_m[30] == pytest.approx(kn30 - (KG + fsc) * 0.5, abs=EXACT)


def test_fresh_water_numbers_written_out():
    """The fresh-water case with no KML column (trim from the tabulated MCTC), its numbers written out
    so a reader can check them by hand: Δ = 1.000·40·10·2 = 800 t; FSC = 32.8/800 = 0.041 m (not
    32.8/820 = 0.040, the table-water displacement); TPC 4.00 (not 4.10); MCTC 800·64.6667/4000 =
    12.9333 (not 13.2567, the table's sea-water value); trim 0.309278 m (not 0.309278·1.025 = 0.317010
    from the table Δ, nor 0.309278/1.025 = 0.301735 from an unscaled MCTC)."""
    v, _ = vessel_in(1.000)
    r = evaluate(without_kml(v), Condition(water_density_t_m3=1.000, tanks=(TankFill("DB1C", "percent", 50.0),),
                                           fs_rule="actual"))
    # printed values rounded to the digits shown: half a unit of the last digit
    assert r.displacement_t == pytest.approx(800.0, abs=EXACT)
    assert r.fsc_m == pytest.approx(0.041, abs=EXACT)
    assert r.tpc_t_cm == pytest.approx(4.00, abs=EXACT)
    assert r.mctc_tm_cm == pytest.approx(12.9333, abs=5e-5)
    assert r.trim_m == pytest.approx(0.309278, abs=5e-7)
    assert r.gm_fluid_m == pytest.approx(2.125667, abs=5e-7)


def test_transfer_correction_uses_the_condition_density():
    """The GZ correction by the actual moment of fluid transfer (IS 2008 Part B 3.1, standards.md §4.1)
    is ρ·M(φ)/Δ with ρ the density of the liquid actually in the tank.  Here the ballast tank (default
    1.025) holds fresh water, ρ = 1.000 t/m³, stated in the condition; the ship floats in sea water at
    Δ = 820 t, T = 2 m.  Box tank l = 6, b = 4, h = 2 at 50 %: M(30°) = 6 + 7√3 = 18.12436 m⁴
    (checks.md §3.2 [A]), so GZ(30°) = KN − KG_solid·sin30 − 1.000·18.12436/820; with the tank's
    default density it would be 0.000553 m lower.  GM fluid uses i at 0°: FSM = 1.000·32 = 32 t·m."""
    rho_liquid = 1.000
    v, disp = vessel_in(RHO_SW, tank_density=rho_liquid, with_transfer=True)
    c = Condition(tanks=(TankFill("DB1C", "percent", 50.0, density_t_m3=rho_liquid),),
                  gz_correction="transfer", fs_rule="actual")
    r = evaluate(v, c)
    assert disp == pytest.approx(820.0, abs=EXACT)
    assert r.displacement_t == pytest.approx(820.0, abs=EXACT) and r.kg_m == pytest.approx(KG, abs=EXACT)
    assert r.fsm_total_tm == pytest.approx(rho_liquid * I_TANK, abs=EXACT)
    m30 = 6 + 7 * math.sqrt(3)
    assert box_transfer_moment_m4(6, 4, 2, 50.0, math.radians(30)) == pytest.approx(m30, abs=EXACT)
    for deg in (10, 20, 30, 40):
        phi = math.radians(deg)
        m = box_transfer_moment_m4(6, 4, 2, 50.0, phi)
        expected = box_kn_m(B, 4.0, T, phi) - KG * math.sin(phi) - rho_liquid * m / 820.0
        assert r.gz_m[deg] == pytest.approx(expected, abs=EXACT)
    assert r.gz_m[30] == pytest.approx(2.58771 - 1.5 - m30 / 820.0, abs=5e-6)  # KN printed to 5 dp
