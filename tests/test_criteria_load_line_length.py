"""The IS Code's length L is the Load Line length (``[vessel] length_ll_m``), not LBP.

IS 2008 takes L as the Load Line Convention defines it (from memory); the ICLL's L (1966 Annex I
reg. 3, from memory: 96 % of the total length on a waterline at 85 % of the least moulded depth, or
stem to rudder stock on that waterline if greater) is usually longer than LBP.  Its thresholds here:
the fishing vessels' wind pressure by height for 24 m ≤ L ≤ 45 m (Part B 2.1.4, standards.md §2.5
[M]), the 24 m the Code applies from (standards.md §3.6 [C]) and the 70 m from which a fishing
vessel's GM0 may be reduced (Part B 2.1, standards.md §3.2 [M]).  Boxes as in test_criteria_sets
(windage A = L·(D − T), centre (D − T)/2 above the waterline).
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.model import CriteriaSettings
from deckload.io.profiles import parse_profile
from test_criteria_sets import box
from test_profiles import BASE, edit, line_of, only
from vessel_factories import RHO_SW

G = 9.81  # m/s², the value of the weather criterion (standards.md §2.2, from memory)


FISHING = CriteriaSettings(ship_type="fishing", sharp_bilged=True)


def lw1(p_pa, length, breadth, depth, draft):
    """lw1 = P·A·Z/(1000·g·Δ), A = L·(D − T), Z = (D − T)/2 + T/2, Δ = ρ·L·B·T (standards.md §2.2)."""
    return p_pa * length * (depth - draft) * ((depth - draft) / 2.0 + draft / 2.0) / (
        1000.0 * G * RHO_SW * length * breadth * draft)


def test_fishing_wind_band_is_read_against_the_load_line_length():
    """LBP 45.00 m, h = 1.5 m: within 24–45 m P = 316 + 0.5·(386 − 316) = 351 Pa (Part B 2.1.4 [M]);
    with her Load Line length 46 m she is outside the band and takes 504 Pa (Part A 2.3,
    standards.md §2.2), lw1 504/351 times larger."""
    taken = box(45.0, 10.0, 6.0, 3.0, 4.0, FISHING)
    assert taken.weather.wind_pressure_pa == pytest.approx(351.0, abs=1e-9)
    ll = box(45.0, 10.0, 6.0, 3.0, 4.0, FISHING, length_ll_m=46.0)
    assert ll.weather.wind_pressure_pa == 504.0
    assert ll.weather.lw1_m == pytest.approx(lw1(504.0, 45.0, 10.0, 6.0, 3.0), rel=1e-9)
    # inside the band either way: the Load Line length changes nothing
    inside = box(40.0, 10.0, 6.0, 3.0, 4.0, FISHING, length_ll_m=41.0)
    assert inside.weather.wind_pressure_pa == pytest.approx(351.0, abs=1e-9)


def test_fishing_band_taken_on_lbp_is_cautioned_where_the_load_line_length_could_pass_45_m():
    """Without length_ll_m, a fishing vessel whose LBP is at most 45 m but whose Load Line length
    could be above it (up to 1.15·LBP, the reader's bound, common practice) is told L was taken as
    LBP and what 504 Pa would make of lw1 (504/351 = 1.44)."""
    r = box(45.0, 10.0, 6.0, 3.0, 4.0, FISHING)
    said = [w.message for w in r.warnings if "length_ll_m" in w.message]
    assert len(said) == 1
    assert "L taken as LBP 45 m" in said[0] and "P is 504 Pa" in said[0] and "1.44 times" in said[0]
    # given, or too short to pass 45 m at 1.15·LBP (38 m · 1.15 = 43.7 m), or P set by the profile: no caution
    for r in (box(45.0, 10.0, 6.0, 3.0, 4.0, FISHING, length_ll_m=44.0),
              box(38.0, 10.0, 6.0, 3.0, 4.0, FISHING),
              box(45.0, 10.0, 6.0, 3.0, 4.0, dataclasses.replace(FISHING, wind_pressure_pa=400.0)),
              box(45.0, 10.0, 6.0, 3.0, 4.0, CriteriaSettings(sharp_bilged=True))):
        assert not [w for w in r.warnings if "length_ll_m" in w.message]


def test_the_24_m_note_follows_the_load_line_length():
    """IS 2008 applies to ships of 24 m and over (standards.md §3.6 [C]), L the Load Line length."""
    r = box(23.0, 6.0, 3.0, 1.5, 2.0, CriteriaSettings(sharp_bilged=True))
    assert any("under 24 m" in n.item and "LBP 23 m" in n.reason for n in r.not_assessed)
    r = box(23.0, 6.0, 3.0, 1.5, 2.0, CriteriaSettings(sharp_bilged=True), length_ll_m=24.5)
    assert not any("under 24 m" in n.item for n in r.not_assessed)


def test_length_ll_m_is_read_and_bounded_against_lbp():
    """0.95–1.15 × LBP (common practice): the base barge's LBP is 40 m, so 38–46 m."""
    text = edit(BASE, "lbp_m = 40.0\n", "lbp_m = 40.0\nlength_ll_m = 41.2\n")
    assert parse_profile(text).particulars.length_ll_m == 41.2
    assert parse_profile(BASE).particulars.length_ll_m is None
    for bad in ("37.9", "46.1", "-41.0", '"41"'):
        text = edit(BASE, "lbp_m = 40.0\n", f"lbp_m = 40.0\nlength_ll_m = {bad}\n")
        p = only(text)
        assert p.key == "vessel.length_ll_m" and p.line == line_of(text, "length_ll_m")
    p = only(edit(BASE, "lbp_m = 40.0\n", "lbp_m = 40.0\nlength_ll_m = 131.2\n"))  # typed in feet
    assert "38–46 m" in p.rule and "Load Line" in p.rule


def test_fishing_reduced_gm_at_70_m_is_read_against_the_load_line_length():
    """Part B 2.1 [M]: GM0 below 0.35 m with L ≥ 70 m; LBP 68 m with a Load Line length of 70.5 m
    qualifies, LBP 68 m alone does not and the refusal names length_ll_m."""
    base = edit(BASE, "lbp_m = 40.0\n", "lbp_m = 68.0\n")
    crit = '\n[criteria]\nship_type = "fishing"\nmin_gm_m = 0.25\n'
    p = only(base + crit)
    assert p.key == "criteria.min_gm_m" and "length_ll_m" in p.rule and "LBP 68 m" in p.rule
    ok = parse_profile(edit(base, "lbp_m = 68.0\n", "lbp_m = 68.0\nlength_ll_m = 70.5\n") + crit)
    assert ok.criteria.min_gm_m == 0.25 and ok.particulars.length_ll_m == 70.5
