"""Sizes that had no least value are bounded below by the vessel's own size (deckload.core.bounds).

A vanishing footprint, deck area, waterline length, lightship or tank-calibration step only divides
something into an absurd number: a 300-digit t/m², a lever, a free surface of 1e298 m².  The floors
are common practice (a 10 cm × 10 cm foot, a square metre of deck, half the LBP of waterline, 2 % of
the greatest tabulated displacement of lightship); the calibration's bound is derived: ΔV/Δh is the
mean plan area of the liquid between two rows, and no surface in the hull exceeds 1.2·LBP × B.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.io.profiles import ProfileError, parse_condition, parse_profile
from demo_vessels import trawler_vessel

TRAWLER = paths.TRAWLER_PROFILE.read_text(encoding="utf-8")
ISLANDER = paths.DEMO_PROFILE.read_text(encoding="utf-8")
GROUNDS = paths.TRAWLER_CONDITIONS["grounds"].read_text(encoding="utf-8")


def edit(text: str, old: str, new: str) -> str:
    assert text.count(old) == 1, old
    return text.replace(old, new)


def only_problem(call) -> str:
    with pytest.raises(ProfileError) as ei:
        call()
    ps = ei.value.problems
    assert len(ps) == 1, "\n".join(map(str, ps))
    return str(ps[0])


def trawler(text: str):
    return parse_profile(text, str(paths.TRAWLER_PROFILE))


@pytest.mark.parametrize("fp, side", [("1e-300", "below"), ("0.005", "below"), ("60.0", "above")])
def test_a_footprint_from_a_vanishing_point_to_more_than_its_deck_area_is_refused(fp, side):
    """The catch on the 51.2 m² trawl deck: 3 t on 1e-300 m² printed a 300-digit t/m² warning."""
    text = edit(GROUNDS, "footprint_m2 = 8.0", f"footprint_m2 = {fp}")
    said = only_problem(lambda: parse_condition(text, "g.condition.toml", trawler_vessel()))
    assert f"deck_item[#2].footprint_m2 = {fp}: {side} the physical limit: must be between 0.01 and 51.2 m²" in said
    ok = parse_condition(edit(GROUNDS, "footprint_m2 = 8.0", "footprint_m2 = 0.01"), "g.condition.toml", trawler_vessel())
    assert ok.deck_items[1].footprint_m2 == 0.01


def test_a_waterline_length_below_half_the_lbp_is_refused():
    """Lwl enters the roll period's C and the bilge-keel ratio; 1e-300 m was accepted (LBP 22 m)."""
    text = edit(TRAWLER, "waterline_length_m = [22.50,", "waterline_length_m = [1e-300,")
    said = only_problem(lambda: trawler(text))
    assert "windage.waterline_length_m" in said and "must be between 11 and 33 m" in said
    text = edit(TRAWLER, "waterline_length_m = [22.50,", "waterline_length_m = [10.9,")
    assert "must be between 11 and 33 m" in only_problem(lambda: trawler(text))


def test_a_deck_area_below_a_square_metre_is_refused():
    text = edit(TRAWLER, "area_m2 = 51.2", "area_m2 = 1e-300")
    said = only_problem(lambda: trawler(text))
    assert "deck_area[TRAWLDECK].area_m2 = 1e-300: below the physical limit: must be between 1 and 190.08 m²" in said


@pytest.mark.parametrize("mass", ["1e-300", "7.0"])
def test_a_lightship_below_two_percent_of_the_greatest_displacement_is_refused(mass):
    """The trawler's table ends at 358 t: 2 % is 7.16 t (her lightship is 168 t, 47 %)."""
    text = edit(TRAWLER, "mass_t = 168.0", f"mass_t = {mass}")
    said = only_problem(lambda: trawler(text))
    assert f"lightship.mass_t = {mass}: below the physical limit: must be between 7.16 and 358 t" in said


def test_a_calibration_step_implying_a_surface_larger_than_the_hull_is_refused():
    """The islander's APT: its second row moved from a sounding of 0.0975 m to 1e-300 m with its
    0.0243 m³ is a surface of 2.43e298 m², against the hull's 1.2·38 × 10 = 456 m²."""
    old = "sounding_m = [\n    0.0, 0.0975,"
    assert ISLANDER.count(old) == 1
    text = ISLANDER.replace(old, "sounding_m = [\n    0.0, 1e-300,")
    said = only_problem(lambda: parse_profile(text, str(paths.DEMO_PROFILE)))
    assert "tank[APT].calibration.volume_m3" in said
    assert "a liquid surface of 2.43e+298 m², larger than the hull's plan area 1.2·LBP × breadth = 456 m²" in said
