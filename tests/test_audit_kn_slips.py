"""Whole rows and columns of a KN table typed in the wrong place (audit.py, ``kn_slips``).

An officer typing a booklet's cross curves can repeat a row, exchange two rows' values or type one
heel's column a row too low or too high.  Every value stays plausible, so the range and lone-cell
checks passed them, and the verdict moved: with the 30° column one row down a NOT MET condition of
an invented 72 m coaster read Met (GZ at 30° 0.199 m too high); row 4000 t typed with row 3600 t's
values, or the two rows exchanged, raised no finding at all (found by an audit).

Rules (derived in audit.py beside KN_ROW_REPEAT_M and KN_SLIP_GAIN): KN is a smooth surface over
displacement and heel, and no two displacements have the same KN at every heel; a slip is judged by
putting it right (rows exchanged back, the column moved back one row) and seeing the table become at
least 20 times smoother.

``COASTER_KN`` is the true table of that invented coaster (B 12.5 m, D 6.5 m), written by
``deckload tables`` from its hull geometry: heels 0–30° every 5°, then every 10° to 90°, eight
displacements 400 t apart.  Both demo vessels' tables (the Islander's 16 × 19, the Trawler's printed
only to 60°) and the trimmed box's tables at five trims (tests/trimmed_box.py, closed form) are the
other true tables.
"""

from __future__ import annotations

import dataclasses
import shutil
from pathlib import Path

import numpy as np
import pytest

from deckload.core.audit import (ERROR, KN_SLIP_GAIN, audit, kn_repeated_rows, kn_shifted_column,
                                 kn_swapped_rows)
from deckload.core.model import frozen_array
from deckload.io.profiles import load_profile
from deckload.report.audit_findings import audit_profile
from demo_vessels import demo_vessel, trawler_vessel
import trimmed_box

SLIPS = ("kn-row-repeat", "kn-row-swap", "kn-column-shift")

COASTER_HEEL = np.array([0, 5, 10, 15, 20, 25, 30, 40, 50, 60, 70, 80, 90], dtype=float)
COASTER_DISP = np.arange(1600.0, 4401.0, 400.0)
COASTER_KN = np.array([
    [0.000, 0.595, 1.196, 1.798, 2.377, 2.885, 3.301, 3.940, 4.271, 4.309, 4.135, 3.795, 3.322],
    [0.000, 0.519, 1.043, 1.578, 2.117, 2.640, 3.111, 3.810, 4.122, 4.173, 4.031, 3.733, 3.308],
    [0.000, 0.475, 0.955, 1.444, 1.947, 2.456, 2.950, 3.624, 3.935, 4.013, 3.913, 3.667, 3.299],
    [0.000, 0.451, 0.904, 1.366, 1.840, 2.330, 2.783, 3.407, 3.727, 3.839, 3.789, 3.600, 3.292],
    [0.000, 0.437, 0.877, 1.323, 1.780, 2.223, 2.605, 3.174, 3.509, 3.660, 3.661, 3.532, 3.286],
    [0.000, 0.432, 0.866, 1.304, 1.730, 2.103, 2.423, 2.938, 3.287, 3.479, 3.533, 3.464, 3.283],
    [0.000, 0.432, 0.865, 1.283, 1.649, 1.964, 2.242, 2.711, 3.067, 3.299, 3.407, 3.399, 3.282],
    [0.000, 0.435, 0.850, 1.211, 1.524, 1.803, 2.058, 2.501, 2.860, 3.124, 3.285, 3.338, 3.286],
])
I3600, I4000, J30 = 5, 6, 6


def shifted(kn, j, step):
    """Column j typed one row down (step +1: each row holds the row above's value, the first row its
    own) or up (step −1: the last row its own), as a column typed out of line is."""
    out = np.array(kn, dtype=float)
    col = out[:, j].copy()
    out[:, j] = np.concatenate(([col[0]], col[:-1])) if step == 1 else np.concatenate((col[1:], [col[-1]]))
    return out


def slips(v):
    return [f for f in audit(v) if f.check in SLIPS]


def with_kn(v, kn):
    return dataclasses.replace(v, cross_curves=dataclasses.replace(v.cross_curves, kn_m=frozen_array(kn)))


# --------------------------------------------------------------------------- no false alarm


def test_the_true_tables_have_no_slip():
    """The coaster's true table, both demo vessels' and the trimmed box's: no repeated row, no pair
    of rows whose exchange makes them smoother, no column that fits another row better."""
    tables = [(COASTER_HEEL, COASTER_DISP, COASTER_KN)]
    tables += [(t.heel_deg, t.displacement_t, t.kn_m) for t in (demo_vessel().cross_curves, trawler_vessel().cross_curves)]
    tables += [(t.heel_deg, t.displacement_t, t.kn_m) for t in map(trimmed_box.kn_at_trim, trimmed_box.TRIMS)]
    assert len(tables) == 3 + len(trimmed_box.TRIMS)
    for heel, disp, kn in tables:
        assert kn_repeated_rows(disp, kn, heel) == []
        assert kn_swapped_rows(disp, kn) is None
        assert kn_shifted_column(heel, kn) is None
    assert slips(demo_vessel()) == [] and slips(trawler_vessel()) == []


def test_rows_meeting_at_one_heel_are_not_a_repeat():
    """The coaster's rows 3600 t and 4000 t agree at 5° (0.432 m) and within a millimetre at 10° and
    90°: curves of KN against displacement cross; only all heels alike is a repeat."""
    assert COASTER_KN[I3600, 1] == COASTER_KN[I4000, 1]
    assert kn_repeated_rows(COASTER_DISP, COASTER_KN, COASTER_HEEL) == []


