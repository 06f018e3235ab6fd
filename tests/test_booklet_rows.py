"""The booklet comparison row by row: each quantity's label, unit, tolerance in words, the
deviation allowed and the verdict (deckload/core/booklet.py).

Tolerances: standards.md §5.3, IACS UR L5 Table 1 / MSC.1/Circ.1229 (the table is quoted
there): displacement 2 %; volume or deadweight 2 %; LCG 1 % / 50 cm max; VCG 1 % / 5 cm max;
TCG 0.5 % of B / 5 cm max; free-surface moment 2 %; FS correction 2 %; KMt and GMt 1 % / 5 cm
max; draughts 1 % / 5 cm max; GZ values 5 % / 5 cm max; downflooding angle 2°; equilibrium
angles 1°; areas under the righting-arm curve 5 % / 0.0012 m·rad.  Where two values are given
the % of the booklet's value applies but may not exceed the linear value (standards.md §5.2,
Circ.1461 5.1).  Trim: aft + forward draught tolerances (derived in booklet.py: trim is their
difference).

The result compared is the hand-built one of test_result_record.py (a display fixture with a
distinct value in every field); every allowed deviation below is worked by hand beside it.
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.booklet import compare
from test_result_record import MET, _result

B_M = 12.0  # breadth for the TCG row: 0.5 % of 12 m = 0.06 m, capped at 0.05 m


def rows_by_key(result, expected):
    return {r.key: r for r in compare(result, expected, B_M)}


EXPECTED = {
    # key: booklet value            result value   allowed (worked)                      passes
    "displacement_t": 2140.0,      # 2150          2 % · 2140 = 42.8                       |10| ≤ 42.8 yes
    "deadweight_t": 1000.0,        # 970           2 % · 1000 = 20                         |−30| no
    "lcg_m": 35.0,                 # 35.5          min(1 % · 35 = 0.35, 0.50) = 0.35        |0.5| no
    "tcg_m": 0.0,                  # 0.03          min(0.5 % · B 12 = 0.06, 0.05) = 0.05   |0.03| yes
    "kg_m": 4.88,                  # 4.9           min(0.0488, 0.05) = 0.0488               |0.02| yes
    "fsm_tm": 88.0,                # 86            2 % · 88 = 1.76                         |−2| no
    "fsc_m": 0.04,                 # 0.04          0.0008                                  0 yes
    "kg_fluid_m": 4.9,             # 4.94          0.049                                   |0.04| yes
    "km_m": 5.9,                   # 5.8           min(0.059, 0.05) = 0.05                 |−0.1| no
    "gm_solid_m": 0.9,             # 0.9           0.009                                   0 yes
    "gm_m": 0.85,                  # 0.86          0.0085                                  |0.01| no
    "draft_aft_m": 3.80,           # 3.78          0.038                                   |−0.02| yes
    "draft_mid_m": 3.6,            # 3.605         0.036                                   |0.005| yes
    "draft_fwd_m": 3.40,           # 3.43          0.034                                   |0.03| yes
    "trim_m": 0.40,                # 0.35          0.038 + 0.034 = 0.072 (booklet drafts)  |−0.05| yes
    "list_deg": 0.0,               # 0.6           1°                                      yes
    "max_gz_m": 0.6,               # 0.61          min(5 % · 0.6 = 0.03, 0.05) = 0.03      |0.01| yes
    "area_0_30_mrad": 0.08,        # 0.082         min(0.004, 0.0012) = 0.0012             |0.002| no
    "area_0_40_mrad": 0.13,        # 0.131         0.0012                                  |0.001| yes
    "area_30_40_mrad": 0.05,       # 0.049         0.0012                                  |−0.001| yes
    "downflooding_angle_deg": 50.0,  # 52          2°                                      exactly 2 yes
    # GZ on the starboard curve (0, 10, 20°: −0.009, 0.14, 0.31 m), linear between points
    "gz": [(10.0, 0.15),           # 0.14          min(0.0075, 0.05) = 0.0075              |−0.01| no
           (15.0, 0.22),           # 0.225         0.011                                   |0.005| yes
           (85.0, 0.1)],           # beyond the tables' end 80°: no value, fails
}

TABLE = [
    # key, label, unit, booklet, deckload, allowed, tolerance in words, passed
    ("displacement_t", "displacement", "t", 2140.0, 2150.0, 42.8, "2 % (displacement)", True),
    ("deadweight_t", "deadweight", "t", 1000.0, 970.0, 20.0, "2 % (volume or deadweight)", False),
    ("lcg_m", "LCG from AP", "m", 35.0, 35.5, 0.35, "1 % / 0.5 m max (LCG)", False),
    ("tcg_m", "TCG", "m", 0.0, 0.03, 0.05, "0.5 % of B / 0.05 m max (TCG)", True),
    ("kg_m", "KG solid", "m", 4.88, 4.9, 0.0488, "1 % / 0.05 m max (VCG)", True),
    ("fsm_tm", "free-surface moment", "t·m", 88.0, 86.0, 1.76, "2 % (free surface moment)", False),
    ("fsc_m", "FS correction", "m", 0.04, 0.04, 0.0008, "2 % (FS correction)", True),
    ("kg_fluid_m", "KG fluid", "m", 4.9, 4.94, 0.049, "1 % / 0.05 m max (VCG)", True),
    ("km_m", "KMt", "m", 5.9, 5.8, 0.05, "1 % / 0.05 m max (KMt)", False),
    ("gm_solid_m", "GM solid", "m", 0.9, 0.9, 0.009, "1 % / 0.05 m max (GMt)", True),
    ("gm_m", "GM fluid", "m", 0.85, 0.86, 0.0085, "1 % / 0.05 m max (GMt)", False),
    ("draft_aft_m", "draft aft", "m", 3.8, 3.78, 0.038, "1 % / 0.05 m max (draughts)", True),
    ("draft_mid_m", "draft midships", "m", 3.6, 3.605, 0.036, "1 % / 0.05 m max (draughts)", True),
    ("draft_fwd_m", "draft forward", "m", 3.4, 3.43, 0.034, "1 % / 0.05 m max (draughts)", True),
    ("trim_m", "trim (+ by stern)", "m", 0.4, 0.35, 0.072, "aft + forward draught tolerances (derived)", True),
    ("list_deg", "list (+ starboard)", "°", 0.0, 0.6, 1.0, "1 ° (equilibrium angles)", True),
    ("max_gz_m", "maximum GZ", "m", 0.6, 0.61, 0.03, "5 % / 0.05 m max (GZ values)", True),
    ("area_0_30_mrad", "area 0–30°", "m·rad", 0.08, 0.082, 0.0012, "5 % / 0.0012 m·rad max (areas under GZ)", False),
    ("area_0_40_mrad", "area 0–40° (or θf)", "m·rad", 0.13, 0.131, 0.0012,
     "5 % / 0.0012 m·rad max (areas under GZ)", True),
    ("area_30_40_mrad", "area 30–40° (or θf)", "m·rad", 0.05, 0.049, 0.0012,
     "5 % / 0.0012 m·rad max (areas under GZ)", True),
    ("downflooding_angle_deg", "downflooding angle", "°", 50.0, 52.0, 2.0, "2 ° (downflooding angle)", True),
    ("gz_m@10", "GZ at 10°", "m", 0.15, 0.14, 0.0075, "5 % / 0.05 m max (GZ values)", False),
    ("gz_m@15", "GZ at 15°", "m", 0.22, 0.225, 0.011, "5 % / 0.05 m max (GZ values)", True),
    ("gz_m@85", "GZ at 85°", "m", 0.1, None, 0.005, "5 % / 0.05 m max (GZ values)", False),
]


def test_every_row_with_its_tolerance_in_words_and_verdict():
    rows = compare(_result((MET,)), EXPECTED, B_M)
    assert [r.key for r in rows] == [t[0] for t in TABLE]  # the printed order
    for r, (key, label, unit, booklet, deckload, allowed, words, passed) in zip(rows, TABLE):
        assert (r.label, r.unit, r.tolerance, r.passed) == (label, unit, words, passed), key
        assert r.booklet == booklet, key
        assert r.deckload == (None if deckload is None else pytest.approx(deckload, abs=1e-12)), key
        assert r.allowed == pytest.approx(allowed, rel=1e-12), key  # worked by hand above
    notes = {r.key: r.note for r in rows if r.note}
    assert notes == {"gz_m@85": "beyond the KN table's last angle 80°"}


def test_only_the_rows_given_are_compared():
    rows = compare(_result((MET,)), {"gm_m": 0.86}, B_M)
    assert [(r.key, r.passed) for r in rows] == [("gm_m", True)]


def test_trim_tolerance_from_deckload_drafts_when_the_booklet_gives_none():
    """No booklet drafts: the trim row takes deckload's aft 3.78 and forward 3.43 m,
    1 % of each (under 5 cm): 0.0378 + 0.0343 = 0.0721 m."""
    (row,) = compare(_result((MET,)), {"trim_m": 0.42}, B_M)
    assert row.allowed == pytest.approx(0.0721, rel=1e-12)
    assert row.passed  # |0.35 − 0.42| = 0.07 ≤ 0.0721
    (row,) = compare(_result((MET,)), {"trim_m": 0.43}, B_M)
    assert not row.passed  # 0.08 > 0.0721


def test_no_downflooding_value_is_a_fail_with_a_note():
    r = dataclasses.replace(_result((MET,)), downflooding_angle_deg=None)
    (row,) = compare(r, {"downflooding_angle_deg": 50.0}, B_M)
    assert (row.deckload, row.passed) == (None, False)
    assert row.note == "deckload has no value here: the profile gives no downflooding angles"
    assert row.difference is None


def test_no_list_where_gz_is_never_positive_is_a_fail_saying_why():
    """A booklet's list against a condition with no position of equilibrium (list None): a fail,
    and the note says why there is no value, not that downflooding data are missing."""
    r = dataclasses.replace(_result((MET,)), list_deg=None)
    (row,) = compare(r, {"list_deg": 2.0}, B_M)
    assert (row.deckload, row.passed) == (None, False)
    assert row.note == "no list: GZ never becomes positive on the side she heels to (no position of equilibrium)"


def test_a_value_that_is_not_finite_never_passes():
    r = dataclasses.replace(_result((MET,)), max_gz_m=float("nan"))
    (row,) = compare(r, {"max_gz_m": 0.6}, B_M)
    assert not row.passed


def test_gz_is_read_on_the_side_she_lists_to():
    """Criteria checked to port: the booklet's GZ is compared with the port curve
    (0.009, 0.15, 0.32 m at 0, 10, 20°): at 10° 0.15 m, within 0.0075 m of 0.15."""
    r = dataclasses.replace(_result((MET,)), criteria_side="port")
    (row,) = compare(r, {"gz": [(10.0, 0.15)]}, B_M)
    assert row.deckload == pytest.approx(0.15, abs=1e-12) and row.passed


def test_gz_at_the_curve_end_is_read_and_just_beyond_is_not():
    """The hand-built curve ends at 20° (its GZ 0.31 m) while gz_end says 80°: 20° is read,
    20.5° is beyond the curve's last point and has no value."""
    rows = compare(_result((MET,)), {"gz": [(20.0, 0.31), (20.5, 0.31)]}, B_M)
    assert rows[0].deckload == pytest.approx(0.31, abs=1e-12) and rows[0].passed
    assert rows[1].deckload is None and not rows[1].passed and rows[1].key == "gz_m@20.5"
    assert rows[1].label == "GZ at 20.5°"


