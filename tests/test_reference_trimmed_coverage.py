"""Trims outside the tables at trims: the caution, the refusals and their words (core/trimmed_tables.py
``coverage``), which tables a result names (``tables_basis``), and when trimmed KN cover the trim.

The vessel is the trimmed box of tests/trimmed_box.py (closed forms DERIVED in its docstring:
KB(T, t) = T/2 + t²/(24·T), KMt = KB + B²/(12·T·cosψ), KN(φ, t) = sinφ·[KB + (B²/(12·T))·(1 +
tan²φ/2)], tanψ = t/L; L 40, B 8 m), with tables at chosen trims; some columns are changed by an
invented amount per metre of trim (said where), so that an estimate crosses its tolerance.

The rule checked (module docstring of core/trimmed_tables.py): beyond the end table by e, its values
are held, so their error is estimated as |end value − neighbour value|·e/w, w the last interval's
width (KN: plus the change of that rate over the last three tables, ``held_error_bound``; with KG
the GZ tolerance too, tests/test_trimmed_beyond_gz.py); refused when that exceeds UR L5's tolerance
(standards.md §5.3: mean draft and KMt 1 %, not more than 5 cm; KN 5 cm), when e > w, or when the
neighbour table does not reach the displacement;
else a caution.  A set with the even-keel table alone keeps the even-keel caution beyond 1 % of LBP
(core/trim.py, deckload's own threshold; 0.40 m here).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from deckload.core.model import frozen_array
from deckload.core.trimmed_tables import TrimBeyondTablesError, coverage, covers_kn, tables_basis
from trimmed_box import TRIMS, B, L, RHO, box, hydro_at_trim, kb, kn_at_trim, kn_exact

D4 = RHO * L * B * 4.0  # 1312 t: the first row of every hydrostatic table
D5 = RHO * L * B * 5.0  # 1640 t: a row of every table


def _kmt(T: float, t: float) -> float:
    return kb(T, t) + B * B / (12 * T * math.cos(math.atan(t / L)))


def _hydro_changed(v, change):
    tt = v.trimmed
    tables = tuple(change(t, h) for t, h in zip(tt.hydro_trim_m, tt.hydrostatics))
    return dataclasses.replace(v, trimmed=dataclasses.replace(tt, hydrostatics=tables))


def _refusal(v, trim, d_eq=D5) -> str:
    with pytest.raises(TrimBeyondTablesError) as e:
        coverage(v, trim, d_eq)
    return str(e.value)


def test_inside_the_covered_trims_no_caution():
    """Inside both sets (and on their end tables, to round-off: the 1e-9 of tables.bracket, scaled by
    the largest trim, 2 m here) there is nothing to say."""
    v = box(5.0, 3.0, 0.98, trims=(-2.0, 0.0, 0.5), kn_trims=(-2.0, 0.0, 0.5))
    assert coverage(v, 0.3, D5) is None
    assert coverage(v, 0.5, D5) is None
    assert coverage(v, 0.5 + 1.5e-9, D5) is None  # within 2e-9 of the +0.5 m tables: on them
    assert coverage(v, -1.0, D5) is None
    assert coverage(v, -2.0, D5) is None  # exactly on the first table
    # the round-off allowance scales with the largest trim at either end (|−2| above, +2 m here)
    v = box(5.0, 3.0, 0.98, trims=(-0.5, 0.0, 2.0), kn_trims=(-0.5, 0.0, 2.0))
    assert coverage(v, 2.0 + 1.5e-9, D5) is None


def test_caution_names_each_set_its_range_and_the_end_table_used():
    """Hydrostatics at −1, 0, +1 m and KN at −2, −1, 0, +0.75 m; at 1.3 m by the stern both sets are
    beyond their ends, by 0.3 m (of a 1 m interval) and 0.55 m (of 0.75 m).  The box's mean draft does
    not change with trim and KMt and KN by t²/(24·T) terms (a few mm over an interval): a caution."""
    v = box(5.0, 3.0, 0.98, trims=(-1.0, 0.0, 1.0), kn_trims=(-2.0, -1.0, 0.0, 0.75))
    assert coverage(v, 1.3, D5) == (
        "trim 1.30 m by the stern is outside the trims tabulated: hydrostatics tables cover -1.00 to +1.00 m; the "
        "+1.00 m table is used; KN tables cover -2.00 to +0.75 m; the +0.75 m table is used; drafts and KN less certain")
    # by the head only the hydrostatics are beyond (−1.5 < −1 m; KN reach −2 m)
    assert coverage(v, -1.5, D5) == (
        "trim 1.50 m by the head is outside the trims tabulated: hydrostatics tables cover -1.00 to +1.00 m; the "
        "-1.00 m table is used; drafts and KN less certain")
    # KN alone beyond: 0.9 m by the stern
    assert coverage(v, 0.9, D5) == (
        "trim 0.90 m by the stern is outside the trims tabulated: KN tables cover -2.00 to +0.75 m; the +0.75 m "
        "table is used; drafts and KN less certain")


def test_refused_beyond_the_last_interval_at_either_end():
    """Hydrostatics at −1, 0, +0.5 m: the last interval is 0.5 m at the stern end and 1 m at the head
    end; 0.7 m beyond the +0.5 m table and 1.3 m beyond the −1 m table are both refused, with the
    width of that end's interval."""
    v = box(5.0, 3.0, 0.98, trims=(-1.0, 0.0, 0.5), kn_trims=TRIMS)
    assert _refusal(v, 1.2) == (
        "trim 1.20 m by the stern is outside the hydrostatics tables' trims (-1.00 to +0.50 m): 0.70 m beyond them, "
        "more than their last interval (0.50 m), where the error cannot be bounded; this condition cannot be "
        "assessed from these tables")
    assert _refusal(v, -2.3) == (
        "trim 2.30 m by the head is outside the hydrostatics tables' trims (-1.00 to +0.50 m): 1.30 m beyond them, "
        "more than their last interval (1.00 m), where the error cannot be bounded; this condition cannot be "
        "assessed from these tables")
    # within one interval at each end the box's tables draw a caution only
    assert coverage(v, 0.9, D5).startswith("trim 0.90 m by the stern is outside the trims tabulated")
    assert coverage(v, -1.9, D5).startswith("trim 1.90 m by the head is outside the trims tabulated")


