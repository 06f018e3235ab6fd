"""Soundings taken trimmed or listed, corrected from the tank's shape (core/soundings.py), against a
box tank in closed form.

Box tank DB1 (derived here): l × b × h = 10 × 4 × 1 m, x 15–25 m from AP, y −2…+2 m, its lowest
point (the bottom) at z_low = 0.5 m above keel; its calibration is V = l·b·s = 40·s.  LBP = 40 m.
The sounding pipe stands at the aft end, x_p = 15 m.  Trimmed t (m, + by the stern) and listed φ
(+ starboard), a sounding s read at the pipe (x_p, y_p) shows the level surface, in ship axes,

    z(x, y) = z_low + s + (x_p − x)·τ + (y − y_p)·tanφ,    τ = t/LBP

(the liquid's surface is parallel to the waterline: its height above the bottom falls forward by
τ per metre when trimmed by the stern, and rises to starboard by tanφ per metre when listed to
starboard).  Let d(x, y) = z − z_low be the depth over the bottom.

1. Surface cutting neither bottom nor top (0 ≤ d ≤ h over the whole tank): V is l·b times the mean
   of d, the plane's value at the tank's centre (x_c, y_c) = (20, 0):
   V = 40·(s + (15 − 20)·τ + (0 − y_p)·tanφ).
   * s = 0.5, t = +0.8 (τ = 0.02), upright: V = 40·(0.5 − 0.1) = 16 m³, even-keel sounding 0.4 m;
   * s = 0.6, t = −1.0 (τ = −0.025): V = 40·(0.6 + 0.125) = 29 m³, even keel 0.725 m;
   * pipe at the port wall y_p = −2, s = 0.5, t = 0, φ = +2°: V = 40·(0.5 + 2·tan 2°) = 22.793662 m³;
   * the same with t = +0.8: V = 40·(0.4 + 2·tan 2°) = 18.793662 m³.
2. Surface meeting the bottom: s = 0.2, t = +1.0 (τ = 0.025) with the pipe aft: d = 0.2 − 0.025·(x − 15)
   is wet for x − 15 < 0.2/0.025 = 8 m, a wedge of length 8 and height 0.2:
   V = b·s²/(2τ) = 4·0.04/0.05 = 3.2 m³, even keel 0.08 m.
3. Surface meeting the top: s = 0.9, t = −1.0: d = 0.9 + 0.025·(x − 15) passes h = 1 at x = 19; the
   part above the top, a wedge of length 6 and height 0.15, is not liquid:
   V = 40·(0.9 + 0.125) − 4·6·0.15/2 = 41 − 1.8 = 39.2 m³, even keel 0.98 m.

The body's stations are 1 m apart (11 stations, Simpson's rule on pairs 15–17, …, 23–25): each
section's wet area is linear in x between the kinks at x = 23 and x = 19, which fall on the ends of
Simpson pairs, so the rule integrates these volumes exactly; the sections are polygons cut by a
line, also exact.  Tolerance 1e-9 m³ (round-off of sums of order 40).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.geometry.body import Body
from deckload.core.model import Condition, SoundingPipe, TankFill, TrimCorrection, frozen_array
from deckload.core.soundings import (
    BOOKLET,
    GEOMETRY,
    CorrectedSounding,
    SoundingError,
    booklet_level,
    correct_sounding,
    level_soundings,
    sounding_note,
    volume_at_sounding,
)
from vessel_factories import box_barge, box_tank

LBP = 40.0
ROUND = 1e-9  # m³ or m: round-off of sums of order 40
TAN2 = math.tan(math.radians(2.0))


def body(scale: float = 1.0) -> Body:
    """The box tank as sections 1 m apart (counter-clockwise corners seen from aft); ``scale``
    widens it, for a shape that holds more than its calibration."""
    xs = np.linspace(15.0, 25.0, 11)
    y = np.tile(np.array([-2.0, 2.0, 2.0, -2.0]) * scale, (11, 1))
    z = np.tile([0.5, 0.5, 1.5, 1.5], (11, 1))
    return Body(xs, y, z)


def tank(**kw):
    t = box_tank("DB1", length_m=10.0, breadth_m=4.0, height_m=1.0, lcg_m=20.0, bottom_m=0.5)
    return dataclasses.replace(t, **kw)


AFT = SoundingPipe(15.0, 0.0)
PORT_WALL = SoundingPipe(15.0, -2.0)


@pytest.mark.parametrize("pipe, s, trim, lst, volume", [
    (AFT, 0.5, 0.8, 0.0, 16.0),                            # case 1
    (AFT, 0.6, -1.0, 0.0, 29.0),                           # case 1, by the head
    (PORT_WALL, 0.5, 0.0, 2.0, 40.0 * (0.5 + 2.0 * TAN2)),  # case 1, listed
    (PORT_WALL, 0.5, 0.8, 2.0, 40.0 * (0.4 + 2.0 * TAN2)),  # case 1, trimmed and listed
    (AFT, 0.2, 1.0, 0.0, 3.2),                             # case 2, the bottom
    (AFT, 0.9, -1.0, 0.0, 39.2),                           # case 3, the top
    (AFT, 0.5, 0.0, 0.0, 20.0),                            # even keel: the calibration's 40·s
])
def test_volume_below_the_surface_a_sounding_shows(pipe, s, trim, lst, volume):
    assert volume_at_sounding(body(), pipe, s, trim, LBP, lst) == pytest.approx(volume, abs=ROUND)


def test_the_hand_values_written_out():
    assert 40.0 * (0.5 + 2.0 * TAN2) == pytest.approx(22.793662, abs=5e-7)
    assert 4 * 0.2**2 / (2 * 0.025) == pytest.approx(3.2, abs=1e-12)


@pytest.mark.parametrize("s, trim, even, volume", [(0.5, 0.8, 0.4, 16.0), (0.2, 1.0, 0.08, 3.2),
                                                  (0.9, -1.0, 0.98, 39.2), (0.6, -1.0, 0.725, 29.0)])
def test_corrected_sounding_is_the_even_keel_sounding_of_the_same_volume(s, trim, even, volume):
    """Read back through the calibration V = 40·s (module docstring)."""
    cs = correct_sounding(tank(), body(), AFT, s, trim, LBP, 0.0)
    assert cs == CorrectedSounding("DB1", s, pytest.approx(even, abs=ROUND), pytest.approx(volume, abs=ROUND))
    assert cs.method == GEOMETRY


def test_a_shape_holding_more_than_its_calibration_reads_the_full_table():
    """A hull-geometry shape 1 % wider than the booklet's table (within UR L5's 2 %, standards.md §5.3)
    sounded full at the aft pipe trimmed 0.5 m by the head (the surface rises forward, so the tank is
    full): 40.4 m³ by the shape, more than the table's 40 m³; the even-keel sounding is the table's
    top, 1 m, and the volume the table's 40 m³ — never a look-up beyond the table."""
    cs = correct_sounding(tank(), body(1.01), AFT, 1.0, -0.5, LBP, 0.0)
    assert (cs.even_keel_m, cs.volume_m3) == pytest.approx((1.0, 40.0), abs=ROUND)


