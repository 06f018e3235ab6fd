"""A limiting or downflooding curve printed against both draft and displacement (as booklet pages
often are) is read against the displacement, and each row's draft is checked against it through
the hydrostatic table (profiles.CURVE_DRAFT_AGREEMENT: UR L5's 2 % on a displacement, standards.md
§5.3, and 1 % for the curve's rounding of the draft); before, "give one, not both" refused a
correct page (found by an audit)."""

from __future__ import annotations

import numpy as np
import pytest

from deckload.io.profiles import ProfileError, load_profile, read_profile
from demo_vessels import copy_of_demo, demo_vessel


def _with_drafts(tmp_path, shift_row: int | None = None):
    v = demo_vessel()
    h = v.hydrostatics
    disp = np.asarray(v.downflooding.displacement_t, dtype=float)
    drafts = np.interp(disp, h.displacement_t, h.draft_m)  # the draft each displacement floats at
    if shift_row is not None:
        drafts[shift_row] += 0.5  # one row typed against another draft
    profile = copy_of_demo(tmp_path, "demo_islander")
    text = profile.read_text(encoding="utf-8")
    head = "[downflooding]\ndisplacement_t = ["
    assert text.count(head) == 1  # the premise: the demo's curve is against displacement
    cells = ", ".join(f"{d:.3f}" for d in drafts)
    profile.write_text(text.replace(head, f"[downflooding]\ndraft_m = [{cells}]\ndisplacement_t = ["), encoding="utf-8")
    return profile, v


def test_both_columns_are_read_against_the_displacement(tmp_path):
    profile, v = _with_drafts(tmp_path)
    read, reading = read_profile(profile)
    assert np.array_equal(read.downflooding.displacement_t, v.downflooding.displacement_t)
    assert np.array_equal(read.downflooding.value, v.downflooding.value)
    assert any("both columns given" in line for line in reading.conversions)


def test_a_row_whose_draft_disagrees_is_refused_naming_it(tmp_path):
    profile, _ = _with_drafts(tmp_path, shift_row=3)
    with pytest.raises(ProfileError, match=r"downflooding\.draft_m.*row 4: draft .* gives .* t by \[hydrostatics\]"):
        load_profile(profile)