def test_last_interval_is_between_the_last_two_tables():
    """Hydrostatics at −1, 0, +0.5, +1 m: the last interval at the stern end is +0.5…+1 m (0.5 m wide),
    so 0.6 m beyond +1 m is refused, naming 0.50 m."""
    v = box(5.0, 3.0, 0.98, trims=(-1.0, 0.0, 0.5, 1.0), kn_trims=TRIMS)
    assert _refusal(v, 1.6) == (
        "trim 1.60 m by the stern is outside the hydrostatics tables' trims (-1.00 to +1.00 m): 0.60 m beyond them, "
        "more than their last interval (0.50 m), where the error cannot be bounded; this condition cannot be "
        "assessed from these tables")


def test_kn_refused_beyond_the_last_interval():
    v = box(5.0, 3.0, 0.98, trims=TRIMS, kn_trims=(-0.5, 0.0, 0.5))
    assert _refusal(v, 1.05) == (
        "trim 1.05 m by the stern is outside the KN tables' trims (-0.50 to +0.50 m): 0.55 m beyond them, more "
        "than their last interval (0.50 m), where the error cannot be bounded; this condition cannot be assessed "
        "from these tables")


def test_mean_draft_estimate_beyond_tolerance_is_refused():
    """Invented: the tables' mean draft rises 0.2 m per metre of trim (draft_m + 0.2·t, as where the
    LCF is off midships).  At Δ = 1312 t (T = 4.0 m at even keel), tables −1, 0, +0.5 m:
    * 0.8 m by the stern, 0.3 m beyond +0.5 m (interval 0.5 m): estimate 0.1·0.3/0.5 = 6.0 cm;
      tolerance 1 % of the end table's 4.1 m = 4.1 cm → refused;
    * 1.3 m by the head, 0.3 m beyond −1 m (interval 1 m): estimate 0.2·0.3 = 6.0 cm; tolerance
      1 % of 3.8 m = 3.8 cm → refused;
    * 0.6 m by the stern, 0.1 m beyond: estimate 2.0 cm, below 4.1 cm → a caution."""
    v = _hydro_changed(box(5.0, 3.0, 0.98, trims=(-1.0, 0.0, 0.5), kn_trims=TRIMS),
                       lambda t, h: dataclasses.replace(h, draft_m=frozen_array(h.draft_m + 0.2 * t)))
    tail = ", beyond UR L5's tolerance (standards.md §5.3); this condition cannot be assessed from these tables"
    assert _refusal(v, 0.8, D4) == ("trim 0.80 m by the stern is outside the hydrostatics tables' trims (-1.00 to "
                                    "+0.50 m): mean draft would be off by about 6.0 cm (tolerance 4.1 cm)" + tail)
    assert _refusal(v, -1.3, D4) == ("trim 1.30 m by the head is outside the hydrostatics tables' trims (-1.00 to "
                                     "+0.50 m): mean draft would be off by about 6.0 cm (tolerance 3.8 cm)" + tail)
    assert coverage(v, 0.6, D4).startswith("trim 0.60 m by the stern is outside the trims tabulated")