@pytest.mark.parametrize("s, trim, lst, message", [
    (1.2, 0.5, 0.0, "tank DB1: sounding 1.2 m is outside 0–1 m"),
    (-0.1, 0.5, 0.0, "tank DB1: sounding -0.1 m is outside 0–1 m"),
    (float("nan"), 0.5, 0.0, "tank DB1: sounding nan m is outside 0–1 m"),
    (0.5, 8.5, 0.0, "trim 8.5 m is beyond a fifth of LBP: no sounding is corrected for it"),
    (0.5, -8.5, 0.0, "trim -8.5 m is beyond a fifth of LBP: no sounding is corrected for it"),
    (0.5, float("inf"), 0.0, "trim inf m is beyond a fifth of LBP: no sounding is corrected for it"),
    (0.5, 0.0, 46.0, "list 46.0° is beyond 45°: no sounding is corrected for it"),
    (0.5, 0.0, -45.5, "list -45.5° is beyond 45°: no sounding is corrected for it"),
    (0.5, 0.0, float("nan"), "list nan° is beyond 45°: no sounding is corrected for it"),
])
def test_refusals_name_the_value_and_the_rule(s, trim, lst, message):
    """A fifth of LBP is 8 m here; a list beyond 45° is no sounding condition."""
    with pytest.raises(SoundingError) as e:
        correct_sounding(tank(), body(), AFT, s, trim, LBP, lst)
    assert str(e.value) == message


