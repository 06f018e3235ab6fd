"""Free-surface moments, the free-surface correction and the IS Code 2008 Part B 3.1 treatment.

Sources: standards.md §4 (IS Code 2008 Part B 3.1; textbook formulas §4.3) and §8 rows
15–17; checks.md §3 [A] and §4 [T]: Barrass & Derrett, *Ship Stability for Masters and
Mates*, 5th ed. (1999), p.195 Ex.1; and analytic results derived in the docstrings from the
textbook formulas of standards.md §4.3 and §6.3 (the numbers of checks.md §4 rows 9–11 are
used as inputs; their source, a course tutorial sheet, is not a published source and is not
relied on for any expected value).  Textbook statements ('Δ 7600, KM …, a slack tank of …') are
posed as conditions on the parallel-sided vessel of tests/vessel_factories.py, whose
tables give exactly the KM, LCF, MCTC the book states.
"""

from __future__ import annotations

import math

import pytest

from deckload.core.model import Condition, DeckItem, FreeSurfaceSettings, MassItem, TankFill
from deckload.core.stability import evaluate
from vessel_factories import (
    RHO_SW,
    ParallelForm,
    barge_at,
    box_barge,
    box_kn_m,
    box_tank,
    box_transfer_moment_m4,
    mass_to_close,
    parallel_sided_vessel,
)

X_MID = 50.0  # LCB = LCF = LCG at midships of the 100 m test vessel: no trim


def form(displacement_t: float, kmt_m: float) -> ParallelForm:
    return ParallelForm(displacement_t=displacement_t, draft_m=6.0, lcb_m=X_MID, lcf_m=X_MID, kmt_m=kmt_m,
                        tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=100.0)


def tank_by_id(result, tid):
    return {t.id: t for t in result.tanks}[tid]


# --------------------------------------------------------------------------- textbook formulas


@pytest.mark.parametrize("n", [1, 2, 4])
def test_rectangular_surface_and_subdivision(n):
    """standards.md §8 row 17 (textbook, derived) and §4.3: tank l = 10, b = 8 in sea water,
    Δ = 10 000 t: i = l·b³/12 = 426.67 m⁴, FSM = ρ·i = 437.33 t·m, FSC = FSM/Δ = 0.0437 m;
    n equal longitudinal subdivisions give i/n² (centre bulkhead: FSM 109.33 t·m; checks.md §3.1)."""
    l, b = 10.0, 8.0
    tanks = []
    for k in range(n):
        y = -b / 2 + b / n * (k + 0.5)
        tanks.append(box_tank(f"DB{k}", length_m=l, breadth_m=b / n, height_m=2.0, lcg_m=X_MID, tcg_m=y))
    w_tank = RHO_SW * l * b * 1.0  # every part at 50 % (1 m of 2 m)
    ls = mass_to_close(10_000.0, (X_MID, 8.0, 0.0), [(w_tank, X_MID, 0.5, 0.0)])
    v = parallel_sided_vessel(form(10_000.0, 9.0), lightship=ls, tanks=tuple(tanks))
    c = Condition(tanks=tuple(TankFill(t.id, "percent", 50.0) for t in tanks), fs_rule="actual")
    r = evaluate(v, c)
    i_whole = l * b**3 / 12
    assert i_whole == pytest.approx(426.67, abs=0.005)
    assert r.displacement_t == pytest.approx(10_000.0, abs=1e-9)
    for t in r.tanks:
        assert t.fsi_m4 == pytest.approx(l * (b / n) ** 3 / 12, rel=1e-12)
    assert r.fsm_total_tm == pytest.approx(RHO_SW * i_whole / n**2, rel=1e-12)
    assert r.fsc_m == pytest.approx(RHO_SW * i_whole / n**2 / 10_000.0, rel=1e-12)
    # KG solid 8.0 and KM 9.0 by construction: KG fluid = 8 + FSC, GM solid 1.0, GM fluid 1.0 − FSC
    fsc = RHO_SW * i_whole / n**2 / 10_000.0
    assert r.kg_m == pytest.approx(8.0, abs=1e-12)
    assert r.kg_fluid_m == pytest.approx(8.0 + fsc, abs=1e-12)
    assert r.gm_solid_m == pytest.approx(1.0, abs=1e-12)
    assert r.gm_fluid_m == pytest.approx(1.0 - fsc, abs=1e-12)
    # standards.md §8 row 17 (textbook, derived there) states FSM 437.33 t·m and FSC 0.0437 m undivided
    # and 109.33 t·m with one centre bulkhead, to 2 dp (tolerance: half a unit of the last digit).
    # n = 4 is not stated there: 1.025·426.67/16 = 27.33 t·m is derived here by the same i/n² rule.
    stated = {1: (437.33, 0.0437), 2: (109.33, None), 4: (27.33, None)}[n]
    assert r.fsm_total_tm == pytest.approx(stated[0], abs=0.005)
    if stated[1] is not None:
        assert r.fsc_m == pytest.approx(stated[1], abs=5e-5)