def test_kmt_estimate_beyond_tolerance_is_refused():
    """Invented: KMt rises 0.2 m per metre of trim (kmt_m + 0.2·t), the mean draft as the box's.  At
    T = 4.0 m, 0.3 m beyond the +0.5 m table (interval 0.5 m): estimate
    |KMt(4, 0.5) + 0.1 − KMt(4, 0)|·0.6 with the box's KMt (closed form), 6.2 cm; tolerance 1 % of
    the end table's KMt(4, 0.5) + 0.1 = 3.44 m → 3.4 cm: refused, the mean draft (unchanged) passing."""
    v = _hydro_changed(box(5.0, 3.0, 0.98, trims=(-1.0, 0.0, 0.5), kn_trims=TRIMS),
                       lambda t, h: dataclasses.replace(h, kmt_m=frozen_array(h.kmt_m + 0.2 * t)))
    end = _kmt(4.0, 0.5) + 0.1
    est = abs(end - _kmt(4.0, 0.0)) * 0.3 / 0.5
    assert f"{est * 100:.1f}" == "6.2" and f"{end:.2f}" == "3.44"
    assert _refusal(v, 0.8, D4) == (
        "trim 0.80 m by the stern is outside the hydrostatics tables' trims (-1.00 to +0.50 m): KMt would be off by "
        "about 6.2 cm (tolerance 3.4 cm), beyond UR L5's tolerance (standards.md §5.3); this condition cannot be "
        "assessed from these tables")
    # 0.05 m beyond: 1.0 cm estimated, a caution
    assert coverage(v, 0.55, D4).startswith("trim 0.55 m by the stern is outside the trims tabulated")


def test_kn_estimate_names_the_heel_where_it_exceeds_tolerance():
    """Invented: KN at 20° alone rises 0.1 m per metre of trim (KN_j + 0.1·t_j in the 20° column).
    KN tables at −1, 0, +1 m; 1.606 m by the stern is 0.606 m beyond +1 m (interval 1 m).  The bound
    of trimmed_tables.held_error_bound: e·|r| + M·e·(w + e)/2, r the last interval's rate (0.1 plus
    the box's own sin20°·1²/(24·5) = 2.85 mm), M = |r − r₂|/1 the change of rate over the last three
    tables, the box's quadratic alone: 2·sin20°/(24·5) = 5.7 mm/m²; 6.23 + 0.28 = 6.5 cm at 20°, over
    the 5 cm of UR L5 (standards.md §5.3): refused naming 20°.  0.4 m beyond: 4.1 + 0.16 = 4.3 cm, a
    caution (no KG given: the KN tolerance alone)."""
    k20 = list(np.asarray(kn_at_trim(0.0).heel_deg)).index(20.0)

    def kn_20(t):
        base = kn_at_trim(t)
        kn = np.array(base.kn_m)
        kn[:, k20] += 0.1 * t
        return dataclasses.replace(base, kn_m=frozen_array(kn))

    v = box(5.0, 3.0, 0.98, trims=TRIMS, kn_trims=(-1.0, 0.0, 1.0), kn_table=kn_20)
    # the box's own change at 20° adds sin20°·1²/(24·5) = 2.9 mm over the interval (closed form);
    # 1.606 m: 0.606 m beyond, 6.23 cm (a trim whose estimate is not near a rounding edge of 0.1 cm)
    r = kn_exact(5.0, 1.0, 20.0) + 0.1 - kn_exact(5.0, 0.0, 20.0)
    r2 = kn_exact(5.0, 0.0, 20.0) - (kn_exact(5.0, -1.0, 20.0) - 0.1)
    est = r * 0.606 + abs(r - r2) * 0.606 * 1.606 / 2
    assert f"{est * 100:.2f}" == "6.51"
    assert _refusal(v, 1.606) == (
        "trim 1.61 m by the stern is outside the KN tables' trims (-1.00 to +1.00 m): KN at 20° would be off by "
        "about 6.5 cm (tolerance 5 cm), beyond UR L5's tolerance (standards.md §5.3); this condition cannot be "
        "assessed from these tables")
    assert coverage(v, 1.4, D5) == ("trim 1.40 m by the stern is outside the trims tabulated: KN tables cover "
                                    "-1.00 to +1.00 m; the +1.00 m table is used; drafts and KN less certain")


