"""The booklet's trim-correction columns for soundings (``[tank.trim_correction]``, core/soundings.py).

Hand-computed case (derived here).  A box tank l × b × h = 10 × 4 × 1 m from x = 15 to 25 m
on the 40 m box of tests/test_trimmed_tables_profile.py, its sounding pipe at the aft end
x_p = 15 m, sounding zero at the bottom.  Trimmed t over L (+ by the stern) the liquid's
surface is z(x) = s + (x_p − x)·t/L (core/soundings.py), so while it cuts neither bottom
nor top (l·|t|/L ≤ s ≤ h − l·|t|/L)

    V = b·∫(s + (x_p − x)·t/L) dx = b·l·(s + (x_p − x_c)·t/L) = b·l·(s − l·t/(2L)),

the even-keel sounding of the same volume is s − l·t/(2L): the correction is −0.125·t m,
the same at every sounding.  The booklet's columns at t = −1, −0.5, +0.5, +1 m are then
+0.125, +0.0625, −0.0625, −0.125 m (or the volumes 40·(s − 0.125·t) m³).  A sounding of
0.500 m at +0.80 m: correction −0.100 m, even-keel 0.400 m, V = 40·0.4 = 16.000 m³; the
columns are linear in s and t here, so linear interpolation is exact (round-off 1e-9).
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from box_profile_text import BoxTank, box_profile_text
from deckload.core.model import Condition, TankFill, TrimCorrection, frozen_array
from deckload.core.soundings import BOOKLET, GEOMETRY, correct_sounding
from deckload.core.stability import evaluate
from deckload.io.paths import DEMO_PROFILE
from deckload.io.profiles import ProfileError, load_profile, parse_profile

L, B, D = 40.0, 8.0, 10.0
TRIMS = [-1.0, -0.5, 0.5, 1.0]
SOUNDINGS = [0.3, 0.5, 0.7]


def _arr(xs) -> str:
    return "[" + ", ".join(repr(round(float(x), 9)) for x in xs) + "]"


def corrections() -> list[list[float]]:
    return [[-0.125 * t for t in TRIMS] for _ in SOUNDINGS]


def volumes() -> list[list[float]]:
    return [[40.0 * (s - 0.125 * t) for t in TRIMS] for s in SOUNDINGS]


def profile(trim_table: str) -> str:
    return box_profile_text(
        name="Sounded box", length_m=L, breadth_m=B, depth_m=D, drafts_m=[4.0, 4.5, 5.0, 5.5, 6.0],
        kn_drafts_m=[4.5, 5.0, 5.5], lightship=(1.025 * L * B * 5.0, None, 3.0),
        tanks=(BoxTank("DB1", (15.0, 25.0), (-2.0, 2.0), (0.0, 1.0), rows=10),), extra=trim_table)


def matrix(rows) -> str:
    return "[\n" + "".join("    " + _arr(r) + ",\n" for r in rows) + "]"


CORR = f"""
  [tank.trim_correction]
  trim_m = {_arr(TRIMS)}
  sounding_m = {_arr(SOUNDINGS)}
  sounding_correction_m = {matrix(corrections())}
"""
VOLS = f"""
  [tank.trim_correction]
  trim_m = {_arr(TRIMS)}
  sounding_m = {_arr(SOUNDINGS)}
  volume_m3 = {matrix(volumes())}
"""


def _tank(r, tid="DB1"):
    return next(t for t in r.tanks if t.id == tid)


def test_hand_computed_sounding_correction():
    """0.500 m at +0.80 m by the stern → 0.400 m at even keel, 16.000 m³ (module docstring); the
    caution names the booklet's correction."""
    v = parse_profile(profile(CORR), "corr.toml")
    r = evaluate(v, Condition(tanks=(TankFill("DB1", "sounding_m", 0.5),), sounding_trim_m=0.8))
    assert _tank(r).volume_m3 == pytest.approx(16.0, abs=1e-9)
    assert _tank(r).sounding_m == pytest.approx(0.4, abs=1e-9)
    note = next(w for w in r.warnings if w.code == "sounding-corrected")
    assert "DB1 0.500 → 0.400 m (booklet trim correction)" in note.message


