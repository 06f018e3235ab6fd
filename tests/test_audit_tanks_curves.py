"""The audit of tank calibrations (free surface, centres of the added liquid) and of the curves
against displacement: each typing error caught with the table, the row and the value named, in
full words; good tables raise nothing.

Base: the 22 m box "trawler" of tests/box_profile_text.py (L 22, B 6.5, D 3.0 m).  Tank FO1P is a
box 4 × 2 × 1 m (x 6–10, y −3…−1, z 0–1 m), calibrated every 0.2 m: V = 8·s m³, LCG 8.0, TCG −2.0,
VCG = s/2, i = l·b³/12 = 2.667 m⁴ (its free surface 8 m²).  Lightship 150 t, hydrostatic table
146.575–381.095 t.  Bounds and their reasons are audit.py's (derived there: Popoviciu for the
free surface, the centroid of the added layer for the centres).
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.core.audit import ERROR, WARNING, audit, has_errors
from deckload.core.model import LimitCurve, frozen_array
from fv22_audit import found, vessel

B = 6.5
I_BOX = 4.0 * 2.0 ** 3 / 12  # FO1P's own free surface, l·b³/12 (m⁴)
FSI_LOOK = "compare with the booklet's calibration table of tank FO1P (free-surface column)"



TOP = 22.0 * 6.5 * 1.025 * 2.6  # the table's last Δ (t) as the profile holds it: 381.09499999999997


def with_cal(tank_id, v=None, tank=None, **cols):
    v = v or vessel()
    t = v.tank(tank_id)
    cal = dataclasses.replace(t.calibration, **{k: frozen_array(np.asarray(a, float)) for k, a in cols.items()})
    new = dataclasses.replace(t, calibration=cal, **(tank or {}))
    return dataclasses.replace(v, tanks=tuple(new if x.id == tank_id else x for x in v.tanks))



# --------------------------------------------------------------------------- free surface


def test_the_box_tanks_raise_nothing():
    assert found(vessel(), "tank-fsi", "tank-fsi-empty", "tank-centre") == []


def test_a_free_surface_above_the_box_bound_in_full():
    """× 20 = 53.3 m⁴ above 1.1 × A·B²/12 = 1.1 × 8·6.5²/12 = 31.0 m⁴ (a doubt)."""
    (f,) = found(with_cal("FO1P", fsi_m4=[I_BOX * 20] * 6), "tank-fsi")
    assert (f.severity, f.key, f.path) == (WARNING, "tank[FO1P].calibration.fsi_m4", ("tank", 1, "calibration", "fsi_m4", 0))
    assert f.text() == (
        "tank[FO1P].calibration.fsi_m4 = 53.333 m⁴ (FSM 45.33 t·m at 0.85 t/m³): above what the tank's own surface "
        "allows: its calibration gives a surface of 8 m², and a box of that area 6.5 m wide has A·B²/12 = 28.17 m⁴; "
        + FSI_LOOK)


def test_a_free_surface_above_any_surface_in_full():
    """× 100 = 266.7 m⁴ above 2·A·B²/4 = 169 m⁴ (Popoviciu with the area doubled: an error)."""
    (f,) = found(with_cal("FO1P", fsi_m4=[I_BOX * 100] * 6), "tank-fsi")
    assert f.severity == ERROR
    assert f.text() == (
        "tank[FO1P].calibration.fsi_m4 = 266.67 m⁴ (FSM 226.7 t·m at 0.85 t/m³): above what the tank's own surface "
        "allows: its calibration gives a surface of 8 m², and no surface of even twice that area within the breadth "
        "6.5 m exceeds 2·A·B²/4 = 169 m⁴; " + FSI_LOOK)  # the limit applied is the one printed


@pytest.mark.parametrize("fsi, expect", [(30.9, []), (31.1, [WARNING]), (168.9, [WARNING]), (169.1, [ERROR])])
def test_the_free_surface_edges(fsi, expect):
    """1.1 × 28.17 = 30.98 m⁴ and 2 × 84.5 = 169 m⁴ for FO1P's 8 m² surface."""
    assert [f.severity for f in found(with_cal("FO1P", fsi_m4=[fsi] * 6), "tank-fsi")] == expect


