"""Look-up in tables at trims and the equilibrium trim they give (core/trimmed_tables.py), number by number.

The vessel is the trimmed box of tests/trimmed_box.py (L 40, B 8, D 10 m, tables at trims −2…+2 m
built from the closed forms DERIVED in its docstring: LCB(T, t) = L/2 − L·t/(12·T),
KB(T, t) = T/2 + t²/(24·T), LCF = L/2, TPC = ρ·L·B/100, BMt = B²/(12·T·cosψ),
BML = L²/(12·T·cos³ψ), KN(φ, t) = sinφ·[KB + (B²/(12·T))·(1 + tan²φ/2)], tanψ = t/L).

Expected values come from two facts:
* linear interpolation (standards.md §6.3: hydrostatics at the displacement and trim from tables by
  linear interpolation; common practice for booklet data, MSC.1/Circ.1229 4.5 in standards.md §5.2):
  between the tables at t₀ and t₁ the value at t is (1 − f)·y(t₀) + f·y(t₁), f = (t − t₀)/(t₁ − t₀),
  and a quantity linear in t (the box's LCB) is reproduced exactly;
* the box's closed forms above, and the trimming of a ship about her LCF at constant displacement
  (derived in the test that uses it).

Tolerances: 1e-9 where the expected value is the same arithmetic on the same table numbers
(round-off only); otherwise tied to the quantity and written beside the check.
"""

from __future__ import annotations

import dataclasses
import math
import re

import numpy as np
import pytest

from deckload.core.model import frozen_array
from deckload.core.tables import OutOfRangeError
from deckload.core.trim import BASIS_GML, BASIS_TABLE, TrimError
from deckload.core.trimmed_tables import (
    TrimNotSettledError,
    draft_tolerance_m,
    equilibrium,
    hydro_at,
    kn_for,
    kn_row_at,
    table_state,
)
from trimmed_box import HEELS, B, L, RHO, box, exact_trim, hydro_at_trim, kb, kn_exact

ROUND_OFF = 1e-9
T5 = 5.0
DISP5 = RHO * L * B * T5  # 1640 t, a row of every table


def _cos(t: float) -> float:
    return math.cos(math.atan(t / L))


def _kmt(T: float, t: float) -> float:
    return kb(T, t) + B * B / (12 * T * _cos(t))


def _kml(T: float, t: float) -> float:
    return kb(T, t) + L * L / (12 * T * _cos(t) ** 3)


def _mctc_table(t: float) -> float:
    """MCTC = Δ·BML/(100·L) = ρ·B·L²/(1200·cos³ψ): the same at every draft (tests/trimmed_box.py)."""
    return RHO * B * L * L / (1200 * _cos(t) ** 3)


def _with_tables(v, change):
    """``v`` with ``change`` applied to every hydrostatic table, the even-keel one included."""
    tt = v.trimmed
    tables = tuple(change(t, h) for t, h in zip(tt.hydro_trim_m, tt.hydrostatics))
    k0 = list(tt.hydro_trim_m).index(0.0)
    return dataclasses.replace(v, hydrostatics=tables[k0], trimmed=dataclasses.replace(tt, hydrostatics=tables))


def _cut(table, rows: int):
    return dataclasses.replace(table, **{c: frozen_array(getattr(table, c)[:rows]) for c in table.columns()})


def _replace_hydro(v, trim: float, table):
    tt = v.trimmed
    k = list(tt.hydro_trim_m).index(trim)
    return dataclasses.replace(v, trimmed=dataclasses.replace(
        tt, hydrostatics=tt.hydrostatics[:k] + (table,) + tt.hydrostatics[k + 1:]))


def _replace_kn(v, trim: float, table):
    tt = v.trimmed
    k = list(tt.kn_trim_m).index(trim)
    return dataclasses.replace(v, trimmed=dataclasses.replace(
        tt, cross_curves=tt.cross_curves[:k] + (table,) + tt.cross_curves[k + 1:]))


@pytest.mark.parametrize("value_m, tol_m", [(3.0, 0.03), (-3.0, 0.03), (4.9, 0.049), (5.0, 0.05), (6.0, 0.05),
                                            (12.0, 0.05)])
def test_draft_tolerance_is_one_percent_and_never_more_than_five_cm(value_m, tol_m):
    """UR L5 / MSC.1/Circ.1229, standards.md §5.3 ("Trim & stability", draughts; "Hull form", KMt):
    1 % of the value, not more than 5 cm.  Exact but for the round-off of 0.01·x."""
    assert draft_tolerance_m(value_m) == pytest.approx(tol_m, rel=0, abs=1e-12)