def test_fluid_gm_from_solid_gm_and_fsm():
    """Analytic (standards.md §4.3, textbook: GM_fluid = GM_solid − FSM/Δ), with the inputs of
    checks.md §4 row 9: solid GM 1.02 m, Δ 7600 t, FSM 1250 t·m →
    fluid GM = 1.02 − 1250/7600 = 0.855526 m.  Posed with one slack ballast tank
    of breadth 10 m and length 12·1250/(ρ·10³) so that ρ·l·b³/12 = 1250 t·m, KM 8.0, KG 6.98."""
    b = 10.0
    l = 12 * 1250.0 / (RHO_SW * b**3)
    tank = box_tank("DB1", length_m=l, breadth_m=b, height_m=2.0, lcg_m=X_MID)
    w = RHO_SW * l * b * 1.0
    ls = mass_to_close(7600.0, (X_MID, 8.0 - 1.02, 0.0), [(w, X_MID, 0.5, 0.0)])
    v = parallel_sided_vessel(form(7600.0, 8.0), lightship=ls, tanks=(tank,))
    r = evaluate(v, Condition(tanks=(TankFill("DB1", "percent", 50.0),), fs_rule="actual"))
    assert r.displacement_t == pytest.approx(7600.0, abs=1e-9)
    assert r.gm_solid_m == pytest.approx(1.02, abs=1e-9)
    assert r.fsm_total_tm == pytest.approx(1250.0, abs=1e-9)
    assert r.gm_fluid_m == pytest.approx(1.02 - 1250.0 / 7600.0, abs=1e-9)
    assert r.gm_fluid_m == pytest.approx(0.855526, abs=5e-7)


def test_barrass_derrett_p195_ex1_double_bottom_pumped_to_half():
    """Barrass & Derrett 5th ed. p.195 Ex.1 (checks.md §4 row 6; answer recomputed there):
    Δ 8153.75 t, KM 8, KG 7.5; DB tank 15 × 10 × 2 m full of sea water is pumped out to half.
    153.75 t leave at KG 1.5 → Δ 8000, KG = (8153.75·7.5 − 153.75·1.5)/8000 = 7.61531,
    FSC = ρ·(15·10³/12)/8000 = 0.16016, GM fluid = 8 − 7.61531 − 0.16016 = 0.22453."""
    tank = box_tank("DB1", length_m=15.0, breadth_m=10.0, height_m=2.0, lcg_m=X_MID)
    full = RHO_SW * 300.0
    ls = mass_to_close(8153.75, (X_MID, 7.5, 0.0), [(full, X_MID, 1.0, 0.0)])
    v = parallel_sided_vessel(form(8000.0, 8.0), lightship=ls, tanks=(tank,))
    before = evaluate(v, Condition(tanks=(TankFill("DB1", "percent", 100.0),)))
    assert before.displacement_t == pytest.approx(8153.75, abs=1e-9)
    assert before.kg_m == pytest.approx(7.5, abs=1e-12)
    assert before.fsm_total_tm == 0.0 and tank_by_id(before, "DB1").state == "full"
    r = evaluate(v, Condition(tanks=(TankFill("DB1", "percent", 50.0),)))
    assert r.displacement_t == pytest.approx(8000.0, abs=1e-9)
    assert r.kg_m == pytest.approx((8153.75 * 7.5 - 153.75 * 1.5) / 8000.0, abs=1e-12)
    assert r.kg_m == pytest.approx(7.61531, abs=5e-6)
    assert r.fsc_m == pytest.approx(RHO_SW * 15 * 10**3 / 12 / 8000.0, abs=1e-12)
    assert r.fsc_m == pytest.approx(0.16016, abs=5e-6)
    assert r.gm_fluid_m == pytest.approx(0.22453, abs=5e-6)


def test_list_from_slack_side_tank():
    """Analytic (standards.md §6.3 weight sums and tanφ = TCG/GM_fluid; §4.3 FSM = ρ·l·b³/12), with the
    inputs of checks.md §4 row 10: Δ 9600, KM 8.5, KG 7.5; DB tank 18 × 14 m
    with a centreline bulkhead; the starboard side filled to 0.6 m with oil RD 0.95 (KG 0.3,
    TCG 3.5).  w = 18·7·0.6·0.95 = 71.82 t; KG 7.44653; FSM = 0.95·18·7³/12 = 488.775 t·m;
    GM fluid 1.00293; GG1 = 71.82·3.5/9671.82 = 0.025990; list = atan(GG1/GM) = 1.484433° = 1°29.07′.
    The parallel-sided vessel's KN = KM·sinφ makes tanφ = TCG/GM exact at any angle."""
    p = box_tank("DB1P", length_m=18.0, breadth_m=7.0, height_m=1.5, lcg_m=X_MID, tcg_m=-3.5, kind="fuel_oil",
                 density_t_m3=0.95, pair="DB1S")
    s = box_tank("DB1S", length_m=18.0, breadth_m=7.0, height_m=1.5, lcg_m=X_MID, tcg_m=3.5, kind="fuel_oil",
                 density_t_m3=0.95, pair="DB1P")
    ls = MassItem("Ship before loading", 9600.0, X_MID, 7.5, 0.0)
    v = parallel_sided_vessel(form(9600.0, 8.5), lightship=ls, tanks=(p, s))
    r = evaluate(v, Condition(tanks=(TankFill("DB1S", "sounding_m", 0.6),), fs_rule="actual"))
    w = 18 * 7 * 0.6 * 0.95
    assert w == pytest.approx(71.82, abs=1e-9)
    assert r.displacement_t == pytest.approx(9600 + w, abs=1e-9)
    assert r.kg_m == pytest.approx((9600 * 7.5 + w * 0.3) / (9600 + w), abs=1e-12)
    assert r.kg_m == pytest.approx(7.44653, abs=5e-6)
    assert r.fsm_total_tm == pytest.approx(0.95 * 18 * 7**3 / 12, abs=1e-9)
    assert r.gm_fluid_m == pytest.approx(1.00293, abs=5e-6)
    assert r.tcg_m == pytest.approx(w * 3.5 / (9600 + w), abs=1e-12)
    exact = math.degrees(math.atan((w * 3.5 / (9600 + w)) / (8.5 - r.kg_m - 488.775 / (9600 + w))))
    assert exact == pytest.approx(1.48443, abs=5e-6)  # 5 dp: half a unit of the last digit
    # The list is where GZ, on the 0.1° grid, crosses zero (linear between grid points): the chord of
    # GM·sinφ − TCG·cosφ over one 0.1° step is within 1e-5° of the root here.
    assert r.list_deg == pytest.approx(exact, abs=1e-5)


