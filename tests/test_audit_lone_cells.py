"""A lone mistyped cell in a booklet table: the audit's test (deckload.core.audit.lone_cell).

An officer typing a booklet transposes two digits of one KMt, types one KN column with the next
heel's values or one FSM a decimal place out.  Each is a valid number that every range check
passes, and each moves GM or GZ by decimetres: a transposed KMt at one row (3.489 typed 3.849)
gave GM 0.36 m too high and "Met" (found by an audit).  The test and its derivation are in
lone_cell's docstring: one wrong cell departs from the chord through its neighbours by δ and bends
its neighbours the other way by δ/2 (even spacing); a kink or a smooth curve does neither.  Checked
here on closed forms (derived below), on the exact KN of checks.md §1.2 (box barge: the deck edge
immerses at 21.8°, a kink in KN), on both demo vessels (no false alarm), and on the demo's own
tables with one cell mistyped (each found, as a WARNING naming the cell).
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.core import audit as au
from deckload.core.audit import WARNING, audit, lone_cell
from deckload.core.model import frozen_array
from demo_vessels import demo_vessel, trawler_vessel

LONE = ("hydro-lone", "kn-lone", "tank-lone", "curve-lone")
X = np.arange(11.0)


def test_a_smooth_curve_and_a_kink_have_no_lone_cell():
    """y = x²: every chord departs by −h² = −1 (y_j − (y_{j−1} + y_{j+1})/2 = −1 at h = 1), past the
    floor 0.5, but a neighbour still departs by −1 + ½ = −0.5 after the cell is put on its chord: not
    lone.  y = |x − 5|: the kink departs by −1 and its neighbours by 0: not lone (derived)."""
    assert lone_cell(X, X**2, lambda v: 0.5) is None
    assert lone_cell(X, np.abs(X - 5.0), lambda v: 0.5) is None


@pytest.mark.parametrize("j", [2, 5, 8])
def test_one_wrong_cell_on_a_line_is_found_with_its_chord(j):
    """y = 2x + 3 with y_j raised by 0.5: the cell departs by exactly 0.5 from the chord 2j + 3; its
    neighbours depart by −0.25 (half of it, the other way) and by 0 once it is on the chord (derived)."""
    y = 2.0 * X + 3.0
    y[j] += 0.5
    i, r, chord = lone_cell(X, y, lambda v: 0.1)
    assert (i, r, chord) == (j, pytest.approx(0.5, abs=1e-12), pytest.approx(2.0 * j + 3.0, abs=1e-12))
    assert lone_cell(X, y, lambda v: 0.5) is None  # at the floor itself: not judged


@pytest.mark.parametrize("j", [0, 1, 9, 10])
def test_a_cell_whose_neighbours_lack_chords_is_not_judged(j):
    """An end cell has no chord; the second and the last-but-one have one neighbour with a chord,
    and there a kink between few rows looks alike (lone_cell's docstring)."""
    y = 2.0 * X + 3.0
    y[j] += 5.0
    assert lone_cell(X, y, lambda v: 0.1) is None


@pytest.mark.parametrize("drafts", [[1.0, 1.6, 2.2, 2.6], [0.8, 1.0, 1.6, 2.2, 2.6, 2.9], [1.0, 1.3, 1.6, 1.9, 2.2, 2.5, 2.8]])
def test_the_box_kn_along_the_displacement_has_no_lone_cell(drafts):
    """tests/box_profile_text.py's 22 m box (B 6.5 m, D 3 m) with KN at those drafts from the closed
    forms of checks.md §1.2: at a fixed heel the deck edge immerses or the bilge emerges between two
    of the drafts, a kink along the displacement, not a wrong cell."""
    from vessel_factories import box_kn_m

    for heel in range(5, 91, 5):
        kn = [box_kn_m(6.5, 3.0, t, np.radians(heel)) for t in drafts]
        assert lone_cell(drafts, kn, au._lone_floor("kn_m")) is None, heel


@pytest.mark.parametrize("step", [1, 2, 3])
def test_the_exact_box_kn_with_its_deck_edge_kink_has_no_lone_cell(step):
    """checks.md §1.2 [A]: KN of the box barge L=40, B=10, D=4, T=2 at 0–80° (the deck edge immerses
    at 21.8°), printed every 5°, and every 10° and 15° (the same values, every 2nd and 3rd)."""
    heel = np.arange(0.0, 81.0, 5.0)
    kn = np.array([0.0, 0.45169, 0.90843, 1.37595, 1.86150, 2.31359, 2.58771, 2.75383, 2.85134, 2.89914,
                   2.90730, 2.88180, 2.82650, 2.74421, 2.63719, 2.50740, 2.35671])
    assert lone_cell(heel[::step], kn[::step], au._lone_floor("kn_m")) is None


@pytest.mark.parametrize("vessel_of", [demo_vessel, trawler_vessel])
def test_the_demo_vessels_tables_have_no_lone_cell(vessel_of):
    assert [f for f in audit(vessel_of()) if f.check in LONE] == []


def _lone(v, check):
    found = [f for f in audit(v) if f.check == check]
    assert len(found) == 1 and found[0].severity == WARNING, found
    return found[0]


def _with(arr, i, value):
    a = np.array(arr, dtype=float)
    a[i] = value
    return frozen_array(a)


def test_a_transposed_kmt_is_named():
    v = demo_vessel()
    h = v.hydrostatics
    assert float(h.kmt_m[10]) == 4.7435  # the premise: the demo's KMt at row 10, typed 4.4735
    f = _lone(dataclasses.replace(v, hydrostatics=dataclasses.replace(h, kmt_m=_with(h.kmt_m, 10, 4.4735))), "hydro-lone")
    assert f.key == "hydrostatics.kmt_m" and f.path == ("hydrostatics", "kmt_m", 10)
    chord = float(f.why.split("gives ")[1].split(" m")[0])
    assert chord == pytest.approx(4.7435, abs=0.02)  # the line through its neighbours comes back near the true value


def test_a_kn_column_typed_with_the_next_heels_values_is_named_in_every_row():
    v = demo_vessel()
    k = v.cross_curves
    j = int(np.flatnonzero(k.heel_deg == 30.0)[0])
    kn = np.array(k.kn_m, dtype=float)
    kn[:, j] = kn[:, j + 1]
    f = _lone(dataclasses.replace(v, cross_curves=dataclasses.replace(k, kn_m=frozen_array(kn))), "kn-lone")
    assert f.path[:2] == ("cross_curves", "kn_m") and f.path[3] == j
    assert f"the 30° value stands out so in {len(k.displacement_t)} of the {len(k.displacement_t)} rows" in f.why


def test_an_fsm_a_decimal_place_out_is_named():
    v = demo_vessel()
    n, t = next((n, t) for n, t in enumerate(v.tanks) if t.id == "FO1P")
    cal = t.calibration
    assert round(float(cal.fsi_m4[5]), 2) == 23.52  # the premise: the demo's FO1P at row 5, typed a place out
    bad = dataclasses.replace(cal, fsi_m4=_with(cal.fsi_m4, 5, float(cal.fsi_m4[5]) / 10.0))
    tanks = list(v.tanks)
    tanks[n] = dataclasses.replace(t, calibration=bad)
    f = _lone(dataclasses.replace(v, tanks=tuple(tanks)), "tank-lone")
    assert f.key == "tank[FO1P].calibration.fsi_m4" and f.path[-1] == 5


def test_a_transposed_downflooding_angle_is_named():
    v = demo_vessel()
    d = v.downflooding
    assert float(d.value[4]) == 57.63  # the premise: typed 75.63
    f = _lone(dataclasses.replace(v, downflooding=dataclasses.replace(d, value=_with(d.value, 4, 75.63))), "curve-lone")
    assert f.key == "downflooding.angle_deg" and f.path == ("downflooding", "angle_deg", 4)


def test_through_the_files_check_names_the_line_and_calc_carries_it(tmp_path, capsys):
    from deckload.cli.main import main
    from demo_vessels import copy_of_demo

    profile = copy_of_demo(tmp_path, "demo_islander")
    text = profile.read_text(encoding="utf-8")
    assert text.count("4.8811, 4.7435, 4.619") == 1  # the premise: the KMt of test_a_transposed_kmt_is_named
    profile.write_text(text.replace("4.8811, 4.7435, 4.619", "4.8811, 4.4735, 4.619"), encoding="utf-8")
    line = next(n for n, ln in enumerate(profile.read_text(encoding="utf-8").splitlines(), 1) if "4.4735" in ln)
    assert main(["check", str(profile)]) == 0  # a doubt, not a contradiction
    out = capsys.readouterr().out
    assert f"{profile.name}:{line}: WARNING hydrostatics.kmt_m = 4.4735 m: stands alone out of a smooth curve" in out
    assert main(["calc", str(profile), str(profile.parent / "demo_islander.departure.condition.toml")]) == 0
    assert "hydrostatics.kmt_m = 4.4735 m: stands alone" in capsys.readouterr().out.replace("\n    ", " ")


@pytest.mark.parametrize("share, flagged", [(0.05, True), (0.099, True), (0.101, False), (0.5, False), (1.01, True)])
def test_a_lightship_far_from_her_loaded_displacement_is_a_doubt(share, flagged):
    """The demo's lightship set to a share of her displacement at the summer mark (2.9 m), read from
    her own hydrostatic table: below a tenth is a doubt (deckload.core.audit.LIGHTSHIP_SHARE, from
    memory), and so is at or above it (she carries nothing)."""
    v = demo_vessel()
    summer = next(m.draft_m for m in v.load_lines if m.name == "summer")
    loaded = float(np.interp(summer, v.hydrostatics.draft_m, v.hydrostatics.displacement_t))
    light = dataclasses.replace(v, lightship=dataclasses.replace(v.lightship, mass_t=share * loaded))
    found = [f for f in audit(light) if f.check == "lightship-share"]
    assert len(found) == flagged and all(f.severity == WARNING and f.key == "lightship.mass_t" for f in found)
    assert [f for f in audit(v) if f.check == "lightship-share"] == []


@pytest.mark.parametrize("kind, density, flagged", [
    ("ballast", 1.25, True), ("ballast", 1.025, False), ("ballast", 1.000, False), ("fresh_water", 1.025, True),
    ("fuel_oil", 0.991, False), ("fuel_oil", 1.10, True), ("diesel", 0.95, True), ("diesel", 0.86, False),
    ("cargo_liquid", 1.8, False)])
def test_a_tank_density_unusual_for_its_kind_is_a_doubt(kind, density, flagged):
    """KIND_DENSITY_T_M3: sea water 1.025 and fresh water 1.000 (standards.md §6.2), residual fuel
    at most 1.010 and distillate 0.900 (ISO 8217, standards.md §6.2); cargo liquids not judged."""
    v = demo_vessel()
    tanks = list(v.tanks)
    tanks[0] = dataclasses.replace(tanks[0], kind=kind, density_t_m3=density)
    found = [f for f in audit(dataclasses.replace(v, tanks=tuple(tanks))) if f.check == "tank-density"]
    assert [(f.key, f.severity) for f in found] == ([(f"tank[{tanks[0].id}].density_t_m3", WARNING)] if flagged else [])


def test_a_pair_whose_full_tank_lcgs_differ_is_a_doubt():
    """A port/starboard pair spans the same frames, so its full-tank LCGs agree (PAIR_LCG_LBP, common
    practice).  The demo's FO1P typed with its LCG mirrored about midships (a midships datum's sign
    slipped) stands 2·|LCG − LBP/2| from FO1S; moved by 1 % of LBP it is within the bound."""
    v = demo_vessel()
    n = next(n for n, t in enumerate(v.tanks) if t.id == "FO1P")
    t = v.tanks[n]
    L = v.particulars.lbp_m
    x = np.asarray(t.calibration.lcg_m, dtype=float)
    assert abs(float(x[-1]) - L / 2) > 0.02 * L  # the premise: mirrored, it lands more than 4 % of LBP away

    def moved(new_x):
        tanks = list(v.tanks)
        tanks[n] = dataclasses.replace(t, calibration=dataclasses.replace(t.calibration, lcg_m=frozen_array(new_x)))
        return [f for f in audit(dataclasses.replace(v, tanks=tuple(tanks))) if f.check == "pair-lcg"]

    (f,) = moved(L - x)
    assert f.severity == WARNING and f.key == "tank[FO1P].calibration.lcg_m"
    assert moved(x + 0.01 * L) == [] and [f for f in audit(v) if f.check == "pair-lcg"] == []