def test_hydrostatics_between_two_tables_are_the_linear_blend_in_trim():
    """At T = 5 m (a row of every table) and t = 0.25 m (a quarter of the way from the 0 m to the
    +1 m table) every column is 0.75·y(0) + 0.25·y(1) of the closed forms (module docstring);
    LCB, linear in t, is the exact L/2 − L·0.25/(12·5)."""
    v = box(T5, 3.0, 0.98)
    row = hydro_at(v, v.trimmed, DISP5, 0.25)

    def blend(y):
        return 0.75 * y(0.0) + 0.25 * y(1.0)

    assert row.draft_mid_m == pytest.approx(T5, abs=ROUND_OFF)
    assert row.lcb_m == pytest.approx(L / 2 - L * 0.25 / (12 * T5), abs=ROUND_OFF)
    assert row.lcf_m == pytest.approx(L / 2, abs=ROUND_OFF)
    assert row.vcb_m == pytest.approx(T5 / 2 + 0.25 / (24 * T5), abs=ROUND_OFF)  # t² interpolated: 0.75·0 + 0.25·1
    assert row.kmt_m == pytest.approx(blend(lambda t: _kmt(T5, t)), abs=ROUND_OFF)
    assert row.tpc_t_cm == pytest.approx(RHO * L * B / 100, abs=ROUND_OFF)
    assert row.mctc_tm_cm == pytest.approx(blend(_mctc_table), abs=ROUND_OFF)
    assert row.kml_m == pytest.approx(blend(lambda t: _kml(T5, t)), abs=ROUND_OFF)


def test_hydrostatics_between_rows_and_between_tables():
    """T = 4.85 m lies 0.4 of the way from the 4.75 m row to the 5 m row (Δ linear in T), t = −0.75 m a
    quarter of the way from the −1 m to the 0 m table: LCB, linear in t, is
    L/2 − L·t/12·(0.6/4.75 + 0.4/5) (linear in Δ within each table, then in trim)."""
    v = box(T5, 3.0, 0.98)
    row = hydro_at(v, v.trimmed, RHO * L * B * 4.85, -0.75)
    assert row.lcb_m == pytest.approx(L / 2 + L * 0.75 / 12 * (0.6 / 4.75 + 0.4 / 5.0), abs=ROUND_OFF)
    assert row.draft_mid_m == pytest.approx(4.85, abs=ROUND_OFF)


@pytest.mark.parametrize("trim_m, table_m", [(3.0, 2.0), (2.0, 2.0), (-3.0, -2.0), (-2.0, -2.0), (1.0, 1.0)])
def test_at_or_beyond_a_table_its_own_numbers_are_used(trim_m, table_m):
    """Beyond the covered trims the end table is held (module docstring); at a tabulated trim that
    table is used as printed: KMt, KML and KB are its closed-form values at T = 5 m."""
    v = box(T5, 3.0, 0.98)
    row = hydro_at(v, v.trimmed, DISP5, trim_m)
    assert row.kmt_m == pytest.approx(_kmt(T5, table_m), abs=ROUND_OFF)
    assert row.kml_m == pytest.approx(_kml(T5, table_m), abs=ROUND_OFF)
    assert row.vcb_m == pytest.approx(kb(T5, table_m), abs=ROUND_OFF)
    assert row.lcb_m == pytest.approx(L / 2 - L * table_m / (12 * T5), abs=ROUND_OFF)


def test_at_a_tabulated_trim_the_next_table_is_not_needed():
    """At exactly +1 m only the +1 m table is read: the +2 m table, cut to drafts 4.0–4.75 m (its own
    grid, short of Δ = 1640 t), does not refuse the look-up.  The same for KN."""
    v = box(T5, 3.0, 0.98)
    v = _replace_hydro(v, 2.0, _cut(hydro_at_trim(2.0), 4))
    kn2 = v.trimmed.cross_curves[list(v.trimmed.kn_trim_m).index(2.0)]
    v = _replace_kn(v, 2.0, dataclasses.replace(kn2, displacement_t=frozen_array(kn2.displacement_t[:2]),
                                                 kn_m=frozen_array(kn2.kn_m[:2])))
    assert hydro_at(v, v.trimmed, DISP5, 1.0).kmt_m == pytest.approx(_kmt(T5, 1.0), abs=ROUND_OFF)
    row = kn_row_at(v.trimmed, DISP5, 1.0)
    assert np.allclose(row, [kn_exact(T5, 1.0, h) for h in HEELS], rtol=0, atol=ROUND_OFF)