def test_suspended_weight_and_slack_tank():
    """Analytic (textbook: a suspended weight acts at its point of suspension, GG1 = w·d/Δ;
    FSC = ρ·i/Δ, standards.md §4.3), with the inputs of checks.md §4 row 11: Δ 8000, KM 6.5, KG 5.7; 40 t lifted from
    KG 3.0 by a derrick whose head is 15 m above the keel (its weight acts at the head); a slack
    fresh-water tank with i = 1200 m⁴.  Effective GM = 0.8 − 40·12/8000 − 1200·1.0/8000 = 0.59."""
    b = 10.0
    l = 12 * 1200.0 / b**3
    tank = box_tank("FW1", length_m=l, breadth_m=b, height_m=2.0, lcg_m=X_MID, kind="fresh_water",
                    density_t_m3=1.0)
    w_fw = 1.0 * l * b * 1.0
    ls = mass_to_close(8000.0, (X_MID, 5.7, 0.0), [(w_fw, X_MID, 0.5, 0.0), (40.0, X_MID, 3.0, 0.0)])
    v = parallel_sided_vessel(form(8000.0, 6.5), lightship=ls, tanks=(tank,))
    c = Condition(tanks=(TankFill("FW1", "percent", 50.0),), deck_items=(DeckItem("Lift at derrick head", 40.0, X_MID, 15.0),),
                  fs_rule="actual")
    r = evaluate(v, c)
    assert tank_by_id(r, "FW1").fsi_m4 == pytest.approx(1200.0, rel=1e-12)
    assert r.gm_fluid_m == pytest.approx(0.8 - 40 * (15 - 3) / 8000 - 1200 / 8000, abs=1e-9)
    assert r.gm_fluid_m == pytest.approx(0.59, abs=1e-9)  # 0.8 − 0.06 − 0.15 exactly


# --------------------------------------------------------------------------- IS 2008 Part B 3.1

DMIN = 1000.0


def b31_vessel():
    """Tanks for the Part B 3.1 cases, on a parallel-sided vessel with Δmin = 1000 t.

    ρ·i (t·m) of each: BW1P/S 1.025·10·5³/12 = 106.8; FO1P/S 0.95·8·4³/12 = 40.53 (pair 81.1);
    FO2C 0.95·6·4³/12 = 30.4; DO1C 0.86·5·6³/12 = 77.4; DO2P/S 0.86·5·4³/12 = 22.9 (pair 45.9);
    CG1C 0.85·8·6³/12 = 122.4; LO1C 0.9·1·1³/12 = 0.075; FW1C 1.0·4·4³/12 = 21.3.
    All but LO1C have Mfs(30°)/Δmin ≥ 0.5·ρ·i/1000 > 0.01 m: only LO1C is a small tank (B 3.1.12).
    """
    tanks = (
        box_tank("BW1P", length_m=10, breadth_m=5, height_m=2, lcg_m=40, tcg_m=-5, pair="BW1S"),
        box_tank("BW1S", length_m=10, breadth_m=5, height_m=2, lcg_m=40, tcg_m=5, pair="BW1P"),
        box_tank("FO1P", length_m=8, breadth_m=4, height_m=2, lcg_m=30, tcg_m=-6, kind="fuel_oil",
                 density_t_m3=0.95, pair="FO1S"),
        box_tank("FO1S", length_m=8, breadth_m=4, height_m=2, lcg_m=30, tcg_m=6, kind="fuel_oil",
                 density_t_m3=0.95, pair="FO1P"),
        box_tank("FO2C", length_m=6, breadth_m=4, height_m=2, lcg_m=20, kind="fuel_oil", density_t_m3=0.95),
        box_tank("DO1C", length_m=5, breadth_m=6, height_m=2, lcg_m=60, kind="diesel", density_t_m3=0.86),
        box_tank("DO2P", length_m=5, breadth_m=4, height_m=2, lcg_m=70, tcg_m=-5, kind="diesel",
                 density_t_m3=0.86, pair="DO2S"),
        box_tank("DO2S", length_m=5, breadth_m=4, height_m=2, lcg_m=70, tcg_m=5, kind="diesel",
                 density_t_m3=0.86, pair="DO2P"),
        box_tank("CG1C", length_m=8, breadth_m=6, height_m=2, lcg_m=50, kind="cargo_liquid", density_t_m3=0.85),
        box_tank("LO1C", length_m=1, breadth_m=1, height_m=1, lcg_m=80, kind="lube_oil", density_t_m3=0.9),
        box_tank("FW1C", length_m=4, breadth_m=4, height_m=2, lcg_m=85, kind="fresh_water", density_t_m3=1.0),
    )
    ls = MassItem("Lightship", 1800.0, X_MID, 4.0, 0.0)
    fs = FreeSurfaceSettings(min_operating_displacement_t=DMIN)
    return parallel_sided_vessel(form(2000.0, 6.0), lightship=ls, tanks=tanks, free_surface=fs,
                                 span_t=1500.0)


