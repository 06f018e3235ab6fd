"""One sign convention on screens: list and trim as magnitudes with their side (P/S, A/F), drafts
in one order (aft, mid, fwd) in the transfer preview and the log's entry details."""

from __future__ import annotations

from deckload.io import paths
from deckload.core.model import TankFill
from deckload.core.stability import evaluate
from deckload.io.profiles import load_condition
from deckload.ui.dialogs import preview_lines
from demo_vessels import demo_vessel


def test_preview_shows_sides_not_signs_and_drafts_aft_mid_fwd():
    v = demo_vessel()
    c = load_condition(paths.DEMO_CONDITIONS["departure"], v)
    before = evaluate(v, c)
    after = evaluate(v, c.with_tank(TankFill("WB1S", "percent", 60.0)))
    assert before.list_deg < 0 < after.list_deg  # port before, starboard after
    lines = [ln.plain for ln in preview_lines(before, after, None)]
    lst = next(ln for ln in lines if ln.startswith("List"))
    assert f"{abs(before.list_deg):.1f} P" in lst and f"{after.list_deg:.1f} S" in lst
    assert lst.startswith("List, °")  # the unit with the label, never after a side letter
    assert f"{after.list_deg - before.list_deg:.2f} to S" in lst  # moved towards starboard
    assert "-" not in lst
    trim = next(ln for ln in lines if ln.startswith("Trim"))
    assert trim.startswith("Trim, m") and "A" in trim and "-" not in trim
    drafts = [ln.split()[1] for ln in lines if ln.startswith("Draft")]
    assert drafts == ["aft", "mid", "fwd"]


def test_a_change_smaller_than_the_shown_precision_is_not_shown_as_a_contradiction():
    """List 0.12° P before and 0.07° P after both read "0.1 P"; the change, 0.05° towards
    starboard, reads "0.05 to S" (one more decimal), not "0.1 S" beside two port readings."""
    import dataclasses

    v = demo_vessel()
    r = evaluate(v, load_condition(paths.DEMO_CONDITIONS["departure"], v))
    before = dataclasses.replace(r, list_deg=-0.12)
    after = dataclasses.replace(r, list_deg=-0.07)
    lst = next(ln.plain for ln in preview_lines(before, after, None) if ln.plain.startswith("List"))
    assert lst.split()[2:] == ["0.1", "P", "0.1", "P", "0.05", "to", "S"]


def test_log_details_use_sides_and_draft_order():
    from deckload.report.verdict_format import sided as _sided

    assert _sided(-0.26, 1, "°", "S", "P") == "0.3° P"
    assert _sided(0.313, 3, " m", "by the stern", "by the head") == "0.313 m by the stern"
    assert _sided(0.0, 1, "°", "S", "P") == "0.0°"
    assert _sided(None, 1, "°", "S", "P") == "—"
