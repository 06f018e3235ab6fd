"""A deck load named on a deck area stands on it: its centre within the area's stated ends and
edges (``x_m``, ``y_m`` of ``[[deck_area]]``), refused from a condition file as on the screen's
deck-load form.

The audit's slip (booklet-conventions audit, "cond_deck_lcg_midships_area"): a deck item typed with
its LCG from midships (x = −8 m) on a hatch spanning 22–58 m from the AP was accepted, the trim went
0.20 → 3.30 m and a condition whose criteria were not met read "Met where assessable".

Here the Demo Trawler's trawl deck (51.2 m², centre 7.00 m aft of midships, LBP 22.0 m: 4.0 m from
the AP) is given ends 3.0 and 11.0 m aft of midships (x_m = [-11.0, -3.0] in her booklet's datum,
midships + forward: 0.0–8.0 m from the AP) and edges 3.2 m either side (her breadth is 7.2 m):
an invented extent, 8.0 m × 6.4 m = 51.2 m², around her stated centre.  The grounds condition's catch
stands on it at 6.0 m from the AP; typed from midships, + forward, the same catch is at −5.0 m.
"""

from __future__ import annotations

import pytest

from deckload.io import paths
from deckload.io.profiles import ProfileError, parse_condition, parse_profile
from deckload.ui.entry import EntryError, ItemForm, item_from_form

TRAWLER = paths.TRAWLER_PROFILE.read_text(encoding="utf-8")
GROUNDS = paths.TRAWLER_CONDITIONS["grounds"].read_text(encoding="utf-8")
AREA = 'max_load_t_m2 = 1.5\n'
EXTENT = 'max_load_t_m2 = 1.5\nx_m = [-11.0, -3.0]\ny_m = [-3.2, 3.2]\n'
CATCH = "lcg_m = 6.0\nvcg_m = 4.4\ntcg_m = 0.0\narea"


def edit(text: str, old: str, new: str) -> str:
    assert text.count(old) == 1, old
    return text.replace(old, new)


def vessel(extent: str = EXTENT):
    return parse_profile(edit(TRAWLER, AREA, extent), str(paths.TRAWLER_PROFILE))


def problems(text: str, v) -> list[str]:
    try:
        parse_condition(text, "g.condition.toml", v)
    except ProfileError as e:
        return [str(p) for p in e.problems]
    return []


def screen(v, lcg: str, tcg: str = "0") -> str | None:
    try:
        item_from_form(v, ItemForm("Catch", "3.0", lcg, "4.4", tcg, "TRAWLDECK"), deck=True)
    except EntryError as e:
        return str(e)
    return None


def test_the_extent_is_read_in_the_areas_datum():
    a = vessel().deck_area("TRAWLDECK")
    assert a.x_extent_m == (0.0, 8.0)  # 11.0 + x, x = −11.0 and −3.0 (midships, + forward)
    assert a.y_extent_m == (-3.2, 3.2)
    assert vessel(AREA).deck_area("TRAWLDECK").x_extent_m is None


def test_a_deck_load_typed_from_midships_is_refused_from_a_file_and_on_the_screen():
    v = vessel()
    assert problems(GROUNDS, v) == [] and screen(v, "6.0") is None
    text = edit(GROUNDS, CATCH, CATCH.replace("lcg_m = 6.0", "lcg_m = 15.0"))
    (said,) = problems(text, v)
    line = next(i for i, s in enumerate(text.splitlines(), 1) if s == "lcg_m = 15.0")
    assert said.startswith(f"g.condition.toml:{line}: deck_item[#2].lcg_m = 15")
    assert "outside deck area TRAWLDECK that the load names: the area spans 0–8 m from the AP" in said
    assert "15 m from the FP, + aft (7 m from the AP) would lie on it" in said  # 22.0 − 15.0
    shown = screen(v, "15.0")
    assert shown is not None and "outside deck area TRAWLDECK" in shown and "from the FP, + aft" in shown
    # from midships, + forward: the catch 5.0 m aft of midships typed −5.0 is off the hull (−4.4 m),
    # refused once, by the hull's range, on both sides
    text = edit(GROUNDS, CATCH, CATCH.replace("lcg_m = 6.0", "lcg_m = -5.0"))
    (said,) = problems(text, v)
    assert "deck_item[#2].lcg_m = -5.0: below the physical limit" in said and screen(v, "-5.0") is not None


