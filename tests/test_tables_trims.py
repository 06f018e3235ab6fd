"""``deckload tables GEOMETRY --trims …``: hydrostatics and KN at trims written into the profile.

* Read back by the profile reader, the command's tables for the demo are the generator's
  (deckload/core/geometry/trimmed.py through tests/tools/trimmed_tables_from_geometry.py) to
  the decimals they are written with (0.1 mm, 0.01 t, 1 mm on KML: cli/tables.py): that test is
  in tests/test_tables_command.py, whose module computes the demo's even-keel tables once for
  every test that needs them.
* On a box hull they are the closed forms derived in tests/trimmed_box.py (its docstring), with
  one difference derived here: the hull calculation integrates the waterplane projected on the
  ship's base (length L, not L/cosψ; core/geometry/trimmed.py leaves the cosψ factors out), so
  BMt = B²/(12·T), BML = L²/(12·T) and MCTC = ρ·B·L²/1200 exactly, where the closed forms in
  trimmed_box.py carry 1/cosψ, 1/cos³ψ and 1/cos³ψ.  At t = 2 m on 40 m, 1/cosψ − 1 = 1.25·10⁻³:
  1.7 mm of KMt at T = 4 m, inside UR L5's 1 % / 5 cm (standards.md §5.3).
* KN at a fixed trim: the plane is held at ζ ≤ c₀ − (x − x_ref)·t/L with ζ along the heeled
  ship's vertical (core/geometry/cross_curves.py, solve_floating), so a section's draft on its
  centreline is d(x) = c(x)/cosφ: the body sees the trim t/cosφ.  Derived: the wall-sided
  sections of trimmed_box.py then sum to KN(φ, t/cosφ) of its docstring (the mean draft T is
  unchanged: the volume is).  This differs from KN(φ, t) with the body's trim held by
  sinφ·(t²/(24·T))·(1/cos²φ − 1): 1.7 cm at 40°, t = 2 m, T = 4.5 m, inside UR L5's 5 cm.
* Bad ``--trims`` are refused with the value and the rule, and nothing is written.
"""

from __future__ import annotations

import math
import tomllib

import numpy as np
import pytest

from deckload.cli.main import main
from deckload.cli.tables import build_profile_text
from tools.trimmed_tables_from_geometry import KN_ROUND, ROUND
from trimmed_box import B, D, DRAFTS, HEELS, KN_DRAFTS, L, RHO, hydro_at_trim, kn_exact


def box_geometry(depth_m: float = D, drafts=DRAFTS, kn_drafts=KN_DRAFTS) -> str:
    """The box of tests/trimmed_box.py as a geometry file: L 40, B 8, depth D, stations every 10 m
    (Simpson's rule is exact on the box: every integrand is at most quadratic in x)."""
    st = [0.0, 10.0, 20.0, 30.0, 40.0]
    disp = [round(RHO * L * B * t, 6) for t in kn_drafts]
    return f"""format = "deckload-geometry-1"

[vessel]
name = "Trim box"
lbp_m = {L}
breadth_m = {B}
depth_m = {depth_m}
design_draft_m = {depth_m / 2}

[hull]
station_x_m = {st}
waterline_z_m = [0.0, {depth_m}]
deck_z_m = {[depth_m] * 5}
half_breadth_m = {[[B / 2, B / 2]] * 5}

[tables]
draft_m = {[float(x) for x in drafts]}
kn_displacement_t = {disp}
kn_heel_deg = {[float(h) for h in range(0, 95, 5)]}
trim_basis = "even keel"
"""


def test_refresh_without_trims_keeps_them_with_a_note(tmp_path):
    box = tmp_path / "box.geometry.toml"
    box.write_text(box_geometry(), encoding="utf-8")
    out = tmp_path / "box.toml"
    assert main(["tables", str(box), "--trims=-1,1", "-o", str(out)]) == 0
    text, notes = build_profile_text(box, out.read_text(encoding="utf-8"))
    assert [e["trim_m"] for e in tomllib.loads(text)["hydrostatics_at_trim"]] == [-1.0, 1.0]
    assert sum("[[hydrostatics_at_trim]] tables are kept as they were" in n for n in notes) == 1


