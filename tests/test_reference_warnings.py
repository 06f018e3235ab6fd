"""The warnings of ``evaluate``: which mark, which limit, and the words the officer reads.

Each test poses the box barge of checks.md §1 (L 40, B 10, D 4 m; Δ = 1.025·400·T t, TPC 4.1 t/cm,
checks.md §1.1) so that the number in the warning follows from a closed form written beside it.
"""

from __future__ import annotations

import dataclasses
import math

import pytest

from deckload.core.loading import LoadingError
from deckload.core.model import Condition, DeckArea, DeckItem, Hold, HoldLoad, LoadLine, MassItem
from deckload.core.stability import evaluate
from vessel_factories import barge_at

SUMMER_M = 2.0
TROPICAL_M = SUMMER_M + SUMMER_M / 48.0
"""ICLL Annex I reg. 40(3): the tropical freeboard is the summer freeboard less 1/48 of the summer
draft, so the tropical mark stands T_s/48 above the summer mark (regulation number from memory)."""


def _barge_at_draft(draft_m: float, marks: tuple[LoadLine, ...], load_line: str):
    """The barge at a midships draft in sea water: Δ = 1.025·40·10·T (checks.md §1.1), G over midships."""
    v, _ = barge_at(draft_m, 3.0)
    return dataclasses.replace(v, load_lines=marks), Condition(load_line=load_line)


def _load_line_warnings(r):
    return [w for w in r.warnings if w.code == "load-line"]


def test_the_condition_chooses_the_mark():
    """At T = 2.020 m in sea water she is 20 mm over the summer mark (2.000 m) and 21.7 mm under the
    tropical one (2.000 + 2.000/48 = 2.04167 m): loaded to tropical marks she is within them, to
    summer marks she is over, and the warning names the summer mark and its draft."""
    marks = (LoadLine("summer", SUMMER_M), LoadLine("tropical", TROPICAL_M))
    r = evaluate(*_barge_at_draft(2.02, marks, "tropical"))
    assert r.draft_mean_m == pytest.approx(2.02, abs=1e-9)
    assert _load_line_warnings(r) == []
    assert r.load_line_margin_m == pytest.approx(TROPICAL_M - 2.02, abs=1e-9)
    (w,) = _load_line_warnings(evaluate(*_barge_at_draft(2.02, marks, "summer")))
    assert w.severity == "danger"
    assert w.message == ("midships draft 2.020 m is over the summer load line "
                         "(2.000 m allowed in water of 1.025 t/m³)")


def test_a_mark_the_vessel_does_not_have_falls_back_to_summer():
    """A condition loaded to 'winter' on a vessel whose profile gives only the summer mark is held to
    the summer mark (deckload's rule, stability._allowed_draft): at 2.020 m she is warned."""
    marks = (LoadLine("summer", SUMMER_M),)
    r = evaluate(*_barge_at_draft(2.02, marks, "winter"))
    (w,) = _load_line_warnings(r)
    assert "over the summer load line (2.000 m allowed" in w.message
    assert r.load_line_margin_m == pytest.approx(SUMMER_M - 2.02, abs=1e-9)


def test_over_the_tropical_mark_names_it():
    """At T = 2.050 m she is 8.3 mm over the tropical mark 2.04167 m (the margin is negative)."""
    marks = (LoadLine("summer", SUMMER_M), LoadLine("tropical", TROPICAL_M))
    r = evaluate(*_barge_at_draft(2.05, marks, "tropical"))
    (w,) = _load_line_warnings(r)
    assert w.message == ("midships draft 2.050 m is over the tropical load line "
                         "(2.042 m allowed in water of 1.025 t/m³)")
    assert r.load_line_margin_m == pytest.approx(TROPICAL_M - 2.05, abs=1e-9)