def test_a_varying_column_is_judged_row_by_row_and_named_at_its_row():
    k = I_BOX
    (f,) = found(with_cal("FO1P", fsi_m4=[k, k, k * 20, k * 20, k, k]), "tank-fsi")
    assert f.path[-1] == 2 and f.severity == WARNING and "(at the empty row)" not in f.why
    (f,) = found(with_cal("FO1P", fsi_m4=[k * 100, k, k, k, k, k]), "tank-fsi")
    assert f.path[-1] == 0 and f.severity == ERROR
    assert f.why.startswith("above what the tank's own surface allows (at the empty row): its calibration gives a surface of 8 m²")
    (f,) = found(with_cal("FO1P", fsi_m4=[k, k, k, k, k, k * 20]), "tank-fsi")
    assert f.path[-1] == 5


def widening_tank(fsi, given="table"):
    """FO1P recalibrated as a tank widening upward: V = 0, 1, 3, 6, 10, 15 m³ every 0.2 m, so the
    surface of each step is 5, 10, 15, 20, 25 m²."""
    return with_cal("FO1P", sounding_m=[0.0, 0.2, 0.4, 0.6, 0.8, 1.0], volume_m3=[0.0, 1.0, 3.0, 6.0, 10.0, 15.0],
                    fsi_m4=fsi, tank={"fsi_given": given, "capacity_m3": 15.0})


def test_each_row_is_judged_against_the_surfaces_either_side_of_it():
    """Row 1 touches the 5 and 10 m² steps: the larger, 10 m², gives 1.1·10·6.5²/12 = 38.7 m⁴; row 0
    only the 5 m² step: 19.4 m⁴."""
    assert found(widening_tank([10.0, 38.0, 40.0, 60.0, 80.0, 90.0]), "tank-fsi") == []
    (f,) = found(widening_tank([10.0, 39.0, 40.0, 60.0, 80.0, 90.0]), "tank-fsi")
    assert f.path[-1] == 1 and "a surface of 10 m²" in f.why
    (f,) = found(widening_tank([20.0, 38.0, 40.0, 60.0, 80.0, 90.0]), "tank-fsi")
    assert f.path[-1] == 0 and "a surface of 5 m²" in f.why


def test_one_value_per_tank_is_judged_against_its_largest_surface():
    """A maximum FSM for the tank (fsi_given 'max', or one value in every row): judged against the
    largest surface, 25 m² (1.1·25·6.5²/12 = 96.8 m⁴), in every row."""
    assert found(widening_tank([50.0] * 6), "tank-fsi") == []
    assert found(widening_tank([50.0] * 5 + [49.0], given="max"), "tank-fsi") == []
    (f,) = found(widening_tank([50.0] * 5 + [49.0]), "tank-fsi")
    assert f.path[-1] == 0 and "a surface of 5 m²" in f.why
    (f,) = found(widening_tank([97.0] * 6), "tank-fsi")
    assert f.path[-1] == 0 and "a surface of 25 m²" in f.why and "(at the empty row)" not in f.why


def test_only_one_free_surface_finding_per_tank():
    k = I_BOX
    got = found(with_cal("FO1P", fsi_m4=[k, k * 20, k * 100, k * 20, k, k]), "tank-fsi", "tank-fsi-empty")
    assert [(f.severity, f.path[-1]) for f in got] == [(WARNING, 1)]


def test_a_tank_known_by_capacity_only_has_no_free_surface_check():
    v = with_cal("FO1P", fsi_m4=[I_BOX * 100] * 6, tank={"level_known": False})
    assert found(v, "tank-fsi", "tank-fsi-empty", "tank-centre") == []


def test_a_free_surface_typed_against_the_empty_row_in_full():
    (f,) = found(with_cal("FO1P", fsi_m4=[20.0] + [I_BOX] * 5), "tank-fsi", "tank-fsi-empty")
    assert (f.severity, f.check, f.path) == (WARNING, "tank-fsi-empty", ("tank", 1, "calibration", "fsi_m4", 0))
    assert f.text() == (
        "tank[FO1P].calibration.fsi_m4 = 20 m⁴ at the empty row: non-zero when empty and larger than just above "
        "(2.6667 m⁴): an empty tank has no free surface, and its bottom-most surface is no larger than the one above "
        "it; " + FSI_LOOK)


