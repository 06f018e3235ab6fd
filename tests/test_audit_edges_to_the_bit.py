"""More of the audit's bounds hit to the last bit (as tests/test_audit_edges.py): a value ON a bound
raises nothing, the next floating-point number beyond it does — the bounds are "more than", never
"at least".  Each bound is written as audit.py states it (its reason there), evaluated in the same
order of operations, and the value tried is searched among the floating-point neighbours of the
bound's real solution so that the rule's own arithmetic lands exactly on it.

Where a bound cannot be met to the bit on the usual vessel, the case says why and poses one
that can: a difference of two floats is exact (Sterbenz) and so a multiple of the larger one's
last place, which must then divide the bound.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from deckload.core.audit import CENTRE_ROUNDING_M, ENVELOPE_X_FRACTION, ERROR, VOLUME_ROUNDING_REL, WARNING, audit
from deckload.core.model import frozen_array
from fv22_audit import found, vessel, with_hydro
from test_audit_tanks_curves import with_cal
from test_reference_free_surface_rules import vessel as parallel_vessel

L, B = 22.0, 6.5  # the 22 m box of tests/box_profile_text.py


def root(g, a, b):
    """Bisection of g's sign change in [a, b] (real solution, to the last bit)."""
    for _ in range(200):
        m = 0.5 * (a + b)
        if (g(a) > 0) == (g(m) > 0):
            a = m
        else:
            b = m
    return a


def on_edge(hit, x0, steps=3000):
    """The float near x0 (within ``steps`` of it) for which ``hit`` holds."""
    for direction in (np.inf, -np.inf):
        x = float(x0)
        for _ in range(steps):
            if hit(x):
                return x
            x = float(np.nextafter(x, direction))
    raise AssertionError(f"no float near {x0} lands on the bound")


# --------------------------------------------------------------------------- the added layer's x and y


def layer(ca, cb):
    """FO1P's top layer (0.8–1.0 m, V 6.4 → 8 m³, capacity 8 m³): its centre and allowance as
    audit.tank_centres works them (its docstring): c = (V_k·c_k − V_{k−1}·c_{k−1})/ΔV,
    tol = (V_{k−1} + V_k)·e/ΔV + (|c_{k−1}| + |c_k|)·ev/ΔV, e = 0.005 m, ev = 0.05 % of 8 m³."""
    cal = vessel().tank("FO1P").calibration
    va, vb = float(cal.volume_m3[4]), float(cal.volume_m3[5])
    dv = float(cal.volume_m3[5] - cal.volume_m3[4])
    e, ev = CENTRE_ROUNDING_M, VOLUME_ROUNDING_REL * 8.0
    return (vb * cb - va * ca) / dv, (va + vb) * e / dv + (abs(ca) + abs(cb)) * ev / dv


def lcg_findings(ca, cb):
    return [f.severity for f in found(with_cal("FO1P", lcg_m=[8.0] * 4 + [ca, cb]), "tank-centre")]


def test_the_added_layer_exactly_on_the_forward_envelope():
    """Forward bound (1 + 0.2)·LBP + tol (overall length rarely beyond 1.2 × LBP: audit.py)."""
    def hit(cb):
        c, tol = layer(8.0, cb)
        return c == (1 + ENVELOPE_X_FRACTION) * L + tol
    cb = on_edge(hit, root(lambda x: np.subtract(*layer(8.0, x)) - (1 + ENVELOPE_X_FRACTION) * L, 11.0, 12.5))
    assert cb == pytest.approx(11.6988, abs=1e-4)
    assert lcg_findings(8.0, cb) == []
    assert lcg_findings(8.0, float(np.nextafter(cb, np.inf))) == [ERROR]