def test_at_the_limits_a_sounding_is_still_corrected():
    """Trim exactly LBP/5 = 8 m and list exactly 45° are accepted; the top and bottom soundings too.
    At 8 m by the stern (τ = 0.2) a sounding of 0.4 m at the aft pipe wets 2 m of the tank:
    V = b·s²/(2τ) = 4·0.16/0.4 = 1.6 m³ (case 2); at 8 m by the head the same from a pipe at the
    forward end (x_p = 25).  Under a 45° list a plane through the centre of the section halves it
    (the rectangle is symmetric about its centre): 20 m³."""
    assert volume_at_sounding(body(), AFT, 0.4, 8.0, LBP, 0.0) == pytest.approx(1.6, abs=ROUND)
    assert volume_at_sounding(body(), SoundingPipe(25.0, 0.0), 0.4, -8.0, LBP, 0.0) == pytest.approx(1.6, abs=ROUND)
    assert volume_at_sounding(body(), SoundingPipe(20.0, 0.0), 0.5, 0.0, LBP, 45.0) == pytest.approx(20.0, abs=ROUND)
    assert volume_at_sounding(body(), SoundingPipe(20.0, 0.0), 0.5, 0.0, LBP, -45.0) == pytest.approx(20.0, abs=ROUND)
    assert correct_sounding(tank(), body(), AFT, 0.0, 0.0, LBP, 0.0).volume_m3 == pytest.approx(0.0, abs=ROUND)
    assert correct_sounding(tank(), body(), AFT, 1.0, 0.0, LBP, 0.0).volume_m3 == pytest.approx(40.0, abs=ROUND)


def sounded_vessel(pipe=AFT, **tank_kw):
    v = box_barge(tanks=(tank(**tank_kw),))
    return dataclasses.replace(v, tank_bodies={"DB1": body()}, sounding_pipes={"DB1": pipe})


def test_level_soundings_gives_readings_back_from_the_sounding_zero_and_the_ullage_reference():
    """Sounding zero 0.05 m above the bottom and ullage reference 1.2 m above it: a sounding of 0.45 m
    and an ullage of 0.70 m both stand for the level 0.5 m.  At +0.8 m trim the even-keel level is
    0.4 m (case 1): the sounding 0.35 m, the ullage 1.2 − 0.4 = 0.8 m, 16 m³."""
    v = sounded_vessel(sounding_zero_m=0.05, ullage_reference_m=1.2)
    for quantity, read, even in (("sounding_m", 0.45, 0.35), ("ullage_m", 0.7, 0.8)):
        c = Condition(tanks=(TankFill("DB1", quantity, read, 1.0),), sounding_trim_m=0.8)
        out, done, missed = level_soundings(v, c)
        assert missed == ()
        (cs,) = done
        assert (cs.tank_id, cs.observed_m, cs.method) == ("DB1", read, GEOMETRY)
        assert (cs.even_keel_m, cs.volume_m3) == pytest.approx((even, 16.0), abs=ROUND)
        (f,) = out.tanks
        assert (f.tank_id, f.quantity, f.density_t_m3) == ("DB1", quantity, 1.0)
        assert f.value == pytest.approx(even, abs=ROUND)
        assert (out.sounding_trim_m, out.sounding_list_deg) == (0.8, 0.0)


def test_level_soundings_listed_only():
    """Upright trim, 2° to starboard, pipe at the port wall: V = 22.793662 m³ (case 1), even keel V/40."""
    v = sounded_vessel(pipe=PORT_WALL)
    c = Condition(tanks=(TankFill("DB1", "sounding_m", 0.5),), sounding_list_deg=2.0)
    out, (cs,), missed = level_soundings(v, c)
    assert cs.even_keel_m == pytest.approx(0.5 + 2.0 * TAN2, abs=ROUND) and missed == ()
    assert out.tanks[0].value == pytest.approx(0.5 + 2.0 * TAN2, abs=ROUND)


