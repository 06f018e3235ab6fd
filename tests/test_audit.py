"""The plausibility audit: each typing error of issue 8's list is caught, with file, line and key.

The base is a 22 m box "trawler" written as a profile file (tests/box_profile_text.py: every
table from the closed forms of checks.md §1, so the base itself is exactly consistent and
must audit clean).  Each case is that file with the issue's mistyped input in it.
"""

from __future__ import annotations

import dataclasses
from pathlib import Path

import numpy as np
import pytest

from box_profile_text import fv22_text
from deckload.report.audit_findings import audit_profile
from deckload.cli.check import run_check
from deckload.core.audit import ERROR, WARNING, audit
from deckload.core.model import frozen_array
from deckload.io.profiles import load_profile, parse_profile

HERE = Path(__file__).parent
DEMOS = [HERE.parent / "vessel_profiles" / "demo_islander.toml", HERE.parent / "deckload" / "data" / "demo_islander.toml"]


def write(tmp_path, text, name="fv22.toml") -> Path:
    f = tmp_path / name
    f.write_text(text, encoding="utf-8")
    return f


def line_of(text: str, fragment: str, nth: int = 1) -> int:
    return [i for i, line in enumerate(text.splitlines(), 1) if fragment in line][nth - 1]


def findings(tmp_path, text):
    f = write(tmp_path, text)
    return f, audit_profile(f, load_profile(f))


def the(found, check):
    hits = [x for x in found if x.finding.check == check]
    assert hits, "\n".join(map(str, found))
    return hits[0]


# --------------------------------------------------------------------------- clean bases


@pytest.mark.parametrize("path", DEMOS, ids=["vessel_profiles", "package_data"])
def test_the_demo_profile_audits_clean(path, capsys):
    """Demo Islander: no error and no warning (its tables are computed from one hull geometry)."""
    assert audit(load_profile(path)) == ()
    assert run_check(path) == 0
    assert "plausibility audit: nothing suspicious found" in capsys.readouterr().out


def test_the_analytic_box_base_audits_clean(tmp_path):
    assert findings(tmp_path, fv22_text())[1] == []


# --------------------------------------------------------------------------- issue 8, "Why"


def test_lightship_lcg_entered_from_midships(tmp_path, capsys):
    """Lightship LCG −2.10 m: a midships-datum value typed into an AP-datum profile."""
    text = fv22_text().replace("lcg_m = 10.6", "lcg_m = -2.10")
    f, found = findings(tmp_path, text)
    hit = the(found, "lightship-x")
    assert hit.is_error and hit.line == line_of(text, "lcg_m = -2.10") and hit.file == str(f)
    assert hit.finding.key == "lightship.lcg_m" and "-2.1 m from AP" in hit.finding.value
    assert "lightship particulars" in hit.finding.look
    assert run_check(f) == 1
    out = capsys.readouterr().out
    assert out.startswith(f"ERR {f}")
    assert f"{f}:{hit.line}: ERROR lightship.lcg_m = -2.1 m from AP: a lightship LCG must lie between" in out
    # nothing is computed from a profile the screen would refuse
    assert "booklet conditions: not run until the audit's errors are put right" in out
    assert "within the MSC.1/Circ.1229" not in out
    cond = tmp_path / "c.condition.toml"
    cond.write_text('name = "empty"\n', encoding="utf-8")
    assert run_check(f, cond) == 1
    out = capsys.readouterr().out
    assert f"{cond}: not computed: its vessel profile has audit errors" in out and "computes to" not in out


def test_every_lcb_negative(tmp_path):
    """Every LCB negative (from midships, + forward, typed as from the AP)."""
    text = fv22_text().replace("lcb_m = [11.0, 11.0, 11.0, 11.0, 11.0, 11.0, 11.0, 11.0, 11.0]",
                               "lcb_m = [-0.31, -0.3, -0.29, -0.28, -0.27, -0.26, -0.25, -0.24, -0.23]")
    f, found = findings(tmp_path, text)
    hit = the(found, "hydro-lcb-range")
    assert hit.is_error and hit.finding.key == "hydrostatics.lcb_m" and hit.line == line_of(text, "lcb_m = [-0.31")
    assert "every row" in hit.finding.why and "hydrostatic particulars" in hit.finding.look