def test_a_table_that_does_not_reach_the_displacement_is_named():
    """Nothing is extrapolated in displacement: the +1 m table cut to 4.0–4.75 m refuses Δ = 1640 t
    between 0 and +1 m, and the refusal names that table, the value and its own range
    (ρ·L·B·T: 1312 t at 4.0 m, 1558 t at 4.75 m)."""
    v = _replace_hydro(box(T5, 3.0, 0.98), 1.0, _cut(hydro_at_trim(1.0), 4))
    with pytest.raises(OutOfRangeError) as e:
        hydro_at(v, v.trimmed, DISP5, 0.5)
    assert str(e.value) == ("displacement (hydrostatic table at trim +1.00 m, at table density) 1640 t is outside "
                            "the table range 1312–1558 t; deckload does not extrapolate")


def test_kn_table_that_does_not_reach_the_displacement_is_named():
    """The same for KN: the −1 m KN table cut to its rows 4.5 and 4.75 m (1476–1558 t) refuses
    Δ = 1640 t between −1 and 0 m, naming the table at −1 m and the range."""
    v = box(T5, 3.0, 0.98)
    kn = v.trimmed.cross_curves[list(v.trimmed.kn_trim_m).index(-1.0)]
    v = _replace_kn(v, -1.0, dataclasses.replace(kn, displacement_t=frozen_array(kn.displacement_t[:2]),
                                                  kn_m=frozen_array(kn.kn_m[:2])))
    with pytest.raises(OutOfRangeError) as e:
        kn_row_at(v.trimmed, DISP5, -0.5)
    assert str(e.value) == ("displacement (KN cross curves at trim -1.00 m, at table density) 1640 t is outside "
                            "the table range 1476–1558 t; deckload does not extrapolate")
    assert (e.value.value, e.value.low, e.value.high, e.value.unit) == (DISP5, pytest.approx(1476.0),
                                                                         pytest.approx(1558.0), "t")


def test_kn_between_two_tables_and_beyond_the_end():
    """KN at T = 5 m: at t = 1.25 m the blend 0.75·KN(1) + 0.25·KN(2) of the closed form; at 2.6 m and
    at −2.6 m the end tables' own rows (held beyond the ends, module docstring).  On the fine grid the
    spline in heel passes through the rows, so GZ's KN at the tabulated heels are the same numbers."""
    v = box(T5, 3.0, 0.98)
    blend = [0.75 * kn_exact(T5, 1.0, h) + 0.25 * kn_exact(T5, 2.0, h) for h in HEELS]
    assert np.allclose(kn_row_at(v.trimmed, DISP5, 1.25), blend, rtol=0, atol=ROUND_OFF)
    assert np.allclose(kn_row_at(v.trimmed, DISP5, 2.6), [kn_exact(T5, 2.0, h) for h in HEELS], rtol=0,
                       atol=ROUND_OFF)
    assert np.allclose(kn_row_at(v.trimmed, DISP5, -2.6), [kn_exact(T5, -2.0, h) for h in HEELS], rtol=0,
                       atol=ROUND_OFF)
    fine = kn_for(v, DISP5, 1.25)
    assert len(fine) == 401  # 0…40° on the 0.1° grid (core/gz.py): the table's last heel
    assert np.allclose(fine[::50], blend, rtol=0, atol=ROUND_OFF)


def test_two_tables_are_blended_too():
    """A set of two tables (even keel and +1 m) is interpolated like a longer one: at 0.25 m,
    0.75·y(0) + 0.25·y(1) for KN and for KMt (closed forms of tests/trimmed_box.py)."""
    v = box(T5, 3.0, 0.98, trims=(0.0, 1.0), kn_trims=(0.0, 1.0))
    blend = [0.75 * kn_exact(T5, 0.0, h) + 0.25 * kn_exact(T5, 1.0, h) for h in HEELS]
    assert np.allclose(kn_row_at(v.trimmed, DISP5, 0.25), blend, rtol=0, atol=ROUND_OFF)
    assert hydro_at(v, v.trimmed, DISP5, 0.25).kmt_m == pytest.approx(0.75 * _kmt(T5, 0.0) + 0.25 * _kmt(T5, 1.0),
                                                                      abs=ROUND_OFF)


def test_kn_for_without_tables_at_trims_is_the_even_keel_kn():
    """No tables at trims: the even-keel KN at the displacement whatever the trim (KN(φ, 0))."""
    v = dataclasses.replace(box(T5, 3.0, 0.98), trimmed=None)
    assert np.allclose(kn_for(v, DISP5, 1.5)[::50], [kn_exact(T5, 0.0, h) for h in HEELS], rtol=0, atol=ROUND_OFF)