def test_neighbour_table_short_of_the_displacement_is_refused():
    """No rate is known where the neighbour table does not reach the displacement: refused, with the
    look-up's own words.  Hydrostatics at −1, 0, +0.5, +1 m, the +0.5 m table cut to 4.0–4.75 m
    (1312–1558 t); KN at −1, 0, +1 m, the 0 m table cut to its rows 4.5 and 4.75 m (1476–1558 t)."""
    v = box(5.0, 3.0, 0.98, trims=(-1.0, 0.0, 0.5, 1.0), kn_trims=(-1.0, 0.0, 1.0))
    tt = v.trimmed
    h = hydro_at_trim(0.5)
    cut = dataclasses.replace(h, **{c: frozen_array(getattr(h, c)[:4]) for c in h.columns()})
    kn0 = tt.cross_curves[1]
    kn_cut = dataclasses.replace(kn0, displacement_t=frozen_array(kn0.displacement_t[:2]),
                                 kn_m=frozen_array(kn0.kn_m[:2]))
    v = dataclasses.replace(v, trimmed=dataclasses.replace(
        tt, hydrostatics=(tt.hydrostatics[0], tt.hydrostatics[1], cut, tt.hydrostatics[3]),
        cross_curves=(tt.cross_curves[0], kn_cut, tt.cross_curves[2])))
    assert _refusal(v, 1.3) == (
        "trim 1.30 m by the stern is outside the hydrostatics tables' trims (-1.00 to +1.00 m): the error cannot be "
        "estimated (displacement (hydrostatic table at trim +0.50 m, at table density) 1640 t is outside the table "
        "range 1312–1558 t; deckload does not extrapolate), beyond UR L5's tolerance (standards.md §5.3); this "
        "condition cannot be assessed from these tables")
    v = dataclasses.replace(v, trimmed=dataclasses.replace(v.trimmed, hydrostatics=tt.hydrostatics[:2]
                                                           + (hydro_at_trim(0.5), tt.hydrostatics[3])))
    assert _refusal(v, 1.3) == (
        "trim 1.30 m by the stern is outside the KN tables' trims (-1.00 to +1.00 m): the error cannot be "
        "estimated (displacement (KN cross curves, at table density) 1640 t is outside the table range "
        "1476–1558 t; deckload does not extrapolate), beyond UR L5's tolerance (standards.md §5.3); this "
        "condition cannot be assessed from these tables")


def test_even_keel_set_keeps_the_one_percent_caution():
    """A set with the even-keel table alone: a caution beyond 1 % of LBP (0.40 m), never a refusal, and
    each such set named; the other set, covering the trim, says nothing."""
    both = box(5.0, 3.0, 0.98, trims=(0.0,), kn_trims=(0.0,))
    assert coverage(both, 0.39, D5) is None
    assert coverage(both, -0.39, D5) is None
    assert coverage(both, 3.0, D5) == ("trim 3.00 m by the stern is outside the trims tabulated: hydrostatics are "
                                       "for even keel only; KN are for even keel only; drafts and KN less certain")
    kn_only = box(5.0, 3.0, 0.98, trims=TRIMS, kn_trims=(0.0,))
    assert coverage(kn_only, -0.5, D5) == ("trim 0.50 m by the head is outside the trims tabulated: KN are for "
                                           "even keel only; drafts and KN less certain")


def test_trimmed_kn_cover_the_trim_only_inside_their_trims():
    """covers_kn: True only with KN at trims besides the even-keel table and the trim inside them
    (then the free-trim reference-LCG caution of core/trim.py does not apply)."""
    v = box(5.0, 3.0, 0.98, trims=TRIMS, kn_trims=(-1.0, 0.0, 1.0))
    assert covers_kn(v, 0.7) and covers_kn(v, -1.0) and covers_kn(v, 1.0)
    assert not covers_kn(v, 1.2) and not covers_kn(v, -1.2)
    assert not covers_kn(box(5.0, 3.0, 0.98, trims=TRIMS, kn_trims=(0.0,)), 0.0)
    assert covers_kn(box(5.0, 3.0, 0.98, trims=TRIMS, kn_trims=(0.0, 1.0)), 0.5)  # two tables are a set too
    assert not covers_kn(dataclasses.replace(v, trimmed=None), 0.0)


# --- which tables a result names (tables_basis): the look-ups of hydro_at / kn_row_at in words ---


