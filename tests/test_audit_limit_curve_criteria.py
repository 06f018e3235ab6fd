"""The plausibility audit doubts a limiting KG (or minimum GM) curve row that allows a KG her own
intact criteria do not allow on her KN tables (core/audit.py, ``limit_curve_against_kn``).

A limiting curve is the least of what the intact and damage criteria allow (IS 2008 A 2.1.7,
standards.md §6.3), so it can never allow more than IS 2008 A 2.2 alone.  An audit of a booklet
typed by hand found that a swapped pair of rows, a column shifted down one row or a transposed
digit raised the allowed KG by up to 0.47 m and passed ``check`` with nothing said.

The vessel is the parallel-sided one of tests/vessel_factories.py: KMt = 6 m at every displacement
and KN = KMt·sinφ, so GZ(φ) = GM·sinφ with GM = KMt − KG (no downflooding angle given: the areas end
at 40°).  Then (standards.md §1, IS 2008 A 2.2.1–2.2.4), derived:

    area 0–30°  = GM·(1 − cos30°) = 0.133975·GM ≥ 0.055 m·rad  ⇔  GM ≥ 0.41053 m
    area 0–40°  = GM·(1 − cos40°) = 0.233956·GM ≥ 0.090 m·rad  ⇔  GM ≥ 0.38469 m
    area 30–40° = GM·(cos30° − cos40°) = 0.099981·GM ≥ 0.030  ⇔  GM ≥ 0.30006 m
    GZ at 30° or more: its largest, GM·sin90° = GM ≥ 0.20 m;   GM0 ≥ 0.15 m

so the area 0–30° governs and the highest KG she may have is 6 − 0.41053 = 5.58947 m.  A row is
doubted when its KG, 5 cm lower (audit.LIMIT_CURVE_KG_MARGIN_M, standards.md §5.3), still fails.
"""

from __future__ import annotations

import dataclasses
import math

import pytest

from deckload.core.audit import LIMIT_CURVE_KG_MARGIN_M, WARNING, audit
from deckload.core.model import LimitCurve, MassItem, frozen_array
from vessel_factories import ParallelForm, parallel_sided_vessel

KMT = 6.0
GM_LEAST = 0.055 / (1.0 - math.cos(math.radians(30.0)))  # 0.41053 m: the area 0–30° governs (docstring)


def vessel_with(kind, values):
    form = ParallelForm(displacement_t=2000.0, draft_m=6.0, lcb_m=50.0, lcf_m=50.0, kmt_m=KMT,
                        tpc_t_cm=20.0, mctc_tm_cm=150.0, lbp_m=100.0)
    v = parallel_sided_vessel(form, lightship=MassItem("Lightship", 1500.0, 50.0, 4.0, 0.0))
    curve = LimitCurve(frozen_array([1600.0, 2000.0, 2400.0]), frozen_array(values), kind)
    return dataclasses.replace(v, limit_curve=curve)


def doubts(v):
    return [f for f in audit(v) if f.check == "curve-above-criteria"]


def test_a_curve_within_her_intact_criteria_is_not_doubted():
    """KG 5.56 m (GM 0.44 m, 3 cm inside the least GM) and a row just 1 cm beyond it (KG 5.60 m): 5 cm
    lower the second still meets every criterion (GM 0.45 m), so neither is doubted; the rounding of a
    booklet's curve and its own method are given that room."""
    assert doubts(vessel_with("max_kg_m", [5.56, 5.56, 5.60])) == []


def test_a_row_allowing_a_kg_her_criteria_refuse_is_doubted_with_the_highest_kg_they_allow():
    """The middle row allows KG 5.75 m (GM 0.25 m): 5 cm lower, GM 0.30 m gives area 0–30° =
    0.133975 × 0.30 = 0.04019 m·rad against 0.055.  The warning names the row (path and value), the
    failing criterion with its value, and the highest KG the set allows there, 5.58947 m (docstring),
    found by bisection to well under a millimetre."""
    found = doubts(vessel_with("max_kg_m", [5.56, 5.75, 5.56]))
    assert [(f.severity, f.key, f.path, f.value) for f in found] == [
        (WARNING, "limit_curve.max_kg_m", ("limit_curve", "max_kg_m", 1), "5.75 m at 2000 t")]
    why = found[0].why
    area = (1.0 - math.cos(math.radians(30.0))) * (KMT - 5.75 + LIMIT_CURVE_KG_MARGIN_M)
    assert f"Area under GZ, 0° to 30° {area:.4g} against 0.055" in why
    assert f"allow KG {KMT - GM_LEAST:.3f} m at most there" in why


def test_a_slip_toward_a_higher_kg_is_doubted_and_one_toward_a_lower_kg_is_not():
    """With KMt 6 m at every row, a row is doubted exactly when KMt − (KG − 5 cm) < 0.41053 m, i.e. KG
    above 5.63947 m (docstring).  A curve 5.58, 5.40, 5.20 m typed one row down (5.58, 5.58, 5.40: each
    still within it) is not doubted, as her tables allow it; 5.08 typed 5.80 (digits transposed) is,
    and the slip the other way, 5.80 typed 5.08, errs on the safe side and is not."""
    assert doubts(vessel_with("max_kg_m", [5.58, 5.58, 5.40])) == []
    assert [f.path[-1] for f in doubts(vessel_with("max_kg_m", [5.20, 5.80, 5.08]))] == [1]
    assert doubts(vessel_with("max_kg_m", [5.20, 5.08, 5.08])) == []