def test_table_without_kb_takes_the_even_keel_kb_on_its_own_grid():
    """A table at a trim may leave out vcb_m (io/profiles.py: the even-keel table must then give it):
    the even-keel KB at the same displacement is used.  The +1 m table without KB and cut to four
    rows, the even-keel table whole: at T = 4.5 m (a row of both) KB is T/2 = 2.25 m exactly, at
    t = 1 m and blended at t = 0.5 m."""
    h1 = dataclasses.replace(_cut(hydro_at_trim(1.0), 4), vcb_m=None)
    v = _replace_hydro(box(T5, 3.0, 0.98), 1.0, h1)
    d = RHO * L * B * 4.5
    assert hydro_at(v, v.trimmed, d, 1.0).vcb_m == pytest.approx(4.5 / 2, abs=ROUND_OFF)
    assert hydro_at(v, v.trimmed, d, 0.5).vcb_m == pytest.approx(4.5 / 2, abs=ROUND_OFF)
    # between rows: 4.6 m, 0.4 of the way from 4.5 to 4.75 m; T/2 is linear in Δ, so exact
    assert hydro_at(v, v.trimmed, RHO * L * B * 4.6, 1.0).vcb_m == pytest.approx(2.3, abs=ROUND_OFF)


def test_table_without_kb_on_a_grid_of_its_own():
    """The +1 m table without KB on every other draft of the box (4.0, 4.5, … 6.0 m: its own
    displacement grid, not the even-keel one's): the even-keel KB is looked up on the even-keel grid,
    T/2 exactly at T = 4.5 m and 5.0 m (rows of both), and the blend at t = 0.5 m is the same.  With
    its own KB, the table's KB on its own grid."""
    h = hydro_at_trim(1.0)
    cols = {c: frozen_array(getattr(h, c)[::2]) for c in h.columns()}
    every_other = dataclasses.replace(h, **{**cols, "vcb_m": None})
    v = _replace_hydro(box(T5, 3.0, 0.98), 1.0, every_other)
    for T in (4.5, 5.0):
        d = RHO * L * B * T
        assert hydro_at(v, v.trimmed, d, 1.0).vcb_m == pytest.approx(T / 2, abs=ROUND_OFF)
        assert hydro_at(v, v.trimmed, d, 0.5).vcb_m == pytest.approx(T / 2, abs=ROUND_OFF)
    # with its own KB, that KB on its own grid: KB(T, 1) = T/2 + 1/(24·T) (tests/trimmed_box.py)
    v = _replace_hydro(box(T5, 3.0, 0.98), 1.0, dataclasses.replace(h, **cols))
    for T in (4.5, 5.0):
        assert hydro_at(v, v.trimmed, RHO * L * B * T, 1.0).vcb_m == pytest.approx(kb(T, 1.0), abs=ROUND_OFF)


def test_small_positive_gml_is_worked_not_refused():
    """KG fluid 28.7 m, below KML = 29.167 m at T = 5 m (tests/trimmed_box.py): GM_L = 0.467 m, small
    but positive, so the trim is worked.  G over the box's upright LCB (L/2): F(0) = 0, even keel."""
    eq = equilibrium(box(T5, 28.7, 0.0), DISP5, RHO, L / 2, 28.7)
    assert eq.trim_m == pytest.approx(0.0, abs=1e-12)
    assert eq.moment.gml_m == pytest.approx(_kml(T5, 0.0) - 28.7, abs=ROUND_OFF)


def test_tables_without_kml_give_no_kml():
    """Without KML the row says so (None), and the tabulated MCTC stands."""
    v = _with_tables(box(T5, 3.0, 0.98), lambda t, h: dataclasses.replace(h, kml_m=None))
    row = hydro_at(v, v.trimmed, DISP5, 0.5)
    assert row.kml_m is None
    assert row.mctc_tm_cm == pytest.approx(0.5 * (_mctc_table(0.0) + _mctc_table(1.0)), abs=ROUND_OFF)


def test_equilibrium_moment_from_kml_at_the_trim():
    """MCT 1 cm = Δ·(KML − KG fluid)/(100·LBP) (standards.md §6.3), KML blended in trim at the
    equilibrium trim between the +1 and +2 m tables (t ≈ 1.497 m, tests/trimmed_box.py); the trim
    within 2 mm of the exact root (the bound derived in test_reference_trimmed_tables.py)."""
    kg, a = 3.0, 0.98
    eq = equilibrium(box(T5, kg, a), DISP5, RHO, L / 2 - a, kg)
    t = eq.trim_m
    assert abs(t - exact_trim(T5, kg, a)) < 2e-3 and 1.0 < t < 2.0
    f = t - 1.0
    kml = (1 - f) * _kml(T5, 1.0) + f * _kml(T5, 2.0)
    assert eq.moment.basis == BASIS_GML
    assert eq.moment.kml_m == pytest.approx(kml, abs=ROUND_OFF)
    assert eq.moment.gml_m == pytest.approx(kml - kg, abs=ROUND_OFF)
    assert eq.moment.mctc_tm_cm == pytest.approx(DISP5 * (kml - kg) / (100 * L), rel=ROUND_OFF)