def test_basis_between_at_and_beyond_the_tables():
    """Tables at −2…+2 m every metre: 1.5 m lies between the +1 and +2 m tables; exactly at +1 m and
    at +2 m (the last table) one table is read; within 1e-12 of a table, that table (round-off);
    2.5 m and −2.5 m are beyond the ends."""
    v = box(5.0, 3.0, 0.98)
    b = tables_basis(v, 1.5)
    assert b.words == ("hydrostatics and KN at trim 1.50 m by the stern, interpolated between the tables at "
                       "+1.00 and +2.00 m")
    assert b.short == "at +1.50 m: +1.00…+2.00 m"
    assert (b.trimmed, b.trim_m, b.hydro_trims_m, b.kn_trims_m, b.outside) == (True, 1.5, (1.0, 2.0), (1.0, 2.0), False)
    assert b.as_dict() == {"tables": "at trims", "trim_m": 1.5, "hydrostatics_trims_m": [1.0, 2.0],
                           "kn_trims_m": [1.0, 2.0], "outside_tabulated_trims": False, "text": b.words}
    for t in (1.0, 1.0 - 1e-13):
        b = tables_basis(v, t)
        assert (b.words, b.short, b.hydro_trims_m) == (
            "hydrostatics and KN at trim 1.00 m by the stern, from the table at +1.00 m", "at +1.00 m: +1.00 m", (1.0,))
    b = tables_basis(v, 2.0)
    assert (b.words, b.hydro_trims_m, b.outside) == (
        "hydrostatics and KN at trim 2.00 m by the stern, from the table at +2.00 m", (2.0,), False)
    b = tables_basis(v, -2.5)
    assert b.words == ("hydrostatics and KN at trim 2.50 m by the head, from the end table at -2.00 m (the trim is "
                       "outside the trims tabulated)")
    assert (b.short, b.hydro_trims_m, b.kn_trims_m, b.outside) == ("at -2.50 m: -2.00 m (end)", (-2.0,), (-2.0,), True)
    assert tables_basis(v, 2.5).hydro_trims_m == (2.0,)


def test_basis_near_even_keel_reads_zero():
    """Under half a centimetre the trim reads "even keel" and 0.00 (two decimals, no sign)."""
    v = box(5.0, 3.0, 0.98)
    b = tables_basis(v, -0.004)
    assert b.words == "hydrostatics and KN at even keel, interpolated between the tables at -1.00 and 0.00 m"
    assert b.short == "at 0.00 m: -1.00…0.00 m"
    assert tables_basis(v, 0.006).short == "at +0.01 m: 0.00…+1.00 m"
    assert tables_basis(v, 0.006).words.startswith("hydrostatics and KN at trim 0.01 m by the stern, ")


def test_basis_when_the_sets_differ():
    """Hydrostatics at −1, 0, +1 m, KN at even keel only: each set named with its own phrase."""
    v = box(5.0, 3.0, 0.98, trims=(-1.0, 0.0, 1.0), kn_trims=(0.0,))
    b = tables_basis(v, 1.5)
    assert b.words == ("at trim 1.50 m by the stern: hydrostatics from the end table at +1.00 m (the trim is outside "
                       "the trims tabulated); KN from the even-keel table alone")
    assert b.short == "at +1.50 m: hyd +1.00 m (end), KN even keel"
    assert (b.hydro_trims_m, b.kn_trims_m, b.outside) == ((1.0,), (0.0,), True)
    b = tables_basis(v, 0.5)
    assert b.words == ("at trim 0.50 m by the stern: hydrostatics interpolated between the tables at 0.00 and +1.00 m; "
                       "KN from the even-keel table alone")
    assert (b.short, b.outside) == ("at +0.50 m: hyd 0.00…+1.00 m, KN even keel", False)
    one = box(5.0, 3.0, 0.98, trims=(0.0,), kn_trims=(0.0,))
    b = tables_basis(one, -0.3)
    assert (b.words, b.short, b.hydro_trims_m, b.outside) == (
        "hydrostatics and KN at trim 0.30 m by the head, from the even-keel table alone", "at -0.30 m: even keel",
        (0.0,), False)


def test_basis_without_tables_at_trims():
    v = dataclasses.replace(box(5.0, 3.0, 0.98), trimmed=None)
    b = tables_basis(v, 1.2)
    assert (b.trimmed, b.trim_m, b.hydro_trims_m, b.kn_trims_m, b.outside) == (False, 1.2, (0.0,), (0.0,), False)
    assert b.words == "even-keel hydrostatics and KN (the profile has no tables at trims)"
    assert b.short == "even keel only"
    assert b.as_dict()["tables"] == "even keel"