def test_fore_peak_lcg_35_m_on_a_22_m_vessel(tmp_path, capsys):
    """Fore-peak LCG 35 m on a 22 m vessel: check refuses it on its own line, with the key; the audit,
    which judges models however they were built, says the same of a model built in code."""
    text = fv22_text()
    at = text.index('id = "FP"')
    text = text[:at] + text[at:].replace("lcg_m = [20.5, 20.5, 20.5, 20.5, 20.5, 20.5]",
                                         "lcg_m = [35.0, 35.0, 35.0, 35.0, 35.0, 35.0]", 1)
    f = write(tmp_path, text)
    assert run_check(f) == 1
    out = capsys.readouterr().out
    loc = f"{f}:{line_of(text, 'lcg_m = [35.0')}: "
    assert any(ln.startswith(loc) and "tank[FP].calibration.lcg_m" in ln and "35" in ln for ln in out.splitlines())
    v = vessel()
    fp = v.tank("FP")
    cal = dataclasses.replace(fp.calibration, lcg_m=frozen_array(np.full(len(fp.calibration.lcg_m), 35.0)))
    v2 = dataclasses.replace(v, tanks=tuple(dataclasses.replace(t, calibration=cal) if t.id == "FP" else t
                                            for t in v.tanks))
    (hit,) = [x for x in audit(v2) if x.check == "position-x"]
    assert hit.severity == ERROR and hit.key == "tank[FP].calibration.lcg_m" and "outside the vessel" in hit.why
    assert hit.path == ("tank", 3, "calibration", "lcg_m", 0) and "calibration table of tank FP" in hit.look


def test_a_tank_centre_just_beyond_the_fp_is_a_doubt(tmp_path):
    """FP tank centre at 24.5 m on a 22 m LBP: inside the reader's 1.2·LBP bound, beyond the 1.1·LBP
    where compartments usually end: a warning, located on its line."""
    text = fv22_text()
    at = text.index('id = "FP"')
    text = text[:at] + text[at:].replace("lcg_m = [20.5, 20.5, 20.5, 20.5, 20.5, 20.5]",
                                         "lcg_m = [24.5, 24.5, 24.5, 24.5, 24.5, 24.5]", 1)
    hit = the(findings(tmp_path, text)[1], "position-x")
    assert hit.finding.severity == WARNING and hit.line == line_of(text, "lcg_m = [24.5")


def test_kn_19_07_typed_for_1_907(tmp_path):
    """A KN of 19.07 typed for 1.907 (here the box's 1.901 at 30°, Δ 146.6 t)."""
    text = fv22_text().replace("1.901373720451374", "19.07")
    f, found = findings(tmp_path, text)
    hit = the(found, "kn-envelope")
    assert hit.is_error and hit.finding.value == "19.07 m" and hit.line == line_of(text, "19.07")
    assert "Δ 146.575 t at 30°" in hit.finding.look


def test_kn_0_1907_typed_for_1_907_stands_out_of_the_curve(tmp_path):
    """The decimal point slipped the other way: 0.1901 inside the curve's range, caught as an outlier."""
    text = fv22_text().replace("1.901373720451374", "0.1901")
    hit = the(findings(tmp_path, text)[1], "kn-outlier")
    assert hit.is_error and hit.finding.value == "0.1901 m" and "at 30°" in hit.finding.look


def test_limiting_kg_curve_entered_against_draft(tmp_path):
    extra = "\n[limit_curve]\ndisplacement_t = [1.0, 1.8, 2.6]\nmax_kg_m = [2.6, 2.5, 2.4]\n"
    text = fv22_text(extra)
    f, found = findings(tmp_path, text)
    hit = the(found, "curve-range")
    assert hit.is_error and hit.finding.key == "limit_curve.displacement_t"
    assert "look like drafts" in hit.finding.why and hit.line == line_of(text, "displacement_t = [1.0, 1.8")


def test_pair_tcgs_with_the_same_sign(tmp_path):
    """Both tanks of a pair entered with the same sign (found only as a 15.7° list in calc before)."""
    text = fv22_text().replace("tcg_m = [-2.0, -2.0, -2.0, -2.0, -2.0, -2.0]", "tcg_m = [2.0, 2.0, 2.0, 2.0, 2.0, 2.0]")
    f, found = findings(tmp_path, text)
    hit = the(found, "pair-tcg-sign")
    assert hit.is_error and hit.finding.key == "tank[FO1P].calibration.tcg_m"
    assert "FO1S" in hit.finding.value and "one sign is wrong" in hit.finding.why
    assert hit.line == line_of(text, "tcg_m = [2.0", 1)


# --------------------------------------------------------------------------- the other checks


def vessel():
    return parse_profile(fv22_text(), "fv22.toml")


def with_hydro(v, **cols):
    return dataclasses.replace(v, hydrostatics=dataclasses.replace(
        v.hydrostatics, **{k: frozen_array(a) for k, a in cols.items()}))


