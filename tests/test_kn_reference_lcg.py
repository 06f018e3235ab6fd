"""Free-trim KN are made for one LCG: a caution when G is far from it (deckload's own threshold).

The threshold (1 % of LBP, :data:`deckload.core.trim.KN_REFERENCE_FRACTION`) is a choice of
this project, not a standard; its size on the demo hull is in the docstring of that constant.
"""

from __future__ import annotations

import dataclasses

import pytest

from deckload.core.model import Condition
from deckload.core.stability import evaluate
from deckload.io.profiles import ProfileError, parse_profile
from deckload.io.paths import DEMO_PROFILE
from vessel_factories import box_barge


def _barge_with_reference(lcg_m: float, reference_m: float | None, basis: str = "free trim"):
    v = box_barge(lightship_lcg_m=lcg_m)
    cc = dataclasses.replace(v.cross_curves, reference_lcg_m=reference_m, trim_basis=basis)
    return dataclasses.replace(v, cross_curves=cc)


@pytest.mark.parametrize("lcg_m, warned", [(20.0, False), (20.39, False), (19.61, False), (20.41, True), (18.4, True)])
def test_caution_beyond_one_percent_of_lbp(lcg_m, warned):
    """LBP 40 m: G more than 0.40 m from the reference LCG 20 m draws the caution, naming both."""
    r = evaluate(_barge_with_reference(lcg_m, 20.0), Condition())
    notes = [w for w in r.warnings if w.code == "kn-reference-lcg"]
    assert bool(notes) is warned
    if warned:
        assert notes[0].severity == "caution"
        where = "forward of" if lcg_m > 20.0 else "abaft"
        # the size is that of the trim G's offset gives her: 2.5 cm per 1 % of LBP (core/trim.py), at least 1 cm
        size = max(1, round(2.5 * 100 * abs(r.trim_m) / 40.0))
        assert notes[0].message == (f"G is {abs(lcg_m - 20.0):.2f} m {where} the KN's free-trim LCG 20.00 m: "
                                    f"GZ may be off by up to about {size} cm")


def test_no_caution_for_even_keel_curves_or_an_unstated_reference():
    assert not any(w.code == "kn-reference-lcg" for w in evaluate(_barge_with_reference(15.0, 20.0, "even keel"),
                                                                    Condition()).warnings)
    assert not any(w.code == "kn-reference-lcg" for w in evaluate(_barge_with_reference(15.0, None), Condition()).warnings)


def test_profile_key_reference_lcg_m():
    """The demo profile states the LCG its free-trim curves were made for (its lightship LCG); a
    non-number there is a problem naming the key."""
    text = DEMO_PROFILE.read_text(encoding="utf-8")
    assert parse_profile(text, str(DEMO_PROFILE)).cross_curves.reference_lcg_m == pytest.approx(17.4)
    bad = text.replace("reference_lcg_m = 17.4", 'reference_lcg_m = "aft"')
    with pytest.raises(ProfileError) as e:
        parse_profile(bad, str(DEMO_PROFILE))
    assert "cross_curves.reference_lcg_m" in str(e.value)


def test_no_caution_where_trimmed_kn_tables_cover_the_trim():
    """KN tabulated at several trims covering hers are made for her own trim, so the free-trim
    reference LCG does not apply (core/trimmed_tables.covers_kn): the box of
    tests/trimmed_box.py with its even-keel set relabelled 'free trim' for an LCG 5 m
    forward of hers draws the caution without the trimmed sets and none with them.  Her trim,
    1.49 m (3.7 % of LBP), lies beyond what even-keel KN support (1.5 %, core/trim.py): without the
    sets the criteria read off the GZ curve are not assessable, which says more than the caution
    (it is left out); with them they are assessed."""
    from trimmed_box import L, box

    v = box(5.0, 3.0, 0.98)
    cc = dataclasses.replace(v.cross_curves, trim_basis="free trim", reference_lcg_m=L / 2 - 0.98 + 5.0)
    with_sets = dataclasses.replace(v, cross_curves=cc)
    without = dataclasses.replace(with_sets, trimmed=None)
    r_without, r_with = evaluate(without, Condition()), evaluate(with_sets, Condition())
    assert "kn-reference-lcg" not in [w.code for w in r_without.warnings]
    assert [c.id for c in r_without.criteria if not c.assessed] == [
        c.id for c in r_without.criteria if not c.id.endswith("-gm0")]
    assert "kn-reference-lcg" not in [w.code for w in r_with.warnings]
    assert all(c.assessed for c in r_with.criteria)
    short = dataclasses.replace(without, lightship=dataclasses.replace(without.lightship, lcg_m=L / 2 - 0.3))
    assert [w.code for w in evaluate(short, Condition()).warnings].count("kn-reference-lcg") == 1