def test_summer_mark_off_the_hydrostatic_table():
    """A summer mark at 3.60 m on tables that end at 3.50 m (vessel_factories.BARGE_DRAFTS_M): the
    permitted draft cannot be worked (FWA needs Δ and TPC at the summer draft, standards.md §6.1), so
    she is told so, and no margin is given."""
    r = evaluate(*_barge_at_draft(2.0, (LoadLine("summer", 3.6),), "summer"))
    (w,) = [w for w in r.warnings if w.code == "load-line-range"]
    assert (w.message, w.severity) == ("summer load line lies outside the hydrostatic table", "caution")
    assert r.load_line_margin_m is None


# ----------------------------------------------------------------------------------- deck and hold loads

DECK = DeckArea("D1", "Main deck", area_m2=100.0, lcg_m=20.0, deck_height_m=4.0, max_load_t_m2=1.5)
HOLD = Hold("H1", "Hold 1", capacity_m3=500.0, lcg_m=20.0, vcg_m=2.0, max_mass_t=200.0)


def _loaded(deck_items=(), holds=()):
    """The barge, lightship 410 t (T = 1.0 m, checks.md §1.1), with one deck area and one hold."""
    v, _ = barge_at(1.0, 3.0)
    v = dataclasses.replace(v, deck_areas=(DECK,), holds=(HOLD,))
    return evaluate(v, Condition(deck_items=tuple(deck_items), holds=tuple(holds)))


def _codes(r, code):
    return [(w.message, w.severity) for w in r.warnings if w.code == code]


def test_deck_load_over_the_local_and_the_mean_limit():
    """Local load = mass/footprint, mean load = Σmass/area (common practice for deck strength).
    Crate 30 t on 10 m² = 3.00 t/m² > 1.50: local warning.  Plates 130 t on 100 m² = 1.30: locally
    within.  On the area 160 t / 100 m² = 1.60 t/m² > 1.50: mean warning.  A 50 t item stowed on no
    area counts on none."""
    r = _loaded(deck_items=(  # the item on no area first: those after it still count
        DeckItem("Boat", 50.0, 20.0, 5.0),
        DeckItem("Crate", 30.0, 20.0, 5.0, area_id="D1", footprint_m2=10.0),
        DeckItem("Plates", 130.0, 20.0, 4.5, area_id="D1", footprint_m2=100.0),
    ))
    assert _codes(r, "deck-load-local") == [("Crate: 3.00 t/m² on Main deck exceeds 1.50 t/m²", "danger")]
    assert _codes(r, "deck-load") == [("Main deck: 160.0 t over 100 m² averages 1.60 t/m², above 1.50 t/m²",
                                       "danger")]


def test_deck_load_exactly_at_the_limit_is_within_it():
    """15 t on 10 m² = 1.50 t/m² and 150 t over 100 m² = 1.50 t/m²: at the limit, not over it."""
    r = _loaded(deck_items=(
        DeckItem("Crate", 15.0, 20.0, 5.0, area_id="D1", footprint_m2=10.0),
        DeckItem("Plates", 135.0, 20.0, 4.5, area_id="D1", footprint_m2=100.0),
    ))
    assert _codes(r, "deck-load-local") == [] and _codes(r, "deck-load") == []


def test_hold_over_its_limit_and_at_it():
    r = _loaded(holds=(HoldLoad("H1", 250.0),))
    assert _codes(r, "hold-load") == [("hold H1: 250.0 t exceeds its limit of 200.0 t", "danger")]
    assert _codes(_loaded(holds=(HoldLoad("H1", 200.0),)), "hold-load") == []


