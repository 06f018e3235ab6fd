"""The audit of hydrostatic and KN tables at a trim: every check of the even-keel table, named by
the trimmed table's key and located at its entry.

Base: the 22 m box "trawler" of tests/box_profile_text.py (checks.md §1.1 closed forms), given
tables at trims −1 and +1 m (hydrostatics) and +1 m and +2 m (KN) that are copies of its even-keel
tables: the audit's checks do not depend on the trim except the VCB bound (the waterline reaches
T + |t|/2 at the deeper end), so the copies pass every check as the even-keel tables do, and a
typing error put into one of them is found there alone.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from box_profile_text import fv22_text
from deckload.core.audit import ERROR, WARNING, _trim_name, audit
from deckload.core.model import TrimmedTables, frozen_array
from deckload.io.profiles import parse_profile


def vessel():
    return parse_profile(fv22_text(), "fv22.toml")


def hydro(v, **cols):
    return dataclasses.replace(v.hydrostatics, **{k: frozen_array(np.asarray(a, float)) for k, a in cols.items()})


def kn_table(v, kn):
    return dataclasses.replace(v.cross_curves, kn_m=frozen_array(np.asarray(kn, float)))


def trimmed(v, aft=None, fwd=None, kn1=None, kn2=None, hydro_trims=(-1.0, 0.0, 1.0)):
    """Tables at trims (−1, 0, +1 m) and KN at (0, +1, +2 m); None = a copy of the even-keel table."""
    h_aft = aft or dataclasses.replace(v.hydrostatics)
    h_fwd = fwd or dataclasses.replace(v.hydrostatics)
    tables = {-1.0: h_fwd, 0.0: v.hydrostatics, 1.0: h_aft, 0.05: h_aft}
    tt = TrimmedTables(
        hydro_trim_m=frozen_array(np.array(hydro_trims)), hydrostatics=tuple(tables[t] for t in hydro_trims),
        kn_trim_m=frozen_array(np.array([0.0, 1.0, 2.0])),
        cross_curves=(v.cross_curves, kn1 or dataclasses.replace(v.cross_curves), kn2 or dataclasses.replace(v.cross_curves)))
    return dataclasses.replace(v, trimmed=tt)


def col(v, name):
    return np.array(getattr(v.hydrostatics, name), dtype=float)


def test_copies_of_the_even_keel_tables_raise_nothing():
    assert audit(trimmed(vessel())) == ()


def test_a_finding_in_a_trimmed_table_is_named_by_its_key_and_entry():
    """LCB of the +1 m table typed from midships: the key, the entry (the +1 m table is the second
    entry of [[hydrostatics_at_trim]]: the even-keel table is [hydrostatics]) and the trim in the look."""
    v = vessel()
    lcb = col(v, "lcb_m") - 11.0
    (f,) = [x for x in audit(trimmed(v, aft=hydro(v, lcb_m=lcb))) if x.check == "hydro-lcb-range"]
    assert (f.severity, f.key, f.path) == (ERROR, "hydrostatics_at_trim[1 m].lcb_m", ("hydrostatics_at_trim", 1, "lcb_m", 0))
    assert f.text() == (
        "hydrostatics_at_trim[1 m].lcb_m = 0 m from AP: outside 0.2–0.8 × LBP from the AP (4.4 m–17.6 m): no hull's "
        "LCB lies in the end fifths of its length (every row: a datum or sign slip?); compare with the booklet's "
        "hydrostatic particulars table, row at draft 1 m at trim +1 m")
    (f,) = [x for x in audit(trimmed(v, fwd=hydro(v, lcb_m=lcb))) if x.check == "hydro-lcb-range"]
    assert (f.key, f.path[:2]) == ("hydrostatics_at_trim[-1 m].lcb_m", ("hydrostatics_at_trim", 0))
    assert f.look.endswith("row at draft 1 m at trim -1 m")


def test_findings_of_two_trimmed_tables_keep_their_own_names():
    v = vessel()
    kmt = col(v, "kmt_m") * 10
    got = [(f.key, f.path[:2]) for f in audit(trimmed(v, aft=hydro(v, kmt_m=kmt), fwd=hydro(v, kmt_m=kmt)))
           if f.check == "hydro-kmt"]
    assert got == [("hydrostatics_at_trim[-1 m].kmt_m", ("hydrostatics_at_trim", 0)),
                   ("hydrostatics_at_trim[1 m].kmt_m", ("hydrostatics_at_trim", 1))]


def test_a_kn_slip_in_a_trimmed_kn_table():
    v = vessel()
    kn = np.array(v.cross_curves.kn_m)
    kn[2, 4] = 14.22  # 1.422 with the decimal point slipped
    (f,) = audit(trimmed(v, kn2=kn_table(v, kn)))
    assert (f.severity, f.check, f.key) == (ERROR, "kn-envelope", "cross_curves_at_trim[2 m].kn_m")
    assert f.path == ("cross_curves_at_trim", 1, "kn_m", 2, 4)
    assert f.look == "the booklet's KN cross curves table, Δ 322.465 t at 40° at trim +2 m"


def test_kn_at_a_trim_is_compared_with_kmt_of_the_table_at_that_trim():
    """The +1 m hydrostatic table with KMt 20 % higher (a doubt of its own: above the single-hull
    bound): the +1 m KN table, equal to the even-keel one, is then 16 % below KMt·sin 10° there (a
    doubt); the +2 m KN table has no hydrostatic table at its trim and is compared with the
    even-keel one (no finding)."""
    v = vessel()
    got = [(f.check, f.key) for f in audit(trimmed(v, aft=hydro(v, kmt_m=col(v, "kmt_m") * 1.2)))]
    assert got == [("hydro-kmt", "hydrostatics_at_trim[1 m].kmt_m"), ("kn-kmt", "cross_curves_at_trim[1 m].kn_m")]


def test_the_waterline_at_the_deeper_end_bounds_vcb_at_a_trim():
    """VCB 1.65 m at a mean draft of 1.6 m: above the waterline at even keel (an error there), but
    at a trim of ±1 m the waterline reaches 1.6 + 0.5 = 2.1 m at the deeper end (derived: the
    waterplane through the mean draft at midships), so it is inside; at a trim of 0.05 m (1.625 m)
    it is not."""
    v = vessel()
    vcb = col(v, "vcb_m")
    vcb[3:] = [1.65, 1.7, 1.8, 1.9, 2.0, 2.1]
    bad = hydro(v, vcb_m=vcb)
    assert [f for f in audit(trimmed(v, aft=bad, fwd=bad)) if f.check == "hydro-vcb"] == []
    (f,) = [f for f in audit(trimmed(v, aft=bad, hydro_trims=(0.0, 0.05))) if f.check == "hydro-vcb"]
    assert f.key == "hydrostatics_at_trim[0.05 m].vcb_m" and "(0–1.625 m)" in f.why
    (f,) = [f for f in audit(dataclasses.replace(v, hydrostatics=bad)) if f.check == "hydro-vcb"]
    assert f.key == "hydrostatics.vcb_m" and "(0–1.6 m)" in f.why


def test_the_trim_in_a_table_name_has_six_significant_digits():
    """As the profile reader names a table at a trim (hydrostatics_at_trim[1 m])."""
    assert [_trim_name(t) for t in (1.0, -1.0, 0.5, 0.1234567, 2.0000004, -0.25, 0.01234567)] == [
        "1", "-1", "0.5", "0.123457", "2", "-0.25", "0.012346"]  # rounded to the micrometre first, as the reader does


def test_three_trimmed_tables_are_numbered_in_order():
    """Trims −1, +1 and +2 m besides the even-keel table: entries 0, 1 and 2 of [[hydrostatics_at_trim]]."""
    v = vessel()
    bad = hydro(v, kmt_m=col(v, "kmt_m") * 10)
    tables = {-1.0: bad, 0.0: v.hydrostatics, 1.0: bad, 2.0: bad}
    trims = (-1.0, 0.0, 1.0, 2.0)
    tt = TrimmedTables(hydro_trim_m=frozen_array(np.array(trims)), hydrostatics=tuple(tables[t] for t in trims),
                       kn_trim_m=frozen_array(np.array([0.0])), cross_curves=(v.cross_curves,))
    got = [(f.key, f.path[:2]) for f in audit(dataclasses.replace(v, trimmed=tt)) if f.check == "hydro-kmt"]
    assert got == [("hydrostatics_at_trim[-1 m].kmt_m", ("hydrostatics_at_trim", 0)),
                   ("hydrostatics_at_trim[1 m].kmt_m", ("hydrostatics_at_trim", 1)),
                   ("hydrostatics_at_trim[2 m].kmt_m", ("hydrostatics_at_trim", 2))]


def test_a_warning_in_a_trimmed_table_stays_a_warning():
    v = vessel()
    (f,) = [x for x in audit(trimmed(v, aft=hydro(v, mctc_tm_cm=col(v, "mctc_tm_cm") * 1.5))) if x.check == "hydro-mctc"]
    assert f.severity == WARNING and f.key == "hydrostatics_at_trim[1 m].mctc_tm_cm"
    assert f.path == ("hydrostatics_at_trim", 1, "mctc_tm_cm", 0)