def test_level_soundings_leaves_other_entries_and_even_keel_alone():
    """Percent and volume entries pass through as they are; at even keel and upright nothing is done;
    a tank without a shape or a pipe is named as not corrected and kept as read."""
    a = box_tank("A1", length_m=2.0, breadth_m=2.0, height_m=1.0, lcg_m=5.0)
    v = dataclasses.replace(sounded_vessel(), tanks=(tank(), a))
    fills = (TankFill("A1", "sounding_m", 0.5), TankFill("DB1", "percent", 50.0), TankFill("DB1", "sounding_m", 0.5))
    c = Condition(tanks=fills, sounding_trim_m=0.8)
    out, done, missed = level_soundings(v, c)
    assert missed == ("A1",)
    assert [d.tank_id for d in done] == ["DB1"]
    assert out.tanks[:2] == fills[:2]
    assert out.tanks[2].value == pytest.approx(0.4, abs=ROUND)
    flat = Condition(tanks=fills)
    assert level_soundings(v, flat) == (flat, (), ())
    # no pipe, or no shape: not corrected
    for w in (dataclasses.replace(v, sounding_pipes={}), dataclasses.replace(v, tank_bodies={})):
        out, done, missed = level_soundings(w, Condition(tanks=fills[2:], sounding_trim_m=0.8))
        assert (done, missed, out.tanks) == ((), ("DB1",), fills[2:])


def test_the_cautions_word_what_was_done():
    c = Condition(sounding_trim_m=0.8, sounding_list_deg=-1.5)
    done = (CorrectedSounding("DB1", 0.5, 0.4, 16.0, GEOMETRY), CorrectedSounding("DB2", 0.25, 0.3125, 12.5, BOOKLET))
    assert sounding_note(c, done, ("A1", "A2")) == [
        ("sounding-corrected", "soundings taken at trim +0.80 m, list -1.5°, as at even keel: "
                               "DB1 0.500 → 0.400 m (tank geometry), DB2 0.250 → 0.312 m (booklet trim correction)"),
        ("sounding-uncorrected", "soundings taken at trim +0.80 m, list -1.5° NOT corrected (no booklet trim correction "
                                 "for this trim and sounding, and no tank shape or sounding pipe): A1, A2"),
    ]
    assert sounding_note(c, (), ()) == []


# ---------------------------------------------------------------- the booklet's columns
# For this tank and pipe the closed form of case 1 gives the even-keel sounding s − 5·τ = s − 0.125·t
# (t in m over LBP 40 m) while the surface stays clear of bottom and top: a correction of −0.125·t m, the
# same at every sounding, and a volume of 40·(s − 0.125·t) m³.  Columns at t = −1, −0.5, +0.5, +1 m
# and soundings 0.3, 0.5, 0.7 m are linear in s and t, so linear interpolation between them is exact.

TRIMS = [-1.0, -0.5, 0.5, 1.0]
SOUNDINGS = [0.3, 0.5, 0.7]


def columns(kind: str, zero: float = 0.0) -> TrimCorrection:
    """The columns for a sounding zero ``zero`` m above the bottom: the reading s is the level s + zero."""
    if kind == "sounding_correction_m":
        value = [[-0.125 * t for t in TRIMS] for _ in SOUNDINGS]
    else:
        value = [[40.0 * (s + zero - 0.125 * t) for t in TRIMS] for s in SOUNDINGS]
    return TrimCorrection(frozen_array(TRIMS), frozen_array(SOUNDINGS), frozen_array(value), kind)


@pytest.mark.parametrize("kind", ["sounding_correction_m", "volume_m3"])
@pytest.mark.parametrize("s, trim, level", [
    (0.5, 0.8, 0.4), (0.5, 0.25, 0.46875), (0.4, -0.75, 0.49375), (0.3, 1.0, 0.175), (0.7, -1.0, 0.825),
    (0.6, 0.5, 0.5375),
])
def test_booklet_columns_interpolated_in_sounding_and_trim(kind, s, trim, level):
    """Even-keel level s − 0.125·t, volume 40 times it; between the ±0.5 m columns trim 0 is the
    calibration itself (correction 0, or the calibration's 40·s)."""
    got = booklet_level(tank(trim_correction=columns(kind)), s, trim)
    assert got == pytest.approx((level, 40.0 * level), abs=ROUND)


@pytest.mark.parametrize("kind", ["sounding_correction_m", "volume_m3"])
@pytest.mark.parametrize("trim, level", [(0.8, 0.45), (0.25, 0.51875), (-0.25, 0.58125)])
def test_booklet_columns_read_from_the_sounding_zero(kind, trim, level):
    """A sounding zero 0.05 m above the bottom: the columns are for the observed sounding, 0.5 m, the
    level 0.55 m, so the even-keel level is 0.55 − 0.125·t (0.45 m at +0.8, 0.51875 m at +0.25,
    0.58125 m at −0.25) and the volume 40 times it.  Between trim 0 and the ±0.5 m columns, trim 0
    is the calibration at the level 0.55 m."""
    got = booklet_level(tank(trim_correction=columns(kind, 0.05), sounding_zero_m=0.05), 0.5, trim)
    assert got == pytest.approx((level, 40.0 * level), abs=ROUND)