def rho_i(v, tid):
    t = v.tank(tid)
    return t.density_t_m3 * float(t.calibration.fsi_m4[0])


def fills(**pct):
    return tuple(TankFill(k, "percent", float(x)) for k, x in pct.items())


@pytest.mark.parametrize("pct, state, counted", [
    (99.0, "full", False), (98.0, "full", False), (97.9, "slack", True),
    (50.0, "worst_band", True), (30.0, "slack", True), (0.3, "empty", False), (0.0, "empty", False),
])
def test_fixed_level_tank_states(pct, state, counted):
    """IS 2008 B 3.1.2: at ≥ 98 % a tank is nominally full, no free surface (standards.md §8 row 15);
    B 3.1.3: a fixed-level (ballast) tank counts at its actual level; ≤ 0.5 % is taken as empty
    (the profile's empty_pct; remainder ignored, standards.md §4.1 [M]).  40–60 % is the
    default worst band for a tank without geometry (vessel_profiles/README.md)."""
    v = b31_vessel()
    r = evaluate(v, Condition(tanks=fills(BW1P=pct)))
    t = tank_by_id(r, "BW1P")
    assert t.state == state
    if counted:
        assert t.fsm_tm == pytest.approx(rho_i(v, "BW1P"), rel=1e-12)
        assert "actual level" in t.fs_rule and "B 3.1.3" in t.fs_rule
    else:
        assert t.fsm_tm == 0.0
        if state == "full":
            assert "nominally full" in t.fs_rule and "B 3.1.2" in t.fs_rule


def test_nominally_full_cargo_tank_counts_at_98():
    """IS 2008 B 3.1.2 footnote: a nominally full cargo tank is corrected at 98 % (standards.md §4.1);
    for a box tank i(98 %) = l·b³/12."""
    v = b31_vessel()
    r = evaluate(v, Condition(tanks=fills(CG1C=99.5)))
    t = tank_by_id(r, "CG1C")
    assert t.state == "full"
    assert t.fsm_tm == pytest.approx(0.85 * 8 * 6**3 / 12, rel=1e-12)
    assert "98" in t.fs_rule and "B 3.1.2" in t.fs_rule


def test_consumables_worst_pair_assumed_slack_even_when_full():
    """IS 2008 B 3.1.4 (standards.md §4.1 [C]): for each consumable kind at least one transverse
    pair or one centreline tank is assumed slack, the one with the greatest effect, at its
    largest correction (B 3.1.3).  Fuel: pair FO1 (2 × 40.53 t·m) beats centreline FO2C (30.4):
    FO1P/S count at ρ·i_max although full; FO2C, slack at 30 %, is variable-level and counts
    at its maximum too (B 3.1.3).  Diesel: centreline DO1C (77.4) beats pair DO2 (45.9), so
    DO1C counts though empty and the empty DO2 pair does not."""
    v = b31_vessel()
    r = evaluate(v, Condition(tanks=fills(FO1P=100, FO1S=100, FO2C=30, DO2P=50, DO2S=50)))
    fo1p, fo1s, fo2c = (tank_by_id(r, k) for k in ("FO1P", "FO1S", "FO2C"))
    assert fo1p.state == "full" and fo1s.state == "full"
    for t in (fo1p, fo1s):
        assert t.fsm_tm == pytest.approx(rho_i(v, t.id), rel=1e-12)
        assert "B 3.1.4" in t.fs_rule and "pair" in t.fs_rule
    assert fo2c.fsm_tm == pytest.approx(rho_i(v, "FO2C"), rel=1e-12)
    assert "variable" in fo2c.fs_rule and "B 3.1.3" in fo2c.fs_rule
    do1c = tank_by_id(r, "DO1C")
    assert do1c.state == "empty" and do1c.fsm_tm == pytest.approx(rho_i(v, "DO1C"), rel=1e-12)
    assert "B 3.1.4" in do1c.fs_rule and "centreline" in do1c.fs_rule
    # The diesel pair is slack at 50 %: variable level, counted at its maximum (B 3.1.3).
    for k in ("DO2P", "DO2S"):
        assert tank_by_id(r, k).fsm_tm == pytest.approx(rho_i(v, k), rel=1e-12)
    # Fresh water: the only FW tank is the worst centreline tank, assumed slack though empty.
    fw = tank_by_id(r, "FW1C")
    assert fw.fsm_tm == pytest.approx(rho_i(v, "FW1C"), rel=1e-12) and "B 3.1.4" in fw.fs_rule
    # Total from the dimensions (b31_vessel docstring): FO1 pair 2·0.95·8·4³/12, FO2C 0.95·6·4³/12,
    # DO1C 0.86·5·6³/12, DO2 pair 2·0.86·5·4³/12, FW1C 1.0·4·4³/12 = 256.0667 t·m; the empty ballast
    # and cargo tanks and the small LO1C add nothing.  Δ = 1800 + 2·60.8 (FO1 full) + 13.68 (FO2C 30 %)
    # + 2·17.2 (DO2 50 %) = 1969.68 t.
    total = 2 * 0.95 * 8 * 4**3 / 12 + 0.95 * 6 * 4**3 / 12 + 0.86 * 5 * 6**3 / 12 \
        + 2 * 0.86 * 5 * 4**3 / 12 + 1.0 * 4 * 4**3 / 12
    assert total == pytest.approx(256.0667, abs=5e-5)
    assert r.displacement_t == pytest.approx(1969.68, abs=1e-9)
    assert r.fsm_total_tm == pytest.approx(total, rel=1e-12)
    assert r.fsc_m == pytest.approx(total / 1969.68, rel=1e-12)