def test_equilibrium_in_fresh_water():
    """Δ = 1640 t in water of 1.000 t/m³ floats at volume 1640 m³: table-equivalent displacement
    Δ·1.025/1.000 = 1681 t, T = 1640/(1.000·L·B) = 5.125 m (a box's mean draft does not change with
    trim, and every table gives the same T at that Δ: exact but for round-off).  TPC = ρ·L·B/100 =
    3.2 t/cm in that water; the table's MCTC (at 1.025) is scaled by 1.000/1.025 (same hull, lighter
    water), blended in trim at the trim found (closed form: the same at every draft); the trim is
    the root of the box's balance at 5.125 m within 2 mm (bound of test_reference_trimmed_tables.py;
    5.125 m lies between rows, as T = 4.85 m there)."""
    kg, a = 3.0, 0.98
    eq = equilibrium(box(T5, kg, a), DISP5, 1.000, L / 2 - a, kg)
    T = DISP5 / (1.000 * L * B)
    assert eq.upright.table_displacement_t == pytest.approx(DISP5 * 1.025, rel=ROUND_OFF)
    assert eq.upright.draft_m == pytest.approx(T, abs=ROUND_OFF)
    assert eq.draft_mid_m == pytest.approx(T, abs=ROUND_OFF)
    assert eq.upright.tpc_t_cm == pytest.approx(1.000 * L * B / 100, rel=ROUND_OFF)
    t = eq.trim_m
    assert abs(t - exact_trim(T, kg, a)) < 2e-3 and 1.0 < t < 2.0
    f = t - 1.0
    assert eq.upright.mctc_tm_cm == pytest.approx(((1 - f) * _mctc_table(1.0) + f * _mctc_table(2.0)) / 1.025,
                                                  rel=ROUND_OFF)
    # MCT for the trim: Δ (actual)·GM_L/(100·L), KML at the table-equivalent Δ: 5.125 m is midway
    # between the 5.0 and 5.25 m rows (Δ linear in T), so each table's KML is the mean of those rows
    def kml_at(t):
        return 0.5 * (_kml(5.0, t) + _kml(5.25, t))

    kml = (1 - f) * kml_at(1.0) + f * kml_at(2.0)
    assert eq.moment.mctc_tm_cm == pytest.approx(DISP5 * (kml - kg) / (100 * L), rel=ROUND_OFF)


def test_equilibrium_without_kml_uses_the_tabulated_mctc_scaled_to_the_water():
    """No KML: MCT is the tables' MCTC at the trim found, times ρ/1.025 (basis "table")."""
    v = _with_tables(box(T5, 3.0, 0.98), lambda t, h: dataclasses.replace(h, kml_m=None))
    eq = equilibrium(v, DISP5, 1.000, L / 2 - 0.98, 3.0)
    f = eq.trim_m - 1.0
    assert 0.0 < f < 1.0
    assert eq.moment.basis == BASIS_TABLE and eq.moment.kml_m is None and eq.moment.gml_m is None
    assert eq.moment.mctc_tm_cm == pytest.approx(((1 - f) * _mctc_table(1.0) + f * _mctc_table(2.0)) / 1.025,
                                                 rel=ROUND_OFF)


def test_kg_above_kml_is_refused_with_both_numbers():
    """KML at T = 5 m, even keel (the first step's table) = KB + BML = 2.5 + 1600/60 = 29.167 m
    (tests/trimmed_box.py): KG fluid 40 m has no longitudinal stability: refused, naming both."""
    with pytest.raises(TrimError) as e:
        equilibrium(box(T5, 40.0, 0.0), DISP5, RHO, L / 2, 40.0)
    assert str(e.value) == ("KG fluid 40 m is not below KML 29.167 m: no longitudinal stability, "
                            "no trim can be computed")


def _lcf_moved(v, lcf_m: float):
    """Every table's LCF column set to ``lcf_m`` (invented: the equilibrium does not use LCF, F(t) of
    the module docstring has none; only the drafts do)."""
    return _with_tables(v, lambda t, h: dataclasses.replace(h, lcf_m=frozen_array(np.full_like(h.lcf_m, lcf_m))))