@pytest.mark.parametrize("gm_row, doubted", [(0.30, True), (0.45, False), (GM_LEAST - LIMIT_CURVE_KG_MARGIN_M + 0.001, False)])
def test_a_minimum_gm_curve_is_judged_the_same_way(gm_row, doubted):
    """As a minimum-GM curve the same rows read GM = KMt − KG: a minimum GM of 0.30 m (+5 cm: 0.35 m)
    fails the area 0–30°, 0.45 m meets it, and a minimum 1 mm above 0.41053 − 0.05 m meets it at the
    margin (docstring)."""
    found = doubts(vessel_with("min_gm_m", [0.45, gm_row, 0.45]))
    assert bool(found) is doubted
    if doubted:
        assert found[0].key == "limit_curve.min_gm_m" and "GM 0.3 m (KG 5.7 m with KMt 6 m)" in found[0].why


def test_kn_rows_a_hair_apart_or_absurd_raise_nothing():
    """KN rows a hair apart (a table no booklet prints) or a KN of 1e300 (refused by the other checks):
    the spline through the rows, and the curve's area and peak, overflowed (tracebacks under a
    fuzzer's -W error).  Nothing is raised, and such a row is not judged."""
    import warnings

    import numpy as np

    from deckload.core.audit import kn_unreached_rows

    v = vessel_with("max_kg_m", [5.20, 5.80, 5.08])
    kn = np.array(v.cross_curves.kn_m)
    kn[1, 5:] = 1e300
    absurd = dataclasses.replace(v, cross_curves=dataclasses.replace(v.cross_curves, kn_m=frozen_array(kn)))
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        assert kn_unreached_rows([1e-310, 2e-310, 3e-310, 100.0], 50.0) == frozenset()
        assert [f.path for f in doubts(absurd)] == []


# ----------------------------------------------------------------------------- unattainable curves
#
# Her lightship is 1500 t at KG 4.0 m; every weight added lies above the keel, so at Δ no condition
# has KG below 1500 × 4.0 / Δ (derived in audit.limit_curve_attainable): 3.75 m at 1600 t, 3.0 m at
# 2000 t, 2.5 m at 2400 t, and GM at most KMt − that: 2.25, 3.0 and 3.5 m.  The booklet-conventions
# audit's slips: a GM curve typed as KG (0.45–0.55 m against a lightship KG of 5.30 m) and a KG curve
# typed as GM both passed `check` with nothing said, and every condition then failed.

def unattainable(v):
    return [f for f in audit(v) if f.check == "curve-unattainable"]


def test_a_gm_curve_typed_as_kg_is_an_error_naming_the_slip():
    (f,) = unattainable(vessel_with("max_kg_m", [0.45, 0.50, 0.55]))
    assert f.severity == "error" and f.key == "limit_curve.max_kg_m" and f.path == ("limit_curve", "max_kg_m", 0)
    assert "allows KG at most 0.45 m at 1600 t, yet no condition of hers at 1600 t can have a KG below 3.75 m" in f.why
    assert "(3 of its 3 rows)" in f.why
    assert "A minimum-GM curve typed under max_kg_m? (read as GM it would allow KG up to KMt 6 m − 0.45 m = 5.55 m)" in f.why


def test_a_kg_curve_typed_as_gm_is_an_error_naming_the_slip():
    (f,) = unattainable(vessel_with("min_gm_m", [5.9, 5.6, 6.2]))
    assert f.severity == "error" and f.path == ("limit_curve", "min_gm_m", 0)
    assert "asks GM at least 5.9 m at 1600 t, yet her GM there is at most KMt 6 m − 3.75 m = 2.25 m" in f.why
    assert "A maximum-KG curve typed under min_gm_m?" in f.why and "(3 of its 3 rows)" in f.why
    (g,) = unattainable(vessel_with("min_gm_m", [0.41, 0.41, 6.2]))
    assert g.path == ("limit_curve", "min_gm_m", 2) and "(at or above KMt: G below the keel)" in g.why


@pytest.mark.parametrize("kind, values", [("max_kg_m", [3.745, 5.56, 5.56]), ("min_gm_m", [2.255, 0.41, 0.41]),
                                          ("max_kg_m", [5.56, 5.56, 5.60]), ("min_gm_m", [0.41, 0.41, 0.41])])
def test_an_attainable_curve_or_one_within_its_printing_is_not_called_impossible(kind, values):
    """3.745 m is 5 mm below the least KG 3.75 m at 1600 t, 2.255 m 5 mm above the greatest GM 2.25 m:
    within a curve printed to 0.01 m (audit.LIMIT_CURVE_PRINT_M)."""
    assert unattainable(vessel_with(kind, values)) == []
