"""The free-text vessel_type naming a kind of ship the criteria do not follow.

The criteria sets follow ``[criteria] ship_type`` alone (criteria.SETS_BY_TYPE): a profile saying
"stern trawler (fishing vessel)" without ship_type was judged by the general set, GM0 ≥ 0.15 m
(IS 2008 Part A 2.2.4) where Part B 2.1 asks 0.35 m (standards.md §3.2, 0.35 m from memory).
"""

from __future__ import annotations

import json

import pytest

from deckload.core.audit import WARNING, audit
from deckload.io.profiles import parse_profile
from test_profiles import BASE, edit

TYPE_LINE = 'vessel_type = "box barge (analytic check case)"\n'


def words_findings(vessel_type: str, criteria: str = ""):
    text = edit(BASE, TYPE_LINE, f"vessel_type = {json.dumps(vessel_type)}\n") + criteria
    return [f for f in audit(parse_profile(text)) if f.check == "ship-type-words"]


def test_an_untyped_trawler_is_warned_naming_both_keys_and_the_set_applied():
    (f,) = words_findings("stern trawler (fishing vessel)")
    assert f.severity == WARNING and f.key == "vessel.vessel_type" and f.path == ("vessel", "vessel_type")
    assert "criteria.ship_type is 'general'" in f.why
    assert ("judged by IS Code 2008 Part A 2.2 general criteria, not IS Code 2008 Part B 2.1 fishing vessel "
            "criteria;") in f.why
    assert 'give [criteria] ship_type = "fishing"' in f.why


@pytest.mark.parametrize("text, kind, ship_type", [
    ("purse seiner", "fishing", "general"),
    ("Longliner", "fishing", "offshore_supply"),
    ("ro-ro passenger ferry", "passenger", "general"),
    ("PSV (platform supply)", "offshore_supply", "fishing"),
    ("offshore supply vessel", "offshore_supply", "passenger"),
])
def test_every_kind_named_against_another_ship_type(text, kind, ship_type):
    extra = f'\n[criteria]\nship_type = "{ship_type}"\n'
    if ship_type == "passenger":
        extra += ("[passengers]\ncount = 12\nmass_per_person_t = 0.075\nstanding_area_m2 = 10.0\n"
                  "standing_tcg_m = 3.0\nservice_speed_kn = 10.0\n")
    (f,) = words_findings(text, extra)
    assert f'ship_type = "{kind}"' in f.why
    if ship_type == "general" and kind == "passenger":  # the general sets are all a passenger ship's too
        assert "so she is judged without IS Code 2008 Part A 3.1 passenger ship heel;" in f.why and f"criteria.ship_type is {ship_type!r}" in f.why


@pytest.mark.parametrize("text, criteria", [
    ("stern trawler (fishing vessel)", '\n[criteria]\nship_type = "fishing"\n'),
    ("coastal island-supply vessel", ""),     # 'supply' alone names no type
    ("box barge (analytic check case)", ""),
    ("offshore supply vessel with passenger berths", '\n[criteria]\nship_type = "offshore_supply"\n'),
    ("trawlerman's tender", ""),             # whole words only
])
def test_no_warning_where_the_type_in_force_is_named_or_none_is(text, criteria):
    assert words_findings(text, criteria) == []
