"""The dangers of the warnings stage at their edges: GM fluid exactly zero, and a GZ curve that never
rises above zero.  Box barge 40 × 10 × 4 m at T = 2 m (Δ = 820 t): KM = KB + BM = T/2 + B²/(12·T)
= 1 + 100/24 = 5.1667 m (checks.md §1.1)."""

from __future__ import annotations

import numpy as np
import pytest

from deckload.core.stability import evaluate
from vessel_factories import barge_at


def test_gm_exactly_zero_is_a_danger():
    """KG set to the table's KM at the T = 2 m row (no interpolation, so GM fluid is 0.0 exactly): GM
    is not positive, she has no initial stability (common practice; IS 2008 Part A 2.2.4 asks
    GM0 ≥ 0.15 m), and the officer is warned of a loll, as for any GM ≤ 0."""
    v, _ = barge_at(2.0, 3.0)
    row = int(np.flatnonzero(v.hydrostatics.draft_m == 2.0)[0])
    km = float(v.hydrostatics.kmt_m[row])
    assert abs(km - (1.0 + 100.0 / 24.0)) < 1e-9
    v0, c0 = barge_at(2.0, km)
    r = evaluate(v0, c0)
    assert r.gm_fluid_m == 0.0
    loll = [w for w in r.warnings if w.code == "negative-gm"]
    assert len(loll) == 1 and loll[0].severity == "danger"
    assert loll[0].message.startswith("GM fluid 0.000 m is not positive: she lolls, about ")


def test_gz_never_positive_is_a_danger():
    """KG 15 m, far above KM 5.17 m (GM = −9.83 m) and above the deck: the curve is below zero at every
    whole degree past upright (checked first, as the premise), so there is no position of
    equilibrium on it: a danger."""
    v, c = barge_at(2.0, 15.0)
    r = evaluate(v, c)
    assert max(r.gz_m[1:]) < 0.0
    notes = [(w.message, w.severity) for w in r.warnings if w.code == "no-equilibrium"]
    assert notes == [("GZ never becomes positive heeling to starboard up to 90°: no position of equilibrium",
                      "danger")]
    assert r.list_deg is None and r.vanishing_angle_deg is None


def test_actual_free_surface_rule_is_a_caution():
    """Rule 'actual' (IS 2008 B 3.1.6, liquid transfers) counts slack tanks at their actual levels only,
    so the allowance of B 3.1.3–3.1.4 for consumables is off: the officer is told so (a caution)."""
    from deckload.core.model import Condition

    v, c = barge_at(2.0, 3.0)
    r = evaluate(v, Condition(fs_rule="actual"))
    notes = [(w.message, w.severity) for w in r.warnings if w.code == "fs-rule-actual"]
    assert notes == [("free surface at actual levels (IS 2008 B 3.1.6): the B 3.1.3–3.1.4 allowance "
                      "for consumables is off", "caution")]
    assert not [w for w in evaluate(v, Condition(fs_rule="is2008")).warnings if w.code == "fs-rule-actual"]


def test_an_entry_typed_twice_is_a_caution_and_two_alike_only_by_name_are_not():
    """A constant or deck item alike in every field to another is counted twice (as the brief's
    'a typing error passes unnoticed' asks to catch, it is named); two crates of one name at two
    places are two crates."""
    import dataclasses

    from deckload.core.model import DeckItem, MassItem

    v, c = barge_at(2.0, 3.0)
    crew = MassItem("Crew", 1.2, 20.0, 6.0)
    crate = DeckItem("Crate", 5.0, 10.0, 4.5, 0.0)
    twice = dataclasses.replace(c, constants=(crew, crew), deck_items=(crate, dataclasses.replace(crate, lcg_m=12.0)))
    r = evaluate(v, twice)
    dup = [w for w in r.warnings if w.code == "duplicate-entry"]
    assert [(w.message, w.severity) for w in dup] == [
        ("two constants “Crew” alike in every field (1.2 t at the same place): both are counted; entered twice?",
         "caution")]
    assert r.displacement_t == pytest.approx(evaluate(v, c).displacement_t + 2 * 1.2 + 2 * 5.0)


def test_a_criterion_failed_by_less_than_the_printed_decimals_says_by_how_much():
    """GM fluid 0.15 m less 1e-5 m against IS 2008 A 2.2.4's 0.15 m: it fails (beyond round-off), and
    the warning writes value and limit to as many digits as tell them apart, never "0.150 against
    0.150"."""
    v, c = barge_at(2.0, 1.0 + 100.0 / 24.0 - 0.15 + 1e-5)
    r = evaluate(v, c)
    gm = next(w for w in r.warnings if w.code == "criterion-failed" and "GM" in w.message)
    assert "0.14999 m against 0.15 (" in gm.message, gm.message