def test_draft_at_the_lcf_inside_the_covered_trims():
    """Drafts about an LCF 2 m abaft midships (x_F = 18 m).  Derived: with x from the AP and t by the
    stern, the keel line is d(x) = T_F + t·(x_F − x)/L, so the mean draft at midships is
    d(L/2) = T_F + t·(x_F − L/2)/L.  The tables give the mean draft at midships, T = 5 m at every trim,
    so T_F = 5 − t·(18 − 20)/40 = 5 + t/20; the trim is the box's own (LCF is not in the balance)."""
    v = _lcf_moved(box(T5, 3.0, 0.98), 18.0)
    eq = equilibrium(v, DISP5, RHO, L / 2 - 0.98, 3.0)
    assert abs(eq.trim_m - exact_trim(T5, 3.0, 0.98)) < 2e-3
    assert eq.draft_mid_m == pytest.approx(T5, abs=ROUND_OFF)
    assert eq.upright.draft_m == pytest.approx(T5 + eq.trim_m / 20, abs=ROUND_OFF)
    assert eq.upright.lcf_m == pytest.approx(18.0, abs=ROUND_OFF)
    # LCB at the trim found: linear in t, so the blend is the closed form L/2 − L·t/(12·T)
    assert eq.upright.lcb_m == pytest.approx(L / 2 - L * eq.trim_m / (12 * T5), abs=ROUND_OFF)
    assert eq.upright.kmt_m == pytest.approx((2 - eq.trim_m) * _kmt(T5, 1.0) + (eq.trim_m - 1) * _kmt(T5, 2.0),
                                             abs=ROUND_OFF)


def test_draft_at_the_lcf_beyond_the_covered_trims():
    """Tables −1…+1 m, G 1.25 m abaft: t ≈ 1.91 m, beyond the +1 m table.  Beyond the end she trims
    about that table's LCF at constant displacement (module docstring), so T_F stays the +1 m table's:
    5 + 1/20 = 5.05 m (previous test), and the mean draft at midships is 5.05 + t·(18 − 20)/40."""
    v = _lcf_moved(box(T5, 3.0, 1.25, trims=(-1.0, 0.0, 1.0), kn_trims=(-1.0, 0.0, 1.0)), 18.0)
    eq = equilibrium(v, DISP5, RHO, L / 2 - 1.25, 3.0)
    assert 1.8 < eq.trim_m < 2.0
    assert eq.upright.draft_m == pytest.approx(5.05, abs=ROUND_OFF)
    assert eq.draft_mid_m == pytest.approx(5.05 - eq.trim_m / 20, abs=ROUND_OFF)


def test_by_the_head_beyond_the_covered_trims():
    """G 1.25 m forward of midships with tables −1…+1 m: the mirror case, t ≈ −1.91 m (exact root
    of tests/trimmed_box.py; the box is symmetric fore and aft, so −t of the stern case), carried on
    from the −1 m table by the linear step: within UR L5's 1 %/5 cm (standards.md §5.3), as the
    stern case in test_reference_trimmed_tables.py; the draft at the LCF (midships) is T."""
    v = box(T5, 3.0, -1.25, trims=(-1.0, 0.0, 1.0), kn_trims=(-1.0, 0.0, 1.0))
    eq = equilibrium(v, DISP5, RHO, L / 2 + 1.25, 3.0)
    t = exact_trim(T5, 3.0, -1.25)
    assert -2.0 < t < -1.8
    assert abs(eq.trim_m - t) <= draft_tolerance_m(t)
    assert eq.upright.draft_m == pytest.approx(T5, abs=ROUND_OFF)
    assert eq.upright.kmt_m == pytest.approx(_kmt(T5, -1.0), abs=ROUND_OFF)  # the end table's, held


def test_iteration_that_cannot_settle_is_refused_with_its_last_two_estimates():
    """The tables' MCTC a tenth of the box's (a slipped decimal) and no KML: every step is ten times
    Newton's, so it overshoots.  Derived from the closed forms (T = 5 m, KG 3 m, LCG = L/2 − 0.98):
    F(t) = LCB(t) + (KG − KB(t))·t/L − LCG; from even keel F(0) = 0.98, the step
    1640·0.98/(100·MCTC(0)/10) ≈ 14.7 m lands beyond +2 m, so the +2 m table is held, giving
    t_a = 2 + 1640·F(2)/(100·MCTC(2)/10) ≈ −2.93 m, beyond −2 m, whose table gives
    t_b = −2 + 1640·F(−2)/(100·MCTC(−2)/10) ≈ +32.2 m, then t_a again: a two-cycle.  Step k ≥ 2 is
    t_a for even k, t_b for odd k, so after MAX_STEPS = 30 steps the last two estimates are t_b (29)
    and t_a (30), printed to 0.1 mm."""
    v = _with_tables(box(T5, 3.0, 0.98),
                     lambda t, h: dataclasses.replace(h, kml_m=None, mctc_tm_cm=frozen_array(h.mctc_tm_cm / 10)))
    lcg = L / 2 - 0.98

    def step_from(t_end):
        f = (L / 2 - L * t_end / (12 * T5)) + (3.0 - kb(T5, t_end)) * t_end / L - lcg
        return t_end + DISP5 * f / (100 * _mctc_table(t_end) / 10)

    t_a, t_b = step_from(2.0), step_from(-2.0)
    assert t_a < -2.0 and t_b > 2.0 and step_from(0.0) > 2.0  # the cycle derived above
    with pytest.raises(TrimNotSettledError) as e:
        equilibrium(v, DISP5, RHO, lcg, 3.0)
    msg = str(e.value)
    m = re.fullmatch(r"the trim did not settle within 30 steps of the trimmed tables \(last estimates "
                     r"([+-]\d+\.\d{4}) and ([+-]\d+\.\d{4}) m, tolerance 0\.1 mm\): the tables' LCB does not move "
                     r"aft as the trim by the stern grows, or their MCTC \(or KML\) is far too small; check "
                     r"\[\[hydrostatics_at_trim\]\] \(LCB, KML, MCTC\) against the booklet", msg)
    assert m, msg
    assert float(m.group(1)) == pytest.approx(t_b, abs=1e-4) and float(m.group(2)) == pytest.approx(t_a, abs=1e-4)