def test_empty_consumables_still_carry_the_worst_group():
    """IS 2008 B 3.1.4: even with every fuel tank empty, the worst fuel pair is assumed slack."""
    v = b31_vessel()
    r = evaluate(v, Condition())
    assert tank_by_id(r, "FO1P").fsm_tm == pytest.approx(rho_i(v, "FO1P"), rel=1e-12)
    assert tank_by_id(r, "FO2C").fsm_tm == 0.0
    assert tank_by_id(r, "BW1P").fsm_tm == 0.0  # ballast is fixed-level: empty means none


@pytest.mark.parametrize("rule", ["is2008", "actual"])
def test_small_tank_exemption(rule):
    """IS 2008 B 3.1.12 (standards.md §8 row 16; the 0.01 m value from memory): a tank whose
    Mfs at 30° over Δmin is below 0.01 m may be left out.  LO1C: ρ·i = 0.075 t·m, so
    Mfs(30°)/Δmin ≈ 0.075·0.5/1000 ≈ 4e-5 m ≪ 0.01 → exempt under is2008, even when slack.
    Rule 'actual' (B 3.1.6) counts it at its actual level."""
    v = b31_vessel()
    r = evaluate(v, Condition(tanks=fills(LO1C=50.0), fs_rule=rule))
    t = tank_by_id(r, "LO1C")
    if rule == "is2008":
        assert t.fsm_tm == 0.0 and "B 3.1.12" in t.fs_rule
    else:
        assert t.fsm_tm == pytest.approx(rho_i(v, "LO1C"), rel=1e-12) and "B 3.1.6" in t.fs_rule


def test_small_tank_exemption_threshold():
    """B 3.1.12 with Δmin set so that the ballast tank BW1P (ρ·i = 106.8 t·m, Mfs(30°) between
    ρ·i·sin30 = 53.4 and the wall-sided 62.3 t·m) lies clearly on each side of 0.01 m:
    Δmin 12 000 t → ratio ≤ 0.0052, exempt; Δmin 2500 t → ratio ≥ 0.021, counted."""
    base = b31_vessel()
    import dataclasses

    for dmin, exempt in ((12_000.0, True), (2_500.0, False)):
        v = dataclasses.replace(base, free_surface=FreeSurfaceSettings(min_operating_displacement_t=dmin))
        t = tank_by_id(evaluate(v, Condition(tanks=fills(BW1P=50.0))), "BW1P")
        assert (t.fsm_tm == 0.0) is exempt
        assert ("B 3.1.12" in t.fs_rule) is exempt


def test_actual_rule_counts_actual_levels():
    """Rule 'actual' (IS 2008 B 3.1.6, liquid transfers): every slack tank at its actual level,
    nothing assumed; full consumables carry none."""
    v = b31_vessel()
    r = evaluate(v, Condition(tanks=fills(FO1P=100, FO1S=100, FO2C=30), fs_rule="actual"))
    assert r.fs_rule == "actual"
    assert tank_by_id(r, "FO1P").fsm_tm == 0.0 and tank_by_id(r, "FO1S").fsm_tm == 0.0
    assert tank_by_id(r, "FO2C").fsm_tm == pytest.approx(rho_i(v, "FO2C"), rel=1e-12)
    assert tank_by_id(r, "DO1C").fsm_tm == 0.0 and tank_by_id(r, "FW1C").fsm_tm == 0.0
    assert r.fsm_total_tm == pytest.approx(rho_i(v, "FO2C"), rel=1e-12)


# --------------------------------------------------------------------------- transfer correction


def test_gz_with_actual_moment_of_fluid_transfer():
    """IS 2008 B 3.1 (standards.md §4.1, [M] paragraph): the GZ curve may be corrected by the actual
    moment of fluid transfer.  Box tank l = 6, b = 4, h = 2 at 50 % in the barge (Δ = 820 t):
    M(30°) = 6 + 7√3 = 18.12436 m⁴ and M(10°) = i·sin10·(1 + ½tan²10) = 5.6431 m⁴ (checks.md §3.2 [A]),
    so GZ(φ) = KN(φ) − KG_solid·sinφ − ρ·M(φ)/Δ.  GM fluid still uses i at 0°: GM = KM − KG − ρ·i/Δ."""
    tank = box_tank("DB1C", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0, with_transfer=True)
    w = RHO_SW * 24.0
    v = box_barge(lightship_t=820.0 - w, lightship_kg_m=3.0, tanks=(tank,))
    c = Condition(tanks=(TankFill("DB1C", "percent", 50.0),), gz_correction="transfer")
    r = evaluate(v, c)
    assert r.gz_correction == "transfer"
    assert r.displacement_t == pytest.approx(820.0, abs=1e-9)
    kg = (v.lightship.mass_t * 3.0 + w * 0.5) / 820.0
    assert r.kg_m == pytest.approx(kg, abs=1e-12)
    for deg, m in ((30, 6 + 7 * math.sqrt(3)), (10, 5.6431)):
        assert box_transfer_moment_m4(6, 4, 2, 50.0, math.radians(deg)) == pytest.approx(m, abs=5e-5)
        expected = box_kn_m(10, 4, 2.0, math.radians(deg)) - kg * math.sin(math.radians(deg)) \
            - RHO_SW * box_transfer_moment_m4(6, 4, 2, 50.0, math.radians(deg)) / 820.0
        assert r.gz_m[deg] == pytest.approx(expected, abs=1e-9)
    assert r.gm_fluid_m == pytest.approx(2.0 / 2 + 100 / 24 - kg - RHO_SW * 6 * 4**3 / 12 / 820.0, abs=1e-12)
    # Worst band: M(30°) within 10 % of its maximum.  The exact band of this tank is 35.98394–64.01606 %
    # (derived in tests/test_reference_worst_band.py, where the program's own band code is checked);
    # the factory's bisection must give it, and 50 % lies inside it.
    lo, hi = tank_by_id(r, "DB1C").worst_band_pct
    assert lo == pytest.approx(35.98394, abs=5e-6) and hi == pytest.approx(64.01606, abs=5e-6)
    assert tank_by_id(r, "DB1C").state == "worst_band"


