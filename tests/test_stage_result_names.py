"""The result carries the names the officer gave: the report heads every page with them
(report/condition_report.py), so a result printed under another vessel's or condition's name would
put the wrong numbers under the right title."""

from __future__ import annotations

import dataclasses

from deckload.core.model import Condition
from deckload.core.stability import evaluate
from vessel_factories import barge_at


def test_result_is_titled_with_the_vessel_and_condition_names():
    """Invented names, typed by the user: the result repeats them exactly."""
    v, c = barge_at(2.0, 3.0)
    v = dataclasses.replace(v, particulars=dataclasses.replace(v.particulars, name="Tern Example"))
    r = evaluate(v, dataclasses.replace(c, name="Departure, ballast 3"))
    assert (r.vessel_name, r.condition_name) == ("Tern Example", "Departure, ballast 3")
    assert evaluate(v, Condition()).condition_name == "Working condition"