def test_the_empty_row_may_exceed_the_next_by_10_percent():
    """1.1 × the next row (audit.EMPTY_FSI_RISE: 10 % for rounding)."""
    assert found(with_cal("FO1P", fsi_m4=[2.0 * 1.1] + [2.0] * 5), "tank-fsi-empty") == []
    assert len(found(with_cal("FO1P", fsi_m4=[2.0 * 1.1 + 1e-6] + [2.0] * 5), "tank-fsi-empty")) == 1


def test_the_empty_row_check_needs_an_empty_row():
    """A table whose first row already holds liquid (V 0.5 m³) is not judged as empty."""
    v = with_cal("FO1P", volume_m3=[0.5, 1.6, 3.2, 4.8, 6.4, 8.0], fsi_m4=[20.0] + [I_BOX] * 5)
    assert found(v, "tank-fsi-empty") == []


# --------------------------------------------------------------------------- centres of the added liquid


def test_a_full_tank_lcg_that_puts_the_last_layer_outside_the_vessel_in_full():
    """LCG 12.0 for 8.0 at 1.0 m: the layer 0.8–1.0 m (1.6 m³) would have its centre at
    (8·12 − 6.4·8)/1.6 = 28 m from the AP, beyond 1.2 × 22 = 26.4 m."""
    (f,) = found(with_cal("FO1P", lcg_m=[8.0] * 5 + [12.0]), "tank-centre")
    assert (f.severity, f.key, f.path) == (ERROR, "tank[FO1P].calibration.lcg_m", ("tank", 1, "calibration", "lcg_m", 5))
    assert f.text() == (
        "tank[FO1P].calibration.lcg_m = 12 m at sounding 1 m: the liquid added from 0.8 to 1 m would have its centre at "
        "x = 28 m, outside the vessel: this centre or the one above it is mistyped; compare with the booklet's "
        "calibration table of tank FO1P")


@pytest.mark.parametrize("lcg, expect", [(11.69, []), (11.71, [ERROR]), (5.51, []), (5.49, [ERROR])])
def test_the_added_layer_lcg_edges(lcg, expect):
    """Layer centre 5·LCG − 32 m must lie within −4.4 … 26.4 m plus the rounding allowance
    (6.4 + 8)·0.005/1.6 + (8 + LCG)·0.004/1.6 ≈ 0.07 m (half a centimetre on each centre, 0.05 % of
    the capacity on each volume, as the formula amplifies them)."""
    assert [f.severity for f in found(with_cal("FO1P", lcg_m=[8.0] * 5 + [lcg]), "tank-centre")] == expect


def test_a_tcg_that_puts_the_last_layer_outside_the_breadth_in_full():
    (f,) = found(with_cal("FO1P", tcg_m=[-2.0] * 5 + [-3.0]), "tank-centre")
    assert (f.severity, f.key, f.path) == (ERROR, "tank[FO1P].calibration.tcg_m", ("tank", 1, "calibration", "tcg_m", 5))
    assert f.text() == (
        "tank[FO1P].calibration.tcg_m = -3 m at sounding 1 m: the liquid added from 0.8 to 1 m would have its centre at "
        "y = -7 m, outside the breadth: this centre or the one above it is mistyped; compare with the booklet's "
        "calibration table of tank FO1P")


@pytest.mark.parametrize("tcg, expect", [(-2.255, []), (-2.27, [ERROR]), (-1.75, [])])
def test_the_added_layer_tcg_edges(tcg, expect):
    """Layer centre 5·TCG + 8 m; |y| ≤ 3.25 m + (0.045 + (2 + |TCG|)·0.0025) m rounding."""
    assert [f.severity for f in found(with_cal("FO1P", tcg_m=[-2.0] * 5 + [tcg]), "tank-centre")] == expect


def test_a_vcg_that_leaves_the_tank_in_full():
    """VCG 0.95 for 0.50 at 1.0 m: the layer 0.8–1.0 m would be centred at (8·0.95 − 6.4·0.4)/1.6 = 3.15 m."""
    (f,) = found(with_cal("FO1S", vcg_m=[0.0, 0.1, 0.2, 0.3, 0.4, 0.95]), "tank-centre")
    assert (f.severity, f.key, f.path) == (ERROR, "tank[FO1S].calibration.vcg_m", ("tank", 2, "calibration", "vcg_m", 5))
    assert f.text() == (
        "tank[FO1S].calibration.vcg_m = 0.95 m at sounding 1 m: the contents' centres leave the tank: the liquid added "
        "from 0.8 to 1 m would have its centre at 3.15 m above the keel, which no tank bottom height makes lie within "
        "that layer together with the rows below; compare with the booklet's calibration table of tank FO1S")