def test_constant_correction_lowers_whole_curve_by_fsc_sin():
    """standards.md §4.3: with the constant correction, GZ(φ) = KN(φ) − KG_fluid·sinφ: the whole
    curve drops by FSC·sinφ against the solid-KG curve."""
    tank = box_tank("DB1C", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0)
    v = box_barge(lightship_t=820.0 - RHO_SW * 24.0, lightship_kg_m=3.0, tanks=(tank,))
    full = evaluate(v, Condition(tanks=(TankFill("DB1C", "percent", 50.0),), fs_rule="actual"))
    fsc = RHO_SW * 6 * 4**3 / 12 / 820.0
    assert full.fsc_m == pytest.approx(fsc, rel=1e-12)
    for deg in range(0, 91, 5):
        exact = box_kn_m(10, 4, 2.0, math.radians(deg)) - full.kg_m * math.sin(math.radians(deg))
        assert full.gz_m[deg] == pytest.approx(exact - fsc * math.sin(math.radians(deg)), abs=1e-9)


def test_fsc_leaves_solid_values_alone():
    """FSC is a virtual rise of G only (standards.md §4.3): Δ, KG solid, drafts are unchanged by it."""
    tank = box_tank("DB1C", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0)
    v = box_barge(lightship_t=820.0 - RHO_SW * 24.0, lightship_kg_m=3.0, tanks=(tank,))
    c = Condition(tanks=(TankFill("DB1C", "percent", 50.0),))
    a = evaluate(v, c.replace(fs_rule="actual"))
    v2, _ = barge_at(2.0, 3.0)
    assert a.displacement_t == pytest.approx(820.0, abs=1e-9)
    assert a.draft_mean_m == pytest.approx(evaluate(v2, Condition()).draft_mean_m, abs=1e-12)
    # KM 5.16667 at T = 2 (checks.md §1.1 [A]); KG solid (Δls·3 + 24.6·0.5)/820 from the masses
    kg = ((820.0 - RHO_SW * 24.0) * 3.0 + RHO_SW * 24.0 * 0.5) / 820.0
    assert a.kg_m == pytest.approx(kg, abs=1e-12)
    assert a.gm_solid_m == pytest.approx(1.0 + 100.0 / 24.0 - kg, abs=1e-12)


def test_transfer_correction_variable_tank_takes_largest_moment():
    """IS 2008 B 3.1.3 (largest correction between the filling limits for variable-level tanks) with
    the GZ corrected by the actual moment of fluid transfer (standards.md §4.1): a fuel tank
    l = 6, b = 4, h = 2 at 20 % counts, at each heel, the largest M over all fills — at 30° the 50 %
    value 6 + 7√3 = 18.12436 m⁴, at 20° 11.6696 m⁴ (checks.md §3.2 [A]) — not its own 20 % value
    (11.31813 m⁴ at 30°).  Barge Δ = 820 t; GZ(φ) = KN(φ) − KG_solid·sinφ − ρ·M_max(φ)/Δ."""
    tank = box_tank("FO1C", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0, kind="fuel_oil",
                    density_t_m3=0.95, with_transfer=True)
    w = 0.95 * 48.0 * 0.20
    v = box_barge(lightship_t=820.0 - w, lightship_kg_m=3.0, tanks=(tank,))
    r = evaluate(v, Condition(tanks=(TankFill("FO1C", "percent", 20.0),), gz_correction="transfer"))
    assert r.displacement_t == pytest.approx(820.0, abs=1e-9)
    t = tank_by_id(r, "FO1C")
    assert t.fsm_tm == pytest.approx(0.95 * 6 * 4**3 / 12, rel=1e-12)  # GM: ρ·i_max (B 3.1.3)
    for deg, m_max in ((30, 6 + 7 * math.sqrt(3)), (20, 11.6696)):
        phi = math.radians(deg)
        assert max(box_transfer_moment_m4(6, 4, 2, f, phi) for f in range(0, 101, 5)) == pytest.approx(m_max, abs=5e-5)
        expected = box_kn_m(10, 4, 2.0, phi) - r.kg_m * math.sin(phi) \
            - 0.95 * max(box_transfer_moment_m4(6, 4, 2, f, phi) for f in range(0, 101, 5)) / 820.0
        assert r.gz_m[deg] == pytest.approx(expected, abs=1e-9)


