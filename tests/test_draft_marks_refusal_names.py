"""Each of the six draft readings, when impossible, is refused under its own mark's name.

Rule and words: deckload's own (draft_marks.condition_from_readings: a reading must be a draft
between the keel and the depth plus keel; the refusal names the mark, the value and both limits).
The vessel and the plane readings are those of tests/test_draft_marks_corrections.py (the barge of
checks.md §1, depth 4 m, keel 0.015 m); one reading at a time is set to 4.5 m, above 4.015 m.
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.draft_marks import DraftMarksError, condition_from_readings
from test_draft_marks_corrections import readings, vessel
from vessel_factories import RHO_SW

FIELDS_AND_NAMES = [
    ("aft_port_m", "aft port"),
    ("aft_stbd_m", "aft starboard"),
    ("mid_port_m", "midships port"),
    ("mid_stbd_m", "midships starboard"),
    ("fwd_port_m", "forward port"),
    ("fwd_stbd_m", "forward starboard"),
]


@pytest.mark.parametrize("field, name", FIELDS_AND_NAMES)
def test_each_reading_is_refused_under_its_own_name(field, name):
    with pytest.raises(DraftMarksError) as e:
        condition_from_readings(vessel(), dataclasses.replace(readings(), **{field: 4.5}), RHO_SW)
    assert str(e.value) == (f"{name} reading 4.5 m: must be a draft between the keel (0.015 m) "
                            "and the depth plus keel (4.015 m)")
