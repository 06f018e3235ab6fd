"""The audit of MCTC (against the waterplane and against KML) and of the KN cross curves: each
typing error caught with the table, the row/column and the value named, in full words; good
tables raise nothing.

Base: the 22 m box "trawler" of tests/box_profile_text.py, L 22, B 6.5, D 3.0 m (checks.md §1.1
closed forms): waterplane coefficient Cw = 1, c = 12·MCTC/(TPC·LBP) = 1 (a rectangle), and
MCTC·100·LBP/(Δ·BML) = 1 (MCTC made with BML).  Its KN table (tests/vessel_factories.py, exact
section formulas of checks.md §1.2) at Δ 146.575, 234.52, 322.465, 381.095 t and 0–90° in 10°
steps.  Bounds and their reasons are audit.py's.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from box_profile_text import FV22_TANKS, box_profile_text
from deckload.core.audit import ERROR, WARNING
from deckload.core.model import frozen_array
from deckload.io.profiles import parse_profile
from fv22_audit import found, vessel, with_hydro

L, B, D = 22.0, 6.5, 3.0
ROW = "compare with the booklet's hydrostatic particulars table, row at draft"
KN_LOOK = "compare with the booklet's KN cross curves table,"



def col(name, v=None):
    return np.array(getattr((v or vessel()).hydrostatics, name), dtype=float)




# --------------------------------------------------------------------------- MCTC against the waterplane


def test_mctc_beyond_any_waterplane_in_full():
    """MCTC × 10: c = 10, above 3·(1.2)²·1.03 = 4.45 (Popoviciu on a waterline ≤ 1.2·LBP, derived in
    audit._check_mctc)."""
    (f,) = found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 10), "hydro-mctc")
    assert (f.severity, f.key, f.path) == (ERROR, "hydrostatics.mctc_tm_cm", ("hydrostatics", "mctc_tm_cm", 0))
    assert f.text() == ("hydrostatics.mctc_tm_cm = 26.872 t·m/cm: 12·MCTC/(TPC·LBP) = 10 at 1 m: no waterplane of this "
                        f"area and breadth gives that (bounds 0.9–4.45); {ROW} 1 m")


def test_mctc_below_what_a_full_waterplane_allows():
    """MCTC × 0.85: c = 0.85 < 0.9·Cw² = 0.9 (the box's waterplane fills L × B: I_L ≥ A³/(12·B²))."""
    (f,) = found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 0.85), "hydro-mctc")
    assert f.severity == ERROR and "= 0.85 at 1 m" in f.why and "(bounds 0.9–4.45)" in f.why
    assert found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 0.91), "hydro-mctc") == []


def test_an_unusual_waterplane_shape_is_a_doubt_in_full():
    (f,) = found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 1.5), "hydro-mctc")
    assert f.severity == WARNING
    assert f.text() == ("hydrostatics.mctc_tm_cm = 4.0308 t·m/cm: 12·MCTC/(TPC·LBP) = 1.5 at 1 m: outside 0.4–1.3 "
                        f"(diamond 0.5, rectangle 1.0); {ROW} 1 m")
    assert found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 1.29), "hydro-mctc") == []
    assert len(found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 1.31), "hydro-mctc")) == 1
    (f,) = found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 4.4), "hydro-mctc")
    assert f.severity == WARNING
    (f,) = found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 4.5), "hydro-mctc")
    assert f.severity == ERROR