@pytest.mark.parametrize("kind, fill, rho, i_counted", [
    ("ballast", 50.0, RHO_SW, 6 * 4**3 / 12),        # fixed level: i at the actual level (B 3.1.3)
    ("fuel_oil", 20.0, 0.95, 6 * 4**3 / 12),         # variable level: the largest i (B 3.1.3)
    ("cargo_liquid", 99.0, 0.85, 6 * 4**3 / 12),     # nominally full cargo: i at 98 % (B 3.1.2)
])
def test_transfer_correction_without_tank_geometry_falls_back_to_i_sin(kind, fill, rho, i_counted):
    """A tank with no transfer table under the 'transfer' correction: its moment is taken as
    i·sinφ, the small-angle (upright-inertia) form of standards.md §4.3 (GZ lowered by ρ·i·sinφ/Δ),
    and the watchkeeper is told which tank lacks geometry.  Box tank l = 6, b = 4 (i = 32 m⁴ at every
    level) in the barge at Δ = 820 t, T = 2 m: GZ(φ) = KN(φ) − KG_solid·sinφ − ρ·32·sinφ/820."""
    tank = box_tank("T1", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0, kind=kind, density_t_m3=rho)
    w = rho * 48.0 * fill / 100.0
    v = box_barge(lightship_t=820.0 - w, lightship_kg_m=3.0, tanks=(tank,))
    r = evaluate(v, Condition(tanks=(TankFill("T1", "percent", fill),), gz_correction="transfer",
                              fs_rule="is2008"))
    assert r.displacement_t == pytest.approx(820.0, abs=1e-9)
    for deg in (10, 30, 60):
        phi = math.radians(deg)
        expected = box_kn_m(10, 4, 2.0, phi) - r.kg_m * math.sin(phi) - rho * i_counted * math.sin(phi) / 820.0
        assert r.gz_m[deg] == pytest.approx(expected, abs=1e-9)
    assert any(x.code == "fs-no-geometry" and "T1" in x.message and x.severity == "caution" for x in r.warnings)


def wedge_tank(tank_id: str, kind: str, density: float):
    """Wedge (hopper) tank l = 10, section (0, 0), (4, 2), (0, 2), calibrated from its geometry
    (checks.md §3.3 [A]: V = l·s², i = (2/3)·l·s³ at sounding s), with rows at the soundings of
    20 %, 50 % and 98 % full (s = 2·√f), so those levels are read without interpolation error."""
    import dataclasses

    import numpy as np

    from deckload.core.geometry.body import Body
    from deckload.core.geometry.hull import compartment_sections
    from deckload.core.geometry.spec import CompartmentShape
    from deckload.core.geometry.tanks import calibrate

    shape = CompartmentShape("prism", 0.0, 10.0, section_y_m=np.array([0.0, 4.0, 0.0]),
                             section_z_m=np.array([0.0, 2.0, 2.0]))
    s = np.unique(np.round(np.concatenate([np.linspace(0.0, 2.0, 11), 2.0 * np.sqrt([0.2, 0.5, 0.98])]), 12))
    cal = calibrate(Body(*compartment_sections(shape, None)), s)
    base = box_tank(tank_id, length_m=10.0, breadth_m=2.0, height_m=2.0, lcg_m=20.0, kind=kind, density_t_m3=density)
    return dataclasses.replace(base, capacity_m3=40.0, calibration=cal)


def wedge_i(fill_pct: float) -> float:
    """i = (2/3)·l·s³ with s = 2·√(f/100) (checks.md §3.3 [A], l = 10)."""
    return 2.0 / 3.0 * 10.0 * (2.0 * math.sqrt(fill_pct / 100.0)) ** 3


@pytest.mark.parametrize("kind, fill, rho, i_counted", [
    ("ballast", 50.0, RHO_SW, wedge_i(50.0)),       # fixed level: i at the actual level, 18.8562 m⁴
    ("fuel_oil", 20.0, 0.95, wedge_i(100.0)),       # variable level: the largest i, at the top, 53.3333 m⁴
    ("cargo_liquid", 99.0, 0.85, wedge_i(98.0)),    # nominally full cargo: i at 98 %, 51.7424 m⁴
])
def test_free_surface_level_of_a_tank_whose_surface_changes(kind, fill, rho, i_counted):
    """IS 2008 B 3.1.2–3.1.3 (standards.md §4.1) on a tank whose free surface grows with the level, so
    the level each rule picks shows in the moment: FSM = ρ·i(level), and with the 'transfer' correction
    and no transfer table GZ is lowered by ρ·i(level)·sinφ/Δ (standards.md §4.3).  Barge Δ = 820 t.
    Tolerances: the geometry calibration is exact to ~1e-9 relative; 1e-6 leaves room for it."""
    tank = wedge_tank("W1", kind, rho)
    w = rho * 40.0 * fill / 100.0
    v = box_barge(lightship_t=820.0 - w, lightship_kg_m=3.0, tanks=(tank,))
    r = evaluate(v, Condition(tanks=(TankFill("W1", "percent", fill),), gz_correction="transfer"))
    assert tank_by_id(r, "W1").fsm_tm == pytest.approx(rho * i_counted, rel=1e-6)  # calibration: ~1e-9 relative
    phi = math.radians(30.0)
    # the wedge's liquid lies to starboard (y_g = 2s/3), so G is off the centre line: − TCG·cosφ
    expected = box_kn_m(10, 4, 2.0, phi) - r.kg_m * 0.5 - r.tcg_m * math.cos(phi) - rho * i_counted * 0.5 / 820.0
    assert r.gz_m[30] == pytest.approx(expected, abs=1e-6)


