"""The audit's check of the centres of the liquid added between calibration rows, at its rounding
allowances: each allowance term decides a case of its own.

Rule (audit.py, ``tank_centres``, derived there): between rows k−1 and k the added volume
ΔV = V_k − V_{k−1} has its centre at c_slab = (V_k·c_k − V_{k−1}·c_{k−1})/ΔV, and one tank-bottom
height z_b, common to all rows, must put every layer between its two levels and every row's own
centre between the bottom and its surface:

    c_slab − s_k − tol_k ≤ z_b ≤ c_slab − s_{k−1} + tol_k,      c_k − s_k − e ≤ z_b ≤ c_k + e,

with e = 0.005 m (half a centimetre: centres printed to the centimetre) and the layer's allowance
tol_k = (V_{k−1} + V_k)·e/ΔV + (|c_{k−1}| + |c_k|)·ev/ΔV, ev = 0.05 % of the capacity (volumes
printed to 3–4 figures) — the rounding as the formula amplifies it.

Base: tank FO1S of the 22 m box of tests/box_profile_text.py (tests/test_audit_tanks_curves.py): a
box 4 × 2 × 1 m on the keel, rows every 0.2 m, V_k = 1.6·k m³, VCG c_k = s_k/2 = 0.1·k m,
capacity 8 m³ (ev = 0.004 m³).  Worked for it:

* rows 1–4 as printed allow z_b in [−0.105, +0.105] m: row 1 (c₁ = 0.1 m at s₁ = 0.2 m) gives
  0.1 − 0.2 − e ≤ z_b ≤ 0.1 + e, and every layer's own bounds (midpoint ± (0.1 + tol_k), tol_k ≥
  0.00525 m) are wider;
* the last row typed c₅ = 0.5 + δ: its layer (0.8–1.0 m, V 6.4 → 8 m³) is centred at
  c_slab = (8·(0.5 + δ) − 6.4·0.4)/1.6 = 0.9 + 5δ with tol₅ = 14.4·0.005/1.6 + (0.9 + δ)·0.004/1.6
  = 0.045 + 0.0025·(0.9 + δ), so it asks −0.1 + 5δ − tol₅ ≤ z_b ≤ 0.1 + 5δ + tol₅ (its own centre's
  bounds, −0.505 + δ … 0.505 + δ, are wider here).

So the table is accepted when −0.1 + 5δ − tol₅ ≤ 0.105 and 0.1 + 5δ + tol₅ ≥ −0.105:

| δ (m) | the layer's bounds on z_b (m) | against [−0.105, 0.105] |
|---|---|---|
| +0.0505 | lower 0.2525 − 0.1 − 0.04737625 = 0.10512375 | above 0.105 by 0.12 mm: refused |
| −0.05045 | upper 0.1 − 0.25225 + 0.047123875 = −0.105126125 | below −0.105 by 0.13 mm: refused |
| +0.0495 | lower 0.10012625 | inside (5 mm to spare): accepted |
| −0.0494 | upper −0.0998735 | inside: accepted |
| +0.04 | lower 0.2 − 0.1 − 0.04735 = 0.05265 | inside (were tol₅ added, not taken off, 0.14735: outside): accepted |
| −0.04 | upper −0.2 + 0.1 + 0.04715 = −0.05285 | inside (were tol₅ taken off, not added, −0.14715: outside): accepted |

The refused ones are refused at the last row (sounding 1.0 m).  The first two rows of the table
hold by tenths of a millimetre: they are where row 1's own centre, with its half-centimetre
allowance (not the layer's, 0.00525 m), bounds the bottom.
"""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.audit import ERROR
from fv22_audit import found, vessel
from test_audit_tanks_curves import with_cal


def last_row_vcg(delta):
    vcg = np.array(vessel().tank("FO1S").calibration.vcg_m, dtype=float)
    assert list(vcg) == pytest.approx([0.0, 0.1, 0.2, 0.3, 0.4, 0.5], abs=1e-12)
    vcg[5] = 0.5 + delta
    return vcg


@pytest.mark.parametrize("delta", [0.0505, -0.05045])
def test_a_last_layer_just_beyond_the_allowances_is_refused(delta):
    (f,) = found(with_cal("FO1S", vcg_m=last_row_vcg(delta)), "tank-centre")
    assert (f.severity, f.key, f.path[-1]) == (ERROR, "tank[FO1S].calibration.vcg_m", 5)
    assert "the liquid added from 0.8 to 1 m would have its centre at" in f.why


@pytest.mark.parametrize("delta", [0.0495, -0.0494, 0.04, -0.04])
def test_a_last_layer_within_the_allowances_is_accepted(delta):
    assert found(with_cal("FO1S", vcg_m=last_row_vcg(delta)), "tank-centre") == []