def test_a_non_finite_lcg_is_refused_not_computed():
    """Every computed number is finite or refused (the project's rule): a NaN LCG makes the first
    estimate NaN, and the iteration refuses at once, naming the start (even keel) and the NaN."""
    with pytest.raises(TrimNotSettledError) as e:
        equilibrium(box(T5, 3.0, 0.98), DISP5, RHO, math.nan, 3.0)
    assert "(last estimates +0.0000 and +nan m, tolerance 0.1 mm)" in str(e.value)


def test_table_state_with_and_without_tables_at_trims():
    """table_state: with tables at trims, the iteration (trimmed = True, no MCTC caution) and the
    coverage note (None inside the covered trims); without them the even-keel method (trimmed =
    False) and the even-keel note beyond 1 % of LBP (core/trim.py).  The even-keel trim of the box
    with KML: t = Δ·(LCB − LCG)/(100·MCTC), MCTC = Δ·(KML − KG)/(100·L) (standards.md §6.3), so
    t = L·0.98/(KML − KG) = 40·0.98/(29.1667 − 3) = 1.498 m."""
    v = box(T5, 3.0, 0.98)
    ts = table_state(v, DISP5, RHO, L / 2 - 0.98, 3.0)
    assert ts.trimmed is True and ts.trim_note is None
    assert abs(ts.trim_m - exact_trim(T5, 3.0, 0.98)) < 2e-3
    f = ts.trim_m - 1.0  # between the +1 and +2 m tables
    assert ts.upright.kmt_m == pytest.approx((1 - f) * _kmt(T5, 1.0) + f * _kmt(T5, 2.0), abs=ROUND_OFF)
    kml = (1 - f) * _kml(T5, 1.0) + f * _kml(T5, 2.0)
    assert ts.moment.mctc_tm_cm == pytest.approx(DISP5 * (kml - 3.0) / (100 * L), rel=ROUND_OFF)
    # tables −1…+1 m, G 1.25 m abaft: ≈ 1.91 m by the stern, beyond them: the coverage caution
    short = box(T5, 3.0, 1.25, trims=(-1.0, 0.0, 1.0), kn_trims=(-1.0, 0.0, 1.0))
    ts1 = table_state(short, DISP5, RHO, L / 2 - 1.25, 3.0)
    assert ts1.trim_note == (f"trim {ts1.trim_m:.2f} m by the stern is outside the trims tabulated: hydrostatics "
                             "tables cover -1.00 to +1.00 m; the +1.00 m table is used; KN tables cover -1.00 to "
                             "+1.00 m; the +1.00 m table is used; drafts and KN less certain")
    plain = dataclasses.replace(v, trimmed=None)
    ts0 = table_state(plain, DISP5, RHO, L / 2 - 0.98, 3.0)
    assert ts0.trimmed is False
    assert ts0.trim_m == pytest.approx(L * 0.98 / (_kml(T5, 0.0) - 3.0), rel=ROUND_OFF)
    # 1.49 m is 3.7 % of LBP, beyond the 1.5 % even-keel KN support (core/trim.py)
    assert ts0.trim_note == (f"trim {ts0.trim_m:.2f} m by the stern ({100 * ts0.trim_m / L:.1f} % of LBP): the "
                             "tables are for even keel; beyond 1.5 % of LBP the criteria read off the GZ curve "
                             "are not assessed (KN tables at trims needed); drafts less certain")
    assert ts0.upright.kmt_m == pytest.approx(_kmt(T5, 0.0), abs=ROUND_OFF)
    assert ts0.moment.mctc_tm_cm == pytest.approx(DISP5 * (_kml(T5, 0.0) - 3.0) / (100 * L), rel=ROUND_OFF)