def test_hand_computed_volume_columns():
    """Volume columns: 0.600 m at −0.70 m (by the head): V = 40·(0.6 + 0.0875) = 27.500 m³, even-keel
    sounding 27.5/40 = 0.6875 m (module docstring)."""
    v = parse_profile(profile(VOLS), "vols.toml")
    r = evaluate(v, Condition(tanks=(TankFill("DB1", "sounding_m", 0.6),), sounding_trim_m=-0.7))
    assert _tank(r).volume_m3 == pytest.approx(27.5, abs=1e-9)
    assert _tank(r).sounding_m == pytest.approx(0.6875, abs=1e-9)


def test_outside_the_columns_or_with_a_list_the_sounding_is_not_corrected_without_geometry():
    """Trim +1.2 m is beyond the columns (to +1.0 m), and a list is not in them: nothing is
    extrapolated, the box has no tank shape, so the sounding stays as read and the caution names it."""
    v = parse_profile(profile(CORR), "corr.toml")
    for trim, lst in ((1.2, 0.0), (0.8, 2.0)):
        r = evaluate(v, Condition(tanks=(TankFill("DB1", "sounding_m", 0.5),), sounding_trim_m=trim,
                                  sounding_list_deg=lst))
        assert _tank(r).volume_m3 == pytest.approx(20.0, abs=1e-9)  # 40 m² × 0.5 m, the even-keel table
        assert any(w.code == "sounding-uncorrected" and "DB1" in w.message for w in r.warnings)


def test_ullage_reading_is_corrected_as_the_sounding_it_is():
    """An ullage of 0.5 m below a reference 1.0 m above the bottom is a sounding of 0.5 m: the same
    0.400 m → 16.000 m³ at +0.80 m, given back as the even-keel ullage 0.600 m."""
    text = profile(CORR).replace('name = "Tank DB1"', 'name = "Tank DB1"\nullage_reference_m = 1.0')
    v = parse_profile(text, "ull.toml")
    r = evaluate(v, Condition(tanks=(TankFill("DB1", "ullage_m", 0.5),), sounding_trim_m=0.8))
    assert _tank(r).volume_m3 == pytest.approx(16.0, abs=1e-9)
    assert "DB1 0.500 → 0.600 m (booklet trim correction)" in next(
        w.message for w in r.warnings if w.code == "sounding-corrected")


def test_columns_from_csv(tmp_path):
    header = "sounding_m," + ",".join(f"corr_{t:+g}" for t in TRIMS)
    body = "\n".join(",".join([repr(s)] + [repr(-0.125 * t) for t in TRIMS]) for s in SOUNDINGS)
    (tmp_path / "db1_trim.csv").write_text(header + "\n" + body + "\n", encoding="utf-8")
    (tmp_path / "p.toml").write_text(profile('\n  [tank.trim_correction]\n  csv = "db1_trim.csv"\n'), encoding="utf-8")
    v = load_profile(tmp_path / "p.toml")
    tc = v.tank("DB1").trim_correction
    assert tc.kind == "sounding_correction_m" and list(tc.trim_m) == TRIMS
    assert np.allclose(tc.value, corrections(), rtol=0, atol=1e-12)
    # a bad cell names the CSV file, line and column
    (tmp_path / "db1_trim.csv").write_text(header + "\n" + body.replace("0.0625", "0.06x5", 1) + "\n", encoding="utf-8")
    with pytest.raises(ProfileError) as ei:
        load_profile(tmp_path / "p.toml")
    (p,) = ei.value.problems
    assert p.file == str(tmp_path / "db1_trim.csv") and p.line == 2 and p.column == "column 3 'corr_-0.5'"
    assert p.key == "tank[DB1].trim_correction.sounding_correction_m"


@pytest.mark.parametrize("edit, key, words", [
    (("trim_m = [-1.0, -0.5, 0.5, 1.0]", "trim_m = [-1.0, 0.0, 0.5, 1.0]"), "trim_m", "calibration table itself"),
    (("trim_m = [-1.0, -0.5, 0.5, 1.0]", "trim_m = [-1.0, 0.5, -0.5, 1.0]"), "trim_m", "increas"),
    (("sounding_m = [0.3, 0.5, 0.7]", "sounding_m = [0.3, 0.5, 1.7]"), "sounding_m", "a sounding the tank can show"),
    (("[0.125, 0.0625", "[2.125, 0.0625"), "sounding_correction_m", "±1 m, the calibration's height"),
])
def test_bad_columns_name_key_value_and_rule(edit, key, words):
    with pytest.raises(ProfileError) as ei:
        parse_profile(profile(CORR.replace(*edit)), "bad.toml")
    problems = [p for p in ei.value.problems if p.key == f"tank[DB1].trim_correction.{key}"]
    assert problems and words in problems[0].rule and problems[0].line is not None


