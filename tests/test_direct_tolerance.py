"""The direct calculation beside the tables, each row judged against its stability-instrument tolerance.

Sources.  Tolerances: IACS UR L5 Table 1 / MSC.1/Circ.1229 as listed in standards.md §5.3 [C]
(draughts, KMt and GMt 1 % / 5 cm max; GZ values 5 % / 5 cm max; areas 5 % / 0.0012 m·rad;
equilibrium angles 1°), the percentage of the base value applying but never exceeding the linear
value (standards.md §5.2, Circ.1461 5.1 [C]); the base value is the tables' (the approved stability
information, standards.md §5.2).  Trim has no row: the sum of the aft and forward draughts'
tolerances (derived: trim is their difference).

Analytic solution (checks.md §1.1 [A], derived there): the box barge L 40 × B 10 × D 4 m,
Δ = 820 t in ρ = 1.025 t/m³, KG = 3 m, floats at T = Δ/(ρ·L·B) = 2 m with KMt = T/2 + B²/(12·T)
= 5.16667 m, GM = 2.16667 m; GZ at 30° = 1.08771 m (checks.md §1.2 [A]).

* **Hull and tables agree**: the tables of that box (closed forms, tests/vessel_factories.py and
  tests/box_profile_text.py) beside a hull of the same box: every row the same to the solver's
  1e-7 m (tests/test_reference_box_equilibrium.py), so every judged row is within tolerance.
* **A hull 9.5 m wide** under the same tables (the independent audit's case): the hull floats at
  T' = 800/(40·9.5) = 2.10526 m, KMt' = T'/2 + 9.5²/(12·T') = 1.05263 + 3.57240 = 4.62503 m
  (the same closed forms with B = 9.5), so KMt and GM fluid differ by −0.54164 m where
  KMt allows min(1 % · 5.16667, 0.05) = 0.05 m and GM min(1 % · 2.16667, 0.05) = 0.0216667 m; the
  drafts by +0.10526 m against min(1 % · 2, 0.05) = 0.02 m.  Upright and symmetric: trim 0 and
  list 0 by both, within.  Its GZ is lower at every heel (narrower: less BM), by more than 5 %.
* **A hull 10.02 m wide**: T'' = 800/(40·10.02) = 1.99601 m, KMt'' = 0.99800 + 100.4004/23.95210
  = 5.18963 m: KMt and GM both differ by +0.02297 m, within KMt's 0.05 m but beyond GM's
  0.0216667 m — the rows are judged each by its own line of the table.
"""

from __future__ import annotations

import dataclasses
import json
import math

import pytest

from deckload.core import booklet
from deckload.core.equilibrium import MAX_GZ_ANGLE_NOTE, compare
from deckload.core.model import Condition
from deckload.core.stability import evaluate
from deckload.report import direct_format as df
from test_reference_box_equilibrium import box_body
from vessel_factories import RHO_SW, box_barge

L, B, D, T, KG = 40.0, 10.0, 4.0, 2.0, 3.0
DISP = RHO_SW * L * B * T  # 820 t, checks.md §1.1
KMT = T / 2 + B * B / (12 * T)  # 5.16667 m, checks.md §1.1
GM = KMT - KG
GZ30 = 1.08771  # checks.md §1.2 [A]

JUDGED = 17  # every row but the angle of maximum GZ, which §5.3 has no row for


def _kmt(breadth: float) -> tuple[float, float]:
    """(T, KMt) of the box with the hull ``breadth`` wide at Δ = 820 t (checks.md §1.1 closed forms)."""
    t = DISP / (RHO_SW * L * breadth)
    return t, t / 2 + breadth * breadth / (12 * t)


def _compare(hull_breadth: float):
    v = dataclasses.replace(box_barge(lightship_t=DISP, lightship_kg_m=KG), hull=box_body(breadth=hull_breadth))
    return compare(v, evaluate(v, Condition()))


