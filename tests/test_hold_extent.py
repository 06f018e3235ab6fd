"""A hold's cargo centre stated in a condition lies in the hold: between the hold's stated ends
(``x_m`` of ``[[hold]]``), as a deck load's does on its area (tests/test_deck_area_extent.py).

The slip is the deck load's (booklet-conventions audit): a centre typed from midships, where a
condition file's LCG is from the AP.  The Demo Trawler's fish hold (centre 0.214 m forward of
midships, LBP 22.0 m: 11.214 m from the AP; its centre against fill 0.146–0.214 m) is given ends
4.0 m aft and 4.5 m forward of midships (x_m = [-4.0, 4.5] in her booklet's datum, midships +
forward: 7.0–15.5 m from the AP): invented, around her stated centres.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.io.profiles import ProfileError, parse_condition, parse_profile

TRAWLER = paths.TRAWLER_PROFILE.read_text(encoding="utf-8")
GROUNDS = paths.TRAWLER_CONDITIONS["grounds"].read_text(encoding="utf-8")
HOLD = 'max_mass_t = 55.0\n'


def vessel(ends: str = "x_m = [-4.0, 4.5]\n"):
    assert TRAWLER.count(HOLD) == 1
    return parse_profile(TRAWLER.replace(HOLD, HOLD + ends), str(paths.TRAWLER_PROFILE))


def problems(lcg: float, v) -> list[str]:
    text = GROUNDS.replace("stowage_m3_t = 2.2\n", f"stowage_m3_t = 2.2\nlcg_m = {lcg}\nvcg_m = 1.8\n")
    try:
        parse_condition(text, "g.condition.toml", v)
    except ProfileError as e:
        return [str(p) for p in e.problems]
    return []


def test_the_ends_are_read_in_the_holds_datum():
    assert vessel().hold("FH").x_extent_m == (7.0, 15.5)  # 11.0 + x (midships, + forward)
    assert vessel("").hold("FH").x_extent_m is None


def test_a_cargo_centre_typed_from_midships_is_refused_naming_the_datum_it_fits():
    v = vessel()
    assert problems(11.0, v) == []
    (p,) = problems(0.214, v)
    assert "holds.FH.lcg_m = 0.214: outside hold FH that the cargo names: the hold spans 7–15.5 m from the AP" in p
    assert "0.214 m from midships, + forward (11.214 m from the AP)" in p and "would lie on it" in p
    assert problems(0.214, vessel("")) == []  # no ends stated: nothing to hold it to


@pytest.mark.parametrize("ends, key", [("x_m = [2.0, 4.5]\n", "lcg_m"), ("x_m = [0.2, 4.5]\n", "fill_lcg_m"),
                                       ("x_m = [3.0, 3.0]\n", "x_m")])
def test_ends_that_leave_out_the_holds_own_centres_are_refused(ends, key):
    with pytest.raises(ProfileError) as e:
        vessel(ends)
    assert any(p.key == f"hold[FH].{key}" for p in e.value.problems), [str(p) for p in e.value.problems]