def test_a_vcg_column_shifted_part_way_down_contradicts_the_rows_below():
    """VCG 0.8, 0.9, 1.0 from 0.6 m (0.5 m too high): the layer 0.4–0.6 m would be centred at
    (4.8·0.8 − 3.2·0.2)/1.6 = 2.0 m, which puts the tank bottom at 1.4–1.6 m, but the rows below put
    it at 0 m: the first contradicting row is named."""
    (f,) = found(with_cal("FO1S", vcg_m=[0.0, 0.1, 0.2, 0.8, 0.9, 1.0]), "tank-centre")
    assert f.path[-1] == 3 and "would have its centre at 2 m above the keel" in f.why


def test_a_tank_whose_bottom_is_above_the_keel_raises_nothing():
    """AP1 lies 0.5–2.5 m above the keel (VCG = 0.5 + s/2): its layers fit a bottom at 0.5 m.  The
    same tank typed with VCG = s/2 (bottom at the keel) is consistent too; its first layer typed 1.0 m
    too high contradicts the layer above it."""
    assert found(vessel(), "tank-centre") == []
    s = np.array(vessel().tank("AP1").calibration.sounding_m)
    assert found(with_cal("AP1", vcg_m=s / 2), "tank-centre") == []
    z = 0.5 + s / 2
    z[1] += 1.0  # 1.7 m at 0.4 m: alone, the first layer fits a bottom 1.3–1.7 m above the keel
    (f,) = found(with_cal("AP1", vcg_m=z), "tank-centre")
    # the next layer (0.4–0.8 m) is centred at (3.2·0.9 − 1.6·1.7)/1.6 = 0.1 m: below that bottom
    assert f.path[-1] == 2 and "would have its centre at 0.1 m above the keel" in f.why


def test_one_centre_finding_per_tank_and_every_tank_judged():
    v = with_cal("FO1P", lcg_m=[8.0] * 5 + [12.0], tcg_m=[-2.0] * 5 + [-3.0])
    v = with_cal("FO1S", v, vcg_m=[0.0, 0.1, 0.2, 0.3, 0.4, 0.95])
    assert [(f.key, f.path[-1]) for f in found(v, "tank-centre")] == [
        ("tank[FO1P].calibration.lcg_m", 5), ("tank[FO1S].calibration.vcg_m", 5)]


# --------------------------------------------------------------------------- curves against displacement


def curve(d, kind="max_kg_m"):
    return LimitCurve(displacement_t=frozen_array(np.asarray(d, float)),
                      value=frozen_array(np.full(len(d), 40.0 if kind == "downflooding_deg" else 2.5)), kind=kind)


def test_a_limiting_kg_curve_against_draft_in_full():
    (f,) = found(dataclasses.replace(vessel(), limit_curve=curve([1.0, 1.8, 2.6])), "curve-range")
    assert (f.severity, f.key, f.path) == (ERROR, "limit_curve.displacement_t", ("limit_curve", "displacement_t", 0))
    assert f.text() == (
        "limit_curve.displacement_t = 1–2.6 t: the curve lies wholly outside the displacements she can have (lightship "
        "150 t to the table's 381.09 t): it can never be used. They look like drafts (m): a curve against draft typed "
        "as against displacement?; compare with the booklet's limiting KG / GM curve")


def test_a_downflooding_curve_above_the_table():
    (f,) = found(dataclasses.replace(vessel(), downflooding=curve([400.0, 500.0], "downflooding_deg")), "curve-range")
    assert (f.severity, f.key, f.path) == (ERROR, "downflooding.displacement_t", ("downflooding", "displacement_t", 0))
    assert f.value == "400–500 t" and f.look == "the booklet's downflooding angle curve"
    assert f.why == ("the curve lies wholly outside the displacements she can have (lightship 150 t to the "
                     "table's 381.09 t): it can never be used")  # no full stop before the "; compare with" that follows