def checks(v, severity=None):
    return {(f.check, f.severity) for f in audit(v) if severity in (None, f.severity)}


def test_a_displacement_digit_slip_contradicts_tpc():
    """Δ at 1.8 m typed 323.3 for 332.3: the step from 1.6 m is 36.1 t against 100·TPC·0.2 = 29.3 t."""
    v = vessel()
    d = np.array(v.hydrostatics.displacement_t)
    assert d[4] == pytest.approx(1.025 * 22 * 6.5 * 1.8)
    d[4] = 323.3
    assert ("hydro-tpc", ERROR) in checks(with_hydro(v, displacement_t=d))


def test_kmt_above_what_the_waterplane_allows():
    """KMt 10× (a slipped decimal): above VCB + A·B²/(4∇), the bound for any waterplane (an error);
    KMt 1.2×: above the single-hull bound VCB + A·B²/(12∇), which the box meets exactly (a doubt:
    a multihull may exceed it).  Bounds derived in audit.py."""
    v = vessel()
    assert ("hydro-kmt", ERROR) in checks(with_hydro(v, kmt_m=np.array(v.hydrostatics.kmt_m) * 10))
    found = checks(with_hydro(v, kmt_m=np.array(v.hydrostatics.kmt_m) * 1.2))
    assert ("hydro-kmt", WARNING) in found and ("hydro-kmt", ERROR) not in found


def test_mctc_against_the_waterplane_and_kml():
    v = vessel()
    found = checks(with_hydro(v, mctc_tm_cm=np.array(v.hydrostatics.mctc_tm_cm) * 10))
    assert ("hydro-mctc", ERROR) in found
    # 0.7 × the BML value: the waterplane allows it (c = 0.7) but KML does not (GML ≥ 0.8·BML)
    found = checks(with_hydro(v, mctc_tm_cm=np.array(v.hydrostatics.mctc_tm_cm) * 0.7))
    assert ("hydro-mctc-kml", WARNING) in found and ("hydro-mctc", WARNING) not in found


def test_vcb_must_rise_with_draft():
    v = vessel()
    vcb = np.array(v.hydrostatics.vcb_m)
    vcb[3] = 0.59  # after 0.7 at 1.4 m: falls
    assert ("hydro-rise", ERROR) in checks(with_hydro(v, vcb_m=vcb))


def test_lcb_contradicting_lcf():
    """LCB from midships in the upper rows only: the LCF column integrated gives 11.0 m there."""
    v = vessel()
    lcb = np.array(v.hydrostatics.lcb_m)
    lcb[5:] = 9.5  # inside 0.3–0.7 L, but 1.5 m (6.8 % of L) from the 11.0 m that LCF implies
    assert ("hydro-lcb-lcf", ERROR) in checks(with_hydro(v, lcb_m=lcb))


def test_block_coefficient_beyond_any_hull():
    v = vessel()
    found = checks(with_hydro(v, displacement_t=np.array(v.hydrostatics.displacement_t) * 1.3,
                              tpc_t_cm=np.array(v.hydrostatics.tpc_t_cm) * 1.3))
    assert ("hydro-cb", ERROR) in found


def test_kn_against_kmt_at_small_heel():
    """KN(10°) halved in one row: KN ≈ KMt·sinφ up to 10° (wall-sided formula, standards.md §6)."""
    v = vessel()
    kn = np.array(v.cross_curves.kn_m)
    kn[1, 1] *= 0.5
    v2 = dataclasses.replace(v, cross_curves=dataclasses.replace(v.cross_curves, kn_m=frozen_array(kn)))
    assert ("kn-kmt", ERROR) in checks(v2)


def test_free_surface_above_what_the_tank_allows(tmp_path):
    """FO1P: a 4 × 2 m surface, i = l·b³/12 = 2.667 m⁴.  ×20 = 53.3 m⁴ is above 1.1 × the box bound
    A·B²/12 = 8·6.5²/12 = 28.2 m⁴ (a warning); ×100 = 267 m⁴ is above A·B²/4 with A doubled,
    2·8·6.5²/4 = 169 m⁴ (an error: Popoviciu, derived in audit.py)."""
    base = "fsi_m4 = [2.6666666666666665, 2.6666666666666665, 2.6666666666666665, 2.6666666666666665, 2.6666666666666665, 2.6666666666666665]"
    text = fv22_text()
    assert base in text
    for factor, sev in ((20, WARNING), (100, ERROR)):
        x = repr(2.6666666666666665 * factor)
        t2 = text.replace(base, "fsi_m4 = [" + ", ".join([x] * 6) + "]", 1)
        hit = the(findings(tmp_path, t2)[1], "tank-fsi")
        assert hit.finding.severity == sev and hit.finding.key == "tank[FO1P].calibration.fsi_m4"
        assert hit.line == line_of(t2, "fsi_m4 = [" + x)


