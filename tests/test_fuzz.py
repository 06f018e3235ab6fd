"""A seeded fuzz run in the suite: mutated profiles, conditions and typed amounts (issue 12).

1,500 cases from a fixed seed (a few seconds): the run fails on any traceback, any non-finite
output, and any result for a physically impossible input.  The generator and the oracle are
in ``tests/fuzz_cases.py``; ``python tests/fuzz_by_hand.py`` runs 100,000 cases by hand.
"""

from __future__ import annotations

import random

import pytest

import fuzz_cases
from demo_vessels import demo_vessel


@pytest.mark.long
def test_a_seeded_fuzz_run_finds_no_traceback_no_non_finite_output_and_no_impossible_result():
    tally = fuzz_cases.run(1500, seed=20261202)
    assert tally.cases == 1500
    assert tally.failures == 0, tally.summary() + "\n" + "\n".join(map(str, tally.examples))
    # the run exercised both sides: inputs refused and results accepted, of every kind
    assert tally.accepted >= 100 and tally.refused >= 500
    assert min(tally.by_kind.values()) >= 150


def test_the_oracle_catches_what_it_is_meant_to_catch():
    """The oracle is not vacuous: an impossible item and an impossible result are flagged."""
    from deckload.core import model as m
    from deckload.core.stability import evaluate
    from deckload.io.paths import DEMO_CONDITIONS
    from deckload.io.profiles import load_condition

    v = demo_vessel()
    c = m.Condition(constants=(m.MassItem("far", 10.0, 1e6, 5.0),))
    assert "x = 1000000.0" in fuzz_cases.impossible_input(v, c)
    r = evaluate(v, load_condition(DEMO_CONDITIONS["departure"], v))
    import dataclasses

    assert fuzz_cases.impossible_result(v, r) is None
    assert "draft_aft_m" in fuzz_cases.impossible_result(v, dataclasses.replace(r, draft_aft_m=-5300.0))
    assert "trim" in fuzz_cases.impossible_result(v, dataclasses.replace(r, trim_m=12392.0))
    # and the mutator does change its input
    rng = random.Random(1)
    assert any(fuzz_cases.mutate(fuzz_cases.BARGE_TEXT, rng) != fuzz_cases.BARGE_TEXT for _ in range(5))