@pytest.mark.parametrize("d, expect", [
    ([100.0, 150.0], False), ([100.0, 149.9], True), ([TOP, 500.0], False), ([381.1, 500.0], True)])
def test_a_curve_touching_the_range_can_be_used(d, expect):
    """Lightship 150 t to the table's last 381.095 t: a curve reaching either end is usable."""
    for name, kind in (("limit_curve", "max_kg_m"), ("downflooding", "downflooding_deg")):
        got = found(dataclasses.replace(vessel(), **{name: curve(d, kind)}), "curve-range")
        assert bool(got) == expect


@pytest.mark.parametrize("top, hint", [(3.0, True), (3.0 + 1e-9, True), (3.01, False)])
def test_the_draft_hint_up_to_the_depth(top, hint):
    """Values no larger than the moulded depth (3.0 m, 1e-9 m for floating-point noise) read as drafts."""
    (f,) = found(dataclasses.replace(vessel(), limit_curve=curve([1.0, top])), "curve-range")
    assert ("They look like drafts (m)" in f.why) == hint


def test_cross_curves_without_overlap_in_full():
    v = vessel()
    k = dataclasses.replace(v.cross_curves, displacement_t=frozen_array(np.array([10.0, 20.0, 30.0, 40.0])))
    (f,) = found(dataclasses.replace(v, cross_curves=k), "curve-range")
    assert (f.severity, f.key, f.path) == (ERROR, "cross_curves.displacement_t", ("cross_curves", "displacement_t", 0))
    assert f.text() == ("cross_curves.displacement_t = 10–40 t: no overlap with the hydrostatic table's 146.57–381.09 t; "
                        "compare with the booklet's KN table (displacement column)")


@pytest.mark.parametrize("d, expect", [
    ([10.0, 146.575], False), ([10.0, 146.5], True), ([TOP, 400.0], False), ([381.2, 400.0], True)])
def test_cross_curves_touching_the_table_overlap(d, expect):
    v = vessel()
    k = dataclasses.replace(v.cross_curves, displacement_t=frozen_array(np.array(d)),
                            kn_m=frozen_array(np.array(v.cross_curves.kn_m)[:2]))
    assert bool(found(dataclasses.replace(v, cross_curves=k), "curve-range")) == expect


# --------------------------------------------------------------------------- the whole audit


def test_errors_come_first_each_group_in_profile_order():
    """A warning found early (lightship KG above 1.5 D) is listed after an error found late (a tank's
    free surface), and warnings keep their order."""
    v = vessel()
    v = dataclasses.replace(v, lightship=dataclasses.replace(v.lightship, vcg_m=5.0))
    v = with_cal("FO1P", v, fsi_m4=[I_BOX * 100] * 6)
    v = with_cal("FO1S", v, fsi_m4=[I_BOX * 20] * 6)
    got = [(f.severity, f.check, f.key) for f in audit(v)]
    assert got == [(ERROR, "tank-fsi", "tank[FO1P].calibration.fsi_m4"),
                   (WARNING, "position-z", "lightship.vcg_m"),
                   (WARNING, "tank-fsi", "tank[FO1S].calibration.fsi_m4")]
    assert has_errors(audit(v)) is True
    assert has_errors(audit(with_cal("FO1S", fsi_m4=[I_BOX * 20] * 6))) is False
    assert has_errors(()) is False


# --------------------------------------------------------------------------- more shapes of tank


def test_a_tank_calibrated_empty_and_full_only_is_judged():
    v = with_cal("FO1P", sounding_m=[0.0, 1.0], volume_m3=[0.0, 8.0], lcg_m=[8.0, 8.0], vcg_m=[0.0, 0.5],
                 tcg_m=[-2.0, -2.0], fsi_m4=[I_BOX * 100] * 2)
    (f,) = found(v, "tank-fsi")
    assert f.severity == ERROR and "a surface of 8 m²" in f.why


