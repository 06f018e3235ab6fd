"""The roll factors of the weather criterion where the other weather tests leave them at 1.0.

IS Code 2008 Part A 2.3 (standards.md §2.3–2.4; the structure θ1 = 109·k·X1·X2·√(r·s) is [C],
46 CFR 28.575(c)).  test_reference_weather.py checks θ1 on ships whose X1, X2 and k are all
1.0 (or k = 0.7 sharp bilge), which cannot tell a product from a quotient; here every factor
differs from 1.  Every factor-table row is from memory [M] (standards.md §2.4), and so are the
−0.043·Lwl/100 term of C and the validity limits (standards.md §2.3 [M]): the marks are
repeated beside the checks.  Hand values are derived in the docstrings.
"""

from __future__ import annotations

import math

import pytest

from deckload.core import weather as wx

HAND_ROLL = """
B 24 m, d 8 m, Lwl 100 m, Cb 0.55, KG 8.5 m, GM 1.0 m, bilge keels Ak 36 m²:
  B/d = 3.0 → X1 = 0.90 [M];  Cb 0.55 → X2 = 0.89 [M];
  Ak·100/(L·B) = 3600/2400 = 1.5 → k = 0.95 [M];
  r = 0.73 + 0.6·(8.5 − 8)/8 = 0.7675 (46 CFR 28.575 [C]);
  C = 0.373 + 0.023·3.0 − 0.043·1.00 = 0.399 (last term [M]);  T = 2·0.399·24/√1.0 = 19.152 s;
  s between 18 s (0.038) and 20 s (0.035): 0.038 − (1.152/2)·0.003 = 0.036272 [M];
  θ1 = 109·0.95·0.90·0.89·√(0.7675·0.036272) = 82.94535·√0.02783876 = 13.83909°.
"""


def test_roll_angle_with_every_factor_below_one():
    """θ1 = 109·k·X1·X2·√(r·s) with k 0.95, X1 0.90, X2 0.89, r 0.7675, s 0.04625 (row 13's r and s,
    standards.md §8): 109·0.95·0.90·0.89 = 82.94535; √(0.7675·0.04625) = 0.1884061;
    θ1 = 15.62707°.  Tolerance 1e-5°: float rounding only (the hand value has 7 figures)."""
    assert wx.roll_angle_deg(0.95, 0.90, 0.89, 0.7675, 0.04625) == pytest.approx(15.627074, abs=1e-5)
    # X2 alone below one: 109·0.89·0.1884061 = 18.27728°
    assert wx.roll_angle_deg(1.0, 1.0, 0.89, 0.7675, 0.04625) == pytest.approx(18.277280, abs=1e-5)


def test_roll_through_its_factors_by_hand():
    """The whole of roll() on the ship of HAND_ROLL (every factor from a table, none equal to 1).

    Tolerances: factors 1e-12 (exact table rows or linear interpolation of exact rows);
    T 1e-9 s and θ1 1e-5° (float rounding of the hand arithmetic)."""
    roll = wx.roll(wx.RollInputs(24.0, 8.0, 100.0, 0.55, 8.5, 1.0, bilge_keel_area_m2=36.0))
    assert roll.x1 == pytest.approx(0.90, abs=1e-12)
    assert roll.x2 == pytest.approx(0.89, abs=1e-12)
    assert roll.k == pytest.approx(0.95, abs=1e-12)
    assert roll.r == pytest.approx(0.7675, abs=1e-12)
    assert roll.period_s == pytest.approx(19.152, abs=1e-9)
    assert roll.s == pytest.approx(0.036272, abs=1e-12)
    assert roll.theta1_deg == pytest.approx(13.839091, abs=1e-5)
    assert roll.outside_validity == ()  # B/d 3.0 < 3.5, OG/d 0.0625, T 19.152 < 20 s [M]


def test_small_bilge_keels_take_the_k_table_not_one():
    """A small ship with small bilge keels: Ak 0.9 m², L 18 m, B 5 m → Ak·100/(L·B) = 90/90 = 1.0
    → k = 0.98 (k table [M]).  Only a ship with NO keels (Ak = 0) takes k = 1.0 (46 CFR 28.575
    [C]); any positive area goes to the table.  Ak 0.5 m² on L 10, B 5 → 1.0 as well → 0.98."""
    assert wx.k_factor(0.9, 18.0, 5.0) == pytest.approx(0.98, abs=1e-12)
    assert wx.k_factor(0.5, 10.0, 5.0) == pytest.approx(0.98, abs=1e-12)


def test_validity_note_at_the_ends_of_the_range():
    """standards.md §2.3 [M]: the tables were derived for B/d < 3.5, OG/d = KG/d − 1 between −0.3
    and 0.5 (read with the ends inside: common practice for a stated range) and T < 20 s.
    B 35, d 10 → B/d = 3.5 exactly: outside (the limit is strict).  KG 12, d 8 → OG/d = 0.5
    exactly: inside, no note on OG/d."""
    at_b_d = wx.roll(wx.RollInputs(35.0, 10.0, 100.0, 0.70, 10.0, 1.0))
    assert "B/d 3.50 ≥ 3.5" in at_b_d.outside_validity
    at_og_d = wx.roll(wx.RollInputs(20.0, 8.0, 100.0, 0.70, 12.0, 1.0))
    assert not any(n.startswith("OG/d") for n in at_og_d.outside_validity)
    above = wx.roll(wx.RollInputs(20.0, 8.0, 100.0, 0.70, 12.5, 1.0))  # OG/d 0.5625
    assert "OG/d +0.56 outside −0.3…0.5" in above.outside_validity


def test_validity_note_at_a_roll_period_of_exactly_twenty_seconds():
    """T < 20 s (standards.md §2.3 [M]), so T = 20 s is outside.  B 10, d 4.6, Lwl 100:
    C = 0.373 + 0.023·10/4.6 − 0.043·1.00 = 0.373 + 0.050 − 0.043 = 0.380 (last term [M]);
    GM 0.1444 → √GM = 0.38, T = 2·0.380·10/0.38 = 20 s exactly (46 CFR 28.575 metric [C])."""
    r = wx.roll(wx.RollInputs(10.0, 4.6, 100.0, 0.70, 4.6, 0.1444))
    assert r.period_s == pytest.approx(20.0, abs=1e-12)
    assert "T 20.0 s ≥ 20 s" in r.outside_validity
    just_below = wx.roll(wx.RollInputs(10.0, 4.6, 100.0, 0.70, 4.6, 0.1445))  # T 19.993 s
    assert not any(n.startswith("T ") for n in just_below.outside_validity)