def test_hull_and_tables_that_agree_flag_nothing():
    """The box's tables beside the box's own hull (module docstring): every judged row within."""
    cmp = _compare(B)
    rows = {r.quantity: r for r in cmp.rows}
    assert cmp.beyond == () and cmp.judged == JUDGED
    assert all(r.within_tolerance for r in cmp.rows if r.quantity != "Angle of max GZ")
    assert rows["KMt"].tables == pytest.approx(KMT, abs=1e-9) and rows["KMt"].direct == pytest.approx(KMT, abs=1e-7)
    # the allowances of standards.md §5.3 with the tables' value as base
    assert rows["KMt"].allowed == pytest.approx(min(0.01 * KMT, 0.05))
    assert rows["GM fluid"].allowed == pytest.approx(min(0.01 * GM, 0.05))
    assert rows["Draft aft"].allowed == pytest.approx(min(0.01 * T, 0.05))
    assert rows["Trim (+ by the stern)"].allowed == pytest.approx(2 * min(0.01 * T, 0.05))  # derived: aft + fwd
    assert rows["List (+ starboard)"].allowed == 1.0
    assert rows["GZ at 30°"].allowed == pytest.approx(min(0.05 * GZ30, 0.05), abs=1e-6)
    assert rows["Area 0–30°"].allowed == pytest.approx(0.0012)  # 5 % of 0.316 is more: the linear value
    assert rows["KMt"].tolerance == "1 % / 0.05 m max (KMt)"
    assert rows["GM fluid"].tolerance == "1 % / 0.05 m max (GMt)"
    assert cmp.summary().startswith(f"All {JUDGED} rows judged are within")


def test_a_hull_narrower_than_the_tables_is_flagged_row_by_row():
    """The audit's case: tables of the 10 m box, hull 9.5 m wide (module docstring)."""
    cmp = _compare(9.5)
    rows = {r.quantity: r for r in cmp.rows}
    t_narrow, kmt_narrow = _kmt(9.5)
    assert rows["KMt"].direct == pytest.approx(kmt_narrow, abs=1e-7)  # 4.62503 m
    assert rows["KMt"].difference == pytest.approx(kmt_narrow - KMT, abs=1e-7)  # −0.54164 m
    assert rows["GM fluid"].difference == pytest.approx(kmt_narrow - KMT, abs=1e-7)
    assert rows["Draft midships"].difference == pytest.approx(t_narrow - T, abs=1e-7)  # +0.10526 m
    beyond = {r.quantity for r in cmp.beyond}
    assert beyond == {"Draft aft", "Draft forward", "Draft midships", "KMt", "GM fluid", "GZ at 10°", "GZ at 20°",
                      "GZ at 30°", "GZ at 40°", "GZ at 50°", "GZ at 60°", "Max GZ", "Area 0–30°", "Area 0–40.0°",
                      "Area 30–40.0°"}
    assert rows["Trim (+ by the stern)"].within_tolerance is True and rows["List (+ starboard)"].within_tolerance is True
    assert cmp.summary().startswith(f"15 of {JUDGED} rows beyond the stability-instrument tolerances of "
                                    "standards.md §5.3")
    assert "disagree with each other" in cmp.summary() and "before relying on the verdict" in cmp.summary()


def test_each_row_is_judged_by_its_own_line_of_the_table():
    """Hull 10.02 m wide (module docstring): KMt and GM fluid differ alike by +0.02297 m, within
    KMt's 5 cm (1 % of 5.167 m is more) and beyond GMt's 1 % of 2.167 m = 0.0217 m."""
    cmp = _compare(10.02)
    rows = {r.quantity: r for r in cmp.rows}
    _, kmt_wide = _kmt(10.02)
    assert rows["KMt"].difference == pytest.approx(kmt_wide - KMT, abs=1e-7)
    assert rows["GM fluid"].difference == pytest.approx(kmt_wide - KMT, abs=1e-7)
    assert rows["KMt"].within_tolerance is True
    assert rows["GM fluid"].within_tolerance is False