def test_one_kind_of_column():
    both = CORR + f"  volume_m3 = {matrix(volumes())}\n"
    with pytest.raises(ProfileError, match="give one of sounding_correction_m"):
        parse_profile(profile(both), "both.toml")


@pytest.fixture(scope="module")
def demo():
    return load_profile(DEMO_PROFILE)


def test_booklet_columns_are_preferred_to_the_geometry(demo):
    """A demo tank with the geometry method available and booklet columns at +0.5 and +1.0 m (made
    here from that geometry, so the two agree at the columns): at +0.75 m the booklet's interpolated
    correction is used and named; at +1.5 m (beyond the columns) and with a list, the geometry is."""
    tank, body, pipe = demo.tank("DB2P"), demo.tank_bodies["DB2P"], demo.sounding_pipes["DB2P"]
    lbp = demo.particulars.lbp_m
    soundings = [0.3, 0.5, 0.7]
    trims = [0.5, 1.0]
    corr = [[correct_sounding(tank, body, pipe, s, t, lbp, 0.0).even_keel_m - s for t in trims] for s in soundings]
    tc = TrimCorrection(frozen_array(trims), frozen_array(soundings), frozen_array(corr), "sounding_correction_m")
    v = dataclasses.replace(demo, tanks=tuple(dataclasses.replace(t, trim_correction=tc) if t.id == "DB2P" else t
                                              for t in demo.tanks))

    def run(trim, lst=0.0):
        r = evaluate(v, Condition(tanks=(TankFill("DB2P", "sounding_m", 0.5),), sounding_trim_m=trim,
                                  sounding_list_deg=lst))
        return r, next(w.message for w in r.warnings if w.code == "sounding-corrected")

    r, note = run(0.75)
    # hand interpolation of the columns at s = 0.5 (a row): halfway between +0.5 and +1.0
    expect = 0.5 + 0.5 * (corr[1][0] + corr[1][1])
    assert f"({BOOKLET})" in note and _tank(r, "DB2P").sounding_m == pytest.approx(expect, abs=1e-9)
    assert f"({GEOMETRY})" in run(1.5)[1]
    assert f"({GEOMETRY})" in run(0.75, -2.0)[1]


def test_deckload_csv_writes_the_columns_back(tmp_path, capsys):
    """`deckload csv` writes the trim corrections as sounding_m + corr_<trim>; read back, the same numbers."""
    from deckload.cli.csv_export import run_csv

    (tmp_path / "p.toml").write_text(profile(CORR), encoding="utf-8")
    assert run_csv(tmp_path / "p.toml", tmp_path / "out") == 0
    assert "tank_DB1_trim.csv" in capsys.readouterr().out
    (tmp_path / "q.toml").write_text(profile('\n  [tank.trim_correction]\n  csv = "out/tank_DB1_trim.csv"\n'),
                                     encoding="utf-8")
    tc = load_profile(tmp_path / "q.toml").tank("DB1").trim_correction
    assert list(tc.trim_m) == TRIMS and np.allclose(tc.value, corrections(), rtol=1e-9, atol=1e-12)


def test_a_correction_beyond_what_the_tilt_can_make_is_refused():
    """A correction of 0.5 m at 0.25 m trim (say cm typed as a fraction of the wrong unit): the surface
    read at the pipe tilts by t/LBP over a tank at most 1.2·LBP long, so the even-keel level lies within
    ±1.2·|t| = ±0.3 m of the reading (derived in io/profiles.py): refused, naming row, column and trim."""
    text = CORR.replace("trim_m = [-1.0, -0.5, 0.5, 1.0]", "trim_m = [-1.0, -0.25, 0.5, 1.0]").replace(
        "[0.125, 0.0625, -0.0625, -0.125]", "[0.125, 0.5, -0.0625, -0.125]", 1)
    with pytest.raises(ProfileError) as ei:
        parse_profile(profile(text), "tilt.toml")
    (p,) = ei.value.problems
    assert p.key == "tank[DB1].trim_correction.sounding_correction_m"
    assert "row 1, column 2: 0.5 at trim -0.25 m" in p.rule and "±0.3 m" in p.rule