def test_a_fine_waterplane_is_judged_against_its_own_area():
    """TPC × 0.5 (Cw 0.5, e.g. a diamond): 0.9·Cw² = 0.225 is the hard floor, 0.4 the doubt.  MCTC
    × 0.15 gives c = 0.3 (a doubt), × 0.1 gives c = 0.2 (an error), × 0.25 gives c = 0.5 (a diamond)."""
    tpc, mctc = col("tpc_t_cm") * 0.5, col("mctc_tm_cm")
    (f,) = found(with_hydro(tpc_t_cm=tpc, mctc_tm_cm=mctc * 0.15), "hydro-mctc")
    assert f.severity == WARNING and "= 0.3 at 1 m" in f.why
    (f,) = found(with_hydro(tpc_t_cm=tpc, mctc_tm_cm=mctc * 0.1), "hydro-mctc")
    assert f.severity == ERROR and "(bounds 0.23–4.45)" in f.why
    assert found(with_hydro(tpc_t_cm=tpc, mctc_tm_cm=mctc * 0.25), "hydro-mctc") == []


def test_only_the_first_bad_mctc_row_is_reported():
    m = col("mctc_tm_cm")
    m[3:] *= 10
    (f,) = found(with_hydro(mctc_tm_cm=m), "hydro-mctc")
    assert f.path == ("hydrostatics", "mctc_tm_cm", 3) and "at 1.6 m" in f.why


# --------------------------------------------------------------------------- MCTC against KML


def test_mctc_against_kml_a_doubt_in_full():
    """KML × 1.5: BML = 1.5·KML − KB, so the table's MCTC is 0.6639 × Δ·BML/(100·LBP) at 1.0 m; GML ≥
    0.8·BML on ordinary ships (audit.MCTC_KML_RANGE, derived)."""
    (f,) = found(with_hydro(kml_m=col("kml_m") * 1.5), "hydro-mctc-kml")
    assert (f.severity, f.key, f.path) == (WARNING, "hydrostatics.mctc_tm_cm", ("hydrostatics", "mctc_tm_cm", 0))
    assert f.text() == (
        "hydrostatics.mctc_tm_cm = 2.6872 t·m/cm: MCTC ≈ Δ·GML/(100·LBP) with GML ≤ BML = KML − KB = 60.75 m: the "
        f"table's MCTC is 0.6639 × Δ·BML/(100·LBP), outside 0.8–1.03; {ROW} 1 m")  # 4 figures: 1.03 vs 1.0306


def test_mctc_against_kml_an_error():
    """KML × 2: ratio 0.4969 at 1.0 m, below 0.5: a factor of 2 slipped."""
    (f,) = found(with_hydro(kml_m=col("kml_m") * 2), "hydro-mctc-kml")
    assert f.severity == ERROR and f.why.endswith("the table's MCTC is 0.4969 × Δ·BML/(100·LBP), outside 0.5–1.1")
    (f,) = found(with_hydro(kml_m=col("kml_m") * 0.9), "hydro-mctc-kml")
    assert f.severity == ERROR and "outside 0.5–1.1" in f.why  # ratio 1.11
    (f,) = found(with_hydro(kml_m=col("kml_m") * 0.95), "hydro-mctc-kml")
    assert f.severity == WARNING and "outside 0.8–1.03" in f.why  # ratio 1.05
    assert found(with_hydro(kml_m=col("kml_m") * 1.2), "hydro-mctc-kml") == []  # ratio 0.83


def test_kml_not_above_the_centre_of_buoyancy_in_full():
    k = col("kml_m")
    k[2] = 0.7  # = VCB at 1.4 m
    (f,) = found(with_hydro(kml_m=k), "hydro-mctc")
    assert (f.severity, f.key, f.path) == (ERROR, "hydrostatics.kml_m", ("hydrostatics", "kml_m", 2))
    assert f.text() == f"hydrostatics.kml_m = 0.7 m: KML is not above the centre of buoyancy; {ROW} 1.4 m"


def test_without_vcb_kb_is_taken_as_0_55_of_the_draft():
    """KB ≈ 0.55·T (common practice, audit._check_mctc) when the table has no VCB: at 1.4 m 0.77 m."""
    k = col("kml_m")
    k[2] = 0.76
    (f,) = found(with_hydro(kml_m=k, vcb_m=None), "hydro-mctc")
    assert f.key == "hydrostatics.kml_m" and f.path[-1] == 2
    assert found(with_hydro(vcb_m=None), "hydro-mctc", "hydro-mctc-kml") == []


