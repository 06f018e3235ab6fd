"""Defects found by trying the program as its users and as a hostile tester would (QA trials).

Each test holds the triggering input of one defect; it failed before its fix.  The Demo Trawler
is invented (LBP 22 m, B 7.2 m, D 3.9 m); its pages are copied to a temporary folder and one
number is mistyped, as a crew typing a booklet into a spreadsheet might.
"""

from __future__ import annotations

import re
import shutil
from pathlib import Path

import pytest

from deckload.io import paths
from deckload.cli.check import run_check
from deckload.cli.main import main
from demo_vessels import demo_vessel, trawler_vessel

BROWSABLE = Path(__file__).resolve().parent.parent / "vessel_profiles"

LONGEST_NUMBER = 16
"""No number in a message needs more characters than this: six significant digits with an
exponent ("-1.23457e+300") is 13; a table's own values print in four decimals below 1e6."""


def _trawler(tmp_path: Path) -> Path:
    """A copy of the Demo Trawler's profile, its conditions and its CSV pages; the profile path."""
    for f in BROWSABLE.glob("demo_trawler*.toml"):
        if "geometry" not in f.name:
            shutil.copy(f, tmp_path / f.name)
    shutil.copytree(BROWSABLE / "demo_trawler", tmp_path / "demo_trawler")
    return tmp_path / "demo_trawler.toml"


def _edit(path: Path, old: str, new: str) -> None:
    text = path.read_text(encoding="utf-8")
    assert old in text, f"{old!r} not in {path}"
    path.write_text(text.replace(old, new, 1), encoding="utf-8")


def _longest_number(text: str) -> str:
    return max(re.findall(r"[-+]?\d[\d.,]*(?:e[-+]?\d+)?", text), key=len, default="")


def test_a_kn_typed_as_1e300_is_named_in_short_numbers_by_the_audit_and_the_booklet_table(tmp_path, capsys):
    """kn.csv line 4 (Δ 140 t), 15°: 1.011 typed as 1e300.  The audit refuses it (ERROR); before
    the fix the audit printed the value, and `check` the booklet conditions' rows, as fixed-point
    numbers of some 300 digits each."""
    profile = _trawler(tmp_path)
    _edit(profile.parent / "demo_trawler" / "kn.csv", "140.0,0.000,0.351,0.690,1.011,",
          "140.0,0.000,0.351,0.690,1e300,")
    assert run_check(profile) == 1
    out = capsys.readouterr().out
    assert "kn.csv:4: ERROR cross_curves.kn_m = 1e+300 m" in out
    assert len(_longest_number(out)) <= LONGEST_NUMBER, _longest_number(out)[:80]


def test_a_capacity_typed_as_1e300_is_refused_with_a_short_percentage(tmp_path, capsys):
    """demo_trawler.toml, tank FWP: capacity_m3 = 3.199 typed as 1e300.  Before the fix the
    difference from the calibration's last volume was printed with 300 digits of percent."""
    profile = _trawler(tmp_path)
    _edit(profile, "capacity_m3 = 3.199", "capacity_m3 = 1e300")
    assert run_check(profile) == 1
    out = capsys.readouterr().out
    assert "demo_trawler.toml:85: tank[FWP].capacity_m3 = 1e+300: differs from the last calibration volume" in out
    assert len(_longest_number(out)) <= LONGEST_NUMBER, _longest_number(out)[:80]


def test_a_free_surface_moment_typed_as_1e30_gives_short_numbers_in_every_message(tmp_path, capsys):
    """demo_trawler.toml, tank FWP: max_fsm_tm = 1.2 typed as 1e30.  The audit refuses it, and
    check then computes nothing from it; the computation itself refuses the condition (KG fluid
    above KML).  Before the fix that reason printed KG fluid as a 28-digit fixed-point number."""
    from deckload.core.stability import evaluate
    from deckload.io.profiles import load_condition, read_profile

    profile = _trawler(tmp_path)
    _edit(profile, "max_fsm_tm = 1.2", "max_fsm_tm = 1e30")
    assert run_check(profile) == 1
    out = capsys.readouterr().out
    assert "booklet conditions: not run until the audit's errors are put right" in out
    assert len(_longest_number(out)) <= LONGEST_NUMBER, _longest_number(out)[:80]
    vessel, _ = read_profile(profile)
    condition = load_condition(profile.parent / "demo_trawler.departure.condition.toml", vessel)
    with pytest.raises(ValueError, match="is not below KML") as refused:
        evaluate(vessel, condition)
    assert len(_longest_number(str(refused.value))) <= LONGEST_NUMBER, str(refused.value)[:80]
    assert main(["calc", str(profile), str(profile.parent / "demo_trawler.departure.condition.toml")]) == 1
    err = capsys.readouterr().err
    assert "Traceback" not in err and len(_longest_number(err)) <= LONGEST_NUMBER


