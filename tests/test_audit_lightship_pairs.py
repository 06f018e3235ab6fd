"""The audit's lightship-trim and port/starboard-pair checks, at their edges and in full words.

Base: the 22 m box "trawler" of tests/box_profile_text.py (L 22, B 6.5 m; hydrostatics from the
closed forms of checks.md §1.1: LCB 11.0 m, MCTC = ρ·B·L²/1200 = 2.6872 t·m/cm at every draft,
Δ from 146.575 t at 1.0 m to 381.095 t at 2.6 m).  Tanks FO1P (TCG −2.0 m) and FO1S (+2.0 m),
8 m³ each, name each other as a pair.

Bounds (audit.py, reasons written there): the lightship trims by the profile's own hydrostatics
no more than 0.05 × LBP (common practice); a pair's full-tank TCGs have opposite signs unless one
is within 0.01 × B of the centreline (common practice), mirror within max(0.05 m, 10 % of the
larger) (standards.md §5.3 for the 0.05 m; UR L5 values are marked [M] there, from memory), and
its capacities differ by no more than 10 % (UR L5's 2 % on a volume, twice, with margin).
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.core.audit import ERROR, WARNING
from deckload.core.model import frozen_array
from deckload.io.profiles import parse_profile
from fv22_audit import found, vessel, with_hydro

L, B = 22.0, 6.5
MCTC = 1.025 * B * L * L / 1200  # the box's MCTC (checks.md §1.1 closed form), 2.6872 t·m/cm




def with_lightship(v=None, **kw):
    v = v or vessel()
    return dataclasses.replace(v, lightship=dataclasses.replace(v.lightship, **kw))



# --------------------------------------------------------------------------- lightship trim


def expected_trim(mass_t, lcg_m, lcb_m=11.0, mctc=MCTC):
    """Trim = Δ·(LCB − LCG)/(100·MCTC) (standards.md §6), + by the stern."""
    return mass_t * (lcb_m - lcg_m) / (100.0 * mctc)


def test_the_lightship_trimming_more_than_5_percent_of_lbp_by_the_stern():
    """LCG 9.0 m: trim = 150·(11 − 9)/(100·2.6872) = 1.116 m > 0.05 × 22 = 1.1 m."""
    assert expected_trim(150.0, 9.0) == pytest.approx(1.1164, abs=1e-4)
    (f,) = found(with_lightship(lcg_m=9.0), "lightship-trim")
    assert (f.severity, f.key, f.path) == (WARNING, "lightship.lcg_m", ("lightship", "lcg_m"))
    assert f.text() == (
        "lightship.lcg_m = 9 m from AP: with the profile's LCB 11 m and MCTC 2.687 t·m/cm at the lightship "
        "displacement she would trim 1.116 m by the stern, more than 0.05 × LBP; compare with the booklet's "
        "lightship particulars and its lightship condition (trim)")


def test_by_the_head_when_g_is_forward_of_b():
    (f,) = found(with_lightship(lcg_m=13.0), "lightship-trim")
    assert "she would trim 1.116 m by the head," in f.why and f.value == "13 m from AP"


def test_a_lightship_trim_under_5_percent_of_lbp_is_accepted():
    """The base: LCG 10.6 m trims 150·0.4/268.7 = 0.22 m; 10.0 m: 0.56 m."""
    assert found(vessel(), "lightship-trim") == []
    assert found(with_lightship(lcg_m=10.0), "lightship-trim") == []


def test_the_trim_edge_at_exactly_5_percent_of_lbp():
    """An MCTC column of 3.75 t·m/cm (binary-exact numbers): LCG 8.25 m trims 150·2.75/375 = 1.1 m
    exactly, which is not MORE than 0.05 × LBP; LCG 8.24 m trims 1.104 m, which is."""
    v = with_hydro(vessel(), mctc_tm_cm=[3.75] * 9)
    assert expected_trim(150.0, 8.25, mctc=3.75) == 0.05 * L
    assert found(with_lightship(v, lcg_m=8.25), "lightship-trim") == []
    (f,) = found(with_lightship(v, lcg_m=8.24), "lightship-trim")
    assert "MCTC 3.75 t·m/cm" in f.why and "she would trim 1.104 m by the stern" in f.why


def test_lcb_and_mctc_are_read_at_the_lightship_displacement():
    """LCB and MCTC vary with Δ here: at the lightship's 190.5475 t (half-way between the 1.2 m and
    1.4 m rows) np.interp gives LCB (11.2 + 11.4)/2 = 11.3 m and MCTC (3.0 + 3.5)/2 = 3.25 t·m/cm,
    so LCG 8.0 m trims 190.5475·3.3/325 = 1.935 m by the stern (linear interpolation between rows)."""
    v = vessel()
    d = np.asarray(v.hydrostatics.displacement_t)
    lcb = [11.0, 11.2, 11.4, 11.6, 11.8, 12.0, 12.2, 12.4, 12.6]
    mctc = [2.5, 3.0, 3.5, 4.0, 4.5, 5.0, 5.5, 6.0, 6.5]
    mass = float((d[1] + d[2]) / 2)
    v = with_lightship(with_hydro(v, lcb_m=lcb, lcf_m=lcb, mctc_tm_cm=mctc), mass_t=mass, lcg_m=8.0)
    (f,) = found(v, "lightship-trim")
    assert f.why.startswith("with the profile's LCB 11.3 m and MCTC 3.25 t·m/cm at the lightship displacement "
                            "she would trim 1.935 m by the stern")


@pytest.mark.parametrize("row", [0, -1])
def test_the_trim_is_judged_at_either_end_of_the_table(row):
    """A lightship mass on the first or last row of the hydrostatic table is inside it."""
    v = vessel()
    mass = float(v.hydrostatics.displacement_t[row])
    (f,) = found(with_lightship(v, mass_t=mass, lcg_m=8.5), "lightship-trim")
    assert f"she would trim {expected_trim(mass, 8.5):.4g} m by the stern" in f.why


@pytest.mark.parametrize("mass", [146.0, 381.2])
def test_no_trim_is_judged_outside_the_hydrostatic_table(mass):
    """Outside the table the audit does not extrapolate: no finding (tables.py never extrapolates)."""
    assert found(with_lightship(mass_t=mass, lcg_m=9.0), "lightship-trim") == []


# --------------------------------------------------------------------------- pairs


def with_full_tcg(**full):
    """The pair's TCG columns set to one value each (a box tank's centre does not move)."""
    v = vessel()
    tanks = []
    for t in v.tanks:
        if t.id in full:
            cal = dataclasses.replace(t.calibration, tcg_m=frozen_array(np.full(len(t.calibration.tcg_m), full[t.id])))
            t = dataclasses.replace(t, calibration=cal)
        tanks.append(t)
    return dataclasses.replace(v, tanks=tuple(tanks))


def with_capacity(v, **caps):
    return dataclasses.replace(v, tanks=tuple(dataclasses.replace(t, capacity_m3=caps[t.id]) if t.id in caps else t
                                              for t in v.tanks))


def test_a_pair_on_one_side_is_an_error_in_full():
    (f,) = found(with_full_tcg(FO1P=2.0), "pair-tcg-sign", "pair-tcg")
    assert (f.severity, f.check, f.key) == (ERROR, "pair-tcg-sign", "tank[FO1P].calibration.tcg_m")
    assert f.path == ("tank", 1, "calibration", "tcg_m", 5)
    assert f.text() == (
        "tank[FO1P].calibration.tcg_m = 2 m (pair FO1S: 2 m): FO1P and FO1S are a port/starboard pair but both "
        "centres are on the starboard side: one sign is wrong; compare with the booklet's calibration tables of "
        "FO1P and FO1S (full-tank TCG)")
    (f,) = found(with_full_tcg(FO1S=-2.0), "pair-tcg-sign", "pair-tcg")
    assert "both centres are on the port side" in f.why and f.value == "-2 m (pair FO1S: -2 m)"


def test_the_pair_is_judged_once_and_by_its_full_tank_row():
    """Only the last row (full) is compared: a pair mirrored when full but not in a lower row passes."""
    v = vessel()
    t = v.tank("FO1S")
    cal = dataclasses.replace(t.calibration, tcg_m=frozen_array(np.array([2.4, 2.3, 2.2, 2.1, 2.05, 2.0])))
    v2 = dataclasses.replace(v, tanks=tuple(dataclasses.replace(x, calibration=cal) if x.id == "FO1S" else x
                                            for x in v.tanks))
    assert found(v2, "pair-tcg-sign", "pair-tcg", "pair-capacity") == []
    assert len(found(with_full_tcg(FO1P=2.0), "pair-tcg-sign", "pair-tcg")) == 1


def test_a_pair_named_from_one_side_only_is_judged():
    v = with_full_tcg(FO1P=2.0)
    v = dataclasses.replace(v, tanks=tuple(dataclasses.replace(t, pair=None) if t.id == "FO1S" else t for t in v.tanks))
    (f,) = found(v, "pair-tcg-sign")
    assert f.key == "tank[FO1P].calibration.tcg_m"
    v = dataclasses.replace(v, tanks=tuple(dataclasses.replace(t, pair=None) if t.id == "FO1P" else t for t in v.tanks))
    v = dataclasses.replace(v, tanks=tuple(dataclasses.replace(t, pair="FO1P") if t.id == "FO1S" else t for t in v.tanks))
    (f,) = found(v, "pair-tcg-sign")
    assert f.key == "tank[FO1S].calibration.tcg_m" and f.path == ("tank", 2, "calibration", "tcg_m", 5)
    assert "FO1S and FO1P are a port/starboard pair" in f.why


def test_a_pair_naming_an_unknown_tank_is_left_to_the_reader():
    v = with_full_tcg(FO1P=2.0)
    v = dataclasses.replace(v, tanks=tuple(dataclasses.replace(t, pair="NOPE" if t.id == "FO1P" else None)
                                           if t.id in ("FO1P", "FO1S") else t for t in v.tanks))
    assert found(v, "pair-tcg-sign", "pair-tcg", "pair-capacity") == []


def test_a_centre_within_1_percent_of_b_of_the_centreline_has_no_side():
    """0.01 × B = 0.065 m: a TCG that close could be a rounding of 0 (common practice), so two such
    centres of one sign are not a sign error (they fail to mirror: a doubt instead)."""
    near = 0.01 * B
    for ya, yb in ((near, 2.0), (2.0, near), (near, near)):
        assert found(with_full_tcg(FO1P=ya, FO1S=yb), "pair-tcg-sign") == []
    (f,) = found(with_full_tcg(FO1P=near, FO1S=near), "pair-tcg")
    assert f.severity == WARNING
    for ya, yb in ((0.066, 2.0), (2.0, 0.066), (-0.066, -2.0)):
        (f,) = found(with_full_tcg(FO1P=ya, FO1S=yb), "pair-tcg-sign")
        assert f.severity == ERROR


def test_tcgs_that_do_not_mirror_are_a_doubt_in_full():
    (f,) = found(with_full_tcg(FO1S=2.3), "pair-tcg", "pair-tcg-sign")
    assert (f.severity, f.check, f.key) == (WARNING, "pair-tcg", "tank[FO1P].calibration.tcg_m")
    assert f.path == ("tank", 1, "calibration", "tcg_m", 5)
    assert f.text() == (
        "tank[FO1P].calibration.tcg_m = -2 m (pair FO1S: 2.3 m): the pair's full-tank TCGs do not mirror: they "
        "differ by 0.3 m (more than max(0.05 m, 10% of the larger)); compare with the booklet's calibration tables "
        "of FO1P and FO1S (full-tank TCG)")


def test_the_mirror_tolerance_edges():
    """max(0.05 m, 10 % of the larger): −0.06/+0.11 differ by exactly 0.05 m (accepted), −0.05/+0.11
    by 0.06 m (a doubt); −2.25/+2.5 differ by exactly 10 % of 2.5 (accepted), −2.24/+2.5 by more.
    (Pairs chosen so the sums are exact in binary floating point.)"""
    assert found(with_full_tcg(FO1P=-0.06, FO1S=0.11), "pair-tcg") == []
    assert len(found(with_full_tcg(FO1P=-0.05, FO1S=0.11), "pair-tcg")) == 1
    assert found(with_full_tcg(FO1P=-2.25, FO1S=2.5), "pair-tcg") == []
    assert found(with_full_tcg(FO1P=-2.5, FO1S=2.25), "pair-tcg") == []
    assert len(found(with_full_tcg(FO1P=-2.24, FO1S=2.5), "pair-tcg")) == 1
    assert len(found(with_full_tcg(FO1P=-2.5, FO1S=2.24), "pair-tcg")) == 1


def test_capacities_that_differ_by_more_than_10_percent_in_full():
    (f,) = found(with_capacity(vessel(), FO1S=7.0), "pair-capacity")
    assert (f.severity, f.key, f.path) == (WARNING, "tank[FO1P].capacity_m3", ("tank", 1, "capacity_m3"))
    assert f.text() == (
        "tank[FO1P].capacity_m3 = 8 m³ (pair FO1S: 7 m³): the pair's capacities differ by 12% (more than 10%: "
        "UR L5 allows 2 % on a volume); compare with the booklet's calibration tables of FO1P and FO1S (capacity)")
    (f,) = found(with_capacity(vessel(), FO1P=7.0), "pair-capacity")
    assert f.value == "7 m³ (pair FO1S: 8 m³)" and "differ by 12%" in f.why


def test_the_capacity_edge_at_10_percent():
    """10 and 9 m³ differ by exactly 10 % of the larger: accepted; 10 and 8.99: a doubt."""
    assert found(with_capacity(vessel(), FO1P=10.0, FO1S=9.0), "pair-capacity") == []
    assert found(with_capacity(vessel(), FO1P=9.0, FO1S=10.0), "pair-capacity") == []
    assert len(found(with_capacity(vessel(), FO1P=10.0, FO1S=8.99), "pair-capacity")) == 1
    assert len(found(with_capacity(vessel(), FO1P=8.99, FO1S=10.0), "pair-capacity")) == 1


def test_a_sign_error_and_a_capacity_doubt_are_both_reported():
    v = with_capacity(with_full_tcg(FO1P=2.0), FO1S=7.0)
    assert [f.check for f in found(v, "pair-tcg-sign", "pair-tcg", "pair-capacity")] == ["pair-tcg-sign", "pair-capacity"]


def test_a_small_boat_trimming_under_a_metre_by_the_stern():
    """A 12 m box (B 4, D 2 m, drafts 0.6–1.4 m; checks.md §1.1 closed forms): MCTC = ρ·B·L²/1200 =
    0.492 t·m/cm.  Lightship 50 t (in the table: Δ at 0.6 m is 29.5 t) at LCG 5.2 m trims
    50·0.8/49.2 = 0.813 m by the stern, more than 0.05 × 12 = 0.6 m: "by the stern" also under 1 m."""
    from box_profile_text import BoxTank, box_profile_text

    text = box_profile_text(name="Box 12", length_m=12.0, breadth_m=4.0, depth_m=2.0, drafts_m=[0.6, 0.8, 1.0, 1.2, 1.4],
                            kn_drafts_m=[0.6, 1.0, 1.4], lightship=(50.0, 5.2, 1.5),
                            tanks=(BoxTank("FW", (1.0, 2.0), (-1.0, 1.0), (0.2, 1.0), kind="fresh_water", density_t_m3=1.0),))
    v = parse_profile(text, "box12.toml")
    mctc = 1.025 * 4.0 * 12.0 * 12.0 / 1200
    trim = expected_trim(50.0, 5.2, lcb_m=6.0, mctc=mctc)
    assert trim == pytest.approx(0.8130, abs=1e-4) and 0.05 * 12.0 < trim < 1.0
    (f,) = found(v, "lightship-trim")
    assert "she would trim 0.813 m by the stern, more than 0.05 × LBP" in f.why


def test_the_pair_is_read_at_the_full_row_of_both_tanks():
    """Rows below the full one have the other sign (mistyped, or a filling pipe's wing): the pair
    check reads the full-tank TCG of both tanks only (their lower rows are the tank checks' business)."""
    v = vessel()
    cols = {"FO1P": [2.0, 2.0, 2.0, 2.0, 2.0, -2.0], "FO1S": [-2.0, -2.0, -2.0, -2.0, -2.0, 2.0]}
    tanks = tuple(dataclasses.replace(t, calibration=dataclasses.replace(t.calibration, tcg_m=frozen_array(np.array(cols[t.id]))))
                  if t.id in cols else t for t in v.tanks)
    assert found(dataclasses.replace(v, tanks=tanks), "pair-tcg-sign", "pair-tcg") == []


def test_a_pair_with_one_centre_on_the_centreline_is_a_doubt_not_a_crash():
    (f,) = found(with_full_tcg(FO1S=0.0), "pair-tcg-sign", "pair-tcg")
    assert f.check == "pair-tcg" and f.value == "-2 m (pair FO1S: 0 m)" and "differ by 2 m" in f.why


def test_both_centres_half_a_metre_to_starboard():
    (f,) = found(with_full_tcg(FO1P=0.5, FO1S=0.5), "pair-tcg-sign")
    assert "both centres are on the starboard side" in f.why