def test_a_keel_row_does_not_stop_the_kml_check():
    """A row at draft 0 (Δ 0) has no MCTC/KML ratio; the rows above it are still judged."""
    h = vessel().hydrostatics
    first = {"draft_m": 0.0, "displacement_t": 0.0, "vcb_m": 0.0}
    cols = {k: np.concatenate([[first.get(k, getattr(h, k)[0])], np.asarray(getattr(h, k))])
            for k in ("draft_m", "displacement_t", "lcb_m", "lcf_m", "kmt_m", "tpc_t_cm", "mctc_tm_cm", "vcb_m", "kml_m")}
    assert found(with_hydro(**cols), "hydro-mctc-kml") == []
    cols["kml_m"] = cols["kml_m"] * 2
    (f,) = found(with_hydro(**cols), "hydro-mctc-kml")
    assert f.path == ("hydrostatics", "mctc_tm_cm", 1)


def test_only_the_first_bad_kml_row_is_reported():
    k = col("kml_m")
    k[4:] *= 2
    (f,) = found(with_hydro(kml_m=k), "hydro-mctc-kml")
    assert f.path == ("hydrostatics", "mctc_tm_cm", 4)
    k[6] = 0.5
    got = found(with_hydro(kml_m=k), "hydro-mctc-kml", "hydro-mctc")
    assert [(f.key, f.path[-1]) for f in got] == [("hydrostatics.mctc_tm_cm", 4)]


# --------------------------------------------------------------------------- KN: impossible values


def kn():
    return np.array(vessel().cross_curves.kn_m, dtype=float)


def with_kn(a, v=None):
    v = v or vessel()
    return dataclasses.replace(v, cross_curves=dataclasses.replace(v.cross_curves, kn_m=frozen_array(np.asarray(a, float))))


KN_CHECKS = ("kn-zero", "kn-negative", "kn-envelope", "kn-kmt", "kn-outlier")


def test_the_box_kn_table_raises_nothing():
    assert found(vessel(), *KN_CHECKS) == []


def test_kn_at_zero_heel_not_zero_in_full():
    a = kn()
    a[1, 0] = 0.02
    (f,) = found(with_kn(a), *KN_CHECKS)
    assert (f.severity, f.check, f.key, f.path) == (ERROR, "kn-zero", "cross_curves.kn_m", ("cross_curves", "kn_m", 1, 0))
    assert f.text() == ("cross_curves.kn_m = 0.02 m: KN at 0° must be zero: upright, the line of buoyancy passes "
                        f"through K; {KN_LOOK} Δ 234.52 t at 0°")
    for x in (0.01, -0.01):  # 1 cm rounding (audit.KN_ZERO_TOLERANCE_M)
        a[1, 0] = x
        assert found(with_kn(a), *KN_CHECKS) == []
    a[1, 0] = -0.011
    assert [f.check for f in found(with_kn(a), *KN_CHECKS)] == ["kn-zero"]


def test_negative_kn_in_full():
    a = kn()
    a[1, 3] = -0.05
    (f,) = found(with_kn(a), *KN_CHECKS)
    assert (f.severity, f.check, f.path) == (ERROR, "kn-negative", ("cross_curves", "kn_m", 1, 3))
    assert f.text() == (
        "cross_curves.kn_m = -0.05 m: KN is negative: heeled to starboard, the centre of buoyancy moves to starboard "
        f"and up, so KN = y_B·cosφ + z_B·sinφ ≥ 0; {KN_LOOK} Δ 234.52 t at 30°")
    a[1, 3] = -0.01  # rounding of a zero
    assert [f.check for f in found(with_kn(a), "kn-negative", "kn-zero", "kn-envelope")] == []


