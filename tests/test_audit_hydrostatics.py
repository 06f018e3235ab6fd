"""The audit of the hydrostatic table: each typing error caught with the column, the row and the
value named and the rule broken, at the edges of its tolerance; a consistent table raises nothing.

Base: the 22 m box "trawler" of tests/box_profile_text.py, L 22, B 6.5, D 3.0 m, drafts 1.0–2.6 m
in 0.2 m steps, every column from the closed forms of checks.md §1.1 (derived there):
Δ = ρ·L·B·T = 146.575·T t, LCB = LCF = 11.0 m, VCB = T/2, KMt = T/2 + B²/(12·T),
TPC = ρ·L·B/100 = 1.46575 t/cm, MCTC = ρ·B·L²/1200 = 2.6872 t·m/cm, KML = T/2 + L²/(12·T).
The box is the single hull with the largest BMt for its waterplane (BMt = B²/(12·T) exactly),
so it sits on the audit's single-hull bound and passes it only within the 3 % allowance.

Bounds and their reasons are audit.py's (written beside each constant there).
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.core.audit import ERROR, WARNING, audit
from fv22_audit import found, vessel, with_hydro

L, B, D, RHO = 22.0, 6.5, 3.0, 1.025
T = np.array([1.0, 1.2, 1.4, 1.6, 1.8, 2.0, 2.2, 2.4, 2.6])
TPC = RHO * L * B / 100  # 1.46575 t/cm: the box's waterplane 143 m² (checks.md §1.1)
LOOK = "compare with the booklet's hydrostatic particulars table, row at draft"



def col(name):
    return np.array(getattr(vessel().hydrostatics, name), dtype=float)




def test_the_box_table_raises_nothing():
    assert [f for f in audit(vessel()) if f.key.startswith("hydrostatics")] == []


def test_a_table_starting_at_the_keel_raises_nothing():
    """A row at draft 0 (Δ 0) is where many booklets start: it has no volume, so no BMt, block
    coefficient or MCTC/KML ratio is formed there (nothing divides by ∇ = 0); its KMt/KML are the
    booklet's limits (here the 1.0 m row's), its VCB 0 and its TPC/MCTC the keel's (the box's)."""
    v = vessel()
    h = v.hydrostatics
    cols = {k: np.concatenate([[first], np.asarray(getattr(h, k))]) for k, first in (
        ("draft_m", 0.0), ("displacement_t", 0.0), ("lcb_m", 11.0), ("lcf_m", 11.0), ("kmt_m", h.kmt_m[0]),
        ("tpc_t_cm", TPC), ("mctc_tm_cm", h.mctc_tm_cm[0]), ("vcb_m", 0.0), ("kml_m", h.kml_m[0]))}
    found_ = [f for f in audit(with_hydro(v, **cols)) if f.key.startswith("hydrostatics")]
    assert found_ == []


# --------------------------------------------------------------------------- LCB / LCF range


def test_an_lcf_in_the_end_fifth_is_an_error_in_full():
    lcf = np.full(9, 11.0)
    lcf[0], lcf[1] = 6.0, 3.0  # row 0 only a doubt, row 1 an error: the error is reported, once
    (f,) = found(with_hydro(lcf_m=lcf), "hydro-lcb-range")
    assert (f.severity, f.key, f.path) == (ERROR, "hydrostatics.lcf_m", ("hydrostatics", "lcf_m", 1))
    assert f.text() == (
        "hydrostatics.lcf_m = 3 m from AP: outside 0.2–0.8 × LBP from the AP (4.4 m–17.6 m): no hull's LCF lies "
        f"in the end fifths of its length; {LOOK} 1.2 m")


def test_an_lcb_and_an_lcf_both_out_are_both_reported():
    got = found(with_hydro(lcb_m=np.full(9, 20.0), lcf_m=np.full(9, 20.0)), "hydro-lcb-range")
    assert [(f.severity, f.key, f.path[-1]) for f in got] == [
        (ERROR, "hydrostatics.lcb_m", 0), (ERROR, "hydrostatics.lcf_m", 0)]
    assert got[0].why.endswith("no hull's LCB lies in the end fifths of its length (every row: a datum or sign slip?)")
    assert got[0].value == "20 m from AP"


def test_an_lcb_far_from_midships_is_a_doubt_in_full():
    got = found(with_hydro(lcb_m=np.full(9, 6.5), lcf_m=np.full(9, 6.5)), "hydro-lcb-range")
    assert [(f.severity, f.key) for f in got] == [(WARNING, "hydrostatics.lcb_m"), (WARNING, "hydrostatics.lcf_m")]
    assert got[0].path == ("hydrostatics", "lcb_m", 0)
    assert got[0].text() == ("hydrostatics.lcb_m = 6.5 m from AP: outside 0.3–0.7 × LBP from the AP: unusually far "
                             f"from midships; {LOOK} 1 m")


@pytest.mark.parametrize("x, expect", [
    (0.2 * L, WARNING), (0.8 * L, WARNING), (0.2 * L - 0.01, ERROR), (0.8 * L + 0.01, ERROR),
    (0.3 * L, None), (0.7 * L, None), (0.3 * L - 0.01, WARNING), (0.7 * L + 0.01, WARNING),
])
def test_the_lcb_range_edges(x, expect):
    """Error outside 0.2–0.8 × LBP, warning outside 0.3–0.7 × LBP (common practice, audit.py); the
    edges themselves are inside.  LCB and LCF move together (a consistent pair)."""
    got = found(with_hydro(lcb_m=np.full(9, x), lcf_m=np.full(9, x)), "hydro-lcb-range")
    assert [f.severity for f in got] == ([] if expect is None else [expect, expect])


# --------------------------------------------------------------------------- Δ against TPC


def test_a_displacement_step_against_tpc_in_full():
    """Δ at 1.8 m raised by 8 % of the step: 100·TPC·0.2 m = 29.315 t (trapezoidal rule, exact for
    the box's constant TPC) against a step of 31.66 t: 8 % apart, a doubt (5 %); 20 %: an error (15 %)."""
    d = col("displacement_t")
    d[4] = d[3] + 29.315 * 1.08
    (f,) = found(with_hydro(displacement_t=d), "hydro-tpc")
    assert (f.severity, f.key, f.path) == (WARNING, "hydrostatics.displacement_t", ("hydrostatics", "displacement_t", 4))
    assert f.text() == (
        "hydrostatics.displacement_t = 266.18 t: the step from 234.52 t (1.6 m) is 31.66 t but 100·TPC over the draft "
        f"gives 29.31 t (8% apart, more than 5%): the displacement or a TPC value is mistyped; {LOOK} 1.8 m")
    d[4] = d[3] + 29.315 * 1.2
    (f,) = found(with_hydro(displacement_t=d), "hydro-tpc")
    assert f.severity == ERROR and "(20% apart, more than 15%)" in f.why and f.value == "269.698 t"


def test_a_tpc_digit_slip_in_one_row():
    """TPC at 2.2 m typed 1.6575 for 1.46575: the steps either side are judged against the mean TPC
    (50·(1.46575 + 1.6575)·0.2 = 31.23 t against 29.315 t: 6.1 %), the first one reported."""
    t = np.full(9, TPC)
    t[6] = 1.6575
    (f,) = found(with_hydro(tpc_t_cm=t), "hydro-tpc")
    assert (f.severity, f.path) == (WARNING, ("hydrostatics", "displacement_t", 6))
    assert "is 29.31 t but 100·TPC over the draft gives 31.23 t (6% apart" in f.why


def test_small_steps_near_the_keel_are_not_judged_on_the_fraction_alone():
    """A 1 cm step (1.00 → 1.01 m): 100·TPC·0.01 = 1.466 t; a step of 1.566 t is 6.8 % off but only
    0.1 t, 0.07 % of Δ: under the 0.5 % floor (values printed to 0.1 t), so no finding; 1.766 t
    (0.3 t, 0.2 % of Δ... still under) neither; a step of 3.0 t (1.5 t, 1 % of Δ) is an error."""
    v = vessel()
    drafts = T.copy()
    drafts[1] = 1.01
    d = col("displacement_t")
    for step, expect in ((1.566, []), (1.766, []), (3.0, [ERROR])):
        d[1] = d[0] + step
        got = found(with_hydro(v, draft_m=drafts, displacement_t=d), "hydro-tpc")
        assert [f.severity for f in got] == expect and all(f.path[-1] == 1 for f in got)


def test_a_miss_over_the_floor_but_under_5_percent_of_the_step_is_accepted():
    """Δ at 1.6 m raised 1.3 t: 4.4 % of the 29.315 t step (under 5 %) though over 0.5 % of Δ (1.17 t)."""
    d = col("displacement_t")
    d[3] += 1.3
    assert found(with_hydro(displacement_t=d), "hydro-tpc") == []


# --------------------------------------------------------------------------- block coefficient


def scaled(factor):
    """Δ and TPC scaled together (so Δ still agrees with TPC): CB = factor."""
    return with_hydro(displacement_t=col("displacement_t") * factor, tpc_t_cm=col("tpc_t_cm") * factor)


def test_a_block_coefficient_beyond_any_hull_in_full():
    (f,) = found(scaled(1.3), "hydro-cb")
    assert (f.severity, f.key, f.path) == (ERROR, "hydrostatics.displacement_t", ("hydrostatics", "displacement_t", 0))
    assert f.text() == ("hydrostatics.displacement_t = 190.547 t: block coefficient Δ/(ρ·LBP·B·T) = 1.3 at 1 m: no hull "
                        f"of this length, breadth and draft can hold that; {LOOK} 1 m")
    (f,) = found(scaled(0.05), "hydro-cb")
    assert f.severity == ERROR and "= 0.05 at 1 m" in f.why


def test_an_unusual_block_coefficient_is_a_doubt_in_full():
    (f,) = found(scaled(1.1), "hydro-cb")
    assert f.severity == WARNING
    assert f.text() == ("hydrostatics.displacement_t = 161.232 t: block coefficient Δ/(ρ·LBP·B·T) = 1.1 at 1 m: outside "
                        f"the usual 0.3–1; {LOOK} 1 m")
    (f,) = found(scaled(0.25), "hydro-cb")
    assert f.severity == WARNING and "= 0.25 at 1 m" in f.why


@pytest.mark.parametrize("factor, expect", [
    (1.0049, None), (1.006, WARNING), (1.2, WARNING), (1.21, ERROR), (0.3001, None), (0.29, WARNING),
    (0.1, WARNING), (0.09, ERROR)])
def test_the_block_coefficient_edges(factor, expect):
    """Warning outside 0.3–1.0 (0.5 % rounding above the box's 1.0), error outside 0.1–1.2 (derived /
    common practice, audit.CB_RANGE); the edges are inside (the factors 1.2 and 0.1 give CB on them
    to the last bit; 1.005 and 0.3 do not, so 1.0049 and 0.3001 stand for them)."""
    got = found(scaled(factor), "hydro-cb")
    assert [f.severity for f in got] == ([] if expect is None else [expect])


def test_only_rows_from_half_the_design_draft_up_are_judged():
    """Row 0 (1.0 m) with CB 1.3: judged when the design draft is 1.8 m or 2.0 m (half of it, 1.0 m,
    is included), not when it is 2.2 m (a shallow row of a fine hull may be fuller or finer)."""
    d = col("displacement_t")
    d[0] *= 1.3
    for design, expect in ((1.8, [ERROR]), (2.0, [ERROR]), (2.2, [])):
        v = vessel()
        v = dataclasses.replace(v, particulars=dataclasses.replace(v.particulars, design_draft_m=design))
        got = found(with_hydro(v, displacement_t=d), "hydro-cb")
        assert [f.severity for f in got] == expect and all(f.path[-1] == 0 for f in got)


# --------------------------------------------------------------------------- VCB


def test_a_falling_vcb_in_full():
    vcb = col("vcb_m")
    vcb[3] = 0.59
    (f,) = found(with_hydro(vcb_m=vcb), "hydro-rise")
    assert (f.severity, f.key, f.path) == (ERROR, "hydrostatics.vcb_m", ("hydrostatics", "vcb_m", 3))
    assert f.text() == ("hydrostatics.vcb_m = 0.59 m: falls from 0.7 m as the draft rises: every added layer lies "
                        f"above the old centre of buoyancy, so VCB can only rise; {LOOK} 1.6 m")


def test_vcb_may_fall_by_half_a_centimetre():
    """1.25 → 1.245 m (rounding of printed values: derived tolerance 0.005 m) passes; 1.25 → 1.24 does not."""
    vcb = np.array([0.5, 0.6, 0.7, 0.8, 1.25, 1.245, 1.3, 1.35, 1.4])
    assert found(with_hydro(vcb_m=vcb), "hydro-rise") == []
    vcb[5] = 1.24
    (f,) = found(with_hydro(vcb_m=vcb), "hydro-rise")
    assert f.path == ("hydrostatics", "vcb_m", 5)


def test_vcb_above_the_waterline_in_full():
    vcb = col("vcb_m")
    vcb[3:] = [1.65, 1.7, 1.8, 1.9, 2.0, 2.1]
    (f,) = found(with_hydro(vcb_m=vcb), "hydro-vcb")
    assert (f.severity, f.key, f.path) == (ERROR, "hydrostatics.vcb_m", ("hydrostatics", "vcb_m", 3))
    assert f.text() == ("hydrostatics.vcb_m = 1.65 m: the centre of buoyancy must lie between the keel and the "
                        f"waterline (0–1.6 m); {LOOK} 1.6 m")


@pytest.mark.parametrize("vcb0, expect", [(1.004, []), (1.006, [ERROR]), (0.0, [ERROR]), (-0.1, [ERROR]), (0.01, [])])
def test_vcb_between_keel_and_waterline_edges(vcb0, expect):
    """0 < VCB < T + 0.005 m (half a printed centimetre) at the 1.0 m row."""
    vcb = col("vcb_m")
    vcb[0] = vcb0
    got = found(with_hydro(vcb_m=vcb), "hydro-vcb")
    assert [f.severity for f in got] == expect and all(f.path == ("hydrostatics", "vcb_m", 0) for f in got)


# --------------------------------------------------------------------------- TPC / MCTC rising


@pytest.mark.parametrize("name, what, base", [("tpc_t_cm", "TPC", "1.4657"), ("mctc_tm_cm", "MCTC", "2.6872")])
def test_tpc_or_mctc_falling_is_a_doubt_in_full(name, what, base):
    a = col(name)
    a[5:] *= 0.98
    (f,) = found(with_hydro(**{name: a}), "hydro-rise")
    assert (f.severity, f.key, f.path) == (WARNING, f"hydrostatics.{name}", ("hydrostatics", name, 5))
    assert f.text() == (
        f"hydrostatics.{name} = {a[5]:.5g}: {what} falls from {base} as the draft rises (it rises on a flared hull; "
        f"tumblehome above the waterline can make it fall); {LOOK} 2 m")


def test_tpc_may_fall_by_one_percent():
    """A fall of exactly 1 % (rounding, audit.RISE_TOLERANCE_REL) passes; 1.1 % does not."""
    a = col("tpc_t_cm")
    a[5:] = a[4] * (1 - 0.01)
    assert found(with_hydro(tpc_t_cm=a), "hydro-rise") == []
    a[5:] = a[4] * 0.989
    assert len(found(with_hydro(tpc_t_cm=a), "hydro-rise")) == 1


# --------------------------------------------------------------------------- KMt


def test_kmt_above_any_waterplane_in_full():
    """KMt × 10 at 1.0 m: 40.21 m against KB + A·B²/(4∇) = 0.5 + 6.5²/4 = 11.06 m (Popoviciu, derived
    in audit.py), + 3 %."""
    (f,) = found(with_hydro(kmt_m=col("kmt_m") * 10), "hydro-kmt")
    assert (f.severity, f.key, f.path) == (ERROR, "hydrostatics.kmt_m", ("hydrostatics", "kmt_m", 0))
    assert f.text() == (
        "hydrostatics.kmt_m = 40.21 m: above what KB + BMt allows at 1 m (11.06 m): BMt = I_T/∇ ≤ A·B²/(4∇) for any "
        f"waterplane within the breadth, with A = 100·TPC/ρ = 143 m²; {LOOK} 1 m")


def test_kmt_above_a_single_hull_in_full():
    """KMt × 1.2 at 1.0 m: 4.825 m against KB + B²/(12·T) = 0.5 + 3.521 = 4.021 m (the box itself)."""
    (f,) = found(with_hydro(kmt_m=col("kmt_m") * 1.2), "hydro-kmt")
    assert f.severity == WARNING
    assert f.text() == (
        "hydrostatics.kmt_m = 4.825 m: above what KB + BMt allows at 1 m (4.021 m): BMt ≤ A·B²/(12∇) for a single hull "
        f"(a multihull may exceed it), with A = 100·TPC/ρ = 143 m²; {LOOK} 1 m")


def test_kmt_below_any_waterplane_in_full():
    """KMt × 0.5 at 1.0 m: 2.010 m against KB + A³/(12·Lwl²·∇) = 0.5 + B²/(12·1.44·T) = 2.945 m
    (Lwl ≤ 1.2·LBP; Hölder, derived in audit.py), − 3 %."""
    (f,) = found(with_hydro(kmt_m=col("kmt_m") * 0.5), "hydro-kmt")
    assert f.severity == ERROR
    assert f.text() == (
        "hydrostatics.kmt_m = 2.01 m: below what KB + BMt allows at 1 m (2.945 m): BMt = I_T/∇ ≥ A³/(12·Lwl²·∇) for any "
        f"waterplane, with A = 100·TPC/ρ = 143 m²; {LOOK} 1 m")


@pytest.mark.parametrize("factor, expect", [
    (1.029, None), (1.031, WARNING), (2.8, WARNING), (2.9, ERROR)])
def test_kmt_edges_above(factor, expect):
    """The box's KMt is the single-hull bound itself: × 1.029 passes (3 % allowance), × 1.031 does not.
    At 1.0 m: (0.5 + 10.5625)·1.03 = 11.394 m is the any-waterplane edge, 2.834 × the box's 4.021 m."""
    got = found(with_hydro(kmt_m=col("kmt_m") * factor), "hydro-kmt")
    assert [f.severity for f in got] == ([] if expect is None else [expect]) and all(f.path[-1] == 0 for f in got)


@pytest.mark.parametrize("kmt0, expect", [(2.945 * 0.971, None), (2.945 * 0.969, ERROR)])
def test_kmt_edge_below(kmt0, expect):
    """At 1.0 m the lower bound 0.5 + 6.5²/17.28 = 2.9451 m, less 3 %."""
    k = col("kmt_m")
    k[0] = kmt0
    got = found(with_hydro(kmt_m=k), "hydro-kmt")
    assert [f.severity for f in got] == ([] if expect is None else [expect])


def test_kmt_without_vcb_uses_keel_and_waterline_for_kb():
    """No VCB column: KB lies between 0 and T, so the upper bounds take KB = T (1.0 + 3.521 = 4.521 m
    at 1.0 m) and the lower takes KB = 0 (6.5²/17.28 = 2.445 m)."""
    (f,) = found(with_hydro(kmt_m=col("kmt_m") * 1.2, vcb_m=None), "hydro-kmt")
    assert f.severity == WARNING and "allows at 1 m (4.521 m)" in f.why
    assert found(with_hydro(kmt_m=col("kmt_m") * 1.1, vcb_m=None), "hydro-kmt") == []
    (f,) = found(with_hydro(kmt_m=col("kmt_m") * 0.5, vcb_m=None), "hydro-kmt")
    assert f.severity == ERROR and "below what KB + BMt allows at 1 m (2.445 m)" in f.why
    assert found(with_hydro(kmt_m=col("kmt_m") * 0.65, vcb_m=None), "hydro-kmt") == []


def test_only_the_first_bad_kmt_row_is_reported():
    k = col("kmt_m")
    k[4:] *= 1.2
    (f,) = found(with_hydro(kmt_m=k), "hydro-kmt")
    assert f.path == ("hydrostatics", "kmt_m", 4) and "allows at 1.8 m" in f.why


# --------------------------------------------------------------------------- LCB against LCF


def consistent_lcb_lcf():
    """LCF = 10 + 0.01·(Δ − Δ0) m (linear in Δ), and LCB from d(∇·LCB) = LCF·d∇ (derived in audit.py):
    Δ·LCB = Δ0·10 + ∫LCF dΔ = Δ0·10 + 10·(Δ − Δ0) + 0.005·(Δ − Δ0)², which the trapezoidal rule
    integrates exactly (LCF is linear)."""
    d = col("displacement_t")
    x = d - d[0]
    return 10.0 + 0.01 * x, (d[0] * 10.0 + 10.0 * x + 0.005 * x * x) / d


def test_a_consistent_lcb_and_lcf_raise_nothing():
    lcf, lcb = consistent_lcb_lcf()
    assert lcb[-1] == pytest.approx(10.7216, abs=1e-4) and lcf[-1] == pytest.approx(12.3452, abs=1e-4)
    assert found(with_hydro(lcf_m=lcf, lcb_m=lcb), "hydro-lcb-lcf", "hydro-lcb-range") == []


def test_an_lcb_off_the_integrated_lcf_in_full():
    """LCB at 2.2 m raised 0.3 m: 1.4 % of LBP from the integral (a doubt above 1 %: UR L5's LCB
    tolerance, standards.md §5.3 [M]); raised 1.2 m: 5.5 % (an error above 5 %: a datum slip)."""
    lcf, lcb = consistent_lcb_lcf()
    exact = lcb[6]
    lcb[6] += 0.3
    (f,) = found(with_hydro(lcf_m=lcf, lcb_m=lcb), "hydro-lcb-lcf")
    assert (f.severity, f.key, f.path) == (WARNING, "hydrostatics.lcb_m", ("hydrostatics", "lcb_m", 6))
    assert exact == pytest.approx(10.4797, abs=1e-4)  # (1465.75 + 1758.9 + 154.69)/322.465
    assert f.text() == (
        "hydrostatics.lcb_m = 10.78 m from AP: the LCF column integrated over the displacement gives LCB 10.48 m here, "
        f"0.3 m away (more than 1% of LBP): LCB and LCF contradict each other; {LOOK} 2.2 m")
    lcb[6] += 0.9
    (f,) = found(with_hydro(lcf_m=lcf, lcb_m=lcb), "hydro-lcb-lcf")
    assert f.severity == ERROR and "1.2 m away (more than 5% of LBP)" in f.why


def test_the_worst_lcb_row_is_the_first_of_equal_gaps():
    lcb = col("lcb_m")
    lcb[5:] = 10.5  # 0.5 m from the integrated 11.0 m in rows 5 to 8 alike
    (f,) = found(with_hydro(lcb_m=lcb), "hydro-lcb-lcf")
    assert f.severity == WARNING and f.path == ("hydrostatics", "lcb_m", 5)


@pytest.mark.parametrize("gap, expect", [(0.21, None), (0.23, WARNING), (1.09, WARNING), (1.11, ERROR)])
def test_the_lcb_lcf_edges(gap, expect):
    """1 % of 22 m = 0.22 m, 5 % = 1.1 m (audit.py: UR L5 / datum slip)."""
    lcb = col("lcb_m")
    lcb[8] = 11.0 + gap
    got = found(with_hydro(lcb_m=lcb), "hydro-lcb-lcf")
    assert [f.severity for f in got] == ([] if expect is None else [expect])


# --------------------------------------------------------------------------- more shapes of table


def test_a_tpc_rising_with_draft_and_its_exact_displacement_raise_nothing():
    """TPC = 1 + 0.5·T² t/cm (a strongly flared hull) and Δ = Δ(1 m) + 100·∫TPC dT =
    146.575 + 100·((T − 1) + (T³ − 1)/6) t (derived).  The trapezoidal rule over a 0.2 m row errs by
    100·h³·TPC''/12 = 0.067 t, far under 5 % of a step; the whole range 1.0–2.6 m in one trapezium
    would err by 7 % (a table must be judged row to row, not end to end)."""
    tpc = 1.0 + 0.5 * T ** 2
    disp = 146.575 + 100.0 * ((T - 1.0) + (T ** 3 - 1.0) / 6.0)
    assert found(with_hydro(tpc_t_cm=tpc, displacement_t=disp), "hydro-tpc") == []


def test_a_tpc_that_rises_then_falls_in_full():
    """TPC 1.40, 1.45, 1.50, 1.46 ...: the fall from 1.50 to 1.46 (2.7 %) is a doubt although every
    value stays above the first row's."""
    tpc = np.array([1.40, 1.45, 1.50, 1.46, 1.47, 1.48, 1.49, 1.50, 1.51])
    (f,) = found(with_hydro(tpc_t_cm=tpc), "hydro-rise")
    assert f.path == ("hydrostatics", "tpc_t_cm", 3)
    assert f.why.startswith("TPC falls from 1.5 as the draft rises") and f.value == "1.46"


def test_rows_below_half_the_design_draft_are_skipped_not_the_end_of_the_check():
    """Design draft 2.2 m: rows from 1.1 m up are judged, so a CB of 1.3 at 1.8 m is still found."""
    v = vessel()
    v = dataclasses.replace(v, particulars=dataclasses.replace(v.particulars, design_draft_m=2.2))
    d = col("displacement_t")
    d[4] *= 1.3
    (f,) = found(with_hydro(v, displacement_t=d), "hydro-cb")
    assert f.path == ("hydrostatics", "displacement_t", 4)


def test_every_check_of_the_table_runs_after_another_has_found_something():
    """One table with a block coefficient beyond any hull, a falling VCB and one above the waterline,
    a falling MCTC, a KMt beyond any waterplane and an LCB off the integrated LCF: each is reported."""
    d, tpc = col("displacement_t") * 1.3, col("tpc_t_cm") * 1.3
    vcb = col("vcb_m")
    vcb[3], vcb[8] = 0.59, 2.7
    mctc = col("mctc_tm_cm")
    mctc[6:] *= 0.97
    lcb = col("lcb_m")
    lcb[5:] = 9.5
    v = with_hydro(displacement_t=d, tpc_t_cm=tpc, vcb_m=vcb, mctc_tm_cm=mctc, kmt_m=col("kmt_m") * 10, lcb_m=lcb)
    got = {(f.check, f.key) for f in audit(v)}
    assert {("hydro-cb", "hydrostatics.displacement_t"), ("hydro-rise", "hydrostatics.vcb_m"),
            ("hydro-vcb", "hydrostatics.vcb_m"), ("hydro-rise", "hydrostatics.mctc_tm_cm"),
            ("hydro-kmt", "hydrostatics.kmt_m"), ("hydro-lcb-lcf", "hydrostatics.lcb_m")} <= got


def keel_row(draft, disp, kmt, vcb):
    """The box table with one row put in front of it (the other columns the 1.0 m row's)."""
    h = vessel().hydrostatics
    first = {"draft_m": draft, "displacement_t": disp, "kmt_m": kmt, "vcb_m": vcb, "kml_m": h.kml_m[0]}
    return {k: np.concatenate([[first.get(k, getattr(h, k)[0])], np.asarray(getattr(h, k))])
            for k in ("draft_m", "displacement_t", "lcb_m", "lcf_m", "kmt_m", "tpc_t_cm", "mctc_tm_cm", "vcb_m", "kml_m")}


def test_a_keel_row_does_not_stop_the_metacentre_check():
    cols = keel_row(0.0, 0.0, 4.0, 0.0)
    cols["kmt_m"][5] *= 1.2  # the 1.8 m row
    (f,) = found(with_hydro(**cols), "hydro-kmt")
    assert f.severity == WARNING and f.path == ("hydrostatics", "kmt_m", 5)


@pytest.mark.parametrize("draft, disp", [(0.02, 0.0), (0.0, 2.0)])
def test_a_row_with_no_draft_or_no_displacement_is_not_judged_against_the_waterplane(draft, disp):
    """Drafts read as extreme and turned moulded, or a keel appendage: Δ 0 above the keel or Δ > 0
    at draft 0.  Neither has a volume and a waterplane to form BMt from: no KMt finding, no crash."""
    assert found(with_hydro(**keel_row(draft, disp, 4.0, 0.01)), "hydro-kmt") == []


def test_a_shallow_row_of_under_a_tonne_is_judged():
    """A row at 5 mm: Δ = 146.575·0.005 = 0.733 t, KMt = T/2 + B²/(12·T) = 704.2 m (checks.md §1.1).
    Typed 7.042 (decimal point slipped twice) it is below KB + A³/(12·Lwl²·∇) = 489 m: an error."""
    cols = keel_row(0.005, 146.575 * 0.005, 7.042, 0.0025)
    (f,) = found(with_hydro(**cols), "hydro-kmt")
    assert f.severity == ERROR and f.path == ("hydrostatics", "kmt_m", 0) and "below what KB + BMt allows at 0.005 m" in f.why
    cols["kmt_m"][0] = 0.0025 + B * B / (12 * 0.005)
    assert found(with_hydro(**cols), "hydro-kmt") == []