def test_the_angle_of_maximum_gz_is_not_judged_and_says_why():
    """Both curves are natural splines through KN every 5°: where the hull and the tables agree at those
    points both put the maximum at the same wrong angle, 28.8° against the exact 29.182° of checks.md
    §1.2 [A], so the row checks nothing there; §5.3 has no row for it."""
    cmp = _compare(B)
    row = next(r for r in cmp.rows if r.quantity == "Angle of max GZ")
    assert row.within_tolerance is None and row.allowed is None and row.note == MAX_GZ_ANGLE_NOTE
    assert row.direct == pytest.approx(row.tables, abs=1e-6)
    assert abs(row.direct - 29.182) > 0.2  # the shared spline's error, unseen by the comparison


def test_zero_is_printed_without_a_sign():
    assert df.fixed(-0.0004, 3) == "0.000" and df.fixed(-0.0, 1) == "0.0"
    assert df.fixed(-0.0004, 3, signed=True) == "0.000" and df.fixed(0.0, 1, signed=True) == "0.0"
    assert df.fixed(-0.0006, 3) == "-0.001" and df.fixed(0.105, 3, signed=True) == "+0.105"


def test_text_report_and_screen_mark_the_rows_beyond():
    from deckload.cli.calc import format_comparison
    from deckload.ui.hull_compare import comparison_text
    from deckload.ui.palette import P

    good, bad = _compare(B), _compare(9.5)
    text = format_comparison(good)
    assert "BEYOND" not in text and "-0.0" not in text and "+0.0 " not in text
    assert f"All {JUDGED} rows judged are within" in text
    text = format_comparison(bad)
    kmt_line = next(line for line in text.splitlines() if line.lstrip().startswith("KMt"))
    assert kmt_line.split()[-2:] == ["±0.050", "BEYOND"] and "-0.542" in kmt_line
    trim_line = next(line for line in text.splitlines() if line.lstrip().startswith("Trim"))
    assert trim_line.split()[-1] == "ok" and "-0.000" not in trim_line
    assert f"!! 15 of {JUDGED} rows beyond" in text
    assert "1 % / 0.05 m max (GMt)" in text  # the rule of each row, in the legend

    screen = comparison_text(bad)
    assert f"15 of {JUDGED} rows beyond" in screen.plain
    start = screen.plain.index("KMt")
    assert any(s.style == P["danger"] and s.start <= start < s.end for s in screen.spans)
    assert screen.plain.count("BEYOND") == 15
    assert max(len(line) for line in screen.plain.splitlines() if "BEYOND" in line) <= 74  # an 80-column terminal

    from deckload.report.condition_report import render_report_text

    v = dataclasses.replace(box_barge(lightship_t=DISP, lightship_kg_m=KG), hull=box_body(breadth=9.5))
    r = evaluate(v, Condition())
    report = render_report_text(r, v, Condition(), comparison=compare(v, r))
    assert report.count("BEYOND") == 15 and f"15 of {JUDGED} rows beyond" in " ".join(report.split())