def test_box_hydrostatics_at_trims_against_closed_forms(tmp_path):
    box = tmp_path / "box.geometry.toml"
    box.write_text(box_geometry(), encoding="utf-8")
    out = tmp_path / "box.toml"
    assert main(["tables", str(box), "--trims", "-2,2,1,-1", "-o", str(out)]) == 0  # a leading minus too
    doc = tomllib.loads(out.read_text(encoding="utf-8"))
    entries = doc["hydrostatics_at_trim"]
    assert [e["trim_m"] for e in entries] == [-2.0, -1.0, 1.0, 2.0]  # sorted, as the reader requires
    for e in entries:
        t = e["trim_m"]
        ref = hydro_at_trim(t)
        cos = math.cos(math.atan(t / L))
        T = np.asarray(DRAFTS)
        assert e["draft_m"] == pytest.approx(list(DRAFTS), abs=ROUND["draft_m"])  # T ± 1 m within 0…10 m: all rows
        for col in ("displacement_t", "lcb_m", "lcf_m", "vcb_m", "tpc_t_cm"):
            np.testing.assert_allclose(e[col], getattr(ref, col), rtol=0, atol=ROUND[col], err_msg=f"{t} {col}")
        # projected waterplane (module docstring): the closed forms without their cosψ factors
        np.testing.assert_allclose(e["kmt_m"], ref.kmt_m - B * B / (12 * T) * (1 / cos - 1), rtol=0, atol=1e-4)
        np.testing.assert_allclose(e["kml_m"], ref.kml_m - L * L / (12 * T) * (1 / cos**3 - 1), rtol=0, atol=1e-3)
        np.testing.assert_allclose(e["mctc_tm_cm"], ref.mctc_tm_cm * cos**3, rtol=0, atol=1e-4)
        # and the whole KMt within UR L5's 1 % / 5 cm of the inclined-plane closed form (standards.md §5.3)
        assert np.all(np.abs(np.asarray(e["kmt_m"]) - ref.kmt_m) <= np.minimum(0.01 * ref.kmt_m, 0.05))
    for e in doc["cross_curves_at_trim"]:
        t = e["trim_m"]
        # the plane held at trim t slopes t/L on the heeled ship's vertical (module docstring): t/cosφ in KB
        exact = [[kn_exact(T, t / math.cos(math.radians(h)), h) for h in HEELS] for T in KN_DRAFTS]
        # compared where every section stays wall-sided: T ± |t|/(2·cosφ) ± (B/2)·tanφ within 0…D
        # (at ±2 m and 40° the shallowest end's bilge or the deepest end's deck edge reaches the water)
        got = np.asarray(e["kn_m"])[:, :len(HEELS)]
        n = 0
        for i, T in enumerate(KN_DRAFTS):
            for k, h in enumerate(HEELS):
                p = math.radians(h)
                reach = abs(t) / (2 * math.cos(p)) + B / 2 * math.tan(p)
                if T - reach > 0 and T + reach < D:
                    assert abs(got[i, k] - exact[i][k]) <= KN_ROUND + 1e-6, (t, T, h, got[i, k], exact[i][k])
                    n += 1
        assert n >= 40  # of 45: the check covers nearly the whole table


@pytest.mark.parametrize("trims, words", [
    ("0.5,0", "trim 0 is the even-keel table"),
    ("1,abc", "'abc' is not a number"),
    ("1,1.0004", "is given twice"),
    ("nan", "must be a finite number"),
    (",".join(str(0.1 * (i + 1)) for i in range(41)), "41 trims, more than the 40 allowed"),
    ("8.5", "8.5 m is above the physical limit: must be between -8 and 8 m (within twice the depth and a fifth "
            "of LBP"),
])
def test_bad_trims_are_refused_and_nothing_is_written(tmp_path, capsys, trims, words):
    box = tmp_path / "box.geometry.toml"
    box.write_text(box_geometry(), encoding="utf-8")
    out = tmp_path / "box.toml"
    assert main(["tables", str(box), f"--trims={trims}", "-o", str(out)]) == 1
    err = capsys.readouterr().err
    assert words in err and "Traceback" not in err
    assert not out.exists()


def test_trim_leaving_too_few_drafts_is_refused(tmp_path, capsys):
    """Depth 5 m, trim 7.9 m (inside the bound min(2·5, 0.2·40) = 8 m): a row needs T − 3.95 > 0 and
    T + 3.95 < 5, i.e. 3.95 < T < 1.05 m: no draft of the table qualifies."""
    box = tmp_path / "box.geometry.toml"
    box.write_text(box_geometry(depth_m=5.0, drafts=(1.0, 2.0, 3.0, 4.0), kn_drafts=(2.0, 3.0)), encoding="utf-8")
    out = tmp_path / "box.toml"
    assert main(["tables", str(box), "--trims=7.9", "-o", str(out)]) == 1
    err = capsys.readouterr().err
    assert "trim +7.9 m leaves 0 of the table's drafts" in err and "Traceback" not in err
    assert not out.exists()