def test_calibration_centre_leaving_the_tank(tmp_path):
    """Full-tank VCG typed 0.95 for 0.50 (still rising, so the schema accepts it): the liquid added
    from 0.8 to 1.0 m would have its centre at (8·0.95 − 6.4·0.4)/1.6 = 3.15 m above the keel,
    outside that layer for the bottom height the rows below fix (0 m)."""
    text = fv22_text()
    at = text.index('id = "FO1S"')
    text = text[:at] + text[at:].replace("vcg_m = [0.0, 0.1, 0.2, 0.3, 0.4, 0.5]", "vcg_m = [0.0, 0.1, 0.2, 0.3, 0.4, 0.95]", 1)
    hit = the(findings(tmp_path, text)[1], "tank-centre")
    assert hit.is_error and hit.finding.key == "tank[FO1S].calibration.vcg_m" and "at sounding 1 m" in hit.finding.value
    assert "3.15 m" in hit.finding.why


def test_pair_capacities_that_differ_markedly_are_a_warning():
    v = vessel()
    a, b = v.tank("FO1P"), v.tank("FO1S")
    cal = dataclasses.replace(b.calibration, volume_m3=frozen_array(np.array(b.calibration.volume_m3) * 0.8))
    b2 = dataclasses.replace(b, calibration=cal, capacity_m3=b.capacity_m3 * 0.8)
    v2 = dataclasses.replace(v, tanks=tuple(b2 if t.id == "FO1S" else t for t in v.tanks))
    assert checks(v2) == {("pair-capacity", WARNING)}
    assert a.capacity_m3 == pytest.approx(8.0)


def test_a_warning_does_not_fail_check(tmp_path, capsys):
    """Lightship KG 5.0 m on a 3.0 m depth: above 1.5 D (a doubt), not above 2.5 D."""
    f = write(tmp_path, fv22_text().replace("vcg_m = 2.4", "vcg_m = 5.0"))
    assert run_check(f) == 0
    out = capsys.readouterr().out
    assert out.startswith(f"OK  {f}") and "WARNING lightship.vcg_m = 5 m above keel" in out
    assert "0 errors" in out and "1 warning" in out


def test_a_finding_in_a_csv_table_points_at_the_csv_line(tmp_path):
    """Tables read from CSV files: the finding names the CSV file and the line of its row, found by the
    row's displacement or volume (an ullage table is typed upside down; the model's is by level)."""
    import test_booklet_input as booklet

    f = booklet.booklet_profile(tmp_path)
    kn = tmp_path / "tables" / "kn.csv"
    kn.write_text(kn.read_text().replace("2.68414", "26.8414"), encoding="utf-8")
    tank = tmp_path / "tables" / "DB1P.csv"
    # FSM 3075 t·m (fsi 3000 m⁴) at full: under the reader's bound 1.2·LBP·B³/12 = 4000 m⁴, above the
    # audit's A·B²/4 with A doubled = 2·50·10²/4 = 2500 m⁴ (the 10 × 5 m tank's surface A = 50 m²)
    tank.write_text(tank.read_text().replace("0.2,50,-10,0.5,2.5 P,106.770833", "0.2,50,-10,0.5,2.5 P,3075.0"),
                    encoding="utf-8")
    found = audit_profile(f, load_profile(f))
    hit = the(found, "kn-envelope")
    assert (hit.file, hit.line) == (str(kn), 2) and hit.finding.value == "26.84 m"
    hit = the(found, "tank-fsi")
    assert (hit.file, hit.line) == (str(tank), 2) and hit.finding.key == "tank[DB1P].calibration.fsi_m4"
    assert hit.finding.severity == ERROR


def test_free_surface_non_zero_when_empty(tmp_path):
    """An FSM typed against the empty row (20 m⁴ at volume 0, 2.667 m⁴ above; under the box bound 28.2 m⁴): a doubt."""
    base = "fsi_m4 = [2.6666666666666665, 2.6666666666666665,"
    text = fv22_text().replace(base, "fsi_m4 = [20.0, 2.6666666666666665,", 1)
    hit = the(findings(tmp_path, text)[1], "tank-fsi-empty")
    assert hit.finding.severity == WARNING and hit.finding.key == "tank[FO1P].calibration.fsi_m4"
    assert "non-zero when empty" in hit.finding.why
