"""Readings at the draft marks are held to what a hull afloat can show (deckload.core.draft_marks).

The forward calculation refuses end drafts outside 0 … the table's greatest draft
(deckload.core.bounds.checked_result); the reverse refuses readings that give a moulded draft at
the AP, midships or the FP outside that range, and a hog or sag beyond LBP/100 (a misread mark:
MAX_DEFLECTION_FRACTION, common practice, from memory).  Arithmetic of the drafts: the module
docstring's steps 1–3 (draft-survey practice, from memory) on the Demo Islander: marks at x = 1,
19 and 36 m, LBP 38 m, keel 0.012 m, table 1.0–3.9 m.
"""

from __future__ import annotations

import pytest

from deckload.cli.main import main
from deckload.core.draft_marks import (
    DraftMarksError,
    DraftsBeyondTablesError,
    MarkReadings,
    condition_from_readings,
)
from deckload.core.tables import OutOfRangeError
from demo_vessels import demo_vessel

RHO = 1.025


def level(aft: float, mid: float, fwd: float) -> MarkReadings:
    return MarkReadings(aft, aft, mid, mid, fwd, fwd)


@pytest.mark.parametrize("args, said", [
    (["--aft", "4.5", "4.5", "--mid", "3.9", "3.9", "--fwd", "0.02", "0.02"], "at the AP of 4.616 m"),
    (["--aft", "4.5", "4.5", "--mid", "0.02", "0.02", "--fwd", "4.5", "4.5"], "at the AP of 4.488 m"),
])
def test_the_audits_readings_are_refused_naming_them(args, said, capsys):
    """Before: exit 0, Δ 1133 t with a moulded FP draft of −0.248 m and a 1.704 m sag; and a 4.48 m
    hog on a 38 m hull, Δ 278.9 t."""
    assert main(["marks", "demo", "departure", *args]) == 1
    err = capsys.readouterr().err
    assert f"moulded draft {said}, outside 0–3.9 m" in err
    a, m, f = args[1], args[4], args[7]
    assert f"aft {a}/{a}, midships {m}/{m}, forward {f}/{f} m" in err
    assert "Traceback" not in err


def test_a_draft_above_the_keel_at_an_end_is_refused():
    """Aft 3.0 m at x = 1 and forward 0.05 m at x = 36, less the 0.012 m keel: slope −2.95/35 per m,
    so the FP (2 m beyond the forward marks) is at 0.038 − 2.95·2/35 = −0.131 m, the keel out of
    the water (derived), though every reading lies between the keel and the depth."""
    v = demo_vessel()
    with pytest.raises(DraftsBeyondTablesError) as e:
        condition_from_readings(v, level(3.0, 1.9, 0.05), RHO)
    assert isinstance(e.value, OutOfRangeError) and isinstance(e.value, DraftMarksError)
    assert "moulded draft at the FP of -0.131 m, outside 0–3.9 m" in str(e.value)
    assert e.value.value == pytest.approx(0.038 - 2.95 * 2 / 35, abs=1e-12)


def test_a_deflection_beyond_lbp_over_100_is_refused_and_a_plausible_one_noted():
    """Ends 2.5 m, midships 2.0 m: a hog of 0.5 m > 38/100 = 0.38 m, refused; midships 2.2 m, a hog of
    0.3 m, is taken with the note that the quarter-mean allows for it only approximately; a sag
    of 0.3 m likewise."""
    v = demo_vessel()
    with pytest.raises(DraftMarksError) as e:
        condition_from_readings(v, level(2.5, 2.0, 2.5), RHO)
    assert str(e.value) == ("the readings (port/starboard) aft 2.5/2.5, midships 2/2, forward 2.5/2.5 m give "
                            "a hog of 0.500 m, more than LBP/100 = 0.380 m: a hull in service does not bend so "
                            "far; a mark is misread")
    with pytest.raises(DraftMarksError, match="a sag of 0.400 m"):
        condition_from_readings(v, level(2.0, 2.4, 2.0), RHO)
    o = condition_from_readings(v, level(2.5, 2.2, 2.5), RHO)
    assert o.deflection_m == pytest.approx(0.3, abs=1e-9)
    assert any(n.startswith("hogged 0.300 m: the quarter-mean") for n in o.notes)
    o = condition_from_readings(v, level(2.0, 2.3, 2.0), RHO)
    assert any(n.startswith("sagged 0.300 m") for n in o.notes)