def test_the_added_layer_exactly_on_the_aft_envelope():
    """Aft bound −0.2·LBP − tol.  With row 4 at 8.0 m no float lands on it; with row 4 printed
    8.001 m (its own layer then centred at 8.004 m, well inside) one does."""
    def hit(cb):
        c, tol = layer(8.001, cb)
        return c == -ENVELOPE_X_FRACTION * L - tol
    cb = on_edge(hit, root(lambda x: sum(layer(8.001, x)) + ENVELOPE_X_FRACTION * L, 3.0, 7.0))
    assert cb == pytest.approx(5.5050, abs=1e-4)
    assert lcg_findings(8.001, cb) == []
    assert lcg_findings(8.001, float(np.nextafter(cb, -np.inf))) == [ERROR]


def test_the_added_layer_exactly_on_the_side():
    """|y| ≤ B/2 + tol: the layer just inside the port side."""
    def hit(cb):
        c, tol = layer(-2.0, cb)
        return abs(c) == B / 2 + tol
    cb = on_edge(hit, root(lambda x: abs(layer(-2.0, x)[0]) - B / 2 - layer(-2.0, x)[1], -2.5, -2.1))
    assert cb == pytest.approx(-2.2611, abs=1e-4)

    def findings(c):
        return [f.severity for f in found(with_cal("FO1P", tcg_m=[-2.0] * 5 + [c]), "tank-centre")]
    assert findings(cb) == []
    assert findings(float(np.nextafter(cb, -np.inf))) == [ERROR]


# --------------------------------------------------------------------------- hydrostatics


def test_vcb_falling_by_exactly_half_a_centimetre():
    """VCB may fall by 0.005 m between rows (rounding, audit.py VCB_FALL_TOLERANCE_M), not more.
    The fall is a difference of two floats, exact and a multiple of the larger's last place; the
    float 0.005 needs places down to 2⁻⁶⁰, so only VCBs below 2⁻⁷ m = 7.8 mm can fall by it to the
    bit: rows typed 0.010 and 0.005 m (0.005 − 0.010 is −0.005 exactly)."""
    vcb = np.array(vessel().hydrostatics.vcb_m, dtype=float)
    vcb[0], vcb[1] = 0.010, 0.005
    assert vcb[1] - vcb[0] == -0.005

    def falls(v):
        return [f for f in found(with_hydro(vcb_m=v), "hydro-rise") if f.key == "hydrostatics.vcb_m"]
    assert falls(vcb) == []
    vcb[1] = float(np.nextafter(0.005, -np.inf))
    (f,) = falls(vcb)
    assert (f.severity, f.path) == (ERROR, ("hydrostatics", "vcb_m", 1))


@pytest.mark.parametrize("gap, below, beyond", [(1.0, [], [WARNING]), (5.0, [WARNING], [ERROR])])
def test_lcb_exactly_1_and_5_percent_of_lbp_from_the_integrated_lcf(gap, below, beyond):
    """LCB against ∫LCF dΔ/Δ: a warning beyond 1 % of LBP (UR L5's LCB tolerance), an error beyond
    5 % (audit.py).  On the 22 m box 0.01·22 needs places no LCB near 11 m has; the parallel-sided
    vessel of tests/test_reference_free_surface_rules.py (LBP 100 m, LCB = LCF = 50 m at Δ 1600,
    2000, 2400 t: the integral gives 50 m exactly) has 0.01·100 = 1.0 and 0.05·100 = 5.0.  Its last
    row's LCB typed 50 + gap is on the bound; the next float above is beyond it."""
    v = parallel_vessel([])
    h = v.hydrostatics
    assert list(h.lcb_m) == list(h.lcf_m) == [50.0, 50.0, 50.0] and v.particulars.lbp_m == 100.0

    def lcb_lcf(last):
        lcb = np.array(h.lcb_m, dtype=float)
        lcb[-1] = last
        w = dataclasses.replace(v, hydrostatics=dataclasses.replace(h, lcb_m=frozen_array(lcb)))
        return [f.severity for f in audit(w) if f.check == "hydro-lcb-lcf"]
    assert lcb_lcf(50.0 + gap) == below
    assert lcb_lcf(float(np.nextafter(50.0 + gap, np.inf))) == beyond