@pytest.mark.parametrize("s, trim", [(0.5, 0.0), (0.5, 1.2), (0.5, -1.2), (0.25, 0.5), (0.75, 0.5)])
def test_booklet_columns_do_not_apply_outside_themselves(s, trim):
    """Nothing extrapolated: beyond the trims or the soundings tabulated (and at trim 0) → None."""
    for kind in ("sounding_correction_m", "volume_m3"):
        assert booklet_level(tank(trim_correction=columns(kind)), s, trim) is None
    assert booklet_level(tank(), 0.5, 0.5) is None


def test_booklet_columns_at_their_ends():
    """At the end columns and end soundings the columns apply (inclusive ends)."""
    t = tank(trim_correction=columns("sounding_correction_m"))
    assert booklet_level(t, 0.3, -1.0) == pytest.approx((0.425, 17.0), abs=ROUND)
    assert booklet_level(t, 0.7, 1.0) == pytest.approx((0.575, 23.0), abs=ROUND)


def test_booklet_columns_are_bounded_by_the_tank():
    """A correction column that would take the level below the bottom or above the top is held to the
    table (0 or 1 m, 0 or 40 m³): corrections of ∓0.4 m at s = 0.3 and 0.7 m, trim ±1 m."""
    big = TrimCorrection(frozen_array([-1.0, 1.0]), frozen_array([0.3, 0.7]),
                         frozen_array([[0.4, -0.4], [0.4, -0.4]]), "sounding_correction_m")
    t = tank(trim_correction=big)
    assert booklet_level(t, 0.3, 1.0) == pytest.approx((0.0, 0.0), abs=ROUND)
    assert booklet_level(t, 0.7, -1.0) == pytest.approx((1.0, 40.0), abs=ROUND)
    vols = TrimCorrection(frozen_array([-1.0, 1.0]), frozen_array([0.3, 0.7]),
                          frozen_array([[-5.0, 45.0], [-5.0, 45.0]]), "volume_m3")
    t = tank(trim_correction=vols)
    assert booklet_level(t, 0.5, 1.0) == pytest.approx((1.0, 40.0), abs=ROUND)
    assert booklet_level(t, 0.5, -1.0) == pytest.approx((0.0, 0.0), abs=ROUND)


def test_level_soundings_prefers_the_booklet_without_a_list():
    """With columns and a shape, trimmed only: the booklet's level (method named); listed: the shape's."""
    v = sounded_vessel(trim_correction=columns("sounding_correction_m"))
    c = Condition(tanks=(TankFill("DB1", "sounding_m", 0.5),), sounding_trim_m=0.8)
    _, (cs,), _ = level_soundings(v, c)
    assert (cs.method, cs.even_keel_m, cs.volume_m3) == (BOOKLET, pytest.approx(0.4, abs=ROUND),
                                                        pytest.approx(16.0, abs=ROUND))
    _, (cs,), _ = level_soundings(v, c.replace(sounding_list_deg=2.0))
    assert cs.method == GEOMETRY
    assert cs.volume_m3 == pytest.approx(16.0, abs=ROUND)  # case 1: the pipe on the centreline, y_p = y_c


def test_level_soundings_reads_the_booklet_from_the_sounding_zero():
    """Sounding zero 0.05 m above the bottom, booklet correction columns (−0.125·t): the reading 0.5 m
    (level 0.55 m) at +0.8 m is corrected by −0.1 m to 0.4 m as read, the level 0.45 m, 4·10·0.45 = 18 m³."""
    v = sounded_vessel(trim_correction=columns("sounding_correction_m"), sounding_zero_m=0.05)
    c = Condition(tanks=(TankFill("DB1", "sounding_m", 0.5),), sounding_trim_m=0.8)
    out, (cs,), _ = level_soundings(v, c)
    assert (cs.method, cs.even_keel_m, cs.volume_m3) == (BOOKLET, pytest.approx(0.4, abs=ROUND),
                                                        pytest.approx(18.0, abs=ROUND))
    assert out.tanks[0].value == pytest.approx(0.4, abs=ROUND)


# ----------------------------------------------------------------- a box or prism tank as `tables` builds it


