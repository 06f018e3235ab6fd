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
    assert f"{after.list_deg - before.list_deg:.1f} S" in lst  # moved towards starboard
    assert "-" not in lst
    trim = next(ln for ln in lines if ln.startswith("Trim"))
    assert "A" in trim and "-" not in trim.split("Trim")[1].split("m")[0]
    drafts = [ln.split()[1] for ln in lines if ln.startswith("Draft")]
    assert drafts == ["aft", "mid", "fwd"]


def test_log_details_use_sides_and_draft_order():
    from deckload.ui.log_screen import _sided

    assert _sided(-0.26, 1, "°", "S", "P") == "0.3° P"
    assert _sided(0.313, 3, " m", "by the stern", "by the head") == "0.313 m by the stern"
    assert _sided(0.0, 1, "°", "S", "P") == "0.0°"
    assert _sided(None, 1, "°", "S", "P") == "—"
