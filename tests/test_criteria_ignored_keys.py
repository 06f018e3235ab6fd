"""[criteria] keys that would change nothing are refused where read, naming the key and the type.

min_gm_m only raises the GM0 limit outside the fishing set (criteria.evaluate_criteria): below
the general, passenger and OSV sets' own 0.15 m (IS 2008 Part A 2.2.4 [C], Part B 2.4.5 [M];
standards.md §1, §3.3) it was ignored in silence.  complete_superstructure serves only the fishing
set's reduced GM0 (Part B 2.1, standards.md §3.2 [M]).
"""

from __future__ import annotations

import pytest

from deckload.io.profiles import parse_profile
from test_profiles import BASE, line_of, only

PASSENGERS = ("[passengers]\ncount = 12\nmass_per_person_t = 0.075\nstanding_area_m2 = 10.0\n"
              "standing_tcg_m = 3.0\nservice_speed_kn = 10.0\n")


def profile(ship_type: str, keys: str) -> str:
    return (BASE + f'\n[criteria]\nship_type = "{ship_type}"\n{keys}\n'
            + (PASSENGERS if ship_type == "passenger" else ""))


@pytest.mark.parametrize("ship_type", ["general", "offshore_supply", "passenger"])
def test_min_gm_below_the_sets_own_limit_is_refused(ship_type):
    text = profile(ship_type, "min_gm_m = 0.10")
    p = only(text)
    assert p.key == "criteria.min_gm_m" and p.line == line_of(text, "min_gm_m = 0.10")
    assert f"below the 0.15 m GM0 of ship_type {ship_type!r}" in p.rule and "fishing" in p.rule
    # equal to or above its own limit: kept (above it raises the limit)
    assert parse_profile(profile(ship_type, "min_gm_m = 0.15")).criteria.min_gm_m == 0.15
    assert parse_profile(profile(ship_type, "min_gm_m = 0.50")).criteria.min_gm_m == 0.50


@pytest.mark.parametrize("ship_type", ["general", "offshore_supply", "passenger"])
def test_complete_superstructure_outside_the_fishing_set_is_refused(ship_type):
    text = profile(ship_type, "complete_superstructure = true")
    p = only(text)
    assert p.key == "criteria.complete_superstructure" and p.line == line_of(text, "complete_superstructure")
    assert "fishing vessels only" in p.rule and repr(ship_type) in p.rule
    assert parse_profile(profile(ship_type, "complete_superstructure = false")).criteria.complete_superstructure is False


def test_the_fishing_set_keeps_both():
    v = parse_profile(profile("fishing", "min_gm_m = 0.25\ncomplete_superstructure = true"))
    assert (v.criteria.min_gm_m, v.criteria.complete_superstructure) == (0.25, True)