def test_nominally_full_cargo_tank_transfer_moment_at_98():
    """IS 2008 B 3.1.2 footnote: a nominally full cargo tank is corrected at 98 % with its real shifting
    moment for GZ.  Box tank l = 6, b = 4, h = 2 with its exact transfer table every 5 % (checks.md §3.2);
    at 98 % the table is read linearly between 95 % and 100 % (M = 0 when full):
    M = 0.4·M(95 %) + 0.6·0 (tables.py: linear between rows).  Barge Δ = 820 t."""
    tank = box_tank("CG1", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0, kind="cargo_liquid",
                    density_t_m3=0.85, with_transfer=True)
    w = 0.85 * 48.0 * 0.99
    v = box_barge(lightship_t=820.0 - w, lightship_kg_m=3.0, tanks=(tank,))
    r = evaluate(v, Condition(tanks=(TankFill("CG1", "percent", 99.0),), gz_correction="transfer"))
    assert tank_by_id(r, "CG1").state == "full"
    for deg in (10, 30):
        phi = math.radians(deg)
        m98 = 0.4 * box_transfer_moment_m4(6, 4, 2, 95.0, phi)
        expected = box_kn_m(10, 4, 2.0, phi) - r.kg_m * math.sin(phi) - 0.85 * m98 / 820.0
        assert r.gz_m[deg] == pytest.approx(expected, abs=1e-9)


def test_worst_centreline_tank_listed_after_a_pair_is_found():
    """IS 2008 B 3.1.4 (standards.md §4.1 [C]): the group with the greatest effect is assumed slack,
    wherever it stands in the tank list.  Fresh water: pair FWP/FWS 2·1.0·4·4³/12 = 42.67 t·m, listed
    first; centreline FWC 1.0·4·6³/12 = 72 t·m, listed after it: FWC governs, the pair does not count.
    Neither is a small tank: Mfs(30°)/Δmin ≥ 21.33·0.5·(1 + ½tan²30)/1000 = 0.0124 m > 0.01 (B 3.1.12)."""
    tanks = (
        box_tank("FWP", length_m=4, breadth_m=4, height_m=2, lcg_m=40, tcg_m=-4, kind="fresh_water",
                 density_t_m3=1.0, pair="FWS"),
        box_tank("FWS", length_m=4, breadth_m=4, height_m=2, lcg_m=40, tcg_m=4, kind="fresh_water",
                 density_t_m3=1.0, pair="FWP"),
        box_tank("FWC", length_m=4, breadth_m=6, height_m=2, lcg_m=60, kind="fresh_water", density_t_m3=1.0),
    )
    v = parallel_sided_vessel(form(2000.0, 6.0), lightship=MassItem("Lightship", 2000.0, X_MID, 4.0, 0.0),
                              tanks=tanks, free_surface=FreeSurfaceSettings(min_operating_displacement_t=DMIN))
    r = evaluate(v, Condition())
    assert tank_by_id(r, "FWC").fsm_tm == pytest.approx(1.0 * 4 * 6**3 / 12, rel=1e-12)
    assert "centreline" in tank_by_id(r, "FWC").fs_rule
    for k in ("FWP", "FWS"):
        assert tank_by_id(r, k).fsm_tm == 0.0 and "exempt" not in tank_by_id(r, k).fs_rule


def test_empty_is_at_or_below_the_remainder_limit():
    """The usual remainder in an 'empty' tank is ignored (IS 2008 B 3.1, standards.md §4.1 [M]): a tank at
    or below the profile's empty_pct (default 0.5 %) is empty and carries no free surface; just above it,
    at 0.6 %, a box ballast tank is slack and counts ρ·l·b³/12 at its level (B 3.1.3, fixed level)."""
    tank = box_tank("DB1C", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0)
    v = box_barge(tanks=(tank,))
    assert v.free_surface.empty_pct == 0.5
    at = evaluate(v, Condition(tanks=(TankFill("DB1C", "percent", 0.5),)))
    assert tank_by_id(at, "DB1C").state == "empty" and tank_by_id(at, "DB1C").fsm_tm == 0.0
    above = evaluate(v, Condition(tanks=(TankFill("DB1C", "percent", 0.6),)))
    assert tank_by_id(above, "DB1C").state == "slack"
    assert tank_by_id(above, "DB1C").fsm_tm == pytest.approx(RHO_SW * 6 * 4**3 / 12, rel=1e-12)


def test_small_tank_bound_reads_30_degrees_between_table_columns():
    """The small-tank test (IS 2008 B 3.1.12) takes the tank's largest M at 30° from its transfer
    table.  With heel columns every 20° the 30° value is read linearly between the 20° and 40° columns
    (tables.py: linear between rows, never extrapolated): max over fills of ½·(M20 + M40).  Box tank
    l = 6, b = 4, h = 2: M at 50 % is 11.6696 (20°) and 20.8584 m⁴ (40°), checks.md §3.2 [A], so the
    bound is 16.2640 m⁴ (the 30° value itself, 18.1244, is not in this table)."""
    import dataclasses

    import numpy as np

    from deckload.core.free_surface import mfs30_bound_m4
    from deckload.core.model import FluidTransfer, frozen_array

    fills = np.arange(0.0, 100.0001, 5.0)
    heels = np.array([0.0, 20.0, 40.0, 60.0, 80.0, 90.0])
    m = np.array([[box_transfer_moment_m4(6, 4, 2, f, math.radians(h)) for h in heels] for f in fills])
    tank = dataclasses.replace(box_tank("T", length_m=6, breadth_m=4, height_m=2, lcg_m=20.0),
                               transfer=FluidTransfer(frozen_array(fills), frozen_array(heels), frozen_array(m)))
    expected = float(np.max(0.5 * (m[:, 1] + m[:, 2])))
    assert expected == pytest.approx(0.5 * (11.6696 + 20.8584), abs=5e-5)
    assert mfs30_bound_m4(tank) == pytest.approx(expected, abs=1e-12)