def three_station_body():
    """The box tank DB1 as ``deckload tables`` builds a box (core/geometry/hull.compartment_body): one
    section at three stations, x 15, 20 and 25 m — where the plane's kinks no longer fall on stations."""
    from deckload.core.geometry.hull import compartment_body
    from deckload.core.geometry.spec import CompartmentShape

    return compartment_body(CompartmentShape("box", 15.0, 25.0, -2.0, 2.0, 0.5, 1.5), None)


@pytest.mark.parametrize("s, trim, volume", [
    (0.2, 1.0, 3.2),     # case 2 of the module docstring: a wedge on the bottom, kink at x = 23 m
    (0.9, -1.0, 39.2),   # case 3: a wedge off the top, kink at x = 19 m
    (0.5, 0.8, 16.0),    # case 1: no kink (Simpson was already exact)
    (0.1, 1.0, 0.8),     # a wedge of length 4 m and height 0.1 m (docstring)
])
def test_a_box_of_three_stations_is_exact_where_the_surface_meets_the_bottom_or_the_top(s, trim, volume):
    """The module docstring's closed forms on the body ``tables`` builds for a box.  An invariance
    audit found Simpson's rule over its three stations 24 % short at 0.25 m and 1 m trim, and 48 %
    over at 0.10 m: the wet section is kinked in x where the surface meets the bottom or the top
    (soundings._prism_volume integrates between the kinks).  For the last row, wet for
    x − 15 < 0.1/0.025 = 4 m: V = b·s²/(2τ) = 4 × 0.01 / 0.05 = 0.8 m³."""
    assert volume_at_sounding(three_station_body(), AFT, s, trim, LBP, 0.0) == pytest.approx(volume, abs=ROUND)


def test_a_prism_sounded_trimmed_and_listed_agrees_with_the_section_cut_at_thousands_of_stations():
    """A right-angled wedge section against the starboard side (y 0.5…2.5, z 0.5…2.5) 10 m long, pipe
    at its aft end on the wall, read 0.3 m at 1.2 m trim and 3° list: the surface crosses the
    section's corners part-way along.  Reference: the same section at 4001 stations 2.5 mm apart
    (trapezoid rule: at a kink its error is of the order of the slope's jump × (2.5 mm)², below
    1e-5 m³ here; a general property of the rule).  The three-station Simpson body misses by far more."""
    from deckload.core.geometry.body import immerse

    y = np.array([0.5, 2.5, 2.5])
    z = np.array([0.5, 0.5, 2.5])
    three = Body(np.linspace(15.0, 25.0, 3), np.tile(y, (3, 1)), np.tile(z, (3, 1)))
    xs = np.linspace(15.0, 25.0, 4001)
    w = np.full(4001, 10.0 / 4000)
    w[[0, -1]] /= 2.0
    fine = Body(xs, np.tile(y, (4001, 1)), np.tile(z, (4001, 1)), w, "trapezoid")
    pipe = SoundingPipe(15.0, 2.5)
    phi = math.radians(3.0)
    c0 = -pipe.y_m * math.sin(phi) + (0.5 + 0.3) * math.cos(phi)
    ref = float(immerse(fine, math.cos(phi), math.sin(phi), c0, 1.2 / LBP * math.cos(phi), pipe.x_m).volume_m3)
    got = volume_at_sounding(three, pipe, 0.3, 1.2, LBP, 3.0)
    assert got == pytest.approx(ref, abs=1e-5)
    old = float(immerse(three, math.cos(phi), math.sin(phi), c0, 1.2 / LBP * math.cos(phi), pipe.x_m).volume_m3)
    assert abs(old - ref) > 100 * 1e-5


def test_a_trim_of_a_few_ulps_reads_the_even_keel_volume_and_raises_nothing():
    """A trim of 1e-310 m over LBP (a subnormal slope): the points where the surface passes the
    section's corners lie beyond any tank, and their division overflowed (a RuntimeWarning, a
    traceback where warnings are errors).  The volume is the even-keel one, l·b·s = 40 × 0.3 m³
    (module docstring, case 1), to round-off."""
    import warnings

    from deckload.core.soundings import _prism_volume

    with warnings.catch_warnings():
        warnings.simplefilter("error")
        assert _prism_volume(three_station_body(), 1.0, 0.0, 0.5 + 0.3, 1e-310, 15.0) == pytest.approx(12.0, abs=ROUND)