def test_kn_beyond_the_buoyant_envelope_in_full():
    """√((B/2)² + (2·D)²) = √(3.25² + 6²) = 6.824 m (audit.KN_ENVELOPE_DEPTHS, common practice)."""
    bound = math.hypot(B / 2, 2 * D)
    assert bound == pytest.approx(6.8236, abs=1e-4)
    a = kn()
    a[2, 4] = 7.0
    (f,) = found(with_kn(a), *KN_CHECKS)
    assert (f.severity, f.check, f.path) == (ERROR, "kn-envelope", ("cross_curves", "kn_m", 2, 4))
    assert f.text() == (
        "cross_curves.kn_m = 7 m: longer than the distance from K to any buoyant point (√((B/2)² + (2·D)²) = 6.824 m): "
        f"a decimal point slipped?; {KN_LOOK} Δ 322.465 t at 40°")
    a[2, 4] = bound  # on the envelope: accepted as impossible-free (it stands out of the curve instead)
    assert [f.check for f in found(with_kn(a), "kn-envelope")] == []


def test_every_impossible_kn_is_reported_and_no_smoothness_finding_repeats_them():
    a = kn()
    a[0, 0], a[1, 3], a[2, 4] = 0.5, -0.5, 9.0
    got = found(with_kn(a), *KN_CHECKS)
    assert [(f.check, f.path[2:]) for f in got] == [("kn-zero", (0, 0)), ("kn-negative", (1, 3)), ("kn-envelope", (2, 4))]


# --------------------------------------------------------------------------- KN against KMt at small heel


def test_kn_against_kmt_a_doubt_in_full():
    """KN(10°) at Δ 234.52 t × 0.85: KMt at that Δ (the 1.6 m row) 3.0005 m, KMt·sin 10° = 0.521 m; the
    table's 0.448 m is 14 % below it (more than the 10 % allowed up to 10°: wall-sided formula,
    standards.md §6, audit.KN_SMALL_ANGLE)."""
    a = kn()
    a[1, 1] *= 0.85
    (f,) = found(with_kn(a), *KN_CHECKS)
    assert (f.severity, f.check, f.path) == (WARNING, "kn-kmt", ("cross_curves", "kn_m", 1, 1))
    assert f.text() == (
        "cross_curves.kn_m = 0.4479 m: at small heel KN ≈ KMt·sinφ = 0.521 m (KMt 3.001 m from the hydrostatic table): "
        f"14% apart (deck edge immersing or bilge emerging before this angle?); {KN_LOOK} Δ 234.52 t at 10°")


def test_kn_against_kmt_an_error_in_full():
    a = kn()
    a[1, 1] *= 0.6
    (f,) = found(with_kn(a), "kn-kmt")
    assert f.severity == ERROR
    assert f.text() == ("cross_curves.kn_m = 0.3162 m: at small heel KN ≈ KMt·sinφ = 0.521 m (KMt 3.001 m from the "
                        f"hydrostatic table): 39% apart; {KN_LOOK} Δ 234.52 t at 10°")


@pytest.mark.parametrize("factor, expect", [(0.92, []), (1.08, []), (0.88, [WARNING]), (0.72, [WARNING]), (0.68, [ERROR]),
                                            (1.35, [ERROR])])
def test_kn_against_kmt_edges_at_10_degrees(factor, expect):
    """10 % doubt, 30 % error up to 10° (audit.py).  The box's own KN(10°) is 1.0042 × KMt·sin 10° at
    Δ 234.52 t (wall-sided: 1 + BMt·tan²φ/(2·KMt))."""
    a = kn()
    a[1, 1] *= factor
    assert [f.severity for f in found(with_kn(a), "kn-kmt")] == expect


def test_only_the_first_kn_row_against_kmt_is_reported():
    a = kn()
    a[1, 1] *= 0.85
    a[2, 1] *= 0.85
    assert [f.path[2:] for f in found(with_kn(a), "kn-kmt")] == [(1, 1)]