def test_a_tank_narrowing_upward_judges_a_row_against_the_larger_surface_below_it():
    """V = 0, 5, 9, 12, 14, 15 m³ every 0.2 m: surfaces 25, 20, 15, 10, 5 m².  Row 1 touches the 25
    and 20 m² steps: 85 m⁴ is under 1.1·25·6.5²/12 = 96.8 m⁴ (and over the 77.5 m⁴ of 20 m²)."""
    v = with_cal("FO1P", volume_m3=[0.0, 5.0, 9.0, 12.0, 14.0, 15.0], fsi_m4=[85.0, 85.0, 60.0, 40.0, 20.0, 10.0],
                 tank={"capacity_m3": 15.0})
    assert found(v, "tank-fsi") == []


def test_the_empty_row_is_compared_with_the_row_just_above_it():
    """20 m⁴ empty, 19 m⁴ just above: not more than 10 % above it (no doubt), whatever the rows higher
    up hold; 20 m⁴ empty and 2 m⁴ just above: a doubt naming the 2 m⁴."""
    assert found(with_cal("FO1P", fsi_m4=[20.0, 19.0, I_BOX, I_BOX, I_BOX, I_BOX]), "tank-fsi-empty") == []
    (f,) = found(with_cal("FO1P", fsi_m4=[20.0, 2.0, I_BOX, I_BOX, I_BOX, I_BOX]), "tank-fsi-empty")
    assert "larger than just above (2 m⁴)" in f.why


def test_a_centre_in_the_first_layer_is_judged():
    """TCG −3.4 m at 0.2 m: the first layer (from empty) is centred at −3.4 m, outside the breadth."""
    (f,) = found(with_cal("FO1P", tcg_m=[-2.0, -3.4, -2.0, -2.0, -2.0, -2.0]), "tank-centre")
    assert f.path == ("tank", 1, "calibration", "tcg_m", 1) and "y = -3.4 m" in f.why


def test_a_finely_calibrated_tank_is_judged_layer_by_layer():
    """FO1P every 0.1 m (0.8 m³ a layer): a full-tank TCG of −3.0 m puts the last layer at
    (8·(−3) − 7.2·(−2))/0.8 = −12 m."""
    s = np.linspace(0.0, 1.0, 11)
    tcg = np.full(11, -2.0)
    tcg[-1] = -3.0
    v = with_cal("FO1P", sounding_m=s, volume_m3=8.0 * s, lcg_m=np.full(11, 8.0), vcg_m=s / 2, tcg_m=tcg,
                 fsi_m4=np.full(11, I_BOX))
    assert found(with_cal("FO1P", v, tcg_m=np.full(11, -2.0)), "tank-centre") == []
    (f,) = found(v, "tank-centre")
    assert f.path[-1] == 10 and "y = -12 m" in f.why


def test_the_tank_bottom_fixed_by_the_rows_below_bounds_a_layer_above():
    """FO1S's rows to 0.4 m fix its bottom within 0.0 ± 0.1 m (each layer lies within its own
    thickness).  A VCG at 0.6 m that centres the layer 0.4–0.6 m at 0.75 m (bottom 0.15–0.35 m) or at
    0.25 m (bottom −0.35…−0.15 m) fits that layer alone but not the rows below: each is named."""
    for vcg3, slab in ((0.3833, "0.7499"), (0.2167, "0.2501")):  # VCG printed to 4 figures
        (f,) = found(with_cal("FO1S", vcg_m=[0.0, 0.1, 0.2, vcg3, vcg3 + 0.1, vcg3 + 0.2]), "tank-centre")
        assert f.path[-1] == 3 and f"would have its centre at {slab} m above the keel" in f.why


def test_a_curve_of_three_points_is_judged_by_its_ends():
    """[100, 120, 151] t reaches past the lightship's 150 t: usable.  [1.0, 2.0, 3.5] lies below it;
    its last value is beyond the 3.0 m depth, so it is not taken for drafts."""
    assert found(dataclasses.replace(vessel(), limit_curve=curve([100.0, 120.0, 151.0])), "curve-range") == []
    (f,) = found(dataclasses.replace(vessel(), limit_curve=curve([1.0, 2.0, 3.5])), "curve-range")
    assert "drafts" not in f.why and f.value == "1–3.5 t"
    v = vessel()
    k = dataclasses.replace(v.cross_curves, displacement_t=frozen_array(np.array([100.0, 120.0, 150.0])),
                            kn_m=frozen_array(np.array(v.cross_curves.kn_m)[:3]))
    assert found(dataclasses.replace(v, cross_curves=k), "curve-range") == []