@pytest.mark.parametrize("text", ["1e+300", "1.23457e+06"])
def test_the_longest_number_helper_sees_an_exponent(text):
    """The helper of the tests above must not pass a long number by splitting it."""
    assert _longest_number(f"x = {text} m") == text


def test_an_impossible_lightship_is_the_one_problem_named(tmp_path, capsys):
    """demo_trawler.toml [lightship] mass_t = 168.0 typed as 1680.0 (a slipped decimal point).
    Before the fix four more problems followed from it: each constant and the fish hold's
    max_mass_t "must be between 0 and 0 t", and a key the file does not hold,
    free_surface.min_operating_displacement_t (defaulted to the lightship), without a line."""
    profile = _trawler(tmp_path)
    _edit(profile, "mass_t = 168.0", "mass_t = 1680.0")
    assert run_check(profile) == 1
    out = capsys.readouterr().out
    problems = [ln for ln in out.splitlines() if ln.startswith(str(profile))]
    assert len(problems) == 1, problems
    assert problems[0].startswith(f"{profile}:29: lightship.mass_t = 1680.0: above the physical limit")
    assert "between 0 and 0 t" not in out and "min_operating_displacement_t" not in out


def _area_b_against_a(b: float, a: float):
    from deckload.core.result import CriterionResult

    return CriterionResult("IS2008-A2.3-area-b-a", "Weather: area b against area a", b, a, "m·rad", ">=",
                           b >= a, "IS Code 2008 Part A 2.3.1.4", set_id="IS2008-A2.3")


def test_a_failed_criterion_never_reads_as_equal_with_a_zero_margin():
    """Seen on the trawler's loading screen (departure, FO1P emptied by ullage 2.87u: list 8°
    to starboard): "Wind b ≥ a  0.064 ≥ 0.064  -0.000 FAIL".  Area b 0.06382 against area a
    0.06398 m·rad: three decimals make them equal.  The figures now show as many decimals as
    the margin needs to be seen (up to five)."""
    from deckload.report import verdict_format as vf

    c = _area_b_against_a(0.06382, 0.06398)
    assert not c.passed
    assert (vf.value_text(c), vf.margin_text(c)) == ("0.0638", "-0.0002")
    assert f"{c.limit:.{vf.digits_of(c)}f}" == "0.0640"
    # a clear margin keeps the usual three decimals (the columns of every view)
    assert vf.margin_text(_area_b_against_a(0.0712, 0.0640)) == "+0.007"
    # a value on the limit itself passes with a zero margin, in the usual decimals
    assert vf.margin_text(_area_b_against_a(0.0640, 0.0640)) == "+0.000"


def test_the_criteria_line_of_calc_shows_the_failing_margin():
    """The same on `deckload calc`'s criteria lines (commands.format_summary), which take their
    decimals from verdict_format: the demo departure with its weather criterion replaced by
    the case above."""
    import dataclasses

    from deckload.cli.calc import format_summary
    from deckload.core.stability import evaluate
    from deckload.io.profiles import load_condition

    vessel = demo_vessel()
    r = evaluate(vessel, load_condition(paths.DEMO_CONDITIONS["departure"], vessel))
    crit = tuple(_area_b_against_a(0.06382, 0.06398) if c.id == "IS2008-A2.3-area-b-a" else c for c in r.criteria)
    assert crit != r.criteria  # the demo has this criterion to replace
    line = next(ln for ln in format_summary(dataclasses.replace(r, criteria=crit)).splitlines()
                if "area b against area a" in ln and "margin" in ln)
    assert "0.0638 >=  0.0640" in line and "margin -0.0002" in line, line


