"""A value that rounds to nought is printed without a sign: an area of −0.0002 m·rad read
"-0.000 ≥ 0.055 FAIL" on the criteria panel and in the alert (found by a real-terminal trial of a
lolling box barge)."""

from __future__ import annotations

from deckload.core.result import CriterionResult
from deckload.core.stability import evaluate
from deckload.report import verdict_format as vf
from deckload.ui.verdict import _criterion_line
from vessel_factories import barge_at


def test_fixed_drops_the_sign_of_nought_only():
    assert vf.fixed(-0.0002, 3) == "0.000" and vf.fixed(-0.0006, 3) == "-0.001"
    assert vf.fixed(0.0004, 3) == "0.000" and vf.fixed(-1.5, 1) == "-1.5"


def test_a_criterion_of_minus_nought_reads_nought_on_the_panel_and_in_the_report():
    c = CriterionResult("IS2008-A2.2.1-area-0-30", "Area under GZ, 0° to 30°", -0.0002, 0.055, "m·rad", ">=",
                        False, "IS Code 2008 Part A 2.2.1", set_id="IS2008-A2.2")
    assert vf.value_text(c) == "0.000"
    line = _criterion_line(c, stale=False, compact=False).plain
    assert "-0.000" not in line and " 0.000 ≥" in line


def test_the_alert_of_a_failed_criterion_has_no_signed_nought():
    """The checks.md §1 box at T 2 m: its area 30°–40° falls through nought as KG rises through about
    4.79 m (0.00375 m·rad at KG 4.75, −0.00125 at 4.80, evaluated).  At KG 4.7895 it is a hair below
    nought (the premise, checked) and fails; its alert prints it without a sign."""
    r = evaluate(*barge_at(2.0, 4.7895, heel_step_deg=1.0))
    c = {c.id: c for c in r.criteria}["IS2008-A2.2.1-area-30-40"]
    assert -0.0005 < c.value < 0.0 and not c.passed
    (alert,) = [w.message for w in r.warnings if "30° to 40°" in w.message]
    assert ": 0.000 m·rad against 0.030" in alert, alert
