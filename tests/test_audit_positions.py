"""The plausibility audit's position checks, at their edges and in the words the officer reads.

Base: the 22 m box "trawler" of tests/box_profile_text.py (L 22, B 6.5, D 3.0 m; every table
from the closed forms of checks.md §1, so it audits clean: tests/test_audit.py).  Each case
puts one mistyped centre into that vessel, built in code (the audit judges models however
they were built), and checks that it is caught with the table, the row/field and the value
named, the bound broken and the booklet page to compare with; and that a value just inside
the bound raises nothing.

The bounds are audit.py's, each with its reason written there:

* centres along the ship: error beyond 0.2 × LBP outside the perpendiculars (overall length
  rarely exceeds 1.2 × LBP: common practice), warning beyond 0.1 × LBP (only a peak reaches
  there: common practice); the lightship LCG within 0.2–0.8 × LBP (her LCB, on the vertical
  through G, never lies in the end fifths: common practice);
* heights, in moulded depths D (common practice): lightship warning above 1.5 D, error above
  2.5 D, warning below 0.3 D; tanks and holds 1.5 D / 3.0 D; deck loads and constants
  2.5 D / 4.0 D;
* across: |TCG| above B/2 plus half a printed centimetre is outside the hull (derived: the
  hull lies within its breadth; 0.005 m rounding of a printed centre).
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.core.audit import ERROR, WARNING, _f
from deckload.core.model import DeckArea, Hold, MassItem, frozen_array
from fv22_audit import found, vessel

L, B, D = 22.0, 6.5, 3.0  # the FV-22 box (tests/box_profile_text.py)




def with_lightship(**kw):
    v = vessel()
    return dataclasses.replace(v, lightship=dataclasses.replace(v.lightship, **kw))


def with_tank_column(tank_id, col, values):
    v = vessel()
    t = v.tank(tank_id)
    cal = dataclasses.replace(t.calibration, **{col: frozen_array(np.asarray(values, dtype=float))})
    return dataclasses.replace(v, tanks=tuple(dataclasses.replace(x, calibration=cal) if x.id == tank_id else x
                                              for x in v.tanks))


def hold(**kw):
    base = dict(id="H1", name="Fish hold", capacity_m3=40.0, lcg_m=12.0, vcg_m=1.6, tcg_m=0.0)
    base.update(kw)
    return Hold(**base)


def with_holds(*holds):
    return dataclasses.replace(vessel(), holds=tuple(holds))


def constant(**kw):
    base = dict(name="Nets and gear", mass_t=2.0, lcg_m=5.0, vcg_m=3.5, tcg_m=0.0)
    base.update(kw)
    return MassItem(**base)


def deck_area(**kw):
    base = dict(id="AFTDK", name="After deck", area_m2=30.0, lcg_m=4.0, deck_height_m=3.0, tcg_m=0.0)
    base.update(kw)
    return DeckArea(**base)


# --------------------------------------------------------------------------- number format


def test_values_are_printed_as_typed_in_every_range():
    """_f prints four significant figures below 1000 (a centre, a KN), one decimal from 1000 to
    1e6 (a displacement in t, or a centre typed in millimetres: 10600 must not read "1.06e+04"),
    and six significant figures beyond (no ship's table holds such a value; fixed point would print
    the whole slip).  The edges belong to the upper range (``abs(x) < 1000``, ``< 1e6``)."""
    assert _f(10.6) == "10.6 m"
    assert _f(-2.1) == "-2.1 m"
    assert _f(3.14159) == "3.142 m"
    assert _f(999.94) == "999.9 m"
    assert _f(1000.0) == "1000.0 m"
    assert _f(-1000.0) == "-1000.0 m"
    assert _f(1000.5) == "1000.5 m"
    assert _f(1500.0) == "1500.0 m"
    assert _f(10600.0) == "10600.0 m"
    assert _f(123456.78) == "123456.8 m"
    assert _f(999999.94) == "999999.9 m"
    assert _f(1e6) == "1e+06 m"
    assert _f(-1e6) == "-1e+06 m"
    assert _f(1234567.0) == "1.23457e+06 m"
    assert _f(150.0, "t") == "150 t"
    assert _f(3.0, "") == "3"


# --------------------------------------------------------------------------- lightship


def test_the_clean_base_has_no_position_finding():
    assert found(vessel(), "lightship-x", "position-x", "position-z", "position-y") == []


@pytest.mark.parametrize("lcg", [0.2 * L, 0.8 * L, 11.0])
def test_a_lightship_lcg_inside_0_2_to_0_8_lbp_is_accepted(lcg):
    assert found(with_lightship(lcg_m=lcg), "lightship-x") == []


@pytest.mark.parametrize("lcg", [0.2 * L - 0.01, 0.8 * L + 0.01, -2.1, 23.0])
def test_a_lightship_lcg_outside_0_2_to_0_8_lbp_is_an_error(lcg):
    (f,) = found(with_lightship(lcg_m=lcg), "lightship-x", "position-x")
    assert (f.severity, f.check, f.key, f.path) == (ERROR, "lightship-x", "lightship.lcg_m", ("lightship", "lcg_m"))
    assert f.value == _f(lcg) + " from AP"


def test_the_lightship_lcg_finding_in_full():
    (f,) = found(with_lightship(lcg_m=-2.1), "lightship-x")
    assert f.text() == (
        "lightship.lcg_m = -2.1 m from AP: a lightship LCG must lie between 0.2 and 0.8 × LBP from the AP "
        "(4.4 m–17.6 m): she floats with B under G, and no hull's LCB lies in the end fifths of her length "
        "(a value from midships or the FP typed as from the AP?); "
        "compare with the booklet's lightship particulars (inclining test summary)")


def test_lightship_kg_between_1_5_and_2_5_depths_is_a_doubt():
    assert found(with_lightship(vcg_m=1.5 * D), "position-z") == []
    (f,) = found(with_lightship(vcg_m=1.5 * D + 0.01), "position-z")
    assert f.severity == WARNING and f.path == ("lightship", "vcg_m")
    assert f.text() == ("lightship.vcg_m = 4.51 m above keel: more than 1.5 × the depth (4.5 m) above the keel; "
                        "compare with the booklet's lightship particulars (inclining test summary)")
    (f,) = found(with_lightship(vcg_m=2.5 * D), "position-z")
    assert f.severity == WARNING


def test_lightship_kg_above_2_5_depths_is_an_error():
    (f,) = found(with_lightship(vcg_m=2.5 * D + 0.01), "position-z")
    assert f.severity == ERROR and f.key == "lightship.vcg_m" and f.path == ("lightship", "vcg_m")
    assert f.text() == ("lightship.vcg_m = 7.51 m above keel: more than 2.5 × the depth (7.5 m) above the keel: "
                        "above anything aboard; compare with the booklet's lightship particulars (inclining test summary)")


def test_lightship_kg_below_0_3_depths_is_a_doubt():
    assert found(with_lightship(vcg_m=0.3 * D), "position-z") == []
    (f,) = found(with_lightship(vcg_m=0.3 * D - 0.01), "position-z")
    assert f.severity == WARNING and f.path == ("lightship", "vcg_m")
    assert f.text() == ("lightship.vcg_m = 0.89 m above keel: below 0.3 × the depth: unusually low for a lightship KG; "
                        "compare with the booklet's lightship particulars (inclining test summary)")


def test_lightship_tcg_beyond_half_the_breadth():
    assert found(with_lightship(tcg_m=B / 2 + 0.004), "position-y") == []
    assert found(with_lightship(tcg_m=B / 2 + 0.005), "position-y") == []  # the edge itself: rounding
    assert found(with_lightship(tcg_m=-(B / 2 + 0.004)), "position-y") == []
    (f,) = found(with_lightship(tcg_m=-3.26), "position-y")
    assert f.severity == ERROR and f.path == ("lightship", "tcg_m")
    assert f.text() == ("lightship.tcg_m = -3.26 m from CL: outside the vessel: |TCG| above half the breadth (3.25 m); "
                        "compare with the booklet's lightship particulars (inclining test summary)")
    (f,) = found(with_lightship(tcg_m=3.26), "position-y")
    assert f.value == "3.26 m from CL"


# --------------------------------------------------------------------------- tanks


@pytest.mark.parametrize("x, severity, end", [
    (-0.2 * L - 0.01, ERROR, "AP"), ((1 + 0.2) * L + 0.01, ERROR, "FP"),
    (-0.2 * L, WARNING, "AP"), ((1 + 0.2) * L, WARNING, "FP"),
    (-0.1 * L - 0.01, WARNING, "AP"), ((1 + 0.1) * L + 0.01, WARNING, "FP"),
])
def test_a_tank_centre_beyond_the_perpendiculars(x, severity, end):
    (f,) = found(with_tank_column("FP", "lcg_m", [20.5, 20.5, 20.5, x, x, x]), "position-x")
    assert (f.severity, f.key, f.path) == (severity, "tank[FP].calibration.lcg_m", ("tank", 3, "calibration", "lcg_m", 3))
    assert f.value == _f(x) + " from AP" and f"beyond the {end} " in f.why


@pytest.mark.parametrize("x", [-0.1 * L, (1 + 0.1) * L])
def test_a_tank_centre_0_1_lbp_outside_the_perpendiculars_is_accepted(x):
    assert found(with_tank_column("FP", "lcg_m", [x] * 6), "position-x") == []


def test_the_tank_centre_findings_in_full():
    (f,) = found(with_tank_column("AP1", "lcg_m", [1.5, -5.0, -5.0, -5.0, -5.0, -5.0]), "position-x")
    assert f.path == ("tank", 0, "calibration", "lcg_m", 1)
    assert f.text() == (
        "tank[AP1].calibration.lcg_m = -5 m from AP: outside the vessel: more than 0.2 × LBP beyond the AP "
        "(the hull runs about -4.4 m to 26.4 m from the AP at most); compare with the booklet's calibration table of tank AP1")
    (f,) = found(with_tank_column("FP", "lcg_m", [24.5] * 6), "position-x")
    assert f.severity == WARNING and f.path == ("tank", 3, "calibration", "lcg_m", 0)
    assert f.text() == (
        "tank[FP].calibration.lcg_m = 24.5 m from AP: more than 0.1 × LBP beyond the FP (-2.2 m to 24.2 m from the AP "
        "is where compartments usually end); compare with the booklet's calibration table of tank FP")


def test_tank_heights_against_1_5_and_3_depths():
    """Tanks lie in the hull or a casing just above it: warning above 1.5 D, error above 3 D
    (common practice, audit.VCG_LIMITS_D).  One finding per column: the first row out."""
    ok = [0.5, 0.7, 0.9, 1.1, 1.3, 1.5 * D]
    assert found(with_tank_column("AP1", "vcg_m", ok), "position-z") == []
    (f,) = found(with_tank_column("AP1", "vcg_m", [0.5, 0.7, 0.9, 1.1, 1.5 * D + 0.01, 3.0 * D]), "position-z")
    assert (f.severity, f.path) == (WARNING, ("tank", 0, "calibration", "vcg_m", 4))
    assert f.text() == ("tank[AP1].calibration.vcg_m = 4.51 m above keel: more than 1.5 × the depth (4.5 m) above the keel; "
                        "compare with the booklet's calibration table of tank AP1")
    (f,) = found(with_tank_column("AP1", "vcg_m", [0.5, 3.0 * D + 0.01] * 3), "position-z")
    assert (f.severity, f.path) == (ERROR, ("tank", 0, "calibration", "vcg_m", 1))
    assert f.text() == ("tank[AP1].calibration.vcg_m = 9.01 m above keel: more than 3 × the depth (9 m) above the keel: "
                        "above anything aboard; compare with the booklet's calibration table of tank AP1")


def test_tank_tcg_outside_the_breadth():
    (f,) = found(with_tank_column("FO1S", "tcg_m", [2.0, 2.0, 3.3, 3.3, 2.0, 2.0]), "position-y")
    assert (f.severity, f.path) == (ERROR, ("tank", 2, "calibration", "tcg_m", 2))
    assert f.text() == ("tank[FO1S].calibration.tcg_m = 3.3 m from CL: outside the vessel: |TCG| above half the breadth "
                        "(3.25 m); compare with the booklet's calibration table of tank FO1S")


def test_each_column_of_a_tank_is_judged():
    """A tank with all three centres out gets one finding per column, in profile order."""
    v = with_tank_column("FP", "lcg_m", [30.0] * 6)
    t = v.tank("FP")
    cal = dataclasses.replace(t.calibration, vcg_m=frozen_array(np.full(6, 10.0)), tcg_m=frozen_array(np.full(6, -4.0)))
    v = dataclasses.replace(v, tanks=tuple(dataclasses.replace(x, calibration=cal) if x.id == "FP" else x for x in v.tanks))
    got = [(f.key, f.path[-1]) for f in found(v, "position-x", "position-z", "position-y")]
    assert got == [("tank[FP].calibration.lcg_m", 0), ("tank[FP].calibration.vcg_m", 0), ("tank[FP].calibration.tcg_m", 0)]


# --------------------------------------------------------------------------- holds, constants, deck areas


def test_a_hold_centre_out_of_the_ship():
    v = with_holds(hold(), hold(id="H2", lcg_m=27.0, vcg_m=9.5, tcg_m=3.5))
    got = {f.key: f for f in found(v, "position-x", "position-z", "position-y")}
    assert set(got) == {"hold[H2].lcg_m", "hold[H2].vcg_m", "hold[H2].tcg_m"}
    f = got["hold[H2].lcg_m"]
    assert (f.severity, f.path) == (ERROR, ("hold", 1, "lcg_m"))
    assert f.text() == ("hold[H2].lcg_m = 27 m from AP: outside the vessel: more than 0.2 × LBP beyond the FP "
                        "(the hull runs about -4.4 m to 26.4 m from the AP at most); "
                        "compare with the booklet's capacity plan / hold table for H2")
    look = "the booklet's capacity plan / hold table for H2"
    f = got["hold[H2].vcg_m"]
    assert (f.severity, f.path, f.value, f.look) == (ERROR, ("hold", 1, "vcg_m"), "9.5 m above keel", look)
    f = got["hold[H2].tcg_m"]
    assert (f.severity, f.path, f.value, f.look) == (ERROR, ("hold", 1, "tcg_m"), "3.5 m from CL", look)


def test_a_hold_height_between_1_5_and_3_depths_is_a_doubt():
    (f,) = found(with_holds(hold(vcg_m=5.0)), "position-z")
    assert f.severity == WARNING and f.key == "hold[H1].vcg_m"


def test_a_hold_fill_table_is_judged_row_by_row():
    """The centroid-against-fill columns: the first row out of each column is named, once."""
    h = hold(fill_pct=frozen_array(np.array([0.0, 50.0, 100.0])),
             fill_lcg_m=frozen_array(np.array([12.0, 30.0, 31.0])),
             fill_vcg_m=frozen_array(np.array([0.5, 1.0, 9.5])))
    got = found(with_holds(h), "position-x", "position-z")
    assert [(f.key, f.path, f.severity, f.value) for f in got] == [
        ("hold[H1].fill_lcg_m", ("hold", 0, "fill_lcg_m", 1), ERROR, "30 m from AP"),
        ("hold[H1].fill_vcg_m", ("hold", 0, "fill_vcg_m", 2), ERROR, "9.5 m above keel"),
    ]
    assert got[0].look == got[1].look == "the booklet's capacity plan / hold table for H1"
    h = hold(fill_pct=frozen_array(np.array([0.0, 100.0])), fill_lcg_m=frozen_array(np.array([12.0, 24.5])),
             fill_vcg_m=frozen_array(np.array([4.6, 4.7])))
    got = found(with_holds(h), "position-x", "position-z")
    assert [(f.key, f.path, f.severity) for f in got] == [
        ("hold[H1].fill_lcg_m", ("hold", 0, "fill_lcg_m", 1), WARNING),
        ("hold[H1].fill_vcg_m", ("hold", 0, "fill_vcg_m", 0), WARNING),
    ]


def test_a_hold_with_only_a_vcg_fill_column():
    h = hold(fill_pct=frozen_array(np.array([0.0, 100.0])), fill_vcg_m=frozen_array(np.array([0.5, 9.5])))
    got = found(with_holds(h), "position-x", "position-z")
    assert [(f.key, f.path) for f in got] == [("hold[H1].fill_vcg_m", ("hold", 0, "fill_vcg_m", 1))]


def test_a_constant_out_of_the_ship():
    """Constants are judged as deck loads: heights up to 2.5 D pass, above 4 D is an error.  A finding
    names the constant by its name, as the reader does (it was 'constant[#2]'; found by an audit)."""
    ok = dataclasses.replace(vessel(), constants=(constant(vcg_m=2.5 * D),))
    assert found(ok, "position-x", "position-z", "position-y") == []
    v = dataclasses.replace(vessel(), constants=(constant(), constant(name="Spare net", lcg_m=-5.0, vcg_m=12.5, tcg_m=-3.3)))
    got = {f.key: f for f in found(v, "position-x", "position-z", "position-y")}
    assert set(got) == {"constant[Spare net].lcg_m", "constant[Spare net].vcg_m", "constant[Spare net].tcg_m"}
    f = got["constant[Spare net].vcg_m"]
    assert (f.severity, f.path) == (ERROR, ("constant", 1, "vcg_m"))
    assert f.text() == ("constant[Spare net].vcg_m = 12.5 m above keel: more than 4 × the depth (12 m) above the keel: "
                        "above anything aboard; compare with the booklet's list of fixed constants (Spare net)")
    look = "the booklet's list of fixed constants (Spare net)"
    f = got["constant[Spare net].lcg_m"]
    assert (f.severity, f.path, f.value, f.look) == (ERROR, ("constant", 1, "lcg_m"), "-5 m from AP", look)
    f = got["constant[Spare net].tcg_m"]
    assert (f.severity, f.path, f.value, f.look) == (ERROR, ("constant", 1, "tcg_m"), "-3.3 m from CL", look)
    (f,) = found(dataclasses.replace(vessel(), constants=(constant(vcg_m=2.5 * D + 0.01),)), "position-z")
    assert f.severity == WARNING and f.why == "more than 2.5 × the depth (7.5 m) above the keel"


def test_a_deck_area_out_of_the_ship():
    v = dataclasses.replace(vessel(), deck_areas=(deck_area(), deck_area(id="FWDDK", lcg_m=24.5, deck_height_m=12.5, tcg_m=3.3)))
    got = {f.key: f for f in found(v, "position-x", "position-z", "position-y")}
    assert set(got) == {"deck_area[FWDDK].lcg_m", "deck_area[FWDDK].deck_height_m", "deck_area[FWDDK].tcg_m"}
    f = got["deck_area[FWDDK].deck_height_m"]
    assert (f.severity, f.path) == (ERROR, ("deck_area", 1, "deck_height_m"))
    assert f.text() == ("deck_area[FWDDK].deck_height_m = 12.5 m above keel: more than 4 × the depth (12 m) above the keel: "
                        "above anything aboard; compare with the booklet's deck plan / deck-load table for FWDDK")
    look = "the booklet's deck plan / deck-load table for FWDDK"
    f = got["deck_area[FWDDK].lcg_m"]
    assert (f.severity, f.path, f.value, f.look) == (WARNING, ("deck_area", 1, "lcg_m"), "24.5 m from AP", look)
    f = got["deck_area[FWDDK].tcg_m"]
    assert (f.severity, f.path, f.value, f.look) == (ERROR, ("deck_area", 1, "tcg_m"), "3.3 m from CL", look)
    (f,) = found(dataclasses.replace(vessel(), deck_areas=(deck_area(deck_height_m=8.0),)), "position-z")
    assert f.severity == WARNING