@pytest.mark.parametrize("condition, message", [
    (Condition(holds=(HoldLoad("H9", 10.0),)), "condition names hold 'H9', which the vessel does not have"),
    (Condition(deck_items=(DeckItem("Crate", 10.0, 20.0, 5.0, area_id="D9"),)),
     "deck item 'Crate' names deck area 'D9', which the vessel does not have"),
    (Condition(deck_items=(DeckItem("Crate", -1.0, 20.0, 5.0),)),
     "deck item 'Crate': mass -1.0 t is not a non-negative number"),
    (Condition(constants=(MassItem("Stores", float("nan"), 20.0, 5.0),)),
     "constant item 'Stores': mass nan t is not a non-negative number"),
])
def test_a_condition_that_does_not_fit_is_refused_by_name(condition, message):
    v, _ = barge_at(1.0, 3.0)
    v = dataclasses.replace(v, deck_areas=(DECK,), holds=(HOLD,))
    with pytest.raises(LoadingError) as e:
        evaluate(v, condition)
    assert str(e.value) == message


# ----------------------------------------------------------------------------------- criteria and list

def test_a_failed_criterion_is_worded_with_value_limit_and_source():
    """KG 4.9 m at T 2 m: GZ(30°) = KN(30°) − 4.9·sin30° = 2.58771 − 2.45 = 0.13771 m (checks.md §1.4),
    and GZ falls beyond 30° (test_reference_short_curve.py), so IS 2008 A 2.2.2 (0.20 m) fails."""
    v, c = barge_at(2.0, 4.9)
    r = evaluate(v, c)
    assert ("FAILED GZ at an angle of 30° or more: 0.138 m against 0.200 (IS Code 2008 Part A 2.2.2)",
            "danger") in _codes(r, "criterion-failed")


def test_a_list_to_port_is_named_port():
    """Wall-sided box (checks.md §1.2 case 1, derived there): y_B = B²·tanφ/(12T), z_B = T/2 + B²·tan²φ/(24T),
    so GZ = y_B·cosφ + z_B·sinφ − KG·sinφ − TCG·cosφ = sinφ·(GM + ½·BM·tan²φ) − TCG·cosφ, zero at the
    list: |TCG| = tanφ·(GM + ½·BM·tan²φ).  Barge T 2 m, KG 3 m: BM = 10²/(12·2) = 4.1667, GM = 2.1667 m
    (checks.md §1.1); for 3.0° to port TCG = −0.052408·(2.1667 + 0.005725) = −0.11385 m.  The box is
    wall-sided up to the deck-edge angle atan(2/5) = 21.8°, far beyond 3°."""
    bm = 100.0 / 24.0
    gm = 1.0 + bm - 3.0
    t = math.tan(math.radians(3.0))
    v, c = barge_at(2.0, 3.0, lightship_tcg_m=-t * (gm + 0.5 * bm * t * t))
    r = evaluate(v, c)
    assert r.list_deg == pytest.approx(-3.0, abs=0.05)  # the 0.1° grid of the GZ curve
    assert _codes(r, "list") == [("list 3.0° to port exceeds 2°", "caution")]


def test_fwa_for_any_mark_is_the_summer_one():
    """ICLL (standards.md §6.1): FWA = Δ/(4·TPC) mm with Δ and TPC at the summer draft.  Summer 2.000 m:
    Δ = 1.025·400·2 = 820 t, TPC = 1.025·400/100 = 4.1 t/cm, FWA = 820/16.4 = 50.0 mm (checks.md §1.1).
    Loaded to tropical marks in fresh water the allowed draft is T_trop + FWA·(1.025 − 1.000)/0.025 =
    2.04167 + 0.050 m.  (FWA worked at the tropical draft instead would be 837.08/16.4 = 51.04 mm, 1 mm
    more: the margin below tells them apart.)"""
    marks = (LoadLine("summer", SUMMER_M), LoadLine("tropical", TROPICAL_M))
    v, _ = _barge_at_draft(2.0, marks, "tropical")
    r = evaluate(v, Condition(load_line="tropical", water_density_t_m3=1.000))
    assert r.load_line_margin_m == pytest.approx(TROPICAL_M + 0.050 - r.draft_mean_m, abs=1e-6)
    assert r.draft_mean_m == pytest.approx(820.0 / 400.0, abs=1e-9)  # Δ/(ρ·L·B) in fresh water