@pytest.mark.parametrize("row", [0, 3])
def test_kn_rows_at_the_ends_of_the_hydrostatic_table_are_judged(row):
    """KN rows at Δ 146.575 t and 381.095 t: the first and last rows of the hydrostatic table."""
    a = kn()
    a[row, 1] *= 0.85
    assert [f.path[2:] for f in found(with_kn(a), "kn-kmt")] == [(row, 1)]


def test_a_kn_row_beyond_the_hydrostatic_table_is_not_judged_against_kmt():
    """Hydrostatics from 1.2 m only (Δ ≥ 175.89 t): the KN row at 146.575 t has no KMt to compare with."""
    v = with_hydro(**{k: col(k)[1:] for k in ("draft_m", "displacement_t", "lcb_m", "lcf_m", "kmt_m", "tpc_t_cm",
                                               "mctc_tm_cm", "vcb_m", "kml_m")})
    a = kn()
    a[0, 1] *= 0.85
    assert found(with_kn(a, v), "kn-kmt") == []
    a[1, 1] *= 0.85
    assert [f.path[2:] for f in found(with_kn(a, v), "kn-kmt")] == [(1, 1)]


def box_5_degree_vessel():
    """The FV-22 box with KN every 5° (same closed forms)."""
    text = box_profile_text(name="FV-22 box, 5° steps", length_m=L, breadth_m=B, depth_m=D,
                            drafts_m=[1.0, 1.2, 1.4, 1.6, 1.8, 2.0, 2.2, 2.4, 2.6], kn_drafts_m=[1.0, 1.6, 2.2, 2.6],
                            heel_step_deg=5.0, lightship=(150.0, 10.6, 2.4), tanks=FV22_TANKS)
    return parse_profile(text, "fv22-5.toml")


def test_up_to_5_degrees_kn_must_agree_with_kmt_within_5_percent():
    """At 5° the allowance is 5 %, at 10° it is 10 % (audit.KN_SMALL_ANGLE): × 0.93 is a doubt at 5°,
    not at 10°."""
    v = box_5_degree_vessel()
    assert found(v, *KN_CHECKS) == []
    a = np.array(v.cross_curves.kn_m)
    b = a.copy()
    b[1, 1] *= 0.93
    (f,) = found(with_kn(b, v), *KN_CHECKS)
    assert (f.check, f.severity, f.path[2:]) == ("kn-kmt", WARNING, (1, 1)) and "at 5°" in f.look
    b = a.copy()
    b[1, 2] *= 0.93
    assert found(with_kn(b, v), "kn-kmt") == []
    b[1, 1] *= 0.96
    assert found(with_kn(b, v), "kn-kmt") == []


# --------------------------------------------------------------------------- KN outliers


def test_an_outlier_in_the_middle_of_the_table_in_full():
    """KN(40°) at Δ 322.465 t × 1.3 (1.422 → 1.849 m): 28 % off the line through its neighbours along
    heel and along displacement alike (the smaller of the two is judged): a doubt (20 %)."""
    a = kn()
    a[2, 4] *= 1.3
    (f,) = found(with_kn(a), *KN_CHECKS)
    assert (f.severity, f.check, f.path) == (WARNING, "kn-outlier", ("cross_curves", "kn_m", 2, 4))
    assert f.text() == (
        "cross_curves.kn_m = 1.849 m: stands out of a smooth curve: 28% away from the line through its neighbours "
        f"along heel and displacement (a shifted decimal point or a transposed digit?); {KN_LOOK} Δ 322.465 t at 40°")


def test_an_outlier_in_the_first_row_is_judged_along_heel_only():
    a = kn()
    a[0, 4] *= 1.3
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.path[2:] == (0, 4) and "36% away from the line through its neighbours along heel (" in f.why