def test_gz_exactly_at_the_last_angle_of_the_tables_is_read():
    """gz_end at 20°, the curve's last point: a booklet GZ at 20° is compared, not refused."""
    r = dataclasses.replace(_result((MET,)), gz_end_deg=20.0)
    (row,) = compare(r, {"gz": [(20.0, 0.30)]}, B_M)
    assert row.deckload == pytest.approx(0.31, abs=1e-12) and row.note == ""
    assert row.passed  # |0.31 − 0.30| = 0.01 ≤ min(5 % · 0.30 = 0.015, 0.05)
    (row,) = compare(r, {"gz": [(20.1, 0.30)]}, B_M)
    assert row.deckload is None and row.note == "beyond the KN table's last angle 20°"


@pytest.mark.parametrize("base", [2140.0, 8402.3, 11344.4])
def test_a_deviation_of_exactly_the_tolerance_passes(base):
    """'Within 2 %' includes 2 % itself (standards.md §5.3): a deckload displacement of exactly
    1.02 × the booklet's passes, whatever round-off the products carry; 1.0201 × does not.
    For 8402.3 and 11344.4 t, |1.02·b − b| exceeds 0.02·b by about 3e-13 t in floating point:
    the allowance of 1e-9 of the value (booklet.ROUNDOFF) is what lets them pass."""
    r = dataclasses.replace(_result((MET,)), displacement_t=base * 1.02)
    (row,) = compare(r, {"displacement_t": base}, B_M)
    assert row.passed
    r = dataclasses.replace(_result((MET,)), displacement_t=base * 1.0201)
    (row,) = compare(r, {"displacement_t": base}, B_M)
    assert not row.passed
