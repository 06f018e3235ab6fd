"""The audit's bounds hit to the last bit: a value ON a bound raises nothing, the next
floating-point number beyond it does (the bounds are "more than", never "at least").

Base: the 22 m box "trawler" of tests/box_profile_text.py (checks.md §1.1 closed forms).  Each
bound is written as audit.py states it (its reason there) and evaluated in the same order of
operations, then the value tried is searched among the floating-point neighbours of the bound so
that the rule's own arithmetic lands exactly on it.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from box_profile_text import fv22_text
from deckload.core.audit import WARNING, audit
from deckload.core.model import frozen_array
from deckload.io.profiles import parse_profile

L, B, RHO = 22.0, 6.5, 1.025


def vessel():
    return parse_profile(fv22_text(), "fv22.toml")


def col(name):
    return np.array(getattr(vessel().hydrostatics, name), dtype=float)


def with_hydro(**cols):
    v = vessel()
    return dataclasses.replace(v, hydrostatics=dataclasses.replace(
        v.hydrostatics, **{k: frozen_array(np.asarray(a, dtype=float)) for k, a in cols.items()}))


def found(v, check):
    return [f for f in audit(v) if f.check == check]


def on_edge(f, x0, target):
    """The float x near x0 (within 200 steps) for which f(x) == target exactly."""
    for direction in (np.inf, -np.inf):
        x = float(x0)
        for _ in range(200):
            if f(x) == target:
                return x
            x = float(np.nextafter(x, direction))
    raise AssertionError(f"no float near {x0} gives {target}")


def test_a_displacement_step_exactly_5_percent_off_tpc():
    """Drafts 1.0 and 1.25 m, TPC 1.5 t/cm: 100·TPC over 0.25 m = 37.5 t.  A step of 39.375 t misses
    by 1.875 t = 5 % exactly (not more: accepted, above the 0.5 % floor of 1.2 t); 39.376 t by more."""
    v = vessel()
    h = v.hydrostatics

    def two_rows(d0, d1):
        cols = {k: np.asarray(getattr(h, k))[:2] for k in ("lcb_m", "lcf_m", "kmt_m", "mctc_tm_cm", "vcb_m", "kml_m")}
        return dataclasses.replace(v, hydrostatics=dataclasses.replace(h, draft_m=frozen_array(np.array([1.0, 1.25])),
                                   displacement_t=frozen_array(np.array([d0, d1])), tpc_t_cm=frozen_array(np.array([1.5, 1.5])),
                                   **{k: frozen_array(a) for k, a in cols.items()}))

    assert found(two_rows(200.0, 239.375), "hydro-tpc") == []
    assert [f.severity for f in found(two_rows(200.0, 239.376), "hydro-tpc")] == [WARNING]
    # the 0.5 % floor: a miss of 2.0 t at Δ 400 t is exactly 0.5 % (and 5.3 % of the step): accepted
    assert found(two_rows(360.5, 400.0), "hydro-tpc") == []
    assert [f.severity for f in found(two_rows(360.5, 400.001), "hydro-tpc")] == [WARNING]


def kmt_bound(i, bm_divisor, allowance):
    """(KB + A·B²/(d·∇))·(1 ± 3 %) at row i, A = 100·TPC/ρ, ∇ = Δ/ρ (audit.py, Popoviciu / single hull)."""
    area = 100.0 * float(col("tpc_t_cm")[i]) / RHO
    vol = float(col("displacement_t")[i]) / RHO
    return (float(col("vcb_m")[i]) + area * B * B / bm_divisor / vol) * allowance


def test_kmt_exactly_on_its_upper_bounds():
    for divisor, severity in ((4.0, "error"), (12.0, "warning")):
        edge = kmt_bound(0, divisor, 1 + 0.03)
        k = col("kmt_m")
        k[0] = edge
        got = [f.severity for f in found(with_hydro(kmt_m=k), "hydro-kmt")]
        assert got == ([] if divisor == 12.0 else ["warning"])  # on the any-waterplane edge: still above the single-hull one
        k[0] = float(np.nextafter(edge, np.inf))
        assert [f.severity for f in found(with_hydro(kmt_m=k), "hydro-kmt")] == [severity]


def test_kmt_exactly_on_its_lower_bound():
    """KB + A³/(12·Lwl²·∇), Lwl = 1.2·LBP, less 3 %."""
    area = 100.0 * float(col("tpc_t_cm")[0]) / RHO
    vol = float(col("displacement_t")[0]) / RHO
    lwl = 1.2 * L
    edge = (float(col("vcb_m")[0]) + area ** 3 / (12.0 * lwl * lwl) / vol) * (1 - 0.03)
    k = col("kmt_m")
    k[0] = edge
    assert found(with_hydro(kmt_m=k), "hydro-kmt") == []
    k[0] = float(np.nextafter(edge, -np.inf))
    assert [f.severity for f in found(with_hydro(kmt_m=k), "hydro-kmt")] == ["error"]


def test_mctc_exactly_on_its_shape_bounds():
    """c = 12·MCTC/(TPC·LBP) on 1.3 (doubt above) and on 3·1.2²·1.03 (error above): not beyond either."""
    tpc = float(col("tpc_t_cm")[0])

    def c(m):
        return 12.0 * m / (tpc * L)

    for target, on, beyond in ((1.3, [], "warning"), (3.0 * 1.2 ** 2 * (1 + 0.03), ["warning"], "error")):
        m = on_edge(c, target * tpc * L / 12.0, target)
        a = col("mctc_tm_cm")
        a[0] = m
        assert [f.severity for f in found(with_hydro(mctc_tm_cm=a), "hydro-mctc")] == on
        while c(m) == target:  # the next MCTC whose c is beyond the bound
            m = float(np.nextafter(m, np.inf))
        a[0] = m
        assert [f.severity for f in found(with_hydro(mctc_tm_cm=a), "hydro-mctc")] == [beyond]