def test_an_outlier_in_the_last_column_is_judged_along_displacement_only():
    a = kn()
    a[2, 9] *= 1.5
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.path[2:] == (2, 9) and "50% away from the line through its neighbours along displacement (" in f.why
    assert f.severity == WARNING


def test_an_outlier_over_50_percent_is_an_error():
    a = kn()
    a[2, 4] *= 1.6
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.severity == ERROR and f.path[2:] == (2, 4)


def test_the_value_that_departs_most_in_metres_is_named():
    """A slipped value bends the lines through its neighbours too; the slipped one is named."""
    a = kn()
    a[1, 5] *= 1.6
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.path[2:] == (1, 5)


# --------------------------------------------------------------------------- more shapes


def test_mctc_beyond_the_waterplane_is_also_judged_against_kml():
    got = {f.check for f in found(with_hydro(mctc_tm_cm=col("mctc_tm_cm") * 10), "hydro-mctc", "hydro-mctc-kml")}
    assert got == {"hydro-mctc", "hydro-mctc-kml"}


def test_kml_half_a_metre_above_kb_is_an_mctc_contradiction_not_a_kml_below_kb():
    """KML 1.2 m at 1.4 m (VCB 0.7 m): BML 0.5 m, so the table's MCTC is ~57 × Δ·BML/(100·LBP)."""
    k = col("kml_m")
    k[2] = 1.2
    (f,) = found(with_hydro(kml_m=k), "hydro-mctc", "hydro-mctc-kml")
    assert (f.check, f.key, f.path[-1]) == ("hydro-mctc-kml", "hydrostatics.mctc_tm_cm", 2) and "BML = KML − KB = 0.5 m" in f.why


def test_a_shallow_row_of_under_a_tonne_is_judged_against_kml():
    """A row at 5 mm (Δ 0.733 t, KML = T/2 + L²/(12·T) = 8067 m, MCTC 2.687, checks.md §1.1) with KML
    typed 806.7 (decimal slip): the ratio is 10, an error."""
    h = vessel().hydrostatics
    first = {"draft_m": 0.005, "displacement_t": 146.575 * 0.005, "vcb_m": 0.0025, "kml_m": 806.7,
             "kmt_m": 0.0025 + B * B / (12 * 0.005)}
    cols = {k: np.concatenate([[first.get(k, getattr(h, k)[0])], np.asarray(getattr(h, k))])
            for k in ("draft_m", "displacement_t", "lcb_m", "lcf_m", "kmt_m", "tpc_t_cm", "mctc_tm_cm", "vcb_m", "kml_m")}
    (f,) = found(with_hydro(**cols), "hydro-mctc-kml")
    assert f.severity == ERROR and f.path[-1] == 0
    cols["kml_m"][0] = 0.0025 + L * L / (12 * 0.005)
    assert found(with_hydro(**cols), "hydro-mctc-kml") == []


def relabelled(heel_from, heel_to, values=None):
    """The box KN table with one heel column relabelled (and its values replaced when given)."""
    v = vessel()
    heel = np.array(v.cross_curves.heel_deg)
    a = kn()
    j = int(np.flatnonzero(heel == heel_from)[0])
    heel[j] = heel_to
    if values is not None:
        a[:, j] = values
    k = dataclasses.replace(v.cross_curves, heel_deg=frozen_array(heel), kn_m=frozen_array(a))
    return dataclasses.replace(v, cross_curves=k), j


def kmt_at_kn_rows():
    """KMt = T/2 + B²/(12·T) at the KN table's drafts 1.0, 1.6, 2.2, 2.6 m (checks.md §1.1)."""
    t = np.array([1.0, 1.6, 2.2, 2.6])
    return t / 2 + B * B / (12 * t)


