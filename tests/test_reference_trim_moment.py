"""MCT 1 cm from the actual GM_L and its refusal when G is not below M_L.

MCTC = Δ·GM_L/(100·LBP), GM_L = KM_L − KG (standards.md §6.3, textbook).  Box barge 40 × 10 m at
T = 2 m in sea water (tests/vessel_factories.box_barge): Δ = 1.025·40·10·2 = 820 t and
KM_L = KB + BM_L = T/2 + L²/(12·T) = 1 + 1600/24 = 67.6667 m (checks.md §1.1).
"""

from __future__ import annotations

import pytest

from deckload.core.hydrostatics import upright
from deckload.core.trim import BASIS_GML, TrimError, kml_at, trim_moment
from vessel_factories import RHO_SW, box_barge


def _barge_at_2m():
    v = box_barge(lightship_t=820.0)
    hy = upright(v, 820.0, RHO_SW)
    kml = kml_at(v, hy.table_displacement_t)
    assert kml == pytest.approx(1.0 + 1600.0 / 24.0, abs=1e-9)  # a table row: exact to round-off
    return v, hy, kml


def test_small_positive_gml_still_gives_a_trim_moment():
    """G half a metre below M_L: GM_L = 0.5 m, MCTC = 820·0.5/(100·40) = 0.1025 t·m/cm (small but a
    moment: the formula holds for any GM_L > 0)."""
    v, hy, kml = _barge_at_2m()
    mct = trim_moment(v, hy, 820.0, kml - 0.5)
    assert mct.basis == BASIS_GML
    # rel 1e-12: KM_L − (KM_L − 0.5) carries round-off of ~1e-14 m on 0.5 m.
    assert mct.mctc_tm_cm == pytest.approx(0.1025, rel=1e-12)
    # The moment carries the KM_L and GM_L it was worked from (TrimMoment's fields).
    assert mct.kml_m == pytest.approx(1.0 + 1600.0 / 24.0, abs=1e-9)
    assert mct.gml_m == pytest.approx(0.5, abs=1e-12)


def test_g_exactly_at_the_longitudinal_metacentre_is_refused():
    """GM_L = 0: no longitudinal stability, MCTC would be 0 and the trim M/(100·MCTC) infinite, so the
    trim is refused, naming KG and KM_L (deckload's wording, tests/test_reference_trimmed_box.py)."""
    v, hy, kml = _barge_at_2m()
    with pytest.raises(TrimError) as e:
        trim_moment(v, hy, 820.0, kml)
    assert str(e.value) == (f"KG fluid {kml:.6g} m is not below KML 67.667 m: "
                            "no longitudinal stability, no trim can be computed")