def test_without_a_summer_mark_the_chosen_mark_stands_for_it():
    """A profile giving only a tropical mark: the FWA is worked at that mark (deckload's rule,
    stability._allowed_draft); in sea water the allowed draft is the mark itself."""
    r = evaluate(*_barge_at_draft(2.05, (LoadLine("tropical", TROPICAL_M),), "tropical"))
    assert r.load_line_margin_m == pytest.approx(TROPICAL_M - 2.05, abs=1e-9)
    (w,) = _load_line_warnings(r)
    assert "over the tropical load line (2.042 m allowed" in w.message


def test_a_tank_in_its_worst_band_is_named_with_the_band():
    """A tank given without its transfer geometry has the worst band 40–60 % (the model's default,
    FreeSurfaceSettings.default_worst_band_pct, deckload's own choice); DB1P at 50 %
    is in it and the caution names the tank, its fill and the band.  At 30 % it is merely slack."""
    from deckload.core.model import TankFill
    from vessel_factories import barge_tanks

    v, _ = barge_at(1.5, 3.0, tanks=barge_tanks())
    assert v.tank("DB1P").worst_band_pct == (40.0, 60.0)  # the premise: the default band
    r = evaluate(v, Condition(tanks=(TankFill("DB1P", "percent", 50.0),)))
    name = v.tank("DB1P").name
    assert _codes(r, "slack-worst-band") == [
        (f"DB1P ({name}) at 50 % is in its worst free-surface band 40–60 %", "caution")]
    (t,) = [t for t in r.tanks if t.id == "DB1P"]
    assert t.capacity_m3 == pytest.approx(8.0 * 4.5 * 0.8, rel=1e-12)  # the box tank's l·b·h (barge_tanks)
    assert t.volume_m3 == pytest.approx(0.5 * 28.8, rel=1e-12)
    r30 = evaluate(v, Condition(tanks=(TankFill("DB1P", "percent", 30.0),)))
    assert _codes(r30, "slack-worst-band") == []


def test_exactly_at_the_mark_is_not_over_it():
    """At T = 2.000 m (Δ 820 t, a table row, even keel) she floats exactly at the summer mark in sea
    water: allowed, margin nil, no warning (ICLL: the mark is the limit, not beyond it)."""
    r = evaluate(*_barge_at_draft(2.0, (LoadLine("summer", SUMMER_M),), "summer"))
    assert r.draft_mean_m == 2.0 and r.load_line_margin_m == 0.0  # a table row: exact in floating point
    assert _load_line_warnings(r) == []


def test_the_items_are_listed_by_group_id_and_name():
    """The result lists every weight item as the report prints it: lightship first, then holds, deck
    items (numbered deck1…) and constants (const1…), each with the mass and centre it was given."""
    v, _ = barge_at(1.0, 3.0)
    v = dataclasses.replace(v, deck_areas=(DECK,), holds=(HOLD,))
    r = evaluate(v, Condition(holds=(HoldLoad("H1", 100.0),),
                              deck_items=(DeckItem("Crate", 10.0, 18.0, 5.0, area_id="D1"),
                                          DeckItem("Boat", 5.0, 30.0, 5.5)),
                              constants=(MassItem("Stores", 7.0, 12.0, 3.5, -0.5),)))
    assert [(i.group, i.id, i.name, i.mass_t, i.lcg_m, i.vcg_m, i.tcg_m) for i in r.items] == [
        ("lightship", "lightship", "Lightship", 410.0, 20.0, 3.0, 0.0),
        ("hold", "H1", "Hold 1", 100.0, 20.0, 2.0, 0.0),
        ("deck", "deck1", "Crate", 10.0, 18.0, 5.0, 0.0),
        ("deck", "deck2", "Boat", 5.0, 30.0, 5.5, 0.0),
        ("constant", "const1", "Stores", 7.0, 12.0, 3.5, -0.5),
    ]