def test_the_hint_names_midships_where_that_is_the_slip():
    """On the audit's vessel (LBP 72 m) a hatch spanning 22–58 m from the AP; a load on it at 44 m
    typed −8 m from midships, + aft (36 + 8 = 44)."""
    from deckload.core.bounds import off_deck_area_x
    from deckload.core.model import DeckArea

    hatch = DeckArea("HATCH", "Hatch covers", 396.0, 40.0, 7.0, x_extent_m=(22.0, 58.0))
    said = off_deck_area_x(hatch, 72.0, -8.0)
    assert said is not None and "spans 22–58 m from the AP" in said
    assert ("-8 m from midships, + forward (28 m from the AP) or from midships, + aft (44 m from the AP) "
            "would lie on it") in said
    assert off_deck_area_x(hatch, 72.0, 44.0) is None


@pytest.mark.parametrize("lcg, refused", [("8.05", False), ("8.06", True), ("-0.05", False), ("-0.06", True)])
def test_the_ends_are_met_within_half_a_printed_decimetre(lcg, refused):
    """AREA_EDGE_TOLERANCE_M = 0.05 m beyond each end (common practice: positions printed to 0.1 m)."""
    v = vessel()
    text = edit(GROUNDS, CATCH, CATCH.replace("lcg_m = 6.0", f"lcg_m = {lcg}"))
    assert bool(problems(text, v)) == refused == (screen(v, lcg) is not None)


def test_a_tcg_off_the_areas_edges_is_refused_alike():
    v = vessel()
    text = edit(GROUNDS, CATCH, CATCH.replace("tcg_m = 0.0", "tcg_m = 3.5"))
    (said,) = problems(text, v)
    assert "deck_item[#2].tcg_m = 3.5: outside deck area TRAWLDECK" in said
    assert screen(v, "6.0", "3.5") is not None and screen(v, "6.0", "3.2") is None


def test_without_an_extent_the_centre_is_held_to_the_hull_only():
    v = vessel(AREA)
    assert problems(edit(GROUNDS, CATCH, CATCH.replace("lcg_m = 6.0", "lcg_m = -2.0")), v) == []


@pytest.mark.parametrize("extent, key, says", [
    ('x_m = [-2.0, -3.0]', "lcg_m", "the area's centre lies outside its own ends x_m (8–9 m from the AP)"),
    ('x_m = [-11.0, -11.0]', "x_m", "the area's two ends must differ"),
    ('x_m = [-11.0, -3.0]\ny_m = [-1.0, 1.0]', "area_m2", "more than the rectangle its ends and edges make"),
    ('x_m = [-11.0, -3.0]\ny_m = ["3.2 P", "3.2 S", 0.0]', "y_m", "must be the area's two edges"),
])
def test_an_extent_that_contradicts_the_area_is_refused(extent, key, says):
    with pytest.raises(ProfileError) as e:
        vessel(f"max_load_t_m2 = 1.5\n{extent}\n")
    (p,) = e.value.problems
    assert p.key == f"deck_area[TRAWLDECK].{key}" or p.key.endswith(f".{key}"), p
    assert says in str(p)


def test_side_marks_are_read_for_the_edges():
    assert vessel('max_load_t_m2 = 1.5\nx_m = [-11.0, -3.0]\ny_m = ["3.2 P", "3.2 S"]\n').deck_area(
        "TRAWLDECK").y_extent_m == (-3.2, 3.2)