def _files(tmp_path, hull_breadth: float):
    """The box as a profile file (tests/box_profile_text.py: checks.md §1.1/§1.2 closed forms, KN every 5°)
    naming a geometry file of a box ``hull_breadth`` wide, and the condition KG 3 m, Δ 820 t."""
    from box_profile_text import BoxTank, box_profile_text

    text = box_profile_text(name="Box barge", length_m=L, breadth_m=B, depth_m=D,
                            drafts_m=[0.5, 1.0, 1.5, 2.0, 2.5, 3.0, 3.5], kn_drafts_m=[1.0, 2.0, 3.0],
                            heel_step_deg=5.0, lightship=(620.0, None, KG),
                            tanks=(BoxTank("T1", (19.0, 21.0), (-1.0, 1.0), (0.0, 1.0)),))  # left empty
    prof = tmp_path / "box.toml"
    prof.write_text(text.replace('format = "deckload-profile-1"\n',
                                 'format = "deckload-profile-1"\nhull_geometry = "box.geometry.toml"\n', 1),
                    encoding="utf-8")
    half = [[hull_breadth / 2] * 2] * 9
    (tmp_path / "box.geometry.toml").write_text(
        'format = "deckload-geometry-1"\n\n[vessel]\nname = "Box barge"\n'
        f"lbp_m = {L}\nbreadth_m = {B}\ndepth_m = {D}\ndesign_draft_m = {T}\n\n[hull]\n"
        f"station_x_m = {[5.0 * k for k in range(9)]}\nwaterline_z_m = [0.0, {D}]\n"
        f"deck_z_m = {[D] * 9}\nhalf_breadth_m = {half}\n\n"
        # what `deckload tables` would make of it (required by the file format; not used by calc)
        "[tables]\ndraft_m = [0.5, 1.0, 2.0, 3.0, 3.5]\nkn_displacement_t = [410.0, 820.0, 1230.0]\n"
        f"kn_heel_deg = {[5.0 * k for k in range(19)]}\ntrim_basis = \"free trim\"\n"
        f"trim_lcg_m = {L / 2}\ntrim_vcg_m = {KG}\n", encoding="utf-8")
    cond = tmp_path / "kg3.condition.toml"
    cond.write_text('format = "deckload-condition-1"\n\n[condition]\nname = "KG 3"\nwater_density_t_m3 = 1.025\n\n'
                    '[[constant]]\nname = "c"\nmass_t = 200.0\nlcg_m = 20.0\nvcg_m = 3.0\ntcg_m = 0.0\n',
                    encoding="utf-8")
    return prof, cond


@pytest.mark.parametrize("hull_breadth, status, beyond", [(B, 0, 0), (9.5, 1, 15)])
def test_calc_direct_exit_status_and_json(tmp_path, capsys, monkeypatch, hull_breadth, status, beyond):
    """README "Exit status": 1 when a row of the direct calculation is beyond its tolerance, after
    printing everything, with the reason on stderr; 0 when hull and tables agree."""
    from deckload.cli.main import main

    monkeypatch.setenv("DECKLOAD_HOME", str(tmp_path / "home"))
    prof, cond = _files(tmp_path, hull_breadth)
    assert main(["calc", str(prof), str(cond), "--direct"]) == status
    out, err = capsys.readouterr()
    assert out.count("BEYOND") == beyond and out.rstrip().endswith("flag-State and class rules.")
    assert ("rows beyond the stability-instrument tolerances" in err) == bool(beyond)
    assert main(["calc", str(prof), str(cond), "--direct", "--json"]) == status
    out, _ = capsys.readouterr()
    doc = json.loads(out)["direct"]
    assert doc["beyond_tolerance"] == beyond and doc["tolerances"] == booklet.SOURCE
    kmt = next(r for r in doc["rows"] if r["quantity"] == "KMt")
    assert kmt["within_tolerance"] is (beyond == 0) and kmt["allowed"] == pytest.approx(0.05)
    assert kmt["tolerance"] == "1 % / 0.05 m max (KMt)"
    assert math.isclose(kmt["tables"], KMT, abs_tol=1e-9)
    angle = next(r for r in doc["rows"] if r["quantity"] == "Angle of max GZ")
    assert angle["within_tolerance"] is None and angle["allowed"] is None
    # the report alike: written in full, then the same status and reason
    out_file = tmp_path / "report.txt"
    assert main(["report", str(prof), str(cond), "--direct", "--txt", "-o", str(out_file)]) == status
    _, err = capsys.readouterr()
    assert out_file.read_text(encoding="utf-8").count("BEYOND") == beyond
    assert ("rows beyond the stability-instrument tolerances" in err) == bool(beyond)