def test_a_negative_kn_at_one_degree_is_caught():
    v, j = relabelled(10.0, 1.0, kmt_at_kn_rows() * math.sin(math.radians(1.0)))
    a = np.array(v.cross_curves.kn_m)
    assert found(v, "kn-negative", "kn-kmt") == []
    a[1, j] = -0.05
    (f,) = found(with_kn(a, v), "kn-negative")
    assert f.path[2:] == (1, j) and "at 1°" in f.look


def test_kn_against_kmt_is_judged_from_just_above_upright():
    """A 1° column holding the 10° values: 10 × KMt·sin 1°, an error."""
    v, j = relabelled(10.0, 1.0)
    (f,) = found(v, "kn-kmt")
    assert f.severity == ERROR and f.path[2:] == (0, j)


def test_kn_against_kmt_stops_at_10_degrees():
    """An 11° column (holding the 20° values, 88 % above KMt·sin 11°) is beyond the small-heel check."""
    v, _ = relabelled(20.0, 11.0)
    assert found(v, "kn-kmt") == []


def test_between_5_and_10_degrees_the_allowance_is_10_percent():
    """A 6° column at 0.93 × KMt·sin 6°: inside the 10 % allowed above 5°."""
    vals = kmt_at_kn_rows() * math.sin(math.radians(6.0))
    vals[1] *= 0.93
    v, _ = relabelled(10.0, 6.0, vals)
    assert found(v, "kn-kmt") == []


def test_an_outlier_is_sought_after_a_kn_kmt_finding():
    a = kn()
    a[1, 1] *= 0.85
    a[2, 5] *= 1.6
    assert {f.check for f in found(with_kn(a), *KN_CHECKS)} == {"kn-kmt", "kn-outlier"}


@pytest.mark.parametrize("row", [0, 3])
def test_an_outlier_at_10_degrees_in_an_end_row_is_judged_along_heel(row):
    a = kn()
    a[row, 1] *= 1.5
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.path[2:] == (row, 1) and "along heel (" in f.why


def test_an_outlier_at_80_degrees_in_the_first_row_is_judged_along_heel():
    a = kn()
    a[0, 8] *= 1.4
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.path[2:] == (0, 8) and "42% away from the line through its neighbours along heel (" in f.why


def test_near_upright_the_outlier_is_judged_against_5_percent_of_the_envelope():
    """KN(5°) in the heaviest row of the 5° table: the line through 0° and 10° is 0.224 m, under 5 % of
    the 6.824 m envelope (0.341 m), which is the scale judged against: 0.06 m off is 18 %, no doubt."""
    v = box_5_degree_vessel()
    a = np.array(v.cross_curves.kn_m)
    line = a[3, 2] / 2
    a[3, 1] = line + 0.06
    assert found(with_kn(a, v), "kn-outlier") == []
    a[3, 1] = line + 0.075  # 22 %
    (f,) = found(with_kn(a, v), "kn-outlier")
    assert f.path[2:] == (3, 1)


def test_of_two_outliers_the_one_further_off_in_metres_is_named():
    """KN(40°) at 234.52 t × 1.3 departs 0.599 m (33 %), KN(70°) at 381.095 t × 0.6 departs 0.578 m
    (39 %): the first is named, though the second is further off as a fraction."""
    a = kn()
    a[1, 4] *= 1.3
    a[3, 7] *= 0.6
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.path[2:] == (1, 4) and "33% away" in f.why
    a = kn()
    a[2, 4] *= 1.3
    a[1, 6] *= 1.3
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.path[2:] == (1, 6)


def test_a_value_slipped_down_is_named_before_a_larger_value_slipped_up_less():
    """KN(50°) at 234.52 t halved (0.97 m off) and KN(70°) at 322.465 t × 1.25 (0.41 m off): the
    halved one is named: it departs most in metres, though the other is the larger number."""
    a = kn()
    a[1, 5] *= 0.5
    a[2, 7] *= 1.25
    (f,) = found(with_kn(a), "kn-outlier")
    assert f.path[2:] == (1, 5)