@pytest.mark.parametrize("name", ["departure", "arrival"])
def test_the_report_criteria_table_cuts_no_paragraph(name, tmp_path):
    """`deckload report trawler arrival --txt` (and --html): the Paragraph column of the
    criteria table was nine characters wide beside the trawler's long descriptions, so each
    "B 2.1 (from memory: Part A 2.2.1–2.2.3 applied, GM0 0.35 m)" broke over seven lines and
    lost text ("2.2.1–2.…").  The column now holds the paragraph ("B 2.1†") and the remark
    follows the table once, in full."""
    from deckload.report import verdict_format as vf
    from deckload.core.stability import evaluate
    from deckload.io.profiles import load_condition
    from deckload.report.condition_report import render_report_text

    vessel = trawler_vessel()
    condition = load_condition(paths.TRAWLER_CONDITIONS[name], vessel)
    r = evaluate(vessel, condition)
    txt = render_report_text(r, vessel, condition, stamp="2026-12-02 19:00 UTC", source="c.toml")
    table = txt[txt.index("Intact stability criteria by set"):txt.index("Severe wind and rolling")]
    assert "…" not in table
    rows = [ln for ln in table.splitlines() if ln.rstrip().endswith(("†", "A 2.3.1.2"))]
    assert len(rows) == len(r.criteria)
    flat = " ".join(txt.split())
    for c in r.criteria:
        assert vf.paragraph(c) in flat  # each remark in full, somewhere on the page
    assert "† in full: B 2.1 (from memory: Part A 2.2.1–2.2.3 applied, GM0 0.35 m)" in flat


def test_a_condition_of_the_other_demo_vessel_is_named_as_such(capsys, tmp_path, monkeypatch):
    """`deckload calc trawler light` ('light' is the Demo Islander's) said only "cannot read
    light: No such file or directory"; it now names the trawler's conditions.  Exit 2 as before
    (a file that cannot be read)."""
    monkeypatch.chdir(tmp_path)  # no file called 'light' here
    assert main(["calc", "trawler", "light"]) == 2
    err = capsys.readouterr().err
    assert "'light' is neither a file nor a condition of the demo vessel 'trawler'" in err
    assert "departure, grounds, arrival" in err
    assert main(["calc", "trawler", "grounds"]) == 0
    capsys.readouterr()
    (tmp_path / "light").write_text("", encoding="utf-8")  # a file of that name is read as a file
    assert main(["calc", "trawler", "light"]) == 1
    assert "neither a file" not in capsys.readouterr().err


def test_the_whole_verdict_page_fits_the_width_it_is_given():
    """Loading screen 120×40 on the trawler, key v: the page was laid out for 96 columns in a
    box that shows 94 (.form.help is 100 wide, less border, padding and scrollbar), and each
    criterion line needed 99, so 'ok'/'FAIL' fell to a line of its own and the paragraph
    column read 'B 2.1 (from'.  The criterion line now fits 94 with the short paragraph; the
    paragraph's remark is on the line under it, in full."""
    from deckload.report import verdict_format as vf
    from deckload.core.stability import evaluate
    from deckload.io.profiles import load_condition
    from deckload.ui.verdict import verdict_page

    vessel = trawler_vessel()
    r = evaluate(vessel, load_condition(paths.TRAWLER_CONDITIONS["departure"], vessel))
    lines = [t.plain for t in verdict_page(r, width=94)]
    assert max(len(x) for x in lines[:-1]) <= 94  # the closing caution is one line the box wraps
    for c in r.criteria:  # the description whole, on the numbers' line or the one above it
        i = next(i for i, x in enumerate(lines) if x.startswith(f"  {vf.paragraph(c, short=True):<10} {c.description}"))
        row = lines[i] if len(c.description) <= 36 else lines[i + 1]
        assert row.rstrip().endswith(("ok", "NEAR", "FAIL")) and "margin" in row
    flat = " ".join(" ".join(lines).split())
    assert "¶ B 2.1 (from memory: Part A 2.2.1–2.2.3 applied, GM0 0.35 m)" in flat


def test_calc_words_an_upright_even_keel_condition_as_the_report_does(capsys):
    """`deckload calc trawler arrival`: trim 0.0000 m, no list.  calc printed "List 0.00° stbd"
    and "Trim 0.000 m by the stern" where the report of the same condition prints "upright"
    and "even keel" (report._side, report._trim: below the last printed decimal)."""
    assert main(["calc", "trawler", "arrival"]) == 0
    out = capsys.readouterr().out
    assert "0.0° upright" in out and "0.000 m even keel" in out  # the list to 0.1°, as every view gives it
    assert "° stbd" not in out and "by the stern" not in out
    assert main(["calc", "trawler", "departure"]) == 0  # a real trim keeps its side
    assert "0.205 m by the stern" in capsys.readouterr().out