# --------------------------------------------------------------------------- each slip caught


@pytest.mark.parametrize("copy, original", [(I4000, I3600), (I3600, I4000 - 2), (0, 1), (7, 6), (7, 2)])
def test_a_row_typed_with_another_rows_values(copy, original):
    """Row ``copy`` typed with row ``original``'s values: found, and the copy is the row named (the
    one off the curve through the rows around the pair; at an end, the later row)."""
    kn = COASTER_KN.copy()
    kn[copy] = kn[original]
    pairs = kn_repeated_rows(COASTER_DISP, kn, COASTER_HEEL)
    assert len(pairs) == 1
    named = pairs[0]
    if copy in (0, 7) and abs(copy - original) == 1:
        assert set(named) == {copy, original}  # an end pair: the later row is named
    else:
        assert named == (copy, original)


@pytest.mark.parametrize("i", range(7))
def test_two_rows_exchanged(i):
    kn = COASTER_KN.copy()
    kn[[i, i + 1]] = kn[[i + 1, i]]
    found = kn_swapped_rows(COASTER_DISP, kn)
    assert found is not None and found[0] == i and found[1] >= KN_SLIP_GAIN


@pytest.mark.parametrize("step", [1, -1])
@pytest.mark.parametrize("j", [2, 4, 6, 7, 9])
def test_a_column_typed_one_row_down_or_up(j, step):
    kn = shifted(COASTER_KN, j, step)
    found = kn_shifted_column(COASTER_HEEL, kn)
    assert found is not None and found[:2] == (j, step) and found[2] >= KN_SLIP_GAIN


def test_the_slips_on_the_demo_tables():
    """The Islander (16 rows, heel every 5° to 90°) and the Trawler (12 rows, to 60° only): a row
    repeated, two rows exchanged and a column moved are each an ERROR naming the row and heel."""
    for v, j in ((demo_vessel(), 8), (trawler_vessel(), 10)):
        kn = np.array(v.cross_curves.kn_m)
        rep = kn.copy()
        rep[5] = rep[4]
        (f,) = slips(with_kn(v, rep))
        assert (f.severity, f.check, f.path[:3]) == (ERROR, "kn-row-repeat", ("cross_curves", "kn_m", 5))
        swap = kn.copy()
        swap[[5, 6]] = swap[[6, 5]]
        (f,) = slips(with_kn(v, swap))
        assert (f.severity, f.check, f.path[:3]) == (ERROR, "kn-row-swap", ("cross_curves", "kn_m", 5))
        (f,) = slips(with_kn(v, shifted(kn, j, 1)))
        assert (f.severity, f.check, f.path) == (ERROR, "kn-column-shift", ("cross_curves", "kn_m", 1, j))
        heel = float(v.cross_curves.heel_deg[j])
        assert f"column {heel:g}°" in f.look and "typed one row down" in f.why


def test_a_shifted_column_in_a_csv_page_names_its_file_line_row_and_heel(tmp_path):
    """The Trawler's KN page (demo_trawler/kn.csv) with its 30° column typed one row down: the
    finding points at the CSV file and the line of the second row (the first holding another row's
    value), and names that row's displacement and the heel."""
    src = Path(__file__).parent.parent / "vessel_profiles"
    shutil.copy(src / "demo_trawler.toml", tmp_path)
    shutil.copytree(src / "demo_trawler", tmp_path / "demo_trawler")
    page = tmp_path / "demo_trawler" / "kn.csv"
    lines = page.read_text(encoding="utf-8").splitlines()
    head = lines[0].split(",")
    k = head.index("kn_30")
    rows = [line.split(",") for line in lines[1:]]
    col = [r[k] for r in rows]
    for r, value in zip(rows, [col[0]] + col[:-1]):
        r[k] = value
    page.write_text("\n".join([lines[0]] + [",".join(r) for r in rows]) + "\n", encoding="utf-8")
    f = tmp_path / "demo_trawler.toml"
    found = [x for x in audit_profile(f, load_profile(f)) if x.finding.check in SLIPS]
    assert len(found) == 1
    hit = found[0]
    assert (hit.file, hit.line, hit.is_error) == (str(page), 3, True)
    assert f"Δ {rows[1][0].rstrip('0').rstrip('.')} t holds {float(col[0]):.4g} m" in hit.finding.why
    assert "column 30°" in hit.finding.look


def test_rows_or_heels_a_hair_apart_are_not_judged_and_raise_nothing():
    """A table no booklet prints: heels 0° and 1e-310° (a subnormal apart), or displacements likewise.  The
    leave-one-out weights (Lagrange) and the second differences divide by the spacing and overflowed
    (a RuntimeWarning; a traceback under the fuzzer's -W error, seed 24680).  Nothing is judged
    there, and nothing is raised."""
    import warnings

    from deckload.core.audit import _leave_out, kn_shifted_column, kn_swapped_rows

    heel = np.array([0.0, 1e-310, 5.0, 10.0, 15.0, 20.0])
    kn = np.outer(np.linspace(1.0, 2.0, 5), np.sin(np.radians(heel)))
    disp = np.array([1e-310, 2e-310, 100.0, 200.0, 300.0])
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        assert _leave_out(heel, 2) is None  # its weights overflow: no prediction from them
        assert kn_shifted_column(heel, kn) is None
        assert kn_swapped_rows(disp, kn) is None