C_LINEAR = -L / (12 * T5) + (3.0 - T5 / 2) / L
"""dF/dt of the linear tables below at T = 5 m, KG 3 m: −L/(12·T) + (KG − KB)/L = −0.65417."""


def _linear_vessel():
    """Tables at −1…+4 m in which the balance F(t) is exactly linear (invented data built on the box):
    LCB the box's, L/2 − L·t/(12·T) (linear in t), KB the even-keel T/2 at every trim, no KML, and a
    constant MCTC M = Δ·|c|/170, so that Δ·c/(100·M) = −1.7 and each step overshoots."""
    mctc = DISP5 * abs(C_LINEAR) / 170

    def change(t, h):
        return dataclasses.replace(h, vcb_m=frozen_array(h.draft_m / 2), kml_m=None,
                                   mctc_tm_cm=frozen_array(np.full_like(h.draft_m, mctc)))

    return _with_tables(box(T5, 3.0, 0.0, trims=(-1.0, 0.0, 1.0, 2.0, 3.0, 4.0), kn_trims=(0.0,)), change)


@pytest.mark.parametrize("t_star, settles", [(1.5, True), (2.2, False)])
def test_the_step_limit_of_thirty(t_star, settles):
    """MAX_STEPS = 30 (core/trimmed_tables.py).  Derived: with F(t) = a + c·t exactly (tables above;
    a = L/2 − LCG, root t* = −a/c, so LCG = L/2 + c·t*) and a constant MCT M, each step maps the error
    e = t − t* to q·e, q = 1 + Δ·c/(100·M) = −0.7.  From even keel e₀ = −t*, so two successive
    estimates differ by |eₖ − eₖ₋₁| = t*·1.7·0.7^(k−1), and the iteration settles at the first k where
    that is ≤ 1e-4 m:
    * t* = 1.5 m: 2.55·0.7²⁸ = 1.16e-4 > 1e-4, 2.55·0.7²⁹ = 8.1e-5 → settles at step 30, the last
      allowed, at t* − 1.5·0.7³⁰ (within 4e-5 m of t*);
    * t* = 2.2 m: 3.74·0.7²⁹ = 1.19e-4 > 1e-4 → not settled in 30 steps: refused (it would at 31).
    The estimates stay within the tables (the largest, 1.7·t* = 3.74 m, under +4 m)."""
    v = _linear_vessel()
    lcg = L / 2 + C_LINEAR * t_star
    if settles:
        eq = equilibrium(v, DISP5, RHO, lcg, 3.0)
        assert eq.steps == 30
        assert abs(eq.trim_m - t_star) < 4e-5
        assert eq.moment.basis == BASIS_TABLE
    else:
        with pytest.raises(TrimNotSettledError) as e:
            equilibrium(v, DISP5, RHO, lcg, 3.0)
        last = [float(x) for x in re.findall(r"[+-]\d+\.\d{4}", str(e.value))]
        assert len(last) == 2 and all(abs(x - t_star) < 2e-4 for x in last)  # |e₂₉|, |e₃₀| ≤ 2.2·0.7²⁹ ≈ 7e-5


@pytest.mark.parametrize("trim_m", [2.0, 2.5])
def test_at_or_beyond_the_last_table_its_neighbour_is_not_read(trim_m):
    """At and beyond the last table (+2 m) that table alone is used (module docstring: the end table
    is held), as at the first one (−2 m): the +1 m table, without KML and cut to drafts 4.0–4.75 m
    (short of Δ = 1640 t), neither refuses the look-up nor takes away the +2 m table's KML, which is
    KB + BML = 29.300 m at T = 5 m (tests/trimmed_box.py).  The same for KN with the +1 m KN table
    cut to its first two rows."""
    v = box(T5, 3.0, 0.98)
    v = _replace_hydro(v, 1.0, dataclasses.replace(_cut(hydro_at_trim(1.0), 4), kml_m=None))
    kn1 = v.trimmed.cross_curves[list(v.trimmed.kn_trim_m).index(1.0)]
    v = _replace_kn(v, 1.0, dataclasses.replace(kn1, displacement_t=frozen_array(kn1.displacement_t[:2]),
                                                 kn_m=frozen_array(kn1.kn_m[:2])))
    row = hydro_at(v, v.trimmed, DISP5, trim_m)
    assert row.kml_m == pytest.approx(_kml(T5, 2.0), abs=ROUND_OFF)
    assert row.kmt_m == pytest.approx(_kmt(T5, 2.0), abs=ROUND_OFF)
    assert np.allclose(kn_row_at(v.trimmed, DISP5, trim_m), [kn_exact(T5, 2.0, h) for h in HEELS], rtol=0,
                       atol=ROUND_OFF)
